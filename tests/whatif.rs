//! What-if commands against outside sources: generated trusses against the
//! method of joints and M/h (statics by hand), determinacy counts, sweep
//! linearity, shards, the redundancy scan of determinate trusses, and
//! adjoint sensitivities against central finite differences.

mod common;

use common::*;
use panelpoint::analysis;
use panelpoint::generate::{generate, Family, GenerateOptions, UnitSystem};
use panelpoint::input::ron_writer::layout_to_ron;
use panelpoint::model::Model;
use panelpoint::rate;
use panelpoint::sweep::{self, RunOptions};

const MILLRACE: &str = include_str!("../models/millrace-footbridge.ron");
const MILLRACE_SWEEP: &str = include_str!("../models/millrace-sweep.ron");

fn between(m: &Model, a: &str, b: &str) -> usize {
    let (na, nb) = (node(m, a), node(m, b));
    m.members
        .iter()
        .position(|x| (x.start == na && x.end == nb) || (x.start == nb && x.end == na))
        .unwrap_or_else(|| panic!("no member between {a} and {b}"))
}

/// Generate through the CLI, load and solve: forces in kip.
fn generated(family: &str) -> (Model, Vec<f64>) {
    let path = temp_model(&format!("gen-{family}.ron"), "");
    let (code, _, err) = run(&[
        "new",
        family,
        "--panels",
        "6",
        "--panel-width",
        "18",
        "--height",
        "22",
        "--panel-load",
        "20",
        "-o",
        path.to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{err}");
    let (m, a) = solve(&std::fs::read_to_string(&path).unwrap());
    let f = a.cases[0].forces.iter().map(|f| f / KIP).collect();
    (m, f)
}

// Statics by hand for six 18 ft panels, 22 ft deep, 20 kip at L1..L5:
// R = 5 × 20 / 2 = 50 kip; M(x) = R·x − Σ P·(x − x_k) over loads left of x;
// shear in panel i (from x_(i−1) to x_i) V_i = R − 20·(i − 1); sinθ = 22/√(18² + 22²).
const W: f64 = 18.0;
const H: f64 = 22.0;
const P: f64 = 20.0;
const R: f64 = 50.0;

fn moment(x: f64) -> f64 {
    let mut m = R * x;
    for k in 1..6 {
        let xk = k as f64 * W;
        if xk < x {
            m -= P * (x - xk);
        }
    }
    m
}

fn sin_theta() -> f64 {
    H / W.hypot(H)
}

#[test]
fn generated_pratt_matches_method_of_joints() {
    let (m, f) = generated("pratt");
    let (_, a) = solve(&layout_to_ron(
        &generate(&GenerateOptions {
            family: Family::Pratt,
            panels: 6,
            panel_width: W,
            height: H,
            panel_load: Some(P),
            units: UnitSystem::Us,
            top_heights: None,
        })
        .unwrap(),
    ));
    // Reactions 50 kip each (statics: symmetric loading, ΣFy = 0).
    for r in &a.cases[0].reactions {
        assert_close!(r[1] / KIP, R, 1e-9);
    }
    // Joint L0: end post compression R/sinθ, bottom chord R·cotθ = M(18)/h (method of joints).
    assert_close!(f[between(&m, "L0", "U1")], -R / sin_theta(), 1e-9);
    assert_close!(f[between(&m, "L0", "L1")], moment(W) / H, 1e-9);
    for i in 2..=3usize {
        let (x0, x1) = ((i - 1) as f64 * W, i as f64 * W);
        let v = R - P * (i - 1) as f64;
        let (li0, li1) = (format!("L{}", i - 1), format!("L{i}"));
        let (ui0, ui1) = (format!("U{}", i - 1), format!("U{i}"));
        // Pratt: moment about U(i−1) for the bottom chord, about L(i) for the top (M/h).
        assert_close!(f[between(&m, &li0, &li1)], moment(x0) / H, 1e-9);
        assert_close!(f[between(&m, &ui0, &ui1)], -moment(x1) / H, 1e-9);
        // Diagonal U(i−1)-L(i) in tension: shear / sinθ.
        assert_close!(f[between(&m, &ui0, &li1)], v / sin_theta(), 1e-9);
    }
    // Verticals (joints): hanger L1-U1 carries the 20 kip at L1; L2-U2 the
    // vertical component of U2-L3, 10 kip compression; L3-U3 is a zero-force member.
    assert_close!(f[between(&m, "L1", "U1")], P, 1e-9);
    assert_close!(f[between(&m, "L2", "U2")], -(R - 2.0 * P), 1e-9);
    assert_close!(f[between(&m, "L3", "U3")], 0.0, 1e-9, 1e-9);
}

#[test]
fn generated_howe_matches_method_of_joints() {
    let (m, f) = generated("howe");
    assert_close!(f[between(&m, "L0", "U1")], -R / sin_theta(), 1e-9);
    for i in 2..=3usize {
        let (x0, x1) = ((i - 1) as f64 * W, i as f64 * W);
        let v = R - P * (i - 1) as f64;
        let (li0, li1) = (format!("L{}", i - 1), format!("L{i}"));
        let (ui0, ui1) = (format!("U{}", i - 1), format!("U{i}"));
        // Howe: diagonal L(i−1)-U(i); bottom chord by moments about U(i), top about L(i−1) (M/h).
        assert_close!(f[between(&m, &li0, &li1)], moment(x1) / H, 1e-9);
        assert_close!(f[between(&m, &ui0, &ui1)], -moment(x0) / H, 1e-9);
        // The diagonal runs down towards the support: compression, shear / sinθ.
        assert_close!(f[between(&m, &li0, &ui1)], -v / sin_theta(), 1e-9);
    }
    // Joint U1: the end post's vertical component R is taken by L1-U1 in tension (method of joints).
    assert_close!(f[between(&m, "L1", "U1")], R, 1e-9);
}

#[test]
fn generated_families_are_statically_determinate_and_stable() {
    for family in Family::names() {
        let fam = Family::from_name(family).unwrap();
        let layout = generate(&GenerateOptions {
            family: fam,
            panels: 6,
            panel_width: 5.0,
            height: 4.0,
            panel_load: Some(10.0),
            units: UnitSystem::Si,
            top_heights: None,
        })
        .unwrap();
        let m = load(&layout_to_ron(&layout));
        // m + r = 2j: the classic count for a plane pin-jointed truss (statics).
        let d = m.determinacy();
        assert_eq!(d.members + d.reactions, 2 * d.joints, "{family}");
        // Stable: the factorization finds no mechanism.
        analysis::analyse(&m).unwrap_or_else(|e| panic!("{family}: {e}"));
    }
}

#[test]
fn new_rejects_bad_input_with_exit_2() {
    let (code, _, err) = run(&[
        "new", "arch", "--panels", "4", "--span", "40", "--height", "5",
    ]);
    assert_eq!(code, 2);
    assert!(err.contains("not a truss family"), "{err}");
    let (code, _, err) = run(&[
        "new", "k-braced", "--panels", "5", "--span", "40", "--height", "5",
    ]);
    assert_eq!(code, 2);
    assert!(err.contains("even number"), "{err}");
    let (code, _, err) = run(&["new", "pratt", "--panels", "4", "--height", "5"]);
    assert_eq!(code, 2);
    assert!(err.contains("--panel-width"), "{err}");
    let (code, out, _) = run(&[
        "new",
        "polygonal",
        "--panels",
        "4",
        "--span",
        "40",
        "--height",
        "5",
        "--top-heights",
        "4,5,4",
    ]);
    assert_eq!(code, 0);
    assert!(out.contains("y: 5"), "{out}");
}

fn opts(m: &Model) -> RunOptions {
    RunOptions {
        method: rate::choose_method(m, None).unwrap(),
        jobs: Some(2),
        detail: true,
    }
}

fn run_all(m: &Model, text: &str, shard: Option<(usize, usize)>) -> Vec<sweep::VariantResult> {
    let s = panelpoint::input::sweep::load_sweep(text, m).unwrap();
    let idx = sweep::shard_indices(s.len(), shard);
    let mut out = Vec::new();
    sweep::run(m, &s, &idx, &opts(m), |r| {
        out.push(r);
        Ok::<(), ()>(())
    })
    .unwrap();
    out
}

#[test]
fn load_scale_sweep_equals_separate_scaled_runs() {
    let base = load(MILLRACE);
    let text = r#"(include_base: false, axes: [
        (name: "crowd", scale: "crowd", values: [0.5, 1.0, 2.0, 3.5]),
        (name: "deck", scale: "deck", values: [1.0, 1.3]),
    ])"#;
    let rows = run_all(&base, text, None);
    assert_eq!(rows.len(), 8);
    for r in &rows {
        assert_eq!(r.kind, sweep::Kind::LoadsOnly);
        let o = r.outcome.as_ref().unwrap();
        let (fc, fd) = ([0.5, 1.0, 2.0, 3.5][r.index / 2], [1.0, 1.3][r.index % 2]);
        // A separate run: the model with its loads scaled by hand, analysed afresh.
        let mut m = base.clone();
        for case in &mut m.cases {
            let f = if case.id == "crowd" { fc } else { fd };
            for l in &mut case.nodal {
                l.fy *= f;
            }
        }
        let a = analysis::analyse(&m).unwrap();
        let rt = rate::rate(&m, &a, rate::choose_method(&m, None).unwrap()).unwrap();
        let c = &rt.checks[rt.controlling.unwrap()];
        assert_close!(o.max_utilization.unwrap(), c.utilization, 1e-9);
        let crowd = a.cases.iter().find(|c| c.id == "crowd").unwrap();
        let deck = a.cases.iter().find(|c| c.id == "deck").unwrap();
        let defl = |c: &analysis::CaseResult| {
            c.displacements
                .iter()
                .fold(0.0f64, |a, d| a.max(d[0].hypot(d[1])))
        };
        assert_close!(o.max_deflection, defl(crowd).max(defl(deck)), 1e-9);
    }
    // Linearity (superposition): the crowd deflection at 2× is twice that at 1×.
    let base_a = analysis::analyse(&base).unwrap();
    let d1 = base_a.cases[1]
        .displacements
        .iter()
        .fold(0.0f64, |a, d| a.max(d[1].abs()));
    let mut m2 = base.clone();
    m2.cases[1].nodal.iter_mut().for_each(|l| l.fy *= 2.0);
    let d2 = analysis::analyse(&m2).unwrap().cases[1]
        .displacements
        .iter()
        .fold(0.0f64, |a, d| a.max(d[1].abs()));
    assert_close!(d2, 2.0 * d1, 1e-9);
}

