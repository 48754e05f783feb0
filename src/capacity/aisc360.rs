//! AISC 360-16 Chapter E flexural buckling of members without slender
//! elements (§E3), the default column curve of the tool, in LRFD or ASD form.

use super::curve::{aisc_regime, ColumnCheck, DesignMethod, Regime};
use super::euler::euler_stress;

/// Resistance factor for compression, AISC 360-16 §E1(a): φc = 0.90.
pub const PHI_C: f64 = 0.90;
/// Safety factor for compression, AISC 360-16 §E1(b): Ωc = 1.67.
pub const OMEGA_C: f64 = 1.67;

/// The branch limit as printed in AISC 360-16 §E3(a): Lc/r = 4.71√(E/Fy).
///
/// The standard gives the equivalent form Fy/Fe ≤ 2.25, which is exact at
/// Lc/r = 1.5π√(E/Fy) = 4.712√(E/Fy); [`nominal_stress`] switches on the
/// ratio form. The two positions differ by 0.05 % in slenderness and the
/// curve values there by less than 0.1 %.
pub fn switch_slenderness(fy: f64, e: f64) -> f64 {
    4.71 * (e / fy).sqrt()
}

/// AISC 360-16 §E3, Eq. E3-2: Fcr = 0.658^(Fy/Fe)·Fy, used when Fy/Fe ≤ 2.25.
pub fn inelastic_fcr(fy: f64, fe: f64) -> f64 {
    0.658_f64.powf(fy / fe) * fy
}

/// AISC 360-16 §E3, Eq. E3-3: Fcr = 0.877·Fe, used when Fy/Fe > 2.25.
pub fn elastic_fcr(fe: f64) -> f64 {
    0.877 * fe
}

/// Nominal critical stress Fcr, AISC 360-16 §E3, Eq. E3-2 or E3-3 with Fe
/// from Eq. E3-4, Fe = π²E/(Lc/r)². Defined for `slenderness >= 0`
/// (Fcr = Fy at zero slenderness).
///
/// This is the same form as AASHTO LRFD Bridge Design Specifications
/// Art. 6.9.4.1 (Pn = 0.658^(Po/Pe)·Po for Pe/Po ≥ 0.44, else 0.877·Pe;
/// from memory), so the curve serves LRFR of steel truss members with the
/// bridge code's own φc substituted by the caller.
pub fn nominal_stress(fy: f64, e: f64, slenderness: f64) -> f64 {
    let fe = euler_stress(e, slenderness);
    if fy <= 2.25 * fe {
        inelastic_fcr(fy, fe)
    } else {
        elastic_fcr(fe)
    }
}

/// The factor applied to Fcr: φc (LRFD) or 1/Ωc (ASD), AISC 360-16 §E1.
pub fn resistance_factor(method: DesignMethod) -> f64 {
    match method {
        DesignMethod::Lrfd => PHI_C,
        DesignMethod::Asd => 1.0 / OMEGA_C,
    }
}

