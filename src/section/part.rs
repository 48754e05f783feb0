//! The kinds of part a built-up truss member is made of, how each is placed
//! and turned in the section, and each part's own area and second moments.
//!
//! Every shape is described in a *datum frame* fixed to its outer faces (so a
//! thickness loss taken from the inner faces leaves the outer faces where they
//! were), then turned by its [`Orientation`] and placed so that its as-built
//! centroid sits at the part's `x`, `y`.

use super::condition::{apply_loss, Condition, Loss};
use super::holes::Hole;
use super::SectionError;

/// A part's cross-section, in its reference orientation.
///
/// Fillets and root radii of rolled shapes are neglected throughout: every
/// rolled shape is idealised as straight-sided rectangles and (for sloped
/// flanges) trapezoids. Computed values therefore fall slightly below the steel
/// tables, typically by 1–3 %.
#[derive(Debug, Clone, PartialEq)]
pub enum Shape {
    /// Flat plate: `width` along x, `thickness` along y, centred on its centroid.
    Plate { width: f64, thickness: f64 },
    /// A shape typed from a steel table by its properties about its own
    /// centroid, reference axes x horizontal, y vertical. `depth` (along y) and
    /// `width` (along x) are only used for drawing and extreme fibres; when
    /// absent, the rectangle with the same area and second moments is used
    /// (`b = √(12·Iy/A)`, `h = √(12·Ix/A)`), an estimate that the section
    /// reports through `SectionProperties::extents_estimated`.
    Given {
        area: f64,
        ix: f64,
        iy: f64,
        ixy: f64,
        depth: Option<f64>,
        width: Option<f64>,
    },
    /// Channel: web along y with its back on the −x side, toes pointing +x.
    /// `flange_slope` is the rise/run of the inner flange face (0 for parallel
    /// flanges; old American standard channels ≈ 1/6, 16.67 % — from memory).
    /// With a slope, `flange_thickness` is the average thickness, taken at the
    /// middle of the flange's free projection `flange_width − web_thickness`,
    /// and each flange is modelled as a trapezoid.
    Channel {
        depth: f64,
        flange_width: f64,
        web_thickness: f64,
        flange_thickness: f64,
        flange_slope: f64,
    },
    /// Angle: heel at the lower left, `leg_x` running along +x and `leg_y`
    /// along +y (legs into the ++ quadrant).
    Angle {
        leg_x: f64,
        leg_y: f64,
        thickness: f64,
    },
    /// I-shape (W, S or built-in beam): web along y, flanges along x, so the
    /// strong axis is x. Sloped inner flange faces as for [`Shape::Channel`],
    /// the free projection of each flange half being `(flange_width − web_thickness)/2`.
    IShape {
        depth: f64,
        flange_width: f64,
        web_thickness: f64,
        flange_thickness: f64,
        flange_slope: f64,
    },
    /// Tee: flange on top along x, stem pointing −y; `depth` is overall.
    Tee {
        depth: f64,
        flange_width: f64,
        stem_thickness: f64,
        flange_thickness: f64,
    },
    /// Solid round bar.
    RoundBar { diameter: f64 },
    /// Solid square bar.
    SquareBar { side: f64 },
    /// Circular hollow section.
    Pipe { outer_diameter: f64, wall: f64 },
    /// Rectangular hollow section with sharp corners: `width` along x,
    /// `height` along y. Give the wall to be used in design (for welded tubes
    /// that is often 0.93 × nominal — common practice).
    RectTube { width: f64, height: f64, wall: f64 },
    /// Eye-bar shank: the same rectangle as a plate but with its `width` along
    /// y (in the truss plane) and `thickness` along x; kept as its own kind so
    /// reports can name it.
    EyeBar { width: f64, thickness: f64 },
}

