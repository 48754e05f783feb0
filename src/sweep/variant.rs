//! Applying a variant's changes to a copy of the base model, and saying
//! what they alter: loads only (same K), stiffness only (same pattern of
//! K), or connectivity (a new pattern).

use super::{Change, DepthNodes, Variant};
use crate::model::{LoadCase, Model, NodalLoad};

/// What a variant changes, weakest first.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Kind {
    /// Loads only: the base factorization serves.
    LoadsOnly,
    /// Member stiffness or geometry, not connectivity: the base symbolic
    /// analysis serves.
    Stiffness,
    /// Members removed: a new symbolic analysis.
    Topology,
}

#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum VariantError {
    #[error("no {what} \"{id}\" in the model")]
    Unknown { what: &'static str, id: String },
    #[error("{0}")]
    Invalid(String),
}

fn find<T>(
    items: &[T],
    id: &str,
    what: &'static str,
    key: impl Fn(&T) -> &str,
) -> Result<usize, VariantError> {
    items
        .iter()
        .position(|t| key(t) == id)
        .ok_or_else(|| VariantError::Unknown {
            what,
            id: id.to_string(),
        })
}

pub fn node_index(model: &Model, id: &str) -> Result<usize, VariantError> {
    find(&model.nodes, id, "node", |n| &n.id)
}

pub fn member_index(model: &Model, id: &str) -> Result<usize, VariantError> {
    find(&model.members, id, "member", |m| &m.id)
}

fn positive(what: &str, v: Option<f64>) -> Result<(), VariantError> {
    match v {
        Some(x) if !(x.is_finite() && x > 0.0) => Err(VariantError::Invalid(format!(
            "{what} must be a positive number, got {x}"
        ))),
        _ => Ok(()),
    }
}

/// The base model with the variant's changes applied in order.
pub fn apply(base: &Model, variant: &Variant) -> Result<Model, VariantError> {
    let mut m = base.clone();
    // A new vehicle first, so that a scale or impact of the same variant
    // acts on it whatever the order of the axes.
    let (vehicles, others): (Vec<&Change>, Vec<&Change>) = variant
        .changes
        .iter()
        .partition(|c| matches!(c, Change::Vehicle { .. }));
    for change in vehicles.into_iter().chain(others) {
        apply_one(&mut m, change)?;
    }
    check_geometry(&m)?;
    Ok(m)
}

