//! `panelpoint stability --format svg`: the truss to scale (faint) and the
//! in-plane buckling mode of the effect with the lowest critical factor
//! (or the one asked for), the mode drawn along every member through the
//! beam-column element points, scaled so its largest translation is a
//! tenth of the truss's width; the critical factor and the case in the legend.

use super::svg::palette::{DEFLECTED, FAINT, INK, PAPER};
use crate::model::Model;
use crate::stability::run::StabilityReport;
use std::io::{self, Write};

/// Which effect is drawn: `case`, or the lowest λcr.
pub fn chosen<'a>(
    r: &'a StabilityReport,
    case: Option<&str>,
) -> Option<&'a crate::stability::in_plane::Buckling> {
    let all = r.in_plane.iter().filter_map(|e| e.buckling.as_ref());
    match case {
        Some(id) => all
            .into_iter()
            .find(|b| b.effect == id && b.critical_factor.is_some()),
        None => all.filter(|b| b.critical_factor.is_some()).min_by(|a, b| {
            a.critical_factor
                .unwrap()
                .total_cmp(&b.critical_factor.unwrap())
        }),
    }
}

fn esc(s: &str) -> String {
    s.replace('&', "&amp;")
        .replace('<', "&lt;")
        .replace('>', "&gt;")
        .replace('"', "&quot;")
}

pub fn mode_svg(
    w: &mut dyn Write,
    model: &Model,
    r: &StabilityReport,
    case: Option<&str>,
) -> io::Result<()> {
    let (mut x0, mut x1, mut y0, mut y1) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for n in &model.nodes {
        x0 = x0.min(n.x);
        x1 = x1.max(n.x);
        y0 = y0.min(n.y);
        y1 = y1.max(n.y);
    }
    let span = (x1 - x0).max(y1 - y0).max(1e-9);
    let (width, margin) = (900.0, 60.0);
    let s = (width - 2.0 * margin) / span;
    // Room above and below for the mode (up to 10 % of the width).
    let room = 0.1 * span * s + 10.0;
    let height = (y1 - y0) * s + 2.0 * room + margin + 110.0;
    let px = |x: f64| margin + (x - x0) * s;
    let py = |y: f64| margin + room + (y1 - y) * s;
    writeln!(
        w,
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{width}\" height=\"{height:.0}\" viewBox=\"0 0 {width} {height:.0}\" font-family=\"sans-serif\">"
    )?;
    writeln!(w, "<rect width=\"100%\" height=\"100%\" fill=\"{PAPER}\"/>")?;
    writeln!(w, "<title>{}</title>", esc(&model.title))?;
    for m in &model.members {
        let (a, b) = (&model.nodes[m.start], &model.nodes[m.end]);
        writeln!(
            w,
            "<line x1=\"{:.1}\" y1=\"{:.1}\" x2=\"{:.1}\" y2=\"{:.1}\" stroke=\"{FAINT}\" stroke-width=\"2\"/>",
            px(a.x), py(a.y), px(b.x), py(b.y)
        )?;
    }
    let b = chosen(r, case);
    let legend = match b {
        Some(b) => {
            let amp = 0.1 * span;
            for (mi, pts) in b.member_shapes.iter().enumerate() {
                let m = &model.members[mi];
                let (a, e) = (&model.nodes[m.start], &model.nodes[m.end]);
                let k = pts.len().saturating_sub(1).max(1) as f64;
                let path: Vec<String> = pts
                    .iter()
                    .enumerate()
                    .map(|(i, d)| {
                        let t = i as f64 / k;
                        let x = a.x + t * (e.x - a.x) + amp * d[0];
                        let y = a.y + t * (e.y - a.y) + amp * d[1];
                        format!("{:.1},{:.1}", px(x), py(y))
                    })
                    .collect();
                writeln!(
                    w,
                    "<polyline points=\"{}\" fill=\"none\" stroke=\"{DEFLECTED}\" stroke-width=\"2.5\"/>",
                    path.join(" ")
                )?;
            }
            format!(
                "In-plane buckling mode, {}: critical factor \u{3bb}cr = {:.3} (residual {:.1e})|Mode (purple) scaled to 10 % of the truss width; the truss in faint grey.",
                b.effect,
                b.critical_factor.unwrap_or(f64::NAN),
                b.residual
            )
        }
        None => "No member is in compression: no buckling mode.".into(),
    };
    writeln!(
        w,
        "<text x=\"{margin}\" y=\"30\" font-size=\"16\" fill=\"{INK}\">{}</text>",
        esc(&model.title)
    )?;
    for (i, line) in legend.split('|').enumerate() {
        writeln!(
            w,
            "<text x=\"{margin}\" y=\"{:.0}\" font-size=\"13\" fill=\"{INK}\">{}</text>",
            height - 70.0 + 18.0 * i as f64,
            esc(line)
        )?;
    }
    writeln!(
        w,
        "<text x=\"{margin}\" y=\"{:.0}\" font-size=\"11\" fill=\"{INK}\">{}</text>",
        height - 18.0,
        esc(super::CAUTION)
    )?;
    writeln!(w, "</svg>")
}
