//! Rating factors at each level of a method: for every member and every
//! live load (a Live case, or a moving load's envelope on its tension and
//! compression sides), RF by the method's equation with its load and
//! resistance factors; the lowest factor per level; postings for legal loads.

use super::checks::MemberCapacity;
use super::MemberRating;
use crate::analysis::CaseResult;
use crate::method::{posting, Level, Method};
use crate::model::{CaseKind, Model};

/// The demand on one member from one live load.
struct Demand {
    dc: f64,
    dw: f64,
    /// Live force with impact, N.
    live: f64,
}

/// RF of one member at one level (None when the live force is negligible
/// or the inputs are not finite):
/// RF = (φc·φs·φ·Rn − γDC·DC·s − γDW·DW·s) / (γL·|L|), s = sign(L), each γ
/// at its maximum where its load adds to the live effect and its minimum
/// where it relieves it. For LFR and ASR the same form with A1, A2 or 1.0.
fn rate_one(
    method: &Method,
    level: &Level,
    cap: &MemberCapacity,
    d: &Demand,
) -> (Option<f64>, MemberRating) {
    let s = if d.live >= 0.0 { 1.0 } else { -1.0 };
    let r = &level.resistance;
    let (nominal, phi, governs, rp, u) = if d.live >= 0.0 {
        let (_, governs) = cap.tension_at(r);
        if governs == "fracture" {
            let rp = if r.uses_rp { cap.rp } else { 1.0 };
            (
                cap.tension_fracture_nominal,
                r.tension_fracture,
                "tension fracture",
                rp,
                cap.shear_lag,
            )
        } else {
            (
                cap.tension_yield_nominal,
                r.tension_yield,
                "tension yield",
                1.0,
                1.0,
            )
        }
    } else {
        (
            cap.compression.nominal,
            r.compression,
            "compression",
            1.0,
            1.0,
        )
    };
    let cs = method.condition_system(level);
    let capacity = cs * phi * nominal * rp;
    let gamma_dc = level.dc.applied(d.dc, s);
    let gamma_dw = level.dw.applied(d.dw, s);
    let denominator = level.gamma_live * d.live.abs();
    let negligible = d.live == 0.0 || d.live.abs() < 1e-12 * capacity.abs();
    let rf = (!negligible)
        .then(|| (capacity - gamma_dc * d.dc * s - gamma_dw * d.dw * s) / denominator)
        .filter(|v| v.is_finite());
    let row = MemberRating {
        member: 0,
        live_id: String::new(),
        at: None,
        legal: false,
        level: level.name,
        rf,
        dc: d.dc,
        dw: d.dw,
        live: d.live,
        capacity,
        nominal,
        governs,
        gamma_dc,
        gamma_dw,
        gamma_live: level.gamma_live,
        phi,
        phi_c: method.phi_c,
        phi_s: method.phi_s,
        phi_cs: cs,
        rp,
        u,
        clause: level.clause,
    };
    (rf, row)
}

