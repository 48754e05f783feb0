//! Every buckling mode of one compression member and the slender-element
//! reduction of its section, as AISC 360-16 Chapter E defines them (the same
//! equations as AASHTO LRFD 6.9.4.1 and 6.9.4.2 — from memory):
//!
//! * flexural buckling (§E3) about both principal axes of the section. When
//!   `Ixy ≠ 0` a principal axis is inclined to the truss plane; the
//!   effective length of a mode whose deflection is neither in nor out of the
//!   truss plane is taken as the larger of the in-plane and out-of-plane
//!   effective lengths (conservative: bracing in either plane holds it at
//!   the shorter spacing too). A mode whose deflection lies in (or normal to)
//!   the truss plane keeps that plane's effective length;
//! * torsional buckling (§E4, Eq. E4-2) of a section whose shear centre is
//!   its centroid, and flexural-torsional buckling of singly symmetric
//!   (Eq. E4-3) and unsymmetric (Eq. E4-4, the lowest root of the cubic)
//!   sections, in principal axes, with `ro² = x0² + y0² + (Ix + Iy)/Ag`
//!   (Eq. E4-9), `H = 1 − (x0² + y0²)/ro²` (Eq. E4-8) and
//!   `Fez = (π²·E·Cw/Lcz² + G·J)/(Ag·ro²)` (Eq. E4-7). The torsional
//!   effective length `Lcz` is taken as the larger of the two flexural ones
//!   (conservative; no separate torsional bracing is described);
//! * the slender-element reduction of §E7: each plate element of the
//!   section classified by its width-to-thickness ratio against λr of
//!   Table B4.1a, and the effective area `Ae` of Eqs. E7-2/E7-3 with the
//!   constants of Table E7.1, given the critical stress `Fcr`.
//!
//! Each mode carries its elastic buckling stress `Fe` and an equivalent
//! slenderness `π·√(E/Fe)`, the K·L/r that gives the same Euler stress, so a
//! column curve written in slenderness (every curve in `capacity`) can be
//! entered with the governing mode (§E3 with `Fe` of §E4, as §E4(a) directs).
//!
//! A single angle connected through one leg also gets the equivalent
//! slenderness of §E5 as a mode of its own (`single_angle`: added beside the
//! principal-axis and §E4 modes, the lowest governs). Not covered here: the
//! effect of lacing on torsion (ignored: conservative).

use super::RateError;
use crate::model::Model;
use crate::section::{self, Shape};
use std::f64::consts::PI;

/// `G/E` used for the St-Venant term: AISC 360-16 takes G = 11,200 ksi with
/// E = 29,000 ksi (from memory), G/E = 0.3862.
pub const SHEAR_MODULUS_RATIO: f64 = 11_200.0 / 29_000.0;

/// A buckling mode.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ModeKind {
    /// Flexural, deflecting in the truss plane.
    FlexuralIn,
    /// Flexural, deflecting out of the truss plane.
    FlexuralOut,
    /// Flexural about the major principal axis (inclined to the truss plane).
    FlexuralMajor,
    /// Flexural about the minor principal axis (inclined to the truss plane).
    FlexuralMinor,
    /// Torsional (shear centre at the centroid), Eq. E4-2.
    Torsional,
    /// Flexural-torsional, singly symmetric section, Eq. E4-3.
    FlexuralTorsionalSingly,
    /// Flexural-torsional, unsymmetric section, Eq. E4-4.
    FlexuralTorsional,
    /// A single angle connected through one leg: the equivalent slenderness
    /// of §E5 (`rate::single_angle`).
    SingleAngle(super::single_angle::E5Equation),
}

