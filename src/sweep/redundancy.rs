//! Load-path redundancy: remove each member in turn, rebuild the model
//! without it and analyse. If the damaged truss is a mechanism the member
//! is non-redundant (critical); a critical member in tension under the
//! dead plus live cases is what bridge inspection practice calls
//! fracture-critical (common practice). Otherwise the greatest utilization
//! after the loss says how close the survivors come to failing.

use super::run::{summarise, RunOptions};
use super::variant::without_member;
use crate::analysis::results::{AnalysisError, Prepared};
use crate::analysis::Analysis;
use crate::model::{CaseKind, Model};
use rayon::prelude::*;

/// The result of losing one member.
#[derive(Clone, Debug, PartialEq)]
pub struct Loss {
    pub member: usize,
    /// The truss becomes a mechanism without it.
    pub critical: bool,
    /// Critical and in tension under dead + live (see [`service_force`]).
    pub fracture_critical: bool,
    /// Its force in the intact truss under dead + live, N.
    pub service_force: f64,
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

/// Remove each member in turn (in parallel) and report the loss.
pub fn scan(model: &Model, analysis: &Analysis, opts: &RunOptions) -> Result<Vec<Loss>, String> {
    let mut service = service_force(model, analysis);
    let largest = service.iter().fold(0.0f64, |a, f| a.max(f.abs()));
    // Round-off of a zero-force member is zero (as in the rating checks).
    for f in &mut service {
        if f.abs() <= 1e-10 * largest {
            *f = 0.0;
        }
    }
    (0..model.members.len())
        .into_par_iter()
        .map(|j| {
            let tension = service[j] > 0.0;
            let mut loss = Loss {
                member: j,
                critical: false,
                fracture_critical: false,
                service_force: service[j],
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
            let solved = Prepared::new(&damaged)
                .and_then(|p| p.solve_cases(&damaged, &damaged.cases).map(|c| (p, c)));
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
