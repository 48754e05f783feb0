//! The model's optional `stability` section: rigid joints for the in-plane
//! buckling analysis, the U-frames of a half-through truss, and the masses
//! and loads of the footbridge vibration check.
//!
//! ```ron
//! stability: (
//!     rigid_joints: ["U1", "U2"],          // default: every joint pinned
//!     elements_per_member: 4,              // 2..8, default 4
//!     u_frames: (
//!         chord: ["L0", "U1", "U2", "U3", "L4"], // bearing to bearing
//!         frames_at: ["U1", "U2", "U3"],   // default: interior chord nodes
//!         vertical_i: 120.0,               // section units⁴
//!         height: "4 ft",                  // chord centroid to floor-beam axis
//!         vertical_height: "3.5 ft",       // to the top of the floor beam (default: height)
//!         floor_beam_i: 800.0,
//!         floor_beam_span: "12 ft",        // between truss centres
//!         connection_flexibility: 0.0,     // rad per (force unit × length unit)
//!         spring: "5 kip/in",              // optional: C_d given directly
//!         use_in_rate: true,               // rate takes the chord's k_out from it
//!     ),
//!     vibration: (
//!         deck_weight: "0.3 kip/ft",       // per truss, per length of span
//!         tributary_width: "5 ft",         // deck width per truss
//!         live_share: 0.0,                 // pedestrian load counted as mass
//!         pedestrian_load: "90 psf",       // default 90 psf
//!         trusses: 2.0,
//!         deflection_ratio: 360.0,
//!     ),
//! )
//! ```

