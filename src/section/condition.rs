//! Section loss found at inspection (corrosion, section missing), applied to a
//! part before any property is computed, so that a rating can report both the
//! as-built and the as-inspected section.

use super::part::Shape;
use super::SectionError;

/// Loss recorded for one part.
#[derive(Debug, Clone, PartialEq)]
pub enum Loss {
    /// Total thickness lost from every element of the part (the caller adds
    /// the loss on both faces). Overall dimensions (depth, flange width, leg
    /// lengths, outer diameter) are kept and each element is thinned from its
    /// inner face (a sloped flange face by a true offset normal to itself) — plates, eye-bars and webs of I-shapes and tees thin
    /// symmetrically; solid bars lose `t` from their diameter or side. This
    /// idealisation keeps the outer fibres in place. A thickness loss cannot be
    /// applied to a [`Shape::Given`].
    Thickness(f64),
    /// Area lost as a percentage, `0 ≤ p < 100`. Area and all second moments
    /// are scaled by `1 − p/100`, which keeps the radius of gyration — an
    /// idealisation (uniform thinning of every element). Hole deductions on
    /// the part are scaled the same way.
    AreaPercent(f64),
    /// The part is gone; it contributes nothing to the reduced section.
    Missing,
    /// Thickness `t` lost from ONE face of a plate or eye-bar: the face on
    /// the positive side of its thickness direction in its reference
    /// orientation (+y of a plate, +x of an eye-bar) when `positive`. The
    /// other face stays where it was, so the plate's centre moves by `t/2`.
    /// (The input layer turns `Outer`/`Inner` into a side.)
    OneFace { t: f64, positive: bool },
}

/// A part after its loss is applied.
#[derive(Debug, Clone, PartialEq)]
pub enum Condition {
    /// The part carries load as `shape` (already thinned), with area and
    /// second moments scaled by `area_factor`; `thickness_loss` is the
    /// thickness taken off each element (applied also to holes' own thickness).
    Present {
        shape: Shape,
        area_factor: f64,
        thickness_loss: f64,
        /// Translation of the reduced shape in its datum frame (one-face loss).
        shift: (f64, f64),
    },
    /// The part is gone.
    Missing,
}

/// Applies `loss` to `shape`; `part` names the part in any error.
pub fn apply_loss(
    part: usize,
    shape: &Shape,
    loss: Option<&Loss>,
) -> Result<Condition, SectionError> {
    match loss {
        None => Ok(Condition::Present {
            shape: shape.clone(),
            area_factor: 1.0,
            thickness_loss: 0.0,
            shift: (0.0, 0.0),
        }),
        Some(Loss::Missing) => Ok(Condition::Missing),
        Some(Loss::AreaPercent(p)) => {
            let p = *p;
            if !(p.is_finite() && (0.0..100.0).contains(&p)) {
                return Err(SectionError::InvalidLoss {
                    part,
                    reason: format!(
                        "area loss {p} % must be at least 0 and less than 100 (record a lost part as Missing)"
                    ),
                });
            }
            Ok(Condition::Present {
                shape: shape.clone(),
                area_factor: 1.0 - p / 100.0,
                thickness_loss: 0.0,
                shift: (0.0, 0.0),
            })
        }
        Some(Loss::Thickness(t)) => {
            let t = *t;
            if !(t.is_finite() && t >= 0.0) {
                return Err(SectionError::InvalidLoss {
                    part,
                    reason: format!("thickness loss {t} must be a finite non-negative number"),
                });
            }
            let reduced = reduce_thickness(part, shape, t)?;
            reduced.validate(part)?;
            Ok(Condition::Present {
                shape: reduced,
                area_factor: 1.0,
                thickness_loss: t,
                shift: (0.0, 0.0),
            })
        }
        Some(Loss::OneFace { t, positive }) => {
            let t = *t;
            if !(t.is_finite() && t >= 0.0) {
                return Err(SectionError::InvalidLoss {
                    part,
                    reason: format!("thickness loss {t} must be a finite non-negative number"),
                });
            }
            let sign = if *positive { -0.5 } else { 0.5 };
            let shift = match shape {
                Shape::Plate { .. } => (0.0, sign * t),
                Shape::EyeBar { .. } => (sign * t, 0.0),
                _ => {
                    return Err(SectionError::InvalidLoss {
                        part,
                        reason: format!(
                            "a loss on one face applies to plates and eye-bars; give a {} its loss as Thickness (inner faces)",
                            shape.kind()
                        ),
                    })
                }
            };
            let reduced = reduce_thickness(part, shape, t)?;
            reduced.validate(part)?;
            Ok(Condition::Present {
                shape: reduced,
                area_factor: 1.0,
                thickness_loss: t,
                shift,
            })
        }
    }
}

