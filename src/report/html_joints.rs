//! The HTML report's joint section: a drawing of each rated gusset-plate
//! joint (plate outline, fastener groups as dots, the Whitmore sections
//! with their 30° spread, the shear planes) and the joint's checks with
//! clause, inputs and rating factor.

use super::html_table::{esc, n, on, t, HTable};
use super::joint_rows::{inputs_line, joint_views, JointView};
use super::svg::palette;
use crate::joint::gusset::types::{GussetJoint, PlaneDir};
use crate::joint::gusset::whitmore;
use crate::model::Model;
use crate::rate::Rating;
use std::fmt::Write;

/// The joints section (nothing when the model describes no joints).
pub(super) fn joints(
    h: &mut String,
    model: &Model,
    rating: Option<&Rating>,
    flush: &mut dyn FnMut(&mut String) -> std::io::Result<()>,
) -> std::io::Result<()> {
    let Some(r) = rating.filter(|r| r.joints.is_some()) else {
        return Ok(());
    };
    let views = joint_views(model, r);
    h.push_str(r#"<section class="major" id="joints"><h2>Joints</h2>"#);
    let _ = writeln!(
        h,
        "<p>Each rated joint: drawing (plate outline; fasteners as dots; Whitmore sections in blue with their 30° spread dashed; full shear planes in orange; the work point as a cross; {u}) and its checks at the {lvl} level, lowest rating factor of any live load, demand and resistance as factored there.</p>",
        u = esc(&format!("dimensions in {}", model.units.section.name)),
        lvl = esc(r.method.primary_level()),
    );
    for j in &model.gussets {
        let id = model.nodes[j.node].id.as_str();
        let _ = writeln!(h, "<h3>Joint {}</h3>", esc(id));
        h.push_str("<div class=\"figure joint-drawing\">");
        h.push_str(&drawing(model, j));
        h.push_str("</div>\n");
        table(h, views.iter().filter(|v| v.node == id));
        if !j.notes.is_empty() {
            h.push_str("<ul class=\"note\">");
            for note in &j.notes {
                let _ = write!(h, "<li>{}</li>", esc(note));
            }
            h.push_str("</ul>\n");
        }
        flush(h)?;
    }
    pins(h, model, r, &views, flush)?;
    h.push_str("</section>\n");
    Ok(())
}

/// Each pin: its drawing under the first load case (stack order, bar
/// forces, moment and shear along the pin) and its checks.
fn pins(
    h: &mut String,
    model: &Model,
    r: &Rating,
    views: &[JointView],
    flush: &mut dyn FnMut(&mut String) -> std::io::Result<()>,
) -> std::io::Result<()> {
    let state = r.effects.iter().find(|e| e.case.is_some());
    for pin in &model.pins {
        let id = model.nodes[pin.node].id.as_str();
        let _ = writeln!(h, "<h3>Pin at {}</h3>", esc(id));
        if let Some(e) = state {
            h.push_str("<div class=\"figure joint-drawing\">");
            h.push_str(&super::pin_svg::pin_svg(model, pin, &e.forces, &e.id));
            h.push_str("</div>\n");
        }
        table(h, views.iter().filter(|v| v.node == id));
        flush(h)?;
    }
    Ok(())
}

/// The summary's facts: the lowest joint factor per level, and whether a
/// joint rather than a member controls the truss.
pub(super) fn summary_facts(h: &mut String, model: &Model, r: &Rating) {
    let Some(j) = &r.joints else { return };
    for &(level, mi) in &r.lowest_by_level {
        let Some(i) = j.lowest_at(level) else {
            continue;
        };
        let jr = &j.ratings[i];
        let rf = jr.rf.unwrap_or(f64::NAN);
        let controls = rf < r.ratings[mi].rf.unwrap_or(f64::INFINITY);
        let _ = write!(
            h,
            "<dt>Lowest joint, {}</dt><dd>RF <strong>{}</strong> — {} for “{}”{}</dd>",
            esc(level),
            esc(&super::table::sig(rf, 3)),
            esc(&super::rate_rows::rating_joint_words(model, r, i)),
            esc(&jr.live_id),
            if controls {
                "; <strong>below every member: the joint controls</strong>"
            } else {
                ""
            }
        );
    }
}

fn table<'a>(h: &mut String, views: impl Iterator<Item = &'a JointView>) {
    let mut tb = HTable::new(&[
        "check",
        "member",
        "part",
        "demand",
        "resistance",
        "unit",
        "RF",
        "live load",
        "clause",
        "inputs and equation",
    ]);
    for v in views {
        let class = if v.rf.is_some_and(|x| x < 1.0) {
            "fail"
        } else {
            ""
        };
        tb.row(
            class,
            vec![
                t(v.kind),
                t(v.member.as_deref().unwrap_or("(joint)")),
                t(&v.part),
                n(v.demand, 4),
                n(v.resistance, 4),
                t(&v.unit),
                on(v.rf, 3),
                t(v.live.as_deref().unwrap_or("-")),
                t(v.clause),
                t(&format!("{}; {}", inputs_line(v), v.equation)),
            ],
        );
    }
    tb.html(h);
}

