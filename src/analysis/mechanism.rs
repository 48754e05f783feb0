//! Naming a mechanism: where and how the truss is free to move.
//!
//! The factorization gives the free motion itself, a null vector of K (see
//! `Factor::null_vector`). The message names the DOF with the largest
//! entry of that mode (its node and direction), and says when the motion
//! is a rigid-body motion of the whole truss, which means the supports are
//! missing or all in one sense (both ends on rollers), not a member.

use super::dofs::Dofs;
use crate::model::Model;

/// A rigid-body fit whose residual is below this fraction of the largest
/// displacement is a rigid-body motion (round-off of the solve is far
/// smaller; a deformation mode of a truss is far larger).
const RIGID_TOLERANCE: f64 = 1e-6;

/// A free motion of the truss, node by node (m, scaled so the largest DOF
/// entry is 1).
#[derive(Clone, Debug, PartialEq)]
pub struct FreeMotion {
    /// Displacement of every node in the mode (zero where no DOF).
    pub displacements: Vec<[f64; 2]>,
    /// The DOF with the largest entry.
    pub dof: usize,
    /// The whole truss moves as one rigid body.
    pub rigid: Option<Rigid>,
}

/// A rigid-body motion u = a + θ·k × r of every connected node.
#[derive(Clone, Debug, PartialEq)]
pub enum Rigid {
    /// A translation (no rotation) in this unit direction.
    Translation([f64; 2]),
    /// A rotation about this point (m).
    Rotation([f64; 2]),
}

/// The free motion described by `mode` (one entry per DOF).
pub fn free_motion(model: &Model, dofs: &Dofs, mode: &[f64]) -> FreeMotion {
    let mut u = vec![[0.0f64; 2]; model.nodes.len()];
    let mut dof = 0;
    for (p, &v) in mode.iter().enumerate() {
        let n = dofs.node[p] as usize;
        let d = dofs.direction[p];
        u[n][0] += v * d[0];
        u[n][1] += v * d[1];
        if v.abs() > mode[dof].abs() {
            dof = p;
        }
    }
    let rigid = rigid_fit(model, dofs, &u);
    FreeMotion {
        displacements: u,
        dof,
        rigid,
    }
}

/// Least-squares fit of a rigid-body motion to the displacements of the
/// nodes that carry DOFs or supports; Some when it fits within
/// [`RIGID_TOLERANCE`].
fn rigid_fit(model: &Model, dofs: &Dofs, u: &[[f64; 2]]) -> Option<Rigid> {
    let nodes: Vec<usize> = (0..model.nodes.len())
        .filter(|&n| !dofs.of_node(n).is_empty() || dofs.support_of[n].is_some())
        .collect();
    if nodes.len() < 2 {
        return None;
    }
    let k = nodes.len() as f64;
    let (mut cx, mut cy, mut ax, mut ay) = (0.0, 0.0, 0.0, 0.0);
    for &n in &nodes {
        cx += model.nodes[n].x / k;
        cy += model.nodes[n].y / k;
        ax += u[n][0] / k;
        ay += u[n][1] / k;
    }
    // About the centroid: u = a − θ·ry, a + θ·rx decouple; θ from
    // Σ(r × u)/Σ|r|².
    let (mut num, mut den) = (0.0, 0.0);
    for &n in &nodes {
        let (rx, ry) = (model.nodes[n].x - cx, model.nodes[n].y - cy);
        num += rx * u[n][1] - ry * u[n][0];
        den += rx * rx + ry * ry;
    }
    let theta = if den > 0.0 { num / den } else { 0.0 };
    let mut residual = 0.0f64;
    let mut largest = 0.0f64;
    for &n in &nodes {
        let (rx, ry) = (model.nodes[n].x - cx, model.nodes[n].y - cy);
        let fit = [ax - theta * ry, ay + theta * rx];
        residual = residual.max((u[n][0] - fit[0]).hypot(u[n][1] - fit[1]));
        largest = largest.max(u[n][0].hypot(u[n][1]));
    }
    if largest == 0.0 || residual > RIGID_TOLERANCE * largest {
        return None;
    }
    let extent = den.sqrt() / k.sqrt();
    if (theta * extent).abs() <= RIGID_TOLERANCE * largest {
        let a = ax.hypot(ay);
        Some(Rigid::Translation([ax / a, ay / a]))
    } else {
        // The point that does not move: a + θ·k × (p − c) = 0.
        Some(Rigid::Rotation([cx - ay / theta, cy + ax / theta]))
    }
}

/// "x", "y" or an angle from x, for a direction whose sense does not matter.
pub fn direction_name(d: [f64; 2]) -> String {
    let mut angle = d[1].atan2(d[0]).to_degrees();
    if angle <= -90.0 {
        angle += 180.0;
    } else if angle > 90.0 {
        angle -= 180.0;
    }
    if angle.abs() < 0.05 {
        "x".into()
    } else if (angle.abs() - 90.0).abs() < 0.05 {
        "y".into()
    } else {
        format!("the direction {angle:.1}° from x")
    }
}

/// The node nearest to a point, for naming a centre of rotation.
pub fn nearest_node(model: &Model, p: [f64; 2]) -> (usize, f64) {
    let mut best = (0, f64::INFINITY);
    for (i, n) in model.nodes.iter().enumerate() {
        let d = (n.x - p[0]).hypot(n.y - p[1]);
        if d < best.1 {
            best = (i, d);
        }
    }
    best
}
