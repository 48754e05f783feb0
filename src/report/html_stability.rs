//! The owner's report's section on whole-truss stability and vibration
//! (issue 19), from the same [`StabilityReport`] `panelpoint stability`
//! writes: the in-plane critical load factor of each load effect with its
//! mode drawn (the stability SVG), the compression chord on its U-frames,
//! the effective lengths `rate` took from these analyses, the footbridge
//! frequencies against the guidance limits and the deflection check.
//! Every piece of text is escaped; every figure carries its clause.

use super::html::{figure, StabilityPart};
use super::html_table::{esc, n, on, t, HTable};
use super::stability_json::{criteria, AASHTO_CLAUSE, K_FORMULA, SPRING_CLAUSE, SPRING_FORMULA};
use super::table::sig;
use super::Scale;
use crate::model::Model;
use crate::stability::chord::UFrameReport;
use crate::stability::run::StabilityReport;
use crate::stability::u_frame::{AASHTO_LATERAL_FORCE, AASHTO_MARGIN};
use crate::stability::vibration::Vibration;
use std::fmt::Write;

/// Modes drawn besides the governing one (inside a closed details block).
const MORE_MODES: usize = 12;

/// The section: the analysis (or why it could not be made) and which K
/// the rating took from it.
pub(super) fn stability(h: &mut String, model: &Model, part: &StabilityPart) {
    h.push_str(
        r#"<section class="major" id="stability"><h2>Stability and vibration of the whole truss</h2>"#,
    );
    let r = match &part.report {
        Ok(r) => *r,
        Err(why) => {
            let _ = writeln!(
                h,
                "<p>The stability analysis could not be made: {}</p></section>",
                esc(why)
            );
            return;
        }
    };
    let s = Scale::of(model);
    in_plane(h, model, r);
    if let Some(u) = &r.u_frame {
        u_frame(h, model, &s, u);
    }
    effective_lengths(h, model, r, part);
    if let Some(v) = &r.vibration {
        let lateral = r
            .u_frame
            .as_ref()
            .and_then(|u| u.lateral_frequency)
            .map(|p| p.0);
        vibration(h, model, &s, v, lateral);
    }
    if !r.notes.is_empty() {
        h.push_str("<h3>Notes</h3>\n<ul>");
        for note in &r.notes {
            let _ = write!(h, "<li>{}</li>", esc(note));
        }
        h.push_str("</ul>\n");
    }
    h.push_str("</section>\n");
}

fn in_plane(h: &mut String, model: &Model, r: &StabilityReport) {
    let _ = writeln!(
        h,
        "<h3>In-plane elastic buckling</h3>\n<p>Lowest critical load factor λcr of K·φ = λ·G·φ for each load case and combination; effective-length factor of each member taking part in the mode: <span class=\"formula\">{}</span>. Members not listed are not governed by the mode (share of its axial work below 10 %).</p>",
        esc(K_FORMULA)
    );
    let mut tb = HTable::new(&[
        "effect",
        "kind",
        "λcr",
        "residual",
        "members in the mode: K",
    ]);
    for e in &r.in_plane {
        let kind = if e.combination { "combination" } else { "case" };
        let (lam, res, members) = match &e.buckling {
            None => (t("not computed"), t("-"), t("moving load")),
            Some(b) => match b.critical_factor {
                None => (t("none"), t("-"), t("no compression")),
                Some(l) => (
                    n(l, 4),
                    t(&format!("{:.1e}", b.residual)),
                    t(&b.members
                        .iter()
                        .map(|k| format!("{} {}", model.members[k.member].id, sig(k.k, 3)))
                        .collect::<Vec<_>>()
                        .join(", ")),
                ),
            },
        };
        tb.row("", vec![t(&e.effect), t(kind), lam, res, members]);
    }
    tb.html(h);
    let governing = super::stability_svg::chosen(r, None).map(|b| b.effect.clone());
    let Some(gov) = governing else {
        h.push_str("<p>No member is in compression: no buckling mode.</p>\n");
        return;
    };
    mode_figure(h, model, r, &gov, "governing (lowest λcr)");
    let others: Vec<&str> = r
        .in_plane
        .iter()
        .filter_map(|e| e.buckling.as_ref())
        .filter(|b| b.critical_factor.is_some() && b.effect != gov)
        .map(|b| b.effect.as_str())
        .collect();
    if !others.is_empty() {
        h.push_str("<details><summary>Buckling modes of the other load effects (open to read or print)</summary>\n");
        for id in others.iter().take(MORE_MODES) {
            mode_figure(h, model, r, id, "");
        }
        if others.len() > MORE_MODES {
            let _ = writeln!(
                h,
                "<p class=\"note\">{} more modes not drawn; `panelpoint stability --format svg --case ID` draws any one.</p>",
                others.len() - MORE_MODES
            );
        }
        h.push_str("</details>\n");
    }
}

