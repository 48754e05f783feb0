//! The gusset-plate checks of one joint as data: what each check's demand
//! is made of (which member forces, in which sense), its nominal
//! resistance, which resistance factor applies, its clause, equation and
//! inputs. `joint_check.rs` hands them to the joint framework.

use super::factors::Factors;
use super::types::{FastenerGroup, GussetJoint, PlaneDir};
use super::{
    bearing, block_shear, buckling, fasteners, net_section, outline, shear_plane, splice, whitmore,
};
use crate::units::Dimension;

/// What the check is.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Kind {
    /// Rivets in shear.
    FastenerShear,
    /// Bolts in shear.
    BoltShear,
    Bearing,
    WhitmoreYield,
    WhitmoreBuckling,
    NetFracture,
    BlockShear,
    ShearYield,
    ShearFracture,
    SpliceYield,
    SpliceFracture,
    SpliceCompression,
}

impl Kind {
    pub fn name(self) -> &'static str {
        match self {
            Kind::FastenerShear | Kind::BoltShear => "fastener shear",
            Kind::Bearing => "bearing at holes",
            Kind::WhitmoreYield => "Whitmore yield",
            Kind::WhitmoreBuckling => "Whitmore buckling",
            Kind::NetFracture => "net section fracture",
            Kind::BlockShear => "block shear",
            Kind::ShearYield => "plane shear yield",
            Kind::ShearFracture => "plane shear fracture",
            Kind::SpliceYield => "splice tension yield",
            Kind::SpliceFracture => "splice net fracture",
            Kind::SpliceCompression => "splice compression",
        }
    }

    /// The factor of this check among the method's joint factors.
    pub fn factor(self, f: &Factors) -> f64 {
        match self {
            Kind::FastenerShear | Kind::BoltShear => f.fastener,
            Kind::Bearing => f.bearing,
            Kind::WhitmoreYield | Kind::SpliceYield => f.gross_yield,
            Kind::WhitmoreBuckling | Kind::SpliceCompression => f.compression,
            Kind::NetFracture | Kind::SpliceFracture => f.net_fracture,
            Kind::BlockShear => f.block_shear,
            Kind::ShearYield => f.shear_yield,
            Kind::ShearFracture => f.shear_fracture,
        }
    }

    /// Clause under MBE Part A (LRFR) — subclause numbers from memory.
    pub fn clause_lrfr(self) -> &'static str {
        match self {
            Kind::FastenerShear => "MBE 6A.6.12.5.1, Table 6A.6.12.5.1-1 (from memory)",
            Kind::BoltShear => "MBE 6A.6.12.5.1; LRFD 6.13.2.7 (from memory)",
            Kind::Bearing => "MBE 6A.6.12.5; LRFD 6.13.2.9 (from memory)",
            Kind::WhitmoreYield => "MBE 6A.6.12.6.2 (from memory)",
            Kind::WhitmoreBuckling => "MBE 6A.6.12.6.8; LRFD 6.9.4.1.1 (from memory)",
            Kind::NetFracture => "MBE 6A.6.12.6.3; LRFD 6.8.2.1 (from memory)",
            Kind::BlockShear => "MBE 6A.6.12.6.4; LRFD 6.13.4 (from memory)",
            Kind::ShearYield | Kind::ShearFracture => "MBE 6A.6.12.6.6 (from memory)",
            Kind::SpliceYield | Kind::SpliceFracture | Kind::SpliceCompression => {
                "MBE 6A.6.12.6.9; LRFD 6.8.2.1 (from memory)"
            }
        }
    }

    /// Clause under MBE Part B (LFR, ASR).
    pub fn clause_part_b(self) -> &'static str {
        match self {
            Kind::FastenerShear | Kind::BoltShear | Kind::Bearing => {
                "MBE Part B, 2009 federal guidance: fasteners (from memory)"
            }
            Kind::WhitmoreYield | Kind::WhitmoreBuckling | Kind::NetFracture | Kind::BlockShear => {
                "MBE Part B, 2009 federal guidance: Whitmore, block shear (from memory)"
            }
            Kind::ShearYield | Kind::ShearFracture => {
                "MBE Part B, 2009 federal guidance: plane shear (from memory)"
            }
            Kind::SpliceYield | Kind::SpliceFracture | Kind::SpliceCompression => {
                "MBE Part B, 2009 federal guidance: chord splice (from memory)"
            }
        }
    }

    /// The nominal equation, without the factor.
    pub fn equation(self) -> &'static str {
        match self {
            Kind::FastenerShear => "n·Fv·Ab·Ns (× 0.83 beyond 38 in)",
            Kind::BoltShear => "n·0.56·Ab·Fub·Ns, 0.45 with threads in the shear plane (× 0.83 beyond 38 in)",
            Kind::Bearing => "Σ min(2.4·d·t·Fu, 1.2·Lc·t·Fu) over holes and plates",
            Kind::WhitmoreYield => "Fy·Lw·t·plates, Lw = (lines − 1)·g + 2·(rows − 1)·s·tan 30° within the plate",
            Kind::WhitmoreBuckling => "0.658^(Po/Pe)·Po (0.877·Pe if Pe/Po < 0.44), Po = Fy·Lw·t·plates, K = 0.5, r = t/√12",
            Kind::NetFracture => "Fu·An·Rp·U, An = (Lw − lines·dh)·t·plates ≤ 0.85·Ag, U = 1.0",
            Kind::BlockShear => "Rp·min(0.58·Fu·Avn, 0.58·Fy·Avg) + Rp·Ubs·Fu·Atn, Ubs = 1.0",
            Kind::ShearYield => "0.58·Fy·L·t·plates·Ω, Ω = 0.88",
            Kind::ShearFracture => "0.58·Fu·(L − holes·dh)·t·plates",
            Kind::SpliceYield => "Σ Fy·Ag of the splice plates",
            Kind::SpliceFracture => "Σ Fu·An·Rp of the splice plates, An ≤ 0.85·Ag",
            Kind::SpliceCompression => "Σ Fy·Ag of the splice plates (short column)",
        }
    }
}

