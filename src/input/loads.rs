//! Conversion of the optional load fields: self-weight, temperature and
//! lack of fit in a load case, and the model-level deck line, vehicles,
//! moving loads and dead-load cases. Called from `convert.rs`; every
//! problem names its load case, member, vehicle or moving load.

use super::convert::{positive, value, Ctx};
use super::diagnostics::{Diagnostic, Diagnostics, Severity};
use super::schema::{LoadCaseFile, ModelFile, VehiclesFile};
use crate::loads::{self_weight, thermal, Axle, Deck, ImpactRule, LiveLoads, MovingLoad, Vehicle};
use crate::model::{InitialElongation, LoadCase, Material, Member, Node, Section};
use crate::units::{Dimension, DisplayUnits};
use std::collections::HashMap;
use std::path::Path;

/// The parts of the model already converted that the loads need.
pub(super) struct Parts<'a> {
    pub units: &'a DisplayUnits,
    pub nodes: &'a [Node],
    pub members: &'a [Member],
    pub sections: &'a [Section],
    pub materials: &'a [Material],
    /// File index of each member id.
    pub member_ids: &'a super::convert::LazyIds<'a, super::schema::MemberFile>,
    /// Whether `members` lines up with the file (no member was rejected).
    pub members_ok: bool,
}

fn member_ref(ctx: &mut Ctx, p: &Parts, name: &str, field: &str, owner: &str) -> Option<usize> {
    match p.member_ids.get(name) {
        Some(i) if p.members_ok => Some(i),
        Some(_) => None,
        None => {
            let at = ctx.loc.field("member", name, 0);
            ctx.error(
                format!("{owner} refers to member \"{name}\", which is not defined ({field})"),
                at,
            );
            None
        }
    }
}

fn member_length(p: &Parts, m: usize) -> f64 {
    let mem = &p.members[m];
    let (a, b) = (&p.nodes[mem.start], &p.nodes[mem.end]);
    (b.x - a.x).hypot(b.y - a.y)
}

