//! The model's optional `gusset_joints` list: riveted or bolted gusset-plate
//! joints at panel points, rated by `joint::gusset` (issue 17, MBE 6A.6.12).
//! Plate and fastener dimensions are in the model's section unit (or with
//! their own unit as a string), strengths in its stress unit; the outline
//! points are plain numbers in the section unit, measured from the panel
//! point's work point with x and y as the truss's.
//!
//! ```ron
//! gusset_joints: [
//!     (node: "L1",
//!      plates: (count: 2, thickness: 0.5, measured_thickness: 0.4375, loss_percent: 0.0,
//!               fy: 33.0, fu: 60.0, holes: Punched),         // e default 29,000 ksi
//!      outline: [(-24.0, -6.0), (24.0, -6.0), (24.0, 30.0), (-24.0, 30.0)],
//!      members: [
//!          (member: "L0-L1", continues: "L1-L2",              // the chord runs through
//!           fastener: Rivet(year: 1905), diameter: 0.875,
//!           lines: 2, rows: 10, pitch: 3.0, gauge: 3.0, first_row: -13.5, offset: 0.0,
//!           planes: 2),
//!          (member: "L1-U1", fastener: Bolt(grade: "A325", threads: Included),
//!           diameter: 0.875, lines: 2, rows: 4, pitch: 3.0, gauge: 3.0,
//!           first_row: 8.0, edge: 1.5, planes: 2, lmid: 6.0, hole: 0.9375),
//!      ],
//!      shear_planes: [Horizontal(4.5)],                      // y of the plane
//!      splice: (members: ["L0-L1", "L1-L2"],
//!               plates: [(count: 2, width: 8.0, thickness: 0.5, holes: 2)]),
//!     ),
//! ]
//! ```

use super::convert::{positive, Ctx, IdMap};
use super::loads::Parts;
use super::quantity::Quantity;
use crate::joint::gusset::fasteners::{self as fast, RivetGrade, INCH, KSI};
use crate::joint::gusset::types::*;
use crate::units::Dimension;
use serde::Deserialize;

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct GussetJointFile {
    pub node: String,
    pub plates: PlatesFile,
    pub outline: Vec<(f64, f64)>,
    #[serde(default)]
    pub members: Vec<GroupFile>,
    #[serde(default)]
    pub shear_planes: Vec<PlaneFile>,
    #[serde(default)]
    pub splice: Option<SpliceFile>,
}

