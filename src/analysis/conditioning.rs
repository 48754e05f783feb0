//! Numerical trust: warnings for models that solve but may not deserve
//! belief — near-mechanisms, stiffnesses many orders apart, very shallow
//! layouts — and a cheap estimate of the condition number of K.
//!
//! The estimate works on the Jacobi-scaled matrix S = D^-1/2 K D^-1/2
//! (D = diag K), whose condition number governs the accuracy of the
//! Cholesky solve far better than that of K in raw SI units. λmax(S) comes
//! from power iteration with K·x, λmin(S) from inverse iteration with the
//! existing factor (Golub & Van Loan, Matrix Computations, §7.3 and §8.2,
//! from memory). A few steps give λmax from below and λmin from above, so
//! the ratio is a lower bound of κ₂(S): a warning is never a false alarm
//! on that score. Rule of thumb (Higham, Accuracy and Stability of
//! Numerical Algorithms, ch. 7, from memory): about log10 κ of the 16
//! significant digits of a double may be lost.

use super::assemble::Csc;
use super::dofs::Dofs;
use super::results::Prepared;
use crate::model::Model;

/// max/min EA/L over the members above which a warning is given.
pub const STIFFNESS_RATIO_WARNING: f64 = 1e8;
/// Members within this many degrees of one line at a node make it a
/// near-mechanism if the node is free across that line.
pub const COLLINEAR_DEGREES: f64 = 1.0;
/// Depth / span of the whole layout below which it is called very shallow.
pub const SHALLOW_RATIO: f64 = 1e-3;
/// Condition estimate of the scaled K above which digits may be lost.
pub const CONDITION_WARNING: f64 = 1e8;
/// Steps of power and of inverse iteration.
pub const ITERATIONS: usize = 16;

/// Above this many DOFs the inverse iteration takes [`LARGE_ITERATIONS`]
/// steps: each is a full triangular solve, and the estimate must stay a
/// small fraction of the factorization's cost (it remains a lower bound).
pub const LARGE_MODEL_DOFS: usize = 100_000;
/// Two steps: the first is solved with the load cases at almost no cost,
/// the second is one triangular solve (at 10⁶ DOF about a twentieth of the
/// factorization). Fewer steps give a smaller lower bound, so fewer
/// warnings on very large models, never a false one.
pub const LARGE_ITERATIONS: usize = 2;
/// At most this many near-mechanism nodes are named.
const SHOWN: usize = 5;

/// λmax, λmin and their ratio for the Jacobi-scaled stiffness.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ConditionEstimate {
    pub lambda_max: f64,
    pub lambda_min: f64,
    /// λmax / λmin, a lower bound of the 2-norm condition number.
    pub condition: f64,
}

impl ConditionEstimate {
    /// Significant digits (of 16) that may be lost: log10 κ.
    pub fn digits_lost(&self) -> f64 {
        self.condition.max(1.0).log10()
    }
}

fn normalise(x: &mut [f64]) -> f64 {
    let norm = x.iter().map(|v| v * v).sum::<f64>().sqrt();
    if norm > 0.0 && norm.is_finite() {
        x.iter_mut().for_each(|v| *v /= norm);
    }
    norm
}

/// A deterministic start vector with no special relation to any mode.
fn start(n: usize) -> Vec<f64> {
    let mut s: u64 = 0x9e37_79b9_7f4a_7c15;
    (0..n)
        .map(|_| {
            s ^= s << 13;
            s ^= s >> 7;
            s ^= s << 17;
            (s >> 11) as f64 / (1u64 << 53) as f64 + 0.5
        })
        .collect()
}

/// √diag K, the Jacobi scaling; `None` if a diagonal is not positive.
fn root_diagonal(k: &Csc) -> Option<Vec<f64>> {
    let d: Vec<f64> = (0..k.n).map(|j| k.get(j, j).max(0.0).sqrt()).collect();
    d.iter().all(|&v| v > 0.0 && v.is_finite()).then_some(d)
}

/// λmax of the scaled stiffness by power iteration with K·x alone (no
/// factor needed, so it can run beside the factorization). `None` for an
/// empty or non-positive diagonal or a non-finite step.
pub fn lambda_max(k: &Csc) -> Option<f64> {
    let n = k.n;
    if n == 0 {
        return None;
    }
    let d = root_diagonal(k)?;
    let (mut x, mut y) = (start(n), vec![0.0; n]);
    normalise(&mut x);
    let mut lambda_max = 0.0;
    let power_steps = if n > LARGE_MODEL_DOFS { 8 } else { ITERATIONS };
    let mut z = vec![0.0; n];
    for _ in 0..power_steps {
        // y = S x = D^-1/2 K D^-1/2 x
        z.iter_mut()
            .zip(x.iter().zip(&d))
            .for_each(|(z, (v, s))| *z = v / s);
        k.sym_mul(&z, &mut y);
        y.iter_mut().zip(&d).for_each(|(v, s)| *v /= s);
        lambda_max = x.iter().zip(&y).map(|(a, b)| a * b).sum::<f64>();
        std::mem::swap(&mut x, &mut y);
        if normalise(&mut x) == 0.0 {
            return None;
        }
    }
    Some(lambda_max)
}

