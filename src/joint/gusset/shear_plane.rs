//! Shear of the gusset plates on a full plane through the joint (MBE
//! 6A.6.12.6.6, from memory): a horizontal plane above (or below) the
//! chord, or a vertical plane at a chord splice, all plates summed.
//!
//!   shear yielding:  Vn = 0.58·Fy·Ag·Ω,  Ω = 0.88       (φvy = 1.00)
//!   shear fracture:  Vn = 0.58·Fu·Anv                   (φvu = 0.80)
//!
//! Ag = L·t·plates over the plate's full length L on the plane; Anv
//! deducts the holes the plane passes through. The demand is the force
//! the members on one side of the plane deliver along it (statics of the
//! free body cut off by the plane), the larger of the two sides.

/// Shear-yield reduction factor Ω of the MBE (from memory).
pub const OMEGA: f64 = 0.88;

/// Nominal shear-yield resistance, N.
pub fn yield_rn(fy: f64, length: f64, t: f64, plates: u32) -> f64 {
    0.58 * fy * length * t * f64::from(plates) * OMEGA
}

/// Net shear area, m², of `holes` of diameter `hole` on the plane.
pub fn net_area(length: f64, holes: u32, hole: f64, t: f64, plates: u32) -> f64 {
    (length - f64::from(holes) * hole).max(0.0) * t * f64::from(plates)
}

/// Nominal shear-fracture resistance, N.
pub fn fracture_rn(fu: f64, anv: f64) -> f64 {
    0.58 * fu * anv
}

/// The shear a plane carries: the component along the plane's direction
/// `d` of Σ Fᵢ·uᵢ over the members cut off by it (forces N, tension
/// positive, uᵢ the unit vector from the work point along member i).
pub fn demand(forces: &[(f64, [f64; 2])], d: [f64; 2]) -> f64 {
    let (x, y) = forces
        .iter()
        .fold((0.0, 0.0), |(x, y), &(f, u)| (x + f * u[0], y + f * u[1]));
    (x * d[0] + y * d[1]).abs()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn horizontal_plane_by_hand() {
        // Two 1/2 in plates, 40 in long on the plane, Fy 33, Fu 60 ksi,
        // the plane through one line of 4 holes of 15/16 in (hand calculation):
        //   yield:    0.58 × 33 × 40 × 0.5 × 2 × 0.88 = 673.728 kip
        //   fracture: Anv = (40 − 3.75) × 0.5 × 2 = 36.25 in²; 0.58 × 60 × 36.25 = 1261.5 kip
        assert!((yield_rn(33.0, 40.0, 0.5, 2) - 673.728).abs() < 1e-9);
        let anv = net_area(40.0, 4, 0.9375, 0.5, 2);
        assert!((anv - 36.25).abs() < 1e-12);
        assert!((fracture_rn(60.0, anv) - 1261.5).abs() < 1e-9);
    }

    #[test]
    fn demand_is_the_horizontal_component_of_the_webs() {
        // A Warren joint on the bottom chord: diagonals at 45° either side,
        // +100 (tension, up-right) and −100 (compression, up-left; its unit
        // vector points up-left): Fx = 100·0.7071 + (−100)·(−0.7071) = 141.42.
        let s = 0.5f64.sqrt();
        let v = demand(&[(100.0, [s, s]), (-100.0, [-s, s])], [1.0, 0.0]);
        assert!((v - 141.421_356).abs() < 1e-5, "{v}");
        // A vertical alone puts no shear on a horizontal plane.
        assert_eq!(demand(&[(50.0, [0.0, 1.0])], [1.0, 0.0]), 0.0);
    }
}
