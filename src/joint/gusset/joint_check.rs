//! The gusset checks handed to the joint framework (`joint::JointCheck`):
//! the method's factor (`factors.rs`) times the nominal resistance, and
//! under LRFR the condition and system factors of MBE 6A.4.2 with the
//! gusset-plate system factor φs ≤ 0.90 (MBE 6A.6.12.1, from memory).

use super::checks::{Check, Kind};
use super::factors;
use crate::joint::{Eval, JointCheck};
use crate::method::{lrfr, Family, Level, Method};
use crate::units::Dimension;

/// System factor of gusset plates, MBE 6A.6.12.1 (from memory): the model's
/// φs when lower.
pub const GUSSET_PHI_S: f64 = 0.90;

/// φc·φs applied to a gusset check at `level` (1.0 where the level takes none).
pub fn condition_system(method: &Method, level: &Level) -> f64 {
    if level.condition_system && method.family == Family::Lrfr {
        (method.phi_c * method.phi_s.min(GUSSET_PHI_S)).max(lrfr::PHI_CS_FLOOR)
    } else {
        method.condition_system(level)
    }
}

/// One gusset check as a framework check.
pub struct GussetCheck(pub Check);

impl JointCheck for GussetCheck {
    fn node(&self) -> usize {
        self.0.node
    }
    fn kind(&self) -> &'static str {
        self.0.kind.name()
    }
    fn member(&self) -> Option<usize> {
        self.0.member
    }
    fn part(&self) -> String {
        self.0.part.clone()
    }
    fn uses(&self) -> Vec<usize> {
        self.0.demand.uses()
    }
    fn clause(&self, method: &Method) -> &'static str {
        match method.family {
            Family::Lfr | Family::Asr => self.0.kind.clause_part_b(),
            _ => self.0.kind.clause_lrfr(),
        }
    }
    fn equation(&self, method: &Method) -> String {
        let f = factors::of(
            method,
            method.design_levels.first().unwrap_or(&lrfr_level()),
        );
        let sym = match (method.family, self.0.kind) {
            (Family::Asr, _) => "allowable fraction",
            (Family::DesignAllowable, _) => "1/Ω",
            (_, Kind::FastenerShear | Kind::BoltShear) => "φ",
            (_, Kind::Bearing) => "φbb",
            (_, Kind::WhitmoreYield | Kind::SpliceYield) => "φy",
            (_, Kind::WhitmoreBuckling | Kind::SpliceCompression) => "φc",
            (_, Kind::NetFracture | Kind::SpliceFracture) => "φu",
            (_, Kind::BlockShear) => "φbs",
            (_, Kind::ShearYield) => "φvy",
            (_, Kind::ShearFracture) => "φvu",
        };
        let cs = if method.family == Family::Lrfr {
            "φc·φs·"
        } else {
            ""
        };
        format!(
            "{cs}{sym}·Rn ({sym} = {:.2}); Rn = {}",
            self.0.kind.factor(&f),
            self.0.kind.equation()
        )
    }
    fn inputs(&self) -> Vec<(&'static str, f64, Option<Dimension>)> {
        self.0.inputs.clone()
    }
    fn dimension(&self) -> Option<Dimension> {
        Some(Dimension::Force)
    }
    fn evaluate(&self, forces: &[f64], method: &Method, level: &Level) -> Eval {
        let f = factors::of(method, level);
        let (demand, r) = self.0.evaluate(forces, &f);
        Eval {
            demand,
            resistance: r * condition_system(method, level),
        }
    }
}

/// A level for the equation text when the method has none.
fn lrfr_level() -> Level {
    lrfr::method(&Default::default()).design_levels[0]
}
