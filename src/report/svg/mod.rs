//! Drawings of a truss as SVG, built as plain strings: the geometry to
//! scale with labels, supports and loads; member forces; utilization; the
//! deflected shape; and a hook for influence-line plots beneath the truss.
//! Every drawing carries a title, a legend, its units and the caution.
//!
//! `truss` draws the structure, `legend` the key, `palette` holds the
//! colours. All text is XML-escaped.

pub mod layout;
pub mod legend;
pub mod palette;
pub mod truss;

use crate::analysis::Analysis;
use crate::model::{CaseKind, Model};
use crate::rate::Rating;
use std::fmt::Write;

/// What a drawing shows.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Show {
    /// Geometry, labels, supports and the loads of one effect.
    Model,
    /// Member forces: colour, width and line style by sense and size.
    Forces,
    /// Utilization (|force| / capacity) as a graded colour.
    Utilization,
    /// The deflected shape, magnified.
    Deflection,
}

impl Show {
    pub fn name(self) -> &'static str {
        match self {
            Show::Model => "model",
            Show::Forces => "member forces",
            Show::Utilization => "utilization",
            Show::Deflection => "deflected shape",
        }
    }
}

/// One load case or combination as drawn: forces, displacements and the
/// (factored) nodal loads, all SI.
#[derive(Clone, Debug, PartialEq)]
pub struct Effect {
    pub id: String,
    /// True for a combination of load cases.
    pub combination: bool,
    pub forces: Vec<f64>,
    pub displacements: Vec<[f64; 2]>,
    pub reactions: Vec<[f64; 2]>,
    /// (node, fx, fy), N.
    pub loads: Vec<(usize, f64, f64)>,
    /// What the drawing must say about how the effect was built (a
    /// combination with a moving load's envelope).
    pub note: Option<String>,
}

/// The load cases, then the combinations as Σ factor × case (live cases
/// times 1 + impact, as `rate::load_effects` combines them).
pub fn effects(model: &Model, analysis: &Analysis) -> Vec<Effect> {
    let mut out: Vec<Effect> = model
        .cases
        .iter()
        .zip(&analysis.cases)
        .map(|(c, r)| Effect {
            id: c.id.clone(),
            combination: false,
            forces: r.forces.clone(),
            displacements: r.displacements.clone(),
            reactions: r.reactions.clone(),
            loads: c.nodal.iter().map(|l| (l.node, l.fx, l.fy)).collect(),
            note: None,
        })
        .collect();
    // Tension-only members: each combination solved whole (superposition
    // does not hold); one that cannot be solved is not drawn (`draw` and
    // `rate` report its error).
    let solved = model
        .has_tension_only()
        .then(|| crate::analysis::active_set::combination_results(model));
    for (ci, combo) in model.combinations.iter().enumerate() {
        if let Some(solved) = &solved {
            let Ok(all) = solved else { continue };
            let (state, s) = &all[ci];
            let mut node_load = vec![[0.0f64; 2]; model.nodes.len()];
            for l in &state.nodal {
                node_load[l.node][0] += l.fx;
                node_load[l.node][1] += l.fy;
            }
            out.push(Effect {
                id: combo.id.clone(),
                combination: true,
                forces: s.result.forces.clone(),
                displacements: s.result.displacements.clone(),
                reactions: s.result.reactions.clone(),
                loads: node_load
                    .iter()
                    .enumerate()
                    .filter(|(_, l)| l[0] != 0.0 || l[1] != 0.0)
                    .map(|(n, l)| (n, l[0], l[1]))
                    .collect(),
                note: Some("Solved whole with its factors (tension-only members: superposition does not hold).".into()),
            });
            continue;
        }
        let mut e = Effect {
            id: combo.id.clone(),
            combination: true,
            forces: vec![0.0; model.members.len()],
            displacements: vec![[0.0; 2]; model.nodes.len()],
            reactions: vec![[0.0; 2]; model.supports.len()],
            loads: Vec::new(),
            note: None,
        };
        let mut node_load = vec![[0.0f64; 2]; model.nodes.len()];
        for &(ci, factor) in &combo.factors {
            let case = &model.cases[ci];
            let f = if case.kind == CaseKind::Live {
                factor * (1.0 + case.impact)
            } else {
                factor
            };
            let r = &analysis.cases[ci];
            for (a, v) in e.forces.iter_mut().zip(&r.forces) {
                *a += f * v;
            }
            for (a, v) in e.displacements.iter_mut().zip(&r.displacements) {
                a[0] += f * v[0];
                a[1] += f * v[1];
            }
            for (a, v) in e.reactions.iter_mut().zip(&r.reactions) {
                a[0] += f * v[0];
                a[1] += f * v[1];
            }
            for l in &case.nodal {
                node_load[l.node][0] += f * l.fx;
                node_load[l.node][1] += f * l.fy;
            }
        }
        e.loads = node_load
            .iter()
            .enumerate()
            .filter(|(_, l)| l[0] != 0.0 || l[1] != 0.0)
            .map(|(n, l)| (n, l[0], l[1]))
            .collect();
        out.push(e);
    }
    out
}

