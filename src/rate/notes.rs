//! The notes of a rating that concern members: lacing, the slenderness
//! limits of the method's code, the Euler cap, and the defaults taken for
//! data the model does not give (U, Rp, steel grade by year).

use super::checks::MemberCapacity;
use super::LoadEffect;
use crate::capacity;
use crate::method::{Family, Method};
use crate::model::Model;
use crate::section;

/// AASHTO LRFD 6.9.3: KL/r ≤ 120 for main compression members (from memory).
pub const AASHTO_COMPRESSION_LIMIT: f64 = 120.0;
/// AASHTO LRFD 6.8.4: L/r ≤ 200 for main tension members not subject to
/// stress reversal, 140 for those subject to reversal (from memory).
pub const AASHTO_TENSION_LIMIT: f64 = 200.0;
pub const AASHTO_REVERSAL_LIMIT: f64 = 140.0;

fn bridge_code(method: &Method) -> bool {
    matches!(method.family, Family::Lrfr | Family::Lfr | Family::Asr)
}

pub(super) fn member_notes(
    model: &Model,
    method: &Method,
    effects: &[LoadEffect],
    members: &[MemberCapacity],
) -> Vec<String> {
    let mut notes = Vec::new();
    let mut default_u = Vec::new();
    let mut default_rp = Vec::new();
    for (m, cap) in members.iter().enumerate() {
        let id = &model.members[m].id;
        let sec = &model.sections[model.members[m].section];
        let compressed = effects.iter().any(|e| e.forces[m] < 0.0);
        let tensioned = effects.iter().any(|e| e.forces[m] > 0.0);
        if let (Some(le), true) = (&cap.lacing, compressed) {
            // §E6.2: 2 % of the available compressive strength, not the demand.
            let pmax = cap.compression.capacity;
            let s = crate::report::Scale::of(model);
            notes.push(format!(
                "member \"{id}\": laced built-up member with tie plates, KL/r = {:.1} about the laced axis, not modified (AISC 360-16 §E6.1(b)); lacing designed for V = 2% of the available strength {:.1} {} = {:.2} {} (§E6.2)",
                le.overall,
                pmax / s.force,
                s.force_name,
                section::lacing_shear(pmax) / s.force,
                s.force_name
            ));
            if let Some(b) = &cap.lacing_bars {
                notes.push(format!(
                    "member \"{id}\": lacing bar force {:.2} {} against strength {:.2} {} (utilization {:.2}); K·L/r = {:.0} {} {:.0} ({}; {})",
                    b.force / s.force,
                    s.force_name,
                    b.capacity / s.force,
                    s.force_name,
                    b.utilization,
                    b.slenderness,
                    if b.slenderness_ok { "≤" } else { "EXCEEDS" },
                    b.slenderness_limit,
                    super::lacing::LacingBarCheck::CLAUSE,
                    if b.angle_given { "angle as given" } else { "angle not given: the least §E6.2 allows taken" }
                ));
            }
            if !le.component_ok {
                notes.push(format!(
                    "member \"{id}\": component slenderness a/ri = {:.1} exceeds 3/4 of the governing slenderness (AISC 360-16 §E6.2)",
                    le.component
                ));
            }
        }
        if compressed {
            if sec.built_up.is_some() {
                notes.extend(cap.modes.report_notes(id, cap.compression.critical_stress));
            }
            if bridge_code(method) && cap.slenderness() > AASHTO_COMPRESSION_LIMIT {
                notes.push(format!(
                    "member \"{id}\": KL/r = {:.1} exceeds the limit of {AASHTO_COMPRESSION_LIMIT:.0} for main compression members (AASHTO LRFD 6.9.3)",
                    cap.slenderness()
                ));
            } else if let Some(w) = capacity::slenderness_warning(cap.slenderness(), true) {
                notes.push(format!("member \"{id}\": {w}"));
            }
            if cap.compression.yields_before_buckling && method.name == "euler" {
                notes.push(format!(
                    "member \"{id}\": Euler stress exceeds Fy, so the member would yield before it buckles elastically; the Euler curve is capped at Fy and an inelastic curve should govern"
                ));
            }
        }
        if tensioned {
            let limit = if compressed {
                AASHTO_REVERSAL_LIMIT
            } else {
                AASHTO_TENSION_LIMIT
            };
            // Not for eyebars, rods and bars, which the article exempts
            // (AASHTO LRFD 6.8.4, from memory): the tension-only members.
            if bridge_code(method)
                && !model.members[m].tension_only
                && cap.slenderness_unit_k() > limit
            {
                notes.push(format!(
                    "member \"{id}\": L/r = {:.1} exceeds the limit of {limit:.0} for main tension members{} (AASHTO LRFD 6.8.4)",
                    cap.slenderness_unit_k(),
                    if compressed { " subject to stress reversal" } else { "" }
                ));
            } else if !compressed && !model.members[m].tension_only {
                if let Some(w) = capacity::slenderness_warning(cap.slenderness_unit_k(), false) {
                    notes.push(format!("member \"{id}\": {w}"));
                }
            }
            if !sec.shear_lag_given && !default_u.contains(&sec.id) {
                default_u.push(sec.id.clone());
            }
            if method.check.uses_rp && sec.holes_punched.is_none() && !default_rp.contains(&sec.id)
            {
                default_rp.push(sec.id.clone());
            }
        }
    }
    if !default_u.is_empty() {
        notes.push(format!(
            "shear-lag factor U = 1.0 taken for sections {} (no shear_lag given; AASHTO LRFD 6.8.2.2 / AISC 360-16 §D3 give U < 1 where not every element is connected: give shear_lag)",
            quoted(&default_u)
        ));
    }
    if !default_rp.is_empty() {
        notes.push(format!(
            "Rp = 0.90 (holes punched full size, the conservative value) taken for sections {} (holes_punched not given; AASHTO LRFD 6.8.2.1; holes_punched: false for drilled or reamed holes gives 1.0)",
            quoted(&default_rp)
        ));
    }
    for mat in &model.materials {
        if let Some(year) = mat.year {
            let (_, _, row) = crate::method::steel_year::strengths(year);
            let s = crate::report::Scale::of(model);
            notes.push(format!(
                "material \"{}\": steel of unknown grade built in {year}: Fy = {:.1} {}, Fu = {:.1} {} assumed ({row}, MBE Table 6A.6.2.1-1, from memory)",
                mat.id,
                mat.fy.unwrap_or(0.0) / s.stress,
                s.stress_name,
                mat.fu.unwrap_or(0.0) / s.stress,
                s.stress_name
            ));
        }
    }
    notes
}

fn quoted(ids: &[String]) -> String {
    ids.iter()
        .map(|s| format!("\"{s}\""))
        .collect::<Vec<_>>()
        .join(", ")
}
