//! AASHTO highway and pedestrian load models (all from memory; check
//! against the edition the owner requires):
//!
//! - H and HS trucks, AASHTO Standard Specifications for Highway Bridges,
//!   17th ed. (2002), §3.7: H trucks W tons gross, 0.2 W on the front axle
//!   and 0.8 W on the rear, 14 ft apart; HS trucks add a semitrailer axle
//!   equal to the rear axle at a spacing varied from 14 to 30 ft for the
//!   greatest effect. Impact §3.8.2.1: I = 50/(L + 125) ≤ 0.30.
//! - HL-93, AASHTO LRFD Bridge Design Specifications §3.6.1.2: the design
//!   truck (8, 32, 32 kip; 14 ft; 14–30 ft) or the design tandem (2 × 25 kip
//!   at 4 ft), whichever governs, plus the design lane 0.64 kip/ft; IM 33 %
//!   (Table 3.6.2.1-1) on the truck or tandem only, never on the lane;
//!   axles that do not contribute are neglected (§3.6.1.3.1).
//! - Legal loads of the Manual for Bridge Evaluation (MBE) §6A.4.4.2.1:
//!   Type 3 (25 t), Type 3S2 (36 t), Type 3-3 (40 t); the lane-type legal
//!   load (0.75 × Type 3-3 plus 0.2 kip/ft) for long spans; the specialized
//!   hauling vehicles SU4–SU7; the notional rating load NRL; IM 33 %
//!   (§6A.4.4.3, which allows less on a smooth riding surface).
//! - Emergency vehicles EV2 and EV3 (FAST Act of 2015, AASHTO guidance
//!   2016).
//! - Pedestrian bridges, AASHTO LRFD Guide Specifications for the Design of
//!   Pedestrian Bridges (2009): 90 psf with no dynamic allowance (§3.1);
//!   the maintenance vehicle H5 (clear deck 7–10 ft) or H10 (over 10 ft)
//!   (§3.2), with no dynamic allowance.

use super::{axles_kip_ft, Dynamic, LoadModel, Presence, FT, KLF, PSF};
use crate::loads::{Rules, Train, VariableGap, Vehicle};

/// The fixed names of this family.
pub const NAMES: &[&str] = &[
    "h5",
    "h10",
    "h15",
    "h20",
    "hs15",
    "hs20",
    "hl93",
    "type3",
    "type3s2",
    "type3-3",
    "legal-lane",
    "su4",
    "su5",
    "su6",
    "su7",
    "nrl",
    "ev2",
    "ev3",
    "ped90",
];

const STD: &str = "AASHTO Standard Specifications for Highway Bridges, 17th ed. (2002)";
const MBE: &str = "AASHTO Manual for Bridge Evaluation";
const PED: &str = "AASHTO LRFD Guide Specifications for the Design of Pedestrian Bridges (2009)";
/// LRFR dynamic load allowance for legal loads, MBE §6A.4.4.3 (from memory).
pub const LEGAL_IM: f64 = 0.33;

