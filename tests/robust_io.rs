//! Issue 22: never destroy a file the run was not asked to write, never hang
//! on an input, never abort on a broken output. Every file-system case runs
//! in a temporary folder of its own, on copies of the repository's models.
//! Expected behaviour is the project's rule (RULES.md: "bad input: clear
//! error naming what and where (exit 2), never a panic or half-written
//! file") and the issue's text.

mod common;
use common::*;
use std::ffi::OsStr;
use std::fs;
use std::path::{Path, PathBuf};

fn repo(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("models").join(name)
}

/// A fresh folder holding copies of the repository's models.
fn scratch(name: &str) -> PathBuf {
    let d = dir(&format!("io-{name}"));
    for f in [
        "four_panel_live.ron",
        "vehicles.ron",
        "millrace-footbridge.ron",
        "millrace-sweep.ron",
    ] {
        fs::copy(repo(f), d.join(f)).unwrap();
    }
    d
}

fn pp(args: &[&OsStr]) -> Run {
    run_os(args)
}

fn os<P: AsRef<OsStr> + ?Sized>(p: &P) -> &OsStr {
    p.as_ref()
}

/// Exit 2, no panic, every needle in stderr.
fn refused(r: &Run, needles: &[&str]) {
    assert_eq!(r.code, 2, "stdout: {}\nstderr: {}", r.stdout, r.stderr);
    assert!(!r.stderr.contains("panicked"), "{}", r.stderr);
    for n in needles {
        assert!(r.stderr.contains(n), "{n:?} not in: {}", r.stderr);
    }
}

fn is_root() -> bool {
    // SAFETY: geteuid has no preconditions.
    unsafe { libc::geteuid() == 0 }
}

// ---- item 3: --out equal to an input --------------------------------------

#[test]
fn out_naming_the_model_is_refused_and_the_model_kept() {
    let d = scratch("out-model");
    let m = d.join("four_panel_live.ron");
    let before = fs::read(&m).unwrap();
    let r = pp(&[os("solve"), m.as_os_str(), os("--out"), m.as_os_str()]);
    refused(&r, &["same file as the input", "four_panel_live.ron"]);
    assert_eq!(fs::read(&m).unwrap(), before, "the model was replaced");
    // A hard link to the model is the same file (same device and inode).
    let link = d.join("link.ron");
    fs::hard_link(&m, &link).unwrap();
    let r = pp(&[os("rate"), m.as_os_str(), os("--out"), link.as_os_str()]);
    refused(&r, &["same file as the input"]);
    // So is a symlink to it.
    let sym = d.join("sym.ron");
    std::os::unix::fs::symlink(&m, &sym).unwrap();
    let r = pp(&[os("solve"), m.as_os_str(), os("--format"), os("json"), os("--out"), sym.as_os_str()]);
    refused(&r, &["same file as the input"]);
    assert_eq!(fs::read(&m).unwrap(), before);
    // A different output file is fine.
    let ok = d.join("out.txt");
    let r = pp(&[os("solve"), m.as_os_str(), os("--out"), ok.as_os_str()]);
    assert_eq!(r.code, 0, "{}", r.stderr);
    fs::remove_dir_all(d).unwrap();
}

#[test]
fn out_naming_the_vehicles_file_is_refused() {
    let d = scratch("out-vehicles");
    let m = d.join("four_panel_live.ron");
    let v = d.join("vehicles.ron");
    let before = fs::read(&v).unwrap();
    let r = pp(&[os("envelope"), m.as_os_str(), os("--out"), v.as_os_str()]);
    refused(&r, &["same file as the input", "vehicles.ron"]);
    assert_eq!(fs::read(&v).unwrap(), before, "the vehicles file was replaced");
    fs::remove_dir_all(d).unwrap();
}

#[test]
fn out_naming_the_sweep_file_is_refused() {
    let d = scratch("out-sweep");
    let m = d.join("millrace-footbridge.ron");
    let s = d.join("millrace-sweep.ron");
    let before = fs::read(&s).unwrap();
    let r = pp(&[os("sweep"), m.as_os_str(), s.as_os_str(), os("--out"), s.as_os_str()]);
    refused(&r, &["same file as the input", "millrace-sweep.ron"]);
    assert_eq!(fs::read(&s).unwrap(), before, "the sweep file was replaced");
    let r = pp(&[os("sweep"), m.as_os_str(), s.as_os_str(), os("--out"), m.as_os_str()]);
    refused(&r, &["same file as the input", "millrace-footbridge.ron"]);
    fs::remove_dir_all(d).unwrap();
}
