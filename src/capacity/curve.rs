//! The shared vocabulary of the capacity module: which column curve a member is
//! checked against, the result record of a column check, the input errors, and
//! the single `column` entry point that validates inputs and dispatches to the
//! per-curve files.

use super::{aisc360, bridge_asd, csa_s16, en1993, euler, johnson};

/// Load and resistance factor design or allowable stress design.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum DesignMethod {
    /// Resistance factor φ applied to the nominal strength.
    Lrfd,
    /// Nominal strength divided by a safety factor Ω.
    Asd,
}

/// EN 1993-1-1 buckling curves, Table 6.1 / Table 6.2.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum BucklingClass {
    A0,
    A,
    B,
    C,
    D,
}

impl BucklingClass {
    /// Imperfection factor α, EN 1993-1-1 §6.3.1.2, Table 6.1:
    /// a0 = 0.13, a = 0.21, b = 0.34, c = 0.49, d = 0.76.
    pub fn alpha(self) -> f64 {
        match self {
            BucklingClass::A0 => 0.13,
            BucklingClass::A => 0.21,
            BucklingClass::B => 0.34,
            BucklingClass::C => 0.49,
            BucklingClass::D => 0.76,
        }
    }

    /// Lower-case suffix used in curve names ("a0", "a", "b", "c", "d").
    pub fn suffix(self) -> &'static str {
        match self {
            BucklingClass::A0 => "a0",
            BucklingClass::A => "a",
            BucklingClass::B => "b",
            BucklingClass::C => "c",
            BucklingClass::D => "d",
        }
    }

    fn from_suffix(s: &str) -> Option<BucklingClass> {
        match s {
            "a0" => Some(BucklingClass::A0),
            "a" => Some(BucklingClass::A),
            "b" => Some(BucklingClass::B),
            "c" => Some(BucklingClass::C),
            "d" => Some(BucklingClass::D),
            _ => None,
        }
    }
}

/// A column curve: the relation between slenderness KL/r and the critical
/// (and design) axial stress, together with the tension factors of the same
/// family (see `tension`).
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Curve {
    /// Elastic buckling capped at yield; no resistance factor.
    Euler,
    /// Johnson parabola up to Cc, Euler beyond; no resistance factor.
    Johnson,
    /// AISC 360-16 Chapter E; φc = 0.90 (LRFD) or Ωc = 1.67 (ASD).
    Aisc360 { method: DesignMethod },
    /// EN 1993-1-1 §6.3.1; recommended γM1 = 1.0.
    En1993 { class: BucklingClass, gamma_m1: f64 },
    /// CSA S16 clause 13.3.1; n = 1.34 (usual) or 2.24; φ = 0.90.
    CsaS16 { n: f64 },
    /// Allowable-stress column formula of the older bridge specifications.
    BridgeAsd { safety_factor: f64 },
}

/// Recommended partial factor γM1 for member buckling, EN 1993-1-1 §6.1(1) Note 2B.
pub const EN1993_GAMMA_M1: f64 = 1.0;
/// Usual CSA S16 column-curve exponent, clause 13.3.1.
pub const CSA_N_DEFAULT: f64 = 1.34;
/// CSA S16 exponent for members with low residual stress (stress-relieved HSS,
/// WWF with flame-cut flanges), clause 13.3.1.
pub const CSA_N_LOW_RESIDUAL: f64 = 2.24;

const NAMES: &[&str] = &[
    "euler",
    "johnson",
    "aisc360",
    "aisc360-asd",
    "en1993-a0",
    "en1993-a",
    "en1993-b",
    "en1993-c",
    "en1993-d",
    "csa-s16",
    "csa-s16-2.24",
    "bridge-asd",
];

fn parse_positive(s: &str) -> Option<f64> {
    let v: f64 = s.parse().ok()?;
    (v.is_finite() && v > 0.0).then_some(v)
}

