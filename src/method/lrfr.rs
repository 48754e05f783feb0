//! Load and resistance factor rating: AASHTO Manual for Bridge Evaluation
//! (MBE) Section 6 Part A, with the resistances of AASHTO LRFD Bridge Design
//! Specifications Section 6. Values from memory of the 3rd edition MBE and
//! the 8th/9th edition LRFD; each is a named constant here.
//!
//! RF = (C − γDC·DC − γDW·DW ± γP·P) / (γL·(LL + IM))   (MBE Eq. 6A.4.2.1-1)
//! C = φc·φs·φ·Rn, φc·φs ≥ 0.85                        (MBE Eq. 6A.4.2.1-2, -3)
//!
//! Each permanent-load factor is taken at its maximum where that load adds
//! to the live effect and at its minimum where it relieves it (AASHTO LRFD
//! 3.4.1, Table 3.4.1-2).
//!
//! Resistances: compression by LRFD 6.9.4.1.1, Pn = 0.658^(Po/Pe)·Po for
//! Pe/Po ≥ 0.44, else 0.877·Pe (Eqs. 6.9.4.1.1-1, -2; the same curve in
//! stress form as AISC 360-16 Eqs. E3-2, E3-3), φc = 0.95 (LRFD 6.5.4.2);
//! tension by LRFD 6.8.2.1: yield φy·Fy·Ag with φy = 0.95 (Eq. 6.8.2.1-1),
//! fracture φu·Fu·An·Rp·U with φu = 0.80 (Eq. 6.8.2.1-2).

use super::{Family, Level, Method, PermanentFactor, Resistance, Settings};
use crate::capacity::{Curve, DesignMethod};

/// AASHTO LRFD 6.5.4.2: φc = 0.95 for axial compression of steel (from memory).
pub const PHI_COMPRESSION: f64 = 0.95;
/// AASHTO LRFD 6.5.4.2: φy = 0.95 for tension, yielding on the gross section.
pub const PHI_YIELD: f64 = 0.95;
/// AASHTO LRFD 6.5.4.2: φu = 0.80 for tension, fracture on the net section.
pub const PHI_FRACTURE: f64 = 0.80;
/// MBE Eq. 6A.4.2.1-3: φc·φs ≥ 0.85 (from memory).
pub const PHI_CS_FLOOR: f64 = 0.85;
/// AASHTO LRFD Table 3.4.1-2: DC maximum 1.25, minimum 0.90 (from memory).
pub const DC: PermanentFactor = PermanentFactor {
    max: 1.25,
    min: 0.90,
};
/// AASHTO LRFD Table 3.4.1-2: DW maximum 1.50, minimum 0.65 (from memory).
pub const DW: PermanentFactor = PermanentFactor {
    max: 1.50,
    min: 0.65,
};
/// MBE Table 6A.4.2.2-1: design load inventory γLL = 1.75 (from memory).
pub const GAMMA_INVENTORY: f64 = 1.75;
/// MBE Table 6A.4.2.2-1: design load operating γLL = 1.35 (from memory).
pub const GAMMA_OPERATING: f64 = 1.35;
/// MBE Table 6A.4.4.2.3a-1: legal-load γL where the ADTT is unknown, 1.45
/// (from memory: the table as revised in the 2013 interims and carried into
/// the 3rd edition; the earlier table had 1.80 … 1.40 for routine traffic).
pub const GAMMA_LEGAL_UNKNOWN: f64 = 1.45;

/// Legal-load live-load factor by single-direction ADTT, MBE Table
/// 6A.4.4.2.3a-1 as recalled (from memory): 1.45 at ADTT ≥ 5000, 1.30 at
/// ADTT ≤ 1000, linear between; 1.45 when the ADTT is not known. The model's
/// `gamma_legal` overrides it.
pub fn gamma_legal(adtt: Option<f64>) -> f64 {
    match adtt {
        None => GAMMA_LEGAL_UNKNOWN,
        Some(a) if a >= 5000.0 => 1.45,
        Some(a) if a <= 1000.0 => 1.30,
        Some(a) => 1.30 + (a - 1000.0) / 4000.0 * 0.15,
    }
}

