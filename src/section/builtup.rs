//! Combining placed parts into one member section: the parallel-axis theorem,
//! principal axes, radii of gyration and extreme-fibre section moduli, for the
//! as-inspected section and, for comparison, the as-built one.

use super::holes::hole_deduction;
use super::outline::placed_polygons;
use super::part::{resolve, Geometry, PlacedPart};
use super::SectionError;

/// Properties of a whole member section.
///
/// Second moments are about the centroid of the whole section, in section
/// axes: `ix` (about the horizontal axis) governs buckling in the truss plane
/// (`i_in = ix`), `iy` buckling out of it (`i_out = iy`).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SectionProperties {
    pub area: f64,
    pub centroid_x: f64,
    pub centroid_y: f64,
    pub ix: f64,
    pub iy: f64,
    pub ixy: f64,
    pub i_major: f64,
    pub i_minor: f64,
    /// Radians from the x axis to the major principal axis, in (−π/2, π/2].
    pub principal_angle: f64,
    pub rx: f64,
    pub ry: f64,
    pub r_min: f64,
    /// Elastic moduli `I / c` to the extreme fibres of the part outlines.
    pub sx_top: f64,
    pub sx_bottom: f64,
    pub sy_left: f64,
    pub sy_right: f64,
    /// `i_minor / i_major`; practitioners aim for the two second moments of a
    /// chord within about 10 % (common practice).
    pub balance: f64,
    /// Gross area less the critical chain of holes of each part.
    pub net_area: f64,
    /// True when a [`super::Shape::Given`] part without `depth` or `width`
    /// set an extreme fibre from its equivalent rectangle (moduli estimated).
    pub extents_estimated: bool,
}

impl SectionProperties {
    /// Second moment for in-plane buckling (`ix`).
    pub fn i_in(&self) -> f64 {
        self.ix
    }
    /// Second moment for out-of-plane buckling (`iy`).
    pub fn i_out(&self) -> f64 {
        self.iy
    }
}

/// Principal second moments by Mohr's circle.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Principal {
    pub major: f64,
    pub minor: f64,
    /// Radians from the x axis to the major axis, in (−π/2, π/2].
    pub angle: f64,
}

/// Principal second moments from `Ix = ∫y²dA`, `Iy = ∫x²dA`, `Ixy = ∫xy dA`
/// (Mohr's circle): `I₁,₂ = (Ix+Iy)/2 ± √(((Ix−Iy)/2)² + Ixy²)`, the major
/// axis at `θ = ½·atan2(−2Ixy, Ix − Iy)` from x.
pub fn principal_moments(ix: f64, iy: f64, ixy: f64) -> Principal {
    let avg = (ix + iy) / 2.0;
    let radius = ((ix - iy) / 2.0).hypot(ixy);
    let mut angle = 0.5 * (-2.0 * ixy).atan2(ix - iy);
    if angle <= -std::f64::consts::FRAC_PI_2 {
        angle += std::f64::consts::PI;
    }
    Principal {
        major: avg + radius,
        minor: avg - radius,
        angle,
    }
}

/// Second moment about a centroidal axis at angle `theta` from x (axis
/// rotation): `I(θ) = Ix·cos²θ + Iy·sin²θ − 2·Ixy·sinθ·cosθ`.
pub fn second_moment_about(ix: f64, iy: f64, ixy: f64, theta: f64) -> f64 {
    let (s, c) = theta.sin_cos();
    ix * c * c + iy * s * s - 2.0 * ixy * s * c
}

/// As-built and as-inspected properties side by side, for reports.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ConditionComparison {
    pub original: SectionProperties,
    pub reduced: SectionProperties,
}

/// Properties of the section as inspected: each part's loss applied first,
/// missing parts contributing nothing, then the parallel-axis theorem
/// `I = Σ(Iᵢ + Aᵢ·dᵢ²)` about the section centroid (`Ixy` with `Aᵢ·dxᵢ·dyᵢ`).
pub fn properties(parts: &[PlacedPart]) -> Result<SectionProperties, SectionError> {
    compute(parts, true)
}

/// Properties of the section as built, ignoring every recorded loss.
pub fn properties_original(parts: &[PlacedPart]) -> Result<SectionProperties, SectionError> {
    compute(parts, false)
}

/// Both [`properties_original`] and [`properties`].
pub fn properties_with_original(parts: &[PlacedPart]) -> Result<ConditionComparison, SectionError> {
    Ok(ConditionComparison {
        original: properties_original(parts)?,
        reduced: properties(parts)?,
    })
}

