//! Load factor rating: AASHTO Manual for Bridge Evaluation Part B
//! (Section 6B.4.3), with the load-factor capacities of the AASHTO Standard
//! Specifications for Highway Bridges (17th edition). Values from memory.
//!
//! RF = (C − A1·D) / (A2·L·(1 + I))                     (MBE Eq. 6B.4.1-1)
//! A1 = 1.3; A2 = 2.17 at inventory and 1.3 at operating (MBE 6B.4.3).
//!
//! Compression (Standard Specifications 10.54.1.1, from memory):
//! Pu = 0.85·As·Fcr, Fcr = Fy·[1 − Fy·(KL/r)²/(4π²E)] for KL/r ≤ √(2π²E/Fy),
//! Fcr = π²E/(KL/r)² beyond — the Johnson–Euler curve with φ = 0.85.
//!
//! Tension: the load-factor tension provision of the Standard
//! Specifications is not held here with confidence, so this method takes
//! the conservative choice 0.95·Fy·Ag and 0.80·Fu·An·U (no higher than any
//! factor that provision can give on Fy·Ag and Fu·An), stated in every
//! report; both factors are named constants.
//!
//! Where the dead load relieves the live effect, A1 is not the conservative
//! choice; the dead load is then taken at `RELIEVING_DEAD` = 1.0 (a stated
//! choice of this program: the Standard Specifications' group loadings take
//! βD·D with βD = 1.0 for such members, from memory).

use super::{Family, Level, Method, PermanentFactor, Resistance, Settings};
use crate::capacity::Curve;

/// MBE 6B.4.3: A1 = 1.3 (from memory).
pub const A1: f64 = 1.3;
/// MBE 6B.4.3: A2 = 2.17 at inventory (from memory).
pub const A2_INVENTORY: f64 = 2.17;
/// MBE 6B.4.3: A2 = 1.3 at operating (from memory).
pub const A2_OPERATING: f64 = 1.3;
/// Dead-load factor where the dead load relieves the live effect (stated choice).
pub const RELIEVING_DEAD: f64 = 1.0;
/// Standard Specifications 10.54.1.1: Pu = 0.85·As·Fcr (from memory).
pub const PHI_COMPRESSION: f64 = 0.85;
/// Conservative tension factors (see the module comment).
pub const TENSION_YIELD: f64 = 0.95;
pub const TENSION_FRACTURE: f64 = 0.80;

pub const RESISTANCE: Resistance = Resistance {
    compression: PHI_COMPRESSION,
    tension_yield: TENSION_YIELD,
    tension_fracture: TENSION_FRACTURE,
    uses_rp: false,
    compression_clause: "AASHTO Standard Specifications 10.54.1.1: Pu = 0.85·As·Fcr, Fcr = Fy[1 − Fy(KL/r)²/(4π²E)] or π²E/(KL/r)² (from memory)",
    tension_clause: "conservative 0.95·Fy·Ag and 0.80·Fu·An·U (this program's stated choice for load factor rating)",
    symbol: "φ",
};

fn level(name: &'static str, a2: f64) -> Level {
    let dead = PermanentFactor {
        max: A1,
        min: RELIEVING_DEAD,
    };
    Level {
        name,
        gamma_live: a2,
        dc: dead,
        dw: dead,
        resistance: RESISTANCE,
        condition_system: false,
        clause: "MBE Eq. 6B.4.1-1, 6B.4.3 (A1 = 1.3, A2 = 2.17 inventory / 1.3 operating)",
    }
}

pub fn method(s: &Settings) -> Method {
    let mut notes = vec![
        "load factor rating: tension taken as 0.95·Fy·Ag and 0.80·Fu·An·U, a conservative choice where the Standard Specifications' load-factor tension provision is not held here".to_string(),
        "load factor rating: where the dead load relieves the live effect it is taken at 1.0, not A1 = 1.3".to_string(),
    ];
    if s.condition_factor.is_some() || s.system_factor.is_some() {
        notes.push("condition and system factors are LRFR factors (MBE Part A) and are not applied by load factor rating".into());
    }
    let operating = level("operating", s.gamma_live_operating.unwrap_or(A2_OPERATING));
    Method {
        name: "lfr".into(),
        family: Family::Lfr,
        curve: Curve::Johnson,
        design_levels: vec![
            level("inventory", s.gamma_live_inventory.unwrap_or(A2_INVENTORY)),
            operating,
        ],
        // MBE 6B.7.1: legal loads are rated at the operating level (from memory).
        legal_levels: vec![Level {
            name: "legal",
            ..operating
        }],
        check: RESISTANCE,
        phi_c: 1.0,
        phi_s: 1.0,
        rates: true,
        equation: "RF = (C − A1·D) / (A2·L·(1 + I)) (MBE Eq. 6B.4.1-1)",
        notes,
    }
}
