//! `panelpoint rate --format json`: the `solve` output plus the curve, every
//! check, the controlling check, the rating factors and the notes.

use super::json::{num, string, write_cases, write_header};
use super::rate_rows::check_row;
use crate::analysis::Analysis;
use crate::input::Diagnostic;
use crate::model::Model;
use crate::rate::Rating;
use std::io::{self, Write};

fn opt(v: Option<f64>) -> String {
    v.map_or("null".into(), num)
}

pub fn rate(
    w: &mut dyn Write,
    model: &Model,
    analysis: &Analysis,
    rating: &Rating,
    warnings: &[Diagnostic],
) -> io::Result<()> {
    write_header(w, model, warnings, &analysis.warnings)?;
    write_cases(w, model, analysis)?;
    let m = &rating.method;
    write!(
        w,
        ",\"method\":{},\"equation\":{},\"levels\":[",
        string(&m.name),
        string(m.equation)
    )?;
    let levels: Vec<_> = m
        .design_levels
        .iter()
        .map(|l| (l, false))
        .chain(m.legal_levels.iter().map(|l| (l, true)))
        .collect();
    for (i, (l, legal)) in levels.iter().enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        write!(
            w,
            "{{\"level\":{},\"for_legal_loads\":{},\"gamma_live\":{},\"gamma_dc_max\":{},\"gamma_dc_min\":{},\"gamma_dw_max\":{},\"gamma_dw_min\":{},\"phi_compression\":{},\"phi_tension_yield\":{},\"phi_tension_fracture\":{},\"phi_cs\":{},\"clause\":{}}}",
            string(l.name),
            legal,
            num(l.gamma_live),
            num(l.dc.max),
            num(l.dc.min),
            num(l.dw.max),
            num(l.dw.min),
            num(l.resistance.compression),
            num(l.resistance.tension_yield),
            num(l.resistance.tension_fracture),
            num(m.condition_system(l)),
            string(l.clause)
        )?;
    }
    write!(
        w,
        "],\"phi_c\":{},\"phi_s\":{},\"compression_clause\":{},\"tension_clause\":{},\"checks\":[",
        num(m.phi_c),
        num(m.phi_s),
        string(m.check.compression_clause),
        string(m.check.tension_clause)
    )?;
    for (i, c) in rating.checks.iter().enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        let r = check_row(model, rating, c);
        write!(
            w,
            "{{\"member\":{},\"case\":{},\"force\":{},\"stress\":{},\"axis\":{},\"slenderness\":{},\"slenderness_in\":{},\"slenderness_out\":{},\"euler_stress\":{},\"critical_stress\":{},\"capacity\":{},\"utilization\":{},\"zero_capacity\":{},\"margin\":{},\"regime\":{},\"rating_factor\":{},\"service\":{},\"clause\":{},\"formula\":{},\"mode\":{}}}",
            string(r.member),
            string(r.case),
            num(r.force),
            num(r.stress),
            string(r.axis),
            num(r.slenderness),
            num(r.slenderness_in),
            num(r.slenderness_out),
            num(r.euler_stress),
            num(r.critical_stress),
            num(r.capacity),
            num(r.utilization),
            r.zero_capacity,
            opt(r.margin),
            string(r.regime),
            opt(r.rating_factor),
            r.service,
            string(r.clause),
            string(r.formula),
            string(&r.mode),
        )?;
    }
    w.write_all(b"],\"controlling\":")?;
    match rating.controlling {
        Some(i) => {
            let r = check_row(model, rating, &rating.checks[i]);
            write!(
                w,
                "{{\"member\":{},\"case\":{},\"utilization\":{},\"zero_capacity\":{}}}",
                string(r.member),
                string(r.case),
                num(r.utilization),
                r.zero_capacity
            )?;
        }
        None => w.write_all(b"null")?,
    }
    w.write_all(b",\"ratings\":[")?;
    for (i, mr) in rating.ratings.iter().enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        let r = super::rate_rows::rating_row(model, rating, mr);
        write!(
            w,
            "{{\"member\":{},\"live_case\":{},\"legal\":{},\"level\":{},\"rf\":{},\"capacity\":{},\"nominal\":{},\"governs\":{},\"dead\":{},\"dead_dc\":{},\"dead_dw\":{},\"live_with_impact\":{},\"gamma_dead\":{},\"gamma_dw\":{},\"gamma_live\":{},\"phi\":{},\"phi_c\":{},\"phi_s\":{},\"phi_cs\":{},\"rp\":{},\"u\":{},\"clause\":{},\"position\":{}}}",
            string(r.member),
            string(r.live),
            mr.legal,
            string(r.level),
            opt(r.rf),
            num(r.capacity),
            num(r.nominal),
            string(r.governs),
            num(r.dc + r.dw),
            num(r.dc),
            num(r.dw),
            num(r.live_force),
            num(mr.gamma_dc),
            num(mr.gamma_dw),
            num(mr.gamma_live),
            num(mr.phi),
            num(mr.phi_c),
            num(mr.phi_s),
            num(mr.phi_cs),
            num(mr.rp),
            num(mr.u),
            string(r.clause),
            r.at.map_or("null".into(), string)
        )?;
    }
    w.write_all(b"],\"lowest_rating\":")?;
    match rating.lowest {
        Some(i) => {
            let r = &rating.ratings[i];
            write!(
                w,
                "{{\"member\":{},\"live_case\":{},\"level\":{},\"rf\":{}}}",
                string(&model.members[r.member].id),
                string(&r.live_id),
                string(r.level),
                opt(r.rf)
            )?;
        }
        None => w.write_all(b"null")?,
    }
    w.write_all(b",\"controlling_by_level\":[")?;
    for (k, &(level, i)) in rating.lowest_by_level.iter().enumerate() {
        if k > 0 {
            w.write_all(b",")?;
        }
        let r = &rating.ratings[i];
        write!(
            w,
            "{{\"level\":{},\"member\":{},\"live_case\":{},\"rf\":{}}}",
            string(level),
            string(&model.members[r.member].id),
            string(&r.live_id),
            opt(r.rf)
        )?;
    }
    w.write_all(b"],\"controlling_element_by_level\":[")?;
    for (k, c) in super::joint_rows::controlling_by_level(model, rating)
        .iter()
        .enumerate()
    {
        if k > 0 {
            w.write_all(b",")?;
        }
        write!(
            w,
            "{{\"level\":{},\"element\":{},\"id\":{},\"node\":{},\"live_case\":{},\"rf\":{}}}",
            string(c.level),
            string(if c.joint { "joint" } else { "member" }),
            string(&c.element),
            c.node.as_deref().map_or("null".into(), string),
            string(&c.live),
            opt(c.rf)
        )?;
    }
    w.write_all(b"],\"postings\":[")?;
    for (k, p) in rating.postings.iter().enumerate() {
        if k > 0 {
            w.write_all(b",")?;
        }
        let v = super::rate_rows::posting_view(model, rating, p);
        write!(
            w,
            "{{\"vehicle\":{},\"weight\":{},\"weight_tons\":{},\"rf\":{},\"member\":{},\"posting\":{},\"posting_tons\":{},\"restrict_or_close\":{},\"clause\":{}}}",
            string(v.vehicle),
            num(v.weight),
            num(v.weight_tons),
            num(v.rf),
            string(&v.member),
            opt(v.posting.flatten()),
            opt(v.posting_tons),
            v.posting == Some(None),
            string(v.clause)
        )?;
    }
    w.write_all(b"]")?;
    w.write_all(b",\"lacing_bars\":[")?;
    let mut first = true;
    for (m, cap) in rating.members.iter().enumerate() {
        let Some(b) = &cap.lacing_bars else { continue };
        if !first {
            w.write_all(b",")?;
        }
        first = false;
        write!(
            w,
            "{{\"member\":{},\"shear\":{},\"bar_force\":{},\"bar_strength\":{},\"utilization\":{},\"slenderness\":{},\"slenderness_limit\":{},\"slenderness_ok\":{},\"clause\":{}}}",
            string(&model.members[m].id),
            num(b.shear / super::Scale::of(model).force),
            num(b.force / super::Scale::of(model).force),
            num(b.capacity / super::Scale::of(model).force),
            num(b.utilization),
            num(b.slenderness),
            num(b.slenderness_limit),
            b.slenderness_ok,
            string(crate::rate::lacing::LacingBarCheck::CLAUSE)
        )?;
    }
    w.write_all(b"]")?;
    write_joints(w, model, rating)?;
    w.write_all(b",\"notes\":[")?;
    let joint_notes = rating.joints.iter().flat_map(|j| j.notes.iter());
    for (i, n) in rating.notes.iter().chain(joint_notes).enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        w.write_all(string(n).as_bytes())?;
    }
    w.write_all(b"]}\n")
}

