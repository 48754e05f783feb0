//! `panelpoint section`: every section's properties, original and after the
//! recorded section loss, in the model's section unit, as text or JSON.

use super::json::{num, string};
use super::table::{sig, Table};
use super::CAUTION;
use crate::model::{Model, Section};
use crate::section::SectionProperties;
use std::io::{self, Write};

/// The quantities shown for each section: (name, unit power, getter).
type Getter = fn(&SectionProperties) -> f64;
const ROWS: &[(&str, i32, Getter)] = &[
    ("area", 2, |p| p.area),
    ("centroid_x", 1, |p| p.centroid_x),
    ("centroid_y", 1, |p| p.centroid_y),
    ("ix", 4, |p| p.ix),
    ("iy", 4, |p| p.iy),
    ("ixy", 4, |p| p.ixy),
    ("i_major", 4, |p| p.i_major),
    ("i_minor", 4, |p| p.i_minor),
    ("rx", 1, |p| p.rx),
    ("ry", 1, |p| p.ry),
    ("r_min", 1, |p| p.r_min),
    ("sx_top", 3, |p| p.sx_top),
    ("sx_bottom", 3, |p| p.sx_bottom),
    ("sy_left", 3, |p| p.sy_left),
    ("sy_right", 3, |p| p.sy_right),
    ("net_area", 2, |p| p.net_area),
];

fn selected<'a>(model: &'a Model, id: Option<&str>) -> Vec<&'a Section> {
    model
        .sections
        .iter()
        .filter(|s| id.is_none_or(|i| s.id == i))
        .collect()
}

