//! The truss itself: geometry to scale, node and member labels, supports
//! as the trade draws them (pin: triangle on hatched ground; roller:
//! triangle on two rollers; an inclined roller turned to its surface),
//! loads and reactions as arrows with values, members styled by what the
//! drawing shows, a scale bar, optional influence-line strips, the legend
//! and the caution.

use super::layout::{Candidate, Layout, Quad};
use super::legend::{self, Item};
use super::palette as pal;
use super::{esc, px, text_width, Drawing, Effect, InfluenceLine, Show, Svg};
use crate::model::{Model, Restraint};
use crate::report::table::sig;
use crate::report::{Scale, CAUTION};
use std::fmt::Write;

/// Model coordinates (m) to drawing px: x right, y up in the model, down
/// on the page.
#[derive(Clone, Copy, Debug)]
pub struct Frame {
    pub xmin: f64,
    pub ymax: f64,
    /// px per m.
    pub scale: f64,
    pub left: f64,
    pub top: f64,
}

impl Frame {
    pub fn p(&self, x: f64, y: f64) -> (f64, f64) {
        (
            self.left + (x - self.xmin) * self.scale,
            self.top + (self.ymax - y) * self.scale,
        )
    }
    pub fn x(&self, x: f64) -> f64 {
        self.left + (x - self.xmin) * self.scale
    }
}

/// Support symbol size, px.
const S: f64 = 11.0;
const LOAD_LEN: f64 = 46.0;
const INFLUENCE_H: f64 = 120.0;

/// 1, 2 or 5 × 10^k not above `v` (v > 0).
pub fn nice_floor(v: f64) -> f64 {
    if !(v.is_finite() && v > 0.0) {
        return 1.0;
    }
    let k = v.log10().floor();
    let base = 10f64.powf(k);
    let m = v / base;
    let n = if m >= 5.0 {
        5.0
    } else if m >= 2.0 {
        2.0
    } else {
        1.0
    };
    n * base
}

/// Magnification of the deflected shape: the largest displacement drawn
/// as about 8 % of the larger model dimension, rounded down to 1-2-5.
pub fn magnification(model: &Model, disp: &[[f64; 2]]) -> f64 {
    let (sx, sy) = extent(model);
    let dmax = disp.iter().fold(0.0f64, |a, u| a.max(u[0].hypot(u[1])));
    if dmax <= 0.0 || !dmax.is_finite() {
        return 1.0;
    }
    nice_floor(0.08 * sx.max(sy).max(1e-9) / dmax)
}

fn extent(model: &Model) -> (f64, f64) {
    let (mut x0, mut x1, mut y0, mut y1) = bounds(model.nodes.iter().map(|n| (n.x, n.y)));
    if x0 > x1 {
        (x0, x1, y0, y1) = (0.0, 0.0, 0.0, 0.0);
    }
    (x1 - x0, y1 - y0)
}

fn bounds(pts: impl Iterator<Item = (f64, f64)>) -> (f64, f64, f64, f64) {
    pts.fold(
        (
            f64::INFINITY,
            f64::NEG_INFINITY,
            f64::INFINITY,
            f64::NEG_INFINITY,
        ),
        |(a, b, c, d), (x, y)| {
            if x.is_finite() && y.is_finite() {
                (a.min(x), b.max(x), c.min(y), d.max(y))
            } else {
                (a, b, c, d)
            }
        },
    )
}

/// Per-member utilization of the drawn effect, or the envelope of all
/// effects: (utilization, effect id).
fn utilizations(d: &Drawing) -> Option<Vec<(f64, String)>> {
    let r = d.rating?;
    let want = d
        .effect
        .and_then(|e| r.effects.iter().position(|x| x.id == e.id));
    let mut out = vec![(0.0, String::new()); d.model.members.len()];
    // The envelope shows the counted checks (not service rows) when any.
    let counted = r.checks.iter().any(|c| !c.service);
    for c in &r.checks {
        if want.is_some_and(|w| w != c.effect) || (want.is_none() && counted && c.service) {
            continue;
        }
        let slot = &mut out[c.member];
        if c.utilization > slot.0 || slot.1.is_empty() {
            *slot = (c.utilization, r.effects[c.effect].id.clone());
        }
    }
    Some(out)
}

fn subtitle(d: &Drawing, mag: Option<f64>) -> String {
    let what = match (d.show, d.effect) {
        (Show::Utilization, None) => "envelope of the counted checks".to_string(),
        (_, Some(e)) if e.combination => format!("combination \"{}\" (factored)", e.id),
        (_, Some(e)) => format!("load case \"{}\"", e.id),
        (_, None) => "no load case".to_string(),
    };
    let mut s = format!("{} — {what} — geometry to scale", capital(d.show.name()));
    if let Some(m) = mag {
        let _ = write!(s, ", displacements magnified ×{}", sig(m, 3));
    }
    s
}

/// The effect's note (how a combination with a moving load was built),
/// wrapped to `chars` characters a line, at most three lines.
fn note_lines(d: &Drawing, chars: usize) -> Vec<String> {
    let Some(note) = d.effect.and_then(|e| e.note.as_ref()) else {
        return Vec::new();
    };
    if d.show == Show::Utilization {
        return Vec::new();
    }
    let mut lines: Vec<String> = vec![String::new()];
    for word in note.split_whitespace() {
        let last = lines.last_mut().unwrap();
        if !last.is_empty() && last.chars().count() + 1 + word.chars().count() > chars {
            lines.push(word.to_string());
        } else {
            if !last.is_empty() {
                last.push(' ');
            }
            last.push_str(word);
        }
    }
    lines.truncate(3);
    lines
}

fn capital(s: &str) -> String {
    let mut c = s.chars();
    match c.next() {
        Some(f) => f.to_uppercase().chain(c).collect(),
        None => String::new(),
    }
}

