//! The `fatigue` block and the members' `detail` fields, converted to
//! [`fatigue::Settings`](crate::fatigue::Settings). Every value is checked
//! here; the library takes them as given.

use super::convert::Ctx;
use super::schema::{ModelFile, StressAreaFile};
use crate::fatigue::mbe::{Category, Traffic};
use crate::fatigue::{Detail, Settings, StressArea};
use crate::loads::LiveLoads;

/// The categories a message lists.
const CATEGORIES: &str = "A, B, B', C, C', D, E, E'";

/// A member's `detail`: whitespace-, comma- or slash-separated parts, each
/// an AASHTO category letter or an EN 1993-1-9 category number (MPa).
fn detail(ctx: &mut Ctx, member: &str, text: &str) -> Option<Detail> {
    let mut d = Detail::default();
    let parts: Vec<&str> = text
        .split(|c: char| c.is_whitespace() || c == ',' || c == '/')
        .filter(|p| !p.is_empty())
        .collect();
    let bad = |ctx: &mut Ctx, why: String| {
        let at = ctx.locate("detail", text, 0);
        ctx.error(format!("member \"{member}\" detail \"{text}\": {why}"), at);
    };
    if parts.is_empty() {
        bad(ctx, format!("give an AASHTO category ({CATEGORIES}) or an EN 1993-1-9 category number such as 71"));
        return None;
    }
    for p in parts {
        if let Ok(v) = p.parse::<f64>() {
            if !(v.is_finite() && v > 0.0) || d.en.is_some() {
                bad(
                    ctx,
                    format!("\"{p}\" is not one positive EN 1993-1-9 category (MPa)"),
                );
                return None;
            }
            d.en = Some(v * 1e6);
        } else if let Some(c) = Category::from_name(p) {
            if d.aashto.is_some() {
                bad(ctx, "more than one AASHTO category".into());
                return None;
            }
            d.aashto = Some(c);
        } else {
            bad(ctx, format!("\"{p}\" is neither an AASHTO detail category ({CATEGORIES}) nor an EN 1993-1-9 category number"));
            return None;
        }
    }
    Some(d)
}

/// A model parameter that must be finite and positive (or, with
/// `zero_ok`, not negative).
fn checked(ctx: &mut Ctx, v: f64, name: &str, zero_ok: bool) -> Option<f64> {
    let ok = v.is_finite() && (v > 0.0 || (zero_ok && v == 0.0));
    if ok {
        Some(v)
    } else {
        let want = if zero_ok {
            "zero or a positive number"
        } else {
            "a positive number"
        };
        ctx.error(format!("fatigue.{name} must be {want}, not {v}"), None);
        None
    }
}

/// Settings of the model's `fatigue` block, or None (with errors in `ctx`
/// when the block is wrong, or a warning when members give details and
/// there is no block).
pub(super) fn settings(ctx: &mut Ctx, file: &ModelFile, live: &LiveLoads) -> Option<Settings> {
    let mut details = Vec::new();
    for (i, m) in file.members.iter().enumerate() {
        if let Some(text) = &m.detail {
            if let Some(d) = detail(ctx, &m.id, text) {
                details.push((i, d));
            }
        }
    }
    let Some(f) = &file.fatigue else {
        if !details.is_empty() {
            ctx.warn(
                format!("{} members give a fatigue detail, but the model has no fatigue block; the details are not used", details.len()),
                None,
            );
        }
        return None;
    };
    let vehicle = match live.vehicles.iter().position(|v| v.id == f.vehicle) {
        Some(v) if live.vehicles[v].axles.is_empty() => {
            ctx.error(format!("fatigue.vehicle \"{}\" has no axles; the fatigue evaluation needs an axle train", f.vehicle), None);
            None
        }
        Some(v) => Some(v),
        None => {
            let at = ctx.locate("vehicle", &f.vehicle, 0);
            ctx.error(
                format!(
                    "fatigue.vehicle \"{}\" is not one of the model's vehicles",
                    f.vehicle
                ),
                at,
            );
            None
        }
    };
    if file.deck.nodes().is_empty() {
        ctx.error(
            "the fatigue evaluation needs a deck line: add `deck: [...]`".into(),
            None,
        );
    }
    let adtt = checked(ctx, f.adtt, "adtt", false);
    let age = checked(ctx, f.age, "age", true);
    let growth = f.growth.unwrap_or(0.0);
    if !(growth.is_finite() && growth > -1.0) {
        ctx.error(
            format!("fatigue.growth must be a yearly rate above -1 (0.02 = 2 %), not {growth}"),
            None,
        );
    }
    let mut s = Settings::new(
        vehicle.unwrap_or(0),
        Traffic {
            adtt: adtt.unwrap_or(1.0),
            age: age.unwrap_or(0.0),
            growth,
        },
    );
    if let Some(i) = f.impact {
        s.impact = checked(ctx, i, "impact", true).unwrap_or(0.0);
    }
    if f.area == Some(StressAreaFile::Gross) {
        s.area = StressArea::Gross;
    }
    if let Some(c) = &f.category {
        match Category::from_name(c) {
            Some(c) => s.default_category = c,
            None => ctx.error(
                format!("fatigue.category \"{c}\" is not an AASHTO detail category ({CATEGORIES})"),
                None,
            ),
        }
    }
    if let Some(v) = f
        .en_category
        .and_then(|v| checked(ctx, v, "en_category", false))
    {
        s.default_en = v * 1e6;
    }
    for (v, name, into) in [
        (f.gamma_mf, "gamma_mf", &mut s.en.gamma_mf),
        (f.gamma_ff, "gamma_ff", &mut s.en.gamma_ff),
        (f.rs, "rs", &mut s.mbe.rs),
        (f.load_factor, "load_factor", &mut s.mbe.load_factor),
        (
            f.infinite_factor,
            "infinite_factor",
            &mut s.mbe.infinite_factor,
        ),
        (f.rr_minimum, "rr_minimum", &mut s.mbe.rr_minimum),
    ] {
        if let Some(v) = v.and_then(|v| checked(ctx, v, name, false)) {
            *into = v;
        }
    }
    s.mbe.rr_evaluation = f
        .rr_evaluation
        .and_then(|v| checked(ctx, v, "rr_evaluation", false));
    s.mbe.rr_mean = f.rr_mean.and_then(|v| checked(ctx, v, "rr_mean", false));
    for (name, a, th) in &f.constants {
        let Some(c) = Category::from_name(name) else {
            ctx.error(
                format!(
                    "fatigue.constants: \"{name}\" is not an AASHTO detail category ({CATEGORIES})"
                ),
                None,
            );
            continue;
        };
        let a = checked(ctx, *a, "constants A (ksi³)", false);
        let th = checked(ctx, *th, "constants threshold (ksi)", false);
        if let (Some(a), Some(th)) = (a, th) {
            s.mbe.constants.retain(|o| o.0 != c);
            s.mbe.constants.push((c, a, th));
        }
    }
    s.details = details;
    Some(s)
}
