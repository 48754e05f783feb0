//! The one fuzz pipeline, shared by the fuzz crate (`fuzz/`) and the
//! regression test that replays saved cases: bytes → loader → analysis →
//! column checks → every report writer, then `rate`, the HTML report,
//! `stability`, `fatigue` and a sweep with their writers. Any panic, any
//! non-finite result or any malformed JSON report is a finding.
//!
//! An input may carry a vehicles file and a sweep file after the model,
//! each after a marker line (`//@vehicles`, `//@sweep`; a RON comment, so
//! the model part stays a model). The vehicles part is written to
//! `vehicles.ron` in a folder of this thread's own, which the model is
//! loaded from (so `vehicles_file: "vehicles.ron"` reads it).

use panelpoint::analysis::{self, Analysis};
use panelpoint::capacity::{self, Curve};
use panelpoint::input::Diagnostic;
use panelpoint::model::Model;
use panelpoint::report;
use panelpoint::stability::run::StabilityReport;
use panelpoint::stability::StabilityError;

/// Marker lines splitting an input into model, vehicles and sweep text.
pub const VEHICLES_MARK: &str = "\n//@vehicles\n";
pub const SWEEP_MARK: &str = "\n//@sweep\n";

/// The later stages (rate, report, stability, fatigue, sweep) run only on
/// models up to this many members and nodes, so one input stays fast.
const STAGE_LIMIT: usize = 300;
/// Variants of a sweep run per input.
const SWEEP_VARIANTS: usize = 12;

/// (model, vehicles, sweep) parts of an input.
pub fn split(text: &str) -> (&str, Option<&str>, Option<&str>) {
    let (rest, sweep) = match text.find(SWEEP_MARK) {
        Some(i) => (&text[..i], Some(&text[i + SWEEP_MARK.len()..])),
        None => (text, None),
    };
    match rest.find(VEHICLES_MARK) {
        Some(i) => (&rest[..i], Some(&rest[i + VEHICLES_MARK.len()..]), sweep),
        None => (rest, None, sweep),
    }
}

