//! Load-path redundancy: remove each member in turn, rebuild the model
//! without it and analyse. If the damaged truss is a mechanism the member
//! is non-redundant (critical); a critical member in tension under the
//! dead plus live effects is what bridge inspection practice calls
//! fracture-critical (common practice). Otherwise the greatest utilization
//! after the loss says how close the survivors come to failing.
//!
//! The live effects are those `rate` checks: the live load cases with
//! their impact and, for each moving load, the dead load plus the greatest
//! tension and plus the greatest compression of its envelope (impact
//! included). A member any of them puts in tension is in tension.

use super::run::{summarise, RunOptions};
use super::variant::without_member;
use crate::analysis::results::{AnalysisError, Prepared};
use crate::analysis::Analysis;
use crate::loads::MovingEnvelope;
use crate::model::{CaseKind, Model};
use crate::rate::Side;
use rayon::prelude::*;

/// The result of losing one member.
#[derive(Clone, Debug, PartialEq)]
pub struct Loss {
    pub member: usize,
    /// The truss becomes a mechanism without it.
    pub critical: bool,
    /// Critical and in tension under dead + live (see [`service_force`]).
    pub fracture_critical: bool,
    /// Its governing force in the intact truss under dead + live, N: the
    /// greatest tension of the service effects if any is tension, else the
    /// greatest compression (see [`service_forces`]).
    pub service_force: f64,
    /// Which service effect gives it ("dead + live", "dead + truck (placed for greatest tension)").
    pub service_effect: String,
    /// Why the damaged truss fails, when it does.
    pub mechanism: Option<String>,
    /// Greatest utilization of the damaged truss and where (None when critical).
    pub max_utilization_after: Option<f64>,
    pub controlling_member: Option<String>,
    pub controlling_case: Option<String>,
}

/// Member forces of the intact truss under the dead cases plus the live
/// cases with impact; if the model marks no case Dead or Live, the sum of
/// all cases.
pub fn service_force(model: &Model, analysis: &Analysis) -> Vec<f64> {
    let marked = model
        .cases
        .iter()
        .any(|c| matches!(c.kind, CaseKind::Dead | CaseKind::Live));
    (0..model.members.len())
        .map(|m| {
            model
                .cases
                .iter()
                .zip(&analysis.cases)
                .filter(|(c, _)| !marked || c.kind != CaseKind::Other)
                .map(|(c, r)| {
                    let f = if c.kind == CaseKind::Live {
                        1.0 + c.impact
                    } else {
                        1.0
                    };
                    f * r.forces[m]
                })
                .sum()
        })
        .collect()
}

/// The service effects of every member: the dead + live cases of
/// [`service_force`] (labelled "dead + live", or "all cases" when no case
/// is marked), then for each moving load the dead load plus the greatest
/// tension and plus the greatest compression of its envelope, as `rate`
/// builds them. Per member, the governing one: the greatest tension if any
/// effect is tension, else the greatest compression. Forces within 1e-10
/// of the largest are round-off of a zero-force member (as in the rating
/// checks) and count as zero.
pub fn service_forces(
    model: &Model,
    analysis: &Analysis,
    envelopes: &[MovingEnvelope],
) -> Vec<(f64, String)> {
    let marked = model
        .cases
        .iter()
        .any(|c| matches!(c.kind, CaseKind::Dead | CaseKind::Live));
    let static_label = if marked { "dead + live" } else { "all cases" };
    let statics = service_force(model, analysis);
    let mut effects: Vec<(String, Vec<f64>)> = vec![(static_label.into(), statics)];
    for env in envelopes {
        for side in [Side::Tension, Side::Compression] {
            let forces = env
                .per_member
                .iter()
                .map(|e| {
                    e.dead
                        + match side {
                            Side::Tension => e.max_tension(),
                            Side::Compression => e.max_compression(),
                        }
                })
                .collect();
            effects.push((
                format!("dead + {} ({})", env.moving_load, side.effect_label()),
                forces,
            ));
        }
    }
    governing(model, &effects)
}

/// Per member, the governing service effect (see [`service_forces`]).
fn governing(model: &Model, effects: &[(String, Vec<f64>)]) -> Vec<(f64, String)> {
    let largest = effects
        .iter()
        .flat_map(|(_, f)| f.iter())
        .fold(0.0f64, |a, f| a.max(f.abs()));
    let clean = |f: f64| if f.abs() <= 1e-10 * largest { 0.0 } else { f };
    (0..model.members.len())
        .map(|m| {
            let pick = |better: &dyn Fn(f64, f64) -> bool| {
                let mut best = (clean(effects[0].1[m]), 0);
                for (k, (_, f)) in effects.iter().enumerate().skip(1) {
                    let v = clean(f[m]);
                    if better(v, best.0) {
                        best = (v, k);
                    }
                }
                best
            };
            let (t, kt) = pick(&|v, b| v > b);
            let (f, k) = if t > 0.0 {
                (t, kt)
            } else {
                pick(&|v, b| v < b)
            };
            (f, effects[k].0.clone())
        })
        .collect()
}