/// `"joints": [{"node", "checks": [{"kind", "member", "demand", "resistance",
/// "rf", "clause", …}]}]`, nodes in the order their first check comes; each
/// check's demand and resistance where its lowest first-level factor was
/// found, and its factor at every level and live load.
fn write_joints(w: &mut dyn Write, model: &Model, rating: &Rating) -> io::Result<()> {
    w.write_all(b",\"joints\":[")?;
    let Some(j) = &rating.joints else {
        return w.write_all(b"]");
    };
    let views = super::joint_rows::joint_views(model, rating);
    let mut nodes: Vec<usize> = Vec::new();
    for c in &j.checks {
        if !nodes.contains(&c.node()) {
            nodes.push(c.node());
        }
    }
    for (k, &node) in nodes.iter().enumerate() {
        if k > 0 {
            w.write_all(b",")?;
        }
        write!(
            w,
            "{{\"node\":{},\"checks\":[",
            string(&model.nodes[node].id)
        )?;
        let mut first = true;
        for (ci, v) in views.iter().enumerate() {
            if j.checks[ci].node() != node {
                continue;
            }
            if !first {
                w.write_all(b",")?;
            }
            first = false;
            write!(
                w,
                "{{\"kind\":{},\"member\":{},\"part\":{},\"demand\":{},\"resistance\":{},\"unit\":{},\"rf\":{},\"level\":{},\"live_case\":{},\"at\":{},\"clause\":{},\"equation\":{},\"inputs\":{{",
                string(v.kind),
                v.member.as_deref().map_or("null".into(), string),
                string(&v.part),
                num(v.demand),
                num(v.resistance),
                string(&v.unit),
                opt(v.rf),
                v.level.map_or("null".into(), string),
                v.live.as_deref().map_or("null".into(), string),
                v.at.as_deref().map_or("null".into(), string),
                string(v.clause),
                string(&v.equation),
            )?;
            for (i, (name, x, u)) in v.inputs.iter().enumerate() {
                if i > 0 {
                    w.write_all(b",")?;
                }
                write!(
                    w,
                    "{}:{{\"value\":{},\"unit\":{}}}",
                    string(name),
                    num(*x),
                    string(u)
                )?;
            }
            w.write_all(b"},\"ratings\":[")?;
            let mut f = true;
            for r in j.ratings.iter().filter(|r| r.check == ci) {
                if !f {
                    w.write_all(b",")?;
                }
                f = false;
                write!(
                    w,
                    "{{\"level\":{},\"live_case\":{},\"rf\":{},\"gamma_dc\":{},\"gamma_dw\":{},\"gamma_live\":{}}}",
                    string(r.level),
                    string(&r.live_id),
                    opt(r.rf),
                    num(r.gamma_dc),
                    num(r.gamma_dw),
                    num(r.gamma_live)
                )?;
            }
            w.write_all(b"]}")?;
        }
        w.write_all(b"]}")?;
    }
    w.write_all(b"]")
}
