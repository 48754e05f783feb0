//! `panelpoint rate` against an independent computation of every method's
//! slenderness, Euler stress and critical stress (the standards' equations
//! written out again here), the controlling member, and rating factors
//! worked by hand for each rating method (LRFR, LFR, ASR).

mod common;
use common::*;
use std::f64::consts::PI;

/// Nominal critical stress by each standard's own equation, in ksi.
fn critical(curve: &str, fy: f64, e: f64, klr: f64) -> f64 {
    let fe = PI * PI * e / (klr * klr); // Euler, Timoshenko & Gere
    let en = |alpha: f64| {
        // EN 1993-1-1 §6.3.1.2 Eqs. 6.49 and 6.50.
        let lb = (fy / fe).sqrt();
        if lb <= 0.2 {
            return fy;
        }
        let phi = 0.5 * (1.0 + alpha * (lb - 0.2) + lb * lb);
        (1.0 / (phi + (phi * phi - lb * lb).sqrt())).min(1.0) * fy
    };
    match curve {
        "euler" => fe.min(fy),
        "johnson" | "lfr" | "asr" => {
            let cc = (2.0 * PI * PI * e / fy).sqrt();
            if klr <= cc {
                fy - (fy / (2.0 * PI)).powi(2) * klr * klr / e
            } else {
                fe
            }
        }
        // AISC 360-16 Eqs. E3-2 and E3-3.
        "aisc360" | "aisc360-asd" | "lrfr" => {
            if fy / fe <= 2.25 {
                0.658f64.powf(fy / fe) * fy
            } else {
                0.877 * fe
            }
        }
        "en1993-a0" => en(0.13),
        "en1993-a" => en(0.21),
        "en1993-b" => en(0.34),
        "en1993-c" => en(0.49),
        "en1993-d" => en(0.76),
        // CSA S16 13.3.1: Fy (1 + λ^2n)^(-1/n), λ = √(Fy/Fe).
        "csa-s16" => fy * (1.0 + (fy / fe).powf(1.34)).powf(-1.0 / 1.34),
        "csa-s16-2.24" => fy * (1.0 + (fy / fe).powf(2.24)).powf(-1.0 / 2.24),
        other => panic!("no reference for curve {other}"),
    }
}

fn rate_json(text: &str, curve: &str) -> serde_json::Value {
    let path = temp_model(&format!("rate-{curve}.ron"), text);
    let (code, out, err) = run(&[
        "rate",
        path.to_str().unwrap(),
        "--method",
        curve,
        "--format",
        "json",
    ]);
    assert_eq!(code, 0, "{curve}: {err}");
    serde_json::from_str(&out).unwrap()
}

#[test]
fn every_curve_matches_its_equations() {
    let curves = [
        "euler",
        "johnson",
        "aisc360",
        "aisc360-asd",
        "en1993-a0",
        "en1993-a",
        "en1993-b",
        "en1993-c",
        "en1993-d",
        "csa-s16",
        "csa-s16-2.24",
        "lrfr",
        "lfr",
        "asr",
    ];
    // Section properties of the example (in, in², in⁴) and E = 29,000 ksi, Fy = 33 ksi.
    let props = |id: &str| match id {
        "chord" => (14.7f64, 310.0f64, 355.0f64),
        _ => (6.2, 41.0, 18.5),
    };
    let m = load(FOUR_PANEL);
    for curve in curves {
        let v = rate_json(FOUR_PANEL, curve);
        assert_eq!(v["method"], curve);
        let checks = v["checks"].as_array().unwrap();
        assert_eq!(checks.len(), 13 * 2);
        let mut compressed = 0;
        for c in checks {
            let id = c["member"].as_str().unwrap();
            let mem = &m.members[member(&m, id)];
            let (a, b) = (&m.nodes[mem.start], &m.nodes[mem.end]);
            let l_in = (b.x - a.x).hypot(b.y - a.y) / INCH;
            let (area, i_in, i_out) = props(&m.sections[mem.section].id);
            let klr = (l_in / (i_in / area).sqrt()).max(l_in / (i_out / area).sqrt());
            let rel = |x: f64, y: f64| (x - y).abs() / y.abs();
            assert!(
                rel(c["slenderness"].as_f64().unwrap(), klr) < 1e-6,
                "{curve} {id}"
            );
            let fe = PI * PI * 29000.0 / (klr * klr);
            assert!(
                rel(c["euler_stress"].as_f64().unwrap(), fe) < 1e-6,
                "{curve} {id}"
            );
            if c["force"].as_f64().unwrap() < 0.0 {
                compressed += 1;
                let fcr = critical(curve, 33.0, 29000.0, klr);
                let got = c["critical_stress"].as_f64().unwrap();
                assert!(rel(got, fcr) < 1e-6, "{curve} {id}: {got} vs {fcr}");
                let margin = c["margin"].as_f64().unwrap();
                let stress = c["force"].as_f64().unwrap().abs() / area;
                assert!(rel(margin, fcr / stress) < 1e-6);
            } else if c["force"].as_f64().unwrap() > 0.0 {
                assert_eq!(c["regime"], "tension");
            } else {
                // L2-U2 carries no force (joint U2, statics): no margin.
                assert_eq!(id, "L2-U2");
                assert!(c["margin"].is_null());
            }
        }
        assert_eq!(compressed, 8, "end posts and top chords in both cases");
        // The controlling check is the one with the highest utilization
        // (there are no combinations: every row is counted or none is).
        let best = checks
            .iter()
            .max_by(|x, y| {
                x["utilization"]
                    .as_f64()
                    .unwrap()
                    .total_cmp(&y["utilization"].as_f64().unwrap())
            })
            .unwrap();
        assert_eq!(
            v["controlling"]["utilization"], best["utilization"],
            "{curve}"
        );
    }
}