impl Shape {
    /// Short name of the kind of shape, for messages and reports.
    pub fn kind(&self) -> &'static str {
        match self {
            Shape::Plate { .. } => "plate",
            Shape::Given { .. } => "given shape",
            Shape::Channel { .. } => "channel",
            Shape::Angle { .. } => "angle",
            Shape::IShape { .. } => "I-shape",
            Shape::Tee { .. } => "tee",
            Shape::RoundBar { .. } => "round bar",
            Shape::SquareBar { .. } => "square bar",
            Shape::Pipe { .. } => "pipe",
            Shape::RectTube { .. } => "rectangular tube",
            Shape::EyeBar { .. } => "eye-bar",
        }
    }

    /// A shape given by table area and second moments, no product moment.
    pub fn given(area: f64, ix: f64, iy: f64) -> Shape {
        Shape::Given {
            area,
            ix,
            iy,
            ixy: 0.0,
            depth: None,
            width: None,
        }
    }

    /// Table properties with the overall width and depth (for drawing).
    pub fn given_with(area: f64, ix: f64, iy: f64, width: f64, depth: f64) -> Shape {
        Shape::Given {
            area,
            ix,
            iy,
            ixy: 0.0,
            depth: Some(depth),
            width: Some(width),
        }
    }

    /// Checks every dimension; `part` names the part in any error.
    pub fn validate(&self, part: usize) -> Result<(), SectionError> {
        let pos = |field: &'static str, value: f64| -> Result<(), SectionError> {
            if value.is_finite() && value > 0.0 {
                Ok(())
            } else {
                Err(SectionError::InvalidDimension { part, field, value })
            }
        };
        let slope_ok = |value: f64| -> Result<(), SectionError> {
            if value.is_finite() && value >= 0.0 {
                Ok(())
            } else {
                Err(SectionError::InvalidDimension {
                    part,
                    field: "flange_slope",
                    value,
                })
            }
        };
        let geom = |reason: String| SectionError::InvalidGeometry { part, reason };
        match *self {
            Shape::Plate { width, thickness } => {
                pos("width", width)?;
                pos("thickness", thickness)
            }
            Shape::EyeBar { width, thickness } => {
                pos("width", width)?;
                pos("thickness", thickness)
            }
            Shape::Given {
                area,
                ix,
                iy,
                ixy,
                depth,
                width,
            } => {
                pos("area", area)?;
                pos("ix", ix)?;
                pos("iy", iy)?;
                if !ixy.is_finite() {
                    return Err(SectionError::NonFinite {
                        part,
                        field: "ixy",
                        value: ixy,
                    });
                }
                if ixy * ixy >= ix * iy {
                    return Err(geom(format!(
                        "ixy {ixy} is too large for ix {ix} and iy {iy} (needs ixy² < ix·iy)"
                    )));
                }
                if let Some(d) = depth {
                    pos("depth", d)?;
                }
                if let Some(w) = width {
                    pos("width", w)?;
                }
                Ok(())
            }
            Shape::Channel {
                depth,
                flange_width,
                web_thickness,
                flange_thickness,
                flange_slope,
            } => {
                pos("depth", depth)?;
                pos("flange_width", flange_width)?;
                pos("web_thickness", web_thickness)?;
                pos("flange_thickness", flange_thickness)?;
                slope_ok(flange_slope)?;
                if web_thickness >= flange_width {
                    return Err(geom(format!(
                        "web_thickness {web_thickness} must be less than flange_width {flange_width}"
                    )));
                }
                let (root, toe) =
                    taper(flange_thickness, flange_slope, flange_width - web_thickness);
                if toe <= 0.0 {
                    return Err(geom(format!(
                        "flange_slope {flange_slope} leaves no thickness at the flange toe"
                    )));
                }
                if 2.0 * root >= depth {
                    return Err(geom(format!(
                        "flanges (root thickness {root}) meet or overlap in depth {depth}"
                    )));
                }
                Ok(())
            }
            Shape::IShape {
                depth,
                flange_width,
                web_thickness,
                flange_thickness,
                flange_slope,
            } => {
                pos("depth", depth)?;
                pos("flange_width", flange_width)?;
                pos("web_thickness", web_thickness)?;
                pos("flange_thickness", flange_thickness)?;
                slope_ok(flange_slope)?;
                if web_thickness >= flange_width {
                    return Err(geom(format!(
                        "web_thickness {web_thickness} must be less than flange_width {flange_width}"
                    )));
                }
                let (root, toe) = taper(
                    flange_thickness,
                    flange_slope,
                    (flange_width - web_thickness) / 2.0,
                );
                if toe <= 0.0 {
                    return Err(geom(format!(
                        "flange_slope {flange_slope} leaves no thickness at the flange toe"
                    )));
                }
                if 2.0 * root >= depth {
                    return Err(geom(format!(
                        "flanges (root thickness {root}) meet or overlap in depth {depth}"
                    )));
                }
                Ok(())
            }
            Shape::Angle {
                leg_x,
                leg_y,
                thickness,
            } => {
                pos("leg_x", leg_x)?;
                pos("leg_y", leg_y)?;
                pos("thickness", thickness)?;
                if thickness >= leg_x.min(leg_y) {
                    return Err(geom(format!(
                        "thickness {thickness} must be less than both legs ({leg_x}, {leg_y})"
                    )));
                }
                Ok(())
            }
            Shape::Tee {
                depth,
                flange_width,
                stem_thickness,
                flange_thickness,
            } => {
                pos("depth", depth)?;
                pos("flange_width", flange_width)?;
                pos("stem_thickness", stem_thickness)?;
                pos("flange_thickness", flange_thickness)?;
                if stem_thickness > flange_width {
                    return Err(geom(format!(
                        "stem_thickness {stem_thickness} exceeds flange_width {flange_width}"
                    )));
                }
                if flange_thickness >= depth {
                    return Err(geom(format!(
                        "flange_thickness {flange_thickness} must be less than depth {depth}"
                    )));
                }
                Ok(())
            }
            Shape::RoundBar { diameter } => pos("diameter", diameter),
            Shape::SquareBar { side } => pos("side", side),
            Shape::Pipe {
                outer_diameter,
                wall,
            } => {
                pos("outer_diameter", outer_diameter)?;
                pos("wall", wall)?;
                if wall >= outer_diameter / 2.0 {
                    return Err(SectionError::WallTooThick {
                        part,
                        field: "outer_diameter",
                        wall,
                        size: outer_diameter,
                    });
                }
                Ok(())
            }
            Shape::RectTube {
                width,
                height,
                wall,
            } => {
                pos("width", width)?;
                pos("height", height)?;
                pos("wall", wall)?;
                let (field, size) = if width <= height {
                    ("width", width)
                } else {
                    ("height", height)
                };
                if wall >= size / 2.0 {
                    return Err(SectionError::WallTooThick {
                        part,
                        field,
                        wall,
                        size,
                    });
                }
                Ok(())
            }
        }
    }

    /// The shape's geometry in its datum frame. Call only on a validated shape.
    pub(crate) fn geometry(&self) -> Geometry {
        match *self {
            Shape::Plate { width, thickness } => Geometry::Polygons(vec![rect(width, thickness)]),
            Shape::EyeBar { width, thickness } => Geometry::Polygons(vec![rect(thickness, width)]),
            Shape::SquareBar { side } => Geometry::Polygons(vec![rect(side, side)]),
            Shape::RectTube {
                width,
                height,
                wall,
            } => {
                let mut inner = rect(width - 2.0 * wall, height - 2.0 * wall);
                inner.reverse();
                Geometry::Polygons(vec![rect(width, height), inner])
            }
            Shape::Angle {
                leg_x,
                leg_y,
                thickness: t,
            } => Geometry::Polygons(vec![vec![
                (0.0, 0.0),
                (leg_x, 0.0),
                (leg_x, t),
                (t, t),
                (t, leg_y),
                (0.0, leg_y),
            ]]),
            Shape::Channel {
                depth,
                flange_width: b,
                web_thickness: tw,
                flange_thickness,
                flange_slope,
            } => {
                let h = depth / 2.0;
                let (root, toe) = taper(flange_thickness, flange_slope, b - tw);
                Geometry::Polygons(vec![vec![
                    (0.0, -h),
                    (b, -h),
                    (b, -h + toe),
                    (tw, -h + root),
                    (tw, h - root),
                    (b, h - toe),
                    (b, h),
                    (0.0, h),
                ]])
            }
            Shape::IShape {
                depth,
                flange_width,
                web_thickness,
                flange_thickness,
                flange_slope,
            } => {
                let h = depth / 2.0;
                let b = flange_width / 2.0;
                let w = web_thickness / 2.0;
                let (root, toe) = taper(flange_thickness, flange_slope, b - w);
                Geometry::Polygons(vec![vec![
                    (-b, -h),
                    (b, -h),
                    (b, -h + toe),
                    (w, -h + root),
                    (w, h - root),
                    (b, h - toe),
                    (b, h),
                    (-b, h),
                    (-b, h - toe),
                    (-w, h - root),
                    (-w, -h + root),
                    (-b, -h + toe),
                ]])
            }
            Shape::Tee {
                depth,
                flange_width,
                stem_thickness,
                flange_thickness: tf,
            } => {
                let b = flange_width / 2.0;
                let s = stem_thickness / 2.0;
                Geometry::Polygons(vec![vec![
                    (-s, -depth),
                    (s, -depth),
                    (s, -tf),
                    (b, -tf),
                    (b, 0.0),
                    (-b, 0.0),
                    (-b, -tf),
                    (-s, -tf),
                ]])
            }
            Shape::RoundBar { diameter } => Geometry::Annulus {
                outer: diameter,
                inner: 0.0,
            },
            Shape::Pipe {
                outer_diameter,
                wall,
            } => Geometry::Annulus {
                outer: outer_diameter,
                inner: outer_diameter - 2.0 * wall,
            },
            Shape::Given {
                area,
                ix,
                iy,
                ixy,
                depth,
                width,
            } => Geometry::Tabulated {
                area,
                ix,
                iy,
                ixy,
                width: width.unwrap_or_else(|| (12.0 * iy / area).sqrt()),
                depth: depth.unwrap_or_else(|| (12.0 * ix / area).sqrt()),
                estimated: width.is_none() || depth.is_none(),
            },
        }
    }

    /// Area, centroid (datum frame) and second moments about the centroid in
    /// the reference orientation.
    pub(crate) fn local(&self, part: usize) -> Result<Local, SectionError> {
        self.validate(part)?;
        let local = match self.geometry() {
            Geometry::Polygons(polys) => polygon_properties(&polys),
            Geometry::Annulus { outer, inner } => {
                // Circle: A = π d²/4, I = π d⁴/64 (closed forms).
                let area = std::f64::consts::PI / 4.0 * (outer * outer - inner * inner);
                let i = std::f64::consts::PI / 64.0 * (outer.powi(4) - inner.powi(4));
                Local {
                    area,
                    cx: 0.0,
                    cy: 0.0,
                    ix: i,
                    iy: i,
                    ixy: 0.0,
                }
            }
            Geometry::Tabulated {
                area, ix, iy, ixy, ..
            } => Local {
                area,
                cx: 0.0,
                cy: 0.0,
                ix,
                iy,
                ixy,
            },
        };
        let vals = [
            local.area, local.cx, local.cy, local.ix, local.iy, local.ixy,
        ];
        if vals.iter().any(|v| !v.is_finite()) {
            return Err(SectionError::Overflow { part });
        }
        if local.area <= 0.0 || local.ix <= 0.0 || local.iy <= 0.0 {
            return Err(SectionError::InvalidGeometry {
                part,
                reason: format!("the {} has no area", self.kind()),
            });
        }
        Ok(local)
    }

    /// The direction the shape's open side points in its reference
    /// orientation, if it has one that [`Orientation::Toes`] may turn.
    fn reference_toes(&self) -> Option<Direction> {
        match self {
            Shape::Angle { .. } => None,
            Shape::Tee { .. } => Some(Direction::NegY),
            _ => Some(Direction::PosX),
        }
    }
}

