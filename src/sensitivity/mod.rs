//! Geometry sensitivity by the adjoint method: the derivative of the
//! governing utilization and of the largest deflection with respect to
//! every free node coordinate, from one extra solve each on the existing
//! factorization, so the engineer sees which panel-point moves help most.
//!
//! # Formulation
//!
//! For a bar m from node a to node b let Δ = x_b − x_a, L = |Δ|, c = Δ/L,
//! Δu = u_b − u_a (full displacements, settlements included), elongation
//! e = c·Δu − e₀ and force N = (EA/L)·e (the direct-stiffness bar,
//! e.g. any matrix structural analysis text). At fixed displacements
//!
//! * ∂L/∂Δ = c, ∂c/∂Δ = (I − c cᵀ)/L,
//! * ∂e/∂Δ = g := (Δu − (c·Δu) c)/L,
//! * ∂N/∂Δ = (EA/L)·(g − e c/L);
//!
//! and derivatives with respect to x_b are +∂/∂Δ, to x_a −∂/∂Δ.
//!
//! Equilibrium on the free DOFs is R(q, x) = Σₘ bₘ Nₘ − f = 0 with
//! bₘ the compatibility row and ∂R/∂q = K. For an objective J(q, x),
//! dJ/dx = ∂J/∂x − λᵀ ∂R/∂x with K λ = (∂J/∂q)ᵀ (the adjoint equation;
//! K is symmetric, so the existing factor solves it). Writing λ as node
//! vectors, Δλ = λ_b − λ_a and a = c·Δλ, bar m contributes to λᵀ∂R/∂Δ
//!
//! T = N (Δλ − a c)/L + a (EA/L)(g − e c/L).
//!
//! Objectives:
//!
//! * Member force Nⱼ of case k: ∂Nⱼ/∂q = kⱼ bⱼ, so dNⱼ/dx = ∂Nⱼ/∂x − Σₘ Tₘ
//!   with λ = K⁻¹ kⱼ bⱼ (one solve, shared by every case).
//! * Utilization of the controlling check U = |N|/C with N = Σₖ αₖ Nⱼ,ₖ
//!   (αₖ the combination factors, live cases times 1 + impact):
//!   dU/dx = sgn(N)/C · Σₖ αₖ dNⱼ,ₖ/dx − |N|/C² · dC/dx.
//!   A tension capacity does not depend on geometry. A compression
//!   capacity C = Fcr(λ)·A with λ = K·L/r on the governing axis depends on
//!   the member length when the unbraced length is the member length:
//!   dC/dx = A · dFcr/dλ · (K/r) · ∂L/∂x, where dFcr/dλ is taken by a
//!   central difference of the chosen column curve in λ alone (the curves
//!   are closed forms in λ, piecewise; a step of 10⁻⁴·λ).
//! * Largest deflection D = |u_n| of node n in case k: ∂D/∂q = (u_n/D)·d_p
//!   on n's free directions d_p, no explicit x term: dD/dx = −Σₘ Tₘ with
//!   λ = K⁻¹ ∂D/∂qᵀ.
//!
//! Loads are fixed nodal forces, independent of geometry. The governing
//! check and deflection node are held fixed: where another check is about
//! to take over, the derivative holds on one side only.
//!
//! The governing check is the one `rate` reports as controlling, over every
//! case and combination and every moving load's envelope. A moving load is
//! held at the position that governs the check (see [`effects`]): its axle
//! and lane loads, as nodal forces at the deck nodes, form one more load
//! case, solved on the existing factorization, whose force gradient enters
//! with the envelope's factor.

pub mod effects;

use crate::analysis::assemble::b_row;
use crate::analysis::{Analysis, CaseResult};
use crate::capacity::{self, Curve, Regime};
use crate::model::{CaseKind, Model};
use crate::rate::Rating;
pub use effects::{terms, Held, Terms};