#[test]
fn stiffness_and_topology_variants_match_fresh_analyses() {
    let base = load(MILLRACE);
    let s = panelpoint::input::sweep::load_sweep(MILLRACE_SWEEP, &base).unwrap();
    let rows = run_all(&base, MILLRACE_SWEEP, None);
    assert_eq!(rows.len(), s.len());
    let all: Vec<_> = (0..s.len()).map(|i| s.variant(i).into_owned()).collect();
    for (r, v) in rows.iter().zip(&all) {
        let m = sweep::apply(&base, v).unwrap();
        match analysis::analyse(&m) {
            // A fresh factorization agrees with the reused symbolic analysis (dense-free cross-check).
            Ok(a) => {
                let rt = rate::rate(&m, &a, rate::choose_method(&m, None).unwrap()).unwrap();
                let u = rt.checks[rt.controlling.unwrap()].utilization;
                assert_close!(
                    r.outcome.as_ref().unwrap().max_utilization.unwrap(),
                    u,
                    1e-9
                );
            }
            // Removing a diagonal of a determinate Pratt leaves a mechanism (statics).
            Err(_) => assert!(r.outcome.is_err(), "{}", r.name),
        }
    }
}

#[test]
fn union_of_shards_equals_the_whole_sweep() {
    let model = temp_model("shard-model.ron", MILLRACE);
    let sw = temp_model("shard-sweep.ron", MILLRACE_SWEEP);
    let (m, s) = (model.to_str().unwrap(), sw.to_str().unwrap());
    let (code, whole, err) = run(&["sweep", m, s, "--format", "csv", "--jobs", "2"]);
    assert_eq!(code, 0, "{err}");
    let whole: Vec<&str> = whole.lines().collect();
    let mut union: Vec<String> = Vec::new();
    for i in 1..=3 {
        let out = sw.with_file_name(format!("shard-{i}.csv"));
        let shard = format!("{i}/3");
        let (code, _, err) = run(&[
            "sweep",
            m,
            s,
            "--format",
            "csv",
            "--shard",
            &shard,
            "--out",
            out.to_str().unwrap(),
        ]);
        assert_eq!(code, 0, "{err}");
        let text = std::fs::read_to_string(&out).unwrap();
        assert!(!sweep_partial(&out).exists(), "partial file left behind");
        let lines: Vec<&str> = text.lines().collect();
        assert_eq!(lines[0], whole[0]);
        for l in &lines[1..] {
            let idx: usize = l.split(',').next().unwrap().parse().unwrap();
            assert_eq!(idx % 3, i - 1, "{l}");
            union.push(l.to_string());
        }
    }
    union.sort_by_key(|l| l.split(',').next().unwrap().parse::<usize>().unwrap());
    assert_eq!(union, whole[1..].to_vec());
}