/// Root and toe thickness of a flange of average thickness `t` whose inner
/// face has the given slope over a free projection `projection` (the average
/// is reached at mid-projection).
fn taper(t: f64, slope: f64, projection: f64) -> (f64, f64) {
    let half_rise = slope * projection / 2.0;
    (t + half_rise, t - half_rise)
}

/// Counter-clockwise rectangle of `bx` along x by `by` along y, centred on the origin.
fn rect(bx: f64, by: f64) -> Vec<(f64, f64)> {
    let (a, b) = (bx / 2.0, by / 2.0);
    vec![(-a, -b), (a, -b), (a, b), (-a, b)]
}

/// A shape's geometry in its datum frame.
#[derive(Debug, Clone, PartialEq)]
pub(crate) enum Geometry {
    /// Outer boundaries counter-clockwise, voids clockwise.
    Polygons(Vec<Vec<(f64, f64)>>),
    /// Solid (inner = 0) or hollow circle centred on the origin, by diameters.
    Annulus { outer: f64, inner: f64 },
    /// Table properties and the extent used to draw the part.
    Tabulated {
        area: f64,
        ix: f64,
        iy: f64,
        ixy: f64,
        width: f64,
        depth: f64,
        estimated: bool,
    },
}

/// Properties in the reference orientation: centroid in the datum frame,
/// second moments about the centroid.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Local {
    pub area: f64,
    pub cx: f64,
    pub cy: f64,
    pub ix: f64,
    pub iy: f64,
    pub ixy: f64,
}

