//! `panelpoint fatigue` as text: the parameters with their sources, then
//! one row per member (finite remaining life first), and the caution.

use super::fatigue_rows::{parameters, rows};
use super::table::{sig, Table};
use super::text::header;
use super::Scale;
use crate::fatigue::Fatigue;
use crate::input::Diagnostic;
use crate::model::Model;
use std::io::{self, Write};

fn years(v: Option<f64>) -> String {
    v.map_or("infinite".into(), |v| format!("{v:.1}"))
}

pub fn fatigue(
    w: &mut dyn Write,
    model: &Model,
    f: &Fatigue,
    warnings: &[Diagnostic],
    all_rows: bool,
) -> io::Result<()> {
    header(w, model, "fatigue", warnings, &[])?;
    let s = Scale::of(model);
    writeln!(w, "\nParameters (editions and sources):")?;
    let mut t = Table::new(&["parameter", "value", "source"]);
    for p in parameters(model, f) {
        t.row(vec![p.name.into(), p.value, p.source.into()]);
    }
    write!(w, "{}", t.render())?;
    let rows = rows(model, f);
    let finite = rows.iter().filter(|r| r.remaining[0].is_some()).count();
    writeln!(
        w,
        "\n{} of {} members have a finite MBE fatigue life at the minimum level.",
        finite,
        rows.len()
    )?;
    if let Some(r) = rows.first().filter(|r| r.remaining[0].is_some()) {
        writeln!(
            w,
            "Least remaining life: member {} (category {}), {} years at the minimum level.",
            r.member,
            r.category,
            years(r.remaining[0])
        )?;
    }
    let st = s.stress_name;
    let mut t = Table::new(&[
        "member",
        "cat",
        &format!("(Df)eff {st}"),
        "n/passage",
        &format!("(Df)max {st}"),
        &format!("(DF)TH {st}"),
        "life min yr",
        "life eval yr",
        "life mean yr",
        "remaining min yr",
        "EN cat",
        "EN D/passage",
        "EN remaining yr",
    ]);
    let shown = if all_rows {
        rows.len()
    } else {
        rows.len().min(40)
    };
    for r in &rows[..shown] {
        let cat = if r.category_default {
            format!("{}*", r.category)
        } else {
            r.category.into()
        };
        let en = if r.en_default {
            format!("{}*", sig(r.en_category, 3))
        } else {
            sig(r.en_category, 3)
        };
        t.row(vec![
            r.member.into(),
            cat,
            sig(r.mbe_effective_range, 4),
            sig(r.cycles_per_passage, 3),
            sig(r.max_range, 4),
            sig(r.threshold, 4),
            years(r.life[0]),
            years(r.life[1]),
            years(r.life[2]),
            years(r.remaining[0]),
            en,
            sig(r.en_damage, 3),
            years(r.en_remaining),
        ]);
    }
    write!(w, "{}", t.render())?;
    if shown < rows.len() {
        writeln!(
            w,
            "({} more members; --all shows every row)",
            rows.len() - shown
        )?;
    }
    writeln!(
        w,
        "* a stated default category (no `detail` given). (Df)eff includes the dynamic allowance, R_s and the load factor; \
infinite life when (Df)max <= (DF)TH (MBE 7.2.4). Lives are years from opening; remaining = life - present age \
(negative: the calculated life is spent). EN: Miner damage per passage on the bilinear curve with gamma_Mf, gamma_Ff."
    )?;
    Ok(())
}
