//! Section definitions of the model file turned into section properties.

use super::convert::{positive, value, Ctx};
use super::parts::{self, convert_parts, LacedAxisFile, PartFile, PlaneAxisFile};
use super::schema::{ConnectedLegFile, SectionFile, ShearLagFile};
use crate::model::{BuiltUp, ConnectedLeg, Lacing, Section};
use crate::section;
use crate::units::{Dimension, DisplayUnits};

pub(super) fn convert_section(ctx: &mut Ctx, s: &SectionFile, u: &DisplayUnits) -> Section {
    let mut section = properties(ctx, s, u);
    section.holes_punched = s.holes_punched;
    if let Some(sl) = &s.shear_lag {
        let at = ctx.loc.field("id", &s.id, 0);
        let what = |f: &str| format!("section \"{}\" shear_lag {f}", s.id);
        let u_factor = match sl {
            ShearLagFile::Factor(v) => Some(*v),
            ShearLagFile::Connection {
                length,
                eccentricity,
            } => {
                let l = parts::section_length(ctx, length, u, &what("length"));
                let x = parts::section_length(ctx, eccentricity, u, &what("eccentricity"));
                // AASHTO LRFD Table 6.8.2.2-1 / AISC 360-16 Table D3.1 case 2.
                (l > 0.0).then(|| 1.0 - x / l)
            }
        };
        match u_factor {
            Some(v) if v.is_finite() && v > 0.0 && v <= 1.0 => {
                section.shear_lag = v;
                section.shear_lag_given = true;
            }
            Some(v) => ctx.error(
                format!(
                    "section \"{}\" shear_lag U = {v:.4} must lie in (0, 1] (U = 1 − x̄/L needs x̄ < L)",
                    s.id
                ),
                at,
            ),
            None => {}
        }
    }
    section
}

fn properties(ctx: &mut Ctx, s: &SectionFile, u: &DisplayUnits) -> Section {
    if let Some(parts) = &s.parts {
        return built_up(ctx, s, parts, u);
    }
    let at = ctx.loc.field("id", &s.id, 0);
    if s.lacing.is_some() || s.truss_plane.is_some() {
        ctx.error(
            format!(
                "section \"{}\": lacing and truss_plane apply to sections with parts",
                s.id
            ),
            at,
        );
    }
    if s.connected_leg.is_some() {
        ctx.error(
            format!(
                "section \"{}\": connected_leg applies to a section of one angle part",
                s.id
            ),
            at,
        );
    }
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
    let mut net = s
        .net_area
        .as_ref()
        .and_then(|q| positive(ctx, q, Dimension::Area, u, &what("net_area"), at));
    if let Some(ratio) = s.net_ratio {
        if s.net_area.is_some() {
            ctx.error(
                format!("section \"{}\": give net_area or net_ratio, not both", s.id),
                at,
            );
        } else if !(ratio.is_finite() && ratio > 0.0 && ratio <= 1.0) {
            ctx.error(
                format!(
                    "section \"{}\" net_ratio must be in (0, 1], not {ratio}",
                    s.id
                ),
                at,
            );
        } else {
            net = area.map(|a| a * ratio);
        }
    }
    if let (Some(a), Some(n)) = (area, net) {
        if n > a * (1.0 + 1e-12) {
            ctx.error(
                format!("section \"{}\" net_area exceeds its area", s.id),
                at,
            );
        }
    }
    let area = area.unwrap_or(1.0);
    let torsion = given_torsion(ctx, s, u, at);
    Section {
        id: s.id.clone(),
        area,
        i_in: i_in.unwrap_or(1.0),
        i_out: i_out.unwrap_or(1.0),
        net_area: net.unwrap_or(area),
        built_up: None,
        shear_lag: 1.0,
        shear_lag_given: false,
        holes_punched: None,
        torsion,
    }
}