fn sweep_partial(out: &std::path::Path) -> std::path::PathBuf {
    let mut n = out.file_name().unwrap().to_os_string();
    n.push(".partial");
    out.with_file_name(n)
}

#[test]
fn sweep_errors_name_the_problem_and_exit_2() {
    let model = temp_model("err-model.ron", MILLRACE);
    let bad = temp_model(
        "err-sweep.ron",
        r#"(variants: [(name: "oops", moves: [(node: "U9", dy: 1.0)])])"#,
    );
    let (code, _, err) = run(&["sweep", model.to_str().unwrap(), bad.to_str().unwrap()]);
    assert_eq!(code, 2);
    assert!(err.contains("no node \"U9\""), "{err}");
    let sw = temp_model("err-sweep2.ron", MILLRACE_SWEEP);
    let (code, _, err) = run(&[
        "sweep",
        model.to_str().unwrap(),
        sw.to_str().unwrap(),
        "--shard",
        "4/3",
    ]);
    assert_eq!(code, 2);
    assert!(err.contains("--shard"), "{err}");
}

#[test]
fn every_member_of_a_determinate_truss_is_critical() {
    // m + r = 2j and stable: removing any member leaves a mechanism (statics).
    for text in [FOUR_PANEL.to_string(), layout_to_ron(&pratt(6))] {
        let (m, a) = solve(&text);
        let losses = sweep::redundancy::scan(&m, &a, &opts(&m)).unwrap();
        assert_eq!(losses.len(), m.members.len());
        for l in &losses {
            assert!(l.critical, "{} not critical", m.members[l.member].id);
            assert!(l.max_utilization_after.is_none());
            // Fracture-critical exactly when in tension under the service loads.
            assert_eq!(l.fracture_critical, l.service_force > 0.0);
        }
    }
}

