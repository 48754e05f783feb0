//! Reports of the what-if commands: sweep rows (streamed one variant at a
//! time, in text, JSON or CSV), the redundancy scan and the geometry
//! sensitivity. Numbers are converted to the model's display units here.

use super::json::{num, string};
use super::table::{sig, Table};
use super::{csv, Format, Scale, CAUTION};
use crate::model::Model;
use crate::rate::Side;
use crate::sensitivity::{best_moves, Held, Sensitivity};
use crate::sweep::redundancy::Loss;
use crate::sweep::{Kind, VariantResult};
use std::io::{self, Write};

fn kind_name(k: Kind) -> &'static str {
    match k {
        Kind::LoadsOnly => "loads",
        Kind::Stiffness => "stiffness",
        Kind::Topology => "topology",
    }
}

fn opt(v: Option<f64>, digits: usize) -> String {
    v.map_or("-".into(), |v| sig(v, digits))
}

/// Writes sweep rows as they arrive.
pub struct SweepWriter {
    format: Format,
    detail: bool,
    scale: Scale,
    rows: usize,
    /// Width of the text case column, set from the model's effect names.
    case_width: std::cell::Cell<usize>,
}

impl SweepWriter {
    pub fn new(format: Format, detail: bool, model: &Model) -> SweepWriter {
        SweepWriter {
            format,
            detail,
            scale: Scale::of(model),
            rows: 0,
            case_width: std::cell::Cell::new(10),
        }
    }

    /// What comes before the first row.
    pub fn header(
        &self,
        w: &mut dyn Write,
        model: &Model,
        total: usize,
        shard: &str,
    ) -> io::Result<()> {
        let s = &self.scale;
        match self.format {
            Format::Text => {
                // Rows stream as they finish, so the case column is sized
                // from every effect name the model can produce.
                let moving = model.live.moving.iter().map(|m| m.id.len()).max().unwrap_or(0);
                let width = model
                    .cases
                    .iter()
                    .map(|c| c.id.len())
                    .chain(model.combinations.iter().map(|c| {
                        c.id.len() + if c.moving.is_empty() { 0 } else { moving + 20 }
                    }))
                    .chain(std::iter::once(if moving > 0 { moving + 24 } else { 0 }))
                    .max()
                    .unwrap_or(4)
                    .clamp(4, 48);
                self.case_width.set(width);
                writeln!(w, "{}: sweep of {total} variants{shard}", model.title)?;
                writeln!(w, "{CAUTION}")?;
                writeln!(
                    w,
                    "util = greatest utilization (controlling member, case); RF = lowest inventory rating factor; defl = greatest node displacement over the load cases, {}",
                    s.disp_name
                )?;
                writeln!(
                    w,
                    "{:>6}  {:>6}  {:<12} {:<cw$} {:>6}  {:<12} {:>8}  {:<6} {:<9}  variant",
                    "index", "util", "member", "case", "RF", "member", "defl", "node", "kind",
                    cw = width
                )
            }
            Format::Json => write!(
                w,
                "{{\"title\":{},\"units\":{{\"deflection\":{},\"length\":{}}},\"caution\":{},\"total\":{total},\"variants\":[",
                string(&model.title),
                string(s.disp_name),
                string(s.length_name),
                string(CAUTION)
            ),
            Format::Csv => {
                write!(
                    w,
                    "index,name,parameters,kind,max_utilization,controlling_member,controlling_case,lowest_rating_factor,rating_member,rating_case,max_deflection_{},deflection_node,deflection_case,error",
                    s.disp_name
                )?;
                if self.detail {
                    write!(w, ",member,member_utilization,member_case,member_rating_factor")?;
                }
                writeln!(w)
            }
        }
    }

