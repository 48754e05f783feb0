//! Moving-load envelopes from influence lines.
//!
//! For each moving load and each member (and support), the greatest
//! tension and greatest compression as the vehicle rolls across the deck
//! in both directions:
//!
//! - axle train: F(p) = Σ Pᵢ·η(sᵢ), η the influence line interpolated
//!   linearly between deck nodes at each axle's chainage sᵢ (axles off the
//!   deck contribute nothing), scanned over the front-axle positions of
//!   [`moving::positions`](super::moving::positions), which include every
//!   position putting an axle on a deck node, so the extreme is exact;
//! - lane (crowd) load w per unit length: placed only where it adds to the
//!   effect sought, w·∫η⁺ds for tension and w·∫η⁻ds for compression over the
//!   whole deck (the positive and negative parts of the line), independent
//!   of where the axles stand;
//! - dynamic allowance: the axle part times (1 + impact); the lane part too
//!   when `impact_on_lane`.
//!
//! The reported extreme is (1 + I)·F_axles + (1 + I or 1)·F_lane, with the
//! tension extreme never below zero and the compression extreme never
//! above zero (the bridge may always be empty). An axle or lane effect
//! below 1e-9 of (largest ordinate of any effect × total load) is
//! round-off in a zero-force member and is reported as zero, unplaced.

use super::influence::{influence_lines, InfluenceLines};
use super::moving::{positions, Deck, Direction, Placement};
use super::{LoadError, MovingLoad, Vehicle};
use crate::analysis::results::Prepared;
use crate::model::Model;

/// One extreme of one effect under one moving load, SI.
#[derive(Clone, Debug, PartialEq)]
pub struct Extreme {
    /// Total live effect including the dynamic allowance, N (tension or
    /// upward reaction positive).
    pub force: f64,
    /// The axle-train part without the dynamic allowance, N.
    pub axles: f64,
    /// The lane part without the dynamic allowance, N.
    pub lane: f64,
    /// Where the axle train stood; None when the vehicle has no axles or
    /// no position gives an effect of this sign.
    pub at: Option<Placement>,
}

impl Extreme {
    fn zero() -> Extreme {
        Extreme {
            force: 0.0,
            axles: 0.0,
            lane: 0.0,
            at: None,
        }
    }
}

/// The envelope of one member, SI.
#[derive(Clone, Debug, PartialEq)]
pub struct MemberEnvelope {
    /// Index into `model.members`.
    pub member: usize,
    pub id: String,
    /// Force under the dead-load cases (`model.live.dead_cases` summed), N.
    pub dead: f64,
    /// Greatest tension (`force` ≥ 0).
    pub tension: Extreme,
    /// Greatest compression (`force` ≤ 0).
    pub compression: Extreme,
}

impl MemberEnvelope {
    /// Greatest live tension with impact, N (≥ 0).
    pub fn max_tension(&self) -> f64 {
        self.tension.force
    }
    /// Greatest live compression with impact, N (≤ 0, tension positive).
    pub fn max_compression(&self) -> f64 {
        self.compression.force
    }
}

/// The envelope of one support's vertical reaction, SI (upward positive).
#[derive(Clone, Debug, PartialEq)]
pub struct ReactionEnvelope {
    /// Index into `model.supports`.
    pub support: usize,
    pub node: String,
    /// Vertical reaction under the dead-load cases, N.
    pub dead: f64,
    /// Greatest upward reaction (`force` ≥ 0).
    pub up: Extreme,
    /// Greatest downward (uplift-resisting) reaction (`force` ≤ 0).
    pub down: Extreme,
}

/// Envelopes under one moving load.
#[derive(Clone, Debug, PartialEq)]
pub struct MovingEnvelope {
    pub moving_load: String,
    pub vehicle: String,
    /// Dynamic allowance fraction applied (already included in `force`).
    pub impact: f64,
    pub impact_on_lane: bool,
    /// Every member, in model order.
    pub per_member: Vec<MemberEnvelope>,
    /// Every support, in model order.
    pub per_support: Vec<ReactionEnvelope>,
}

