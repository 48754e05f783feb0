//! The elastic (Euler) buckling stress, used on its own as the simplest
//! column curve (capped at yield) and as the elastic branch or reference
//! stress Fe of every other curve.

use super::curve::{ColumnCheck, Regime};
use std::f64::consts::PI;

/// Elastic critical stress of a pin-ended column, σe = π²E/(KL/r)²
/// (Euler; Timoshenko & Gere, *Theory of Elastic Stability*, Ch. 2, the
/// pin-ended column in stress form; the same quantity is Fe in AISC 360-16
/// Eq. E3-4, σcr in
/// EN 1993-1-1 §6.3.1.2 and Fe in CSA S16 clause 13.3.1).
///
/// Returns `+∞` for `slenderness == 0` (no buckling).
pub fn euler_stress(e: f64, slenderness: f64) -> f64 {
    PI * PI * e / (slenderness * slenderness)
}

/// Nominal stress of the capped Euler curve: min(σe, Fy).
/// Defined for `slenderness >= 0` (Fy at zero slenderness).
pub fn nominal_stress(fy: f64, e: f64, slenderness: f64) -> f64 {
    euler_stress(e, slenderness).min(fy)
}

/// Column check on the capped Euler curve, φ = 1.0. Inputs already validated.
pub(super) fn check(fy: f64, e: f64, slenderness: f64) -> ColumnCheck {
    let fe = euler_stress(e, slenderness);
    let (critical_stress, regime, formula) = if fe < fy {
        (fe, Regime::Elastic, "σcr = π²E/(KL/r)²")
    } else {
        (fy, Regime::Inelastic, "σcr = Fy (σe ≥ Fy, yield governs)")
    };
    ColumnCheck {
        euler_stress: fe,
        critical_stress,
        design_stress: critical_stress,
        resistance_factor: 1.0,
        regime,
        yields_before_buckling: fe > fy,
        clause: "Euler buckling σe = π²E/(KL/r)² (Timoshenko & Gere), capped at Fy",
        formula,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::capacity::curve::{column, Curve};
    use approx::assert_relative_eq;

    // Common practice: E = 29,000 ksi, Fy = 36 ksi (A36).
    const E: f64 = 29_000.0;
    const FY: f64 = 36.0;

    #[test]
    fn matches_closed_form() {
        // Closed form π²E/(KL/r)² (Timoshenko & Gere), evaluated by hand:
        // KL/r = 100: 9.8696044·29000/10000 = 28.6218528 ksi.
        assert_relative_eq!(euler_stress(E, 100.0), 28.621_852_8, max_relative = 1e-8);
        // KL/r = 200: 7.1554632 ksi.
        assert_relative_eq!(euler_stress(E, 200.0), 7.155_463_2, max_relative = 1e-7);
    }

    #[test]
    fn doubling_slenderness_quarters_the_stress() {
        // Closed form: σe ∝ 1/(KL/r)².
        for s in [30.0, 75.0, 140.0] {
            assert_relative_eq!(
                euler_stress(E, 2.0 * s),
                euler_stress(E, s) / 4.0,
                max_relative = 1e-12
            );
        }
    }

    #[test]
    fn capped_at_yield_with_correct_regime() {
        // KL/r = 50: σe = 114.49 ksi > Fy = 36 → Fy governs (closed form).
        let k = column(&Curve::Euler, FY, E, 50.0).unwrap();
        assert_eq!(k.critical_stress, FY);
        assert_eq!(k.regime, Regime::Inelastic);
        assert!(k.yields_before_buckling);
        assert_eq!(k.resistance_factor, 1.0);
        // KL/r = 150: σe = 12.72 ksi < Fy → elastic.
        let k = column(&Curve::Euler, FY, E, 150.0).unwrap();
        assert_relative_eq!(k.critical_stress, euler_stress(E, 150.0));
        assert_relative_eq!(k.critical_stress, 12.720_824, max_relative = 1e-6);
        assert_eq!(k.regime, Regime::Elastic);
        assert!(!k.yields_before_buckling);
        assert_eq!(nominal_stress(FY, E, 0.0), FY);
    }
}
