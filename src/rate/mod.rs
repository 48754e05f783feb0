//! Member capacity checks and load rating for a solved model: for every
//! member under every load case and combination, the slenderness in both
//! planes, the Euler and critical stresses of the chosen column curve or
//! the tension capacity, utilization and margin; then rating factors from
//! the dead and live cases.
//!
//! Everything here is in SI; the report layer converts.

mod checks;
mod combine;

pub use checks::{member_capacity, Axis, MemberCapacity};
pub use combine::{load_effects, LoadEffect};

use crate::analysis::{Analysis, CaseResult};
use crate::capacity::{self, Curve, Regime};
use crate::model::{CaseKind, Model};

#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum RateError {
    #[error("material \"{0}\" has no fy; capacity checks need the yield stress")]
    NoYield(String),
    #[error("material \"{0}\" has no fu; the tension fracture check needs the tensile strength")]
    NoTensile(String),
    #[error("member \"{member}\": {source}")]
    Capacity {
        member: String,
        source: capacity::CapacityError,
    },
}

/// One member under one load case or combination.
#[derive(Clone, Debug, PartialEq)]
pub struct Check {
    pub member: usize,
    /// Index into [`Rating::effects`].
    pub effect: usize,
    /// Axial force, N (tension positive), and stress on the gross area, Pa.
    pub force: f64,
    pub stress: f64,
    pub regime: Regime,
    /// Design capacity in the sense of the force, N (after φ, 1/Ω, 1/γ).
    pub capacity: f64,
    /// |force| / capacity.
    pub utilization: f64,
    /// Critical (nominal) stress / |stress|: the factor of safety against
    /// buckling as practitioners quote it; None when the force is zero.
    pub margin: Option<f64>,
    /// Rating factor at inventory level for rows of a live case.
    pub rating_factor: Option<f64>,
}

/// Rating factors of one member for one live case.
#[derive(Clone, Debug, PartialEq)]
pub struct MemberRating {
    pub member: usize,
    /// Index of the live case in `model.cases`.
    pub live_case: usize,
    /// Dead-load force (sum of Dead cases), N.
    pub dead: f64,
    /// Live force with impact, N.
    pub live: f64,
    /// Capacity used (tension or compression side, design value), N.
    pub capacity: f64,
    pub inventory: Option<f64>,
    pub operating: Option<f64>,
}

/// All checks of a model on one curve.
pub struct Rating {
    pub curve: Curve,
    /// Load cases then combinations, forces per member.
    pub effects: Vec<LoadEffect>,
    /// Per-member capacity (both axes, both senses).
    pub members: Vec<MemberCapacity>,
    /// Every member under every effect.
    pub checks: Vec<Check>,
    /// Index of the check with the highest utilization.
    pub controlling: Option<usize>,
    pub ratings: Vec<MemberRating>,
    /// Index into `ratings` of the lowest inventory rating factor.
    pub lowest: Option<usize>,
    /// Notes for the report: slenderness limits, σe > Fy, and the like.
    pub notes: Vec<String>,
}

/// The curve named on the command line, else the model's, else the default.
pub fn choose_curve(model: &Model, cli: Option<&str>) -> Result<Curve, String> {
    let name = cli.or(model.rating.curve.as_deref());
    match name {
        None => Ok(Curve::default_curve()),
        Some(n) => Curve::from_name(n).ok_or_else(|| {
            format!(
                "\"{n}\" is not a column curve; use one of {}",
                Curve::names().join(", ")
            )
        }),
    }
}

/// Check every member under every case and combination, and rate it.
pub fn rate(model: &Model, analysis: &Analysis, curve: Curve) -> Result<Rating, RateError> {
    rate_results(model, &analysis.cases, curve)
}