fn mode_figure(h: &mut String, model: &Model, r: &StabilityReport, id: &str, what: &str) {
    let mut svg = Vec::new();
    if super::stability_svg::mode_svg(&mut svg, model, r, Some(id)).is_err() {
        return;
    }
    let lam = r
        .in_plane
        .iter()
        .filter_map(|e| e.buckling.as_ref())
        .find(|b| b.effect == id)
        .and_then(|b| b.critical_factor);
    let caption = format!(
        "In-plane buckling mode of “{id}”{}: λcr = {}.",
        if what.is_empty() {
            String::new()
        } else {
            format!(", {what}")
        },
        lam.map_or("-".into(), |l| sig(l, 4))
    );
    figure(h, &String::from_utf8_lossy(&svg), &caption);
}

fn u_frame(h: &mut String, model: &Model, s: &Scale, u: &UFrameReport) {
    let per_len = s.force / s.length;
    h.push_str("<h3>Compression chord on its U-frames</h3>\n");
    let _ = writeln!(
        h,
        "<p>U-frame spring C<sub>d</sub> = {} {}/{} ({}; {}).</p>",
        esc(&sig(u.spring.stiffness / per_len, 4)),
        esc(s.force_name),
        esc(s.length_name),
        esc(if u.spring.given {
            "given in the model"
        } else {
            SPRING_FORMULA
        }),
        esc(SPRING_CLAUSE)
    );
    if !u.spring.given {
        let _ = writeln!(
            h,
            "<p class=\"note\">Flexibility terms: vertical {}, floor beam {}, connection {} {}/{}.</p>",
            esc(&sig(u.spring.delta_vertical * per_len, 3)),
            esc(&sig(u.spring.delta_floor_beam * per_len, 3)),
            esc(&sig(u.spring.delta_connection * per_len, 3)),
            esc(s.length_name),
            esc(s.force_name)
        );
    }
    let mut tb = HTable::new(&["effect", "λcr", "required", "ok", "chord members: K (K·L)"]);
    for c in &u.results {
        let members = u
            .members
            .iter()
            .zip(&c.buckling.segments)
            .filter_map(|(&m, seg)| {
                seg.map(|(_, k)| {
                    let mem = &model.members[m];
                    format!(
                        "{} {} ({} {})",
                        mem.id,
                        sig(k, 3),
                        sig(k * model.length(m) / s.length, 3),
                        s.length_name
                    )
                })
            })
            .collect::<Vec<_>>()
            .join(", ");
        let ok = c.margin_ok.map_or("-", |o| if o { "yes" } else { "NO" });
        tb.row(
            if c.margin_ok == Some(false) {
                "fails"
            } else {
                ""
            },
            vec![
                t(&c.effect),
                on(c.buckling.critical_factor, 4),
                if c.combination {
                    n(AASHTO_MARGIN, 3)
                } else {
                    t("-")
                },
                t(ok),
                t(&members),
            ],
        );
    }
    tb.html(h);
    let _ = writeln!(h, "<p class=\"note\">{}</p>", esc(AASHTO_CLAUSE));
    let hu = format!("H {}", s.force_name);
    let mu = format!("H·h {}-{}", s.force_name, s.length_name);
    let du = format!("H/Cd {}", s.disp_name);
    let mut tb = HTable::new(&["U-frame", &hu, &mu, &du]);
    for &(node, f, m, d) in &u.lateral {
        tb.row(
            "",
            vec![
                t(&model.nodes[node].id),
                n(f / s.force, 3),
                n(m / (s.force * s.length), 3),
                n(d / s.disp, 3),
            ],
        );
    }
    tb.html(h);
    let _ = writeln!(
        h,
        "<p class=\"note\">H = {} {}/{} × tributary panel length; check the verticals, floor beams and their connections for H and H·h.</p>",
        esc(&sig(AASHTO_LATERAL_FORCE / per_len, 3)),
        esc(s.force_name),
        esc(s.length_name)
    );
    if let Some((f, res)) = u.lateral_frequency {
        let _ = writeln!(
            h,
            "<p>Lateral frequency of the chord on its U-frames: {} Hz (residual {res:.1e}).</p>",
            esc(&sig(f, 3))
        );
    }
}

