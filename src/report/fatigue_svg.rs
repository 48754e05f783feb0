//! The truss coloured by fatigue life used: each member drawn on the
//! project's utilization ramp by the fraction of its minimum-level MBE life
//! already spent (present age / minimum life; over 1, spent, in the failure
//! colour), labelled with its remaining life in years. Members of infinite
//! life take the start of the ramp and the label "inf".

use super::svg::palette::{self, FAIL, INK, PAPER};
use super::svg::Svg;
use crate::fatigue::Fatigue;
use crate::model::Model;
use std::fmt::Write;

/// Fraction of the minimum-level life used by the present age (0 when the
/// life is infinite).
pub fn used(age: f64, life: Option<f64>) -> f64 {
    match life {
        Some(l) if l > 0.0 => age / l,
        Some(_) => f64::INFINITY,
        None => 0.0,
    }
}

/// The drawing as an SVG document, `width` px wide.
pub fn draw(model: &Model, f: &Fatigue, width: f64) -> String {
    let w = width.max(480.0);
    let (mut x0, mut x1, mut y0, mut y1) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for n in &model.nodes {
        (x0, x1, y0, y1) = (x0.min(n.x), x1.max(n.x), y0.min(n.y), y1.max(n.y));
    }
    if x0 > x1 {
        (x0, x1, y0, y1) = (0.0, 1.0, 0.0, 1.0);
    }
    let margin = 70.0;
    let (sx, sy) = ((x1 - x0).max(1e-12), (y1 - y0).max(1e-12));
    let scale = ((w - 2.0 * margin) / sx).min(0.5 * w / sy);
    let top = 60.0;
    let left = (w - sx * scale) / 2.0;
    let h = top + sy * scale + 140.0;
    let p = |x: f64, y: f64| (left + (x - x0) * scale, top + (y1 - y) * scale);
    let mut svg = Svg::default();
    let _ = writeln!(
        svg.out,
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{w:.0}\" height=\"{h:.0}\" viewBox=\"0 0 {w:.0} {h:.0}\" font-family=\"DejaVu Sans, Arial, sans-serif\">"
    );
    svg.rect(0.0, 0.0, w, h, &format!("fill=\"{PAPER}\""));
    let title = format!(
        "{}: fatigue life used at the MBE minimum level (age {} years)",
        if model.title.is_empty() {
            "(untitled model)"
        } else {
            &model.title
        },
        f.settings.traffic.age
    );
    svg.text(
        (w / 2.0, 28.0),
        15.0,
        "middle",
        &title,
        &format!("fill=\"{INK}\""),
    );
    let age = f.settings.traffic.age;
    for r in &f.members {
        let m = &model.members[r.member];
        let (a, b) = (&model.nodes[m.start], &model.nodes[m.end]);
        let (pa, pb) = (p(a.x, a.y), p(b.x, b.y));
        let u = used(age, r.mbe.life[0]);
        svg.line(pa, pb, INK, 9.0, " stroke-linecap=\"round\"");
        svg.line(
            pa,
            pb,
            &palette::utilization(u),
            6.5,
            " stroke-linecap=\"round\"",
        );
        if u > 1.0 {
            // Spent: a broken white core, as failing members elsewhere.
            svg.line(pa, pb, PAPER, 1.5, " stroke-dasharray=\"4 4\"");
        }
        let label = match r.mbe.remaining[0] {
            None => format!("{} inf", m.id),
            Some(y) if y < 0.0 => format!("{} spent", m.id),
            Some(y) => format!("{} {:.0} yr", m.id, y),
        };
        let mid = ((pa.0 + pb.0) / 2.0, (pa.1 + pb.1) / 2.0 - 7.0);
        svg.text(
            mid,
            10.5,
            "middle",
            &label,
            &format!("fill=\"{INK}\" stroke=\"{PAPER}\" stroke-width=\"3\" paint-order=\"stroke\""),
        );
    }
    // Legend: the ramp from 0 to 1 and the spent colour.
    let ly = top + sy * scale + 50.0;
    let (lx, lw) = (margin, 260.0);
    for k in 0..25 {
        let u = (k as f64 + 0.5) / 25.0;
        let x = lx + k as f64 * lw / 25.0;
        svg.rect(
            x,
            ly,
            lw / 25.0 + 0.3,
            12.0,
            &format!("fill=\"{}\"", palette::utilization(u)),
        );
    }
    svg.rect(lx, ly, lw, 12.0, &format!("fill=\"none\" stroke=\"{INK}\""));
    svg.rect(
        lx + lw + 24.0,
        ly,
        26.0,
        12.0,
        &format!("fill=\"{FAIL}\" stroke=\"{INK}\""),
    );
    for (u, t, anchor) in [
        (0.0, "0 (or infinite life)", "start"),
        (0.5, "0.5", "middle"),
        (1.0, "1", "middle"),
    ] {
        svg.text(
            (lx + u * lw, ly + 26.0),
            10.5,
            anchor,
            t,
            &format!("fill=\"{INK}\""),
        );
    }
    svg.text(
        (lx + lw + 56.0, ly + 10.5),
        10.5,
        "start",
        "over 1: spent",
        &format!("fill=\"{INK}\""),
    );
    let note = [
        format!(
            "Life used = present age / minimum-level life (AASHTO MBE 7.2.5, R_R = {}); labels: remaining years at that level.",
            f.settings.mbe.rr_minimum
        ),
        format!(
            "Vehicle \u{201c}{}\u{201d}, (ADTT)SL {}, growth {} a year. Screening calculation for review by a qualified engineer.",
            f.vehicle, f.settings.traffic.adtt, f.settings.traffic.growth
        ),
    ];
    for (i, t) in note.iter().enumerate() {
        svg.text(
            (lx, ly + 46.0 + 15.0 * i as f64),
            11.0,
            "start",
            t,
            &format!("fill=\"{INK}\""),
        );
    }
    svg.out.push_str("</svg>\n");
    svg.out
}