/// `j`, `cw`, `x0`, `y0` of a section given by its properties: all four or
/// none (J and Cw positive or zero, J > 0 or Cw > 0).
fn given_torsion(
    ctx: &mut Ctx,
    s: &SectionFile,
    u: &DisplayUnits,
    at: Option<(usize, usize)>,
) -> Option<section::TorsionProperties> {
    let given = [
        s.j.is_some(),
        s.cw.is_some(),
        s.x0.is_some(),
        s.y0.is_some(),
    ];
    if given.iter().all(|g| !g) {
        return None;
    }
    if !given.iter().all(|g| *g) {
        ctx.error(
            format!(
                "section \"{}\": give all of j, cw, x0 and y0, or none",
                s.id
            ),
            at,
        );
        return None;
    }
    let what = |f: &str| format!("section \"{}\" {f}", s.id);
    let j = value(
        ctx,
        s.j.as_ref()?,
        Dimension::SecondMoment,
        u,
        &what("j"),
        at,
    );
    let cw = s.cw.map(|c| c * u.section.to_si.powi(6));
    // Offsets in the section unit, as the parts' x and y.
    let x0 = Some(parts::section_length(ctx, s.x0.as_ref()?, u, &what("x0")));
    let y0 = Some(parts::section_length(ctx, s.y0.as_ref()?, u, &what("y0")));
    let (Some(j), Some(cw), Some(x0), Some(y0)) = (j, cw, x0, y0) else {
        return None;
    };
    match (j, cw) {
        (j, cw) if cw.is_finite() && j >= 0.0 && cw >= 0.0 && j + cw > 0.0 => {
            Some(section::TorsionProperties {
                j,
                cw,
                shear_centre_x: x0,
                shear_centre_y: y0,
                closed_cells: 0,
                links: 0,
            })
        }
        _ => {
            ctx.error(
                format!(
                    "section \"{}\": j and cw must be zero or positive and not both zero",
                    s.id
                ),
                at,
            );
            None
        }
    }
}