impl ModeKind {
    pub fn name(self) -> &'static str {
        match self {
            ModeKind::FlexuralIn => "flexural, in plane",
            ModeKind::FlexuralOut => "flexural, out of plane",
            ModeKind::FlexuralMajor => "flexural, major principal axis",
            ModeKind::FlexuralMinor => "flexural, minor principal axis",
            ModeKind::Torsional => "torsional",
            ModeKind::FlexuralTorsionalSingly | ModeKind::FlexuralTorsional => "flexural-torsional",
            ModeKind::SingleAngle(_) => "single angle through one leg, equivalent slenderness",
        }
    }
    pub fn clause(self) -> &'static str {
        match self {
            ModeKind::FlexuralIn
            | ModeKind::FlexuralOut
            | ModeKind::FlexuralMajor
            | ModeKind::FlexuralMinor => "AISC 360-16 §E3, Eq. E3-4",
            ModeKind::Torsional => "AISC 360-16 §E4, Eq. E4-2",
            ModeKind::FlexuralTorsionalSingly => "AISC 360-16 §E4, Eq. E4-3",
            ModeKind::FlexuralTorsional => "AISC 360-16 §E4, Eq. E4-4",
            ModeKind::SingleAngle(eq) => eq.clause(),
        }
    }
    pub fn is_flexural(self) -> bool {
        matches!(
            self,
            ModeKind::FlexuralIn
                | ModeKind::FlexuralOut
                | ModeKind::FlexuralMajor
                | ModeKind::FlexuralMinor
                | ModeKind::SingleAngle(_)
        )
    }
}

/// One buckling mode of a member (SI).
#[derive(Clone, Debug, PartialEq)]
pub struct BucklingMode {
    pub kind: ModeKind,
    /// Elastic buckling stress Fe, Pa.
    pub fe: f64,
    /// π·√(E/Fe): the K·L/r with the same Euler stress.
    pub slenderness: f64,
    /// Effective length (flexural: of the mode; torsional: Lcz), m.
    pub effective_length: f64,
    /// Radius of gyration of a flexural mode (m); ro for §E4 modes.
    pub radius: f64,
}

/// A plate element of the section for §E7.
#[derive(Clone, Debug, PartialEq)]
pub struct PlateElement {
    /// Index of the part and a description ("south channel web").
    pub part: usize,
    pub name: String,
    /// Width and thickness, m (as inspected).
    pub b: f64,
    pub t: f64,
    /// Table B4.1a case and λr.
    pub case: &'static str,
    pub lambda_r: f64,
    pub stiffened: bool,
    /// Table E7.1 constants.
    pub c1: f64,
    pub c2: f64,
}

impl PlateElement {
    pub fn ratio(&self) -> f64 {
        self.b / self.t
    }
    pub fn slender(&self) -> bool {
        self.ratio() > self.lambda_r
    }
    /// Effective width by AISC 360-16 §E7.1 for a critical stress `fcr`:
    /// `be = b` when `λ ≤ λr·√(Fy/Fcr)` (Eq. E7-2), otherwise
    /// `be = b·(1 − c1·√(Fel/Fcr))·√(Fel/Fcr)` (Eq. E7-3) with
    /// `Fel = (c2·λr/λ)²·Fy` (Eq. E7-5).
    pub fn effective_width(&self, fy: f64, fcr: f64) -> f64 {
        let l = self.ratio();
        if fcr.is_nan() || fcr <= 0.0 || l <= self.lambda_r * (fy / fcr).sqrt() {
            return self.b;
        }
        let fel = (self.c2 * self.lambda_r / l).powi(2) * fy;
        let k = (fel / fcr).sqrt();
        (self.b * (1.0 - self.c1 * k) * k).clamp(0.0, self.b)
    }
}

/// Effective area of §E7 at one critical stress.
#[derive(Clone, Debug, PartialEq)]
pub struct EffectiveArea {
    /// Ae, m², and Ae/Ag.
    pub area: f64,
    pub ratio: f64,
    /// The element that loses the most area, if any is reduced.
    pub governing: Option<usize>,
}

/// All modes of one member and its plate elements.
#[derive(Clone, Debug, PartialEq)]
pub struct CompressionModes {
    pub modes: Vec<BucklingMode>,
    /// Index into `modes` of the lowest Fe.
    pub governing: usize,
    pub elements: Vec<PlateElement>,
    /// Gross area (m²), Fy and E (Pa).
    pub area: f64,
    pub fy: f64,
    pub e: f64,
    /// What was not checked or was assumed, for the report.
    pub notes: Vec<String>,
}

