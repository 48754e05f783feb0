//! Geometric checks of a truss layout: a length tolerance scaled to the
//! model, coincident nodes, and members that cross without a joint.

use crate::model::{Model, Node};
use std::collections::HashMap;

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
/// y, found through a hash grid of cell `tol` so the cost stays linear even
/// when whole columns of nodes share one x. At most [`COINCIDENT_LIMIT`]
/// pairs, in order of the later node.
pub fn coincident_nodes(nodes: &[Node], tol: f64) -> Vec<(usize, usize)> {
    let cell = tol.max(f64::MIN_POSITIVE);
    let key = |n: &Node| {
        // Saturating casts: non-finite or huge coordinates land in the edge
        // cells and are still compared exactly below.
        ((n.x / cell).floor() as i64, (n.y / cell).floor() as i64)
    };
    let mut grid: HashMap<(i64, i64), Vec<u32>> = HashMap::with_capacity(nodes.len());
    let mut pairs = Vec::new();
    'nodes: for (b, nb) in nodes.iter().enumerate() {
        let (kx, ky) = key(nb);
        let mut near = [(0i64, 0i64); 9];
        let mut count = 0;
        for dx in -1..=1i64 {
            for dy in -1..=1i64 {
                let k = (kx.saturating_add(dx), ky.saturating_add(dy));
                if !near[..count].contains(&k) {
                    near[count] = k;
                    count += 1;
                }
            }
        }
        for k in &near[..count] {
            for &a in grid.get(k).map_or(&[][..], |v| &v[..]) {
                let na = &nodes[a as usize];
                if (nb.x - na.x).abs() <= tol && (nb.y - na.y).abs() <= tol {
                    pairs.push((a as usize, b));
                    if pairs.len() >= COINCIDENT_LIMIT {
                        break 'nodes;
                    }
                }
            }
        }
        grid.entry((kx, ky)).or_default().push(b as u32);
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
/// one mean member length: each member is entered in the cells its bounding
/// box (grown by `tol`) covers, and a pair is tested only in the one cell that
/// holds the lower-left corner of the overlap of their boxes, so no pair is
/// tested twice and no set of seen pairs is needed. Linear in the number of
/// members for evenly spread layouts, whatever the number of crossings.
pub fn crossing_members(model: &Model, tol: f64) -> Vec<(usize, usize)> {
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
    let total: f64 = (0..m).map(|i| model.length(i)).sum();
    let cell = (total / m as f64).max(4.0 * tol).max(f64::MIN_POSITIVE);
    let key = |v: f64| (v / cell).floor() as i64;
    let mut grid: HashMap<(i64, i64), Vec<u32>> = HashMap::with_capacity(m);
    let mut oversize = Vec::new();
    for (i, b) in boxes.iter().enumerate() {
        let (cx0, cx1) = (key(b[0]), key(b[2]));
        let (cy0, cy1) = (key(b[1]), key(b[3]));
        let cells = (cx1 - cx0)
            .saturating_add(1)
            .saturating_mul((cy1 - cy0).saturating_add(1));
        if !(1..=64).contains(&cells) {
            oversize.push(i);
            continue;
        }
        for cx in cx0..=cx1 {
            for cy in cy0..=cy1 {
                grid.entry((cx, cy)).or_default().push(i as u32);
            }
        }
    }
    let touch = |a: usize, b: usize| {
        let (ma, mb) = (&model.members[a], &model.members[b]);
        let shared =
            ma.start == mb.start || ma.start == mb.end || ma.end == mb.start || ma.end == mb.end;
        !shared && segments_touch(pt(ma.start), pt(ma.end), pt(mb.start), pt(mb.end), tol)
    };
    let overlap =
        |a: &[f64; 4], b: &[f64; 4]| a[0] <= b[2] && b[0] <= a[2] && a[1] <= b[3] && b[1] <= a[3];
    let mut pairs = Vec::new();
    for (&(cx, cy), list) in &grid {
        for (k, &a) in list.iter().enumerate() {
            let ba = &boxes[a as usize];
            for &b in &list[k + 1..] {
                let bb = &boxes[b as usize];
                if !overlap(ba, bb) || key(ba[0].max(bb[0])) != cx || key(ba[1].max(bb[1])) != cy {
                    continue;
                }
                if touch(a as usize, b as usize) {
                    pairs.push(((a.min(b)) as usize, (a.max(b)) as usize));
                }
            }
        }
    }
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
    pairs.sort_unstable();
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
            }],
            sections: vec![Section {
                id: "s".into(),
                area: 1.0,
                i_in: 1.0,
                i_out: 1.0,
                net_area: 1.0,
                built_up: None,
            }],
            nodes,
            members: members
                .iter()
                .enumerate()
                .map(|(i, &(start, end))| Member {
                    id: format!("m{i}"),
                    start,
                    end,
                    section: 0,
                    material: 0,
                    k_in: 1.0,
                    k_out: 1.0,
                    unbraced_in: None,
                    unbraced_out: None,
                })
                .collect(),
            supports: vec![],
            cases: vec![],
            combinations: vec![],
            rating: Default::default(),
            live: Default::default(),
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
