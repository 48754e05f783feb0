//! The one fuzz pipeline, shared by the fuzz crate (`fuzz/`) and the
//! regression test that replays saved cases: bytes → loader → analysis →
//! column checks → every report writer. Any panic, any non-finite result
//! or any malformed JSON report is a finding.

use panelpoint::analysis;
use panelpoint::capacity::{self, Curve};
use panelpoint::report;

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
    let converted = match panelpoint::input::load_str(text) {
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
    if let Err(e) = serde_json::from_slice::<serde_json::Value>(&json_out) {
        panic!("the JSON report does not parse: {e}");
    }
    let mut csv_out = Vec::new();
    report::csv::solve(&mut csv_out, model, &a).expect("csv report");
    format!(
        "solved: {} warnings, {} analysis warnings, {} cases",
        warnings.len().min(3),
        a.warnings.len().min(3),
        a.cases.len().min(3)
    )
}