impl CompressionModes {
    pub fn governing(&self) -> &BucklingMode {
        &self.modes[self.governing]
    }
    /// The slenderness to enter a column curve with: the governing mode's.
    pub fn slenderness(&self) -> f64 {
        self.governing().slenderness
    }
    /// AISC 360-16 §E7, Eq. E7-1: `Pn = Fcr·Ae`, with `Ae = Ag − Σ(b − be)·t`.
    pub fn effective_area(&self, fcr: f64) -> EffectiveArea {
        let mut lost = 0.0;
        let mut governing = None;
        let mut worst = 0.0;
        for (i, el) in self.elements.iter().enumerate() {
            let d = (el.b - el.effective_width(self.fy, fcr)) * el.t;
            lost += d;
            if d > worst {
                worst = d;
                governing = Some(i);
            }
        }
        let area = (self.area - lost).max(0.0);
        EffectiveArea {
            area,
            ratio: area / self.area,
            governing,
        }
    }
    /// The element with the largest b/t over its λr.
    pub fn most_slender(&self) -> Option<&PlateElement> {
        self.elements
            .iter()
            .max_by(|a, b| (a.ratio() / a.lambda_r).total_cmp(&(b.ratio() / b.lambda_r)))
    }
}

/// π²E/(KL/r)² with its equivalent slenderness.
fn flexural(kind: ModeKind, e: f64, kl: f64, r: f64) -> BucklingMode {
    let s = kl / r;
    BucklingMode {
        kind,
        fe: PI * PI * e / (s * s),
        slenderness: s,
        effective_length: kl,
        radius: r,
    }
}

/// Every buckling mode of member `m` and its section's plate elements.
pub fn compression_modes(model: &Model, m: usize) -> Result<CompressionModes, RateError> {
    let mem = &model.members[m];
    let mat = &model.materials[mem.material];
    let sec = &model.sections[mem.section];
    let fy = mat.fy.ok_or_else(|| RateError::NoYield(mat.id.clone()))?;
    let e = mat.e;
    let l = model.length(m);
    let kl_in = mem.k_in * mem.unbraced_in.unwrap_or(l);
    let kl_out = mem.k_out * mem.unbraced_out.unwrap_or(l);
    let mut notes = Vec::new();
    let mut modes = Vec::new();
    let mut elements = Vec::new();
    match &sec.built_up {
        None => {
            let f1 = flexural(ModeKind::FlexuralIn, e, kl_in, sec.r_in());
            let f2 = flexural(ModeKind::FlexuralOut, e, kl_out, sec.r_out());
            match &sec.torsion {
                // Given J, Cw, x0 (across the plane), y0 (in it): axis 1 is x
                // (i_in = Ix, x0 along it), axis 2 is y (i_out = Iy).
                Some(t) => {
                    let lcz = kl_in.max(kl_out);
                    let tm = torsional_mode(
                        e,
                        sec.area,
                        sec.i_in,
                        sec.i_out,
                        t.j,
                        t.cw,
                        t.shear_centre_x,
                        t.shear_centre_y,
                        lcz,
                        &f1,
                        &f2,
                    );
                    if tm.fe.is_finite() && tm.fe > 0.0 {
                        modes.push(tm);
                    }
                }
                None => notes.push(
                    "torsional and flexural-torsional buckling (AISC 360-16 §E4) not checked: the section is given by its properties only (no j, cw, x0, y0)".into(),
                ),
            }
            modes.insert(0, f2);
            modes.insert(0, f1);
        }
        Some(b) => {
            let p = &b.reduced;
            let th = p.principal_angle;
            let (e1, e2) = ((th.cos(), th.sin()), (-th.sin(), th.cos()));
            let in_dir = if b.x_in_plane { (1.0, 0.0) } else { (0.0, 1.0) };
            let length_for = |d: (f64, f64), major: bool| {
                let c = (d.0 * in_dir.0 + d.1 * in_dir.1).abs();
                if c >= 1.0 - 1e-10 {
                    (ModeKind::FlexuralIn, kl_in)
                } else if c <= 1e-5 {
                    (ModeKind::FlexuralOut, kl_out)
                } else if major {
                    (ModeKind::FlexuralMajor, kl_in.max(kl_out))
                } else {
                    (ModeKind::FlexuralMinor, kl_in.max(kl_out))
                }
            };
            let (r1, r2) = ((p.i_major / p.area).sqrt(), (p.i_minor / p.area).sqrt());
            // About the major axis the deflection is along e2, and vice versa.
            let (k1, l1) = length_for(e2, true);
            let (k2, l2) = length_for(e1, false);
            let f1 = flexural(k1, e, l1, r1);
            let f2 = flexural(k2, e, l2, r2);
            if !matches!(k2, ModeKind::FlexuralIn | ModeKind::FlexuralOut) {
                notes.push(format!(
                    "principal axes inclined {:.1}° to the section axes (Ixy ≠ 0): flexural buckling about both principal axes with the larger effective length (conservative)",
                    th.to_degrees()
                ));
            }
            match &b.torsion {
                Some(t) => {
                    let (dx, dy) = (t.shear_centre_x - p.centroid_x, t.shear_centre_y - p.centroid_y);
                    let x0 = dx * e1.0 + dy * e1.1;
                    let y0 = dx * e2.0 + dy * e2.1;
                    let lcz = kl_in.max(kl_out);
                    let tm = torsional_mode(
                        e, p.area, p.i_major, p.i_minor, t.j, t.cw, x0, y0, lcz, &f1, &f2,
                    );
                    if tm.fe.is_finite() && tm.fe > 0.0 {
                        modes.push(tm);
                    } else {
                        notes.push("torsional buckling (AISC 360-16 §E4) not checked: the section has no torsional stiffness by thin-walled theory".into());
                    }
                }
                None => notes.push(
                    "torsional and flexural-torsional buckling (AISC 360-16 §E4) not checked: a part is given by table properties only (no J, Cw or shear centre)".into(),
                ),
            }
            modes.insert(0, f2);
            modes.insert(0, f1);
            // AISC 360-16 §E5: a single angle through one leg.
            let (sa, sa_notes) = super::single_angle::single_angle_mode(model, m, b, e);
            modes.extend(sa);
            notes.extend(sa_notes);
            // The parts were validated on input; an error here is reported, not fatal.
            elements = plate_elements(&b.parts, e, fy).unwrap_or_else(|err| {
                notes.push(format!(
                    "slender elements (AISC 360-16 §E7) not classified: {err}"
                ));
                Vec::new()
            });
        }
    }
    let governing = modes
        .iter()
        .enumerate()
        .min_by(|a, b| a.1.fe.total_cmp(&b.1.fe))
        .map(|(i, _)| i)
        .unwrap_or(0);
    Ok(CompressionModes {
        modes,
        governing,
        elements,
        area: sec.area,
        fy,
        e,
        notes,
    })
}

