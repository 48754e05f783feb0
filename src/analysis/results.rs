//! Solving load cases on one factorization and recovering member forces,
//! reactions, displacements and an equilibrium check for each.

use super::assemble::{b_row, stiffness, BRow, Csc};
use super::dofs::Dofs;
use super::solve::{Factor, FactorError, Symbolic};
use crate::model::{LoadCase, Model};

/// Relative equilibrium residual above which a solution is refused.
pub const RESIDUAL_LIMIT: f64 = 1e-6;
/// Pivot ratio below which results are flagged as possibly inaccurate.
pub const CONDITION_WARNING_RATIO: f64 = 1e-8;

#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum AnalysisError {
    #[error("the truss is a mechanism: node \"{node}\" is free to move in {direction}; add a member or a support there")]
    Mechanism {
        node: String,
        direction: String,
        pivot_ratio: f64,
    },
    #[error("the truss is a mechanism: its supports do not hold it, the whole truss is free to {motion} as a rigid body; add a support or make a roller a pin")]
    RigidBody { motion: String },
    #[error("load case \"{case}\": equilibrium residual {relative:.1e} of the largest force exceeds {limit:.0e}; the model is too ill-conditioned to trust")]
    Residual {
        case: String,
        relative: f64,
        limit: f64,
    },
    #[error("the stiffness matrix is too ill-conditioned to factor: it lost positive definiteness at node \"{node}\" ({direction}); look there for a nearly flat or nearly collinear layout or members of very different stiffness")]
    IllConditioned { node: String, direction: String },
    #[error("the sparse factorization failed for want of memory or a malformed matrix")]
    Internal,
    /// Issue 16: with its slack tension-only members out, the truss cannot
    /// carry the load state (`analysis::active_set`).
    #[error("{state}: with the tension-only members {slack} slack the truss is a mechanism: {motion}; that load cannot be carried by tension in those members, add a member that can push or check the loads")]
    SlackMechanism {
        state: String,
        slack: String,
        motion: String,
    },
    /// Issue 16: the active-set iteration came back to a set of slack
    /// members it had already tried.
    #[error("{state}: the tension-only iteration is cycling (slack members {slack} came back after {iterations} iterations); the state is too close to a member's zero force to decide, adjust the slack or the loads slightly")]
    Cycling {
        state: String,
        slack: String,
        iterations: usize,
    },
    /// A force, displacement or reaction overflowed (issue 22, item 12): an
    /// error rather than a number the checks would treat as zero.
    #[error("load case \"{case}\": a {what} is not a finite number (overflow); the loads, properties or factors are out of range")]
    NonFinite { case: String, what: &'static str },
    /// A job whose memory, estimated before allocating, exceeds the
    /// machine's (issue 22, item 9).
    #[error("{what} needs about {needed_gib:.1} GiB, more than this machine's {available_gib:.1} GiB of memory; {advice}")]
    TooLarge {
        what: String,
        needed_gib: f64,
        available_gib: f64,
        advice: &'static str,
    },
}

/// The machine's physical memory, bytes (`u64::MAX` when unknown).
pub fn physical_memory() -> u64 {
    // SAFETY: sysconf has no preconditions.
    let (pages, size) = unsafe {
        (
            libc::sysconf(libc::_SC_PHYS_PAGES),
            libc::sysconf(libc::_SC_PAGESIZE),
        )
    };
    if pages > 0 && size > 0 {
        (pages as u64).saturating_mul(size as u64)
    } else {
        u64::MAX
    }
}

/// Refuse a job of `needed` bytes (computed in f64, so no overflow) above
/// the physical memory, before anything is allocated.
pub fn check_memory(
    needed: f64,
    what: impl FnOnce() -> String,
    advice: &'static str,
) -> Result<(), AnalysisError> {
    let available = physical_memory() as f64;
    if needed > available {
        const GIB: f64 = 1024.0 * 1024.0 * 1024.0;
        return Err(AnalysisError::TooLarge {
            what: what(),
            needed_gib: needed / GIB,
            available_gib: available / GIB,
            advice,
        });
    }
    Ok(())
}

/// The results of one load case, all in SI.
#[derive(Clone, Debug, PartialEq)]
pub struct CaseResult {
    pub id: String,
    /// Global displacement of every node, m (zero for nodes no member meets).
    pub displacements: Vec<[f64; 2]>,
    /// Axial force of every member, N, tension positive.
    pub forces: Vec<f64>,
    /// Reaction of every support (order of `model.supports`), N, global.
    pub reactions: Vec<[f64; 2]>,
    /// Largest |K·u − f| over the free DOFs, N.
    pub residual: f64,
    /// `residual` divided by the largest applied or member force.
    pub relative_residual: f64,
    /// Sum of applied loads and of reactions, N (they should cancel).
    pub load_sum: [f64; 2],
    pub reaction_sum: [f64; 2],
    /// The force scale of the case, N: the largest applied load, member
    /// force or imposed-elongation force. Values far below it are round-off.
    pub force_scale: f64,
}