/// How the demand is made from member forces (N, tension positive).
#[derive(Clone, Debug, PartialEq)]
pub enum Demand {
    /// |Σ cᵢ·Fᵢ| (fasteners, bearing, plane shear).
    Abs(Vec<(usize, f64)>),
    /// max(Σ cᵢ·Fᵢ, 0): the tension checks.
    Tension(Vec<(usize, f64)>),
    /// max(−Σ cᵢ·Fᵢ, 0): the compression checks.
    Compression(Vec<(usize, f64)>),
    /// max(|Σ aᵢ·Fᵢ|, |Σ bⱼ·Fⱼ|): a plane's shear from the free body on
    /// either side (equal by statics when every member at the joint has a
    /// group; the larger when not).
    Larger(Vec<(usize, f64)>, Vec<(usize, f64)>),
    /// |Σ Fᵢ·uᵢ|: a chord running through the joint.
    Vector(Vec<(usize, [f64; 2])>),
    /// The largest tension (or compression when `compression`) among members.
    Largest {
        members: Vec<usize>,
        compression: bool,
    },
}

impl Demand {
    pub fn of(&self, forces: &[f64]) -> f64 {
        let sum = |t: &[(usize, f64)]| t.iter().map(|&(m, c)| c * forces[m]).sum::<f64>();
        match self {
            Demand::Abs(t) => sum(t).abs(),
            Demand::Larger(a, b) => sum(a).abs().max(sum(b).abs()),
            Demand::Tension(t) => sum(t).max(0.0),
            Demand::Compression(t) => (-sum(t)).max(0.0),
            Demand::Vector(t) => {
                let (x, y) = t.iter().fold((0.0, 0.0), |(x, y), &(m, u)| {
                    (x + forces[m] * u[0], y + forces[m] * u[1])
                });
                x.hypot(y)
            }
            Demand::Largest {
                members,
                compression,
            } => members
                .iter()
                .map(|&m| if *compression { -forces[m] } else { forces[m] })
                .fold(0.0, f64::max),
        }
    }

