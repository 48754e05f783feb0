//! The load states a joint check is rated under: the dead load split into
//! DC and DW, and for each live load the member forces it may bring to the
//! joint at once.
//!
//! A live case is one consistent state. A moving load checked by a joint
//! check of one member takes that member's envelope sides (its greatest
//! tension and compression, lane parts included), exactly as the member's
//! own rating. A check of several members loaded by a vehicle of axles
//! only takes every position of the vehicle as a state of the whole truss
//! (`loads::envelope_nonlinear::placements`: every step plus every position
//! that puts an axle on a deck node, each train and direction; between
//! those the forces are linear in the position, so a demand convex in the
//! forces is greatest at one of them). A load model with a lane, trailing or
//! crowd load has no single position (the uniform load is placed over the
//! parts of each member's own influence line that add): such a check takes
//! every corner of the box [C_j₁, T_j₁] × … × [C_jₙ, T_jₙ] of its members'
//! envelopes, which holds the forces of any one position, and a convex
//! demand is greatest over the box at a corner: an upper bound, said in the
//! notes.

use super::{JointCheck, JointError};
use crate::analysis::CaseResult;
use crate::loads::MovingEnvelope;
use crate::model::Model;

/// Most members with a live effect one check may combine (2ⁿ corners).
pub const MAX_MEMBERS: usize = 10;

/// Dead-load member forces, N: components (DC) and wearing surface (DW).
pub struct Dead {
    pub dc: Vec<f64>,
    pub dw: Vec<f64>,
}

impl Dead {
    pub fn of(model: &Model, cases: &[CaseResult]) -> Dead {
        let (dc_cases, dw_cases) = model.dead_cases_split();
        let n = model.members.len();
        let sum = |list: &[usize]| {
            let mut v = vec![0.0; n];
            for &c in list {
                for (x, f) in v.iter_mut().zip(&cases[c].forces) {
                    *x += f;
                }
            }
            v
        };
        Dead {
            dc: sum(&dc_cases),
            dw: sum(&dw_cases),
        }
    }
}

/// Where a live load comes from.
#[derive(Clone, Debug, PartialEq)]
pub enum Source {
    /// A live load case and its factor 1 + impact.
    Case(usize, f64),
    /// Index into the moving-load envelopes.
    Moving(usize),
}

/// A live load rated on its own.
#[derive(Clone, Debug, PartialEq)]
pub struct LiveLoad {
    pub id: String,
    pub legal: bool,
    pub source: Source,
}

/// Every live load of the model: live cases, then moving loads.
pub fn live_loads(model: &Model, envelopes: &[MovingEnvelope]) -> Vec<LiveLoad> {
    let mut out: Vec<LiveLoad> = (0..model.cases.len())
        .filter(|&c| super::is_live(model, c))
        .map(|c| LiveLoad {
            id: model.cases[c].id.clone(),
            legal: model.cases[c].legal,
            source: Source::Case(c, 1.0 + model.cases[c].impact),
        })
        .collect();
    for (k, env) in envelopes.iter().enumerate() {
        let legal = model
            .live
            .moving
            .iter()
            .find(|m| m.id == env.moving_load)
            .is_some_and(|m| m.legal);
        out.push(LiveLoad {
            id: env.moving_load.clone(),
            legal,
            source: Source::Moving(k),
        });
    }
    out
}

/// One state of a live load: member forces with impact, N, and which
/// envelope sides it takes (None for a live case).
#[derive(Clone, Debug, PartialEq)]
pub struct Corner {
    pub live: Vec<f64>,
    pub at: Option<String>,
}

/// Every position of each moving load solved as a state of the whole truss
/// (None for a load model with a uniform part, which has no one position).
pub struct Positions {
    pub per_moving: Vec<Option<Vec<Corner>>>,
}

impl Positions {
    pub fn of(
        model: &Model,
        analysis: &crate::analysis::Analysis,
        envelopes: &[MovingEnvelope],
    ) -> Result<Positions, JointError> {
        let length = model.units.length;
        let mut per_moving = Vec::with_capacity(envelopes.len());
        for env in envelopes {
            let Some(k) = model
                .live
                .moving
                .iter()
                .position(|m| m.id == env.moving_load)
            else {
                per_moving.push(None);
                continue;
            };
            let Ok((placed, _)) = crate::loads::envelope_nonlinear::placements(model, k) else {
                per_moving.push(None);
                continue;
            };
            let cases: Vec<_> = placed.iter().map(|p| p.case.clone()).collect();
            let solved = analysis
                .prepared
                .solve_cases(model, &cases)
                .map_err(|e| JointError::Analysis(e.to_string()))?;
            per_moving.push(Some(
                solved
                    .into_iter()
                    .zip(&placed)
                    .map(|(r, p)| Corner {
                        live: r.forces,
                        at: Some(format!(
                            "front axle at {:.2} {} ({})",
                            p.at.position / length.to_si,
                            length.name,
                            p.at.direction.name()
                        )),
                    })
                    .collect(),
            ));
        }
        Ok(Positions { per_moving })
    }
}

/// The states of `live` for `check`.
pub fn corners(
    model: &Model,
    cases: &[CaseResult],
    envelopes: &[MovingEnvelope],
    positions: &Positions,
    live: &LiveLoad,
    check: &dyn JointCheck,
) -> Result<Vec<Corner>, JointError> {
    let n = model.members.len();
    let env = match live.source {
        Source::Case(c, factor) => {
            return Ok(vec![Corner {
                live: cases[c].forces.iter().map(|f| f * factor).collect(),
                at: None,
            }])
        }
        Source::Moving(k) => k,
    };
    let k = env;
    let env = &envelopes[k];
    let mut used: Vec<usize> = check.uses();
    used.sort_unstable();
    used.dedup();
    // Members the vehicle does not load add nothing to the box.
    used.retain(|&m| {
        let e = &env.per_member[m];
        e.tension.force != 0.0 || e.compression.force != 0.0
    });
    if used.len() >= 2 {
        if let Some(Some(all)) = positions.per_moving.get(k) {
            return Ok(all.clone());
        }
    }
    if used.len() > MAX_MEMBERS {
        return Err(JointError::TooManyMembers {
            node: model.nodes[check.node()].id.to_string(),
            kind: check.kind().to_string(),
            count: used.len(),
            limit: MAX_MEMBERS,
        });
    }
    let mut out = Vec::with_capacity(1 << used.len());
    for mask in 0..(1usize << used.len()) {
        let mut v = vec![0.0; n];
        let mut at = Vec::with_capacity(used.len());
        for (bit, &m) in used.iter().enumerate() {
            let e = &env.per_member[m];
            let (force, side) = if mask >> bit & 1 == 0 {
                (e.tension.force, crate::rate::Side::Tension)
            } else {
                (e.compression.force, crate::rate::Side::Compression)
            };
            v[m] = force;
            at.push(format!("{} {}", model.members[m].id, side.label()));
        }
        out.push(Corner {
            live: v,
            at: Some(if at.is_empty() {
                "not loaded by the vehicle".to_string()
            } else {
                at.join(", ")
            }),
        });
    }
    Ok(out)
}