/// A model made ready to solve: DOFs, stiffness, factorization.
pub struct Prepared {
    pub dofs: Dofs,
    pub k: Csc,
    pub factor: Factor,
    rows: Vec<BRow>,
    stiff: Vec<f64>,
    /// Unit vector of each member, computed once for every case recovered.
    dirs: Vec<[f64; 2]>,
}

/// Everything `solve` reports.
pub struct Analysis {
    pub prepared: Prepared,
    pub cases: Vec<CaseResult>,
    /// Warnings about accuracy (ill-conditioning), for the report.
    pub warnings: Vec<String>,
}

/// The error for a failed factorization: a mechanism named by the node and
/// direction that move most in its free motion (the null vector of K), or
/// a rigid-body motion of the whole truss.
pub(crate) fn mechanism(model: &Model, dofs: &Dofs, e: FactorError) -> AnalysisError {
    use super::mechanism::{direction_name, free_motion, nearest_node, Rigid};
    match e {
        FactorError::Singular {
            dof,
            pivot_ratio,
            mode,
        } => {
            let Some(mode) = mode else {
                return AnalysisError::Mechanism {
                    node: model.nodes[dofs.node[dof] as usize].id.clone(),
                    direction: dofs.direction_name(dof),
                    pivot_ratio,
                };
            };
            let motion = free_motion(model, dofs, &mode);
            match motion.rigid {
                Some(Rigid::Translation(d)) => AnalysisError::RigidBody {
                    motion: format!("move in {}", direction_name(d)),
                },
                Some(Rigid::Rotation(p)) => {
                    let (n, dist) = nearest_node(model, p);
                    let scale = model
                        .nodes
                        .iter()
                        .fold(0.0f64, |a, q| a.max(q.x.abs()).max(q.y.abs()));
                    let near = if dist <= 1e-6 * scale.max(1e-9) {
                        "about node"
                    } else {
                        "about a point near node"
                    };
                    AnalysisError::RigidBody {
                        motion: format!("rotate {near} \"{}\"", model.nodes[n].id),
                    }
                }
                None => AnalysisError::Mechanism {
                    node: model.nodes[dofs.node[motion.dof] as usize].id.clone(),
                    direction: dofs.direction_name(motion.dof),
                    pivot_ratio,
                },
            }
        }
        FactorError::NotPositive { dof } => AnalysisError::IllConditioned {
            node: model.nodes[dofs.node[dof] as usize].id.clone(),
            direction: dofs.direction_name(dof),
        },
        FactorError::Internal => AnalysisError::Internal,
    }
}

/// The free motion of a model that is a mechanism (node displacements of
/// the null vector of K, largest DOF entry 1), or None when K factors.
pub fn free_motion(model: &Model) -> Option<super::mechanism::FreeMotion> {
    let dofs = Dofs::new(model);
    let k = stiffness(model, &dofs);
    let err = Symbolic::new(&k).and_then(|s| s.factor(&k)).err()?;
    match err {
        FactorError::Singular {
            mode: Some(mode), ..
        } => Some(super::mechanism::free_motion(model, &dofs, &mode)),
        _ => None,
    }
}

impl Prepared {
    pub fn new(model: &Model) -> Result<Prepared, AnalysisError> {
        use crate::timing::stage;
        let dofs = stage("DOF numbering", || Dofs::new(model));
        let k = stage("assembly", || stiffness(model, &dofs));
        let symbolic = stage("symbolic factorization", || Symbolic::new(&k))
            .map_err(|e| mechanism(model, &dofs, e))?;
        Self::with_symbolic(model, dofs, k, &symbolic)
    }

    /// Numeric factorization reusing a symbolic analysis of the same pattern.
    pub fn with_symbolic(
        model: &Model,
        dofs: Dofs,
        k: Csc,
        symbolic: &Symbolic,
    ) -> Result<Prepared, AnalysisError> {
        let stiff = (0..model.members.len())
            .map(|m| model.axial_stiffness(m))
            .collect();
        Self::with_stiffness(model, dofs, k, symbolic, stiff)
    }