/// The right-hand side of the first inverse-iteration step, D^1/2 x0 (x0
/// the normalised start vector), so a caller can solve it in the same block
/// as its load cases and hand the solution to [`estimate_with`].
pub fn first_probe(k: &Csc) -> Option<Vec<f64>> {
    let d = root_diagonal(k)?;
    let mut x = start(k.n);
    normalise(&mut x);
    Some(x.iter().zip(&d).map(|(v, s)| v * s).collect())
}

/// Estimate the condition of the scaled stiffness of `p`; `None` for an
/// empty model or if the iteration met a non-finite value.
pub fn estimate(p: &Prepared) -> Option<ConditionEstimate> {
    estimate_with(p, lambda_max(&p.k)?, None)
}

/// [`estimate`] given λmax (from [`lambda_max`]) and, optionally, the
/// first inverse-iteration step already solved: K⁻¹ applied to
/// [`first_probe`]. The result is the same either way.
pub fn estimate_with(
    p: &Prepared,
    lambda_max: f64,
    first: Option<Vec<f64>>,
) -> Option<ConditionEstimate> {
    let n = p.n();
    if n == 0 {
        return None;
    }
    let d = root_diagonal(&p.k)?;
    let mut x = start(n);
    normalise(&mut x);
    let mut first = first.filter(|f| f.len() == n);
    let mut mu_max = 0.0;
    let steps = if n > LARGE_MODEL_DOFS {
        LARGE_ITERATIONS
    } else {
        ITERATIONS
    };
    for _ in 0..steps {
        // y = S^-1 x = D^1/2 K^-1 D^1/2 x
        let mut y = match first.take() {
            Some(solved) => solved,
            None => {
                let mut y: Vec<f64> = x.iter().zip(&d).map(|(v, s)| v * s).collect();
                p.factor.solve_in_place(&mut y, 1);
                y
            }
        };
        y.iter_mut().zip(&d).for_each(|(v, s)| *v *= s);
        mu_max = x.iter().zip(&y).map(|(a, b)| a * b).sum::<f64>();
        x = y;
        if normalise(&mut x) == 0.0 {
            return None;
        }
    }
    let lambda_min = 1.0 / mu_max;
    let condition = lambda_max / lambda_min;
    (condition.is_finite() && lambda_min > 0.0).then_some(ConditionEstimate {
        lambda_max,
        lambda_min,
        condition,
    })
}

/// Warning when EA/L of the members spans more than [`STIFFNESS_RATIO_WARNING`].
pub fn stiffness_spread(model: &Model) -> Option<String> {
    let mut lo = (f64::INFINITY, 0);
    let mut hi = (0.0f64, 0);
    for m in 0..model.members.len() {
        let k = model.axial_stiffness(m);
        if k < lo.0 {
            lo = (k, m);
        }
        if k > hi.0 {
            hi = (k, m);
        }
    }
    let ratio = hi.0 / lo.0;
    (ratio > STIFFNESS_RATIO_WARNING).then(|| {
        format!(
            "member stiffnesses EA/L span a ratio of {ratio:.1e} (stiffest \"{}\", softest \"{}\"); results may lose accuracy",
            model.members[hi.1].id, model.members[lo.1].id
        )
    })
}

