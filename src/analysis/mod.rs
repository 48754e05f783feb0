//! The analysis core: DOF numbering, assembly, factorization and the
//! per-case results. It does no I/O and, on a validated model, fails only
//! for a mechanism, which it names by node and direction.

pub mod active_set;
pub mod assemble;
pub mod conditioning;
pub mod dofs;
pub mod eigen;
pub mod eigen_sparse;
pub mod mechanism;
pub mod results;
pub mod solve;

pub use results::{analyse, analyse_beside, free_motion, Analysis, CaseResult};
