//! In-plane effective lengths for `rate --k-from buckling` (issue 19):
//! every member that takes part in the lowest in-plane buckling mode of a
//! load case or combination (share of the mode's axial work at least
//! [`super::in_plane::PARTICIPATION`]) takes as its in-plane K the
//! **largest** K = (π/L)·√(E·I_in/(λcr·|N|)) over the effects in which it
//! takes part, with the unbraced length the member length. Members in no
//! mode keep the model's `k_in`/`unbraced_in`.
//!
//! Why the largest K and not the K of the governing effect (lowest λcr):
//! a member's K from one effect depends on how heavily that effect loads
//! it (lightly loaded members get a long effective length), and `rate`
//! checks every effect with one K per member. The largest K gives each
//! member a capacity no higher than the K of any single effect would,
//! the governing effect's included, so no effect is rated on a K from a
//! mode that restrains the member more than its own does (conservative).
//! Called from `cli/commands.rs` like [`super::rate_k`]; `src/rate/` is
//! unchanged.

use super::run::InPlane;
use super::StabilityError;
use crate::analysis::Analysis;
use crate::model::Model;

/// One member's in-plane K taken from buckling.
#[derive(Clone, Debug, PartialEq)]
pub struct InPlaneK {
    pub member: usize,
    /// The largest K over the effects in which the member takes part.
    pub k: f64,
    /// The effect that gave it.
    pub effect: String,
    /// That effect's λcr.
    pub critical_factor: f64,
}

/// Each member's largest K over the effects' modes (members in no mode
/// are left out), in member order.
pub fn chosen(members: usize, in_plane: &[InPlane]) -> Vec<InPlaneK> {
    let mut best: Vec<Option<InPlaneK>> = vec![None; members];
    for e in in_plane {
        let Some(b) = &e.buckling else { continue };
        let Some(lam) = b.critical_factor else {
            continue;
        };
        for mk in &b.members {
            if !mk.k.is_finite() || mk.k <= 0.0 {
                continue;
            }
            let slot = &mut best[mk.member];
            if slot.as_ref().is_none_or(|s| mk.k > s.k) {
                *slot = Some(InPlaneK {
                    member: mk.member,
                    k: mk.k,
                    effect: b.effect.clone(),
                    critical_factor: lam,
                });
            }
        }
    }
    best.into_iter().flatten().collect()
}

/// The rule, for the notes of `rate` and the report.
pub const RULE: &str = "In-plane K from the elastic buckling of the truss (--k-from buckling): for each member that takes part in the lowest mode of a load case or combination (share of the mode's axial work at least 10 %), K = (pi/L) sqrt(E I_in/(lambda_cr |N|)) (AISC 360-16 Commentary Appendix 7, from memory), the largest over the effects in which it takes part, with the member length as unbraced length; the largest K is used so that no effect is checked with more restraint than its own mode gives (conservative). Moving-load envelopes have no single force distribution and are checked with these K too. Other members keep the model's k_in.";

/// A copy of the model with the in-plane K of the members in the modes
/// from buckling, the notes, and the choices.
pub fn with_buckling_k(
    model: &Model,
    analysis: &Analysis,
) -> Result<(Model, Vec<String>, Vec<InPlaneK>), StabilityError> {
    let effects = super::run::effects(model, analysis);
    let mut rigid = vec![false; model.nodes.len()];
    for &n in &model.stability.rigid {
        rigid[n] = true;
    }
    let pairs: Vec<(String, Vec<f64>)> = effects
        .iter()
        .map(|(id, _, f)| (id.clone(), f.clone()))
        .collect();
    let buckled = super::in_plane::buckling(model, &rigid, model.stability.parts, &pairs)?;
    let in_plane: Vec<InPlane> = effects
        .iter()
        .zip(buckled)
        .map(|((id, combination, _), b)| InPlane {
            effect: id.clone(),
            combination: *combination,
            buckling: Some(b),
        })
        .collect();
    let ks = chosen(model.members.len(), &in_plane);
    let (m, notes) = apply(model, &ks);
    Ok((m, notes, ks))
}

/// A copy of the model with the chosen in-plane K, and the notes.
pub fn apply(model: &Model, ks: &[InPlaneK]) -> (Model, Vec<String>) {
    let mut m = model.clone();
    let mut notes = vec![RULE.to_string()];
    if ks.is_empty() {
        notes.push("No member takes part in an in-plane buckling mode (no compression): every member keeps the model's k_in.".into());
    }
    for c in ks {
        let mem = &mut m.members[c.member];
        notes.push(format!(
            "member \"{}\": k_in {:.3} from in-plane buckling of \"{}\" (lambda_cr {:.4}; was {:.3}{})",
            mem.id,
            c.k,
            c.effect,
            c.critical_factor,
            mem.k_in,
            if mem.unbraced_in.is_some() {
                ", with its unbraced_in"
            } else {
                ""
            }
        ));
        mem.k_in = c.k;
        mem.unbraced_in = None;
    }
    (m, notes)
}
