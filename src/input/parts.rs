//! The built-up section form of the model file: parts placed in the
//! section's own plane, with their holes and inspected section loss, and
//! the lacing that ties them together. Converted into `section` types in SI.
//!
//! ```ron
//! (id: "top-chord", parts: [
//!     Plate(width: 16.0, thickness: 0.5, x: 0.0, y: 5.8),
//!     Part(area: 8.2, ix: 190.0, iy: 6.3, x: -6.1, y: 0.0),
//!     Part(area: 8.2, ix: 190.0, iy: 6.3, x: 6.1, y: 0.0),
//! ])
//! ```
//! Every dimension is in the model's section unit unless written with its
//! own unit. `x`, `y` place each part's own centroid (x across the truss
//! plane, y in it).

use super::convert::Ctx;
use super::quantity::Quantity;
use crate::section::{
    Connector, Direction, GivenKind, Hole, Loss, Orientation, PlacedPart, Quadrant, Shape,
};
use crate::units::{Dimension, DisplayUnits};
use serde::Deserialize;

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct HoleFile {
    /// Hole diameter as used for net area (fastener + allowance).
    pub diameter: Quantity,
    /// Number of such holes straight across (default 1).
    #[serde(default)]
    pub count: Option<u32>,
    /// Stagger from the previous hole of the same chain.
    #[serde(default)]
    pub pitch: Option<Quantity>,
    #[serde(default)]
    pub gauge: Option<Quantity>,
    /// Thickness the hole passes through, when not the part's own.
    #[serde(default)]
    pub thickness: Option<Quantity>,
    /// Failure path this hole belongs to (default 0); a part loses the area of its worst path.
    #[serde(default)]
    pub chain: Option<usize>,
}

/// Section loss found at inspection.
#[derive(Debug, Deserialize)]
pub enum LossFile {
    /// Total thickness lost from every element of the part.
    Thickness(Quantity),
    /// Percent of the part's area lost (radius of gyration kept).
    AreaPercent(f64),
    /// The part is gone.
    Missing,
    /// Thickness lost from one face of a plate or eye-bar (`Outer`: the face
    /// farther from the section's centroid as built; `Inner`: the nearer),
    /// or from both (`Both`: the same as `Thickness`).
    Face { thickness: Quantity, face: FaceFile },
}

#[derive(Debug, Deserialize, Clone, Copy, PartialEq, Eq)]
pub enum FaceFile {
    Outer,
    Inner,
    Both,
}

#[derive(Debug, Deserialize, Clone, Copy)]
pub enum ToesFile {
    PosX,
    NegX,
    PosY,
    NegY,
}

#[derive(Debug, Deserialize, Clone, Copy)]
pub enum LegsFile {
    PP,
    PN,
    NP,
    NN,
}