impl Curve {
    /// Parse a command-line / model name. The names listed by [`Curve::names`]
    /// are accepted (ASCII case-insensitive, surrounding blanks ignored). So
    /// that [`Curve::name`] is an exact inverse for every parameter value,
    /// a numeric suffix is also accepted: "en1993-b-1.1" (γM1 = 1.1),
    /// "csa-s16-1.8" (n = 1.8), "bridge-asd-1.7" (FS = 1.7).
    /// Returns `None` for an unknown name or a non-positive parameter.
    pub fn from_name(name: &str) -> Option<Curve> {
        let name = name.trim().to_ascii_lowercase();
        match name.as_str() {
            "euler" => return Some(Curve::Euler),
            "johnson" => return Some(Curve::Johnson),
            "aisc360" => {
                return Some(Curve::Aisc360 {
                    method: DesignMethod::Lrfd,
                })
            }
            "aisc360-asd" => {
                return Some(Curve::Aisc360 {
                    method: DesignMethod::Asd,
                })
            }
            "csa-s16" => return Some(Curve::CsaS16 { n: CSA_N_DEFAULT }),
            "bridge-asd" => {
                return Some(Curve::BridgeAsd {
                    safety_factor: bridge_asd::DEFAULT_SAFETY_FACTOR,
                })
            }
            _ => {}
        }
        if let Some(rest) = name.strip_prefix("en1993-") {
            let (class, gamma_m1) = match rest.split_once('-') {
                Some((c, g)) => (c, parse_positive(g)?),
                None => (rest, EN1993_GAMMA_M1),
            };
            let class = BucklingClass::from_suffix(class)?;
            return Some(Curve::En1993 { class, gamma_m1 });
        }
        if let Some(n) = name.strip_prefix("csa-s16-") {
            return Some(Curve::CsaS16 {
                n: parse_positive(n)?,
            });
        }
        if let Some(fs) = name.strip_prefix("bridge-asd-") {
            return Some(Curve::BridgeAsd {
                safety_factor: parse_positive(fs)?,
            });
        }
        None
    }

    /// The name of this curve, the inverse of [`Curve::from_name`]. Default
    /// parameters give the short names of [`Curve::names`]; other parameter
    /// values are appended as a numeric suffix.
    pub fn name(&self) -> String {
        match *self {
            Curve::Euler => "euler".to_string(),
            Curve::Johnson => "johnson".to_string(),
            Curve::Aisc360 {
                method: DesignMethod::Lrfd,
            } => "aisc360".to_string(),
            Curve::Aisc360 {
                method: DesignMethod::Asd,
            } => "aisc360-asd".to_string(),
            Curve::En1993 { class, gamma_m1 } => {
                if gamma_m1 == EN1993_GAMMA_M1 {
                    format!("en1993-{}", class.suffix())
                } else {
                    format!("en1993-{}-{}", class.suffix(), gamma_m1)
                }
            }
            Curve::CsaS16 { n } => {
                if n == CSA_N_DEFAULT {
                    "csa-s16".to_string()
                } else {
                    format!("csa-s16-{n}")
                }
            }
            Curve::BridgeAsd { safety_factor } => {
                if safety_factor == bridge_asd::DEFAULT_SAFETY_FACTOR {
                    "bridge-asd".to_string()
                } else {
                    format!("bridge-asd-{safety_factor}")
                }
            }
        }
    }

    /// The standard curve names, in a stable order.
    pub fn names() -> &'static [&'static str] {
        NAMES
    }

    /// AISC 360-16, LRFD.
    pub fn default_curve() -> Curve {
        Curve::Aisc360 {
            method: DesignMethod::Lrfd,
        }
    }

    /// Check the curve's own parameter (γM1, n or FS) is positive and finite.
    pub fn validate(&self) -> Result<(), CapacityError> {
        match *self {
            Curve::En1993 { gamma_m1, .. } => positive("gamma_m1", gamma_m1),
            Curve::CsaS16 { n } => positive("n", n),
            Curve::BridgeAsd { safety_factor } => positive("safety_factor", safety_factor),
            _ => Ok(()),
        }
    }
}

