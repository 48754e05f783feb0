//! `panelpoint rate --format csv`: one row per member and load case or
//! combination, units in the headers; then, after a blank line, one row
//! per member, live load and rating level with every factor; then, after
//! another blank line, the postings of legal loads (when there are any);
//! then, after another, one row per joint check, live load and level.

use super::csv::{field, num};
use super::rate_rows::{by_rating, by_utilization, check_row, posting_view, rating_row};
use super::Scale;
use crate::model::Model;
use crate::rate::Rating;
use std::io::{self, Write};

pub fn rate(w: &mut dyn Write, model: &Model, rating: &Rating) -> io::Result<()> {
    let s = Scale::of(model);
    writeln!(
        w,
        "member,case,force_{f},stress_{st},axis,slenderness,euler_stress_{st},critical_stress_{st},capacity_{f},utilization,margin,regime,rating_factor,method,service,clause,zero_capacity",
        f = s.force_name,
        st = s.stress_name
    )?;
    let method = &rating.method.name;
    for i in by_utilization(rating) {
        let r = check_row(model, rating, &rating.checks[i]);
        writeln!(
            w,
            "{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{}",
            field(r.member),
            field(r.case),
            num(r.force),
            num(r.stress),
            r.axis,
            num(r.slenderness),
            num(r.euler_stress),
            num(r.critical_stress),
            num(r.capacity),
            num(r.utilization),
            r.margin.map_or(String::new(), num),
            r.regime,
            r.rating_factor.map_or(String::new(), num),
            field(method),
            r.service,
            field(r.clause),
            r.zero_capacity
        )?;
    }
    if !rating.ratings.is_empty() {
        writeln!(
            w,
            "\nmember,live_load,level,rf,dc_{f},dw_{f},live_with_impact_{f},capacity_{f},nominal_{f},governs,gamma_dc,gamma_dw,gamma_live,phi,phi_c,phi_s,phi_cs,rp,u,position,clause",
            f = s.force_name
        )?;
        for i in by_rating(rating) {
            let mr = &rating.ratings[i];
            let r = rating_row(model, rating, mr);
            writeln!(
                w,
                "{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{}",
                field(r.member),
                field(r.live),
                r.level,
                r.rf.map_or(String::new(), num),
                num(r.dc),
                num(r.dw),
                num(r.live_force),
                num(r.capacity),
                num(r.nominal),
                r.governs,
                num(mr.gamma_dc),
                num(mr.gamma_dw),
                num(mr.gamma_live),
                num(mr.phi),
                num(mr.phi_c),
                num(mr.phi_s),
                num(mr.phi_cs),
                num(mr.rp),
                num(mr.u),
                field(r.at.unwrap_or("")),
                field(r.clause)
            )?;
        }
    }
    if !rating.postings.is_empty() {
        writeln!(
            w,
            "\nvehicle,weight_{f},weight_tons,rf,member,posting_{f},posting_tons,verdict,clause",
            f = s.force_name
        )?;
        for p in &rating.postings {
            let v = posting_view(model, rating, p);
            writeln!(
                w,
                "{},{},{},{},{},{},{},{},{}",
                field(v.vehicle),
                num(v.weight),
                num(v.weight_tons),
                num(v.rf),
                field(&v.member),
                v.posting.flatten().map_or(String::new(), num),
                v.posting_tons.map_or(String::new(), num),
                field(&super::rate_rows::posting_words(&v)),
                field(v.clause)
            )?;
        }
    }
    joints(w, model, rating)
}

/// One row per joint check, live load and level: demand and resistance with
/// the factored dead load and the live load at its factor.
fn joints(w: &mut dyn Write, model: &Model, rating: &Rating) -> io::Result<()> {
    let Some(j) = &rating.joints else {
        return Ok(());
    };
    writeln!(
        w,
        "\nnode,check,member,part,live_load,level,rf,demand,resistance,unit,gamma_dc,gamma_dw,gamma_live,position,clause"
    )?;
    for r in &j.ratings {
        let c = &j.checks[r.check];
        let dim = c.dimension();
        let (demand, unit) = super::joint_rows::shown(model, dim, r.factored.demand);
        let (resistance, _) = super::joint_rows::shown(model, dim, r.factored.resistance);
        writeln!(
            w,
            "{},{},{},{},{},{},{},{},{},{},{},{},{},{},{}",
            field(&model.nodes[c.node()].id),
            field(c.kind()),
            field(
                &c.member()
                    .map_or(String::new(), |m| model.members[m].id.to_string())
            ),
            field(&c.part()),
            field(&r.live_id),
            r.level,
            r.rf.map_or(String::new(), num),
            num(demand),
            num(resistance),
            field(&unit),
            num(r.gamma_dc),
            num(r.gamma_dw),
            num(r.gamma_live),
            field(r.at.as_deref().unwrap_or("")),
            field(c.clause(&rating.method))
        )?;
    }
    Ok(())
}