/// The §E4 mode in principal axes: `x0`, `y0` along the major (1) and minor
/// (2) axes, `f1`, `f2` the flexural modes about them (Fex, Fey).
#[allow(clippy::too_many_arguments)]
fn torsional_mode(
    e: f64,
    area: f64,
    i1: f64,
    i2: f64,
    j: f64,
    cw: f64,
    x0: f64,
    y0: f64,
    lcz: f64,
    f1: &BucklingMode,
    f2: &BucklingMode,
) -> BucklingMode {
    let ro2 = x0 * x0 + y0 * y0 + (i1 + i2) / area;
    let fez = (PI * PI * e * cw / (lcz * lcz) + SHEAR_MODULUS_RATIO * e * j) / (area * ro2);
    let tol = 1e-6 * ro2.sqrt();
    let (kind, fe) = if x0.abs() <= tol && y0.abs() <= tol {
        (ModeKind::Torsional, fez)
    } else if x0.abs() <= tol {
        // Symmetric about axis 2 (x0 = 0): couples with flexure about it.
        (
            ModeKind::FlexuralTorsionalSingly,
            e4_3(f2.fe, fez, y0 * y0 / ro2),
        )
    } else if y0.abs() <= tol {
        (
            ModeKind::FlexuralTorsionalSingly,
            e4_3(f1.fe, fez, x0 * x0 / ro2),
        )
    } else {
        (
            ModeKind::FlexuralTorsional,
            e4_4(f1.fe, f2.fe, fez, x0 * x0 / ro2, y0 * y0 / ro2),
        )
    };
    BucklingMode {
        kind,
        fe,
        slenderness: PI * (e / fe).sqrt(),
        effective_length: lcz,
        radius: ro2.sqrt(),
    }
}