    /// One variant.
    pub fn row(&mut self, w: &mut dyn Write, r: &VariantResult) -> io::Result<()> {
        let d = self.scale.disp;
        let first = self.rows == 0;
        self.rows += 1;
        match self.format {
            Format::Text => {
                let label = if r.parameters == "base" || r.parameters == r.name {
                    r.name.clone()
                } else {
                    format!("{} [{}]", r.name, r.parameters)
                };
                match &r.outcome {
                    Err(e) => writeln!(w, "{:>6}  failed: {e}  {label}", r.index),
                    Ok(o) => {
                        writeln!(
                            w,
                            "{:>6}  {:>6}  {:<12} {:<cw$} {:>6}  {:<12} {:>8}  {:<6} {:<9}  {label}",
                            r.index,
                            opt(o.max_utilization, 3),
                            o.controlling_member.as_deref().unwrap_or("-"),
                            o.controlling_case.as_deref().unwrap_or("-"),
                            opt(o.lowest_rating_factor, 3),
                            o.rating_member.as_deref().unwrap_or("-"),
                            sig(o.max_deflection / d, 3),
                            o.deflection_node.as_deref().unwrap_or("-"),
                            kind_name(r.kind),
                            cw = self.case_width.get(),
                        )?;
                        for m in &o.members {
                            writeln!(
                                w,
                                "{:>6}  {:>6}  {:<12} {:<cw$} {:>6}",
                                "",
                                sig(m.utilization, 3),
                                m.member,
                                m.case,
                                opt(m.rating_factor, 3),
                                cw = self.case_width.get()
                            )?;
                        }
                        Ok(())
                    }
                }
            }
            Format::Json => {
                if !first {
                    w.write_all(b",")?;
                }
                write!(
                    w,
                    "\n{{\"index\":{},\"name\":{},\"parameters\":{},\"kind\":{}",
                    r.index,
                    string(&r.name),
                    string(&r.parameters),
                    string(kind_name(r.kind))
                )?;
                match &r.outcome {
                    Err(e) => write!(w, ",\"error\":{}}}", string(e)),
                    Ok(o) => {
                        let s = |v: &Option<String>| v.as_deref().map_or("null".into(), string);
                        write!(
                            w,
                            ",\"max_utilization\":{},\"controlling_member\":{},\"controlling_case\":{},\"lowest_rating_factor\":{},\"rating_member\":{},\"rating_case\":{},\"max_deflection\":{},\"deflection_node\":{},\"deflection_case\":{}",
                            o.max_utilization.map_or("null".into(), num),
                            s(&o.controlling_member),
                            s(&o.controlling_case),
                            o.lowest_rating_factor.map_or("null".into(), num),
                            s(&o.rating_member),
                            s(&o.rating_case),
                            num(o.max_deflection / d),
                            s(&o.deflection_node),
                            s(&o.deflection_case),
                        )?;
                        if self.detail {
                            w.write_all(b",\"members\":[")?;
                            for (i, m) in o.members.iter().enumerate() {
                                if i > 0 {
                                    w.write_all(b",")?;
                                }
                                write!(
                                    w,
                                    "{{\"member\":{},\"utilization\":{},\"case\":{},\"rating_factor\":{}}}",
                                    string(&m.member),
                                    num(m.utilization),
                                    string(&m.case),
                                    m.rating_factor.map_or("null".into(), num)
                                )?;
                            }
                            w.write_all(b"]")?;
                        }
                        w.write_all(b"}")
                    }
                }
            }
            Format::Csv => {
                let head = format!(
                    "{},{},{},{}",
                    r.index,
                    csv::field(&r.name),
                    csv::field(&r.parameters),
                    kind_name(r.kind)
                );
                match &r.outcome {
                    Err(e) => {
                        write!(w, "{head},,,,,,,,,,{}", csv::field(e))?;
                        if self.detail {
                            write!(w, ",,,,")?;
                        }
                        writeln!(w)
                    }
                    Ok(o) => {
                        let f = |v: &Option<String>| csv::field(v.as_deref().unwrap_or(""));
                        let summary = format!(
                            "{head},{},{},{},{},{},{},{},{},{},",
                            o.max_utilization.map_or(String::new(), csv::num),
                            f(&o.controlling_member),
                            f(&o.controlling_case),
                            o.lowest_rating_factor.map_or(String::new(), csv::num),
                            f(&o.rating_member),
                            f(&o.rating_case),
                            csv::num(o.max_deflection / d),
                            f(&o.deflection_node),
                            f(&o.deflection_case),
                        );
                        if !self.detail {
                            return writeln!(w, "{summary}");
                        }
                        for m in &o.members {
                            writeln!(
                                w,
                                "{summary},{},{},{},{}",
                                csv::field(&m.member),
                                csv::num(m.utilization),
                                csv::field(&m.case),
                                m.rating_factor.map_or(String::new(), csv::num)
                            )?;
                        }
                        Ok(())
                    }
                }
            }
        }
    }