/// As [`effects`], with the member forces of each combination that names a
/// moving load taken from `rating` as `rate` checks them: for each member
/// the side of the moving load's envelope (its governing vehicle position)
/// with the larger force, beside the combination's load cases; the loads,
/// reactions and deflections drawn stay those of the load cases alone, and
/// the effect's note says so.
pub fn effects_rated(model: &Model, analysis: &Analysis, rating: Option<&Rating>) -> Vec<Effect> {
    let mut out = effects(model, analysis);
    let Some(r) = rating else {
        return out;
    };
    for (ci, combo) in model.combinations.iter().enumerate() {
        let Some(&(k, factor)) = combo.moving.first() else {
            continue;
        };
        let sides: Vec<&[f64]> = r
            .effects
            .iter()
            .filter(|x| x.combination.map(|c| c.0) == Some(ci))
            .map(|x| x.forces.as_slice())
            .collect();
        let Some(e) = out.iter_mut().find(|e| e.combination && e.id == combo.id) else {
            continue;
        };
        if sides.is_empty() {
            continue;
        }
        // Per member, the side with the higher utilization (as checked).
        let util = |j: usize, f: f64| {
            let cap = &r.members[j];
            let c = if f > 0.0 {
                cap.tension_capacity
            } else {
                cap.compression.capacity
            };
            f.abs() / c
        };
        e.forces = (0..model.members.len())
            .map(|j| {
                sides
                    .iter()
                    .map(|f| f[j])
                    .max_by(|a, b| util(j, *a).total_cmp(&util(j, *b)))
                    .unwrap_or(0.0)
            })
            .collect();
        e.note = Some(format!(
            "Member forces include {} × moving load \"{}\" at each member's governing position (its greater utilization of the envelope's tension and compression sides, as rate checks them); the loads, reactions and deflections drawn are those of the load cases alone.",
            sig_plain(factor),
            model.live.moving[k].id
        ));
    }
    out
}

fn sig_plain(v: f64) -> String {
    super::table::sig(v, 4)
}

/// An influence line to plot under the truss: `ordinates` are (x in m, the
/// value in `unit`) at increasing x, as the influence-line code gives them.
#[derive(Clone, Debug, PartialEq)]
pub struct InfluenceLine {
    pub name: String,
    pub unit: String,
    pub ordinates: Vec<(f64, f64)>,
}

/// What to draw.
pub struct Drawing<'a> {
    pub model: &'a Model,
    pub show: Show,
    /// The effect drawn (None: the model alone; for utilization, the
    /// envelope of all effects).
    pub effect: Option<&'a Effect>,
    /// Needed for [`Show::Utilization`].
    pub rating: Option<&'a Rating>,
    /// Plots placed under the truss at the same horizontal scale.
    pub influence: &'a [InfluenceLine],
    /// Width of the drawing in px.
    pub width: f64,
}

