//! The Johnson parabola: the classical inelastic column curve, tangent to the
//! Euler hyperbola at the transition slenderness Cc. Used unfactored as a
//! reference curve, and (divided by a safety factor) by the older bridge
//! allowable-stress formula in `bridge_asd`.

use super::curve::{ColumnCheck, Regime};
use super::euler::euler_stress;
use std::f64::consts::PI;

/// Transition slenderness Cc = √(2π²E/Fy), where the Johnson parabola meets
/// the Euler curve at σ = Fy/2 (closed form; the same Cc appears in the
/// AASHTO Standard Specifications allowable-stress column formula, from memory).
pub fn transition_slenderness(fy: f64, e: f64) -> f64 {
    (2.0 * PI * PI * e / fy).sqrt()
}

/// Johnson parabola σ = Fy − (Fy/2π)²(KL/r)²/E (closed form), valid for
/// KL/r ≤ Cc.
pub fn parabola(fy: f64, e: f64, slenderness: f64) -> f64 {
    let k = fy / (2.0 * PI);
    fy - k * k * slenderness * slenderness / e
}

/// Nominal stress of the Johnson–Euler curve: the parabola up to Cc, Euler
/// beyond. Defined for `slenderness >= 0`.
pub fn nominal_stress(fy: f64, e: f64, slenderness: f64) -> f64 {
    if slenderness <= transition_slenderness(fy, e) {
        parabola(fy, e, slenderness)
    } else {
        euler_stress(e, slenderness)
    }
}

/// Column check on the Johnson–Euler curve, φ = 1.0. Inputs already validated.
pub(super) fn check(fy: f64, e: f64, slenderness: f64) -> ColumnCheck {
    let fe = euler_stress(e, slenderness);
    let elastic = slenderness > transition_slenderness(fy, e);
    let (critical_stress, regime, formula) = if elastic {
        (fe, Regime::Elastic, "σcr = π²E/(KL/r)²  (KL/r > Cc)")
    } else {
        (
            parabola(fy, e, slenderness),
            Regime::Inelastic,
            "σcr = Fy − (Fy/2π)²(KL/r)²/E  (KL/r ≤ Cc)",
        )
    };
    ColumnCheck {
        euler_stress: fe,
        critical_stress,
        design_stress: critical_stress,
        resistance_factor: 1.0,
        regime,
        yields_before_buckling: fe > fy,
        clause: "Johnson parabola to Cc = √(2π²E/Fy), Euler beyond (closed form)",
        formula,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::capacity::curve::{column, Curve};
    use approx::assert_relative_eq;

    // Common practice: E = 29,000 ksi; older medium steel Fy = 33 ksi.
    const E: f64 = 29_000.0;
    const FY: f64 = 33.0;

    #[test]
    fn transition_slenderness_value() {
        // Closed form by hand: √(2·9.8696044·29000/33) = √17346.58 = 131.706.
        assert_relative_eq!(transition_slenderness(FY, E), 131.706, max_relative = 1e-5);
        // Common practice: for A36 steel Cc ≈ 126.1 (from memory).
        assert_relative_eq!(transition_slenderness(36.0, E), 126.1, epsilon = 0.05);
    }

    #[test]
    fn meets_euler_with_equal_value_and_slope() {
        // Closed form: both curves equal Fy/2 at Cc, both slopes equal −Fy/Cc.
        let cc = transition_slenderness(FY, E);
        assert_relative_eq!(parabola(FY, E, cc), FY / 2.0, max_relative = 1e-12);
        assert_relative_eq!(euler_stress(E, cc), FY / 2.0, max_relative = 1e-12);
        // Central finite differences, step h.
        let h = 1e-4;
        let d_par = (parabola(FY, E, cc + h) - parabola(FY, E, cc - h)) / (2.0 * h);
        let d_eul = (euler_stress(E, cc + h) - euler_stress(E, cc - h)) / (2.0 * h);
        assert_relative_eq!(d_par, d_eul, max_relative = 1e-6);
        assert_relative_eq!(d_par, -FY / cc, max_relative = 1e-6);
        // One-sided differences of the combined curve agree across Cc.
        let left = (nominal_stress(FY, E, cc) - nominal_stress(FY, E, cc - h)) / h;
        let right = (nominal_stress(FY, E, cc + h) - nominal_stress(FY, E, cc)) / h;
        assert_relative_eq!(left, right, max_relative = 1e-4);
    }

    #[test]
    fn branches_and_regime() {
        let cc = transition_slenderness(FY, E);
        // Closed form by hand at KL/r = 60: 33 − (33/2π)²·3600/29000 = 33 − 3.4244 = 29.5756.
        let k = column(&Curve::Johnson, FY, E, 60.0).unwrap();
        assert_relative_eq!(k.critical_stress, 29.5756, max_relative = 1e-5);
        assert_eq!(k.regime, Regime::Inelastic);
        assert_eq!(k.design_stress, k.critical_stress);
        let k = column(&Curve::Johnson, FY, E, cc * 1.2).unwrap();
        assert_relative_eq!(k.critical_stress, euler_stress(E, cc * 1.2));
        assert_eq!(k.regime, Regime::Elastic);
        assert_eq!(nominal_stress(FY, E, 0.0), FY);
    }
}
