//! The owner's report's section on moving loads: for each moving load its
//! vehicle (axles and spacings, lane load), dynamic allowance, step, legal
//! flag and the deck line it rolls on, and where it stood for the
//! controlling rating factor of each level.

use super::html_table::{esc, n, t, HTable};
use super::table::sig;
use super::Scale;
use crate::model::Model;
use crate::rate::Rating;
use std::fmt::Write;

pub(super) fn moving_loads(h: &mut String, model: &Model, rating: Option<&Rating>, s: &Scale) {
    if model.live.moving.is_empty() {
        return;
    }
    h.push_str(r#"<section class="major" id="moving"><h2>Moving loads</h2>"#);
    let deck: Vec<&str> = model
        .live
        .deck
        .iter()
        .map(|&n| model.nodes[n].id.as_str())
        .collect();
    let _ = writeln!(
        h,
        "<p>Deck line (panel points where the floor beams deliver the load, in order): {}. Each vehicle is rolled both ways along it; axle loads reach the panel points by the lever rule.</p>",
        esc(&deck.join(" – "))
    );
    for ml in &model.live.moving {
        let v = &model.live.vehicles[ml.vehicle];
        let _ = writeln!(
            h,
            "<h3>“{}”: vehicle “{}”{}</h3>",
            esc(&ml.id),
            esc(&v.id),
            if ml.legal { " (legal load)" } else { "" }
        );
        if let Some(name) = &ml.model {
            let source = crate::loads::library::lookup(name)
                .map(|m| m.source.to_string())
                .unwrap_or_default();
            let _ = writeln!(
                h,
                "<p>Published load model <strong>{}</strong>: {}. This truss carries a share of {} of it (lever rule across the floor beam, with any multiple-presence factor and scale).</p>",
                esc(name),
                esc(&source),
                sig(ml.share, 4)
            );
        }
        let share = if ml.share > 0.0 { ml.share } else { 1.0 };
        let _ = writeln!(
            h,
            "<p>Gross weight {} {}; dynamic allowance {} % on the axles{}; positions every {} {}. Axle loads below are this truss's share.</p>",
            sig(v.weight() / share / s.force, 4),
            esc(s.force_name),
            sig(ml.impact * 100.0, 3),
            if v.lane.is_some() {
                if ml.impact_on_lane {
                    " and on the lane load"
                } else {
                    ", none on the lane load"
                }
            } else {
                ""
            },
            sig(ml.step / s.length, 3),
            esc(s.length_name)
        );
        if !v.axles.is_empty() {
            let lu = format!("load {}", s.force_name);
            let ou = format!("behind the front axle {}", s.length_name);
            let mut tb = HTable::new(&["axle", &lu, &ou]);
            for (k, a) in v.axles.iter().enumerate() {
                tb.row(
                    "",
                    vec![
                        t(&(k + 1).to_string()),
                        n(a.load / s.force, 4),
                        n(a.offset / s.length, 4),
                    ],
                );
            }
            tb.html(h);
        }
        if let Some(w) = v.lane {
            let _ = writeln!(
                h,
                "<p>Lane load {} {}/{} on the parts of each influence line that add to the effect.</p>",
                sig(w / (s.force / s.length), 4),
                esc(s.force_name),
                esc(s.length_name)
            );
        }
        if let Some(r) = rating {
            for &(level, i) in &r.lowest_by_level {
                let mr = &r.ratings[i];
                if mr.live_id != ml.id {
                    continue;
                }
                let _ = writeln!(
                    h,
                    "<p>Controls the {} rating: member {}, RF {}, {}.</p>",
                    esc(level),
                    esc(&model.members[mr.member].id),
                    esc(&mr.rf.map_or("-".into(), |v| sig(v, 3))),
                    esc(mr.at.as_deref().unwrap_or("position not recorded"))
                );
            }
        }
    }
    h.push_str("</section>\n");
}
