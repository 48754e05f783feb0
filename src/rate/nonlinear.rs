//! Rating a model with tension-only members (issue 16), where superposition
//! no longer holds: every state is solved whole by the active-set
//! iteration of `analysis/active_set.rs`.
//!
//! - load cases: as solved by `analyse` (each on its own);
//! - combinations: the whole factored load as one state (live cases times
//!   factor·(1 + impact)); where the method's minimum dead-load factors are
//!   below the written ones, the state with the dead cases at those minima
//!   too, each member taking the more severe of the two (the linear path
//!   applies the minimum member by member where the dead load relieves);
//! - moving loads: at every front-axle position of
//!   [`moving::positions`](crate::loads::moving::positions), each train of
//!   the vehicle and both directions, the dead load plus the axles times
//!   (1 + impact), placed on the deck nodes by the lever rule, solved
//!   together; each member's greatest and least force over the positions
//!   are its envelope. Lane, trailing and crowd loads and the leaving-off of
//!   relieving axles are refused ([`crate::loads::LoadError::TensionOnlyMoving`]);
//! - the rating factor is the live-load multiplier λ at which the member
//!   reaches its resistance when the factored dead load is applied first and
//!   λ·γL·(L + IM) then added, the active set followed along the way (see
//!   [`reach`]). Both the maximum and the minimum permanent-load factors are
//!   traced and the lower factor is kept. A model without tension-only
//!   members never comes here.

use super::checks::MemberCapacity;
use super::levels::{side_capacity, SideCapacity};
use super::{LoadEffect, MemberRating, RateError, Rating, Side};
use crate::analysis::active_set::{combination_state, dead_state, factored_state, Solver};
use crate::analysis::results::AnalysisError;
use crate::analysis::CaseResult;
use crate::loads::envelope_nonlinear::merge;
use crate::loads::moving::Placement;
use crate::method::{Level, Method};
use crate::model::{CaseKind, LoadCase, Model};

/// λ beyond which the trace stops: the member is not governed by this live load.
pub const LAMBDA_MAX: f64 = 1e4;
/// Most segments of one trace.
const MAX_SEGMENTS: usize = 10_000;

/// A member's resistances in the two senses, N (positive magnitudes;
/// infinite compression for a tension-only member, which goes slack first).
#[derive(Clone, Copy, Debug)]
pub struct Limit {
    pub tension: f64,
    pub compression: f64,
}

/// Where a member reaches its resistance: the multiplier and the sense.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Reached {
    pub lambda: f64,
    pub tension: bool,
    /// Not the member's resistance but the truss becoming a mechanism (its
    /// slack members out) at this λ.
    pub mechanism: bool,
}

/// One stretch of the response to `dead` + λ·`live` with the set of slack
/// members fixed: member forces N(λ) = `dead[m]` + λ·`live[m]` for
/// `start` ≤ λ ≤ `end` (the first segment also below 0, where the dead load
/// alone is beyond a resistance).
#[derive(Clone, Debug)]
pub struct Segment {
    pub start: f64,
    pub end: f64,
    pub dead: Vec<f64>,
    pub live: Vec<f64>,
}

/// The piecewise-linear response to `dead` + λ·`live`, λ from 0 to
/// [`LAMBDA_MAX`], and the λ where the truss itself gives way, if it does.
#[derive(Clone, Debug)]
pub struct Path {
    pub segments: Vec<Segment>,
    pub mechanism: Option<f64>,
}

impl Path {
    /// Member forces at `lambda` (on the segment holding it; the last one
    /// beyond its end).
    pub fn forces_at(&self, lambda: f64) -> Option<Vec<f64>> {
        let seg = self
            .segments
            .iter()
            .find(|s| lambda <= s.end)
            .or(self.segments.last())?;
        Some(
            seg.dead
                .iter()
                .zip(&seg.live)
                .map(|(d, l)| d + lambda * l)
                .collect(),
        )
    }
}

