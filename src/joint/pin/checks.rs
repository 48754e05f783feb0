//! The joint checks of pins, for the framework to rate under every load
//! state: the pin in combined bending and shear (one check per pin), the
//! bearing of each bar on it, and the body of each bar of a multiple-eyebar
//! member at its unequal share. Proportions (LRFD 6.8.6, 6.8.7) are not
//! strength checks: they go into the notes as met or not, with their values.

use super::eyebar::{self, Proportion};
use super::resolve::Resolved;
use super::statics::diagram_unchecked;
use super::strength::{self, Basis};
use super::{Bar, BarKind, Carrier, Pin};
use crate::joint::{Eval, JointCheck, JointSet};
use crate::method::{Family, Level, Method};
use crate::model::Model;
use crate::units::{plain, Dimension};
use std::sync::Arc;

/// A pin with everything its checks share.
struct PinData {
    pin: Pin,
    resolved: Resolved,
    /// "pin 6 in" in the section unit.
    part: String,
}

impl PinData {
    /// Each bar's force on the pin and the diagram's largest M and V.
    fn moment_shear(&self, forces: &[f64]) -> (f64, f64) {
        let d = diagram_unchecked(&self.resolved.loads(&self.pin, forces));
        (d.max_moment, d.max_shear)
    }

    /// The bar's force (N, magnitude) for its own checks: its share of the
    /// member's force, times the unequal-sharing factor in a multiple-bar
    /// member; a load entry's share of the balance.
    fn bar_force(&self, bar: usize, bars: u32, forces: &[f64]) -> f64 {
        let f = self.resolved.forces(forces)[bar];
        let k = if bars >= 2 {
            self.pin.factors.sharing
        } else {
            1.0
        };
        f[0].hypot(f[1]) * k
    }
}

/// The pin in combined bending and shear.
struct PinStrength(Arc<PinData>);

impl JointCheck for PinStrength {
    fn node(&self) -> usize {
        self.0.pin.node
    }
    fn kind(&self) -> &'static str {
        "pin moment and shear"
    }
    fn member(&self) -> Option<usize> {
        None
    }
    fn part(&self) -> String {
        self.0.part.clone()
    }
    fn uses(&self) -> Vec<usize> {
        self.0.resolved.members.clone()
    }
    fn clause(&self, method: &Method) -> &'static str {
        if method.family == crate::method::Family::DesignFactored {
            return "AASHTO LRFD Eq. 6.7.6.2.1-1 with φf = φv = 0.90 for a design code (at or below EN 1993-1-8 Table 3.10 pin bending; from memory)";
        }
        match strength::basis(method) {
            Basis::Lrfd => "AASHTO LRFD 6.7.6.2.1, Eq. 6.7.6.2.1-1; φf = φv = 1.00 (6.5.4.2) (from memory)",
            Basis::LoadFactor => "AASHTO LRFD 6.7.6.2.1, Eq. 6.7.6.2.1-1 against load-factor loads (this program's choice for lfr; from memory)",
            Basis::Allowable => "AASHTO Standard Specifications Table 10.32.1A: pins 0.80·Fy bending, 0.40·Fy shear (from memory; inventory values kept at operating)",
        }
    }
    fn equation(&self, method: &Method) -> String {
        match strength::basis(method) {
            Basis::Allowable => {
                "max(M/(π·D³/32) / (0.80·Fy), V/(π·D²/4) / (0.40·Fy)) ≤ 1; M, V the largest along the pin (vector sum of both planes)".into()
            }
            _ => "6·Mu/(φf·D³·Fy) + (2.2·Vu/(φv·D²·Fy))³ ≤ 0.95; φ includes φc·φs where the method applies them; Mu, Vu the largest along the pin (vector sum of both planes)".into(),
        }
    }
    fn inputs(&self) -> Vec<(&'static str, f64, Option<Dimension>)> {
        let f = &self.0.pin.factors;
        vec![
            ("D", self.0.pin.diameter, Some(Dimension::Length)),
            ("Fy", self.0.pin.fy, Some(Dimension::Stress)),
            ("φf", f.phi_flexure, None),
            ("φv", f.phi_shear, None),
            ("limit", f.interaction_limit, None),
        ]
    }
    fn dimension(&self) -> Option<Dimension> {
        None
    }
    fn evaluate(&self, forces: &[f64], method: &Method, level: &Level) -> Eval {
        let p = &self.0.pin;
        let f = &p.factors;
        let (m, v) = self.0.moment_shear(forces);
        match strength::basis(method) {
            Basis::Allowable => {
                let fb = m / strength::section_modulus(p.diameter);
                let fv = v / strength::area(p.diameter);
                let ratio =
                    (fb / (f.allowable_bending * p.fy)).max(fv / (f.allowable_shear * p.fy));
                Eval {
                    demand: ratio,
                    resistance: 1.0,
                }
            }
            _ => {
                let cs = strength::condition_system(method, level);
                Eval {
                    demand: strength::interaction(
                        m,
                        v,
                        p.diameter,
                        p.fy,
                        cs * f.phi_flexure,
                        cs * f.phi_shear,
                    ),
                    resistance: f.interaction_limit,
                }
            }
        }
    }
}

