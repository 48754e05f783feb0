//! The one closed cell of a built-up section, for Bredt–Batho's torsion
//! constant `J = 4A₀²/∮ds/t` (e.g. Timoshenko & Goodier, *Theory of
//! Elasticity*, §115; Kollbrunner & Basler, *Torsion in Structures*, ch. 3;
//! from memory) and the closed-section sectorial coordinate.
//!
//! The cell is the one cycle of the joined section's centre-line graph: the
//! walls of the parts that close it and the short joints (jogs) between the
//! centre lines of plies riveted together. `A₀` is the area enclosed by that
//! centre-line polygon; `∮ds/t` runs over its walls (`L/t`, or
//! `L·ln(tb/ta)/(tb − ta)` for a wall of linearly varying thickness). A jog
//! carries the cell's shear flow through the plies' contact; it is given the
//! least thickness of the two walls it joins and of the cell walls meeting
//! it at its ends (for a cover plate on a channel's flange: the web's, as if
//! the web ran on to the plate's centre line — the usual hand idealisation,
//! conservative), and adds no area. Joints of zero length add nothing.

use super::Element;

/// The closed cell of a section's element graph.
pub(super) struct Cell {
    /// For every element: +1 / −1 when it lies on the cell and runs from its
    /// node `i` to `j` along / against the cell's direction; 0 off the cell.
    pub dir: Vec<i8>,
    /// `∫ds/t` of each element on the cell (0 off it).
    pub flex: Vec<f64>,
    /// Twice the area enclosed by the cell's centre line, signed by the
    /// cell's direction (positive anticlockwise).
    pub two_a0: f64,
    /// `∮ds/t` around the cell.
    pub oint: f64,
}

/// The cycle closed by element `closing` (not in the spanning tree `up`:
/// for every node the node and element it was reached from). `None` when
/// the cycle runs through a link between parts that do not touch, or
/// encloses no area, or a wall of it has no thickness.
pub(super) fn find(
    nodes: &[(f64, f64)],
    els: &[Element],
    lens: &[f64],
    up: &[Option<(usize, usize)>],
    closing: usize,
) -> Option<Cell> {
    let path = |mut n: usize| {
        let mut v = vec![n];
        while let Some((a, _)) = up[n] {
            n = a;
            v.push(n);
        }
        v
    };
    let (pi, pj) = (path(els[closing].i), path(els[closing].j));
    // Lowest common ancestor: the first node of j's path on i's path.
    let lca = *pj.iter().find(|n| pi.contains(n))?;
    // The directed edges (from, to, element) around the cell: the closing
    // element i → j, j up to the ancestor, down to i.
    let mut seq = vec![(els[closing].i, els[closing].j, closing)];
    for &n in pj.iter().take_while(|&&n| n != lca) {
        let (a, k) = up[n]?;
        seq.push((n, a, k));
    }
    let down: Vec<usize> = pi.iter().copied().take_while(|&n| n != lca).collect();
    for &n in down.iter().rev() {
        let (a, k) = up[n]?;
        seq.push((a, n, k));
    }
    let mut dir = vec![0i8; els.len()];
    for &(a, _, k) in &seq {
        dir[k] = if a == els[k].i { 1 } else { -1 };
    }
    // Thickness of element k at node n.
    let t_at = |k: usize, n: usize| if n == els[k].i { els[k].ta } else { els[k].tb };
    let tol = 1e-9 * lens.iter().fold(0.0, |m: f64, &l| m.max(l));
    let mut flex = vec![0.0; els.len()];
    let m = seq.len();
    for (idx, &(a, b, k)) in seq.iter().enumerate() {
        let (e, l) = (&els[k], lens[k]);
        if l <= tol {
            continue;
        }
        flex[k] = if e.ta > 0.0 && e.tb > 0.0 {
            if (e.ta - e.tb).abs() <= 1e-12 * e.ta {
                l / e.ta
            } else {
                l * (e.tb / e.ta).ln() / (e.tb - e.ta)
            }
        } else {
            // A jog: the least of the joined walls and its neighbours on the cell.
            let (prev, next) = (seq[(idx + m - 1) % m].2, seq[(idx + 1) % m].2);
            let t = [e.jog?, t_at(prev, a), t_at(next, b)]
                .into_iter()
                .filter(|t| *t > 0.0)
                .fold(f64::INFINITY, f64::min);
            if !t.is_finite() {
                return None;
            }
            l / t
        };
    }
    let two_a0: f64 = seq
        .iter()
        .map(|&(a, b, _)| nodes[a].0 * nodes[b].1 - nodes[b].0 * nodes[a].1)
        .sum();
    let oint: f64 = flex.iter().sum();
    let scale = tol / 1e-9;
    (two_a0.is_finite() && two_a0.abs() > 1e-9 * scale * scale && oint.is_finite() && oint > 0.0)
        .then_some(Cell {
            dir,
            flex,
            two_a0,
            oint,
        })
}