    /// What comes after the last row.
    pub fn footer(&self, w: &mut dyn Write) -> io::Result<()> {
        match self.format {
            Format::Json => w.write_all(b"\n]}\n"),
            _ => Ok(()),
        }
    }
}

/// `panelpoint redundancy`.
pub fn redundancy(
    w: &mut dyn Write,
    model: &Model,
    losses: &[Loss],
    format: Format,
) -> io::Result<()> {
    let s = Scale::of(model);
    match format {
        Format::Csv => redundancy_csv(w, model, losses, &s),
        Format::Json => {
            write!(
                w,
                "{{\"title\":{},\"caution\":{},\"units\":{{\"force\":{}}},\"members\":[",
                string(&model.title),
                string(CAUTION),
                string(s.force_name)
            )?;
            for (i, l) in losses.iter().enumerate() {
                if i > 0 {
                    w.write_all(b",")?;
                }
                let o = |v: &Option<String>| v.as_deref().map_or("null".into(), string);
                write!(
                    w,
                    "\n{{\"member\":{},\"critical\":{},\"fracture_critical\":{},\"service_force\":{},\"service_effect\":{},\"max_utilization_after\":{},\"controlling_member\":{},\"controlling_case\":{},\"mechanism\":{}}}",
                    string(&model.members[l.member].id),
                    l.critical,
                    l.fracture_critical,
                    num(l.service_force / s.force),
                    string(&l.service_effect),
                    l.max_utilization_after.map_or("null".into(), num),
                    o(&l.controlling_member),
                    o(&l.controlling_case),
                    o(&l.mechanism)
                )?;
            }
            w.write_all(b"\n]}\n")
        }
        Format::Text => {
            writeln!(
                w,
                "{}: load-path redundancy, each member removed in turn",
                model.title
            )?;
            writeln!(w, "{CAUTION}")?;
            writeln!(
                w,
                "critical = the truss is a mechanism without the member; fracture-critical = critical and in tension under dead + live (live: the live cases with impact, and each moving load's envelope as `rate` checks it; the greatest tension is shown when there is any)"
            )?;
            let mut t = Table::new(&[
                "member",
                &format!("D+L force {}", s.force_name),
                "under",
                "verdict",
                "util after",
                "where",
                "case",
            ]);
            for l in losses {
                t.row(vec![
                    model.members[l.member].id.to_string(),
                    sig(l.service_force / s.force, 4),
                    l.service_effect.clone(),
                    verdict(l).into(),
                    opt(l.max_utilization_after, 3),
                    l.controlling_member.clone().unwrap_or("-".into()),
                    l.controlling_case.clone().unwrap_or("-".into()),
                ]);
            }
            w.write_all(t.render().as_bytes())?;
            let n = losses.iter().filter(|l| l.critical).count();
            let fc = losses.iter().filter(|l| l.fracture_critical).count();
            writeln!(
                w,
                "{n} of {} members non-redundant, {fc} of them fracture-critical",
                losses.len()
            )
        }
    }
}