pub fn text(w: &mut dyn Write, model: &Model, id: Option<&str>) -> io::Result<()> {
    let unit = model.units.section.name;
    let f = model.units.section.to_si;
    writeln!(w, "panelpoint section: {}", model.title)?;
    writeln!(w, "CAUTION: {CAUTION}")?;
    writeln!(
        w,
        "Section unit: {unit} (areas {unit}2, second moments {unit}4)"
    )?;
    for s in selected(model, id) {
        writeln!(w, "\n== Section \"{}\" ==", s.id)?;
        match &s.built_up {
            None => {
                writeln!(
                    w,
                    "given properties: area {} {unit}2, i_in {} {unit}4, i_out {} {unit}4, net area {} {unit}2, r_in {} {unit}, r_out {} {unit}",
                    sig(s.area / f.powi(2), 5),
                    sig(s.i_in / f.powi(4), 5),
                    sig(s.i_out / f.powi(4), 5),
                    sig(s.net_area / f.powi(2), 5),
                    sig(s.r_in() / f, 4),
                    sig(s.r_out() / f, 4),
                )?;
                if let Some(t) = &s.torsion {
                    writeln!(
                        w,
                        "given torsion: J {} {unit}4, Cw {} {unit}6, shear centre x0 = {} {unit}, y0 = {} {unit} from the centroid",
                        sig(t.j / f.powi(4), 4),
                        sig(t.cw / f.powi(6), 4),
                        sig(t.shear_centre_x / f, 4),
                        sig(t.shear_centre_y / f, 4),
                    )?;
                }
            }
            Some(b) => {
                let mut t = Table::new(&["property", "unit", "as built", "after loss", "change"]);
                for (name, pow, get) in ROWS {
                    let (o, r) = (
                        get(&b.original) / f.powi(*pow),
                        get(&b.reduced) / f.powi(*pow),
                    );
                    let change = if o.abs() > 0.0 && *pow != 1 {
                        format!("{:+.1}%", (r - o) / o * 100.0)
                    } else {
                        String::new()
                    };
                    t.row(vec![
                        name.to_string(),
                        if *pow == 1 {
                            unit.to_string()
                        } else {
                            format!("{unit}{pow}")
                        },
                        sig(o, 5),
                        sig(r, 5),
                        change,
                    ]);
                }
                t.row(vec![
                    "principal angle".into(),
                    "deg".into(),
                    sig(b.original.principal_angle.to_degrees(), 4),
                    sig(b.reduced.principal_angle.to_degrees(), 4),
                    String::new(),
                ]);
                t.row(vec![
                    "balance I_minor/I_major".into(),
                    "-".into(),
                    sig(b.original.balance, 3),
                    sig(b.reduced.balance, 3),
                    String::new(),
                ]);
                write!(w, "{}", t.render())?;
                writeln!(
                    w,
                    "in the truss plane: i_in = {} = {} {unit}4; out of plane: i_out = {} {unit}4 (after loss)",
                    if b.x_in_plane { "Iy" } else { "Ix" },
                    sig(s.i_in / f.powi(4), 5),
                    sig(s.i_out / f.powi(4), 5)
                )?;
                match &b.torsion {
                    Some(t) => {
                        writeln!(
                            w,
                            "torsion (after loss, thin-walled centre lines, {}): shear centre x = {} {unit}, y = {} {unit} (x0 = {}, y0 = {} from the centroid); J = {} {unit}4; Cw = {} {unit}6",
                            match t.cell {
                                crate::section::TorsionCell::Closed => "closed cell",
                                crate::section::TorsionCell::Solid => "solid bar",
                                _ => "open section",
                            },
                            sig(t.shear_centre_x / f, 4),
                            sig(t.shear_centre_y / f, 4),
                            sig((t.shear_centre_x - b.reduced.centroid_x) / f, 4),
                            sig((t.shear_centre_y - b.reduced.centroid_y) / f, 4),
                            sig(t.j / f.powi(4), 4),
                            sig(t.cw / f.powi(6), 4),
                        )?;
                        if t.links > 0 {
                            writeln!(w, "note: {} joint(s) between parts that do not touch are taken through the lacing or tie plates (warping continuous); the lacing adds nothing to J (conservative)", t.links)?;
                        }
                        match t.cell {
                            crate::section::TorsionCell::Closed if t.closed_cells > 0 => writeln!(w, "note: the parts close one cell: J = 4·A0²/∮ds/t (Bredt–Batho, wall centre lines; riveted plies taken as fastened continuously) plus Σ b·t³/3 of the walls off the cell; Cw = 0 taken for the closed cell (conservative); shear centre by the closed-section sectorial coordinate")?,
                            crate::section::TorsionCell::Closed => writeln!(w, "note: closed tube: J by closed form (Bredt–Batho for a rectangular tube), Cw = 0")?,
                            crate::section::TorsionCell::CutLaced => writeln!(w, "note: the parts close a cell, but the section is described as laced or battened (lacing, batten and tie plates do not close a cell): taken as open (cut), which underestimates J (conservative)")?,
                            crate::section::TorsionCell::CutCells if t.closed_cells > 1 => writeln!(w, "note: {} closed cells found; Bredt–Batho is applied to a single cell only, so the section is taken as open (cut), which underestimates J (conservative)", t.closed_cells)?,
                            crate::section::TorsionCell::CutCells => writeln!(w, "note: a closed cell was found but encloses no area by the wall centre lines; taken as open (cut), which underestimates J (conservative)")?,
                            _ => {}
                        }
                    }
                    None => writeln!(
                        w,
                        "torsion: not computed (a part is given only by table properties); flexural-torsional buckling cannot be checked for this section"
                    )?,
                }
                // Balance is a design aim of built-up compression members
                // (two or more components, laced or battened), not of eye-bars
                // or single shapes.
                let eyebar = b
                    .parts
                    .iter()
                    .any(|p| matches!(p.shape, crate::section::Shape::EyeBar { .. }));
                let balance_aim = b.parts.len() >= 2 && !eyebar;
                if balance_aim && b.reduced.balance < 0.9 {
                    writeln!(
                        w,
                        "note: the two principal second moments differ by more than 10 % (balance {:.2}); designers of compression members usually kept them within about 10 % (common practice)",
                        b.reduced.balance
                    )?;
                }
                if let Some(l) = &b.lacing {
                    writeln!(
                        w,
                        "lacing: connectors every {} {unit}, component r = {} {unit}, a/ri = {}, Ki = {}, {} (AISC 360-16 §E6.1)",
                        sig(l.spacing / f, 4),
                        sig(l.component_r / f, 4),
                        sig(l.spacing / l.component_r, 4),
                        l.k_i,
                        match l.connector {
                            crate::section::Connector::SnugTight => "snug-tight bolts, Eq. E6-2a",
                            crate::section::Connector::HotDrivenRivet => "hot-driven rivets, Eq. E6-2a",
                            crate::section::Connector::Pretensioned => "pretensioned bolts, Eq. E6-2b",
                            crate::section::Connector::Welded => "welded, Eq. E6-2b",
                        }
                    )?;
                }
                let mut t = Table::new(&[
                    "part",
                    "kind",
                    &format!("x {unit}"),
                    &format!("y {unit}"),
                    "holes",
                    "loss",
                ]);
                for (i, p) in b.parts.iter().enumerate() {
                    t.row(vec![
                        p.label.clone().unwrap_or_else(|| format!("{}", i + 1)),
                        p.shape.kind().to_string(),
                        sig(p.x / f, 4),
                        sig(p.y / f, 4),
                        p.holes.len().to_string(),
                        match &p.loss {
                            None => "none".into(),
                            Some(crate::section::Loss::Thickness(t)) => {
                                format!("{} {unit} thickness", sig(t / f, 3))
                            }
                            Some(crate::section::Loss::OneFace { t, positive }) => format!(
                                "{} {unit} thickness from the {} face",
                                sig(t / f, 3),
                                if *positive { "+" } else { "−" }
                            ),
                            Some(crate::section::Loss::AreaPercent(pc)) => format!("{pc}% area"),
                            Some(crate::section::Loss::Missing) => "missing".into(),
                        },
                    ]);
                }
                write!(w, "{}", t.render())?;
            }
        }
    }
    Ok(())
}

