//! Rating methods. A method is one coherent set: the nominal column curve,
//! the resistance (or allowable-stress) factors, the load factors, the
//! rating-factor equation and the levels it rates at. It is the only place
//! that knows a method's factors; `rate` asks it and hard-codes none, so one
//! philosophy's capacity can never meet another's load factors.
//!
//! One file per method family: [`lrfr`] (AASHTO MBE Section 6 Part A with
//! AASHTO LRFD Section 6 resistances), [`lfr`] and [`asr`] (MBE Part B),
//! [`design_code`] (AISC 360, EN 1993-1-1, CSA S16, each with its own load
//! factors), [`screening`] (Euler and Johnson curves, no code factors).
//! [`posting`] and [`steel_year`] are the MBE's load posting and the
//! strengths of steel of unknown grade.

pub mod asr;
pub mod design_code;
pub mod lfr;
pub mod lrfr;
pub mod posting;
pub mod screening;
pub mod steel_year;

use crate::capacity::Curve;

/// The family of a method: decides how the rows are read.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Family {
    /// Load and resistance factor rating (MBE Part A).
    Lrfr,
    /// Load factor rating (MBE Part B).
    Lfr,
    /// Allowable stress rating (MBE Part B).
    Asr,
    /// A design code's factored-load check (LRFD or limit states).
    DesignFactored,
    /// A design code's service-load check against Rn/Ω.
    DesignAllowable,
    /// Screening curves with no code factors.
    Screening,
}

/// Factors a level applies to a member's nominal resistances.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Resistance {
    /// Multiplier on the nominal compressive strength Pn = Fcr·Ag
    /// (φc, 0.85, 1/FS, 1/Ωc, 1/γM1).
    pub compression: f64,
    /// Multiplier on gross-section yield Fy·Ag (φy, 0.55 or 0.75, 1/Ωt, 1/γM0).
    pub tension_yield: f64,
    /// Multiplier on net-section fracture Fu·An·U (·Rp where `uses_rp`).
    pub tension_fracture: f64,
    /// Whether the reduction factor for holes Rp applies (AASHTO LRFD 6.8.2.1).
    pub uses_rp: bool,
    /// Clause of the compression resistance.
    pub compression_clause: &'static str,
    /// Clause of the tension resistance.
    pub tension_clause: &'static str,
    /// What the factor is called in reports: "φ", "1/FS", "1/Ω", "1/γM".
    pub symbol: &'static str,
}

/// A permanent-load factor: its maximum where the load adds to the live
/// effect, its minimum where it relieves it (AASHTO LRFD 3.4.1).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PermanentFactor {
    pub max: f64,
    pub min: f64,
}

impl PermanentFactor {
    pub const ONE: PermanentFactor = PermanentFactor { max: 1.0, min: 1.0 };

    /// The factor for a permanent force `dead` against a live force of sign
    /// `sign` (±1): the maximum where it adds, the minimum where it relieves.
    pub fn applied(&self, dead: f64, sign: f64) -> f64 {
        if dead * sign < 0.0 {
            self.min
        } else {
            self.max
        }
    }
}

/// A rating level: its name, load factors and resistance factors.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Level {
    /// "inventory", "operating", "legal", "design", "allowable", "screening".
    pub name: &'static str,
    /// Live-load factor γL (A2 for LFR, 1.0 for ASR).
    pub gamma_live: f64,
    /// Dead load of components and attachments (DC; A1 for LFR).
    pub dc: PermanentFactor,
    /// Wearing surfaces and utilities (DW).
    pub dw: PermanentFactor,
    pub resistance: Resistance,
    /// Whether the condition and system factors apply (MBE 6A.4.2.1).
    pub condition_system: bool,
    /// The rating equation and the load-factor clause.
    pub clause: &'static str,
}

/// A rating method with its levels.
#[derive(Clone, Debug, PartialEq)]
pub struct Method {
    /// The name the user gave (`lrfr`, `asr`, `en1993-b`, …).
    pub name: String,
    pub family: Family,
    /// Nominal column curve (its own φ is not used: the level's is).
    pub curve: Curve,
    /// Levels at which design (non-legal) live loads are rated.
    pub design_levels: Vec<Level>,
    /// Levels at which legal live loads are rated.
    pub legal_levels: Vec<Level>,
    /// The resistance of the check table (cases and combinations).
    pub check: Resistance,
    /// Condition factor φc and system factor φs as given (LRFR only).
    pub phi_c: f64,
    pub phi_s: f64,
    /// Whether rating factors are given at all (screening without a
    /// user safety factor gives none).
    pub rates: bool,
    /// The rating-factor equation, for reports.
    pub equation: &'static str,
    /// Stated defaults and assumptions, for the report's notes.
    pub notes: Vec<String>,
}

/// Everything the model may set about the method.
#[derive(Clone, Debug, PartialEq, Default)]
pub struct Settings {
    pub condition_factor: Option<f64>,
    pub system_factor: Option<f64>,
    /// Single-lane ADTT for the legal-load factor (LRFR).
    pub adtt: Option<f64>,
    /// Legal-load factor given directly (overrides ADTT).
    pub gamma_legal: Option<f64>,
    /// EN 1993-1-1 γM1, CSA S16 n, screening safety factor.
    pub gamma_m1: Option<f64>,
    pub csa_n: Option<f64>,
    pub safety_factor: Option<f64>,
    /// Live-load factors given for inventory and operating (override).
    pub gamma_live_inventory: Option<f64>,
    pub gamma_live_operating: Option<f64>,
    /// Maximum DC factor given for inventory and operating (override).
    pub gamma_dead_inventory: Option<f64>,
    pub gamma_dead_operating: Option<f64>,
}

