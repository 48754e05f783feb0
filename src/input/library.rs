//! Moving loads that name a library model (`vehicle: "hs20"`) and the
//! deck's transverse layout: the model's loads scaled by `scale` and by
//! the truss's lever-rule share, and its standard's dynamic allowance
//! unless `impact` is given. Called from `loads.rs`.

use super::convert::{positive, value, Ctx};
use super::schema::{DeckFile, MovingLoadFile};
use crate::loads::library::{self, Dynamic};
use crate::loads::{ImpactRule, Vehicle};
use crate::units::{Dimension, DisplayUnits};

/// Rail gauge (4 ft 8½ in), the least truss spacing there can be: the
/// conservative stand-in for S in the rocking effect 100/S when the deck
/// gives no width.
pub const GAUGE: f64 = 56.5 * 0.0254;

pub(crate) use crate::loads::distribution::DeckLayout as Layout;

/// The layout of a `deck: (nodes, width, …)`; None for the list form.
pub(super) fn layout(ctx: &mut Ctx, deck: &DeckFile, u: &DisplayUnits) -> Option<Layout> {
    let DeckFile::Layout(d) = deck else {
        return None;
    };
    let len = |ctx: &mut Ctx, q, what: &str| value(ctx, q, Dimension::Length, u, &what, None);
    let width = d
        .width
        .as_ref()
        .and_then(|q| positive(ctx, q, Dimension::Length, u, &"deck width", None));
    let lanes = d
        .lanes
        .iter()
        .filter_map(|q| len(ctx, q, "deck lane offset"))
        .collect();
    let wheel_lines = d
        .wheel_lines
        .iter()
        .filter_map(|q| len(ctx, q, "deck wheel line offset"))
        .collect();
    let tributary = d
        .tributary
        .as_ref()
        .and_then(|q| positive(ctx, q, Dimension::Length, u, &"deck tributary width", None));
    if (!d.lanes.is_empty() || !d.wheel_lines.is_empty()) && d.width.is_none() {
        ctx.error(
            "deck: lanes and wheel lines need the truss spacing `width` (the floor beam's span) for the lever rule".into(),
            None,
        );
    }
    if !d.lanes.is_empty() && !d.wheel_lines.is_empty() {
        ctx.error("deck: give lanes or wheel_lines, not both".into(), None);
    }
    Some(Layout {
        width,
        lanes,
        wheel_lines,
        tributary,
    })
}

/// The moving load's `scale` (1 when absent), checked.
pub(super) fn scale(ctx: &mut Ctx, ml: &MovingLoadFile, at: Option<(usize, usize)>) -> Option<f64> {
    let s = ml.scale.unwrap_or(1.0);
    if !(s.is_finite() && s > 0.0) {
        ctx.error(
            format!(
                "moving load \"{}\" scale must be a positive number, not {s}",
                ml.id
            ),
            at,
        );
        return None;
    }
    Some(s)
}

/// A library model made ready for one moving load.
pub(crate) struct Resolved {
    pub name: String,
    /// Loads × scale × share, SI.
    pub vehicle: Vehicle,
    /// Nominal allowance (the rule's value for the whole deck).
    pub impact: f64,
    pub impact_on_lane: bool,
    pub rule: ImpactRule,
    /// Lever-rule share with multiple presence (or, for an area load, the
    /// tributary width in m).
    pub share: f64,
    /// A legal load of its standard (rated at the legal level, posted).
    pub legal: bool,
}

/// The library model `ml.vehicle` scaled and shared for this truss.
pub(super) fn resolve(
    ctx: &mut Ctx,
    ml: &MovingLoadFile,
    layout: &Option<Layout>,
    deck_length: Option<f64>,
    at: Option<(usize, usize)>,
) -> Option<Resolved> {
    let scale = scale(ctx, ml, at)?;
    let who = format!("moving load \"{}\"", ml.id);
    match resolve_named(&ml.vehicle, &who, scale, layout.as_ref(), deck_length) {
        Some(Ok((r, warnings))) => {
            for w in warnings {
                ctx.warn(w, at);
            }
            Some(r)
        }
        Some(Err(e)) => {
            ctx.error(e, at);
            None
        }
        None => None,
    }
}

/// The library model `name` times `scale`, shared for this truss by
/// `layout`, with its standard's allowance on a deck `deck_length` long:
/// `None` when `name` is not a library model, an error for a load the
/// layout cannot place; warnings beside the result. `who` names the
/// moving load in messages.
pub(crate) fn resolve_named(
    name: &str,
    who: &str,
    scale: f64,
    layout: Option<&Layout>,
    deck_length: Option<f64>,
) -> Option<Result<(Resolved, Vec<String>), String>> {
    let m = library::lookup(name)?;
    let mut warnings = Vec::new();
    let (mut vehicle, share) = if m.is_area() {
        let Some(width) = layout.and_then(Layout::area_width) else {
            return Some(Err(format!("{who}: the area load \"{}\" needs the width of deck this truss carries: give `deck: (nodes: [...], width: ...)` (half the width is taken) or `tributary: ...`", m.name)));
        };
        let mut v = m.vehicle.scaled(scale * width);
        v.lane = m.area.map(|q| q * width * scale);
        (v, width)
    } else {
        let share = layout.map_or(1.0, |l| l.vehicle_share(m.presence).0);
        if share <= 0.0 {
            warnings.push(format!(
                "{who}: no lane or wheel line loads this truss (lever-rule share 0)"
            ));
        }
        (m.vehicle.scaled(scale * share), share)
    };
    vehicle.id = if scale == 1.0 {
        m.name.clone()
    } else {
        format!("{} x {scale}", m.name)
    };
    let span = deck_length.unwrap_or(0.0);
    let (rule, impact) = match m.dynamic {
        Dynamic::None => (ImpactRule::Fixed, 0.0),
        Dynamic::Fixed(x) => (ImpactRule::Fixed, x),
        Dynamic::LoadedLength => {
            let r = ImpactRule::LoadedLength;
            (r, r.allowance(0.0, span))
        }
        Dynamic::Arema => {
            let spacing = layout.and_then(|l| l.width).unwrap_or_else(|| {
                warnings.push(format!("{who}: the railway rocking effect 100/S needs the truss spacing S; without a deck width the rail gauge 4 ft 8.5 in is taken (conservative): give `deck: (nodes: [...], width: ...)`"));
                GAUGE
            });
            let r = ImpactRule::Arema { span, spacing };
            (r, r.allowance(0.0, span))
        }
        Dynamic::EnPhi { phi3 } => {
            let r = ImpactRule::EnPhi { phi3, length: span };
            (r, r.allowance(0.0, span))
        }
    };
    Some(Ok((
        Resolved {
            name: m.name,
            vehicle,
            impact,
            impact_on_lane: m.impact_on_lane,
            rule,
            share,
            legal: m.legal,
        },
        warnings,
    )))
}
