//! Joint checks: the parts of a truss at its nodes (pins, gusset plates,
//! fastener groups) checked and rated from the member forces the analysis
//! already gives at each node.
//!
//! A joint type is one module beside its peers: it turns the model's
//! description of its joints into [`JointCheck`]s, and [`all_checks`] lists
//! the builders. This module evaluates every check under every load case
//! and combination without a moving load (`rows`), and rates it for every
//! live load at every level of the method (`ratings`):
//!
//! RF = the live multiplier λ at which the check reaches its limit,
//! u(γDC·DC + γDW·DW + λ·γL·(L + IM)) = 1, with each γ at its maximum or
//! minimum, whichever gives the lower λ ([`solve_rf`]). For a check whose
//! demand is |Σ aᵢ·Fᵢ| against a fixed resistance this is the rating
//! equation (MBE Eq. 6A.4.2.1-1) exactly; checks not linear in the live load
//! (a pin's moment and shear interaction) are solved by bisection.
//!
//! Moving loads ([`states`]): a check using one member takes that member's
//! envelope extremes, exactly as the member's own rating; a check using
//! several members takes every corner of the box of their extremes, an
//! upper bound of any single vehicle position for demands convex in the
//! member forces (every joint check here is), so never above the code's
//! rating factor.
//!
//! Everything in SI; the report layer converts.

pub mod gusset;
pub(crate) mod nonlinear;
pub mod pin;
pub mod solve_rf;
pub mod states;

use crate::analysis::Analysis;
use crate::method::{Level, Method};
use crate::model::{CaseKind, Model};
use crate::rate::Rating;
use crate::units::Dimension;

/// Demand and resistance of one check under one set of member forces;
/// utilization = demand / resistance (an interaction value against its
/// limit is one too).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Eval {
    pub demand: f64,
    pub resistance: f64,
}

impl Eval {
    /// demand / resistance; infinite for a zero resistance under load.
    pub fn utilization(&self) -> f64 {
        if self.demand == 0.0 {
            0.0
        } else {
            self.demand / self.resistance
        }
    }
}

/// One check of one part of a joint, computed from the members' axial
/// forces. Implementations own their resistance factors or allowable
/// stresses for each method family, with clauses.
pub trait JointCheck: Send + Sync {
    /// Node index of the joint.
    fn node(&self) -> usize;
    /// Short kind: "fastener shear", "Whitmore yield", "pin moment and shear".
    fn kind(&self) -> &'static str;
    /// The member the check belongs to, or None for the joint as a whole.
    fn member(&self) -> Option<usize>;
    /// Which part, for the reader.
    fn part(&self) -> String;
    /// Members whose axial forces enter the check.
    fn uses(&self) -> Vec<usize>;
    /// The clause for this method.
    fn clause(&self, method: &Method) -> &'static str;
    /// The equation as text, without numbers.
    fn equation(&self, method: &Method) -> String;
    /// Named inputs in SI with their dimension (None: a plain number).
    fn inputs(&self) -> Vec<(&'static str, f64, Option<Dimension>)>;
    /// Unit of demand and resistance (None: a dimensionless interaction).
    fn dimension(&self) -> Option<Dimension>;
    /// Demand and resistance under `forces` (N, tension positive, one per
    /// member) at this method and level.
    fn evaluate(&self, forces: &[f64], method: &Method, level: &Level) -> Eval;
}

/// What a joint type's builder gives: its checks, and notes for the report
/// (defaults taken, data missing).
#[derive(Default)]
pub struct JointSet {
    pub checks: Vec<Box<dyn JointCheck>>,
    pub notes: Vec<String>,
}

/// Every joint type's checks of `model`, in a fixed order. A new joint type
/// adds one line here.
pub fn all_checks(model: &Model) -> JointSet {
    let builders: [fn(&Model) -> JointSet; 2] = [pin::checks, gusset::checks];
    let mut all = JointSet::default();
    for build in builders {
        let set = build(model);
        all.checks.extend(set.checks);
        all.notes.extend(set.notes);
    }
    all
}

/// One check under one load case or combination (no moving load).
#[derive(Clone, Debug, PartialEq)]
pub struct JointRow {
    /// Index into [`Joints::checks`].
    pub check: usize,
    /// Index into the rating's effects.
    pub effect: usize,
    pub eval: Eval,
    /// Not this method's comparison (see `rate::Check::service`).
    pub service: bool,
}

/// The rating factor of one check for one live load at one level.
#[derive(Clone, Debug, PartialEq)]
pub struct JointRating {
    /// Index into [`Joints::checks`].
    pub check: usize,
    pub live_id: String,
    pub legal: bool,
    pub level: &'static str,
    /// None where the live load does not drive the check.
    pub rf: Option<f64>,
    /// Where the live load was taken: the members' envelope sides used.
    pub at: Option<String>,
    /// Demand and resistance with the factored dead load and λ = 1.
    pub factored: Eval,
    pub gamma_dc: f64,
    pub gamma_dw: f64,
    pub gamma_live: f64,
}

/// Every joint check of a model, evaluated and rated.
pub struct Joints {
    pub checks: Vec<Box<dyn JointCheck>>,
    pub rows: Vec<JointRow>,
    pub ratings: Vec<JointRating>,
    pub notes: Vec<String>,
}

impl Joints {
    /// The lowest rating factor at `level` (index into `ratings`).
    pub fn lowest_at(&self, level: &str) -> Option<usize> {
        (0..self.ratings.len())
            .filter(|&i| self.ratings[i].level == level && self.ratings[i].rf.is_some())
            .min_by(|&a, &b| {
                let (x, y) = (self.ratings[a].rf, self.ratings[b].rf);
                x.unwrap().total_cmp(&y.unwrap())
            })
    }

