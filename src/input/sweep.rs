//! Reading a sweep file (RON; schema in docs/sweeps.md): variants as a
//! list and as the cartesian product of axes, every number converted to SI
//! with the model's units and every id checked against the model, so a
//! typo is reported before anything is analysed.

use super::diagnostics::{Diagnostic, Diagnostics, Severity};
use super::quantity::Quantity;
use super::schema::{CaseKindFile, NodalLoadFile};
use crate::loads::ImpactRule;
use crate::model::{CaseKind, Model};
use crate::sweep::{
    AddedCase, Axis, Change, DepthNodes, MaterialProps, SectionProps, Sweep, Variant, VehicleChoice,
};
use crate::units::Dimension;
use serde::Deserialize;

/// Largest number of variants a sweep file may expand to.
pub const MAX_VARIANTS: usize = 1_000_000;

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SweepFile {
    /// The model the sweep was written for (informational).
    #[serde(default)]
    pub model: Option<String>,
    /// Run the unchanged model first, as variant 0 (default true).
    #[serde(default)]
    pub include_base: Option<bool>,
    #[serde(default)]
    pub variants: Vec<ChangesFile>,
    #[serde(default)]
    pub axes: Vec<AxisFile>,
}

#[derive(Debug, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct ChangesFile {
    #[serde(default)]
    pub name: Option<String>,
    /// `[("crowd", 1.25)]`: multiply a case's loads, or a moving load's vehicle.
    #[serde(default)]
    pub scale: Vec<(String, f64)>,
    /// `[("truck", 0.33)]`: the dynamic allowance of a moving load or live case.
    #[serde(default)]
    pub impact: Vec<(String, f64)>,
    /// `[("truck", "h10")]`: another vehicle (library model or the model's own) for a moving load.
    #[serde(default)]
    pub vehicles: Vec<(String, String)>,
    #[serde(default)]
    pub add_cases: Vec<AddCaseFile>,
    #[serde(default)]
    pub moves: Vec<MoveFile>,
    #[serde(default)]
    pub depth: Option<DepthFile>,
    /// `[("U1-L2", "post")]`: member → existing section.
    #[serde(default)]
    pub sections: Vec<(String, String)>,
    /// `[("U1-L2", "new-steel")]`: member → existing material.
    #[serde(default)]
    pub materials: Vec<(String, String)>,
    #[serde(default)]
    pub section_properties: Vec<SectionPropsFile>,
    #[serde(default)]
    pub material_properties: Vec<MaterialPropsFile>,
    /// Member ids to remove.
    #[serde(default)]
    pub remove: Vec<String>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct AddCaseFile {
    pub id: String,
    #[serde(default)]
    pub kind: Option<CaseKindFile>,
    #[serde(default)]
    pub impact: Option<f64>,
    #[serde(default)]
    pub loads: Vec<NodalLoadFile>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct MoveFile {
    pub node: String,
    #[serde(default)]
    pub x: Option<Quantity>,
    #[serde(default)]
    pub y: Option<Quantity>,
    #[serde(default)]
    pub dx: Option<Quantity>,
    #[serde(default)]
    pub dy: Option<Quantity>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DepthFile {
    pub dy: Quantity,
    /// Move nodes whose id starts with this (default "U").
    #[serde(default)]
    pub prefix: Option<String>,
    /// Move every node above the lowest support instead.
    #[serde(default)]
    pub above_supports: Option<bool>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SectionPropsFile {
    pub section: String,
    #[serde(default)]
    pub area: Option<Quantity>,
    #[serde(default)]
    pub i_in: Option<Quantity>,
    #[serde(default)]
    pub i_out: Option<Quantity>,
    #[serde(default)]
    pub net_area: Option<Quantity>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct MaterialPropsFile {
    pub material: String,
    #[serde(default)]
    pub e: Option<Quantity>,
    #[serde(default)]
    pub fy: Option<Quantity>,
    #[serde(default)]
    pub fu: Option<Quantity>,
}

/// One axis of the cartesian product: general `steps`, or the shorthands
/// `scale: "case"` / `depth: "U"` (or `"above-supports"`) with `values`.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct AxisFile {
    pub name: String,
    #[serde(default)]
    pub steps: Vec<ChangesFile>,
    #[serde(default)]
    pub scale: Option<String>,
    /// Shorthand: the impact of this moving load or live case, with values.
    #[serde(default)]
    pub impact: Option<String>,
    #[serde(default)]
    pub depth: Option<String>,
    /// Shorthand: the vehicle of this moving load, with values naming
    /// vehicles (`["h5", "h10"]`).
    #[serde(default)]
    pub vehicle: Option<String>,
    #[serde(default)]
    pub values: Vec<Quantity>,
}

struct Ctx<'a> {
    model: &'a Model,
    errors: Vec<Diagnostic>,
}

impl Ctx<'_> {
    fn error(&mut self, message: String) {
        if self.errors.len() < 200 {
            self.errors.push(Diagnostic {
                severity: Severity::Error,
                message,
                location: None,
            });
        }
    }

    fn si(&mut self, q: &Quantity, dim: Dimension, what: &str) -> f64 {
        match q.to_si(dim, self.model.units.factor_for(dim)) {
            Ok(v) => v,
            Err(e) => {
                self.error(format!("{what}: {e}"));
                0.0
            }
        }
    }

    fn opt(&mut self, q: &Option<Quantity>, dim: Dimension, what: &str) -> Option<f64> {
        q.as_ref().map(|q| self.si(q, dim, what))
    }

    fn has(&mut self, what: &str, id: &str, known: bool, at: &str) {
        if !known {
            self.error(format!("{at}: no {what} \"{id}\" in the model"));
        }
    }

    fn node(&mut self, id: &str, at: &str) {
        let k = self.model.nodes.iter().any(|n| n.id == id);
        self.has("node", id, k, at);
    }
    fn member(&mut self, id: &str, at: &str) {
        let k = self.model.members.iter().any(|n| n.id == id);
        self.has("member", id, k, at);
    }
    fn section(&mut self, id: &str, at: &str) {
        let k = self.model.sections.iter().any(|n| n.id == id);
        self.has("section", id, k, at);
    }
    fn material(&mut self, id: &str, at: &str) {
        let k = self.model.materials.iter().any(|n| n.id == id);
        self.has("material", id, k, at);
    }
    fn is_moving(&self, id: &str) -> bool {
        self.model.live.moving.iter().any(|x| x.id == id)
    }

    /// A load case or a moving load; true for a moving load.
    fn case_or_moving(&mut self, id: &str, at: &str) -> bool {
        if self.is_moving(id) {
            return true;
        }
        let k = self.model.cases.iter().any(|n| n.id == id);
        self.has("load case or moving load", id, k, at);
        false
    }

    /// A change of impact: a moving load or a load case.
    fn impact(&mut self, id: &str, impact: f64, at: &str) -> Change {
        self.case_or_moving(id, at);
        if !(impact.is_finite() && impact >= 0.0) {
            self.error(format!(
                "{at}: impact of \"{id}\" must be a fraction ≥ 0 (0.33 for 33 %), got {impact}"
            ));
        }
        Change::Impact {
            load: id.to_string(),
            impact,
        }
    }

    /// Moving load `moving` given vehicle `name`: a vehicle of the model
    /// (the first `user_vehicles`, as the model file's names take
    /// precedence) or a library model, placed as the model file would
    /// place it (the moving load's scale, the deck layout's share, the
    /// standard's allowance unless the model gave `impact`).
    fn vehicle(&mut self, moving: &str, name: &str, at: &str) -> Option<Change> {
        let live = &self.model.live;
        let Some(ml) = live.moving.iter().find(|x| x.id == moving) else {
            self.error(format!("{at}: no moving load \"{moving}\" in the model"));
            return None;
        };
        let layout = live.layout.as_ref();
        let keep = ml.impact_given.then_some(());
        let choice = if let Some(v) = live.vehicles[..live.user_vehicles]
            .iter()
            .find(|v| v.id == name)
        {
            let share = layout.map_or(1.0, |l| {
                l.vehicle_share(crate::loads::library::Presence::None).0
            });
            VehicleChoice {
                name: name.to_string(),
                vehicle: v.scaled(ml.scale * share),
                impact: keep.map_or(Some((0.0, ImpactRule::Fixed, false)), |_| None),
                model: None,
                share,
                legal: None,
            }
        } else {
            let deck_length = crate::loads::Deck::from_nodes(&self.model.nodes, &live.deck)
                .ok()
                .map(|d| d.length());
            let who = format!("{at}: moving load \"{moving}\"");
            match super::library::resolve_named(name, &who, ml.scale, layout, deck_length) {
                Some(Ok((r, _warnings))) => VehicleChoice {
                    name: name.to_string(),
                    vehicle: r.vehicle,
                    impact: keep.map_or(Some((r.impact, r.rule, r.impact_on_lane)), |_| None),
                    model: Some(r.name),
                    share: r.share,
                    legal: Some(r.legal),
                },
                Some(Err(e)) => {
                    self.error(e);
                    return None;
                }
                None => {
                    self.error(format!(
                        "{at}: vehicle \"{name}\" for moving load \"{moving}\" is neither a vehicle of the model nor a library model (`panelpoint vehicles` lists them)"
                    ));
                    return None;
                }
            }
        };
        Some(Change::Vehicle {
            moving: moving.to_string(),
            choice: Box::new(choice),
        })
    }

    /// Scaling a case or a moving load.
    fn scale(&mut self, id: &str, factor: f64, at: &str) -> Change {
        if self.case_or_moving(id, at) {
            Change::ScaleMoving {
                moving: id.to_string(),
                factor,
            }
        } else {
            Change::ScaleCase {
                case: id.to_string(),
                factor,
            }
        }
    }
}

fn kind(k: Option<CaseKindFile>) -> CaseKind {
    match k {
        Some(CaseKindFile::Dead) => CaseKind::Dead,
        Some(CaseKindFile::Wearing) => CaseKind::Wearing,
        Some(CaseKindFile::Live) => CaseKind::Live,
        _ => CaseKind::Other,
    }
}

fn show(q: &Option<Quantity>) -> Option<String> {
    q.as_ref().map(|q| q.show().trim_matches('"').to_string())
}

/// The changes of one list entry or axis step, with a description of each.
fn changes(ctx: &mut Ctx, f: &ChangesFile, at: &str) -> (Vec<Change>, Vec<(String, String)>) {
    let mut out = Vec::new();
    let mut params = Vec::new();
    for (case, factor) in &f.scale {
        if !(factor.is_finite() && factor.abs() <= super::MAX_FACTOR) {
            ctx.error(format!(
                "{at}: scale factor of \"{case}\" must be a finite number from -{m} to {m}, not {factor:?}",
                m = super::MAX_FACTOR
            ));
        }
        out.push(ctx.scale(case, *factor, at));
        params.push((format!("scale {case}"), format!("{factor}")));
    }
    for (load, impact) in &f.impact {
        out.push(ctx.impact(load, *impact, at));
        params.push((format!("impact {load}"), format!("{impact}")));
    }
    for (moving, name) in &f.vehicles {
        out.extend(ctx.vehicle(moving, name, at));
        params.push((format!("vehicle {moving}"), name.clone()));
    }
    for add in &f.add_cases {
        let mut loads = Vec::new();
        for l in &add.loads {
            ctx.node(&l.node, at);
            let w = format!("{at}: added case \"{}\" at \"{}\"", add.id, l.node);
            let fx = ctx.opt(&l.fx, Dimension::Force, &w).unwrap_or(0.0);
            let fy = ctx.opt(&l.fy, Dimension::Force, &w).unwrap_or(0.0);
            loads.push((l.node.clone(), fx, fy));
        }
        if let Some(i) = add.impact {
            if !(i.is_finite() && (0.0..=super::MAX_IMPACT).contains(&i)) {
                ctx.error(format!(
                    "{at}: impact of \"{}\" must be a fraction from 0 to {}, not {i:?}",
                    add.id,
                    super::MAX_IMPACT
                ));
            }
        }
        out.push(Change::AddCase(AddedCase {
            id: add.id.clone(),
            kind: kind(add.kind),
            impact: add.impact.unwrap_or(0.0),
            loads,
        }));
        params.push(("add case".into(), add.id.clone()));
    }
    for mv in &f.moves {
        ctx.node(&mv.node, at);
        let w = format!("{at}: move of \"{}\"", mv.node);
        let x = ctx.opt(&mv.x, Dimension::Length, &w);
        let y = ctx.opt(&mv.y, Dimension::Length, &w);
        let dx = ctx.opt(&mv.dx, Dimension::Length, &w).unwrap_or(0.0);
        let dy = ctx.opt(&mv.dy, Dimension::Length, &w).unwrap_or(0.0);
        let text: Vec<String> = [
            ("x", show(&mv.x)),
            ("y", show(&mv.y)),
            ("dx", show(&mv.dx)),
            ("dy", show(&mv.dy)),
        ]
        .into_iter()
        .filter_map(|(k, v)| v.map(|v| format!("{k} {v}")))
        .collect();
        out.push(Change::MoveNode {
            node: mv.node.clone(),
            x,
            y,
            dx,
            dy,
        });
        params.push((format!("move {}", mv.node), text.join(" ")));
    }
    if let Some(d) = &f.depth {
        let dy = ctx.si(&d.dy, Dimension::Length, &format!("{at}: depth dy"));
        let nodes = if d.above_supports == Some(true) {
            DepthNodes::AboveSupports
        } else {
            DepthNodes::Prefix(d.prefix.clone().unwrap_or_else(|| "U".into()))
        };
        out.push(Change::Depth { nodes, dy });
        params.push((
            "depth".into(),
            format!("+{}", d.dy.show().trim_matches('"')),
        ));
    }
    for (member, section) in &f.sections {
        ctx.member(member, at);
        ctx.section(section, at);
        out.push(Change::MemberSection {
            member: member.clone(),
            section: section.clone(),
        });
        params.push((format!("section {member}"), section.clone()));
    }
    for (member, material) in &f.materials {
        ctx.member(member, at);
        ctx.material(material, at);
        out.push(Change::MemberMaterial {
            member: member.clone(),
            material: material.clone(),
        });
        params.push((format!("material {member}"), material.clone()));
    }
    for s in &f.section_properties {
        ctx.section(&s.section, at);
        let w = format!("{at}: section \"{}\"", s.section);
        let props = SectionProps {
            area: ctx.opt(&s.area, Dimension::Area, &w),
            i_in: ctx.opt(&s.i_in, Dimension::SecondMoment, &w),
            i_out: ctx.opt(&s.i_out, Dimension::SecondMoment, &w),
            net_area: ctx.opt(&s.net_area, Dimension::Area, &w),
        };
        let text: Vec<String> = [
            ("area", show(&s.area)),
            ("i_in", show(&s.i_in)),
            ("i_out", show(&s.i_out)),
            ("net_area", show(&s.net_area)),
        ]
        .into_iter()
        .filter_map(|(k, v)| v.map(|v| format!("{k} {v}")))
        .collect();
        out.push(Change::SectionProperties {
            section: s.section.clone(),
            props,
        });
        params.push((format!("props {}", s.section), text.join(" ")));
    }
    for m in &f.material_properties {
        ctx.material(&m.material, at);
        let w = format!("{at}: material \"{}\"", m.material);
        let props = MaterialProps {
            e: ctx.opt(&m.e, Dimension::Stress, &w),
            fy: ctx.opt(&m.fy, Dimension::Stress, &w),
            fu: ctx.opt(&m.fu, Dimension::Stress, &w),
        };
        let text: Vec<String> = [("e", show(&m.e)), ("fy", show(&m.fy)), ("fu", show(&m.fu))]
            .into_iter()
            .filter_map(|(k, v)| v.map(|v| format!("{k} {v}")))
            .collect();
        out.push(Change::MaterialProperties {
            material: m.material.clone(),
            props,
        });
        params.push((format!("props {}", m.material), text.join(" ")));
    }
    for member in &f.remove {
        ctx.member(member, at);
        out.push(Change::RemoveMember {
            member: member.clone(),
        });
        params.push(("remove".into(), member.clone()));
    }
    (out, params)
}

/// The steps of one axis: (label, changes).
fn axis_steps(ctx: &mut Ctx, a: &AxisFile) -> Vec<(String, Vec<Change>)> {
    let at = format!("axis \"{}\"", a.name);
    let forms = [
        !a.steps.is_empty(),
        a.scale.is_some(),
        a.impact.is_some(),
        a.depth.is_some(),
        a.vehicle.is_some(),
    ]
    .iter()
    .filter(|b| **b)
    .count();
    if forms != 1 {
        ctx.error(format!(
            "{at}: give exactly one of steps, scale, impact, depth or vehicle (the last four with values)"
        ));
        return vec![];
    }
    if !a.steps.is_empty() {
        if !a.values.is_empty() {
            ctx.error(format!(
                "{at}: values go with scale, impact, depth or vehicle, not with steps"
            ));
        }
        return a
            .steps
            .iter()
            .enumerate()
            .map(|(i, s)| {
                let (c, p) = changes(ctx, s, &format!("{at} step {}", i + 1));
                let label = s.name.clone().unwrap_or_else(|| {
                    if p.is_empty() {
                        "base".into()
                    } else {
                        p.iter()
                            .map(|(k, v)| format!("{k} {v}"))
                            .collect::<Vec<_>>()
                            .join(", ")
                    }
                });
                (label, c)
            })
            .collect();
    }
    if a.values.is_empty() {
        ctx.error(format!("{at}: values is empty"));
        return vec![];
    }
    if let Some(moving) = &a.vehicle {
        return a
            .values
            .iter()
            .map(|v| {
                match v {
                    Quantity::Text(name) => {
                        let change = ctx.vehicle(moving, name, &at).into_iter().collect();
                        (name.clone(), change)
                    }
                    Quantity::Number(x) => {
                        ctx.error(format!(
                            "{at}: vehicle {x} must be a vehicle's name in quotes (\"h10\", or a vehicle id of the model)"
                        ));
                        (x.to_string(), vec![])
                    }
                }
            })
            .collect();
    }
    for (id, what, is_scale) in [
        (&a.scale, "scale factor", true),
        (&a.impact, "impact", false),
    ] {
        let Some(id) = id else { continue };
        let moving = ctx.case_or_moving(id, &at);
        let mut steps = Vec::new();
        for v in &a.values {
            let f = match v {
                Quantity::Number(f) if f.is_finite() && f.abs() <= super::MAX_FACTOR => *f,
                other => {
                    ctx.error(format!(
                        "{at}: {what} {} must be a plain number from -{m} to {m}",
                        other.show(),
                        m = super::MAX_FACTOR
                    ));
                    1.0
                }
            };
            let change = match (is_scale, moving) {
                (true, true) => Change::ScaleMoving {
                    moving: id.clone(),
                    factor: f,
                },
                (true, false) => Change::ScaleCase {
                    case: id.clone(),
                    factor: f,
                },
                (false, _) => {
                    if f < 0.0 {
                        ctx.error(format!(
                            "{at}: impact {f} of \"{id}\" must be a fraction ≥ 0 (0.33 for 33 %)"
                        ));
                    }
                    Change::Impact {
                        load: id.clone(),
                        impact: f,
                    }
                }
            };
            steps.push((v.show().trim_matches('"').to_string(), vec![change]));
        }
        return steps;
    }
    let prefix = a.depth.clone().unwrap_or_default();
    let nodes = if prefix == "above-supports" {
        DepthNodes::AboveSupports
    } else {
        DepthNodes::Prefix(prefix)
    };
    a.values
        .iter()
        .map(|v| {
            let dy = ctx.si(v, Dimension::Length, &at);
            let change = Change::Depth {
                nodes: nodes.clone(),
                dy,
            };
            (v.show().trim_matches('"').to_string(), vec![change])
        })
        .collect()
}

/// Parse and check sweep text against `model`.
pub fn load_sweep(text: &str, model: &Model) -> Result<Sweep, Diagnostics> {
    let options = ron::Options::default()
        .with_default_extension(ron::extensions::Extensions::IMPLICIT_SOME)
        .with_recursion_limit(64);
    let file: SweepFile = super::syntax::read(&options, text)?;
    let mut ctx = Ctx {
        model,
        errors: Vec::new(),
    };
    let mut sweep = Sweep::default();
    if file.include_base.unwrap_or(true) {
        sweep.variants.push(Variant {
            name: "base".into(),
            parameters: vec![],
            changes: vec![],
        });
    }
    for (i, v) in file.variants.iter().enumerate() {
        let name = v
            .name
            .clone()
            .unwrap_or_else(|| format!("variant {}", i + 1));
        printable(&mut ctx, &name, &format!("variant number {}", i + 1));
        let (changes, parameters) = changes(&mut ctx, v, &format!("variant \"{name}\""));
        sweep.variants.push(Variant {
            name,
            parameters,
            changes,
        });
    }
    if !file.axes.is_empty() {
        let axes: Vec<Axis> = file
            .axes
            .iter()
            .map(|a| {
                printable(&mut ctx, &a.name, "an axis");
                for st in &a.steps {
                    if let Some(n) = &st.name {
                        printable(
                            &mut ctx,
                            n,
                            &format!("axis \"{}\" step", a.name.escape_debug()),
                        );
                    }
                }
                (a.name.clone(), axis_steps(&mut ctx, a))
            })
            .collect();
        let total = axes
            .iter()
            .try_fold(1usize, |acc, (_, s)| acc.checked_mul(s.len()))
            .filter(|&t| t + sweep.variants.len() <= MAX_VARIANTS);
        match total {
            None => ctx.error(format!(
                "the listed variants and the axes' product make more than {MAX_VARIANTS} variants; split the sweep"
            )),
            // The product is not expanded: `Sweep::variant` builds each
            // variant when it runs.
            Some(_) if ctx.errors.is_empty() => sweep.axes = axes,
            Some(_) => {}
        }
    }
    if sweep.variants.len() > MAX_VARIANTS {
        ctx.error(format!(
            "the sweep lists more than {MAX_VARIANTS} variants; split the sweep"
        ));
    }
    if sweep.is_empty() {
        ctx.error("the sweep has no variants (give variants or axes)".into());
    }
    if ctx.errors.is_empty() {
        Ok(sweep)
    } else {
        Err(Diagnostics { errors: ctx.errors })
    }
}

/// Sweep names reach the terminal, CSV and JSON: control characters and
/// bidirectional marks are refused (issue 22, item 14).
fn printable(ctx: &mut Ctx, name: &str, what: &str) {
    if crate::textsafe::has_unsafe(name) {
        ctx.error(format!(
            "{what} name \"{}\" contains a control character or a bidirectional mark; names must print on one line as written",
            name.escape_debug()
        ));
    }
}