/// Area, centroid and centroidal second moments of polygons by Green's
/// theorem (the standard polygon-moment formulas): with
/// `c = xᵢyᵢ₊₁ − xᵢ₊₁yᵢ`, `A = Σc/2`, `∫x dA = Σ(xᵢ+xᵢ₊₁)c/6`,
/// `∫y² dA = Σ(yᵢ²+yᵢyᵢ₊₁+yᵢ₊₁²)c/12`, `∫xy dA = Σ(xᵢyᵢ₊₁+2xᵢyᵢ+2xᵢ₊₁yᵢ₊₁+xᵢ₊₁yᵢ)c/24`,
/// then the parallel-axis theorem to the centroid.
pub(crate) fn polygon_properties(polys: &[Vec<(f64, f64)>]) -> Local {
    let (mut a, mut sx, mut sy, mut qxx, mut qyy, mut qxy) = (0.0, 0.0, 0.0, 0.0, 0.0, 0.0);
    for poly in polys {
        let n = poly.len();
        for i in 0..n {
            let (x0, y0) = poly[i];
            let (x1, y1) = poly[(i + 1) % n];
            let c = x0 * y1 - x1 * y0;
            a += c;
            sx += (x0 + x1) * c;
            sy += (y0 + y1) * c;
            qxx += (y0 * y0 + y0 * y1 + y1 * y1) * c;
            qyy += (x0 * x0 + x0 * x1 + x1 * x1) * c;
            qxy += (x0 * y1 + 2.0 * x0 * y0 + 2.0 * x1 * y1 + x1 * y0) * c;
        }
    }
    let area = a / 2.0;
    let cx = sx / (6.0 * area);
    let cy = sy / (6.0 * area);
    Local {
        area,
        cx,
        cy,
        ix: qxx / 12.0 - area * cy * cy,
        iy: qyy / 12.0 - area * cx * cx,
        ixy: qxy / 24.0 - area * cx * cy,
    }
}

/// A direction in section coordinates.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Direction {
    #[default]
    PosX,
    PosY,
    NegX,
    NegY,
}

impl Direction {
    fn quarter_turns(self) -> i32 {
        match self {
            Direction::PosX => 0,
            Direction::PosY => 1,
            Direction::NegX => 2,
            Direction::NegY => 3,
        }
    }
}

/// A quadrant of section coordinates, named by the signs of x and y.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Quadrant {
    /// +x, +y
    #[default]
    PP,
    /// +x, −y
    PN,
    /// −x, +y
    NP,
    /// −x, −y
    NN,
}

/// How a part is turned from its reference orientation (see [`Shape`]).
///
/// * `Reference` — as the shape is defined.
/// * `Toes(d)` — turn the shape (a rotation by quarter turns, never a mirror)
///   so that its open side points `d`: channel toes (reference +x) — `PosX` or
///   `NegX` for a vertical web, `PosY` or `NegY` for a horizontal web; a tee's
///   stem (reference −y). For closed shapes the reference "toe" is +x, so
///   `Toes(PosY)` is a quarter turn. Not defined for angles.
///   Whether a channel is "toe-in" or "toe-out" relative to the member centre
///   is for the caller to decide from the sign of its `x`.
/// * `Legs(q)` — mirror the shape so that an angle's legs point into quadrant
///   `q` (reference ++): `NP` mirrors x, `PN` mirrors y, `NN` both. Which leg
///   is horizontal is fixed by `leg_x`/`leg_y`. On other shapes it mirrors
///   the same way.
/// * `Rotated90` — a quarter turn counter-clockwise of the reference shape.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Orientation {
    #[default]
    Reference,
    Toes(Direction),
    Legs(Quadrant),
    Rotated90,
}

impl Orientation {
    /// The map of [`Orientation::matrix`] for a shape (errors name part 0).
    pub fn matrix_of(&self, shape: &Shape) -> Result<[[f64; 2]; 2], SectionError> {
        self.matrix(shape, 0)
    }
    /// The linear map `[[a, b], [c, d]]` taking reference coordinates to
    /// section coordinates (`x' = a·x + b·y`, `y' = c·x + d·y`).
    pub(crate) fn matrix(&self, shape: &Shape, part: usize) -> Result<[[f64; 2]; 2], SectionError> {
        let turns = |k: i32| -> [[f64; 2]; 2] {
            match k.rem_euclid(4) {
                0 => [[1.0, 0.0], [0.0, 1.0]],
                1 => [[0.0, -1.0], [1.0, 0.0]],
                2 => [[-1.0, 0.0], [0.0, -1.0]],
                _ => [[0.0, 1.0], [-1.0, 0.0]],
            }
        };
        Ok(match *self {
            Orientation::Reference => turns(0),
            Orientation::Rotated90 => turns(1),
            Orientation::Toes(d) => match shape.reference_toes() {
                Some(r) => turns(d.quarter_turns() - r.quarter_turns()),
                None => {
                    return Err(SectionError::InvalidOrientation {
                        part,
                        orientation: "Toes",
                        shape: shape.kind(),
                    })
                }
            },
            Orientation::Legs(q) => match q {
                Quadrant::PP => [[1.0, 0.0], [0.0, 1.0]],
                Quadrant::NP => [[-1.0, 0.0], [0.0, 1.0]],
                Quadrant::PN => [[1.0, 0.0], [0.0, -1.0]],
                Quadrant::NN => [[-1.0, 0.0], [0.0, -1.0]],
            },
        })
    }
}

