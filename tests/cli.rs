//! The command line as a user meets it: every bad-input case of the core
//! schema exits 2 with a message naming the problem and its place, and the
//! good paths write text, JSON and CSV.

mod common;
use common::*;

/// (what is broken, edit to the example, text the message must contain).
fn bad_cases() -> Vec<(&'static str, String, &'static str)> {
    let f = FOUR_PANEL;
    vec![
        ("syntax", f.replace("(id: \"L1\", x: 18.0, y: 0.0),", "(id: \"L1\", x: 18.0 y: 0.0),"), "line 14, column"),
        ("unknown field", f.replace("(id: \"L1\", x: 18.0, y: 0.0)", "(id: \"L1\", x: 18.0, y: 0.0, z: 1.0)"), "z"),
        ("duplicate node", f.replace("(id: \"U3\", x: 54.0, y: 16.0)", "(id: \"U2\", x: 54.0, y: 16.0)"), "duplicate node id \"U2\""),
        ("duplicate member", f.replace("(id: \"L3-L4\",", "(id: \"L2-L3\","), "duplicate member id \"L2-L3\""),
        ("missing node", f.replace("start: \"L3\", end: \"L4\"", "start: \"L3\", end: \"L9\""), "node \"L9\", which is not defined"),
        ("missing section", f.replace("(id: \"L1-U1\", start: \"L1\", end: \"U1\", section: \"web\"", "(id: \"L1-U1\", start: \"L1\", end: \"U1\", section: \"webb\""), "section \"webb\""),
        ("missing material", f.replace("(id: \"L0-L1\", start: \"L0\", end: \"L1\", section: \"chord\", material: \"steel\")", "(id: \"L0-L1\", start: \"L0\", end: \"L1\", section: \"chord\", material: \"iron\")"), "material \"iron\""),
        ("zero length", f.replace("(id: \"L2-U2\", start: \"L2\", end: \"U2\"", "(id: \"L2-U2\", start: \"L2\", end: \"L2\""), "member \"L2-U2\" starts and ends at the same node"),
        ("coincident nodes", f.replace("(id: \"U3\", x: 54.0, y: 16.0)", "(id: \"U3\", x: 36.0, y: 16.0)"), "are at the same place"),
        ("zero E", f.replace("e: 29000.0", "e: 0.0"), "material \"steel\" e must be positive"),
        ("negative area", f.replace("area: 6.2", "area: -6.2"), "section \"web\" area must be positive"),
        ("zero second moment", f.replace("i_out: 355.0", "i_out: 0"), "section \"chord\" i_out must be positive"),
        ("NaN", f.replace("x: 18.0, y: 0.0", "x: NaN, y: 0.0"), "node \"L1\" x"),
        ("infinite text", f.replace("x: 18.0, y: 0.0", "x: \"inf ft\", y: 0.0"), "node \"L1\" x"),
        ("load on missing node", f.replace("(node: \"L1\", fy: -9.0)", "(node: \"L7\", fy: -9.0)"), "node \"L7\", which is not defined"),
        ("no supports", f.replace("(node: \"L0\", kind: Pin),", "").replace("(node: \"L4\", kind: Roller),", ""), "no supports"),
        ("wrong dimension", f.replace("e: 29000.0", "e: \"29000 ft\""), "a length, but a stress is expected"),
        ("unknown unit", f.replace("e: 29000.0", "e: \"29000 kilopond\""), "unknown unit \"kilopond\""),
        ("bad units block", f.replace("length: \"ft\"", "length: \"kip\""), "units.length"),
        ("mechanism", f.replace("(id: \"U1-L2\", start: \"U1\", end: \"L2\", section: \"web\", material: \"steel\"),", ""), "mechanism: node"),
        ("mechanism by roller", f.replace("(node: \"L0\", kind: Pin)", "(node: \"L0\", kind: Roller)"), "free to move in x"),
    ]
}

