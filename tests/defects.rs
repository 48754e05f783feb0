//! Issue 21: defects a new user and a rating engineer found. Each test
//! failed before its fix. The demo model is models/millrace-footbridge.ron
//! (an invented scenario).

mod common;
use common::*;

fn demo() -> String {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("models/millrace-footbridge.ron")
        .display()
        .to_string()
}

fn demo_text() -> String {
    std::fs::read_to_string(demo()).unwrap()
}

/// Parse CSV the simple way (no quoted commas in these outputs' numbers):
/// every line must have as many fields as the header (RFC 4180's rule),
/// counting a quoted field as one.
fn csv_rows(text: &str) -> Vec<Vec<String>> {
    let mut rows = Vec::new();
    for line in text.lines() {
        let mut fields = Vec::new();
        let mut cur = String::new();
        let mut quoted = false;
        for ch in line.chars() {
            match ch {
                '"' => quoted = !quoted,
                ',' if !quoted => fields.push(std::mem::take(&mut cur)),
                c => cur.push(c),
            }
        }
        fields.push(cur);
        rows.push(fields);
    }
    rows
}

// Defect 6: `--format csv` printed JSON for these two commands.
#[test]
fn redundancy_and_sensitivity_write_csv_when_asked() {
    for cmd in ["redundancy", "sensitivity"] {
        let (code, out, err) = run(&[cmd, &demo(), "--format", "csv"]);
        assert_eq!(code, 0, "{cmd}: {err}");
        assert!(!out.trim_start().starts_with('{'), "{cmd} printed JSON:\n{out}");
        let rows = csv_rows(&out);
        assert!(rows.len() > 2, "{cmd}: {out}");
        let width = rows[0].len();
        assert!(width >= 4, "{cmd}: header {:?}", rows[0]);
        for r in &rows {
            assert_eq!(r.len(), width, "{cmd}: ragged row {r:?}");
        }
    }
    // One row per member for redundancy (21 members in the demo).
    let (_, out, _) = run(&["redundancy", &demo(), "--format", "csv"]);
    assert_eq!(out.lines().count(), 1 + 21);
}