/// One row per member, live load and level.
pub(super) fn rate_live_loads(
    model: &Model,
    results: &[CaseResult],
    envelopes: &[crate::loads::MovingEnvelope],
    method: &Method,
    members: &[MemberCapacity],
) -> Vec<MemberRating> {
    let (dc_cases, dw_cases) = model.dead_cases_split();
    let sum = |cases: &[usize], m: usize| cases.iter().map(|&c| results[c].forces[m]).sum::<f64>();
    let dc: Vec<f64> = (0..members.len()).map(|m| sum(&dc_cases, m)).collect();
    let dw: Vec<f64> = (0..members.len()).map(|m| sum(&dw_cases, m)).collect();
    let mut out = Vec::new();
    for (ci, case) in model.cases.iter().enumerate() {
        if case.kind != CaseKind::Live {
            continue;
        }
        let levels = if case.legal {
            &method.legal_levels
        } else {
            &method.design_levels
        };
        for (m, cap) in members.iter().enumerate() {
            let d = Demand {
                dc: dc[m],
                dw: dw[m],
                live: results[ci].forces[m] * (1.0 + case.impact),
            };
            for level in levels {
                let (_, mut row) = rate_one(method, level, cap, &d);
                row.member = m;
                row.live_id = case.id.clone();
                row.legal = case.legal;
                out.push(row);
            }
        }
    }
    let length = model.units.length;
    for env in envelopes {
        let Some(ml) = model.live.moving.iter().find(|x| x.id == env.moving_load) else {
            continue;
        };
        let levels = if ml.legal {
            &method.legal_levels
        } else {
            &method.design_levels
        };
        for (m, cap) in members.iter().enumerate() {
            let e = &env.per_member[m];
            for level in levels {
                // Rate each side of the envelope; the lower factor governs.
                let mut best: Option<MemberRating> = None;
                for (side, extreme) in [
                    (super::Side::Tension, &e.tension),
                    (super::Side::Compression, &e.compression),
                ] {
                    // A side whose extreme has the other sign (a member the
                    // vehicle never compresses, say) is not that side: the
                    // other side rates it.
                    let wrong_sign = match side {
                        super::Side::Tension => extreme.force < 0.0,
                        super::Side::Compression => extreme.force > 0.0,
                    };
                    if wrong_sign {
                        continue;
                    }
                    let d = Demand {
                        dc: dc[m],
                        dw: dw[m],
                        live: extreme.force,
                    };
                    let (Some(rf), mut row) = rate_one(method, level, cap, &d) else {
                        continue;
                    };
                    row.member = m;
                    row.live_id = env.moving_load.clone();
                    row.legal = ml.legal;
                    row.at = extreme.at.as_ref().map(|p| {
                        format!(
                            "{} with the front axle at {:.2} {} ({})",
                            side.label(),
                            p.position / length.to_si,
                            length.name,
                            format!("{:?}", p.direction).to_lowercase()
                        )
                    });
                    if best
                        .as_ref()
                        .is_none_or(|b| rf < b.rf.unwrap_or(f64::INFINITY))
                    {
                        best = Some(row);
                    }
                }
                out.extend(best);
            }
        }
    }
    out
}

/// The index of the lowest factor at each level, in the method's order.
pub(super) fn lowest_by_level(
    method: &Method,
    ratings: &[MemberRating],
) -> Vec<(&'static str, usize)> {
    let mut names: Vec<&'static str> = Vec::new();
    for l in method.design_levels.iter().chain(&method.legal_levels) {
        if !names.contains(&l.name) {
            names.push(l.name);
        }
    }
    names
        .into_iter()
        .filter_map(|name| {
            (0..ratings.len())
                .filter(|&i| ratings[i].level == name && ratings[i].rf.is_some())
                .min_by(|&a, &b| ratings[a].rf.unwrap().total_cmp(&ratings[b].rf.unwrap()))
                .map(|i| (name, i))
        })
        .collect()
}

/// The gross weight of a legal live load, N: a moving load's vehicle axles,
/// or a Live case's total downward load.
fn legal_weight(model: &Model, id: &str) -> Option<f64> {
    if let Some(ml) = model.live.moving.iter().find(|x| x.id == id) {
        // The model's vehicle carries this truss's share; W is the whole
        // vehicle's gross weight.
        let share = if ml.share > 0.0 { ml.share } else { 1.0 };
        let w = model.live.vehicles[ml.vehicle].weight() / share;
        return (w > 0.0).then_some(w);
    }
    let case = model.cases.iter().find(|c| c.id == id)?;
    let w: f64 = case.nodal.iter().map(|l| -l.fy).sum();
    (w > 0.0).then_some(w)
}

/// A posting for each legal live load: its lowest legal-level factor.
pub(super) fn postings(
    model: &Model,
    method: &Method,
    ratings: &[MemberRating],
) -> Vec<super::PostingRow> {
    let mut ids: Vec<&str> = Vec::new();
    for r in ratings.iter().filter(|r| r.legal) {
        if !ids.contains(&r.live_id.as_str()) {
            ids.push(&r.live_id);
        }
    }
    ids.into_iter()
        .filter_map(|id| {
            let low = ratings
                .iter()
                .filter(|r| r.legal && r.live_id == id && r.rf.is_some())
                .min_by(|a, b| a.rf.unwrap().total_cmp(&b.rf.unwrap()))?;
            let weight = legal_weight(model, id)?;
            let rf = low.rf.unwrap();
            Some(super::PostingRow {
                vehicle: id.to_string(),
                weight,
                rf,
                member: low.member,
                posting: posting::posting(method.family, rf, weight),
                clause: posting::clause(method.family),
                joint: None,
            })
        })
        .collect()
}
