//! Member capacity checks and load rating for a solved model: for every
//! member under every load case and combination, the slenderness in both
//! planes, the Euler and critical stresses of the rating method's column
//! curve or the tension capacity, utilization and margin; then rating
//! factors at each of the method's levels, and postings for legal loads.
//! The method (`crate::method`) supplies every factor.
//!
//! Everything here is in SI; the report layer converts.

mod checks;
mod combine;
pub mod lacing;
mod levels;
pub mod modes;
mod notes;

pub use checks::{member_capacity, Axis, LacingEffect, MemberCapacity, RP_PUNCHED};
pub use combine::{load_effects, moving_effects, LoadEffect, Relief, Side};
pub use modes::{compression_modes, BucklingMode, CompressionModes, ModeKind};

use crate::analysis::{Analysis, CaseResult};
use crate::capacity::{self, Regime};
use crate::method::Method;
use crate::model::{CaseKind, Model};

#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum RateError {
    #[error("material \"{0}\" has no fy; capacity checks need the yield stress")]
    NoYield(String),
    #[error("material \"{0}\" has no fu; the tension fracture check needs the tensile strength")]
    NoTensile(String),
    #[error("moving loads: {0}")]
    Loads(#[from] crate::loads::LoadError),
    /// A combined or enveloped force overflowed (issue 22, item 12).
    #[error("load case or combination \"{effect}\": the force of member \"{member}\" is not a finite number (overflow); the loads or factors are out of range")]
    NonFinite { effect: String, member: String },
    #[error("{0}")]
    Joint(#[from] crate::joint::JointError),
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
    /// Resistance at the method's check level in the sense of the force, N
    /// (φ·Rn, with φc·φs for LRFR; Rn/FS or Rn/Ω for allowable stress).
    pub capacity: f64,
    /// |force| / capacity.
    pub utilization: f64,
    /// Critical (nominal) stress / |stress|: the factor of safety against
    /// buckling as practitioners quote it; None when the force is zero.
    pub margin: Option<f64>,
    /// Rating factor at the method's first level for rows of a live load.
    pub rating_factor: Option<f64>,
    /// Not this method's comparison, so shown for information and not
    /// counted as a failure: an unfactored effect (a single case or a
    /// service envelope) under a method with factored resistances, or a
    /// combination under an allowable-stress method.
    pub service: bool,
}

/// The rating factor of one member for one live load at one level, with
/// every factor used.
#[derive(Clone, Debug, PartialEq)]
pub struct MemberRating {
    pub member: usize,
    /// The live case's or moving load's id.
    pub live_id: String,
    /// For a moving load: where the vehicle stood for the governing effect.
    pub at: Option<String>,
    /// Whether the live load is a legal load.
    pub legal: bool,
    /// "inventory", "operating", "legal", "design", "screening".
    pub level: &'static str,
    pub rf: Option<f64>,
    /// Dead-load forces DC and DW, N (tension positive).
    pub dc: f64,
    pub dw: f64,
    /// Live force with impact, N.
    pub live: f64,
    /// C = φc·φs·φ·Rn in the sense of the live force, N.
    pub capacity: f64,
    /// Nominal resistance Rn on that side, N.
    pub nominal: f64,
    /// "compression", "tension yield" or "tension fracture".
    pub governs: &'static str,
    /// Load factors as applied (γDC, γDW: max or min by sign; γL).
    pub gamma_dc: f64,
    pub gamma_dw: f64,
    pub gamma_live: f64,
    /// Resistance factor on Rn (φ, or 1/FS for allowable stress).
    pub phi: f64,
    /// Condition and system factors as given, and their product as applied
    /// (with the 0.85 floor of MBE Eq. 6A.4.2.1-3; 1.0 where not applied).
    pub phi_c: f64,
    pub phi_s: f64,
    pub phi_cs: f64,
    /// Rp and U where they entered (tension fracture), else 1.0.
    pub rp: f64,
    pub u: f64,
    /// The rating equation's clause for this level.
    pub clause: &'static str,
}

impl MemberRating {
    /// Total dead-load force DC + DW, N.
    pub fn dead(&self) -> f64 {
        self.dc + self.dw
    }
}

/// A legal vehicle's posting.
#[derive(Clone, Debug, PartialEq)]
pub struct PostingRow {
    /// The legal live load's id.
    pub vehicle: String,
    /// Gross weight W, N.
    pub weight: f64,
    /// Lowest legal-load RF and its member.
    pub rf: f64,
    pub member: usize,
    pub posting: crate::method::posting::Posting,
    pub clause: &'static str,
    /// Where a joint check governs the posting: index into the joints'
    /// ratings (the member above is then the lowest member only).
    pub joint: Option<usize>,
}

/// All checks of a model under one rating method.
pub struct Rating {
    pub method: Method,
    /// Load cases then combinations, forces per member.
    pub effects: Vec<LoadEffect>,
    /// Per-member capacity (both axes, both senses).
    pub members: Vec<MemberCapacity>,
    /// Every member under every effect.
    pub checks: Vec<Check>,
    /// Index of the check with the highest utilization (service rows only
    /// when there is nothing else).
    pub controlling: Option<usize>,
    /// One row per member, live load and level.
    pub ratings: Vec<MemberRating>,
    /// Index into `ratings` of the lowest factor at the method's first
    /// level (else at any level).
    pub lowest: Option<usize>,
    /// The lowest rating factor at each level, in the method's level order.
    pub lowest_by_level: Vec<(&'static str, usize)>,
    pub postings: Vec<PostingRow>,
    /// Notes for the report: stated defaults, slenderness limits, σe > Fy.
    pub notes: Vec<String>,
    /// Joint checks (pins, gusset plates, fastener groups) where the model
    /// describes joints.
    pub joints: Option<crate::joint::Joints>,
}

impl Rating {
    /// The lowest rating factor at `level`, if any.
    pub fn lowest_at(&self, level: &str) -> Option<&MemberRating> {
        self.lowest_by_level
            .iter()
            .find(|(l, _)| *l == level)
            .map(|&(_, i)| &self.ratings[i])
    }

    /// Checks that count toward the verdict (not service rows).
    pub fn failing(&self) -> usize {
        self.checks
            .iter()
            .filter(|c| !c.service && c.utilization > 1.0)
            .count()
    }
}

/// The method named on the command line, else the model's, else LRFR.
pub fn choose_method(model: &Model, cli: Option<&str>) -> Result<Method, String> {
    let name = cli
        .or(model.rating.method.as_deref())
        .unwrap_or(crate::method::DEFAULT);
    Method::from_name(name, &model.rating.settings).map_err(|e| e.to_string())
}

/// Check every member under every case and combination, and rate it.
pub fn rate(model: &Model, analysis: &Analysis, method: Method) -> Result<Rating, RateError> {
    let envelopes = moving_envelopes(model, &analysis.prepared)?;
    let mut rating = rate_results(model, &analysis.cases, method, &envelopes)?;
    rating.joints = crate::joint::rate_joints(model, analysis, &rating, &envelopes)?;
    crate::joint::post_with_joints(&mut rating);
    Ok(rating)
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
pub fn rate_results(
    model: &Model,
    results: &[CaseResult],
    method: Method,
    envelopes: &[crate::loads::MovingEnvelope],
) -> Result<Rating, RateError> {
    let members = (0..model.members.len())
        .map(|m| member_capacity(model, m, &method))
        .collect::<Result<Vec<_>, _>>()?;
    let relief = combine::Relief::of(&method);
    let (mut effects, mut relieved) = combine::load_effects_relieved(model, results, relief);
    let (moving, more) = combine::moving_effects_relieved(model, results, envelopes, relief);
    effects.extend(moving);
    relieved.extend(more);
    for e in &effects {
        if let Some(m) = e.forces.iter().position(|f| !f.is_finite()) {
            return Err(RateError::NonFinite {
                effect: e.id.clone(),
                member: model.members[m].id.to_string(),
            });
        }
    }
    let ratings = if method.rates {
        levels::rate_live_loads(model, results, envelopes, &method, &members)
    } else {
        Vec::new()
    };
    let checks = check_rows(model, &effects, &members, &method, &ratings);
    let controlling = controlling(&checks);
    let lowest_by_level = levels::lowest_by_level(&method, &ratings);
    let lowest = lowest_by_level
        .iter()
        .find(|(l, _)| *l == method.primary_level())
        .or(lowest_by_level.first())
        .map(|&(_, i)| i);
    let postings = levels::postings(model, &method, &ratings);
    let mut notes = method.notes.clone();
    for id in &relieved {
        notes.push(format!(
            "combination \"{id}\": where a dead case relieves the live effect in a member it is taken at its minimum factor (AASHTO LRFD 3.4.1 for LRFR; the method's own minimum otherwise)"
        ));
    }
    notes.extend(notes::member_notes(model, &method, &effects, &members));
    Ok(Rating {
        method,
        effects,
        members,
        checks,
        controlling,
        ratings,
        lowest,
        lowest_by_level,
        postings,
        notes,
        joints: None,
    })
}

/// Every member under every effect.
fn check_rows(
    model: &Model,
    effects: &[LoadEffect],
    members: &[MemberCapacity],
    method: &Method,
    ratings: &[MemberRating],
) -> Vec<Check> {
    let first = method.primary_level();
    let mut checks = Vec::with_capacity(effects.len() * members.len());
    for (ei, effect) in effects.iter().enumerate() {
        // Forces below 1e-10 of the largest in this effect are round-off of a
        // zero-force member: checked as zero, on the compression side.
        let largest = effect.forces.iter().fold(0.0f64, |a, f| a.max(f.abs()));
        let service = effect.factored == method.checks_service();
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
            // The first level's factor of this member for the live load the
            // row shows (a live case, or a moving load's side).
            let rating_factor = live_of(model, effect).and_then(|id| {
                ratings
                    .iter()
                    .filter(|r| r.member == m && r.live_id == id && r.level == first)
                    .filter_map(|r| r.rf)
                    .reduce(f64::min)
            });
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
                service,
            });
        }
    }
    checks
}

/// The live load an effect shows alone, if it is one: a Live case or a
/// moving load's service envelope.
fn live_of<'a>(model: &'a Model, effect: &LoadEffect) -> Option<&'a str> {
    if let Some(c) = effect.case {
        return (model.cases[c].kind == CaseKind::Live).then(|| model.cases[c].id.as_str());
    }
    effect.moving.map(|(k, _)| model.live.moving[k].id.as_str())
}

/// The check with the highest utilization, preferring rows that count.
fn controlling(checks: &[Check]) -> Option<usize> {
    let pick = |service_ok: bool| {
        (0..checks.len())
            .filter(|&i| service_ok || !checks[i].service)
            .max_by(|&a, &b| {
                checks[a]
                    .utilization
                    .total_cmp(&checks[b].utilization)
                    .then(b.cmp(&a))
            })
    };
    pick(false).or_else(|| pick(true))
}