/// `shape` with every element thickness reduced by `t`.
pub fn reduce_thickness(part: usize, shape: &Shape, t: f64) -> Result<Shape, SectionError> {
    let thin = |field: &'static str, thickness: f64| -> Result<f64, SectionError> {
        if t < thickness {
            Ok(thickness - t)
        } else {
            Err(SectionError::LossExceedsThickness {
                part,
                field,
                loss: t,
                thickness,
            })
        }
    };
    let sloped = |avg: f64, slope: f64, shift: f64| -> Result<f64, SectionError> {
        let lost = t * (1.0 + slope * slope).sqrt() - slope * shift;
        if lost < avg {
            Ok(avg - lost)
        } else {
            Err(SectionError::LossExceedsThickness {
                part,
                field: "flange_thickness",
                loss: t,
                thickness: avg,
            })
        }
    };
    Ok(match *shape {
        Shape::Plate { width, thickness } => Shape::Plate {
            width,
            thickness: thin("thickness", thickness)?,
        },
        Shape::EyeBar { width, thickness } => Shape::EyeBar {
            width,
            thickness: thin("thickness", thickness)?,
        },
        Shape::Given { .. } => return Err(SectionError::LossNotApplicable { part }),
        // A sloped inner flange face offset by the true (normal) distance t
        // loses t·√(1 + s²) of thickness at every x; the average thickness is
        // taken at mid-projection, which moves toward the web by half the web's
        // inner-face loss (t/2 for a channel, t/4 for an I-shape whose web
        // thins on both faces), where the flange was s·t/2 (s·t/4) thicker.
        Shape::Channel {
            depth,
            flange_width,
            web_thickness,
            flange_thickness,
            flange_slope,
        } => Shape::Channel {
            depth,
            flange_width,
            web_thickness: thin("web_thickness", web_thickness)?,
            flange_thickness: sloped(flange_thickness, flange_slope, t / 2.0)?,
            flange_slope,
        },
        Shape::IShape {
            depth,
            flange_width,
            web_thickness,
            flange_thickness,
            flange_slope,
        } => Shape::IShape {
            depth,
            flange_width,
            web_thickness: thin("web_thickness", web_thickness)?,
            flange_thickness: sloped(flange_thickness, flange_slope, t / 4.0)?,
            flange_slope,
        },
        Shape::Angle {
            leg_x,
            leg_y,
            thickness,
        } => Shape::Angle {
            leg_x,
            leg_y,
            thickness: thin("thickness", thickness)?,
        },
        Shape::Tee {
            depth,
            flange_width,
            stem_thickness,
            flange_thickness,
        } => Shape::Tee {
            depth,
            flange_width,
            stem_thickness: thin("stem_thickness", stem_thickness)?,
            flange_thickness: thin("flange_thickness", flange_thickness)?,
        },
        Shape::RoundBar { diameter } => Shape::RoundBar {
            diameter: thin("diameter", diameter)?,
        },
        Shape::SquareBar { side } => Shape::SquareBar {
            side: thin("side", side)?,
        },
        Shape::Pipe {
            outer_diameter,
            wall,
        } => Shape::Pipe {
            outer_diameter,
            wall: thin("wall", wall)?,
        },
        Shape::RectTube {
            width,
            height,
            wall,
        } => Shape::RectTube {
            width,
            height,
            wall: thin("wall", wall)?,
        },
    })
}

