//! The owner's report's table of lacing-bar checks (AISC 360-16 §E6.2):
//! the same numbers as the `rate` text table and the JSON `lacing_bars`,
//! with each check's clause beside it.

use super::html_table::{esc, n, t, HTable};
use super::Scale;
use crate::model::Model;
use crate::rate::lacing::LacingBarCheck;
use crate::rate::Rating;
use std::fmt::Write;

/// A table of every described lacing's bar checks, under the capacities;
/// nothing when no member describes its bars.
pub(super) fn lacing_bars(h: &mut String, model: &Model, r: &Rating, s: &Scale) {
    let bars: Vec<(usize, &LacingBarCheck)> = r
        .members
        .iter()
        .enumerate()
        .filter_map(|(m, c)| c.lacing_bars.as_ref().map(|b| (m, b)))
        .collect();
    if bars.is_empty() {
        return;
    }
    h.push_str("<h3>Lacing bars</h3>\n");
    let vu = format!("V {}", s.force_name);
    let fu = format!("bar force {}", s.force_name);
    let cu = format!("bar strength {}", s.force_name);
    let lu = format!("bar length {}", s.disp_name);
    let mut tb = HTable::new(&[
        "member",
        &vu,
        &fu,
        &cu,
        "utilization",
        &lu,
        "K",
        "K·L/r",
        "limit",
        "verdict",
        "clause",
    ]);
    for (m, b) in bars {
        let fails = b.utilization > 1.0 || !b.slenderness_ok;
        let verdict = match (b.utilization > 1.0, b.slenderness_ok) {
            (false, true) => "passes",
            (true, true) => "FAILS: strength",
            (false, false) => "FAILS: slenderness",
            (true, false) => "FAILS: strength and slenderness",
        };
        tb.row(
            if fails { "fails" } else { "" },
            vec![
                t(&model.members[m].id),
                n(b.shear / s.force, 4),
                n(b.force / s.force, 4),
                n(b.capacity / s.force, 4),
                n(b.utilization, 3),
                n(b.length / s.disp, 4),
                n(b.k, 2),
                n(b.slenderness, 4),
                n(b.slenderness_limit, 3),
                t(verdict),
                t(&format!(
                    "{}: V = 2 % of C; F = V/(planes·n·sin θ); K·L/r ≤ {}{}",
                    LacingBarCheck::CLAUSE,
                    b.slenderness_limit,
                    if b.angle_given {
                        ""
                    } else {
                        "; angle not given, the least §E6.2 allows taken"
                    }
                )),
            ],
        );
    }
    tb.html(h);
    let _ = writeln!(
        h,
        r#"<p class="note">{}</p>"#,
        esc("V is 2 % of the member's available compressive strength C (AISC 360-16 §E6.2), shared by the laced faces; a bar's force F = V/(planes·n·sin θ), n = 1 single, 2 double lacing; its strength by the member's column curve at K·L/r with r = t/√12, K = 1.0 single, 0.7 double; K·L/r limit 140 single, 200 double.")
    );
}
