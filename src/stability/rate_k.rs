//! Effective lengths for `rate` from the U-frame analysis: when the model's
//! `stability.u_frames.use_in_rate` is set, every compression-chord member
//! (the chord path, end posts included) takes as its out-of-plane K the
//! largest K = (π/L)·√(E·I_out/(λcr·|N|)) of the load effects in which it
//! is compressed, never below 1.0 (a conservative floor: the chord's
//! continuity over the panel points is not counted on), with the unbraced
//! length the member length. The user's `k_out`/`unbraced_out` of those
//! members are replaced, and the notes say so.

use super::StabilityError;
use crate::analysis::Analysis;
use crate::model::Model;

/// Smallest K taken into `rate`.
pub const K_FLOOR: f64 = 1.0;

/// A copy of the model with the chord's out-of-plane K from its U-frames,
/// and the notes for the rating report; None when the model does not ask.
pub fn with_u_frame_k(
    model: &Model,
    analysis: &Analysis,
) -> Result<Option<(Model, Vec<String>)>, StabilityError> {
    let Some(u) = model.stability.u_frame.as_ref().filter(|u| u.use_in_rate) else {
        return Ok(None);
    };
    let effects = super::run::effects(model, analysis);
    let report = super::chord::analyse(model, u, &effects)?;
    let mut k = vec![None::<f64>; report.members.len()];
    for r in &report.results {
        for (slot, seg) in k.iter_mut().zip(&r.buckling.segments) {
            if let Some((_, kk)) = seg {
                *slot = Some(slot.map_or(*kk, |v: f64| v.max(*kk)));
            }
        }
    }
    let mut m = model.clone();
    let u_ = &model.units;
    let per_len = u_.force.to_si / u_.length.to_si;
    let mut notes = vec![format!(
        "Out-of-plane K of the compression chord from its U-frames (spring {:.4} {}/{}, EN 1993-2 D.2.4; chord as a beam-column on elastic supports with the actual force distribution, largest K over the cases and combinations, not below {K_FLOOR}); the model's k_out of these members is not used.",
        report.spring.stiffness / per_len,
        u_.force.name,
        u_.length.name
    )];
    for (&mi, kk) in report.members.iter().zip(&k) {
        if let Some(kk) = kk {
            let used = kk.max(K_FLOOR);
            let mem = &mut m.members[mi];
            notes.push(format!(
                "member \"{}\": k_out {:.3} from the U-frame analysis (was {:.3}{})",
                mem.id,
                used,
                mem.k_out,
                if mem.unbraced_out.is_some() {
                    ", with its unbraced_out"
                } else {
                    ""
                }
            ));
            mem.k_out = used;
            mem.unbraced_out = None;
        }
    }
    Ok(Some((m, notes)))
}
