//! The lacing bars of a laced built-up compression member, checked as AISC
//! 360-16 §E6.2 directs (from memory):
//!
//! * the lacing carries a shear normal to the member axis of 2 % of the
//!   member's AVAILABLE compressive strength, `V = 0.02·φPn` (not the
//!   demand), shared by the laced faces;
//! * a bar's force is `F = (V/planes)/(n·sin θ)` (statics; `n` = 1 for single
//!   lacing, 2 for double), θ the bar's angle to the member axis;
//! * its compressive strength by the member's own column curve at
//!   `K·L/r`, K = 1.0 single, 0.7 double (joined at the crossing), `L` the
//!   bar's length between its connections to the components, `r = t/√12`;
//! * `L/r ≤ 140` single, `≤ 200` double;
//! * each component between lacing connections: `K·a/ri ≤ ¾` of the
//!   member's governing slenderness (K = 1), see `checks::LacingEffect`.
//!
//! The bar length follows from the lacing spacing `a` (between connections
//! on one component) and θ: single lacing zigzags, each bar covering `a/2`
//! along the member, `L = (a/2)/cos θ`; double lacing crosses within each
//! `a`, `L = a/cos θ`.

use crate::capacity::{self, Curve};
use crate::model::{Lacing, LacingBars};
use crate::section::{self, LacingSystem};

/// §E6.2 checks of one member's lacing bars (SI).
#[derive(Clone, Debug, PartialEq)]
pub struct LacingBarCheck {
    /// V = 2 % of the member's available compressive strength, N.
    pub shear: f64,
    /// Axial force in one bar, N.
    pub force: f64,
    /// Bar length between connections, m, and K.
    pub length: f64,
    pub k: f64,
    /// K·L/r of the bar, its limit and whether it is met.
    pub slenderness: f64,
    pub slenderness_limit: f64,
    pub slenderness_ok: bool,
    /// Design compressive strength of one bar, N, and force/strength.
    pub capacity: f64,
    pub utilization: f64,
    /// Whether the angle was given (else the least §E6.2 allows was taken).
    pub angle_given: bool,
}

impl LacingBarCheck {
    pub const CLAUSE: &'static str = "AISC 360-16 §E6.2";
}

/// Checks `lc`'s bars for a member whose available compressive strength is
/// `member_capacity` (N), with the member's curve and material.
pub fn lacing_bar_check(
    lc: &Lacing,
    bars: &LacingBars,
    member_capacity: f64,
    curve: &Curve,
    fy: f64,
    e: f64,
) -> Result<LacingBarCheck, capacity::CapacityError> {
    let shear = section::lacing_shear(member_capacity);
    let force = section::lacing_bar_force(shear / bars.planes as f64, bars.system, bars.angle);
    let (length, k, limit) = match bars.system {
        LacingSystem::Single => (lc.spacing / 2.0 / bars.angle.cos(), 1.0, 140.0),
        LacingSystem::Double => (lc.spacing / bars.angle.cos(), 0.7, 200.0),
    };
    let r = bars.thickness / 12f64.sqrt();
    let slenderness = section::lacing_bar_kl_r(length, r, bars.system);
    let check = capacity::column(curve, fy, e, slenderness)?;
    let capacity = check.design_stress * bars.width * bars.thickness;
    Ok(LacingBarCheck {
        shear,
        force,
        length,
        k,
        slenderness,
        slenderness_limit: limit,
        slenderness_ok: section::lacing_bar_slenderness_ok(slenderness, bars.system),
        capacity,
        utilization: force / capacity,
        angle_given: bars.angle_given,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::capacity::DesignMethod;

    #[test]
    fn single_lacing_bar_by_hand() {
        // Member φPn = 400 kip; V = 0.02·400 = 8 kip over 1 plane; single
        // lacing at 60°: F = 8/(1·sin 60°) = 9.2376 kip. Spacing a = 16 in:
        // L = 8/cos 60° = 16 in; bar 2 × 3/8 in, r = 0.375/√12 = 0.10825 in;
        // KL/r = 16/0.10825 = 147.8 > 140 (fails §E6.2). Fe = π²·29000/147.8²
        // = 13.10 ksi; Fy/Fe = 2.75 > 2.25 → Fcr = 0.877·Fe = 11.49 ksi;
        // φPn = 0.9·11.49·0.75 = 7.755 kip; utilization 9.2376/7.755 = 1.19.
        // (Units: the functions are unit-agnostic; kip, in, ksi here.)
        let lc = Lacing {
            spacing: 16.0,
            connector: section::Connector::HotDrivenRivet,
            k_i: 0.86,
            component_r: 1.0,
            out_of_plane: true,
            bars: None,
            tie_plates: Some(true),
        };
        let bars = LacingBars {
            width: 2.0,
            thickness: 0.375,
            angle: 60f64.to_radians(),
            angle_given: true,
            system: LacingSystem::Single,
            planes: 1,
        };
        let curve = Curve::Aisc360 {
            method: DesignMethod::Lrfd,
        };
        let c = lacing_bar_check(&lc, &bars, 400.0, &curve, 36.0, 29000.0).unwrap();
        assert!((c.shear - 8.0).abs() < 1e-12);
        assert!((c.force - 8.0 / 60f64.to_radians().sin()).abs() < 1e-12);
        assert!((c.length - 16.0).abs() < 1e-9);
        let r = 0.375 / 12f64.sqrt();
        assert!((c.slenderness - 16.0 / r).abs() < 1e-9);
        assert!(!c.slenderness_ok);
        let fe = std::f64::consts::PI.powi(2) * 29000.0 / (16.0 / r).powi(2);
        let hand = 0.9 * 0.877 * fe * 0.75;
        assert!((c.capacity - hand).abs() < 1e-9 * hand);
        assert!((c.capacity - 7.755).abs() < 0.01);
        // Double lacing at 45°: L = 16/cos 45° = 22.63 in, K = 0.7,
        // F = 8/(2·sin 45°) = 5.657 kip, limit 200: 0.7·22.63/0.10825 = 146.3.
        let d = LacingBars {
            system: LacingSystem::Double,
            angle: 45f64.to_radians(),
            ..bars
        };
        let c = lacing_bar_check(&lc, &d, 400.0, &curve, 36.0, 29000.0).unwrap();
        assert!((c.force - 8.0 / (2.0 * 45f64.to_radians().sin())).abs() < 1e-12);
        assert!((c.slenderness - 0.7 * 16.0 / 45f64.to_radians().cos() / r).abs() < 1e-9);
        assert!(c.slenderness_ok);
    }
}
