//! The rating results flattened into display-unit rows, shared by the
//! text, JSON and CSV writers so the three formats always agree.

use super::Scale;
use crate::capacity::Regime;
use crate::model::Model;
use crate::rate::{Check, MemberRating, Rating};

/// One check row in display units.
pub struct CheckRow<'a> {
    pub member: &'a str,
    pub case: &'a str,
    /// Not the method's own comparison (see `Check::service`): not counted.
    pub service: bool,
    /// "service" (unfactored effect, factored method) or "factored"
    /// (combination, allowable-stress method).
    pub label: &'static str,
    pub force: f64,
    pub stress: f64,
    pub axis: &'static str,
    pub slenderness: f64,
    pub slenderness_in: f64,
    pub slenderness_out: f64,
    pub euler_stress: f64,
    pub critical_stress: f64,
    pub capacity: f64,
    /// |force| / capacity; not finite when the capacity is zero.
    pub utilization: f64,
    /// The capacity is zero (or not positive): the utilization is shown as
    /// null / empty with this flag, never like "not applicable" (issue 22,
    /// item 16); with a force the check fails.
    pub zero_capacity: bool,
    pub margin: Option<f64>,
    pub regime: &'static str,
    pub rating_factor: Option<f64>,
    pub clause: &'static str,
    pub formula: &'static str,
    /// The governing buckling mode and its clause (compression rows), e.g.
    /// "flexural-torsional (AISC 360-16 §E4, Eq. E4-3)"; "" in tension.
    pub mode: String,
}

pub fn check_row<'a>(model: &'a Model, r: &'a Rating, c: &Check) -> CheckRow<'a> {
    let s = Scale::of(model);
    let cap = &r.members[c.member];
    let area = model.sections[model.members[c.member].section].area;
    // A slack tension-only member is shown against its tension resistance:
    // it is never checked in compression (issue 16).
    let slack = c.regime == Regime::Slack;
    let tension = c.regime == Regime::Tension || slack;
    CheckRow {
        member: &model.members[c.member].id,
        case: &r.effects[c.effect].id,
        service: c.service,
        label: if r.effects[c.effect].factored {
            "factored"
        } else {
            "service"
        },
        force: c.force / s.force,
        stress: c.stress / s.stress,
        axis: cap.axis.as_str(),
        slenderness: cap.slenderness(),
        slenderness_in: cap.slenderness_in,
        slenderness_out: cap.slenderness_out,
        euler_stress: cap.compression.euler_stress / s.stress,
        critical_stress: if tension {
            cap.tension_nominal / area / s.stress
        } else {
            cap.compression.critical_stress / s.stress
        },
        capacity: c.capacity / s.force,
        utilization: c.utilization,
        zero_capacity: c.capacity <= 0.0 || c.capacity.is_nan(),
        margin: c.margin,
        regime: c.regime.as_str(),
        rating_factor: c.rating_factor,
        clause: if tension {
            cap.tension_clause
        } else {
            cap.compression.clause
        },
        formula: if slack {
            "slack: a tension-only member (eyebar, rod, counter) carries no compression"
        } else if tension {
            "min(yield on gross area, fracture on net area)"
        } else {
            cap.compression.check.formula
        },
        mode: if tension {
            String::new()
        } else {
            let g = cap.modes.governing().kind;
            format!("{} (Fe by {})", g.name(), g.clause())
        },
    }
}

impl CheckRow<'_> {
    /// The utilization for a text table: `d` significant digits, or
    /// "zero C" when the capacity is zero.
    pub fn utilization_text(&self, d: usize) -> String {
        if self.zero_capacity {
            ZERO_CAPACITY.into()
        } else {
            super::table::sig(self.utilization, d)
        }
    }
}

/// What a text table shows for the utilization of a check whose capacity
/// is zero.
pub const ZERO_CAPACITY: &str = "zero C";

/// Rating indices sorted by rating factor, lowest first (rows without a
/// factor last), levels in the method's order within one factor.
pub fn by_rating(r: &Rating) -> Vec<usize> {
    let mut idx: Vec<usize> = (0..r.ratings.len()).collect();
    idx.sort_by(|&a, &b| {
        let key = |i: usize| r.ratings[i].rf.unwrap_or(f64::INFINITY);
        key(a).total_cmp(&key(b)).then(a.cmp(&b))
    });
    idx
}

/// One rating row in display units, with its factors spelled out.
pub struct RatingRow<'a> {
    pub member: &'a str,
    pub live: &'a str,
    pub level: &'static str,
    pub rf: Option<f64>,
    pub dc: f64,
    pub dw: f64,
    pub live_force: f64,
    pub capacity: f64,
    pub nominal: f64,
    pub governs: &'static str,
    /// "γDC 0.90 (relieves) · γDW 1.50 · γL 1.75 · φ 0.95 · φc·φs 0.95 · Rp 0.90 · U 1.00".
    pub factors: String,
    pub clause: &'static str,
    pub at: Option<&'a str>,
}

