//! `panelpoint rate --format json`: the `solve` output plus the curve, every
//! check, the controlling check, the rating factors and the notes.

use super::json::{num, string, write_cases, write_header};
use super::rate_rows::check_row;
use super::Scale;
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
    let s = Scale::of(model);
    write_header(w, model, warnings, &analysis.warnings)?;
    write_cases(w, model, analysis)?;
    write!(
        w,
        ",\"curve\":{},\"checks\":[",
        string(&rating.curve.name())
    )?;
    for (i, c) in rating.checks.iter().enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        let r = check_row(model, rating, c);
        write!(
            w,
            "{{\"member\":{},\"case\":{},\"force\":{},\"stress\":{},\"axis\":{},\"slenderness\":{},\"slenderness_in\":{},\"slenderness_out\":{},\"euler_stress\":{},\"critical_stress\":{},\"capacity\":{},\"utilization\":{},\"margin\":{},\"regime\":{},\"rating_factor\":{},\"clause\":{},\"formula\":{}}}",
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
            opt(r.margin),
            string(r.regime),
            opt(r.rating_factor),
            string(r.clause),
            string(r.formula),
        )?;
    }
    w.write_all(b"],\"controlling\":")?;
    match rating.controlling {
        Some(i) => {
            let r = check_row(model, rating, &rating.checks[i]);
            write!(
                w,
                "{{\"member\":{},\"case\":{},\"utilization\":{}}}",
                string(r.member),
                string(r.case),
                num(r.utilization)
            )?;
        }
        None => w.write_all(b"null")?,
    }
    w.write_all(b",\"ratings\":[")?;
    for (i, r) in rating.ratings.iter().enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        write!(
            w,
            "{{\"member\":{},\"live_case\":{},\"dead\":{},\"live_with_impact\":{},\"capacity\":{},\"inventory\":{},\"operating\":{},\"position\":{}}}",
            string(&model.members[r.member].id),
            string(&r.live_id),
            num(r.dead / s.force),
            num(r.live / s.force),
            num(r.capacity / s.force),
            opt(r.inventory),
            opt(r.operating),
            r.at.as_ref().map_or("null".into(), |a| string(a))
        )?;
    }
    w.write_all(b"],\"lowest_rating\":")?;
    match rating.lowest {
        Some(i) => {
            let r = &rating.ratings[i];
            write!(
                w,
                "{{\"member\":{},\"live_case\":{},\"inventory\":{},\"operating\":{}}}",
                string(&model.members[r.member].id),
                string(&r.live_id),
                opt(r.inventory),
                opt(r.operating)
            )?;
        }
        None => w.write_all(b"null")?,
    }
    w.write_all(b",\"notes\":[")?;
    for (i, n) in rating.notes.iter().enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        w.write_all(string(n).as_bytes())?;
    }
    w.write_all(b"]}\n")
}
