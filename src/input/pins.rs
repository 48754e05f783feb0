//! The model's optional `pins` list: the pins of a pin-connected truss and
//! the stack of bars on each, in order along the pin (see
//! `joint/pin/` for the checks and docs/pins.md).
//!
//! ```ron
//! pins: [(
//!     node: "L3", diameter: "6 in", fy: "36 ksi",   // or material: "pin steel"
//!     stack: [
//!         (member: "L2-L3", thickness: "1.5 in",    // position: mid-thickness,
//!          eyebar: (body: "6 in", head: "15 in", beyond: "5 in", hole: "6.03 in")),
//!         (member: "U3-L3", thickness: "0.5 in", plate: "pin plate",
//!          width: "12 in", beyond: "4 in", hole: "6.03 in"),
//!         (load: "floor beam hanger", thickness: "1 in", gap: "0.25 in"),
//!         ...
//!     ],
//!     factors: (sharing: 1.10, interaction_limit: 0.95), // all optional
//! )]
//! ```
//!
//! Lengths without a unit are in the section unit. `position` is the
//! bar's mid-thickness from any reference on the pin; without it a bar sits
//! against the one before (after `gap`), the first at 0. A `member` bar
//! carries a share of that member's force (by thickness among the member's
//! bars on the pin); a `load` bar a share of the force balancing the members
//! (the node's applied load or support). Validation: the member meets the
//! node; bars do not overlap; a member with `bars: N` has N bars on the
//! pin; each member's bars (and the load bars) are centred on one plane (a
//! plane truss loads the pin symmetrically, else the pin is not in
//! equilibrium); a node with applied loads, a support or on the deck has a
//! load bar.

use super::convert::{shown, Ctx, IdMap};
use super::quantity::Quantity;
use crate::joint::pin::{Bar, BarKind, Carrier, EyebarHead, Factors, Pin};
use crate::model::{LoadCase, Material, Member};
use crate::units::{plain, Dimension, DisplayUnits};
use serde::Deserialize;

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PinFile {
    pub node: String,
    pub diameter: Quantity,
    #[serde(default)]
    pub fy: Option<Quantity>,
    #[serde(default)]
    pub material: Option<String>,
    pub stack: Vec<StackFile>,
    #[serde(default)]
    pub factors: Option<FactorsFile>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct StackFile {
    #[serde(default)]
    pub member: Option<String>,
    #[serde(default)]
    pub load: Option<String>,
    pub thickness: Quantity,
    #[serde(default)]
    pub position: Option<Quantity>,
    #[serde(default)]
    pub gap: Option<Quantity>,
    #[serde(default)]
    pub eyebar: Option<EyebarFile>,
    /// A pin plate's name (e.g. "pin plate"), with its geometry at the hole.
    #[serde(default)]
    pub plate: Option<String>,
    #[serde(default)]
    pub width: Option<Quantity>,
    #[serde(default)]
    pub beyond: Option<Quantity>,
    #[serde(default)]
    pub hole: Option<Quantity>,
    /// The bar's yield stress (a load bar; a member bar takes its material's).
    #[serde(default)]
    pub fy: Option<Quantity>,
}

/// An eyebar's head: all four, or none (`eyebar: ()`).
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct EyebarFile {
    #[serde(default)]
    pub body: Option<Quantity>,
    #[serde(default)]
    pub head: Option<Quantity>,
    #[serde(default)]
    pub beyond: Option<Quantity>,
    #[serde(default)]
    pub hole: Option<Quantity>,
}

#[derive(Debug, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct FactorsFile {
    pub phi_flexure: Option<f64>,
    pub phi_shear: Option<f64>,
    pub phi_bearing: Option<f64>,
    pub interaction_limit: Option<f64>,
    pub bearing: Option<f64>,
    pub plate_bearing: Option<f64>,
    pub lfr_bearing: Option<f64>,
    pub allowable_bending: Option<f64>,
    pub allowable_shear: Option<f64>,
    pub allowable_bearing: Option<f64>,
    pub sharing: Option<f64>,
}

