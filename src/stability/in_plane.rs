//! Elastic buckling of the truss in its plane: every member as 2–8
//! beam-column elements with its `i_in`, pinned at a joint unless the model
//! names the joint rigid, the geometric stiffness from the analysed axial
//! forces of each load case or combination, and the lowest critical load
//! factor λcr of K·φ = λ·G·φ.
//!
//! Effective length of a member that takes part in the mode (its share of
//! φᵀ·G·φ at least [`PARTICIPATION`] of the largest member's):
//! K = (π/L)·√(E·I/(λcr·|N|)) — the member's own Euler load equated with
//! its force at the critical state (the standard effective-length
//! definition from an elastic buckling analysis, e.g. AISC 360-16
//! Commentary Appendix 7, from memory).

use super::frame::{geometric_work, Frame, FrameNode, Matrix};
use super::StabilityError;
use crate::analysis::eigen::{EigenError, Reduced, DENSE_LIMIT};
use crate::analysis::eigen_sparse::SparseSym;
use crate::model::Model;
use nalgebra::DVector;

/// Share of the largest member's φᵀ·G·φ above which a member is counted
/// as taking part in the mode (a screening choice, overridable).
pub const PARTICIPATION: f64 = 0.10;

/// The plane frame of a model and where its members and nodes went.
pub struct InPlaneFrame {
    pub frame: Frame,
    pub nodes: Vec<FrameNode>,
    /// Element index range of each member.
    pub members: Vec<std::ops::Range<usize>>,
}

/// Builds the frame (axial forces zero; set per effect with [`InPlaneFrame::set_forces`]).
/// `rigid[node]`: members meeting there share its rotation.
pub fn build(model: &Model, rigid: &[bool], parts: usize) -> InPlaneFrame {
    let mut frame = Frame::default();
    let mut held = vec![None; model.nodes.len()];
    for s in &model.supports {
        held[s.node] = Some(s.restraint.free_direction());
    }
    let mut nodes = Vec::with_capacity(model.nodes.len());
    for (i, n) in model.nodes.iter().enumerate() {
        let support = held[i].is_some();
        let mut node = frame.node(n.x, n.y, [support, support, !rigid[i]]);
        if let Some(Some(d)) = held[i] {
            let s = frame.dof().map(|(k, _)| k).unwrap_or_default();
            let coef = |c: f64| (c.abs() > 1e-15).then_some((s, c));
            node.dofs[0] = coef(d[0]);
            node.dofs[1] = coef(d[1]);
        }
        nodes.push(node);
    }
    let mut members = Vec::with_capacity(model.members.len());
    for (mi, m) in model.members.iter().enumerate() {
        let (a, b) = (nodes[m.start], nodes[m.end]);
        let rot_a = if rigid[m.start] {
            a.dofs[2]
        } else {
            frame.dof()
        };
        let rot_b = if rigid[m.end] { b.dofs[2] } else { frame.dof() };
        let sec = &model.sections[m.section];
        let mat = &model.materials[m.material];
        let start = frame.beams.len();
        let props = [mat.e * sec.area, mat.e * sec.i_in, 0.0];
        frame.member(&a, &b, rot_a, rot_b, parts, props, 0.0, mi);
        members.push(start..frame.beams.len());
    }
    InPlaneFrame {
        frame,
        nodes,
        members,
    }
}

impl InPlaneFrame {
    pub fn set_forces(&mut self, forces: &[f64]) {
        for b in &mut self.frame.beams {
            b.axial = forces[b.member];
        }
    }
}

/// A member's effective length from the mode.
#[derive(Clone, Debug, PartialEq)]
pub struct MemberK {
    pub member: usize,
    /// Axial force of the effect, N (negative: compression).
    pub force: f64,
    /// λcr·|N|, N.
    pub critical_force: f64,
    /// K = (π/L)·√(EI/(λcr·|N|)).
    pub k: f64,
    /// Share of φᵀ·G·φ relative to the largest member's.
    pub share: f64,
}

/// The buckling result of one load effect.
#[derive(Clone, Debug, PartialEq)]
pub struct Buckling {
    pub effect: String,
    /// λcr; None when no member is in compression.
    pub critical_factor: Option<f64>,
    pub residual: f64,
    /// Members taking part, with K; others are not governed by this mode.
    pub members: Vec<MemberK>,
    /// Translation of every model node in the mode (largest component 1).
    pub mode: Vec<[f64; 2]>,
    /// Translations along each member (parts + 1 points, start to end).
    pub member_shapes: Vec<Vec<[f64; 2]>>,
}