/// The figures quoted for the example with the default curve: L0-U1 under
/// dead 62.93 / 72.27 / 27.26 ksi / 360.6 kip / 0.0563 / 19.72, and L0-U1
/// under crowd controlling at 0.0783 (AISC 360-16 E3-2 with φc = 0.90).
#[test]
fn default_curve_figures() {
    let path = temp_model("rate-default.ron", FOUR_PANEL);
    let (code, out, _) = run(&[
        "rate",
        path.to_str().unwrap(),
        "--method",
        "aisc360",
        "--format",
        "json",
    ]);
    assert_eq!(code, 0);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["method"], "aisc360");
    let c = v["checks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["member"] == "L0-U1" && c["case"] == "dead")
        .unwrap();
    let near = |k: &str, x: f64, tol: f64| {
        let got = c[k].as_f64().unwrap();
        assert!((got - x).abs() <= tol, "{k}: {got} vs {x}");
    };
    near("force", -20.32, 0.005);
    near("slenderness", 62.93, 0.005);
    near("euler_stress", 72.27, 0.005);
    near("critical_stress", 27.26, 0.005);
    near("capacity", 360.6, 0.05);
    near("utilization", 0.0563, 0.00005);
    near("margin", 19.72, 0.005);
    assert_eq!(c["axis"], "in");
    assert_eq!(c["regime"], "inelastic");
    assert!(c["rating_factor"].is_null());
    assert_eq!(v["controlling"]["member"], "L0-U1");
    assert_eq!(v["controlling"]["case"], "crowd");
    assert!((v["controlling"]["utilization"].as_f64().unwrap() - 0.0783).abs() < 0.00005);
}

