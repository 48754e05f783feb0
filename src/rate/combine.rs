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
    /// A combination (factored by the user); false for a single case and
    /// for a service envelope (dead + moving load).
    pub factored: bool,
    /// For a combination: its index in `model.combinations`, and the side
    /// of its moving load's envelope when it names one.
    pub combination: Option<(usize, Option<Side>)>,
    pub forces: Vec<f64>,
}

/// Which extreme of a moving-load envelope an effect holds.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Side {
    Tension,
    Compression,
}

impl Side {
    /// How an effect holding this side is named: the live load placed for
    /// its greatest tension or compression (the total with the dead load may
    /// still have the other sense, so the name says where the vehicle is,
    /// not what the member carries).
    pub fn effect_label(self) -> &'static str {
        match self {
            Side::Tension => "placed for greatest tension",
            Side::Compression => "placed for greatest compression",
        }
    }

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

/// The minimum permanent-load factors (DC, DW) taken where a dead case
/// relieves the live part of a combination: the rating method's (AASHTO
/// LRFD 3.4.1: 0.90 and 0.65 for LRFR), or none (the factors as written).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Relief {
    pub dc: f64,
    pub dw: f64,
}

impl Relief {
    /// The method's minima at its first level.
    pub fn of(method: &crate::method::Method) -> Option<Relief> {
        method.design_levels.first().map(|l| Relief {
            dc: l.dc.min,
            dw: l.dw.min,
        })
    }
}

/// Sum a combination's cases into `forces`: live cases with their impact;
/// with `relief`, a dead case whose force relieves the combination's live
/// part in a member is taken at min(factor, the minimum factor). Returns the
/// number of member-case terms so reduced.
fn sum_cases(
    model: &Model,
    results: &[CaseResult],
    factors: &[(usize, f64)],
    live_extra: Option<&[f64]>,
    relief: Option<Relief>,
    forces: &mut [f64],
) -> usize {
    let mut live = vec![0.0; forces.len()];
    if let Some(extra) = live_extra {
        live.copy_from_slice(extra);
    }
    for &(ci, f) in factors {
        let case = &model.cases[ci];
        if case.kind == CaseKind::Live {
            let f = f * (1.0 + case.impact);
            for (acc, v) in live.iter_mut().zip(&results[ci].forces) {
                *acc += f * v;
            }
        }
    }
    let mut reduced = 0;
    for &(ci, f) in factors {
        let case = &model.cases[ci];
        if case.kind == CaseKind::Live {
            continue;
        }
        let min = match (relief, case.kind) {
            (Some(r), CaseKind::Dead) => Some(r.dc),
            (Some(r), CaseKind::Wearing) => Some(r.dw),
            _ => None,
        };
        for (m, (acc, v)) in forces.iter_mut().zip(&results[ci].forces).enumerate() {
            let g = match min {
                Some(min) if f > min && v * live[m] < 0.0 => {
                    reduced += 1;
                    min
                }
                _ => f,
            };
            *acc += g * v;
        }
    }
    for (acc, l) in forces.iter_mut().zip(&live) {
        *acc += l;
    }
    reduced
}

/// As [`load_effects`], from the case results alone.
pub fn load_effects_of(model: &Model, results: &[CaseResult]) -> Vec<LoadEffect> {
    load_effects_relieved(model, results, None).0
}

/// Every load case as solved, one effect each (unfactored).
pub(crate) fn case_effects(model: &Model, results: &[CaseResult]) -> Vec<LoadEffect> {
    model
        .cases
        .iter()
        .zip(results)
        .enumerate()
        .map(|(i, (c, r))| LoadEffect {
            id: c.id.clone(),
            case: Some(i),
            moving: None,
            factored: false,
            combination: None,
            forces: r.forces.clone(),
        })
        .collect()
}

/// As [`load_effects_of`], with the method's minimum dead-load factors
/// where a dead case relieves a combination's live part; also the ids of
/// the combinations where that happened.
pub fn load_effects_relieved(
    model: &Model,
    results: &[CaseResult],
    relief: Option<Relief>,
) -> (Vec<LoadEffect>, Vec<String>) {
    let mut relieved = Vec::new();
    let mut out = case_effects(model, results);
    // Combinations that name a moving load are built by `moving_effects`.
    for (ci, combo) in model
        .combinations
        .iter()
        .enumerate()
        .filter(|(_, c)| c.moving.is_empty())
    {
        let mut forces = vec![0.0; model.members.len()];
        let n = sum_cases(model, results, &combo.factors, None, relief, &mut forces);
        if n > 0 {
            relieved.push(combo.id.clone());
        }
        out.push(LoadEffect {
            id: combo.id.clone(),
            case: None,
            moving: None,
            factored: true,
            combination: Some((ci, None)),
            forces,
        });
    }
    (out, relieved)
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
    moving_effects_relieved(model, results, envelopes, None).0
}

/// As [`moving_effects`], with the method's minimum dead-load factors where
/// a dead case relieves the combination's live part.
pub fn moving_effects_relieved(
    model: &Model,
    results: &[CaseResult],
    envelopes: &[crate::loads::MovingEnvelope],
    relief: Option<Relief>,
) -> (Vec<LoadEffect>, Vec<String>) {
    let mut relieved = Vec::new();
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
                id: format!("dead + {} ({})", env.moving_load, side.effect_label()),
                case: None,
                moving: Some((k, side)),
                factored: false,
                combination: None,
                forces,
            });
        }
    }
    for (ci, combo) in model.combinations.iter().enumerate() {
        for &(k, factor) in &combo.moving {
            let Some(env) = envelopes.get(k) else {
                continue;
            };
            for side in [Side::Tension, Side::Compression] {
                let vehicle: Vec<f64> = env
                    .per_member
                    .iter()
                    .map(|e| {
                        factor
                            * match side {
                                Side::Tension => e.max_tension(),
                                Side::Compression => e.max_compression(),
                            }
                    })
                    .collect();
                let mut forces = vec![0.0; model.members.len()];
                let n = sum_cases(
                    model,
                    results,
                    &combo.factors,
                    Some(&vehicle),
                    relief,
                    &mut forces,
                );
                if n > 0 && !relieved.contains(&combo.id) {
                    relieved.push(combo.id.clone());
                }
                out.push(LoadEffect {
                    id: format!(
                        "{} ({factor} × {} {})",
                        combo.id,
                        env.moving_load,
                        side.effect_label()
                    ),
                    case: None,
                    moving: None,
                    factored: true,
                    combination: Some((ci, Some(side))),
                    forces,
                });
            }
        }
    }
    (out, relieved)
}
