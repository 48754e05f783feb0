//! Riveted and bolted gusset-plate joints rated at every panel point
//! (issue 17; MBE 6A.6.12, and for LFR/ASR the MBE Part B / 2009 federal
//! gusset-plate guidance as recalled). The mechanics are one idea per file
//! with no model dependence — `fasteners`, `bearing`, `whitmore`,
//! `buckling`, `net_section`, `block_shear`, `shear_plane`, `splice`,
//! `outline` (plate geometry) — and `factors` holds the resistance factors
//! by method. `types` is the validated joint description (from
//! `input/joints.rs`), `checks` turns a joint into checks as data.

pub mod bearing;
pub mod block_shear;
pub mod buckling;
pub mod checks;
pub mod factors;
pub mod fasteners;
pub mod net_section;
pub mod outline;
pub mod shear_plane;
pub mod splice;
pub mod types;
pub mod whitmore;

pub use types::GussetJoint;
