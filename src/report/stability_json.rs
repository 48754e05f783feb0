//! `panelpoint stability --format json`. Fixed names: `in_plane` (one
//! entry per case and combination: `case`, `kind`, `critical_factor`,
//! `residual`, `members`, `mode`), then `u_frame` and `vibration` (null when
//! the model gives no data for them), then `notes`. Values in the model's
//! display units (see `units`), frequencies in Hz.

use super::json::{string, write_header};
use super::Scale;
use crate::input::Diagnostic;
use crate::model::Model;
use crate::stability::chord::UFrameReport;
use crate::stability::run::StabilityReport;
use crate::stability::u_frame::{AASHTO_LATERAL_FORCE, AASHTO_MARGIN};
use crate::stability::vibration::Vibration;
use serde_json::{json, Value};
use std::io::{self, Write};

pub const SPRING_CLAUSE: &str = "EN 1993-2:2006 Annex D.2.4 eq. (D.2) with the connection term of BS 5400-3 9.6.4.1.3 (from memory)";
pub const SPRING_FORMULA: &str = "Cd = 1/(hv^3/(3 E Iv) + h^2 bq/(2 E Iq) + h^2 fc)";
pub const K_FORMULA: &str = "K = (pi/L) sqrt(E I/(lambda_cr |N|))";
pub const AASHTO_CLAUSE: &str =
    "AASHTO LRFD 6.14.2.9 (from memory): lateral force 0.30 kip/ft at the top-chord panel points; chord critical force >= 1.5 x factored force";
pub const GUIDE: &str = "AASHTO LRFD Guide Specifications for the Design of Pedestrian Bridges (2009), 6 and 5 (from memory)";
pub const EN1990: &str = "EN 1990:2002/A1:2005 Annex A2, A2.4.3.2(2) (from memory)";
pub const RANGES: &str =
    "footbridge guidance (Setra 2006, HiVoSS 2008) resonance-risk ranges (from memory)";

pub fn stability(
    w: &mut dyn Write,
    model: &Model,
    report: &StabilityReport,
    warnings: &[Diagnostic],
) -> io::Result<()> {
    write_header(w, model, warnings, &[])?;
    let v = body(model, report);
    for key in ["in_plane", "u_frame", "vibration", "notes"] {
        write!(w, ",{}:{}", string(key), v[key])?;
    }
    w.write_all(b"}\n")
}

fn body(model: &Model, r: &StabilityReport) -> Value {
    let s = Scale::of(model);
    let in_plane: Vec<Value> = r
        .in_plane
        .iter()
        .map(|e| {
            let kind = if e.combination { "combination" } else { "case" };
            match &e.buckling {
                None => json!({"case": e.effect, "kind": kind, "critical_factor": null, "computed": false}),
                Some(b) => json!({
                    "case": e.effect,
                    "kind": kind,
                    "computed": true,
                    "critical_factor": b.critical_factor,
                    "residual": b.residual,
                    "formula": K_FORMULA,
                    "members": b.members.iter().map(|k| json!({
                        "member": model.members[k.member].id.as_str(),
                        "force": k.force / s.force,
                        "critical_force": k.critical_force / s.force,
                        "k": k.k,
                        "share": k.share,
                    })).collect::<Vec<_>>(),
                    "mode": b.mode.iter().enumerate().map(|(i, d)| json!({
                        "node": model.nodes[i].id, "dx": d[0], "dy": d[1]
                    })).collect::<Vec<_>>(),
                }),
            }
        })
        .collect();
    json!({
        "in_plane": in_plane,
        "u_frame": r.u_frame.as_ref().map(|u| u_frame(model, &s, u)),
        "vibration": r.vibration.as_ref().map(|v| vibration(model, &s, v, r)),
        "notes": r.notes,
    })
}

