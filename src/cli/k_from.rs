//! The model `rate` and `report` check: the compression chord's k_out from
//! its U-frames when the model asks (`stability/rate_k.rs`), the in-plane
//! K from the truss's elastic buckling with `--k-from buckling`
//! (`stability/rate_k_in.rs`); the notes say which members took which K.
//! `src/rate/` is unchanged: it rates the adjusted copy.

use super::args::KFrom;
use crate::analysis::Analysis;
use crate::error::Error;
use crate::model::Model;
use crate::stability::run::InPlane;
use std::path::Path;

/// The adjusted model (None: the model as given) and the notes for the
/// rating. `in_plane`: the buckling results when already computed.
pub fn rated_model(
    path: &Path,
    model: &Model,
    analysis: &Analysis,
    k_from: KFrom,
    in_plane: Option<&[InPlane]>,
) -> Result<(Option<Model>, Vec<String>), Error> {
    let err = |source| Error::Stability {
        path: path.to_path_buf(),
        source,
    };
    let from_u_frames = crate::stability::rate_k::with_u_frame_k(model, analysis).map_err(err)?;
    let (mut adjusted, mut notes) = match from_u_frames {
        Some((m, n)) => (Some(m), n),
        None => (None, Vec::new()),
    };
    if k_from == KFrom::Buckling {
        let base = adjusted.as_ref().unwrap_or(model);
        let (m, n) = match in_plane {
            Some(ip) => {
                let ks = crate::stability::rate_k_in::chosen(model.members.len(), ip);
                crate::stability::rate_k_in::apply(base, &ks)
            }
            None => {
                // Buckling of the model as given (its k_out plays no part).
                let (_, _, ks) =
                    crate::stability::rate_k_in::with_buckling_k(model, analysis).map_err(err)?;
                crate::stability::rate_k_in::apply(base, &ks)
            }
        };
        adjusted = Some(m);
        notes.extend(n);
    }
    Ok((adjusted, notes))
}