/// Self-weight, temperature and lack of fit of one load case, appended to
/// `case` as nodal loads and initial elongations.
pub(super) fn case_loads(ctx: &mut Ctx, c: &LoadCaseFile, case: &mut LoadCase, p: &Parts) {
    let u = p.units;
    if let Some(factor) = c.self_weight {
        if !(factor.is_finite() && factor > 0.0) {
            ctx.error(
                format!(
                    "case \"{}\": self_weight factor must be a positive number, not {factor}",
                    c.id
                ),
                None,
            );
        } else if p.members_ok {
            if factor < 1.0 {
                ctx.warn(
                    format!("case \"{}\": self_weight factor {factor} is below 1; connection material usually adds a few per cent", c.id),
                    None,
                );
            }
            match self_weight::self_weight_loads(
                p.nodes,
                p.members,
                p.sections,
                p.materials,
                factor,
            ) {
                Ok(loads) => case.nodal.extend(loads),
                Err(missing) => {
                    for (mat, m) in missing {
                        let at = ctx.loc.field("id", &p.materials[mat].id, 0);
                        ctx.error(
                            format!(
                                "case \"{}\": self_weight needs the density of material \"{}\" (used by member \"{}\"); add `density: \"490 pcf\"` or similar",
                                c.id, p.materials[mat].id, p.members[m].id
                            ),
                            at,
                        );
                    }
                }
            }
        }
    }

    // Temperature: one change per member, the per-member entry replacing
    // the uniform one.
    let mut change: Vec<Option<f64>> = vec![None; p.members.len()];
    if let Some(q) = &c.temperature_all {
        let what = format!("case \"{}\" temperature_all", c.id);
        if let Some(t) = value(ctx, q, Dimension::Temperature, u, &what, None) {
            change.iter_mut().for_each(|v| *v = Some(t));
        }
    }
    let mut given = vec![false; p.members.len()];
    for t in &c.temperature {
        let owner = format!("a temperature change in case \"{}\"", c.id);
        let Some(m) = member_ref(ctx, p, &t.member, "temperature", &owner) else {
            continue;
        };
        if std::mem::replace(&mut given[m], true) {
            let at = ctx.loc.field("member", &t.member, 0);
            ctx.error(
                format!(
                    "case \"{}\" gives member \"{}\" more than one temperature change",
                    c.id, t.member
                ),
                at,
            );
            continue;
        }
        let what = format!("case \"{}\" temperature of member \"{}\"", c.id, t.member);
        if let Some(v) = value(ctx, &t.change, Dimension::Temperature, u, &what, None) {
            change[m] = Some(v);
        }
    }
    let mut elongation = vec![0.0; p.members.len()];
    let mut no_alpha: Vec<usize> = Vec::new();
    for (m, t) in change.iter().enumerate() {
        let Some(t) = *t else { continue };
        if t == 0.0 {
            continue;
        }
        let mat = p.members[m].material;
        match p.materials[mat].alpha {
            Some(alpha) => {
                elongation[m] += thermal::thermal_elongation(alpha, t, member_length(p, m))
            }
            None if !no_alpha.contains(&mat) => {
                no_alpha.push(mat);
                let at = ctx.loc.field("id", &p.materials[mat].id, 0);
                ctx.error(
                    format!(
                        "case \"{}\": the temperature change of member \"{}\" needs the thermal expansion coefficient of material \"{}\"; add `alpha: \"6.5e-6 /F\"` or similar",
                        c.id, p.members[m].id, p.materials[mat].id
                    ),
                    at,
                );
            }
            None => {}
        }
    }

    // Lack of fit, in the section (displacement) unit.
    let mut fitted = vec![false; p.members.len()];
    for l in &c.lack_of_fit {
        let owner = format!("a lack of fit in case \"{}\"", c.id);
        let Some(m) = member_ref(ctx, p, &l.member, "lack_of_fit", &owner) else {
            continue;
        };
        if std::mem::replace(&mut fitted[m], true) {
            let at = ctx.loc.field("member", &l.member, 0);
            ctx.error(
                format!(
                    "case \"{}\" gives member \"{}\" more than one lack of fit",
                    c.id, l.member
                ),
                at,
            );
            continue;
        }
        let what = format!("case \"{}\" lack of fit of member \"{}\"", c.id, l.member);
        if let Ok(e) = l
            .elongation
            .to_si(Dimension::Length, u.section.to_si)
            .map_err(|e| ctx.error(format!("{what}: {e}"), None))
        {
            if e.abs() >= 0.5 * member_length(p, m) {
                ctx.error(
                    format!(
                        "{what}: {} is not small beside the member's length",
                        l.elongation.show()
                    ),
                    None,
                );
            }
            elongation[m] += e;
        }
    }
    for (member, &e) in elongation.iter().enumerate() {
        if e != 0.0 {
            case.elongations.push(InitialElongation {
                member,
                elongation: e,
            });
        }
    }
}