/// Render the whole drawing.
pub fn render(d: &Drawing) -> String {
    let model = d.model;
    let sc = Scale::of(model);
    let w = d.width.max(480.0);
    let effect = d.effect;
    let show_loads = matches!(d.show, Show::Model | Show::Forces) && effect.is_some();
    let deflect = match (d.show, effect) {
        (Show::Deflection, Some(e)) => Some((magnification(model, &e.displacements), e)),
        _ => None,
    };
    let util = if d.show == Show::Utilization {
        utilizations(d)
    } else {
        None
    };

    // Extents, including the magnified deflected shape.
    let pts: Vec<(f64, f64)> = model
        .nodes
        .iter()
        .enumerate()
        .flat_map(|(i, n)| {
            let mut v = vec![(n.x, n.y)];
            if let Some((m, e)) = deflect {
                let u = e.displacements.get(i).copied().unwrap_or([0.0; 2]);
                v.push((n.x + m * u[0], n.y + m * u[1]));
            }
            v
        })
        .collect();
    let (mut x0, mut x1, mut y0, mut y1) = bounds(pts.iter().copied());
    if x0 > x1 {
        (x0, x1, y0, y1) = (0.0, 1.0, 0.0, 1.0);
    }
    let (sx, sy) = (x1 - x0, y1 - y0);
    let margin = 100.0;
    let avail_w = w - 2.0 * margin;
    let avail_h = 0.55 * w;
    let scale = match (sx > 1e-12, sy > 1e-12) {
        (true, true) => (avail_w / sx).min(avail_h / sy),
        (true, false) => avail_w / sx,
        (false, true) => avail_h / sy,
        (false, false) => 1.0,
    };
    let title_h = 62.0;
    let above = if show_loads { LOAD_LEN + 36.0 } else { 34.0 };
    let mut frame = Frame {
        xmin: x0,
        ymax: y1,
        scale,
        left: (w - sx * scale) / 2.0,
        top: title_h + above,
    };
    let hanging = show_loads && effect.is_some_and(|e| loads_below(&frame, model, e));
    // Less room above when every load hangs below (none is drawn above).
    let above_loads = show_loads && effect.is_some_and(|e| loads_above(&frame, model, e));
    if hanging && !above_loads && d.show == Show::Model {
        frame.top = title_h + 34.0;
    }
    let below = match (d.show == Show::Forces, hanging) {
        (true, true) => 160.0,
        (true, false) => 118.0,
        (false, true) => LOAD_LEN + 80.0,
        (false, false) => 70.0,
    };
    let truss_bottom = frame.top + sy * scale;
    let scalebar_y = truss_bottom + below;
    let influence_top = scalebar_y + 34.0;
    let legend_top = influence_top + d.influence.len() as f64 * INFLUENCE_H + 8.0;
    let items = legend_items(d, &sc, deflect, util.as_deref());
    let legend_h = legend::height(&items, w - 40.0);
    let h = legend_top + legend_h + 40.0;

    let mut svg = Svg::default();
    let _ = writeln!(
        svg.out,
        r#"<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 {} {}" width="{}" height="{}" font-family="DejaVu Sans, Arial, Helvetica, sans-serif">"#,
        px(w),
        px(h),
        px(w),
        px(h)
    );
    let title = if model.title.is_empty() {
        "(untitled model)"
    } else {
        &model.title
    };
    let sub = subtitle(d, deflect.map(|(m, _)| m));
    let _ = writeln!(svg.out, "<title>{} — {}</title>", esc(title), esc(&sub));
    svg.rect(0.0, 0.0, w, h, &format!(r#"fill="{}""#, pal::PAPER));
    let ink = format!(r#"fill="{}""#, pal::INK);
    svg.text(
        (20.0, 28.0),
        18.0,
        "start",
        title,
        &format!(r#"{ink} font-weight="bold""#),
    );
    svg.text((20.0, 50.0), 13.0, "start", &sub, &ink);
    let chars = ((w - 40.0) / (0.56 * 11.0)).max(40.0) as usize;
    for (i, line) in note_lines(d, chars).iter().enumerate() {
        svg.text((20.0, 67.0 + 14.0 * i as f64), 11.0, "start", line, &ink);
    }

    // Members.
    svg.raw(r#"<g class="members">"#);
    let fmax = effect
        .map(|e| e.forces.iter().fold(0.0f64, |a, f| a.max(f.abs())))
        .unwrap_or(0.0);
    let label_members = model.members.len() <= 400;
    // Labels wait for the collision pass, after every arrow and symbol.
    let mut lay = Layout::default();
    let mut member_labels: Vec<MemberLabel> = Vec::new();
    for (m, mem) in model.members.iter().enumerate() {
        let (a, b) = (&model.nodes[mem.start], &model.nodes[mem.end]);
        let (pa, pb) = (frame.p(a.x, a.y), frame.p(b.x, b.y));
        let id = esc(&mem.id);
        let (label, lw) = match d.show {
            Show::Model => {
                svg.line(
                    pa,
                    pb,
                    pal::STRUCTURE,
                    2.5,
                    &format!(r#" class="member" data-member="{id}""#),
                );
                (mem.id.to_string(), 2.5)
            }
            Show::Forces => {
                let f = effect.map_or(0.0, |e| e.forces[m]);
                member_force(&mut svg, pa, pb, f, fmax, &id, &sc)
            }
            Show::Utilization => {
                let (u, case) = util
                    .as_ref()
                    .and_then(|u| u.get(m).cloned())
                    .unwrap_or((f64::NAN, String::new()));
                member_util(&mut svg, pa, pb, u, &case, &id)
            }
            Show::Deflection => {
                svg.line(
                    pa,
                    pb,
                    pal::FAINT,
                    1.3,
                    &format!(
                        r#" stroke-dasharray="5 4" class="member undeformed" data-member="{id}""#
                    ),
                );
                if let Some((mag, e)) = deflect {
                    let ua = e.displacements[mem.start];
                    let ub = e.displacements[mem.end];
                    let qa = frame.p(a.x + mag * ua[0], a.y + mag * ua[1]);
                    let qb = frame.p(b.x + mag * ub[0], b.y + mag * ub[1]);
                    lay.line(qa, qb, 2.3);
                    svg.line(
                        qa,
                        qb,
                        pal::DEFLECTED,
                        2.6,
                        &format!(r#" class="member deflected" data-member="{id}""#),
                    );
                }
                (String::new(), 0.0)
            }
        };
        lay.line(pa, pb, lw.max(2.5) / 2.0 + 1.0);
        if label_members && !label.is_empty() {
            member_labels.push((pa, pb, label, lw));
        }
    }
    svg.raw("</g>");

    // Supports, under the nodes.
    svg.raw(r#"<g class="supports">"#);
    for s in &model.supports {
        let n = &model.nodes[s.node];
        let p = frame.p(n.x, n.y);
        support(&mut svg, p, s.restraint, 1.0);
        lay.obstacle(Quad::rect(
            p.0 - 1.5 * S - 1.0,
            p.1 + 4.0,
            p.0 + 1.5 * S + 1.0,
            p.1 + 2.4 * S,
        ));
    }
    svg.raw("</g>");

    // Nodes: hinge circles, labels away from the members they join.
    svg.raw(r#"<g class="nodes">"#);
    let many = model.nodes.len() > 300;
    let mut node_points = Vec::with_capacity(model.nodes.len());
    for (i, n) in model.nodes.iter().enumerate() {
        let p = match deflect {
            Some((mag, e)) => {
                let u = e.displacements[i];
                frame.p(n.x + mag * u[0], n.y + mag * u[1])
            }
            None => frame.p(n.x, n.y),
        };
        svg.circle(
            p,
            if many { 1.6 } else { 3.4 },
            &format!(
                r#"fill="{}" stroke="{}" stroke-width="1.3""#,
                pal::PAPER,
                pal::INK
            ),
        );
        let r = if many { 1.6 } else { 3.4 };
        lay.obstacle(Quad::rect(
            p.0 - r - 1.0,
            p.1 - r - 1.0,
            p.0 + r + 1.0,
            p.1 + r + 1.0,
        ));
        node_points.push(p);
    }
    svg.raw("</g>");

    // Arrows first (obstacles), then labels by importance: nodes, loads,
    // reactions, the deflection note, member values.
    let mut pending: Vec<(Vec<Candidate>, String, String)> = Vec::new();
    if show_loads {
        if let Some(e) = effect {
            pending.extend(loads(&mut svg, &mut lay, &frame, model, e, &sc));
        }
    }
    if d.show == Show::Forces {
        if let Some(e) = effect {
            pending.extend(reactions(&mut svg, &mut lay, &frame, model, e, &sc));
        }
    }
    svg.raw(r#"<g class="labels">"#);
    if !many {
        for (i, n) in model.nodes.iter().enumerate() {
            let c = node_label_places(node_points[i], away(model, i));
            lay.place(&mut svg, &c, 11.0, &n.id, &halo(pal::INK, "italic"), true);
        }
    }
    for (c, text, attrs) in &pending {
        lay.place(&mut svg, c, 11.0, text, attrs, true);
    }
    if let Some((_, e)) = deflect {
        // The largest displacement, labelled at its node.
        if let Some((i, u)) = e
            .displacements
            .iter()
            .enumerate()
            .max_by(|a, b| a.1[0].hypot(a.1[1]).total_cmp(&b.1[0].hypot(b.1[1])))
        {
            let mag = deflect.map(|(m, _)| m).unwrap_or(1.0);
            let n = &model.nodes[i];
            let p = frame.p(n.x + mag * u[0], n.y + mag * u[1]);
            // Components below a millionth of the largest displacement are
            // round-off of the solve: shown as 0.
            let big = u[0].hypot(u[1]);
            let clean = |v: f64| if v.abs() <= 1e-6 * big { 0.0 } else { v };
            let t = format!(
                "{}: ux {}, uy {} {}",
                n.id,
                sig(clean(u[0]) / sc.disp, 3),
                sig(clean(u[1]) / sc.disp, 3),
                sc.disp_name
            );
            let mut c: Vec<Candidate> = [
                (0.0, 30.0),
                (0.0, -22.0),
                (0.0, 46.0),
                (0.0, -38.0),
                (0.0, 62.0),
            ]
            .iter()
            .map(|&(dx, dy)| Candidate::flat((p.0 + dx, p.1 + dy), "middle"))
            .collect();
            // Under the whole drawing, clear of every member.
            let low = node_points.iter().map(|q| q.1).fold(p.1, f64::max);
            for dy in [34.0, 50.0] {
                c.push(Candidate::flat((p.0, low + dy), "middle"));
            }
            lay.place(&mut svg, &c, 11.5, &t, &halo(pal::DEFLECTED, "bold"), true);
        }
    }
    for (pa, pb, text, lw) in &member_labels {
        let c = member_label_places(*pa, *pb, text, *lw);
        lay.place(&mut svg, &c, 10.5, text, &halo(pal::INK, ""), false);
    }
    svg.raw("</g>");
    if lay.dropped > 0 {
        svg.text(
            (w - 20.0, scalebar_y + 12.0),
            10.5,
            "end",
            &format!(
                "{} member label{} left out for room; `panelpoint solve` lists every value",
                lay.dropped,
                if lay.dropped == 1 { "" } else { "s" }
            ),
            &ink,
        );
    }

    scale_bar(
        &mut svg,
        &frame,
        sx,
        &sc,
        20.0_f64.max(frame.left - 60.0),
        scalebar_y,
    );

    for (k, line) in d.influence.iter().enumerate() {
        influence_plot(
            &mut svg,
            &frame,
            influence_top + k as f64 * INFLUENCE_H,
            sx,
            line,
            &sc,
        );
    }

    legend::draw(&mut svg, &items, 20.0, legend_top, w - 40.0);
    svg.text(
        (20.0, h - 16.0),
        11.0,
        "start",
        &format!("CAUTION: {CAUTION}"),
        &ink,
    );
    svg.raw("</svg>");
    svg.out
}

/// Text attributes with a white halo so labels read over lines.
fn halo(fill: &str, style: &str) -> String {
    let style = match style {
        "italic" => r#" font-style="italic""#,
        "bold" => r#" font-weight="bold""#,
        _ => "",
    };
    format!(
        r#"fill="{fill}" stroke="{}" stroke-width="3" stroke-linejoin="round" paint-order="stroke"{style}"#,
        pal::PAPER
    )
}

/// Unit vector (page coordinates) pointing away from the members at node `i`.
fn away(model: &Model, i: usize) -> (f64, f64) {
    let n = &model.nodes[i];
    let (mut sx, mut sy) = (0.0, 0.0);
    for mem in &model.members {
        let other = if mem.start == i {
            mem.end
        } else if mem.end == i {
            mem.start
        } else {
            continue;
        };
        let o = &model.nodes[other];
        let (dx, dy) = (o.x - n.x, -(o.y - n.y));
        let l = dx.hypot(dy);
        if l > 0.0 {
            sx += dx / l;
            sy += dy / l;
        }
    }
    let l = sx.hypot(sy);
    if l < 1e-6 {
        (-0.7, -0.7)
    } else {
        (-sx / l, -sy / l)
    }
}

fn member_force(
    svg: &mut Svg,
    pa: (f64, f64),
    pb: (f64, f64),
    f: f64,
    fmax: f64,
    id: &str,
    sc: &Scale,
) -> (String, f64) {
    let zero = fmax <= 0.0 || f.abs() <= 1e-9 * fmax;
    if zero {
        svg.line(
            pa,
            pb,
            pal::FAINT,
            1.4,
            &format!(r#" stroke-dasharray="3 3" class="member zero" data-member="{id}""#),
        );
        return ("0".into(), 1.4);
    }
    let width = 3.0 + 7.0 * f.abs() / fmax;
    let value = sig(f.abs() / sc.force, 3);
    if f > 0.0 {
        svg.line(
            pa,
            pb,
            pal::TENSION,
            width,
            &format!(r#" class="member tension" data-member="{id}""#),
        );
        svg.line(pa, pb, pal::TENSION_CORE, width * 0.42, r#" class="core""#);
        (format!("{value} T"), width)
    } else {
        svg.line(
            pa,
            pb,
            pal::COMPRESSION,
            width,
            &format!(r#" class="member compression" data-member="{id}""#),
        );
        (format!("{value} C"), width)
    }
}

fn member_util(
    svg: &mut Svg,
    pa: (f64, f64),
    pb: (f64, f64),
    u: f64,
    case: &str,
    id: &str,
) -> (String, f64) {
    if !u.is_finite() {
        svg.line(
            pa,
            pb,
            pal::FAINT,
            1.4,
            &format!(r#" stroke-dasharray="3 3" class="member unrated" data-member="{id}""#),
        );
        return (String::new(), 1.4);
    }
    let width = 6.0;
    // A faint outline so the palest ramp colours read on white paper.
    svg.line(pa, pb, pal::FAINT, width + 1.6, "");
    let colour = pal::utilization(u);
    let case = esc(case);
    svg.line(
        pa,
        pb,
        &colour,
        width,
        &format!(
            r#" class="member{}" data-member="{id}" data-utilization="{}" data-case="{case}""#,
            if u > 1.0 { " fails" } else { "" },
            sig(u, 4)
        ),
    );
    if u > 1.0 {
        svg.line(pa, pb, pal::PAPER, 1.6, r#" stroke-dasharray="5 3""#);
        (format!("{} !", sig(u, 3)), width)
    } else {
        (sig(u, 2), width)
    }
}

/// Places for a label written along a member, upright: 40 % along and
/// above it first (clear of crossing labels in panels with two
/// diagonals), then other points along it, above and below.
fn member_label_places(
    pa: (f64, f64),
    pb: (f64, f64),
    text: &str,
    stroke_w: f64,
) -> Vec<Candidate> {
    let (dx, dy) = (pb.0 - pa.0, pb.1 - pa.1);
    let len = dx.hypot(dy);
    if len < 1.0 || text_width(text, 10.5) > 0.8 * len {
        return Vec::new();
    }
    let mut ang = dy.atan2(dx).to_degrees();
    if ang > 90.0 {
        ang -= 180.0;
    } else if ang <= -90.0 {
        ang += 180.0;
    }
    // Measure along from the end the upright text starts at.
    let (a, b) =
        if (pb.0 - pa.0) * ang.to_radians().cos() + (pb.1 - pa.1) * ang.to_radians().sin() >= 0.0 {
            (pa, pb)
        } else {
            (pb, pa)
        };
    let off = stroke_w / 2.0 + 4.0;
    let mut out = Vec::new();
    for (t, below) in [
        (0.4, false),
        (0.6, false),
        (0.4, true),
        (0.6, true),
        (0.3, false),
        (0.7, false),
        (0.3, true),
        (0.7, true),
        (0.5, false),
        (0.5, true),
        (0.22, false),
        (0.78, false),
        (0.22, true),
        (0.78, true),
    ] {
        let half = text_width(text, 10.5) / 2.0;
        // Keep the text within the member's length.
        if t * len < half + 4.0 || (1.0 - t) * len < half + 4.0 {
            continue;
        }
        out.push(Candidate {
            at: (a.0 + (b.0 - a.0) * t, a.1 + (b.1 - a.1) * t),
            anchor: "middle",
            rotate: ang,
            dy: if below { off + 0.78 * 10.5 } else { -off },
        });
    }
    out
}

/// Places for a node's label: away from its members first, then round it.
fn node_label_places(p: (f64, f64), (dx, dy): (f64, f64)) -> Vec<Candidate> {
    let mut dirs = vec![(dx, dy)];
    for k in 0..8 {
        let a = std::f64::consts::TAU * k as f64 / 8.0 + std::f64::consts::FRAC_PI_8;
        dirs.push((a.cos(), a.sin()));
    }
    let mut out = Vec::new();
    for r in [14.0, 20.0] {
        for &(dx, dy) in &dirs {
            let anchor = if dx > 0.4 {
                "start"
            } else if dx < -0.4 {
                "end"
            } else {
                "middle"
            };
            out.push(Candidate::flat((p.0 + dx * r, p.1 + dy * r + 4.0), anchor));
        }
    }
    out
}

/// Draw a support symbol at `p` (page px), `k` times the normal size.
pub fn support(svg: &mut Svg, p: (f64, f64), r: Restraint, k: f64) {
    let rot = match r {
        Restraint::InclinedRoller { angle } => -angle.to_degrees(),
        _ => 0.0,
    };
    let s = S * k;
    let attrs = format!(
        r#"fill="{}" stroke="{}" stroke-width="{}""#,
        pal::PAPER,
        pal::INK,
        px(1.3 * k.max(0.6))
    );
    let _ = writeln!(
        svg.out,
        r#"<g class="support {}" transform="translate({} {}) rotate({})">"#,
        r.name().replace(' ', "-"),
        px(p.0),
        px(p.1),
        px(rot)
    );
    let ground = match r {
        Restraint::Pin => {
            svg.path(&[(0.0, 0.0), (-s, 1.6 * s), (s, 1.6 * s)], true, &attrs);
            1.6 * s
        }
        Restraint::Roller | Restraint::InclinedRoller { .. } => {
            svg.path(&[(0.0, 0.0), (-s, 1.3 * s), (s, 1.3 * s)], true, &attrs);
            let rr = 0.27 * s;
            svg.circle((-0.5 * s, 1.3 * s + rr), rr, &attrs);
            svg.circle((0.5 * s, 1.3 * s + rr), rr, &attrs);
            1.3 * s + 2.0 * rr
        }
    };
    let sw = 1.2 * k.max(0.6);
    svg.line((-1.5 * s, ground), (1.5 * s, ground), pal::INK, sw, "");
    let hatches = 7;
    for h in 0..hatches {
        let x = -1.5 * s + (h as f64 + 1.0) * 3.0 * s / hatches as f64;
        svg.line(
            (x, ground),
            (x - 0.45 * s, ground + 0.5 * s),
            pal::INK,
            sw * 0.8,
            "",
        );
    }
    svg.raw("</g>");
}

/// An arrow from `tail` to `tip` with a head at the tip; `open` draws the
/// head as an outline (reactions), otherwise filled (loads).
fn arrow(svg: &mut Svg, tail: (f64, f64), tip: (f64, f64), colour: &str, open: bool, class: &str) {
    let (dx, dy) = (tip.0 - tail.0, tip.1 - tail.1);
    let l = dx.hypot(dy).max(1e-9);
    let (ux, uy) = (dx / l, dy / l);
    let (hl, hw) = (10.0, 4.5);
    let base = (tip.0 - ux * hl, tip.1 - uy * hl);
    let _ = writeln!(svg.out, r#"<g class="{class}">"#);
    svg.line(tail, base, colour, 1.8, "");
    let head = [
        tip,
        (base.0 - uy * hw, base.1 + ux * hw),
        (base.0 + uy * hw, base.1 - ux * hw),
    ];
    let fill = if open { pal::PAPER } else { colour };
    svg.path(
        &head,
        true,
        &format!(r#"fill="{fill}" stroke="{colour}" stroke-width="1.3""#),
    );
    svg.raw("</g>");
}

/// How far (px) point `q` lies outside the truss's box on the page.
fn outside(frame: &Frame, bbox: (f64, f64, f64, f64), q: (f64, f64)) -> f64 {
    let (a, b) = (frame.p(bbox.0, bbox.3), frame.p(bbox.1, bbox.2));
    let dx = (a.0 - q.0).max(q.0 - b.0).max(0.0);
    let dy = (a.1 - q.1).max(q.1 - b.1).max(0.0);
    dx.hypot(dy)
}

/// Whether some load of `e` is drawn hanging below the truss.
fn loads_below(frame: &Frame, model: &Model, e: &Effect) -> bool {
    let bbox = bounds(model.nodes.iter().map(|n| (n.x, n.y)));
    e.loads.iter().any(|&(node, fx, fy)| {
        let mag = fx.hypot(fy);
        if !(mag > 0.0 && mag.is_finite()) {
            return false;
        }
        let n = &model.nodes[node];
        let p = frame.p(n.x, n.y);
        let (ux, uy) = (fx / mag, -fy / mag);
        let push = outside(frame, bbox, (p.0 - ux * LOAD_LEN, p.1 - uy * LOAD_LEN));
        let pull = outside(frame, bbox, (p.0 + ux * LOAD_LEN, p.1 + uy * LOAD_LEN));
        pull > push && uy > 0.0
    })
}

/// A member's label waiting for the collision pass: its ends, text and line width.
type MemberLabel = ((f64, f64), (f64, f64), String, f64);

/// A label waiting for the collision pass: its places, text and attributes.
type Pending = (Vec<Candidate>, String, String);

/// Loads of `e` at each node, those in one direction summed: (node, fx,
/// fy, the parts' magnitudes).
fn loads_by_node(e: &Effect) -> Vec<(usize, f64, f64, Vec<f64>)> {
    let mut out: Vec<(usize, f64, f64, Vec<f64>)> = Vec::new();
    for &(node, fx, fy) in &e.loads {
        let mag = fx.hypot(fy);
        if !(mag > 0.0 && mag.is_finite()) {
            continue;
        }
        let same = out.iter_mut().find(|(n, gx, gy, _)| {
            *n == node
                && (gx * fy - gy * fx).abs() <= 1e-9 * mag * gx.hypot(*gy)
                && gx * fx + gy * fy > 0.0
        });
        match same {
            Some(l) => {
                l.1 += fx;
                l.2 += fy;
                l.3.push(mag);
            }
            None => out.push((node, fx, fy, vec![mag])),
        }
    }
    out
}

/// Whether some load of `e` is drawn above the truss (pushed from above).
fn loads_above(frame: &Frame, model: &Model, e: &Effect) -> bool {
    let bbox = bounds(model.nodes.iter().map(|n| (n.x, n.y)));
    e.loads.iter().any(|&(node, fx, fy)| {
        let mag = fx.hypot(fy);
        if !(mag > 0.0 && mag.is_finite()) {
            return false;
        }
        let n = &model.nodes[node];
        let p = frame.p(n.x, n.y);
        let (ux, uy) = (fx / mag, -fy / mag);
        let push = outside(frame, bbox, (p.0 - ux * LOAD_LEN, p.1 - uy * LOAD_LEN));
        let pull = outside(frame, bbox, (p.0 + ux * LOAD_LEN, p.1 + uy * LOAD_LEN));
        let supported = model.supports.iter().any(|s| s.node == node);
        (supported || push >= pull) && uy > 0.0
    })
}

/// Draw the load arrows of `e` (obstacles in `lay`) and return their labels.
fn loads(
    svg: &mut Svg,
    lay: &mut Layout,
    frame: &Frame,
    model: &Model,
    e: &Effect,
    sc: &Scale,
) -> Vec<Pending> {
    let bbox = bounds(model.nodes.iter().map(|n| (n.x, n.y)));
    let mut out = Vec::new();
    svg.raw(r#"<g class="loads">"#);
    for (node, fx, fy, parts) in loads_by_node(e) {
        let mag = fx.hypot(fy);
        let n = &model.nodes[node];
        let p = frame.p(n.x, n.y);
        let (ux, uy) = (fx / mag, -fy / mag);
        // Push onto the node from outside the truss where that side is
        // clear (a top-chord load from above); else hang the arrow from the
        // node (a bottom-chord load drawn below it), so it never crosses
        // the members. At a support the space below belongs to the support
        // and its reaction: push from the other side.
        let push_far = (p.0 - ux * LOAD_LEN, p.1 - uy * LOAD_LEN);
        let pull_far = (p.0 + ux * LOAD_LEN, p.1 + uy * LOAD_LEN);
        let supported = model.supports.iter().any(|s| s.node == node);
        let push = supported || outside(frame, bbox, push_far) >= outside(frame, bbox, pull_far);
        let (tail, tip, label_at, dir) = if push {
            let tip = (p.0 - ux * 6.0, p.1 - uy * 6.0);
            let tail = (tip.0 - ux * LOAD_LEN, tip.1 - uy * LOAD_LEN);
            (tail, tip, tail, -1.0)
        } else {
            // Start clear of the node's own label, which sits on this side.
            let tail = (p.0 + ux * 24.0, p.1 + uy * 24.0);
            let tip = (tail.0 + ux * LOAD_LEN, tail.1 + uy * LOAD_LEN);
            (tail, tip, tip, 1.0)
        };
        arrow(svg, tail, tip, pal::LOAD, false, "load");
        lay.obstacle(Quad::segment(tail, tip, 5.5));
        let total = format!("{} {}", sig(mag / sc.force, 3), sc.force_name);
        let t = if parts.len() > 1 {
            let each: Vec<String> = parts.iter().map(|m| sig(m / sc.force, 3)).collect();
            format!("{total} ({})", each.join(" + "))
        } else {
            total
        };
        // The label beyond the far end of the arrow, else beside its shaft.
        let (ox, oy) = (dir * ux, dir * uy);
        let (lx, ly) = (label_at.0 + ox * 6.0, label_at.1 + oy * 6.0);
        let first = if oy.abs() >= ox.abs() {
            Candidate::flat((lx, if oy < 0.0 { ly - 2.0 } else { ly + 11.0 }), "middle")
        } else if ox < 0.0 {
            Candidate::flat((lx, ly + 4.0), "end")
        } else {
            Candidate::flat((lx, ly + 4.0), "start")
        };
        let mid = ((tail.0 + tip.0) / 2.0, (tail.1 + tip.1) / 2.0);
        let mut c = vec![first];
        for k in [1.0, 2.0] {
            c.push(Candidate::flat(
                (first.at.0, first.at.1 + oy.signum() * 13.0 * k),
                first.anchor,
            ));
        }
        c.push(Candidate::flat((mid.0 + 8.0, mid.1 + 4.0), "start"));
        c.push(Candidate::flat((mid.0 - 8.0, mid.1 + 4.0), "end"));
        out.push((c, t, halo(pal::LOAD, "bold")));
    }
    svg.raw("</g>");
    out
}

/// Draw the reaction arrows of `e` (obstacles in `lay`) and return their labels.
fn reactions(
    svg: &mut Svg,
    lay: &mut Layout,
    frame: &Frame,
    model: &Model,
    e: &Effect,
    sc: &Scale,
) -> Vec<Pending> {
    let rmax = e
        .reactions
        .iter()
        .flatten()
        .fold(0.0f64, |a, r| a.max(r.abs()));
    let (sx, _) = extent(model);
    let mid = model
        .nodes
        .iter()
        .map(|n| n.x)
        .fold(f64::INFINITY, f64::min)
        + sx / 2.0;
    let mut out = Vec::new();
    svg.raw(r#"<g class="reactions">"#);
    for (s, r) in model.supports.iter().zip(&e.reactions) {
        let n = &model.nodes[s.node];
        let p = frame.p(n.x, n.y);
        if r[1].abs() > 1e-9 * rmax {
            let (y_near, y_far) = (p.1 + 2.6 * S + 6.0, p.1 + 2.6 * S + 6.0 + 40.0);
            let (tail, tip) = if r[1] > 0.0 {
                ((p.0, y_far), (p.0, y_near))
            } else {
                ((p.0, y_near), (p.0, y_far))
            };
            arrow(svg, tail, tip, pal::REACTION, true, "reaction");
            lay.obstacle(Quad::segment(tail, tip, 5.5));
            let c = vec![
                Candidate::flat((p.0, y_far + 14.0), "middle"),
                Candidate::flat((p.0 - 8.0, (y_near + y_far) / 2.0 + 4.0), "end"),
                Candidate::flat((p.0 + 8.0, (y_near + y_far) / 2.0 + 4.0), "start"),
                Candidate::flat((p.0, y_far + 28.0), "middle"),
            ];
            let t = format!("Ry {} {}", sig(r[1] / sc.force, 3), sc.force_name);
            out.push((c, t, halo(pal::REACTION, "")));
        }
        if r[0].abs() > 1e-9 * rmax {
            let side = if n.x <= mid { -1.0 } else { 1.0 };
            let y = p.1 + 0.9 * S;
            let (near, far) = (p.0 + side * (1.8 * S + 4.0), p.0 + side * (1.8 * S + 44.0));
            let pointing_right = r[0] > 0.0;
            let (tail, tip) = if (side < 0.0) == pointing_right {
                ((far, y), (near, y))
            } else {
                ((near, y), (far, y))
            };
            arrow(svg, tail, tip, pal::REACTION, true, "reaction");
            lay.obstacle(Quad::segment(tail, tip, 5.5));
            let anchor = if side < 0.0 { "start" } else { "end" };
            let c = vec![
                Candidate::flat((far + side * 4.0, y - 9.0), anchor),
                Candidate::flat((far + side * 4.0, y + 17.0), anchor),
                Candidate::flat(
                    (far + side * 6.0, y + 4.0),
                    if side < 0.0 { "end" } else { "start" },
                ),
            ];
            let t = format!("Rx {} {}", sig(r[0] / sc.force, 3), sc.force_name);
            out.push((c, t, halo(pal::REACTION, "")));
        }
    }
    svg.raw("</g>");
    out
}

fn scale_bar(svg: &mut Svg, frame: &Frame, span: f64, sc: &Scale, x: f64, y: f64) {
    let span_disp = span / sc.length;
    let len = nice_floor(if span_disp > 0.0 {
        span_disp / 4.0
    } else {
        1.0
    });
    let lpx = len * sc.length * frame.scale;
    if !(lpx.is_finite() && lpx > 4.0) {
        return;
    }
    svg.raw(r#"<g class="scale-bar">"#);
    for k in 0..2 {
        let fill = if k == 0 { pal::INK } else { pal::PAPER };
        svg.rect(
            x + k as f64 * lpx / 2.0,
            y,
            lpx / 2.0,
            5.0,
            &format!(r#"fill="{fill}" stroke="{}" stroke-width="0.8""#, pal::INK),
        );
    }
    let ink = format!(r#"fill="{}""#, pal::INK);
    svg.text((x, y + 17.0), 10.0, "middle", "0", &ink);
    svg.text(
        (x + lpx / 2.0, y + 17.0),
        10.0,
        "middle",
        &short(len / 2.0),
        &ink,
    );
    svg.text(
        (x + lpx, y + 17.0),
        10.0,
        "middle",
        &format!("{} {}", short(len), sc.length_name),
        &ink,
    );
    svg.raw("</g>");
}

/// A round number without trailing zeros (10, 2.5, 0.05).
fn short(v: f64) -> String {
    let s = format!("{v:.6}");
    s.trim_end_matches('0').trim_end_matches('.').to_string()
}

/// The influence-line hook: plot `line` in a strip at `top`, sharing the
/// truss's horizontal scale, positive ordinates up.
pub fn influence_plot(
    svg: &mut Svg,
    frame: &Frame,
    top: f64,
    span: f64,
    line: &InfluenceLine,
    sc: &Scale,
) {
    let ords: Vec<(f64, f64)> = line
        .ordinates
        .iter()
        .copied()
        .filter(|(x, v)| x.is_finite() && v.is_finite())
        .collect();
    let axis_y = top + INFLUENCE_H / 2.0 + 6.0;
    let (xl, xr) = (frame.x(frame.xmin), frame.x(frame.xmin + span));
    let ink = format!(r#"fill="{}""#, pal::INK);
    svg.raw(r#"<g class="influence">"#);
    svg.text(
        (20.0, top + 12.0),
        11.5,
        "start",
        &format!("Influence line: {} ({})", line.name, line.unit),
        &format!(r#"{ink} font-weight="bold""#),
    );
    svg.line((xl, axis_y), (xr, axis_y), pal::INK, 1.0, "");
    let vmax = ords.iter().fold(0.0f64, |a, o| a.max(o.1.abs()));
    if ords.len() >= 2 && vmax > 0.0 {
        // Room above the peak for its value under the strip's title.
        let k = (INFLUENCE_H / 2.0 - 26.0) / vmax;
        let pts: Vec<(f64, f64)> = ords
            .iter()
            .map(|&(x, v)| (frame.x(x), axis_y - k * v))
            .collect();
        let mut poly = vec![(pts[0].0, axis_y)];
        poly.extend(pts.iter().copied());
        poly.push((pts[pts.len() - 1].0, axis_y));
        svg.path(
            &poly,
            true,
            &format!(
                r#"fill="{}" fill-opacity="0.18" stroke="none""#,
                pal::INFLUENCE_POS
            ),
        );
        svg.path(
            &pts,
            false,
            &format!(r#"fill="none" stroke="{}" stroke-width="1.8""#, pal::INK),
        );
        let (imax, imin) = ords.iter().enumerate().fold((0, 0), |(a, b), (i, o)| {
            (
                if o.1 > ords[a].1 { i } else { a },
                if o.1 < ords[b].1 { i } else { b },
            )
        });
        for i in [imax, imin] {
            let (x, v) = ords[i];
            if v == 0.0 {
                continue;
            }
            let p = (frame.x(x), axis_y - k * v);
            svg.text(
                (p.0, p.1 + if v > 0.0 { -5.0 } else { 13.0 }),
                10.5,
                "middle",
                &sig(v, 3),
                &halo(pal::INK, ""),
            );
        }
    }
    svg.text(
        (xr + 6.0, axis_y + 4.0),
        10.0,
        "start",
        &format!("x {}", sc.length_name),
        &ink,
    );
    svg.raw("</g>");
}

fn pin_symbol(svg: &mut Svg, c: (f64, f64)) {
    support(svg, (c.0, c.1 - 7.0), Restraint::Pin, 0.6);
}
fn roller_symbol(svg: &mut Svg, c: (f64, f64)) {
    support(svg, (c.0, c.1 - 7.0), Restraint::Roller, 0.6);
}
fn inclined_symbol(svg: &mut Svg, c: (f64, f64)) {
    support(
        svg,
        (c.0, c.1 - 6.0),
        Restraint::InclinedRoller {
            angle: 20f64.to_radians(),
        },
        0.6,
    );
}
fn load_symbol(svg: &mut Svg, c: (f64, f64)) {
    arrow(
        svg,
        (c.0 - 16.0, c.1 + 4.0),
        (c.0 + 16.0, c.1 + 4.0),
        pal::LOAD,
        false,
        "",
    );
}
fn reaction_symbol(svg: &mut Svg, c: (f64, f64)) {
    arrow(
        svg,
        (c.0 - 16.0, c.1 + 4.0),
        (c.0 + 16.0, c.1 + 4.0),
        pal::REACTION,
        true,
        "",
    );
}
fn node_symbol(svg: &mut Svg, c: (f64, f64)) {
    svg.circle(
        (c.0, c.1 + 4.0),
        3.4,
        &format!(
            r#"fill="{}" stroke="{}" stroke-width="1.3""#,
            pal::PAPER,
            pal::INK
        ),
    );
}

fn legend_items(
    d: &Drawing,
    sc: &Scale,
    deflect: Option<(f64, &Effect)>,
    util: Option<&[(f64, String)]>,
) -> Vec<Item> {
    let mut items = Vec::new();
    match d.show {
        Show::Model => items.push(Item::Line {
            label: "member (label: member id)".into(),
            stroke: pal::STRUCTURE,
            width: 2.5,
            dash: None,
            core: None,
        }),
        Show::Forces => {
            items.push(Item::Line {
                label: "compression (C), solid".into(),
                stroke: pal::COMPRESSION,
                width: 7.0,
                dash: None,
                core: None,
            });
            items.push(Item::Line {
                label: "tension (T), double line".into(),
                stroke: pal::TENSION,
                width: 7.0,
                dash: None,
                core: Some((pal::TENSION_CORE, 7.0 * 0.42)),
            });
            items.push(Item::Line {
                label: "zero force".into(),
                stroke: pal::FAINT,
                width: 1.4,
                dash: Some("3 3"),
                core: None,
            });
        }
        Show::Utilization => {
            items.push(Item::Ramp);
        }
        Show::Deflection => {
            items.push(Item::Line {
                label: "undeformed".into(),
                stroke: pal::FAINT,
                width: 1.3,
                dash: Some("5 4"),
                core: None,
            });
            items.push(Item::Line {
                label: "deflected (magnified)".into(),
                stroke: pal::DEFLECTED,
                width: 2.6,
                dash: None,
                core: None,
            });
        }
    }
    items.push(Item::Symbol {
        label: "pin joint".into(),
        draw: node_symbol,
    });
    let kinds: Vec<Restraint> = d.model.supports.iter().map(|s| s.restraint).collect();
    if kinds.iter().any(|r| matches!(r, Restraint::Pin)) {
        items.push(Item::Symbol {
            label: "pinned support".into(),
            draw: pin_symbol,
        });
    }
    if kinds.iter().any(|r| matches!(r, Restraint::Roller)) {
        items.push(Item::Symbol {
            label: "roller".into(),
            draw: roller_symbol,
        });
    }
    if kinds
        .iter()
        .any(|r| matches!(r, Restraint::InclinedRoller { .. }))
    {
        items.push(Item::Symbol {
            label: "inclined roller (turned to its surface)".into(),
            draw: inclined_symbol,
        });
    }
    let loads_drawn = matches!(d.show, Show::Model | Show::Forces) && d.effect.is_some();
    if loads_drawn {
        items.push(Item::Symbol {
            label: format!("applied load, {}", sc.force_name),
            draw: load_symbol,
        });
    }
    if d.show == Show::Forces && d.effect.is_some() {
        items.push(Item::Symbol {
            label: format!("reaction, {}", sc.force_name),
            draw: reaction_symbol,
        });
    }
    let mut units = format!("Units: lengths in {}", sc.length_name);
    match d.show {
        Show::Model => {
            if loads_drawn {
                let _ = write!(units, "; loads in {}", sc.force_name);
            }
        }
        Show::Forces => {
            let _ = write!(
                units,
                "; member forces and loads in {}; line width in proportion to |force|",
                sc.force_name
            );
        }
        Show::Utilization => {
            units.push_str("; utilization = |force| / design capacity, no unit");
        }
        Show::Deflection => {
            let _ = write!(units, "; displacements in {}", sc.disp_name);
        }
    }
    items.push(Item::Note(units));
    if let Some((mag, e)) = deflect {
        let dmax = e
            .displacements
            .iter()
            .fold(0.0f64, |a, u| a.max(u[0].hypot(u[1])));
        items.push(Item::Note(format!(
            "Displacements drawn magnified ×{}; largest displacement {} {} (true size)",
            sig(mag, 3),
            sig(dmax / sc.disp, 3),
            sc.disp_name
        )));
    }
    if let Some(u) = util {
        let fails = u.iter().filter(|x| x.0 > 1.0).count();
        if let Some((m, (v, case))) = u
            .iter()
            .enumerate()
            .filter(|x| x.1 .0.is_finite())
            .max_by(|a, b| a.1 .0.total_cmp(&b.1 .0))
        {
            items.push(Item::Note(format!(
                "Highest: member {} at {} under \"{}\"; {} member(s) above 1",
                d.model.members[m].id,
                sig(*v, 3),
                case,
                fails
            )));
        }
    }
    if d.show == Show::Utilization && d.rating.is_none() {
        items.push(Item::Note(
            "No capacity checks available (materials need fy and fu)".into(),
        ));
    }
    items
}
