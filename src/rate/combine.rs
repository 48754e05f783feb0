//! Load effects to check: every load case as solved, and every named
//! combination as the linear sum of its factored cases (live cases with
//! their impact allowance, 1.25·DC + 1.75·(LL + IM) style).

use crate::analysis::{Analysis, CaseResult};
use crate::model::{CaseKind, Model};

/// Member forces of one load case or combination, N.
#[derive(Clone, Debug, PartialEq)]
pub struct LoadEffect {
    pub id: String,
    /// The load case index, or None for a combination.
    pub case: Option<usize>,
    pub forces: Vec<f64>,
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
            forces: r.forces.clone(),
        })
        .collect();
    for combo in &model.combinations {
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
            forces,
        });
    }
    out
}
