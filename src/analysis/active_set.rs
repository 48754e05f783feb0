//! Tension-only members (eyebars, rods, counters) by an active-set
//! iteration (issue 16).
//!
//! A tension-only member is either taut (in the stiffness with its EA/L,
//! force N = EA/L·(e − e₀) ≥ 0) or slack (out of the stiffness, force 0,
//! and its trial force EA/L·(e − e₀) from the displacements ≤ 0: it would
//! lengthen less than its slack). e₀ is the member's stress-free
//! elongation: its `slack` (positive slack, negative drawn up) plus any
//! lack of fit or temperature of the state, as `loads/thermal.rs` takes it.
//!
//! The iteration starts with every tension-only member taut (or from a
//! given set), solves, and updates all at once: a taut member in
//! compression goes slack, a slack member whose trial force is tension is
//! taken back. It stops when nothing changes (the Signorini conditions
//! N ≥ 0, trial ≤ 0 when slack, hold for every member: the solution of the
//! piecewise-linear problem). Should the all-at-once update leave a
//! mechanism, only the most compressed member is let go instead; a
//! mechanism then is the truss's own (the load cannot be carried without a
//! member pushing): [`AnalysisError::SlackMechanism`], naming the slack
//! members and the node and direction as `analysis/mechanism.rs` does. A set
//! seen before is cycling: [`AnalysisError::Cycling`].
//!
//! A slack member is given zero stiffness rather than removed, so the
//! sparsity pattern of K never changes and the one symbolic factorization
//! of `solve.rs` serves every iteration and every state of the model.
//! A force within 10⁻⁹ of the state's force scale of zero keeps the
//! member as it is (round-off must not flip it back and forth).

use super::assemble::{b_row, stiffness, Csc};
use super::dofs::Dofs;
use super::results::{prepared_warnings, Analysis, AnalysisError, CaseResult, Prepared};
use super::solve::Symbolic;
use crate::model::{InitialElongation, LoadCase, Model};

/// Relative force below which a tension-only member is at zero force.
pub const ZERO_FORCE: f64 = 1e-9;
/// Iterations after which the iteration gives up as cycling.
pub const MAX_ITERATIONS: usize = 200;

/// A solved state: the results with the slack members known.
#[derive(Clone, Debug)]
pub struct State {
    pub result: CaseResult,
    /// Per member: true for a slack tension-only member.
    pub slack: Vec<bool>,
    /// Iterations taken (1: the first set held).
    pub iterations: usize,
}

impl State {
    /// Ids of the slack members, for a report.
    pub fn slack_ids(&self, model: &Model) -> Vec<String> {
        slack_names(model, &self.slack)
    }
}

fn slack_names(model: &Model, slack: &[bool]) -> Vec<String> {
    (0..slack.len())
        .filter(|&m| slack[m])
        .map(|m| model.members[m].id.to_string())
        .collect()
}

/// The one symbolic factorization of a model's full stiffness pattern and
/// what each active set needs to assemble its K.
pub struct Solver<'a> {
    model: &'a Model,
    dofs: Dofs,
    pattern: Csc,
    symbolic: Symbolic,
    full: Vec<f64>,
    tension_only: Vec<usize>,
    /// Factorizations by set of slack members: a trace over many vehicle
    /// positions meets the same few sets again and again.
    cache: std::cell::RefCell<std::collections::HashMap<Vec<bool>, std::rc::Rc<Prepared>>>,
}

/// Sets of slack members whose factorizations are kept.
const CACHE_SETS: usize = 64;

impl<'a> Solver<'a> {
    pub fn new(model: &'a Model) -> Result<Solver<'a>, AnalysisError> {
        let dofs = Dofs::new(model);
        let pattern = stiffness(model, &dofs);
        let symbolic =
            Symbolic::new(&pattern).map_err(|e| super::results::mechanism(model, &dofs, e))?;
        let full = (0..model.members.len())
            .map(|m| model.axial_stiffness(m))
            .collect();
        let tension_only = (0..model.members.len())
            .filter(|&m| model.members[m].tension_only)
            .collect();
        Ok(Solver {
            model,
            dofs,
            pattern,
            symbolic,
            full,
            tension_only,
            cache: Default::default(),
        })
    }

    pub fn model(&self) -> &'a Model {
        self.model
    }

    /// The tension-only members, by index.
    pub fn tension_only(&self) -> &[usize] {
        &self.tension_only
    }