/// AISC 360-16 Eq. E4-3 with `H = 1 − c²` (`c² = (offset/ro)²`):
/// `Fe = (Fa + Fez)/(2H)·[1 − √(1 − 4·Fa·Fez·H/(Fa + Fez)²)]`, `Fa` the
/// flexural stress about the axis of symmetry.
pub fn e4_3(fa: f64, fez: f64, c2: f64) -> f64 {
    let h = 1.0 - c2;
    let s = fa + fez;
    // 1 − √(1 − q) written as q/(1 + √(1 − q)) to keep digits when q is small.
    let q = 4.0 * fa * fez * h / (s * s);
    s / (2.0 * h) * q / (1.0 + (1.0 - q).max(0.0).sqrt())
}

/// Lowest root of AISC 360-16 Eq. E4-4:
/// `(Fe − Fex)(Fe − Fey)(Fe − Fez) − Fe²(Fe − Fey)(x0/ro)² − Fe²(Fe − Fex)(y0/ro)² = 0`,
/// found by bisection on `(0, min(Fex, Fey, Fez)]` where the cubic changes
/// sign (it is −Fex·Fey·Fez at 0 and ≥ 0 at the smallest of the three).
pub fn e4_4(fex: f64, fey: f64, fez: f64, cx2: f64, cy2: f64) -> f64 {
    let f = |x: f64| {
        (x - fex) * (x - fey) * (x - fez) - x * x * (x - fey) * cx2 - x * x * (x - fex) * cy2
    };
    let (mut lo, mut hi) = (0.0, fex.min(fey).min(fez));
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if f(mid) < 0.0 {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    0.5 * (lo + hi)
}

/// Plate elements of a built-up section (as inspected) with their Table B4.1a
/// case (AISC 360-16, from memory):
/// * case 1, λr = 0.56√(E/Fy): flanges of rolled I-shapes, channels, tees;
/// * case 3, λr = 0.45√(E/Fy): angle legs and plate overhangs beyond the
///   outermost line of support ("all other unstiffened elements"; taken for
///   angles in contact too — conservative);
/// * case 4, λr = 0.75√(E/Fy): stems of tees;
/// * case 5, λr = 1.49√(E/Fy): webs of I-shapes and channels (h = d − 2tf);
/// * case 6, λr = 1.40√(E/Fy): walls of rectangular tubes (b = side − 3t);
/// * case 7, λr = 1.40√(E/Fy): cover plates between lines of fasteners.
///
/// A plate's lines of support are where other parts touch it: the element
/// between supports runs between the outer ends of the outermost contacts
/// and each overhang from the inner end of the outermost contact to the
/// edge (both at least as wide as about the rivet lines: conservative), or
/// the `gauge` given between its two lines of fasteners sets them. A plate
/// touched by one part only is one overhang (unstiffened) on its wider side;
/// touched by nothing, one unstiffened element of its full width.
pub fn plate_elements(
    parts: &[section::PlacedPart],
    e: f64,
    fy: f64,
) -> Result<Vec<PlateElement>, section::SectionError> {
    let root = (e / fy).sqrt();
    let mut out = Vec::new();
    for (i, p) in parts.iter().enumerate() {
        let shape = match section::apply_loss(i, &p.shape, p.loss.as_ref())? {
            section::Condition::Missing => continue,
            section::Condition::Present {
                shape, area_factor, ..
            } => scale_thickness(&shape, area_factor),
        };
        let label = p.label.clone().unwrap_or_else(|| format!("part {}", i + 1));
        let mut push = |what: &str, b: f64, t: f64, case: &'static str, k: f64, stiff: bool| {
            let (c1, c2) = match (stiff, case) {
                (true, "case 6") => (0.20, 1.38),
                (true, _) => (0.18, 1.31),
                (false, _) => (0.22, 1.49),
            };
            out.push(PlateElement {
                part: i,
                name: format!("{label} {what}"),
                b,
                t,
                case,
                lambda_r: k * root,
                stiffened: stiff,
                c1,
                c2,
            });
        };
        match shape {
            Shape::Plate { width, thickness } | Shape::EyeBar { width, thickness } => {
                let mut c = section::torsion::plate_contacts(parts, i)?;
                if let Some(g) = p.gauge {
                    let (a, z) = ((width - g) / 2.0, (width + g) / 2.0);
                    c = vec![(a, a), (z, z)];
                }
                // Supports: the outer ends of the outermost contacts bound
                // the element between them, the inner ends the overhangs.
                let lo = c.iter().map(|x| x.0).fold(f64::INFINITY, f64::min);
                let hi = c.iter().map(|x| x.1).fold(f64::NEG_INFINITY, f64::max);
                let first_in = c
                    .iter()
                    .filter(|x| x.0 == lo)
                    .map(|x| x.1)
                    .fold(lo, f64::max);
                let last_in = c
                    .iter()
                    .filter(|x| x.1 == hi)
                    .map(|x| x.0)
                    .fold(hi, f64::min);
                let tiny = 1e-9 * width;
                if c.is_empty() {
                    push("(unsupported)", width, thickness, "case 3", 0.45, false);
                } else if hi - lo > tiny && c.len() > 1 {
                    push("between supports", hi - lo, thickness, "case 7", 1.40, true);
                    for (w, side) in [(first_in, "overhang 1"), (width - last_in, "overhang 2")] {
                        if w > tiny {
                            push(side, w, thickness, "case 3", 0.45, false);
                        }
                    }
                } else {
                    let w = last_in.max(width - first_in);
                    push("overhang", w, thickness, "case 3", 0.45, false);
                }
            }
            Shape::Channel {
                depth,
                flange_width,
                web_thickness,
                flange_thickness,
                ..
            } => {
                push(
                    "flange",
                    flange_width,
                    flange_thickness,
                    "case 1",
                    0.56,
                    false,
                );
                push(
                    "web",
                    depth - 2.0 * flange_thickness,
                    web_thickness,
                    "case 5",
                    1.49,
                    true,
                );
            }
            Shape::IShape {
                depth,
                flange_width,
                web_thickness,
                flange_thickness,
                ..
            } => {
                push(
                    "flange",
                    flange_width / 2.0,
                    flange_thickness,
                    "case 1",
                    0.56,
                    false,
                );
                push(
                    "web",
                    depth - 2.0 * flange_thickness,
                    web_thickness,
                    "case 5",
                    1.49,
                    true,
                );
            }
            Shape::Tee {
                depth,
                flange_width,
                stem_thickness,
                flange_thickness,
            } => {
                push(
                    "flange",
                    flange_width / 2.0,
                    flange_thickness,
                    "case 1",
                    0.56,
                    false,
                );
                push("stem", depth, stem_thickness, "case 4", 0.75, false);
            }
            Shape::Angle {
                leg_x,
                leg_y,
                thickness,
            } => {
                push("leg", leg_x.max(leg_y), thickness, "case 3", 0.45, false);
            }
            Shape::RectTube {
                width,
                height,
                wall,
            } => {
                push(
                    "wall",
                    width.max(height) - 3.0 * wall,
                    wall,
                    "case 6",
                    1.40,
                    true,
                );
            }
            Shape::Given { .. }
            | Shape::RoundBar { .. }
            | Shape::SquareBar { .. }
            | Shape::Pipe { .. } => {}
        }
    }
    Ok(out)
}