/// Column check on AISC 360-16 §E3. Inputs already validated.
pub(super) fn check(fy: f64, e: f64, slenderness: f64, method: DesignMethod) -> ColumnCheck {
    let fe = euler_stress(e, slenderness);
    let regime = aisc_regime(fy, fe);
    let critical_stress = nominal_stress(fy, e, slenderness);
    let (clause, formula) = match regime {
        Regime::Elastic => (
            "AISC 360-16 §E3, Eq. E3-3 (Fe by Eq. E3-4)",
            "Fcr = 0.877·Fe",
        ),
        _ => (
            "AISC 360-16 §E3, Eq. E3-2 (Fe by Eq. E3-4)",
            "Fcr = 0.658^(Fy/Fe)·Fy",
        ),
    };
    let phi = resistance_factor(method);
    ColumnCheck {
        euler_stress: fe,
        critical_stress,
        design_stress: critical_stress * phi,
        resistance_factor: phi,
        regime,
        yields_before_buckling: fe > fy,
        clause,
        formula,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::capacity::curve::{column, Curve};
    use approx::assert_relative_eq;

    // Common practice: structural steel E = 29,000 ksi.
    const E: f64 = 29_000.0;

    const SLENDERNESS: [f64; 9] = [0.0, 20.0, 50.0, 80.0, 100.0, 120.0, 133.7, 150.0, 200.0];

    /// Design stress via the per-file function (allows KL/r = 0).
    fn design(fy: f64, s: f64, method: DesignMethod) -> f64 {
        nominal_stress(fy, E, s) * resistance_factor(method)
    }

    #[test]
    fn table_4_14_fy36() {
        // AISC Manual Table 4-14, Fy = 36 ksi, φcFcr and Fcr/Ωc in ksi
        // (from memory, each re-derived by hand with Eqs. E3-2/E3-3 to 0.01 ksi).
        let lrfd = [32.40, 31.73, 28.40, 23.13, 19.14, 15.18, 12.64, 10.04, 5.65];
        let asd = [21.56, 21.11, 18.90, 15.39, 12.73, 10.10, 8.41, 6.68, 3.76];
        for (i, &s) in SLENDERNESS.iter().enumerate() {
            assert!(
                (design(36.0, s, DesignMethod::Lrfd) - lrfd[i]).abs() <= 0.05,
                "LRFD KL/r = {s}"
            );
            assert!(
                (design(36.0, s, DesignMethod::Asd) - asd[i]).abs() <= 0.05,
                "ASD KL/r = {s}"
            );
        }
    }

    #[test]
    fn table_4_14_fy50() {
        // AISC Manual Table 4-14, Fy = 50 ksi (from memory, re-derived by hand
        // to 0.01 ksi). Beyond 113.4 the elastic branch makes values
        // independent of Fy, so 133.7–200 repeat the Fy = 36 column.
        let lrfd = [45.00, 43.70, 37.48, 28.18, 21.66, 15.69, 12.64, 10.04, 5.65];
        let asd = [29.94, 29.08, 24.94, 18.75, 14.41, 10.44, 8.41, 6.68, 3.76];
        for (i, &s) in SLENDERNESS.iter().enumerate() {
            assert!(
                (design(50.0, s, DesignMethod::Lrfd) - lrfd[i]).abs() <= 0.05,
                "LRFD KL/r = {s}"
            );
            assert!(
                (design(50.0, s, DesignMethod::Asd) - asd[i]).abs() <= 0.05,
                "ASD KL/r = {s}"
            );
        }
    }

    #[test]
    fn public_column_matches_table_and_reports_branch() {
        // AISC Manual Table 4-14, Fy = 36, KL/r = 100 → φcFcr = 19.14 ksi (from memory).
        let k = column(&Curve::default_curve(), 36.0, E, 100.0).unwrap();
        assert!((k.design_stress - 19.14).abs() <= 0.05);
        assert_eq!(k.regime, Regime::Inelastic);
        assert_eq!(k.clause, "AISC 360-16 §E3, Eq. E3-2 (Fe by Eq. E3-4)");
        assert_eq!(k.resistance_factor, 0.90);
        // KL/r = 200 → 5.65 ksi, elastic branch E3-3 (from memory).
        let k = column(&Curve::default_curve(), 36.0, E, 200.0).unwrap();
        assert!((k.design_stress - 5.65).abs() <= 0.05);
        assert_eq!(k.regime, Regime::Elastic);
        assert_eq!(k.formula, "Fcr = 0.877·Fe");
        assert!(!k.yields_before_buckling);
        let asd = Curve::from_name("aisc360-asd").unwrap();
        let k = column(&asd, 36.0, E, 200.0).unwrap();
        assert_relative_eq!(k.resistance_factor, 1.0 / 1.67);
    }

    #[test]
    fn worked_example_fy33() {
        // Hand calculation with AISC 360-16 E3-4 and E3-2:
        // Fy = 33 ksi (older medium steel, common practice), KL/r = 62.93,
        // Fe = π²·29000/62.93² = 72.27 ksi, Fcr = 0.658^(33/72.27)·33 = 27.26 ksi,
        // φcPn = 0.90·27.26·14.7 in² = 360.6 kip.
        let k = column(&Curve::default_curve(), 33.0, E, 62.93).unwrap();
        assert!((k.euler_stress - 72.27).abs() < 0.005);
        assert!((k.critical_stress - 27.26).abs() < 0.005);
        assert!((k.design_stress * 14.7 - 360.6).abs() < 0.05);
        assert_eq!(k.regime, Regime::Inelastic);
        assert!(k.yields_before_buckling);
    }

    #[test]
    fn continuous_at_the_switch() {
        // Closed form: at Fy/Fe = 2.25, E3-2 gives 0.658^2.25·Fy = 0.38994·Fy and
        // E3-3 gives 0.877/2.25·Fy = 0.38978·Fy: equal within 0.05 %.
        for fy in [33.0, 36.0, 50.0] {
            let fe = fy / 2.25;
            assert_relative_eq!(inelastic_fcr(fy, fe), elastic_fcr(fe), max_relative = 5e-4);
            // At the printed limit 4.71√(E/Fy), E3-2 and E3-3 agree within 0.1 %.
            let s = switch_slenderness(fy, E);
            let e3_3 = elastic_fcr(euler_stress(E, s));
            assert_relative_eq!(nominal_stress(fy, E, s), e3_3, max_relative = 1e-3);
            // The ratio-form switch: just past 1.5π√(E/Fy) is elastic.
            let exact = 1.5 * std::f64::consts::PI * (E / fy).sqrt();
            let k_in = column(&Curve::default_curve(), fy, E, exact * (1.0 - 1e-9)).unwrap();
            let k_el = column(&Curve::default_curve(), fy, E, exact * (1.0 + 1e-9)).unwrap();
            assert_eq!(k_in.regime, Regime::Inelastic);
            assert_eq!(k_el.regime, Regime::Elastic);
            assert_relative_eq!(
                k_in.critical_stress,
                k_el.critical_stress,
                max_relative = 1e-3
            );
        }
        // From memory: 4.71√(29000/36) = 133.7 and 4.71√(29000/50) = 113.4.
        assert!((switch_slenderness(36.0, E) - 133.7).abs() < 0.05);
        assert!((switch_slenderness(50.0, E) - 113.4).abs() < 0.05);
    }
}
