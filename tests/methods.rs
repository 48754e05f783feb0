//! Rating methods (LRFR, LFR, ASR, design codes, screening) against their
//! equations worked by hand, each value's source named beside it: the
//! permanent-load factor taken at its minimum where the dead load relieves
//! (stress reversal), the φc·φs floor, allowable-stress levels, load factor
//! rating, legal loads and posting, steel of unknown grade by year, shear
//! lag and holes, and the replaced `curve` field.

mod common;
use common::*;
use std::f64::consts::PI;

fn rate_json_with(text: &str, args: &[&str]) -> serde_json::Value {
    let path = temp_model("methods.ron", text);
    let mut all = vec!["rate", path.to_str().unwrap(), "--format", "json"];
    all.extend_from_slice(args);
    let (code, out, err) = run(&all);
    assert_eq!(code, 0, "{err}");
    serde_json::from_str(&out).unwrap()
}

fn rating<'a>(
    v: &'a serde_json::Value,
    member: &str,
    live: &str,
    level: &str,
) -> &'a serde_json::Value {
    v["ratings"]
        .as_array()
        .unwrap()
        .iter()
        .find(|r| r["member"] == member && r["live_case"] == live && r["level"] == level)
        .unwrap_or_else(|| panic!("no rating {member} {live} {level}"))
}

fn f(v: &serde_json::Value, k: &str) -> f64 {
    v[k].as_f64().unwrap_or_else(|| panic!("{k} in {v}"))
}

/// The example with kinds: dead (DC), crowd live with 10 % impact.
fn four_panel_rated(rating: &str) -> String {
    FOUR_PANEL
        .replace("(id: \"dead\", loads:", "(id: \"dead\", kind: Dead, loads:")
        .replace(
            "(id: \"crowd\", loads:",
            "(id: \"crowd\", kind: Live, impact: 0.10, loads:",
        )
        .replace("    ],\n)", &format!("    ],\n    rating: {rating},\n)"))
}

/// End post L0-U1 of the example (method of joints, l = √(18² + 16²) ft):
/// D = −13.5·l/16, L·(1 + I) = −18.75·l/16·1.1, KL/r = l·12/√(310/14.7).
fn end_post() -> (f64, f64, f64) {
    let l = (18.0f64 * 18.0 + 16.0 * 16.0).sqrt();
    (
        13.5 * l / 16.0,
        18.75 * l / 16.0 * 1.1,
        l * 12.0 / (310.0f64 / 14.7).sqrt(),
    )
}

/// Johnson–Euler curve (the Standard Specifications' column formula before
/// its factor, from memory): Fy[1 − Fy(KL/r)²/(4π²E)] to √(2π²E/Fy).
fn johnson(fy: f64, e: f64, klr: f64) -> f64 {
    if klr <= (2.0 * PI * PI * e / fy).sqrt() {
        fy * (1.0 - fy * klr * klr / (4.0 * PI * PI * e))
    } else {
        PI * PI * e / (klr * klr)
    }
}