#[derive(Debug, Deserialize, Clone, Copy, PartialEq, Eq)]
pub enum HolesFile {
    Punched,
    Drilled,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PlatesFile {
    #[serde(default)]
    pub count: Option<u32>,
    pub thickness: Quantity,
    #[serde(default)]
    pub measured_thickness: Option<Quantity>,
    #[serde(default)]
    pub loss_percent: Option<f64>,
    pub fy: Quantity,
    pub fu: Quantity,
    #[serde(default)]
    pub e: Option<Quantity>,
    #[serde(default)]
    pub holes: Option<HolesFile>,
}

#[derive(Debug, Deserialize, Clone, Copy, PartialEq, Eq)]
pub enum ThreadsFile {
    Included,
    Excluded,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum FastenerFile {
    Rivet {
        #[serde(default)]
        year: Option<i32>,
        #[serde(default)]
        grade: Option<String>,
        /// Fv given directly (overrides the MBE table).
        #[serde(default)]
        shear_strength: Option<Quantity>,
    },
    Bolt {
        grade: String,
        #[serde(default)]
        threads: Option<ThreadsFile>,
        /// Fub given directly (overrides the grade's).
        #[serde(default)]
        tensile_strength: Option<Quantity>,
    },
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct GroupFile {
    pub member: String,
    #[serde(default)]
    pub continues: Option<String>,
    pub fastener: FastenerFile,
    pub diameter: Quantity,
    #[serde(default)]
    pub hole: Option<Quantity>,
    #[serde(default)]
    pub lines: Option<u32>,
    pub rows: u32,
    #[serde(default)]
    pub pitch: Option<Quantity>,
    #[serde(default)]
    pub gauge: Option<Quantity>,
    pub first_row: Quantity,
    #[serde(default)]
    pub offset: Option<Quantity>,
    #[serde(default)]
    pub edge: Option<Quantity>,
    #[serde(default)]
    pub planes: Option<u32>,
    #[serde(default)]
    pub lmid: Option<Quantity>,
}

#[derive(Debug, Deserialize)]
pub enum PlaneFile {
    Horizontal(Quantity),
    Vertical(Quantity),
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SpliceFile {
    pub members: Vec<String>,
    pub plates: Vec<SplicePlatesFile>,
    #[serde(default)]
    pub hole: Option<Quantity>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SplicePlatesFile {
    #[serde(default)]
    pub count: Option<u32>,
    pub width: Quantity,
    pub thickness: Quantity,
    #[serde(default)]
    pub holes: Option<u32>,
    #[serde(default)]
    pub fy: Option<Quantity>,
    #[serde(default)]
    pub fu: Option<Quantity>,
}

/// Bounds of a fastener pattern (far beyond any real joint; they keep a
/// hostile file from asking for billions of fasteners).
const MAX_LINES: u32 = 50;
const MAX_ROWS: u32 = 200;

/// Reads every joint, reporting each problem by joint and field.
pub(super) fn convert(
    ctx: &mut Ctx,
    file: &[GussetJointFile],
    node_ids: &IdMap,
    p: &Parts,
) -> Vec<GussetJoint> {
    let mut out = Vec::with_capacity(file.len());
    let mut seen = vec![false; p.nodes.len()];
    for j in file {
        let Some(&node) = node_ids.get(j.node.as_str()) else {
            ctx.error(
                format!(
                    "gusset joint at \"{}\": node \"{}\" is not defined",
                    j.node, j.node
                ),
                None,
            );
            continue;
        };
        if std::mem::replace(&mut seen[node], true) {
            ctx.error(
                format!(
                    "gusset joint at \"{}\" is given twice; give one per node",
                    j.node
                ),
                None,
            );
            continue;
        }
        if let Some(joint) = joint(ctx, j, node, p) {
            out.push(joint);
        }
    }
    out
}

/// Field reader of one joint: errors say "gusset joint at "L1": <field> ...".
struct R<'c, 'a, 'p, 'q> {
    ctx: &'c mut Ctx<'a>,
    p: &'p Parts<'q>,
    node: &'p str,
}

impl R<'_, '_, '_, '_> {
    /// The message names the joint and field; no line is given (the
    /// node's id also appears in supports and loads before the joint).
    fn err(&mut self, msg: String) {
        self.ctx
            .error(format!("gusset joint at \"{}\": {msg}", self.node), None);
    }
    fn what(&self, field: &str) -> String {
        format!("gusset joint at \"{}\": {field}", self.node)
    }
    fn length(&mut self, q: &Quantity, field: &str) -> Option<f64> {
        let w = self.what(field);
        let f = self.p.units.section.to_si;
        match q.to_si(Dimension::Length, f) {
            Ok(v) if v > 0.0 && v.is_finite() => Some(v),
            Ok(_) => {
                self.ctx.error(
                    format!(
                        "{w} must be positive, not {}",
                        q.show_in(self.p.units.section.name)
                    ),
                    None,
                );
                None
            }
            Err(e) => {
                self.ctx.error(format!("{w}: {e}"), None);
                None
            }
        }
    }
    fn signed_length(&mut self, q: &Quantity, field: &str) -> Option<f64> {
        let w = self.what(field);
        match q.to_si(Dimension::Length, self.p.units.section.to_si) {
            Ok(v) if v.is_finite() => Some(v),
            Ok(_) => None,
            Err(e) => {
                self.ctx.error(format!("{w}: {e}"), None);
                None
            }
        }
    }
    fn stress(&mut self, q: &Quantity, field: &str) -> Option<f64> {
        let w = self.what(field);
        positive(self.ctx, q, Dimension::Stress, self.p.units, &w, None)
    }
    fn count(&mut self, n: u32, field: &str) -> Option<u32> {
        if n == 0 {
            self.err(format!("{field} must be at least 1"));
            None
        } else {
            Some(n)
        }
    }
}

fn joint(ctx: &mut Ctx, j: &GussetJointFile, node: usize, p: &Parts) -> Option<GussetJoint> {
    let mut r = R {
        ctx,
        p,
        node: &j.node,
    };
    let mut notes = Vec::new();
    let plates = plates(&mut r, &j.plates, &mut notes);
    let outline = outline(&mut r, &j.outline);
    let mut groups = Vec::new();
    let mut used = Vec::new();
    for (i, g) in j.members.iter().enumerate() {
        if let Some(g) = group(&mut r, g, i, node, &mut notes) {
            for &m in &g.members {
                if used.contains(&m) {
                    r.err(format!(
                        "members[{i}]: member \"{}\" has two fastener groups",
                        p.members[m].id
                    ));
                }
                used.push(m);
            }
            groups.push(g);
        }
    }
    if j.members.is_empty() {
        r.err("members: give the fastener group of at least one member".into());
    }
    let attached =
        (0..p.members.len()).filter(|&m| p.members[m].start == node || p.members[m].end == node);
    for m in attached {
        if !used.contains(&m) {
            notes.push(format!("member \"{}\" has no fastener group at this joint: its fasteners and Whitmore section are not checked", p.members[m].id));
        }
    }
    let mut planes = Vec::new();
    for (i, pl) in j.shear_planes.iter().enumerate() {
        let (dir, q) = match pl {
            PlaneFile::Horizontal(q) => (PlaneDir::Horizontal, q),
            PlaneFile::Vertical(q) => (PlaneDir::Vertical, q),
        };
        let Some(at) = r.signed_length(q, &format!("shear_planes[{i}]")) else {
            continue;
        };
        planes.push(ShearPlane { dir, at });
    }
    if j.shear_planes.is_empty() {
        notes.push("no shear plane given: the full-plane shear checks (MBE 6A.6.12.6.6) are not made at this joint".into());
    }
    let splice = j
        .splice
        .as_ref()
        .and_then(|s| splice(&mut r, s, node, &groups, plates.as_ref()));
    let (plates, outline) = (plates?, outline?);
    derive_defaults(&r, &mut groups, &outline, &mut notes);
    let joint = GussetJoint {
        node,
        plates,
        outline,
        groups,
        planes,
        splice,
        notes,
    };
    geometry_checks(&mut r, &joint);
    Some(joint)
}

fn plates(r: &mut R, f: &PlatesFile, notes: &mut Vec<String>) -> Option<Plates> {
    let count = r.count(f.count.unwrap_or(1), "plates.count");
    if f.count.is_none() {
        notes.push("plates.count not given: one gusset plate taken".into());
    }
    let nominal = r.length(&f.thickness, "plates.thickness");
    let measured = match &f.measured_thickness {
        Some(q) => r.length(q, "plates.measured_thickness"),
        None => nominal,
    };
    let loss = f.loss_percent.unwrap_or(0.0);
    if !(0.0..100.0).contains(&loss) {
        r.err(format!(
            "plates.loss_percent must be from 0 to under 100, not {loss}"
        ));
    }
    let fy = r.stress(&f.fy, "plates.fy");
    let fu = r.stress(&f.fu, "plates.fu");
    let e = match &f.e {
        Some(q) => r.stress(q, "plates.e"),
        None => {
            notes.push("plates.e not given: E = 29,000 ksi taken (common practice)".into());
            Some(29_000.0 * KSI)
        }
    };
    let rp = match f.holes {
        Some(HolesFile::Drilled) => 1.0,
        Some(HolesFile::Punched) => 0.90,
        None => {
            notes.push("plates.holes not given: holes taken as punched full size, Rp = 0.90 (AASHTO LRFD 6.8.2.1, conservative)".into());
            0.90
        }
    };
    let thickness = measured? * (1.0 - loss / 100.0);
    if f.measured_thickness.is_some() || loss > 0.0 {
        notes.push(format!(
            "plates rated at {:.4} of their nominal thickness (measured thickness and section loss)",
            thickness / nominal?
        ));
    }
    Some(Plates {
        count: count?,
        thickness,
        nominal_thickness: nominal?,
        fy: fy?,
        fu: fu?,
        e: e?,
        rp,
    })
}

fn outline(r: &mut R, pts: &[(f64, f64)]) -> Option<Vec<P>> {
    let f = r.p.units.section.to_si;
    let poly: Vec<P> = pts.iter().map(|&(x, y)| [x * f, y * f]).collect();
    if poly.len() < 3 || poly.iter().any(|q| !(q[0].is_finite() && q[1].is_finite())) {
        r.err("outline needs at least three finite points (x, y) in the section unit".into());
        return None;
    }
    if crate::joint::gusset::outline::area2(&poly).abs() <= 0.0 {
        r.err("outline encloses no area".into());
        return None;
    }
    Some(poly)
}

fn fastener(r: &mut R, f: &FastenerFile, at: &str, notes: &mut Vec<String>) -> Option<Fastener> {
    match f {
        FastenerFile::Rivet {
            year,
            grade,
            shear_strength,
        } => {
            let g = match grade
                .as_deref()
                .map(|s| s.to_ascii_uppercase().replace([' ', '_'], "-"))
            {
                None => None,
                Some(s) if s == "A502-1" || s == "A502-GRADE-1" => Some(RivetGrade::A502Grade1),
                Some(s) if s == "A502-2" || s == "A502-GRADE-2" || s == "A502-3" => {
                    Some(RivetGrade::A502Grade2)
                }
                Some(s) => {
                    r.err(format!("{at}.fastener: rivet grade \"{s}\" is not known (use \"A502-1\" or \"A502-2\", or give shear_strength)"));
                    return None;
                }
            };
            if let Some(q) = shear_strength {
                let fv = r.stress(q, &format!("{at}.fastener.shear_strength"))?;
                return Some(Fastener::Rivet {
                    fv,
                    basis: "shear strength given".into(),
                });
            }
            let (fv, basis) = fast::rivet_strength(g, *year);
            if g.is_none() && year.is_none() {
                notes.push(format!("{at}: rivets of unknown year and grade: Fv = {:.0} ksi of rivets of unknown origin (MBE Table 6A.6.12.5.1-1, from memory)", fv / KSI));
            }
            Some(Fastener::Rivet {
                fv,
                basis: format!("{basis} (MBE Table 6A.6.12.5.1-1, from memory)"),
            })
        }
        FastenerFile::Bolt {
            grade,
            threads,
            tensile_strength,
        } => {
            let fub = match tensile_strength {
                Some(q) => r.stress(q, &format!("{at}.fastener.tensile_strength"))?,
                None => match grade.to_ascii_uppercase().as_str() {
                    "A307" => fast::FUB_A307,
                    "A325" | "F3125-A325" => fast::FUB_A325,
                    "A490" | "F3125-A490" => fast::FUB_A490,
                    other => {
                        r.err(format!("{at}.fastener: bolt grade \"{other}\" is not known (use A307, A325 or A490, or give tensile_strength)"));
                        return None;
                    }
                },
            };
            if threads.is_none() {
                notes.push(format!("{at}: bolt threads not said: taken as included in the shear planes (conservative)"));
            }
            Some(Fastener::Bolt {
                fub,
                threads_excluded: *threads == Some(ThreadsFile::Excluded),
                grade: grade.clone(),
            })
        }
    }
}

fn member_at(r: &mut R, name: &str, node: usize, field: &str) -> Option<usize> {
    let Some(m) = r.p.member_ids.get(name).filter(|_| r.p.members_ok) else {
        r.err(format!(
            "{field} refers to member \"{name}\", which is not defined"
        ));
        return None;
    };
    let mem = &r.p.members[m];
    if mem.start != node && mem.end != node {
        r.err(format!(
            "{field}: member \"{name}\" does not meet this node"
        ));
        return None;
    }
    Some(m)
}

/// Unit vector from `node` along member `m`.
fn axis(p: &Parts, m: usize, node: usize) -> P {
    let mem = &p.members[m];
    let other = if mem.start == node {
        mem.end
    } else {
        mem.start
    };
    let (a, b) = (&p.nodes[node], &p.nodes[other]);
    let l = (b.x - a.x).hypot(b.y - a.y);
    [(b.x - a.x) / l, (b.y - a.y) / l]
}

fn group(
    r: &mut R,
    g: &GroupFile,
    i: usize,
    node: usize,
    notes: &mut Vec<String>,
) -> Option<FastenerGroup> {
    let at = format!("members[{i}]");
    let m = member_at(r, &g.member, node, &format!("{at}.member"));
    let mut members = vec![m?];
    if let Some(c) = &g.continues {
        let c = member_at(r, c, node, &format!("{at}.continues"))?;
        let (u, v) = (axis(r.p, members[0], node), axis(r.p, c, node));
        if u[0] * v[0] + u[1] * v[1] > -0.99 {
            r.err(format!("{at}.continues: member \"{}\" is not in line with \"{}\" (a chord running through the joint)", r.p.members[c].id, g.member));
            return None;
        }
        members.push(c);
    }
    let fastener = fastener(r, &g.fastener, &at, notes);
    let diameter = r.length(&g.diameter, &format!("{at}.diameter"));
    let hole = match &g.hole {
        Some(q) => r.length(q, &format!("{at}.hole")),
        None => diameter.map(|d| d + INCH / 16.0),
    };
    let lines = r.count(g.lines.unwrap_or(1), &format!("{at}.lines"));
    let rows = r.count(g.rows, &format!("{at}.rows"));
    if lines.unwrap_or(1) > MAX_LINES || rows.unwrap_or(1) > MAX_ROWS {
        r.err(format!(
            "{at}: at most {MAX_LINES} lines and {MAX_ROWS} rows of fasteners in a group"
        ));
        return None;
    }
    let need = |r: &mut R, q: &Option<Quantity>, n: Option<u32>, field: &str| match (q, n) {
        (Some(q), _) => r.length(q, &format!("{at}.{field}")),
        (None, Some(n)) if n > 1 => {
            r.err(format!(
                "{at}.{field} is needed with more than one {}",
                if field == "pitch" { "row" } else { "line" }
            ));
            None
        }
        (None, _) => Some(0.0),
    };
    let pitch = need(r, &g.pitch, rows, "pitch");
    let gauge = need(r, &g.gauge, lines, "gauge");
    let first_row = r.signed_length(&g.first_row, &format!("{at}.first_row"));
    if members.len() == 1 && first_row.is_some_and(|f| f <= 0.0) {
        r.err(format!(
            "{at}.first_row must be positive (work point to the row nearest it, along the member)"
        ));
    }
    let offset = match &g.offset {
        Some(q) => r.signed_length(q, &format!("{at}.offset")),
        None => Some(0.0),
    };
    let edge = match &g.edge {
        Some(q) => r.length(q, &format!("{at}.edge")).map(Some),
        None => Some(None), // from the outline, once the joint is read
    };
    let planes = r.count(g.planes.unwrap_or(1), &format!("{at}.planes"));
    if g.planes.is_none() {
        notes.push(format!(
            "{at}: shear planes per fastener not given: single shear taken (conservative)"
        ));
    }
    let lmid = match &g.lmid {
        Some(q) => r.length(q, &format!("{at}.lmid")).map(Some),
        None => Some(None), // from the other groups, once the joint is read
    };
    let (d, h) = (diameter?, hole?);
    if h < d {
        r.err(format!("{at}.hole must not be smaller than the diameter"));
        return None;
    }
    Some(FastenerGroup {
        axis: axis(r.p, members[0], node),
        members,
        fastener: fastener?,
        diameter: d,
        hole: h,
        lines: lines?,
        rows: rows?,
        pitch: pitch?,
        gauge: gauge?,
        first_row: first_row?,
        offset: offset?,
        edge: edge?.unwrap_or(f64::NAN),
        planes: planes?,
        lmid: lmid?.unwrap_or(f64::NAN),
    })
}

fn splice(
    r: &mut R,
    s: &SpliceFile,
    node: usize,
    groups: &[FastenerGroup],
    plates: Option<&Plates>,
) -> Option<Splice> {
    let mut members = Vec::new();
    for (i, m) in s.members.iter().enumerate() {
        members.push(member_at(r, m, node, &format!("splice.members[{i}]"))?);
    }
    if members.is_empty() || s.plates.is_empty() {
        r.err("splice needs its members and at least one group of plates".into());
        return None;
    }
    let hole = match &s.hole {
        Some(q) => r.length(q, "splice.hole")?,
        None => groups.iter().map(|g| g.hole).fold(0.0, f64::max),
    };
    let mut out = Vec::new();
    for (i, f) in s.plates.iter().enumerate() {
        let at = format!("splice.plates[{i}]");
        let count = r.count(f.count.unwrap_or(1), &format!("{at}.count"));
        let width = r.length(&f.width, &format!("{at}.width"));
        let thickness = r.length(&f.thickness, &format!("{at}.thickness"));
        let fy = match &f.fy {
            Some(q) => r.stress(q, &format!("{at}.fy")),
            None => plates.map(|p| p.fy),
        };
        let fu = match &f.fu {
            Some(q) => r.stress(q, &format!("{at}.fu")),
            None => plates.map(|p| p.fu),
        };
        let holes = f.holes.unwrap_or(0);
        if let (Some(w), true) = (width, hole > 0.0) {
            if f64::from(holes) * hole >= w {
                r.err(format!("{at}: the holes take the whole width"));
            }
        }
        out.push(SplicePlates {
            count: count?,
            width: width?,
            thickness: thickness?,
            holes,
            fy: fy?,
            fu: fu?,
        });
    }
    Some(Splice {
        members,
        plates: out,
        hole,
    })
}

/// Edge distances from the outline and Lmid from the other groups where the
/// model gives none (NaN until here), said in one note per joint in the
/// model's section unit.
fn derive_defaults(r: &R, groups: &mut [FastenerGroup], outline: &[P], notes: &mut Vec<String>) {
    use crate::joint::gusset::derive;
    let sec = r.p.units.section;
    let show = |v: f64| format!("{} {}", crate::units::plain(v / sec.to_si), sec.name);
    let mut said = Vec::new();
    for i in 0..groups.len() {
        let id = &r.p.members[groups[i].members[0]].id;
        if groups[i].edge.is_nan() {
            let e = derive::edge(outline, &groups[i]);
            groups[i].edge = if e.is_finite() {
                e
            } else {
                1.5 * groups[i].diameter
            };
            if groups[i].members.len() == 1 {
                said.push(format!("{id} edge {}", show(groups[i].edge)));
            }
        }
        if groups[i].lmid.is_nan() {
            let l = derive::lmid(groups, i);
            groups[i].lmid = l.unwrap_or(groups[i].first_row.abs());
            if groups[i].members.len() == 1 {
                match l {
                    Some(l) => said.push(format!("{id} Lmid {}", show(l))),
                    None => said.push(format!(
                        "{id} Lmid {} (to the work point: no adjacent fastener line crossed)",
                        show(groups[i].lmid)
                    )),
                }
            }
        }
    }
    if !said.is_empty() {
        notes.push(format!(
            "taken from the geometry (edge distance along the member to the outline; Lmid to the nearest adjacent fastener line, MBE 6A.6.12.6.8): {}",
            said.join(", ")
        ));
    }
}

/// Geometry the checks need: every Whitmore section inside the plate, every plane cutting it.
fn geometry_checks(r: &mut R, j: &GussetJoint) {
    use crate::joint::gusset::{checks, outline};
    for (i, g) in j.groups.iter().enumerate() {
        if g.members.len() == 1 && !outline::inside(&j.outline, g.whitmore_centre()) {
            r.err(format!(
                "members[{i}]: the row nearest the work point lies outside the plate outline"
            ));
        }
        for q in g.positions() {
            if !outline::inside(&j.outline, q) {
                r.err(format!(
                    "members[{i}]: a fastener lies outside the plate outline"
                ));
                break;
            }
        }
    }
    for (i, pl) in j.planes.iter().enumerate() {
        let (length, _) = checks::plane_section(j, pl);
        if length <= 0.0 {
            r.err(format!(
                "shear_planes[{i}] does not cross the plate outline"
            ));
        }
    }
    for c in checks::of_joint(j) {
        if !(c.nominal > 0.0 && c.nominal.is_finite()) {
            let m = c.member.map_or(String::new(), |m| {
                format!(" of member \"{}\"", r.p.members[m].id)
            });
            r.err(format!(
                "{}{m} has no resistance (check the dimensions: holes wider than the section?)",
                c.kind.name()
            ));
        }
    }
}
