//! Rivet and bolt holes: the net area of a member across its critical
//! section, straight across or along a staggered chain (the s²/4g rule).

use super::condition::Condition;
use super::part::{resolve, PlacedPart, Shape};
use super::SectionError;

/// One hole on a failure path across a part.
///
/// `diameter` is the hole width used for net area: the caller adds the
/// allowance (see [`hole_diameter`]). `pitch` (s, along the member) and
/// `gauge` (g, across it) are measured to the PREVIOUS hole on the same chain;
/// they are ignored on the first hole of a chain.
///
/// `thickness` is the thickness of the element the hole pierces. When `None`
/// it is taken from the shape: plate and eye-bar thickness, channel WEB
/// thickness, angle thickness, I-shape and tee FLANGE thickness (average
/// thickness for sloped flanges), pipe and tube wall (one wall), round-bar
/// diameter and square-bar side. A hole in a channel flange or an I-shape web
/// must give its thickness; a [`Shape::Given`] part always must.
///
/// `chain` groups holes into failure paths across the part. Each chain is a
/// complete path: list every hole on it, including holes shared with other
/// chains. The part's net area is taken on the chain that removes most (the
/// critical path). Plain holes straight across a part all sit in chain 0.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Hole {
    pub diameter: f64,
    pub gauge: Option<f64>,
    pub pitch: Option<f64>,
    pub thickness: Option<f64>,
    pub chain: usize,
}

impl Hole {
    /// A hole straight across (no stagger), in chain 0.
    pub fn new(diameter: f64) -> Hole {
        Hole {
            diameter,
            ..Hole::default()
        }
    }
    /// A hole staggered from the previous hole of its chain by pitch `s` and gauge `g`.
    pub fn staggered(diameter: f64, pitch: f64, gauge: f64) -> Hole {
        Hole {
            diameter,
            pitch: Some(pitch),
            gauge: Some(gauge),
            ..Hole::default()
        }
    }
    /// The same hole on failure path `chain`.
    pub fn in_chain(mut self, chain: usize) -> Hole {
        self.chain = chain;
        self
    }
    /// The same hole through an element of thickness `t`.
    pub fn through(mut self, t: f64) -> Hole {
        self.thickness = Some(t);
        self
    }
    /// `s²/(4g)` to the previous hole, or 0 when the stagger data is absent
    /// or not positive (which is conservative).
    fn stagger_term(&self) -> f64 {
        match (self.pitch, self.gauge) {
            (Some(s), Some(g)) if s.is_finite() && g.is_finite() && s > 0.0 && g > 0.0 => {
                s * s / (4.0 * g)
            }
            _ => 0.0,
        }
    }
}

/// Hole width for net area: `fastener + allowance`.
///
/// Common practice (US): a standard hole is 1/16 in larger than the fastener
/// and AISC 360-16 §B4.3b adds another 1/16 in (2 mm metric) for damage, so
/// for a 3/4 in rivet the net-area width is 3/4 + 1/8 = 7/8 in; AASHTO uses
/// the same 1/8 in over the nominal fastener. Pass `allowance = 0.125` (in)
/// with the fastener size, or 1/16 in (2 mm) with the nominal hole size.
pub fn hole_diameter(fastener: f64, allowance: f64) -> f64 {
    fastener + allowance
}

/// Net area along one staggered chain of holes through a uniform thickness:
/// `An = Ag − t·Σd + t·Σ s²/(4g)` (AISC 360-16 §B4.3b, AASHTO 6.8.3).
///
/// Each hole's `pitch` and `gauge` are to the previous hole in `path`; the
/// first hole's are ignored, and absent or non-positive stagger data adds
/// nothing. The result is clamped to `0 ≤ An ≤ Ag`; non-finite inputs give 0.
pub fn net_area_staggered(gross_area: f64, thickness: f64, path: &[Hole]) -> f64 {
    let sum_d: f64 = path.iter().map(|h| h.diameter).sum();
    let sum_s: f64 = path.iter().skip(1).map(Hole::stagger_term).sum();
    let net = gross_area - thickness * (sum_d - sum_s);
    if net.is_finite() && gross_area.is_finite() {
        net.clamp(0.0, gross_area.max(0.0))
    } else {
        0.0
    }
}

/// The critical net area: the least of [`net_area_staggered`] over the chains
/// given (the gross area when there are none).
pub fn critical_net_area(gross_area: f64, thickness: f64, chains: &[Vec<Hole>]) -> f64 {
    chains
        .iter()
        .map(|c| net_area_staggered(gross_area, thickness, c))
        .fold(net_area_staggered(gross_area, thickness, &[]), f64::min)
}

/// Default element thickness a hole pierces (see [`Hole`]).
fn default_thickness(shape: &Shape) -> Option<f64> {
    match *shape {
        Shape::Plate { thickness, .. } | Shape::EyeBar { thickness, .. } => Some(thickness),
        Shape::Channel { web_thickness, .. } => Some(web_thickness),
        Shape::Angle { thickness, .. } => Some(thickness),
        Shape::IShape {
            flange_thickness, ..
        }
        | Shape::Tee {
            flange_thickness, ..
        } => Some(flange_thickness),
        Shape::Pipe { wall, .. } | Shape::RectTube { wall, .. } => Some(wall),
        Shape::RoundBar { diameter } => Some(diameter),
        Shape::SquareBar { side } => Some(side),
        Shape::Given { .. } => None,
    }
}