/// Bearing of one bar on the pin.
struct Bearing {
    data: Arc<PinData>,
    bar: usize,
    /// Bars of the bar's member (1 for a load entry).
    bars: u32,
    /// Fy in bearing: the lower of the pin's and the bar's.
    fy: f64,
    part: String,
}

impl JointCheck for Bearing {
    fn node(&self) -> usize {
        self.data.pin.node
    }
    fn kind(&self) -> &'static str {
        "pin bearing"
    }
    fn member(&self) -> Option<usize> {
        self.data.resolved.member[self.bar]
    }
    fn part(&self) -> String {
        self.part.clone()
    }
    fn uses(&self) -> Vec<usize> {
        match self.data.resolved.member[self.bar] {
            Some(m) => vec![m],
            None => self.data.resolved.members.clone(),
        }
    }
    fn clause(&self, method: &Method) -> &'static str {
        let plate = self.data.pin.stack[self.bar].is_plate();
        if method.family == crate::method::Family::DesignFactored {
            return "AASHTO LRFD 6.7.6.2.2 / 6.8.7.1 times 0.90 for a design code (AISC 360-16 §J7: φ·1.8·Fy·Apb = 1.35·Fy·t·D; from memory)";
        }
        match (strength::basis(method), plate) {
            (Basis::Lrfd, false) => "AASHTO LRFD 6.7.6.2.2, Eq. 6.7.6.2.2-1; φb = 1.00 (6.5.4.2) (from memory)",
            (Basis::Lrfd, true) => "AASHTO LRFD 6.8.7.1 pin plates, Pr = φb·Apb·Fy (from memory)",
            (Basis::LoadFactor, _) => "load-factor bearing on pins 1.35·Fy·t·D, AASHTO Standard Specifications (from memory)",
            (Basis::Allowable, _) => "AASHTO Standard Specifications Table 10.32.1A: bearing on pins 0.80·Fy (from memory)",
        }
    }
    fn equation(&self, method: &Method) -> String {
        let plate = self.data.pin.stack[self.bar].is_plate();
        let share = if self.bars >= 2 {
            " (bar force: k·F/N, k the unequal-sharing factor)"
        } else {
            ""
        };
        let r = match (strength::basis(method), plate) {
            (Basis::Lrfd, false) => "φc·φs·φb·1.5·t·D·Fy",
            (Basis::Lrfd, true) => "φc·φs·φb·t·D·Fy",
            (Basis::LoadFactor, _) => "1.35·t·D·Fy",
            (Basis::Allowable, _) => "0.80·Fy·t·D",
        };
        format!("P ≤ {r}, Fy the lower of pin and bar{share}")
    }
    fn inputs(&self) -> Vec<(&'static str, f64, Option<Dimension>)> {
        let bar = &self.data.pin.stack[self.bar];
        let mut v = vec![
            ("t", bar.thickness, Some(Dimension::Length)),
            ("D", self.data.pin.diameter, Some(Dimension::Length)),
            ("Fy", self.fy, Some(Dimension::Stress)),
            ("share", self.data.resolved.share[self.bar], None),
        ];
        if self.bars >= 2 {
            v.push(("N", self.bars as f64, None));
            v.push(("k", self.data.pin.factors.sharing, None));
        }
        v
    }
    fn dimension(&self) -> Option<Dimension> {
        Some(Dimension::Force)
    }
    fn evaluate(&self, forces: &[f64], method: &Method, level: &Level) -> Eval {
        let p = &self.data.pin;
        let bar = &p.stack[self.bar];
        let cs = match strength::basis(method) {
            Basis::Lrfd => strength::condition_system(method, level),
            _ => 1.0,
        };
        Eval {
            demand: self.data.bar_force(self.bar, self.bars, forces),
            resistance: strength::bearing(
                &p.factors,
                strength::basis(method),
                bar.is_plate(),
                bar.thickness,
                p.diameter,
                self.fy,
                cs,
            ),
        }
    }
}