/// A rating factor worked by hand: dead case `kind: Dead`, crowd `kind:
/// Live` with 10 % impact. End post L0-U1: D = −13.5·l/16, L = −18.75·l/16
/// (method of joints, l = √(18² + 16²) ft); LRFR: φc·Pn = 0.95·Fcr·14.7 with
/// Fcr by AASHTO LRFD Eq. 6.9.4.1.1-1 (= AISC E3-2), φc = 0.95 (LRFD
/// 6.5.4.2); RF = (φc·Pn − 1.25·|D|) / (γL·|L|·1.1), γL = 1.75 inventory,
/// 1.35 operating (MBE Eq. 6A.4.2.1-1, Table 6A.4.2.2-1; from memory).
#[test]
fn rating_factor_by_hand() {
    let text = FOUR_PANEL
        .replace("(id: \"dead\", loads:", "(id: \"dead\", kind: Dead, loads:")
        .replace(
            "(id: \"crowd\", loads:",
            "(id: \"crowd\", kind: Live, impact: 0.10, loads:",
        );
    let v = rate_json(&text, "lrfr");
    let l = (18.0f64 * 18.0 + 16.0 * 16.0).sqrt();
    let (d, live) = (13.5 * l / 16.0, 18.75 * l / 16.0 * 1.1);
    let klr = l * 12.0 / (310.0f64 / 14.7).sqrt();
    let fe = PI * PI * 29000.0 / (klr * klr);
    let phi_pn = 0.95 * 0.658f64.powf(33.0 / fe) * 33.0 * 14.7;
    let rf_inv = (phi_pn - 1.25 * d) / (1.75 * live);
    let rf_op = (phi_pn - 1.25 * d) / (1.35 * live);
    let row = |level: &str| {
        v["ratings"]
            .as_array()
            .unwrap()
            .iter()
            .find(|r| r["member"] == "L0-U1" && r["level"] == level)
            .unwrap()
            .clone()
    };
    let inv = row("inventory");
    assert!((inv["rf"].as_f64().unwrap() - rf_inv).abs() < 1e-9 * rf_inv);
    assert!((row("operating")["rf"].as_f64().unwrap() - rf_op).abs() < 1e-9 * rf_op);
    // Every factor is reported beside the factor it produced.
    assert_eq!(inv["gamma_dead"], 1.25);
    assert_eq!(inv["gamma_live"], 1.75);
    assert_eq!(inv["phi"], 0.95);
    assert_eq!(inv["phi_c"], 1.0);
    assert_eq!(inv["phi_s"], 1.0);
    assert!((inv["capacity"].as_f64().unwrap() - phi_pn).abs() < 1e-9 * phi_pn);
    assert!((inv["dead"].as_f64().unwrap() + d).abs() < 1e-9);
    assert!((inv["live_with_impact"].as_f64().unwrap() + live).abs() < 1e-9);
    // The lowest inventory factor is reported with its member and case.
    let lowest = &v["lowest_rating"];
    let min = v["ratings"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|r| r["level"] == "inventory")
        .filter_map(|r| r["rf"].as_f64())
        .fold(f64::INFINITY, f64::min);
    assert_eq!(lowest["rf"].as_f64().unwrap(), min);
    assert_eq!(lowest["level"], "inventory");
    assert_eq!(lowest["live_case"], "crowd");
    // The crowd rows of the check table carry the inventory factor.
    let row = v["checks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["member"] == "L0-U1" && c["case"] == "crowd")
        .unwrap();
    assert!((row["rating_factor"].as_f64().unwrap() - rf_inv).abs() < 1e-9 * rf_inv);
    // A single live case is an unfactored effect: shown, not counted, under LRFR.
    assert_eq!(row["service"], true);
}

/// Combinations: 1.25·dead + 1.75·(crowd + IM) is the linear sum of the
/// cases (superposition) with the live case's impact applied.
#[test]
fn combinations_are_linear() {
    let text = FOUR_PANEL
        .replace("(id: \"crowd\", loads:", "(id: \"crowd\", kind: Live, impact: 0.2, loads:")
        .replace(
            "    ],\n)",
            "    ],\n    combinations: [(id: \"strength\", factors: [(\"dead\", 1.25), (\"crowd\", 1.75)])],\n    rating: (method: \"en1993-b\"),\n)",
        );
    let path = temp_model("combo.ron", &text);
    let (code, out, err) = run(&["rate", path.to_str().unwrap(), "--format", "json"]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["method"], "en1993-b", "model-wide method");
    let force = |case: &str| {
        v["checks"]
            .as_array()
            .unwrap()
            .iter()
            .find(|c| c["member"] == "U1-U2" && c["case"] == case)
            .unwrap()["force"]
            .as_f64()
            .unwrap()
    };
    let expected = 1.25 * force("dead") + 1.75 * 1.2 * force("crowd");
    assert!((force("strength") - expected).abs() < 1e-9 * expected.abs());
}

#[test]
fn rate_errors() {
    let no_fy = FOUR_PANEL.replace("fy: 33.0, ", "");
    let path = temp_model("no-fy.ron", &no_fy);
    let (code, _, err) = run(&["rate", path.to_str().unwrap()]);
    assert_eq!(code, 2);
    assert!(err.contains("material \"steel\" has no fy"), "{err}");
    let path = temp_model("curve.ron", FOUR_PANEL);
    let (code, _, err) = run(&["rate", path.to_str().unwrap(), "--method", "perry"]);
    assert_eq!(code, 2);
    assert!(err.contains("\"perry\" is not a rating method"), "{err}");
    let bad_combo = FOUR_PANEL.replace(
        "    ],\n)",
        "    ],\n    combinations: [(id: \"c\", factors: [(\"wind\", 1.0)])],\n)",
    );
    let path = temp_model("combo-bad.ron", &bad_combo);
    let (code, _, err) = run(&["validate", path.to_str().unwrap()]);
    assert_eq!(code, 2);
    assert!(
        err.contains("load case \"wind\", which is not defined"),
        "{err}"
    );
}

/// Model-wide method parameters: γM1 divides the EN 1993 resistance
/// (EN 1993-1-1 Eq. 6.47, Nb,Rd = χ·A·fy/γM1; the default 1.10 is EN 1993-2
/// §6.1's recommendation for bridges, from memory), and the net-to-gross
/// ratio feeds the fracture check (AISC 360-16 Eq. D2-2, φt·Fu·Ae, φt = 0.75).
#[test]
fn model_parameters_and_tension() {
    let base = rate_json(
        &FOUR_PANEL.replace("    ],\n)", "    ],\n    rating: (gamma_m1: 1.0),\n)"),
        "en1993-c",
    );
    let factored = rate_json(FOUR_PANEL, "en1993-c");

    let cap = |v: &serde_json::Value| {
        v["checks"]
            .as_array()
            .unwrap()
            .iter()
            .find(|c| c["member"] == "U1-U2")
            .unwrap()["capacity"]
            .as_f64()
            .unwrap()
    };
    assert!(
        (cap(&base) / cap(&factored) - 1.1).abs() < 1e-12,
        "{} {}",
        cap(&base),
        cap(&factored)
    );
    // Web net area 0.5·6.2 in²: fracture 0.75·60·3.1 = 139.5 kip governs over
    // yield 0.9·33·6.2 = 184.14 kip.
    let net = FOUR_PANEL.replace(
        "(id: \"web\", area: 6.2,",
        "(id: \"web\", net_ratio: 0.5, area: 6.2,",
    );
    let v = rate_json(&net, "aisc360");
    let c = v["checks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["member"] == "L1-U1" && c["case"] == "dead")
        .unwrap();
    assert!((c["capacity"].as_f64().unwrap() - 139.5).abs() < 1e-9);
    assert_eq!(c["regime"], "tension");
    // 9 kip in the hanger L1-U1 (joint L1, statics).
    assert!((c["utilization"].as_f64().unwrap() - 9.0 / 139.5).abs() < 1e-9);
}

/// A moving load rated by hand: one 10 kip axle with 10 % impact rolled
/// along the bottom chord of the example. The end post L0-U1 is worst with
/// the axle at L1: R0 = 3/4 of the axle (lever rule), so L = −0.75·11·l/16
/// kip (method of joints at L0, l = √(18² + 16²) ft); D = −13.5·l/16 from the
/// dead case; LRFR inventory RF = (φPn − 1.25·|D|)/(1.75·|L|) with Pn by
/// AASHTO LRFD Eq. 6.9.4.1.1-1 (the AISC E3-2 curve) and φc = 0.95.
#[test]
fn moving_load_rating_by_hand() {
    let text = FOUR_PANEL
        .replace("(id: \"dead\", loads:", "(id: \"dead\", kind: Dead, loads:")
        .replace(
            "    ],\n)",
            "    ],\n    deck: [\"L0\", \"L1\", \"L2\", \"L3\", \"L4\"],\n    vehicles: [(id: \"axle\", axles: [(load: \"10 kip\")])],\n    moving_loads: [(id: \"roll\", vehicle: \"axle\", step: \"0.5 ft\", impact: 0.10)],\n)",
        );
    let v = rate_json(&text, "lrfr");
    let l = (18.0f64 * 18.0 + 16.0 * 16.0).sqrt();
    let live = 0.75 * 11.0 * l / 16.0;
    let d = 13.5 * l / 16.0;
    let klr = l * 12.0 / (310.0f64 / 14.7).sqrt();
    let fe = PI * PI * 29000.0 / (klr * klr);
    let phi_pn = 0.95 * 0.658f64.powf(33.0 / fe) * 33.0 * 14.7;
    let rf = (phi_pn - 1.25 * d) / (1.75 * live);
    let r = v["ratings"]
        .as_array()
        .unwrap()
        .iter()
        .find(|r| r["member"] == "L0-U1" && r["live_case"] == "roll" && r["level"] == "inventory")
        .unwrap();
    assert!(
        (r["live_with_impact"].as_f64().unwrap() + live).abs() < 1e-9,
        "{r}"
    );
    assert!((r["rf"].as_f64().unwrap() - rf).abs() < 1e-9 * rf, "{r}");
    assert!(r["position"].as_str().unwrap().contains("18.00 ft"), "{r}");
    // The check row holds dead + live: −(13.5 + 8.25)·l/16.
    let c = v["checks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| {
            c["member"] == "L0-U1" && c["case"] == "dead + roll (placed for greatest compression)"
        })
        .unwrap();
    assert!((c["force"].as_f64().unwrap() + (d + live)).abs() < 1e-9);
}
