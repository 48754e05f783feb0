//! `panelpoint fatigue --format csv`: one row per member, units in the
//! headers, lives in years (empty where infinite), the basis in a column.
//! The parameter list and the caution go to standard error (`notes`).

use super::csv::{field, num};
use super::fatigue_rows::{parameters, rows, BASIS};
use super::{Scale, CAUTION};
use crate::fatigue::Fatigue;
use crate::model::Model;
use std::io::{self, Write};

fn opt(v: Option<f64>) -> String {
    v.map_or(String::new(), num)
}

pub fn fatigue(w: &mut dyn Write, model: &Model, f: &Fatigue) -> io::Result<()> {
    let s = Scale::of(model);
    writeln!(
        w,
        "member,category,category_default,en_category_MPa,effective_range_{st},cycles_per_passage,max_range_{st},threshold_{st},life_minimum_yr,life_evaluation_yr,life_mean_yr,remaining_yr,remaining_evaluation_yr,remaining_mean_yr,en_damage_per_passage,en_life_yr,en_remaining_yr,basis",
        st = s.stress_name
    )?;
    for r in rows(model, f) {
        writeln!(
            w,
            "{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{}",
            field(r.member),
            field(r.category),
            r.category_default,
            num(r.en_category),
            num(r.mbe_effective_range),
            num(r.cycles_per_passage),
            num(r.max_range),
            num(r.threshold),
            opt(r.life[0]),
            opt(r.life[1]),
            opt(r.life[2]),
            opt(r.remaining[0]),
            opt(r.remaining[1]),
            opt(r.remaining[2]),
            num(r.en_damage),
            opt(r.en_life),
            opt(r.en_remaining),
            field(BASIS)
        )?;
    }
    Ok(())
}

/// The caution and the parameters, one line each, for standard error
/// beside a CSV file.
pub fn notes(model: &Model, f: &Fatigue) -> Vec<String> {
    let mut out = vec![format!("caution: {CAUTION}")];
    for p in parameters(model, f) {
        out.push(format!(
            "parameter: {} = {} ({})",
            p.name, p.value, p.source
        ));
    }
    out
}