    /// Checks of the rows that count (not service rows) above 1.
    pub fn failing(&self) -> usize {
        self.rows
            .iter()
            .filter(|r| !r.service && r.eval.utilization() > 1.0)
            .count()
    }
}

/// Joint checks that cannot be evaluated.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum JointError {
    #[error("joint at node \"{node}\", {kind}: too many members' envelopes to combine ({count}; at most {limit})")]
    TooManyMembers {
        node: String,
        kind: String,
        count: usize,
        limit: usize,
    },
    #[error("joint checks: {0}")]
    Analysis(String),
    #[error("joint at node \"{node}\", {kind}, {effect}: the demand or resistance is not a finite number")]
    NonFinite {
        node: String,
        kind: String,
        effect: String,
    },
}

/// Evaluate and rate every joint check of `model` (None when it describes
/// no joints).
pub fn rate_joints(
    model: &Model,
    analysis: &Analysis,
    rating: &Rating,
    envelopes: &[crate::loads::MovingEnvelope],
) -> Result<Option<Joints>, JointError> {
    let set = all_checks(model);
    if set.checks.is_empty() {
        return Ok(None);
    }
    rate_joint_set(model, analysis, rating, envelopes, set).map(Some)
}

/// [`rate_joints`] for a given set of checks.
pub fn rate_joint_set(
    model: &Model,
    analysis: &Analysis,
    rating: &Rating,
    envelopes: &[crate::loads::MovingEnvelope],
    set: JointSet,
) -> Result<Joints, JointError> {
    let method = &rating.method;
    let rows = rows_of(model, rating, &set.checks)?;
    let mut notes = set.notes;
    let ratings = if method.rates {
        rate_live(model, analysis, method, &set.checks, envelopes, &mut notes)?
    } else {
        Vec::new()
    };
    Ok(Joints {
        checks: set.checks,
        rows,
        ratings,
        notes,
    })
}

