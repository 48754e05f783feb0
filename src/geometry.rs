//! Geometric checks of a truss layout: a length tolerance scaled to the
//! model, coincident nodes, and members that cross without a joint.

use crate::model::{Model, Node};

/// Distances below this are "the same place": a billionth of the model's
/// size, so the check means the same in mm or in miles.
pub fn tolerance(nodes: &[Node]) -> f64 {
    let (mut x0, mut x1, mut y0, mut y1) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for n in nodes {
        x0 = x0.min(n.x);
        x1 = x1.max(n.x);
        y0 = y0.min(n.y);
        y1 = y1.max(n.y);
    }
    let extent = (x1 - x0).max(y1 - y0);
    if extent.is_finite() && extent > 0.0 {
        1e-9 * extent
    } else {
        f64::MIN_POSITIVE
    }
}

/// Largest number of coincident pairs [`coincident_nodes`] reports.
pub const COINCIDENT_LIMIT: usize = 100;

/// Pairs `(a, b)`, `a < b`, of nodes within `tol` of each other in both x and
/// y, found through a hash grid so the cost stays linear even when whole
/// columns of nodes share one x. The cells are 64 `tol` wide, so the square
/// of half-width `tol` round a node almost always lies in one cell: about
/// one lookup per node. Each cell holds a chain of its nodes through one
/// `next` array, not a list of its own. At most [`COINCIDENT_LIMIT`] pairs,
/// in order of the later node.
pub fn coincident_nodes(nodes: &[Node], tol: f64) -> Vec<(usize, usize)> {
    const NONE: u32 = u32::MAX;
    let cell = (64.0 * tol).max(f64::MIN_POSITIVE);
    // Saturating casts: non-finite or huge coordinates land in the edge
    // cells and are still compared exactly below.
    let key = |v: f64| (v / cell).floor() as i64;
    let mut head: rustc_hash::FxHashMap<(i64, i64), u32> =
        rustc_hash::FxHashMap::with_capacity_and_hasher(nodes.len(), Default::default());
    let mut next = vec![NONE; nodes.len()];
    let mut pairs = Vec::new();
    'nodes: for (b, nb) in nodes.iter().enumerate() {
        let (x0, x1) = (key(nb.x - tol), key(nb.x + tol));
        let (y0, y1) = (key(nb.y - tol), key(nb.y + tol));
        let mut near = Vec::new();
        for cx in x0..=x1.max(x0).min(x0.saturating_add(1)) {
            for cy in y0..=y1.max(y0).min(y0.saturating_add(1)) {
                let mut a = head.get(&(cx, cy)).copied().unwrap_or(NONE);
                while a != NONE {
                    let na = &nodes[a as usize];
                    if (nb.x - na.x).abs() <= tol && (nb.y - na.y).abs() <= tol {
                        near.push(a as usize);
                    }
                    a = next[a as usize];
                }
            }
        }
        // Chains run newest first: report in node order.
        near.sort_unstable();
        for a in near {
            pairs.push((a, b));
            if pairs.len() >= COINCIDENT_LIMIT {
                break 'nodes;
            }
        }
        let own = head.entry((key(nb.x), key(nb.y))).or_insert(NONE);
        next[b] = *own;
        *own = b as u32;
    }
    pairs.sort_unstable_by_key(|&(a, b)| (b, a));
    pairs
}