#[test]
fn bad_input_exits_2_with_a_clear_message() {
    for (what, text, needle) in bad_cases() {
        assert_ne!(text, FOUR_PANEL, "{what}: the edit did not apply");
        let path = temp_model(&format!("bad-{}.ron", what.replace(' ', "-")), &text);
        for cmd in ["validate", "solve"] {
            let (code, out, err) = run(&[cmd, path.to_str().unwrap()]);
            assert_eq!(code, 2, "{what} ({cmd}): exit {code}, stderr {err}");
            assert!(
                err.contains(needle),
                "{what} ({cmd}): {err:?} lacks {needle:?}"
            );
            assert!(err.starts_with("panelpoint: error: "), "{what}: {err}");
            assert!(!err.contains("panicked"), "{what}: {err}");
            assert!(what == "NaN" || !err.contains("NaN"), "{what}: {err}");
            assert!(
                out.is_empty(),
                "{what}: no partial output on error, got {out}"
            );
        }
    }
}

#[test]
fn all_errors_are_listed_together() {
    let text = FOUR_PANEL
        .replace("e: 29000.0", "e: -1.0")
        .replace("start: \"L3\", end: \"L4\"", "start: \"L3\", end: \"L9\"");
    let path = temp_model("two-errors.ron", &text);
    let (code, _, err) = run(&["validate", path.to_str().unwrap()]);
    assert_eq!(code, 2);
    assert!(
        err.contains("e must be positive") && err.contains("\"L9\""),
        "{err}"
    );
    assert!(err.contains("line "), "locations given: {err}");
}

#[test]
fn warnings_for_isolated_nodes_and_crossings() {
    let text = FOUR_PANEL.replace(
        "(id: \"U3\", x: 54.0, y: 16.0),",
        "(id: \"U3\", x: 54.0, y: 16.0),\n        (id: \"X\", x: 90.0, y: 5.0),",
    );
    let path = temp_model("isolated.ron", &text);
    let (code, out, err) = run(&["solve", path.to_str().unwrap()]);
    assert_eq!(code, 0, "{err}");
    assert!(
        out.contains("warning: line") && out.contains("node \"X\" has no member"),
        "{out}"
    );
    let (code, _, err) = run(&["validate", path.to_str().unwrap()]);
    assert_eq!(code, 0);
    assert!(err.contains("warning") && err.contains("\"X\""), "{err}");
}

