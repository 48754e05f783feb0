//! Load effects to check: every load case as solved, and every named
//! combination as the linear sum of its factored cases (live cases with
//! their impact allowance, 1.25·DC + 1.75·(LL + IM) style).

use crate::analysis::{Analysis, CaseResult};
use crate::model::{CaseKind, Model};

/// Member forces of one load case or combination, N.
#[derive(Clone, Debug, PartialEq)]
pub struct LoadEffect {
    pub id: String,
    /// The load case index, or None for a combination or moving load.
    pub case: Option<usize>,
    /// For a moving-load envelope: the moving load's index and which side.
    pub moving: Option<(usize, Side)>,
    pub forces: Vec<f64>,
}

/// Which extreme of a moving-load envelope an effect holds.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Side {
    Tension,
    Compression,
}

impl Side {
    pub fn label(self) -> &'static str {
        match self {
            Side::Tension => "max tension",
            Side::Compression => "max compression",
        }
    }
}

pub fn load_effects(model: &Model, analysis: &Analysis) -> Vec<LoadEffect> {
    load_effects_of(model, &analysis.cases)
}

/// As [`load_effects`], from the case results alone.
pub fn load_effects_of(model: &Model, results: &[CaseResult]) -> Vec<LoadEffect> {
    let analysis_cases = results;
    let mut out: Vec<LoadEffect> = model
        .cases
        .iter()
        .zip(analysis_cases)
        .enumerate()
        .map(|(i, (c, r))| LoadEffect {
            id: c.id.clone(),
            case: Some(i),
            moving: None,
            forces: r.forces.clone(),
        })
        .collect();
    // Combinations that name a moving load are built by `moving_effects`.
    for combo in model.combinations.iter().filter(|c| c.moving.is_empty()) {
        let mut forces = vec![0.0; model.members.len()];
        for &(ci, factor) in &combo.factors {
            let case = &model.cases[ci];
            let f = if case.kind == CaseKind::Live {
                factor * (1.0 + case.impact)
            } else {
                factor
            };
            for (acc, v) in forces.iter_mut().zip(&analysis_cases[ci].forces) {
                *acc += f * v;
            }
        }
        out.push(LoadEffect {
            id: combo.id.clone(),
            case: None,
            moving: None,
            forces,
        });
    }
    out
}

/// Effects of moving-load envelopes: for each moving load, the dead-load
/// force plus the greatest tension, and plus the greatest compression, of
/// every member (impact included); and for each combination that names a moving load, the
/// combination with that envelope side in place of a case.
pub fn moving_effects(
    model: &Model,
    results: &[CaseResult],
    envelopes: &[crate::loads::MovingEnvelope],
) -> Vec<LoadEffect> {
    let mut out = Vec::new();
    for (k, env) in envelopes.iter().enumerate() {
        for side in [Side::Tension, Side::Compression] {
            // Service envelope: the dead-load force plus the live extreme.
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
            out.push(LoadEffect {
                id: format!("dead + {} ({})", env.moving_load, side.label()),
                case: None,
                moving: Some((k, side)),
                forces,
            });
        }
    }
    for combo in &model.combinations {
        for &(k, factor) in &combo.moving {
            let Some(env) = envelopes.get(k) else {
                continue;
            };
            for side in [Side::Tension, Side::Compression] {
                let mut forces = vec![0.0; model.members.len()];
                for &(ci, f) in &combo.factors {
                    let case = &model.cases[ci];
                    let f = if case.kind == CaseKind::Live {
                        f * (1.0 + case.impact)
                    } else {
                        f
                    };
                    for (acc, v) in forces.iter_mut().zip(&results[ci].forces) {
                        *acc += f * v;
                    }
                }
                for (acc, e) in forces.iter_mut().zip(&env.per_member) {
                    *acc += factor
                        * match side {
                            Side::Tension => e.max_tension(),
                            Side::Compression => e.max_compression(),
                        };
                }
                out.push(LoadEffect {
                    id: format!("{} ({} {})", combo.id, env.moving_load, side.label()),
                    case: None,
                    moving: None,
                    forces,
                });
            }
        }
    }
    out
}
