//! Text reports of influence lines (a table and a terminal sketch per
//! line) and of moving-load envelopes (a table per moving load).

use super::table::{sig, Table};
use super::text::header;
use super::Scale;
use crate::input::Diagnostic;
use crate::loads::{Extreme, InfluenceLines, MovingEnvelope};
use crate::model::Model;
use std::io::{self, Write};

/// Columns and rows of the terminal sketch of one influence line.
const SKETCH_WIDTH: usize = 61;
const SKETCH_HEIGHT: usize = 9;

/// Ordinates rounded so round-off shows as zero.
fn ordinate(v: f64) -> String {
    if v.abs() < 1e-9 {
        "0".into()
    } else {
        sig(v, 5)
    }
}

/// A character plot of the piecewise-linear line through `values` at the
/// deck chainages: `*` the line, `o` a deck node, `-` the zero axis.
pub fn sketch(lines: &InfluenceLines, values: &[f64]) -> Vec<String> {
    let deck = &lines.deck;
    let l = deck.length();
    let hi = values.iter().fold(0.0f64, |a, &b| a.max(b));
    let lo = values.iter().fold(0.0f64, |a, &b| a.min(b));
    let span = if hi - lo > 1e-12 { hi - lo } else { 1.0 };
    let row_of = |v: f64| (((hi - v) / span) * (SKETCH_HEIGHT - 1) as f64).round() as usize;
    let mut grid = vec![vec![' '; SKETCH_WIDTH]; SKETCH_HEIGHT];
    let zero = row_of(0.0).min(SKETCH_HEIGHT - 1);
    grid[zero].iter_mut().for_each(|c| *c = '-');
    let curve: Vec<usize> = (0..SKETCH_WIDTH)
        .map(|x| {
            let s = l * x as f64 / (SKETCH_WIDTH - 1) as f64;
            row_of(deck.interpolate(values, s)).min(SKETCH_HEIGHT - 1)
        })
        .collect();
    for (x, &r) in curve.iter().enumerate() {
        grid[r][x] = '*';
    }
    for (k, &c) in deck.chainage.iter().enumerate() {
        let x = ((c / l) * (SKETCH_WIDTH - 1) as f64).round() as usize;
        let r = row_of(values[k]).min(SKETCH_HEIGHT - 1);
        grid[r][x.min(SKETCH_WIDTH - 1)] = 'o';
    }
    let label = |r: usize| {
        if r == 0 {
            sig(hi, 3)
        } else if r == SKETCH_HEIGHT - 1 {
            sig(lo, 3)
        } else if r == zero {
            "0".into()
        } else {
            String::new()
        }
    };
    (0..SKETCH_HEIGHT)
        .map(|r| {
            let row: String = grid[r].iter().collect();
            format!("{:>9} |{}", label(r), row.trim_end())
        })
        .collect()
}

fn line_block(
    w: &mut dyn Write,
    model: &Model,
    lines: &InfluenceLines,
    title: &str,
    values: &[f64],
) -> io::Result<()> {
    let s = Scale::of(model);
    writeln!(w, "\n== {title} ==")?;
    let mut t = Table::new(&[
        "deck node",
        &format!("chainage {}", s.length_name),
        "ordinate",
    ]);
    for (k, &n) in lines.deck.nodes.iter().enumerate() {
        t.row(vec![
            model.nodes[n].id.clone(),
            sig(lines.deck.chainage[k] / s.length, 5),
            ordinate(values[k]),
        ]);
    }
    write!(w, "{}", t.render())?;
    for row in sketch(lines, values) {
        writeln!(w, "{row}")?;
    }
    Ok(())
}

/// `panelpoint influence` as text: the lines of `members` then the
/// vertical reactions of `supports` (indices into the model).
pub fn influence(
    w: &mut dyn Write,
    model: &Model,
    lines: &InfluenceLines,
    members: &[usize],
    supports: &[usize],
    warnings: &[Diagnostic],
) -> io::Result<()> {
    header(w, model, "influence", warnings, &[])?;
    let first = &model.nodes[lines.deck.nodes[0]].id;
    let last = &model.nodes[*lines.deck.nodes.last().unwrap()].id;
    writeln!(
        w,
        "Deck: {} nodes from \"{first}\" to \"{last}\"; ordinates are member force (tension +) or reaction (up +) per unit downward load, linear between deck nodes",
        lines.nd()
    )?;
    for &m in members {
        let title = format!("Member \"{}\"", model.members[m].id);
        line_block(w, model, lines, &title, lines.member(m))?;
    }
    for &s in supports {
        let node = &model.nodes[model.supports[s].node].id;
        line_block(
            w,
            model,
            lines,
            &format!("Reaction ry at \"{node}\""),
            &lines.reaction_y(s),
        )?;
    }
    Ok(())
}