fn cross(o: [f64; 2], a: [f64; 2], b: [f64; 2]) -> f64 {
    (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
}

/// Whether members `a` and `b` (no shared node) touch anywhere.
fn segments_touch(p: [f64; 2], q: [f64; 2], r: [f64; 2], s: [f64; 2], tol: f64) -> bool {
    let scale = (q[0] - p[0]).hypot(q[1] - p[1]) + (s[0] - r[0]).hypot(s[1] - r[1]);
    let eps = tol * scale;
    let d1 = cross(r, s, p);
    let d2 = cross(r, s, q);
    let d3 = cross(p, q, r);
    let d4 = cross(p, q, s);
    let straddle = |u: f64, v: f64| (u > eps && v < -eps) || (u < -eps && v > eps);
    if straddle(d1, d2) && straddle(d3, d4) {
        return true;
    }
    // Touching or overlapping along a line.
    let on = |a: [f64; 2], b: [f64; 2], c: [f64; 2], d: f64| {
        d.abs() <= eps
            && c[0] >= a[0].min(b[0]) - tol
            && c[0] <= a[0].max(b[0]) + tol
            && c[1] >= a[1].min(b[1]) - tol
            && c[1] <= a[1].max(b[1]) + tol
    };
    on(r, s, p, d1) || on(r, s, q, d2) || on(p, q, r, d3) || on(p, q, s, d4)
}

/// Pairs `(a, b)`, `a < b`, of members that cross, touch or overlap
/// without sharing a node, sorted. Found through a uniform grid of cell about
/// one mean member length, stored flat (counting sort: one pass counts the
/// members of each cell, a second files them), so a million members cost
/// two passes and no allocation per cell. Each member is entered in the
/// cells its bounding box (grown by `tol`) covers, and a pair is tested only
/// in the one cell that holds the lower-left corner of the overlap of their
/// boxes, so no pair is tested twice and no set of seen pairs is needed.
/// Linear in the number of members for evenly spread layouts, whatever the
/// number of crossings; cells are scanned on all cores.
pub fn crossing_members(model: &Model, tol: f64) -> Vec<(usize, usize)> {
    use rayon::prelude::*;
    let m = model.members.len();
    if m < 2 {
        return Vec::new();
    }
    let pt = |i: usize| [model.nodes[i].x, model.nodes[i].y];
    // Bounding boxes [x0, y0, x1, y1], grown by the tolerance.
    let boxes: Vec<[f64; 4]> = model
        .members
        .iter()
        .map(|mem| {
            let (p, q) = (pt(mem.start), pt(mem.end));
            [
                p[0].min(q[0]) - tol,
                p[1].min(q[1]) - tol,
                p[0].max(q[0]) + tol,
                p[1].max(q[1]) + tol,
            ]
        })
        .collect();
    let mut extent = [f64::MAX, f64::MAX, f64::MIN, f64::MIN];
    for b in &boxes {
        extent = [
            extent[0].min(b[0]),
            extent[1].min(b[1]),
            extent[2].max(b[2]),
            extent[3].max(b[3]),
        ];
    }
    let (width, height) = (extent[2] - extent[0], extent[3] - extent[1]);
    if !(width.is_finite() && height.is_finite()) {
        return Vec::new();
    }
    let total: f64 = boxes.iter().map(|b| (b[2] - b[0]).max(b[3] - b[1])).sum();
    let mut cell = (total / m as f64).max(4.0 * tol).max(f64::MIN_POSITIVE);
    // A sparse layout (a few members far apart) would need more cells than
    // members: coarsen the grid until there are at most about 4 per member.
    let budget = 4.0 * m as f64 + 64.0;
    let cells_for = |cell: f64| ((width / cell).floor() + 1.0) * ((height / cell).floor() + 1.0);
    if cells_for(cell) > budget {
        cell *= (cells_for(cell) / budget).sqrt();
        while cells_for(cell) > budget {
            cell *= 1.5;
        }
    }
    let nx = (width / cell).floor() as usize + 1;
    let ny = (height / cell).floor() as usize + 1;
    // Cell of a coordinate: monotone in v (a product and a truncation of
    // a non-negative value), which is all the search below relies on.
    let inv = 1.0 / cell;
    let key = |v: f64, origin: f64, n: usize| (((v - origin) * inv).max(0.0) as usize).min(n - 1);
    // Cell range [x0, x1, y0, y1] of each member's box.
    let spans: Vec<[u32; 4]> = boxes
        .iter()
        .map(|b| {
            [
                key(b[0], extent[0], nx) as u32,
                key(b[2], extent[0], nx) as u32,
                key(b[1], extent[1], ny) as u32,
                key(b[3], extent[1], ny) as u32,
            ]
        })
        .collect();
    // The range of a member covering at most 64 cells; the rest are oversize.
    let span = |i: usize| {
        let [x0, x1, y0, y1] = spans[i].map(|v| v as usize);
        ((x1 - x0 + 1) * (y1 - y0 + 1) <= 64).then_some((x0, x1, y0, y1))
    };
    let mut start = vec![0u32; nx * ny + 1];
    let mut oversize = Vec::new();
    for i in 0..m {
        match span(i) {
            Some((x0, x1, y0, y1)) => {
                for cy in y0..=y1 {
                    for cx in x0..=x1 {
                        start[cy * nx + cx + 1] += 1;
                    }
                }
            }
            None => oversize.push(i),
        }
    }
    for c in 1..start.len() {
        start[c] += start[c - 1];
    }
    let mut filed = vec![0u32; start[nx * ny] as usize];
    let mut next: Vec<u32> = start[..nx * ny].to_vec();
    for i in 0..m {
        if let Some((x0, x1, y0, y1)) = span(i) {
            for cy in y0..=y1 {
                for cx in x0..=x1 {
                    let slot = &mut next[cy * nx + cx];
                    filed[*slot as usize] = i as u32;
                    *slot += 1;
                }
            }
        }
    }
    drop(next);
    let touch = |a: usize, b: usize| {
        let (ma, mb) = (&model.members[a], &model.members[b]);
        let shared =
            ma.start == mb.start || ma.start == mb.end || ma.end == mb.start || ma.end == mb.end;
        !shared && segments_touch(pt(ma.start), pt(ma.end), pt(mb.start), pt(mb.end), tol)
    };
    let overlap =
        |a: &[f64; 4], b: &[f64; 4]| a[0] <= b[2] && b[0] <= a[2] && a[1] <= b[3] && b[1] <= a[3];
    let in_cell = |c: usize, found: &mut Vec<(usize, usize)>| {
        let (cx, cy) = ((c % nx) as u32, (c / nx) as u32);
        let list = &filed[start[c] as usize..start[c + 1] as usize];
        for (k, &a) in list.iter().enumerate() {
            let (ba, sa) = (&boxes[a as usize], &spans[a as usize]);
            for &b in &list[k + 1..] {
                let (bb, sb) = (&boxes[b as usize], &spans[b as usize]);
                // The cell of the overlap's lower-left corner, by the
                // monotone key: the larger of the two lower cells.
                if !overlap(ba, bb) || sa[0].max(sb[0]) != cx || sa[2].max(sb[2]) != cy {
                    continue;
                }
                if touch(a as usize, b as usize) {
                    found.push((a.min(b) as usize, a.max(b) as usize));
                }
            }
        }
    };
    let rows: Vec<Vec<(usize, usize)>> = (0..ny)
        .into_par_iter()
        .map(|cy| {
            let mut found = Vec::new();
            (cy * nx..(cy + 1) * nx).for_each(|c| in_cell(c, &mut found));
            found
        })
        .collect();
    let mut pairs: Vec<(usize, usize)> = rows.into_iter().flatten().collect();
    let is_oversize = {
        let mut v = vec![false; m];
        oversize.iter().for_each(|&i| v[i] = true);
        v
    };
    for &a in &oversize {
        for b in 0..m {
            if b == a || (is_oversize[b] && b < a) || !overlap(&boxes[a], &boxes[b]) {
                continue;
            }
            if touch(a, b) {
                pairs.push((a.min(b), a.max(b)));
            }
        }
    }
    pairs.par_sort_unstable();
    pairs
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{Material, Member, Section};
    use crate::units::DisplayUnits;

    fn node(id: usize, x: f64, y: f64) -> Node {
        Node {
            id: format!("n{id}"),
            x,
            y,
        }
    }

    fn model(nodes: Vec<Node>, members: &[(usize, usize)]) -> Model {
        let l = crate::units::lookup("m").unwrap();
        Model {
            title: String::new(),
            units: DisplayUnits {
                length: l,
                force: crate::units::lookup("N").unwrap(),
                section: l,
                stress: crate::units::lookup("Pa").unwrap(),
            },
            materials: vec![Material {
                id: "s".into(),
                e: 1.0,
                fy: None,
                fu: None,
                density: None,
                alpha: None,
                year: None,
            }],
            sections: vec![Section {
                id: "s".into(),
                area: 1.0,
                i_in: 1.0,
                i_out: 1.0,
                net_area: 1.0,
                built_up: None,
                shear_lag: 1.0,
                shear_lag_given: false,
                holes_punched: None,
                torsion: None,
            }],
            nodes,
            members: members
                .iter()
                .enumerate()
                .map(|(i, &(start, end))| Member {
                    id: format!("m{i}").into(),
                    start,
                    end,
                    section: 0,
                    material: 0,
                    k_in: 1.0,
                    k_out: 1.0,
                    unbraced_in: None,
                    unbraced_out: None,
                    tension_only: false,
                    bars: 1,
                })
                .collect(),
            supports: vec![],
            cases: vec![],
            combinations: vec![],
            rating: Default::default(),
            live: Default::default(),
            fatigue: None,
            stability: Default::default(),
            slack: Vec::new(),
            pins: Vec::new(),
            gussets: Vec::new(),
        }
    }

    /// The obvious all-pairs search, as the reference for the grid.
    fn crossings_brute(model: &Model, tol: f64) -> Vec<(usize, usize)> {
        let pt = |i: usize| [model.nodes[i].x, model.nodes[i].y];
        let mut out = Vec::new();
        for a in 0..model.members.len() {
            for b in a + 1..model.members.len() {
                let (ma, mb) = (&model.members[a], &model.members[b]);
                let shared = ma.start == mb.start
                    || ma.start == mb.end
                    || ma.end == mb.start
                    || ma.end == mb.end;
                if !shared
                    && segments_touch(pt(ma.start), pt(ma.end), pt(mb.start), pt(mb.end), tol)
                {
                    out.push((a, b));
                }
            }
        }
        out
    }

    /// A square lattice of `n` × `n` panels with both diagonals in each.
    fn lattice(n: usize) -> Model {
        let id = |i: usize, j: usize| j * (n + 1) + i;
        let mut nodes = Vec::new();
        for j in 0..=n {
            for i in 0..=n {
                nodes.push(node(id(i, j), i as f64 * 3.0, j as f64 * 3.0));
            }
        }
        let mut members = Vec::new();
        for j in 0..=n {
            for i in 0..=n {
                if i < n {
                    members.push((id(i, j), id(i + 1, j)));
                }
                if j < n {
                    members.push((id(i, j), id(i, j + 1)));
                }
                if i < n && j < n {
                    members.push((id(i, j), id(i + 1, j + 1)));
                    members.push((id(i + 1, j), id(i, j + 1)));
                }
            }
        }
        model(nodes, &members)
    }

    #[test]
    fn lattice_crossings_one_per_panel() {
        // Each square panel's two diagonals cross at its centre and nothing
        // else crosses: n² pairs (by construction, checked against brute force).
        let m = lattice(7);
        let tol = tolerance(&m.nodes);
        let grid = crossing_members(&m, tol);
        assert_eq!(grid.len(), 49);
        assert_eq!(grid, crossings_brute(&m, tol));
    }

    #[test]
    fn crossings_match_brute_force_on_scattered_members() {
        // Pseudo-random segments of mixed lengths, some spanning the whole
        // layout (the oversize path), compared with the all-pairs search.
        let mut state = 12345u64;
        let mut rnd = || {
            state = state
                .wrapping_mul(6364136223846793005)
                .wrapping_add(1442695040888963407);
            (state >> 11) as f64 / (1u64 << 53) as f64
        };
        let nodes: Vec<Node> = (0..120)
            .map(|i| node(i, rnd() * 50.0, rnd() * 20.0))
            .collect();
        let mut members: Vec<(usize, usize)> = (0..110).map(|i| (i, i + 1)).collect();
        members.push((0, 119));
        members.push((5, 77));
        let m = model(nodes, &members);
        let tol = tolerance(&m.nodes);
        let brute = crossings_brute(&m, tol);
        assert!(brute.len() > 50, "the test layout should cross a lot");
        assert_eq!(crossing_members(&m, tol), brute);
    }

    #[test]
    fn crossings_in_far_apart_clusters_match_brute_force() {
        // Two small crossing clusters 1e6 m apart: the grid at one member
        // length would need ~1e11 cells, so it is coarsened; the pairs must
        // still be exactly those of the all-pairs search.
        let mut nodes = Vec::new();
        let mut members = Vec::new();
        for (c, (ox, oy)) in [(0.0, 0.0), (1e6, 3e5)].into_iter().enumerate() {
            let b = c * 4;
            nodes.push(node(b, ox, oy));
            nodes.push(node(b + 1, ox + 2.0, oy + 2.0));
            nodes.push(node(b + 2, ox + 2.0, oy));
            nodes.push(node(b + 3, ox, oy + 2.0));
            members.push((b, b + 1));
            members.push((b + 2, b + 3));
            members.push((b, b + 2));
        }
        let m = model(nodes, &members);
        let tol = tolerance(&m.nodes);
        let brute = crossings_brute(&m, tol);
        assert_eq!(brute, vec![(0, 1), (3, 4)]);
        assert_eq!(crossing_members(&m, tol), brute);
    }

    #[test]
    fn touching_end_on_member_counts_as_crossing() {
        // A T-junction without a node: the stem's end lies on the bar.
        let nodes = vec![
            node(0, 0.0, 0.0),
            node(1, 10.0, 0.0),
            node(2, 4.0, 0.0),
            node(3, 4.0, 5.0),
        ];
        let m = model(nodes, &[(0, 1), (2, 3)]);
        assert_eq!(crossing_members(&m, tolerance(&m.nodes)), vec![(0, 1)]);
    }

    #[test]
    fn coincident_nodes_match_brute_force_near_cell_edges() {
        // Nodes on a coarse grid, each followed by copies nudged by up to
        // twice the tolerance either way (some within it, some not), placed
        // about cell edges: the all-pairs test is the reference.
        let tol = 1e-3;
        let cell = 64.0 * tol;
        let mut nodes = Vec::new();
        let mut state = 99u64;
        let mut rnd = || {
            state = state
                .wrapping_mul(6364136223846793005)
                .wrapping_add(1442695040888963407);
            (state >> 11) as f64 / (1u64 << 53) as f64 - 0.5
        };
        for i in 0..12 {
            for j in 0..5 {
                let (x, y) = (i as f64 * 7.0 * cell, j as f64 * 3.0 * cell);
                nodes.push(node(nodes.len(), x, y));
                for _ in 0..2 {
                    let (dx, dy) = (4.0 * tol * rnd(), 4.0 * tol * rnd());
                    nodes.push(node(nodes.len(), x + dx, y + dy));
                }
            }
        }
        let mut brute = Vec::new();
        for b in 0..nodes.len() {
            for a in 0..b {
                let (na, nb) = (&nodes[a], &nodes[b]);
                if (na.x - nb.x).abs() <= tol && (na.y - nb.y).abs() <= tol {
                    brute.push((a, b));
                }
            }
        }
        brute.truncate(COINCIDENT_LIMIT);
        assert!(brute.len() > 20, "the layout should have close pairs");
        assert_eq!(coincident_nodes(&nodes, tol), brute);
    }

    #[test]
    fn coincident_nodes_in_shared_columns() {
        // Whole columns share one x (the case that made a sort-by-x scan
        // quadratic); one node is repeated within the tolerance.
        let mut nodes = Vec::new();
        for i in 0..30 {
            for j in 0..30 {
                nodes.push(node(nodes.len(), i as f64, j as f64));
            }
        }
        let tol = tolerance(&nodes);
        nodes.push(node(900, 7.0 + 0.5 * tol, 11.0 - 0.5 * tol));
        nodes.push(node(901, 7.0 + 3.0 * tol, 11.0));
        assert_eq!(coincident_nodes(&nodes, tol), vec![(7 * 30 + 11, 900)]);
    }

    #[test]
    fn coincident_nodes_bounded() {
        let nodes: Vec<Node> = (0..500).map(|i| node(i, 1.0, 2.0)).collect();
        let pairs = coincident_nodes(&nodes, 1e-9);
        assert_eq!(pairs.len(), COINCIDENT_LIMIT);
        assert!(pairs.iter().all(|&(a, b)| a < b));
    }
}
