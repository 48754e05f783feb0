//! Helpers shared by the integration tests: run the binary, write models
//! into a private temporary directory.
#![allow(dead_code)]

use std::path::{Path, PathBuf};
use std::process::Command;

pub struct Run {
    pub code: i32,
    pub stdout: String,
    pub stderr: String,
}

pub fn run(args: &[&std::ffi::OsStr]) -> Run {
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