fn model(name: &str, designation: &str, source: String, vehicle: Vehicle) -> LoadModel {
    LoadModel {
        name: name.into(),
        designation: designation.into(),
        source,
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

fn truck(loads: &[f64], spacings: &[f64]) -> Vehicle {
    Vehicle {
        axles: axles_kip_ft(loads, spacings),
        ..Vehicle::default()
    }
}

/// An H truck of `tons` (W): 0.2 W and 0.8 W at 14 ft.
fn h_truck(tons: f64) -> Vehicle {
    let w = 2.0 * tons; // kip
    truck(&[0.2 * w, 0.8 * w], &[14.0])
}

/// An HS truck of `tons` for the tractor: 0.2 W, 0.8 W, 0.8 W at 14 ft and
/// 14–30 ft.
fn hs_truck(tons: f64) -> Vehicle {
    let w = 2.0 * tons;
    Vehicle {
        rules: Rules {
            variable_gap: Some(VariableGap {
                axle: 2,
                min: 14.0 * FT,
                max: 30.0 * FT,
            }),
            ..Rules::default()
        },
        ..truck(&[0.2 * w, 0.8 * w, 0.8 * w], &[14.0, 14.0])
    }
}

fn legal(name: &str, designation: &str, clause: &str, vehicle: Vehicle) -> LoadModel {
    LoadModel {
        dynamic: Dynamic::Fixed(LEGAL_IM),
        presence: Presence::Lrfd,
        legal: true,
        note: "IM 33 % (MBE 6A.4.4.3; 10-20 % allowed for a smooth approach: give `impact`)".into(),
        ..model(
            name,
            designation,
            format!("{MBE} {clause} (from memory)"),
            vehicle,
        )
    }
}

/// The AASHTO model of that name.
pub fn lookup(name: &str) -> Option<LoadModel> {
    let std_truck = |name: &str, designation: &str, v: Vehicle| LoadModel {
        dynamic: Dynamic::LoadedLength,
        presence: Presence::Standard,
        ..model(
            name,
            designation,
            format!("{STD} 3.7.6-3.7.7, impact 3.8.2.1 (from memory)"),
            v,
        )
    };
    let ped_truck = |name: &str, designation: &str, tons: f64| {
        LoadModel {
        note: "maintenance vehicle of the pedestrian guide: H5 for a clear deck width of 7-10 ft, H10 over 10 ft; no dynamic allowance".into(),
        ..model(
            name,
            designation,
            format!("{PED} 3.2, axles as the H truck of {STD} 3.7.6 (from memory)"),
            h_truck(tons),
        )
    }
    };
    Some(match name {
        "h5" => ped_truck(name, "H5", 5.0),
        "h10" => ped_truck(name, "H10", 10.0),
        "h15" => std_truck(name, "H15-44", h_truck(15.0)),
        "h20" => std_truck(name, "H20-44", h_truck(20.0)),
        "hs15" => std_truck(name, "HS15-44", hs_truck(15.0)),
        "hs20" => std_truck(name, "HS20-44", hs_truck(20.0)),
        "hl93" => {
            let mut v = hs_truck(20.0);
            v.lane = Some(0.64 * KLF);
            v.rules.ignore_relieving = true;
            v.rules.label = Some("design truck".into());
            v.rules.alternatives.push(Train {
                label: "design tandem".into(),
                axles: axles_kip_ft(&[25.0, 25.0], &[4.0]),
                variable_gap: None,
            });
            LoadModel {
                dynamic: Dynamic::Fixed(0.33),
                presence: Presence::Lrfd,
                note: "design truck (train 0) or design tandem (train 1), whichever governs, plus the design lane; IM on truck or tandem only. The 90 % two-truck load for negative moment of continuous spans (3.6.1.3.1) is not applied".into(),
                ..model(
                    name,
                    "HL-93",
                    "AASHTO LRFD Bridge Design Specifications 3.6.1.2.2-3.6.1.2.4, IM Table 3.6.2.1-1, multiple presence Table 3.6.1.1.2-1 (from memory)".into(),
                    v,
                )
            }
        }
        "type3" => legal(name, "Type 3", "6A.4.4.2.1, Fig. D6A-1", truck(&[16.0, 17.0, 17.0], &[15.0, 4.0])),
        "type3s2" => legal(
            name,
            "Type 3S2",
            "6A.4.4.2.1, Fig. D6A-2",
            truck(&[10.0, 15.5, 15.5, 15.5, 15.5], &[11.0, 4.0, 22.0, 4.0]),
        ),
        "type3-3" => legal(
            name,
            "Type 3-3",
            "6A.4.4.2.1, Fig. D6A-3",
            truck(&[12.0, 12.0, 12.0, 16.0, 14.0, 14.0], &[15.0, 4.0, 15.0, 16.0, 4.0]),
        ),
        "legal-lane" => {
            let mut v = truck(&[9.0, 9.0, 9.0, 12.0, 10.5, 10.5], &[15.0, 4.0, 15.0, 16.0, 4.0]);
            v.lane = Some(0.2 * KLF);
            LoadModel {
                note: "0.75 x Type 3-3 plus 0.2 kip/ft, for spans over 200 ft (and two such trucks 30 ft apart for negative moment, not applied here); IM on the truck only".into(),
                ..legal(name, "Lane-type legal load", "6A.4.4.2.1, Fig. D6A-4", v)
            }
        }
        "su4" => legal(name, "SU4", "6A.4.4.2.1 (specialized hauling vehicles)", truck(&[12.0, 8.0, 17.0, 17.0], &[10.0, 4.0, 4.0])),
        "su5" => legal(name, "SU5", "6A.4.4.2.1 (specialized hauling vehicles)", truck(&[12.0, 8.0, 8.0, 17.0, 17.0], &[10.0, 4.0, 4.0, 4.0])),
        "su6" => legal(
            name,
            "SU6",
            "6A.4.4.2.1 (specialized hauling vehicles)",
            truck(&[11.5, 8.0, 8.0, 17.0, 17.0, 8.0], &[10.0, 4.0, 4.0, 4.0, 4.0]),
        ),
        "su7" => legal(
            name,
            "SU7",
            "6A.4.4.2.1 (specialized hauling vehicles)",
            truck(&[11.5, 8.0, 8.0, 17.0, 17.0, 8.0, 8.0], &[10.0, 4.0, 4.0, 4.0, 4.0, 4.0]),
        ),
        "nrl" => LoadModel {
            note: "notional rating load; spacings as recalled (6 ft then 4 ft): check against the MBE figure before relying on it".into(),
            ..legal(
                name,
                "NRL",
                "6A.4.4.2.1, Fig. D6A-5 (notional rating load)",
                truck(&[6.0, 8.0, 8.0, 17.0, 17.0, 8.0, 8.0, 8.0], &[6.0, 4.0, 4.0, 4.0, 4.0, 4.0, 4.0]),
            )
        },
        "ev2" => LoadModel {
            source: "AASHTO emergency vehicle EV2 (FAST Act 2015; MBE 2018 interim 6A.4.4.2.1) (from memory)".into(),
            note: "24 kip front, 33.5 kip rear at 15 ft".into(),
            ..legal(name, "EV2", "", truck(&[24.0, 33.5], &[15.0]))
        },
        "ev3" => LoadModel {
            source: "AASHTO emergency vehicle EV3 (FAST Act 2015; MBE 2018 interim 6A.4.4.2.1) (from memory)".into(),
            note: "24 kip front, tandem 2 x 31 kip at 15 ft and 4 ft".into(),
            ..legal(name, "EV3", "", truck(&[24.0, 31.0, 31.0], &[15.0, 4.0]))
        },
        "ped90" => LoadModel {
            area: Some(90.0 * PSF),
            note: "area load times the tributary width of deck this truss carries; no dynamic allowance".into(),
            ..model(
                name,
                "Pedestrian load 90 psf",
                format!("{PED} 3.1 (from memory)"),
                Vehicle::default(),
            )
        },
        _ => return None,
    })
}

#[cfg(test)]
mod tests {
    use super::super::KIP;
    use super::*;

    fn gross_kip(name: &str) -> f64 {
        lookup(name).unwrap().gross_weight() / KIP
    }

    #[test]
    fn gross_weights_match_their_designations() {
        // Designation = gross weight (from memory): H and HS trucks W tons
        // (HS20: 20 t tractor = 40 kip + 32 kip semitrailer axle = 72 kip),
        // Type 3 25 t, Type 3S2 36 t, Type 3-3 40 t, SU4 27 t, SU5 31 t,
        // SU6 34.75 t, SU7 38.75 t, NRL 40 t, EV2 57.5 kip, EV3 86 kip.
        for (name, kip) in [
            ("h5", 10.0),
            ("h10", 20.0),
            ("h15", 30.0),
            ("h20", 40.0),
            ("hs15", 54.0),
            ("hs20", 72.0),
            ("hl93", 72.0),
            ("type3", 50.0),
            ("type3s2", 72.0),
            ("type3-3", 80.0),
            ("legal-lane", 60.0),
            ("su4", 54.0),
            ("su5", 62.0),
            ("su6", 69.5),
            ("su7", 77.5),
            ("nrl", 80.0),
            ("ev2", 57.5),
            ("ev3", 86.0),
        ] {
            assert!(
                (gross_kip(name) - kip).abs() < 1e-9,
                "{name}: {}",
                gross_kip(name)
            );
        }
        assert_eq!(gross_kip("ped90"), 0.0);
    }

    #[test]
    fn hl93_parts() {
        let m = lookup("hl93").unwrap();
        // Tandem 2 x 25 kip at 4 ft; lane 0.64 kip/ft; IM 33 % on axles only.
        let t = &m.vehicle.rules.alternatives[0];
        assert!((t.axles[1].offset - 4.0 * FT).abs() < 1e-12);
        assert!((t.axles.iter().map(|a| a.load).sum::<f64>() - 50.0 * KIP).abs() < 1e-6);
        assert!((m.vehicle.lane.unwrap() - 0.64 * KLF).abs() < 1e-9);
        assert_eq!(m.dynamic, Dynamic::Fixed(0.33));
        assert!(!m.impact_on_lane);
        assert!(!m.legal);
        assert!(lookup("type3").unwrap().legal);
        // HS20 rear spacing 14..30 ft.
        let g = lookup("hs20").unwrap().vehicle.rules.variable_gap.unwrap();
        assert!((g.min / FT - 14.0).abs() < 1e-12 && (g.max / FT - 30.0).abs() < 1e-12);
        // 90 psf = 4.309 kN/m² (1 psf = 47.88 N/m², by hand).
        assert!((lookup("ped90").unwrap().area.unwrap() - 4309.22).abs() < 0.01);
    }
}
