//! `panelpoint vehicles`: the library of published load models with their
//! axles, spacings, lane or area loads, dynamic allowance and sources —
//! US models in kip and ft, EN 1991-2 models in kN and m.

use super::json::{num, string};
use crate::loads::library::{Dynamic, LoadModel, FT, KIP, KLF, PSF};
use std::io::{self, Write};

fn metric(m: &LoadModel) -> bool {
    m.source.starts_with("EN ")
}

/// (force divisor, length divisor, force unit, length unit).
fn units(m: &LoadModel) -> (f64, f64, &'static str, &'static str) {
    if metric(m) {
        (1000.0, 1.0, "kN", "m")
    } else {
        (KIP, FT, "kip", "ft")
    }
}

fn axles_line(m: &LoadModel, axles: &[crate::loads::Axle]) -> String {
    let (f, l, fu, lu) = units(m);
    let mut s = String::new();
    let mut prev = 0.0;
    for (i, a) in axles.iter().enumerate() {
        if i > 0 {
            s += &format!(" -{}- ", trim(a.offset / l - prev / l));
        }
        s += &trim(a.load / f);
        prev = a.offset;
    }
    if s.is_empty() {
        "none".into()
    } else {
        format!("{s} ({fu}, spacings in {lu})")
    }
}

fn trim(v: f64) -> String {
    let s = format!("{:.3}", v);
    s.trim_end_matches('0').trim_end_matches('.').to_string()
}

fn dynamic(m: &LoadModel) -> String {
    let on = if m.impact_on_lane {
        "all of the load"
    } else {
        "axles only"
    };
    match m.dynamic {
        Dynamic::None => "none".into(),
        Dynamic::Fixed(x) => format!("{} % on {on}", trim(100.0 * x)),
        Dynamic::LoadedLength => {
            format!("I = 50/(L + 125) <= 0.30, L the loaded length (ft), on {on}")
        }
        Dynamic::Arema => format!(
            "100/S + 40 - 3L^2/1600 (L < 80 ft) or 100/S + 16 + 600/(L - 30) percent, on {on}"
        ),
        Dynamic::EnPhi { phi3: true } => {
            "Phi3 = 2.16/(sqrt(L_phi) - 0.2) + 0.73 within 1.00..2.00, on all of the load".into()
        }
        Dynamic::EnPhi { phi3: false } => {
            "Phi2 = 1.44/(sqrt(L_phi) - 0.2) + 0.82 within 1.00..1.67, on all of the load".into()
        }
    }
}

fn distributed(m: &LoadModel) -> Option<String> {
    let v = &m.vehicle;
    let (f, l, fu, lu) = units(m);
    if let Some(q) = m.area {
        return Some(if metric(m) {
            format!("{} kN/m2 over the tributary width", trim(q / 1000.0))
        } else {
            format!("{} psf over the tributary width", trim(q / PSF))
        });
    }
    if v.rules.crowd.is_some() {
        return Some("q_fk = 2.0 + 120/(L + 30) kN/m2 within 2.5..5.0, L the loaded length (m), over the tributary width".into());
    }
    if let Some(t) = &v.rules.trailing {
        return Some(format!(
            "{} {fu}/{lu} trailing, from {} {lu} behind the front axle",
            trim(t.load / (f / l)),
            trim(t.offset / l)
        ));
    }
    v.lane.map(|w| {
        if metric(m) {
            format!(
                "{} kN/m on the parts of the influence line that add",
                trim(w / 1000.0)
            )
        } else {
            format!(
                "{} kip/ft on the parts of the influence line that add",
                trim(w / KLF)
            )
        }
    })
}

/// Text listing of `models`.
pub fn text(w: &mut dyn Write, models: &[LoadModel]) -> io::Result<()> {
    writeln!(w, "Library load models (every number from memory: check against the edition the owner requires)")?;
    for m in models {
        let (f, _, fu, _) = units(m);
        writeln!(
            w,
            "\n{}  {}{}",
            m.name,
            m.designation,
            if m.legal { "  [legal load]" } else { "" }
        )?;
        writeln!(w, "  axles:    {}", axles_line(m, &m.vehicle.axles))?;
        if let Some(g) = &m.vehicle.rules.variable_gap {
            let l = units(m).1;
            writeln!(
                w,
                "  spacing:  axle {} varies {}..{} for the greatest effect",
                g.axle + 1,
                trim(g.min / l),
                trim(g.max / l)
            )?;
        }
        for t in &m.vehicle.rules.alternatives {
            writeln!(w, "  or {}: {}", t.label, axles_line(m, &t.axles))?;
        }
        if let Some(d) = distributed(m) {
            writeln!(w, "  uniform:  {d}")?;
        }
        if m.gross_weight() > 0.0 {
            writeln!(w, "  gross:    {} {fu}", trim(m.gross_weight() / f))?;
        }
        writeln!(w, "  dynamic:  {}", dynamic(m))?;
        if m.vehicle.rules.ignore_relieving {
            writeln!(w, "  axles that relieve the effect are left off")?;
        }
        if !m.note.is_empty() {
            writeln!(w, "  note:     {}", m.note)?;
        }
        writeln!(w, "  source:   {}", m.source)?;
    }
    writeln!(
        w,
        "\nCooper E-n and the alternate live load take any n: cooper-e72, alternate-e60."
    )?;
    writeln!(w, "{}", super::CAUTION)
}

/// JSON listing of `models` (loads in N, lengths in m).
pub fn json(w: &mut dyn Write, models: &[LoadModel]) -> io::Result<()> {
    write!(
        w,
        "{{\"units\":{{\"force\":\"N\",\"length\":\"m\"}},\"caution\":{},\"models\":[",
        string(super::CAUTION)
    )?;
    for (i, m) in models.iter().enumerate() {
        if i > 0 {
            write!(w, ",")?;
        }
        let axles = |a: &[crate::loads::Axle]| {
            a.iter()
                .map(|a| format!("{{\"load\":{},\"offset\":{}}}", num(a.load), num(a.offset)))
                .collect::<Vec<_>>()
                .join(",")
        };
        write!(
            w,
            "{{\"name\":{},\"designation\":{},\"legal\":{},\"gross_weight\":{},\"axles\":[{}],\"alternatives\":[{}],\"uniform\":{},\"dynamic\":{},\"note\":{},\"source\":{}}}",
            string(&m.name),
            string(&m.designation),
            m.legal,
            num(m.gross_weight()),
            axles(&m.vehicle.axles),
            m.vehicle
                .rules
                .alternatives
                .iter()
                .map(|t| format!("{{\"label\":{},\"axles\":[{}]}}", string(&t.label), axles(&t.axles)))
                .collect::<Vec<_>>()
                .join(","),
            distributed(m).map_or("null".into(), |d| string(&d)),
            string(&dynamic(m)),
            string(&m.note),
            string(&m.source),
        )?;
    }
    writeln!(w, "]}}")
}
