//! A drawing of a member section for reports: a small standalone SVG of its
//! parts, centroid and axes, with a title line of its main properties.

use crate::section::{outline, outline_original, PlacedPart, SectionProperties};
use crate::units::plain;
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

/// One part's text beside the drawing: number, label, what is not shown
/// by the outline (holes, loss, "outline not to shape").
fn part_note(i: usize, p: &PlacedPart, unit: &str) -> String {
    use crate::section::Loss;
    let mut t = format!("{}", i + 1);
    if let Some(l) = &p.label {
        t.push(' ');
        t.push_str(l);
    }
    let mut extra = Vec::new();
    if matches!(p.shape, crate::section::Shape::EyeBar { .. }) {
        extra.push("eyebar".to_string());
    }
    if !crate::section::outline_to_shape(p) {
        extra.push("outline not to shape".to_string());
    }
    if !p.holes.is_empty() {
        let d = p.holes[0].diameter;
        let same = p
            .holes
            .iter()
            .all(|h| (h.diameter - d).abs() <= 1e-12 * d.abs());
        extra.push(if same {
            format!(
                "{} hole{} ⌀{} {unit}",
                p.holes.len(),
                if p.holes.len() == 1 { "" } else { "s" },
                plain(d)
            )
        } else {
            format!("{} holes", p.holes.len())
        });
    }
    match &p.loss {
        Some(Loss::Thickness(tl)) => extra.push(format!("loss {} {unit} thickness", plain(*tl))),
        Some(Loss::AreaPercent(pc)) => extra.push(format!("loss {} % of area", plain(*pc))),
        Some(Loss::Missing) => extra.push("missing".into()),
        Some(Loss::OneFace { t, .. }) => {
            extra.push(format!("loss {} {unit} thickness on one face", plain(*t)))
        }
        None => {}
    }
    if !extra.is_empty() {
        t.push_str(": ");
        t.push_str(&extra.join(", "));
    }
    t
}

/// Path data of polygons in section coordinates, y flipped for SVG.
fn path_d(o: &Polygons) -> String {
    let mut d = String::new();
    for poly in o {
        for (k, (x, y)) in poly.iter().enumerate() {
            let _ = write!(d, "{}{:.4},{:.4} ", if k == 0 { "M" } else { "L" }, x, -y);
        }
        d.push_str("Z ");
    }
    d.trim_end().to_string()
}

fn finite(o: Polygons) -> Polygons {
    o.into_iter()
        .filter(|poly| poly.iter().all(|(x, y)| x.is_finite() && y.is_finite()))
        .collect()
}

/// A dimension line from `a` to `b` (SVG coordinates) with end ticks and
/// its value written beside the middle.
fn dimension(
    s: &mut String,
    a: (f64, f64),
    b: (f64, f64),
    text: &str,
    font: f64,
    stroke: f64,
    vertical: bool,
) {
    let tick = font * 0.4;
    let _ = writeln!(
        s,
        r##"<g class="dimension"><line x1="{:.4}" y1="{:.4}" x2="{:.4}" y2="{:.4}" stroke="#333333" stroke-width="{:.4}"/>"##,
        a.0,
        a.1,
        b.0,
        b.1,
        stroke * 0.6
    );
    for p in [a, b] {
        let (dx, dy) = if vertical { (tick, 0.0) } else { (0.0, tick) };
        let _ = writeln!(
            s,
            r##"<line x1="{:.4}" y1="{:.4}" x2="{:.4}" y2="{:.4}" stroke="#333333" stroke-width="{:.4}"/>"##,
            p.0 - dx,
            p.1 - dy,
            p.0 + dx,
            p.1 + dy,
            stroke * 0.6
        );
    }
    let (mx, my) = ((a.0 + b.0) / 2.0, (a.1 + b.1) / 2.0);
    if vertical {
        let _ = writeln!(
            s,
            r##"<text x="{:.4}" y="{:.4}" font-family="sans-serif" font-size="{font:.4}" text-anchor="middle" transform="rotate(-90 {:.4} {:.4})" fill="#333333">{text}</text></g>"##,
            mx - font * 0.5,
            my,
            mx - font * 0.5,
            my
        );
    } else {
        let _ = writeln!(
            s,
            r##"<text x="{:.4}" y="{:.4}" font-family="sans-serif" font-size="{font:.4}" text-anchor="middle" fill="#333333">{text}</text></g>"##,
            mx,
            my + font * 1.3
        );
    }
}

