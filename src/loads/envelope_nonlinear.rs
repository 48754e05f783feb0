//! Moving loads over a truss with tension-only members (issue 16), where
//! influence lines no longer superpose: the vehicle is placed at every
//! front-axle position of [`positions`] (each train of the vehicle, both
//! directions), its axles times (1 + impact) put on the deck nodes by the
//! lever rule as nodal loads, and each position solved together with the
//! dead load by the active-set iteration (`analysis/active_set.rs`).
//!
//! The envelope's live part of a member is N(dead + vehicle) − N(dead) at
//! the position giving the greatest (least) total, so dead + extreme is the
//! force the member really carries there. Lane, trailing and crowd loads
//! and the leaving-off of relieving axles are refused
//! ([`LoadError::TensionOnlyMoving`]): they are placed per member on the
//! parts of its influence line that add, which has no meaning once the
//! response is not linear. The dynamic allowance is the rule's value at a
//! loaded length of zero (for 50/(L + 125) its 0.30 cap), the conservative
//! one, as it cannot follow each member's loaded length in one state.

use super::envelope::{Extreme, MemberEnvelope, MovingEnvelope, ReactionEnvelope};
use super::moving::{positions, Deck, Direction, Placement};
use super::rules::concrete_trains;
use super::LoadError;
use crate::analysis::active_set::{dead_state, Solver};
use crate::model::{CaseKind, LoadCase, Model, NodalLoad};

/// One position of a vehicle as a load state of its own.
#[derive(Clone, Debug)]
pub struct Placed {
    /// The axle loads with the dynamic allowance, unfactored.
    pub case: LoadCase,
    pub at: Placement,
    /// 0 for the vehicle's own train, 1… its alternatives.
    pub train: usize,
    pub gap: Option<f64>,
}

/// Every position of moving load `k`, and the dynamic allowance applied.
pub fn placements(model: &Model, k: usize) -> Result<(Vec<Placed>, f64), LoadError> {
    let ml = &model.live.moving[k];
    let v = &model.live.vehicles[ml.vehicle];
    let refuse = |what| {
        Err(LoadError::TensionOnlyMoving {
            id: ml.id.clone(),
            what,
        })
    };
    if v.lane.is_some() {
        return refuse("a lane load");
    }
    if v.rules.trailing.is_some() {
        return refuse("a trailing uniform load");
    }
    if v.rules.crowd.is_some() {
        return refuse("a crowd load");
    }
    if v.rules.ignore_relieving {
        return refuse("a load model that leaves off relieving axles");
    }
    let deck = Deck::of_model(model)?;
    let impact = ml.impact_rule.allowance(ml.impact, 0.0);
    let mut out = Vec::new();
    for train in concrete_trains(v, &deck) {
        for direction in [Direction::Forward, Direction::Reverse] {
            for front in positions(&deck, &train.axles, &[], ml.step, direction, &ml.id)? {
                let mut case = LoadCase {
                    id: ml.id.clone(),
                    kind: CaseKind::Live,
                    impact,
                    ..Default::default()
                };
                for a in &train.axles {
                    let Some((i, w0, w1)) = deck.split(direction.axle_at(front, a.offset)) else {
                        continue;
                    };
                    for (node, w) in [(deck.nodes[i], w0), (deck.nodes[i + 1], w1)] {
                        if w != 0.0 {
                            case.nodal.push(NodalLoad {
                                node,
                                fx: 0.0,
                                fy: -(1.0 + impact) * a.load * w,
                            });
                        }
                    }
                }
                if !case.nodal.is_empty() {
                    out.push(Placed {
                        case,
                        at: Placement {
                            position: front,
                            direction,
                        },
                        train: train.train,
                        gap: train.gap,
                    });
                }
            }
        }
    }
    Ok((out, impact))
}

/// `a` plus `f` times `b`, as one load state.
pub fn merge(a: &LoadCase, b: &LoadCase, f: f64) -> LoadCase {
    let mut out = a.clone();
    out.nodal.extend(b.nodal.iter().map(|l| NodalLoad {
        node: l.node,
        fx: f * l.fx,
        fy: f * l.fy,
    }));
    out.settlements
        .extend(b.settlements.iter().map(|s| crate::model::Settlement {
            node: s.node,
            dx: f * s.dx,
            dy: f * s.dy,
        }));
    out.elongations.extend(
        b.elongations
            .iter()
            .map(|e| crate::model::InitialElongation {
                member: e.member,
                elongation: f * e.elongation,
            }),
    );
    out
}

fn extreme(live: f64, impact: f64, p: Option<&Placed>) -> Extreme {
    Extreme {
        force: live,
        axles: live / (1.0 + impact),
        lane: 0.0,
        at: p.map(|p| p.at),
        impact,
        train: p.map_or(0, |p| p.train),
        gap: p.and_then(|p| p.gap),
        loaded_length: 0.0,
    }
}

/// The envelopes of every moving load of a model with tension-only members.
pub fn envelopes(model: &Model) -> Result<Vec<MovingEnvelope>, LoadError> {
    if model.live.moving.is_empty() {
        return Err(LoadError::NoMovingLoads);
    }
    let solver = Solver::new(model)?;
    let dead_case = dead_state(model);
    let dead = solver.solve(&dead_case, None)?;
    let nm = model.members.len();
    let ns = model.supports.len();
    let mut out = Vec::new();
    for (k, ml) in model.live.moving.iter().enumerate() {
        let (placed, impact) = placements(model, k)?;
        // Per effect (members then supports' vertical reactions): the
        // greatest and least live part and where.
        let mut hi = vec![(0.0f64, None::<usize>); nm + ns];
        let mut lo = vec![(0.0f64, None::<usize>); nm + ns];
        for (pi, p) in placed.iter().enumerate() {
            let s = solver.solve(&merge(&dead_case, &p.case, 1.0), Some(&dead.slack))?;
            let live = (0..nm)
                .map(|m| s.result.forces[m] - dead.result.forces[m])
                .chain((0..ns).map(|r| s.result.reactions[r][1] - dead.result.reactions[r][1]));
            for (e, v) in live.enumerate() {
                if v > hi[e].0 {
                    hi[e] = (v, Some(pi));
                }
                if v < lo[e].0 {
                    lo[e] = (v, Some(pi));
                }
            }
        }
        // Round-off of a member the vehicle does not load: zero, unplaced
        // (as the linear envelope reports it).
        let scale = hi.iter().chain(&lo).fold(0.0f64, |a, e| a.max(e.0.abs()));
        let pick = |e: (f64, Option<usize>)| {
            if e.0.abs() <= 1e-9 * scale {
                extreme(0.0, impact, None)
            } else {
                extreme(e.0, impact, e.1.map(|i| &placed[i]))
            }
        };
        out.push(MovingEnvelope {
            moving_load: ml.id.clone(),
            vehicle: model.live.vehicles[ml.vehicle].id.clone(),
            impact,
            impact_on_lane: ml.impact_on_lane,
            per_member: (0..nm)
                .map(|m| MemberEnvelope {
                    member: m,
                    id: model.members[m].id.to_string(),
                    dead: dead.result.forces[m],
                    tension: pick(hi[m]),
                    compression: pick(lo[m]),
                })
                .collect(),
            per_support: (0..ns)
                .map(|r| ReactionEnvelope {
                    support: r,
                    node: model.nodes[model.supports[r].node].id.clone(),
                    dead: dead.result.reactions[r][1],
                    up: pick(hi[nm + r]),
                    down: pick(lo[nm + r]),
                })
                .collect(),
        });
    }
    Ok(out)
}
