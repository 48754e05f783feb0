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
    let method = &rating.method;
    writeln!(w, "Rating method: {} — {}", method.name, method.equation)?;
    if let Some(i) = rating.controlling {
        let r = check_row(model, rating, &rating.checks[i]);
        let verdict = if r.zero_capacity {
            term.paint("FAILS: zero capacity", Mark::Fail)
        } else if r.utilization > 1.0 {
            term.paint("FAILS", Mark::Fail)
        } else {
            term.paint("passes", Mark::Strong)
        };
        writeln!(
            w,
            "\nControlling: member {} under \"{}\", utilization {} ({verdict}); {} {} against capacity {} {} ({}, {})",
            r.member,
            r.case,
            r.utilization_text(3),
            sig(r.force, 4),
            s.force_name,
            sig(r.capacity, 4),
            s.force_name,
            r.regime,
            r.clause
        )?;
    }
    if rating.lowest_by_level.is_empty() {
        if method.rates {
            writeln!(
                w,
                "No rating factors: the model declares no Live load case or moving load (set kind: Live, and kind: Dead on dead cases)."
            )?;
        } else {
            writeln!(
                w,
                "No rating factors: \"{}\" is a screening curve; give rating.safety_factor to rate with it.",
                method.name
            )?;
        }
    }
    for &(level, i) in &rating.lowest_by_level {
        let r = super::rate_rows::rating_row(model, rating, &rating.ratings[i]);
        writeln!(
            w,
            "Lowest rating factor, {level}: {} — member {} for live load \"{}\"{} ({})",
            opt(r.rf, 3),
            r.member,
            r.live,
            r.at.map_or(String::new(), |a| format!(", {a}")),
            r.factors
        )?;
    }
    super::joint_text::summary(w, model, rating)?;
    for p in &rating.postings {
        let v = super::rate_rows::posting_view(model, rating, p);
        writeln!(
            w,
            "Legal load \"{}\" (W = {} {}, {} {}): lowest RF {} at member {}: {} [{}]",
            v.vehicle,
            sig(v.weight, 4),
            s.force_name,
            sig(v.weight_tons, 3),
            v.ton_name,
            sig(v.rf, 3),
            v.member,
            super::rate_rows::posting_words(&v),
            v.clause
        )?;
    }
    let failing = rating.failing();
    if failing > 0 {
        let line = format!("{failing} check(s) exceed capacity (utilization > 1).");
        writeln!(w, "{}", term.paint(&line, Mark::Fail))?;
    }
    let service = rating.checks.iter().filter(|c| c.service).count();
    if service > 0 {
        writeln!(
            w,
            "{}",
            if method.checks_service() {
                "Rows marked \"factored\" are factored combinations shown against the allowable resistance for information; they are not this method's check and are not counted."
            } else {
                "Rows marked \"service\" are unfactored effects (single cases, dead + moving load) shown against the factored resistance for information; they are not strength checks and are not counted."
            }
        )?;
    }

    writeln!(w, "\n== Checks, highest utilization first ==")?;
    let fu = format!("force {}", s.force_name);
    let eu = format!("Fe {}", s.stress_name);
    let cu = format!("Fcr {}", s.stress_name);
    let pu = format!("C {}", s.force_name);
    let rf_head = format!("RF {}", method.primary_level());
    let mut t = Table::new(&[
        "member", "case", &fu, "axis", "KL/r", &eu, &cu, "regime", &pu, "util", "margin", &rf_head,
    ]);
    let order = by_utilization(rating);
    let limit = if all_rows {
        order.len()
    } else {
        order.len().min(40)
    };
    for (k, &i) in order[..limit].iter().enumerate() {
        let r = check_row(model, rating, &rating.checks[i]);
        let mark = if r.utilization > 1.0 && !r.service {
            Mark::Fail
        } else if k == 0 {
            Mark::Strong
        } else {
            Mark::Plain
        };
        t.row_marked(
            vec![
                r.member.into(),
                if r.service {
                    format!("{} [{}]", r.case, r.label)
                } else {
                    r.case.into()
                },
                sig(r.force, 4),
                r.axis.into(),
                sig(r.slenderness, 4),
                sig(r.euler_stress, 4),
                sig(r.critical_stress, 4),
                r.regime.into(),
                sig(r.capacity, 4),
                r.utilization_text(3),
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
        let dcu = format!("DC {}", s.force_name);
        let dwu = format!("DW {}", s.force_name);
        let lu = format!("LL+IM {}", s.force_name);
        let cu = format!("C {}", s.force_name);
        let mut t = Table::new(&[
            "member",
            "live load",
            "level",
            &dcu,
            &dwu,
            &lu,
            &cu,
            "RF",
            "factors",
        ]);
        let limit = if all_rows {
            idx.len()
        } else {
            idx.len().min(25)
        };
        for &i in &idx[..limit] {
            let r = super::rate_rows::rating_row(model, rating, &rating.ratings[i]);
            t.row(vec![
                r.member.to_string(),
                r.live.to_string(),
                r.level.to_string(),
                sig(r.dc, 4),
                sig(r.dw, 4),
                sig(r.live_force, 4),
                sig(r.capacity, 4),
                opt(r.rf, 3),
                r.factors,
            ]);
        }
        t.optional(&["factors", dwu.as_str()]);
        write!(w, "{}", t.render_for(term))?;
        if limit < idx.len() {
            writeln!(
                w,
                "({} more rows; --all shows every row, --format csv gives them all)",
                idx.len() - limit
            )?;
        }
    }
    let bars: Vec<(usize, &crate::rate::lacing::LacingBarCheck)> = rating
        .members
        .iter()
        .enumerate()
        .filter_map(|(m, c)| c.lacing_bars.as_ref().map(|b| (m, b)))
        .collect();
    if !bars.is_empty() {
        writeln!(
            w,
            "\n== Lacing bars ({}) ==",
            crate::rate::lacing::LacingBarCheck::CLAUSE
        )?;
        let vu = format!("V {}", s.force_name);
        let fu = format!("bar force {}", s.force_name);
        let cu = format!("bar strength {}", s.force_name);
        let mut t = Table::new(&["member", &vu, &fu, &cu, "util", "K·L/r", "limit", "verdict"]);
        for (m, b) in bars {
            let fails = b.utilization > 1.0 || !b.slenderness_ok;
            t.row_marked(
                vec![
                    model.members[m].id.to_string(),
                    sig(b.shear / s.force, 4),
                    sig(b.force / s.force, 4),
                    sig(b.capacity / s.force, 4),
                    sig(b.utilization, 3),
                    sig(b.slenderness, 4),
                    sig(b.slenderness_limit, 3),
                    if fails {
                        "FAILS".into()
                    } else {
                        "passes".into()
                    },
                ],
                if fails { Mark::Fail } else { Mark::Plain },
            );
        }
        t.optional(&["limit", vu.as_str()]);
        write!(w, "{}", t.render_for(term))?;
        writeln!(
            w,
            "(V = 2 % of the member's available compressive strength C; K·L/r limit 140 single, 200 double lacing)"
        )?;
    }
    super::joint_text::table(w, model, rating, term)?;
    let joint_notes: Vec<&String> = rating.joints.iter().flat_map(|j| j.notes.iter()).collect();
    if !rating.notes.is_empty() || !joint_notes.is_empty() {
        writeln!(w, "\nNotes:")?;
        for n in rating.notes.iter().chain(joint_notes) {
            writeln!(w, "- {n}")?;
        }
    }
    writeln!(
        w,
        "\nutil = |force| / C, C the resistance of the method ({} on the nominal strength{}); margin = critical stress / |stress| (factor of safety against buckling, or against yield/fracture in tension); {}.\nCompression: {}\nTension: {}",
        method.check.symbol,
        if method.family == crate::method::Family::Lrfr { ", times φc·φs" } else { "" },
        method.equation,
        method.check.compression_clause,
        method.check.tension_clause
    )?;
    Ok(())
}