/// Member forces and support reactions under the dead-load cases summed.
pub fn dead_load(
    model: &Model,
    prepared: &Prepared,
) -> Result<(Vec<f64>, Vec<[f64; 2]>), LoadError> {
    let mut forces = vec![0.0; model.members.len()];
    let mut reactions = vec![[0.0; 2]; model.supports.len()];
    // The listed dead cases, or else every case of kind Dead.
    let listed = model.dead_cases();
    let cases: Vec<_> = listed.iter().map(|&c| model.cases[c].clone()).collect();
    if cases.is_empty() {
        return Ok((forces, reactions));
    }
    for r in prepared.solve_cases(model, &cases)? {
        forces.iter_mut().zip(&r.forces).for_each(|(a, b)| *a += b);
        for (a, b) in reactions.iter_mut().zip(&r.reactions) {
            a[0] += b[0];
            a[1] += b[1];
        }
    }
    Ok((forces, reactions))
}

/// Envelopes of every moving load of the model: influence lines on the
/// model's deck from the factorization in `prepared`, dead load from
/// `model.live.dead_cases` (or every `Dead` case when none is listed). All results SI (N), tension positive.
///
/// Errors: no deck line (`NoDeck`), no moving loads (`NoMovingLoads`), a
/// step too fine (`TooManyPositions`), or an analysis failure.
pub fn envelopes(model: &Model, prepared: &Prepared) -> Result<Vec<MovingEnvelope>, LoadError> {
    if model.live.moving.is_empty() {
        return Err(LoadError::NoMovingLoads);
    }
    let deck = Deck::of_model(model)?;
    let lines = influence_lines(model, prepared, &deck)?;
    let (forces, reactions) = dead_load(model, prepared)?;
    envelopes_with(model, &lines, &forces, &reactions)
}

/// As [`envelopes`], on influence lines already computed (on any deck) and
/// given dead-load member forces and support reactions (N).
pub fn envelopes_with(
    model: &Model,
    lines: &InfluenceLines,
    dead_forces: &[f64],
    dead_reactions: &[[f64; 2]],
) -> Result<Vec<MovingEnvelope>, LoadError> {
    model
        .live
        .moving
        .iter()
        .map(|ml| {
            let vehicle = &model.live.vehicles[ml.vehicle];
            let (tension, compression) = extremes(lines, vehicle, ml)?;
            let nm = model.members.len();
            let per_member: Vec<MemberEnvelope> = (0..nm)
                .map(|m| MemberEnvelope {
                    member: m,
                    id: model.members[m].id.to_string(),
                    dead: dead_forces[m],
                    tension: tension[m].clone(),
                    compression: compression[m].clone(),
                })
                .collect();
            let per_support: Vec<ReactionEnvelope> = (0..model.supports.len())
                .map(|s| ReactionEnvelope {
                    support: s,
                    node: model.nodes[model.supports[s].node].id.clone(),
                    dead: dead_reactions[s][1],
                    up: tension[nm + s].clone(),
                    down: compression[nm + s].clone(),
                })
                .collect();
            check_finite(model, ml, &per_member, &per_support)?;
            Ok(MovingEnvelope {
                moving_load: ml.id.clone(),
                vehicle: vehicle.id.clone(),
                impact: ml.impact,
                impact_on_lane: ml.impact_on_lane,
                per_member,
                per_support,
            })
        })
        .collect()
}

/// Refuse an envelope holding an overflowed value, naming where.
fn check_finite(
    model: &Model,
    ml: &MovingLoad,
    members: &[MemberEnvelope],
    supports: &[ReactionEnvelope],
) -> Result<(), LoadError> {
    let bad = |of: String| LoadError::NonFinite {
        id: ml.id.clone(),
        of,
    };
    for e in members {
        let v = [e.dead, e.max_tension(), e.max_compression()];
        if !v.iter().all(|x| x.is_finite()) {
            return Err(bad(format!("member \"{}\"", e.id)));
        }
    }
    for (s, e) in supports.iter().enumerate() {
        let v = [e.dead, e.up.force, e.down.force];
        if !v.iter().all(|x| x.is_finite()) {
            let node = &model.nodes[model.supports[s].node].id;
            return Err(bad(format!("the reaction at \"{node}\"")));
        }
    }
    Ok(())
}