/// Which K `rate` took from these analyses, member by member.
fn effective_lengths(h: &mut String, model: &Model, r: &StabilityReport, part: &StabilityPart) {
    use crate::stability::rate_k::K_FLOOR;
    h.push_str("<h3>Effective lengths used by the rating</h3>\n");
    let k_from_buckling = part.k_from_buckling;
    let given = |m: usize| part.given_k.get(m).copied();
    let u_used = model
        .stability
        .u_frame
        .as_ref()
        .is_some_and(|u| u.use_in_rate);
    let mut tb = HTable::new(&["member", "plane", "K used", "from", "K in the model file"]);
    if let (Some(u), true) = (&r.u_frame, u_used) {
        for (i, &m) in u.members.iter().enumerate() {
            let k = u
                .results
                .iter()
                .filter_map(|c| c.buckling.segments.get(i).copied().flatten())
                .map(|(_, k)| k)
                .fold(None, |a: Option<f64>, k| Some(a.map_or(k, |a| a.max(k))));
            if let Some(k) = k {
                tb.row(
                    "",
                    vec![
                        t(&model.members[m].id),
                        t("out of plane"),
                        n(k.max(K_FLOOR), 3),
                        t(&format!(
                            "U-frames: largest K over the effects, not below {K_FLOOR:.1}"
                        )),
                        on(given(m).map(|g| g.1), 3),
                    ],
                );
            }
        }
    }
    if k_from_buckling {
        for c in crate::stability::rate_k_in::chosen(model.members.len(), &r.in_plane) {
            tb.row(
                "",
                vec![
                    t(&model.members[c.member].id),
                    t("in plane"),
                    n(c.k, 3),
                    t(&format!(
                        "in-plane buckling of “{}” (λcr {}), largest K over the effects",
                        c.effect,
                        sig(c.critical_factor, 4)
                    )),
                    on(given(c.member).map(|g| g.0), 3),
                ],
            );
        }
    }
    let any = u_used || k_from_buckling;
    if any {
        tb.html(h);
    }
    let _ = writeln!(
        h,
        "<p class=\"note\">{} {}</p>",
        if u_used {
            "Out of plane: the compression chord's k_out from its U-frames (use_in_rate), with the member length as unbraced length."
        } else {
            "Out of plane: the model's k_out (the U-frame results are not used by the rating; set use_in_rate to use them)."
        },
        esc(if k_from_buckling {
            crate::stability::rate_k_in::RULE
        } else {
            "In plane: the model's k_in (rate --k-from buckling takes K from the in-plane buckling modes)."
        })
    );
}

fn vibration(h: &mut String, model: &Model, s: &Scale, v: &Vibration, lateral: Option<f64>) {
    h.push_str("<h3>Natural frequencies (footbridge use)</h3>\n<p>In-plane modes of the pin-jointed truss with lumped masses; lateral: the compression chord on its U-frames (the deck's own lateral mode needs its plan bracing, not modelled).</p>\n");
    let mut tb = HTable::new(&["mode", "f Hz", "vertical share", "residual"]);
    for (i, m) in v.modes.iter().enumerate() {
        tb.row(
            "",
            vec![
                t(&(i + 1).to_string()),
                n(m.frequency, 4),
                t(&format!("{:.2}", m.vertical_share)),
                t(&format!("{:.1e}", m.residual)),
            ],
        );
    }
    tb.html(h);
    let kip = if s.force_name == "kip" {
        String::new()
    } else {
        format!(
            " ({} kip)",
            sig(v.weight / crate::stability::vibration::KIP, 4)
        )
    };
    let _ = writeln!(
        h,
        "<p>Supported weight W = {} {}{} (the weight-based limit takes W in kip).</p>",
        esc(&sig(v.weight / s.force, 4)),
        esc(s.force_name),
        esc(&kip)
    );
    let mut tb = HTable::new(&["check", "value Hz", "limit", "ok", "source"]);
    for (name, src, value, limit, ok) in criteria(v, lateral) {
        tb.row(
            if ok == Some(false) { "fails" } else { "" },
            vec![
                t(&name),
                on(value, 3),
                t(&limit),
                t(ok.map_or("-", |o| if o { "yes" } else { "NO" })),
                t(src),
            ],
        );
    }
    tb.html(h);
    let ratio = model
        .stability
        .vibration
        .as_ref()
        .map_or(360.0, |i| i.deflection_ratio);
    let limit = v.span / ratio;
    let _ = writeln!(
        h,
        "<p>Pedestrian live-load deflection {} {} against span/{} = {} {}: <strong>{}</strong> (guide specification 5, from memory).</p>",
        esc(&sig(v.deflection / s.disp, 3)),
        esc(s.disp_name),
        esc(&format!("{ratio}")),
        esc(&sig(limit / s.disp, 3)),
        esc(s.disp_name),
        if v.deflection <= limit { "ok" } else { "EXCEEDS" }
    );
}
