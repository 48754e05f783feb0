//! The key of a drawing: sample lines, symbols, a utilization colour bar
//! and notes (units, magnification), flowed into rows inside a framed box.

use super::palette as pal;
use super::{text_width, Svg};

/// One entry of the key.
pub enum Item {
    /// A sample line: colour, width, dash pattern, optional pale core
    /// (the double line of tension).
    Line {
        label: String,
        stroke: &'static str,
        width: f64,
        dash: Option<&'static str>,
        core: Option<(&'static str, f64)>,
    },
    /// A small symbol drawn by the caller's function at the given centre.
    Symbol {
        label: String,
        draw: fn(&mut Svg, (f64, f64)),
    },
    /// The utilization colour bar from 0 to 1 with the failure swatch.
    Ramp,
    /// A line of text (units, magnification, notes).
    Note(String),
}

const FONT: f64 = 12.0;
const ROW: f64 = 22.0;
const SAMPLE: f64 = 34.0;

fn item_width(item: &Item) -> f64 {
    match item {
        Item::Line { label, .. } | Item::Symbol { label, .. } => {
            SAMPLE + 8.0 + text_width(label, FONT) + 22.0
        }
        Item::Ramp => 360.0,
        Item::Note(t) => text_width(t, FONT) + 22.0,
    }
}

/// Lay the items out in rows within `width`; returns the height used.
pub fn height(items: &[Item], width: f64) -> f64 {
    let rows = rows(items, width);
    row_tops(items, &rows).last().copied().unwrap_or(0.0) + 30.0
}

/// Extra height of a row holding the colour bar: its numbers sit under it
/// and must clear the next row's text.
const RAMP_EXTRA: f64 = 12.0;

/// Offset of each row's top from the first, and the total after the last.
fn row_tops(items: &[Item], rows: &[Vec<usize>]) -> Vec<f64> {
    let mut tops = vec![0.0];
    for r in rows {
        let extra = if r.iter().any(|&i| matches!(items[i], Item::Ramp)) {
            RAMP_EXTRA
        } else {
            0.0
        };
        tops.push(tops.last().unwrap() + ROW + extra);
    }
    tops
}

fn rows(items: &[Item], width: f64) -> Vec<Vec<usize>> {
    let inner = width - 24.0;
    let mut rows: Vec<Vec<usize>> = vec![Vec::new()];
    let mut used = 0.0;
    for (i, it) in items.iter().enumerate() {
        let w = item_width(it);
        let force_break = matches!(it, Item::Ramp | Item::Note(_)) && used > 0.0;
        if (used + w > inner || force_break) && !rows.last().unwrap().is_empty() {
            rows.push(Vec::new());
            used = 0.0;
        }
        rows.last_mut().unwrap().push(i);
        used += w;
        if matches!(it, Item::Ramp | Item::Note(_)) {
            rows.push(Vec::new());
            used = 0.0;
        }
    }
    rows.retain(|r| !r.is_empty());
    rows
}

/// Draw the key in a box at (`x`, `y`) of `width`; returns its height.
pub fn draw(svg: &mut Svg, items: &[Item], x: f64, y: f64, width: f64) -> f64 {
    let rows = rows(items, width);
    let tops = row_tops(items, &rows);
    let h = tops.last().copied().unwrap_or(0.0) + 30.0;
    svg.raw(r#"<g class="legend">"#);
    svg.rect(
        x,
        y,
        width,
        h,
        &format!(
            r#"fill="{}" stroke="{}" stroke-width="1""#,
            pal::PAPER,
            pal::FAINT
        ),
    );
    svg.text(
        (x + 12.0, y + 17.0),
        FONT,
        "start",
        "Legend",
        &format!(r#"font-weight="bold" fill="{}""#, pal::INK),
    );
    let ink = format!(r#"fill="{}""#, pal::INK);
    for (r, row) in rows.iter().enumerate() {
        let cy = y + 30.0 + tops[r] + ROW / 2.0 - 4.0;
        let mut cx = x + 12.0;
        for &i in row {
            let it = &items[i];
            match it {
                Item::Line {
                    label,
                    stroke,
                    width: w,
                    dash,
                    core,
                } => {
                    let dash = dash
                        .map(|d| format!(r#" stroke-dasharray="{d}""#))
                        .unwrap_or_default();
                    svg.line((cx, cy), (cx + SAMPLE, cy), stroke, *w, &dash);
                    if let Some((c, cw)) = core {
                        svg.line((cx, cy), (cx + SAMPLE, cy), c, *cw, "");
                    }
                    svg.text((cx + SAMPLE + 8.0, cy + 4.0), FONT, "start", label, &ink);
                }
                Item::Symbol { label, draw } => {
                    draw(svg, (cx + SAMPLE / 2.0, cy - 4.0));
                    svg.text((cx + SAMPLE + 8.0, cy + 4.0), FONT, "start", label, &ink);
                }
                Item::Ramp => {
                    let (bx, bw, bh) = (cx, 220.0, 10.0);
                    let n = 44;
                    for k in 0..n {
                        let u = (k as f64 + 0.5) / n as f64;
                        svg.rect(
                            bx + bw * k as f64 / n as f64,
                            cy - 8.0,
                            bw / n as f64 + 0.3,
                            bh,
                            &format!(r#"fill="{}""#, pal::utilization(u)),
                        );
                    }
                    svg.rect(
                        bx,
                        cy - 8.0,
                        bw,
                        bh,
                        &format!(r#"fill="none" stroke="{}" stroke-width="0.6""#, pal::INK),
                    );
                    for t in [0.0, 0.25, 0.5, 0.75, 1.0] {
                        let tx = bx + bw * t;
                        svg.line((tx, cy + 2.0), (tx, cy + 5.0), pal::INK, 0.8, "");
                        svg.text((tx, cy + 14.0), 9.0, "middle", &format!("{t}"), &ink);
                    }
                    let fx = bx + bw + 14.0;
                    svg.line((fx, cy - 3.0), (fx + SAMPLE, cy - 3.0), pal::FAIL, 6.0, "");
                    svg.line(
                        (fx, cy - 3.0),
                        (fx + SAMPLE, cy - 3.0),
                        pal::PAPER,
                        1.6,
                        r#" stroke-dasharray="5 3""#,
                    );
                    svg.text(
                        (fx + SAMPLE + 6.0, cy + 1.0),
                        FONT,
                        "start",
                        "> 1 fails",
                        &ink,
                    );
                }
                Item::Note(t) => {
                    svg.text((cx, cy + 4.0), FONT, "start", t, &ink);
                }
            }
            cx += item_width(it);
        }
    }
    svg.raw("</g>");
    h
}
