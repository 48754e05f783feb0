//! The outline of each part as polygons in section coordinates: what the
//! report draws, and where the extreme fibres for elastic moduli come from.

use super::part::{polygon_properties, resolve, Geometry, GivenKind, PlacedPart, Resolved};
use super::SectionError;

/// Number of sides used for a circle; a multiple of 4 so that the extreme
/// fibres at 0°, 90°, 180° and 270° are vertices and exact.
pub const CIRCLE_SIDES: usize = 96;

/// Polygons of a part in section coordinates (as inspected; a missing part
/// gives its as-built outline so it can be drawn dashed). Each polygon is
/// implicitly closed (the last vertex joins the first). Outer boundaries run
/// counter-clockwise, voids (inside of pipes and tubes) clockwise. Circles are
/// polygons of [`CIRCLE_SIDES`] sides. A [`super::Shape::Given`] part is drawn
/// as its width × depth rectangle centred on its centroid. An invalid part
/// gives no polygons; see [`try_outline`].
pub fn outline(p: &PlacedPart) -> Vec<Vec<(f64, f64)>> {
    try_outline(p).unwrap_or_default()
}

/// As [`outline`], reporting why a part cannot be drawn (as part 0).
pub fn try_outline(p: &PlacedPart) -> Result<Vec<Vec<(f64, f64)>>, SectionError> {
    resolve(0, p, true).map(|r| placed_polygons(&r, p))
}

/// The as-built outline, ignoring any loss.
pub fn outline_original(p: &PlacedPart) -> Vec<Vec<(f64, f64)>> {
    resolve(0, p, false)
        .map(|r| placed_polygons(&r, p))
        .unwrap_or_default()
}

/// A circle of diameter `d` centred on the origin, counter-clockwise.
fn circle(d: f64) -> Vec<(f64, f64)> {
    (0..CIRCLE_SIDES)
        .map(|k| {
            let a = std::f64::consts::TAU * k as f64 / CIRCLE_SIDES as f64;
            (d / 2.0 * a.cos(), d / 2.0 * a.sin())
        })
        .collect()
}

/// Whether the outline of `p` is its real shape: false for a part given by
/// table properties drawn as a rectangle (no kind, or its width and depth
/// estimated from the radii of gyration), which a drawing must say.
pub fn outline_to_shape(p: &PlacedPart) -> bool {
    match resolve(0, p, false) {
        Ok(r) => match r.geometry {
            Geometry::Tabulated {
                area,
                width,
                depth,
                estimated,
                ..
            } => {
                !estimated
                    && p.drawn_as
                        .and_then(|k| idealised(k, area, width, depth))
                        .is_some()
            }
            _ => true,
        },
        Err(_) => false,
    }
}

/// A rolled shape of `kind` with overall `width` × `depth` and one element
/// thickness t chosen so that its area is `area` (fillets and flange slopes
/// left out: a drawing, not properties), its own centroid at the origin.
/// Thickness by hand: angle and tee A = t(w + d − t); channel and I-shape
/// A = t(d + 2w − 2t). None when no such t fits.
pub fn idealised(kind: GivenKind, area: f64, w: f64, d: f64) -> Option<Vec<(f64, f64)>> {
    let t = match kind {
        GivenKind::Angle | GivenKind::Tee => {
            let b = w + d;
            (b - (b * b - 4.0 * area).sqrt()) / 2.0
        }
        GivenKind::Channel | GivenKind::IShape => {
            let b = d + 2.0 * w;
            (b - (b * b - 8.0 * area).sqrt()) / 4.0
        }
    };
    let limit = match kind {
        GivenKind::Angle => w.min(d),
        GivenKind::Tee => w.min(d),
        GivenKind::Channel => w.min(d / 2.0),
        GivenKind::IShape => w.min(d / 2.0),
    };
    if !(t.is_finite() && t > 0.0 && t < limit) {
        return None;
    }
    let poly = match kind {
        GivenKind::Angle => vec![(0.0, 0.0), (w, 0.0), (w, t), (t, t), (t, d), (0.0, d)],
        GivenKind::Channel => vec![
            (0.0, 0.0),
            (w, 0.0),
            (w, t),
            (t, t),
            (t, d - t),
            (w, d - t),
            (w, d),
            (0.0, d),
        ],
        GivenKind::IShape => {
            let (a, h) = (w / 2.0, t / 2.0);
            vec![
                (-a, 0.0),
                (a, 0.0),
                (a, t),
                (h, t),
                (h, d - t),
                (a, d - t),
                (a, d),
                (-a, d),
                (-a, d - t),
                (-h, d - t),
                (-h, t),
                (-a, t),
            ]
        }
        GivenKind::Tee => {
            let (a, h) = (w / 2.0, t / 2.0);
            vec![
                (-h, 0.0),
                (h, 0.0),
                (h, d - t),
                (a, d - t),
                (a, d),
                (-a, d),
                (-a, d - t),
                (-h, d - t),
            ]
        }
    };
    let c = polygon_properties(std::slice::from_ref(&poly));
    Some(
        poly.into_iter()
            .map(|(x, y)| (x - c.cx, y - c.cy))
            .collect(),
    )
}