/// Demo diagonal L3-U4 under LRFR: the deck's dead load puts it in tension
/// (+3.714 kip: panel shear 14.5 − 3·5.8 = 2.9 kip over sin θ = 20/25.61,
/// statics by hand) while the truck compresses it, so γDC = 0.90 (AASHTO
/// LRFD 3.4.1, Table 3.4.1-2) and not 1.25. Capacity by hand: KL/r =
/// 307.35/√(4.5/3.4) = 267.15, Fe = π²·29000/267.15² = 4.0105 ksi, Fcr =
/// 0.877·Fe (LRFD Eq. 6.9.4.1.1-2), C = φc·φs·φ·Fcr·A with the demo's
/// condition factor 0.95, system factor 1.0, φc = 0.95 and A = 3.4 in².
#[test]
fn stress_reversal_takes_the_minimum_dead_factor() {
    let text = std::fs::read_to_string(
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models/millrace-footbridge.ron"),
    )
    .unwrap();
    let v = rate_json_with(&text, &["--method", "lrfr"]);
    assert_eq!(v["method"], "lrfr");
    let r = rating(&v, "L3-U4", "truck", "inventory");
    assert_eq!(r["gamma_dead"], 0.9, "{r}");
    let dead = f(r, "dead");
    let panel_shear: f64 = 14.5 - 3.0 * 5.8;
    let sin = 20.0 / (16.0f64 * 16.0 + 20.0 * 20.0).sqrt();
    assert!((dead - panel_shear.abs() / sin).abs() < 1e-9, "dead {dead}");
    let klr = (16.0f64 * 16.0 + 20.0 * 20.0).sqrt() * 12.0 / (4.5f64 / 3.4).sqrt();
    let fe = PI * PI * 29000.0 / (klr * klr);
    let c = 0.95 * 0.95 * 0.877 * fe * 3.4;
    assert!((f(r, "capacity") - c).abs() < 1e-9 * c, "{r}");
    let live = f(r, "live_with_impact");
    assert!(live < 0.0);
    let rf = (c + 0.90 * dead) / (1.75 * live.abs());
    assert!((f(r, "rf") - rf).abs() < 1e-9 * rf, "{r}");
    // With the maximum factor the factor would be higher (unconservative).
    assert!(rf < (c + 1.25 * dead) / (1.75 * live.abs()));
    // The controlling member at inventory is named, with γDC = 0.90.
    let by_level = v["controlling_by_level"].as_array().unwrap();
    assert_eq!(by_level[0]["level"], "inventory");
    assert!(["L3-U4", "U2-L3"].contains(&by_level[0]["member"].as_str().unwrap()));
}

/// MBE Eq. 6A.4.2.1-3 (from memory): φc·φs ≥ 0.85; 0.85 × 0.85 = 0.7225 is
/// raised to 0.85.
#[test]
fn condition_and_system_floor() {
    let v = rate_json_with(
        &four_panel_rated("(method: \"lrfr\", condition_factor: 0.85, system_factor: 0.85)"),
        &[],
    );
    let (d, live, klr) = end_post();
    let fe = PI * PI * 29000.0 / (klr * klr);
    let pn = 0.658f64.powf(33.0 / fe) * 33.0 * 14.7; // LRFD Eq. 6.9.4.1.1-1
    let r = rating(&v, "L0-U1", "crowd", "inventory");
    assert_eq!(r["phi_cs"], 0.85);
    assert_eq!(r["phi_c"], 0.85);
    assert_eq!(r["phi_s"], 0.85);
    let c = 0.85 * 0.95 * pn;
    assert!((f(r, "capacity") - c).abs() < 1e-9 * c);
    let rf = (c - 1.25 * d) / (1.75 * live);
    assert!((f(r, "rf") - rf).abs() < 1e-9 * rf);
}

/// MBE Part B allowable stress rating (from memory): RF = (C − D)/(L(1 + I)),
/// C = Fa·A with Fa = Johnson/FS, FS = 2.12 inventory, 1.70 operating; no
/// condition or system factor even when the model gives one.
#[test]
fn allowable_stress_rating_by_hand() {
    let v = rate_json_with(
        &four_panel_rated("(method: \"asr\", condition_factor: 0.85)"),
        &[],
    );
    let (d, live, klr) = end_post();
    let fcr = johnson(33.0, 29000.0, klr);
    for (level, fs) in [("inventory", 2.12), ("operating", 1.70)] {
        let r = rating(&v, "L0-U1", "crowd", level);
        let c = fcr / fs * 14.7;
        assert!((f(r, "capacity") - c).abs() < 1e-9 * c, "{level} {r}");
        let rf = (c - d) / live;
        assert!((f(r, "rf") - rf).abs() < 1e-9 * rf, "{level} {r}");
        assert_eq!(r["phi_cs"], 1.0);
        assert_eq!(r["gamma_dead"], 1.0);
    }
    // Tension: 0.55·Fy·Ag inventory, 0.75·Fy·Ag operating (hanger L1-U1,
    // yield governs over 0.50·Fu·An = 186 kip on the gross web area).
    let r = rating(&v, "L1-U1", "crowd", "inventory");
    assert!((f(r, "capacity") - 0.55 * 33.0 * 6.2).abs() < 1e-9);
    let r = rating(&v, "L1-U1", "crowd", "operating");
    assert!((f(r, "capacity") - 0.75 * 33.0 * 6.2).abs() < 1e-9);
}

