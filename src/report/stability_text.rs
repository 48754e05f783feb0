//! `panelpoint stability` as text: in-plane critical factors and effective
//! lengths, the chord on its U-frames, the footbridge frequencies and
//! deflection, each with its clause and formula.

use super::stability_json::{criteria, AASHTO_CLAUSE, K_FORMULA, SPRING_CLAUSE, SPRING_FORMULA};
use super::table::{sig, Table};
use super::{Scale, CAUTION};
use crate::input::Diagnostic;
use crate::model::Model;
use crate::stability::chord::UFrameReport;
use crate::stability::run::StabilityReport;
use crate::stability::u_frame::{AASHTO_LATERAL_FORCE, AASHTO_MARGIN};
use std::io::{self, Write};

pub fn stability(
    w: &mut dyn Write,
    model: &Model,
    r: &StabilityReport,
    warnings: &[Diagnostic],
) -> io::Result<()> {
    let s = Scale::of(model);
    writeln!(w, "{}", model.title)?;
    writeln!(w, "{CAUTION}")?;
    for d in warnings {
        writeln!(w, "warning: {d}")?;
    }
    writeln!(
        w,
        "\nIn-plane elastic buckling (K phi = lambda G phi; {K_FORMULA})"
    )?;
    let mut t = Table::new(&[
        "case",
        "kind",
        "lambda_cr",
        "residual",
        "members in the mode (K)",
    ]);
    for e in &r.in_plane {
        let kind = if e.combination { "combination" } else { "case" };
        let (lam, res, members) = match &e.buckling {
            None => ("not computed".into(), "-".into(), "moving load".into()),
            Some(b) => match b.critical_factor {
                None => ("none".into(), "-".into(), "no compression".into()),
                Some(l) => (
                    sig(l, 4),
                    format!("{:.1e}", b.residual),
                    b.members
                        .iter()
                        .map(|k| format!("{} ({})", model.members[k.member].id, sig(k.k, 3)))
                        .collect::<Vec<_>>()
                        .join(", "),
                ),
            },
        };
        t.row(vec![e.effect.clone(), kind.into(), lam, res, members]);
    }
    write!(w, "{}", t.render())?;
    writeln!(
        w,
        "Members not listed are not governed by the lowest mode (share of the mode's axial work below 10 %)."
    )?;
    if let Some(u) = &r.u_frame {
        u_frame(w, model, &s, u)?;
    }
    if let Some(v) = &r.vibration {
        let lateral = r
            .u_frame
            .as_ref()
            .and_then(|u| u.lateral_frequency)
            .map(|p| p.0);
        writeln!(
            w,
            "\nNatural frequencies (in-plane, pin-jointed truss, lumped masses)"
        )?;
        let mut t = Table::new(&["mode", "f (Hz)", "vertical share", "residual"]);
        for (i, m) in v.modes.iter().enumerate() {
            t.row(vec![
                (i + 1).to_string(),
                sig(m.frequency, 4),
                format!("{:.2}", m.vertical_share),
                format!("{:.1e}", m.residual),
            ]);
        }
        write!(w, "{}", t.render())?;
        writeln!(
            w,
            "Supported weight W = {} {} ({} kip); lateral: the compression chord on its U-frames (the deck's own lateral mode needs its plan bracing, not modelled).",
            sig(v.weight / s.force, 4),
            s.force_name,
            sig(v.weight / crate::stability::vibration::KIP, 4)
        )?;
        let mut t = Table::new(&["check", "value (Hz)", "limit", "ok", "source"]);
        for (name, src, value, limit, ok) in criteria(v, lateral) {
            t.row(vec![
                name,
                value.map_or("-".into(), |f| sig(f, 3)),
                limit,
                ok.map_or("-".into(), |o| if o { "yes".into() } else { "NO".into() }),
                src.into(),
            ]);
        }
        write!(w, "{}", t.render())?;
        let ratio = model
            .stability
            .vibration
            .as_ref()
            .map_or(360.0, |i| i.deflection_ratio);
        let limit = v.span / ratio;
        writeln!(
            w,
            "Pedestrian live-load deflection {} {} vs span/{ratio} = {} {}: {} (guide specification 5, from memory)",
            sig(v.deflection / s.disp, 3),
            s.disp_name,
            sig(limit / s.disp, 3),
            s.disp_name,
            if v.deflection <= limit { "ok" } else { "EXCEEDS" }
        )?;
    }
    if !r.notes.is_empty() {
        writeln!(w, "\nNotes")?;
        for n in &r.notes {
            writeln!(w, "- {n}")?;
        }
    }
    Ok(())
}