/// What the pins' validation needs of the rest of the model.
pub(super) struct Context<'a> {
    pub units: &'a DisplayUnits,
    pub node_ids: &'a IdMap<'a>,
    pub member_ids: &'a dyn Fn(&str) -> Option<usize>,
    pub members: &'a [Member],
    pub materials: &'a [Material],
    pub cases: &'a [LoadCase],
    pub supported: &'a [bool],
    pub deck: &'a [usize],
}

/// A length in the section unit (bare numbers) as m, positive or zero.
fn length(ctx: &mut Ctx, q: &Quantity, u: &DisplayUnits, what: &str, zero_ok: bool) -> Option<f64> {
    match q.to_si(Dimension::Length, u.section.to_si) {
        Ok(v) if v > 0.0 || (zero_ok && v == 0.0) => Some(v),
        Ok(_) => {
            ctx.error(
                format!("{what} must be positive, not {}", q.show_in(u.section.name)),
                None,
            );
            None
        }
        Err(e) => {
            ctx.error(format!("{what}: {e}"), None);
            None
        }
    }
}

fn factors(ctx: &mut Ctx, f: &Option<FactorsFile>, pin: &str) -> Factors {
    let mut out = Factors::default();
    let Some(f) = f else { return out };
    for (name, given, slot) in [
        ("phi_flexure", f.phi_flexure, &mut out.phi_flexure),
        ("phi_shear", f.phi_shear, &mut out.phi_shear),
        ("phi_bearing", f.phi_bearing, &mut out.phi_bearing),
        (
            "interaction_limit",
            f.interaction_limit,
            &mut out.interaction_limit,
        ),
        ("bearing", f.bearing, &mut out.bearing),
        ("plate_bearing", f.plate_bearing, &mut out.plate_bearing),
        ("lfr_bearing", f.lfr_bearing, &mut out.lfr_bearing),
        (
            "allowable_bending",
            f.allowable_bending,
            &mut out.allowable_bending,
        ),
        (
            "allowable_shear",
            f.allowable_shear,
            &mut out.allowable_shear,
        ),
        (
            "allowable_bearing",
            f.allowable_bearing,
            &mut out.allowable_bearing,
        ),
        ("sharing", f.sharing, &mut out.sharing),
    ] {
        match given {
            Some(v) if v.is_finite() && v > 0.0 && v <= 10.0 => *slot = v,
            Some(v) => ctx.error(
                format!("pin at node \"{pin}\" factors.{name} must be a positive number up to 10, not {v}"),
                None,
            ),
            None => {}
        }
    }
    if out.sharing < 1.0 {
        ctx.error(
            format!("pin at node \"{pin}\" factors.sharing must be at least 1 (the most loaded bar takes k·F/N), not {}", out.sharing),
            None,
        );
    }
    out
}

/// One stack entry as a bar (its position still to be placed).
fn bar(
    ctx: &mut Ctx,
    c: &Context,
    s: &StackFile,
    pin: &str,
    node: usize,
    i: usize,
) -> Option<(Bar, Option<f64>, f64)> {
    let u = c.units;
    let what = |f: &str| format!("pin at node \"{pin}\" stack bar {} {f}", i + 1);
    let t = length(ctx, &s.thickness, u, &what("thickness"), false);
    let position = s
        .position
        .as_ref()
        .map(|q| q.to_si(Dimension::Length, u.section.to_si));
    let position = match position {
        Some(Ok(v)) => Some(v),
        Some(Err(e)) => {
            ctx.error(format!("{}: {e}", what("position")), None);
            return None;
        }
        None => None,
    };
    let gap = match &s.gap {
        Some(q) => length(ctx, q, u, &what("gap"), true)?,
        None => 0.0,
    };
    let bar_fy = match &s.fy {
        Some(q) => super::convert::positive(ctx, q, Dimension::Stress, u, &what("fy"), None),
        None => None,
    };
    let (carrier, label, fy) = match (&s.member, &s.load) {
        (Some(m), None) => {
            let Some(k) = (c.member_ids)(m) else {
                ctx.error(
                    format!(
                        "{} refers to member \"{}\", which is not defined",
                        what("member"),
                        shown(m)
                    ),
                    None,
                );
                return None;
            };
            let mm = &c.members[k];
            if mm.start != node && mm.end != node {
                ctx.error(
                    format!(
                        "{}: member \"{}\" does not meet node \"{pin}\"",
                        what("member"),
                        shown(m)
                    ),
                    None,
                );
                return None;
            }
            (
                Carrier::Member(k),
                m.clone(),
                bar_fy.or(c.materials[mm.material].fy),
            )
        }
        (None, Some(l)) => (Carrier::Load, crate::textsafe::strip(l), bar_fy),
        _ => {
            ctx.error(
                format!("{}: give exactly one of member or load", what("")).replace("  ", " "),
                None,
            );
            return None;
        }
    };
    let kind = bar_kind(ctx, s, &carrier, u, &what)?;
    Some((
        Bar {
            carrier,
            label,
            kind,
            thickness: t?,
            position: 0.0,
            fy,
        },
        position,
        gap,
    ))
}

