//! Natural frequencies for footbridge reuse, and the pedestrian live-load
//! deflection.
//!
//! Vertical: the truss as a pin-jointed plane frame (one element per member,
//! free end rotations), lumped masses at the joints from the members'
//! self-weight (half to each end), the deck's weight and any share of the
//! pedestrian load at the deck nodes by tributary length; K·φ = ω²·M·φ;
//! the lowest mode whose kinetic energy is mostly vertical (share ≥ ½).
//! Lateral: the compression chord on its U-frames (see `u_frame`), when
//! the model gives them.
//!
//! Limits (each from memory, cited in the report beside the number):
//! - AASHTO LRFD Guide Specifications for the Design of Pedestrian Bridges
//!   (2nd ed., 2009), 6: fundamental vertical frequency ≥ 3.0 Hz, or else
//!   f ≥ 2.86·ln(180/W), W the weight of the supported structure, kip; lateral
//!   ≥ 1.3 Hz; 5: pedestrian live-load (90 psf) deflection ≤ span/360.
//! - EN 1990:2002/A1:2005 Annex A2, A2.4.3.2(2): comfort criteria to be
//!   verified when the vertical frequency is below 5 Hz or the lateral below 2.5 Hz.
//! - Footbridge guidance (Sétra 2006; HiVoSS 2008): resonance-risk ranges
//!   1.25–4.6 Hz vertical (first and second harmonic of walking) and
//!   0.5–1.2 Hz lateral.

use super::frame::{Frame, MassKind};
use super::StabilityError;
use crate::analysis::eigen::smallest_positive;
use crate::model::Model;

/// Pedestrian load of the guide specification, 90 psf in Pa (from memory).
pub const PEDESTRIAN_LOAD: f64 = 90.0 * 4.448_221_615_260_5 / (0.3048 * 0.3048);
pub const KIP: f64 = 4_448.221_615_260_5;

/// What the model's `vibration` section gives (SI, validated).
#[derive(Clone, Debug, PartialEq)]
pub struct VibrationInput {
    /// Weight of deck and floor system carried by this truss, N/m of span.
    pub deck_weight: f64,
    /// Fraction of the pedestrian load counted as mass (default 0).
    pub live_share: f64,
    /// Pedestrian load, Pa (default 90 psf).
    pub pedestrian_load: f64,
    /// Deck width carried by this truss, m.
    pub tributary_width: f64,
    /// Number of trusses sharing the deck (for the weight W; default 2).
    pub trusses: f64,
    /// Deflection limit as span/ratio (default 360).
    pub deflection_ratio: f64,
}

