//! Design-code checks used as a rating method: the code's own resistance
//! factors with the code family's own load factors, never another's.
//!
//! * `aisc360`: AISC 360-16 Chapter E (φc = 0.90) and §D2 (φt = 0.90 on
//!   Fy·Ag, 0.75 on Fu·Ae, Ae = U·An by §D3); loads 1.2·D + 1.6·L
//!   (ASCE/SEI 7-16 §2.3.1, combination 2, from memory), dead load taken at
//!   0.9 where it relieves (the counteracting-dead factor of §2.3.1, a
//!   conservative choice here).
//! * `aisc360-asd`: Pn/Ωc (Ωc = 1.67), Fy·Ag/1.67 and Fu·Ae/2.00; loads
//!   D + L (ASCE/SEI 7-16 §2.4.1, combination 2), dead load taken at 0.6
//!   where it relieves (as in §2.4.1 combination 7, a conservative choice).
//! * `en1993-*`: EN 1993-1-1 §6.3.1 (χ·A·fy/γM1) and §6.2.3 (A·fy/γM0,
//!   0.9·Anet·fu/γM2); γM1 = 1.10 as EN 1993-2 §6.1 Note 2B recommends for
//!   bridges (overridable, `rating.gamma_m1`), γM0 = 1.00, γM2 = 1.25; loads
//!   γG = 1.35 unfavourable / 1.00 favourable, γQ = 1.50 (EN 1990 Table
//!   A1.2(B), recommended values, from memory); Anet·U with the program's
//!   shear-lag factor U (EN has no U for most members: conservative).
//! * `csa-s16`, `csa-s16-2.24`: CSA S16 cl. 13.3.1 (φ = 0.90, n = 1.34 or
//!   2.24) and 13.2 (φ = 0.90 on Ag·Fy, φu = 0.75 on Ane·Fu); loads
//!   1.25·D (0.9·D relieving) + 1.5·L (NBCC 2015 Table 4.1.3.2-A, from memory).
//!
//! One level, "design": RF = (φ·Rn − γD·D)/(γL·L); for `aisc360-asd`
//! RF = (Rn/Ω − D)/L.

use super::{Family, Level, Method, PermanentFactor, Resistance, Settings};
use crate::capacity::curve::{CSA_N_DEFAULT, CSA_N_LOW_RESIDUAL};
use crate::capacity::{BucklingClass, Curve, DesignMethod};

/// EN 1993-2 §6.1 Note 2B: recommended γM1 = 1.10 for bridges (from memory).
pub const EN_GAMMA_M1_BRIDGES: f64 = 1.10;

fn level(
    gamma_live: f64,
    dead: PermanentFactor,
    resistance: Resistance,
    clause: &'static str,
) -> Level {
    Level {
        name: "design",
        gamma_live,
        dc: dead,
        dw: dead,
        resistance,
        condition_system: false,
        clause,
    }
}

