//! Nothing lost: a failed run leaves an existing `--out` file untouched
//! and prints nothing on standard output.

mod common;
use common::*;
use std::ffi::OsStr;

#[test]
fn failing_model_keeps_the_old_out_file() {
    let d = dir("keep");
    let out = write(&d, "report.txt", "previous report\n");
    let model = write(&d, "m.ron", triangle("4.0", "NaN"));
    let r = run_os(&[
        OsStr::new("solve"),
        model.as_os_str(),
        OsStr::new("--out"),
        out.as_os_str(),
    ]);
    assert_eq!(r.code, 2, "{}", r.stderr);
    assert_eq!(std::fs::read_to_string(&out).unwrap(), "previous report\n");
    assert_eq!(
        std::fs::read_dir(&d).unwrap().count(),
        2,
        "temporary file left"
    );
    // A mechanism (collinear C) fails in the analysis, after loading.
    let model = write(&d, "mech.ron", triangle("4.0", "0.0"));
    for fmt in ["text", "json", "csv"] {
        let r = run_os(&[
            OsStr::new("solve"),
            model.as_os_str(),
            OsStr::new("--format"),
            OsStr::new(fmt),
            OsStr::new("--out"),
            out.as_os_str(),
        ]);
        assert_eq!(r.code, 2, "{}", r.stderr);
        assert_eq!(std::fs::read_to_string(&out).unwrap(), "previous report\n");
    }
    // And a good model does replace it.
    let good = write(&d, "good.ron", triangle("4.0", "1.5"));
    let r = run_os(&[
        OsStr::new("solve"),
        good.as_os_str(),
        OsStr::new("--out"),
        out.as_os_str(),
    ]);
    assert_eq!(r.code, 0, "{}", r.stderr);
    assert!(std::fs::read_to_string(&out).unwrap().contains("Load case"));
    std::fs::remove_dir_all(d).unwrap();
}

#[test]
fn errors_print_nothing_on_stdout() {
    let d = dir("quiet");
    for (name, text) in [
        ("syntax.ron", "(units: "),
        ("nan.ron", &triangle("4.0", "NaN")),
        ("mech.ron", &triangle("4.0", "0.0")),
    ] {
        let p = write(&d, name, text);
        for fmt in ["text", "json", "csv"] {
            let r = run_os(&[
                OsStr::new("solve"),
                p.as_os_str(),
                OsStr::new("--format"),
                OsStr::new(fmt),
            ]);
            assert_eq!(r.code, 2, "{name}: {}", r.stderr);
            assert!(r.stdout.is_empty(), "{name} {fmt}: {}", r.stdout);
            assert!(r.stderr.starts_with("panelpoint: error: "), "{}", r.stderr);
        }
    }
    std::fs::remove_dir_all(d).unwrap();
}