    /// [`Prepared::with_symbolic`] with each member's axial stiffness given
    /// (`k` assembled with the same): zero for a slack tension-only member
    /// of the active-set iteration, which then carries no force.
    pub fn with_stiffness(
        model: &Model,
        dofs: Dofs,
        k: Csc,
        symbolic: &Symbolic,
        stiff: Vec<f64>,
    ) -> Result<Prepared, AnalysisError> {
        let factor = crate::timing::stage("numeric factorization", || symbolic.factor(&k))
            .map_err(|e| mechanism(model, &dofs, e))?;
        let rows = (0..model.members.len())
            .map(|m| b_row(model, &dofs, m))
            .collect();
        let dirs = (0..model.members.len())
            .map(|m| model.direction(m))
            .collect();
        Ok(Prepared {
            dofs,
            k,
            factor,
            rows,
            stiff,
            dirs,
        })
    }

    pub fn n(&self) -> usize {
        self.dofs.len()
    }

    /// Prescribed displacement of each node along its restrained directions.
    fn settlement(&self, model: &Model, case: &LoadCase) -> Vec<[f64; 2]> {
        let mut delta = vec![[0.0; 2]; model.nodes.len()];
        for s in &case.settlements {
            let mut d = [s.dx, s.dy];
            for q in self.dofs.of_node(s.node) {
                let dir = self.dofs.direction[q];
                let along = d[0] * dir[0] + d[1] * dir[1];
                d[0] -= along * dir[0];
                d[1] -= along * dir[1];
            }
            delta[s.node] = d;
        }
        delta
    }

    /// Elongation each member is forced to have apart from the free DOFs:
    /// settlement of its ends less its stress-free elongation.
    fn imposed(&self, model: &Model, case: &LoadCase, delta: &[[f64; 2]]) -> Vec<f64> {
        let mut e = vec![0.0; model.members.len()];
        if !case.settlements.is_empty() {
            for (m, mem) in model.members.iter().enumerate() {
                let c = self.dirs[m];
                let (a, b) = (delta[mem.start], delta[mem.end]);
                e[m] = c[0] * (b[0] - a[0]) + c[1] * (b[1] - a[1]);
            }
        }
        for ie in &case.elongations {
            e[ie.member] -= ie.elongation;
        }
        e
    }

    /// The load vector of a case on the free DOFs.
    pub fn load_vector(&self, model: &Model, case: &LoadCase, out: &mut [f64]) {
        out.iter_mut().for_each(|v| *v = 0.0);
        for l in &case.nodal {
            for q in self.dofs.of_node(l.node) {
                let d = self.dofs.direction[q];
                out[q] += l.fx * d[0] + l.fy * d[1];
            }
        }
        if !case.settlements.is_empty() || !case.elongations.is_empty() {
            let delta = self.settlement(model, case);
            let imposed = self.imposed(model, case, &delta);
            for (m, &e) in imposed.iter().enumerate() {
                if e != 0.0 {
                    for (q, b) in self.rows[m].iter() {
                        out[q] -= self.stiff[m] * e * b;
                    }
                }
            }
        }
    }

    /// Solve every case on the one factorization, all right-hand sides as one block.
    pub fn solve_cases(
        &self,
        model: &Model,
        cases: &[LoadCase],
    ) -> Result<Vec<CaseResult>, AnalysisError> {
        Ok(self.solve_cases_with(model, cases, None)?.0)
    }

    /// [`Prepared::solve_cases`], solving one further right-hand side
    /// `extra` (length n) in the same block — a block solve reads the factor
    /// once for all its columns — and returning its solution.
    pub fn solve_cases_with(
        &self,
        model: &Model,
        cases: &[LoadCase],
        extra: Option<Vec<f64>>,
    ) -> Result<(Vec<CaseResult>, Option<Vec<f64>>), AnalysisError> {
        let n = self.n();
        let extra = extra.filter(|e| e.len() == n);
        let columns = cases.len() + usize::from(extra.is_some());
        // The block of right-hand sides and each case's results (nodes ×
        // 2 displacements, member forces, support reactions), 8 bytes each.
        let per_case = n + 2 * model.nodes.len() + model.members.len() + 2 * model.supports.len();
        check_memory(
            8.0 * columns as f64 * per_case as f64,
            || {
                format!(
                    "solving {} load cases of {n} degrees of freedom at once",
                    cases.len()
                )
            },
            "split the load cases over several model files or sweep shards",
        )?;
        let mut rhs = Vec::new();
        rhs.try_reserve_exact(n * columns)
            .map_err(|_| AnalysisError::TooLarge {
                what: format!(
                    "solving {} load cases of {n} degrees of freedom",
                    cases.len()
                ),
                needed_gib: 8.0 * (n * columns) as f64 / (1u64 << 30) as f64,
                available_gib: physical_memory() as f64 / (1u64 << 30) as f64,
                advice: "the memory could not be allocated; split the load cases",
            })?;
        rhs.resize(n * columns, 0.0);
        for (c, case) in cases.iter().enumerate() {
            self.load_vector(model, case, &mut rhs[c * n..(c + 1) * n]);
        }
        if let Some(e) = &extra {
            rhs[cases.len() * n..].copy_from_slice(e);
        }
        self.factor.solve_in_place(&mut rhs, columns);
        // Variants are recovered on all cores (each is independent); a
        // single large case is recovered on one.
        use rayon::prelude::*;
        let results = cases
            .par_iter()
            .enumerate()
            .with_min_len(16)
            .map(|(c, case)| self.recover(model, case, &rhs[c * n..(c + 1) * n]))
            .collect::<Vec<_>>()
            .into_iter()
            // The first failing case in order, as a serial loop would report.
            .collect::<Result<Vec<_>, _>>()?;
        let solved = extra.map(|_| rhs[cases.len() * n..].to_vec());
        Ok((results, solved))
    }