#[test]
fn a_counter_diagonal_makes_its_panel_redundant() {
    // Add the second diagonal L1-U2 to the four-panel truss's second panel:
    // degree 1 (m + r = 17 > 16), so the panel's members and that panel's
    // diagonals can each be lost (statics: one redundant in the panel).
    let text = FOUR_PANEL.replace(
        "(id: \"L2-U3\"",
        "(id: \"L1-U2\", start: \"L1\", end: \"U2\", section: \"web\", material: \"steel\"),\n        (id: \"L2-U3\"",
    );
    let (m, a) = solve(&text);
    assert_eq!(m.determinacy().degree(), 1);
    let losses = sweep::redundancy::scan(&m, &a, &opts(&m)).unwrap();
    let by = |id: &str| {
        losses
            .iter()
            .find(|l| m.members[l.member].id == id)
            .unwrap()
    };
    for id in ["U1-L2", "L1-U2", "U1-U2", "L1-L2"] {
        assert!(!by(id).critical, "{id}");
        assert!(by(id).max_utilization_after.unwrap() > 0.0);
    }
    for id in ["L0-L1", "L2-U3", "L3-L4"] {
        assert!(by(id).critical, "{id}");
    }
    let (code, out, _) = run(&[
        "redundancy",
        temp_model("red.ron", &text).to_str().unwrap(),
        "--format",
        "json",
    ]);
    assert_eq!(code, 0);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["members"].as_array().unwrap().len(), 14);
    assert_eq!(v["members"][0]["member"], "L0-L1");
    assert_eq!(v["members"][0]["critical"], true);
    assert!(v["members"][0]["max_utilization_after"].is_null());
}

