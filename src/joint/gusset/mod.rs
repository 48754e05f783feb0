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
pub mod derive;
pub mod factors;
pub mod fasteners;
pub mod net_section;
pub mod outline;
pub mod shear_plane;
pub mod splice;
pub mod types;
pub mod whitmore;

pub use types::GussetJoint;

pub mod joint_check;

use crate::joint::JointSet;
use crate::model::Model;

/// Every gusset-plate check of `model`, with the joints' notes.
pub fn checks(model: &Model) -> JointSet {
    let mut set = JointSet::default();
    if model.gussets.is_empty() {
        return set;
    }
    for j in &model.gussets {
        // Member directions from the model as it is now (a sweep may move nodes).
        let mut j = j.clone();
        for g in &mut j.groups {
            let mem = &model.members[g.members[0]];
            let other = if mem.start == j.node {
                mem.end
            } else {
                mem.start
            };
            let (a, b) = (&model.nodes[j.node], &model.nodes[other]);
            let l = (b.x - a.x).hypot(b.y - a.y);
            if l > 0.0 {
                g.axis = [(b.x - a.x) / l, (b.y - a.y) / l];
            }
        }
        let j = &j;
        for c in checks::of_joint(j) {
            set.checks.push(Box::new(joint_check::GussetCheck(c)));
        }
        let id = &model.nodes[j.node].id;
        set.notes
            .extend(j.notes.iter().map(|n| format!("gusset joint {id}: {n}")));
    }
    set.notes.push(format!(
        "gusset plates: member forces shared equally by a concentric fastener group; under LRFR φc·φs with φs ≤ {:.2} for gusset plates (MBE 6A.6.12.1, from memory); LFR takes the LRFR φ (conservative), ASR 0.55/0.75·Fy and 0.50 fractions; rivet strengths of MBE Table 6A.6.12.5.1-1 from memory (override with shear_strength)",
        joint_check::GUSSET_PHI_S
    ));
    set.notes.push("gusset plates: the chord splice is checked without the eccentricity of the splice plates; block shear only for the block a tension member pulls out toward the plate edge".into());
    set
}