/// The response to `dead` + λ·`live`, the active set followed event by
/// event.
///
/// With the set of slack members fixed the response is linear in λ:
/// N(λ) = N_D + λ·N_L for a taut member, the trial force T(λ) = T_D + λ·T_L
/// for a slack one (one block solve of the two load vectors per segment).
/// The segment ends at the first event: a taut tension-only member's force
/// falling to zero (it goes slack) or a slack member's trial force rising
/// to zero (it takes up its slack); the member is flipped and the next
/// segment solved. Should a flip leave a mechanism that no slack member's
/// take-up stops, the truss itself gives way at that λ (`mechanism`). A set
/// of slack members seen twice at one λ is cycling.
pub fn path(solver: &Solver, dead: &LoadCase, live: &LoadCase) -> Result<Path, AnalysisError> {
    let model = solver.model();
    let nm = model.members.len();
    let first = solver.solve(dead, None)?;
    let mut slack = first.slack;
    let dead_s = solver.with_slack(dead);
    let mut lambda = 0.0f64;
    let mut seen_here: Vec<Vec<bool>> = Vec::new();
    let mut out = Path {
        segments: Vec::new(),
        mechanism: None,
    };
    for segment in 0..MAX_SEGMENTS {
        let p = match solver.prepared(&slack) {
            Ok(p) => p,
            Err(AnalysisError::Mechanism { .. } | AnalysisError::RigidBody { .. }) => {
                // A member let go at the event leaves the truss free to
                // move until a slack member takes up its slack (at the same
                // λ): take it up and go on; if none does, the truss itself
                // gives way here (a panel whose shear reverses with no
                // counter).
                match solver.take_up(&slack, live) {
                    Some(next) => {
                        slack = next;
                        continue;
                    }
                    None => {
                        out.mechanism = Some(lambda);
                        break;
                    }
                }
            }
            Err(e) => return Err(e),
        };
        let r = p.solve_cases(model, &[dead_s.clone(), live.clone()])?;
        let (d, l) = (&r[0], &r[1]);
        let eps = 1e-9 * lambda.abs().max(1.0);
        // The next event and the members flipping there.
        let mut next = f64::INFINITY;
        let mut flips: Vec<(usize, f64)> = Vec::new();
        for &m in solver.tension_only() {
            let (a, b) = if slack[m] {
                (
                    solver.trial_force(&dead_s, d, m),
                    solver.trial_force(live, l, m),
                )
            } else {
                (d.forces[m], l.forces[m])
            };
            let crossing = if slack[m] { b > 0.0 } else { b < 0.0 };
            if !crossing {
                continue;
            }
            let at = (-a / b).max(lambda);
            flips.push((m, at));
            next = next.min(at);
        }
        out.segments.push(Segment {
            start: lambda,
            end: next.min(LAMBDA_MAX),
            dead: d.forces.clone(),
            live: l.forces.clone(),
        });
        if !next.is_finite() || next > LAMBDA_MAX {
            break;
        }
        if next > lambda + eps {
            seen_here.clear();
        }
        lambda = next;
        for (m, at) in flips {
            if at <= next + 1e-9 * next.abs().max(1.0) {
                slack[m] = !slack[m];
            }
        }
        if seen_here.contains(&slack) {
            return Err(AnalysisError::Cycling {
                state: format!("the rating of live load \"{}\"", live.id),
                slack: (0..nm)
                    .filter(|&m| slack[m])
                    .map(|m| model.members[m].id.to_string())
                    .collect::<Vec<_>>()
                    .join(", "),
                iterations: segment + 1,
            });
        }
        seen_here.push(slack.clone());
    }
    Ok(out)
}