/// Nodes where every member lies within [`COLLINEAR_DEGREES`] of one line
/// and a free direction of the node crosses that line: a near-mechanism
/// (the node is held across the line only by second-order stiffness).
pub fn near_collinear(model: &Model, dofs: &Dofs) -> Vec<String> {
    let nn = model.nodes.len();
    // Sum of (cos 2θ, sin 2θ) per node: direction-free (θ and θ+180° agree).
    let mut sum = vec![[0.0f64; 2]; nn];
    let mut count = vec![0usize; nn];
    for (m, mem) in model.members.iter().enumerate() {
        let c = model.direction(m);
        let (c2, s2) = (c[0] * c[0] - c[1] * c[1], 2.0 * c[0] * c[1]);
        for node in [mem.start, mem.end] {
            sum[node][0] += c2;
            sum[node][1] += s2;
            count[node] += 1;
        }
    }
    let tol = COLLINEAR_DEGREES.to_radians();
    let mut lines = Vec::new();
    let mut found = 0usize;
    let mut angle_of = vec![None; nn];
    for node in 0..nn {
        if count[node] == 0 || dofs.of_node(node).is_empty() {
            continue;
        }
        let phi = 0.5 * sum[node][1].atan2(sum[node][0]);
        angle_of[node] = Some(phi);
    }
    let mut spread = vec![0.0f64; nn];
    for (m, mem) in model.members.iter().enumerate() {
        let c = model.direction(m);
        for node in [mem.start, mem.end] {
            if let Some(phi) = angle_of[node] {
                // Angle between the member's line and the line at phi.
                let sin = (c[1] * phi.cos() - c[0] * phi.sin()).abs();
                spread[node] = spread[node].max(sin.min(1.0).asin());
            }
        }
    }
    for node in 0..nn {
        let Some(phi) = angle_of[node] else { continue };
        if spread[node] > tol {
            continue;
        }
        let normal = [-phi.sin(), phi.cos()];
        let free_across = dofs.of_node(node).any(|q| {
            let d = dofs.direction[q];
            (d[0] * normal[0] + d[1] * normal[1]).abs() > tol.sin()
        });
        if free_across {
            found += 1;
            if lines.len() < SHOWN {
                lines.push(format!(
                    "near-mechanism at node \"{}\": its {} member(s) lie within {:.2}° of one line and nothing holds it across that line; a small load across it gives very large displacements",
                    model.nodes[node].id,
                    count[node],
                    spread[node].to_degrees()
                ));
            }
        }
    }
    if found > SHOWN {
        lines.push(format!(
            "{} more near-mechanism nodes with nearly collinear members",
            found - SHOWN
        ));
    }
    lines
}

/// Depth over span of the node cloud along its principal axes (second
/// moments of the node positions).
pub fn depth_over_span(model: &Model) -> Option<f64> {
    let n = model.nodes.len() as f64;
    if model.nodes.len() < 2 {
        return None;
    }
    let (mx, my) = model
        .nodes
        .iter()
        .fold((0.0, 0.0), |(a, b), p| (a + p.x / n, b + p.y / n));
    let (mut sxx, mut syy, mut sxy) = (0.0, 0.0, 0.0);
    for p in &model.nodes {
        let (dx, dy) = (p.x - mx, p.y - my);
        sxx += dx * dx;
        syy += dy * dy;
        sxy += dx * dy;
    }
    let phi = 0.5 * (2.0 * sxy).atan2(sxx - syy);
    let (u, v) = ([phi.cos(), phi.sin()], [-phi.sin(), phi.cos()]);
    let (mut a0, mut a1, mut b0, mut b1) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for p in &model.nodes {
        let (dx, dy) = (p.x - mx, p.y - my);
        let a = dx * u[0] + dy * u[1];
        let b = dx * v[0] + dy * v[1];
        a0 = a0.min(a);
        a1 = a1.max(a);
        b0 = b0.min(b);
        b1 = b1.max(b);
    }
    let span = a1 - a0;
    (span > 0.0 && span.is_finite()).then(|| (b1 - b0) / span)
}

/// The warnings that need only the layout and the DOFs, not the factor:
/// stiffness spread, near-mechanisms, a very shallow layout.
pub fn layout_warnings(model: &Model, dofs: &Dofs) -> Vec<String> {
    let mut out = Vec::new();
    out.extend(stiffness_spread(model));
    out.extend(near_collinear(model, dofs));
    if let Some(r) = depth_over_span(model) {
        if r < SHALLOW_RATIO {
            out.push(format!(
                "very shallow layout: depth/span = {r:.1e} (below {SHALLOW_RATIO:.0e}); chord forces grow as span/depth and are sensitive to small errors in node heights"
            ));
        }
    }
    out
}

/// The warning for a condition estimate above [`CONDITION_WARNING`].
pub fn condition_warning(c: Option<ConditionEstimate>) -> Option<String> {
    let c = c?;
    (c.condition > CONDITION_WARNING).then(|| {
        format!(
            "ill-conditioned stiffness: condition estimate {:.1e} of the scaled K; about {:.0} of 16 significant digits may be lost",
            c.condition,
            c.digits_lost()
        )
    })
}

/// Every numerical-trust warning for a solved model.
pub fn warnings(model: &Model, p: &Prepared) -> Vec<String> {
    let mut out = layout_warnings(model, &p.dofs);
    out.extend(condition_warning(estimate(p)));
    out
}