pub fn rating_row<'a>(model: &'a Model, r: &'a Rating, mr: &'a MemberRating) -> RatingRow<'a> {
    let s = Scale::of(model);
    let sign = if mr.live >= 0.0 { 1.0 } else { -1.0 };
    let how = |d: f64| if d * sign < 0.0 { " (relieves)" } else { "" };
    let mut factors = format!(
        "γDC {:.2}{} · γDW {:.2}{} · γL {:.2} · {} {:.3}",
        mr.gamma_dc,
        how(mr.dc),
        mr.gamma_dw,
        how(mr.dw),
        mr.gamma_live,
        r.method.check.symbol,
        mr.phi
    );
    if mr.phi_cs != 1.0 || mr.phi_c != 1.0 || mr.phi_s != 1.0 {
        factors.push_str(&format!(
            " · φc {:.2} · φs {:.2} · φc·φs {:.3}",
            mr.phi_c, mr.phi_s, mr.phi_cs
        ));
    }
    if mr.governs == "tension fracture" {
        factors.push_str(&format!(" · Rp {:.2} · U {:.3}", mr.rp, mr.u));
    }
    RatingRow {
        member: &model.members[mr.member].id,
        live: &mr.live_id,
        level: mr.level,
        rf: mr.rf,
        dc: mr.dc / s.force,
        dw: mr.dw / s.force,
        live_force: mr.live / s.force,
        capacity: mr.capacity / s.force,
        nominal: mr.nominal / s.force,
        governs: mr.governs,
        factors,
        clause: mr.clause,
        at: mr.at.as_deref(),
    }
}

/// A posting in display units: the weight and posting load in the force
/// unit and in tons (short tons of 2000 lbf for US force units, tonnes of
/// 9.80665 kN otherwise).
pub struct PostingView<'a> {
    pub vehicle: &'a str,
    /// The governing element: a member id, or a joint check described.
    pub member: String,
    pub rf: f64,
    pub weight: f64,
    pub weight_tons: f64,
    /// None: no posting; Some(None): restrict or close; Some(Some(p)): post at p.
    pub posting: Option<Option<f64>>,
    pub posting_tons: Option<f64>,
    pub ton_name: &'static str,
    pub clause: &'static str,
}

pub fn posting_view<'a>(
    model: &'a Model,
    rating: &Rating,
    p: &'a crate::rate::PostingRow,
) -> PostingView<'a> {
    use crate::method::posting::Posting;
    let s = Scale::of(model);
    let us = matches!(model.units.force.name, "kip" | "lbf" | "lb");
    let (ton, ton_name) = if us {
        (2000.0 * 4.448_221_615_260_5, "ton")
    } else {
        (9_806.65, "t")
    };
    let posting = match p.posting {
        Posting::None => None,
        Posting::RestrictOrClose => Some(None),
        Posting::Post(w) => Some(Some(w)),
    };
    PostingView {
        vehicle: &p.vehicle,
        member: match p.joint {
            None => model.members[p.member].id.to_string(),
            Some(i) => rating_joint_words(model, rating, i),
        },
        rf: p.rf,
        weight: p.weight / s.force,
        weight_tons: p.weight / ton,
        posting: posting.map(|o| o.map(|w| w / s.force)),
        posting_tons: posting.flatten().map(|w| w / ton),
        ton_name,
        clause: p.clause,
    }
}

/// A joint rating row described for a sentence: "joint L3, fastener shear
/// of U2-L3 (2 gusset plates)".
pub fn rating_joint_words(model: &Model, rating: &Rating, i: usize) -> String {
    let Some(j) = &rating.joints else {
        return String::new();
    };
    let check = &j.checks[j.ratings[i].check];
    let member = check
        .member()
        .map_or(String::new(), |m| format!(" of {}", model.members[m].id));
    format!(
        "joint {}, {}{} ({})",
        model.nodes[check.node()].id,
        check.kind(),
        member,
        check.part()
    )
}

/// The posting's verdict as words.
pub fn posting_words(p: &PostingView) -> String {
    match p.posting {
        None => "no posting (RF ≥ 1.0)".to_string(),
        Some(None) => "restrict or close (RF below the posting range)".to_string(),
        Some(Some(w)) => format!(
            "post at {} ({} {})",
            super::table::sig(w, 3),
            super::table::sig(p.posting_tons.unwrap_or(0.0), 3),
            p.ton_name
        ),
    }
}

/// Check indices sorted by utilization, highest first.
pub fn by_utilization(r: &Rating) -> Vec<usize> {
    let mut idx: Vec<usize> = (0..r.checks.len()).collect();
    idx.sort_by(|&a, &b| {
        r.checks[b]
            .utilization
            .total_cmp(&r.checks[a].utilization)
            .then(a.cmp(&b))
    });
    idx
}
