//! Error and warning messages in the model's own words (issue 21, defects
//! 8, 9 and 10): the model's units, numbers without float noise, parts
//! counted from one with their labels, one message per mistake, every
//! unknown field in one pass, and no internal type names.

mod common;
use common::*;

fn validate(name: &str, text: &str) -> (i32, String) {
    let path = temp_model(name, text);
    let (code, _, err) = run(&["validate", path.to_str().unwrap()]);
    (code, err)
}

/// A 1.5 in thickness loss on a 1.0 in bar, the third part, labelled
/// "bar 3": the loss consumes the bar (1.5 ≥ 1.0), an error told in inches.
#[test]
fn thickness_loss_message_in_model_units_with_label() {
    let chord = r#"(id: "x", parts: [
    Plate(width: 14.0, thickness: 0.5, x: 0.0, y: 6.25),
    Plate(width: 10.0, thickness: 1.0, x: 0.0, y: 0.0),
    Plate(width: 4.0, thickness: 1.0, x: 0.0, y: -3.0, label: "bar 3", loss: Thickness(1.5)),
])"#;
    let text = FOUR_PANEL
        .replace(
            "(id: \"chord\", area: 14.7, i_in: 310.0, i_out: 355.0)",
            chord,
        )
        .replace("section: \"chord\"", "section: \"x\"");
    let (code, err) = validate("loss.ron", &text);
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains(
            "section \"x\", part 3 (\"bar 3\"): thickness loss 1.5 in is not less than the thickness 1.0 in"
        ),
        "{err}"
    );
    assert!(!err.contains("0.0381") && !err.contains("0.0254"), "{err}");
}

/// A misspelt vehicle id is one mistake: one message, and no second one
/// about the combination that names the moving load.
#[test]
fn misspelt_vehicle_gives_one_message() {
    let demo = std::fs::read_to_string(
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models/millrace-footbridge.ron"),
    )
    .unwrap();
    let bad = demo.replace(
        "vehicle: \"maintenance-truck\"",
        "vehicle: \"maintenance-truk\"",
    );
    assert_ne!(bad, demo);
    let (code, err) = validate("veh.ron", &bad);
    assert_eq!(code, 2);
    assert!(
        err.contains("\"maintenance-truk\", which is neither defined nor a library model"),
        "{err}"
    );
    assert_eq!(err.lines().count(), 1, "{err}");
    assert!(!err.contains("combination"), "{err}");
}

/// Unknown fields name the entry in the file's words, not a Rust type.
#[test]
fn unknown_field_names_no_internal_type() {
    let text = FOUR_PANEL.replacen("(id: \"L0\"", "(idd: \"L0\"", 1);
    assert_ne!(text, FOUR_PANEL);
    let (code, err) = validate("typo.ron", &text);
    assert_eq!(code, 2);
    assert!(err.contains("unknown field `idd` in a node entry"), "{err}");
    assert!(!err.contains("File`"), "{err}");
}

/// Two typos in field names, on two lines: two messages, each with its own
/// line and column (line 13 col 10 is `idd` of node L0 in four_panel.ron,
/// counted in the file; line 23 col 23 is `strt` of member L0-L1).
#[test]
fn every_unknown_field_in_one_pass() {
    let text = FOUR_PANEL
        .replacen("(id: \"L0\"", "(idd: \"L0\"", 1)
        .replacen("start: \"L0\", end: \"L1\"", "strt: \"L0\", end: \"L1\"", 1);
    let (code, err) = validate("typos.ron", &text);
    assert_eq!(code, 2);
    let lines: Vec<&str> = err
        .lines()
        .filter(|l| l.contains("unknown field"))
        .collect();
    assert_eq!(lines.len(), 2, "{err}");
    assert!(
        lines[0].contains("line 13, column 10") && lines[0].contains("`idd`"),
        "{err}"
    );
    assert!(
        lines[1].contains("line 23, column 23") && lines[1].contains("`strt`"),
        "{err}"
    );
    // The blanked-out `strt` leaves `start` missing: not a second mistake.
    assert!(!err.contains("missing field"), "{err}");
}

/// E = 29,000,000 typed with `stress: "ksi"` (a units slip: steel is about
/// 29,000 ksi, 200 GPa, from memory) is warned about, with the range of
/// structural steel and iron stated in ksi; the model still runs (exit 0).
/// The range 70–210 GPa (about 10,000 to 30,000 ksi) is common practice.
#[test]
fn implausible_values_are_warned_about() {
    let text = FOUR_PANEL.replace("e: 29000.0, fy: 33.0", "e: 29000000.0, fy: 33000.0");
    assert_ne!(text, FOUR_PANEL);
    let path = temp_model("slip.ron", &text);
    let (code, out, err) = run(&["solve", path.to_str().unwrap()]);
    assert_eq!(code, 0, "{err}");
    let all = format!("{out}\n{err}");
    assert!(
        all.contains("material \"steel\" e = 2.900e7 ksi is far outside the range of structural steel and iron (about 10000 to 30000 ksi, common practice)"),
        "{all}"
    );
    assert!(all.contains("fy = 33000.0 ksi"), "{all}");
    // The plain four-panel truss (48 ft, steel) draws no such warning.
    let path = temp_model("plain.ron", FOUR_PANEL);
    let (code, out, err) = run(&["solve", path.to_str().unwrap()]);
    assert_eq!(code, 0);
    assert!(!format!("{out}{err}").contains("far outside"), "{out}{err}");
    // Coordinates in feet with `length: "mm"`: a 72 mm truss (four_panel.ron
    // spans 72 ft), far below the 1 m of the smallest real trusses.
    let small = FOUR_PANEL.replace("length: \"ft\"", "length: \"mm\"");
    assert_ne!(small, FOUR_PANEL);
    let path = temp_model("small.ron", &small);
    let (_, out, err) = run(&["solve", path.to_str().unwrap()]);
    assert!(
        format!("{out}{err}")
            .contains("the truss measures 72.0 mm from node \"L0\" to node \"L4\""),
        "{out}{err}"
    );
}

/// A coordinate beyond the accepted range is told in the model's length
/// unit: 1e9 ft against the limit 1e8 m = 3.281e8 ft (1 ft = 0.3048 m).
#[test]
fn coordinate_limit_in_model_units() {
    let text = FOUR_PANEL.replacen("(id: \"L4\", x: 72.0", "(id: \"L4\", x: 1e9", 1);
    assert_ne!(text, FOUR_PANEL);
    let (code, err) = validate("far.ron", &text);
    assert_eq!(code, 2);
    assert!(
        err.contains("node \"L4\" coordinate x = 1.000e9 ft is beyond ±3.281e8 ft"),
        "{err}"
    );
}