impl Default for Curve {
    fn default() -> Self {
        Curve::default_curve()
    }
}

/// Which branch of a column curve governs, or a tension check.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Regime {
    Elastic,
    Inelastic,
    Tension,
    /// A tension-only member (rod, eyebar, counter) that is slack: no
    /// force, never checked in compression (issue 16).
    Slack,
}

impl Regime {
    pub fn as_str(self) -> &'static str {
        match self {
            Regime::Elastic => "elastic",
            Regime::Inelastic => "inelastic",
            Regime::Tension => "tension",
            Regime::Slack => "slack",
        }
    }
}

/// The result of a column (axial compression) check, per unit area.
#[derive(Clone, Debug, PartialEq)]
pub struct ColumnCheck {
    /// Elastic buckling stress σe = π²E/(KL/r)².
    pub euler_stress: f64,
    /// Nominal critical stress of the curve, before any resistance or safety
    /// factor: AISC Fcr; EN χ·fy; CSA Fy(1+λ²ⁿ)^(−1/n); the bridge parabola or
    /// Euler value before division by FS; Euler/Johnson their curve value.
    pub critical_stress: f64,
    /// `critical_stress × resistance_factor`.
    pub design_stress: f64,
    /// Multiplier applied to the nominal stress: φc, 1/Ωc, 1/γM1, φ, 1/FS or 1.0.
    pub resistance_factor: f64,
    /// `Elastic` when the curve's elastic branch governs. For the continuous
    /// curves (EN 1993, CSA S16), which have no branch point, the AISC boundary
    /// Fe < Fy/2.25 is used so that reports are comparable across curves.
    pub regime: Regime,
    /// σe > Fy: the member would yield before it buckles elastically.
    pub yields_before_buckling: bool,
    /// The clause and equation actually used.
    pub clause: &'static str,
    /// A short readable form of the branch used.
    pub formula: &'static str,
}