fn at(e: &Extreme, s: &Scale) -> (String, String) {
    match e.at {
        Some(p) => (sig(p.position / s.length, 5), p.direction.name().into()),
        None => ("-".into(), "-".into()),
    }
}

/// Which train (and variable spacing, in the model's length unit) gave
/// extreme `e` of vehicle `v`; empty when no position gave it.
pub(super) fn governed_by(e: &Extreme, v: &crate::loads::Vehicle, s: &Scale) -> String {
    if e.at.is_none() {
        return "-".into();
    }
    let label = v.train_label(e.train);
    match e.gap {
        Some(g) => format!("{label}, spacing {}", sig(g / s.length, 4)),
        None => label.to_string(),
    }
}

fn force(v: f64, s: &Scale) -> String {
    if v.abs() < 1e-9 {
        "0".into()
    } else {
        sig(v / s.force, 5)
    }
}

/// `panelpoint envelope` as text.
pub fn envelopes(
    w: &mut dyn Write,
    model: &Model,
    envelopes: &[MovingEnvelope],
    warnings: &[Diagnostic],
) -> io::Result<()> {
    header(w, model, "envelope", warnings, &[])?;
    let s = Scale::of(model);
    writeln!(
        w,
        "Live forces include the dynamic allowance; tension +. Position = front-axle chainage along the deck; forward = first deck node to last."
    )?;
    for env in envelopes {
        writeln!(
            w,
            "\n== Moving load \"{}\": vehicle \"{}\", impact {}{} ==",
            env.moving_load,
            env.vehicle,
            sig(env.impact, 3),
            if env.impact_on_lane {
                " (lane too)"
            } else {
                ""
            }
        )?;
        if let Some(ml) = model.live.moving.iter().find(|m| m.id == env.moving_load) {
            if let Some(name) = &ml.model {
                if let Some(lib) = crate::loads::library::lookup(name) {
                    writeln!(
                        w,
                        "Load model {} ({}), share of the vehicle on this truss {}; source: {}",
                        lib.designation,
                        name,
                        sig(ml.share, 4),
                        lib.source
                    )?;
                }
            }
            if ml.impact_rule != crate::loads::ImpactRule::Fixed {
                writeln!(
                    w,
                    "Impact per member: {} (the value above is for the whole deck)",
                    ml.impact_rule.describe()
                )?;
            }
        }
        let (fl, ll) = (s.force_name, s.length_name);
        // A vehicle that chooses among trains or spacings names the one
        // that gave each extreme (design truck or tandem, rear spacing).
        let vehicle = model
            .live
            .moving
            .iter()
            .find(|m| m.id == env.moving_load)
            .map(|m| &model.live.vehicles[m.vehicle])
            .filter(|v| v.chooses_train());
        if vehicle.is_some() {
            writeln!(
                w,
                "Each extreme names the train that governed and, where the axle spacing varies, the spacing ({ll}) that gave it."
            )?;
        }
        let by = format!("train, spacing {ll}");
        let with_by = |mut head: Vec<String>| {
            if vehicle.is_some() {
                head.insert(5, by.clone());
                head.push(by.clone());
            }
            head
        };
        let heads = with_by(vec![
            "member".into(),
            format!("dead {fl}"),
            format!("max tension {fl}"),
            format!("at {ll}"),
            "dir".into(),
            format!("max compression {fl}"),
            format!("at {ll}"),
            "dir".into(),
        ]);
        let mut t = Table::new(&heads.iter().map(String::as_str).collect::<Vec<_>>());
        let row = |id: &str, dead: f64, a: &Extreme, b: &Extreme| {
            let (tp, td) = at(a, &s);
            let (cp, cd) = at(b, &s);
            let mut r = vec![
                id.to_string(),
                force(dead, &s),
                force(a.force, &s),
                tp,
                td,
                force(b.force, &s),
                cp,
                cd,
            ];
            if let Some(v) = vehicle {
                r.insert(5, governed_by(a, v, &s));
                r.push(governed_by(b, v, &s));
            }
            r
        };
        for m in &env.per_member {
            t.row(row(&m.id, m.dead, &m.tension, &m.compression));
        }
        write!(w, "{}", t.render())?;
        writeln!(w)?;
        let heads = with_by(vec![
            "support".into(),
            format!("dead ry {fl}"),
            format!("max up {fl}"),
            format!("at {ll}"),
            "dir".into(),
            format!("max down {fl}"),
            format!("at {ll}"),
            "dir".into(),
        ]);
        let mut t = Table::new(&heads.iter().map(String::as_str).collect::<Vec<_>>());
        for r in &env.per_support {
            t.row(row(&r.node, r.dead, &r.up, &r.down));
        }
        write!(w, "{}", t.render())?;
    }
    Ok(())
}