/// `panelpoint redundancy --format csv`: one row per member removed.
fn redundancy_csv(w: &mut dyn Write, model: &Model, losses: &[Loss], s: &Scale) -> io::Result<()> {
    writeln!(
        w,
        "member,verdict,critical,fracture_critical,service_force_{},service_effect,max_utilization_after,controlling_member,controlling_case,mechanism",
        s.force_name
    )?;
    let f = |v: &Option<String>| v.as_deref().map_or(String::new(), csv::field);
    for l in losses {
        writeln!(
            w,
            "{},{},{},{},{},{},{},{},{},{}",
            csv::field(&model.members[l.member].id),
            verdict(l),
            l.critical,
            l.fracture_critical,
            csv::num(l.service_force / s.force),
            csv::field(&l.service_effect),
            l.max_utilization_after.map_or(String::new(), csv::num),
            f(&l.controlling_member),
            f(&l.controlling_case),
            f(&l.mechanism)
        )?;
    }
    Ok(())
}

fn verdict(l: &Loss) -> &'static str {
    if l.fracture_critical {
        "fracture-critical"
    } else if l.critical {
        "critical"
    } else {
        "redundant"
    }
}

/// Name of a move that lowers the utilization: "lower U3", "move U3 left".
fn move_name(model: &Model, node: usize, axis: usize, d: f64) -> String {
    let id = &model.nodes[node].id;
    match (axis, d > 0.0) {
        (0, true) => format!("move {id} left"),
        (0, false) => format!("move {id} right"),
        (_, true) => format!("lower {id}"),
        (_, false) => format!("raise {id}"),
    }
}

/// How many of the best moves the text report lists.
pub const BEST_MOVES: usize = 6;

/// Where the moving load was held, in the model's units, and what that means.
fn held_text(model: &Model, h: &Held) -> String {
    let sc = Scale::of(model);
    let at = match h.at {
        Some(p) => format!(
            "front axle at {:.2} {}, {}",
            p.position / sc.length,
            sc.length_name,
            p.direction.name()
        ),
        None => "no axle contributing".into(),
    };
    let lane = if h.lane {
        format!(
            ", lane load over the {} parts of the influence line",
            if h.side == Side::Tension {
                "tension"
            } else {
                "compression"
            }
        )
    } else {
        String::new()
    };
    format!(
        "{} held where it governs this check ({}): {at}{lane}. The envelope is piecewise linear in the vehicle position, so these are the derivatives at that position (one-sided where another position is about to govern); the vehicle's loads are held as nodal forces at the deck nodes, so a moved deck node carries the same load",
        h.moving_load,
        h.side.label()
    )
}

fn held_json(model: &Model, h: Option<&Held>) -> String {
    let Some(h) = h else { return "null".into() };
    let sc = Scale::of(model);
    format!(
        "{{\"moving_load\":{},\"side\":{},\"front_axle\":{},\"direction\":{},\"lane\":{},\"note\":{}}}",
        string(&h.moving_load),
        string(h.side.label()),
        h.at.map_or("null".into(), |p| num(p.position / sc.length)),
        h.at.map_or("null".into(), |p| string(p.direction.name())),
        h.lane,
        string(&held_text(model, h))
    )
}

