//! What a checked effect is made of, for differentiating it: load cases
//! with their factors and, for a moving-load envelope (alone or in a
//! combination), the vehicle held where it governs the check.
//!
//! An envelope is the greatest of the forces over every vehicle position;
//! the force at one position is linear in the loads, and between the
//! positions where an axle crosses a deck node it is linear in the position
//! too (piecewise linear influence lines). At the governing position the
//! envelope's derivative is that of the active piece (the derivative of a
//! maximum is the derivative of the maximizing term where it is unique):
//! the vehicle is held there and its axle and lane loads become nodal
//! forces at the deck nodes by the lever rule, a load case like any other.
//! Where another position is about to govern, the derivative holds on one
//! side only.

use crate::analysis::Analysis;
use crate::loads::{Deck, MovingEnvelope, Placement};
use crate::model::{CaseKind, LoadCase, Model, NodalLoad};
use crate::rate::{Rating, Side};

/// The parts of one effect of a rating.
#[derive(Clone, Debug, PartialEq)]
pub struct Terms {
    /// Load cases and their factors (live cases times 1 + impact).
    pub cases: Vec<(usize, f64)>,
    /// A moving load's envelope: its index, which side, and the factor on it.
    pub moving: Option<(usize, Side, f64)>,
    /// The load case, combination or moving load the effect comes from.
    pub source: String,
}

/// Where the vehicle was held for a check (SI).
#[derive(Clone, Debug, PartialEq)]
pub struct Held {
    pub moving_load: String,
    pub side: Side,
    /// The front axle's place, None when no axle contributes.
    pub at: Option<Placement>,
    /// The lane load is placed over the parts of the influence line of the
    /// envelope's sign.
    pub lane: bool,
}

fn with_impact(model: &Model, factors: &[(usize, f64)]) -> Vec<(usize, f64)> {
    factors
        .iter()
        .map(|&(c, f)| {
            let case = &model.cases[c];
            let g = if case.kind == CaseKind::Live {
                1.0 + case.impact
            } else {
                1.0
            };
            (c, f * g)
        })
        .collect()
}

/// The terms of `rating.effects[effect]`, as `rate` built it: a case; a
/// moving load's service envelope (the dead cases plus one side); a plain
/// combination; or a combination naming a moving load, with one side.
/// None when the effect is none of these.
pub fn terms(model: &Model, rating: &Rating, effect: usize) -> Option<Terms> {
    let e = &rating.effects[effect];
    if let Some(c) = e.case {
        return Some(Terms {
            cases: vec![(c, 1.0)],
            moving: None,
            source: model.cases[c].id.clone(),
        });
    }
    if let Some((k, side)) = e.moving {
        return Some(Terms {
            cases: model.dead_cases().into_iter().map(|c| (c, 1.0)).collect(),
            moving: Some((k, side, 1.0)),
            source: model.live.moving.get(k)?.id.clone(),
        });
    }
    let (ci, side) = e.combination?;
    let combo = &model.combinations[ci];
    let cases = with_impact(model, &combo.factors);
    match (side, combo.moving.first()) {
        (None, _) => Some(Terms {
            cases,
            moving: None,
            source: combo.id.clone(),
        }),
        (Some(side), Some(&(k, factor))) => Some(Terms {
            cases,
            moving: Some((k, side, factor)),
            source: combo.id.clone(),
        }),
        (Some(_), None) => None,
    }
}

/// The moving load of envelope `k` held where it governs member `j` on
/// `side`, as one load case of nodal forces (impact included; factor 1),
/// with where it stood. `lam` is the adjoint vector K⁻¹·kⱼ·bⱼ of member j,
/// whose product with a unit load at a deck node is the influence ordinate
/// (Maxwell–Betti), used to place the lane load.
pub fn held_vehicle(
    model: &Model,
    analysis: &Analysis,
    env: &MovingEnvelope,
    k: usize,
    side: Side,
    j: usize,
    lam: &[f64],
) -> Result<(LoadCase, Held), crate::loads::LoadError> {
    let ml = &model.live.moving[k];
    let vehicle = &model.live.vehicles[ml.vehicle];
    let deck = Deck::of_model(model)?;
    let e = &env.per_member[j];
    let extreme = match side {
        Side::Tension => &e.tension,
        Side::Compression => &e.compression,
    };
    let mut load = vec![0.0f64; deck.nodes.len()];
    let axle_factor = 1.0 + ml.impact;
    if let Some(p) = extreme.at {
        for a in &vehicle.axles {
            if let Some((i, wa, wb)) = deck.split(p.direction.axle_at(p.position, a.offset)) {
                load[i] += axle_factor * a.load * wa;
                load[i + 1] += axle_factor * a.load * wb;
            }
        }
    }
    let lane = extreme.lane != 0.0 && vehicle.lane.is_some();
    if lane {
        let w = vehicle.lane.unwrap_or(0.0) * if ml.impact_on_lane { axle_factor } else { 1.0 };
        let dofs = &analysis.prepared.dofs;
        // Influence ordinate of member j at each deck node: a unit
        // downward load there, dotted with λ.
        let eta: Vec<f64> = deck
            .nodes
            .iter()
            .map(|&n| {
                dofs.of_node(n)
                    .map(|p| -lam[p] * dofs.direction[p][1])
                    .sum()
            })
            .collect();
        let sign = if side == Side::Tension { 1.0 } else { -1.0 };
        for i in 0..eta.len() - 1 {
            let h = deck.chainage[i + 1] - deck.chainage[i];
            let (a, b) = (sign * eta[i], sign * eta[i + 1]);
            // ∫ N_i and ∫ N_{i+1} (hat functions 1 − t, t) over the part of
            // the segment where the line has the envelope's sign, as
            // `Deck::signed_areas` splits it.
            let (na, nb) = if a >= 0.0 && b >= 0.0 {
                (0.5, 0.5)
            } else if a <= 0.0 && b <= 0.0 {
                (0.0, 0.0)
            } else {
                let t0 = a.abs() / (a.abs() + b.abs());
                if a > 0.0 {
                    (t0 - 0.5 * t0 * t0, 0.5 * t0 * t0)
                } else {
                    (0.5 * (1.0 - t0) * (1.0 - t0), 0.5 * (1.0 - t0 * t0))
                }
            };
            load[i] += w * h * na;
            load[i + 1] += w * h * nb;
        }
    }
    let nodal = deck
        .nodes
        .iter()
        .zip(&load)
        .filter(|(_, &p)| p != 0.0)
        .map(|(&node, &p)| NodalLoad {
            node,
            fx: 0.0,
            fy: -p,
        })
        .collect();
    let case = LoadCase {
        id: format!("{} held", ml.id),
        kind: CaseKind::Other,
        impact: 0.0,
        legal: false,
        nodal,
        settlements: vec![],
        elongations: vec![],
    };
    Ok((
        case,
        Held {
            moving_load: ml.id.clone(),
            side,
            at: extreme.at,
            lane,
        },
    ))
}