/// MBE Part B load factor rating (from memory): RF = (C − A1·D)/(A2·L(1 + I)),
/// A1 = 1.3, A2 = 2.17 / 1.3; C = 0.85·As·Fcr with the Johnson formula
/// (Standard Specifications 10.54.1.1, from memory).
#[test]
fn load_factor_rating_by_hand() {
    let v = rate_json_with(&four_panel_rated("(method: \"lfr\")"), &[]);
    let (d, live, klr) = end_post();
    let c = 0.85 * johnson(33.0, 29000.0, klr) * 14.7;
    for (level, a2) in [("inventory", 2.17), ("operating", 1.3)] {
        let r = rating(&v, "L0-U1", "crowd", level);
        let rf = (c - 1.3 * d) / (a2 * live);
        assert!((f(r, "rf") - rf).abs() < 1e-9 * rf, "{level} {r}");
    }
}

/// A design code keeps its own load factors: AISC 360 with ASCE 7's
/// 1.2·D + 1.6·L (from memory), φc = 0.90.
#[test]
fn design_code_uses_its_own_load_factors() {
    let v = rate_json_with(&four_panel_rated("(method: \"aisc360\")"), &[]);
    let (d, live, klr) = end_post();
    let fe = PI * PI * 29000.0 / (klr * klr);
    let c = 0.90 * 0.658f64.powf(33.0 / fe) * 33.0 * 14.7;
    let r = rating(&v, "L0-U1", "crowd", "design");
    let rf = (c - 1.2 * d) / (1.6 * live);
    assert!((f(r, "rf") - rf).abs() < 1e-9 * rf, "{r}");
    // Allowable-stress AISC: Rn/Ωc against D + L.
    let v = rate_json_with(&four_panel_rated("(method: \"aisc360-asd\")"), &[]);
    let r = rating(&v, "L0-U1", "crowd", "design");
    let c = 0.658f64.powf(33.0 / fe) * 33.0 * 14.7 / 1.67;
    let rf = (c - d) / live;
    assert!((f(r, "rf") - rf).abs() < 1e-9 * rf, "{r}");
}

/// Screening curves give no rating factor without a safety factor, and
/// RF = (Pn/FS − D)/L with one.
#[test]
fn screening_needs_a_safety_factor() {
    let v = rate_json_with(&four_panel_rated("(method: \"johnson\")"), &[]);
    assert!(v["ratings"].as_array().unwrap().is_empty());
    assert!(v["notes"].to_string().contains("safety_factor"));
    let v = rate_json_with(
        &four_panel_rated("(method: \"johnson\", safety_factor: 2.0)"),
        &[],
    );
    let (d, live, klr) = end_post();
    let c = johnson(33.0, 29000.0, klr) * 14.7 / 2.0;
    let r = rating(&v, "L0-U1", "crowd", "screening");
    let rf = (c - d) / live;
    assert!((f(r, "rf") - rf).abs() < 1e-9 * rf, "{r}");
}

