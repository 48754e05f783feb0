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
use super::rules::{concrete_trains, Concrete};
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
    /// Dynamic allowance applied to this extreme (fraction).
    pub impact: f64,
    /// Which train governed: 0 the vehicle's own, 1… its alternatives.
    pub train: usize,
    /// The variable axle spacing that governed, m.
    pub gap: Option<f64>,
    /// Length of deck over which this effect's influence line adds, m.
    pub loaded_length: f64,
}

impl Extreme {
    fn zero() -> Extreme {
        Extreme {
            force: 0.0,
            axles: 0.0,
            lane: 0.0,
            at: None,
            impact: 0.0,
            train: 0,
            gap: None,
            loaded_length: 0.0,
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

/// The best value found so far of one effect and where.
#[derive(Clone, Copy)]
struct Best {
    value: f64,
    at: Option<Placement>,
    train: usize,
    gap: Option<f64>,
}

const NONE: Best = Best {
    value: 0.0,
    at: None,
    train: 0,
    gap: None,
};

/// Influence ordinates rearranged for the scan.
struct Rows<'a> {
    deck: &'a Deck,
    ne: usize,
    /// Row k: every effect at deck node k.
    rows: Vec<f64>,
    /// Row k: ∫₀^{c_k} η ds of every effect (for a trailing uniform load).
    prefix: Vec<f64>,
}

impl<'a> Rows<'a> {
    fn new(lines: &'a InfluenceLines) -> Rows<'a> {
        let deck = &lines.deck;
        let nd = lines.nd();
        let nm = lines.members.len() / nd;
        let ns = lines.reactions.len() / nd;
        let ne = nm + ns;
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
        let mut prefix = vec![0.0; nd * ne];
        for k in 1..nd {
            let h = deck.chainage[k] - deck.chainage[k - 1];
            for e in 0..ne {
                prefix[k * ne + e] = prefix[(k - 1) * ne + e]
                    + 0.5 * h * (rows[(k - 1) * ne + e] + rows[k * ne + e]);
            }
        }
        Rows {
            deck,
            ne,
            rows,
            prefix,
        }
    }

    fn row(&self, k: usize) -> &[f64] {
        &self.rows[k * self.ne..(k + 1) * self.ne]
    }

    /// Adds w·∫₀^s η ds of every effect to `vals` (s clipped to the deck).
    fn add_integral_to(&self, s: f64, w: f64, vals: &mut [f64]) {
        let c = &self.deck.chainage;
        let s = s.clamp(0.0, self.deck.length());
        let Some((k, _, t)) = self.deck.split(s) else {
            return;
        };
        let h = c[k + 1] - c[k];
        // ∫ over the part segment: h(t − t²/2)·η_k + h(t²/2)·η_{k+1}.
        let (a, b) = (h * (t - 0.5 * t * t), h * 0.5 * t * t);
        let ne = self.ne;
        let prefix = &self.prefix[k * ne..(k + 1) * ne];
        let (ra, rb) = (self.row(k), self.row(k + 1));
        for (e, v) in vals.iter_mut().enumerate() {
            *v += w * (prefix[e] + a * ra[e] + b * rb[e]);
        }
    }
}

/// Effects of `train` with the front axle at `p`: into `hi` and `lo` (the
/// same unless relieving axles are left off, when each axle counts only
/// where it adds to the sign sought).
#[allow(clippy::too_many_arguments)]
fn evaluate(
    r: &Rows,
    vehicle: &Vehicle,
    train: &Concrete,
    p: f64,
    direction: Direction,
    hi: &mut [f64],
    lo: &mut [f64],
    tmp: &mut [f64],
) -> bool {
    hi.iter_mut().for_each(|v| *v = 0.0);
    lo.iter_mut().for_each(|v| *v = 0.0);
    let relieve = vehicle.rules.ignore_relieving;
    let mut any = false;
    for a in &train.axles {
        let Some((k, wa, wb)) = r.deck.split(direction.axle_at(p, a.offset)) else {
            continue;
        };
        any = true;
        let (ra, rb) = (r.row(k), r.row(k + 1));
        let (wa, wb) = (a.load * wa, a.load * wb);
        if relieve {
            for e in 0..r.ne {
                tmp[e] = wa * ra[e] + wb * rb[e];
                hi[e] += tmp[e].max(0.0);
                lo[e] += tmp[e].min(0.0);
            }
        } else {
            for e in 0..r.ne {
                hi[e] += wa * ra[e] + wb * rb[e];
            }
        }
    }
    if let Some(t) = &vehicle.rules.trailing {
        let head = direction.axle_at(p, t.offset);
        let ahead_of_deck = match direction {
            Direction::Forward => head > 0.0,
            Direction::Reverse => head < r.deck.length(),
        };
        if ahead_of_deck {
            any = true;
            match direction {
                Direction::Forward => r.add_integral_to(head, t.load, hi),
                Direction::Reverse => {
                    r.add_integral_to(r.deck.length(), t.load, hi);
                    r.add_integral_to(head, -t.load, hi);
                }
            }
        }
    }
    if !relieve {
        lo.copy_from_slice(hi);
    }
    any
}

/// Rolls one concrete train both ways, updating the best of every effect.
/// With a trailing uniform load the effect is quadratic between
/// consecutive positions (the load's head moves over a linear line), so
/// the vertex of the parabola through three points inside the interval is
/// taken too when it falls inside.
fn roll(
    r: &Rows,
    vehicle: &Vehicle,
    train: &Concrete,
    ml: &MovingLoad,
    best_hi: &mut [Best],
    best_lo: &mut [Best],
) -> Result<(), LoadError> {
    let ne = r.ne;
    let extra: Vec<f64> = vehicle.rules.trailing.iter().map(|t| t.offset).collect();
    let quadratic = !extra.is_empty();
    let (mut hi, mut lo, mut tmp) = (vec![0.0; ne], vec![0.0; ne], vec![0.0; ne]);
    let (mut prev, mut mid, mut scratch) = (vec![0.0; ne], vec![0.0; ne], vec![0.0; ne]);
    let mut lo2 = vec![0.0; ne];
    let sliver = 1e-9 * (r.deck.length() + extra.iter().fold(0.0, |a: f64, b| a.max(*b)));
    let mk = |p: f64, direction| Best {
        value: 0.0,
        at: Some(Placement {
            position: p,
            direction,
        }),
        train: train.train,
        gap: train.gap,
    };
    for direction in [Direction::Forward, Direction::Reverse] {
        let ps = positions(r.deck, &train.axles, &extra, ml.step, direction, &ml.id)?;
        let mut last: Option<f64> = None;
        for &p in &ps {
            if !evaluate(r, vehicle, train, p, direction, &mut hi, &mut lo, &mut tmp) {
                last = None;
                continue;
            }
            for e in 0..ne {
                if hi[e] > best_hi[e].value {
                    best_hi[e] = Best {
                        value: hi[e],
                        ..mk(p, direction)
                    };
                }
                if lo[e] < best_lo[e].value {
                    best_lo[e] = Best {
                        value: lo[e],
                        ..mk(p, direction)
                    };
                }
            }
            if quadratic {
                // Slivers between positions that differ by round-off only
                // (an axle and the load's head reaching nodes together)
                // are skipped: their ends were evaluated.
                if let Some(p0) = last.filter(|&p0| p - p0 > sliver) {
                    // Three points inside (p0, p): the effect may jump at a
                    // breakpoint (an axle leaving the deck over a reaction),
                    // so the parabola is fitted on the open interval.
                    let at = |u: f64| p0 + (0.5 + 0.25 * u) * (p - p0);
                    for (buf, u) in [(&mut prev, -1.0), (&mut mid, 0.0), (&mut scratch, 1.0)] {
                        evaluate(r, vehicle, train, at(u), direction, buf, &mut lo2, &mut tmp);
                    }
                    for e in 0..ne {
                        let (gm, g0, gp) = (prev[e], mid[e], scratch[e]);
                        let a = 0.5 * (gp + gm) - g0;
                        let b = 0.5 * (gp - gm);
                        if a.abs() <= 1e-12 * (gm.abs() + g0.abs() + gp.abs()) {
                            continue;
                        }
                        let u = -b / (2.0 * a);
                        if u > -2.0 && u < 2.0 {
                            let v = g0 - b * b / (4.0 * a);
                            if a < 0.0 && v > best_hi[e].value {
                                best_hi[e] = Best {
                                    value: v,
                                    ..mk(at(u), direction)
                                };
                            }
                            if a > 0.0 && v < best_lo[e].value {
                                best_lo[e] = Best {
                                    value: v,
                                    ..mk(at(u), direction)
                                };
                            }
                        }
                    }
                }
                last = Some(p);
            }
        }
    }
    Ok(())
}

/// Refuse an envelope holding an overflowed value, naming where (issue 22,
/// item 12: an overflow must not be zeroed by the round-off floor and pass).
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
    let r = Rows::new(lines);
    let (deck, ne, nd) = (&lines.deck, r.ne, lines.nd());
    let mut hi = vec![NONE; ne];
    let mut lo = vec![NONE; ne];
    let trains = concrete_trains(vehicle, deck);
    for train in &trains {
        roll(&r, vehicle, train, ml, &mut hi, &mut lo)?;
    }
    if trains.is_empty() && vehicle.rules.trailing.is_some() {
        let lone = Concrete {
            train: 0,
            label: vehicle.id.clone(),
            gap: None,
            axles: Vec::new(),
        };
        roll(&r, vehicle, &lone, ml, &mut hi, &mut lo)?;
    }
    // Round-off floor: an effect below 1e-9 of the largest ordinate of any
    // effect times the load is noise (a zero-force member), reported as
    // zero with no placement.
    let largest = r.rows.iter().fold(0.0f64, |a, v| a.max(v.abs()));
    let total = trains
        .iter()
        .map(|t| t.axles.iter().map(|a| a.load).sum::<f64>())
        .fold(0.0, f64::max)
        + vehicle
            .rules
            .trailing
            .as_ref()
            .map_or(0.0, |t| t.load * deck.length());
    let floor = 1e-9 * largest * total;
    for e in 0..ne {
        if hi[e].value <= floor {
            hi[e] = NONE;
        }
        if lo[e].value >= -floor {
            lo[e] = NONE;
        }
    }
    let lane_floor = 1e-9 * largest * deck.length();
    let mut tension = Vec::with_capacity(ne);
    let mut compression = Vec::with_capacity(ne);
    let mut ord = vec![0.0; nd];
    for e in 0..ne {
        for (k, o) in ord.iter_mut().enumerate() {
            *o = r.rows[k * ne + e];
        }
        let (pos, neg) = deck.signed_areas(&ord);
        let (lpos, lneg) = deck.signed_lengths(&ord);
        let mut out = [Extreme::zero(), Extreme::zero()];
        for (x, (best, area, length)) in
            out.iter_mut().zip([(hi[e], pos, lpos), (lo[e], neg, lneg)])
        {
            let w = vehicle.lane.unwrap_or(0.0)
                + vehicle
                    .rules
                    .crowd
                    .as_ref()
                    .map_or(0.0, |c| c.rule.intensity(length) * c.width);
            x.lane = if area.abs() > lane_floor {
                w * area
            } else {
                0.0
            };
            x.axles = best.value;
            x.at = best.at;
            x.train = best.train;
            x.gap = best.gap;
            x.loaded_length = length;
            x.impact = ml.impact_rule.allowance(ml.impact, length);
            let lane_factor = if ml.impact_on_lane {
                1.0 + x.impact
            } else {
                1.0
            };
            x.force = (1.0 + x.impact) * x.axles + lane_factor * x.lane;
        }
        let [t, c] = out;
        tension.push(t);
        compression.push(c);
    }
    Ok((tension, compression))
}