/// An area loss in percent as uniform thinning of every element.
fn scale_thickness(s: &Shape, k: f64) -> Shape {
    if k == 1.0 {
        return s.clone();
    }
    let mut s = s.clone();
    match &mut s {
        Shape::Plate { thickness, .. } | Shape::EyeBar { thickness, .. } => *thickness *= k,
        Shape::Channel {
            web_thickness,
            flange_thickness,
            ..
        }
        | Shape::IShape {
            web_thickness,
            flange_thickness,
            ..
        } => {
            *web_thickness *= k;
            *flange_thickness *= k;
        }
        Shape::Tee {
            stem_thickness,
            flange_thickness,
            ..
        } => {
            *stem_thickness *= k;
            *flange_thickness *= k;
        }
        Shape::Angle { thickness, .. } => *thickness *= k,
        Shape::RectTube { wall, .. } | Shape::Pipe { wall, .. } => *wall *= k,
        _ => {}
    }
    s
}

impl CompressionModes {
    /// Report notes for member `id` with a built-up section: every mode's
    /// equivalent slenderness, the governing one named with its clause, the
    /// §E7 reduction at critical stress `fcr` (Pa) and what was not checked.
    pub fn report_notes(&self, id: &str, fcr: f64) -> Vec<String> {
        let mut out = Vec::new();
        let list: Vec<String> = self
            .modes
            .iter()
            .map(|m| format!("{} {:.1}", m.kind.name(), m.slenderness))
            .collect();
        let g = self.governing();
        out.push(format!(
            "member \"{id}\": buckling modes, equivalent KL/r = π·√(E/Fe): {}; governing: {} ({})",
            list.join(", "),
            g.kind.name(),
            g.kind.clause()
        ));
        let ea = self.effective_area(fcr);
        if let Some(i) = ea.governing {
            let el = &self.elements[i];
            out.push(format!(
                "member \"{id}\": slender element {} b/t = {:.1} > λr = {:.1} (AISC 360-16 Table B4.1a {}); effective area Ae = {:.3}·Ag at Fcr (§E7, Eqs. E7-2/E7-3)",
                el.name,
                el.ratio(),
                el.lambda_r,
                el.case,
                ea.ratio
            ));
        }
        out.extend(self.notes.iter().map(|n| format!("member \"{id}\": {n}")));
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn cubic_reduces_to_e4_3_for_a_singly_symmetric_section() {
        // With x0 = 0 Eq. E4-4 factors as (Fe − Fex)·[(Fe − Fey)(Fe − Fez)
        // − Fe²·(y0/ro)²] = 0 (algebra), whose lower root of the bracket is
        // Eq. E4-3 with H = 1 − (y0/ro)². Fex far above keeps it the lowest.
        let (fey, fez, c2) = (30.0, 45.0, 0.4);
        let closed = e4_3(fey, fez, c2);
        let cubic = e4_4(1e6, fey, fez, 0.0, c2);
        assert!((closed - cubic).abs() < 1e-9 * closed, "{closed} {cubic}");
        // The coupled root lies below both uncoupled stresses.
        assert!(closed < fey.min(fez));
        // Uncoupled (no offset): the root is the lower of the two.
        assert!((e4_3(fey, fez, 0.0) - fey).abs() < 1e-9);
        // Unsymmetric: the root is a root and lies below all three.
        let (fx, fy, fz, a, b) = (50.0, 30.0, 45.0, 0.1, 0.3);
        let r = e4_4(fx, fy, fz, a, b);
        let f = (r - fx) * (r - fy) * (r - fz) - r * r * (r - fy) * a - r * r * (r - fx) * b;
        assert!(f.abs() < 1e-6 * fx * fy * fz && r < fy);
    }

    #[test]
    fn effective_width_by_e7_3() {
        // Stiffened element b = 10, t = 0.2 (λ = 50), λr = 1.40√(29000/36)
        // = 39.74, Fy 36, Fcr 30 (ksi, ratios only): λr√(Fy/Fcr) = 43.5 < 50,
        // Fel = (1.31·39.74/50)²·36 = 39.02, √(Fel/Fcr) = 1.1404,
        // be = 10·(1 − 0.18·1.1404)·1.1404 = 9.0632 (by hand).
        let el = PlateElement {
            part: 0,
            name: "p".into(),
            b: 10.0,
            t: 0.2,
            case: "case 7",
            lambda_r: 1.40 * (29000.0f64 / 36.0).sqrt(),
            stiffened: true,
            c1: 0.18,
            c2: 1.31,
        };
        let fel = (1.31 * el.lambda_r / 50.0).powi(2) * 36.0;
        let k = (fel / 30.0).sqrt();
        assert!((el.effective_width(36.0, 30.0) - 10.0 * (1.0 - 0.18 * k) * k).abs() < 1e-12);
        assert!((el.effective_width(36.0, 30.0) - 9.0632).abs() < 1e-3);
        // At a low Fcr the limit λr·√(Fy/Fcr) exceeds λ: fully effective (E7-2).
        assert_eq!(el.effective_width(36.0, 10.0), 10.0);
    }
}