/// Every check under every load case and combination without a moving load
/// (consistent states), at the method's first level.
pub(crate) fn rows_of(
    model: &Model,
    rating: &Rating,
    checks: &[Box<dyn JointCheck>],
) -> Result<Vec<JointRow>, JointError> {
    let method = &rating.method;
    let first = method
        .design_levels
        .first()
        .or(method.legal_levels.first())
        .copied();
    let mut rows = Vec::new();
    if let Some(level) = first {
        for (ci, check) in checks.iter().enumerate() {
            for (ei, e) in rating.effects.iter().enumerate() {
                let moving = e.moving.is_some() || matches!(e.combination, Some((_, Some(_))));
                if moving {
                    continue;
                }
                let eval = check.evaluate(&e.forces, method, &level);
                finite(model, check.as_ref(), &eval, &e.id)?;
                rows.push(JointRow {
                    check: ci,
                    effect: ei,
                    eval,
                    service: e.factored == method.checks_service(),
                });
            }
        }
    }
    Ok(rows)
}

fn finite(model: &Model, check: &dyn JointCheck, e: &Eval, effect: &str) -> Result<(), JointError> {
    if e.demand.is_finite() && e.resistance.is_finite() {
        Ok(())
    } else {
        Err(JointError::NonFinite {
            node: model.nodes[check.node()].id.to_string(),
            kind: check.kind().to_string(),
            effect: effect.to_string(),
        })
    }
}

/// One row per check, live load and level.
fn rate_live(
    model: &Model,
    analysis: &Analysis,
    method: &Method,
    checks: &[Box<dyn JointCheck>],
    envelopes: &[crate::loads::MovingEnvelope],
    notes: &mut Vec<String>,
) -> Result<Vec<JointRating>, JointError> {
    let dead = states::Dead::of(model, &analysis.cases);
    let positions = states::Positions::of(model, analysis, envelopes)?;
    let several = checks.iter().any(|c| c.uses().len() >= 2);
    for (env, p) in envelopes.iter().zip(&positions.per_moving) {
        if several && p.is_none() {
            notes.push(format!(
                "moving load \"{}\": its uniform (lane, trailing or crowd) part has no single position, so joint checks of several members combine the members' envelope extremes (every corner of their box): an upper bound of any one position, conservative",
                env.moving_load
            ));
        }
    }
    let mut out = Vec::new();
    for live in states::live_loads(model, envelopes) {
        let levels = if live.legal {
            &method.legal_levels
        } else {
            &method.design_levels
        };
        for (ci, check) in checks.iter().enumerate() {
            let corners = states::corners(
                model,
                &analysis.cases,
                envelopes,
                &positions,
                &live,
                check.as_ref(),
            )?;
            for level in levels {
                let row = solve_rf::rate_check(check.as_ref(), method, level, &dead, &corners);
                finite(model, check.as_ref(), &row.factored, &live.id)?;
                out.push(JointRating {
                    check: ci,
                    live_id: live.id.clone(),
                    legal: live.legal,
                    level: level.name,
                    rf: row.rf,
                    at: row.at,
                    factored: row.factored,
                    gamma_dc: row.gamma_dc,
                    gamma_dw: row.gamma_dw,
                    gamma_live: level.gamma_live,
                });
            }
        }
    }
    Ok(out)
}

/// Postings governed by a joint: where a joint check's legal-load factor is
/// below the lowest member's, it sets the posting (MBE 6A.8.3 applies to the
/// bridge's lowest legal-load factor, whatever element gives it).
pub fn post_with_joints(rating: &mut Rating) {
    let Some(j) = &rating.joints else { return };
    let family = rating.method.family;
    for p in &mut rating.postings {
        let low = (0..j.ratings.len())
            .filter(|&i| j.ratings[i].legal && j.ratings[i].live_id == p.vehicle)
            .filter(|&i| j.ratings[i].rf.is_some())
            .min_by(|&a, &b| {
                j.ratings[a]
                    .rf
                    .unwrap()
                    .total_cmp(&j.ratings[b].rf.unwrap())
            });
        if let Some(i) = low {
            let rf = j.ratings[i].rf.unwrap();
            if rf < p.rf {
                p.rf = rf;
                p.posting = crate::method::posting::posting(family, rf, p.weight);
                p.joint = Some(i);
            }
        }
    }
}

/// Whether a case is a live case (rated as a live load).
pub(crate) fn is_live(model: &Model, c: usize) -> bool {
    model.cases[c].kind == CaseKind::Live
}