fn props_json(p: &SectionProperties, f: f64) -> String {
    let mut out = String::from("{");
    for (i, (name, pow, get)) in ROWS.iter().enumerate() {
        if i > 0 {
            out.push(',');
        }
        out += &format!("{}:{}", string(name), num(get(p) / f.powi(*pow)));
    }
    out += &format!(
        ",\"principal_angle_deg\":{},\"balance\":{}}}",
        num(p.principal_angle.to_degrees()),
        num(p.balance)
    );
    out
}

pub fn json(w: &mut dyn Write, model: &Model, id: Option<&str>) -> io::Result<()> {
    let f = model.units.section.to_si;
    write!(
        w,
        "{{\"units\":{{\"section\":{}}},\"caution\":{},\"sections\":[",
        string(model.units.section.name),
        string(CAUTION)
    )?;
    for (i, s) in selected(model, id).iter().enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        write!(
            w,
            "{{\"id\":{},\"built_up\":{},\"area\":{},\"i_in\":{},\"i_out\":{},\"net_area\":{}",
            string(&s.id),
            s.built_up.is_some(),
            num(s.area / f.powi(2)),
            num(s.i_in / f.powi(4)),
            num(s.i_out / f.powi(4)),
            num(s.net_area / f.powi(2)),
        )?;
        // Torsion: J, Cw and the shear centre in the centroid's frame
        // (null when a part is known only by its table properties).
        let t = s
            .built_up
            .as_ref()
            .and_then(|b| b.torsion.as_ref())
            .or(s.torsion.as_ref());
        write!(
            w,
            ",\"j\":{},\"cw\":{},\"shear_centre\":{}",
            t.map_or("null".into(), |t| num(t.j / f.powi(4))),
            t.map_or("null".into(), |t| num(t.cw / f.powi(6))),
            t.map_or("null".into(), |t| format!(
                "{{\"x\":{},\"y\":{}}}",
                num(t.shear_centre_x / f),
                num(t.shear_centre_y / f)
            )),
        )?;
        if let Some(t) = t {
            write!(
                w,
                ",\"torsion_cell\":{},\"torsion_closed_cells\":{},\"torsion_links\":{}",
                string(t.cell.name()),
                t.closed_cells,
                t.links
            )?;
        }
        if let Some(b) = &s.built_up {
            let r = &b.reduced;
            write!(
                w,
                ",\"centroid_x\":{},\"centroid_y\":{},\"ix\":{},\"iy\":{},\"ixy\":{},\"reduced\":{},\"original\":{}",
                num(r.centroid_x / f),
                num(r.centroid_y / f),
                num(r.ix / f.powi(4)),
                num(r.iy / f.powi(4)),
                num(r.ixy / f.powi(4)),
                props_json(r, f),
                props_json(&b.original, f)
            )?;
        }
        w.write_all(b"}")?;
    }
    w.write_all(b"]}\n")
}

