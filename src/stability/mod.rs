//! Stability and vibration of the whole truss: elastic buckling in the
//! truss plane (effective lengths from the mode), the compression chord of
//! a half-through truss on its U-frames, and natural frequencies for
//! footbridge use. SI throughout; no I/O, no formats.

pub mod frame;
pub mod in_plane;

use crate::analysis::eigen::EigenError;

/// Elements per member by default (4 gives the Euler load of a pinned
/// column within 0.01 %, see tests/stability.rs).
pub const DEFAULT_PARTS: usize = 4;

/// What the model's `stability` section asks for (SI, validated).
#[derive(Clone, Debug, PartialEq)]
pub struct Settings {
    /// Node indices whose joints are rigid in the truss plane.
    pub rigid: Vec<usize>,
    /// Beam-column elements per member.
    pub parts: usize,
}

impl Default for Settings {
    fn default() -> Self {
        Settings {
            rigid: Vec::new(),
            parts: DEFAULT_PARTS,
        }
    }
}

#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum StabilityError {
    #[error("the plane frame of the truss is unstable before loading (a mechanism)")]
    Unstable,
    #[error("the plane frame has {dofs} DOFs; the dense eigen-solver takes at most {limit} (use fewer `elements_per_member`)")]
    TooLarge { dofs: usize, limit: usize },
    #[error(transparent)]
    Eigen(#[from] EigenError),
}