/// The design-code method called `key`, or None when no such code.
pub fn method(key: &str, s: &Settings) -> Option<Method> {
    let (curve, level, family, equation) = match key {
        "aisc360" => (
            Curve::Aisc360 {
                method: DesignMethod::Lrfd,
            },
            level(
                1.6,
                PermanentFactor { max: 1.2, min: 0.9 },
                Resistance {
                    compression: 0.90,
                    tension_yield: 0.90,
                    tension_fracture: 0.75,
                    uses_rp: false,
                    compression_clause: "AISC 360-16 §E3, Eqs. E3-1…E3-4 (φc = 0.90)",
                    tension_clause: "AISC 360-16 §D2, Eqs. D2-1 (φt = 0.90) and D2-2 (φt = 0.75, Ae = U·An, §D3)",
                    symbol: "φ",
                },
                "ASCE/SEI 7-16 §2.3.1: 1.2·D + 1.6·L (0.9·D where it relieves), from memory",
            ),
            Family::DesignFactored,
            "RF = (φ·Rn − γD·D) / (γL·L)",
        ),
        "aisc360-asd" => (
            Curve::Aisc360 {
                method: DesignMethod::Asd,
            },
            level(
                1.0,
                PermanentFactor { max: 1.0, min: 0.6 },
                Resistance {
                    compression: 1.0 / 1.67,
                    tension_yield: 1.0 / 1.67,
                    tension_fracture: 1.0 / 2.00,
                    uses_rp: false,
                    compression_clause: "AISC 360-16 §E3, Eqs. E3-1…E3-4 (Ωc = 1.67)",
                    tension_clause: "AISC 360-16 §D2, Eqs. D2-1 (Ωt = 1.67) and D2-2 (Ωt = 2.00, Ae = U·An, §D3)",
                    symbol: "1/Ω",
                },
                "ASCE/SEI 7-16 §2.4.1: D + L (0.6·D where it relieves), from memory",
            ),
            Family::DesignAllowable,
            "RF = (Rn/Ω − D) / L",
        ),
        "csa-s16" | "csa-s16-2.24" => {
            let n = if key == "csa-s16" {
                s.csa_n.unwrap_or(CSA_N_DEFAULT)
            } else {
                CSA_N_LOW_RESIDUAL
            };
            (
                Curve::CsaS16 { n },
                level(
                    1.5,
                    PermanentFactor {
                        max: 1.25,
                        min: 0.9,
                    },
                    Resistance {
                        compression: 0.90,
                        tension_yield: 0.90,
                        tension_fracture: 0.75,
                        uses_rp: false,
                        compression_clause: "CSA S16 cl. 13.3.1 (φ = 0.90)",
                        tension_clause: "CSA S16 cl. 13.2(a) (φ = 0.90 on Ag·Fy, φu = 0.75 on Ane·Fu)",
                        symbol: "φ",
                    },
                    "NBCC 2015 Table 4.1.3.2-A: 1.25·D (0.9·D where it relieves) + 1.5·L, from memory",
                ),
                Family::DesignFactored,
                "RF = (φ·Rn − γD·D) / (γL·L)",
            )
        }
        _ => {
            let class = match key.strip_prefix("en1993-")? {
                "a0" => BucklingClass::A0,
                "a" => BucklingClass::A,
                "b" => BucklingClass::B,
                "c" => BucklingClass::C,
                "d" => BucklingClass::D,
                _ => return None,
            };
            let gamma_m1 = s.gamma_m1.unwrap_or(EN_GAMMA_M1_BRIDGES);
            (
                Curve::En1993 { class, gamma_m1 },
                level(
                    1.5,
                    PermanentFactor {
                        max: 1.35,
                        min: 1.0,
                    },
                    Resistance {
                        compression: 1.0 / gamma_m1,
                        tension_yield: 1.0 / crate::capacity::tension::EN_GAMMA_M0,
                        tension_fracture: 0.9 / crate::capacity::tension::EN_GAMMA_M2,
                        uses_rp: false,
                        compression_clause: "EN 1993-1-1 §6.3.1, Eqs. 6.47/6.49 (χ·A·fy/γM1; γM1 = 1.10 for bridges, EN 1993-2 §6.1)",
                        tension_clause: "EN 1993-1-1 §6.2.3, Eqs. 6.6 (γM0 = 1.0) and 6.7 (0.9·Anet·U·fu/γM2, γM2 = 1.25)",
                        symbol: "1/γM",
                    },
                    "EN 1990 Table A1.2(B): 1.35·G (1.00·G favourable) + 1.50·Q, recommended values, from memory",
                ),
                Family::DesignFactored,
                "RF = (Rd − γG·G) / (γQ·Q)",
            )
        }
    };
    let mut l = level;
    if let Some(g) = s.gamma_live_inventory {
        l.gamma_live = g;
    }
    if let Some(g) = s.gamma_dead_inventory {
        l.dc.max = g;
        l.dw.max = g;
    }
    let mut notes = Vec::new();
    if s.condition_factor.is_some() || s.system_factor.is_some() {
        notes.push(format!(
            "condition and system factors are LRFR factors (MBE Part A) and are not applied by the design-code method \"{key}\""
        ));
    }
    Some(Method {
        name: key.to_string(),
        family,
        curve,
        design_levels: vec![l],
        legal_levels: vec![l],
        check: l.resistance,
        phi_c: 1.0,
        phi_s: 1.0,
        rates: true,
        equation,
        notes,
    })
}