/// Greatest and least effect of `vehicle` for every member force then
/// every vertical reaction (members first, in order, then supports).
pub fn extremes(
    lines: &InfluenceLines,
    vehicle: &Vehicle,
    ml: &MovingLoad,
) -> Result<(Vec<Extreme>, Vec<Extreme>), LoadError> {
    let deck = &lines.deck;
    let nd = lines.nd();
    let nm = lines.members.len() / nd;
    let ns = lines.reactions.len() / nd;
    let ne = nm + ns;
    // Ordinates transposed: row k holds every effect at deck node k.
    let mut rows = vec![0.0; nd * ne];
    for m in 0..nm {
        for (k, v) in lines.member(m).iter().enumerate() {
            rows[k * ne + m] = *v;
        }
    }
    for s in 0..ns {
        for (k, v) in lines.reaction_y(s).iter().enumerate() {
            rows[k * ne + nm + s] = *v;
        }
    }
    // No sum below can exceed (Σ|P|·(1 + I) + |w|·L·(1 + I))·max|η|: when that
    // bound is finite nothing overflows, so one check here replaces a test
    // of every value (issue 22, item 12: an overflow must not be zeroed by
    // the round-off floor below and pass).
    let largest = rows.iter().fold(0.0f64, |a, v| a.max(v.abs()));
    let abs_total: f64 = vehicle.axles.iter().map(|a| a.load.abs()).sum();
    let lane_total = vehicle.lane.unwrap_or(0.0).abs() * deck.length();
    let bound = (abs_total + lane_total) * (1.0 + ml.impact) * largest;
    if !bound.is_finite() {
        return Err(LoadError::NonFinite {
            id: ml.id.clone(),
            of: format!("vehicle \"{}\" (its loads overflow)", vehicle.id),
        });
    }
    let mut hi: Vec<(f64, Option<Placement>)> = vec![(0.0, None); ne];
    let mut lo: Vec<(f64, Option<Placement>)> = vec![(0.0, None); ne];
    if !vehicle.axles.is_empty() {
        let mut vals = vec![0.0; ne];
        let mut weights: Vec<(usize, f64)> = Vec::with_capacity(2 * vehicle.axles.len());
        for direction in [Direction::Forward, Direction::Reverse] {
            for p in positions(deck, vehicle, ml.step, direction, &ml.id)? {
                weights.clear();
                for a in &vehicle.axles {
                    if let Some((k, wa, wb)) = deck.split(direction.axle_at(p, a.offset)) {
                        weights.push((k, a.load * wa));
                        weights.push((k + 1, a.load * wb));
                    }
                }
                if weights.is_empty() {
                    continue;
                }
                vals.iter_mut().for_each(|v| *v = 0.0);
                for &(k, w) in &weights {
                    if w != 0.0 {
                        let row = &rows[k * ne..(k + 1) * ne];
                        vals.iter_mut().zip(row).for_each(|(v, r)| *v += w * r);
                    }
                }
                let at = Some(Placement {
                    position: p,
                    direction,
                });
                for e in 0..ne {
                    if vals[e] > hi[e].0 {
                        hi[e] = (vals[e], at);
                    }
                    if vals[e] < lo[e].0 {
                        lo[e] = (vals[e], at);
                    }
                }
            }
        }
    }
    // Round-off floor: an effect below 1e-9 of the largest ordinate of any
    // effect times the load is noise (a zero-force member), reported as
    // zero with no placement.
    let total: f64 = vehicle.axles.iter().map(|a| a.load).sum();
    let floor = 1e-9 * largest * total;
    for e in 0..ne {
        if hi[e].0 <= floor {
            hi[e] = (0.0, None);
        }
        if lo[e].0 >= -floor {
            lo[e] = (0.0, None);
        }
    }
    let lane_floor = 1e-9 * largest * deck.length();
    let axle_factor = 1.0 + ml.impact;
    let lane_factor = if ml.impact_on_lane { axle_factor } else { 1.0 };
    let w = vehicle.lane.unwrap_or(0.0);
    let mut tension = Vec::with_capacity(ne);
    let mut compression = Vec::with_capacity(ne);
    let mut ord = vec![0.0; nd];
    for e in 0..ne {
        let (mut t, mut c) = (Extreme::zero(), Extreme::zero());
        if w != 0.0 {
            for (k, o) in ord.iter_mut().enumerate() {
                *o = rows[k * ne + e];
            }
            let (pos, neg) = deck.signed_areas(&ord);
            t.lane = if pos > lane_floor { w * pos } else { 0.0 };
            c.lane = if neg < -lane_floor { w * neg } else { 0.0 };
        }
        (t.axles, t.at) = hi[e];
        (c.axles, c.at) = lo[e];
        t.force = axle_factor * t.axles + lane_factor * t.lane;
        c.force = axle_factor * c.axles + lane_factor * c.lane;
        tension.push(t);
        compression.push(c);
    }
    Ok((tension, compression))
}
