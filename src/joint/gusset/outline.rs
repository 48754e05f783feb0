//! Plane geometry of a gusset plate in joint coordinates (m, origin at the
//! panel point's work point, x and y as the truss's): the plate outline as
//! a polygon, lines through it, and the fastener positions of a pattern.

/// A point or vector.
pub type P = [f64; 2];

/// Parameters s where the line `o + s·d` crosses the polygon's edges, sorted.
fn crossings(poly: &[P], o: P, d: P) -> Vec<f64> {
    let mut out = Vec::new();
    let n = poly.len();
    for i in 0..n {
        let a = poly[i];
        let b = poly[(i + 1) % n];
        let e = [b[0] - a[0], b[1] - a[1]];
        let den = d[0] * e[1] - d[1] * e[0];
        if den.abs() < 1e-15 {
            continue; // parallel edge: its ends count through the neighbours
        }
        let w = [a[0] - o[0], a[1] - o[1]];
        let s = (w[0] * e[1] - w[1] * e[0]) / den;
        let u = (w[0] * d[1] - w[1] * d[0]) / den;
        // Half-open on the edge so that a vertex is counted once.
        if (0.0..1.0).contains(&u) {
            out.push(s);
        }
    }
    out.sort_by(f64::total_cmp);
    out
}

/// Whether `p` lies inside the polygon (even-odd rule).
pub fn inside(poly: &[P], p: P) -> bool {
    crossings(poly, p, [1.0, 0.0])
        .iter()
        .filter(|&&s| s > 0.0)
        .count()
        % 2
        == 1
}

/// Distance from `o` (inside) along the unit vector `d` to the plate edge.
pub fn reach(poly: &[P], o: P, d: P) -> f64 {
    crossings(poly, o, d)
        .into_iter()
        .filter(|&s| s > 0.0)
        .fold(f64::INFINITY, f64::min)
}

/// Length of plate cut by the whole line through `o` along the unit vector
/// `d`: the sum of its intervals inside the polygon.
pub fn cut_length(poly: &[P], o: P, d: P) -> f64 {
    let s = crossings(poly, o, d);
    s.chunks_exact(2).map(|c| c[1] - c[0]).sum()
}

/// Twice the signed area (positive counter-clockwise).
pub fn area2(poly: &[P]) -> f64 {
    let n = poly.len();
    (0..n)
        .map(|i| {
            let (a, b) = (poly[i], poly[(i + 1) % n]);
            a[0] * b[1] - b[0] * a[1]
        })
        .sum()
}

/// The fastener centres of a rectangular pattern on the axis `u` (unit
/// vector from the work point along the member): rows at `first`,
/// `first + pitch`, …; `lines` gauge lines centred on the axis, `gauge` apart.
pub fn fastener_positions(
    u: P,
    first: f64,
    rows: u32,
    pitch: f64,
    lines: u32,
    gauge: f64,
) -> Vec<P> {
    let n = [-u[1], u[0]];
    let mut out = Vec::with_capacity((rows * lines) as usize);
    for r in 0..rows {
        let a = first + f64::from(r) * pitch;
        for l in 0..lines {
            let b = (f64::from(l) - f64::from(lines - 1) / 2.0) * gauge;
            out.push([u[0] * a + n[0] * b, u[1] * a + n[1] * b]);
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn rect() -> Vec<P> {
        vec![[-2.0, -1.0], [2.0, -1.0], [2.0, 3.0], [-2.0, 3.0]]
    }

    #[test]
    fn a_rectangle_by_geometry() {
        let r = rect();
        assert!(inside(&r, [0.0, 0.0]));
        assert!(!inside(&r, [2.5, 0.0]));
        assert!((reach(&r, [0.0, 0.0], [1.0, 0.0]) - 2.0).abs() < 1e-12);
        assert!((reach(&r, [0.0, 0.0], [0.0, -1.0]) - 1.0).abs() < 1e-12);
        // A horizontal line at y = 1 cuts the 4-wide rectangle over 4.
        assert!((cut_length(&r, [0.0, 1.0], [1.0, 0.0]) - 4.0).abs() < 1e-12);
        // The 45° line through the origin runs from (-1,-1) to (2,2): 3·√2.
        let d = [0.5f64.sqrt(), 0.5f64.sqrt()];
        assert!((cut_length(&r, [0.0, 0.0], d) - 3.0 * 2f64.sqrt()).abs() < 1e-12);
        assert!((area2(&r) - 32.0).abs() < 1e-12);
    }

    #[test]
    fn a_notched_plate_cuts_in_two_intervals() {
        // A U-shaped plate: the line y = 2 crosses the notch between x = -1 and 1.
        let u = vec![
            [-3.0, 0.0],
            [3.0, 0.0],
            [3.0, 3.0],
            [1.0, 3.0],
            [1.0, 1.0],
            [-1.0, 1.0],
            [-1.0, 3.0],
            [-3.0, 3.0],
        ];
        assert!((cut_length(&u, [0.0, 2.0], [1.0, 0.0]) - 4.0).abs() < 1e-12);
        assert!(!inside(&u, [0.0, 2.0]));
    }

    #[test]
    fn pattern_positions() {
        // Two lines 3 apart, three rows 4 apart from 5 along +y.
        let p = fastener_positions([0.0, 1.0], 5.0, 3, 4.0, 2, 3.0);
        assert_eq!(p.len(), 6);
        assert_eq!(p[0], [1.5, 5.0]);
        assert_eq!(p[1], [-1.5, 5.0]);
        assert_eq!(p[5], [-1.5, 13.0]);
    }
}
