//! Cross-section properties of existing built-up truss members.
//!
//! Old riveted truss members are assembled from channels, angles, plates and
//! bars, pierced by rivet holes and thinned by corrosion. This module turns an
//! inspected description of such a member into the properties a load rating
//! needs: gross and net area, second moments about the section centroid,
//! principal axes, radii of gyration, elastic moduli, and the built-up member
//! checks of AISC 360-16 §E6.
//!
//! Conventions used throughout:
//! * one consistent length unit (the model's section unit, e.g. inches);
//!   areas are unit², second moments unit⁴;
//! * section coordinates: `x` across the plane of the truss, `y` in it.
//!   `Ix` (about the horizontal centroidal axis) governs buckling IN the truss
//!   plane, `Iy` buckling OUT of it;
//! * every part is placed by `x`, `y` = the position of that part's OWN
//!   centroid (as built, before any section loss) in section coordinates.
//!
//! The model file's section form maps directly onto these types:
//! `Plate(width: 16.0, thickness: 0.5, x: 0.0, y: 5.8)` is
//! `PlacedPart::new(Shape::Plate { width: 16.0, thickness: 0.5 }, 0.0, 5.8)`, and
//! `Part(area: 8.2, ix: 190.0, iy: 6.3, x: -6.1, y: 0.0)` is
//! `PlacedPart::new(Shape::given(8.2, 190.0, 6.3), -6.1, 0.0)`; orientation,
//! holes, loss and label default to reference, none, none and none.

pub mod builtup;
pub mod condition;
pub mod holes;
pub mod lacing;
pub mod outline;
pub mod part;
pub mod torsion;

pub use builtup::{
    principal_moments, properties, properties_original, properties_with_original,
    second_moment_about, ConditionComparison, Principal, SectionProperties,
};
pub use condition::{apply_loss, Condition, Loss};
pub use holes::{
    critical_net_area, hole_diameter, net_area, net_area_staggered, try_net_area, Hole,
};
pub use lacing::{
    component_slenderness_ok, component_slenderness_ok_k, lacing_bar_force, lacing_bar_kl_r,
    lacing_bar_slenderness_ok, lacing_shear, modified_slenderness, Connector, LacingSystem,
    K_I_BACK_TO_BACK_ANGLES, K_I_BACK_TO_BACK_CHANNELS, K_I_OTHER,
};
pub use outline::{outline, outline_original, outline_to_shape, try_outline};
pub use part::{
    part_properties, part_properties_indexed, Direction, GivenKind, Orientation, PartProperties,
    PlacedPart, Quadrant, Shape,
};
pub use torsion::{torsion, torsion_with, TorsionCell, TorsionProperties};

/// Everything that can be wrong with a section description.
///
/// `part` is the index of the part in the slice handed to
/// [`properties`]; functions that take a single part report index 0.
#[derive(thiserror::Error, Debug, Clone, PartialEq)]
pub enum SectionError {
    /// The section has no parts at all.
    #[error("the section has no parts")]
    NoParts,
    /// Every part is recorded as missing, so nothing carries load.
    #[error("every part of the section is recorded as missing")]
    AllPartsMissing,
    /// A dimension that must be a finite positive number is not.
    #[error("part {part}: {field} must be a finite positive number (got {value})")]
    InvalidDimension {
        part: usize,
        field: &'static str,
        value: f64,
    },
    /// A value that may have any sign is not finite.
    #[error("part {part}: {field} must be finite (got {value})")]
    NonFinite {
        part: usize,
        field: &'static str,
        value: f64,
    },
    /// A hollow shape whose wall is half its size or more.
    #[error("part {part}: wall {wall} must be less than half of {field} {size}")]
    WallTooThick {
        part: usize,
        field: &'static str,
        wall: f64,
        size: f64,
    },
    /// Dimensions that are individually valid but do not make a shape.
    #[error("part {part}: {reason}")]
    InvalidGeometry { part: usize, reason: String },
    /// An orientation that has no meaning for the shape.
    #[error("part {part}: orientation {orientation} does not apply to a {shape}")]
    InvalidOrientation {
        part: usize,
        orientation: &'static str,
        shape: &'static str,
    },
    /// A thickness loss that consumes an element entirely.
    #[error("part {part}: thickness loss {loss} is not less than the {field} {thickness}; record the part as Missing instead")]
    LossExceedsThickness {
        part: usize,
        field: &'static str,
        loss: f64,
        thickness: f64,
    },
    /// A loss value outside its range.
    #[error("part {part}: {reason}")]
    InvalidLoss { part: usize, reason: String },
    /// A thickness loss on a shape known only by its table properties.
    #[error("part {part}: a thickness loss cannot be applied to a shape given only by table properties; use AreaPercent")]
    LossNotApplicable { part: usize },
    /// A hole field that must be finite and positive (or non-negative) is not.
    #[error("part {part}, hole {hole}: {field} is invalid (got {value})")]
    InvalidHole {
        part: usize,
        hole: usize,
        field: &'static str,
        value: f64,
    },
    /// A hole whose pierced thickness cannot be inferred from the shape.
    #[error(
        "part {part}, hole {hole}: the thickness pierced by the hole must be given for a {shape}"
    )]
    HoleThicknessRequired {
        part: usize,
        hole: usize,
        shape: &'static str,
    },
    /// Holes remove all of a part's area.
    #[error("part {part}: holes remove {deduction} of a gross area of {area}")]
    NetAreaNonPositive {
        part: usize,
        area: f64,
        deduction: f64,
    },
    /// The numbers overflowed (dimensions far outside any real member).
    #[error("part {part}: properties overflowed; dimensions are out of range")]
    Overflow { part: usize },
}