/// This thread's folder holding the vehicles file, written afresh (or
/// removed) for every input.
fn vehicles_dir(vehicles: Option<&str>) -> std::path::PathBuf {
    let id = format!("{:?}", std::thread::current().id());
    let id: String = id.chars().filter(char::is_ascii_digit).collect();
    let dir = std::env::temp_dir().join(format!("panelpoint-fuzz-{}-{id}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("fuzz folder");
    let file = dir.join("vehicles.ron");
    match vehicles {
        Some(v) => std::fs::write(&file, v).expect("fuzz vehicles file"),
        None => {
            let _ = std::fs::remove_file(&file);
        }
    }
    dir
}

fn parses(what: &str, json: &[u8]) {
    if let Err(e) = serde_json::from_slice::<serde_json::Value>(json) {
        panic!("the {what} JSON report does not parse: {e}");
    }
}

/// The message with quoted text and digits removed: a coarse "which check
/// fired" signature for the mutation driver.
fn shape(message: &str) -> String {
    let mut out = String::new();
    let mut quoted = false;
    for c in message.chars().take(200) {
        match c {
            '"' => quoted = !quoted,
            _ if quoted || c.is_ascii_digit() => {}
            _ => out.push(c),
        }
    }
    out
}

/// Run one input through the whole pipeline. Returns an outcome signature
/// ("load: <message shape>", "analysis: ...", "solved ..."), used by the
/// mutation driver to keep inputs that reach somewhere new; panics on a
/// finding.
pub fn fuzz_one(bytes: &[u8]) -> String {
    // The CLI refuses non-UTF-8 before the loader sees it.
    let Ok(text) = std::str::from_utf8(bytes) else {
        return "utf8".into();
    };
    let (text, vehicles, sweep) = split(text);
    let dir = vehicles_dir(vehicles);
    let converted = match panelpoint::input::load_str_in(text, Some(&dir)) {
        Ok(c) => c,
        Err(d) => {
            assert!(!d.errors.is_empty(), "an Err with no diagnostic");
            assert!(d.errors.len() <= 201, "unbounded error list");
            let _ = d.to_string();
            return format!("load: {}", shape(&d.errors[0].message));
        }
    };
    let model = &converted.model;
    for n in &model.nodes {
        assert!(n.x.is_finite() && n.y.is_finite(), "non-finite node");
    }
    let a = match analysis::analyse(model) {
        Ok(a) => a,
        Err(e) => {
            let m = e.to_string();
            assert!(!m.is_empty());
            return format!("analysis: {}", shape(&m));
        }
    };
    for case in &a.cases {
        let finite = case.forces.iter().all(|f| f.is_finite())
            && case.displacements.iter().flatten().all(|v| v.is_finite())
            && case.reactions.iter().flatten().all(|v| v.is_finite())
            && case.relative_residual.is_finite();
        assert!(finite, "non-finite result in case \"{}\"", case.id);
    }
    // Column check of every member whose material has a yield stress.
    let curve = Curve::default_curve();
    for (m, mem) in model.members.iter().enumerate() {
        let mat = &model.materials[mem.material];
        let sec = &model.sections[mem.section];
        if let Some(fy) = mat.fy {
            let r = sec.r_in().min(sec.r_out());
            let kl_r = model.length(m) / r;
            if let Ok(c) = capacity::column(&curve, fy, mat.e, kl_r) {
                assert!(
                    c.design_stress.is_finite() && c.design_stress >= 0.0,
                    "column check gave {c:?}"
                );
            }
        }
    }
    let warnings = &converted.warnings;
    let mut text_out = Vec::new();
    report::text::solve(&mut text_out, model, &a, warnings).expect("text report");
    let mut json_out = Vec::new();
    report::json::solve(&mut json_out, model, &a, warnings).expect("json report");
    parses("solve", &json_out);
    let mut csv_out = Vec::new();
    report::csv::solve(&mut csv_out, model, &a).expect("csv report");
    let mut sig = format!(
        "solved: {} warnings, {} analysis warnings, {} cases",
        warnings.len().min(3),
        a.warnings.len().min(3),
        a.cases.len().min(3)
    );
    if model.members.len() + model.nodes.len() <= STAGE_LIMIT {
        let stab = panelpoint::stability::run::run(model, &a);
        sig.push_str(&rate_and_report(model, &a, warnings, &stab));
        sig.push_str(&stability(model, &stab, warnings));
        sig.push_str(&fatigue(model, warnings));
        if let Some(sw) = sweep {
            sig.push_str(&sweep_rows(model, sw));
        }
    }
    sig
}

/// `rate` (its three writers) and the HTML report; the outcome's shape.
fn rate_and_report(
    model: &Model,
    a: &Analysis,
    warnings: &[Diagnostic],
    stab: &Result<StabilityReport, StabilityError>,
) -> String {
    let method = match panelpoint::rate::choose_method(model, None) {
        Ok(m) => m,
        Err(e) => return format!("; method: {}", shape(&e)),
    };
    // As `report --k-from buckling` does for a model with a `stability`
    // section: in-plane K from the buckling modes, then the streamed page
    // with the stability section.
    let stab = (model.stability != panelpoint::stability::Settings::default()).then_some(stab);
    let adjusted = match &stab {
        Some(Ok(s)) => {
            let ks = panelpoint::stability::rate_k_in::chosen(model.members.len(), &s.in_plane);
            for k in &ks {
                assert!(k.k.is_finite() && k.k > 0.0, "K from buckling {k:?}");
            }
            Some(panelpoint::stability::rate_k_in::apply(model, &ks).0)
        }
        _ => None,
    };
    let model = adjusted.as_ref().unwrap_or(model);
    let r = panelpoint::rate::rate(model, a, method);
    let given_k: Vec<(f64, f64)> = model.members.iter().map(|x| (x.k_in, x.k_out)).collect();
    let extras = report::html::Extras {
        fatigue: None,
        stability: stab.as_ref().map(|s| report::html::StabilityPart {
            report: s.as_ref().map_err(|e| e.to_string()),
            k_from_buckling: true,
            given_k,
        }),
    };
    let mut html = Vec::new();
    report::html::write_report(
        &mut html,
        model,
        a,
        r.as_ref().map_err(|e| e.to_string()),
        warnings,
        &extras,
    )
    .expect("html report");
    assert!(
        html.starts_with(b"<!DOCTYPE html>") && std::str::from_utf8(&html).is_ok(),
        "the HTML report has no doctype or is not UTF-8"
    );
    let r = match r {
        Ok(r) => r,
        Err(e) => return format!("; rate: {}", shape(&e.to_string())),
    };
    for c in &r.checks {
        assert!(c.force.is_finite() && c.capacity >= 0.0, "rate check {c:?}");
        assert!(!c.utilization.is_nan(), "NaN utilization in {c:?}");
    }
    let mut out = Vec::new();
    report::rate_text::rate(&mut out, model, a, &r, warnings, true).expect("rate text");
    out.clear();
    report::rate_json::rate(&mut out, model, a, &r, warnings).expect("rate json");
    parses("rate", &out);
    out.clear();
    report::rate_csv::rate(&mut out, model, &r).expect("rate csv");
    format!("; rated {}", r.controlling.is_some())
}

/// `stability` with its three writers.
fn stability(
    model: &Model,
    r: &Result<StabilityReport, StabilityError>,
    warnings: &[Diagnostic],
) -> String {
    let r = match r {
        Ok(r) => r,
        Err(e) => return format!("; stability: {}", shape(&e.to_string())),
    };
    let mut out = Vec::new();
    report::stability_text::stability(&mut out, model, r, warnings).expect("stability text");
    out.clear();
    report::stability_json::stability(&mut out, model, r, warnings).expect("stability json");
    parses("stability", &out);
    out.clear();
    report::stability_svg::mode_svg(&mut out, model, r, None).expect("stability svg");
    format!(
        "; stability {} {}",
        r.u_frame.is_some(),
        r.vibration.is_some()
    )
}

/// `fatigue` with its writers and drawing, when the model asks for it.
fn fatigue(model: &Model, warnings: &[Diagnostic]) -> String {
    if model.fatigue.is_none() {
        return String::new();
    }
    let f = match panelpoint::fatigue::evaluate_model(model) {
        Ok(f) => f,
        Err(e) => return format!("; fatigue: {}", shape(&e.to_string())),
    };
    let mut out = Vec::new();
    report::fatigue_text::fatigue(&mut out, model, &f, warnings, true).expect("fatigue text");
    out.clear();
    report::fatigue_json::fatigue(&mut out, model, &f, warnings).expect("fatigue json");
    parses("fatigue", &out);
    out.clear();
    report::fatigue_csv::fatigue(&mut out, model, &f).expect("fatigue csv");
    let _ = report::fatigue_svg::draw(model, &f, 900.0);
    "; fatigue".into()
}

/// The first variants of a sweep, one worker, through the JSON writer.
fn sweep_rows(model: &Model, text: &str) -> String {
    use panelpoint::sweep;
    let sw = match panelpoint::input::sweep::load_sweep(text, model) {
        Ok(s) => s,
        Err(d) => {
            assert!(!d.errors.is_empty(), "a sweep Err with no diagnostic");
            return format!("; sweep load: {}", shape(&d.errors[0].message));
        }
    };
    let method = match panelpoint::rate::choose_method(model, None) {
        Ok(m) => m,
        Err(e) => return format!("; sweep method: {}", shape(&e)),
    };
    let indices: Vec<usize> = (0..sw.len().min(SWEEP_VARIANTS)).collect();
    let opts = sweep::RunOptions {
        method,
        jobs: Some(1),
        detail: true,
    };
    let mut out = Vec::new();
    let mut writer = report::whatif::SweepWriter::new(report::Format::Json, true, model);
    let mut failed = 0;
    writer
        .header(&mut out, model, sw.len(), "")
        .expect("sweep header");
    sweep::run(model, &sw, &indices, &opts, |row| {
        failed += usize::from(row.outcome.is_err());
        writer.row(&mut out, &row)
    })
    .expect("sweep rows");
    writer.footer(&mut out).expect("sweep footer");
    parses("sweep", &out);
    format!("; sweep {} failed {}", indices.len().min(3), failed.min(3))
}