/// The multiplier λ at which each member reaches its resistance under
/// `dead` + λ·`live`, along the [`path`]: within a segment a member reaches
/// its resistance where N_D + λ·N_L = R (tension) or −R (compression). In
/// the first segment a negative λ is kept (the dead load alone beyond the
/// resistance, as the linear rating equation gives it). Members not reached
/// by [`LAMBDA_MAX`] get None. Where the truss itself gives way, every
/// member not yet reached gets that λ, marked `mechanism` (no rating above
/// it is faithful).
pub fn reach(path: &Path, limits: &[Limit]) -> Vec<Option<Reached>> {
    let mut out: Vec<Option<Reached>> = vec![None; limits.len()];
    for (si, seg) in path.segments.iter().enumerate() {
        let eps = 1e-9 * seg.start.abs().max(1.0);
        for (m, o) in out.iter_mut().enumerate() {
            if o.is_some() {
                continue;
            }
            let (a, b) = (seg.dead[m], seg.live[m]);
            if b == 0.0 {
                continue;
            }
            let (target, tension) = if b > 0.0 {
                (limits[m].tension, true)
            } else {
                (-limits[m].compression, false)
            };
            if !target.is_finite() {
                continue;
            }
            let at = (target - a) / b;
            let within = at <= seg.end && (si == 0 || at >= seg.start - eps);
            if within && at <= LAMBDA_MAX {
                *o = Some(Reached {
                    lambda: at,
                    tension,
                    mechanism: false,
                });
            }
        }
    }
    if let Some(lambda) = path.mechanism {
        for o in out.iter_mut().filter(|o| o.is_none()) {
            *o = Some(Reached {
                lambda,
                tension: true,
                mechanism: true,
            });
        }
    }
    out
}

/// A live load to rate or envelope: every placement as a load state of its
/// own (axle loads or case loads with the dynamic allowance, unfactored).
pub(crate) struct Live {
    pub(crate) id: String,
    pub(crate) legal: bool,
    /// Index into `model.live.moving` for a moving load.
    pub(crate) moving: Option<usize>,
    pub(crate) placements: Vec<(LoadCase, Option<Placement>)>,
}

/// The placements of moving load `k`: every train, direction and position
/// (`loads/envelope_nonlinear.rs`).
fn moving_placements(model: &Model, k: usize) -> Result<Live, RateError> {
    let ml = &model.live.moving[k];
    let (placed, _) = crate::loads::envelope_nonlinear::placements(model, k)?;
    Ok(Live {
        id: ml.id.clone(),
        legal: ml.legal,
        moving: Some(k),
        placements: placed.into_iter().map(|p| (p.case, Some(p.at))).collect(),
    })
}

/// Every live load of the model: Live cases (one placement) and moving loads.
fn live_loads(model: &Model) -> Result<Vec<Live>, RateError> {
    let mut out = Vec::new();
    for (ci, case) in model.cases.iter().enumerate() {
        if case.kind == CaseKind::Live {
            out.push(Live {
                id: case.id.clone(),
                legal: case.legal,
                moving: None,
                placements: vec![(
                    factored_state(model, &case.id, &[(ci, 1.0 + case.impact)]),
                    None,
                )],
            });
        }
    }
    for k in 0..model.live.moving.len() {
        out.push(moving_placements(model, k)?);
    }
    Ok(out)
}

/// Greatest and least force of every member over the states `base` +
/// `factor` × each placement.
fn extremes(
    solver: &Solver,
    base: &LoadCase,
    live: &Live,
    factor: f64,
    start: &[bool],
) -> Result<(Vec<f64>, Vec<f64>), AnalysisError> {
    let nm = solver.model().members.len();
    if live.placements.is_empty() {
        // The vehicle never stands on the deck: the base state alone.
        let s = solver.solve(base, Some(start))?;
        return Ok((s.result.forces.clone(), s.result.forces));
    }
    let (mut hi, mut lo) = (vec![f64::NEG_INFINITY; nm], vec![f64::INFINITY; nm]);
    for (p, _) in &live.placements {
        let s = solver.solve(&merge(base, p, factor), Some(start))?;
        for m in 0..nm {
            hi[m] = hi[m].max(s.result.forces[m]);
            lo[m] = lo[m].min(s.result.forces[m]);
        }
    }
    Ok((hi, lo))
}

/// Load cases as analysed, combinations solved whole, and the moving loads'
/// envelopes of states solved whole.
/// |force| over the member's resistance in the sense of the force (a
/// tension-only member has none in compression: it is slack).
fn utilization(cap: &MemberCapacity, force: f64) -> f64 {
    if force >= 0.0 {
        force / cap.tension_capacity
    } else {
        -force / cap.compression.capacity
    }
}