/// The resistance factors of AASHTO LRFD Section 6 for this method.
pub const RESISTANCE: Resistance = Resistance {
    compression: PHI_COMPRESSION,
    tension_yield: PHI_YIELD,
    tension_fracture: PHI_FRACTURE,
    uses_rp: true,
    compression_clause: "AASHTO LRFD 6.9.4.1.1, Eqs. 6.9.4.1.1-1/-2 (φc = 0.95, 6.5.4.2)",
    tension_clause:
        "AASHTO LRFD 6.8.2.1, Eqs. 6.8.2.1-1 (φy = 0.95, Fy·Ag) and 6.8.2.1-2 (φu = 0.80, Fu·An·Rp·U)",
    symbol: "φ",
};

const EQUATION: &str =
    "RF = (φc·φs·φ·Rn − γDC·DC − γDW·DW) / (γL·(LL + IM)), φc·φs ≥ 0.85 (MBE Eqs. 6A.4.2.1-1/-3)";

fn level(name: &'static str, gamma_live: f64, dc_max: f64) -> Level {
    Level {
        name,
        gamma_live,
        dc: PermanentFactor {
            max: dc_max,
            min: DC.min,
        },
        dw: DW,
        resistance: RESISTANCE,
        condition_system: true,
        clause: match name {
            "inventory" | "operating" => {
                "MBE Eq. 6A.4.2.1-1, Table 6A.4.2.2-1; γDC/γDW by AASHTO LRFD Table 3.4.1-2"
            }
            _ => "MBE Eq. 6A.4.2.1-1, legal load Table 6A.4.4.2.3a-1; γDC/γDW by AASHTO LRFD Table 3.4.1-2",
        },
    }
}

pub fn method(s: &Settings) -> Method {
    let phi_c = s.condition_factor.unwrap_or(1.0);
    let phi_s = s.system_factor.unwrap_or(1.0);
    let legal = s.gamma_legal.unwrap_or_else(|| gamma_legal(s.adtt));
    let mut notes = Vec::new();
    if phi_c * phi_s < PHI_CS_FLOOR {
        notes.push(format!(
            "φc·φs = {:.4} is raised to the floor of 0.85 (MBE Eq. 6A.4.2.1-3)",
            phi_c * phi_s
        ));
    }
    if s.gamma_legal.is_none() && s.adtt.is_none() {
        notes.push(
            "legal-load factor γL = 1.45 taken for an unknown ADTT (MBE Table 6A.4.4.2.3a-1, from memory); give rating.adtt or rating.gamma_legal".into(),
        );
    }
    Method {
        name: "lrfr".into(),
        family: Family::Lrfr,
        curve: Curve::Aisc360 {
            method: DesignMethod::Lrfd,
        },
        design_levels: vec![
            level(
                "inventory",
                s.gamma_live_inventory.unwrap_or(GAMMA_INVENTORY),
                s.gamma_dead_inventory.unwrap_or(DC.max),
            ),
            level(
                "operating",
                s.gamma_live_operating.unwrap_or(GAMMA_OPERATING),
                s.gamma_dead_operating.unwrap_or(DC.max),
            ),
        ],
        legal_levels: vec![level("legal", legal, DC.max)],
        check: RESISTANCE,
        phi_c,
        phi_s,
        rates: true,
        equation: EQUATION,
        notes,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn legal_factor_by_adtt() {
        // MBE Table 6A.4.4.2.3a-1 as recalled (from memory): 1.45 unknown or
        // ≥ 5000, 1.30 ≤ 1000, linear between: 3000 → 1.30 + 0.075 = 1.375.
        assert_eq!(gamma_legal(None), 1.45);
        assert_eq!(gamma_legal(Some(6000.0)), 1.45);
        assert_eq!(gamma_legal(Some(500.0)), 1.30);
        assert!((gamma_legal(Some(3000.0)) - 1.375).abs() < 1e-12);
    }

    #[test]
    fn floor_of_condition_and_system() {
        // MBE Eq. 6A.4.2.1-3: 0.85 × 0.85 = 0.7225 is raised to 0.85.
        let m = method(&Settings {
            condition_factor: Some(0.85),
            system_factor: Some(0.85),
            ..Settings::default()
        });
        let inv = m.design_levels[0];
        assert_eq!(m.condition_system(&inv), 0.85);
        let m = method(&Settings {
            condition_factor: Some(0.95),
            ..Settings::default()
        });
        assert_eq!(m.condition_system(&m.design_levels[0]), 0.95);
    }
}