#[cfg(test)]
mod tests {
    use super::super::builtup::{properties, properties_original, properties_with_original};
    use super::super::part::{part_properties, PlacedPart};
    use super::*;
    use approx::assert_relative_eq;

    fn plate(w: f64, t: f64, y: f64) -> PlacedPart {
        PlacedPart::new(
            Shape::Plate {
                width: w,
                thickness: t,
            },
            0.0,
            y,
        )
    }

    #[test]
    fn thickness_loss_on_plate_reduces_area_by_width_times_loss() {
        // 14 × 0.5 plate losing 1/16 in: ΔA = 14 × 0.0625 = 0.875 (by hand).
        let p = part_properties(&plate(14.0, 0.5, 0.0).with_loss(Loss::Thickness(0.0625))).unwrap();
        assert_relative_eq!(p.area, 7.0 - 0.875, max_relative = 1e-12);
        // Ix = b(t − Δt)³/12 (rectangle closed form).
        assert_relative_eq!(p.ix, 14.0 * 0.4375f64.powi(3) / 12.0, max_relative = 1e-12);
    }

    #[test]
    fn missing_part_drops_area_and_original_is_kept() {
        // Two 10 × 1 plates at y = ±5; the top one missing. Original: A = 20,
        // Ix = 2(10/12 + 10·25) = 501.667 (parallel axis, by hand);
        // reduced: A = 10, Ix = 10/12, centroid at the bottom plate.
        let parts = vec![
            plate(10.0, 1.0, 5.0).with_loss(Loss::Missing),
            plate(10.0, 1.0, -5.0),
        ];
        let both = properties_with_original(&parts).unwrap();
        assert_relative_eq!(both.original.area, 20.0, max_relative = 1e-12);
        assert_relative_eq!(
            both.original.ix,
            2.0 * (10.0 / 12.0 + 250.0),
            max_relative = 1e-12
        );
        assert_relative_eq!(both.reduced.area, 10.0, max_relative = 1e-12);
        assert_relative_eq!(both.reduced.centroid_y, -5.0, max_relative = 1e-12);
        assert_relative_eq!(both.reduced.ix, 10.0 / 12.0, max_relative = 1e-12);
        assert_eq!(properties_original(&parts).unwrap(), both.original);
        assert_eq!(properties(&parts).unwrap(), both.reduced);
    }

    #[test]
    fn area_percent_keeps_radius_of_gyration() {
        // 20 % loss: A × 0.8 and I × 0.8, so r = √(I/A) unchanged (by definition).
        let base = part_properties(&plate(10.0, 1.0, 0.0)).unwrap();
        let lost =
            part_properties(&plate(10.0, 1.0, 0.0).with_loss(Loss::AreaPercent(20.0))).unwrap();
        assert_relative_eq!(lost.area, 0.8 * base.area, max_relative = 1e-12);
        assert_relative_eq!(
            (lost.iy / lost.area).sqrt(),
            (base.iy / base.area).sqrt(),
            max_relative = 1e-12
        );
    }

    #[test]
    fn channel_thinned_from_inside_moves_its_centroid_to_the_back() {
        // Thinning the web from its inner face moves material toward the back
        // (x = 0 in the datum frame), so the reduced centroid moves −x.
        let ch = Shape::Channel {
            depth: 12.0,
            flange_width: 3.0,
            web_thickness: 0.4,
            flange_thickness: 0.5,
            flange_slope: 0.0,
        };
        let p =
            part_properties(&PlacedPart::new(ch.clone(), 6.0, 0.0).with_loss(Loss::Thickness(0.1)))
                .unwrap();
        assert!(p.centroid_x < 6.0);
        assert_relative_eq!(p.centroid_y, 0.0, epsilon = 1e-12);
        // Reduced area by hand: web 12 × 0.3 + flanges 2 × 2.7 × 0.4 = 5.76.
        assert_relative_eq!(p.area, 3.6 + 2.16, max_relative = 1e-12);
    }