use super::convert::{positive, value, Ctx, IdMap};
use super::quantity::Quantity;
use crate::model::Material;
use crate::stability::u_frame::UFrameInput;
use crate::stability::vibration::{VibrationInput, PEDESTRIAN_LOAD};
use crate::stability::Settings;
use crate::units::{Dimension, DisplayUnits};
use serde::Deserialize;

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct StabilityFile {
    #[serde(default)]
    pub rigid_joints: Vec<String>,
    #[serde(default)]
    pub elements_per_member: Option<usize>,
    #[serde(default)]
    pub u_frames: Option<UFramesFile>,
    #[serde(default)]
    pub vibration: Option<VibrationFile>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct UFramesFile {
    pub chord: Vec<String>,
    #[serde(default)]
    pub frames_at: Option<Vec<String>>,
    #[serde(default)]
    pub e: Option<Quantity>,
    pub vertical_i: Quantity,
    pub height: Quantity,
    #[serde(default)]
    pub vertical_height: Option<Quantity>,
    pub floor_beam_i: Quantity,
    pub floor_beam_span: Quantity,
    #[serde(default)]
    pub connection_flexibility: Option<f64>,
    #[serde(default)]
    pub spring: Option<Quantity>,
    #[serde(default)]
    pub use_in_rate: Option<bool>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct VibrationFile {
    pub deck_weight: Quantity,
    pub tributary_width: Quantity,
    #[serde(default)]
    pub live_share: Option<f64>,
    #[serde(default)]
    pub pedestrian_load: Option<Quantity>,
    #[serde(default)]
    pub trusses: Option<f64>,
    #[serde(default)]
    pub deflection_ratio: Option<f64>,
}

/// Node indices of `ids`, an error naming `field` for each unknown one.
fn nodes(ctx: &mut Ctx, ids: &[String], node_ids: &IdMap, field: &str) -> Vec<usize> {
    let mut out = Vec::with_capacity(ids.len());
    for id in ids {
        match node_ids.get(id.as_str()) {
            Some(&i) => out.push(i),
            None => {
                let at = ctx.locate(field, id, 0);
                ctx.error(
                    format!("stability.{field} refers to node \"{id}\", which is not defined"),
                    at,
                )
            }
        }
    }
    out
}

pub(super) fn convert(
    ctx: &mut Ctx,
    file: &Option<StabilityFile>,
    node_ids: &IdMap,
    units: &DisplayUnits,
    materials: &[Material],
) -> Settings {
    let mut s = Settings::default();
    let Some(f) = file else {
        return s;
    };
    s.rigid = nodes(ctx, &f.rigid_joints, node_ids, "rigid_joints");
    if let Some(p) = f.elements_per_member {
        if (2..=8).contains(&p) {
            s.parts = p;
        } else {
            ctx.error(
                format!("stability.elements_per_member must be 2 to 8, not {p}"),
                None,
            );
        }
    }
    if let Some(u) = &f.u_frames {
        s.u_frame = u_frames(ctx, u, node_ids, units, materials);
    }
    if let Some(v) = &f.vibration {
        s.vibration = vibration(ctx, v, units);
    }
    s
}

fn u_frames(
    ctx: &mut Ctx,
    u: &UFramesFile,
    node_ids: &IdMap,
    units: &DisplayUnits,
    materials: &[Material],
) -> Option<UFrameInput> {
    let chord = nodes(ctx, &u.chord, node_ids, "chord");
    if u.chord.len() < 3 {
        ctx.error(
            "stability.u_frames.chord needs at least three nodes (bearing, panel point, bearing)"
                .into(),
            None,
        );
    }
    let frames_at = match &u.frames_at {
        Some(ids) => nodes(ctx, ids, node_ids, "frames_at"),
        None => chord
            .get(1..chord.len().saturating_sub(1))
            .unwrap_or_default()
            .to_vec(),
    };
    let pos = |ctx: &mut Ctx, q: &Quantity, dim, f: &str| {
        positive(ctx, q, dim, units, &format!("stability.u_frames.{f}"), None)
    };
    let e = match &u.e {
        Some(q) => pos(ctx, q, Dimension::Stress, "e"),
        None => materials.first().map(|m| m.e),
    };
    let vertical_i = pos(ctx, &u.vertical_i, Dimension::SecondMoment, "vertical_i");
    let height = pos(ctx, &u.height, Dimension::Length, "height");
    let vertical_height = match &u.vertical_height {
        Some(q) => pos(ctx, q, Dimension::Length, "vertical_height"),
        None => height,
    };
    let floor_beam_i = pos(
        ctx,
        &u.floor_beam_i,
        Dimension::SecondMoment,
        "floor_beam_i",
    );
    let floor_beam_span = pos(
        ctx,
        &u.floor_beam_span,
        Dimension::Length,
        "floor_beam_span",
    );
    let spring = u
        .spring
        .as_ref()
        .and_then(|q| pos(ctx, q, Dimension::ForcePerLength, "spring"));
    let fc = u.connection_flexibility.unwrap_or(0.0);
    if !(fc >= 0.0 && fc.is_finite()) {
        ctx.error(
            format!("stability.u_frames.connection_flexibility must be zero or positive, not {fc}"),
            None,
        );
    }
    // rad per (force unit × length unit) → rad/(N·m).
    let fc = fc / (units.force.to_si * units.length.to_si);
    Some(UFrameInput {
        chord,
        frames_at,
        e: e?,
        vertical_i: vertical_i?,
        vertical_height: vertical_height?,
        height: height?,
        floor_beam_i: floor_beam_i?,
        floor_beam_span: floor_beam_span?,
        connection_flexibility: fc,
        spring,
        use_in_rate: u.use_in_rate.unwrap_or(false),
    })
}

fn vibration(ctx: &mut Ctx, v: &VibrationFile, units: &DisplayUnits) -> Option<VibrationInput> {
    let what = |f: &str| format!("stability.vibration.{f}");
    let deck_weight = value(
        ctx,
        &v.deck_weight,
        Dimension::ForcePerLength,
        units,
        &what("deck_weight"),
        None,
    );
    let width = positive(
        ctx,
        &v.tributary_width,
        Dimension::Length,
        units,
        &what("tributary_width"),
        None,
    );
    let load = match &v.pedestrian_load {
        Some(q) => positive(
            ctx,
            q,
            Dimension::Stress,
            units,
            &what("pedestrian_load"),
            None,
        ),
        None => Some(PEDESTRIAN_LOAD),
    };
    let live_share = v.live_share.unwrap_or(0.0);
    if !(0.0..=1.0).contains(&live_share) {
        ctx.error(
            format!("{} must be 0 to 1, not {live_share}", what("live_share")),
            None,
        );
    }
    let trusses = v.trusses.unwrap_or(2.0);
    let ratio = v.deflection_ratio.unwrap_or(360.0);
    for (name, x) in [("trusses", trusses), ("deflection_ratio", ratio)] {
        if !(x > 0.0 && x.is_finite()) {
            ctx.error(format!("{} must be positive, not {x}", what(name)), None);
        }
    }
    let deck_weight = deck_weight?;
    if deck_weight < 0.0 {
        ctx.error(
            format!("{} must not be negative", what("deck_weight")),
            None,
        );
    }
    Some(VibrationInput {
        deck_weight,
        live_share,
        pedestrian_load: load?,
        tributary_width: width?,
        trusses,
        deflection_ratio: ratio,
    })
}