/// Polygons of the resolved geometry in the datum frame.
fn datum_polygons(g: &Geometry, kind: Option<GivenKind>) -> Vec<Vec<(f64, f64)>> {
    match g {
        Geometry::Polygons(p) => p.clone(),
        Geometry::Annulus { outer, inner } => {
            let mut v = vec![circle(*outer)];
            if *inner > 0.0 {
                let mut c = circle(*inner);
                c.reverse();
                v.push(c);
            }
            v
        }
        Geometry::Tabulated {
            area,
            width,
            depth,
            estimated: false,
            ..
        } if kind.is_some_and(|k| idealised(k, *area, *width, *depth).is_some()) => {
            vec![idealised(kind.unwrap(), *area, *width, *depth).unwrap()]
        }
        Geometry::Tabulated { width, depth, .. } => {
            let (a, b) = (width / 2.0, depth / 2.0);
            vec![vec![(-a, -b), (a, -b), (a, b), (-a, b)]]
        }
    }
}

/// Places a resolved part's polygons: `q = (x, y) + M·(p − c₀)` with `c₀` the
/// as-built centroid in the datum frame; mirrored parts have their vertex
/// order reversed to keep outer boundaries counter-clockwise.
pub(crate) fn placed_polygons(r: &Resolved, p: &PlacedPart) -> Vec<Vec<(f64, f64)>> {
    let [[a, b], [c, d]] = r.matrix;
    let (cx, cy) = r.datum_centroid;
    let mirrored = a * d - b * c < 0.0;
    datum_polygons(&r.geometry, p.drawn_as)
        .into_iter()
        .map(|poly| {
            let mut q: Vec<(f64, f64)> = poly
                .into_iter()
                .map(|(u, v)| {
                    let (u, v) = (u - cx, v - cy);
                    (p.x + a * u + b * v, p.y + c * u + d * v)
                })
                .collect();
            if mirrored {
                q.reverse();
            }
            q
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::super::part::{Orientation, Quadrant, Shape};
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn outline_area_and_centroid_match_part() {
        // The placed outline of an angle has the part's area (L6×4×1/2:
        // 0.5(6 + 4 − 0.5) = 4.75, by hand) and its centroid at the part's x, y.
        let p = PlacedPart::new(
            Shape::Angle {
                leg_x: 4.0,
                leg_y: 6.0,
                thickness: 0.5,
            },
            3.0,
            -2.0,
        )
        .oriented(Orientation::Legs(Quadrant::NN));
        let poly = outline(&p);
        let l = polygon_properties(&poly);
        assert_relative_eq!(l.area, 4.75, max_relative = 1e-12);
        assert_relative_eq!(l.cx, 3.0, max_relative = 1e-12);
        assert_relative_eq!(l.cy, -2.0, max_relative = 1e-12);
    }

    #[test]
    fn pipe_outline_has_exact_extremes_and_a_void() {
        let p = PlacedPart::new(
            Shape::Pipe {
                outer_diameter: 4.0,
                wall: 0.25,
            },
            1.0,
            1.0,
        );
        let poly = outline(&p);
        assert_eq!(poly.len(), 2);
        let ymax = poly[0].iter().map(|v| v.1).fold(f64::MIN, f64::max);
        // Top fibre at y + D/2 = 3 (vertex at 90° since 96 is a multiple of 4).
        assert_relative_eq!(ymax, 3.0, max_relative = 1e-12);
        // Void is clockwise: negative signed area of the inner polygon.
        assert!(polygon_properties(&poly[1..]).area < 0.0);
    }

    #[test]
    fn given_angle_is_drawn_as_an_angle_of_its_area() {
        // 5 × 3½ angle of area 3.05 in²: t from A = t(w + d − t):
        // t = (8.5 − √(8.5² − 4·3.05))/2 = 0.3785 in (a 3/8 in angle, by hand).
        let p = PlacedPart::new(Shape::given_with(3.05, 7.8, 3.2, 5.0, 3.5), 1.0, 2.0)
            .drawn_as(GivenKind::Angle);
        let poly = outline(&p);
        assert_eq!(poly[0].len(), 6);
        let l = polygon_properties(&poly);
        assert_relative_eq!(l.area, 3.05, max_relative = 1e-9);
        assert_relative_eq!(l.cx, 1.0, max_relative = 1e-9);
        assert_relative_eq!(l.cy, 2.0, max_relative = 1e-9);
        assert!(outline_to_shape(&p));
        // Without a kind, or without extents, the outline is not to shape.
        let plain = PlacedPart::new(Shape::given_with(3.05, 7.8, 3.2, 5.0, 3.5), 0.0, 0.0);
        assert!(!outline_to_shape(&plain));
        let est =
            PlacedPart::new(Shape::given(3.05, 7.8, 3.2), 0.0, 0.0).drawn_as(GivenKind::Angle);
        assert!(!outline_to_shape(&est));
    }

    #[test]
    fn invalid_part_has_no_outline() {
        let p = PlacedPart::new(Shape::RoundBar { diameter: -1.0 }, 0.0, 0.0);
        assert!(outline(&p).is_empty());
        assert!(try_outline(&p).is_err());
    }
}