/// The body of the most loaded bar of a multiple-eyebar member in tension.
struct EyebarBody {
    data: Arc<PinData>,
    bar: usize,
    bars: u32,
    /// Body area b·t, m², and the bar's Fy.
    area: f64,
    fy: f64,
    part: String,
}

impl EyebarBody {
    fn cs(&self, method: &Method, level: &Level) -> f64 {
        method.condition_system_with(level, method.member_phi_s(self.bars))
    }
}

impl JointCheck for EyebarBody {
    fn node(&self) -> usize {
        self.data.pin.node
    }
    fn kind(&self) -> &'static str {
        "eyebar body tension"
    }
    fn member(&self) -> Option<usize> {
        self.data.resolved.member[self.bar]
    }
    fn part(&self) -> String {
        self.part.clone()
    }
    fn uses(&self) -> Vec<usize> {
        self.data.resolved.member[self.bar].into_iter().collect()
    }
    fn clause(&self, method: &Method) -> &'static str {
        match method.family {
            Family::Lrfr => "AASHTO LRFD 6.8.6.1 with Eq. 6.8.2.1-1 on the body; φs = 0.90 multiple-eyebar member, MBE Table 6A.4.2.4-1 (from memory)",
            _ => "yield of the body at the level's tension factor (the member's own tension clause)",
        }
    }
    fn equation(&self, _method: &Method) -> String {
        "k·F/N ≤ φc·φs·φy·Fy·b·t (k the unequal-sharing factor, F the member's tension)".into()
    }
    fn inputs(&self) -> Vec<(&'static str, f64, Option<Dimension>)> {
        vec![
            ("Ab", self.area, Some(Dimension::Area)),
            ("Fy", self.fy, Some(Dimension::Stress)),
            ("N", self.bars as f64, None),
            ("k", self.data.pin.factors.sharing, None),
        ]
    }
    fn dimension(&self) -> Option<Dimension> {
        Some(Dimension::Force)
    }
    fn evaluate(&self, forces: &[f64], method: &Method, level: &Level) -> Eval {
        let m = self.data.resolved.member[self.bar].unwrap_or(0);
        let k = self.data.pin.factors.sharing;
        let demand = (forces[m] * self.data.resolved.share[self.bar] * k).max(0.0);
        Eval {
            demand,
            resistance: self.cs(method, level)
                * level.resistance.tension_yield
                * self.fy
                * self.area,
        }
    }
}