fn u_frame(w: &mut dyn Write, model: &Model, s: &Scale, u: &UFrameReport) -> io::Result<()> {
    let per_len = s.force / s.length;
    writeln!(w, "\nCompression chord on U-frames")?;
    writeln!(
        w,
        "U-frame spring Cd = {} {}/{} ({}; {})",
        sig(u.spring.stiffness / per_len, 4),
        s.force_name,
        s.length_name,
        if u.spring.given {
            "given in the model"
        } else {
            SPRING_FORMULA
        },
        SPRING_CLAUSE
    )?;
    if !u.spring.given {
        writeln!(
            w,
            "  flexibility terms: vertical {}, floor beam {}, connection {} {}/{}",
            sig(u.spring.delta_vertical * per_len, 3),
            sig(u.spring.delta_floor_beam * per_len, 3),
            sig(u.spring.delta_connection * per_len, 3),
            s.length_name,
            s.force_name
        )?;
    }
    let mut t = Table::new(&[
        "case",
        "lambda_cr",
        "required",
        "ok",
        "chord members: K (K L)",
    ]);
    for c in &u.results {
        let members = u
            .members
            .iter()
            .zip(&c.buckling.segments)
            .filter_map(|(&m, seg)| {
                seg.map(|(_, k)| {
                    let mem = &model.members[m];
                    let (a, b) = (&model.nodes[mem.start], &model.nodes[mem.end]);
                    let l = (b.x - a.x).hypot(b.y - a.y);
                    format!(
                        "{} {} ({} {})",
                        mem.id,
                        sig(k, 3),
                        sig(k * l / s.length, 3),
                        s.length_name
                    )
                })
            })
            .collect::<Vec<_>>()
            .join(", ");
        t.row(vec![
            c.effect.clone(),
            c.buckling
                .critical_factor
                .map_or("none".into(), |l| sig(l, 4)),
            if c.combination {
                format!("{AASHTO_MARGIN}")
            } else {
                "-".into()
            },
            c.margin_ok
                .map_or("-".into(), |o| if o { "yes".into() } else { "NO".into() }),
            members,
        ]);
    }
    write!(w, "{}", t.render())?;
    writeln!(w, "{AASHTO_CLAUSE}")?;
    let mut t = Table::new(&["U-frame", "H", "H h", "H/Cd"]);
    for &(n, h, m, d) in &u.lateral {
        t.row(vec![
            model.nodes[n].id.clone(),
            format!("{} {}", sig(h / s.force, 3), s.force_name),
            format!(
                "{} {}-{}",
                sig(m / (s.force * s.length), 3),
                s.force_name,
                s.length_name
            ),
            format!("{} {}", sig(d / s.disp, 3), s.disp_name),
        ]);
    }
    write!(w, "{}", t.render())?;
    writeln!(
        w,
        "H = {} {}/{} x tributary panel length; check the verticals, floor beams and their connections for H and H h.",
        sig(AASHTO_LATERAL_FORCE / per_len, 3),
        s.force_name,
        s.length_name
    )?;
    if let Some((f, res)) = u.lateral_frequency {
        writeln!(
            w,
            "Lateral frequency of the chord on its U-frames: {} Hz (residual {res:.1e})",
            sig(f, 3)
        )?;
    }
    Ok(())
}