    #[test]
    fn sloped_flange_face_is_offset_by_the_true_distance() {
        // Channel d 15, bf 3.4, tw 0.4, tf 0.65 (average), slope 1:6, loss
        // t = 0.1 from the inner faces. Geometry of an offset line: the
        // sloped inner face moved a normal distance t sits t·√(1 + s²) lower
        // at every x, so the thickness at the old web face (x = tw) and at
        // the toe (x = bf) each drop by exactly t·√(1 + s²) = 0.101379.
        // Thickness at x of a flange of average tf at mid-projection x_m =
        // (tw + bf)/2: tf + s·(x_m − x) (the shape's own definition).
        let s = 1.0 / 6.0;
        let (bf, tw, tf, t) = (3.4, 0.4, 0.65, 0.1);
        let at = |avg: f64, web: f64, x: f64| avg + s * ((web + bf) / 2.0 - x);
        let ch = Shape::Channel {
            depth: 15.0,
            flange_width: bf,
            web_thickness: tw,
            flange_thickness: tf,
            flange_slope: s,
        };
        let Shape::Channel {
            web_thickness: tw2,
            flange_thickness: tf2,
            ..
        } = reduce_thickness(0, &ch, t).unwrap()
        else {
            panic!()
        };
        assert_relative_eq!(tw2, tw - t, max_relative = 1e-12);
        let drop = t * (1.0 + s * s).sqrt();
        for x in [tw, bf] {
            assert_relative_eq!(at(tf, tw, x) - at(tf2, tw2, x), drop, max_relative = 1e-12);
        }
        // I-shape: web thinned t/2 per face, flange halves from x = tw/2.
        let ish = Shape::IShape {
            depth: 15.0,
            flange_width: 2.0 * bf,
            web_thickness: tw,
            flange_thickness: tf,
            flange_slope: s,
        };
        let Shape::IShape {
            web_thickness: w2,
            flange_thickness: f2,
            ..
        } = reduce_thickness(0, &ish, t).unwrap()
        else {
            panic!()
        };
        let at_i = |avg: f64, web: f64, x: f64| avg + s * ((web / 2.0 + bf) / 2.0 - x);
        for x in [tw / 2.0, bf] {
            assert_relative_eq!(
                at_i(tf, tw, x) - at_i(f2, w2, x),
                drop,
                max_relative = 1e-12
            );
        }
    }

    #[test]
    fn bad_losses_are_errors() {
        let e = apply_loss(
            4,
            &Shape::Plate {
                width: 10.0,
                thickness: 0.5,
            },
            Some(&Loss::Thickness(0.5)),
        )
        .unwrap_err();
        assert!(matches!(
            e,
            SectionError::LossExceedsThickness {
                part: 4,
                field: "thickness",
                ..
            }
        ));
        let e = apply_loss(
            1,
            &Shape::given(8.2, 190.0, 6.3),
            Some(&Loss::Thickness(0.1)),
        )
        .unwrap_err();
        assert_eq!(e, SectionError::LossNotApplicable { part: 1 });
        for p in [100.0, -1.0, f64::NAN] {
            let e = apply_loss(
                2,
                &Shape::RoundBar { diameter: 1.0 },
                Some(&Loss::AreaPercent(p)),
            )
            .unwrap_err();
            assert!(matches!(e, SectionError::InvalidLoss { part: 2, .. }));
        }
        let e = apply_loss(
            0,
            &Shape::RoundBar { diameter: 1.0 },
            Some(&Loss::Thickness(f64::NAN)),
        )
        .unwrap_err();
        assert!(matches!(e, SectionError::InvalidLoss { part: 0, .. }));
    }
}