/// Which eigen-solver: dense up to [`DENSE_LIMIT`] DOFs, sparse subspace
/// iteration above (`Auto`), or one of them forced.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Solver {
    Auto,
    Dense,
    Sparse,
}

/// λcr and effective lengths for each (id, member forces) effect.
pub fn buckling(
    model: &Model,
    rigid: &[bool],
    parts: usize,
    effects: &[(String, Vec<f64>)],
) -> Result<Vec<Buckling>, StabilityError> {
    buckling_with(model, rigid, parts, effects, Solver::Auto)
}

/// As [`buckling`], with the solver chosen.
pub fn buckling_with(
    model: &Model,
    rigid: &[bool],
    parts: usize,
    effects: &[(String, Vec<f64>)],
    solver: Solver,
) -> Result<Vec<Buckling>, StabilityError> {
    let mut f = build(model, rigid, parts);
    let n = f.frame.n_dofs;
    let sparse = match solver {
        Solver::Auto => n > DENSE_LIMIT,
        Solver::Dense => false,
        Solver::Sparse => true,
    };
    let (reduced, k_sparse) = if sparse {
        let t = f.frame.triplets(Matrix::Stiffness);
        (None, Some(SparseSym::new(n, t)))
    } else {
        let k = f.frame.stiffness();
        (
            Some(Reduced::new(&k).map_err(|_| StabilityError::Unstable)?),
            None,
        )
    };
    let mut out = Vec::with_capacity(effects.len());
    for (id, forces) in effects {
        f.set_forces(forces);
        let pairs = match (&reduced, &k_sparse) {
            (Some(r), _) => r.smallest_positive(&f.frame.geometric(), 1),
            (None, Some(k)) => {
                let g = SparseSym::new(n, f.frame.triplets(Matrix::Geometric));
                crate::analysis::eigen_sparse::smallest_positive(k, &g, 1)
            }
            (None, None) => unreachable!("one solver is prepared"),
        };
        match pairs {
            Ok(pairs) => out.push(describe(model, &f, id, forces, &pairs[0])),
            Err(EigenError::NoPositive) => out.push(Buckling {
                effect: id.clone(),
                critical_factor: None,
                residual: 0.0,
                members: Vec::new(),
                mode: Vec::new(),
                member_shapes: Vec::new(),
            }),
            Err(EigenError::NotPositiveDefinite) => return Err(StabilityError::Unstable),
            Err(e) => return Err(StabilityError::Eigen(e)),
        }
    }
    Ok(out)
}

fn describe(
    model: &Model,
    f: &InPlaneFrame,
    id: &str,
    forces: &[f64],
    p: &crate::analysis::eigen::EigenPair,
) -> Buckling {
    let lambda = p.value;
    let phi = &p.vector;
    let work: Vec<f64> = f
        .members
        .iter()
        .map(|r| {
            f.frame.beams[r.clone()]
                .iter()
                .map(|b| geometric_work(b, phi))
                .sum()
        })
        .collect();
    let biggest = work.iter().cloned().fold(0.0f64, f64::max);
    let mut members = Vec::new();
    for (mi, m) in model.members.iter().enumerate() {
        let n = forces[mi];
        let share = if biggest > 0.0 {
            work[mi] / biggest
        } else {
            0.0
        };
        if n < 0.0 && share >= PARTICIPATION {
            let ei = model.materials[m.material].e * model.sections[m.section].i_in;
            let l = (model.nodes[m.end].x - model.nodes[m.start].x)
                .hypot(model.nodes[m.end].y - model.nodes[m.start].y);
            let pcr = lambda * n.abs();
            members.push(MemberK {
                member: mi,
                force: n,
                critical_force: pcr,
                k: std::f64::consts::PI / l * (ei / pcr).sqrt(),
                share,
            });
        }
    }
    let mode = f
        .nodes
        .iter()
        .map(|n| Frame::translation(&n.dofs, phi))
        .collect();
    let member_shapes = f
        .members
        .iter()
        .map(|r| {
            let beams = &f.frame.beams[r.clone()];
            let mut pts = vec![at(&beams[0].dofs[..2], phi)];
            pts.extend(beams.iter().map(|b| at(&b.dofs[3..5], phi)));
            pts
        })
        .collect();
    Buckling {
        effect: id.to_string(),
        critical_factor: Some(lambda),
        residual: p.residual,
        members,
        mode,
        member_shapes,
    }
}

fn at(dofs: &[super::frame::Dof], phi: &DVector<f64>) -> [f64; 2] {
    let v = |d: super::frame::Dof| d.map_or(0.0, |(i, c)| c * phi[i]);
    [v(dofs[0]), v(dofs[1])]
}
