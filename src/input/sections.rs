//! Section definitions of the model file turned into section properties.

use super::convert::{positive, Ctx};
use super::schema::SectionFile;
use crate::model::Section;
use crate::units::{Dimension, DisplayUnits};

pub(super) fn convert_section(ctx: &mut Ctx, s: &SectionFile, u: &DisplayUnits) -> Section {
    let at = ctx.loc.field("id", &s.id, 0);
    let what = |f: &str| format!("section \"{}\" {f}", s.id);
    let need = |ctx: &mut Ctx, q: &Option<_>, dim, f: &str| match q {
        Some(q) => positive(ctx, q, dim, u, &what(f), at),
        None => {
            ctx.error(format!("section \"{}\" needs {f}", s.id), at);
            None
        }
    };
    let area = need(ctx, &s.area, Dimension::Area, "area");
    let i_in = need(ctx, &s.i_in, Dimension::SecondMoment, "i_in");
    let i_out = need(ctx, &s.i_out, Dimension::SecondMoment, "i_out");
    let net = s
        .net_area
        .as_ref()
        .and_then(|q| positive(ctx, q, Dimension::Area, u, &what("net_area"), at));
    if let (Some(a), Some(n)) = (area, net) {
        if n > a * (1.0 + 1e-12) {
            ctx.error(
                format!("section \"{}\" net_area exceeds its area", s.id),
                at,
            );
        }
    }
    let area = area.unwrap_or(1.0);
    Section {
        id: s.id.clone(),
        area,
        i_in: i_in.unwrap_or(1.0),
        i_out: i_out.unwrap_or(1.0),
        net_area: net.unwrap_or(area),
    }
}