/// `panelpoint sensitivity`.
pub fn sensitivity(
    w: &mut dyn Write,
    model: &Model,
    s: &Sensitivity,
    effect: &str,
    format: Format,
) -> io::Result<()> {
    let sc = Scale::of(model);
    // d/dx per display length unit; deflection in the displacement unit.
    let du = sc.length;
    let dd = sc.length / sc.disp;
    let axis = |a: usize| if a == 0 { "x" } else { "y" };
    match format {
        Format::Csv => {
            writeln!(
                w,
                "row,id,case,axis,value,d_utilization_per_{l},d_deflection_{d}_per_{l}",
                l = sc.length_name,
                d = sc.disp_name
            )?;
            writeln!(
                w,
                "governing utilization,{},{},,{},,",
                csv::field(&model.members[s.member].id),
                csv::field(effect),
                csv::num(s.utilization)
            )?;
            writeln!(
                w,
                "greatest deflection {},{},{},,{},,",
                sc.disp_name,
                csv::field(&model.nodes[s.deflection_node].id),
                csv::field(&model.cases[s.deflection_case].id),
                csv::num(s.deflection / sc.disp)
            )?;
            if let Some(h) = &s.held {
                writeln!(
                    w,
                    "moving load held,{},{},,{},,",
                    csv::field(&h.moving_load),
                    csv::field(h.side.label()),
                    csv::field(&held_text(model, h))
                )?;
            }
            for c in &s.coordinates {
                writeln!(
                    w,
                    "coordinate,{},,{},,{},{}",
                    csv::field(&model.nodes[c.node].id),
                    axis(c.axis),
                    csv::num(c.d_utilization * du),
                    csv::num(c.d_deflection * dd)
                )?;
            }
            Ok(())
        }
        Format::Json => {
            write!(
                w,
                "{{\"title\":{},\"caution\":{},\"units\":{{\"length\":{},\"deflection\":{}}},\"utilization\":{{\"member\":{},\"case\":{},\"value\":{}}},\"deflection\":{{\"node\":{},\"case\":{},\"value\":{}}},\"held\":{},\"coordinates\":[",
                string(&model.title),
                string(CAUTION),
                string(sc.length_name),
                string(sc.disp_name),
                string(&model.members[s.member].id),
                string(effect),
                num(s.utilization),
                string(&model.nodes[s.deflection_node].id),
                string(&model.cases[s.deflection_case].id),
                num(s.deflection / sc.disp),
                held_json(model, s.held.as_ref())
            )?;
            for (i, c) in s.coordinates.iter().enumerate() {
                if i > 0 {
                    w.write_all(b",")?;
                }
                write!(
                    w,
                    "\n{{\"node\":{},\"axis\":{},\"d_utilization\":{},\"d_deflection\":{}}}",
                    string(&model.nodes[c.node].id),
                    string(axis(c.axis)),
                    num(c.d_utilization * du),
                    num(c.d_deflection * dd)
                )?;
            }
            w.write_all(b"\n]}\n")
        }
        Format::Text => {
            writeln!(w, "{}: geometry sensitivity (adjoint)", model.title)?;
            writeln!(w, "{CAUTION}")?;
            writeln!(
                w,
                "governing utilization {} of member {} under {}; greatest deflection {} {} at {} under {}",
                sig(s.utilization, 4),
                model.members[s.member].id,
                effect,
                sig(s.deflection / sc.disp, 4),
                sc.disp_name,
                model.nodes[s.deflection_node].id,
                model.cases[s.deflection_case].id
            )?;
            if let Some(h) = &s.held {
                writeln!(w, "{}", held_text(model, h))?;
            }
            writeln!(
                w,
                "\nmoves that lower the governing utilization most, per {} moved:",
                sc.length_name
            )?;
            for c in best_moves(s).into_iter().take(BEST_MOVES) {
                if c.d_utilization == 0.0 {
                    break;
                }
                writeln!(
                    w,
                    "  {:<18} utilization −{} per {}, deflection {:+} {} per {}",
                    move_name(model, c.node, c.axis, c.d_utilization),
                    sig(c.d_utilization.abs() * du, 3),
                    sc.length_name,
                    sig(-c.d_utilization.signum() * c.d_deflection * dd, 3),
                    sc.disp_name,
                    sc.length_name
                )?;
            }
            let mut t = Table::new(&[
                "node",
                "axis",
                &format!("dU/d{} per {}", "x", sc.length_name),
                &format!("d(defl)/dx {}/{}", sc.disp_name, sc.length_name),
            ]);
            for c in &s.coordinates {
                t.row(vec![
                    model.nodes[c.node].id.clone(),
                    axis(c.axis).into(),
                    sig(c.d_utilization * du, 4),
                    sig(c.d_deflection * dd, 4),
                ]);
            }
            writeln!(w)?;
            w.write_all(t.render().as_bytes())?;
            writeln!(
                w,
                "the governing check and deflection node are held fixed; a move large enough to change them leaves this linear estimate"
            )
        }
    }
}