/// The deck line, vehicles, moving loads and dead-load cases.
pub(super) fn live_loads(
    ctx: &mut Ctx,
    file: &ModelFile,
    p: &Parts,
    node_ids: &super::convert::IdMap,
    carries: &[bool],
) -> LiveLoads {
    let u = p.units;
    let mut live = LiveLoads::default();

    // Deck.
    let mut deck_ok = true;
    for id in file.deck.nodes() {
        match node_ids.get(id.as_str()) {
            Some(&i) if carries.get(i) == Some(&true) => live.deck.push(i),
            Some(_) => {
                deck_ok = false;
                let at = ctx.loc.field("deck", id, 0);
                ctx.error(
                    format!(
                        "deck node \"{id}\" has no member and no support, so it cannot carry load"
                    ),
                    at,
                );
            }
            None => {
                deck_ok = false;
                ctx.error(
                    format!("the deck refers to node \"{id}\", which is not defined"),
                    None,
                );
            }
        }
    }
    let mut deck_length = None;
    if deck_ok && !file.deck.nodes().is_empty() && ctx.errors.is_empty() {
        match Deck::from_nodes(p.nodes, &live.deck) {
            Ok(d) => deck_length = Some(d.length()),
            Err(e) => ctx.error(format!("deck: {e}"), None),
        }
    }
    let layout = super::library::layout(ctx, &file.deck, u);

    // Vehicles.
    let mut vehicle_ids: HashMap<&str, usize> = HashMap::new();
    for (i, v) in file.vehicles.iter().enumerate() {
        let at = ctx.loc.field("id", &v.id, 0);
        if v.id.trim().is_empty() {
            ctx.error(format!("vehicle number {} has an empty id", i + 1), None);
        } else if crate::textsafe::has_unsafe(&v.id) {
            ctx.error(
                format!(
                    "vehicle number {} id \"{}\" contains a control character or a bidirectional mark; ids must print on one line as written",
                    i + 1,
                    v.id.escape_debug()
                ),
                None,
            );
        } else if vehicle_ids.insert(&v.id, i).is_some() {
            ctx.error(format!("duplicate vehicle id \"{}\"", v.id), at);
        }
        let mut axles = Vec::with_capacity(v.axles.len());
        let mut offset = 0.0;
        for (n, a) in v.axles.iter().enumerate() {
            let what = format!("vehicle \"{}\" axle {}", v.id, n + 1);
            let load = positive(
                ctx,
                &a.load,
                Dimension::Force,
                u,
                &format!("{what} load"),
                at,
            );
            let spacing = match &a.spacing {
                None => Some(0.0),
                Some(q) => value(ctx, q, Dimension::Length, u, &format!("{what} spacing"), at),
            };
            if let Some(s) = spacing {
                if n == 0 && s != 0.0 {
                    ctx.error(
                        format!("{what} spacing must be 0: the spacing is the distance behind the axle in front, and the first axle has none"),
                        at,
                    );
                } else if s < 0.0 {
                    ctx.error(format!("{what} spacing must not be negative"), at);
                }
                offset += s.max(0.0);
            }
            if let Some(load) = load {
                axles.push(Axle { load, offset });
            }
        }
        let lane = v.lane.as_ref().and_then(|q| {
            positive(
                ctx,
                q,
                Dimension::ForcePerLength,
                u,
                &format!("vehicle \"{}\" lane", v.id),
                at,
            )
        });
        if v.axles.is_empty() && v.lane.is_none() {
            ctx.error(
                format!("vehicle \"{}\" has neither axles nor a lane load", v.id),
                at,
            );
        }
        live.vehicles.push(Vehicle {
            id: v.id.clone(),
            axles,
            lane,
            ..Vehicle::default()
        });
    }

    live.user_vehicles = live.vehicles.len();
    live.layout = layout.clone();

    // Moving loads.
    let mut seen: HashMap<&str, ()> = HashMap::new();
    for ml in &file.moving_loads {
        let at = ctx.loc.field("id", &ml.id, 0);
        let who = format!("moving load \"{}\"", ml.id);
        if crate::textsafe::has_unsafe(&ml.id) {
            ctx.error(
                format!(
                    "moving load id \"{}\" contains a control character or a bidirectional mark; ids must print on one line as written",
                    ml.id.escape_debug()
                ),
                None,
            );
        }
        if seen.insert(&ml.id, ()).is_some() {
            ctx.error(format!("duplicate moving load id \"{}\"", ml.id), at);
        }
        let mut resolved = None;
        let vehicle = match vehicle_ids.get(ml.vehicle.as_str()) {
            Some(&v) => Some(v),
            None if crate::loads::library::lookup(&ml.vehicle).is_some() => {
                resolved = super::library::resolve(ctx, ml, &layout, deck_length, at);
                resolved.as_ref().map(|r| {
                    live.vehicles.push(r.vehicle.clone());
                    live.vehicles.len() - 1
                })
            }
            None => {
                let at = ctx.loc.field("vehicle", &ml.vehicle, 0);
                ctx.error(
                        format!(
                        "{who} refers to vehicle \"{}\", which is neither defined nor a library model (`panelpoint vehicles` lists them)",
                        ml.vehicle
                    ),
                    at,
                );
                None
            }
        };
        let step = positive(
            ctx,
            &ml.step,
            Dimension::Length,
            u,
            &format!("{who} step"),
            at,
        );
        let impact = ml
            .impact
            .unwrap_or_else(|| resolved.as_ref().map_or(0.0, |r| r.impact));
        if !(impact.is_finite() && (0.0..=super::MAX_IMPACT).contains(&impact)) {
            ctx.error(
                format!(
                    "{who} impact must be a fraction from 0 to {} (0.10 for 10 %), not {impact:?}",
                    super::MAX_IMPACT
                ),
                at,
            );
        } else if impact > 1.0 {
            ctx.warn(
                format!("{who} impact {impact} is more than 100 %; impact is a fraction (0.10 for 10 %)"),
                at,
            );
        }
        // A user's vehicle takes its `scale` and, on a deck with lanes or
        // wheel lines, its lever-rule share (no multiple-presence factor):
        // a scaled copy, so other moving loads of the vehicle are unchanged.
        let mut user_share = 1.0;
        let vehicle = match (vehicle, &resolved) {
            (Some(v), None) => {
                let scale = super::library::scale(ctx, ml, at).unwrap_or(1.0);
                user_share = layout.as_ref().map_or(1.0, |l| {
                    l.vehicle_share(crate::loads::library::Presence::None).0
                });
                if scale * user_share != 1.0 {
                    let copy = live.vehicles[v].scaled(scale * user_share);
                    live.vehicles.push(copy);
                    Some(live.vehicles.len() - 1)
                } else {
                    Some(v)
                }
            }
            (v, _) => v,
        };
        if let (Some(vehicle), Some(step)) = (vehicle, step) {
            live.moving.push(MovingLoad {
                id: ml.id.clone(),
                vehicle,
                step,
                impact,
                impact_on_lane: ml
                    .impact_on_lane
                    .unwrap_or_else(|| resolved.as_ref().is_some_and(|r| r.impact_on_lane)),
                impact_rule: match (&resolved, ml.impact) {
                    (Some(r), None) => r.rule,
                    _ => ImpactRule::Fixed,
                },
                model: resolved.as_ref().map(|r| r.name.clone()),
                share: resolved.as_ref().map_or(user_share, |r| r.share),
                legal: ml
                    .legal
                    .unwrap_or_else(|| resolved.as_ref().is_some_and(|r| r.legal)),
                scale: ml.scale.unwrap_or(1.0),
                impact_given: ml.impact.is_some(),
            });
        }
    }
    if !file.moving_loads.is_empty() && file.deck.nodes().is_empty() {
        ctx.error(
            "moving loads need a deck line: add `deck: [\"L0\", \"L1\", ...]`, the panel points in order".into(),
            None,
        );
    }

    // Dead-load cases.
    let case_ids: HashMap<&str, usize> = file
        .load_cases
        .iter()
        .enumerate()
        .map(|(i, c)| (c.id.as_str(), i))
        .collect();
    for id in &file.dead_cases {
        match case_ids.get(id.as_str()) {
            Some(&i) if !live.dead_cases.contains(&i) => live.dead_cases.push(i),
            Some(_) => ctx.error(format!("dead_cases lists case \"{id}\" twice"), None),
            None => ctx.error(
                format!("dead_cases refers to load case \"{id}\", which is not defined"),
                None,
            ),
        }
    }
    live
}

