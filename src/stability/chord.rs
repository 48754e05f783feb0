//! The model's compression chord on its U-frames: the chord path read from
//! the model, one [`Chord`] per load effect, and the AASHTO LRFD 6.14.2.9
//! half-through-truss figures (lateral force at the panel points, the
//! margin of the critical force over the factored force).

use super::u_frame::{
    chord_buckling, spring, Chord, ChordBuckling, Spring, UFrameInput, AASHTO_LATERAL_FORCE,
    AASHTO_MARGIN,
};
use super::StabilityError;
use crate::model::Model;

/// Standard gravity, m/s² (for masses from weights).
pub const G: f64 = 9.806_65;

/// The chord's members along the path (index, reversed?).
pub fn path_members(model: &Model, path: &[usize]) -> Result<Vec<usize>, StabilityError> {
    path.windows(2)
        .map(|w| {
            model
                .members
                .iter()
                .position(|m| {
                    (m.start == w[0] && m.end == w[1]) || (m.start == w[1] && m.end == w[0])
                })
                .ok_or_else(|| StabilityError::ChordGap {
                    from: model.nodes[w[0]].id.clone(),
                    to: model.nodes[w[1]].id.clone(),
                })
        })
        .collect()
}

fn length(model: &Model, mi: usize) -> f64 {
    let m = &model.members[mi];
    let (a, b) = (&model.nodes[m.start], &model.nodes[m.end]);
    (b.x - a.x).hypot(b.y - a.y)
}

/// The unrolled chord with the forces of one effect.
pub fn chord(model: &Model, u: &UFrameInput, members: &[usize], forces: &[f64]) -> Chord {
    let k = spring(u).stiffness;
    let springs = u
        .chord
        .iter()
        .enumerate()
        .map(|(i, n)| {
            let interior = i > 0 && i + 1 < u.chord.len();
            if interior && u.frames_at.contains(n) {
                k
            } else {
                0.0
            }
        })
        .collect();
    let mut masses = vec![0.0; u.chord.len()];
    for (i, &mi) in members.iter().enumerate() {
        let m = &model.members[mi];
        let density = model.materials[m.material].density.unwrap_or(STEEL_WEIGHT);
        let half = density * model.sections[m.section].area * length(model, mi) / G / 2.0;
        masses[i] += half;
        masses[i + 1] += half;
    }
    Chord {
        lengths: members.iter().map(|&mi| length(model, mi)).collect(),
        ei: members
            .iter()
            .map(|&mi| {
                let m = &model.members[mi];
                model.materials[m.material].e * model.sections[m.section].i_out
            })
            .collect(),
        forces: members.iter().map(|&mi| forces[mi]).collect(),
        springs,
        masses,
        parts: super::u_frame::PARTS,
    }
}

/// Weight density of steel assumed when a material gives none, N/m³
/// (490 lb/ft³ = 77.0 kN/m³, common practice).
pub const STEEL_WEIGHT: f64 = 76_972.0;

/// The chord's result for one effect.
#[derive(Clone, Debug, PartialEq)]
pub struct ChordResult {
    pub effect: String,
    /// Whether the effect is a combination (the AASHTO margin applies).
    pub combination: bool,
    pub buckling: ChordBuckling,
    /// λcr ≥ [`AASHTO_MARGIN`] (for combinations; None for cases or no compression).
    pub margin_ok: Option<bool>,
}

/// Everything the U-frame analysis reports.
#[derive(Clone, Debug, PartialEq)]
pub struct UFrameReport {
    pub spring: Spring,
    /// Chord members along the path.
    pub members: Vec<usize>,
    pub results: Vec<ChordResult>,
    /// Per U-frame node: AASHTO lateral force H (N), moment H·h at the
    /// floor beam (N·m), displacement H/C_d (m).
    pub lateral: Vec<(usize, f64, f64, f64)>,
    /// Lowest lateral frequency of the chord on its U-frames, Hz, and residual.
    pub lateral_frequency: Option<(f64, f64)>,
}

/// Runs the chord for each (id, is-combination, forces) effect.
pub fn analyse(
    model: &Model,
    u: &UFrameInput,
    effects: &[(String, bool, Vec<f64>)],
) -> Result<UFrameReport, StabilityError> {
    let members = path_members(model, &u.chord)?;
    let mut results = Vec::with_capacity(effects.len());
    for (id, combination, forces) in effects {
        let c = chord(model, u, &members, forces);
        let b = chord_buckling(&c)?;
        let margin_ok = match (combination, b.critical_factor) {
            (true, Some(l)) => Some(l >= AASHTO_MARGIN),
            _ => None,
        };
        results.push(ChordResult {
            effect: id.clone(),
            combination: *combination,
            buckling: b,
            margin_ok,
        });
    }
    let s = spring(u);
    let lateral = lateral_forces(model, u, s.stiffness);
    let zero = vec![0.0; model.members.len()];
    let c = chord(model, u, &members, &zero);
    let lateral_frequency = super::u_frame::lateral_frequencies(&c, 1)?.first().copied();
    Ok(UFrameReport {
        spring: s,
        members,
        results,
        lateral,
        lateral_frequency,
    })
}

/// H at each U-frame: 0.30 kip/ft times the horizontal span tributary to
/// the panel point (half of each adjacent panel), M = H·h, δ = H/C_d.
fn lateral_forces(model: &Model, u: &UFrameInput, k: f64) -> Vec<(usize, f64, f64, f64)> {
    let x = |i: usize| model.nodes[u.chord[i]].x;
    (1..u.chord.len().saturating_sub(1))
        .filter(|&i| u.frames_at.contains(&u.chord[i]))
        .map(|i| {
            let trib = ((x(i) - x(i - 1)).abs() + (x(i + 1) - x(i)).abs()) / 2.0;
            let h = AASHTO_LATERAL_FORCE * trib;
            (u.chord[i], h, h * u.height, h / k)
        })
        .collect()
}