/// A legal moving load is rated at the legal level (γL = 1.45 for an
/// unknown ADTT, MBE Table 6A.4.4.2.3a-1, from memory) and posted by MBE
/// Eq. 6A.8.3-1: W/0.7·(RF − 0.3) for 0.3 ≤ RF < 1.0.
#[test]
fn legal_load_and_posting() {
    // One 50 kip axle (W = 50 kip = 25 tons) on the example's bottom chord.
    let text = four_panel_rated("(method: \"lrfr\")").replace(
        "    rating:",
        "    deck: [\"L0\", \"L1\", \"L2\", \"L3\", \"L4\"],\n    vehicles: [(id: \"legal\", axles: [(load: \"50 kip\")])],\n    moving_loads: [(id: \"posting\", vehicle: \"legal\", step: \"1 ft\", impact: 0.0, legal: true)],\n    rating:",
    );
    let v = rate_json_with(&text, &[]);
    let rows: Vec<_> = v["ratings"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|r| r["live_case"] == "posting")
        .collect();
    assert!(!rows.is_empty());
    assert!(rows
        .iter()
        .all(|r| r["level"] == "legal" && r["gamma_live"] == 1.45));
    let low = rows
        .iter()
        .map(|r| f(r, "rf"))
        .fold(f64::INFINITY, f64::min);
    let p = &v["postings"][0];
    assert_eq!(p["vehicle"], "posting");
    assert!((f(p, "weight") - 50.0).abs() < 1e-12);
    assert!((f(p, "weight_tons") - 25.0).abs() < 1e-9, "{p}");
    assert!((f(p, "rf") - low).abs() < 1e-12);
    if (0.3..1.0).contains(&low) {
        let post = 50.0 / 0.7 * (low - 0.3);
        assert!((f(p, "posting") - post).abs() < 1e-9 * post, "{p}");
    } else if low >= 1.0 {
        assert!(p["posting"].is_null());
    } else {
        assert_eq!(p["restrict_or_close"], true);
    }
    // A heavier axle (300 kip) lowers RF below 1: the posting follows Eq. 6A.8.3-1.
    let heavy = text.replace("\"50 kip\"", "\"300 kip\"");
    let v = rate_json_with(&heavy, &[]);
    let p = &v["postings"][0];
    let rf = f(p, "rf");
    assert!(rf < 1.0, "{p}");
    if rf >= 0.3 {
        assert!((f(p, "posting") - 300.0 / 0.7 * (rf - 0.3)).abs() < 1e-9 * 300.0);
    } else {
        assert_eq!(p["restrict_or_close"], true);
    }
}

/// Steel of unknown grade by year (MBE Table 6A.6.2.1-1, from memory):
/// built 1912 → Fy 30 ksi, Fu 60 ksi; hanger tension capacity 0.95·30·6.2.
#[test]
fn steel_of_unknown_grade_by_year() {
    let text = four_panel_rated("(method: \"lrfr\")").replace(
        "(id: \"steel\", e: 29000.0, fy: 33.0, fu: 60.0)",
        "(id: \"steel\", e: 29000.0, year: 1912)",
    );
    let v = rate_json_with(&text, &[]);
    let r = rating(&v, "L1-U1", "crowd", "inventory");
    assert_eq!(r["governs"], "tension yield");
    assert!((f(r, "capacity") - 0.95 * 30.0 * 6.2).abs() < 1e-9, "{r}");
    assert!(v["notes"].to_string().contains("1912"));
}

/// Shear lag and holes (AASHTO LRFD 6.8.2.1, from memory): fracture
/// φu·Fu·An·Rp·U with φu = 0.80. Web net area 0.5·6.2 = 3.1 in²:
/// U = 0.8, drilled holes: 0.80·60·3.1·0.8 = 119.04 kip < 0.95·33·6.2 =
/// 194.37; punched (Rp = 0.90, also the default when not stated): 107.136.
#[test]
fn shear_lag_and_punched_holes() {
    let base = four_panel_rated("(method: \"lrfr\")");
    let with = |extra: &str| {
        base.replace(
            "(id: \"web\", area: 6.2,",
            &format!("(id: \"web\", net_ratio: 0.5, {extra} area: 6.2,"),
        )
    };
    let cap = |text: &str| {
        let v = rate_json_with(text, &[]);
        f(rating(&v, "L1-U1", "crowd", "inventory"), "capacity")
    };
    assert!((cap(&with("shear_lag: 0.8, holes_punched: false,")) - 119.04).abs() < 1e-9);
    assert!((cap(&with("shear_lag: 0.8, holes_punched: true,")) - 107.136).abs() < 1e-9);
    assert!((cap(&with("shear_lag: 0.8,")) - 107.136).abs() < 1e-9);
    // U = 1 − x̄/L (AASHTO LRFD Table 6.8.2.2-1): x̄ = 1.2 in, L = 6 in → 0.8.
    assert!(
        (cap(&with(
            "shear_lag: (length: 6.0, eccentricity: 1.2), holes_punched: false,"
        )) - 119.04)
            .abs()
            < 1e-9
    );
    // The default U and Rp are said in the notes.
    let v = rate_json_with(&base, &[]);
    let notes = v["notes"].to_string();
    assert!(notes.contains("U = 1.0 taken"), "{notes}");
    assert!(notes.contains("Rp = 0.90"), "{notes}");
}