    /// K and the member stiffnesses with the `slack` members at zero,
    /// factored on the shared symbolic analysis.
    /// Kept for the next call with the same set (up to [`CACHE_SETS`]).
    pub fn prepared(&self, slack: &[bool]) -> Result<std::rc::Rc<Prepared>, AnalysisError> {
        if let Some(p) = self.cache.borrow().get(slack) {
            return Ok(p.clone());
        }
        let (k, stiff) = self.assemble(slack);
        let p = std::rc::Rc::new(Prepared::with_stiffness(
            self.model,
            self.dofs.clone(),
            k,
            &self.symbolic,
            stiff,
        )?);
        let mut cache = self.cache.borrow_mut();
        if cache.len() >= CACHE_SETS {
            cache.clear();
        }
        cache.insert(slack.to_vec(), p.clone());
        Ok(p)
    }

    /// K (full pattern) and the member stiffnesses with `slack` at zero.
    fn assemble(&self, slack: &[bool]) -> (Csc, Vec<f64>) {
        let model = self.model;
        let stiff: Vec<f64> = self
            .full
            .iter()
            .zip(slack)
            .map(|(&k, &s)| if s { 0.0 } else { k })
            .collect();
        let mut k = self.pattern.clone();
        k.values.iter_mut().for_each(|v| *v = 0.0);
        for (m, &km) in stiff.iter().enumerate() {
            if km == 0.0 {
                continue;
            }
            let b = b_row(model, &self.dofs, m);
            for (p, bp) in b.iter() {
                for (q, bq) in b.iter() {
                    if p <= q {
                        let (lo, hi) = (k.col_ptr[q], k.col_ptr[q + 1]);
                        let at = k.row_idx[lo..hi]
                            .binary_search(&p)
                            .expect("the full pattern holds every member entry");
                        k.values[lo + at] += km * bp * bq;
                    }
                }
            }
        }
        (k, stiff)
    }

    /// With the set `slack` a mechanism: the slack members its free motion
    /// takes up. The truss moves freely (at no load) in the null vector of
    /// K, in the sense in which `push` does positive work, until a slack
    /// member lengthens by its slack; every slack member that lengthens in
    /// that motion is taken back (those that need not be are let go again
    /// by the iteration). None when no slack member lengthens, or the set is
    /// not a mechanism: the truss cannot carry the load without a member
    /// pushing.
    pub fn take_up(&self, slack: &[bool], push: &LoadCase) -> Option<Vec<bool>> {
        use super::solve::FactorError;
        let (k, _) = self.assemble(slack);
        let Err(FactorError::Singular {
            mode: Some(mode), ..
        }) = self.symbolic.factor(&k)
        else {
            return None;
        };
        let u = super::mechanism::free_motion(self.model, &self.dofs, &mode).displacements;
        let work: f64 = push
            .nodal
            .iter()
            .map(|l| l.fx * u[l.node][0] + l.fy * u[l.node][1])
            .sum();
        if work == 0.0 || !work.is_finite() {
            return None;
        }
        let sign = work.signum();
        let mut next = slack.to_vec();
        let mut any = false;
        for &m in &self.tension_only {
            if !slack[m] {
                continue;
            }
            let mem = &self.model.members[m];
            let c = self.model.direction(m);
            let (a, b) = (u[mem.start], u[mem.end]);
            // The mode is scaled to a largest entry of 1: a lengthening
            // below 10⁻⁹ of it is round-off.
            if sign * (c[0] * (b[0] - a[0]) + c[1] * (b[1] - a[1])) > 1e-9 {
                next[m] = false;
                any = true;
            }
        }
        any.then_some(next)
    }

    /// The state `case` with the members' own slack added as stress-free
    /// elongations (once per state).
    pub fn with_slack(&self, case: &LoadCase) -> LoadCase {
        let mut c = case.clone();
        c.elongations.extend(
            self.model
                .slack
                .iter()
                .map(|&(member, e)| InitialElongation {
                    member,
                    elongation: e,
                }),
        );
        c
    }

    /// Solve one load state (a case, or a combination made into one case)
    /// by the active-set iteration, starting from `start` (slack flags per
    /// member) or with every member taut.
    pub fn solve(&self, case: &LoadCase, start: Option<&[bool]>) -> Result<State, AnalysisError> {
        let model = self.model;
        let state = self.with_slack(case);
        let mut slack = start.map_or_else(|| vec![false; model.members.len()], <[bool]>::to_vec);
        let mut seen: Vec<Vec<bool>> = Vec::new();
        for iteration in 1..=MAX_ITERATIONS {
            let (result, used) = self.solve_set(&state, &slack, &seen)?;
            slack = used;
            let next = self.update(&state, &result, &slack);
            if next == slack {
                return Ok(State {
                    result,
                    slack,
                    iterations: iteration,
                });
            }
            seen.push(std::mem::replace(&mut slack, next));
            if seen.contains(&slack) {
                return Err(AnalysisError::Cycling {
                    state: describe(case),
                    slack: slack_names(model, &slack).join(", "),
                    iterations: iteration,
                });
            }
        }
        Err(AnalysisError::Cycling {
            state: describe(case),
            slack: slack_names(model, &slack).join(", "),
            iterations: MAX_ITERATIONS,
        })
    }