/// One joint as inline SVG, joint coordinates in the model's section unit.
fn drawing(model: &Model, j: &GussetJoint) -> String {
    let k = 1.0 / model.units.section.to_si; // m → section unit
    let p = |q: [f64; 2]| [q[0] * k, q[1] * k];
    let poly: Vec<[f64; 2]> = j.outline.iter().map(|&q| p(q)).collect();
    let (mut x0, mut x1, mut y0, mut y1) = (0.0f64, 0.0f64, 0.0f64, 0.0f64);
    for q in &poly {
        x0 = x0.min(q[0]);
        x1 = x1.max(q[0]);
        y0 = y0.min(q[1]);
        y1 = y1.max(q[1]);
    }
    let size = (x1 - x0).max(y1 - y0).max(1e-9);
    let pad = 0.18 * size;
    let (x0, x1, y0, y1) = (x0 - pad, x1 + pad, y0 - pad, y1 + pad);
    let stroke = size / 250.0;
    let font = size / 28.0;
    // y up in the model, down in SVG: draw with y negated.
    let mut s = format!(
        r#"<svg viewBox="{} {} {} {}" width="420" role="img" aria-label="gusset joint drawing">"#,
        f(x0),
        f(-y1),
        f(x1 - x0),
        f(y1 - y0)
    );
    let pts: Vec<String> = poly
        .iter()
        .map(|q| format!("{},{}", f(q[0]), f(-q[1])))
        .collect();
    let _ = write!(
        s,
        r#"<polygon points="{}" fill="{}" stroke="{}" stroke-width="{}"/>"#,
        pts.join(" "),
        palette::TENSION_CORE,
        palette::STRUCTURE,
        f(2.0 * stroke)
    );
    for g in &j.groups {
        // Member centre lines from the work point out past the plate.
        let along = |u: [f64; 2]| {
            poly.iter()
                .map(|q| q[0] * u[0] + q[1] * u[1])
                .fold(0.0, f64::max)
        };
        let reach = along(g.axis) + 0.45 * pad;
        let back = if g.members.len() > 1 {
            -(along([-g.axis[0], -g.axis[1]]) + 0.45 * pad)
        } else {
            0.0
        };
        let (a, b) = (
            [g.axis[0] * back, g.axis[1] * back],
            [g.axis[0] * reach, g.axis[1] * reach],
        );
        line(&mut s, a, b, palette::FAINT, stroke, Some("4 3"));
        let id = &model.members[g.members[0]].id;
        label(&mut s, [b[0], b[1]], id, font);
        if let Some(&m2) = g.members.get(1) {
            label(&mut s, [a[0], a[1]], &model.members[m2].id, font);
        }
        for q in g.positions() {
            let q = p(q);
            let _ = write!(
                s,
                r#"<circle cx="{}" cy="{}" r="{}" fill="{}"/>"#,
                f(q[0]),
                f(-q[1]),
                f(g.diameter * k / 2.0),
                palette::INK
            );
        }
        if g.members.len() == 1 {
            whitmore_lines(&mut s, j, g, k, stroke);
        }
    }
    for pl in &j.planes {
        let at = pl.at * k;
        let (a, b) = match pl.dir {
            PlaneDir::Horizontal => ([x0 + pad / 2.0, at], [x1 - pad / 2.0, at]),
            PlaneDir::Vertical => ([at, y0 + pad / 2.0], [at, y1 - pad / 2.0]),
        };
        line(
            &mut s,
            a,
            b,
            palette::COMPRESSION,
            1.5 * stroke,
            Some("8 4"),
        );
    }
    let c = size / 60.0;
    line(&mut s, [-c, 0.0], [c, 0.0], palette::INK, stroke, None);
    line(&mut s, [0.0, -c], [0.0, c], palette::INK, stroke, None);
    s.push_str("</svg>");
    s
}

/// The Whitmore section (solid) and the 30° spread lines (dashed).
fn whitmore_lines(
    s: &mut String,
    j: &GussetJoint,
    g: &crate::joint::gusset::types::FastenerGroup,
    k: f64,
    stroke: f64,
) {
    let spread = whitmore::spread_width(g.lines, g.gauge, g.rows, g.pitch);
    let c = g.whitmore_centre();
    let (a, b) = whitmore::section_ends(&j.outline, c, g.axis, spread);
    let sc = |q: [f64; 2]| [q[0] * k, q[1] * k];
    line(s, sc(a), sc(b), palette::TENSION, 2.0 * stroke, None);
    // Outer fasteners of the row farthest from the work point to the untruncated ends.
    let pos = g.positions();
    let lines = g.lines as usize;
    let far = &pos[pos.len() - lines..];
    let nrm = [-g.axis[1], g.axis[0]];
    let ends = [
        [c[0] + nrm[0] * spread / 2.0, c[1] + nrm[1] * spread / 2.0],
        [c[0] - nrm[0] * spread / 2.0, c[1] - nrm[1] * spread / 2.0],
    ];
    line(
        s,
        sc(far[lines - 1]),
        sc(ends[0]),
        palette::TENSION,
        stroke,
        Some("3 2"),
    );
    line(
        s,
        sc(far[0]),
        sc(ends[1]),
        palette::TENSION,
        stroke,
        Some("3 2"),
    );
}

fn line(s: &mut String, a: [f64; 2], b: [f64; 2], colour: &str, w: f64, dash: Option<&str>) {
    let dash = dash.map_or(String::new(), |d| {
        let scale: Vec<String> = d
            .split(' ')
            .map(|x| f(x.parse::<f64>().unwrap_or(1.0) * w * 2.0))
            .collect();
        format!(r#" stroke-dasharray="{}""#, scale.join(" "))
    });
    let _ = write!(
        s,
        r#"<line x1="{}" y1="{}" x2="{}" y2="{}" stroke="{colour}" stroke-width="{}"{dash}/>"#,
        f(a[0]),
        f(-a[1]),
        f(b[0]),
        f(-b[1]),
        f(w)
    );
}

fn label(s: &mut String, at: [f64; 2], text: &str, font: f64) {
    let _ = write!(
        s,
        r#"<text x="{}" y="{}" font-size="{}" text-anchor="middle" fill="{}">{}</text>"#,
        f(at[0]),
        f(-at[1]),
        f(font),
        palette::INK,
        esc(text)
    );
}

fn f(v: f64) -> String {
    format!("{:.3}", v)
}