/// `solve` runs the crossing-members check beside the analysis; its
/// warnings must still reach both reports, after the loader's others, as
/// `validate` (which loads in one go) gives them.
#[test]
fn crossing_warnings_reach_solve_reports_in_order() {
    let text = FOUR_PANEL
        .replace(
            "(id: \"U3\", x: 54.0, y: 16.0),",
            "(id: \"U3\", x: 54.0, y: 16.0),\n        (id: \"X\", x: 90.0, y: 5.0),",
        )
        .replace(
            "(id: \"L2-U3\", start: \"L2\", end: \"U3\", section: \"web\", material: \"steel\"),",
            "(id: \"L2-U3\", start: \"L2\", end: \"U3\", section: \"web\", material: \"steel\"),\n\
             (id: \"U2-L3\", start: \"U2\", end: \"L3\", section: \"web\", material: \"steel\"),",
        );
    let path = temp_model("crossing.ron", &text);
    let p = path.to_str().unwrap();
    let (code, out, err) = run(&["solve", p, "--format", "json"]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let w: Vec<String> = v["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .map(|w| w.to_string())
        .collect();
    let isolated = w
        .iter()
        .position(|m| m.contains("node \\\"X\\\" has no member"));
    let crossing = w
        .iter()
        .position(|m| m.contains("cross without a shared node"));
    assert!(
        matches!((isolated, crossing), (Some(i), Some(c)) if i < c),
        "{w:?}"
    );
    let (code, out, _) = run(&["solve", p]);
    assert_eq!(code, 0);
    assert!(out.contains("cross without a shared node"), "{out}");
    let (_, _, err) = run(&["validate", p]);
    let i = err.find("has no member").unwrap();
    let c = err.find("cross without a shared node").unwrap();
    assert!(i < c, "{err}");
}

#[test]
fn missing_file_and_usage() {
    let (code, _, err) = run(&["solve", "/nonexistent/model.ron"]);
    assert_eq!(code, 2);
    assert!(err.contains("cannot read /nonexistent/model.ron"), "{err}");
    let (code, _, _) = run(&["frobnicate"]);
    assert_eq!(code, 2);
}

#[test]
fn formats_agree() {
    let path = temp_model("four.ron", FOUR_PANEL);
    let p = path.to_str().unwrap();
    let (code, json, _) = run(&["solve", p, "--format", "json"]);
    assert_eq!(code, 0);
    let v: serde_json::Value = serde_json::from_str(&json).unwrap();
    assert_eq!(v["units"]["force"], "kip");
    let dead = &v["cases"][0];
    assert_eq!(dead["id"], "dead");
    let l0l1 = &dead["members"][0];
    assert_eq!(l0l1["id"], "L0-L1");
    // 13.5 kip · 18/16 (method of joints at L0) and /14.7 in².
    assert!((l0l1["force"].as_f64().unwrap() - 15.1875).abs() < 1e-9);
    assert!((l0l1["stress"].as_f64().unwrap() - 15.1875 / 14.7).abs() < 1e-9);
    assert!((dead["reactions"][0]["ry"].as_f64().unwrap() - 13.5).abs() < 1e-9);
    let (code, csv, _) = run(&["solve", p, "--format", "csv"]);
    assert_eq!(code, 0);
    assert!(csv.starts_with("case,kind,id,ux_in,uy_in,rx_kip,ry_kip,force_kip,stress_ksi\n"));
    let row = csv
        .lines()
        .find(|l| l.starts_with("dead,member,L0-L1,"))
        .unwrap();
    let force: f64 = row.split(',').nth(7).unwrap().parse().unwrap();
    assert!((force - 15.1875).abs() < 1e-9);
    let (code, text, _) = run(&["solve", p]);
    assert_eq!(code, 0);
    assert!(text.contains("force kip") && text.contains("CAUTION"));
    assert!(text.contains("statically determinate"));
}

#[test]
fn out_is_atomic() {
    let dir = std::env::temp_dir().join(format!("pp-out-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let target = dir.join("result.json");
    std::fs::write(&target, "precious").unwrap();
    let bad = temp_model("bad-for-out.ron", &FOUR_PANEL.replace("e: 29000.0", "e: 0"));
    let (code, _, _) = run(&[
        "solve",
        bad.to_str().unwrap(),
        "--format",
        "json",
        "--out",
        target.to_str().unwrap(),
    ]);
    assert_eq!(code, 2);
    assert_eq!(std::fs::read_to_string(&target).unwrap(), "precious");
    let good = temp_model("good-for-out.ron", FOUR_PANEL);
    let (code, _, _) = run(&[
        "solve",
        good.to_str().unwrap(),
        "--format",
        "json",
        "--out",
        target.to_str().unwrap(),
    ]);
    assert_eq!(code, 0);
    assert!(std::fs::read_to_string(&target).unwrap().starts_with('{'));
    assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 1);
}

/// The condition estimate's warning reaches every format: JSON's warnings
/// (last, after the loader's and the layout warnings), the text report, and
/// for CSV, which carries numbers only, stderr. Model: `skew_apex_triangle`
/// (κ ≳ 1/θ² ≈ 4e8 by hand geometry, above the 1e8 warning limit).
#[test]
fn condition_warning_reaches_json_last_and_csv_stderr() {
    // `rate` needs the tensile strength too (a round value for mild steel).
    let text = skew_apex_triangle().replace("fy: 250.0)", "fy: 250.0, fu: 400.0)");
    let path = temp_model("skew_apex.ron", &text);
    let p = path.to_str().unwrap();
    let (code, out, err) = run(&["solve", p, "--format", "json"]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let w = v["warnings"].as_array().unwrap();
    let last = w.last().unwrap().as_str().unwrap();
    assert!(last.contains("condition estimate"), "{w:?}");
    assert!(v["cases"].as_array().is_some_and(|c| !c.is_empty()));
    let (_, text_out, _) = run(&["solve", p]);
    assert!(text_out.contains(last), "{text_out}");
    let (code, csv, err) = run(&["solve", p, "--format", "csv"]);
    assert_eq!(code, 0);
    assert!(err.contains("condition estimate"), "{err}");
    assert!(!csv.contains("condition estimate"));
    let (code, _, err) = run(&["rate", p, "--format", "csv"]);
    assert_eq!(code, 0, "{err}");
    assert!(err.contains("condition estimate"), "{err}");
}
