//! Geometric checks of a truss layout: a length tolerance scaled to the
//! model, coincident nodes, and members that cross without a joint.

use crate::model::{Model, Node};
use std::collections::{HashMap, HashSet};

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

/// Pairs of nodes closer than `tol` (each later node reported once).
pub fn coincident_nodes(nodes: &[Node], tol: f64) -> Vec<(usize, usize)> {
    let mut order: Vec<usize> = (0..nodes.len()).collect();
    order.sort_by(|&a, &b| nodes[a].x.total_cmp(&nodes[b].x));
    let mut pairs = Vec::new();
    for (k, &a) in order.iter().enumerate() {
        for &b in &order[k + 1..] {
            if nodes[b].x - nodes[a].x > tol {
                break;
            }
            if (nodes[b].y - nodes[a].y).abs() <= tol {
                pairs.push((a.min(b), a.max(b)));
            }
            if pairs.len() >= 100 {
                return pairs;
            }
        }
    }
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

/// Pairs of members that cross, touch or overlap without sharing a node,
/// found through a uniform grid so large lattices stay fast.
pub fn crossing_members(model: &Model, tol: f64) -> Vec<(usize, usize)> {
    let m = model.members.len();
    if m < 2 {
        return Vec::new();
    }
    let pt = |i: usize| [model.nodes[i].x, model.nodes[i].y];
    let total: f64 = (0..m).map(|i| model.length(i)).sum();
    let cell = 2.0 * total / m as f64;
    let key = |v: f64| (v / cell).floor() as i64;
    let mut grid: HashMap<(i64, i64), Vec<u32>> = HashMap::new();
    let mut oversize = Vec::new();
    for i in 0..m {
        let (p, q) = (pt(model.members[i].start), pt(model.members[i].end));
        let (cx0, cx1) = (key(p[0].min(q[0])), key(p[0].max(q[0])));
        let (cy0, cy1) = (key(p[1].min(q[1])), key(p[1].max(q[1])));
        if (cx1 - cx0 + 1) * (cy1 - cy0 + 1) > 64 {
            oversize.push(i);
            continue;
        }
        for cx in cx0..=cx1 {
            for cy in cy0..=cy1 {
                grid.entry((cx, cy)).or_default().push(i as u32);
            }
        }
    }
    let mut found = HashSet::new();
    let test = |a: usize, b: usize, found: &mut HashSet<(usize, usize)>| {
        let (ma, mb) = (&model.members[a], &model.members[b]);
        if a == b
            || ma.start == mb.start
            || ma.start == mb.end
            || ma.end == mb.start
            || ma.end == mb.end
        {
            return;
        }
        let key = (a.min(b), a.max(b));
        if found.contains(&key) {
            return;
        }
        if segments_touch(pt(ma.start), pt(ma.end), pt(mb.start), pt(mb.end), tol) {
            found.insert(key);
        }
    };
    for list in grid.values() {
        for (k, &a) in list.iter().enumerate() {
            for &b in &list[k + 1..] {
                test(a as usize, b as usize, &mut found);
            }
        }
    }
    for &a in &oversize {
        for b in 0..m {
            test(a, b, &mut found);
        }
    }
    let mut pairs: Vec<_> = found.into_iter().collect();
    pairs.sort_unstable();
    pairs
}
