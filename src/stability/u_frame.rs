//! The compression chord of a half-through (pony) truss on its U-frames.
//!
//! Spring of one U-frame (lateral force at the chord per lateral
//! displacement there), symmetric mode (the two chords move in mirror
//! image, the floor beam bent in single curvature by equal end moments, end
//! rotation M·b_q/(2·E·I_q)):
//!
//! C_d = 1/δ, δ = h_v³/(3·E·I_v) + h²·b_q/(2·E·I_q) + h²·f_c
//!
//! — EN 1993-2:2006 Annex D.2.4, eq. (D.2), C_d = E·I_v/(h_v³/3 +
//! h²·b_q·I_v/(2·I_q)) (from memory), with the connection flexibility term
//! f_c·h² of the BS 5400-3:2000 clause 9.6.4.1.3 form
//! δ = d₁³/(3EI₁) + u·B·d₂²/(EI₂) + f·d₂², u = ½ (from memory).
//! h_v: chord centroid to the top of the floor beam (the vertical's
//! cantilever), h: chord centroid to the floor beam's axis, b_q: floor-beam
//! span between the trusses, f_c: rotation of the vertical-to-floor-beam
//! connection per unit moment (rad/(N·m)).
//!
//! The chord, from bearing to bearing through the end posts, is unrolled
//! into a straight beam-column with each member's E·I_out, its actual
//! axial force in each load effect, U-frame springs at the panel points and
//! lateral restraint at the bearings (ends pinned laterally); the lowest λ
//! of K·φ = λ·G·φ gives each chord member's critical force λ·|N| and
//! K = (π/L)·√(E·I_out/(λ·|N|)).

use super::frame::{Frame, FrameNode};
use super::StabilityError;
use crate::analysis::eigen::{smallest_positive, EigenError};

/// AASHTO LRFD Bridge Design Specifications (9th ed., 2020) 6.14.2.9, from
/// memory: lateral force at each top-chord panel point, per length of
/// span, on the verticals, floor beams and their connections: 0.30 kip/ft.
pub const AASHTO_LATERAL_FORCE: f64 = 0.30 * 4_448.221_615_260_5 / 0.3048;

/// AASHTO LRFD 6.14.2.9, from memory: the chord's critical buckling force
/// as a column on elastic lateral supports shall exceed the greatest
/// factored chord force by at least 50 %.
pub const AASHTO_MARGIN: f64 = 1.5;

/// The U-frame description (SI, validated).
#[derive(Clone, Debug, PartialEq)]
pub struct UFrameInput {
    /// Chord path: node indices from bearing to bearing.
    pub chord: Vec<usize>,
    /// Nodes with a U-frame (interior nodes of the path).
    pub frames_at: Vec<usize>,
    /// E of the vertical and floor beam, Pa.
    pub e: f64,
    pub vertical_i: f64,
    pub vertical_height: f64,
    pub height: f64,
    pub floor_beam_i: f64,
    pub floor_beam_span: f64,
    /// f_c, rad/(N·m).
    pub connection_flexibility: f64,
    /// A spring stiffness given directly, N/m (overrides the formula).
    pub spring: Option<f64>,
    /// Whether `rate` takes the chord's k_out from this analysis.
    pub use_in_rate: bool,
}

/// The U-frame spring and its parts.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Spring {
    /// δ terms, m/N: vertical, floor beam, connection.
    pub delta_vertical: f64,
    pub delta_floor_beam: f64,
    pub delta_connection: f64,
    /// C_d, N/m.
    pub stiffness: f64,
    /// True when given directly rather than computed.
    pub given: bool,
}

/// C_d of EN 1993-2 D.2.4 (+ connection term), see the module comment.
pub fn spring(u: &UFrameInput) -> Spring {
    let dv = u.vertical_height.powi(3) / (3.0 * u.e * u.vertical_i);
    let dq = u.height * u.height * u.floor_beam_span / (2.0 * u.e * u.floor_beam_i);
    let dc = u.height * u.height * u.connection_flexibility;
    match u.spring {
        Some(k) => Spring {
            delta_vertical: dv,
            delta_floor_beam: dq,
            delta_connection: dc,
            stiffness: k,
            given: true,
        },
        None => Spring {
            delta_vertical: dv,
            delta_floor_beam: dq,
            delta_connection: dc,
            stiffness: 1.0 / (dv + dq + dc),
            given: false,
        },
    }
}

