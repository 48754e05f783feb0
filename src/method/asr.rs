//! Allowable stress rating: AASHTO Manual for Bridge Evaluation Part B
//! (6B.4.2, Table 6B.6.2.1-1 as recalled), with the allowable stresses of
//! the AASHTO Standard Specifications (Table 10.32.1A). Values from memory.
//!
//! RF = (C − D) / (L·(1 + I))                           (MBE Eq. 6B.4.1-1, A1 = A2 = 1.0)
//!
//! No condition or system factor. Inventory allowables: tension 0.55·Fy on
//! the gross area and 0.50·Fu on the net area; compression the column
//! formula Fa = Fy/FS·[1 − (KL/r)²·Fy/(4π²E)] for KL/r ≤ Cc, π²E/(FS·(KL/r)²)
//! beyond, FS = 2.12. Operating allowables: tension 0.75·Fy, compression with
//! FS = 1.70. The operating net-section allowable is not held here with
//! confidence; the inventory value 0.50·Fu is kept at operating, the
//! conservative choice, and said so.

use super::{Family, Level, Method, PermanentFactor, Resistance, Settings};
use crate::capacity::Curve;

/// Standard Specifications Table 10.32.1A: FS = 2.12 at inventory (from memory).
pub const FS_INVENTORY: f64 = 2.12;
/// MBE Table 6B.6.2.1-1: FS = 1.70 at operating (from memory).
pub const FS_OPERATING: f64 = 1.70;
/// Tension on the gross area: 0.55·Fy inventory, 0.75·Fy operating (from memory).
pub const YIELD_INVENTORY: f64 = 0.55;
pub const YIELD_OPERATING: f64 = 0.75;
/// Tension on the net area: 0.50·Fu (inventory; kept at operating, see above).
pub const FRACTURE: f64 = 0.50;

fn resistance(fs: f64, yield_ratio: f64, level: &str) -> Resistance {
    Resistance {
        compression: 1.0 / fs,
        tension_yield: yield_ratio,
        tension_fracture: FRACTURE,
        uses_rp: false,
        compression_clause: if level == "inventory" {
            "Standard Specifications Table 10.32.1A column formula, FS = 2.12 (from memory)"
        } else {
            "MBE Table 6B.6.2.1-1 column formula at operating, FS = 1.70 (from memory)"
        },
        tension_clause: if level == "inventory" {
            "Standard Specifications Table 10.32.1A: 0.55·Fy on Ag, 0.50·Fu on An·U (from memory)"
        } else {
            "MBE Table 6B.6.2.1-1: 0.75·Fy on Ag; 0.50·Fu on An·U kept from inventory (from memory)"
        },
        symbol: "1/FS",
    }
}

fn level(name: &'static str, fs: f64, yield_ratio: f64) -> Level {
    Level {
        name,
        gamma_live: 1.0,
        dc: PermanentFactor::ONE,
        dw: PermanentFactor::ONE,
        resistance: resistance(fs, yield_ratio, name),
        condition_system: false,
        clause: "MBE Eq. 6B.4.1-1 with A1 = A2 = 1.0 (allowable stress rating)",
    }
}

pub fn method(s: &Settings) -> Method {
    let inventory = level("inventory", FS_INVENTORY, YIELD_INVENTORY);
    let operating = level("operating", FS_OPERATING, YIELD_OPERATING);
    let mut notes = vec![
        "allowable stress rating: the net-section allowable 0.50·Fu is kept at operating (conservative; the operating value is not held here)".to_string(),
    ];
    if s.condition_factor.is_some() || s.system_factor.is_some() {
        notes.push("condition and system factors are LRFR factors (MBE Part A) and are not applied by allowable stress rating".into());
    }
    Method {
        name: "asr".into(),
        family: Family::Asr,
        curve: Curve::Johnson,
        design_levels: vec![inventory, operating],
        // MBE Part B: legal loads are rated at the operating level (from memory).
        legal_levels: vec![Level {
            name: "legal",
            ..operating
        }],
        check: inventory.resistance,
        phi_c: 1.0,
        phi_s: 1.0,
        rates: true,
        equation: "RF = (C − D) / (L·(1 + I)) (MBE Eq. 6B.4.1-1, A1 = A2 = 1.0)",
        notes,
    }
}
