//! Strength of a pin in combined bending and shear, and bearing of the bars
//! on it, by rating family. Every constant is a field of [`Factors`] with its
//! default here, overridable per pin in the model (`factors: (...)`).
//!
//! AASHTO LRFD Bridge Design Specifications (recalled from the 7th–9th
//! editions, from memory):
//! - 6.7.6.2.1, combined flexure and shear (Eq. 6.7.6.2.1-1):
//!   6·Mu/(φf·D³·Fy) + (2.2·Vu/(φv·D²·Fy))³ ≤ 0.95,
//!   φf = 1.00 and φv = 1.00 (6.5.4.2), D pin diameter, Fy of the pin.
//! - 6.7.6.2.2, bearing (Eq. 6.7.6.2.2-1): (Rpb)r = φb·1.5·t·D·Fy, φb = 1.00
//!   (6.5.4.2, bearing on pins in reamed, drilled or bored holes), t the
//!   bar's thickness and Fy the bar's (the plate's) yield stress.
//! - 6.8.7.1, pin plates: bearing Pr = φb·Apb·Fy, Apb = t·D (from memory);
//!   taken for bars described as pin plates.
//!
//! This program takes Fy in bearing as the lower of the pin's and the bar's
//! (conservative where the pin is the softer steel).
//!
//! AASHTO Standard Specifications, allowable stresses for pins (Table
//! 10.32.1A, from memory; used by `asr` and the allowable-stress design
//! codes): bending 0.80·Fy, shear 0.40·Fy, bearing 0.80·Fy (pins not subject
//! to rotation), on the pin's fibre stress M/(π·D³/32), its average shear
//! V/(π·D²/4) and the bearing stress P/(t·D). The operating allowables of
//! these are not held here, so the inventory values are kept at operating
//! (conservative, stated in the notes).
//!
//! `lfr`: the LRFD interaction above (a strength form with φ = 1.00 taken
//! against factored loads) and bearing 1.35·Fy·t·D, the load-factor bearing
//! on pins recalled from the Standard Specifications (from memory; lower than
//! LRFD's 1.5, so the conservative of the two).
//!
//! Design codes with factored loads use the LRFD equations (their own pin
//! provisions are not implemented); screening uses the allowable stresses.

use crate::method::{Family, Level, Method};

/// Resistance factors, limits and allowable-stress ratios for pins.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Factors {
    /// φf, LRFD 6.5.4.2 (1.00, from memory).
    pub phi_flexure: f64,
    /// φv, LRFD 6.5.4.2 (1.00, from memory).
    pub phi_shear: f64,
    /// φb, LRFD 6.5.4.2 (1.00, from memory).
    pub phi_bearing: f64,
    /// Right-hand side of Eq. 6.7.6.2.1-1 (0.95, from memory).
    pub interaction_limit: f64,
    /// Coefficient of t·D·Fy in LRFD bearing, Eq. 6.7.6.2.2-1 (1.5).
    pub bearing: f64,
    /// Coefficient of t·D·Fy on pin plates, LRFD 6.8.7.1 (1.0, from memory).
    pub plate_bearing: f64,
    /// Coefficient of t·D·Fy in load-factor bearing (1.35, from memory).
    pub lfr_bearing: f64,
    /// Allowable bending, shear and bearing stress as fractions of Fy
    /// (Standard Specifications Table 10.32.1A: 0.80, 0.40, 0.80, from memory).
    pub allowable_bending: f64,
    pub allowable_shear: f64,
    pub allowable_bearing: f64,
    /// Unequal sharing among the bars of a multiple-eyebar member: the most
    /// loaded bar takes `sharing`·F/N (this program's choice, 1.10; see
    /// `eyebar.rs`).
    pub sharing: f64,
}