/// Second moments `(ix, iy, ixy)` after the linear map `m` (orthogonal):
/// with `x' = a·x + b·y`, `y' = c·x + d·y`:
/// `Ix' = c²Iy + 2cd·Ixy + d²Ix`, `Iy' = a²Iy + 2ab·Ixy + b²Ix`,
/// `Ixy' = ac·Iy + (ad + bc)·Ixy + bd·Ix` (from ∫y'² dA etc.).
pub(crate) fn transform_moments(m: [[f64; 2]; 2], ix: f64, iy: f64, ixy: f64) -> (f64, f64, f64) {
    let [[a, b], [c, d]] = m;
    (
        c * c * iy + 2.0 * c * d * ixy + d * d * ix,
        a * a * iy + 2.0 * a * b * ixy + b * b * ix,
        a * c * iy + (a * d + b * c) * ixy + b * d * ix,
    )
}

/// A part as placed in a section.
///
/// `x`, `y` locate the part's OWN centroid, as built (before any loss), in
/// section coordinates. A thickness loss taken from inner faces may move the
/// reduced centroid; [`PartProperties::centroid_x`]/`centroid_y` give where it
/// ends up.
#[derive(Debug, Clone, PartialEq)]
pub struct PlacedPart {
    pub shape: Shape,
    pub x: f64,
    pub y: f64,
    pub orientation: Orientation,
    pub holes: Vec<Hole>,
    pub loss: Option<Loss>,
    pub label: Option<String>,
    /// For a plate: the distance between its two lines of fasteners (the
    /// width of the element between supports of AISC 360-16 Table B4.1a,
    /// case 7); `None` takes the middle of each part touching it.
    pub gauge: Option<f64>,
    /// For a [`Shape::Given`] with its width and depth: the kind of rolled
    /// shape it is, so that it can be drawn as that shape (idealised with
    /// one thickness, see [`super::outline::idealised`]). Drawing only.
    pub drawn_as: Option<GivenKind>,
}

/// The kind of rolled shape a part given by table properties is.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum GivenKind {
    /// Legs along +x (width) and +y (depth) from the heel, in the reference orientation.
    Angle,
    /// Web along y (depth) at the back, flanges (width) towards +x.
    Channel,
    /// Flanges (width) at top and bottom, web along y (depth).
    IShape,
    /// Flange (width) at the top, stem down (depth overall).
    Tee,
}

impl PlacedPart {
    /// A part in its reference orientation, with no holes and no loss.
    pub fn new(shape: Shape, x: f64, y: f64) -> PlacedPart {
        PlacedPart {
            shape,
            x,
            y,
            orientation: Orientation::Reference,
            holes: Vec::new(),
            loss: None,
            label: None,
            drawn_as: None,
            gauge: None,
        }
    }
    /// The same part, drawn as a `kind` (for table properties with extents).
    pub fn drawn_as(mut self, kind: GivenKind) -> PlacedPart {
        self.drawn_as = Some(kind);
        self
    }
    /// The same part turned to `orientation`.
    pub fn oriented(mut self, orientation: Orientation) -> PlacedPart {
        self.orientation = orientation;
        self
    }
    /// The same part with these holes.
    pub fn with_holes(mut self, holes: Vec<Hole>) -> PlacedPart {
        self.holes = holes;
        self
    }
    /// The same part with an inspected loss.
    pub fn with_loss(mut self, loss: Loss) -> PlacedPart {
        self.loss = Some(loss);
        self
    }
    /// The same plate with its lines of fasteners `gauge` apart.
    pub fn with_gauge(mut self, gauge: f64) -> PlacedPart {
        self.gauge = Some(gauge);
        self
    }
    /// The same part with a label for reports.
    pub fn labelled(mut self, label: &str) -> PlacedPart {
        self.label = Some(label.to_string());
        self
    }
}

/// A part's own properties, in section axes, about the part's own (reduced)
/// centroid, after orientation and loss. A missing part has zero area and
/// second moments.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PartProperties {
    pub area: f64,
    pub ix: f64,
    pub iy: f64,
    pub ixy: f64,
    /// Where the reduced centroid lies in section coordinates (equal to the
    /// part's `x`, `y` unless a thickness loss moved it).
    pub centroid_x: f64,
    pub centroid_y: f64,
}

/// Everything the section needs from one part.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Resolved {
    pub props: PartProperties,
    pub missing: bool,
    /// The geometry as inspected (or as built when `missing`), in the datum frame.
    pub geometry: Geometry,
    pub matrix: [[f64; 2]; 2],
    /// As-built centroid in the datum frame (placed at the part's x, y).
    pub datum_centroid: (f64, f64),
    pub condition: Condition,
}

