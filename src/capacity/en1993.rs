//! EN 1993-1-1 flexural buckling of uniform members in compression
//! (§6.3.1), with the five buckling curves a0–d, so that trusses can be
//! rated on the European curves alongside the North American ones.

use super::curve::{aisc_regime, BucklingClass, ColumnCheck};
use super::euler::euler_stress;

/// Non-dimensional slenderness, EN 1993-1-1 §6.3.1.2, Eq. 6.50:
/// λ̄ = √(A·fy/Ncr) = √(fy/σcr) for Class 1–3 sections.
pub fn lambda_bar(fy: f64, sigma_cr: f64) -> f64 {
    (fy / sigma_cr).sqrt()
}

/// Reduction factor χ, EN 1993-1-1 §6.3.1.2, Eq. 6.49:
/// χ = 1/(Φ + √(Φ² − λ̄²)) ≤ 1, Φ = 0.5[1 + α(λ̄ − 0.2) + λ̄²];
/// χ = 1 for λ̄ ≤ 0.2 (§6.3.1.2(4)). Returns 0 for λ̄ = +∞.
/// Expects λ̄ ≥ 0 and α ≥ 0 (Table 6.1 values).
pub fn chi(lambda_bar: f64, alpha: f64) -> f64 {
    if lambda_bar <= 0.2 {
        return 1.0;
    }
    if lambda_bar.is_infinite() {
        return 0.0;
    }
    let phi = 0.5 * (1.0 + alpha * (lambda_bar - 0.2) + lambda_bar * lambda_bar);
    let root = (phi * phi - lambda_bar * lambda_bar).max(0.0).sqrt();
    (1.0 / (phi + root)).min(1.0)
}

/// Nominal buckling stress χ·fy, EN 1993-1-1 §6.3.1.2, Eqs. 6.49–6.50 with
/// σcr = π²E/(L/i)². Defined for `slenderness >= 0` (fy at zero slenderness).
pub fn nominal_stress(fy: f64, e: f64, slenderness: f64, class: BucklingClass) -> f64 {
    let sigma_cr = euler_stress(e, slenderness);
    chi(lambda_bar(fy, sigma_cr), class.alpha()) * fy
}

