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
use crate::analysis::active_set::Solver;
use crate::loads::envelope_nonlinear::merge;
use crate::method::{Level, Method};
use crate::model::{LoadCase, Model};
use crate::rate::nonlinear::{factored_dead, path, Live, Path};
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

/// Best (lowest λ) so far for one check: λ, γDC, γDW, placement, path index.
type Best = Option<(f64, f64, f64, usize, usize)>;

/// Every joint check of a tension-only model, evaluated and rated.
pub(crate) fn rate_joints(
    model: &Model,
    solver: &Solver,
    rating: &Rating,
    lives: &[Live],
    set: JointSet,
) -> Result<Joints, RateError> {
    let method = &rating.method;
    let rows = rows_of(model, rating, &set.checks)?;
    let mut ratings = Vec::new();
    if method.rates {
        for live in lives {
            let levels = if live.legal {
                &method.legal_levels
            } else {
                &method.design_levels
            };
            for level in levels {
                ratings.extend(rate_live(model, solver, method, level, live, &set.checks)?);
            }
        }
    }
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
    solver: &Solver,
    method: &Method,
    level: &Level,
    live: &Live,
    checks: &[Box<dyn JointCheck>],
) -> Result<Vec<JointRating>, RateError> {
    let mut best: Vec<Best> = vec![None; checks.len()];
    let mut paths: Vec<Path> = Vec::new();
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
            let (dead, gdc, gdw) = factored_dead(model, level, max);
            let path = path(solver, &dead, &scaled)?;
            for (ci, check) in checks.iter().enumerate() {
                let u = |f: &[f64]| check.evaluate(f, method, level).utilization();
                if let Some(l) = first_crossing(&path, u) {
                    if best[ci].is_none_or(|b| l < b.0) {
                        best[ci] = Some((l, gdc, gdw, pi, paths.len()));
                    }
                }
            }
            paths.push(path);
        }
    }
    let length = model.units.length;
    Ok(checks
        .iter()
        .enumerate()
        .map(|(ci, check)| {
            let b = best[ci];
            let factored = b.and_then(|b| paths[b.4].forces_at(1.0)).map_or(
                Eval {
                    demand: 0.0,
                    resistance: 0.0,
                },
                |f| check.evaluate(&f, method, level),
            );
            let at = b
                .and_then(|b| live.placements.get(b.3))
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
                gamma_dc: b.map_or(level.dc.max, |b| b.1),
                gamma_dw: b.map_or(level.dw.max, |b| b.2),
                gamma_live: level.gamma_live,
            }
        })
        .collect())
}