    /// Solve with the set `slack`; should it be a mechanism, step back to
    /// the last set seen and let go only its most compressed member.
    fn solve_set(
        &self,
        state: &LoadCase,
        slack: &[bool],
        seen: &[Vec<bool>],
    ) -> Result<(CaseResult, Vec<bool>), AnalysisError> {
        match self.solve_once(state, slack) {
            Ok(r) => Ok((r, slack.to_vec())),
            Err(e @ (AnalysisError::Mechanism { .. } | AnalysisError::RigidBody { .. })) => {
                // A slack member with its slack still to take up: the truss
                // moves freely until it does, then carries the load.
                if let Some(next) = self.take_up(slack, state) {
                    return self.solve_set(state, &next, seen);
                }
                let fallback = seen.last().and_then(|prev| {
                    let r = self.solve_once(state, prev).ok()?;
                    let m = self
                        .tension_only
                        .iter()
                        .copied()
                        .filter(|&m| !prev[m] && r.forces[m] < 0.0)
                        .min_by(|&a, &b| r.forces[a].total_cmp(&r.forces[b]))?;
                    let mut one = prev.clone();
                    one[m] = true;
                    (one.as_slice() != slack).then_some(one)
                });
                match fallback {
                    Some(one) => self.solve_set(state, &one, &[]),
                    None => Err(self.slack_mechanism(state, slack, e)),
                }
            }
            Err(e) => Err(e),
        }
    }

    fn solve_once(&self, state: &LoadCase, slack: &[bool]) -> Result<CaseResult, AnalysisError> {
        let p = self.prepared(slack)?;
        let mut r = p.solve_cases(self.model, std::slice::from_ref(state))?;
        Ok(r.pop().expect("one state, one result"))
    }

    /// The typed error for a set that is a mechanism (`e` the plain
    /// mechanism error of its factorization).
    pub fn slack_mechanism(
        &self,
        case: &LoadCase,
        slack: &[bool],
        e: AnalysisError,
    ) -> AnalysisError {
        let motion = match e {
            AnalysisError::Mechanism {
                node, direction, ..
            } => format!("node \"{node}\" is free to move in {direction}"),
            AnalysisError::RigidBody { motion } => format!("the whole truss is free to {motion}"),
            other => return other,
        };
        let names = slack_names(self.model, slack);
        AnalysisError::SlackMechanism {
            state: describe(case),
            slack: if names.is_empty() {
                "(none)".into()
            } else {
                names.join(", ")
            },
            motion,
        }
    }

    /// The set the result asks for: taut members in compression let go,
    /// slack members that would be stretched taken back.
    fn update(&self, state: &LoadCase, r: &CaseResult, slack: &[bool]) -> Vec<bool> {
        let tol = ZERO_FORCE * r.force_scale;
        let mut next = slack.to_vec();
        for &m in &self.tension_only {
            next[m] = if slack[m] {
                self.trial_force(state, r, m) <= tol
            } else {
                r.forces[m] < -tol
            };
        }
        next
    }

    /// EA/L·(e − e₀) of member `m` from the displacements of `r`: what it
    /// would carry were it taut.
    pub fn trial_force(&self, state: &LoadCase, r: &CaseResult, m: usize) -> f64 {
        let mem = &self.model.members[m];
        let c = self.model.direction(m);
        let (a, b) = (r.displacements[mem.start], r.displacements[mem.end]);
        let e0: f64 = state
            .elongations
            .iter()
            .filter(|ie| ie.member == m)
            .map(|ie| ie.elongation)
            .sum();
        self.full[m] * (c[0] * (b[0] - a[0]) + c[1] * (b[1] - a[1]) - e0)
    }
}

fn describe(case: &LoadCase) -> String {
    format!("load state \"{}\"", case.id)
}