fn compute(parts: &[PlacedPart], with_loss: bool) -> Result<SectionProperties, SectionError> {
    if parts.is_empty() {
        return Err(SectionError::NoParts);
    }
    let mut resolved = Vec::with_capacity(parts.len());
    let mut net = 0.0;
    for (i, p) in parts.iter().enumerate() {
        let r = resolve(i, p, with_loss)?;
        let deduction = hole_deduction(i, p, &r.condition)?;
        if !r.missing {
            if r.props.area - deduction <= 0.0 {
                return Err(SectionError::NetAreaNonPositive {
                    part: i,
                    area: r.props.area,
                    deduction,
                });
            }
            net += r.props.area - deduction;
        }
        resolved.push(r);
    }
    let present: Vec<_> = resolved
        .iter()
        .enumerate()
        .filter(|(_, r)| !r.missing)
        .collect();
    if present.is_empty() {
        return Err(SectionError::AllPartsMissing);
    }
    let area: f64 = present.iter().map(|(_, r)| r.props.area).sum();
    let cx = present
        .iter()
        .map(|(_, r)| r.props.area * r.props.centroid_x)
        .sum::<f64>()
        / area;
    let cy = present
        .iter()
        .map(|(_, r)| r.props.area * r.props.centroid_y)
        .sum::<f64>()
        / area;
    let (mut ix, mut iy, mut ixy) = (0.0, 0.0, 0.0);
    let (mut xmin, mut xmax, mut ymin, mut ymax) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    let mut estimated = false;
    for (i, r) in &present {
        let p = &r.props;
        let (dx, dy) = (p.centroid_x - cx, p.centroid_y - cy);
        ix += p.ix + p.area * dy * dy;
        iy += p.iy + p.area * dx * dx;
        ixy += p.ixy + p.area * dx * dy;
        if let Geometry::Tabulated {
            estimated: true, ..
        } = r.geometry
        {
            estimated = true;
        }
        for poly in placed_polygons(r, &parts[*i]) {
            for (x, y) in poly {
                xmin = xmin.min(x);
                xmax = xmax.max(x);
                ymin = ymin.min(y);
                ymax = ymax.max(y);
            }
        }
    }
    let pr = principal_moments(ix, iy, ixy);
    let modulus = |i: f64, c: f64| if c > 0.0 { i / c } else { 0.0 };
    let out = SectionProperties {
        area,
        centroid_x: cx,
        centroid_y: cy,
        ix,
        iy,
        ixy,
        i_major: pr.major,
        i_minor: pr.minor,
        principal_angle: pr.angle,
        rx: (ix / area).sqrt(),
        ry: (iy / area).sqrt(),
        r_min: (pr.minor.max(0.0) / area).sqrt(),
        sx_top: modulus(ix, ymax - cy),
        sx_bottom: modulus(ix, cy - ymin),
        sy_left: modulus(iy, cx - xmin),
        sy_right: modulus(iy, xmax - cx),
        balance: if pr.major > 0.0 {
            pr.minor / pr.major
        } else {
            0.0
        },
        net_area: net,
        extents_estimated: estimated,
    };
    let all = [
        out.area,
        out.centroid_x,
        out.centroid_y,
        out.ix,
        out.iy,
        out.ixy,
        out.i_major,
        out.i_minor,
        out.principal_angle,
        out.rx,
        out.ry,
        out.r_min,
        out.sx_top,
        out.sx_bottom,
        out.sy_left,
        out.sy_right,
        out.balance,
        out.net_area,
    ];
    if all.iter().any(|v| !v.is_finite()) {
        return Err(SectionError::Overflow {
            part: present.last().map(|(i, _)| *i).unwrap_or(0),
        });
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::super::part::{Orientation, Shape};
    use super::*;
    use approx::assert_relative_eq;

    fn chord() -> Vec<PlacedPart> {
        vec![
            PlacedPart::new(
                Shape::Plate {
                    width: 16.0,
                    thickness: 0.5,
                },
                0.0,
                5.8,
            ),
            PlacedPart::new(Shape::given(8.2, 190.0, 6.3), -6.1, 0.0),
            PlacedPart::new(Shape::given(8.2, 190.0, 6.3), 6.1, 0.0),
        ]
    }

    #[test]
    fn two_channels_and_cover_plate_by_hand() {
        // Worked by hand:
        //   plate 16 × 0.5: A = 8, own Ix = 16·0.5³/12 = 1/6, own Iy = 0.5·16³/12 = 170.6667.
        //   A = 8 + 2·8.2 = 24.4.
        //   ȳ = 8·5.8/24.4 = 46.4/24.4 = 1.9016393; x̄ = 0 (symmetric).
        //   Ix = ΣIᵢ + ΣAᵢyᵢ² − A·ȳ² = (1/6 + 380) + 8·5.8² − 46.4²/24.4
        //      = 380.1666667 + 269.12 − 88.2360656 = 561.0506011.
        //   Iy = 170.6667 + 2·(6.3 + 8.2·6.1²) = 170.6667 + 12.6 + 610.244 = 793.5106667.
        let s = properties(&chord()).unwrap();
        assert_relative_eq!(s.area, 24.4, max_relative = 1e-9);
        assert_relative_eq!(s.centroid_y, 46.4 / 24.4, max_relative = 1e-9);
        assert_relative_eq!(s.centroid_x, 0.0, epsilon = 1e-12);
        let ix = 1.0 / 6.0 + 380.0 + 8.0 * 5.8 * 5.8 - 46.4 * 46.4 / 24.4;
        assert_relative_eq!(s.ix, ix, max_relative = 1e-9);
        assert_relative_eq!(s.ix, 561.0506011, max_relative = 1e-9);
        let iy = 0.5 * 16f64.powi(3) / 12.0 + 2.0 * (6.3 + 8.2 * 6.1 * 6.1);
        assert_relative_eq!(s.iy, iy, max_relative = 1e-9);
        assert_relative_eq!(s.iy, 793.5106667, max_relative = 1e-9);
        // Symmetric about y: Ixy = 0, principal axes are the section axes.
        assert_relative_eq!(s.ixy, 0.0, epsilon = 1e-9);
        assert_relative_eq!(s.i_major, iy, max_relative = 1e-9);
        assert_relative_eq!(s.i_minor, ix, max_relative = 1e-9);
        assert_relative_eq!(s.balance, ix / iy, max_relative = 1e-9);
        assert_relative_eq!(s.rx, (ix / 24.4).sqrt(), max_relative = 1e-9);
        assert_relative_eq!(s.net_area, s.area, max_relative = 1e-15);
        // Top fibre: top of the plate at 5.8 + 0.25 = 6.05 lies below the
        // equivalent-rectangle top of the given parts, h/2 = √(12·190/8.2)/2.
        let h2 = (12.0f64 * 190.0 / 8.2).sqrt() / 2.0;
        assert_relative_eq!(s.sx_top, ix / (h2 - s.centroid_y), max_relative = 1e-9);
        assert!(s.extents_estimated);
    }

    #[test]
    fn doubly_symmetric_section_has_no_product_moment() {
        // Two channels toes-out at ±5 plus two plates top and bottom:
        // doubly symmetric, so Ixy = 0 (symmetry) and centroid at the origin.
        let ch = Shape::Channel {
            depth: 12.0,
            flange_width: 2.942,
            web_thickness: 0.282,
            flange_thickness: 0.501,
            flange_slope: 1.0 / 6.0,
        };
        let pl = Shape::Plate {
            width: 14.0,
            thickness: 0.375,
        };
        let parts = vec![
            PlacedPart::new(ch.clone(), 5.0, 0.0),
            PlacedPart::new(ch, -5.0, 0.0)
                .oriented(Orientation::Toes(super::super::part::Direction::NegX)),
            PlacedPart::new(pl.clone(), 0.0, 6.1875),
            PlacedPart::new(pl, 0.0, -6.1875),
        ];
        let s = properties(&parts).unwrap();
        assert_relative_eq!(s.ixy, 0.0, epsilon = 1e-9);
        assert_relative_eq!(s.centroid_x, 0.0, epsilon = 1e-12);
        assert_relative_eq!(s.centroid_y, 0.0, epsilon = 1e-12);
        assert_relative_eq!(s.sx_top, s.sx_bottom, max_relative = 1e-12);
        assert_relative_eq!(s.sy_left, s.sy_right, max_relative = 1e-12);
        // Extreme fibre: plate top at 6.1875 + 0.1875 = 6.375 (by hand).
        assert_relative_eq!(s.sx_top, s.ix / 6.375, max_relative = 1e-12);
    }

    #[test]
    fn single_angle_principal_axes_by_mohrs_circle() {
        let a = vec![PlacedPart::new(
            Shape::Angle {
                leg_x: 4.0,
                leg_y: 6.0,
                thickness: 0.5,
            },
            0.0,
            0.0,
        )];
        let s = properties(&a).unwrap();
        assert!(s.ixy.abs() > 1.0);
        // Mohr's circle: the second moment about the principal angle is the
        // maximum, a quarter turn later the minimum; every other axis lies
        // between, and Ix + Iy = I₁ + I₂ (invariant).
        let f = |t: f64| second_moment_about(s.ix, s.iy, s.ixy, t);
        assert_relative_eq!(f(s.principal_angle), s.i_major, max_relative = 1e-12);
        assert_relative_eq!(
            f(s.principal_angle + std::f64::consts::FRAC_PI_2),
            s.i_minor,
            max_relative = 1e-12
        );
        for k in 0..36 {
            let v = f(k as f64 * std::f64::consts::PI / 36.0);
            assert!(v <= s.i_major * (1.0 + 1e-12) && v >= s.i_minor * (1.0 - 1e-12));
        }
        assert_relative_eq!(s.i_major + s.i_minor, s.ix + s.iy, max_relative = 1e-12);
        // Principal product moment vanishes: Ixy' = (Ix−Iy)/2·sin2θ + Ixy·cos2θ = 0.
        let t = s.principal_angle;
        let ixy_p = (s.ix - s.iy) / 2.0 * (2.0 * t).sin() + s.ixy * (2.0 * t).cos();
        assert!(ixy_p.abs() < 1e-9 * s.i_major);
    }

    /// Second moments of a part rotated by φ (tensor rotation):
    /// Ix' = Ix c² + Iy s² + 2Ixy sc, Iy' = Ix s² + Iy c² − 2Ixy sc,
    /// Ixy' = (Iy − Ix) sc + Ixy (c² − s²), for x' = x c − y s, y' = x s + y c.
    fn rotated_given(area: f64, ix: f64, iy: f64, ixy: f64, phi: f64) -> Shape {
        let (s, c) = phi.sin_cos();
        Shape::Given {
            area,
            ix: ix * c * c + iy * s * s + 2.0 * ixy * s * c,
            iy: ix * s * s + iy * c * c - 2.0 * ixy * s * c,
            ixy: (iy - ix) * s * c + ixy * (c * c - s * s),
            depth: None,
            width: None,
        }
    }

    #[test]
    fn principal_moments_invariant_under_rotation_of_the_whole_section() {
        // A lopsided section of three tabulated parts; rotating every part
        // and its position by φ must leave I₁, I₂ unchanged and turn the
        // principal axis by φ (rigid-body rotation, tensor invariants).
        let base = [
            (5.0, 20.0, 3.0, 1.0, 2.0, 1.0),
            (3.0, 4.0, 9.0, -0.5, -3.0, 2.5),
            (2.0, 1.0, 1.0, 0.0, 0.5, -4.0),
        ];
        let build = |phi: f64| -> Vec<PlacedPart> {
            let (s, c) = phi.sin_cos();
            base.iter()
                .map(|&(a, ix, iy, ixy, x, y)| {
                    PlacedPart::new(
                        rotated_given(a, ix, iy, ixy, phi),
                        x * c - y * s,
                        x * s + y * c,
                    )
                })
                .collect()
        };
        let s0 = properties(&build(0.0)).unwrap();
        assert!(s0.ixy.abs() > 1.0);
        for phi in [0.3, 1.1, -0.7] {
            let s = properties(&build(phi)).unwrap();
            assert_relative_eq!(s.i_major, s0.i_major, max_relative = 1e-10);
            assert_relative_eq!(s.i_minor, s0.i_minor, max_relative = 1e-10);
            assert_relative_eq!(s.ix + s.iy, s0.ix + s0.iy, max_relative = 1e-10);
            assert_relative_eq!(s.area, s0.area, max_relative = 1e-12);
            // Axis direction: compare modulo π.
            let d = (s.principal_angle - s0.principal_angle - phi).rem_euclid(std::f64::consts::PI);
            assert!(d.min(std::f64::consts::PI - d) < 1e-9, "phi {phi}: {d}");
        }
    }

    #[test]
    fn section_errors() {
        assert_eq!(properties(&[]), Err(SectionError::NoParts));
        let mut parts = chord();
        for p in &mut parts {
            p.loss = Some(super::super::condition::Loss::Missing);
        }
        assert_eq!(properties(&parts), Err(SectionError::AllPartsMissing));
        assert!(properties_original(&parts).is_ok());
        let mut parts = chord();
        parts[2].shape = Shape::given(8.2, -190.0, 6.3);
        assert!(matches!(
            properties(&parts),
            Err(SectionError::InvalidDimension {
                part: 2,
                field: "ix",
                ..
            })
        ));
        let mut parts = chord();
        parts[1].shape = Shape::Plate {
            width: f64::NAN,
            thickness: 0.5,
        };
        assert!(matches!(
            properties(&parts),
            Err(SectionError::InvalidDimension {
                part: 1,
                field: "width",
                ..
            })
        ));
        let mut parts = chord();
        parts[0].shape = Shape::Plate {
            width: 1e200,
            thickness: 1e200,
        };
        assert!(matches!(
            properties(&parts),
            Err(SectionError::Overflow { .. })
        ));
    }
}
