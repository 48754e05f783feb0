//! Replays every saved fuzz case in `tests/regressions/` through the fuzz
//! pipeline: each must end in an error or a result, never a panic.

#[path = "regressions/pipeline.rs"]
mod pipeline;

#[test]
fn every_saved_case_runs_clean() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/regressions");
    let mut n = 0;
    let mut entries: Vec<_> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|e| e == "ron" || e == "bin"))
        .collect();
    entries.sort();
    let mut sigs = std::collections::HashMap::new();
    for p in entries {
        let bytes = std::fs::read(&p).unwrap();
        let outcome = std::panic::catch_unwind(|| pipeline::fuzz_one(&bytes));
        assert!(outcome.is_ok(), "{} panicked", p.display());
        let name = p.file_name().unwrap().to_string_lossy().into_owned();
        sigs.insert(name, outcome.unwrap());
        n += 1;
    }
    // The multi-file seeds reach the later stages: a vehicles file and a
    // sweep; stability with the report's stability section; fatigue.
    let s = &sigs["seed_millrace_vehicles_sweep.ron"];
    assert!(s.contains("rated true") && s.contains("; sweep "), "{s}");
    let s = &sigs["seed_tanners_brook_pony.ron"];
    assert!(s.contains("stability true true"), "{s}");
    let s = &sigs["seed_four_panel_fatigue_vehicles.ron"];
    assert!(s.contains("; fatigue"), "{s}");
    // The seed cases below are always present; a missing folder must fail.
    assert!(n >= 3, "only {n} regression cases found");
}

#[test]
fn the_pipeline_solves_the_example() {
    // Guard against a pipeline that rejects everything: the core example
    // reaches the reports.
    let bytes = include_bytes!("data/four_panel.ron");
    assert!(pipeline::fuzz_one(bytes).starts_with("solved"));
}
