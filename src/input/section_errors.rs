//! A section error told in the model's words: its units, numbers rounded
//! for a person, parts counted from one and named by their label.
//!
//! The section library reports in SI with zero-based part indices; only
//! the input layer knows the units and labels of the file, so the message
//! is written here.

use crate::section::SectionError;
use crate::units::{plain, Dimension, DisplayUnits};

/// `section "id", part 3 ("bar 3")`: the one-based part and its label.
pub(super) fn part_name(section: &str, index: usize, label: Option<&str>) -> String {
    match label {
        Some(l) if !l.is_empty() => format!("section \"{section}\", part {} (\"{l}\")", index + 1),
        _ => format!("section \"{section}\", part {}", index + 1),
    }
}

/// The dimension of a named field of a part or hole.
fn dimension_of(field: &str) -> Dimension {
    match field {
        "area" => Dimension::Area,
        "ix" | "iy" | "ixy" => Dimension::SecondMoment,
        _ => Dimension::Length,
    }
}

/// An SI value of `dim` as text in the model's section units (`1.5 in`).
fn show(v: f64, dim: Dimension, u: &DisplayUnits) -> String {
    let (f, name) = match dim {
        Dimension::Area => (u.area_to_si(), format!("{}2", u.section.name)),
        Dimension::SecondMoment => (u.second_moment_to_si(), format!("{}4", u.section.name)),
        _ => (u.section.to_si, u.section.name.to_string()),
    };
    if v.is_finite() {
        format!("{} {name}", plain(v / f))
    } else {
        format!("{v}")
    }
}

/// The message for `e` raised by section `section`; `labels[i]` is part
/// `i`'s label in the file.
pub(super) fn describe(
    e: &SectionError,
    section: &str,
    labels: &[Option<&str>],
    u: &DisplayUnits,
) -> String {
    let part = |i: usize| part_name(section, i, labels.get(i).copied().flatten());
    let val = |field: &str, v: f64| show(v, dimension_of(field), u);
    let len = |v: f64| show(v, Dimension::Length, u);
    match e {
        SectionError::NoParts | SectionError::AllPartsMissing => format!("section \"{section}\": {e}"),
        SectionError::InvalidDimension { part: i, field, value } => format!(
            "{}: {field} must be a finite positive number (got {})",
            part(*i),
            val(field, *value)
        ),
        SectionError::NonFinite { part: i, field, value } => {
            format!("{}: {field} must be finite (got {value})", part(*i))
        }
        SectionError::WallTooThick { part: i, field, wall, size } => format!(
            "{}: wall {} must be less than half of the {field} {}",
            part(*i),
            len(*wall),
            len(*size)
        ),
        SectionError::InvalidGeometry { part: i, reason } | SectionError::InvalidLoss { part: i, reason } => {
            format!("{}: {reason}", part(*i))
        }
        SectionError::InvalidOrientation { part: i, orientation, shape } => format!(
            "{}: orientation {orientation} does not apply to a {shape}",
            part(*i)
        ),
        SectionError::LossExceedsThickness { part: i, field, loss, thickness } => format!(
            "{}: thickness loss {} is not less than the {field} {}; record the part as Missing instead",
            part(*i),
            len(*loss),
            len(*thickness)
        ),
        SectionError::LossNotApplicable { part: i } => format!(
            "{}: a thickness loss cannot be applied to a shape given only by table properties; use AreaPercent",
            part(*i)
        ),
        SectionError::InvalidHole { part: i, hole, field, value } => format!(
            "{}, hole {}: {field} is invalid (got {})",
            part(*i),
            hole + 1,
            len(*value)
        ),
        SectionError::HoleThicknessRequired { part: i, hole, shape } => format!(
            "{}, hole {}: the thickness pierced by the hole must be given for a {shape}",
            part(*i),
            hole + 1
        ),
        SectionError::NetAreaNonPositive { part: i, area, deduction } => format!(
            "{}: holes remove {} of a gross area of {}",
            part(*i),
            show(*deduction, Dimension::Area, u),
            show(*area, Dimension::Area, u)
        ),
        SectionError::Overflow { part: i } => {
            format!("{}: properties overflowed; dimensions are out of range", part(*i))
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn loss_message_in_model_units_one_based_with_label() {
        // 1.5 in loss on a 1.0 in bar, third part labelled "bar 3" (issue 21, defect 8).
        let e = SectionError::LossExceedsThickness {
            part: 2,
            field: "thickness",
            loss: 1.5 * 0.0254,
            thickness: 0.0254,
        };
        let labels = [None, None, Some("bar 3")];
        assert_eq!(
            describe(&e, "x", &labels, &DisplayUnits::us()),
            "section \"x\", part 3 (\"bar 3\"): thickness loss 1.5 in is not less than the thickness 1.0 in; record the part as Missing instead"
        );
    }
}
