//! Helpers shared by the integration tests: run the binary, load a model
//! from text, and build small models without repeating boilerplate.
#![allow(dead_code)]

use panelpoint::analysis::{self, Analysis};
use panelpoint::model::Model;
use std::process::Command;

pub const FOUR_PANEL: &str = include_str!("../data/four_panel.ron");

/// Run the `panelpoint` binary; returns (exit code, stdout, stderr).
pub fn run(args: &[&str]) -> (i32, String, String) {
    let out = Command::new(env!("CARGO_BIN_EXE_panelpoint"))
        .args(args)
        // Text tables fit COLUMNS when it is set; keep the tests' tables whole.
        .env_remove("COLUMNS")
        .output()
        .expect("run panelpoint");
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

/// Write `text` to a fresh temporary file and return its path. Each call
/// gets its own folder, so tests running in parallel never share a file.
pub fn temp_model(name: &str, text: &str) -> std::path::PathBuf {
    use std::sync::atomic::{AtomicUsize, Ordering};
    static NEXT: AtomicUsize = AtomicUsize::new(0);
    let n = NEXT.fetch_add(1, Ordering::Relaxed);
    let dir = std::env::temp_dir().join(format!("panelpoint-tests-{}-{n}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join(name);
    std::fs::write(&path, text).unwrap();
    // Models may name the example vehicles file beside them.
    let vehicles = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models/vehicles.ron");
    std::fs::copy(vehicles, dir.join("vehicles.ron")).unwrap();
    path
}

pub fn load(text: &str) -> Model {
    // Relative files a model names (a vehicles file) are read from models/.
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models");
    match panelpoint::input::load_str_in(text, Some(&dir)) {
        Ok(c) => c.model,
        Err(d) => panic!("model did not load:\n{d}"),
    }
}

pub fn solve(text: &str) -> (Model, Analysis) {
    let m = load(text);
    let a = analysis::analyse(&m).expect("analysis");
    (m, a)
}

pub fn member(m: &Model, id: &str) -> usize {
    m.members
        .iter()
        .position(|x| x.id == id)
        .unwrap_or_else(|| panic!("no member {id}"))
}

pub fn node(m: &Model, id: &str) -> usize {
    m.nodes
        .iter()
        .position(|x| x.id == id)
        .unwrap_or_else(|| panic!("no node {id}"))
}

/// kip → N and ft → m, to compare SI results with hand values in US units.
pub const KIP: f64 = 4448.2216152605;
pub const FT: f64 = 0.3048;
pub const INCH: f64 = 0.0254;

/// Relative closeness with an absolute floor.
pub fn close(a: f64, b: f64, rel: f64, floor: f64) -> bool {
    (a - b).abs() <= rel * a.abs().max(b.abs()) + floor
}

#[macro_export]
macro_rules! assert_close {
    ($a:expr, $b:expr, $rel:expr) => {{
        let (a, b): (f64, f64) = ($a, $b);
        assert!(
            $crate::common::close(a, b, $rel, 1e-12),
            "{} = {a} but expected {b} (rel {})",
            stringify!($a),
            $rel
        );
    }};
    ($a:expr, $b:expr, $rel:expr, $floor:expr) => {{
        let (a, b): (f64, f64) = ($a, $b);
        assert!(
            $crate::common::close(a, b, $rel, $floor),
            "{} = {a} but expected {b} (rel {}, floor {})",
            stringify!($a),
            $rel,
            $floor
        );
    }};
}

/// A small model in US units from node, member and support lists.
pub fn model_text(
    nodes: &[(&str, f64, f64)],
    members: &[(&str, &str, &str)],
    supports: &[(&str, &str)],
    loads: &[(&str, f64, f64)],
) -> String {
    let mut s = String::from(
        "(title: \"test\", units: (length: \"ft\", force: \"kip\", section: \"in\", stress: \"ksi\"),\n\
         materials: [(id: \"steel\", e: 29000.0, fy: 36.0, fu: 58.0)],\n\
         sections: [(id: \"s\", area: 10.0, i_in: 100.0, i_out: 100.0)],\nnodes: [\n",
    );
    for (id, x, y) in nodes {
        s += &format!("  (id: \"{id}\", x: {x:?}, y: {y:?}),\n");
    }
    s += "],\nmembers: [\n";
    for (id, a, b) in members {
        s += &format!(
            "  (id: \"{id}\", start: \"{a}\", end: \"{b}\", section: \"s\", material: \"steel\"),\n"
        );
    }
    s += "],\nsupports: [\n";
    for (n, k) in supports {
        s += &format!("  (node: \"{n}\", kind: {k}),\n");
    }
    s += "],\nload_cases: [(id: \"a\", loads: [\n";
    for (n, fx, fy) in loads {
        s += &format!("  (node: \"{n}\", fx: {fx:?}, fy: {fy:?}),\n");
    }
    s += "])])\n";
    s
}

// Helpers of the robustness tests.
use std::path::{Path, PathBuf};

pub struct Run {
    pub code: i32,
    pub stdout: String,
    pub stderr: String,
}

/// Run the binary with OS-string arguments (odd file names).
pub fn run_os(args: &[&std::ffi::OsStr]) -> Run {
    let out = Command::new(env!("CARGO_BIN_EXE_panelpoint"))
        .args(args)
        .output()
        .expect("run panelpoint");
    Run {
        code: out.status.code().unwrap_or(-1),
        stdout: String::from_utf8_lossy(&out.stdout).into_owned(),
        stderr: String::from_utf8_lossy(&out.stderr).into_owned(),
    }
}

/// A fresh directory for one test.
pub fn dir(name: &str) -> PathBuf {
    let d = std::env::temp_dir().join(format!("pp-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&d);
    std::fs::create_dir_all(&d).unwrap();
    d
}

pub fn write(dir: &Path, name: &str, bytes: impl AsRef<[u8]>) -> PathBuf {
    let p = dir.join(name);
    std::fs::write(&p, bytes).unwrap();
    p
}

/// A small valid SI model (a triangle) with `nodes` and `extra` spliced in.
pub fn triangle(x_b: &str, y_c: &str) -> String {
    format!(
        r#"(
    units: (length: "m", force: "kN", section: "mm", stress: "MPa"),
    materials: [(id: "s", e: 200000.0, fy: 250.0)],
    sections: [(id: "a", area: 1000.0, i_in: 1e6, i_out: 1e6)],
    nodes: [(id: "A", x: 0.0, y: 0.0), (id: "B", x: {x_b}, y: 0.0), (id: "C", x: 2.0, y: {y_c})],
    members: [
        (id: "AB", start: "A", end: "B", section: "a", material: "s"),
        (id: "BC", start: "B", end: "C", section: "a", material: "s"),
        (id: "CA", start: "C", end: "A", section: "a", material: "s"),
    ],
    supports: [(node: "A", kind: Pin), (node: "B", kind: Roller)],
    load_cases: [(id: "w", loads: [(node: "C", fy: -10.0)])],
)"#
    )
}

/// The triangle with chord A-B 4 m long at 45° and apex C 0.1 mm off its
/// midpoint, both supports pinned: θ = 5e-5 rad, so C's stiffness across the
/// line is ~ sin²θ = 2.5e-9 of its stiffness along it (hand geometry), and on
/// a 45° line Jacobi scaling cannot separate the two, so κ(scaled K) ≳ 1/θ²
/// ≈ 4e8 while the pivot ratio stays above the 1e-10 mechanism limit.
pub fn skew_apex_triangle() -> String {
    let r = std::f64::consts::FRAC_1_SQRT_2;
    let (bx, by) = (4.0 * r, 4.0 * r);
    let (cx, cy) = (2.0 * r - 1e-4 * r, 2.0 * r + 1e-4 * r);
    triangle("4.0", "1.5")
        .replace(
            "(id: \"B\", x: 4.0, y: 0.0)",
            &format!("(id: \"B\", x: {bx:?}, y: {by:?})"),
        )
        .replace(
            "(id: \"C\", x: 2.0, y: 1.5)",
            &format!("(id: \"C\", x: {cx:?}, y: {cy:?})"),
        )
        .replace("kind: Roller", "kind: Pin")
}
