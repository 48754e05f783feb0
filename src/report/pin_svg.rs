//! A drawing of one pin (issue 16): the stack of bars in order along the
//! pin, each drawn to scale across the pin with its number, name and force
//! on the pin (magnitude and direction in the truss plane; tension blue,
//! compression amber, load bars grey), and under it the bending moment |M|
//! and shear |V| along the pin (vector sums of both planes), the largest
//! marked. Lengths in the section unit, forces in the force unit.

use super::svg::{esc, palette};
use crate::joint::pin::resolve::Resolved;
use crate::joint::pin::statics::diagram_unchecked;
use crate::joint::pin::{Carrier, Pin};
use crate::model::Model;
use crate::units::plain;
use std::fmt::Write;

const W: f64 = 760.0;
const LEFT: f64 = 70.0;
const RIGHT: f64 = 40.0;

/// The SVG of `pin` under member forces `forces` (N), the state called `state`.
pub fn pin_svg(model: &Model, pin: &Pin, forces: &[f64], state: &str) -> String {
    let r = Resolved::new(pin, &model.nodes, &model.members);
    let bar_forces = r.forces(forces);
    let d = diagram_unchecked(&r.loads(pin, forces));
    let u = &model.units;
    let (len, force) = (u.section, u.force);
    let moment_unit = format!("{}·{}", force.name, len.name);
    let z0 = pin
        .stack
        .iter()
        .map(|b| b.position - b.thickness / 2.0)
        .fold(f64::MAX, f64::min);
    let z1 = pin
        .stack
        .iter()
        .map(|b| b.position + b.thickness / 2.0)
        .fold(f64::MIN, f64::max);
    let span = (z1 - z0).max(1e-9);
    let x = |z: f64| LEFT + (z - z0) / span * (W - LEFT - RIGHT);
    let h = 640.0;
    let mut s = String::new();
    let _ = write!(
        s,
        r#"<svg xmlns="http://www.w3.org/2000/svg" width="{W}" height="{h}" viewBox="0 0 {W} {h}" font-family="sans-serif" font-size="11">"#
    );
    let _ = write!(
        s,
        r#"<rect width="{W}" height="{h}" fill="{}"/>"#,
        palette::PAPER
    );
    let node = &model.nodes[pin.node].id;
    let _ = write!(
        s,
        r#"<text x="{LEFT}" y="22" font-size="14" fill="{}">{}</text>"#,
        palette::INK,
        esc(&format!(
            "Pin {} {} at {node}, Fy {} {}: \"{state}\"",
            plain(pin.diameter / len.to_si),
            len.name,
            plain(pin.fy / u.stress.to_si),
            u.stress.name
        ))
    );
    let _ = write!(
        s,
        r#"<text x="{LEFT}" y="38" fill="{}">{}</text>"#,
        palette::FAINT,
        esc("Bars in stack order along the pin; below each, its force on the pin and the angle from the truss's x axis.")
    );
    let _ = write!(
        s,
        r#"<text x="{LEFT}" y="52" fill="{}">{}</text>"#,
        palette::FAINT,
        esc("Screening calculation for review by a qualified engineer.")
    );
    // The pin and the bars.
    let (pin_top, pin_bottom) = (190.0, 210.0);
    let _ = write!(
        s,
        r#"<rect x="{}" y="{pin_top}" width="{}" height="{}" fill="{}" stroke="{}"/>"#,
        x(z0) - 8.0,
        x(z1) - x(z0) + 16.0,
        pin_bottom - pin_top,
        palette::TENSION_CORE,
        palette::STRUCTURE
    );
    draw_bars(&mut s, pin, forces, &bar_forces, &x, force);
    // Moment and shear along the pin.
    plot(
        &mut s,
        &d,
        &x,
        380.0,
        500.0,
        true,
        &format!("|M| along the pin, {moment_unit}"),
        force.to_si * len.to_si,
    );
    plot(
        &mut s,
        &d,
        &x,
        540.0,
        610.0,
        false,
        &format!("|V| along the pin, {}", force.name),
        force.to_si,
    );
    let _ = write!(
        s,
        r#"<text x="{LEFT}" y="{}" fill="{}">{}</text>"#,
        h - 8.0,
        palette::INK,
        esc(&format!(
            "largest |M| = {} {moment_unit} at {} {}; largest |V| = {} {} between {} and {} {}",
            plain(d.max_moment / (force.to_si * len.to_si)),
            plain((d.max_moment_at - z0) / len.to_si),
            len.name,
            plain(d.max_shear / force.to_si),
            force.name,
            plain((d.max_shear_span.0 - z0) / len.to_si),
            plain((d.max_shear_span.1 - z0) / len.to_si),
            len.name
        ))
    );
    s.push_str("</svg>\n");
    s
}