/// Old models that name `curve` get a message saying what replaced it; an
/// unknown method is refused; `bridge-asd` points to `asr`.
#[test]
fn replaced_curve_and_unknown_methods() {
    let text = FOUR_PANEL.replace(
        "    ],\n)",
        "    ],\n    rating: (curve: \"bridge-asd\"),\n)",
    );
    let path = temp_model("old-curve.ron", &text);
    let (code, _, err) = run(&["rate", path.to_str().unwrap()]);
    assert_eq!(code, 2);
    assert!(
        err.contains("rating.curve is replaced by rating.method"),
        "{err}"
    );
    assert!(err.contains("method: \"asr\""), "{err}");
    let path = temp_model("m.ron", FOUR_PANEL);
    let (code, _, err) = run(&["rate", path.to_str().unwrap(), "--method", "bridge-asd"]);
    assert_eq!(code, 2);
    assert!(err.contains("\"asr\""), "{err}");
}

/// Lacing bars get rows of their own (AISC 360-16 §E6.2): V is 2 % of the
/// member's available compressive strength C (the capacity of its
/// compression checks), not of the demand.
#[test]
fn lacing_bars_have_rows_of_their_own() {
    let text = std::fs::read_to_string(
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models/millrace-footbridge.ron"),
    )
    .unwrap();
    let v = rate_json_with(&text, &[]);
    let rows = v["lacing_bars"].as_array().unwrap();
    assert_eq!(rows.len(), 6, "top chords and end posts");
    for r in rows {
        let member = r["member"].as_str().unwrap();
        let c = v["checks"]
            .as_array()
            .unwrap()
            .iter()
            .find(|c| c["member"] == member && c["force"].as_f64().unwrap() < 0.0)
            .unwrap();
        let cap = f(c, "capacity");
        assert!((f(r, "shear") - 0.02 * cap).abs() < 1e-9 * cap, "{r}");
        assert_eq!(r["clause"], "AISC 360-16 §E6.2");
    }
}

/// The owner's report shows the same lacing-bar checks as `rate` (AISC
/// 360-16 §E6.2), with the clause in each row: V, the bar force and the
/// bar strength equal the JSON rows to the 4 significant digits shown.
#[test]
fn lacing_bars_in_the_html_report() {
    let path =
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models/millrace-footbridge.ron");
    let text = std::fs::read_to_string(&path).unwrap();
    let v = rate_json_with(&text, &[]);
    let dir = temp_model("lacing.ron", &text);
    let out = dir.with_file_name("lacing.html");
    let (code, _, err) = run(&["report", dir.to_str().unwrap(), "-o", out.to_str().unwrap()]);
    assert_eq!(code, 0, "{err}");
    let html = std::fs::read_to_string(out).unwrap();
    let start = html
        .find("<h3>Lacing bars</h3>")
        .expect("a lacing-bar table");
    let table = &html[start..start + html[start..].find("</table>").unwrap()];
    let body = &table[table.find("<tbody>").unwrap()..];
    let rows: Vec<&str> = body.split("<tr").skip(1).collect();
    let json = v["lacing_bars"].as_array().unwrap();
    assert_eq!(rows.len(), json.len());
    assert_eq!(rows.len(), 6, "top chords and end posts");
    for (row, r) in rows.iter().zip(json) {
        let cells: Vec<&str> = row
            .split("<td")
            .skip(1)
            .map(|c| {
                let c = &c[c.find('>').unwrap() + 1..];
                &c[..c.find("</td>").unwrap()]
            })
            .collect();
        assert_eq!(cells[0], r["member"].as_str().unwrap());
        for (i, k) in [(1, "shear"), (2, "bar_force"), (3, "bar_strength")] {
            let shown: f64 = cells[i].parse().unwrap();
            let want = f(r, k);
            assert!(
                (shown - want).abs() <= 1e-3 * want.abs(),
                "{k}: {shown} vs {want}"
            );
        }
        assert!(cells[10].contains("AISC 360-16 §E6.2"), "{}", cells[10]);
    }
}
