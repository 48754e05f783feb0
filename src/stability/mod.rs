//! Stability and vibration of the whole truss: elastic buckling in the
//! truss plane (effective lengths from the mode), the compression chord of
//! a half-through truss on its U-frames, and natural frequencies for
//! footbridge use. SI throughout; no I/O, no formats.

pub mod chord;
pub mod frame;
pub mod in_plane;
pub mod rate_k;
pub mod rate_k_in;
pub mod run;
pub mod u_frame;
pub mod vibration;

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
    pub u_frame: Option<u_frame::UFrameInput>,
    pub vibration: Option<vibration::VibrationInput>,
}

impl Default for Settings {
    fn default() -> Self {
        Settings {
            rigid: Vec::new(),
            parts: DEFAULT_PARTS,
            u_frame: None,
            vibration: None,
        }
    }
}

#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum StabilityError {
    #[error("the plane frame of the truss is unstable before loading (a mechanism)")]
    Unstable,
    #[error("stability.u_frames.chord: no member joins \"{from}\" and \"{to}\"")]
    ChordGap { from: String, to: String },
    #[error("the vibration check needs a deck line of two or more nodes (`deck: [...]`)")]
    NoDeck,
    #[error(transparent)]
    Eigen(#[from] EigenError),
}

impl StabilityError {
    /// True for our own failure (an inaccurate eigen-solution), not the model's.
    pub fn is_internal(&self) -> bool {
        matches!(
            self,
            StabilityError::Eigen(EigenError::Residual { .. } | EigenError::Sparse)
        )
    }
}