/// A load state made of factored cases: nodal loads, settlements and
/// elongations each times its factor (impact already in the factor).
pub fn factored_state(model: &Model, id: &str, terms: &[(usize, f64)]) -> LoadCase {
    let mut out = LoadCase {
        id: id.to_string(),
        ..Default::default()
    };
    for &(c, f) in terms {
        let case = &model.cases[c];
        out.nodal
            .extend(case.nodal.iter().map(|l| crate::model::NodalLoad {
                node: l.node,
                fx: f * l.fx,
                fy: f * l.fy,
            }));
        out.settlements
            .extend(case.settlements.iter().map(|s| crate::model::Settlement {
                node: s.node,
                dx: f * s.dx,
                dy: f * s.dy,
            }));
        out.elongations
            .extend(case.elongations.iter().map(|e| InitialElongation {
                member: e.member,
                elongation: f * e.elongation,
            }));
    }
    out
}

/// A combination's load cases as one state: each case times its factor,
/// live cases also times 1 + impact (as `rate` combines them). A moving
/// load it names is not included (it is rolled position by position).
pub fn combination_state(model: &Model, combo: &crate::model::Combination) -> LoadCase {
    let terms: Vec<(usize, f64)> = combo
        .factors
        .iter()
        .map(|&(c, f)| {
            let case = &model.cases[c];
            if case.kind == crate::model::CaseKind::Live {
                (c, f * (1.0 + case.impact))
            } else {
                (c, f)
            }
        })
        .collect();
    factored_state(model, &combo.id, &terms)
}

/// Every combination of the model solved whole by the iteration, with its
/// state (for drawings and reports of a model with tension-only members).
pub fn combination_results(model: &Model) -> Result<Vec<(LoadCase, State)>, AnalysisError> {
    let solver = Solver::new(model)?;
    let dead = solver.solve(&dead_state(model), None)?;
    model
        .combinations
        .iter()
        .map(|c| {
            let state = combination_state(model, c);
            let s = solver.solve(&state, Some(&dead.slack))?;
            Ok((state, s))
        })
        .collect()
}

/// The dead-load state: the model's dead cases together, unfactored.
pub fn dead_state(model: &Model) -> LoadCase {
    let terms: Vec<(usize, f64)> = model.dead_cases().into_iter().map(|c| (c, 1.0)).collect();
    factored_state(model, "dead load", &terms)
}

/// The factorization of the dead-load state's active set, and the ids of
/// its slack members: what influence lines of a model with tension-only
/// members are computed on (they hold only while that set does).
pub fn dead_prepared(model: &Model) -> Result<(Prepared, Vec<String>), AnalysisError> {
    let solver = Solver::new(model)?;
    let dead = solver.solve(&dead_state(model), None)?;
    let (k, stiff) = solver.assemble(&dead.slack);
    let p = Prepared::with_stiffness(model, solver.dofs.clone(), k, &solver.symbolic, stiff)?;
    Ok((p, dead.slack_ids(model)))
}

/// The label influence lines of a model with tension-only members carry.
pub fn influence_label(slack: &[String]) -> String {
    format!(
        "tension-only members: influence lines of the dead-load active set{} (they hold while that set does; `rate` and `envelope` solve each vehicle position whole)",
        if slack.is_empty() {
            " (no member slack)".to_string()
        } else {
            format!(" (slack: {})", slack.join(", "))
        }
    )
}

/// [`super::analyse`] for a model with tension-only members: each case
/// solved on its own by the iteration; the `prepared` kept is that of the
/// dead-load state's active set (for influence lines and envelopes). A
/// warning per case names its slack members.
pub fn analyse(model: &Model) -> Result<Analysis, AnalysisError> {
    let solver = Solver::new(model)?;
    let dead = solver.solve(&dead_state(model), None)?;
    let mut cases = Vec::with_capacity(model.cases.len());
    let mut warnings = Vec::new();
    for case in &model.cases {
        let s = solver.solve(case, Some(&dead.slack))?;
        let ids = s.slack_ids(model);
        if !ids.is_empty() {
            warnings.push(format!(
                "load case \"{}\": tension-only members slack (carry no force): {}",
                case.id,
                ids.join(", ")
            ));
        }
        cases.push(s.result);
    }
    let (k, stiff) = solver.assemble(&dead.slack);
    let prepared =
        Prepared::with_stiffness(model, solver.dofs.clone(), k, &solver.symbolic, stiff)?;
    warnings.extend(prepared_warnings(model, &prepared));
    warnings.push(
        "tension-only members: each case solved by the active-set iteration (superposition does not hold)".into(),
    );
    Ok(Analysis {
        prepared,
        cases,
        warnings,
    })
}
