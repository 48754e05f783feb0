//! Issue 22 item 16: a check whose capacity is zero must not look like a
//! check that does not apply. `rate` computes utilization = |force| / C
//! (src/rate/mod.rs), so C = 0 gives ∞ (with a force) or NaN (without),
//! neither a JSON number: JSON writes `"utilization": null` with
//! `"zero_capacity": true`, CSV an empty utilization with `zero_capacity`
//! true, text "zero C" and, when it controls, "FAILS: zero capacity".

mod common;

use panelpoint::report;

fn rated() -> (
    panelpoint::model::Model,
    panelpoint::analysis::Analysis,
    panelpoint::rate::Rating,
) {
    let m = common::load(common::FOUR_PANEL);
    let a = panelpoint::analysis::analyse(&m).unwrap();
    let method = panelpoint::rate::choose_method(&m, None).unwrap();
    let r = panelpoint::rate::rate(&m, &a, method).unwrap();
    (m, a, r)
}

#[test]
fn zero_capacity_is_distinguishable_in_every_format() {
    let (m, a, mut r) = rated();
    // Check 0 (a loaded member): capacity zero as rate would produce it.
    let k = r.checks.iter().position(|c| c.force != 0.0).unwrap();
    r.checks[k].capacity = 0.0;
    r.checks[k].utilization = r.checks[k].force.abs() / 0.0;
    assert!(r.checks[k].utilization.is_infinite());
    r.controlling = Some(k);
    let (member, case) = (
        m.members[r.checks[k].member].id.clone(),
        r.effects[r.checks[k].effect].id.clone(),
    );

    let mut out = Vec::new();
    report::rate_json::rate(&mut out, &m, &a, &r, &[]).unwrap();
    let v: serde_json::Value = serde_json::from_slice(&out).unwrap();
    let rows = v["checks"].as_array().unwrap();
    let flagged: Vec<&serde_json::Value> =
        rows.iter().filter(|c| c["zero_capacity"] == true).collect();
    assert_eq!(flagged.len(), 1);
    assert!(flagged[0]["utilization"].is_null());
    assert_eq!(flagged[0]["member"], member.as_str());
    assert_eq!(flagged[0]["case"], case.as_str());
    // Every other row: a number and the flag false (never missing).
    for c in rows.iter().filter(|c| c["zero_capacity"] == false) {
        assert!(c["utilization"].is_number(), "{c}");
    }
    assert_eq!(rows.len(), r.checks.len());
    assert_eq!(v["controlling"]["zero_capacity"], true);
    assert!(v["controlling"]["utilization"].is_null());

    let mut out = Vec::new();
    report::rate_csv::rate(&mut out, &m, &r).unwrap();
    let csv = String::from_utf8(out).unwrap();
    let mut lines = csv.lines();
    let head: Vec<&str> = lines.next().unwrap().split(',').collect();
    // The flag is the last column (the clause before it may hold quoted
    // commas); the utilization comes before any text cell that could.
    let ui = head.iter().position(|h| *h == "utilization").unwrap();
    assert_eq!(head.last(), Some(&"zero_capacity"));
    let mut seen = 0;
    for line in lines.take_while(|l| !l.is_empty()) {
        let cells: Vec<&str> = line.split(',').collect();
        if cells[0] == member && cells[1] == case {
            assert_eq!(cells[ui], "");
            assert_eq!(cells.last(), Some(&"true"));
            seen += 1;
        } else {
            assert_eq!(cells.last(), Some(&"false"), "{line}");
            assert!(cells[ui].parse::<f64>().is_ok(), "{line}");
        }
    }
    assert_eq!(seen, 1);

    let mut out = Vec::new();
    report::rate_text::rate(&mut out, &m, &a, &r, &[], true).unwrap();
    let text = String::from_utf8(out).unwrap();
    assert!(text.contains("FAILS: zero capacity"), "{text}");
    assert!(text.contains("utilization zero C"));
    // Exactly one table row shows "zero C" (the controlling line is the other mention).
    assert_eq!(text.matches("zero C").count(), 2, "{text}");

    let html = report::html::report(&m, &a, Ok(&r), &[]);
    assert!(html.contains("zero capacity FAILS"));
}

/// Capacity zero and no force: utilization 0/0 is NaN, still flagged, and
/// not counted as a failure (nothing is carried).
#[test]
fn zero_capacity_without_force_is_flagged_not_failed() {
    let (m, a, mut r) = rated();
    let k = 0;
    r.checks[k].force = 0.0;
    r.checks[k].capacity = 0.0;
    // |force| / capacity = 0 / 0, as rate computes it.
    r.checks[k].utilization = r.checks[k].force.abs() / r.checks[k].capacity;
    assert!(r.checks[k].utilization.is_nan());
    let mut out = Vec::new();
    report::rate_json::rate(&mut out, &m, &a, &r, &[]).unwrap();
    let v: serde_json::Value = serde_json::from_slice(&out).unwrap();
    let row = &v["checks"][k];
    assert!(row["utilization"].is_null());
    assert_eq!(row["zero_capacity"], true);
}