/// One mode.
#[derive(Clone, Debug, PartialEq)]
pub struct Mode {
    pub frequency: f64,
    /// Share of kinetic energy in vertical motion.
    pub vertical_share: f64,
    pub residual: f64,
    /// Node translations (largest component 1).
    pub shape: Vec<[f64; 2]>,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Vibration {
    pub modes: Vec<Mode>,
    /// Index into `modes` of the lowest vertical mode.
    pub vertical: Option<usize>,
    /// Weight of the supported structure (all trusses and deck), N.
    pub weight: f64,
    /// Guide-spec weight-based minimum 2.86·ln(180/W), Hz.
    pub weight_based_minimum: f64,
    pub span: f64,
    /// Largest deck-node deflection under the pedestrian load, m.
    pub deflection: f64,
}

/// Lumped mass at each model node, kg, and the weight of this truss and its deck, N.
pub fn node_masses(model: &Model, v: &VibrationInput) -> (Vec<f64>, f64) {
    let mut mass = vec![0.0; model.nodes.len()];
    let mut weight = 0.0;
    for m in &model.members {
        let (a, b) = (&model.nodes[m.start], &model.nodes[m.end]);
        let density = model.materials[m.material]
            .density
            .unwrap_or(super::chord::STEEL_WEIGHT);
        let w = density * model.sections[m.section].area * (b.x - a.x).hypot(b.y - a.y);
        weight += w;
        mass[m.start] += w / 2.0 / super::chord::G;
        mass[m.end] += w / 2.0 / super::chord::G;
    }
    for (n, trib) in deck_tributary(model) {
        let w = v.deck_weight * trib;
        weight += w;
        let live = v.live_share * v.pedestrian_load * v.tributary_width * trib;
        mass[n] += (w + live) / super::chord::G;
    }
    (mass, weight)
}

/// (deck node, tributary length along x).
fn deck_tributary(model: &Model) -> Vec<(usize, f64)> {
    let d = &model.live.deck;
    (0..d.len())
        .map(|i| {
            let x = |k: usize| model.nodes[d[k]].x;
            let left = if i > 0 { (x(i) - x(i - 1)).abs() } else { 0.0 };
            let right = if i + 1 < d.len() {
                (x(i + 1) - x(i)).abs()
            } else {
                0.0
            };
            (d[i], (left + right) / 2.0)
        })
        .collect()
}

/// The lowest `count` in-plane modes and the footbridge figures.
pub fn vibration(
    model: &Model,
    v: &VibrationInput,
    count: usize,
) -> Result<Vibration, StabilityError> {
    if model.live.deck.len() < 2 {
        return Err(StabilityError::NoDeck);
    }
    let rigid = vec![false; model.nodes.len()];
    let mut f = super::in_plane::build(model, &rigid, 1);
    let (masses, truss_weight) = node_masses(model, v);
    for (node, &m) in f.nodes.iter().zip(&masses) {
        f.frame.masses.push((node.dofs[0], m));
        f.frame.masses.push((node.dofs[1], m));
    }
    let m = f.frame.mass(MassKind::Lumped);
    let pairs = smallest_positive(&f.frame.stiffness(), &m, count).map_err(|e| match e {
        crate::analysis::eigen::EigenError::NotPositiveDefinite => StabilityError::Unstable,
        e => e.into(),
    })?;
    let modes: Vec<Mode> = pairs
        .iter()
        .map(|p| {
            let shape: Vec<[f64; 2]> = f
                .nodes
                .iter()
                .map(|n| Frame::translation(&n.dofs, &p.vector))
                .collect();
            let (mut ev, mut et) = (0.0, 0.0);
            for (s, &mi) in shape.iter().zip(&masses) {
                ev += mi * s[1] * s[1];
                et += mi * (s[0] * s[0] + s[1] * s[1]);
            }
            Mode {
                frequency: p.value.sqrt() / (2.0 * std::f64::consts::PI),
                vertical_share: if et > 0.0 { ev / et } else { 0.0 },
                residual: p.residual,
                shape,
            }
        })
        .collect();
    let vertical = modes.iter().position(|m| m.vertical_share >= 0.5);
    let weight = truss_weight * v.trusses;
    let xs = model.live.deck.iter().map(|&n| model.nodes[n].x);
    let span = xs.clone().fold(f64::MIN, f64::max) - xs.fold(f64::MAX, f64::min);
    Ok(Vibration {
        modes,
        vertical,
        weight,
        weight_based_minimum: 2.86 * (180.0 / (weight / KIP)).ln(),
        span,
        deflection: deflection(model, v)?,
    })
}

/// Largest vertical deflection of a deck node under the pedestrian load on
/// the whole deck (lumped at the deck nodes by tributary length), m.
pub fn deflection(model: &Model, v: &VibrationInput) -> Result<f64, StabilityError> {
    let mut m = model.clone();
    m.combinations.clear();
    m.live.moving.clear();
    m.cases = vec![crate::model::LoadCase {
        id: "pedestrian".into(),
        kind: crate::model::CaseKind::Live,
        nodal: deck_tributary(model)
            .into_iter()
            .map(|(node, trib)| crate::model::NodalLoad {
                node,
                fx: 0.0,
                fy: -v.pedestrian_load * v.tributary_width * trib,
            })
            .collect(),
        ..Default::default()
    }];
    let a = crate::analysis::analyse(&m).map_err(|_| StabilityError::Unstable)?;
    Ok(model
        .live
        .deck
        .iter()
        .map(|&n| a.cases[0].displacements[n][1].abs())
        .fold(0.0, f64::max))
}