/// A chord unrolled: segment lengths, E·I, axial force (tension +) and
/// the spring at each station (segments + 1 of them; ends held).
#[derive(Clone, Debug, PartialEq)]
pub struct Chord {
    pub lengths: Vec<f64>,
    pub ei: Vec<f64>,
    pub forces: Vec<f64>,
    pub springs: Vec<f64>,
    /// Lumped mass at each station, kg (for the lateral frequency).
    pub masses: Vec<f64>,
    /// Beam-column elements per segment (4 for a real chord).
    pub parts: usize,
}

/// The buckling of the chord under one effect.
#[derive(Clone, Debug, PartialEq)]
pub struct ChordBuckling {
    /// λcr, None when no segment is in compression.
    pub critical_factor: Option<f64>,
    pub residual: f64,
    /// Per segment: (critical force λ|N|, K), None where in tension.
    pub segments: Vec<Option<(f64, f64)>>,
    /// Lateral displacement at each station in the mode.
    pub mode: Vec<f64>,
}

/// Elements per chord segment of a model's chord.
pub const PARTS: usize = 4;

fn frame(c: &Chord) -> (Frame, Vec<FrameNode>) {
    let mut f = Frame::default();
    let n = c.lengths.len();
    let mut x = 0.0;
    let mut nodes = Vec::with_capacity(n + 1);
    for i in 0..=n {
        let end = i == 0 || i == n;
        nodes.push(f.node(x, 0.0, [true, end, false]));
        if i < n {
            x += c.lengths[i];
        }
    }
    for i in 0..n {
        let (a, b) = (nodes[i], nodes[i + 1]);
        let ea = c.ei[i] / (c.lengths[i] * c.lengths[i]);
        f.member(
            &a,
            &b,
            a.dofs[2],
            b.dofs[2],
            c.parts,
            [ea, c.ei[i], 0.0],
            c.forces[i],
            i,
        );
    }
    for (node, &k) in nodes.iter().zip(&c.springs) {
        if k > 0.0 {
            f.springs.push((node.dofs[1], k));
        }
    }
    (f, nodes)
}

/// λcr, critical forces and K of each segment.
pub fn chord_buckling(c: &Chord) -> Result<ChordBuckling, StabilityError> {
    let (f, nodes) = frame(c);
    let pairs = match smallest_positive(&f.stiffness(), &f.geometric(), 1) {
        Ok(p) => p,
        Err(EigenError::NoPositive) => {
            return Ok(ChordBuckling {
                critical_factor: None,
                residual: 0.0,
                segments: vec![None; c.lengths.len()],
                mode: Vec::new(),
            })
        }
        Err(EigenError::NotPositiveDefinite) => return Err(StabilityError::Unstable),
        Err(e) => return Err(e.into()),
    };
    let p = &pairs[0];
    let lambda = p.value;
    let segments = (0..c.lengths.len())
        .map(|i| {
            (c.forces[i] < 0.0).then(|| {
                let pcr = lambda * c.forces[i].abs();
                (
                    pcr,
                    std::f64::consts::PI / c.lengths[i] * (c.ei[i] / pcr).sqrt(),
                )
            })
        })
        .collect();
    let mode = nodes
        .iter()
        .map(|n| Frame::translation(&n.dofs, &p.vector)[1])
        .collect();
    Ok(ChordBuckling {
        critical_factor: Some(lambda),
        residual: p.residual,
        segments,
        mode,
    })
}

/// Lowest lateral natural frequencies of the chord on its U-frames, Hz,
/// with station masses lumped (the chord's own mass lumped by the caller).
pub fn lateral_frequencies(c: &Chord, count: usize) -> Result<Vec<(f64, f64)>, StabilityError> {
    let (mut f, nodes) = frame(c);
    for b in &mut f.beams {
        b.axial = 0.0;
    }
    for (node, &m) in nodes.iter().zip(&c.masses) {
        f.masses.push((node.dofs[1], m));
    }
    let m = f.mass(super::frame::MassKind::Lumped);
    let pairs = smallest_positive(&f.stiffness(), &m, count).map_err(|e| match e {
        EigenError::NotPositiveDefinite => StabilityError::Unstable,
        e => e.into(),
    })?;
    Ok(pairs
        .iter()
        .map(|p| (p.value.sqrt() / (2.0 * std::f64::consts::PI), p.residual))
        .collect())
}