/// Resolves a part; with `with_loss == false` the inspected loss is ignored.
pub(crate) fn resolve(
    part: usize,
    p: &PlacedPart,
    with_loss: bool,
) -> Result<Resolved, SectionError> {
    for (field, value) in [("x", p.x), ("y", p.y)] {
        if !value.is_finite() {
            return Err(SectionError::NonFinite { part, field, value });
        }
    }
    let original = p.shape.local(part)?;
    let matrix = p.orientation.matrix(&p.shape, part)?;
    let loss = if with_loss { p.loss.as_ref() } else { None };
    let condition = apply_loss(part, &p.shape, loss)?;
    let datum_centroid = (original.cx, original.cy);
    let (geometry, local, factor, missing) = match &condition {
        Condition::Missing => (p.shape.geometry(), original, 0.0, true),
        Condition::Present {
            shape,
            area_factor,
            shift: (sx, sy),
            ..
        } => {
            let mut local = shape.local(part)?;
            local.cx += sx;
            local.cy += sy;
            let geometry = match shape.geometry() {
                Geometry::Polygons(polys) => Geometry::Polygons(
                    polys
                        .into_iter()
                        .map(|poly| poly.into_iter().map(|(x, y)| (x + sx, y + sy)).collect())
                        .collect(),
                ),
                other => other,
            };
            (geometry, local, *area_factor, false)
        }
    };
    let (ix, iy, ixy) = transform_moments(matrix, local.ix, local.iy, local.ixy);
    let [[a, b], [c, d]] = matrix;
    let (dx, dy) = (local.cx - original.cx, local.cy - original.cy);
    let props = PartProperties {
        area: local.area * factor,
        ix: ix * factor,
        iy: iy * factor,
        ixy: ixy * factor,
        centroid_x: p.x + a * dx + b * dy,
        centroid_y: p.y + c * dx + d * dy,
    };
    Ok(Resolved {
        props,
        missing,
        geometry,
        matrix,
        datum_centroid,
        condition,
    })
}

/// A part's own properties (section axes, about its own reduced centroid,
/// after orientation and loss). Errors name the part as index 0.
pub fn part_properties(p: &PlacedPart) -> Result<PartProperties, SectionError> {
    part_properties_indexed(0, p)
}