/// The SVG drawing of one built-up section.
pub fn svg(w: &mut dyn Write, model: &Model, section: &Section) -> io::Result<()> {
    let b = section
        .built_up
        .as_ref()
        .ok_or_else(|| io::Error::other("not built up"))?;
    // Draw in the section unit so the labels read in it.
    let f = model.units.section.to_si;
    let parts: Vec<_> = b
        .parts
        .iter()
        .map(|p| crate::section::PlacedPart {
            shape: scale_shape(&p.shape, 1.0 / f),
            x: p.x / f,
            y: p.y / f,
            orientation: p.orientation,
            holes: p
                .holes
                .iter()
                .map(|h| crate::section::Hole {
                    diameter: h.diameter / f,
                    gauge: h.gauge.map(|g| g / f),
                    pitch: h.pitch.map(|g| g / f),
                    thickness: h.thickness.map(|g| g / f),
                    chain: h.chain,
                })
                .collect(),
            loss: p.loss.as_ref().map(|l| match l {
                crate::section::Loss::Thickness(t) => crate::section::Loss::Thickness(t / f),
                crate::section::Loss::OneFace { t, positive } => crate::section::Loss::OneFace {
                    t: t / f,
                    positive: *positive,
                },
                other => other.clone(),
            }),
            label: p.label.clone(),
            drawn_as: p.drawn_as,
            gauge: p.gauge.map(|g| g / f),
        })
        .collect();
    let props = crate::section::properties(&parts).map_err(io::Error::other)?;
    w.write_all(
        super::section_svg::section_svg(
            &section.id,
            &parts,
            &props,
            b.torsion
                .as_ref()
                .map(|t| (t.shear_centre_x / f, t.shear_centre_y / f)),
            model.units.section.name,
        )
        .as_bytes(),
    )
}

fn scale_shape(s: &crate::section::Shape, k: f64) -> crate::section::Shape {
    use crate::section::Shape::*;
    match *s {
        Plate { width, thickness } => Plate {
            width: width * k,
            thickness: thickness * k,
        },
        Given {
            area,
            ix,
            iy,
            ixy,
            depth,
            width,
        } => Given {
            area: area * k * k,
            ix: ix * k.powi(4),
            iy: iy * k.powi(4),
            ixy: ixy * k.powi(4),
            depth: depth.map(|d| d * k),
            width: width.map(|d| d * k),
        },
        Channel {
            depth,
            flange_width,
            web_thickness,
            flange_thickness,
            flange_slope,
        } => Channel {
            depth: depth * k,
            flange_width: flange_width * k,
            web_thickness: web_thickness * k,
            flange_thickness: flange_thickness * k,
            flange_slope,
        },
        Angle {
            leg_x,
            leg_y,
            thickness,
        } => Angle {
            leg_x: leg_x * k,
            leg_y: leg_y * k,
            thickness: thickness * k,
        },
        IShape {
            depth,
            flange_width,
            web_thickness,
            flange_thickness,
            flange_slope,
        } => IShape {
            depth: depth * k,
            flange_width: flange_width * k,
            web_thickness: web_thickness * k,
            flange_thickness: flange_thickness * k,
            flange_slope,
        },
        Tee {
            depth,
            flange_width,
            stem_thickness,
            flange_thickness,
        } => Tee {
            depth: depth * k,
            flange_width: flange_width * k,
            stem_thickness: stem_thickness * k,
            flange_thickness: flange_thickness * k,
        },
        RoundBar { diameter } => RoundBar {
            diameter: diameter * k,
        },
        SquareBar { side } => SquareBar { side: side * k },
        Pipe {
            outer_diameter,
            wall,
        } => Pipe {
            outer_diameter: outer_diameter * k,
            wall: wall * k,
        },
        RectTube {
            width,
            height,
            wall,
        } => RectTube {
            width: width * k,
            height: height * k,
            wall: wall * k,
        },
        EyeBar { width, thickness } => EyeBar {
            width: width * k,
            thickness: thickness * k,
        },
    }
}
