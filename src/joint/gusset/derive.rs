//! Dimensions a joint's geometry gives when the model does not: the edge
//! distance of a pattern (from the plate outline) and the free length
//! Lmid of its Whitmore column (to the nearest fastener line of an
//! adjacent member, MBE 6A.6.12.6.8 as recalled).

use super::outline::{reach, P};
use super::types::FastenerGroup;

/// Least distance along the member axis from a fastener of the outermost
/// row to the plate edge, m (infinite if the outline does not close that way).
pub fn edge(poly: &[P], g: &FastenerGroup) -> f64 {
    let per_row = g.lines as usize;
    let p = g.positions();
    let last = &p[p.len().saturating_sub(per_row)..];
    last.iter()
        .map(|&q| reach(poly, q, g.axis))
        .fold(f64::INFINITY, f64::min)
}

/// Distance from the Whitmore centre of group `i`, back along its axis
/// toward the work point, to the first gauge line of another group it
/// crosses (each line taken between its extreme fasteners); None if none.
pub fn lmid(groups: &[FastenerGroup], i: usize) -> Option<f64> {
    let g = &groups[i];
    let c = g.whitmore_centre();
    let d = [-g.axis[0], -g.axis[1]];
    let mut best: Option<f64> = None;
    for (k, h) in groups.iter().enumerate() {
        if k == i {
            continue;
        }
        let p = h.positions();
        let lines = h.lines as usize;
        for l in 0..lines {
            let a = p[l];
            let b = p[p.len() - lines + l];
            if let Some(s) = ray_segment(c, d, a, b) {
                best = Some(best.map_or(s, |x: f64| x.min(s)));
            }
        }
    }
    best
}

/// Parameter s > 0 where the ray o + s·d meets segment ab.
fn ray_segment(o: P, d: P, a: P, b: P) -> Option<f64> {
    let e = [b[0] - a[0], b[1] - a[1]];
    let den = d[0] * e[1] - d[1] * e[0];
    if den.abs() < 1e-15 {
        return None;
    }
    let w = [a[0] - o[0], a[1] - o[1]];
    let s = (w[0] * e[1] - w[1] * e[0]) / den;
    let u = (w[0] * d[1] - w[1] * d[0]) / den;
    (s > 0.0 && (-1e-9..=1.0 + 1e-9).contains(&u)).then_some(s)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::joint::gusset::types::Fastener;

    fn group(axis: P, first: f64, rows: u32, lines: u32, offset: f64) -> FastenerGroup {
        FastenerGroup {
            members: vec![0],
            axis,
            fastener: Fastener::Rivet {
                fv: 1.0,
                basis: String::new(),
            },
            diameter: 0.875,
            hole: 0.9375,
            lines,
            rows,
            pitch: 3.0,
            gauge: 3.0,
            first_row: first,
            offset,
            edge: 0.0,
            planes: 1,
            lmid: 0.0,
        }
    }

    #[test]
    fn edge_and_lmid_by_geometry() {
        // A vertical member, rows at y = 8, 11, 14, lines at x = ±1.5, on a
        // plate reaching y = 16: edge = 16 − 14 = 2 (geometry).
        let poly = vec![[-20.0, -4.0], [20.0, -4.0], [20.0, 16.0], [-20.0, 16.0]];
        let v = group([0.0, 1.0], 8.0, 3, 2, 0.0);
        assert!((edge(&poly, &v) - 2.0).abs() < 1e-12);
        // A chord running through along x with its two lines at y = ±1.5 from
        // x = −12 to 12: the vertical's Whitmore centre (0, 8) comes down
        // to the upper chord line y = 1.5 after 6.5 (geometry).
        let chord = group([1.0, 0.0], -12.0, 9, 2, 0.0);
        let gs = vec![v, chord];
        assert!((lmid(&gs, 0).unwrap() - 6.5).abs() < 1e-12);
        // The chord's own Whitmore centre meets no other line going back.
        assert_eq!(lmid(&gs, 1), None);
    }
}
