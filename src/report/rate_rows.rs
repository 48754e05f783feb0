//! The rating results flattened into display-unit rows, shared by the
//! text, JSON and CSV writers so the three formats always agree.

use super::Scale;
use crate::capacity::Regime;
use crate::model::Model;
use crate::rate::{Check, Rating};

/// One check row in display units.
pub struct CheckRow<'a> {
    pub member: &'a str,
    pub case: &'a str,
    pub force: f64,
    pub stress: f64,
    pub axis: &'static str,
    pub slenderness: f64,
    pub slenderness_in: f64,
    pub slenderness_out: f64,
    pub euler_stress: f64,
    pub critical_stress: f64,
    pub capacity: f64,
    pub utilization: f64,
    pub margin: Option<f64>,
    pub regime: &'static str,
    pub rating_factor: Option<f64>,
    pub clause: &'static str,
    pub formula: &'static str,
}

pub fn check_row<'a>(model: &'a Model, r: &'a Rating, c: &Check) -> CheckRow<'a> {
    let s = Scale::of(model);
    let cap = &r.members[c.member];
    let area = model.sections[model.members[c.member].section].area;
    let tension = c.regime == Regime::Tension;
    CheckRow {
        member: &model.members[c.member].id,
        case: &r.effects[c.effect].id,
        force: c.force / s.force,
        stress: c.stress / s.stress,
        axis: cap.axis.as_str(),
        slenderness: cap.slenderness(),
        slenderness_in: cap.slenderness_in,
        slenderness_out: cap.slenderness_out,
        euler_stress: cap.compression.euler_stress / s.stress,
        critical_stress: if tension {
            cap.tension_nominal / area / s.stress
        } else {
            cap.compression.critical_stress / s.stress
        },
        capacity: c.capacity / s.force,
        utilization: c.utilization,
        margin: c.margin,
        regime: c.regime.as_str(),
        rating_factor: c.rating_factor,
        clause: if tension {
            cap.tension.clause
        } else {
            cap.compression.check.clause
        },
        formula: if tension {
            "min(yield on gross area, fracture on net area)"
        } else {
            cap.compression.check.formula
        },
    }
}

/// Rating indices sorted by inventory rating factor, lowest first (rows
/// without a factor last).
pub fn by_rating(r: &Rating) -> Vec<usize> {
    let mut idx: Vec<usize> = (0..r.ratings.len()).collect();
    idx.sort_by(|&a, &b| {
        let key = |i: usize| r.ratings[i].inventory.unwrap_or(f64::INFINITY);
        key(a).total_cmp(&key(b))
    });
    idx
}

/// Check indices sorted by utilization, highest first.
pub fn by_utilization(r: &Rating) -> Vec<usize> {
    let mut idx: Vec<usize> = (0..r.checks.len()).collect();
    idx.sort_by(|&a, &b| {
        r.checks[b]
            .utilization
            .total_cmp(&r.checks[a].utilization)
            .then(a.cmp(&b))
    });
    idx
}