impl Default for Factors {
    fn default() -> Self {
        Factors {
            phi_flexure: 1.00,
            phi_shear: 1.00,
            phi_bearing: 1.00,
            interaction_limit: 0.95,
            bearing: 1.5,
            plate_bearing: 1.0,
            lfr_bearing: 1.35,
            allowable_bending: 0.80,
            allowable_shear: 0.40,
            allowable_bearing: 0.80,
            sharing: super::eyebar::SHARING,
        }
    }
}

/// How a method checks pins.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Basis {
    /// LRFD 6.7.6.2 with its φ (lrfr, design codes with factored loads).
    Lrfd,
    /// The LRFD interaction with load-factor bearing (lfr).
    LoadFactor,
    /// Allowable stresses (asr, allowable-stress design codes, screening).
    Allowable,
}

pub fn basis(method: &Method) -> Basis {
    match method.family {
        Family::Lrfr | Family::DesignFactored => Basis::Lrfd,
        Family::Lfr => Basis::LoadFactor,
        Family::Asr | Family::DesignAllowable | Family::Screening => Basis::Allowable,
    }
}

/// Factor on the AASHTO pin equations under a design code's factored check
/// (`aisc360`, `en1993-*`, `csa-s16`): 0.90 keeps them at or below AISC
/// 360-16 §J7 pin bearing (φ·1.8·Fy·Apb = 0.75·1.8 = 1.35·Fy·t·D, against
/// 0.90·1.5 = 1.35) and EN 1993-1-8 Table 3.10 pin bending
/// (1.5·Wel·fy/γM0 ≈ 0.147·D³·fy, against 0.90·0.95/6 ≈ 0.143·D³·fy); from
/// memory. The AASHTO values alone (φ = 1.00) would exceed both.
pub const DESIGN_CODE_PHI: f64 = 0.90;

/// φc·φs where the method applies them (LRFR, MBE Eq. 6A.4.2.1-2/-3);
/// [`DESIGN_CODE_PHI`] for a design code's factored check; else 1.
pub fn condition_system(method: &Method, level: &Level) -> f64 {
    if method.family == Family::DesignFactored {
        DESIGN_CODE_PHI
    } else {
        method.condition_system(level)
    }
}

/// LRFD Eq. 6.7.6.2.1-1 left side: 6·M/(φf·D³·Fy) + (2.2·V/(φv·D²·Fy))³.
pub fn interaction(m: f64, v: f64, d: f64, fy: f64, phi_f: f64, phi_v: f64) -> f64 {
    6.0 * m / (phi_f * d.powi(3) * fy) + (2.2 * v / (phi_v * d * d * fy)).powi(3)
}

/// Elastic section modulus of a round pin, π·D³/32.
pub fn section_modulus(d: f64) -> f64 {
    std::f64::consts::PI * d.powi(3) / 32.0
}

/// Area of a round pin, π·D²/4.
pub fn area(d: f64) -> f64 {
    std::f64::consts::PI * d * d / 4.0
}

