//! EN 1991-2:2003 traffic load models (all from memory):
//!
//! - LM71 (§6.3.2): four 250 kN point loads at 1.6 m plus q_vk = 80 kN/m,
//!   times α (classification factor, `scale` on the moving load; 1.0 by
//!   default, 0.75…1.46 by the national annex); "any number of lengths of
//!   q_vk and up to four of the point loads" (§6.8.1), so the distributed
//!   load goes on every part of the influence line that adds and point
//!   loads that relieve are left off. The distributed load is also placed
//!   under the 6.4 m of the point loads (the figure leaves it off there):
//!   conservative by at most 80 kN/m over 6.4 m.
//!   Dynamic factor (§6.4.5.2) Φ2 = 1.44/(√LΦ − 0.2) + 0.82 within
//!   1.00…1.67 (carefully maintained track), Φ3 = 2.16/(√LΦ − 0.2) + 0.73
//!   within 1.00…2.00 (standard maintenance), on all of LM71; LΦ the
//!   determinant length (Table 6.2: the span of a simply supported main
//!   girder).
//! - LM1 (§4.3.2), one notional lane 3 m wide: lane 1 tandem 2 × 300 kN
//!   (axles 1.2 m apart) and 9 kN/m²; lane 2 2 × 200 kN and 2.5 kN/m²;
//!   lane 3 2 × 100 kN and 2.5 kN/m²; dynamic amplification included; α
//!   adjustment factors 1.0 (national annex: `scale`).
//! - Footbridges (§5.3.2): crowd q_fk = 2.0 + 120/(L + 30) kN/m² within
//!   2.5…5.0 (Eq. 5.1, L the loaded length, m); the service vehicle
//!   Q_serv (§5.3.2.3, Fig. 5.2): axles 80 kN and 40 kN 3 m apart.

use super::{axles_si, Dynamic, LoadModel, Presence};
use crate::loads::{Crowd, CrowdRule, Rules, Vehicle};

/// The fixed names of this family.
pub const NAMES: &[&str] = &[
    "lm71",
    "lm71-phi2",
    "lm1-lane1",
    "lm1-lane2",
    "lm1-lane3",
    "en-crowd",
    "en-service",
];

const KN: f64 = 1000.0;
/// Width of a notional lane, m (EN 1991-2 Table 4.1 for a carriageway ≥ 6 m).
pub const LANE_WIDTH: f64 = 3.0;

fn model(name: &str, designation: &str, clause: &str, vehicle: Vehicle) -> LoadModel {
    LoadModel {
        name: name.into(),
        designation: designation.into(),
        source: format!("EN 1991-2:2003 {clause} (from memory)"),
        vehicle: Vehicle {
            id: name.into(),
            ..vehicle
        },
        area: None,
        dynamic: Dynamic::None,
        impact_on_lane: false,
        presence: Presence::None,
        legal: false,
        note: String::new(),
    }
}

fn lm1(name: &str, lane: u8, axle_kn: f64, udl_kn_m2: f64) -> LoadModel {
    LoadModel {
        note: format!("notional lane {lane} of 3 m: tandem axles {axle_kn} kN, UDL {udl_kn_m2} kN/m2 x 3 m; dynamic amplification included; alpha factors by `scale`"),
        ..model(
            name,
            &format!("LM1 lane {lane}"),
            "4.3.2, Table 4.2",
            Vehicle {
                axles: axles_si(&[axle_kn * KN; 2], &[1.2]),
                lane: Some(udl_kn_m2 * KN * LANE_WIDTH),
                ..Vehicle::default()
            },
        )
    }
}

