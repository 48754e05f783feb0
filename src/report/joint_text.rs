//! The joint checks in `panelpoint rate` text: the lowest joint factor at
//! each level beside the members' (which element controls), and one row per
//! joint check with its clause.

use super::joint_rows::{inputs_line, joint_views};
use super::table::{sig, Table};
use super::term::{Mark, Term};
use crate::model::Model;
use crate::rate::Rating;
use std::io::{self, Write};

/// "Lowest joint rating factor, inventory: …", saying whether it is below
/// the lowest member factor (the joint then controls the truss).
pub fn summary(w: &mut dyn Write, model: &Model, rating: &Rating) -> io::Result<()> {
    let Some(j) = &rating.joints else {
        return Ok(());
    };
    for &(level, mi) in &rating.lowest_by_level {
        let Some(i) = j.lowest_at(level) else {
            continue;
        };
        let r = &j.ratings[i];
        let rf = r.rf.unwrap_or(f64::NAN);
        let member_rf = rating.ratings[mi].rf.unwrap_or(f64::INFINITY);
        writeln!(
            w,
            "Lowest joint rating factor, {level}: {} — {} for live load \"{}\"{}{}",
            sig(rf, 3),
            super::rate_rows::rating_joint_words(model, rating, i),
            r.live_id,
            r.at.as_ref().map_or(String::new(), |a| format!(" ({a})")),
            if rf < member_rf {
                "; below every member: the joint controls"
            } else {
                ""
            }
        )?;
    }
    Ok(())
}

/// The joint check table, lowest factor first.
pub fn table(w: &mut dyn Write, model: &Model, rating: &Rating, term: &Term) -> io::Result<()> {
    let views = joint_views(model, rating);
    if views.is_empty() {
        return Ok(());
    }
    writeln!(
        w,
        "\n== Joint checks (factor at {}, lowest first) ==",
        rating.method.primary_level()
    )?;
    let mut order: Vec<usize> = (0..views.len()).collect();
    order.sort_by(|&a, &b| {
        let key = |i: usize| views[i].rf.unwrap_or(f64::INFINITY);
        key(a).total_cmp(&key(b))
    });
    let mut t = Table::new(&[
        "node",
        "check",
        "member",
        "demand",
        "resistance",
        "unit",
        "RF",
        "live load",
        "clause",
    ]);
    for &i in &order {
        let v = &views[i];
        let fails = v.rf.is_some_and(|r| r < 1.0) || (v.rf.is_none() && v.demand > v.resistance);
        t.row_marked(
            vec![
                v.node.clone(),
                v.kind.to_string(),
                v.member.clone().unwrap_or_else(|| "—".into()),
                sig(v.demand, 4),
                sig(v.resistance, 4),
                v.unit.clone(),
                v.rf.map_or("—".into(), |r| sig(r, 3)),
                v.live.clone().unwrap_or_default(),
                v.clause.to_string(),
            ],
            if fails { Mark::Fail } else { Mark::Plain },
        );
    }
    t.optional(&["clause", "live load", "unit"]);
    write!(w, "{}", t.render_for(term))?;
    writeln!(w)?;
    writeln!(w, "Joint check inputs and equations:")?;
    for &i in &order {
        let v = &views[i];
        writeln!(
            w,
            "- {} {}{} ({}): {} — {}",
            v.node,
            v.kind,
            v.member
                .as_ref()
                .map_or(String::new(), |m| format!(" of {m}")),
            v.part,
            v.equation,
            inputs_line(v)
        )?;
    }
    writeln!(
        w,
        "(demand and resistance with the factored dead load and the live load at its factor; RF the live multiplier at which the check reaches its limit; several members' envelopes combined at the corners of their extremes, an upper bound of any one vehicle position)"
    )?;
    Ok(())
}