    /// Member forces, reactions, displacements and the equilibrium check
    /// from the free-DOF solution `q` of `case`.
    pub fn recover(
        &self,
        model: &Model,
        case: &LoadCase,
        q: &[f64],
    ) -> Result<CaseResult, AnalysisError> {
        let nn = model.nodes.len();
        let delta = self.settlement(model, case);
        // Plain nodal loads (the usual case, and every variant of a sweep)
        // impose no elongation: skip the per-member pass.
        let imposed = if case.settlements.is_empty() && case.elongations.is_empty() {
            None
        } else {
            Some(self.imposed(model, case, &delta))
        };
        let mut displacements = delta;
        for (d, &v) in q.iter().enumerate() {
            let node = self.dofs.node[d] as usize;
            let dir = self.dofs.direction[d];
            displacements[node][0] += v * dir[0];
            displacements[node][1] += v * dir[1];
        }
        let mut forces = Vec::with_capacity(model.members.len());
        // Net force on each node from members and loads; zero at free nodes.
        let mut net = vec![[0.0f64; 2]; nn];
        let mut largest: f64 = 0.0;
        for (m, mem) in model.members.iter().enumerate() {
            let e: f64 = self.rows[m].iter().map(|(d, b)| b * q[d]).sum::<f64>()
                + imposed.as_ref().map_or(0.0, |v| v[m]);
            let force = self.stiff[m] * e;
            forces.push(force);
            // The imposed part enters the nodal sums too; its size sets the
            // round-off scale even when the net force is zero (a free
            // thermal expansion of a determinate truss).
            largest = largest
                .max(force.abs())
                .max((self.stiff[m] * imposed.as_ref().map_or(0.0, |v| v[m])).abs());
            let c = self.dirs[m];
            net[mem.start][0] += force * c[0];
            net[mem.start][1] += force * c[1];
            net[mem.end][0] -= force * c[0];
            net[mem.end][1] -= force * c[1];
        }
        let mut load_sum = [0.0; 2];
        for l in &case.nodal {
            net[l.node][0] += l.fx;
            net[l.node][1] += l.fy;
            load_sum[0] += l.fx;
            load_sum[1] += l.fy;
            largest = largest.max(l.fx.hypot(l.fy));
        }
        // Residual along the free directions.
        let mut residual: f64 = 0.0;
        for d in 0..q.len() {
            let node = self.dofs.node[d] as usize;
            let dir = self.dofs.direction[d];
            residual = residual.max((net[node][0] * dir[0] + net[node][1] * dir[1]).abs());
        }
        let mut reaction_sum = [0.0; 2];
        let reactions: Vec<[f64; 2]> = model
            .supports
            .iter()
            .map(|s| {
                // Only the restrained directions carry a reaction: remove the
                // free part, which is round-off already counted in `residual`.
                let mut r = [-net[s.node][0], -net[s.node][1]];
                if let Some(d) = s.restraint.free_direction() {
                    let along = r[0] * d[0] + r[1] * d[1];
                    r[0] -= along * d[0];
                    r[1] -= along * d[1];
                }
                reaction_sum[0] += r[0];
                reaction_sum[1] += r[1];
                r
            })
            .collect();
        let relative = if largest > 0.0 {
            residual / largest
        } else {
            0.0
        };
        let overflow = if !forces.iter().all(|f| f.is_finite()) {
            Some("member force")
        } else if !displacements.iter().flatten().all(|v| v.is_finite()) {
            Some("displacement")
        } else if !reactions.iter().flatten().all(|v| v.is_finite()) {
            Some("reaction")
        } else {
            None
        };
        if let Some(what) = overflow {
            return Err(AnalysisError::NonFinite {
                case: case.id.clone(),
                what,
            });
        }
        if relative.is_nan() || relative > RESIDUAL_LIMIT {
            return Err(AnalysisError::Residual {
                case: case.id.clone(),
                relative,
                limit: RESIDUAL_LIMIT,
            });
        }
        Ok(CaseResult {
            id: case.id.clone(),
            displacements,
            forces,
            reactions,
            residual,
            relative_residual: relative,
            load_sum,
            reaction_sum,
            force_scale: largest,
        })
    }
}