/// [`service_forces`] for a model with tension-only members, where
/// superposition does not hold: the dead and live cases (with impact)
/// solved together as one state by the active-set iteration, and each
/// moving load's service envelope as `rate` builds it (dead load and
/// vehicle solved together at every position).
fn tension_only_service(
    model: &Model,
    analysis: &Analysis,
    opts: &RunOptions,
) -> Result<Vec<(f64, String)>, String> {
    use crate::analysis::active_set::{factored_state, Solver};
    let marked = model
        .cases
        .iter()
        .any(|c| matches!(c.kind, CaseKind::Dead | CaseKind::Live));
    let terms: Vec<(usize, f64)> = (0..model.cases.len())
        .filter(|&c| !marked || model.cases[c].kind != CaseKind::Other)
        .map(|c| {
            let case = &model.cases[c];
            let f = if case.kind == CaseKind::Live {
                1.0 + case.impact
            } else {
                1.0
            };
            (c, f)
        })
        .collect();
    let label = if marked { "dead + live" } else { "all cases" };
    let solver = Solver::new(model).map_err(|e| e.to_string())?;
    let statics = solver
        .solve(&factored_state(model, label, &terms), None)
        .map_err(|e| e.to_string())?;
    let mut effects = vec![(label.to_string(), statics.result.forces)];
    let rating =
        crate::rate::rate(model, analysis, opts.method.clone()).map_err(|e| e.to_string())?;
    effects.extend(
        rating
            .effects
            .into_iter()
            .filter(|e| e.moving.is_some())
            .map(|e| (e.id, e.forces)),
    );
    Ok(governing(model, &effects))
}

/// Remove each member in turn (in parallel) and report the loss.
pub fn scan(model: &Model, analysis: &Analysis, opts: &RunOptions) -> Result<Vec<Loss>, String> {
    let service = if model.has_tension_only() {
        tension_only_service(model, analysis, opts)?
    } else {
        let envelopes =
            crate::rate::moving_envelopes(model, &analysis.prepared).map_err(|e| e.to_string())?;
        service_forces(model, analysis, &envelopes)
    };
    (0..model.members.len())
        .into_par_iter()
        .map(|j| {
            let tension = service[j].0 > 0.0;
            let mut loss = Loss {
                member: j,
                critical: false,
                fracture_critical: false,
                service_force: service[j].0,
                service_effect: service[j].1.clone(),
                mechanism: None,
                max_utilization_after: None,
                controlling_member: None,
                controlling_case: None,
            };
            let damaged = match without_member(model, j) {
                Ok(m) => m,
                Err(e) => {
                    loss.critical = true;
                    loss.fracture_critical = tension;
                    loss.mechanism = Some(e.to_string());
                    return Ok(loss);
                }
            };
            // With tension-only members the damaged truss is re-run by the
            // active-set iteration; a mechanism once its slack members are
            // out is a mechanism: the lost member is not redundant.
            let solved = if damaged.has_tension_only() {
                crate::analysis::analyse(&damaged).map(|a| (a.prepared, a.cases))
            } else {
                Prepared::new(&damaged)
                    .and_then(|p| p.solve_cases(&damaged, &damaged.cases).map(|c| (p, c)))
            };
            match solved {
                Err(AnalysisError::Internal) => Err(AnalysisError::Internal.to_string()),
                Err(e) => {
                    // A mechanism, or so ill-conditioned that equilibrium
                    // fails: either way the survivors cannot carry the load.
                    loss.critical = true;
                    loss.fracture_critical = tension;
                    loss.mechanism = Some(e.to_string());
                    Ok(loss)
                }
                Ok((_, cases)) if damaged.has_tension_only() => {
                    match super::run::summarise_tension_only(&damaged, &cases, opts) {
                        // A combination or vehicle position the damaged
                        // truss cannot carry with its slack members out.
                        Err(crate::rate::RateError::Analysis(e))
                            if e != AnalysisError::Internal =>
                        {
                            loss.critical = true;
                            loss.fracture_critical = tension;
                            loss.mechanism = Some(e.to_string());
                            Ok(loss)
                        }
                        Err(e) => Err(e.to_string()),
                        Ok(o) => {
                            loss.max_utilization_after = o.max_utilization;
                            loss.controlling_member = o.controlling_member;
                            loss.controlling_case = o.controlling_case;
                            Ok(loss)
                        }
                    }
                }
                Ok((prepared, cases)) => {
                    let o = summarise(&damaged, &cases, &prepared, opts)?;
                    loss.max_utilization_after = o.max_utilization;
                    loss.controlling_member = o.controlling_member;
                    loss.controlling_case = o.controlling_case;
                    Ok(loss)
                }
            }
        })
        .collect()
}