/// Bearing resistance of one bar, force: the factored (or allowable)
/// resistance by the basis, with φc·φs = `cs` where it applies.
pub fn bearing(f: &Factors, basis: Basis, plate: bool, t: f64, d: f64, fy: f64, cs: f64) -> f64 {
    let coefficient = match (basis, plate) {
        (Basis::Lrfd, false) => f.phi_bearing * f.bearing,
        (Basis::Lrfd, true) => f.phi_bearing * f.plate_bearing,
        (Basis::LoadFactor, false) => f.lfr_bearing,
        (Basis::LoadFactor, true) => f.lfr_bearing.min(f.plate_bearing),
        (Basis::Allowable, _) => f.allowable_bearing,
    };
    cs * coefficient * t * d * fy
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn interaction_by_hand() {
        // D = 6 in, Fy = 36 ksi, M = 600 kip·in, V = 300 kip, φf = φv = 1:
        //   6·600/(216·36) = 3600/7776 = 0.462963
        //   2.2·300/(36·36) = 660/1296 = 0.509259; cubed = 0.132073
        //   sum = 0.595036 ≤ 0.95 (LRFD Eq. 6.7.6.2.1-1, from memory).
        let v = interaction(600.0, 300.0, 6.0, 36.0, 1.0, 1.0);
        let hand = 3600.0 / 7776.0 + (660.0f64 / 1296.0).powi(3);
        assert!((v - hand).abs() < 1e-12);
        assert!((v - 0.595036).abs() < 1e-6);
        // φ multiplies the resistance: φf = φv = 0.5 doubles the bending
        // term and multiplies the shear term by 2³ = 8.
        let half = interaction(600.0, 300.0, 6.0, 36.0, 0.5, 0.5);
        assert!((half - (2.0 * 3600.0 / 7776.0 + 8.0 * (660.0f64 / 1296.0).powi(3))).abs() < 1e-12);
    }

    /// Under a design code the pin equations stay at or below the codes'
    /// own: EN 1993-1-8 Table 3.10 pin bending MRd = 1.5·Wel·fy/γM0
    /// (γM0 = 1.0), Wel = π·D³/32; AISC 360-16 §J7 bearing φ·1.8·Fy·Apb with
    /// φ = 0.75 (both from memory).
    #[test]
    fn design_code_pins_not_above_the_codes() {
        let (d, fy): (f64, f64) = (5.0, 36.0);
        // Pure bending at the interaction limit 0.95 with φf = DESIGN_CODE_PHI.
        let m = DESIGN_CODE_PHI * 0.95 * d.powi(3) * fy / 6.0;
        let m_en = 1.5 * section_modulus(d) * fy;
        assert!(m <= m_en, "{m} > EN {m_en}");
        assert!(
            (interaction(m, 0.0, d, fy, DESIGN_CODE_PHI, DESIGN_CODE_PHI) - 0.95).abs() < 1e-12
        );
        // Bearing: 0.90 × 1.5·Fy·t·D against AISC 0.75 × 1.8·Fy·t·D.
        let t = 1.0;
        let ours = bearing(
            &Factors::default(),
            Basis::Lrfd,
            false,
            t,
            d,
            fy,
            DESIGN_CODE_PHI,
        );
        assert!(ours <= 0.75 * 1.8 * fy * t * d + 1e-9, "{ours}");
    }

    #[test]
    fn bearing_by_basis() {
        // t = 1.5 in, D = 6 in, Fy = 36 ksi: t·D·Fy = 324 kip.
        let f = Factors::default();
        // LRFD 6.7.6.2.2: 1.0 × 1.5 × 324 = 486 kip.
        assert_eq!(bearing(&f, Basis::Lrfd, false, 1.5, 6.0, 36.0, 1.0), 486.0);
        // LRFD 6.8.7.1 pin plate: 1.0 × 324 = 324 kip.
        assert_eq!(bearing(&f, Basis::Lrfd, true, 1.5, 6.0, 36.0, 1.0), 324.0);
        // Allowable 0.80·Fy (Table 10.32.1A, from memory): 259.2 kip.
        assert!((bearing(&f, Basis::Allowable, false, 1.5, 6.0, 36.0, 1.0) - 259.2).abs() < 1e-9);
        // Load factor 1.35·Fy: 437.4 kip; φc·φs = 0.85 would scale it.
        assert!((bearing(&f, Basis::LoadFactor, false, 1.5, 6.0, 36.0, 1.0) - 437.4).abs() < 1e-9);
        assert!((bearing(&f, Basis::Lrfd, false, 1.5, 6.0, 36.0, 0.85) - 413.1).abs() < 1e-9);
    }

    #[test]
    fn round_pin_properties() {
        // S = π·6³/32 = 21.2058 in³, A = π·36/4 = 28.2743 in² (closed forms).
        assert!((section_modulus(6.0) - 21.205750).abs() < 1e-6);
        assert!((area(6.0) - 28.274334).abs() < 1e-6);
    }
}
