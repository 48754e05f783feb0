//! The Whitmore section of a member's fastener pattern (MBE 6A.6.12.6.2,
//! from memory; Whitmore 1952): lines spread at 30° from the outer
//! fasteners of the first row (farthest from the work point) to the last
//! row (nearest the work point), where the effective width is
//!
//!   Lw = (lines − 1)·g + 2·(rows − 1)·s·tan 30°
//!
//! truncated at the plate edges: each half no wider than the plate reaches
//! on that side of the member axis at the last row.

use super::outline::{reach, P};

/// The 30° spread width, m.
pub fn spread_width(lines: u32, gauge: f64, rows: u32, pitch: f64) -> f64 {
    let tan30 = (30f64).to_radians().tan();
    f64::from(lines.saturating_sub(1)) * gauge
        + 2.0 * f64::from(rows.saturating_sub(1)) * pitch * tan30
}

/// The spread width truncated at the plate edges: `left` and `right` are
/// the plate's reach from the member axis on either side, m.
pub fn truncated(width: f64, left: f64, right: f64) -> f64 {
    (width / 2.0).min(left) + (width / 2.0).min(right)
}

/// The Whitmore width of a pattern on axis `u` whose section is centred
/// at `c` (the row nearest the work point), within plate `poly`:
/// (effective width, spread width).
pub fn width_in_plate(poly: &[P], c: P, u: P, spread: f64) -> (f64, f64) {
    let n = [-u[1], u[0]];
    let left = reach(poly, c, n);
    let right = reach(poly, c, [-n[0], -n[1]]);
    (truncated(spread, left, right), spread)
}

/// The ends of the truncated Whitmore section (for drawings): the points
/// on either side of centre `c`, across axis `u`, within plate `poly`.
pub fn section_ends(poly: &[P], c: P, u: P, spread: f64) -> (P, P) {
    let n = [-u[1], u[0]];
    let left = (spread / 2.0).min(reach(poly, c, n));
    let right = (spread / 2.0).min(reach(poly, c, [-n[0], -n[1]]));
    (
        [c[0] + n[0] * left, c[1] + n[1] * left],
        [c[0] - n[0] * right, c[1] - n[1] * right],
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn spread_of_a_simple_pattern_by_geometry() {
        // 2 lines at 3 in gauge, 4 rows at 3 in pitch: the 30° lines leave
        // the outer fasteners of the first row and travel 9 in, spreading
        // 9·tan 30° = 5.196 in each side: Lw = 3 + 2 × 5.196 = 13.392 in.
        let w = spread_width(2, 3.0, 4, 3.0);
        assert!((w - (3.0 + 18.0 / 3f64.sqrt())).abs() < 1e-12, "{w}");
        // One row: the section is the gauge width only.
        assert!((spread_width(3, 2.5, 1, 3.0) - 5.0).abs() < 1e-12);
    }

    #[test]
    fn truncated_at_the_plate_edge() {
        // A vertical member on a plate 10 wide, offset: axis 3 from the left
        // edge, 7 from the right; spread 13.392 → 3 + 6.696 = 9.696.
        let poly = vec![[-3.0, 0.0], [7.0, 0.0], [7.0, 20.0], [-3.0, 20.0]];
        let (w, s) = width_in_plate(&poly, [0.0, 5.0], [0.0, 1.0], 13.392);
        assert!((s - 13.392).abs() < 1e-12);
        assert!((w - 9.696).abs() < 1e-12, "{w}");
        // Wide plate: untruncated.
        let wide = vec![[-30.0, 0.0], [30.0, 0.0], [30.0, 20.0], [-30.0, 20.0]];
        assert!((width_in_plate(&wide, [0.0, 5.0], [0.0, 1.0], 13.392).0 - 13.392).abs() < 1e-12);
    }
}
