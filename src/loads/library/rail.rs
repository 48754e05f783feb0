//! Railway loading of AREMA Manual for Railway Engineering, Ch. 15 (steel
//! structures), §1.3.3 (from memory):
//!
//! - Cooper E80: two locomotives, each axle loads 40, 80, 80, 80, 80, 52,
//!   52, 52, 52 kip at 8, 5, 5, 5, 9, 5, 6, 5 ft, the second locomotive 8 ft
//!   behind the first, then a uniform 8 kip/ft from 5 ft behind the last
//!   axle on. Cooper E-n scales every load (axles and uniform) by n/80.
//! - The alternate live load: four axles of 100 kip at 5, 6 and 5 ft (E80),
//!   scaled by n/80 likewise; the greater effect of the two governs in the
//!   manual — give both as moving loads.
//! - Impact (§1.3.5, steel spans, equipment without hammer blow): rocking
//!   effect 100/S percent (S the spacing of the trusses, ft) plus
//!   40 − 3L²/1600 percent for L < 80 ft or 16 + 600/(L − 30) percent for
//!   L ≥ 80 ft, L the span in ft. Hammer-blow (steam) impact and the 90 %
//!   allowance for ballasted decks are not modelled.

use super::{axles_kip_ft, Dynamic, LoadModel, Presence, FT, KLF};
use crate::loads::{Rules, Trailing, Vehicle};

/// The fixed names listed (any n: `cooper-e72`, `alternate-e60`).
pub const NAMES: &[&str] = &["cooper-e80", "alternate-e80"];

const SOURCE: &str = "AREMA Manual for Railway Engineering Ch. 15 1.3.3 (loading), 1.3.5 (impact, steel spans, rocking 100/S) (from memory)";

/// Axle loads (kip) of one E80 locomotive, front first.
const E80_LOCO: [f64; 9] = [40.0, 80.0, 80.0, 80.0, 80.0, 52.0, 52.0, 52.0, 52.0];
/// Spacings (ft) within one locomotive.
const E80_SPACING: [f64; 8] = [8.0, 5.0, 5.0, 5.0, 9.0, 5.0, 6.0, 5.0];

/// Cooper E-n.
pub fn cooper(n: f64) -> LoadModel {
    let f = n / 80.0;
    let mut loads: Vec<f64> = Vec::new();
    let mut spacings: Vec<f64> = Vec::new();
    for loco in 0..2 {
        if loco == 1 {
            spacings.push(8.0);
        }
        loads.extend(E80_LOCO.iter().map(|l| l * f));
        spacings.extend(E80_SPACING);
    }
    let axles = axles_kip_ft(&loads, &spacings);
    let last = axles.last().map_or(0.0, |a| a.offset);
    let name = format!("cooper-e{}", fmt_n(n));
    LoadModel {
        name: name.clone(),
        designation: format!("Cooper E{}", fmt_n(n)),
        source: SOURCE.into(),
        vehicle: Vehicle {
            id: name,
            axles,
            lane: None,
            rules: Rules {
                trailing: Some(Trailing {
                    load: 8.0 * f * KLF,
                    offset: last + 5.0 * FT,
                }),
                ..Rules::default()
            },
        },
        area: None,
        dynamic: Dynamic::Arema,
        impact_on_lane: true,
        presence: Presence::None,
        legal: false,
        note: "impact on all of the load; S from the deck's width (the truss spacing)".into(),
    }
}

/// The alternate live load for E-n.
pub fn alternate(n: f64) -> LoadModel {
    let f = n / 80.0;
    let name = format!("alternate-e{}", fmt_n(n));
    LoadModel {
        name: name.clone(),
        designation: format!("Alternate live load E{}", fmt_n(n)),
        vehicle: Vehicle {
            id: name,
            axles: axles_kip_ft(&[100.0 * f; 4], &[5.0, 6.0, 5.0]),
            ..Vehicle::default()
        },
        ..cooper(n)
    }
}

fn fmt_n(n: f64) -> String {
    if n.fract() == 0.0 {
        format!("{n:.0}")
    } else {
        format!("{n}")
    }
}

/// `cooper-eN` or `alternate-eN` with 10 ≤ N ≤ 150.
pub fn lookup(name: &str) -> Option<LoadModel> {
    let (which, n) = name
        .strip_prefix("cooper-e")
        .map(|n| (true, n))
        .or_else(|| name.strip_prefix("alternate-e").map(|n| (false, n)))?;
    let n: f64 = n.parse().ok()?;
    if !(10.0..=150.0).contains(&n) {
        return None;
    }
    Some(if which { cooper(n) } else { alternate(n) })
}

#[cfg(test)]
mod tests {
    use super::super::KIP;
    use super::*;

    #[test]
    fn e80_axles_and_scaling() {
        // E80: 2 × (40 + 4·80 + 4·52) = 1136 kip on 18 axles over 104 ft,
        // uniform 8 kip/ft from 109 ft (from memory, AREMA 15-1.3.3).
        let m = lookup("cooper-e80").unwrap();
        assert_eq!(m.vehicle.axles.len(), 18);
        assert!((m.gross_weight() / KIP - 1136.0).abs() < 1e-9);
        assert!((m.vehicle.length() / FT - 104.0).abs() < 1e-9);
        let t = m.vehicle.rules.trailing.as_ref().unwrap();
        assert!((t.offset / FT - 109.0).abs() < 1e-9);
        assert!((t.load / KLF - 8.0).abs() < 1e-12);
        // E60 = 60/80 of everything.
        let e60 = lookup("cooper-e60").unwrap();
        assert!((e60.gross_weight() / KIP - 852.0).abs() < 1e-9);
        assert!((e60.vehicle.rules.trailing.unwrap().load / KLF - 6.0).abs() < 1e-12);
        assert_eq!(e60.designation, "Cooper E60");
        // Alternate: 4 × 100 kip at 5, 6, 5 ft.
        let a = lookup("alternate-e80").unwrap();
        assert!((a.gross_weight() / KIP - 400.0).abs() < 1e-9);
        assert!((a.vehicle.length() / FT - 16.0).abs() < 1e-9);
        assert!(a.vehicle.rules.trailing.is_none());
        assert!(lookup("cooper-e5").is_none() && lookup("cooper-ex").is_none());
    }
}