/// Checks a part's holes and returns the area its critical chain removes
/// under `condition` (0 for a missing part).
///
/// Per chain: `Σ dᵢ·tᵢ − Σ sᵢ²/(4gᵢ)·min(tᵢ, tᵢ₋₁)`, the stagger credit taken
/// on the thinner of the two elements it joins (conservative). For holes in
/// opposite legs of an angle the caller gives the gauge as the sum of the
/// gauges from the heel less the thickness (AISC 360-16 §B4.3b).
pub(crate) fn hole_deduction(
    part: usize,
    p: &PlacedPart,
    condition: &Condition,
) -> Result<f64, SectionError> {
    let mut thicknesses = Vec::with_capacity(p.holes.len());
    for (i, h) in p.holes.iter().enumerate() {
        let bad = |field: &'static str, value: f64| SectionError::InvalidHole {
            part,
            hole: i,
            field,
            value,
        };
        if !(h.diameter.is_finite() && h.diameter > 0.0) {
            return Err(bad("diameter", h.diameter));
        }
        if let Some(g) = h.gauge {
            if !(g.is_finite() && g > 0.0) {
                return Err(bad("gauge", g));
            }
        }
        if let Some(s) = h.pitch {
            if !(s.is_finite() && s >= 0.0) {
                return Err(bad("pitch", s));
            }
            if s > 0.0 && h.gauge.is_none() {
                return Err(bad("gauge (required with a pitch)", f64::NAN));
            }
        }
        if let Some(t) = h.thickness {
            if !(t.is_finite() && t > 0.0) {
                return Err(bad("thickness", t));
            }
        }
        let t = match condition {
            Condition::Missing => 0.0,
            Condition::Present {
                shape,
                area_factor,
                thickness_loss,
                ..
            } => {
                let t = match h.thickness {
                    Some(t) if *thickness_loss >= t => {
                        return Err(SectionError::LossExceedsThickness {
                            part,
                            field: "hole element thickness",
                            loss: *thickness_loss,
                            thickness: t,
                        })
                    }
                    Some(t) => t - thickness_loss,
                    None => {
                        default_thickness(shape).ok_or(SectionError::HoleThicknessRequired {
                            part,
                            hole: i,
                            shape: shape.kind(),
                        })?
                    }
                };
                t * area_factor
            }
        };
        thicknesses.push(t);
    }
    let mut chains: Vec<usize> = p.holes.iter().map(|h| h.chain).collect();
    chains.sort_unstable();
    chains.dedup();
    let mut worst: f64 = 0.0;
    for c in chains {
        let mut prev_t: Option<f64> = None;
        let mut removed = 0.0;
        for (h, &t) in p
            .holes
            .iter()
            .zip(&thicknesses)
            .filter(|(h, _)| h.chain == c)
        {
            removed += h.diameter * t;
            if let Some(pt) = prev_t {
                removed -= h.stagger_term() * t.min(pt);
            }
            prev_t = Some(t);
        }
        worst = worst.max(removed);
    }
    Ok(worst)
}

/// Net area of each part (gross less its critical chain of holes) summed over
/// the section, after loss; missing parts contribute nothing.
pub fn try_net_area(parts: &[PlacedPart]) -> Result<f64, SectionError> {
    net_area_with(parts, true)
}

pub(crate) fn net_area_with(parts: &[PlacedPart], with_loss: bool) -> Result<f64, SectionError> {
    let mut total = 0.0;
    for (i, p) in parts.iter().enumerate() {
        let r = resolve(i, p, with_loss)?;
        let deduction = hole_deduction(i, p, &r.condition)?;
        if r.missing {
            continue;
        }
        let net = r.props.area - deduction;
        if net <= 0.0 {
            return Err(SectionError::NetAreaNonPositive {
                part: i,
                area: r.props.area,
                deduction,
            });
        }
        total += net;
    }
    Ok(total)
}

/// As [`try_net_area`], but an invalid section gives 0.0 (no capacity) rather
/// than an error; use [`try_net_area`] to learn why.
pub fn net_area(parts: &[PlacedPart]) -> f64 {
    try_net_area(parts).unwrap_or(0.0)
}

#[cfg(test)]
mod tests {
    use super::super::builtup::properties;
    use super::super::condition::Loss;
    use super::*;
    use approx::assert_relative_eq;

    const D: f64 = 0.875; // 3/4 in rivet + 1/8 in allowance (common practice)

    #[test]
    fn hole_diameter_adds_allowance() {
        // 3/4 in fastener + 1/8 in = 7/8 in (common practice, AISC §B4.3b).
        assert_relative_eq!(hole_diameter(0.75, 0.125), 0.875, max_relative = 1e-15);
    }