macro_rules! part_kinds {
    ($( $(#[$doc:meta])* $variant:ident { $( $(#[$fattr:meta])* $field:ident : $ty:ty),* $(,)? } ),* $(,)?) => {
        /// One part of a built-up section.
        #[derive(Debug, Deserialize)]
        #[serde(deny_unknown_fields)]
        pub enum PartFile {
            $(
                $(#[$doc])*
                $variant {
                    $( $(#[$fattr])* $field: $ty,)*
                    x: Quantity,
                    y: Quantity,
                    #[serde(default)]
                    holes: Vec<HoleFile>,
                    #[serde(default)]
                    loss: Option<LossFile>,
                    #[serde(default)]
                    label: Option<String>,
                    /// A quarter turn anticlockwise of the reference shape.
                    #[serde(default)]
                    rotated: Option<bool>,
                    /// Channels and tees: the direction the toes (or stem) point.
                    #[serde(default)]
                    toes: Option<ToesFile>,
                    /// Angles: the quadrant the legs point into.
                    #[serde(default)]
                    legs: Option<LegsFile>,
                },
            )*
        }

        impl PartFile {
            /// The part's label in the file, if it has one.
            pub fn label(&self) -> Option<&str> {
                self.common().4.as_deref()
            }

            fn common(&self) -> (&Quantity, &Quantity, &[HoleFile], &Option<LossFile>, &Option<String>, Option<bool>, Option<ToesFile>, Option<LegsFile>) {
                match self {
                    $(PartFile::$variant { x, y, holes, loss, label, rotated, toes, legs, .. } =>
                        (x, y, holes.as_slice(), loss, label, *rotated, *toes, *legs),)*
                }
            }
        }
    };
}

part_kinds! {
    /// A flat plate: width along x, thickness along y.
    Plate { width: Quantity, thickness: Quantity, #[serde(default)] gauge: Option<Quantity> },
    /// Any shape by its table properties about its own centroid.
    Part { area: Quantity, ix: Quantity, iy: Quantity, #[serde(default)] ixy: Option<Quantity>, #[serde(default)] depth: Option<Quantity>, #[serde(default)] width: Option<Quantity>, #[serde(default)] kind: Option<GivenKindFile> },
    /// A channel by its dimensions (flange_slope: inner-face rise/run, 0 for parallel flanges).
    Channel { depth: Quantity, flange_width: Quantity, web_thickness: Quantity, flange_thickness: Quantity, #[serde(default)] flange_slope: Option<f64> },
    /// An angle: legs along x and y.
    Angle { leg_x: Quantity, leg_y: Quantity, thickness: Quantity },
    /// An I or H shape.
    IShape { depth: Quantity, flange_width: Quantity, web_thickness: Quantity, flange_thickness: Quantity, #[serde(default)] flange_slope: Option<f64> },
    /// A tee.
    Tee { depth: Quantity, flange_width: Quantity, stem_thickness: Quantity, flange_thickness: Quantity },
    RoundBar { diameter: Quantity },
    SquareBar { side: Quantity },
    Pipe { outer_diameter: Quantity, wall: Quantity },
    RectTube { width: Quantity, height: Quantity, wall: Quantity },
    /// A rectangular eye-bar: width in the truss plane.
    EyeBar { width: Quantity, thickness: Quantity, #[serde(default)] gauge: Option<Quantity> },
}

/// Which section axis lies in the plane of the truss.
#[derive(Debug, Deserialize, Clone, Copy, PartialEq, Eq)]
pub enum PlaneAxisFile {
    /// The section's y axis lies in the truss plane (default): i_in = Ix.
    Y,
    /// The section's x axis lies in the truss plane: i_in = Iy.
    X,
}

#[derive(Debug, Deserialize, Clone, Copy, PartialEq, Eq)]
pub enum ConnectorFile {
    SnugTight,
    Riveted,
    Pretensioned,
    Welded,
}

/// The rolled shape a `Part` given by table properties is, for drawing it.
#[derive(Debug, Deserialize, Clone, Copy, PartialEq, Eq)]
pub enum GivenKindFile {
    Angle,
    Channel,
    IShape,
    Tee,
}

#[derive(Debug, Deserialize, Clone, Copy, PartialEq, Eq)]
pub enum LacedAxisFile {
    In,
    Out,
}

/// Lacing or batten plates of a built-up member (AISC 360-16 §E6).
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LacingFile {
    /// Distance between connectors (lacing points or battens) along the member.
    pub spacing: Quantity,
    #[serde(default)]
    pub connector: Option<ConnectorFile>,
    /// Ki of E6-2b: 0.50 back-to-back angles, 0.75 back-to-back channels, 0.86 otherwise.
    #[serde(default)]
    pub k_i: Option<f64>,
    /// Least radius of gyration of one component; default: the smallest among the parts that are not plates.
    #[serde(default)]
    pub component_r: Option<Quantity>,
    /// The axis whose slenderness the lacing modifies (default Out: components side by side across the truss plane).
    #[serde(default)]
    pub axis: Option<LacedAxisFile>,
    /// The lacing bars (flat bars), for their own checks (AISC 360-16 §E6.2).
    #[serde(default)]
    pub bar: Option<LacingBarFile>,
    /// Angle of the bars to the member axis, degrees (default: the least
    /// §E6.2 allows, 60 single, 45 double).
    #[serde(default)]
    pub angle: Option<f64>,
    /// Single or Double (crossed, joined at the crossing) lacing (default Single).
    #[serde(default)]
    pub kind: Option<LacingKindFile>,
    /// Number of laced faces sharing the shear (default 1).
    #[serde(default)]
    pub planes: Option<u32>,
    /// Whether tie plates are fitted at the ends and at interruptions (§E6.2).
    #[serde(default)]
    pub tie_plates: Option<bool>,
}

/// A flat lacing bar.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LacingBarFile {
    pub width: Quantity,
    pub thickness: Quantity,
}

#[derive(Debug, Deserialize, Clone, Copy)]
pub enum LacingKindFile {
    Single,
    Double,
}

/// Read a length in the section unit.
fn len(ctx: &mut Ctx, q: &Quantity, u: &DisplayUnits, what: &str) -> f64 {
    match q.to_si(Dimension::Length, u.section.to_si) {
        Ok(v) => v,
        Err(e) => {
            ctx.error(format!("{what}: {e}"), None);
            1.0
        }
    }
}

fn conv(ctx: &mut Ctx, q: &Quantity, dim: Dimension, u: &DisplayUnits, what: &str) -> f64 {
    let f = match dim {
        Dimension::Area => u.area_to_si(),
        Dimension::SecondMoment => u.second_moment_to_si(),
        _ => u.section.to_si,
    };
    match q.to_si(dim, f) {
        Ok(v) => v,
        Err(e) => {
            ctx.error(format!("{what}: {e}"), None);
            1.0
        }
    }
}

/// Convert the parts of section `id` to SI `PlacedPart`s (errors into `ctx`).
pub(super) fn convert_parts(
    ctx: &mut Ctx,
    id: &str,
    parts: &[PartFile],
    u: &DisplayUnits,
) -> Vec<PlacedPart> {
    let mut out = Vec::with_capacity(parts.len());
    for (i, p) in parts.iter().enumerate() {
        let name = super::section_errors::part_name(id, i, p.label());
        let w = |f: &str| format!("{name} {f}");
        let l = |ctx: &mut Ctx, q: &Quantity, f: &str| len(ctx, q, u, &w(f));
        let shape = match p {
            PartFile::Plate {
                width, thickness, ..
            } => Shape::Plate {
                width: l(ctx, width, "width"),
                thickness: l(ctx, thickness, "thickness"),
            },
            PartFile::Part {
                area,
                ix,
                iy,
                ixy,
                depth,
                width,
                ..
            } => Shape::Given {
                area: conv(ctx, area, Dimension::Area, u, &w("area")),
                ix: conv(ctx, ix, Dimension::SecondMoment, u, &w("ix")),
                iy: conv(ctx, iy, Dimension::SecondMoment, u, &w("iy")),
                ixy: ixy
                    .as_ref()
                    .map_or(0.0, |q| conv(ctx, q, Dimension::SecondMoment, u, &w("ixy"))),
                depth: depth.as_ref().map(|q| l(ctx, q, "depth")),
                width: width.as_ref().map(|q| l(ctx, q, "width")),
            },
            PartFile::Channel {
                depth,
                flange_width,
                web_thickness,
                flange_thickness,
                flange_slope,
                ..
            } => Shape::Channel {
                depth: l(ctx, depth, "depth"),
                flange_width: l(ctx, flange_width, "flange_width"),
                web_thickness: l(ctx, web_thickness, "web_thickness"),
                flange_thickness: l(ctx, flange_thickness, "flange_thickness"),
                flange_slope: flange_slope.unwrap_or(0.0),
            },
            PartFile::Angle {
                leg_x,
                leg_y,
                thickness,
                ..
            } => Shape::Angle {
                leg_x: l(ctx, leg_x, "leg_x"),
                leg_y: l(ctx, leg_y, "leg_y"),
                thickness: l(ctx, thickness, "thickness"),
            },
            PartFile::IShape {
                depth,
                flange_width,
                web_thickness,
                flange_thickness,
                flange_slope,
                ..
            } => Shape::IShape {
                depth: l(ctx, depth, "depth"),
                flange_width: l(ctx, flange_width, "flange_width"),
                web_thickness: l(ctx, web_thickness, "web_thickness"),
                flange_thickness: l(ctx, flange_thickness, "flange_thickness"),
                flange_slope: flange_slope.unwrap_or(0.0),
            },
            PartFile::Tee {
                depth,
                flange_width,
                stem_thickness,
                flange_thickness,
                ..
            } => Shape::Tee {
                depth: l(ctx, depth, "depth"),
                flange_width: l(ctx, flange_width, "flange_width"),
                stem_thickness: l(ctx, stem_thickness, "stem_thickness"),
                flange_thickness: l(ctx, flange_thickness, "flange_thickness"),
            },
            PartFile::RoundBar { diameter, .. } => Shape::RoundBar {
                diameter: l(ctx, diameter, "diameter"),
            },
            PartFile::SquareBar { side, .. } => Shape::SquareBar {
                side: l(ctx, side, "side"),
            },
            PartFile::Pipe {
                outer_diameter,
                wall,
                ..
            } => Shape::Pipe {
                outer_diameter: l(ctx, outer_diameter, "outer_diameter"),
                wall: l(ctx, wall, "wall"),
            },
            PartFile::RectTube {
                width,
                height,
                wall,
                ..
            } => Shape::RectTube {
                width: l(ctx, width, "width"),
                height: l(ctx, height, "height"),
                wall: l(ctx, wall, "wall"),
            },
            PartFile::EyeBar {
                width, thickness, ..
            } => Shape::EyeBar {
                width: l(ctx, width, "width"),
                thickness: l(ctx, thickness, "thickness"),
            },
        };
        // Plates: the distance between the two lines of fasteners (§E7 width).
        let gauge = match p {
            PartFile::Plate { gauge, width, .. } | PartFile::EyeBar { gauge, width, .. } => {
                gauge.as_ref().map(|q| {
                    let g = l(ctx, q, "gauge");
                    let wd = l(ctx, width, "width");
                    if !(g > 0.0 && g <= wd) {
                        ctx.error(
                            format!(
                                "{}: must be positive and not more than the width",
                                w("gauge")
                            ),
                            None,
                        );
                    }
                    g
                })
            }
            _ => None,
        };
        let (x, y, holes, loss, label, rotated, toes, legs) = p.common();
        let x = l(ctx, x, "x");
        let y = l(ctx, y, "y");
        let orientation = match (rotated, toes, legs) {
            (Some(true), None, None) => Orientation::Rotated90,
            (_, Some(t), None) => Orientation::Toes(match t {
                ToesFile::PosX => Direction::PosX,
                ToesFile::NegX => Direction::NegX,
                ToesFile::PosY => Direction::PosY,
                ToesFile::NegY => Direction::NegY,
            }),
            (_, None, Some(q)) => Orientation::Legs(match q {
                LegsFile::PP => Quadrant::PP,
                LegsFile::PN => Quadrant::PN,
                LegsFile::NP => Quadrant::NP,
                LegsFile::NN => Quadrant::NN,
            }),
            (_, Some(_), Some(_)) => {
                ctx.error(
                    format!("{}: give toes or legs, not both", w("orientation")),
                    None,
                );
                Orientation::Reference
            }
            _ => Orientation::Reference,
        };
        let mut hs = Vec::new();
        for h in holes {
            let d = l(ctx, &h.diameter, "hole diameter");
            let base = Hole {
                diameter: d,
                gauge: h.gauge.as_ref().map(|q| l(ctx, q, "hole gauge")),
                pitch: h.pitch.as_ref().map(|q| l(ctx, q, "hole pitch")),
                thickness: h.thickness.as_ref().map(|q| l(ctx, q, "hole thickness")),
                chain: h.chain.unwrap_or(0),
            };
            let count = h.count.unwrap_or(1);
            if count == 0 || count > 1000 {
                ctx.error(format!("{}: count must be 1 to 1000", w("hole")), None);
            }
            for _ in 0..count.min(1000) {
                hs.push(base.clone());
            }
        }
        let loss = loss.as_ref().map(|lf| match lf {
            LossFile::Thickness(q) => Loss::Thickness(l(ctx, q, "loss")),
            // The side is settled below, once the section's centroid is known.
            LossFile::Face { thickness, face } => {
                let t = l(ctx, thickness, "loss");
                match face {
                    FaceFile::Both => Loss::Thickness(t),
                    _ => Loss::OneFace { t, positive: true },
                }
            }
            LossFile::AreaPercent(p) => Loss::AreaPercent(*p),
            LossFile::Missing => Loss::Missing,
        });
        out.push(PlacedPart {
            shape,
            x,
            y,
            orientation,
            holes: hs,
            loss,
            label: label.clone(),
            drawn_as: match p {
                PartFile::Part { kind, .. } => kind.map(|k| match k {
                    GivenKindFile::Angle => GivenKind::Angle,
                    GivenKindFile::Channel => GivenKind::Channel,
                    GivenKindFile::IShape => GivenKind::IShape,
                    GivenKindFile::Tee => GivenKind::Tee,
                }),
                _ => None,
            },
            gauge,
        });
    }
    one_face_sides(parts, &mut out);
    out
}

/// Turns `Outer`/`Inner` losses into the side of each plate's thickness:
/// the outer face is the one farther from the as-built centroid (measured
/// along the plate's thickness direction; a plate through the centroid
/// takes its positive side as outer).
fn one_face_sides(parts: &[PartFile], out: &mut [PlacedPart]) {
    let Ok(props) = crate::section::properties_original(out) else {
        return;
    };
    for (p, placed) in parts.iter().zip(out.iter_mut()) {
        let Some(LossFile::Face { face, .. }) = p.common().3 else {
            continue;
        };
        let Some(Loss::OneFace { t, .. }) = placed.loss else {
            continue;
        };
        let Ok(m) = placed.orientation.matrix_of(&placed.shape) else {
            continue;
        };
        // Thickness direction in section axes: datum +y of a plate, +x of an eye-bar.
        let dir = match placed.shape {
            Shape::EyeBar { .. } => (m[0][0], m[1][0]),
            _ => (m[0][1], m[1][1]),
        };
        let away = (placed.x - props.centroid_x) * dir.0 + (placed.y - props.centroid_y) * dir.1;
        let outer_positive = away >= 0.0;
        let positive = match face {
            FaceFile::Outer => outer_positive,
            _ => !outer_positive,
        };
        placed.loss = Some(Loss::OneFace { t, positive });
    }
}

pub(super) fn connector(c: Option<ConnectorFile>) -> Connector {
    match c {
        None | Some(ConnectorFile::SnugTight) => Connector::SnugTight,
        Some(ConnectorFile::Riveted) => Connector::HotDrivenRivet,
        Some(ConnectorFile::Pretensioned) => Connector::Pretensioned,
        Some(ConnectorFile::Welded) => Connector::Welded,
    }
}

pub(super) fn section_length(ctx: &mut Ctx, q: &Quantity, u: &DisplayUnits, what: &str) -> f64 {
    len(ctx, q, u, what)
}