fn built_up(ctx: &mut Ctx, s: &SectionFile, parts: &[PartFile], u: &DisplayUnits) -> Section {
    let at = ctx.loc.field("id", &s.id, 0);
    if s.area.is_some() || s.i_in.is_some() || s.i_out.is_some() {
        ctx.error(
            format!(
                "section \"{}\" gives both parts and area/i_in/i_out; use one form",
                s.id
            ),
            at,
        );
    }
    let placed = convert_parts(ctx, &s.id, parts, u);
    let fallback = Section {
        id: s.id.clone(),
        area: 1.0,
        i_in: 1.0,
        i_out: 1.0,
        net_area: 1.0,
        built_up: None,
        shear_lag: 1.0,
        shear_lag_given: false,
        holes_punched: None,
        torsion: None,
    };
    let props = match section::properties_with_original(&placed) {
        Ok(p) => p,
        Err(e) => {
            let labels: Vec<Option<&str>> = parts.iter().map(|p| p.label()).collect();
            ctx.error(super::section_errors::describe(&e, &s.id, &labels, u), at);
            return fallback;
        }
    };
    let torsion = match section::torsion(&placed) {
        Ok(t) => t,
        Err(e) => {
            ctx.error(format!("section \"{}\": {e}", s.id), at);
            return fallback;
        }
    };
    let x_in_plane = s.truss_plane == Some(PlaneAxisFile::X);
    let r = &props.reduced;
    let (i_in, i_out) = if x_in_plane {
        (r.iy, r.ix)
    } else {
        (r.ix, r.iy)
    };
    let mut net_area = r.net_area;
    if let Some(ratio) = s.net_ratio {
        if ratio.is_finite() && ratio > 0.0 && ratio <= 1.0 {
            net_area = r.area * ratio;
        } else {
            ctx.error(
                format!(
                    "section \"{}\" net_ratio must be in (0, 1], not {ratio}",
                    s.id
                ),
                at,
            );
        }
    }
    if let Some(q) = &s.net_area {
        if let Some(n) = positive(
            ctx,
            q,
            Dimension::Area,
            u,
            &format!("section \"{}\" net_area", s.id),
            at,
        ) {
            net_area = n;
        }
    }
    if !is_positive(net_area) || net_area > r.area * (1.0 + 1e-12) {
        ctx.error(
            format!(
                "section \"{}\": net area is not between zero and the area",
                s.id
            ),
            at,
        );
        return fallback;
    }
    let lacing = s.lacing.as_ref().map(|l| {
        let what = format!("section \"{}\" lacing spacing", s.id);
        let spacing = parts::section_length(ctx, &l.spacing, u, &what);
        if !is_positive(spacing) {
            ctx.error(format!("{what} must be positive"), at);
        }
        let component_r = match &l.component_r {
            Some(q) => parts::section_length(
                ctx,
                q,
                u,
                &format!("section \"{}\" lacing component_r", s.id),
            ),
            // The components are the main shapes: plates and eye-bars (cover
            // plates, tie plates) are left out unless there is nothing else.
            None => placed
                .iter()
                .filter(|p| !matches!(p.loss, Some(section::Loss::Missing)))
                .filter(|p| {
                    placed.iter().all(|q| {
                        matches!(
                            q.shape,
                            section::Shape::Plate { .. } | section::Shape::EyeBar { .. }
                        )
                    }) || !matches!(
                        p.shape,
                        section::Shape::Plate { .. } | section::Shape::EyeBar { .. }
                    )
                })
                .filter_map(|p| section::part_properties(p).ok())
                .map(|pp| {
                    let m = section::principal_moments(pp.ix, pp.iy, pp.ixy);
                    (m.minor / pp.area).sqrt()
                })
                .fold(f64::INFINITY, f64::min),
        };
        if !is_positive(component_r) {
            ctx.error(
                format!("section \"{}\" lacing component_r must be positive", s.id),
                at,
            );
        }
        let k_i = l.k_i.unwrap_or(section::K_I_OTHER);
        if !is_positive(k_i) {
            ctx.error(
                format!("section \"{}\" lacing k_i must be positive", s.id),
                at,
            );
        }
        let system = match l.kind {
            Some(parts::LacingKindFile::Double) => section::LacingSystem::Double,
            _ => section::LacingSystem::Single,
        };
        let bars = l.bar.as_ref().map(|b| {
            let w = |f: &str| format!("section \"{}\" lacing bar {f}", s.id);
            let width = parts::section_length(ctx, &b.width, u, &w("width"));
            let thickness = parts::section_length(ctx, &b.thickness, u, &w("thickness"));
            if !is_positive(width) || !is_positive(thickness) {
                ctx.error(format!("{} and thickness must be positive", w("width")), at);
            }
            let least = match system {
                section::LacingSystem::Single => 60.0,
                section::LacingSystem::Double => 45.0,
            };
            let deg = l.angle.unwrap_or(least);
            if !(deg.is_finite() && deg > 0.0 && deg < 90.0) {
                ctx.error(
                    format!(
                        "section \"{}\" lacing angle must be between 0 and 90 degrees, not {deg}",
                        s.id
                    ),
                    at,
                );
            }
            let planes = l.planes.unwrap_or(1);
            if planes == 0 {
                ctx.error(
                    format!("section \"{}\" lacing planes must be at least 1", s.id),
                    at,
                );
            }
            crate::model::LacingBars {
                width,
                thickness,
                angle: deg.to_radians(),
                angle_given: l.angle.is_some(),
                system,
                planes: planes.max(1),
            }
        });
        Lacing {
            spacing,
            connector: parts::connector(l.connector),
            k_i,
            component_r,
            out_of_plane: l.axis != Some(LacedAxisFile::In),
            bars,
            tie_plates: l.tie_plates,
        }
    });
    let connected_leg = s.connected_leg.map(|c| match c {
        ConnectedLegFile::Long => ConnectedLeg::Long,
        ConnectedLegFile::Short => ConnectedLeg::Short,
        ConnectedLegFile::Both => ConnectedLeg::Both,
    });
    let angles = placed
        .iter()
        .filter(|p| matches!(p.shape, section::Shape::Angle { .. }))
        .count();
    if connected_leg.is_some() && (angles != 1 || placed.len() != 1) {
        ctx.error(
            format!(
                "section \"{}\": connected_leg applies to a section of one angle part",
                s.id
            ),
            at,
        );
    }
    Section {
        id: s.id.clone(),
        area: r.area,
        i_in,
        i_out,
        net_area,
        built_up: Some(BuiltUp {
            parts: placed,
            original: props.original,
            reduced: props.reduced,
            x_in_plane,
            lacing,
            torsion,
            connected_leg,
        }),
        shear_lag: 1.0,
        shear_lag_given: false,
        holes_punched: None,
        torsion: None,
    }
}

/// Strictly positive and finite (false for NaN).
fn is_positive(v: f64) -> bool {
    v.is_finite() && v > 0.0
}
