//! Hostile and extreme model files through the real binary: each must end
//! with exit status 2, an empty standard output and a message naming the
//! problem — never a panic, a hang or a NaN.

mod common;
use common::*;
use std::ffi::OsStr;
use std::path::Path;

fn solve(path: &Path) -> Run {
    run_os(&[OsStr::new("solve"), path.as_os_str()])
}

/// Exit 2, nothing on stdout, no panic, and every needle in stderr.
fn refused(r: &Run, needles: &[&str]) {
    assert_eq!(r.code, 2, "stderr: {}", r.stderr);
    assert!(r.stdout.is_empty(), "partial output: {}", r.stdout);
    assert!(!r.stderr.contains("panicked"), "{}", r.stderr);
    for n in needles {
        assert!(r.stderr.contains(n), "{n:?} not in: {}", r.stderr);
    }
}

fn bad(name: &str, text: &str, needles: &[&str]) {
    let d = dir(name);
    let p = write(&d, "m.ron", text);
    refused(&solve(&p), needles);
    std::fs::remove_dir_all(d).unwrap();
}

#[test]
fn the_helper_model_solves() {
    // Guard: the hostile variants below differ from a model that works.
    let d = dir("ok");
    let p = write(&d, "m.ron", triangle("4.0", "1.5"));
    let r = solve(&p);
    assert_eq!(r.code, 0, "{}", r.stderr);
    assert!(r.stdout.contains("AB"));
}

#[test]
fn empty_and_blank_files() {
    bad("empty", "", &["empty"]);
    bad("blank", "  \n\t\n", &["empty"]);
}

#[test]
fn huge_file_of_whitespace_and_garbage() {
    // 50 MB: whitespace, then garbage; refused at the garbage's line.
    let mut text = " \n".repeat(25_000_000);
    text.push_str("@@ garbage ##");
    bad("huge", &text, &["syntax", "line 25000001"]);
}

#[test]
fn deeply_nested_ron() {
    let text = "(".repeat(100_000) + &")".repeat(100_000);
    bad("nested", &text, &["syntax", "line 1"]);
    let text = format!("(units: {}", "[".repeat(100_000));
    bad("nested2", &text, &["syntax"]);
    let text = format!("(title: \"t\", units: {}", "(".repeat(100_000));
    bad("nested3", &text, &["syntax"]);
}

#[test]
fn nan_and_inf_as_literals_and_text() {
    bad(
        "nan-lit",
        &triangle("NaN", "1.5"),
        &["node \"B\" x", "not a finite number"],
    );
    bad(
        "inf-lit",
        &triangle("inf", "1.5"),
        &["node \"B\" x", "not a finite number"],
    );
    bad(
        "ninf-lit",
        &triangle("4.0", "-inf"),
        &["node \"C\" y", "not a finite number"],
    );
    bad(
        "nan-text",
        &triangle("\"NaN m\"", "1.5"),
        &["node \"B\" x", "not a number with a unit"],
    );
    bad(
        "inf-text",
        &triangle("\"inf m\"", "1.5"),
        &["node \"B\" x", "not a number with a unit"],
    );
    // Overflow on conversion: 1e305 MPa is beyond f64 in Pa.
    let t = triangle("4.0", "1.5").replace("e: 200000.0", "e: 1e305");
    bad("ovf", &t, &["material \"s\" e", "not a finite number"]);
}

#[test]
fn astronomically_large_coordinates() {
    bad(
        "1e300",
        &triangle("1e300", "1.5"),
        &["node \"B\"", "coordinate"],
    );
}

#[test]
fn member_of_1e_minus_12_length() {
    // B at 1e-12 m from A in a 2 m truss: a zero-length member.
    bad(
        "tiny",
        &triangle("1e-12", "1.5"),
        &["member \"AB\"", "zero length"],
    );
}

#[test]
fn many_duplicate_ids_stay_bounded() {
    let mut nodes = String::new();
    for _ in 0..200_000 {
        nodes.push_str("(id: \"N\", x: 0.0, y: 0.0),\n");
    }
    let text = triangle("4.0", "1.5").replace("nodes: [", &format!("nodes: [{nodes}"));
    let d = dir("dups");
    let p = write(&d, "m.ron", text);
    let r = solve(&p);
    refused(&r, &["duplicate node id \"N\""]);
    let lines = r.stderr.lines().count();
    assert!(lines <= 201, "{lines} lines of errors");
    std::fs::remove_dir_all(d).unwrap();
}

#[test]
fn unknown_units_and_wrong_dimensions() {
    let t = triangle("4.0", "1.5");
    bad(
        "unit1",
        &t.replace("length: \"m\"", "length: \"furlong\""),
        &["units.length", "unknown unit \"furlong\""],
    );
    bad(
        "unit2",
        &t.replace("force: \"kN\"", "force: \"m\""),
        &["units.force", "length unit, not a force unit"],
    );
    bad(
        "unit3",
        &t.replace("x: 2.0", "x: \"2 kN\""),
        &["node \"C\" x", "is a force, but a length is expected"],
    );
    bad(
        "unit4",
        &t.replace("e: 200000.0", "e: \"200 parsec\""),
        &["material \"s\" e", "unknown unit \"parsec\""],
    );
}

#[test]
fn odd_characters_in_ids() {
    let t = triangle("4.0", "1.5");
    // Quotes and unicode are fine ids.
    let d = dir("odd-ok");
    let ok = t.replace("\"C\"", "\"C \\\"top\\\" ✓ Ω\"");
    let r = solve(&write(&d, "m.ron", &ok));
    assert_eq!(r.code, 0, "{}", r.stderr);
    assert!(r.stdout.contains("C \"top\" ✓ Ω"));
    // A newline in an id would split a report line.
    bad(
        "odd-nl",
        &t.replace("(id: \"C\"", "(id: \"C\\nD\""),
        &["node number 3 id \"C\\nD\"", "control character"],
    );
    // A 100 kB id.
    let long = "x".repeat(100_000);
    let text = t.replace("\"C\"", &format!("\"{long}\""));
    let d = dir("odd-long");
    let r = solve(&write(&d, "m.ron", &text));
    refused(&r, &["node number 3 has an id of 100000 characters"]);
    assert!(
        r.stderr.len() < 2_000,
        "message repeats the huge id: {} bytes",
        r.stderr.len()
    );
}

#[test]
fn missing_file_directory_and_non_utf8() {
    let d = dir("files");
    refused(
        &solve(&d.join("absent.ron")),
        &["cannot read", "absent.ron"],
    );
    refused(&solve(&d), &["cannot read"]);
    let p = write(&d, "bin.ron", b"(title: \"\xff\xfe\")");
    refused(&solve(&p), &["not UTF-8", "offset 9"]);
    std::fs::remove_dir_all(d).unwrap();
}
