//! Warnings (not errors) for values far outside what structural steel and
//! iron, and real trusses, have: the usual sign of a units slip, such as
//! E = 29,000,000 typed with `stress: "ksi"`.
//!
//! The ranges are common practice (values from memory, rounded):
//! - E: cast iron about 70–170 GPa, wrought iron about 170–200 GPa, steel
//!   about 200–210 GPa → 70–210 GPa (about 10,000–30,000 ksi).
//! - Fy: wrought iron about 170–210 MPa (25–30 ksi), old mild steel about
//!   210–250 MPa, high-strength steels to about 690 MPa (100 ksi).
//! - Fu: cast iron in tension from about 140 MPa (20 ksi), steels to about
//!   900 MPa (130 ksi).
//! - Weight density: cast iron about 70.6 kN/m³ (450 pcf), steel about
//!   77 kN/m³ (490 pcf) → 70–78 kN/m³.
//! - Size of a truss: about 1 m (small roof trusses) to 550 m (the longest
//!   truss spans, cantilever bridges).
//!
//! A value is "far outside" when it lies below the range's low end divided
//! by [`FAR`] or above its high end times [`FAR`]: margin enough for the
//! odd real material, and a units slip (a factor of 6.9 for ksi/MPa, 1000
//! for kip/lb or mm/m, 12 for in/ft) still shows.

use super::convert::Ctx;
use crate::units::{Dimension, DisplayUnits};

/// How far outside a range a value must lie before it is warned about.
pub const FAR: f64 = 1.5;

/// A range of a property of structural steel and iron, SI.
pub struct Range {
    pub what: &'static str,
    pub dimension: Dimension,
    pub low: f64,
    pub high: f64,
}

pub const E: Range = Range {
    what: "e",
    dimension: Dimension::Stress,
    low: 70e9,
    high: 210e9,
};
pub const FY: Range = Range {
    what: "fy",
    dimension: Dimension::Stress,
    low: 170e6,
    high: 690e6,
};
pub const FU: Range = Range {
    what: "fu",
    dimension: Dimension::Stress,
    low: 140e6,
    high: 900e6,
};
pub const DENSITY: Range = Range {
    what: "density",
    dimension: Dimension::Density,
    low: 70e3,
    high: 78e3,
};
/// Largest extent of the nodes, m.
pub const SIZE: Range = Range {
    what: "size",
    dimension: Dimension::Length,
    low: 1.0,
    high: 550.0,
};

/// Two significant digits, for the ends of a stated range.
fn two_digits(v: f64) -> String {
    if v == 0.0 || !v.is_finite() {
        return format!("{v}");
    }
    let p = 10f64.powi(v.abs().log10().floor() as i32 - 1);
    let r = (v / p).round() * p;
    let decimals = (-(v.abs().log10().floor() as i32 - 1)).max(0) as usize;
    format!("{r:.decimals$}")
}

impl Range {
    /// Whether SI `v` lies far outside the range.
    pub fn far_outside(&self, v: f64) -> bool {
        v < self.low / FAR || v > self.high * FAR
    }

    /// "about 10000 to 30000 ksi", in the model's unit.
    pub fn stated(&self, u: &DisplayUnits) -> String {
        let f = u.factor_for(self.dimension);
        format!(
            "about {} to {} {}",
            two_digits(self.low / f),
            two_digits(self.high / f),
            u.name_for(self.dimension)
        )
    }
}

/// Warn about material `id`'s properties (SI; None where not given).
pub(super) fn check_material(
    ctx: &mut Ctx,
    id: &str,
    values: [(&Range, Option<f64>); 4],
    u: &DisplayUnits,
    at: Option<(usize, usize)>,
) {
    for (range, v) in values {
        let Some(v) = v.filter(|v| range.far_outside(*v)) else {
            continue;
        };
        let f = u.factor_for(range.dimension);
        ctx.warn(
            format!(
                "material \"{id}\" {} = {} {} is far outside the range of structural steel and iron ({}, common practice); check the value and the {} unit",
                range.what,
                crate::units::plain(v / f),
                u.name_for(range.dimension),
                range.stated(u),
                if range.dimension == Dimension::Stress { "stress" } else { "force and length" },
            ),
            at,
        );
    }
}

/// Warn when the truss is far smaller or larger than trusses are; `extent`
/// is the larger of the x and y spans of the nodes, m, between `a` and `b`.
pub(super) fn check_size(ctx: &mut Ctx, extent: f64, a: &str, b: &str, u: &DisplayUnits) {
    if extent > 0.0 && SIZE.far_outside(extent) {
        ctx.warn(
            format!(
                "the truss measures {} {} from node \"{a}\" to node \"{b}\", far outside the size of real trusses ({}, common practice); check the coordinates and the length unit",
                crate::units::plain(extent / u.length.to_si),
                u.length.name,
                SIZE.stated(u),
            ),
            None,
        );
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ranges_in_model_units() {
        // 70 GPa = 10,153 ksi and 210 GPa = 30,458 ksi (1 ksi = 6.894757 MPa).
        assert_eq!(E.stated(&DisplayUnits::us()), "about 10000 to 30000 ksi");
        assert_eq!(E.stated(&DisplayUnits::si()), "about 70000 to 210000 MPa");
        // 29,000 ksi is steel; 29,000,000 ksi a units slip.
        let ksi = 6.894_757_293e6;
        assert!(!E.far_outside(29_000.0 * ksi));
        assert!(E.far_outside(29e6 * ksi));
        assert!(!FY.far_outside(36.0 * ksi) && FY.far_outside(36_000.0 * ksi));
        // A mass density, 7850 (kg/m³), typed as kN/m³: 7.85e6 N/m³.
        assert!(!DENSITY.far_outside(77e3) && DENSITY.far_outside(7850e3));
    }
}
