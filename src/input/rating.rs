//! The model's `rating` block turned into the method's name and settings;
//! the method itself (and every default) lives in `crate::method`.

use super::convert::Ctx;
use super::schema::RatingFile;
use crate::method::{Method, Settings};
use crate::model::RatingSettings;

pub(super) fn convert_rating(ctx: &mut Ctx, r: &RatingFile) -> RatingSettings {
    if let Some(name) = &r.curve {
        let at = ctx.loc.field("curve", name, 0);
        let hint = if name.trim().eq_ignore_ascii_case("bridge-asd") {
            "asr".to_string()
        } else if crate::method::NAMES.contains(&name.trim().to_ascii_lowercase().as_str()) {
            name.trim().to_ascii_lowercase()
        } else {
            crate::method::DEFAULT.to_string()
        };
        ctx.error(
            format!(
                "rating.curve is replaced by rating.method, which sets the capacity equations and the load factors together; write rating: (method: \"{hint}\", ...) (methods: {})",
                crate::method::NAMES.join(", ")
            ),
            at,
        );
    }
    let level = |l: &Option<super::schema::LevelFile>| {
        (
            l.as_ref().and_then(|l| l.gamma_dead),
            l.as_ref().and_then(|l| l.gamma_live),
        )
    };
    let (gamma_dead_inventory, gamma_live_inventory) = level(&r.inventory);
    let (gamma_dead_operating, gamma_live_operating) = level(&r.operating);
    let settings = Settings {
        condition_factor: r.condition_factor,
        system_factor: r.system_factor,
        adtt: r.adtt,
        gamma_legal: r.gamma_legal,
        gamma_m1: r.gamma_m1,
        csa_n: r.csa_n,
        safety_factor: r.safety_factor,
        gamma_live_inventory,
        gamma_live_operating,
        gamma_dead_inventory,
        gamma_dead_operating,
    };
    for (name, v) in [
        ("inventory.gamma_dead", gamma_dead_inventory),
        ("inventory.gamma_live", gamma_live_inventory),
        ("operating.gamma_dead", gamma_dead_operating),
        ("operating.gamma_live", gamma_live_operating),
    ] {
        if let Some(v) = v {
            if !(v.is_finite() && v > 0.0) {
                ctx.error(
                    format!("rating.{name} must be a positive number, not {v}"),
                    None,
                );
            }
        }
    }
    for (name, v, hi) in [
        ("condition_factor", r.condition_factor, 1.2),
        ("system_factor", r.system_factor, 1.2),
    ] {
        if let Some(v) = v {
            if !(v.is_finite() && v > 0.0 && v <= hi) {
                ctx.error(
                    format!("rating.{name} must lie in (0, {hi}], not {v}"),
                    None,
                );
            }
        }
    }
    let name = r.method.as_deref().unwrap_or(crate::method::DEFAULT);
    if let Err(e) = Method::from_name(name, &settings) {
        let at = r
            .method
            .as_ref()
            .and_then(|m| ctx.loc.field("method", m, 0));
        ctx.error(format!("rating.method: {e}"), at);
    }
    RatingSettings {
        method: r.method.clone(),
        settings,
    }
}