/// As [`part_properties`], naming the part `index` in any error.
pub fn part_properties_indexed(
    index: usize,
    p: &PlacedPart,
) -> Result<PartProperties, SectionError> {
    resolve(index, p, true).map(|r| r.props)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;
    use std::f64::consts::PI;

    fn props(shape: Shape) -> PartProperties {
        part_properties(&PlacedPart::new(shape, 0.0, 0.0)).unwrap()
    }

    #[test]
    fn plate_is_bh3_over_12() {
        // Rectangle: A = b·h, Ix = b·h³/12, Iy = h·b³/12 (closed form).
        let p = props(Shape::Plate {
            width: 16.0,
            thickness: 0.5,
        });
        assert_relative_eq!(p.area, 8.0, max_relative = 1e-12);
        assert_relative_eq!(p.ix, 16.0 * 0.125 / 12.0, max_relative = 1e-12);
        assert_relative_eq!(p.iy, 0.5 * 4096.0 / 12.0, max_relative = 1e-12);
        assert_relative_eq!(p.ixy, 0.0, epsilon = 1e-12);
    }

    #[test]
    fn eyebar_has_width_in_truss_plane() {
        // Rectangle closed form with the 8 in width along y: Ix = 1·8³/12.
        let p = props(Shape::EyeBar {
            width: 8.0,
            thickness: 1.0,
        });
        assert_relative_eq!(p.ix, 512.0 / 12.0, max_relative = 1e-12);
        assert_relative_eq!(p.iy, 8.0 / 12.0, max_relative = 1e-12);
    }

    #[test]
    fn round_bar_is_pi_d4_over_64() {
        // Circle: A = πd²/4, I = πd⁴/64 (closed form).
        let p = props(Shape::RoundBar { diameter: 2.0 });
        assert_relative_eq!(p.area, PI, max_relative = 1e-12);
        assert_relative_eq!(p.ix, PI * 16.0 / 64.0, max_relative = 1e-12);
        assert_relative_eq!(p.iy, p.ix, max_relative = 1e-12);
    }

    #[test]
    fn square_bar_is_s4_over_12() {
        // Square: I = s⁴/12 (closed form).
        let p = props(Shape::SquareBar { side: 1.5 });
        assert_relative_eq!(p.ix, 1.5f64.powi(4) / 12.0, max_relative = 1e-12);
        assert_relative_eq!(p.area, 2.25, max_relative = 1e-12);
    }

    #[test]
    fn pipe_matches_closed_form() {
        // Annulus: A = π(D²−d²)/4, I = π(D⁴−d⁴)/64 with d = D − 2t (closed form).
        let p = props(Shape::Pipe {
            outer_diameter: 6.625,
            wall: 0.28,
        });
        let d = 6.625 - 0.56;
        assert_relative_eq!(
            p.area,
            PI / 4.0 * (6.625f64.powi(2) - d * d),
            max_relative = 1e-12
        );
        assert_relative_eq!(
            p.ix,
            PI / 64.0 * (6.625f64.powi(4) - d.powi(4)),
            max_relative = 1e-12
        );
        // Pipe 6 Std: A ≈ 5.58 in², I ≈ 28.1 in⁴ (AISC Manual, from memory;
        // the table uses the same nominal wall).
        assert_relative_eq!(p.area, 5.58, max_relative = 0.01);
        assert_relative_eq!(p.ix, 28.1, max_relative = 0.01);
    }

    #[test]
    fn rect_tube_matches_closed_form() {
        // Hollow rectangle: I = (B·H³ − b·h³)/12 (closed form).
        let p = props(Shape::RectTube {
            width: 4.0,
            height: 6.0,
            wall: 0.25,
        });
        assert_relative_eq!(p.area, 24.0 - 3.5 * 5.5, max_relative = 1e-12);
        assert_relative_eq!(
            p.ix,
            (4.0 * 216.0 - 3.5 * 5.5f64.powi(3)) / 12.0,
            max_relative = 1e-12
        );
        assert_relative_eq!(
            p.iy,
            (6.0 * 64.0 - 5.5 * 3.5f64.powi(3)) / 12.0,
            max_relative = 1e-12
        );
    }

    #[test]
    fn c15x33_9_against_steel_table() {
        // AISC Manual C15×33.9 (from memory): d 15, bf 3.40, tw 0.400,
        // tf 0.650, inner flange slope 1:6; A 10.0, Ix 315, Iy 8.07, x̄ 0.787.
        // Tolerance 3 % for the neglected fillets and rounding.
        let shape = Shape::Channel {
            depth: 15.0,
            flange_width: 3.4,
            web_thickness: 0.4,
            flange_thickness: 0.65,
            flange_slope: 1.0 / 6.0,
        };
        let p = props(shape.clone());
        assert_relative_eq!(p.area, 10.0, max_relative = 0.03);
        assert_relative_eq!(p.ix, 315.0, max_relative = 0.03);
        assert_relative_eq!(p.iy, 8.07, max_relative = 0.03);
        let local = shape.local(0).unwrap();
        assert_relative_eq!(local.cx, 0.787, max_relative = 0.03);
    }

    #[test]
    fn c12x20_7_against_steel_table() {
        // AISC Manual C12×20.7 (from memory): d 12, bf 2.94, tw 0.282,
        // tf 0.501, slope 1:6; A 6.08, Ix 129, Iy 3.86, x̄ 0.698.
        let shape = Shape::Channel {
            depth: 12.0,
            flange_width: 2.942,
            web_thickness: 0.282,
            flange_thickness: 0.501,
            flange_slope: 1.0 / 6.0,
        };
        let p = props(shape.clone());
        assert_relative_eq!(p.area, 6.08, max_relative = 0.03);
        assert_relative_eq!(p.ix, 129.0, max_relative = 0.03);
        assert_relative_eq!(p.iy, 3.86, max_relative = 0.04);
        assert_relative_eq!(shape.local(0).unwrap().cx, 0.698, max_relative = 0.03);
    }

    #[test]
    fn l4x4x_half_against_steel_table() {
        // AISC Manual L4×4×1/2 (from memory): A 3.75, Ix = Iy 5.52 (5.56 in
        // older editions), ȳ = x̄ 1.18, rz 0.776.
        let shape = Shape::Angle {
            leg_x: 4.0,
            leg_y: 4.0,
            thickness: 0.5,
        };
        let p = props(shape.clone());
        assert_relative_eq!(p.area, 3.75, max_relative = 0.01);
        assert_relative_eq!(p.ix, 5.52, max_relative = 0.02);
        assert_relative_eq!(p.iy, 5.52, max_relative = 0.02);
        let local = shape.local(0).unwrap();
        assert_relative_eq!(local.cy, 1.18, max_relative = 0.01);
        let pr = super::super::builtup::principal_moments(p.ix, p.iy, p.ixy);
        assert_relative_eq!((pr.minor / p.area).sqrt(), 0.776, max_relative = 0.02);
    }

    #[test]
    fn l6x4x_half_against_steel_table() {
        // AISC Manual L6×4×1/2, long leg vertical (from memory): A 4.75,
        // Ix 17.4, ȳ 1.99, Iy 6.27, x̄ 0.987, rz 0.864, tan α 0.440.
        let shape = Shape::Angle {
            leg_x: 4.0,
            leg_y: 6.0,
            thickness: 0.5,
        };
        let p = props(shape.clone());
        assert_relative_eq!(p.area, 4.75, max_relative = 0.01);
        assert_relative_eq!(p.ix, 17.4, max_relative = 0.02);
        assert_relative_eq!(p.iy, 6.27, max_relative = 0.02);
        let local = shape.local(0).unwrap();
        assert_relative_eq!(local.cx, 0.987, max_relative = 0.01);
        assert_relative_eq!(local.cy, 1.99, max_relative = 0.01);
        // Legs into ++: material lies at (+x, −y) and (−x, +y) of the
        // centroid, so Ixy < 0 (sign from the geometry).
        assert!(p.ixy < -1.0);
        let pr = super::super::builtup::principal_moments(p.ix, p.iy, p.ixy);
        assert_relative_eq!((pr.minor / p.area).sqrt(), 0.864, max_relative = 0.02);
        assert_relative_eq!(pr.angle.tan(), 0.440, max_relative = 0.02);
    }

    #[test]
    fn w8x31_against_steel_table() {
        // AISC Manual W8×31 (from memory): d 8.00, bf 8.00, tw 0.285,
        // tf 0.435; A 9.13, Ix 110, Iy 37.1 (fillets neglected: 3 %).
        let p = props(Shape::IShape {
            depth: 8.0,
            flange_width: 7.995,
            web_thickness: 0.285,
            flange_thickness: 0.435,
            flange_slope: 0.0,
        });
        assert_relative_eq!(p.area, 9.13, max_relative = 0.03);
        assert_relative_eq!(p.ix, 110.0, max_relative = 0.03);
        assert_relative_eq!(p.iy, 37.1, max_relative = 0.03);
    }

    #[test]
    fn tee_centroid_and_moment_by_hand() {
        // Flange 6 × 1 on top, stem 1 × 5 below (depth 6), worked by hand:
        // A = 6 + 5 = 11; ȳ below top = (6·0.5 + 5·3.5)/11 = 20.5/11.
        // Ix = 6·1³/12 + 6(0.5−ȳ)² + 1·5³/12 + 5(3.5−ȳ)².
        let shape = Shape::Tee {
            depth: 6.0,
            flange_width: 6.0,
            stem_thickness: 1.0,
            flange_thickness: 1.0,
        };
        let l = shape.local(0).unwrap();
        let yb = 20.5 / 11.0;
        assert_relative_eq!(l.area, 11.0, max_relative = 1e-12);
        assert_relative_eq!(l.cy, -yb, max_relative = 1e-12);
        let ix = 0.5 + 6.0 * (0.5 - yb).powi(2) + 125.0 / 12.0 + 5.0 * (3.5 - yb).powi(2);
        assert_relative_eq!(l.ix, ix, max_relative = 1e-12);
        assert_relative_eq!(l.iy, 216.0 / 12.0 + 5.0 / 12.0, max_relative = 1e-12);
    }

    #[test]
    fn orientations_turn_and_mirror() {
        let angle = Shape::Angle {
            leg_x: 4.0,
            leg_y: 6.0,
            thickness: 0.5,
        };
        let base = props(angle.clone());
        // Mirroring one axis flips the sign of Ixy only (∫xy dA with x → −x).
        let m = part_properties(
            &PlacedPart::new(angle.clone(), 0.0, 0.0).oriented(Orientation::Legs(Quadrant::NP)),
        )
        .unwrap();
        assert_relative_eq!(m.ix, base.ix, max_relative = 1e-12);
        assert_relative_eq!(m.ixy, -base.ixy, max_relative = 1e-12);
        let both = part_properties(
            &PlacedPart::new(angle.clone(), 0.0, 0.0).oriented(Orientation::Legs(Quadrant::NN)),
        )
        .unwrap();
        assert_relative_eq!(both.ixy, base.ixy, max_relative = 1e-12);
        // A quarter turn swaps Ix and Iy and negates Ixy.
        let r = part_properties(
            &PlacedPart::new(angle.clone(), 0.0, 0.0).oriented(Orientation::Rotated90),
        )
        .unwrap();
        assert_relative_eq!(r.ix, base.iy, max_relative = 1e-12);
        assert_relative_eq!(r.iy, base.ix, max_relative = 1e-12);
        assert_relative_eq!(r.ixy, -base.ixy, max_relative = 1e-12);
        // Toes make no sense for an angle.
        let e = part_properties(
            &PlacedPart::new(angle, 0.0, 0.0).oriented(Orientation::Toes(Direction::NegX)),
        );
        assert!(matches!(
            e,
            Err(SectionError::InvalidOrientation { part: 0, .. })
        ));
        // A channel with toes up has its web horizontal: Ix and Iy swap.
        let ch = Shape::Channel {
            depth: 12.0,
            flange_width: 3.0,
            web_thickness: 0.3,
            flange_thickness: 0.5,
            flange_slope: 0.0,
        };
        let c0 = props(ch.clone());
        let up = part_properties(
            &PlacedPart::new(ch, 0.0, 0.0).oriented(Orientation::Toes(Direction::PosY)),
        )
        .unwrap();
        assert_relative_eq!(up.ix, c0.iy, max_relative = 1e-12);
        assert_relative_eq!(up.iy, c0.ix, max_relative = 1e-12);
    }

    #[test]
    fn invalid_dimensions_name_the_part() {
        for bad in [0.0, -1.0, f64::NAN, f64::INFINITY] {
            let e = part_properties_indexed(
                3,
                &PlacedPart::new(
                    Shape::Plate {
                        width: bad,
                        thickness: 0.5,
                    },
                    0.0,
                    0.0,
                ),
            )
            .unwrap_err();
            assert!(
                matches!(
                    e,
                    SectionError::InvalidDimension {
                        part: 3,
                        field: "width",
                        ..
                    }
                ),
                "{e:?}"
            );
        }
        let e = part_properties(&PlacedPart::new(
            Shape::Pipe {
                outer_diameter: 4.0,
                wall: 2.0,
            },
            0.0,
            0.0,
        ))
        .unwrap_err();
        assert!(matches!(e, SectionError::WallTooThick { part: 0, .. }));
        let e = part_properties(&PlacedPart::new(
            Shape::given(8.2, 190.0, 6.3),
            f64::NAN,
            0.0,
        ))
        .unwrap_err();
        assert!(matches!(
            e,
            SectionError::NonFinite {
                part: 0,
                field: "x",
                ..
            }
        ));
        let bad_ixy = Shape::Given {
            area: 1.0,
            ix: 1.0,
            iy: 1.0,
            ixy: 1.0,
            depth: None,
            width: None,
        };
        assert!(matches!(
            bad_ixy.validate(2),
            Err(SectionError::InvalidGeometry { part: 2, .. })
        ));
        let steep = Shape::Channel {
            depth: 12.0,
            flange_width: 3.0,
            web_thickness: 0.3,
            flange_thickness: 0.2,
            flange_slope: 1.0,
        };
        assert!(matches!(
            steep.validate(1),
            Err(SectionError::InvalidGeometry { part: 1, .. })
        ));
    }
}
