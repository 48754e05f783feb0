//! Joint checks of a truss with tension-only members, where superposition
//! does not hold: every live placement's response to the factored dead load
//! plus λ times the factored live load is followed event by event
//! (`rate::nonlinear::path`, the same path the members are rated on), and a
//! check's rating factor is the first λ on that path where its utilization
//! reaches 1. Within a segment the forces are linear in λ and every joint
//! check's utilization convex, so the first segment whose end reaches 1
//! holds the crossing, found by bisection; where the dead load alone is
//! beyond the limit the first segment's linear extrapolation gives the
//! factor (≤ 0), as the rating equation would. A truss that gives way (its
//! slack members out) at λm caps every factor at λm. Moving loads are their
//! placements one by one, so a check of several members sees the forces of
//! one vehicle position at a time (no envelope corners needed).

use super::solve_rf::LAMBDA_MAX;
use super::{rows_of, Eval, JointCheck, JointRating, JointSet, Joints};
use crate::method::{Level, Method};
use crate::model::Model;
use crate::rate::nonlinear::{Live, Path, Traced};
use crate::rate::{RateError, Rating};

/// The first λ on `path` where `u` reaches 1.
fn first_crossing(path: &Path, u: impl Fn(&[f64]) -> f64) -> Option<f64> {
    let at = |seg: &crate::rate::nonlinear::Segment, l: f64| -> Vec<f64> {
        seg.dead
            .iter()
            .zip(&seg.live)
            .map(|(d, v)| d + l * v)
            .collect()
    };
    let Some(first) = path.segments.first() else {
        return path.mechanism;
    };
    let u0 = u(&at(first, 0.0));
    if u0 >= 1.0 {
        let u1 = u(&at(first, 1.0));
        return Some(if u1 > u0 { (1.0 - u0) / (u1 - u0) } else { 0.0 });
    }
    for seg in &path.segments {
        let end = seg.end.min(LAMBDA_MAX);
        if u(&at(seg, end)) < 1.0 {
            continue;
        }
        let (mut lo, mut hi) = (seg.start, end);
        for _ in 0..200 {
            let mid = 0.5 * (lo + hi);
            if mid <= lo || mid >= hi {
                break;
            }
            if u(&at(seg, mid)) < 1.0 {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return Some(0.5 * (lo + hi));
    }
    path.mechanism
}

/// Every joint check of a tension-only model, evaluated and rated on the
/// paths the members were rated on (`followed`: live load, level, paths).
pub(crate) fn rate_joints(
    model: &Model,
    rating: &Rating,
    lives: &[Live],
    followed: &[(usize, Level, Vec<Traced>)],
    set: JointSet,
) -> Result<Joints, RateError> {
    let method = &rating.method;
    let rows = rows_of(model, rating, &set.checks)?;
    let ratings = followed
        .iter()
        .flat_map(|(li, level, traced)| {
            rate_live(model, method, level, &lives[*li], traced, &set.checks)
        })
        .collect();
    Ok(Joints {
        checks: set.checks,
        rows,
        ratings,
        notes: set.notes,
    })
}

/// The rows of one live load at one level.
fn rate_live(
    model: &Model,
    method: &Method,
    level: &Level,
    live: &Live,
    traced: &[Traced],
    checks: &[Box<dyn JointCheck>],
) -> Vec<JointRating> {
    // Best (lowest λ) so far per check: λ and the index into `traced`.
    let mut best: Vec<Option<(f64, usize)>> = vec![None; checks.len()];
    for (ti, t) in traced.iter().enumerate() {
        for (ci, check) in checks.iter().enumerate() {
            let u = |f: &[f64]| check.evaluate(f, method, level).utilization();
            if let Some(l) = first_crossing(&t.path, u) {
                if best[ci].is_none_or(|b| l < b.0) {
                    best[ci] = Some((l, ti));
                }
            }
        }
    }
    let length = model.units.length;
    checks
        .iter()
        .enumerate()
        .map(|(ci, check)| {
            let b = best[ci];
            let t = b.map(|b| &traced[b.1]);
            let factored = t.and_then(|t| t.path.forces_at(1.0)).map_or(
                Eval {
                    demand: 0.0,
                    resistance: 0.0,
                },
                |f| check.evaluate(&f, method, level),
            );
            let at = t
                .and_then(|t| live.placements.get(t.placement))
                .and_then(|(_, at)| *at)
                .map(|p| {
                    format!(
                        "front axle at {:.2} {} ({})",
                        p.position / length.to_si,
                        length.name,
                        p.direction.name()
                    )
                });
            JointRating {
                check: ci,
                live_id: live.id.clone(),
                legal: live.legal,
                level: level.name,
                rf: b.map(|b| b.0).filter(|v| v.is_finite()),
                at,
                factored,
                gamma_dc: t.map_or(level.dc.max, |t| t.gamma_dc),
                gamma_dw: t.map_or(level.dw.max, |t| t.gamma_dw),
                gamma_live: level.gamma_live,
            }
        })
        .collect()
}