/// Each bar across the pin to scale, its number and name above, its force
/// on the pin below (tension blue, compression amber, load bars grey).
fn draw_bars(
    s: &mut String,
    pin: &Pin,
    forces: &[f64],
    bar_forces: &[[f64; 2]],
    x: &dyn Fn(f64) -> f64,
    force: crate::units::Unit,
) {
    for (i, bar) in pin.stack.iter().enumerate() {
        let f = bar_forces[i];
        let (xa, xb) = (
            x(bar.position - bar.thickness / 2.0),
            x(bar.position + bar.thickness / 2.0),
        );
        let colour = match bar.carrier {
            Carrier::Load => palette::FAINT,
            Carrier::Member(m) if forces[m] >= 0.0 => palette::TENSION,
            Carrier::Member(_) => palette::COMPRESSION,
        };
        let _ = write!(
            s,
            r#"<rect x="{xa:.2}" y="150" width="{:.2}" height="100" fill="{colour}" fill-opacity="0.85" stroke="{}"/>"#,
            (xb - xa).max(1.0),
            palette::INK
        );
        let xm = 0.5 * (xa + xb);
        let label = format!("{} {}", i + 1, bar.name());
        let _ = write!(
            s,
            r#"<text transform="translate({:.2},142) rotate(-60)" fill="{}">{}</text>"#,
            xm + 3.0,
            palette::INK,
            esc(&label)
        );
        let mag = f[0].hypot(f[1]) / force.to_si;
        let angle = f[1].atan2(f[0]).to_degrees();
        let _ = write!(
            s,
            r#"<text transform="translate({:.2},262) rotate(60)" fill="{}">{}</text>"#,
            xm - 3.0,
            palette::INK,
            esc(&format!("{} {} at {:.0}°", plain(mag), force.name, angle))
        );
    }
}

/// |M| (sampled between loads, where it is the length of a linear vector)
/// or |V| (steps) between `top` and `bottom`.
#[allow(clippy::too_many_arguments)]
fn plot(
    s: &mut String,
    d: &crate::joint::pin::statics::Diagram,
    x: &dyn Fn(f64) -> f64,
    top: f64,
    bottom: f64,
    moment: bool,
    title: &str,
    unit: f64,
) {
    let _ = write!(
        s,
        r#"<text x="{LEFT}" y="{}" fill="{}">{}</text>"#,
        top - 10.0,
        palette::INK,
        esc(title)
    );
    if d.z.len() < 2 {
        return;
    }
    let (za, zb) = (d.z[0], d.z[d.z.len() - 1]);
    let _ = write!(
        s,
        r#"<line x1="{:.2}" y1="{bottom}" x2="{:.2}" y2="{bottom}" stroke="{}"/>"#,
        x(za),
        x(zb),
        palette::FAINT
    );
    let top_value = if moment { d.max_moment } else { d.max_shear };
    if top_value <= 0.0 {
        return;
    }
    let y = |v: f64| bottom - v / top_value * (bottom - top);
    let mut pts = vec![(x(za), bottom)];
    for i in 0..d.z.len() - 1 {
        let (a, b) = (d.z[i], d.z[i + 1]);
        if moment {
            let (m0, v) = (d.moment[i], d.shear[i]);
            for k in 0..=8 {
                let t = (b - a) * k as f64 / 8.0;
                let m = (m0[0] + v[0] * t).hypot(m0[1] + v[1] * t);
                pts.push((x(a + t), y(m)));
            }
        } else {
            let v = d.shear[i][0].hypot(d.shear[i][1]);
            pts.push((x(a), y(v)));
            pts.push((x(b), y(v)));
        }
    }
    pts.push((x(zb), bottom));
    let path: Vec<String> = pts
        .iter()
        .map(|(px, py)| format!("{px:.2},{py:.2}"))
        .collect();
    let colour = if moment {
        palette::TENSION
    } else {
        palette::COMPRESSION
    };
    let _ = write!(
        s,
        r#"<polygon points="{}" fill="{colour}" fill-opacity="0.25" stroke="{colour}" stroke-width="1.5"/>"#,
        path.join(" ")
    );
    let (mx, label_at) = if moment {
        (d.max_moment, d.max_moment_at)
    } else {
        (d.max_shear, 0.5 * (d.max_shear_span.0 + d.max_shear_span.1))
    };
    let _ = write!(
        s,
        r#"<circle cx="{:.2}" cy="{top:.2}" r="3" fill="{}"/><text x="{:.2}" y="{:.2}" fill="{}">{}</text>"#,
        x(label_at),
        palette::INK,
        x(label_at) + 5.0,
        top - 1.0,
        palette::INK,
        esc(&plain(mx / unit))
    );
}

#[cfg(test)]
mod tests {
    #[test]
    fn drawing_names_the_bars_and_the_largest_moment() {
        let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models");
        let text = std::fs::read_to_string(dir.join("alder-mill-pins.ron")).unwrap();
        let model = crate::input::load_str_in(&text, Some(&dir)).unwrap().model;
        let a = crate::analysis::analyse(&model).unwrap();
        let pin = &model.pins[3];
        let svg = super::pin_svg(&model, pin, &a.cases[0].forces, "deck");
        assert!(svg.starts_with("<svg") && svg.ends_with("</svg>\n"));
        assert!(svg.contains("Pin 5.0 in at L3"));
        assert!(svg.contains("1 L2-L3 eyebar") && svg.contains("6 floor beam hanger"));
        assert!(svg.contains("largest |M| ="));
        assert!(!svg.contains("NaN"));
    }
}
