//! CSA S16 axial compressive resistance (clause 13.3.1), the single
//! continuous column curve of the Canadian steel standard, with its two
//! exponents n = 1.34 and n = 2.24.

use super::curve::{aisc_regime, ColumnCheck};
use super::euler::euler_stress;

/// Resistance factor for structural steel, CSA S16 clause 13.1(a): φ = 0.90.
pub const PHI: f64 = 0.90;

/// Non-dimensional slenderness, CSA S16 clause 13.3.1: λ = √(Fy/Fe).
pub fn lambda(fy: f64, fe: f64) -> f64 {
    (fy / fe).sqrt()
}

/// Unfactored curve value Fy·(1 + λ^(2n))^(−1/n), from CSA S16 clause 13.3.1,
/// Cr = φ·A·Fy·(1 + λ^(2n))^(−1/n), with Fe = π²E/(KL/r)². Defined for
/// `slenderness >= 0` (Fy at zero slenderness).
pub fn nominal_stress(fy: f64, e: f64, slenderness: f64, n: f64) -> f64 {
    let l = lambda(fy, euler_stress(e, slenderness));
    curve_value(fy, l, n)
}

fn curve_value(fy: f64, lambda: f64, n: f64) -> f64 {
    // Written as exp(−ln(1 + λ^2n)/n) so that very large λ underflows to 0
    // instead of producing ∞^(−1/n) surprises.
    fy * (-(lambda.powf(2.0 * n)).ln_1p() / n).exp()
}

/// Column check on CSA S16 clause 13.3.1, design stress Cr/A = φ·Fy(1+λ²ⁿ)^(−1/n).
/// Inputs already validated.
pub(super) fn check(fy: f64, e: f64, slenderness: f64, n: f64) -> ColumnCheck {
    let fe = euler_stress(e, slenderness);
    let critical_stress = curve_value(fy, lambda(fy, fe), n);
    ColumnCheck {
        euler_stress: fe,
        critical_stress,
        design_stress: critical_stress * PHI,
        resistance_factor: PHI,
        regime: aisc_regime(fy, fe),
        yields_before_buckling: fe > fy,
        clause: "CSA S16 cl. 13.3.1, Cr = φ·A·Fy·(1 + λ^2n)^(−1/n)",
        formula: "Fcr = Fy·(1 + λ^2n)^(−1/n), λ = √(Fy/Fe)",
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::capacity::curve::{column, Curve};
    use approx::assert_relative_eq;

    // Common practice: E = 200,000 MPa (CSA S16 cl. 8.1 value), Fy = 350 MPa (350W).
    const E: f64 = 200_000.0;
    const FY: f64 = 350.0;

    /// KL/r that gives the requested λ: KL/r = λ·π·√(E/Fy).
    fn slenderness_for(l: f64) -> f64 {
        l * std::f64::consts::PI * (E / FY).sqrt()
    }

    #[test]
    fn matches_clause_13_3_1_at_several_lambda() {
        // Closed form (1 + λ^2n)^(−1/n) evaluated by hand:
        // λ = 1: 2^(−1/1.34) = 0.59614, 2^(−1/2.24) = 0.73386;
        // λ = 0.5, n = 1.34: (1 + 0.5^2.68)^(−0.7463) = 0.89744;
        // λ = 2,  n = 1.34: (1 + 2^2.68)^(−0.7463) = 0.22436;
        // λ = 2,  n = 2.24: (1 + 2^4.48)^(−0.4464) = 0.24516.
        let cases = [
            (1.34, 1.0, 0.59614),
            (2.24, 1.0, 0.73386),
            (1.34, 0.5, 0.89744),
            (2.24, 0.5, 0.98062),
            (1.34, 2.0, 0.22436),
            (2.24, 2.0, 0.24516),
        ];
        for (n, l, ratio) in cases {
            let v = nominal_stress(FY, E, slenderness_for(l), n);
            assert!((v / FY - ratio).abs() < 1e-5, "n = {n}, λ = {l}");
        }
    }

    #[test]
    fn column_check_both_exponents() {
        // λ = 1 closed form; the design stress carries φ = 0.90 (cl. 13.1).
        let s = slenderness_for(1.0);
        let k = column(&Curve::from_name("csa-s16").unwrap(), FY, E, s).unwrap();
        assert_relative_eq!(
            k.critical_stress,
            FY * 2f64.powf(-1.0 / 1.34),
            max_relative = 1e-12
        );
        assert_relative_eq!(
            k.design_stress,
            0.9 * k.critical_stress,
            max_relative = 1e-12
        );
        let k2 = column(&Curve::from_name("csa-s16-2.24").unwrap(), FY, E, s).unwrap();
        assert_relative_eq!(
            k2.critical_stress,
            FY * 2f64.powf(-1.0 / 2.24),
            max_relative = 1e-12
        );
        // Low-residual-stress curve is higher (closed form, larger n).
        assert!(k2.critical_stress > k.critical_stress);
        assert_eq!(nominal_stress(FY, E, 0.0, 1.34), FY);
    }

    #[test]
    fn extreme_slenderness_stays_finite() {
        // λ = 1e6: (1 + λ^2.68)^(−1/1.34) ≈ λ^−2 = 1e−12 (closed form asymptote).
        let v = nominal_stress(FY, E, slenderness_for(1e6), 1.34);
        assert!(v.is_finite() && v > 0.0);
        assert_relative_eq!(v / FY, 1e-12, max_relative = 1e-6);
    }
}