fn pratt(n: usize) -> panelpoint::generate::TrussLayout {
    generate(&GenerateOptions {
        family: Family::Pratt,
        panels: n,
        panel_width: 18.0,
        height: 22.0,
        panel_load: Some(20.0),
        units: UnitSystem::Us,
        top_heights: None,
    })
    .unwrap()
}

/// The governing utilization of a fixed check and a fixed node's deflection.
fn objectives(m: &Model, member: usize, effect: usize, node: usize, case: usize) -> (f64, f64) {
    let a = analysis::analyse(m).unwrap();
    let r = rate::rate(m, &a, rate::choose_method(m, None).unwrap()).unwrap();
    let c = r
        .checks
        .iter()
        .find(|c| c.member == member && c.effect == effect)
        .unwrap();
    let d = a.cases[case].displacements[node];
    (c.utilization, d[0].hypot(d[1]))
}

fn check_against_finite_differences(text: &str) {
    let (m, a) = solve(text);
    let r = rate::rate(&m, &a, rate::choose_method(&m, None).unwrap()).unwrap();
    let s = panelpoint::sensitivity::sensitivity(&m, &a, &r, None).unwrap();
    assert!(!s.coordinates.is_empty());
    let h = 1e-4; // m
    let mut compared = 0;
    for c in &s.coordinates {
        // A moving load is held as nodal forces at the deck nodes (the
        // documented convention), while `rate` re-rolls it along the moved
        // deck. Along a level deck a vertical move changes the chainages
        // only to second order (√(a² + d²) − a ≈ d²/2a), so only the
        // horizontal moves of deck nodes are left out.
        if s.held.is_some() && m.live.deck.contains(&c.node) && c.axis == 0 {
            continue;
        }
        let mv = |sign: f64| {
            let mut mm = m.clone();
            let n = &mut mm.nodes[c.node];
            if c.axis == 0 {
                n.x += sign * h;
            } else {
                n.y += sign * h;
            }
            objectives(
                &mm,
                s.member,
                s.effect,
                s.deflection_node,
                s.deflection_case,
            )
        };
        let (p, q) = (mv(1.0), mv(-1.0));
        // Central difference (f(x+h) − f(x−h)) / 2h, error O(h²) (numerical analysis, from memory).
        let fd_u = (p.0 - q.0) / (2.0 * h);
        let fd_d = (p.1 - q.1) / (2.0 * h);
        assert_close!(c.d_utilization, fd_u, 1e-4, 1e-7);
        assert_close!(c.d_deflection, fd_d, 1e-4, 1e-9);
        compared += 1;
    }
    assert!(compared >= 4);
}