/// Analyse every load case of a validated model.
///
/// Work that needs no factor runs beside the symbolic factorization (a
/// single-threaded ordering): the layout warnings and the power iteration
/// for λmax of the condition estimate. The first inverse-iteration step of
/// the estimate is solved in the same block as the load cases.
/// The smallest-pivot warning of a factorization, if it is ill-conditioned.
fn pivot_warning(model: &Model, prepared: &Prepared) -> Option<String> {
    let ratio = prepared.factor.min_pivot_ratio;
    (ratio < CONDITION_WARNING_RATIO).then(|| {
        let dof = prepared.factor.min_pivot_dof;
        format!(
            "ill-conditioned stiffness: smallest pivot ratio {ratio:.1e} at node \"{}\" ({}); about {:.0} of 16 digits may be lost",
            model.nodes[prepared.dofs.node[dof] as usize].id,
            prepared.dofs.direction_name(dof),
            (1.0 / ratio).log10()
        )
    })
}

/// The analysis warnings a command that only factors (influence lines,
/// envelopes) can give without solving the load cases: the smallest pivot
/// and the layout checks (near-mechanism, shallow layout). The condition
/// estimate needs the cases' block solve and is left to `analyse`.
pub fn prepared_warnings(model: &Model, prepared: &Prepared) -> Vec<String> {
    let mut w: Vec<String> = pivot_warning(model, prepared).into_iter().collect();
    w.extend(super::conditioning::layout_warnings(model, &prepared.dofs));
    w
}

pub fn analyse(model: &Model) -> Result<Analysis, AnalysisError> {
    analyse_beside(model, || ()).0
}

/// [`analyse`], running `beside` on the second core during the symbolic
/// factorization (one core's work, about 1 s at 10⁶ DOF); `beside` must
/// not need the analysis. Its result comes back even if the analysis fails.
pub fn analyse_beside<T: Send>(
    model: &Model,
    beside: impl FnOnce() -> T + Send,
) -> (Result<Analysis, AnalysisError>, T) {
    let (mut beside, mut other) = (Some(beside), None);
    let a = analyse_with(model, || other = beside.take().map(|f| f()));
    // Should the analysis have stopped before the symbolic step, run it now.
    let other = match (other, beside) {
        (Some(t), _) => t,
        (None, Some(f)) => f(),
        (None, None) => unreachable!("the closure was taken and so ran"),
    };
    (a, other)
}

fn analyse_with(model: &Model, beside: impl FnOnce() + Send) -> Result<Analysis, AnalysisError> {
    use super::conditioning;
    if model.has_tension_only() {
        beside();
        return super::active_set::analyse(model);
    }
    use crate::timing::stage;
    let dofs = stage("DOF numbering", || Dofs::new(model));
    let k = stage("assembly", || stiffness(model, &dofs));
    let (symbolic, (layout_warnings, lambda_max)) = stage("symbolic factorization", || {
        rayon::join(
            || Symbolic::new(&k),
            || {
                beside();
                (
                    conditioning::layout_warnings(model, &dofs),
                    conditioning::lambda_max(&k),
                )
            },
        )
    });
    let symbolic = symbolic.map_err(|e| mechanism(model, &dofs, e))?;
    let prepared = Prepared::with_symbolic(model, dofs, k, &symbolic)?;
    let probe = lambda_max.and(conditioning::first_probe(&prepared.k));
    let (cases, first) = stage("solve + member forces", || {
        prepared.solve_cases_with(model, &model.cases, probe)
    })?;
    let mut warnings: Vec<String> = pivot_warning(model, &prepared).into_iter().collect();
    warnings.extend(layout_warnings);
    let estimate = stage("condition estimate", || {
        lambda_max.and_then(|l| conditioning::estimate_with(&prepared, l, first))
    });
    warnings.extend(conditioning::condition_warning(estimate));
    Ok(Analysis {
        prepared,
        cases,
        warnings,
    })
}