/// Renders the section to a self-contained SVG string.
///
/// The viewBox is fitted to the parts, their notes and dimensions; section
/// y points up (drawn as −y). Parts are filled grey with a dark outline
/// (voids by the even-odd rule); material lost at inspection is the
/// as-built outline filled pale vermilion under the reduced one (a missing
/// part so, and dashed; no patterns or ids, so that many drawings can sit
/// in one HTML page). Parts given by table properties are drawn
/// as their rolled shape when their kind, width and depth are known, else
/// as a rectangle noted "outline not to shape". Each part is numbered on
/// the drawing, with its label, holes and loss in a column of notes to the
/// right (leader lines to the parts); the overall width and depth are
/// dimensioned; the centroid after loss is a cross on the centroidal axes
/// (the as-built centroid a small circle when it differs). The title line
/// gives `id`, area, Ix and Iy in `unit`. Parts that cannot be outlined are
/// skipped. `shear_centre` (in the parts' unit; the section's own torsion
/// properties, which know whether a cell is taken closed) is marked S.
pub fn section_svg(
    id: &str,
    parts: &[PlacedPart],
    props: &SectionProperties,
    shear_centre: Option<(f64, f64)>,
    unit: &str,
) -> String {
    use crate::section::Loss;
    let shapes: Vec<(Polygons, Polygons)> = parts
        .iter()
        .map(|p| {
            let now = if matches!(p.loss, Some(Loss::Missing)) {
                Vec::new()
            } else {
                finite(outline(p))
            };
            (now, finite(outline_original(p)))
        })
        .collect();
    let (cx, cy) = if props.centroid_x.is_finite() && props.centroid_y.is_finite() {
        (props.centroid_x, props.centroid_y)
    } else {
        (0.0, 0.0)
    };
    let (mut xmin, mut xmax, mut ymin, mut ymax) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for (_, o) in &shapes {
        for &(x, y) in o.iter().flatten() {
            xmin = xmin.min(x);
            xmax = xmax.max(x);
            ymin = ymin.min(y);
            ymax = ymax.max(y);
        }
    }
    if xmin > xmax {
        (xmin, xmax, ymin, ymax) = (cx, cx, cy, cy);
    }
    // Shear centre by thin-walled theory (None for table-only parts).
    let sc = shear_centre.filter(|(x, y)| x.is_finite() && y.is_finite());
    if let Some((x, y)) = sc {
        (xmin, xmax, ymin, ymax) = (xmin.min(x), xmax.max(x), ymin.min(y), ymax.max(y));
    }
    let mut size = (xmax - xmin).max(ymax - ymin);
    if !(size.is_finite() && size > 0.0) {
        size = 1.0;
    }
    let font = 0.04 * size;
    let stroke = size / 250.0;
    let ext = 0.06 * size;
    // Notes in a column right of the drawing, in the order of the parts'
    // heights, spaced so that no two overlap.
    let notes: Vec<String> = parts
        .iter()
        .enumerate()
        .map(|(i, p)| part_note(i, p, unit))
        .collect();
    let anchor = |i: usize| -> (f64, f64) {
        let o = if shapes[i].1.is_empty() {
            &shapes[i].0
        } else {
            &shapes[i].1
        };
        let pts: Vec<&(f64, f64)> = o.iter().flatten().collect();
        if pts.is_empty() {
            return (parts[i].x, parts[i].y);
        }
        let n = pts.len() as f64;
        (
            pts.iter().map(|p| p.0).sum::<f64>() / n,
            pts.iter().map(|p| p.1).sum::<f64>() / n,
        )
    };
    let mut order: Vec<usize> = (0..parts.len()).collect();
    order.sort_by(|&a, &b| anchor(b).1.total_cmp(&anchor(a).1));
    let note_x = xmax + ext + 0.12 * size;
    let gap = 1.4 * font;
    let mut note_y = vec![0.0; parts.len()];
    let mut last = f64::MIN;
    for &i in &order {
        // SVG y grows downwards: a note at least `gap` below the one above.
        let y = (-anchor(i).1).max(last + gap);
        note_y[i] = y;
        last = y;
    }
    let text_w = |t: &str| 0.56 * font * t.chars().count() as f64;
    let notes_right = notes
        .iter()
        .map(|t| note_x + text_w(t))
        .fold(xmax + ext, f64::max);
    let notes_bottom = note_y.iter().copied().fold(-ymin, f64::max);
    let u = xml_escape(unit);
    let title = format!(
        "{}: A = {} {u}², Ix = {} {u}⁴, Iy = {} {u}⁴",
        xml_escape(id),
        num(props.area),
        num(props.ix),
        num(props.iy)
    );
    let original = crate::section::properties_original(parts).ok();
    let moved = original
        .as_ref()
        .filter(|o| (o.centroid_x - cx).hypot(o.centroid_y - cy) > 1e-6 * size);
    let centroid_note = match moved {
        Some(o) => format!(
            "+ centroid after loss (x̄ = {}, ȳ = {} {u}); ○ as built (x̄ = {}, ȳ = {} {u})",
            num(cx),
            num(cy),
            num(o.centroid_x),
            num(o.centroid_y)
        ),
        None => format!("+ centroid (x̄ = {}, ȳ = {} {u})", num(cx), num(cy)),
    };
    let any_lost = parts.iter().any(|p| p.loss.is_some());
    let title_font = 0.035 * size;
    let left = xmin - ext - 0.14 * size;
    let top = -ymax - ext - 3.8 * title_font;
    let right = notes_right
        .max(left + text_w(&centroid_note) * title_font / font + 0.05 * size)
        .max(left + text_w(&title) * 0.035 / 0.04 * 0.9 + 0.05 * size);
    let bottom = notes_bottom.max(-ymin + ext) + 0.14 * size;
    let (vx, vy, vw, vh) = (left, top, right - left, bottom - top);

    let mut s = String::new();
    let _ = writeln!(
        s,
        r#"<svg xmlns="http://www.w3.org/2000/svg" viewBox="{vx:.4} {vy:.4} {vw:.4} {vh:.4}" width="{:.0}" height="{:.0}">"#,
        (480.0 * vw / size / 1.5).clamp(480.0, 900.0),
        (480.0 * vw / size / 1.5).clamp(480.0, 900.0) * vh / vw
    );
    let _ = writeln!(s, "<title>{}</title>", xml_escape(id));
    // Lost material first: the as-built outline of every part with a loss.
    for (i, (now, orig)) in shapes.iter().enumerate() {
        if parts[i].loss.is_none() || orig.is_empty() {
            continue;
        }
        let dash = if now.is_empty() {
            format!(
                r#" stroke-dasharray="{:.4} {:.4}""#,
                4.0 * stroke,
                3.0 * stroke
            )
        } else {
            String::new()
        };
        let _ = writeln!(
            s,
            r##"<path d="{}" fill="#f4b9a3" fill-rule="evenodd" stroke="#d0451b" stroke-width="{:.4}"{dash} class="lost"/>"##,
            path_d(orig),
            stroke * 0.8
        );
    }
    for (i, (now, _)) in shapes.iter().enumerate() {
        if now.is_empty() {
            continue;
        }
        let label = parts[i]
            .label
            .as_deref()
            .map(|l| format!(" data-label=\"{}\"", xml_escape(l)))
            .unwrap_or_default();
        let to_shape = crate::section::outline_to_shape(&parts[i]);
        // Eyebars in a blue-grey of their own (issue 16), named in the notes.
        let eyebar = matches!(parts[i].shape, crate::section::Shape::EyeBar { .. });
        let _ = writeln!(
            s,
            r##"<path d="{}" fill="{}" fill-rule="evenodd" stroke="#333333" stroke-width="{stroke:.4}" class="{}"{label}{}/>"##,
            path_d(now),
            match (eyebar, to_shape) {
                (true, _) => "#a9b8c8",
                (false, true) => "#b3b3b3",
                (false, false) => "#d9d9d9",
            },
            if eyebar { "part eyebar" } else { "part" },
            if to_shape {
                ""
            } else {
                r#" data-not-to-shape="true""#
            }
        );
    }
    // Centroidal axes, dash-dot, across the drawing.
    let dash = format!(
        r#"stroke-dasharray="{:.4} {:.4} {:.4} {:.4}""#,
        6.0 * stroke,
        2.0 * stroke,
        stroke,
        2.0 * stroke
    );
    let _ = writeln!(
        s,
        r##"<line x1="{:.4}" y1="{:.4}" x2="{:.4}" y2="{:.4}" stroke="#1f4e99" stroke-width="{:.4}" {dash} class="axis-x"/>"##,
        xmin - ext,
        -cy,
        xmax + ext,
        -cy,
        stroke * 0.7
    );
    let _ = writeln!(
        s,
        r##"<line x1="{:.4}" y1="{:.4}" x2="{:.4}" y2="{:.4}" stroke="#1f4e99" stroke-width="{:.4}" {dash} class="axis-y"/>"##,
        cx,
        -(ymin - ext),
        cx,
        -(ymax + ext),
        stroke * 0.7
    );
    let _ = writeln!(
        s,
        r##"<text x="{:.4}" y="{:.4}" font-family="sans-serif" font-size="{font:.4}" fill="#1f4e99">x</text>"##,
        xmax + ext + 0.01 * size,
        -cy + font / 3.0
    );
    let _ = writeln!(
        s,
        r##"<text x="{:.4}" y="{:.4}" font-family="sans-serif" font-size="{font:.4}" fill="#1f4e99">y</text>"##,
        cx + 0.015 * size,
        -(ymax + ext)
    );
    // Centroid after loss (cross), and as built (circle) when it moved.
    let c = 0.035 * size;
    let _ = writeln!(
        s,
        r##"<path d="M{:.4},{:.4} L{:.4},{:.4} M{:.4},{:.4} L{:.4},{:.4}" stroke="#c00000" stroke-width="{:.4}" class="centroid" data-x="{cx}" data-y="{cy}"/>"##,
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
    if let Some(o) = moved {
        let _ = writeln!(
            s,
            r##"<circle cx="{:.4}" cy="{:.4}" r="{:.4}" fill="none" stroke="#555555" stroke-width="{:.4}" class="centroid-as-built"/>"##,
            o.centroid_x,
            -o.centroid_y,
            0.4 * c,
            stroke
        );
    }
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
            font
        );
    }
    // Overall dimensions: width under the section, depth to its left.
    let dim_y = -ymin + ext + 0.03 * size;
    dimension(
        &mut s,
        (xmin, dim_y),
        (xmax, dim_y),
        &format!("{} {u}", num(xmax - xmin)),
        font,
        stroke,
        false,
    );
    let dim_x = xmin - ext - 0.03 * size;
    dimension(
        &mut s,
        (dim_x, -ymax),
        (dim_x, -ymin),
        &format!("{} {u}", num(ymax - ymin)),
        font,
        stroke,
        true,
    );
    // Part numbers at the parts, notes with leaders in the right column.
    for (i, note) in notes.iter().enumerate() {
        let (ax, ay) = anchor(i);
        let _ = writeln!(
            s,
            r##"<g class="part-note"><line x1="{:.4}" y1="{:.4}" x2="{:.4}" y2="{:.4}" stroke="#777777" stroke-width="{:.4}"/><circle cx="{:.4}" cy="{:.4}" r="{:.4}" fill="#777777"/><text x="{:.4}" y="{:.4}" font-family="sans-serif" font-size="{font:.4}" fill="#000000">{}</text></g>"##,
            ax,
            -ay,
            note_x - 0.01 * size,
            note_y[i],
            stroke * 0.6,
            ax,
            -ay,
            stroke * 1.5,
            note_x,
            note_y[i] + font / 3.0,
            xml_escape(note)
        );
    }
    let _ = writeln!(
        s,
        r##"<text x="{:.4}" y="{:.4}" font-family="sans-serif" font-size="{:.4}" fill="#000000">{title}</text>"##,
        left + 0.02 * size,
        top + 1.2 * title_font,
        title_font
    );
    let mut sub = xml_escape(&centroid_note);
    if any_lost {
        sub.push_str("; vermilion: material lost at inspection");
    }
    let _ = writeln!(
        s,
        r##"<text x="{:.4}" y="{:.4}" font-family="sans-serif" font-size="{:.4}" fill="#333333" class="centroid-note">{sub}</text>"##,
        left + 0.02 * size,
        top + 2.6 * title_font,
        title_font * 0.85
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
        let svg = section_svg("top chord \"A&B\" <L1>", &parts, &props, None, "in");
        assert!(svg.starts_with("<svg xmlns=\"http://www.w3.org/2000/svg\""));
        assert!(svg.trim_end().ends_with("</svg>"));
        // Three present parts filled, one missing drawn as lost (vermilion, dashed).
        assert_eq!(svg.matches("class=\"part\"").count(), 3);
        assert_eq!(svg.matches("class=\"lost\"").count(), 1);
        assert!(svg.contains("missing"));
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
        let svg = section_svg("p", &parts, &props, None, "in");
        assert!(svg.contains("M-2.0000,-9.5000"), "{svg}");
    }

    #[test]
    fn shear_centre_is_marked_where_given() {
        // The mark is the section's own shear centre (for a closed cell it
        // comes from the closed-section coordinate, which the parts alone
        // do not tell): drawn when given, not otherwise.
        let parts = vec![PlacedPart::new(
            Shape::Plate {
                width: 4.0,
                thickness: 1.0,
            },
            0.0,
            0.0,
        )];
        let props = properties(&parts).unwrap();
        let with = section_svg("p", &parts, &props, Some((0.0, 3.0)), "in");
        assert!(with.contains("class=\"shear-centre\""));
        assert!(with.contains("cy=\"-3.0000\""), "{with}");
        let without = section_svg("p", &parts, &props, None, "in");
        assert!(!without.contains("shear-centre"));
    }

    #[test]
    fn escape_covers_xml_specials() {
        assert_eq!(xml_escape("a<b>&\"c'"), "a&lt;b&gt;&amp;&quot;c&apos;");
    }
}