/// A combination's state with its dead cases at the method's minimum
/// factors, where a written factor is above them; None when none is.
fn relieved_state(
    model: &Model,
    combo: &crate::model::Combination,
    relief: super::Relief,
) -> Option<LoadCase> {
    let mut changed = false;
    let factors: Vec<(usize, f64)> = combo
        .factors
        .iter()
        .map(|&(c, f)| {
            let min = match model.cases[c].kind {
                CaseKind::Dead => relief.dc,
                CaseKind::Wearing => relief.dw,
                _ => return (c, f),
            };
            if f > min {
                changed = true;
                (c, min)
            } else {
                (c, f)
            }
        })
        .collect();
    let relieved = crate::model::Combination {
        factors,
        ..combo.clone()
    };
    changed.then(|| combination_state(model, &relieved))
}

/// Load cases as analysed, combinations solved whole (also with the dead
/// cases at the method's minimum factors, the more severe kept), and the
/// moving loads' envelopes of states solved whole. Also the ids of the
/// combinations where the minimum factors were tried.
#[allow(clippy::too_many_arguments)]
fn effects(
    model: &Model,
    results: &[CaseResult],
    solver: &Solver,
    lives: &[Live],
    dead_slack: &[bool],
    members: &[MemberCapacity],
    relief: Option<super::Relief>,
    relieved: &mut Vec<String>,
) -> Result<Vec<LoadEffect>, RateError> {
    let mut out = super::combine::case_effects(model, results);
    for (ci, combo) in model.combinations.iter().enumerate() {
        // The factors as written and, where the method has minimum
        // permanent-load factors below them, the dead cases at those minima
        // (AASHTO LRFD 3.4.1: a dead load that relieves the effect at its
        // least): each member takes the more severe of the two states.
        let state = combination_state(model, combo);
        let low = relief.and_then(|r| relieved_state(model, combo, r));
        if low.is_some() {
            relieved.push(combo.id.clone());
        }
        if combo.moving.is_empty() {
            let s = solver.solve(&state, Some(dead_slack))?;
            let mut forces = s.result.forces;
            if let Some(low) = &low {
                let t = solver.solve(low, Some(dead_slack))?;
                for (m, f) in forces.iter_mut().enumerate() {
                    let g = t.result.forces[m];
                    if utilization(&members[m], g) > utilization(&members[m], *f) {
                        *f = g;
                    }
                }
            }
            out.push(LoadEffect {
                id: combo.id.clone(),
                case: None,
                moving: None,
                factored: true,
                combination: Some((ci, None)),
                forces,
            });
            continue;
        }
        for &(k, factor) in &combo.moving {
            let Some(live) = lives.iter().find(|l| l.moving == Some(k)) else {
                continue;
            };
            let (mut hi, mut lo) = extremes(solver, &state, live, factor, dead_slack)?;
            if let Some(low) = &low {
                let (h2, l2) = extremes(solver, low, live, factor, dead_slack)?;
                hi.iter_mut().zip(h2).for_each(|(a, b)| *a = a.max(b));
                lo.iter_mut().zip(l2).for_each(|(a, b)| *a = a.min(b));
            }
            for (side, forces) in [(Side::Tension, hi), (Side::Compression, lo)] {
                out.push(LoadEffect {
                    id: format!(
                        "{} ({factor} × {} {})",
                        combo.id,
                        live.id,
                        side.effect_label()
                    ),
                    case: None,
                    moving: None,
                    factored: true,
                    combination: Some((ci, Some(side))),
                    forces,
                });
            }
        }
    }
    let dead = dead_state(model);
    for live in lives {
        let Some(k) = live.moving else { continue };
        let (hi, lo) = extremes(solver, &dead, live, 1.0, dead_slack)?;
        for (side, forces) in [(Side::Tension, hi), (Side::Compression, lo)] {
            out.push(LoadEffect {
                id: format!("dead + {} ({})", live.id, side.effect_label()),
                case: None,
                moving: Some((k, side)),
                factored: false,
                combination: None,
                forces,
            });
        }
    }
    Ok(out)
}