fn apply_one(m: &mut Model, change: &Change) -> Result<(), VariantError> {
    match change {
        Change::ScaleCase { case, factor } => {
            let c = find(&m.cases, case, "load case", |c| &c.id)?;
            let case = &mut m.cases[c];
            for l in &mut case.nodal {
                l.fx *= factor;
                l.fy *= factor;
            }
            for s in &mut case.settlements {
                s.dx *= factor;
                s.dy *= factor;
            }
            for e in &mut case.elongations {
                e.elongation *= factor;
            }
        }
        Change::ScaleMoving { moving, factor } => {
            let k = find(&m.live.moving, moving, "moving load", |x| &x.id)?;
            let mut vehicle = m.live.vehicles[m.live.moving[k].vehicle].clone();
            for a in &mut vehicle.axles {
                a.load *= factor;
            }
            if let Some(w) = &mut vehicle.lane {
                *w *= factor;
            }
            m.live.vehicles.push(vehicle);
            m.live.moving[k].vehicle = m.live.vehicles.len() - 1;
        }
        Change::Vehicle { moving, choice } => {
            let k = find(&m.live.moving, moving, "moving load", |x| &x.id)?;
            m.live.vehicles.push(choice.vehicle.clone());
            let ml = &mut m.live.moving[k];
            ml.vehicle = m.live.vehicles.len() - 1;
            if let Some((impact, rule, on_lane)) = choice.impact {
                ml.impact = impact;
                ml.impact_rule = rule;
                ml.impact_on_lane = on_lane;
            }
            ml.model = choice.model.clone();
            ml.share = choice.share;
            if let Some(legal) = choice.legal {
                ml.legal = legal;
            }
        }
        Change::Impact { load, impact } => {
            if !(impact.is_finite() && *impact >= 0.0) {
                return Err(VariantError::Invalid(format!(
                    "impact of \"{load}\" must be a fraction ≥ 0, got {impact}"
                )));
            }
            if let Some(k) = m.live.moving.iter().position(|x| &x.id == load) {
                // A given allowance replaces the standard's rule, as `impact`
                // in the model file does.
                m.live.moving[k].impact = *impact;
                m.live.moving[k].impact_rule = crate::loads::ImpactRule::Fixed;
            } else {
                let c = find(&m.cases, load, "load case or moving load", |c| &c.id)?;
                m.cases[c].impact = *impact;
            }
        }
        Change::AddCase(add) => {
            if m.cases.iter().any(|c| c.id == add.id) {
                return Err(VariantError::Invalid(format!(
                    "added load case \"{}\" already exists",
                    add.id
                )));
            }
            let mut nodal = Vec::with_capacity(add.loads.len());
            for (node, fx, fy) in &add.loads {
                let node = node_index(m, node)?;
                nodal.push(NodalLoad {
                    node,
                    fx: *fx,
                    fy: *fy,
                });
            }
            m.cases.push(LoadCase {
                id: add.id.clone(),
                kind: add.kind,
                impact: add.impact,
                legal: false,
                nodal,
                settlements: vec![],
                elongations: vec![],
            });
        }
        Change::MoveNode { node, x, y, dx, dy } => {
            let n = node_index(m, node)?;
            let node = &mut m.nodes[n];
            node.x = x.unwrap_or(node.x) + dx;
            node.y = y.unwrap_or(node.y) + dy;
        }
        Change::Depth { nodes, dy } => {
            let selected: Vec<usize> = match nodes {
                DepthNodes::Prefix(p) => (0..m.nodes.len())
                    .filter(|&i| m.nodes[i].id.starts_with(p.as_str()))
                    .collect(),
                DepthNodes::AboveSupports => {
                    let low = m
                        .supports
                        .iter()
                        .map(|s| m.nodes[s.node].y)
                        .fold(f64::INFINITY, f64::min);
                    let tol = 1e-9 * (1.0 + low.abs());
                    (0..m.nodes.len())
                        .filter(|&i| m.nodes[i].y > low + tol)
                        .collect()
                }
            };
            if selected.is_empty() {
                return Err(VariantError::Invalid(
                    "the change of depth selects no node".into(),
                ));
            }
            for i in selected {
                m.nodes[i].y += dy;
            }
        }
        Change::MemberSection { member, section } => {
            let j = member_index(m, member)?;
            m.members[j].section = find(&m.sections, section, "section", |s| &s.id)?;
        }
        Change::MemberMaterial { member, material } => {
            let j = member_index(m, member)?;
            m.members[j].material = find(&m.materials, material, "material", |s| &s.id)?;
        }
        Change::SectionProperties { section, props } => {
            let s = find(&m.sections, section, "section", |s| &s.id)?;
            positive("area", props.area)?;
            positive("i_in", props.i_in)?;
            positive("i_out", props.i_out)?;
            positive("net_area", props.net_area)?;
            let sec = &mut m.sections[s];
            // A new gross area with no new net area keeps the old net/gross ratio.
            if let Some(a) = props.area {
                let ratio = sec.net_area / sec.area;
                sec.area = a;
                sec.net_area = props.net_area.unwrap_or(a * ratio);
            } else if let Some(n) = props.net_area {
                sec.net_area = n;
            }
            sec.i_in = props.i_in.unwrap_or(sec.i_in);
            sec.i_out = props.i_out.unwrap_or(sec.i_out);
            if sec.net_area > sec.area * (1.0 + 1e-12) {
                return Err(VariantError::Invalid(format!(
                    "section \"{section}\": net area exceeds the gross area"
                )));
            }
        }
        Change::MaterialProperties { material, props } => {
            let k = find(&m.materials, material, "material", |s| &s.id)?;
            positive("e", props.e)?;
            positive("fy", props.fy)?;
            positive("fu", props.fu)?;
            let mat = &mut m.materials[k];
            mat.e = props.e.unwrap_or(mat.e);
            mat.fy = props.fy.or(mat.fy);
            mat.fu = props.fu.or(mat.fu);
        }
        Change::RemoveMember { member } => {
            let j = member_index(m, member)?;
            *m = without_member(m, j)?;
        }
    }
    Ok(())
}

