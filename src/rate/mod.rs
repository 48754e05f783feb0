//! Member capacity checks and load rating for a solved model: for every
//! member under every load case and combination, the slenderness in both
//! planes, the Euler and critical stresses of the chosen column curve or
//! the tension capacity, utilization and margin; then rating factors from
//! the dead and live cases.
//!
//! Everything here is in SI; the report layer converts.

mod checks;
mod combine;
pub mod lacing;
pub mod modes;

pub use checks::{member_capacity, Axis, LacingEffect, MemberCapacity};
pub use combine::{load_effects, moving_effects, LoadEffect, Side};
pub use modes::{compression_modes, BucklingMode, CompressionModes, ModeKind};

use crate::analysis::{Analysis, CaseResult};
use crate::capacity::{self, Curve, Regime};
use crate::model::{CaseKind, Model};
use crate::section;

#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum RateError {
    #[error("material \"{0}\" has no fy; capacity checks need the yield stress")]
    NoYield(String),
    #[error("material \"{0}\" has no fu; the tension fracture check needs the tensile strength")]
    NoTensile(String),
    #[error("moving loads: {0}")]
    Loads(#[from] crate::loads::LoadError),
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

/// Rating factors of one member for one live load (a Live case or a
/// moving load's envelope).
#[derive(Clone, Debug, PartialEq)]
pub struct MemberRating {
    pub member: usize,
    /// The live case's or moving load's id.
    pub live_id: String,
    /// For a moving load: where the vehicle stood for the governing effect.
    pub at: Option<String>,
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
    let curve = match name {
        None => Curve::default_curve(),
        Some(n) => Curve::from_name(n).ok_or_else(|| {
            format!(
                "\"{n}\" is not a column curve; use one of {}",
                Curve::names().join(", ")
            )
        })?,
    };
    // Parameters set in the model's rating block apply to their curve.
    let s = &model.rating;
    Ok(match curve {
        Curve::En1993 { class, gamma_m1 } => Curve::En1993 {
            class,
            gamma_m1: s.gamma_m1.unwrap_or(gamma_m1),
        },
        Curve::BridgeAsd { safety_factor } => Curve::BridgeAsd {
            safety_factor: s.safety_factor.unwrap_or(safety_factor),
        },
        Curve::CsaS16 { n } => Curve::CsaS16 {
            n: s.csa_n.unwrap_or(n),
        },
        other => other,
    })
}

/// Check every member under every case and combination, and rate it.
pub fn rate(model: &Model, analysis: &Analysis, curve: Curve) -> Result<Rating, RateError> {
    let envelopes = moving_envelopes(model, &analysis.prepared)?;
    rate_results(model, &analysis.cases, curve, &envelopes)
}

/// The moving-load envelopes of a model (none when it has no moving loads).
pub fn moving_envelopes(
    model: &Model,
    prepared: &crate::analysis::results::Prepared,
) -> Result<Vec<crate::loads::MovingEnvelope>, RateError> {
    if model.live.moving.is_empty() {
        Ok(Vec::new())
    } else {
        Ok(crate::loads::envelopes(model, prepared)?)
    }
}

/// As [`rate`], from the case results alone (one per `model.cases`), for
/// callers that solved many variants on one factorization.
// Members, dead forces and envelopes are parallel arrays indexed by member.
#[allow(clippy::needless_range_loop)]
pub fn rate_results(
    model: &Model,
    results: &[CaseResult],
    curve: Curve,
    envelopes: &[crate::loads::MovingEnvelope],
) -> Result<Rating, RateError> {
    let members = (0..model.members.len())
        .map(|m| member_capacity(model, m, &curve))
        .collect::<Result<Vec<_>, _>>()?;
    let mut effects = combine::load_effects_of(model, results);
    effects.extend(moving_effects(model, results, envelopes));
    let dead_cases = model.dead_cases();
    let dead: Vec<f64> = (0..model.members.len())
        .map(|m| dead_cases.iter().map(|&c| results[c].forces[m]).sum())
        .collect();
    let phi = model.rating.condition_factor * model.rating.system_factor;
    let s = &model.rating;
    let asr = matches!(curve, Curve::BridgeAsd { .. });
    // RF of member m for a live force (impact included), both levels.
    let rf = |m: usize, live: f64| -> (Option<f64>, Option<f64>, f64) {
        let cap = &members[m];
        let (ct, cc) = (phi * cap.tension_capacity, phi * cap.compression.capacity);
        let level = |g: crate::model::Level| {
            capacity::member_rating(ct, cc, dead[m], live, g.gamma_dead, g.gamma_live)
        };
        let capacity = if live >= 0.0 { ct } else { cc };
        if asr {
            // Allowable-stress form RF = (C − D)/(L(1 + I)), one level.
            (
                capacity::member_rating(ct, cc, dead[m], live, 1.0, 1.0),
                None,
                capacity,
            )
        } else {
            (level(s.inventory), level(s.operating), capacity)
        }
    };

    let mut ratings = Vec::new();
    // Inventory RF of (member, effect) for the check rows.
    let mut rf_of = std::collections::HashMap::new();
    for (ci, case) in model.cases.iter().enumerate() {
        if case.kind != CaseKind::Live {
            continue;
        }
        let ei = effects.iter().position(|e| e.case == Some(ci)).unwrap_or(0);
        for m in 0..members.len() {
            let live = results[ci].forces[m] * (1.0 + case.impact);
            let (inventory, operating, capacity) = rf(m, live);
            rf_of.insert((m, ei), inventory);
            ratings.push(MemberRating {
                member: m,
                live_id: case.id.clone(),
                at: None,
                dead: dead[m],
                live,
                capacity,
                inventory,
                operating,
            });
        }
    }
    let length = model.units.length;
    for (k, env) in envelopes.iter().enumerate() {
        for m in 0..members.len() {
            let e = &env.per_member[m];
            // Rate each side of the envelope; the lower factor governs.
            let mut best: Option<MemberRating> = None;
            for (side, extreme) in [
                (Side::Tension, &e.tension),
                (Side::Compression, &e.compression),
            ] {
                let live = extreme.force;
                let (inventory, operating, capacity) = rf(m, live);
                let ei = effects.iter().position(|x| x.moving == Some((k, side)));
                if let Some(ei) = ei {
                    rf_of.insert((m, ei), inventory);
                }
                let Some(inv) = inventory else { continue };
                let at = extreme.at.as_ref().map(|p| {
                    format!(
                        "{} with the front axle at {:.2} {} ({})",
                        side.label(),
                        p.position / length.to_si,
                        length.name,
                        format!("{:?}", p.direction).to_lowercase()
                    )
                });
                let row = MemberRating {
                    member: m,
                    live_id: env.moving_load.clone(),
                    at,
                    dead: dead[m],
                    live,
                    capacity,
                    inventory,
                    operating,
                };
                if best
                    .as_ref()
                    .is_none_or(|b| inv < b.inventory.unwrap_or(f64::INFINITY))
                {
                    best = Some(row);
                }
            }
            if let Some(b) = best {
                ratings.push(b);
            }
        }
    }

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
            let rating_factor = rf_of.get(&(m, ei)).copied().flatten();
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
        if let (Some(le), true) = (&cap.lacing, compressed) {
            // §E6.2: 2 % of the available compressive strength, not the demand.
            let pmax = cap.compression.capacity;
            let s = crate::report::Scale::of(model);
            notes.push(format!(
                "member \"{id}\": laced built-up member with tie plates, KL/r = {:.1} about the laced axis, not modified (AISC 360-16 §E6.1(b)); lacing designed for V = 2% of the available strength {:.1} {} = {:.2} {} (§E6.2)",
                le.overall,
                pmax / s.force,
                s.force_name,
                section::lacing_shear(pmax) / s.force,
                s.force_name
            ));
            if let Some(b) = &cap.lacing_bars {
                notes.push(format!(
                    "member \"{id}\": lacing bar force {:.2} {} against strength {:.2} {} (utilization {:.2}); K·L/r = {:.0} {} {:.0} ({}; {})",
                    b.force / s.force,
                    s.force_name,
                    b.capacity / s.force,
                    s.force_name,
                    b.utilization,
                    b.slenderness,
                    if b.slenderness_ok { "≤" } else { "EXCEEDS" },
                    b.slenderness_limit,
                    lacing::LacingBarCheck::CLAUSE,
                    if b.angle_given { "angle as given" } else { "angle not given: the least §E6.2 allows taken" }
                ));
            }
            if !le.component_ok {
                notes.push(format!(
                    "member \"{id}\": component slenderness a/ri = {:.1} exceeds 3/4 of the governing slenderness (AISC 360-16 §E6.2)",
                    le.component
                ));
            }
        }
        if compressed {
            if model.sections[model.members[m].section].built_up.is_some() {
                notes.extend(cap.modes.report_notes(id, cap.compression.critical_stress));
            }
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