fn single(message: String) -> Diagnostics {
    Diagnostics {
        errors: vec![Diagnostic {
            severity: Severity::Error,
            message,
            location: None,
        }],
    }
}

static ALLOW_OUTSIDE: std::sync::atomic::AtomicBool = std::sync::atomic::AtomicBool::new(false);

/// Let a model's `vehicles_file` name a file outside the model's folder
/// (the CLI's `--allow-outside-files`; off by default, issue 22 item 8).
pub fn allow_outside_files(on: bool) {
    ALLOW_OUTSIDE.store(on, std::sync::atomic::Ordering::Relaxed);
}

/// Where `vehicles_file` `name` is: relative to `dir` (the model file's
/// folder, or the current folder), and inside it (symlinks resolved) unless
/// [`allow_outside_files`] was set.
fn vehicles_path(name: &str, dir: Option<&Path>) -> Result<std::path::PathBuf, Diagnostics> {
    let dir = match dir {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => std::path::PathBuf::from("."),
    };
    let path = dir.join(name);
    let cannot = |e: std::io::Error| {
        single(format!(
            "vehicles_file \"{name}\": cannot read {}: {e}",
            path.display()
        ))
    };
    if ALLOW_OUTSIDE.load(std::sync::atomic::Ordering::Relaxed) {
        return Ok(path);
    }
    let real_dir = std::fs::canonicalize(&dir).map_err(cannot)?;
    let real = std::fs::canonicalize(&path).map_err(cannot)?;
    if !real.starts_with(&real_dir) {
        return Err(single(format!(
            "vehicles_file \"{name}\" is outside the model's folder ({}); a model reads files only \
             from its own folder and below (pass --allow-outside-files to allow it)",
            real_dir.display()
        )));
    }
    Ok(path)
}