/// As [`rate`], from the case results alone (one per `model.cases`), for
/// callers that solved many variants on one factorization.
pub fn rate_results(
    model: &Model,
    results: &[CaseResult],
    curve: Curve,
) -> Result<Rating, RateError> {
    let members = (0..model.members.len())
        .map(|m| member_capacity(model, m, &curve))
        .collect::<Result<Vec<_>, _>>()?;
    let effects = combine::load_effects_of(model, results);
    let dead: Vec<f64> = (0..model.members.len())
        .map(|m| {
            model
                .cases
                .iter()
                .zip(results)
                .filter(|(c, _)| c.kind == CaseKind::Dead)
                .map(|(_, r)| r.forces[m])
                .sum()
        })
        .collect();
    let has_dead = model.cases.iter().any(|c| c.kind == CaseKind::Dead);
    let phi = model.rating.condition_factor * model.rating.system_factor;
    let s = &model.rating;

    let mut ratings = Vec::new();
    let mut rf_of = std::collections::HashMap::new();
    for (ci, case) in model.cases.iter().enumerate() {
        if case.kind != CaseKind::Live {
            continue;
        }
        for (m, cap) in members.iter().enumerate() {
            let live = results[ci].forces[m] * (1.0 + case.impact);
            let (ct, cc) = (phi * cap.tension_capacity, phi * cap.compression.capacity);
            let level = |g: crate::model::Level| {
                capacity::member_rating(ct, cc, dead[m], live, g.gamma_dead, g.gamma_live)
            };
            let (inventory, operating) = if matches!(curve, Curve::BridgeAsd { .. }) {
                // Allowable-stress form RF = (C − D)/(L(1 + I)), one level.
                (
                    capacity::member_rating(ct, cc, dead[m], live, 1.0, 1.0),
                    None,
                )
            } else {
                (level(s.inventory), level(s.operating))
            };
            let capacity = if live >= 0.0 { ct } else { cc };
            rf_of.insert((m, ci), inventory);
            ratings.push(MemberRating {
                member: m,
                live_case: ci,
                dead: dead[m],
                live,
                capacity,
                inventory,
                operating,
            });
        }
    }
    let _ = has_dead;

    let mut checks = Vec::with_capacity(effects.len() * members.len());
    for (ei, effect) in effects.iter().enumerate() {
        // Forces below 1e-10 of the largest in this effect are round-off of a
        // zero-force member: checked as zero, on the compression side.
        let largest = effect.forces.iter().fold(0.0f64, |a, f| a.max(f.abs()));
        for (m, cap) in members.iter().enumerate() {
            let raw = effect.forces[m];
            let force = if raw.abs() <= 1e-10 * largest {
                0.0
            } else {
                raw
            };
            let area = model.sections[model.members[m].section].area;
            let stress = force / area;
            let (regime, capacity, critical) = if force > 0.0 {
                (
                    Regime::Tension,
                    cap.tension_capacity,
                    cap.tension_nominal / area,
                )
            } else {
                (
                    cap.compression.regime,
                    cap.compression.capacity,
                    cap.compression.critical_stress,
                )
            };
            let utilization = force.abs() / capacity;
            let margin = (stress.abs() > 0.0).then(|| critical / stress.abs());
            let rating_factor = effect
                .case
                .and_then(|ci| rf_of.get(&(m, ci)).copied().flatten());
            checks.push(Check {
                member: m,
                effect: ei,
                force,
                stress,
                regime,
                capacity,
                utilization,
                margin,
                rating_factor,
            });
        }
    }
    let controlling = (0..checks.len()).max_by(|&a, &b| {
        checks[a]
            .utilization
            .total_cmp(&checks[b].utilization)
            .then(b.cmp(&a))
    });
    let lowest = (0..ratings.len())
        .filter(|&i| ratings[i].inventory.is_some())
        .min_by(|&a, &b| {
            ratings[a]
                .inventory
                .unwrap()
                .total_cmp(&ratings[b].inventory.unwrap())
        });
    let mut notes = Vec::new();
    for (m, cap) in members.iter().enumerate() {
        let id = &model.members[m].id;
        let compressed = effects.iter().any(|e| e.forces[m] < 0.0);
        let tensioned = effects.iter().any(|e| e.forces[m] > 0.0);
        if compressed {
            if let Some(w) = capacity::slenderness_warning(cap.slenderness(), true) {
                notes.push(format!("member \"{id}\": {w}"));
            }
            if cap.compression.yields_before_buckling && matches!(curve, Curve::Euler) {
                notes.push(format!(
                    "member \"{id}\": Euler stress exceeds Fy, so the member would yield before it buckles elastically; the Euler curve is capped at Fy and an inelastic curve should govern"
                ));
            }
        }
        if tensioned && !compressed {
            if let Some(w) = capacity::slenderness_warning(cap.slenderness_unit_k(), false) {
                notes.push(format!("member \"{id}\": {w}"));
            }
        }
    }
    Ok(Rating {
        curve,
        effects,
        members,
        checks,
        controlling,
        ratings,
        lowest,
        notes,
    })
}