#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SensitivityError {
    #[error("no check to differentiate: the model has no members or load cases")]
    NoCheck,
    #[error("--case \"{id}\": no load case, combination or moving load of that id; the model has: {known}")]
    UnknownCase { id: String, known: String },
    #[error("internal: member \"{member}\" under \"{effect}\" could not be rebuilt from its load cases and vehicle position")]
    Rebuilt { member: String, effect: String },
    #[error("moving loads: {0}")]
    Loads(#[from] crate::loads::LoadError),
    /// Issue 16: the derivatives assume one linear stiffness; with
    /// tension-only members the set of slack members may change with the
    /// geometry, so the adjoint is not defined where it does.
    #[error("the model has tension-only members ({members}): its response is piecewise linear and a move of a node may change which of them are slack, so geometry derivatives are not given; compare variants with `panelpoint sweep` instead")]
    TensionOnly { members: String },
    #[error(transparent)]
    Analysis(#[from] crate::analysis::results::AnalysisError),
    #[error("member \"{member}\": {source}")]
    Capacity {
        member: String,
        source: capacity::CapacityError,
    },
}

/// Derivatives with respect to one coordinate of one node (SI).
#[derive(Clone, Debug, PartialEq)]
pub struct Coordinate {
    pub node: usize,
    /// 0 = x, 1 = y.
    pub axis: usize,
    /// dU/dx, per m.
    pub d_utilization: f64,
    /// dD/dx, m per m.
    pub d_deflection: f64,
}

/// The two objectives and their gradients.
#[derive(Clone, Debug, PartialEq)]
pub struct Sensitivity {
    pub member: usize,
    /// Index into `rating.effects`.
    pub effect: usize,
    pub utilization: f64,
    pub deflection_node: usize,
    pub deflection_case: usize,
    /// Largest deflection, m.
    pub deflection: f64,
    /// Every coordinate of every connected, unsupported node.
    pub coordinates: Vec<Coordinate>,
    /// Where a moving load was held, when the check includes one.
    pub held: Option<Held>,
}

/// Geometry of bar m at the solution of one case.
struct Bar {
    l: f64,
    c: [f64; 2],
    ea: f64,
    e: f64,
    g: [f64; 2],
}

fn bar(model: &Model, m: usize, case: &CaseResult) -> Bar {
    let mem = &model.members[m];
    let l = model.length(m);
    let c = model.direction(m);
    let ea = model.materials[mem.material].e * model.sections[mem.section].area;
    let (ua, ub) = (case.displacements[mem.start], case.displacements[mem.end]);
    let du = [ub[0] - ua[0], ub[1] - ua[1]];
    let cdu = c[0] * du[0] + c[1] * du[1];
    let e = case.forces[m] * l / ea;
    Bar {
        l,
        c,
        ea,
        e,
        g: [(du[0] - cdu * c[0]) / l, (du[1] - cdu * c[1]) / l],
    }
}

/// ∂N/∂Δ of bar m at fixed displacements.
fn dn_ddelta(b: &Bar) -> [f64; 2] {
    let k = b.ea / b.l;
    [
        k * (b.g[0] - b.e * b.c[0] / b.l),
        k * (b.g[1] - b.e * b.c[1] / b.l),
    ]
}

/// Add `v` as the derivative with respect to Δ of member m into `grad`.
fn scatter(model: &Model, m: usize, v: [f64; 2], scale: f64, grad: &mut [f64]) {
    let mem = &model.members[m];
    grad[2 * mem.end] += scale * v[0];
    grad[2 * mem.end + 1] += scale * v[1];
    grad[2 * mem.start] -= scale * v[0];
    grad[2 * mem.start + 1] -= scale * v[1];
}

/// λᵀ ∂R/∂x for one case, λ given per free DOF.
fn adjoint_term(model: &Model, analysis: &Analysis, case: &CaseResult, lam: &[f64]) -> Vec<f64> {
    let dofs = &analysis.prepared.dofs;
    let mut ln = vec![[0.0f64; 2]; model.nodes.len()];
    for (p, &v) in lam.iter().enumerate() {
        let d = dofs.direction[p];
        let n = dofs.node[p] as usize;
        ln[n][0] += v * d[0];
        ln[n][1] += v * d[1];
    }
    let mut grad = vec![0.0; 2 * model.nodes.len()];
    for m in 0..model.members.len() {
        let mem = &model.members[m];
        let b = bar(model, m, case);
        let dl = [
            ln[mem.end][0] - ln[mem.start][0],
            ln[mem.end][1] - ln[mem.start][1],
        ];
        let a = b.c[0] * dl[0] + b.c[1] * dl[1];
        let n = case.forces[m];
        let dn = dn_ddelta(&b);
        let t = [
            n * (dl[0] - a * b.c[0]) / b.l + a * dn[0],
            n * (dl[1] - a * b.c[1]) / b.l + a * dn[1],
        ];
        scatter(model, m, t, 1.0, &mut grad);
    }
    grad
}

/// dNⱼ/dx of one case (all node coordinates).
fn force_gradient(
    model: &Model,
    analysis: &Analysis,
    case: &CaseResult,
    lam: &[f64],
    j: usize,
) -> Vec<f64> {
    let mut grad = adjoint_term(model, analysis, case, lam);
    grad.iter_mut().for_each(|v| *v = -*v);
    let b = bar(model, j, case);
    scatter(model, j, dn_ddelta(&b), 1.0, &mut grad);
    grad
}

/// dC/dL of member j's capacity in the sense of `force`.
fn capacity_per_length(
    model: &Model,
    rating: &Rating,
    j: usize,
    force: f64,
) -> Result<f64, SensitivityError> {
    let cap = &rating.members[j];
    if force > 0.0 || cap.compression.regime == Regime::Tension {
        return Ok(0.0);
    }
    let mem = &model.members[j];
    let sec = &model.sections[mem.section];
    let (k, given, r) = match cap.axis {
        crate::rate::Axis::In => (mem.k_in, mem.unbraced_in.is_some(), sec.r_in()),
        crate::rate::Axis::Out => (mem.k_out, mem.unbraced_out.is_some(), sec.r_out()),
    };
    if given {
        return Ok(0.0);
    }
    let lambda = cap.slenderness();
    let h = 1e-4 * lambda.max(1.0);
    let err = |source| SensitivityError::Capacity {
        member: mem.id.to_string(),
        source,
    };
    let curve: &Curve = &rating.method.curve;
    let hi = capacity::column(curve, cap.fy, cap.e, lambda + h).map_err(err)?;
    let lo = capacity::column(curve, cap.fy, cap.e, (lambda - h).max(0.0)).map_err(err)?;
    let dfdl = (hi.critical_stress - lo.critical_stress) / (lambda + h - (lambda - h).max(0.0));
    // The method's factors on the nominal strength (φ, φc·φs, 1/FS).
    let factor = cap.compression.capacity / cap.compression.nominal;
    Ok(sec.area * factor * dfdl * k / r)
}

/// The effects `--case` may name: load cases, combinations, moving loads.
fn known_ids(model: &Model) -> String {
    model
        .cases
        .iter()
        .map(|c| &c.id)
        .chain(model.combinations.iter().map(|c| &c.id))
        .chain(model.live.moving.iter().map(|m| &m.id))
        .map(|id| format!("\"{id}\""))
        .collect::<Vec<_>>()
        .join(", ")
}

/// The check to differentiate: `rate`'s controlling check, or the worst
/// check of the effects of `case` (a load case, a combination, a moving
/// load, or one effect's own id), and the terms of its effect.
fn governing<'r>(
    model: &Model,
    rating: &'r Rating,
    case: Option<&str>,
) -> Result<(&'r crate::rate::Check, Terms), SensitivityError> {
    let terms: Vec<Option<Terms>> = (0..rating.effects.len())
        .map(|e| terms(model, rating, e))
        .collect();
    let chosen = |e: usize| match (case, &terms[e]) {
        (_, None) => false,
        (None, Some(_)) => true,
        (Some(id), Some(t)) => t.source == id || rating.effects[e].id == id,
    };
    if let Some(id) = case {
        if !(0..rating.effects.len()).any(chosen) {
            return Err(SensitivityError::UnknownCase {
                id: id.to_string(),
                known: known_ids(model),
            });
        }
    }
    let controlling = rating
        .controlling
        .map(|c| &rating.checks[c])
        .filter(|c| case.is_none() && chosen(c.effect));
    let check = match controlling {
        Some(c) => Some(c),
        None => rating
            .checks
            .iter()
            .filter(|c| chosen(c.effect))
            .max_by(|a, b| a.utilization.total_cmp(&b.utilization)),
    }
    .ok_or(SensitivityError::NoCheck)?;
    let t = terms[check.effect]
        .clone()
        .ok_or(SensitivityError::NoCheck)?;
    Ok((check, t))
}