/// Every pin check of the model and the notes: each pin's stack in order,
/// the proportions of eyebar heads and pin plates, the defaults taken.
pub fn checks(model: &Model) -> JointSet {
    let mut out = JointSet {
        checks: Vec::new(),
        notes: Vec::new(),
    };
    let sec = model.units.section;
    let len = |v: f64| format!("{} {}", plain(v / sec.to_si), sec.name);
    let mut any_shared = false;
    let mut no_fy = Vec::new();
    let mut bodies: Vec<(Carrier, u64, u64)> = Vec::new();
    for pin in &model.pins {
        let node = &model.nodes[pin.node].id;
        let resolved = Resolved::new(pin, &model.nodes, &model.members);
        let data = Arc::new(PinData {
            pin: pin.clone(),
            resolved,
            part: format!("pin {} at {node}", len(pin.diameter)),
        });
        out.checks.push(Box::new(PinStrength(data.clone())));
        out.notes.push(stack_note(model, pin, &len));
        // Bars alike (one member, thickness, form and steel) carry the same
        // share and resist alike: one check for them, naming them all.
        let mut classes: Vec<Vec<usize>> = Vec::new();
        for (i, bar) in pin.stack.iter().enumerate() {
            let alike = |c: &&mut Vec<usize>| {
                let o = &pin.stack[c[0]];
                o.carrier == bar.carrier
                    && o.thickness == bar.thickness
                    && o.kind == bar.kind
                    && o.fy == bar.fy
                    && matches!(bar.carrier, Carrier::Member(_))
            };
            match classes.iter_mut().find(alike) {
                Some(c) => c.push(i),
                None => classes.push(vec![i]),
            }
        }
        for class in &classes {
            let i = class[0];
            let bar = &pin.stack[i];
            let bars = match bar.carrier {
                Carrier::Member(m) => model.members[m].bars,
                Carrier::Load => 1,
            };
            any_shared |= bars >= 2;
            let numbers: Vec<String> = class.iter().map(|k| (k + 1).to_string()).collect();
            let part = format!(
                "{} {} ({}, {}) on pin at {node}",
                if class.len() == 1 { "bar" } else { "bars" },
                numbers.join(" and "),
                bar.name(),
                len(bar.thickness)
            );
            let Some(fy) = bar.fy else {
                no_fy.push(format!("{node}: {}", bar.name()));
                continue;
            };
            out.checks.push(Box::new(Bearing {
                data: data.clone(),
                bar: i,
                bars,
                fy: fy.min(pin.fy),
                part: part.clone(),
            }));
            // The body once per member and bar size (at its first pin).
            let body_key = |b: f64| (bar.carrier.clone(), b.to_bits(), bar.thickness.to_bits());
            if let (BarKind::Eyebar(Some(head)), true) = (&bar.kind, bars >= 2) {
                if bodies.contains(&body_key(head.body)) {
                    continue;
                }
                bodies.push(body_key(head.body));
                out.checks.push(Box::new(EyebarBody {
                    data: data.clone(),
                    bar: i,
                    bars,
                    area: head.body * bar.thickness,
                    fy,
                    part,
                }));
            }
        }
        proportion_notes(model, pin, &len, &mut out.notes);
    }
    eyebar_notes(model, &len, &mut out.notes);
    if any_shared {
        out.notes.push(format!(
            "multiple-eyebar members: the pin's statics shares a member's force among its bars by thickness; each bar's bearing and body take the most loaded bar at k·F/N, k = {} (this program's choice for unequal sharing, overridable per pin as factors.sharing); lrfr rates these members and bars with φs = 0.90 (MBE Table 6A.4.2.4-1, from memory) unless the model's system factor is lower",
            plain(model.pins.first().map_or(eyebar::SHARING, |p| p.factors.sharing))
        ));
    }
    if !no_fy.is_empty() {
        out.notes.push(format!(
            "pin bearing not checked for load entries without fy: {}",
            no_fy.join(", ")
        ));
    }
    if !model.pins.is_empty() {
        out.notes.push("pins: bars act as point loads at mid-thickness (common practice); allowable-stress rating keeps the inventory pin allowables at operating (the operating values are not held here; conservative)".into());
    }
    out
}

/// "pin 6 in at L3, stack in order: 1 L2-L3 eyebar 1.5 in at 0.75 in; ...".
fn stack_note(model: &Model, pin: &Pin, len: &dyn Fn(f64) -> String) -> String {
    let stack: Vec<String> = pin
        .stack
        .iter()
        .enumerate()
        .map(|(i, b)| {
            format!(
                "{} {} {} at {}",
                i + 1,
                b.name(),
                len(b.thickness),
                len(b.position)
            )
        })
        .collect();
    format!(
        "pin {} at {}: stack in order along the pin (mid-thickness positions): {}",
        len(pin.diameter),
        model.nodes[pin.node].id,
        stack.join("; ")
    )
}

fn proportion_text(
    p: &Proportion,
    len: &dyn Fn(f64) -> String,
    area: &dyn Fn(f64) -> String,
) -> String {
    let v = |x| if p.area { area(x) } else { len(x) };
    format!(
        "{} {} {} {} ({}): {}",
        p.what,
        v(p.value),
        if p.at_least { "≥" } else { "≤" },
        v(p.limit),
        p.rule,
        if p.met() { "met" } else { "NOT MET" }
    )
}