/// The EN 1991-2 model of that name.
pub fn lookup(name: &str) -> Option<LoadModel> {
    Some(match name {
        "lm71" | "lm71-phi2" => {
            let phi3 = name == "lm71";
            LoadModel {
                dynamic: Dynamic::EnPhi { phi3 },
                impact_on_lane: true,
                note: format!(
                    "{} on the whole model; alpha by `scale`; distributed load also under the point loads (conservative)",
                    if phi3 { "Phi3 (standard maintenance)" } else { "Phi2 (carefully maintained track)" }
                ),
                ..model(
                    name,
                    if phi3 { "LM71 with Phi3" } else { "LM71 with Phi2" },
                    "6.3.2 (LM71), 6.8.1 (arrangement), 6.4.5.2 (Phi)",
                    Vehicle {
                        axles: axles_si(&[250.0 * KN; 4], &[1.6; 3]),
                        lane: Some(80.0 * KN),
                        rules: Rules {
                            ignore_relieving: true,
                            ..Rules::default()
                        },
                        ..Vehicle::default()
                    },
                )
            }
        }
        "lm1-lane1" => lm1(name, 1, 300.0, 9.0),
        "lm1-lane2" => lm1(name, 2, 200.0, 2.5),
        "lm1-lane3" => lm1(name, 3, 100.0, 2.5),
        "en-crowd" => LoadModel {
            note: "q_fk(L) times the tributary width; L the loaded length of each member's influence line".into(),
            ..model(
                name,
                "Footbridge crowd q_fk",
                "5.3.2.1 Eq. (5.1)",
                Vehicle {
                    rules: Rules {
                        crowd: Some(Crowd {
                            rule: CrowdRule::En1991Footbridge,
                            width: 1.0,
                        }),
                        ..Rules::default()
                    },
                    ..Vehicle::default()
                },
            )
        },
        "en-service" => LoadModel {
            note: "no dynamic allowance applied (give `impact` if the national annex asks for one)".into(),
            ..model(
                name,
                "Footbridge service vehicle Q_serv",
                "5.3.2.3, Fig. 5.2",
                Vehicle {
                    axles: axles_si(&[80.0 * KN, 40.0 * KN], &[3.0]),
                    ..Vehicle::default()
                },
            )
        },
        _ => return None,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::loads::ImpactRule;

    #[test]
    fn gross_weights() {
        // LM71 4 × 250 = 1000 kN; LM1 lane 1 2 × 300 = 600 kN; service
        // vehicle 80 + 40 = 120 kN (EN 1991-2, from memory).
        let g = |n: &str| lookup(n).unwrap().gross_weight() / KN;
        assert!((g("lm71") - 1000.0).abs() < 1e-9);
        assert!((g("lm1-lane1") - 600.0).abs() < 1e-9);
        assert!((g("lm1-lane2") - 400.0).abs() < 1e-9);
        assert!((g("en-service") - 120.0).abs() < 1e-9);
        // LM1 lane 1 UDL 9 kN/m² × 3 m = 27 kN/m.
        assert!((lookup("lm1-lane1").unwrap().vehicle.lane.unwrap() - 27_000.0).abs() < 1e-9);
    }

    #[test]
    fn crowd_intensity_eq_5_1_by_hand() {
        // q_fk = 2.0 + 120/(L + 30), 2.5 ≤ q ≤ 5.0 kN/m² (EN 1991-2 Eq. 5.1,
        // from memory): L = 10 → 5.0; L = 50 → 3.5; L = 90 → 3.0;
        // L = 5 → 5.43 capped at 5.0; L = 300 → 2.364 raised to 2.5.
        let q = |l: f64| CrowdRule::En1991Footbridge.intensity(l) / KN;
        assert!((q(10.0) - 5.0).abs() < 1e-12);
        assert!((q(50.0) - 3.5).abs() < 1e-12);
        assert!((q(90.0) - 3.0).abs() < 1e-12);
        assert_eq!(q(5.0), 5.0);
        assert_eq!(q(300.0), 2.5);
    }

    #[test]
    fn phi_by_hand() {
        // LΦ = 16 m: √16 − 0.2 = 3.8; Φ3 = 2.16/3.8 + 0.73 = 1.29842;
        // Φ2 = 1.44/3.8 + 0.82 = 1.19895 (EN 1991-2 6.4.5.2, from memory).
        let i3 = ImpactRule::EnPhi {
            phi3: true,
            length: 16.0,
        }
        .allowance(0.0, 0.0);
        let i2 = ImpactRule::EnPhi {
            phi3: false,
            length: 16.0,
        }
        .allowance(0.0, 0.0);
        assert!((i3 - (2.16 / 3.8 + 0.73 - 1.0)).abs() < 1e-12 && (i3 - 0.298_42).abs() < 1e-5);
        assert!((i2 - 0.198_95).abs() < 1e-5);
        // Short span: Φ3 capped at 2.00 (LΦ = 1 m: 2.16/0.8 + 0.73 = 3.43).
        let short = ImpactRule::EnPhi {
            phi3: true,
            length: 1.0,
        }
        .allowance(0.0, 0.0);
        assert_eq!(short, 1.0);
        // Long span: Φ2 floor 1.00 (LΦ = 400 m: 1.44/19.8 + 0.82 = 0.893).
        let long = ImpactRule::EnPhi {
            phi3: false,
            length: 400.0,
        }
        .allowance(0.0, 0.0);
        assert_eq!(long, 0.0);
    }
}