#[test]
fn sensitivities_match_central_finite_differences_four_panel() {
    check_against_finite_differences(FOUR_PANEL);
}

#[test]
fn sensitivities_match_central_finite_differences_generated() {
    // A generated Pratt and the demo, whose governing check is a compression
    // chord in some cases: the capacity's length dependence is exercised.
    check_against_finite_differences(&layout_to_ron(&pratt(6)));
    check_against_finite_differences(MILLRACE);
}

#[test]
fn sensitivity_of_a_compression_member_includes_slenderness() {
    // Make a top-chord check govern: only dead load on a slender chord.
    let (m, a) = solve(FOUR_PANEL);
    let r = rate::rate(&m, &a, rate::choose_method(&m, None).unwrap()).unwrap();
    // Worst compression check of case "dead".
    let worst = r
        .checks
        .iter()
        .filter(|c| c.force < 0.0 && r.effects[c.effect].case == Some(0))
        .max_by(|a, b| a.utilization.total_cmp(&b.utilization))
        .unwrap();
    assert!(worst.capacity < r.members[worst.member].tension_capacity);
    let (code, out, err) = run(&[
        "sensitivity",
        temp_model("sens.ron", FOUR_PANEL).to_str().unwrap(),
        "--case",
        "dead",
        "--format",
        "json",
    ]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["coordinates"].as_array().unwrap().len(), 12);
    let (code, _, err) = run(&[
        "sensitivity",
        temp_model("sens2.ron", FOUR_PANEL).to_str().unwrap(),
        "--case",
        "nope",
    ]);
    assert_eq!(code, 2);
    assert!(
        err.contains("no load case, combination or moving load"),
        "{err}"
    );
}

#[test]
fn sensitivity_of_a_buckling_check_matches_finite_differences() {
    // A generated Pratt with a slender chord section, so that an end post
    // or top chord buckling check governs and the capacity's dependence on
    // member length (KL/r) enters the derivative.
    let text = layout_to_ron(&pratt(6)).replace("i_in: 310", "i_in: 60");
    assert!(text.contains("i_in: 60"));
    let (m, a) = solve(&text);
    let r = rate::rate(&m, &a, rate::choose_method(&m, None).unwrap()).unwrap();
    let c = &r.checks[r.controlling.unwrap()];
    assert!(c.force < 0.0, "a compression check must govern");
    check_against_finite_differences(&text);
}

#[test]
fn sweep_json_parses_and_a_failed_run_keeps_the_old_file() {
    let model = temp_model("json-model.ron", MILLRACE);
    let sw = temp_model("json-sweep.ron", MILLRACE_SWEEP);
    let (code, out, err) = run(&[
        "sweep",
        model.to_str().unwrap(),
        sw.to_str().unwrap(),
        "--format",
        "json",
        "--detail",
    ]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let rows = v["variants"].as_array().unwrap();
    // 1 base + 6 listed + 5 × 4 × 2 product variants (the sweep file's own count).
    assert_eq!(rows.len(), 47);
    assert_eq!(rows[0]["members"].as_array().unwrap().len(), 21);
    assert!(rows[5]["error"].as_str().unwrap().contains("mechanism"));
    let target = temp_model("kept.csv", "old contents");
    let bad = temp_model("bad-sweep.ron", "(variants: [(scale: [(\"nope\", 2.0)])])");
    let (code, _, err) = run(&[
        "sweep",
        model.to_str().unwrap(),
        bad.to_str().unwrap(),
        "--out",
        target.to_str().unwrap(),
    ]);
    assert_eq!(code, 2);
    assert!(
        err.contains("no load case or moving load \"nope\""),
        "{err}"
    );
    assert_eq!(std::fs::read_to_string(&target).unwrap(), "old contents");
}