/// Invalid input to a capacity check.
#[derive(Clone, Debug, PartialEq, thiserror::Error)]
pub enum CapacityError {
    /// A quantity that must be positive and finite was not.
    #[error("{name} must be a positive, finite number (got {value})")]
    NotPositive { name: &'static str, value: f64 },
    /// The net area given for a tension check exceeds the gross area.
    #[error("net area ({net}) must not exceed gross area ({gross})")]
    NetExceedsGross { net: f64, gross: f64 },
    /// The inputs were each valid but the result overflowed.
    #[error("the {what} is not finite for these inputs (overflow)")]
    NonFinite { what: &'static str },
}

pub(super) fn positive(name: &'static str, value: f64) -> Result<(), CapacityError> {
    if value.is_finite() && value > 0.0 {
        Ok(())
    } else {
        Err(CapacityError::NotPositive { name, value })
    }
}

/// Column check of one member: `fy` yield stress, `e` elastic modulus (same
/// stress unit), `slenderness` = KL/r (dimensionless, > 0). Dispatches to the
/// per-curve files; see each for the clause and equations.
///
/// Errors when any input or curve parameter is not positive and finite, or if
/// a result would overflow; never returns NaN.
pub fn column(
    curve: &Curve,
    fy: f64,
    e: f64,
    slenderness: f64,
) -> Result<ColumnCheck, CapacityError> {
    positive("fy", fy)?;
    positive("e", e)?;
    positive("slenderness", slenderness)?;
    curve.validate()?;
    let check = match *curve {
        Curve::Euler => euler::check(fy, e, slenderness),
        Curve::Johnson => johnson::check(fy, e, slenderness),
        Curve::Aisc360 { method } => aisc360::check(fy, e, slenderness, method),
        Curve::En1993 { class, gamma_m1 } => en1993::check(fy, e, slenderness, class, gamma_m1),
        Curve::CsaS16 { n } => csa_s16::check(fy, e, slenderness, n),
        Curve::BridgeAsd { safety_factor } => bridge_asd::check(fy, e, slenderness, safety_factor),
    };
    for (what, v) in [
        ("Euler stress", check.euler_stress),
        ("critical stress", check.critical_stress),
        ("design stress", check.design_stress),
    ] {
        if !v.is_finite() {
            return Err(CapacityError::NonFinite { what });
        }
    }
    Ok(check)
}

/// The regime boundary shared by AISC 360-16 §E3 and, by convention here, the
/// continuous curves: elastic when Fy/Fe > 2.25.
pub(super) fn aisc_regime(fy: f64, fe: f64) -> Regime {
    if fy > 2.25 * fe {
        Regime::Elastic
    } else {
        Regime::Inelastic
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    // Common practice: structural steel E = 29,000 ksi; older medium steel Fy ≈ 33 ksi.
    const E: f64 = 29_000.0;
    const FY: f64 = 33.0;

    #[test]
    fn every_listed_name_round_trips() {
        // Closed form: name() is the inverse of from_name() on the list.
        for &n in Curve::names() {
            let c = Curve::from_name(n).unwrap_or_else(|| panic!("{n} not parsed"));
            assert_eq!(c.name(), n);
        }
        assert_eq!(Curve::names().len(), 12);
    }

    #[test]
    fn names_map_to_the_intended_parameters() {
        // Values from the brief's naming convention.
        assert_eq!(Curve::from_name("csa-s16"), Some(Curve::CsaS16 { n: 1.34 }));
        assert_eq!(
            Curve::from_name("csa-s16-2.24"),
            Some(Curve::CsaS16 { n: 2.24 })
        );
        assert_eq!(
            Curve::from_name("aisc360-asd"),
            Some(Curve::Aisc360 {
                method: DesignMethod::Asd
            })
        );
        assert_eq!(
            Curve::from_name("EN1993-C "),
            Some(Curve::En1993 {
                class: BucklingClass::C,
                gamma_m1: 1.0
            })
        );
        assert_eq!(Curve::default_curve(), Curve::from_name("aisc360").unwrap());
        assert_eq!(Curve::default(), Curve::default_curve());
    }

    #[test]
    fn non_default_parameters_round_trip() {
        let curves = [
            Curve::En1993 {
                class: BucklingClass::B,
                gamma_m1: 1.1,
            },
            Curve::CsaS16 { n: 1.8 },
            Curve::BridgeAsd { safety_factor: 1.7 },
        ];
        for c in curves {
            assert_eq!(Curve::from_name(&c.name()), Some(c));
        }
    }

    #[test]
    fn unknown_or_bad_names_are_rejected() {
        for bad in [
            "",
            "aisc",
            "en1993",
            "en1993-e",
            "en1993-b-0",
            "csa-s16-",
            "csa-s16-x",
            "csa-s16--1",
            "bridge-asd-nan",
            "bridge-asd-inf",
        ] {
            assert_eq!(Curve::from_name(bad), None, "{bad:?} should be rejected");
        }
    }

    #[test]
    fn alpha_values_match_table_6_1() {
        // EN 1993-1-1 Table 6.1.
        let expected = [
            (BucklingClass::A0, 0.13),
            (BucklingClass::A, 0.21),
            (BucklingClass::B, 0.34),
            (BucklingClass::C, 0.49),
            (BucklingClass::D, 0.76),
        ];
        for (c, a) in expected {
            assert_eq!(c.alpha(), a);
        }
    }

    #[test]
    fn regime_strings() {
        assert_eq!(Regime::Elastic.as_str(), "elastic");
        assert_eq!(Regime::Inelastic.as_str(), "inelastic");
        assert_eq!(Regime::Tension.as_str(), "tension");
    }

    #[test]
    fn invalid_inputs_are_errors_not_nan() {
        let c = Curve::default_curve();
        for (fy, e, s) in [
            (0.0, E, 50.0),
            (-33.0, E, 50.0),
            (f64::NAN, E, 50.0),
            (FY, 0.0, 50.0),
            (FY, f64::INFINITY, 50.0),
            (FY, E, 0.0),
            (FY, E, -10.0),
            (FY, E, f64::NAN),
            (FY, E, f64::INFINITY),
        ] {
            assert!(
                matches!(column(&c, fy, e, s), Err(CapacityError::NotPositive { .. })),
                "({fy}, {e}, {s}) should be rejected"
            );
        }
        let bad = Curve::CsaS16 { n: 0.0 };
        assert_eq!(
            column(&bad, FY, E, 50.0),
            Err(CapacityError::NotPositive {
                name: "n",
                value: 0.0
            })
        );
        let bad = Curve::En1993 {
            class: BucklingClass::B,
            gamma_m1: f64::NAN,
        };
        assert!(column(&bad, FY, E, 50.0).is_err());
        let bad = Curve::BridgeAsd {
            safety_factor: -2.0,
        };
        assert!(column(&bad, FY, E, 50.0).is_err());
    }

    #[test]
    fn overflow_is_an_error() {
        // π²E/(KL/r)² overflows for a huge modulus and tiny slenderness.
        let r = column(&Curve::Euler, FY, 1e308, 1e-10);
        assert_eq!(
            r,
            Err(CapacityError::NonFinite {
                what: "Euler stress"
            })
        );
    }

    #[test]
    fn error_messages_are_readable() {
        let err = column(&Curve::Euler, -1.0, E, 50.0).unwrap_err();
        assert_eq!(
            err.to_string(),
            "fy must be a positive, finite number (got -1)"
        );
    }

    #[test]
    fn every_curve_gives_sane_results_over_a_sweep() {
        // Closed form properties every curve must have: 0 < design ≤ critical·factor
        // consistent, critical ≤ Fy, monotone non-increasing in KL/r.
        let mut curves: Vec<Curve> = Curve::names()
            .iter()
            .map(|n| Curve::from_name(n).unwrap())
            .collect();
        curves.push(Curve::BridgeAsd { safety_factor: 1.7 });
        for c in &curves {
            let mut last = f64::INFINITY;
            for i in 1..=600 {
                let s = i as f64 * 0.5;
                let k = column(c, FY, E, s).unwrap();
                assert!(k.critical_stress > 0.0 && k.critical_stress <= FY + 1e-12);
                assert_relative_eq!(
                    k.design_stress,
                    k.critical_stress * k.resistance_factor,
                    max_relative = 1e-12
                );
                assert!(k.critical_stress <= last + 1e-9, "{} at {s}", c.name());
                last = k.critical_stress;
                assert_relative_eq!(
                    k.euler_stress,
                    std::f64::consts::PI.powi(2) * E / (s * s),
                    max_relative = 1e-12
                );
                assert_eq!(k.yields_before_buckling, k.euler_stress > FY);
                assert!(!k.clause.is_empty() && !k.formula.is_empty());
            }
        }
    }

    #[test]
    fn continuous_curves_use_the_aisc_regime_boundary() {
        // Convention documented on ColumnCheck::regime: Elastic iff Fe < Fy/2.25.
        let s_switch = aisc360::switch_slenderness(FY, E);
        for c in [
            Curve::from_name("en1993-b").unwrap(),
            Curve::from_name("csa-s16").unwrap(),
        ] {
            assert_eq!(
                column(&c, FY, E, s_switch * 0.99).unwrap().regime,
                Regime::Inelastic
            );
            assert_eq!(
                column(&c, FY, E, s_switch * 1.01).unwrap().regime,
                Regime::Elastic
            );
        }
    }
}