/// The model with member `j` removed and every member index fixed.
///
/// A node left with no member at all loses its DOFs; a load on such a
/// node could no longer be carried, so that is an error (the truss has
/// lost a joint), as is a support left on it.
pub fn without_member(m: &Model, j: usize) -> Result<Model, VariantError> {
    let mut out = m.clone();
    out.members.remove(j);
    out.slack.retain(|&(k, _)| k != j);
    for (k, _) in &mut out.slack {
        if *k > j {
            *k -= 1;
        }
    }
    for g in &mut out.gussets {
        g.without_member(j);
    }
    for case in &mut out.cases {
        case.elongations.retain(|e| e.member != j);
        for e in &mut case.elongations {
            if e.member > j {
                e.member -= 1;
            }
        }
    }
    // Pins: the removed member's bars leave the stacks (a pin left with no
    // member's bar goes too); later members move down by one.
    use crate::joint::pin::Carrier;
    for pin in &mut out.pins {
        pin.stack.retain(|b| b.carrier != Carrier::Member(j));
        for b in &mut pin.stack {
            if let Carrier::Member(k) = &mut b.carrier {
                if *k > j {
                    *k -= 1;
                }
            }
        }
    }
    out.pins.retain(|p| {
        p.stack
            .iter()
            .any(|b| matches!(b.carrier, Carrier::Member(_)))
    });
    let mut connected = vec![false; out.nodes.len()];
    for mem in &out.members {
        connected[mem.start] = true;
        connected[mem.end] = true;
    }
    let removed = &m.members[j];
    for n in [removed.start, removed.end] {
        if connected[n] {
            continue;
        }
        let loaded = out.cases.iter().any(|c| {
            c.nodal
                .iter()
                .any(|l| l.node == n && (l.fx != 0.0 || l.fy != 0.0))
        });
        if loaded {
            return Err(VariantError::Invalid(format!(
                "removing member \"{}\" leaves loaded node \"{}\" with no member",
                removed.id, m.nodes[n].id
            )));
        }
    }
    Ok(out)
}

/// Moves must not make a member of zero length.
fn check_geometry(m: &Model) -> Result<(), VariantError> {
    // The loader's coordinate bound holds for moved nodes too (issue 22,
    // item 16): a move of 1e300 m is an error for that row, not a solve.
    let max = crate::input::convert::MAX_COORDINATE;
    for n in &m.nodes {
        for (axis, v) in [("x", n.x), ("y", n.y)] {
            if v.is_nan() || v.abs() > max {
                return Err(VariantError::Invalid(format!(
                    "node \"{}\" coordinate {axis} = {v:.3e} m after the moves is beyond ±{max:.0e} m",
                    n.id
                )));
            }
        }
    }
    for (j, mem) in m.members.iter().enumerate() {
        let l = m.length(j);
        if !(l.is_finite() && l > 1e-9) {
            return Err(VariantError::Invalid(format!(
                "member \"{}\" has zero length after the moves",
                mem.id
            )));
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sweep::{Change, DepthNodes, Variant};

    fn four_panel() -> Model {
        crate::input::load_str(include_str!("../../tests/data/four_panel.ron"))
            .unwrap()
            .model
    }

    fn with(changes: Vec<Change>) -> Variant {
        Variant {
            changes,
            ..Variant::default()
        }
    }

    #[test]
    fn moves_depth_and_removal() {
        let m = four_panel();
        let u2 = node_index(&m, "U2").unwrap();
        // Absolute x, offset y: U2 stands 16 ft = 4.8768 m high (1 ft = 0.3048 m exactly), + 0.5 m.
        let v = with(vec![Change::MoveNode {
            node: "U2".into(),
            x: Some(10.0),
            y: None,
            dx: 0.0,
            dy: 0.5,
        }]);
        let out = apply(&m, &v).unwrap();
        assert_eq!(out.nodes[u2].x, 10.0);
        assert!((out.nodes[u2].y - (16.0 * 0.3048 + 0.5)).abs() < 1e-12);
        // Depth by prefix and above the supports move the same three U nodes here.
        for nodes in [DepthNodes::Prefix("U".into()), DepthNodes::AboveSupports] {
            let out = apply(&m, &with(vec![Change::Depth { nodes, dy: 1.0 }])).unwrap();
            let moved = (0..m.nodes.len())
                .filter(|&i| out.nodes[i].y != m.nodes[i].y)
                .count();
            assert_eq!(moved, 3);
        }
        let out = apply(
            &m,
            &with(vec![Change::RemoveMember {
                member: "L2-U2".into(),
            }]),
        )
        .unwrap();
        assert_eq!(out.members.len(), m.members.len() - 1);
        assert!(out.members.iter().all(|x| x.id != "L2-U2"));
        let err = apply(
            &m,
            &with(vec![Change::MoveNode {
                node: "U2".into(),
                x: Some(36.0 * 0.3048),
                y: Some(0.0),
                dx: 0.0,
                dy: 0.0,
            }]),
        )
        .unwrap_err();
        assert!(err.to_string().contains("zero length"), "{err}");
        assert!(apply(
            &m,
            &with(vec![Change::ScaleCase {
                case: "x".into(),
                factor: 2.0
            }])
        )
        .is_err());
    }
}
