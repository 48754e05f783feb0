//! `panelpoint rate --format csv`: one row per member and load case or
//! combination, units in the headers.

use super::csv::{field, num};
use super::rate_rows::{by_utilization, check_row};
use super::Scale;
use crate::model::Model;
use crate::rate::Rating;
use std::io::{self, Write};

pub fn rate(w: &mut dyn Write, model: &Model, rating: &Rating) -> io::Result<()> {
    let s = Scale::of(model);
    writeln!(
        w,
        "member,case,force_{f},stress_{st},axis,slenderness,euler_stress_{st},critical_stress_{st},capacity_{f},utilization,margin,regime,rating_factor,curve,clause",
        f = s.force_name,
        st = s.stress_name
    )?;
    let curve = rating.curve.name();
    for i in by_utilization(rating) {
        let r = check_row(model, rating, &rating.checks[i]);
        writeln!(
            w,
            "{},{},{},{},{},{},{},{},{},{},{},{},{},{},{}",
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
            field(&curve),
            field(r.clause)
        )?;
    }
    Ok(())
}
