//! CSV reports of influence lines (one row per line and deck node) and of
//! moving-load envelopes (one row per moving load and member or support).

use super::csv::{field, num};
use super::Scale;
use crate::loads::{Extreme, InfluenceLines, MovingEnvelope};
use crate::model::Model;
use std::io::{self, Write};

/// `panelpoint influence --format csv`: `kind,id,node,chainage_<len>,value`
/// with kind `member`, `reaction_x` or `reaction_y`.
pub fn influence(
    w: &mut dyn Write,
    model: &Model,
    lines: &InfluenceLines,
    members: &[usize],
    supports: &[usize],
) -> io::Result<()> {
    let s = Scale::of(model);
    writeln!(w, "kind,id,node,chainage_{},value", s.length_name)?;
    let deck = &lines.deck;
    let mut row = |kind: &str, id: &str, values: &[f64]| -> io::Result<()> {
        for (k, v) in values.iter().enumerate() {
            writeln!(
                w,
                "{kind},{},{},{},{}",
                field(id),
                field(&model.nodes[deck.nodes[k]].id),
                num(deck.chainage[k] / s.length),
                num(*v)
            )?;
        }
        Ok(())
    };
    for &m in members {
        row("member", &model.members[m].id, lines.member(m))?;
    }
    for &sup in supports {
        let node = &model.nodes[model.supports[sup].node].id;
        row("reaction_x", node, &lines.reaction_x(sup))?;
        row("reaction_y", node, &lines.reaction_y(sup))?;
    }
    Ok(())
}

fn cells(e: &Extreme, s: &Scale) -> String {
    let (p, d) = match e.at {
        Some(p) => (num(p.position / s.length), p.direction.name()),
        None => (String::new(), ""),
    };
    format!(
        "{},{},{},{p},{d}",
        num(e.force / s.force),
        num(e.axles / s.force),
        num(e.lane / s.force)
    )
}

/// The train that gave `e` and its variable spacing (empty when none).
fn train_cells(e: &Extreme, v: Option<&crate::loads::Vehicle>, s: &Scale) -> String {
    match (e.at, v) {
        (Some(_), Some(v)) => format!(
            "{},{}",
            field(v.train_label(e.train)),
            e.gap.map_or(String::new(), |g| num(g / s.length))
        ),
        _ => ",".into(),
    }
}

/// `panelpoint envelope --format csv`: one row per moving load and member
/// (kind `member`) or support vertical reaction (kind `reaction_y`; the
/// "max" columns are then up, the "min" columns down).
pub fn envelopes(w: &mut dyn Write, model: &Model, envelopes: &[MovingEnvelope]) -> io::Result<()> {
    let s = Scale::of(model);
    writeln!(
        w,
        "moving_load,vehicle,impact,kind,id,dead_{f},max_{f},max_axles_{f},max_lane_{f},max_position_{l},max_direction,min_{f},min_axles_{f},min_lane_{f},min_position_{l},min_direction,max_train,max_variable_spacing_{l},min_train,min_variable_spacing_{l}",
        f = s.force_name,
        l = s.length_name
    )?;
    for env in envelopes {
        let head = format!(
            "{},{},{}",
            field(&env.moving_load),
            field(&env.vehicle),
            num(env.impact)
        );
        let v = model
            .live
            .moving
            .iter()
            .find(|m| m.id == env.moving_load)
            .map(|m| &model.live.vehicles[m.vehicle]);
        for m in &env.per_member {
            writeln!(
                w,
                "{head},member,{},{},{},{},{},{}",
                field(&m.id),
                num(m.dead / s.force),
                cells(&m.tension, &s),
                cells(&m.compression, &s),
                train_cells(&m.tension, v, &s),
                train_cells(&m.compression, v, &s)
            )?;
        }
        for r in &env.per_support {
            writeln!(
                w,
                "{head},reaction_y,{},{},{},{},{},{}",
                field(&r.node),
                num(r.dead / s.force),
                cells(&r.up, &s),
                cells(&r.down, &s),
                train_cells(&r.up, v, &s),
                train_cells(&r.down, v, &s)
            )?;
        }
    }
    Ok(())
}