fn u_frame(model: &Model, s: &Scale, u: &UFrameReport) -> Value {
    let per_len = s.force / s.length;
    json!({
        "spring": {
            "stiffness": u.spring.stiffness / per_len,
            "units": format!("{}/{}", s.force_name, s.length_name),
            "given": u.spring.given,
            "delta_vertical": u.spring.delta_vertical * per_len,
            "delta_floor_beam": u.spring.delta_floor_beam * per_len,
            "delta_connection": u.spring.delta_connection * per_len,
            "clause": SPRING_CLAUSE,
            "formula": SPRING_FORMULA,
        },
        "chord": u.members.iter().map(|&m| model.members[m].id.as_str()).collect::<Vec<_>>(),
        "results": u.results.iter().map(|c| json!({
            "case": c.effect,
            "kind": if c.combination { "combination" } else { "case" },
            "critical_factor": c.buckling.critical_factor,
            "residual": c.buckling.residual,
            "required": if c.combination { Some(AASHTO_MARGIN) } else { None },
            "ok": c.margin_ok,
            "members": u.members.iter().zip(&c.buckling.segments).filter_map(|(&m, seg)| seg.map(|(pcr, k)| {
                let mem = &model.members[m];
                let (a, b) = (&model.nodes[mem.start], &model.nodes[mem.end]);
                let l = (b.x - a.x).hypot(b.y - a.y);
                json!({"member": mem.id.as_str(), "critical_force": pcr / s.force, "k": k, "effective_length": k * l / s.length})
            })).collect::<Vec<_>>(),
            "mode": c.buckling.mode,
        })).collect::<Vec<_>>(),
        "lateral_force": {
            "clause": AASHTO_CLAUSE,
            "per_length": AASHTO_LATERAL_FORCE / per_len,
            "frames": u.lateral.iter().map(|&(n, h, m, d)| json!({
                "node": model.nodes[n].id, "force": h / s.force, "moment": m / (s.force * s.length), "displacement": d / s.disp,
            })).collect::<Vec<_>>(),
        },
        "lateral_frequency": u.lateral_frequency.map(|(f, res)| json!({"value": f, "residual": res})),
    })
}

/// One footbridge limit: (check, source, value in Hz, limit text, passes).
pub type Criterion = (String, &'static str, Option<f64>, String, Option<bool>);

/// Pass/fail entries of the footbridge limits.
pub fn criteria(v: &Vibration, lateral: Option<f64>) -> Vec<Criterion> {
    let fv = v.vertical.map(|i| v.modes[i].frequency);
    let mut out = Vec::new();
    let min = 3.0f64.min(v.weight_based_minimum.max(0.0));
    out.push((
        "vertical frequency >= 3.0 Hz, or >= 2.86 ln(180/W)".to_string(),
        GUIDE,
        fv,
        format!(
            ">= {:.2} Hz (3.0; weight-based {:.2})",
            min, v.weight_based_minimum
        ),
        fv.map(|f| f >= min),
    ));
    out.push((
        "lateral frequency >= 1.3 Hz".into(),
        GUIDE,
        lateral,
        ">= 1.3 Hz".into(),
        lateral.map(|f| f >= 1.3),
    ));
    out.push((
        "vertical frequency: comfort check needed below 5 Hz".into(),
        EN1990,
        fv,
        ">= 5 Hz (else verify accelerations)".into(),
        fv.map(|f| f >= 5.0),
    ));
    out.push((
        "lateral frequency: comfort check needed below 2.5 Hz".into(),
        EN1990,
        lateral,
        ">= 2.5 Hz (else verify accelerations)".into(),
        lateral.map(|f| f >= 2.5),
    ));
    out.push((
        "vertical frequency outside 1.25-4.6 Hz".into(),
        RANGES,
        fv,
        "outside 1.25-4.6 Hz".into(),
        fv.map(|f| !(1.25..=4.6).contains(&f)),
    ));
    out.push((
        "lateral frequency outside 0.5-1.2 Hz".into(),
        RANGES,
        lateral,
        "outside 0.5-1.2 Hz".into(),
        lateral.map(|f| !(0.5..=1.2).contains(&f)),
    ));
    out
}

fn vibration(model: &Model, s: &Scale, v: &Vibration, r: &StabilityReport) -> Value {
    let lateral = r
        .u_frame
        .as_ref()
        .and_then(|u| u.lateral_frequency)
        .map(|p| p.0);
    let input = model.stability.vibration.as_ref();
    let ratio = input.map_or(360.0, |i| i.deflection_ratio);
    let limit = v.span / ratio;
    json!({
        "modes": v.modes.iter().map(|m| json!({
            "frequency": m.frequency, "vertical_share": m.vertical_share, "residual": m.residual,
        })).collect::<Vec<_>>(),
        "vertical_frequency": v.vertical.map(|i| v.modes[i].frequency),
        "lateral_frequency": lateral,
        "lateral_note": "lateral: the compression chord on its U-frames (the deck's own lateral mode needs its plan bracing, not modelled)",
        "weight": v.weight / s.force,
        "weight_kip": v.weight / crate::stability::vibration::KIP,
        "weight_based_minimum": v.weight_based_minimum,
        "criteria": criteria(v, lateral).into_iter().map(|(name, src, value, limit, ok)| json!({
            "check": name, "source": src, "value": value, "limit": limit, "ok": ok,
        })).collect::<Vec<_>>(),
        "deflection": {
            "value": v.deflection / s.disp,
            "limit": limit / s.disp,
            "ratio": ratio,
            "span": v.span / s.length,
            "ok": v.deflection <= limit,
            "source": format!("span/{ratio} under the pedestrian load, {GUIDE}"),
        },
    })
}
