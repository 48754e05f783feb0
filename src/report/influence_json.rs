//! JSON reports of influence lines and moving-load envelopes. Lengths are
//! in the model's length unit and forces in its force unit; ordinates are
//! dimensionless (force per unit load).

use super::json::{num, string, write_header};
use super::Scale;
use crate::input::Diagnostic;
use crate::loads::{Extreme, InfluenceLines, MovingEnvelope};
use crate::model::Model;
use std::io::{self, Write};

/// `panelpoint influence --format json`:
/// `{..header.., "deck": [{"node","chainage"}], "lines": [{"member": id,
/// "ordinates": [{"node","chainage","value"}]}, {"reaction": node,
/// "ordinates": [{"node","chainage","rx","ry"}]}]}`.
pub fn influence(
    w: &mut dyn Write,
    model: &Model,
    lines: &InfluenceLines,
    members: &[usize],
    supports: &[usize],
    warnings: &[Diagnostic],
) -> io::Result<()> {
    let s = Scale::of(model);
    write_header(w, model, warnings, &[])?;
    let deck = &lines.deck;
    w.write_all(b",\"deck\":[")?;
    for (k, &n) in deck.nodes.iter().enumerate() {
        if k > 0 {
            w.write_all(b",")?;
        }
        write!(
            w,
            "{{\"node\":{},\"chainage\":{}}}",
            string(&model.nodes[n].id),
            num(deck.chainage[k] / s.length)
        )?;
    }
    w.write_all(b"],\"lines\":[")?;
    let mut first = true;
    for &m in members {
        if !std::mem::take(&mut first) {
            w.write_all(b",")?;
        }
        write!(
            w,
            "{{\"member\":{},\"ordinates\":[",
            string(&model.members[m].id)
        )?;
        for (k, v) in lines.member(m).iter().enumerate() {
            if k > 0 {
                w.write_all(b",")?;
            }
            write!(
                w,
                "{{\"node\":{},\"chainage\":{},\"value\":{}}}",
                string(&model.nodes[deck.nodes[k]].id),
                num(deck.chainage[k] / s.length),
                num(*v)
            )?;
        }
        w.write_all(b"]}")?;
    }
    for &sup in supports {
        if !std::mem::take(&mut first) {
            w.write_all(b",")?;
        }
        let node = &model.nodes[model.supports[sup].node].id;
        write!(w, "{{\"reaction\":{},\"ordinates\":[", string(node))?;
        let (rx, ry) = (lines.reaction_x(sup), lines.reaction_y(sup));
        for k in 0..lines.nd() {
            if k > 0 {
                w.write_all(b",")?;
            }
            write!(
                w,
                "{{\"node\":{},\"chainage\":{},\"rx\":{},\"ry\":{}}}",
                string(&model.nodes[deck.nodes[k]].id),
                num(deck.chainage[k] / s.length),
                num(rx[k]),
                num(ry[k])
            )?;
        }
        w.write_all(b"]}")?;
    }
    w.write_all(b"]}\n")
}

fn extreme(
    w: &mut dyn Write,
    name: &str,
    e: &Extreme,
    v: Option<&crate::loads::Vehicle>,
    s: &Scale,
) -> io::Result<()> {
    let (position, direction) = match e.at {
        Some(p) => (num(p.position / s.length), string(p.direction.name())),
        None => ("null".into(), "null".into()),
    };
    // The train that governed (its name) and the variable spacing used.
    let (train, spacing) = match (e.at, v) {
        (Some(_), Some(v)) => (
            string(v.train_label(e.train)),
            e.gap.map_or("null".into(), |g| num(g / s.length)),
        ),
        _ => ("null".into(), "null".into()),
    };
    write!(
        w,
        "\"{name}\":{{\"force\":{},\"axles\":{},\"lane\":{},\"position\":{position},\"direction\":{direction},\"train\":{train},\"variable_spacing\":{spacing}}}",
        num(e.force / s.force),
        num(e.axles / s.force),
        num(e.lane / s.force)
    )
}

/// `panelpoint envelope --format json`: `{..header.., "envelopes":
/// [{"moving_load","vehicle","impact","impact_on_lane","members": [{"id",
/// "dead","tension": {"force","axles","lane","position","direction","train",
/// "variable_spacing"},
/// "compression": {..}}], "supports": [{"node","dead","up","down"}]}]}`.
pub fn envelopes(
    w: &mut dyn Write,
    model: &Model,
    envelopes: &[MovingEnvelope],
    warnings: &[Diagnostic],
) -> io::Result<()> {
    let s = Scale::of(model);
    write_header(w, model, warnings, &[])?;
    w.write_all(b",\"envelopes\":[")?;
    for (i, env) in envelopes.iter().enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        let v = model
            .live
            .moving
            .iter()
            .find(|m| m.id == env.moving_load)
            .map(|m| &model.live.vehicles[m.vehicle]);
        write!(
            w,
            "{{\"moving_load\":{},\"vehicle\":{},\"impact\":{},\"impact_on_lane\":{},\"members\":[",
            string(&env.moving_load),
            string(&env.vehicle),
            num(env.impact),
            env.impact_on_lane
        )?;
        for (j, m) in env.per_member.iter().enumerate() {
            if j > 0 {
                w.write_all(b",")?;
            }
            write!(
                w,
                "{{\"id\":{},\"dead\":{},",
                string(&m.id),
                num(m.dead / s.force)
            )?;
            extreme(w, "tension", &m.tension, v, &s)?;
            w.write_all(b",")?;
            extreme(w, "compression", &m.compression, v, &s)?;
            w.write_all(b"}")?;
        }
        w.write_all(b"],\"supports\":[")?;
        for (j, r) in env.per_support.iter().enumerate() {
            if j > 0 {
                w.write_all(b",")?;
            }
            write!(
                w,
                "{{\"node\":{},\"dead\":{},",
                string(&r.node),
                num(r.dead / s.force)
            )?;
            extreme(w, "up", &r.up, v, &s)?;
            w.write_all(b",")?;
            extreme(w, "down", &r.down, v, &s)?;
            w.write_all(b"}")?;
        }
        w.write_all(b"]}")?;
    }
    w.write_all(b"]}\n")
}
