//! `panelpoint rate` as text: the controlling member and case on top, then
//! the checks sorted by utilization and the rating factors, units in every
//! header, and the caution.

use super::rate_rows::{by_utilization, check_row};
use super::table::{sig, Table};
use super::term::{Mark, Term};
use super::text::header;
use super::Scale;
use crate::analysis::Analysis;
use crate::input::Diagnostic;
use crate::model::Model;
use crate::rate::Rating;
use std::io::{self, Write};

fn opt(v: Option<f64>, d: usize) -> String {
    v.map_or("-".into(), |v| sig(v, d))
}

pub fn rate(
    w: &mut dyn Write,
    model: &Model,
    analysis: &Analysis,
    rating: &Rating,
    warnings: &[Diagnostic],
    all_rows: bool,
) -> io::Result<()> {
    rate_term(
        w,
        model,
        analysis,
        rating,
        warnings,
        all_rows,
        &Term::plain(),
    )
}

/// `panelpoint rate` as text for `term`: the controlling verdict and rows
/// over capacity emphasised when it takes colour; on a narrow terminal the
/// check table leaves out, in order, Fe, Fcr, axis, margin, KL/r, regime.
pub fn rate_term(
    w: &mut dyn Write,
    model: &Model,
    analysis: &Analysis,
    rating: &Rating,
    warnings: &[Diagnostic],
    all_rows: bool,
    term: &Term,
) -> io::Result<()> {
    header(w, model, "rate", warnings, &analysis.warnings)?;
    let s = Scale::of(model);
    writeln!(w, "Column curve: {}", rating.curve.name())?;
    if let Some(i) = rating.controlling {
        let r = check_row(model, rating, &rating.checks[i]);
        let verdict = if r.utilization > 1.0 {
            term.paint("FAILS", Mark::Fail)
        } else {
            term.paint("passes", Mark::Strong)
        };
        writeln!(
            w,
            "\nControlling: member {} under \"{}\", utilization {} ({verdict}); {} {} against capacity {} {} ({}, {})",
            r.member,
            r.case,
            sig(r.utilization, 3),
            sig(r.force, 4),
            s.force_name,
            sig(r.capacity, 4),
            s.force_name,
            r.regime,
            r.clause
        )?;
    }
    if let Some(i) = rating.lowest {
        let r = &rating.ratings[i];
        writeln!(
            w,
            "Lowest rating factor: {} (inventory), {} (operating) — member {} for live load \"{}\"{}",
            opt(r.inventory, 3),
            opt(r.operating, 3),
            model.members[r.member].id,
            r.live_id,
            r.at.as_ref().map_or(String::new(), |a| format!(", {a}"))
        )?;
    } else {
        writeln!(
            w,
            "No rating factors: the model declares no Live load case (set kind: Live, and kind: Dead on dead cases)."
        )?;
    }
    let failing = rating.checks.iter().filter(|c| c.utilization > 1.0).count();
    if failing > 0 {
        let line = format!("{failing} check(s) exceed capacity (utilization > 1).");
        writeln!(w, "{}", term.paint(&line, Mark::Fail))?;
    }

    writeln!(w, "\n== Checks, highest utilization first ==")?;
    let fu = format!("force {}", s.force_name);
    let eu = format!("Fe {}", s.stress_name);
    let cu = format!("Fcr {}", s.stress_name);
    let pu = format!("capacity {}", s.force_name);
    let mut t = Table::new(&[
        "member", "case", &fu, "axis", "KL/r", &eu, &cu, "regime", &pu, "util", "margin", "RF inv",
    ]);
    let order = by_utilization(rating);
    let limit = if all_rows {
        order.len()
    } else {
        order.len().min(40)
    };
    for (k, &i) in order[..limit].iter().enumerate() {
        let r = check_row(model, rating, &rating.checks[i]);
        let mark = if r.utilization > 1.0 {
            Mark::Fail
        } else if k == 0 {
            Mark::Strong
        } else {
            Mark::Plain
        };
        t.row_marked(
            vec![
                r.member.into(),
                r.case.into(),
                sig(r.force, 4),
                r.axis.into(),
                sig(r.slenderness, 4),
                sig(r.euler_stress, 4),
                sig(r.critical_stress, 4),
                r.regime.into(),
                sig(r.capacity, 4),
                sig(r.utilization, 3),
                opt(r.margin, 3),
                opt(r.rating_factor, 3),
            ],
            mark,
        );
    }
    t.optional(&[eu.as_str(), cu.as_str(), "axis", "margin", "KL/r", "regime"]);
    write!(w, "{}", t.render_for(term))?;
    if limit < order.len() {
        writeln!(
            w,
            "({} more rows; --all shows every row, --format csv gives them all)",
            order.len() - limit
        )?;
    }

    if !rating.ratings.is_empty() {
        writeln!(w, "\n== Rating factors, lowest first ==")?;
        let idx = super::rate_rows::by_rating(rating);
        let du = format!("dead {}", s.force_name);
        let lu = format!("live+IM {}", s.force_name);
        let cu = format!("capacity {}", s.force_name);
        let mut t = Table::new(&[
            "member",
            "live case",
            &du,
            &lu,
            &cu,
            "RF inventory",
            "RF operating",
        ]);
        let limit = if all_rows {
            idx.len()
        } else {
            idx.len().min(25)
        };
        for &i in &idx[..limit] {
            let r = &rating.ratings[i];
            t.row(vec![
                model.members[r.member].id.to_string(),
                r.live_id.clone(),
                sig(r.dead / s.force, 4),
                sig(r.live / s.force, 4),
                sig(r.capacity / s.force, 4),
                opt(r.inventory, 3),
                opt(r.operating, 3),
            ]);
        }
        write!(w, "{}", t.render_for(term))?;
    }
    if !rating.notes.is_empty() {
        writeln!(w, "\nNotes:")?;
        for n in &rating.notes {
            writeln!(w, "- {n}")?;
        }
    }
    writeln!(
        w,
        "\nutil = |force| / design capacity; margin = critical stress / |stress| (factor of safety against buckling, or against yield/fracture in tension); RF = (φC − γD·D) / (γL·(L + IM))."
    )?;
    Ok(())
}