/// Eyebar heads (LRFD 6.8.6) and each member's pin plates (LRFD 6.8.7).
fn proportion_notes(
    model: &Model,
    pin: &Pin,
    len: &dyn Fn(f64) -> String,
    notes: &mut Vec<String>,
) {
    let sec = model.units.section;
    let area = |v: f64| format!("{} {}2", plain(v / (sec.to_si * sec.to_si)), sec.name);
    let node = &model.nodes[pin.node].id;
    let mut plain_eyebars = Vec::new();
    for (i, bar) in pin.stack.iter().enumerate() {
        if let BarKind::Eyebar(None) = bar.kind {
            plain_eyebars.push(format!("{} ({})", i + 1, bar.name()));
        }
    }
    if !plain_eyebars.is_empty() {
        notes.push(format!(
            "pin at {node}: eyebar head proportions (LRFD 6.8.6) not checked, head not described: bars {}",
            plain_eyebars.join(", ")
        ));
    }
    // Pin plates: per member with plates, when every bar of it at this pin
    // is described with width, beyond and hole.
    let mut seen: Vec<usize> = Vec::new();
    for bar in &pin.stack {
        let Carrier::Member(m) = bar.carrier else {
            continue;
        };
        if seen.contains(&m) || !bar.is_plate() {
            continue;
        }
        seen.push(m);
        let of_member: Vec<&Bar> = pin
            .stack
            .iter()
            .filter(|b| b.carrier == Carrier::Member(m))
            .collect();
        let mut across = 0.0;
        let mut beyond = 0.0;
        let mut complete = true;
        for b in &of_member {
            match &b.kind {
                BarKind::Plate {
                    width: Some(w),
                    beyond: Some(a),
                    hole: Some(d),
                    ..
                } => {
                    across += (w - d) * b.thickness;
                    beyond += a * b.thickness;
                }
                _ => complete = false,
            }
        }
        let id = &model.members[m].id;
        if !complete {
            notes.push(format!(
                "pin at {node}, member \"{id}\": pin-plate net sections (LRFD 6.8.7.2) not checked: give width, beyond and hole for every plate of the member on the pin"
            ));
            continue;
        }
        let an = model.sections[model.members[m].section].net_area;
        let text: Vec<String> = eyebar::plate_proportions(across, beyond, an)
            .iter()
            .map(|p| proportion_text(p, len, &area))
            .collect();
        notes.push(format!(
            "pin at {node}, member \"{id}\": pin plates, LRFD 6.8.7.2 (from memory), An = {} the member's net area: {}",
            area(an),
            text.join("; ")
        ));
    }
}

/// One note per distinct eyebar (member, thickness, head, pin): LRFD 6.8.6
/// proportions, the ones not met in full and the governing ratio.
fn eyebar_notes(model: &Model, len: &dyn Fn(f64) -> String, notes: &mut Vec<String>) {
    let sec = model.units.section;
    let area = |v: f64| format!("{} {}2", plain(v / (sec.to_si * sec.to_si)), sec.name);
    type Key = (String, [u64; 6]);
    let mut seen: Vec<(Key, Vec<String>)> = Vec::new();
    let mut found: Vec<(Key, Vec<Proportion>, f64)> = Vec::new();
    for pin in &model.pins {
        let node = &model.nodes[pin.node].id;
        for (i, bar) in pin.stack.iter().enumerate() {
            let BarKind::Eyebar(Some(head)) = &bar.kind else {
                continue;
            };
            let key: Key = (
                bar.label.clone(),
                [
                    head.body,
                    head.head,
                    head.beyond,
                    head.hole,
                    bar.thickness,
                    pin.diameter,
                ]
                .map(f64::to_bits),
            );
            let at = format!("{node} bar {}", i + 1);
            match seen.iter_mut().find(|(k, _)| *k == key) {
                Some((_, v)) => v.push(at),
                None => {
                    seen.push((key.clone(), vec![at]));
                    let p = eyebar::eyebar_proportions(
                        head,
                        bar.thickness,
                        pin.diameter,
                        bar.fy.unwrap_or(0.0),
                    );
                    found.push((key, p, head.body * bar.thickness));
                }
            }
        }
    }
    for ((key, p, ab), (_, at)) in found.iter().zip(&seen) {
        let [b, h, a, d, t, pin] = key.1.map(f64::from_bits);
        let net = (h - d) * t;
        let failed: Vec<String> = p
            .iter()
            .filter(|x| !x.met())
            .map(|x| proportion_text(x, len, &area))
            .collect();
        let verdict = if failed.is_empty() {
            format!("all {} met", p.len())
        } else {
            format!("NOT MET: {}", failed.join("; "))
        };
        notes.push(format!(
            "eyebars of \"{}\" ({} × {}, head {} across a {} hole, {} beyond, on a {} pin; at {}): head proportions, LRFD 6.8.6 (from memory): {verdict}; net section across the hole {} = {}·Ab (1.35 to 1.60)",
            key.0,
            len(b),
            len(t),
            len(h),
            len(d),
            len(a),
            len(pin),
            at.join(", "),
            area(net),
            plain(net / ab),
        ));
    }
}
