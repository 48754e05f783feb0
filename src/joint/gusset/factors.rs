//! Resistance factors (or allowable fractions of the nominal resistance)
//! of the gusset-plate checks, by rating method and level. The member
//! checks' factors stay in `method/`; these are the joint's own.
//!
//! LRFR (MBE 6A.6.12 with AASHTO LRFD 6.5.4.2, from memory): fasteners in
//! shear φ = 0.80, bearing φbb = 0.80, gross yielding φy = 0.95, net
//! fracture φu = 0.80, block shear φbs = 0.80, shear yielding φvy = 1.00,
//! shear fracture φvu = 0.80, Whitmore compression φc = 0.90.
//!
//! LFR (MBE Part B with the 2009 federal gusset-plate guidance): the
//! guidance's own load-factor capacities are not held here with
//! confidence; the LRFR factors above (none above 1.0) are applied to the
//! same nominal resistances, the conservative choice, and said so.
//!
//! ASR (MBE Part B, Standard Specifications allowables, from memory):
//! yield-type resistances × the method's tension-yield fraction (0.55·Fy
//! inventory, 0.75·Fy operating), fracture-type (fasteners, bearing, net
//! section, block shear, shear fracture) × 0.50 at both levels (so a
//! 27 ksi rivet is allowed 13.5 ksi and bearing 1.2·d·t·Fu), compression
//! × 1/FS of the method's level.
//!
//! Design codes: AISC 360-16 (J3.6, J3.10, J4, D2, E3: φ = 0.75 for
//! fastener shear, bearing, fracture and block shear, 0.90 yield and
//! compression, 1.00 shear yield; ASD 1/Ω with Ω = 2.00, 1.67, 1.50). The
//! EN 1993 and CSA S16 methods and the screening curves take the AISC LRFD
//! factors (the lower of AASHTO's and AISC's), said in the notes.

use crate::method::{Family, Level, Method};

/// What a check's nominal resistance is multiplied by.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Factors {
    pub fastener: f64,
    pub bearing: f64,
    pub gross_yield: f64,
    pub net_fracture: f64,
    pub block_shear: f64,
    pub shear_yield: f64,
    pub shear_fracture: f64,
    pub compression: f64,
    /// "φ" or "allowable fraction" for the reports.
    pub symbol: &'static str,
}

/// AASHTO LRFD / MBE Part A factors (from memory).
pub const LRFR: Factors = Factors {
    fastener: 0.80,
    bearing: 0.80,
    gross_yield: 0.95,
    net_fracture: 0.80,
    block_shear: 0.80,
    shear_yield: 1.00,
    shear_fracture: 0.80,
    compression: 0.90,
    symbol: "φ",
};

/// AISC 360-16 LRFD factors (from memory).
pub const AISC_LRFD: Factors = Factors {
    fastener: 0.75,
    bearing: 0.75,
    gross_yield: 0.90,
    net_fracture: 0.75,
    block_shear: 0.75,
    shear_yield: 1.00,
    shear_fracture: 0.75,
    compression: 0.90,
    symbol: "φ",
};

/// AISC 360-16 ASD: 1/Ω (from memory).
pub const AISC_ASD: Factors = Factors {
    fastener: 1.0 / 2.00,
    bearing: 1.0 / 2.00,
    gross_yield: 1.0 / 1.67,
    net_fracture: 1.0 / 2.00,
    block_shear: 1.0 / 2.00,
    shear_yield: 1.0 / 1.50,
    shear_fracture: 1.0 / 2.00,
    compression: 1.0 / 1.67,
    symbol: "1/Ω",
};

/// Allowable fraction of a fracture-type nominal resistance in ASR (from memory).
pub const ASR_FRACTURE: f64 = 0.50;

/// The factors of `method` at `level`.
pub fn of(method: &Method, level: &Level) -> Factors {
    match method.family {
        Family::Lrfr | Family::Lfr => LRFR,
        Family::Asr => {
            let y = level.resistance.tension_yield;
            Factors {
                fastener: ASR_FRACTURE,
                bearing: ASR_FRACTURE,
                gross_yield: y,
                net_fracture: ASR_FRACTURE,
                block_shear: ASR_FRACTURE,
                shear_yield: y,
                shear_fracture: ASR_FRACTURE,
                compression: level.resistance.compression,
                symbol: "allowable fraction",
            }
        }
        Family::DesignAllowable => AISC_ASD,
        Family::DesignFactored | Family::Screening => AISC_LRFD,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::method::Settings;

    #[test]
    fn factors_by_method() {
        let s = Settings::default();
        let lrfr = Method::from_name("lrfr", &s).unwrap();
        let f = of(&lrfr, &lrfr.design_levels[0]);
        // MBE 6A.6.12 / AASHTO LRFD 6.5.4.2 (from memory).
        assert_eq!(
            (f.fastener, f.shear_yield, f.compression),
            (0.80, 1.00, 0.90)
        );
        let asr = Method::from_name("asr", &s).unwrap();
        let inv = of(&asr, &asr.design_levels[0]);
        let op = of(&asr, &asr.design_levels[1]);
        // 0.55·Fy inventory, 0.75·Fy operating (Standard Specifications, from memory).
        assert_eq!((inv.gross_yield, op.gross_yield), (0.55, 0.75));
        assert_eq!(inv.fastener, 0.5);
        assert!((inv.compression - 1.0 / 2.12).abs() < 1e-12);
    }
}