/// A combination's dead cases that relieve its live part in the checked
/// member are taken at the method's minimum factor, as `rate` combines them
/// (AASHTO LRFD 3.4.1 for LRFR); the factor is constant on either side of
/// the sign change, so the derivative is that of the chosen factor.
fn relieve(
    model: &Model,
    rating: &Rating,
    check: &crate::rate::Check,
    terms: &Terms,
    parts: &mut [(CaseResult, f64)],
) {
    let Some(relief) = crate::rate::Relief::of(&rating.method) else {
        return;
    };
    if rating.effects[check.effect].combination.is_none() {
        return;
    }
    let j = check.member;
    let n_cases = terms.cases.len();
    let kind = |i: usize| (i < n_cases).then(|| model.cases[terms.cases[i].0].kind);
    let live: f64 = parts
        .iter()
        .enumerate()
        .filter(|(i, _)| matches!(kind(*i), None | Some(CaseKind::Live)))
        .map(|(_, (r, f))| f * r.forces[j])
        .sum();
    for (i, (r, f)) in parts.iter_mut().enumerate() {
        let min = match kind(i) {
            Some(CaseKind::Dead) => relief.dc,
            Some(CaseKind::Wearing) => relief.dw,
            _ => continue,
        };
        if *f > min && r.forces[j] * live < 0.0 {
            *f = min;
        }
    }
}