/// The form of a stack entry: an eyebar (its head all given or none), a
/// plate of a member with its geometry at the hole, or a plain bar.
fn bar_kind(
    ctx: &mut Ctx,
    s: &StackFile,
    carrier: &Carrier,
    u: &DisplayUnits,
    what: &dyn Fn(&str) -> String,
) -> Option<BarKind> {
    let opt = |ctx: &mut Ctx, q: &Option<Quantity>, f: &str| {
        q.as_ref().and_then(|q| length(ctx, q, u, &what(f), false))
    };
    let kind = match (&s.eyebar, &s.plate) {
        (Some(_), Some(_)) => {
            ctx.error(
                format!("{}: a bar is an eyebar or a plate, not both", what("")),
                None,
            );
            return None;
        }
        (Some(e), None) => {
            let b = opt(ctx, &e.body, "eyebar.body");
            let h = opt(ctx, &e.head, "eyebar.head");
            let a = opt(ctx, &e.beyond, "eyebar.beyond");
            let d = opt(ctx, &e.hole, "eyebar.hole");
            let given = [&e.body, &e.head, &e.beyond, &e.hole]
                .iter()
                .filter(|q| q.is_some())
                .count();
            if given != 0 && given != 4 {
                ctx.error(
                    format!(
                        "{}: give all of body, head, beyond and hole, or none",
                        what("eyebar")
                    ),
                    None,
                );
                return None;
            }
            match (b, h, a, d) {
                (Some(body), Some(head), Some(beyond), Some(hole)) => {
                    if head <= hole {
                        ctx.error(
                            format!("{}: the head must be wider than the hole", what("eyebar")),
                            None,
                        );
                        return None;
                    }
                    BarKind::Eyebar(Some(EyebarHead {
                        body,
                        head,
                        beyond,
                        hole,
                    }))
                }
                _ if given == 0 => BarKind::Eyebar(None),
                _ => return None,
            }
        }
        (None, Some(name)) => {
            if matches!(carrier, Carrier::Load) {
                ctx.error(
                    format!(
                        "{}: a pin plate belongs to a member; give member",
                        what("plate")
                    ),
                    None,
                );
                return None;
            }
            let width = opt(ctx, &s.width, "width");
            let hole = opt(ctx, &s.hole, "hole");
            if let (Some(w), Some(d)) = (width, hole) {
                if w <= d {
                    ctx.error(
                        format!("{}: the plate must be wider than the hole", what("width")),
                        None,
                    );
                    return None;
                }
            }
            BarKind::Plate {
                name: crate::textsafe::strip(name),
                width,
                beyond: opt(ctx, &s.beyond, "beyond"),
                hole,
            }
        }
        (None, None) => {
            if s.width.is_some() || s.beyond.is_some() || s.hole.is_some() {
                ctx.error(
                    format!(
                        "{}: width, beyond and hole describe a plate; give plate: \"name\"",
                        what("")
                    ),
                    None,
                );
                return None;
            }
            BarKind::Plain
        }
    };
    Some(kind)
}