    #[test]
    fn staggered_plate_by_hand() {
        // Worked by hand: plate 12 × 1/2, holes 7/8 in.
        // Straight path through 2 holes: An = 6 − 0.5·2·0.875 = 5.125.
        // Zig-zag through 3 holes, s = 2, g = 3 between each:
        //   net width = 12 − 3·0.875 + 2·(2²/(4·3)) = 10.041667,
        //   An = 0.5 × 10.041667 = 5.0208333 → governs.
        let straight = vec![Hole::new(D), Hole::new(D)];
        let zigzag = vec![
            Hole::new(D),
            Hole::staggered(D, 2.0, 3.0),
            Hole::staggered(D, 2.0, 3.0),
        ];
        assert_relative_eq!(
            net_area_staggered(6.0, 0.5, &straight),
            5.125,
            max_relative = 1e-12
        );
        assert_relative_eq!(
            net_area_staggered(6.0, 0.5, &zigzag),
            0.5 * (12.0 - 2.625 + 2.0 / 3.0),
            max_relative = 1e-12
        );
        let crit = critical_net_area(6.0, 0.5, &[straight.clone(), zigzag.clone()]);
        assert_relative_eq!(crit, 5.0208333333333, max_relative = 1e-12);

        // The same through a placed plate, the chains given as chain 0 and 1.
        let mut holes = straight;
        holes.extend(zigzag.into_iter().map(|h| h.in_chain(1)));
        let part = PlacedPart::new(
            Shape::Plate {
                width: 12.0,
                thickness: 0.5,
            },
            0.0,
            0.0,
        )
        .with_holes(holes);
        assert_relative_eq!(
            net_area(std::slice::from_ref(&part)),
            crit,
            max_relative = 1e-12
        );
        let props = properties(&[part]).unwrap();
        assert_relative_eq!(props.net_area, crit, max_relative = 1e-12);
        assert_relative_eq!(props.area, 6.0, max_relative = 1e-12);
    }

    #[test]
    fn wide_stagger_does_not_govern() {
        // With s = 6, g = 3: s²/4g = 3 > d, the zig-zag path is longer than
        // the straight one and the straight path through one hole governs:
        // An = 0.5(12 − 0.875) = 5.5625 (by hand).
        let one = vec![Hole::new(D)];
        let zig = vec![Hole::new(D), Hole::staggered(D, 6.0, 3.0)];
        assert_relative_eq!(
            critical_net_area(6.0, 0.5, &[one, zig]),
            5.5625,
            max_relative = 1e-12
        );
    }

    #[test]
    fn channel_web_holes_use_web_thickness_and_loss() {
        // C12 web 0.282, two 7/8 holes in the web: deduction 2·0.875·0.282.
        let ch = Shape::Channel {
            depth: 12.0,
            flange_width: 2.942,
            web_thickness: 0.282,
            flange_thickness: 0.501,
            flange_slope: 1.0 / 6.0,
        };
        let part =
            PlacedPart::new(ch.clone(), 0.0, 0.0).with_holes(vec![Hole::new(D), Hole::new(D)]);
        let gross = properties(std::slice::from_ref(&part)).unwrap().area;
        assert_relative_eq!(
            net_area(std::slice::from_ref(&part)),
            gross - 2.0 * D * 0.282,
            max_relative = 1e-12
        );
        // With 0.05 thickness loss the hole removes d × (0.282 − 0.05).
        let lost = part.clone().with_loss(Loss::Thickness(0.05));
        let p = properties(std::slice::from_ref(&lost)).unwrap();
        assert_relative_eq!(p.net_area, p.area - 2.0 * D * 0.232, max_relative = 1e-12);
        // A flange hole given its own thickness.
        let fl = PlacedPart::new(ch, 0.0, 0.0).with_holes(vec![Hole::new(D).through(0.501)]);
        let g = properties(std::slice::from_ref(&fl)).unwrap();
        assert_relative_eq!(g.net_area, g.area - D * 0.501, max_relative = 1e-12);
    }

    #[test]
    fn bad_holes_are_errors() {
        let given = PlacedPart::new(Shape::given(8.2, 190.0, 6.3), 0.0, 0.0);
        let p = vec![given.clone(), given.clone().with_holes(vec![Hole::new(D)])];
        assert!(matches!(
            try_net_area(&p),
            Err(SectionError::HoleThicknessRequired {
                part: 1,
                hole: 0,
                ..
            })
        ));
        assert_eq!(net_area(&p), 0.0);
        let p = vec![given.clone().with_holes(vec![
            Hole::new(D).through(0.4),
            Hole::new(-1.0).through(0.4),
        ])];
        assert!(matches!(
            try_net_area(&p),
            Err(SectionError::InvalidHole {
                part: 0,
                hole: 1,
                field: "diameter",
                ..
            })
        ));
        let plate = PlacedPart::new(
            Shape::Plate {
                width: 2.0,
                thickness: 0.5,
            },
            0.0,
            0.0,
        );
        let p = vec![plate.with_holes(vec![Hole::new(1.0), Hole::new(1.0)])];
        assert!(matches!(
            try_net_area(&p),
            Err(SectionError::NetAreaNonPositive { part: 0, .. })
        ));
    }
}