impl<'a> Drawing<'a> {
    pub fn new(model: &'a Model, show: Show) -> Drawing<'a> {
        Drawing {
            model,
            show,
            effect: None,
            rating: None,
            influence: &[],
            width: 1000.0,
        }
    }
}

/// Draw a truss as a complete SVG document.
pub fn draw(d: &Drawing) -> String {
    truss::render(d)
}

/// Escape text for XML character data and attribute values; control
/// characters XML 1.0 forbids are dropped.
pub fn esc(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    for ch in s.chars() {
        match ch {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&apos;"),
            c if (c as u32) < 0x20 && c != '\t' && c != '\n' && c != '\r' => {}
            '\u{FFFE}' | '\u{FFFF}' => {}
            c => out.push(c),
        }
    }
    out
}

/// A coordinate or length in px, two decimals, never NaN in the output.
pub fn px(v: f64) -> String {
    if v.is_finite() {
        let s = format!("{v:.2}");
        let s = s.trim_end_matches('0').trim_end_matches('.');
        if s == "-0" {
            "0".into()
        } else {
            s.to_string()
        }
    } else {
        "0".into()
    }
}

/// Rough width in px of `text` at `size` px in a sans-serif face.
pub fn text_width(text: &str, size: f64) -> f64 {
    text.chars().count() as f64 * size * 0.56
}

/// A small SVG writer: elements appended to a string.
#[derive(Default)]
pub struct Svg {
    pub out: String,
}

impl Svg {
    pub fn raw(&mut self, s: &str) {
        self.out.push_str(s);
        self.out.push('\n');
    }

    /// A straight line; `extra` is appended inside the tag (attributes).
    pub fn line(&mut self, a: (f64, f64), b: (f64, f64), stroke: &str, width: f64, extra: &str) {
        let _ = writeln!(
            self.out,
            r#"<line x1="{}" y1="{}" x2="{}" y2="{}" stroke="{stroke}" stroke-width="{}"{extra}/>"#,
            px(a.0),
            px(a.1),
            px(b.0),
            px(b.1),
            px(width)
        );
    }

    /// A closed or open polyline path through `pts`.
    pub fn path(&mut self, pts: &[(f64, f64)], close: bool, attrs: &str) {
        let mut d = String::new();
        for (i, p) in pts.iter().enumerate() {
            let _ = write!(
                d,
                "{}{} {} ",
                if i == 0 { "M" } else { "L" },
                px(p.0),
                px(p.1)
            );
        }
        if close {
            d.push('Z');
        }
        let _ = writeln!(self.out, r#"<path d="{}" {attrs}/>"#, d.trim_end());
    }

    pub fn circle(&mut self, c: (f64, f64), r: f64, attrs: &str) {
        let _ = writeln!(
            self.out,
            r#"<circle cx="{}" cy="{}" r="{}" {attrs}/>"#,
            px(c.0),
            px(c.1),
            px(r)
        );
    }

    pub fn rect(&mut self, x: f64, y: f64, w: f64, h: f64, attrs: &str) {
        let _ = writeln!(
            self.out,
            r#"<rect x="{}" y="{}" width="{}" height="{}" {attrs}/>"#,
            px(x),
            px(y),
            px(w),
            px(h)
        );
    }

    /// Text at `p`; `anchor` start/middle/end; `attrs` extra attributes.
    pub fn text(&mut self, p: (f64, f64), size: f64, anchor: &str, text: &str, attrs: &str) {
        let _ = writeln!(
            self.out,
            r#"<text x="{}" y="{}" font-size="{}" text-anchor="{anchor}" {attrs}>{}</text>"#,
            px(p.0),
            px(p.1),
            px(size),
            esc(text)
        );
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn escapes_markup_and_controls() {
        assert_eq!(esc("a<b & \"c\"\u{1}"), "a&lt;b &amp; &quot;c&quot;");
        assert_eq!(px(1.5), "1.5");
        assert_eq!(px(-0.001), "0");
        assert_eq!(px(f64::NAN), "0");
        assert_eq!(px(2.0), "2");
    }
}
