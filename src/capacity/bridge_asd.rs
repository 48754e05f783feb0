//! The allowable-stress column formula of the older bridge specifications
//! (a Johnson parabola / Euler curve divided by one safety factor), kept so
//! that existing trusses can be re-rated on the basis they were designed and
//! previously rated on.

use super::curve::{ColumnCheck, Regime};
use super::euler::euler_stress;
use super::johnson::{parabola, transition_slenderness};

/// Default safety factor FS = 2.12 of the AASHTO Standard Specifications
/// (allowable stress) column formula, §10.32, Table 10.32.1A (from memory).
pub const DEFAULT_SAFETY_FACTOR: f64 = 2.12;

/// Nominal (unfactored) curve value of the AASHTO Standard Specifications
/// (allowable stress) column formula, §10.32, Table 10.32.1A (from memory):
/// Fy − (Fy/2π)²(KL/r)²/E for KL/r ≤ Cc = √(2π²E/Fy), π²E/(KL/r)² beyond.
/// The allowable stress is this value divided by FS. Defined for
/// `slenderness >= 0`.
pub fn nominal_stress(fy: f64, e: f64, slenderness: f64) -> f64 {
    // The same Johnson–Euler curve, before the safety factor.
    super::johnson::nominal_stress(fy, e, slenderness)
}

/// Allowable axial compressive stress Fa, AASHTO Standard Specifications
/// (allowable stress) column formula (from memory):
/// Fa = [Fy − (Fy/2π)²(KL/r)²/E]/FS for KL/r ≤ Cc, Fa = π²E/(FS·(KL/r)²) beyond.
pub fn allowable_stress(fy: f64, e: f64, slenderness: f64, safety_factor: f64) -> f64 {
    nominal_stress(fy, e, slenderness) / safety_factor
}

/// Column check on the bridge allowable-stress formula; resistance factor 1/FS.
/// Inputs already validated.
pub(super) fn check(fy: f64, e: f64, slenderness: f64, safety_factor: f64) -> ColumnCheck {
    let fe = euler_stress(e, slenderness);
    let elastic = slenderness > transition_slenderness(fy, e);
    let (critical_stress, regime, formula) = if elastic {
        (fe, Regime::Elastic, "Fa = π²E/(FS·(KL/r)²)  (KL/r > Cc)")
    } else {
        (
            parabola(fy, e, slenderness),
            Regime::Inelastic,
            "Fa = [Fy − (Fy/2π)²(KL/r)²/E]/FS  (KL/r ≤ Cc)",
        )
    };
    let factor = 1.0 / safety_factor;
    ColumnCheck {
        euler_stress: fe,
        critical_stress,
        design_stress: critical_stress * factor,
        resistance_factor: factor,
        regime,
        yields_before_buckling: fe > fy,
        clause: "AASHTO Standard Specifications (allowable stress) column formula, §10.32, Table 10.32.1A (from memory)",
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
    fn allowable_stress_hand_values() {
        // Hand calculation, FS = 2.12:
        // KL/r = 0:   33/2.12 = 15.566 ksi;
        // KL/r = 60:  (33 − (33/2π)²·3600/29000)/2.12 = 29.5757/2.12 = 13.951 ksi;
        // KL/r = 150: π²·29000/(2.12·22500) = 6.0004 ksi (Cc = 131.7, Euler branch).
        let fs = DEFAULT_SAFETY_FACTOR;
        assert!((allowable_stress(FY, E, 0.0, fs) - 15.566).abs() < 5e-4);
        assert!((allowable_stress(FY, E, 60.0, fs) - 13.951).abs() < 5e-4);
        assert!((allowable_stress(FY, E, 150.0, fs) - 6.0004).abs() < 5e-4);
        // From memory: the familiar simplified form for Fy = 33 ksi,
        // Fa = 15,000 − ¼(KL/r)² psi, is close to the exact one at KL/r = 60.
        let simplified = (15_000.0 - 0.25 * 3600.0) / 1000.0;
        assert!((allowable_stress(FY, E, 60.0, fs) - simplified).abs() < 0.2);
    }

    #[test]
    fn column_check_fields() {
        let curve = Curve::from_name("bridge-asd").unwrap();
        assert_eq!(
            curve,
            Curve::BridgeAsd {
                safety_factor: 2.12
            }
        );
        let k = column(&curve, FY, E, 60.0).unwrap();
        assert_eq!(k.regime, Regime::Inelastic);
        assert_relative_eq!(k.critical_stress, 29.5757, max_relative = 1e-5);
        assert_relative_eq!(k.resistance_factor, 1.0 / 2.12);
        assert_relative_eq!(
            k.design_stress,
            k.critical_stress / 2.12,
            max_relative = 1e-12
        );
        let k = column(&curve, FY, E, 150.0).unwrap();
        assert_eq!(k.regime, Regime::Elastic);
        assert_relative_eq!(k.critical_stress, k.euler_stress);
        // A different FS scales the allowable stress inversely (closed form).
        let k17 = column(&Curve::BridgeAsd { safety_factor: 1.7 }, FY, E, 150.0).unwrap();
        assert_relative_eq!(
            k17.design_stress * 1.7,
            k.design_stress * 2.12,
            max_relative = 1e-12
        );
    }
}