/// Both gradients for the controlling check (or the worst check of
/// `case`: a load case, combination or moving load id) and the largest
/// deflection (over all load cases, or of `case` when it is a load case).
pub fn sensitivity(
    model: &Model,
    analysis: &Analysis,
    rating: &Rating,
    case: Option<&str>,
) -> Result<Sensitivity, SensitivityError> {
    if model.has_tension_only() {
        let ids: Vec<&str> = model
            .members
            .iter()
            .filter(|m| m.tension_only)
            .map(|m| m.id.as_str())
            .collect();
        return Err(SensitivityError::TensionOnly {
            members: ids.join(", "),
        });
    }
    let (check, terms) = governing(model, rating, case)?;
    let j = check.member;
    let n = analysis.prepared.n();
    let factor = &analysis.prepared.factor;

    // Utilization.
    let kj = model.axial_stiffness(j);
    let mut lam = vec![0.0; n];
    for (p, v) in b_row(model, &analysis.prepared.dofs, j).iter() {
        lam[p] = kj * v;
    }
    factor.solve_in_place(&mut lam, 1);
    // The effect as load cases with factors; a moving load held where it
    // governs becomes one more case.
    let mut parts: Vec<(CaseResult, f64)> = terms
        .cases
        .iter()
        .map(|&(c, f)| (analysis.cases[c].clone(), f))
        .collect();
    let mut held = None;
    if let Some((k, side, f)) = terms.moving {
        let envs = crate::loads::envelopes(model, &analysis.prepared)?;
        let (case, h) = effects::held_vehicle(model, analysis, &envs[k], k, side, j, &lam)?;
        let r = analysis
            .prepared
            .solve_cases(model, std::slice::from_ref(&case))?;
        parts.extend(r.into_iter().map(|r| (r, f)));
        held = Some(h);
    }
    relieve(model, rating, check, &terms, &mut parts);
    let nn = model.nodes.len();
    let mut du = vec![0.0; 2 * nn];
    let rebuilt: f64 = parts.iter().map(|(r, f)| f * r.forces[j]).sum();
    let force = check.force;
    // The rebuilt effect must be the one checked (a zero-force check is
    // round-off and is zero).
    if force != 0.0 && (rebuilt - force).abs() > 1e-6 * force.abs() {
        return Err(SensitivityError::Rebuilt {
            member: model.members[j].id.to_string(),
            effect: rating.effects[check.effect].id.clone(),
        });
    }
    let cap = check.capacity;
    let s = force.signum();
    if force != 0.0 {
        for (r, alpha) in &parts {
            let g = force_gradient(model, analysis, r, &lam, j);
            for (d, v) in du.iter_mut().zip(g) {
                *d += s * alpha * v / cap;
            }
        }
        let dcdl = capacity_per_length(model, rating, j, force)?;
        if dcdl != 0.0 {
            let c = model.direction(j);
            let dc = [dcdl * c[0], dcdl * c[1]];
            scatter(model, j, dc, -force.abs() / (cap * cap), &mut du);
        }
    }

    // Largest deflection.
    let cases: Vec<usize> = match case.and_then(|id| model.cases.iter().position(|c| c.id == id)) {
        Some(c) => vec![c],
        None => (0..model.cases.len()).collect(),
    };
    let mut best = (0.0f64, 0usize, cases.first().copied().unwrap_or(0));
    for &ci in &cases {
        for (ni, d) in analysis.cases[ci].displacements.iter().enumerate() {
            let v = d[0].hypot(d[1]);
            if v > best.0 {
                best = (v, ni, ci);
            }
        }
    }
    let (dmax, dn, dc) = best;
    let mut dd = vec![0.0; 2 * nn];
    if dmax > 0.0 {
        let dofs = &analysis.prepared.dofs;
        let u = analysis.cases[dc].displacements[dn];
        let mut lam = vec![0.0; n];
        for p in dofs.of_node(dn) {
            let d = dofs.direction[p];
            lam[p] = (u[0] * d[0] + u[1] * d[1]) / dmax;
        }
        factor.solve_in_place(&mut lam, 1);
        let t = adjoint_term(model, analysis, &analysis.cases[dc], &lam);
        for (d, v) in dd.iter_mut().zip(t) {
            *d = -v;
        }
    }

    let dofs = &analysis.prepared.dofs;
    let mut coordinates = Vec::new();
    for node in 0..nn {
        if dofs.support_of[node].is_some() || dofs.of_node(node).is_empty() {
            continue;
        }
        for axis in 0..2 {
            coordinates.push(Coordinate {
                node,
                axis,
                d_utilization: du[2 * node + axis],
                d_deflection: dd[2 * node + axis],
            });
        }
    }
    Ok(Sensitivity {
        member: j,
        effect: check.effect,
        utilization: check.utilization,
        deflection_node: dn,
        deflection_case: dc,
        deflection: dmax,
        coordinates,
        held,
    })
}

/// The coordinates ordered by how much moving them lowers the
/// utilization per unit length moved, best first.
pub fn best_moves(s: &Sensitivity) -> Vec<&Coordinate> {
    let mut v: Vec<&Coordinate> = s.coordinates.iter().collect();
    v.sort_by(|a, b| b.d_utilization.abs().total_cmp(&a.d_utilization.abs()));
    v
}