/// The pins of the model, validated.
pub(super) fn convert(ctx: &mut Ctx, pins: &[PinFile], c: &Context) -> Vec<Pin> {
    let mut out = Vec::with_capacity(pins.len());
    let mut seen = Vec::new();
    for p in pins {
        let Some(&node) = c.node_ids.get(p.node.as_str()) else {
            ctx.error(
                format!(
                    "pin at node \"{}\": the node is not defined",
                    shown(&p.node)
                ),
                ctx.locate("node", &p.node, 0),
            );
            continue;
        };
        if seen.contains(&node) {
            ctx.error(format!("pin at node \"{}\" is given twice", p.node), None);
            continue;
        }
        seen.push(node);
        if let Some(pin) = one(ctx, p, node, c) {
            out.push(pin);
        }
    }
    out
}

fn one(ctx: &mut Ctx, p: &PinFile, node: usize, c: &Context) -> Option<Pin> {
    let u = c.units;
    let id = &p.node;
    let errors = ctx.errors.len();
    let diameter = length(
        ctx,
        &p.diameter,
        u,
        &format!("pin at node \"{id}\" diameter"),
        false,
    );
    let fy = match (&p.fy, &p.material) {
        (Some(q), None) => super::convert::positive(
            ctx,
            q,
            Dimension::Stress,
            u,
            &format!("pin at node \"{id}\" fy"),
            None,
        ),
        (None, Some(m)) => match c.materials.iter().find(|x| &x.id == m) {
            Some(mat) if mat.fy.is_some() => mat.fy,
            Some(_) => {
                ctx.error(
                    format!("pin at node \"{id}\" material \"{m}\" has no fy (nor year)"),
                    None,
                );
                None
            }
            None => {
                ctx.error(
                    format!(
                        "pin at node \"{id}\" refers to material \"{}\", which is not defined",
                        shown(m)
                    ),
                    None,
                );
                None
            }
        },
        _ => {
            ctx.error(
                format!(
                    "pin at node \"{id}\": give exactly one of fy or material for the pin's steel"
                ),
                None,
            );
            None
        }
    };
    let factors = factors(ctx, &p.factors, id);
    if p.stack.is_empty() {
        ctx.error(format!("pin at node \"{id}\" has an empty stack"), None);
        return None;
    }
    // Place the bars: given positions, or against the previous bar.
    let mut stack = Vec::with_capacity(p.stack.len());
    let mut face = 0.0;
    for (i, s) in p.stack.iter().enumerate() {
        let Some((mut b, position, gap)) = bar(ctx, c, s, id, node, i) else {
            continue;
        };
        b.position = position.unwrap_or(face + gap + b.thickness / 2.0);
        face = b.position + b.thickness / 2.0;
        stack.push(b);
    }
    if ctx.errors.len() > errors {
        return None;
    }
    let sec = |v: f64| format!("{} {}", plain(v / u.section.to_si), u.section.name);
    let (diameter, fy) = (diameter?, fy?);
    let tol = check_overlaps(ctx, &stack, id, &sec);
    if !stack
        .iter()
        .any(|b| matches!(b.carrier, Carrier::Member(_)))
    {
        ctx.error(
            format!("pin at node \"{id}\": the stack has no member's bar"),
            None,
        );
    }
    check_members(ctx, c, &stack, id, node);
    check_balance(ctx, &stack, id, tol, &sec);
    if ctx.errors.len() > errors {
        return None;
    }
    Some(Pin {
        node,
        diameter,
        fy,
        stack,
        factors,
    })
}

