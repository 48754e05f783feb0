//! Screening curves: the Euler hyperbola (capped at Fy) and the Johnson
//! parabola, nominal and unfactored. They report utilization against the
//! nominal strength and the factor of safety; a rating factor only with a
//! safety factor the user gives (`rating.safety_factor`), as
//! RF = (Pn/FS − D) / L, stated as such. No code's load factors apply.

use super::{Family, Level, Method, PermanentFactor, Resistance, Settings};
use crate::capacity::Curve;

pub fn method(key: &str, s: &Settings) -> Method {
    let curve = if key == "euler" {
        Curve::Euler
    } else {
        Curve::Johnson
    };
    let fs = s.safety_factor.unwrap_or(1.0);
    let resistance = Resistance {
        compression: 1.0 / fs,
        tension_yield: 1.0 / fs,
        tension_fracture: 1.0 / fs,
        uses_rp: false,
        compression_clause: if key == "euler" {
            "Euler σe = π²E/(KL/r)², capped at Fy (closed form, unfactored)"
        } else {
            "Johnson parabola to Cc = √(2π²E/Fy), Euler beyond (closed form, unfactored)"
        },
        tension_clause: "unfactored Fy·Ag (gross yield) and Fu·An·U (net fracture)",
        symbol: "1/FS",
    };
    let level = Level {
        name: "screening",
        gamma_live: 1.0,
        dc: PermanentFactor::ONE,
        dw: PermanentFactor::ONE,
        resistance,
        condition_system: false,
        clause: "screening: RF = (Pn/FS − D)/L with the user's safety factor FS",
    };
    let rates = s.safety_factor.is_some();
    let mut notes = vec![format!(
        "\"{key}\" is a screening curve with no code factors: utilization is against the nominal strength{}",
        if rates {
            format!(" divided by the user's safety factor FS = {fs}")
        } else {
            "; no rating factors without rating.safety_factor".to_string()
        }
    )];
    if s.condition_factor.is_some() || s.system_factor.is_some() {
        notes.push("condition and system factors are not applied by a screening curve".into());
    }
    Method {
        name: key.to_string(),
        family: Family::Screening,
        curve,
        design_levels: vec![level],
        legal_levels: vec![level],
        check: resistance,
        phi_c: 1.0,
        phi_s: 1.0,
        rates,
        equation: "RF = (Pn/FS − D) / L (user's safety factor FS)",
        notes,
    }
}