/// The dead state at a level's maximum or minimum permanent-load factors.
pub(crate) fn factored_dead(model: &Model, level: &Level, max: bool) -> (LoadCase, f64, f64) {
    let (dc, dw) = model.dead_cases_split();
    let (gdc, gdw) = if max {
        (level.dc.max, level.dw.max)
    } else {
        (level.dc.min, level.dw.min)
    };
    let terms: Vec<(usize, f64)> = dc
        .iter()
        .map(|&c| (c, gdc))
        .chain(dw.iter().map(|&c| (c, gdw)))
        .collect();
    (
        factored_state(model, "factored dead load", &terms),
        gdc,
        gdw,
    )
}

/// One placement's response path at one level: the factored dead load with
/// the permanent factors at their maxima or minima, then λ·γL·(L + IM).
pub(crate) struct Traced {
    pub(crate) placement: usize,
    pub(crate) gamma_dc: f64,
    pub(crate) gamma_dw: f64,
    pub(crate) path: Path,
}

/// Every placement of `live` followed at `level`, both permanent factors:
/// the paths the members and the joints are rated on (followed once).
pub(crate) fn paths(
    model: &Model,
    solver: &Solver,
    level: &Level,
    live: &Live,
) -> Result<Vec<Traced>, AnalysisError> {
    let mut out = Vec::with_capacity(2 * live.placements.len());
    for (pi, (p, _)) in live.placements.iter().enumerate() {
        let scaled = merge(
            &LoadCase {
                id: live.id.clone(),
                ..Default::default()
            },
            p,
            level.gamma_live,
        );
        for max in [true, false] {
            let (dead, gamma_dc, gamma_dw) = factored_dead(model, level, max);
            out.push(Traced {
                placement: pi,
                gamma_dc,
                gamma_dw,
                path: path(solver, &dead, &scaled)?,
            });
        }
    }
    Ok(out)
}

/// The rating rows of one live load at one level: for each member the
/// lowest traced factor over the placements and both permanent factors.
#[allow(clippy::too_many_arguments)]
fn rate_live(
    model: &Model,
    solver: &Solver,
    method: &Method,
    level: &Level,
    members: &[MemberCapacity],
    live: &Live,
    traced: &[Traced],
    dead_forces: &[f64],
    dead_slack: &[bool],
) -> Result<Vec<MemberRating>, AnalysisError> {
    let nm = members.len();
    let tension: Vec<SideCapacity> = members
        .iter()
        .map(|c| side_capacity(method, level, c, true))
        .collect();
    let compression: Vec<SideCapacity> = members
        .iter()
        .map(|c| side_capacity(method, level, c, false))
        .collect();
    let limits: Vec<Limit> = (0..nm)
        .map(|m| Limit {
            tension: tension[m].capacity,
            compression: if model.members[m].tension_only {
                f64::INFINITY
            } else {
                compression[m].capacity
            },
        })
        .collect();
    // Per member: (λ, sense, γDC, γDW, placement index).
    let mut best: Vec<Option<(Reached, f64, f64, usize)>> = vec![None; nm];
    for t in traced {
        for (m, r) in reach(&t.path, &limits).into_iter().enumerate() {
            let Some(r) = r else { continue };
            if best[m].is_none_or(|b| r.lambda < b.0.lambda) {
                best[m] = Some((r, t.gamma_dc, t.gamma_dw, t.placement));
            }
        }
    }
    let mut rows = Vec::with_capacity(nm);
    for m in 0..nm {
        // The live force with impact at the governing (or first) placement,
        // from the service state solved whole.
        let pi = best[m].map_or(0, |b| b.3);
        let Some((p, at)) = live.placements.get(pi) else {
            continue;
        };
        let service = solver.solve(&merge(&dead_state(model), p, 1.0), Some(dead_slack))?;
        let live_force = service.result.forces[m] - dead_forces[m];
        let sense = best[m].map_or(live_force >= 0.0, |b| b.0.tension);
        let side = if sense { &tension[m] } else { &compression[m] };
        let slack = model.members[m].tension_only && service.slack[m];
        let governs = if best[m].is_some_and(|b| b.0.mechanism) {
            "truss becomes a mechanism (slack members out)"
        } else if best[m].is_none() && slack {
            "slack"
        } else {
            side.governs
        };
        let length = model.units.length;
        rows.push(MemberRating {
            member: m,
            live_id: live.id.clone(),
            at: at.map(|p| {
                format!(
                    "{} with the front axle at {:.2} {} ({})",
                    if sense { "tension" } else { "compression" },
                    p.position / length.to_si,
                    length.name,
                    p.direction.name()
                )
            }),
            legal: live.legal,
            level: level.name,
            rf: best[m].map(|b| b.0.lambda).filter(|v| v.is_finite()),
            dc: dead_forces[m],
            dw: 0.0,
            live: live_force,
            capacity: side.capacity,
            nominal: side.nominal,
            governs,
            gamma_dc: best[m].map_or(level.dc.max, |b| b.1),
            gamma_dw: best[m].map_or(level.dw.max, |b| b.2),
            gamma_live: level.gamma_live,
            phi: side.phi,
            phi_c: method.phi_c,
            phi_s: members[m].phi_s,
            phi_cs: method.condition_system_with(level, members[m].phi_s),
            rp: side.rp,
            u: side.u,
            clause: level.clause,
        });
    }
    Ok(rows)
}