/// Bars overlapping along the pin, each pair named; the length tolerance
/// of the stack (1e-4 of its length) is returned for the balance check.
fn check_overlaps(ctx: &mut Ctx, stack: &[Bar], id: &str, sec: &dyn Fn(f64) -> String) -> f64 {
    let mut order: Vec<usize> = (0..stack.len()).collect();
    order.sort_by(|&a, &b| stack[a].position.total_cmp(&stack[b].position));
    let span = stack
        .iter()
        .map(|b| b.position + b.thickness / 2.0)
        .fold(f64::MIN, f64::max)
        - stack
            .iter()
            .map(|b| b.position - b.thickness / 2.0)
            .fold(f64::MAX, f64::min);
    let tol = 1e-4 * span + 1e-7;
    for w in order.windows(2) {
        let (a, b) = (&stack[w[0]], &stack[w[1]]);
        let overlap = (a.position + a.thickness / 2.0) - (b.position - b.thickness / 2.0);
        if overlap > tol {
            ctx.error(
                format!(
                    "pin at node \"{id}\": stack bars {} ({}) and {} ({}) overlap by {}",
                    w[0] + 1,
                    a.name(),
                    w[1] + 1,
                    b.name(),
                    sec(overlap)
                ),
                None,
            );
        }
    }
    tol
}

/// Bars per member against `bars: N`; a load bar where the node takes loads.
fn check_members(ctx: &mut Ctx, c: &Context, stack: &[Bar], id: &str, node: usize) {
    let mut members: Vec<usize> = stack
        .iter()
        .filter_map(|b| match b.carrier {
            Carrier::Member(m) => Some(m),
            Carrier::Load => None,
        })
        .collect();
    members.dedup();
    members.sort_unstable();
    members.dedup();
    for &m in &members {
        let n = stack
            .iter()
            .filter(|b| b.carrier == Carrier::Member(m))
            .count();
        let eyebars = stack
            .iter()
            .filter(|b| b.carrier == Carrier::Member(m) && matches!(b.kind, BarKind::Eyebar(_)))
            .count();
        let want = c.members[m].bars as usize;
        if want >= 2 && eyebars != want {
            ctx.error(
                format!(
                    "pin at node \"{id}\": member \"{}\" has bars: {want} but the stack holds {eyebars} of its eyebars ({n} of its bars in all)",
                    c.members[m].id
                ),
                None,
            );
        }
    }
    let has_load = stack.iter().any(|b| b.carrier == Carrier::Load);
    let loaded = c.cases.iter().find(|case| {
        case.nodal
            .iter()
            .any(|l| l.node == node && (l.fx != 0.0 || l.fy != 0.0))
    });
    let reason = if c.supported[node] {
        Some("it is supported".to_string())
    } else if let Some(case) = loaded {
        Some(format!("case \"{}\" loads it", case.id))
    } else if c.deck.contains(&node) {
        Some("it is on the deck line".to_string())
    } else {
        None
    };
    if let (Some(reason), false) = (reason, has_load) {
        ctx.error(
            format!("pin at node \"{id}\": {reason}, so its stack needs a load bar (load: \"...\") where that force enters the pin, or the pin is not in equilibrium"),
            None,
        );
    }
}

/// Every member's bars, and the load bars, centred on one plane.
fn check_balance(ctx: &mut Ctx, stack: &[Bar], id: &str, tol: f64, sec: &dyn Fn(f64) -> String) {
    let mut groups: Vec<(Carrier, f64, f64, String)> = Vec::new();
    for b in stack {
        match groups.iter_mut().find(|g| g.0 == b.carrier) {
            Some(g) => {
                g.1 += b.thickness * b.position;
                g.2 += b.thickness;
            }
            None => groups.push((
                b.carrier.clone(),
                b.thickness * b.position,
                b.thickness,
                b.label.clone(),
            )),
        }
    }
    let Some(first) = groups.first() else { return };
    let z0 = first.1 / first.2;
    for g in &groups[1..] {
        let z = g.1 / g.2;
        if (z - z0).abs() > tol {
            ctx.error(
                format!(
                    "pin at node \"{id}\": the bars of \"{}\" are centred at {} along the pin, those of \"{}\" at {}; a plane truss loads its pins symmetrically, so every member's bars (and the load bars) must be centred on one plane, or the pin is not in equilibrium",
                    first.3,
                    sec(z0),
                    g.3,
                    sec(z)
                ),
                None,
            );
        }
    }
}