    /// The members whose forces enter.
    pub fn uses(&self) -> Vec<usize> {
        let mut v: Vec<usize> = match self {
            Demand::Abs(t) | Demand::Tension(t) | Demand::Compression(t) => {
                t.iter().map(|x| x.0).collect()
            }
            Demand::Larger(a, b) => a.iter().chain(b).map(|x| x.0).collect(),
            Demand::Vector(t) => t.iter().map(|x| x.0).collect(),
            Demand::Largest { members, .. } => members.clone(),
        };
        v.sort_unstable();
        v.dedup();
        v
    }
}

/// One check of a joint, everything but the method's factor fixed.
#[derive(Clone, Debug, PartialEq)]
pub struct Check {
    pub node: usize,
    pub kind: Kind,
    pub member: Option<usize>,
    pub part: String,
    pub demand: Demand,
    /// Nominal resistance, N (> 0, validated at input).
    pub nominal: f64,
    pub inputs: Vec<(&'static str, f64, Option<Dimension>)>,
}

impl Check {
    /// (demand, factored or allowable resistance), N.
    pub fn evaluate(&self, forces: &[f64], f: &Factors) -> (f64, f64) {
        (self.demand.of(forces), self.kind.factor(f) * self.nominal)
    }
}

/// The Whitmore figures of a group: (effective width, spread width, slenderness K·L/r).
pub fn whitmore_of(j: &GussetJoint, g: &FastenerGroup) -> (f64, f64, f64) {
    let spread = whitmore::spread_width(g.lines, g.gauge, g.rows, g.pitch);
    let (w, s) = whitmore::width_in_plate(&j.outline, g.whitmore_centre(), g.axis, spread);
    (w, s, buckling::slenderness(g.lmid, j.plates.thickness))
}

fn part(j: &GussetJoint, what: &str) -> String {
    format!(
        "{} gusset plate{} {what}",
        j.plates.count,
        if j.plates.count == 1 { "" } else { "s" }
    )
}

/// Every check of joint `j`.
pub fn of_joint(j: &GussetJoint) -> Vec<Check> {
    let mut out = Vec::new();
    for g in &j.groups {
        group_checks(j, g, &mut out);
    }
    plane_checks(j, &mut out);
    splice_checks(j, &mut out);
    out
}

fn group_checks(j: &GussetJoint, g: &FastenerGroup, out: &mut Vec<Check>) {
    use Dimension::{Area, Length, Stress};
    let p = &j.plates;
    let t = p.thickness;
    let m = g.members[0];
    let length = f64::from(g.rows.saturating_sub(1)) * g.pitch;
    let (rn_one, strength, what, kind) = match &g.fastener {
        super::types::Fastener::Rivet { fv, .. } => (
            fasteners::rivet_rn(g.diameter, *fv, g.planes),
            *fv,
            "Fv",
            Kind::FastenerShear,
        ),
        super::types::Fastener::Bolt {
            fub,
            threads_excluded,
            ..
        } => (
            fasteners::bolt_rn(g.diameter, *fub, *threads_excluded, g.planes),
            *fub,
            "Fub",
            Kind::BoltShear,
        ),
    };
    let n = g.count();
    let (whole, continuous) = if g.members.len() > 1 {
        let u2 = g.axis;
        let v: Vec<(usize, [f64; 2])> = g
            .members
            .iter()
            .map(|&k| (k, if k == m { u2 } else { [-u2[0], -u2[1]] }))
            .collect();
        (Demand::Vector(v), true)
    } else {
        (Demand::Abs(vec![(m, 1.0)]), false)
    };
    let check = |kind, demand, nominal, inputs| Check {
        node: j.node,
        kind,
        member: Some(m),
        part: part(j, &format!("and {n} fasteners")),
        demand,
        nominal,
        inputs,
    };
    out.push(check(
        kind,
        whole.clone(),
        fasteners::group_rn(n, rn_one, length),
        vec![
            ("n", f64::from(n), None),
            ("d", g.diameter, Some(Length)),
            (what, strength, Some(Stress)),
            ("Ns", f64::from(g.planes), None),
            ("long-joint factor", fasteners::long_joint(length), None),
        ],
    ));
    let pat = bearing::Pattern {
        lines: g.lines,
        rows: g.rows,
        pitch: g.pitch,
        edge: g.edge,
        diameter: g.diameter,
        hole: g.hole,
    };
    out.push(check(
        Kind::Bearing,
        whole,
        bearing::group_rn(&pat, t, p.fu, p.count),
        vec![
            ("d", g.diameter, Some(Length)),
            ("t", t, Some(Length)),
            ("Fu", p.fu, Some(Stress)),
            ("edge", g.edge, Some(Length)),
            ("s", g.pitch, Some(Length)),
            ("dh", g.hole, Some(Length)),
        ],
    ));
    if continuous {
        return; // a chord running through: its Whitmore section is not a member end
    }
    let (lw, spread, klr) = whitmore_of(j, g);
    let ag = lw * t * f64::from(p.count);
    let axial = vec![(m, 1.0)];
    out.push(check(
        Kind::WhitmoreYield,
        Demand::Tension(axial.clone()),
        p.fy * ag,
        vec![
            ("Lw", lw, Some(Length)),
            ("spread", spread, Some(Length)),
            ("t", t, Some(Length)),
            ("Fy", p.fy, Some(Stress)),
        ],
    ));
    out.push(check(
        Kind::WhitmoreBuckling,
        Demand::Compression(axial.clone()),
        buckling::pn(ag, p.fy, p.e, klr),
        vec![
            ("Lw", lw, Some(Length)),
            ("Lmid", g.lmid, Some(Length)),
            ("K·L/r", klr, None),
            ("Fy", p.fy, Some(Stress)),
        ],
    ));
    let an = net_section::net_area(lw, g.lines, g.hole, t, p.count);
    out.push(check(
        Kind::NetFracture,
        Demand::Tension(axial.clone()),
        net_section::rn(p.fu, an, p.rp, 1.0),
        vec![
            ("An", an, Some(Area)),
            ("Fu", p.fu, Some(Stress)),
            ("Rp", p.rp, None),
        ],
    ));
    let b = block_shear::block(
        g.lines, g.gauge, g.rows, g.pitch, g.edge, g.hole, t, p.count,
    );
    out.push(check(
        Kind::BlockShear,
        Demand::Tension(axial),
        block_shear::rn(&b, p.fy, p.fu, p.rp),
        vec![
            ("Avg", b.avg, Some(Area)),
            ("Avn", b.avn, Some(Area)),
            ("Atn", b.atn, Some(Area)),
            ("Rp", p.rp, None),
        ],
    ));
}

/// The plane's direction, a point on it and its name.
fn plane_line(pl: &super::types::ShearPlane) -> ([f64; 2], [f64; 2], &'static str) {
    match pl.dir {
        PlaneDir::Horizontal => ([1.0, 0.0], [0.0, pl.at], "horizontal"),
        PlaneDir::Vertical => ([0.0, 1.0], [pl.at, 0.0], "vertical"),
    }
}

/// Length of plate on a plane and the holes it passes through.
pub fn plane_section(j: &GussetJoint, pl: &super::types::ShearPlane) -> (f64, u32) {
    let (d, o, _) = plane_line(pl);
    let length = outline::cut_length(&j.outline, o, d);
    let holes = j
        .groups
        .iter()
        .flat_map(|g| g.positions().into_iter().map(move |q| (q, g.hole)))
        .filter(|&(q, h)| {
            let dist = (q[0] - o[0]) * d[1] - (q[1] - o[1]) * d[0];
            dist.abs() < h / 2.0
        })
        .count() as u32;
    (length, holes)
}

fn plane_checks(j: &GussetJoint, out: &mut Vec<Check>) {
    use Dimension::{Area, Length, Stress};
    let p = &j.plates;
    for pl in &j.planes {
        let (d, o, name) = plane_line(pl);
        // The free bodies on either side: groups by their centroid's side
        // (a group straddling the plane belongs to neither).
        let normal = [d[1], -d[0]];
        let coord = |q: [f64; 2]| -((q[0] - o[0]) * normal[0] + (q[1] - o[1]) * normal[1]);
        let (mut pos, mut neg) = (Vec::new(), Vec::new());
        for g in &j.groups {
            let c = coord(g.centroid());
            if c.abs() < 1e-9 {
                continue;
            }
            for (k, &m) in g.members.iter().enumerate() {
                let u = if k == 0 {
                    g.axis
                } else {
                    [-g.axis[0], -g.axis[1]]
                };
                let t = (m, u[0] * d[0] + u[1] * d[1]);
                if c > 0.0 {
                    pos.push(t)
                } else {
                    neg.push(t)
                }
            }
        }
        let (length, holes) = plane_section(j, pl);
        let hole = j.groups.iter().map(|g| g.hole).fold(0.0, f64::max);
        let anv = shear_plane::net_area(length, holes, hole, p.thickness, p.count);
        let part = part(j, &format!("on the {name} plane"));
        out.push(Check {
            node: j.node,
            kind: Kind::ShearYield,
            member: None,
            part: part.clone(),
            demand: Demand::Larger(pos.clone(), neg.clone()),
            nominal: shear_plane::yield_rn(p.fy, length, p.thickness, p.count),
            inputs: vec![
                ("L", length, Some(Length)),
                ("t", p.thickness, Some(Length)),
                ("Fy", p.fy, Some(Stress)),
                ("Ω", shear_plane::OMEGA, None),
            ],
        });
        out.push(Check {
            node: j.node,
            kind: Kind::ShearFracture,
            member: None,
            part,
            demand: Demand::Larger(pos, neg),
            nominal: shear_plane::fracture_rn(p.fu, anv),
            inputs: vec![
                ("L", length, Some(Length)),
                ("holes", f64::from(holes), None),
                ("Anv", anv, Some(Area)),
                ("Fu", p.fu, Some(Stress)),
            ],
        });
    }
}

fn splice_checks(j: &GussetJoint, out: &mut Vec<Check>) {
    use Dimension::{Area, Stress};
    let Some(s) = &j.splice else { return };
    let (fy_ag, fu_an) = splice::strengths(&s.plates, s.hole);
    let ag: f64 = s
        .plates
        .iter()
        .map(|p| p.width * p.thickness * f64::from(p.count))
        .sum();
    let plates: u32 = s.plates.iter().map(|p| p.count).sum();
    let part = format!(
        "{plates} splice plate{}",
        if plates == 1 { "" } else { "s" }
    );
    let member = s.members.first().copied();
    for (kind, nominal, compression) in [
        (Kind::SpliceYield, fy_ag, false),
        (Kind::SpliceFracture, fu_an * j.plates.rp, false),
        (Kind::SpliceCompression, fy_ag, true),
    ] {
        out.push(Check {
            node: j.node,
            kind,
            member,
            part: part.clone(),
            demand: Demand::Largest {
                members: s.members.clone(),
                compression,
            },
            nominal,
            inputs: vec![
                ("Ag", ag, Some(Area)),
                ("Fy·Ag", fy_ag, Some(Dimension::Force)),
                ("Fu·An", fu_an, Some(Dimension::Force)),
                ("Rp", j.plates.rp, None),
                ("Fy", s.plates.first().map_or(0.0, |p| p.fy), Some(Stress)),
            ],
        });
    }
}