/// [`super::rate`] for a model with tension-only members.
pub(super) fn rate(
    model: &Model,
    results: &[CaseResult],
    method: Method,
) -> Result<Rating, RateError> {
    let members = (0..model.members.len())
        .map(|m| super::member_capacity(model, m, &method))
        .collect::<Result<Vec<_>, _>>()?;
    let solver = Solver::new(model)?;
    let dead = solver.solve(&dead_state(model), None)?;
    let lives = live_loads(model)?;
    let mut relieved = Vec::new();
    let effects = effects(
        model,
        results,
        &solver,
        &lives,
        &dead.slack,
        &members,
        super::Relief::of(&method),
        &mut relieved,
    )?;
    let mut ratings = Vec::new();
    // Each live load's paths at each level, followed once for the members
    // and the joints: (live load, level, paths).
    let mut followed: Vec<(usize, Level, Vec<Traced>)> = Vec::new();
    if method.rates {
        for (li, live) in lives.iter().enumerate() {
            let levels = if live.legal {
                &method.legal_levels
            } else {
                &method.design_levels
            };
            for level in levels {
                let traced = paths(model, &solver, level, live)?;
                ratings.extend(rate_live(
                    model,
                    &solver,
                    &method,
                    level,
                    &members,
                    live,
                    &traced,
                    &dead.result.forces,
                    &dead.slack,
                )?);
                followed.push((li, *level, traced));
            }
        }
    }
    let mut rating = super::finish(model, method, members, effects, Vec::new(), ratings)?;
    let set = crate::joint::all_checks(model);
    if !set.checks.is_empty() {
        rating.joints = Some(crate::joint::nonlinear::rate_joints(
            model, &rating, &lives, &followed, set,
        )?);
        crate::joint::post_with_joints(&mut rating);
    }
    for id in relieved {
        rating.notes.push(format!(
            "combination \"{id}\": solved also with its dead cases at the method's minimum factors (AASHTO LRFD 3.4.1 for LRFR), each member taking the more severe of the two states"
        ));
    }
    rating.notes.push(
        "tension-only members (issue 16): every case, combination and vehicle position solved whole by the active-set iteration (superposition does not hold); rating factor = the live-load multiplier at which the member reaches its resistance with the factored dead load applied first, the slack members followed event by event (DC and DW shown together as DC); a slack member carries no force and is never checked in compression".into(),
    );
    let mut gave_way: Vec<String> = Vec::new();
    for r in rating
        .ratings
        .iter()
        .filter(|r| r.governs.starts_with("truss becomes"))
    {
        let note = format!(
            "live load \"{}\" at the {} level: at RF {:.2} the truss itself becomes a mechanism (a panel's shear reverses where no counter can carry it, or a needed tension-only member goes slack); members that do not reach their resistance sooner are rated at that factor",
            r.live_id,
            r.level,
            r.rf.unwrap_or(f64::NAN)
        );
        if !gave_way.contains(&note) {
            gave_way.push(note);
        }
    }
    rating.notes.extend(gave_way);
    let slack = dead.slack_ids(model);
    if !slack.is_empty() {
        rating.notes.push(format!(
            "tension-only members slack under the dead load: {}",
            slack.join(", ")
        ));
    }
    Ok(rating)
}
