//! `panelpoint stability`: every analysis the model asks for, in one
//! result — in-plane buckling of every load case and combination, the
//! chord on its U-frames (when given), and the footbridge vibration
//! figures (when given).

use super::chord::UFrameReport;
use super::in_plane::Buckling;
use super::vibration::Vibration;
use super::StabilityError;
use crate::analysis::Analysis;
use crate::model::Model;

/// One load effect's in-plane result.
#[derive(Clone, Debug, PartialEq)]
pub struct InPlane {
    pub effect: String,
    pub combination: bool,
    /// None for a combination that names a moving load (not computed).
    pub buckling: Option<Buckling>,
}

#[derive(Clone, Debug, PartialEq)]
pub struct StabilityReport {
    pub in_plane: Vec<InPlane>,
    pub u_frame: Option<UFrameReport>,
    pub vibration: Option<Vibration>,
    pub notes: Vec<String>,
}

/// Forces below this fraction of the largest force scale of any case are
/// round-off (e.g. a temperature change on a statically determinate truss)
/// and are taken as zero, so they cannot produce a meaningless λcr.
pub const ROUND_OFF: f64 = 1e-9;

/// (id, is-combination, member forces) of every case and every
/// combination without a moving load (as `rate` builds them), round-off
/// forces zeroed.
pub fn effects(model: &Model, analysis: &Analysis) -> Vec<(String, bool, Vec<f64>)> {
    let scale = analysis
        .cases
        .iter()
        .fold(0.0f64, |m, c| m.max(c.force_scale));
    let mut all = crate::rate::load_effects(model, analysis);
    if model.has_tension_only() {
        // Tension-only members: each combination solved whole (issue 16);
        // one the truss cannot carry is left out (`rate` reports it).
        let solved = crate::analysis::active_set::combination_results(model).ok();
        all.retain_mut(|e| match (e.combination, &solved) {
            (Some((ci, None)), Some(s)) => {
                e.forces = s[ci].1.result.forces.clone();
                true
            }
            (Some(_), None) => false,
            _ => true,
        });
    }
    all.into_iter()
        .map(|e| {
            let forces = e
                .forces
                .iter()
                .map(|&n| if n.abs() < ROUND_OFF * scale { 0.0 } else { n })
                .collect();
            (e.id, e.case.is_none(), forces)
        })
        .collect()
}

pub fn run(model: &Model, analysis: &Analysis) -> Result<StabilityReport, StabilityError> {
    let s = &model.stability;
    let effects = effects(model, analysis);
    let mut rigid = vec![false; model.nodes.len()];
    for &n in &s.rigid {
        rigid[n] = true;
    }
    let pairs: Vec<(String, Vec<f64>)> = effects
        .iter()
        .map(|(id, _, f)| (id.clone(), f.clone()))
        .collect();
    let buckled = super::in_plane::buckling(model, &rigid, s.parts, &pairs)?;
    let mut in_plane: Vec<InPlane> = effects
        .iter()
        .zip(buckled)
        .map(|((id, combination, _), b)| InPlane {
            effect: id.clone(),
            combination: *combination,
            buckling: Some(b),
        })
        .collect();
    let mut notes = vec![format!(
        "In-plane buckling: {} beam-column elements per member, joints pinned{}; axial forces from the linear truss analysis.",
        s.parts,
        if s.rigid.is_empty() {
            String::new()
        } else {
            format!(" except {} rigid joint(s)", s.rigid.len())
        }
    )];
    for c in model.combinations.iter().filter(|c| !c.moving.is_empty()) {
        in_plane.push(InPlane {
            effect: c.id.clone(),
            combination: true,
            buckling: None,
        });
        notes.push(format!(
            "Combination \"{}\" names a moving load: its buckling is not computed here (the envelope has no single force distribution).",
            c.id
        ));
    }
    let u_frame = match &s.u_frame {
        Some(u) => Some(super::chord::analyse(model, u, &effects)?),
        None => None,
    };
    let vibration = match &s.vibration {
        Some(v) => Some(super::vibration::vibration(model, v, 6)?),
        None => None,
    };
    if model.materials.iter().any(|m| m.density.is_none())
        && (u_frame.is_some() || vibration.is_some())
    {
        notes.push("A material gives no density: steel, 490 lb/ft³ (77.0 kN/m³), is assumed for masses (common practice).".into());
    }
    Ok(StabilityReport {
        in_plane,
        u_frame,
        vibration,
        notes,
    })
}