/// Column check on EN 1993-1-1 §6.3.1, design stress Nb,Rd/A = χ·fy/γM1
/// (Eq. 6.47). Inputs already validated.
pub(super) fn check(
    fy: f64,
    e: f64,
    slenderness: f64,
    class: BucklingClass,
    gamma_m1: f64,
) -> ColumnCheck {
    let sigma_cr = euler_stress(e, slenderness);
    let lb = lambda_bar(fy, sigma_cr);
    let critical_stress = chi(lb, class.alpha()) * fy;
    let (clause, formula) = if lb <= 0.2 {
        (
            "EN 1993-1-1 §6.3.1.2(4) (λ̄ ≤ 0.2, χ = 1), Eq. 6.47",
            "χ = 1; Nb,Rd/A = fy/γM1",
        )
    } else {
        (
            "EN 1993-1-1 §6.3.1.2, Eqs. 6.47, 6.49, 6.50",
            "χ = 1/(Φ + √(Φ² − λ̄²)), Φ = 0.5[1 + α(λ̄ − 0.2) + λ̄²], λ̄ = √(fy/σcr)",
        )
    };
    let factor = 1.0 / gamma_m1;
    ColumnCheck {
        euler_stress: sigma_cr,
        critical_stress,
        design_stress: critical_stress * factor,
        resistance_factor: factor,
        regime: aisc_regime(fy, sigma_cr),
        yields_before_buckling: sigma_cr > fy,
        clause,
        formula,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::capacity::curve::{column, Curve, Regime};
    use approx::assert_relative_eq;

    const CLASSES: [BucklingClass; 5] = [
        BucklingClass::A0,
        BucklingClass::A,
        BucklingClass::B,
        BucklingClass::C,
        BucklingClass::D,
    ];

    #[test]
    fn chi_is_one_up_to_0_2() {
        // EN 1993-1-1 §6.3.1.2(4): χ = 1 for λ̄ ≤ 0.2; Eq. 6.49 itself gives 1 at 0.2.
        for c in CLASSES {
            assert_eq!(chi(0.0, c.alpha()), 1.0);
            assert_eq!(chi(0.2, c.alpha()), 1.0);
            assert_relative_eq!(chi(0.2 + 1e-12, c.alpha()), 1.0, max_relative = 1e-9);
            assert!(chi(0.25, c.alpha()) < 1.0);
        }
    }

    #[test]
    fn chi_at_1_0_and_2_0() {
        // Eq. 6.49 evaluated by hand to 4 d.p. (closed form). At λ̄ = 1.0 the
        // a, b, c, d values agree with the χ tables of design handbooks
        // (0.6656, 0.5970, 0.5399, 0.4671, from memory); curve a0 gives 0.7253.
        let at_1 = [0.7253, 0.6656, 0.5970, 0.5399, 0.4671];
        let at_2 = [0.2323, 0.2229, 0.2095, 0.1962, 0.1766];
        for (i, c) in CLASSES.iter().enumerate() {
            assert!((chi(1.0, c.alpha()) - at_1[i]).abs() < 5e-5, "{c:?} at 1.0");
            assert!((chi(2.0, c.alpha()) - at_2[i]).abs() < 5e-5, "{c:?} at 2.0");
        }
    }

    #[test]
    fn chi_solves_the_perry_robertson_quadratic() {
        // Closed form: χ is the smaller root of λ̄²χ² − 2Φχ + 1 = 0.
        for c in CLASSES {
            let a = c.alpha();
            for i in 3..=60 {
                let l = i as f64 * 0.1;
                let x = chi(l, a);
                let phi = 0.5 * (1.0 + a * (l - 0.2) + l * l);
                assert!((l * l * x * x - 2.0 * phi * x + 1.0).abs() < 1e-12);
                assert!(x > 0.0 && x < 1.0);
                // Below the Euler hyperbola χ ≤ 1/λ̄² (closed form bound).
                assert!(x <= 1.0 / (l * l) + 1e-12);
            }
        }
        assert_eq!(chi(f64::INFINITY, 0.34), 0.0);
    }

    #[test]
    fn curves_are_ordered_a0_to_d() {
        // Closed form: larger α gives a lower curve for every λ̄ > 0.2.
        for i in 3..=30 {
            let l = i as f64 * 0.1;
            for w in CLASSES.windows(2) {
                assert!(chi(l, w[0].alpha()) > chi(l, w[1].alpha()));
            }
        }
    }

    #[test]
    fn column_check_with_partial_factor() {
        // Common practice (EN 1993-1-1 §3.2.6): E = 210,000 MPa; S355, fy = 355 MPa.
        // KL/r = π√(E/fy) puts σcr = fy, λ̄ = 1.0, so χ = 0.5970 on curve b
        // (closed form, Eq. 6.49) and χ·fy = 211.9 MPa.
        let (e, fy): (f64, f64) = (210_000.0, 355.0);
        let s = std::f64::consts::PI * (e / fy).sqrt();
        let curve = Curve::En1993 {
            class: BucklingClass::B,
            gamma_m1: 1.1,
        };
        let k = column(&curve, fy, e, s).unwrap();
        assert_relative_eq!(k.euler_stress, fy, max_relative = 1e-12);
        assert!((k.critical_stress - 211.9).abs() < 0.05);
        assert_relative_eq!(
            k.design_stress,
            k.critical_stress / 1.1,
            max_relative = 1e-12
        );
        assert_relative_eq!(k.resistance_factor, 1.0 / 1.1);
        assert_eq!(k.regime, Regime::Inelastic);
        assert_eq!(k.clause, "EN 1993-1-1 §6.3.1.2, Eqs. 6.47, 6.49, 6.50");
        // Stocky member (λ̄ < 0.2): χ = 1, §6.3.1.2(4).
        let k = column(&curve, fy, e, 10.0).unwrap();
        assert_eq!(k.critical_stress, fy);
        assert!(k.clause.contains("6.3.1.2(4)"));
        assert_eq!(nominal_stress(fy, e, 0.0, BucklingClass::D), fy);
    }
}
