//! A drawing of a member section for reports: a small standalone SVG of its
//! parts, centroid and axes, with a title line of its main properties.

use crate::section::{outline, outline_original, PlacedPart, SectionProperties};
use std::fmt::Write;

/// Polygons of one part in section coordinates.
type Polygons = Vec<Vec<(f64, f64)>>;

/// Escapes text for XML character data and attribute values.
fn xml_escape(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    for ch in s.chars() {
        match ch {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&apos;"),
            c if (c as u32) < 0x20 && c != '\t' && c != '\n' && c != '\r' => {}
            c => out.push(c),
        }
    }
    out
}

/// A number to about four significant figures for the title.
fn num(v: f64) -> String {
    if !v.is_finite() {
        return "-".to_string();
    }
    let a = v.abs();
    if a >= 1000.0 {
        format!("{v:.0}")
    } else if a >= 100.0 {
        format!("{v:.1}")
    } else if a >= 10.0 {
        format!("{v:.2}")
    } else {
        format!("{v:.3}")
    }
}

/// Renders the section to a self-contained SVG string.
///
/// The viewBox is fitted to the parts with a margin; section y points up
/// (drawn as −y). Parts are filled grey with a dark outline (voids by the
/// even-odd rule), missing parts are drawn dashed and unfilled at their
/// as-built outline, the centroid is marked with a cross, the shear centre
/// (when the parts' walls are known, [`crate::section::torsion`]) with a
/// circle labelled S, and the centroidal x and y axes are drawn. The title line gives `id`, area, Ix and Iy in
/// `unit`. Parts that cannot be outlined are skipped.
pub fn section_svg(
    id: &str,
    parts: &[PlacedPart],
    props: &SectionProperties,
    unit: &str,
) -> String {
    let polys: Vec<(bool, Polygons)> = parts
        .iter()
        .map(|p| {
            let missing = matches!(p.loss, Some(crate::section::Loss::Missing));
            let o = if missing {
                outline_original(p)
            } else {
                outline(p)
            };
            let o = o
                .into_iter()
                .filter(|poly| poly.iter().all(|(x, y)| x.is_finite() && y.is_finite()))
                .collect();
            (missing, o)
        })
        .collect();
    let (cx, cy) = if props.centroid_x.is_finite() && props.centroid_y.is_finite() {
        (props.centroid_x, props.centroid_y)
    } else {
        (0.0, 0.0)
    };
    // Shear centre by thin-walled theory (None for table-only parts).
    let sc = crate::section::torsion(parts)
        .ok()
        .flatten()
        .map(|t| (t.shear_centre_x, t.shear_centre_y));
    let (mut xmin, mut xmax, mut ymin, mut ymax) = (cx, cx, cy, cy);
    if let Some((x, y)) = sc {
        (xmin, xmax, ymin, ymax) = (xmin.min(x), xmax.max(x), ymin.min(y), ymax.max(y));
    }
    for (_, o) in &polys {
        for &(x, y) in o.iter().flatten() {
            xmin = xmin.min(x);
            xmax = xmax.max(x);
            ymin = ymin.min(y);
            ymax = ymax.max(y);
        }
    }
    let mut size = (xmax - xmin).max(ymax - ymin);
    if !(size.is_finite() && size > 0.0) {
        size = 1.0;
    }
    let margin = 0.12 * size;
    let title_h = 0.07 * size;
    let stroke = size / 250.0;
    let (vx, vy) = (xmin - margin, -ymax - margin - title_h);
    let (vw, vh) = (
        xmax - xmin + 2.0 * margin,
        ymax - ymin + 2.0 * margin + title_h,
    );

    let mut s = String::new();
    let _ = writeln!(
        s,
        r#"<svg xmlns="http://www.w3.org/2000/svg" viewBox="{vx:.4} {vy:.4} {vw:.4} {vh:.4}" width="480" height="{:.0}">"#,
        480.0 * vh / vw
    );
    let _ = writeln!(s, "<title>{}</title>", xml_escape(id));
    for (i, (missing, o)) in polys.iter().enumerate() {
        if o.is_empty() {
            continue;
        }
        let mut d = String::new();
        for poly in o {
            for (k, (x, y)) in poly.iter().enumerate() {
                let _ = write!(d, "{}{:.4},{:.4} ", if k == 0 { "M" } else { "L" }, x, -y);
            }
            d.push_str("Z ");
        }
        let label = parts[i]
            .label
            .as_deref()
            .map(|l| format!(" data-label=\"{}\"", xml_escape(l)))
            .unwrap_or_default();
        if *missing {
            let _ = writeln!(
                s,
                r##"<path d="{}" fill="none" stroke="#333333" stroke-width="{stroke:.4}" stroke-dasharray="{:.4} {:.4}" class="missing"{label}/>"##,
                d.trim_end(),
                4.0 * stroke,
                3.0 * stroke
            );
        } else {
            let _ = writeln!(
                s,
                r##"<path d="{}" fill="#b3b3b3" fill-rule="evenodd" stroke="#333333" stroke-width="{stroke:.4}" class="part"{label}/>"##,
                d.trim_end()
            );
        }
    }
    // Centroidal axes, dash-dot, across the drawing.
    let ext = 0.06 * size;
    let _ = writeln!(
        s,
        r##"<line x1="{:.4}" y1="{:.4}" x2="{:.4}" y2="{:.4}" stroke="#1f4e99" stroke-width="{:.4}" stroke-dasharray="{:.4} {:.4} {:.4} {:.4}" class="axis-x"/>"##,
        xmin - ext,
        -cy,
        xmax + ext,
        -cy,
        stroke * 0.7,
        6.0 * stroke,
        2.0 * stroke,
        stroke,
        2.0 * stroke
    );
    let _ = writeln!(
        s,
        r##"<line x1="{:.4}" y1="{:.4}" x2="{:.4}" y2="{:.4}" stroke="#1f4e99" stroke-width="{:.4}" stroke-dasharray="{:.4} {:.4} {:.4} {:.4}" class="axis-y"/>"##,
        cx,
        -(ymin - ext),
        cx,
        -(ymax + ext),
        stroke * 0.7,
        6.0 * stroke,
        2.0 * stroke,
        stroke,
        2.0 * stroke
    );
    let font = 0.045 * size;
    let _ = writeln!(
        s,
        r##"<text x="{:.4}" y="{:.4}" font-family="sans-serif" font-size="{font:.4}" fill="#1f4e99">x</text>"##,
        xmax + ext + 0.01 * size,
        -cy + font / 3.0
    );
    let _ = writeln!(
        s,
        r##"<text x="{:.4}" y="{:.4}" font-family="sans-serif" font-size="{font:.4}" fill="#1f4e99">y</text>"##,
        cx + 0.01 * size,
        -(ymax + ext) - 0.01 * size
    );
    // Centroid cross.
    let c = 0.035 * size;
    let _ = writeln!(
        s,
        r##"<path d="M{:.4},{:.4} L{:.4},{:.4} M{:.4},{:.4} L{:.4},{:.4}" stroke="#c00000" stroke-width="{:.4}" class="centroid"/>"##,
        cx - c,
        -cy,
        cx + c,
        -cy,
        cx,
        -cy - c,
        cx,
        -cy + c,
        1.5 * stroke
    );
    // Shear centre: a small open circle with a dot, labelled S.
    if let Some((x, y)) = sc {
        let _ = writeln!(
            s,
            r##"<circle cx="{x:.4}" cy="{:.4}" r="{:.4}" fill="none" stroke="#6a3d9a" stroke-width="{:.4}" class="shear-centre"/>"##,
            -y,
            0.02 * size,
            1.2 * stroke
        );
        let _ = writeln!(
            s,
            r##"<circle cx="{x:.4}" cy="{:.4}" r="{:.4}" fill="#6a3d9a" class="shear-centre-dot"/>"##,
            -y,
            0.006 * size
        );
        let _ = writeln!(
            s,
            r##"<text x="{:.4}" y="{:.4}" font-family="sans-serif" font-size="{:.4}" fill="#6a3d9a">S</text>"##,
            x + 0.025 * size,
            -y + 0.035 * size,
            0.04 * size
        );
    }
    let u = xml_escape(unit);
    let title = format!(
        "{}: A = {} {u}², Ix = {} {u}⁴, Iy = {} {u}⁴",
        xml_escape(id),
        num(props.area),
        num(props.ix),
        num(props.iy)
    );
    let _ = writeln!(
        s,
        r##"<text x="{:.4}" y="{:.4}" font-family="sans-serif" font-size="{:.4}" fill="#000000">{title}</text>"##,
        xmin - margin * 0.8,
        -ymax - margin - title_h * 0.3,
        0.035 * size
    );
    s.push_str("</svg>\n");
    s
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::section::{properties, Loss, Shape};

    fn chord() -> Vec<PlacedPart> {
        vec![
            PlacedPart::new(
                Shape::Plate {
                    width: 16.0,
                    thickness: 0.5,
                },
                0.0,
                5.8,
            )
            .labelled("cover <pl>"),
            PlacedPart::new(Shape::given(8.2, 190.0, 6.3), -6.1, 0.0),
            PlacedPart::new(Shape::given(8.2, 190.0, 6.3), 6.1, 0.0).with_loss(Loss::Missing),
            PlacedPart::new(
                Shape::Pipe {
                    outer_diameter: 2.0,
                    wall: 0.2,
                },
                0.0,
                -3.0,
            ),
        ]
    }

    #[test]
    fn svg_has_parts_axes_title_and_escapes() {
        let parts = chord();
        let props = properties(&parts).unwrap();
        let svg = section_svg("top chord \"A&B\" <L1>", &parts, &props, "in");
        assert!(svg.starts_with("<svg xmlns=\"http://www.w3.org/2000/svg\""));
        assert!(svg.trim_end().ends_with("</svg>"));
        // Three present parts filled, one missing dashed.
        assert_eq!(svg.matches("class=\"part\"").count(), 3);
        assert_eq!(svg.matches("class=\"missing\"").count(), 1);
        assert!(svg.contains("stroke-dasharray"));
        assert!(svg.contains("class=\"axis-x\"") && svg.contains("class=\"axis-y\""));
        assert!(svg.contains("class=\"centroid\""));
        // Escaped id and label; no raw specials from them.
        assert!(svg.contains("top chord &quot;A&amp;B&quot; &lt;L1&gt;"));
        assert!(svg.contains("data-label=\"cover &lt;pl&gt;\""));
        assert!(!svg.contains("<L1>") && !svg.contains("<pl>"));
        // Title carries the section's own area and Ix, formatted as num() does.
        assert!(svg.contains(&format!("A = {} in²", num(props.area))));
        assert!(svg.contains(&format!("Ix = {} in⁴", num(props.ix))));
        assert!(!svg.contains("NaN") && !svg.contains("inf"));
    }

    #[test]
    fn shear_centre_is_marked_behind_a_channel_web() {
        // A channel's shear centre lies behind its web, outside the steel
        // (thin-walled closed form, e = 3b'²tf/(6b'tf + h'tw) from the web
        // centre line): the mark must sit left of the web's back at x = −x̄.
        let parts = vec![PlacedPart::new(
            Shape::Channel {
                depth: 12.0,
                flange_width: 3.0,
                web_thickness: 0.3,
                flange_thickness: 0.5,
                flange_slope: 0.0,
            },
            0.0,
            0.0,
        )];
        let props = properties(&parts).unwrap();
        let svg = section_svg("c", &parts, &props, "in");
        let at = svg.find("class=\"shear-centre\"").expect("marked");
        let tag = &svg[svg[..at].rfind("<circle").unwrap()..at];
        let cx: f64 = tag
            .split("cx=\"")
            .nth(1)
            .unwrap()
            .split('"')
            .next()
            .unwrap()
            .parse()
            .unwrap();
        // b' = 3 − 0.15, h' = 12 − 0.5; the web centre line lies at
        // −x̄ + tw/2 with x̄ the channel's own centroid from its back.
        let (b, tf, tw, h) = (2.85, 0.5, 0.3, 11.5);
        let e = 3.0 * b * b * tf / (6.0 * b * tf + h * tw);
        let xbar = parts[0].shape.local(0).unwrap().cx;
        assert!((cx - (-xbar + tw / 2.0 - e)).abs() < 1e-3, "{cx}");
        assert!(cx < 0.0);
        // No shear centre for parts known only by table properties.
        let given = vec![PlacedPart::new(Shape::given(8.2, 190.0, 6.3), 0.0, 0.0)];
        let p2 = properties(&given).unwrap();
        assert!(!section_svg("g", &given, &p2, "in").contains("shear-centre"));
    }

    #[test]
    fn y_axis_points_up() {
        // A 4 × 1 plate centred at y = +10: its lower-left corner (−2, 9.5)
        // must be drawn at SVG (−2, −9.5), i.e. y flipped so that up is up.
        let parts = vec![PlacedPart::new(
            Shape::Plate {
                width: 4.0,
                thickness: 1.0,
            },
            0.0,
            10.0,
        )];
        let props = properties(&parts).unwrap();
        let svg = section_svg("p", &parts, &props, "in");
        assert!(svg.contains("M-2.0000,-9.5000"), "{svg}");
    }

    #[test]
    fn escape_covers_xml_specials() {
        assert_eq!(xml_escape("a<b>&\"c'"), "a&lt;b&gt;&amp;&quot;c&apos;");
    }
}