/// The method names, in a stable order.
pub const NAMES: &[&str] = &[
    "lrfr",
    "lfr",
    "asr",
    "aisc360",
    "aisc360-asd",
    "en1993-a0",
    "en1993-a",
    "en1993-b",
    "en1993-c",
    "en1993-d",
    "csa-s16",
    "csa-s16-2.24",
    "euler",
    "johnson",
];

/// The default method: load and resistance factor rating.
pub const DEFAULT: &str = "lrfr";

/// Why a method name or setting was refused.
#[derive(Clone, Debug, PartialEq, thiserror::Error)]
pub enum MethodError {
    #[error("\"{0}\" is not a rating method; use one of {names}", names = NAMES.join(", "))]
    Unknown(String),
    #[error("\"bridge-asd\" is now the rating method \"asr\" (MBE allowable stress rating, with inventory and operating levels)")]
    BridgeAsd,
    #[error("{name} must be a positive, finite number (got {value})")]
    NotPositive { name: &'static str, value: f64 },
}

impl Method {
    /// The method called `name` (ASCII case-insensitive), with the model's settings.
    pub fn from_name(name: &str, s: &Settings) -> Result<Method, MethodError> {
        let key = name.trim().to_ascii_lowercase();
        for (field, v) in [
            ("condition_factor", s.condition_factor),
            ("system_factor", s.system_factor),
            ("adtt", s.adtt),
            ("gamma_legal", s.gamma_legal),
            ("gamma_m1", s.gamma_m1),
            ("csa_n", s.csa_n),
            ("safety_factor", s.safety_factor),
        ] {
            if let Some(v) = v {
                if !(v.is_finite() && v > 0.0) {
                    return Err(MethodError::NotPositive {
                        name: field,
                        value: v,
                    });
                }
            }
        }
        let method = match key.as_str() {
            "lrfr" => lrfr::method(s),
            "lfr" => lfr::method(s),
            "asr" => asr::method(s),
            "euler" | "johnson" => screening::method(&key, s),
            "bridge-asd" => return Err(MethodError::BridgeAsd),
            _ => match design_code::method(&key, s) {
                Some(m) => m,
                None => return Err(MethodError::Unknown(name.trim().to_string())),
            },
        };
        Ok(method)
    }

    /// φc·φs as applied, with the MBE Eq. 6A.4.2.1-3 floor of 0.85; 1.0 for
    /// levels without condition and system factors.
    pub fn condition_system(&self, level: &Level) -> f64 {
        self.condition_system_with(level, self.phi_s)
    }

    /// As [`Method::condition_system`] with a member's own system factor
    /// `phi_s` (a multiple-eyebar member's 0.90, MBE Table 6A.4.2.4-1).
    pub fn condition_system_with(&self, level: &Level, phi_s: f64) -> f64 {
        if level.condition_system {
            (self.phi_c * phi_s).max(lrfr::PHI_CS_FLOOR)
        } else {
            1.0
        }
    }

    /// The system factor φs of member with `bars` parallel eyebars: the
    /// model's, or 0.90 for a multiple-eyebar member where `lrfr` rates
    /// (MBE Table 6A.4.2.4-1, from memory) if that is lower.
    pub fn member_phi_s(&self, bars: u32) -> f64 {
        crate::joint::pin::eyebar::member_phi_s(self.phi_s, bars, self.family == Family::Lrfr)
    }

    /// Whether checks of unfactored effects (single cases, service
    /// envelopes) are the method's own comparison: true for allowable-stress
    /// methods and screening, false where resistances are factored.
    pub fn checks_service(&self) -> bool {
        matches!(
            self.family,
            Family::Asr | Family::DesignAllowable | Family::Screening
        )
    }

    /// The level whose lowest rating factor the summary names first.
    pub fn primary_level(&self) -> &'static str {
        self.design_levels.first().map_or("", |l| l.name)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_resolve_and_bridge_asd_redirects() {
        for n in NAMES {
            let m = Method::from_name(n, &Settings::default()).unwrap();
            assert_eq!(m.name, *n);
        }
        assert_eq!(
            Method::from_name("bridge-asd", &Settings::default()),
            Err(MethodError::BridgeAsd)
        );
        assert!(matches!(
            Method::from_name("lrfd", &Settings::default()),
            Err(MethodError::Unknown(_))
        ));
        let bad = Settings {
            condition_factor: Some(-1.0),
            ..Settings::default()
        };
        assert!(Method::from_name("lrfr", &bad).is_err());
    }

    #[test]
    fn permanent_factor_adds_or_relieves() {
        // AASHTO LRFD Table 3.4.1-2 (from memory): DC 1.25 max, 0.90 min.
        let dc = PermanentFactor {
            max: 1.25,
            min: 0.90,
        };
        // Dead tension against live compression relieves: minimum.
        assert_eq!(dc.applied(3.7, -1.0), 0.90);
        // Dead compression with live compression adds: maximum.
        assert_eq!(dc.applied(-3.7, -1.0), 1.25);
        assert_eq!(dc.applied(0.0, -1.0), 1.25);
    }
}