/// A RON error without any text of the file: a file that is not a vehicles
/// file (say `/etc/shadow`) must not be quoted in the message. Everything
/// between quotes or backticks in the parser's message is left out.
fn redacted(code: &str) -> String {
    let mut out = String::with_capacity(code.len());
    let mut inside: Option<char> = None;
    for c in code.chars() {
        match inside {
            Some(q) if c == q => {
                inside = None;
                out.push('…');
                out.push(c);
            }
            Some(_) => {}
            None if c == '`' || c == '"' || c == '\'' => {
                inside = Some(c);
                out.push(c);
            }
            None => out.push(c),
        }
    }
    out
}

/// Read `vehicles_file` (see [`vehicles_path`]) with the bounds of
/// [`super::file`] and append its vehicles to the model's own.
pub(super) fn merge_vehicles_file(
    file: &mut ModelFile,
    dir: Option<&Path>,
) -> Result<Option<std::path::PathBuf>, Diagnostics> {
    let Some(name) = file.vehicles_file.clone() else {
        return Ok(None);
    };
    let path = vehicles_path(&name, dir)?;
    let bytes = super::file::read_bounded(&path).map_err(|e| {
        single(format!(
            "vehicles_file \"{name}\": cannot read {}: {e}",
            path.display()
        ))
    })?;
    let text = String::from_utf8(bytes).map_err(|e| {
        single(format!(
            "vehicles_file \"{name}\": not UTF-8 text (bad byte at offset {})",
            e.utf8_error().valid_up_to()
        ))
    })?;
    let options = ron::Options::default()
        .with_default_extension(ron::extensions::Extensions::IMPLICIT_SOME)
        .with_recursion_limit(64);
    let more: VehiclesFile = super::syntax::read(&options, &text).map_err(|mut d| {
        for e in &mut d.errors {
            if let Some((line, col)) = e.location.take() {
                e.message = format!(
                    "vehicles_file \"{name}\": line {line}, column {col}: {} (not a vehicles file?)",
                    redacted(&e.message)
                );
            } else {
                e.message = format!("vehicles_file \"{name}\": {}", redacted(&e.message));
            }
        }
        d
    })?;
    file.vehicles.extend(more.vehicles);
    Ok(Some(path))
}
