//! Member capacity for load rating: axial compression on a choice of column
//! curves (Euler, Johnson, AISC 360-16, EN 1993-1-1, CSA S16, the older bridge
//! allowable-stress formula), axial tension in the same factor family. Rating factors live in the
//! rating methods (`crate::method`). All functions are unit-agnostic: stresses in one
//! consistent unit, areas in one consistent unit, forces = stress × area.

pub mod aisc360;
pub mod bridge_asd;
pub mod csa_s16;
pub mod curve;
pub mod en1993;
pub mod euler;
pub mod johnson;
pub mod tension;

pub use curve::{column, BucklingClass, CapacityError, ColumnCheck, Curve, DesignMethod, Regime};
pub use tension::{slenderness_warning, tension, TensionCheck};
