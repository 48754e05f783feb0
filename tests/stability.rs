//! Stability and vibration against closed forms and hand calculations.

mod common;

use panelpoint::analysis::eigen::smallest_positive;
use panelpoint::stability::frame::{Frame, MassKind};
use std::f64::consts::PI;

/// A straight column along x of length `l` in `parts` elements, axial
/// force −1 N (unit compression), ends held as `hold_a`, `hold_b` (u, v, θ).
fn column(l: f64, ei: f64, parts: usize, hold_a: [bool; 3], hold_b: [bool; 3]) -> f64 {
    let mut f = Frame::default();
    let a = f.node(0.0, 0.0, hold_a);
    let b = f.node(l, 0.0, hold_b);
    f.member(
        &a,
        &b,
        a.dofs[2],
        b.dofs[2],
        parts,
        [1e6 * ei, ei, 0.0],
        -1.0,
        0,
    );
    let p = smallest_positive(&f.stiffness(), &f.geometric(), 1).unwrap();
    assert!(p[0].residual < 1e-8, "residual {}", p[0].residual);
    p[0].value
}

const PIN: [bool; 3] = [true, true, false];
const ROLL: [bool; 3] = [false, true, false];
const FIXED: [bool; 3] = [true, true, true];
const FREE: [bool; 3] = [false, false, false];
const SLIDE_FIXED: [bool; 3] = [false, true, true];

/// Euler: Pcr = π²EI/(KL)² with K = 1 pinned–pinned, 2 fixed–free, 0.5
/// fixed–fixed (closed forms, any mechanics text); fixed–pinned
/// Pcr = (βL)²·EI/L² with βL = 4.493409 the least root of tan x = x
/// (closed form; K = π/4.4934 = 0.6992). Within 0.1 % with 4 elements
/// (6 for fixed–pinned, 8 for fixed–fixed, whose shorter half-waves need
/// them: 4 give 0.2 % on fixed–pinned, 6 give 0.16 % on fixed–fixed).
#[test]
fn euler_columns_within_a_tenth_of_a_percent() {
    let (l, ei) = (6.0, 2.1e11 * 8.0e-6);
    let euler = |k: f64| PI * PI * ei / (k * l).powi(2);
    let cases = [
        ("pinned-pinned", PIN, ROLL, 4, euler(1.0)),
        ("fixed-free", FIXED, FREE, 4, euler(2.0)),
        (
            "fixed-pinned",
            FIXED,
            ROLL,
            6,
            4.493_409_457_909_064f64.powi(2) * ei / (l * l),
        ),
        ("fixed-fixed", FIXED, SLIDE_FIXED, 8, euler(0.5)),
    ];
    for (name, a, b, parts, expected) in cases {
        let got = column(l, ei, parts, a, b);
        let rel = (got - expected).abs() / expected;
        assert!(rel < 1e-3, "{name}: {got} vs {expected} ({rel:.2e})");
    }
    // Convergence is from above (a stiffer discrete model): 2 elements on
    // a pinned column are further off than 4.
    let two = column(l, ei, 2, PIN, ROLL);
    let four = column(l, ei, 4, PIN, ROLL);
    assert!(two > four && four > euler(1.0));
}

/// n rigid bars of length l in a line, pinned at one end, on a roller at
/// the other, a lateral spring k at each interior joint, end thrust P:
/// Pcr = k·l/(2 + 2·cos(π/n)) (closed form: the lowest root of the
/// tridiagonal k − (P/l)·[2, −1] system). The bars are beam elements with
/// EI = 10⁶·k·l³ (rigid by comparison: error of order 10⁻⁶).
#[test]
fn chain_of_bars_on_springs_closed_form() {
    let (l, k) = (2.0, 5.0e4);
    for n in [2usize, 3, 5, 8] {
        let mut f = Frame::default();
        let nodes: Vec<_> = (0..=n)
            .map(|i| {
                // Node rotations held: the bars carry their own (pins).
                let hold = if i == 0 {
                    FIXED
                } else if i == n {
                    SLIDE_FIXED
                } else {
                    [false, false, true]
                };
                f.node(i as f64 * l, 0.0, hold)
            })
            .collect();
        for i in 0..n {
            let (ra, rb) = (f.dof(), f.dof());
            let ei = 1e6 * k * l.powi(3);
            f.member(
                &nodes[i],
                &nodes[i + 1],
                ra,
                rb,
                1,
                [1e3 * ei, ei, 0.0],
                -1.0,
                i,
            );
        }
        for node in &nodes[1..n] {
            f.springs.push((node.dofs[1], k));
        }
        let p = smallest_positive(&f.stiffness(), &f.geometric(), 1).unwrap();
        let expected = k * l / (2.0 + 2.0 * (PI / n as f64).cos());
        let rel = (p[0].value - expected).abs() / expected;
        assert!(rel < 1e-5, "n = {n}: {} vs {expected}", p[0].value);
    }
}

/// A pin-jointed truss buckles in its plane where its weakest compression
/// member does: λcr = min over compressed members of π²·E·I_in/(L²·|N|)
/// (Euler, pinned ends: the joints give no rotational restraint). The
/// four-panel Pratt truss of tests/data under its dead load.
#[test]
fn pin_jointed_truss_buckles_at_its_weakest_member() {
    let (m, a) = common::solve(common::FOUR_PANEL);
    let effects: Vec<(String, Vec<f64>)> = a
        .cases
        .iter()
        .map(|c| (c.id.clone(), c.forces.clone()))
        .collect();
    let rigid = vec![false; m.nodes.len()];
    let res = panelpoint::stability::in_plane::buckling(&m, &rigid, 4, &effects).unwrap();
    let mut checked = 0;
    for (r, (_, forces)) in res.iter().zip(&effects) {
        let mut weakest = f64::INFINITY;
        for (mi, mem) in m.members.iter().enumerate() {
            if forces[mi] < 0.0 {
                let (s, e) = (&m.nodes[mem.start], &m.nodes[mem.end]);
                let l = (e.x - s.x).hypot(e.y - s.y);
                let ei = m.materials[mem.material].e * m.sections[mem.section].i_in;
                weakest = weakest.min(PI * PI * ei / (l * l * forces[mi].abs()));
            }
        }
        if weakest.is_finite() {
            let got = r.critical_factor.unwrap();
            let rel = (got - weakest).abs() / weakest;
            // The joints move a little in the mode; 0.5 % covers that and
            // the 4-element discretization.
            assert!(
                rel < 5e-3,
                "{}: λcr {got} vs weakest member {weakest}",
                r.effect
            );
            assert!(r.residual < 1e-6);
            // The weakest member takes part with K = 1 (to the same 0.5 %).
            assert!(r.members.iter().any(|k| (k.k - 1.0).abs() < 5e-3));
            checked += 1;
        }
    }
    assert!(checked > 0);
}

/// Making every joint of the pin-jointed truss rigid adds restraint, so
/// λcr can only rise (Rayleigh quotient: more stiffness, same G); with
/// stiff chords restraining the slender web members it rises clearly.
#[test]
fn rigid_joints_raise_the_critical_factor() {
    let (m, a) = common::solve(common::FOUR_PANEL);
    let effects = vec![(a.cases[0].id.clone(), a.cases[0].forces.clone())];
    let pinned = vec![false; m.nodes.len()];
    let rigid = vec![true; m.nodes.len()];
    let lp = panelpoint::stability::in_plane::buckling(&m, &pinned, 4, &effects).unwrap()[0]
        .critical_factor
        .unwrap();
    let lr = panelpoint::stability::in_plane::buckling(&m, &rigid, 4, &effects).unwrap()[0]
        .critical_factor
        .unwrap();
    assert!(lr > 1.05 * lp, "rigid {lr} vs pinned {lp}");
}

/// Simply supported beam: ω_n = (nπ/L)²·√(EI/m) (closed form, any
/// structural-dynamics text); consistent mass, 12 elements, within 0.1 %
/// for the first three modes.
#[test]
fn simply_supported_beam_frequencies() {
    let (l, ei, m) = (10.0, 2.1e11 * 1.2e-4, 150.0);
    let mut f = Frame::default();
    let a = f.node(0.0, 0.0, PIN);
    let b = f.node(l, 0.0, ROLL);
    f.member(&a, &b, a.dofs[2], b.dofs[2], 12, [1e4 * ei, ei, m], 0.0, 0);
    let p = smallest_positive(&f.stiffness(), &f.mass(MassKind::Consistent), 3).unwrap();
    for (i, pair) in p.iter().enumerate() {
        let n = (i + 1) as f64;
        let expected = (n * PI / l).powi(2) * (ei / m).sqrt();
        let got = pair.value.sqrt();
        assert!(
            (got - expected).abs() / expected < 1e-3,
            "mode {n}: {got} vs {expected}"
        );
    }
}

/// A long uniformly compressed chord on closely spaced springs k at
/// spacing a (a continuous foundation c = k/a): Engesser's
/// Pcr = 2·√(c·EI) (closed form, Timoshenko & Gere, *Theory of Elastic
/// Stability*, §2.10, from memory), valid when the half-wave
/// π·(EI/c)^¼ = 9.9 m is long against a = 1.0 m and short against the
/// 60 m chord. Within 1 %.
#[test]
fn chord_on_elastic_foundation_engesser() {
    use panelpoint::stability::u_frame::{chord_buckling, Chord};
    let (ei, c, a, span) = (1.0e7, 1.0e5, 1.0, 60.0);
    let n = (span / a) as usize;
    let chord = Chord {
        lengths: vec![a; n],
        ei: vec![ei; n],
        forces: vec![-1.0; n],
        springs: (0..=n)
            .map(|i| if i == 0 || i == n { 0.0 } else { c * a })
            .collect(),
        masses: vec![0.0; n + 1],
        parts: 1,
    };
    let b = chord_buckling(&chord).unwrap();
    let expected = 2.0 * (c * ei).sqrt();
    let got = b.critical_factor.unwrap();
    assert!(
        (got - expected).abs() / expected < 0.01,
        "{got} vs {expected}"
    );
    assert!(b.residual < 1e-6);
    // Every segment carries the same force, so K = π/a·√(EI/Pcr) for all:
    // by hand π/1.0·√(1e7/2e6) = 7.025.
    let (_, k) = b.segments[n / 2].unwrap();
    assert!((k - PI / a * (ei / got).sqrt()).abs() < 1e-9 && (k - 7.025).abs() < 0.07);
}

/// The U-frame spring by hand (EN 1993-2 D.2.4 with the connection term):
/// E = 200 GPa, I_v = 2.0e-5 m⁴, h_v = 0.9 m, h = 1.0 m, I_q = 3.0e-4 m⁴,
/// b_q = 3.0 m, f_c = 1.0e-7 rad/(N·m):
/// h_v³/(3EI_v) = 0.729/(3·2e11·2e-5) = 0.729/1.2e7 = 6.075e-8 m/N,
/// h²·b_q/(2EI_q) = 3.0/(2·2e11·3e-4) = 3.0/1.2e8 = 2.5e-8 m/N,
/// h²·f_c = 1.0e-7 m/N; δ = 1.8575e-7 m/N, C_d = 1/δ = 5.3836e6 N/m.
#[test]
fn u_frame_spring_by_hand() {
    use panelpoint::stability::u_frame::{spring, UFrameInput};
    let mut u = UFrameInput {
        chord: vec![],
        frames_at: vec![],
        e: 2.0e11,
        vertical_i: 2.0e-5,
        vertical_height: 0.9,
        height: 1.0,
        floor_beam_i: 3.0e-4,
        floor_beam_span: 3.0,
        connection_flexibility: 1.0e-7,
        spring: None,
        use_in_rate: false,
    };
    let s = spring(&u);
    assert!((s.delta_vertical - 6.075e-8).abs() < 1e-12);
    assert!((s.delta_floor_beam - 2.5e-8).abs() < 1e-12);
    assert!((s.delta_connection - 1.0e-7).abs() < 1e-15);
    assert!((s.stiffness - 5.3836e6).abs() < 5e2, "{}", s.stiffness);
    u.spring = Some(1.0e6);
    assert_eq!(spring(&u).stiffness, 1.0e6);
}

/// One intermediate lateral spring at mid-length of a pinned column of
/// length L: the column buckles between supports, Pcr = π²EI/(L/2)², once
/// k ≥ 16π²EI/L³ (the ideal brace stiffness, Timoshenko & Gere ch. 2, from memory, and
/// Winter's 2P/a with a = L/2, from memory); with no spring Pcr = π²EI/L²;
/// in between it lies between the two.
#[test]
fn chord_with_one_spring_ideal_brace() {
    use panelpoint::stability::u_frame::{chord_buckling, Chord};
    let (ei, l) = (4.0e6, 8.0f64);
    let ideal = 16.0 * PI * PI * ei / l.powi(3);
    let make = |k: f64| Chord {
        lengths: vec![l / 2.0; 2],
        ei: vec![ei; 2],
        forces: vec![-1.0; 2],
        springs: vec![0.0, k, 0.0],
        masses: vec![0.0; 3],
        parts: 4,
    };
    let lam = |k: f64| chord_buckling(&make(k)).unwrap().critical_factor.unwrap();
    let (p1, p2) = (PI * PI * ei / (l * l), 4.0 * PI * PI * ei / (l * l));
    assert!((lam(0.0) - p1).abs() / p1 < 1e-3);
    assert!((lam(1.01 * ideal) - p2).abs() / p2 < 1e-3);
    assert!((lam(10.0 * ideal) - p2).abs() / p2 < 1e-3);
    let mid = lam(0.5 * ideal);
    assert!(mid > 1.1 * p1 && mid < 0.99 * p2, "{mid}");
}

fn demo() -> String {
    std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/models/tanners-brook-pony.ron"
    ))
    .unwrap()
}

/// The demo through the command line: fixed JSON names, every case and
/// combination, the caution, and the U-frame spring by hand from the
/// model's numbers (E = 29,000 ksi, I_v = 24 in⁴, h_v = 78 in, h = 87 in,
/// I_q = 900 in⁴, b_q = 132 in, f_c = 2e-6 rad/(kip·ft) = 1.6667e-7
/// rad/(kip·in)): δ = 78³/(3·29000·24) + 87²·132/(2·29000·900) +
/// 87²·1.6667e-7 = 0.227276 + 0.019140 + 0.001262 = 0.247678 in/kip,
/// C_d = 4.0375 kip/in = 48.45 kip/ft.
#[test]
fn stability_command_json() {
    let path = common::temp_model("pony.ron", &demo());
    let out = path.with_extension("json");
    let (code, stdout, stderr) = common::run(&[
        "stability",
        path.to_str().unwrap(),
        "--format",
        "json",
        "-o",
        out.to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{stderr}");
    assert!(stdout.is_empty());
    let v: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&out).unwrap()).unwrap();
    assert!(v["caution"]
        .as_str()
        .unwrap()
        .contains("qualified engineer"));
    let cases: Vec<&str> = v["in_plane"]
        .as_array()
        .unwrap()
        .iter()
        .map(|e| e["case"].as_str().unwrap())
        .collect();
    assert_eq!(cases, ["dead", "crowd", "strength-i"]);
    for e in v["in_plane"].as_array().unwrap() {
        assert!(e["critical_factor"].as_f64().unwrap() > 1.0);
        assert!(e["residual"].as_f64().unwrap() < 1e-6);
    }
    let cd = v["u_frame"]["spring"]["stiffness"].as_f64().unwrap();
    assert!((cd - 48.45).abs() < 0.01, "{cd}");
    // The factored combination's chord margin is checked against 1.5.
    let strength = &v["u_frame"]["results"][2];
    assert_eq!(strength["required"].as_f64(), Some(1.5));
    assert_eq!(
        strength["ok"].as_bool(),
        Some(strength["critical_factor"].as_f64().unwrap() >= 1.5)
    );
    // Chord members' K from the U-frames: above 1 for this soft frame.
    for m in strength["members"].as_array().unwrap() {
        assert!(m["k"].as_f64().unwrap() > 1.0);
    }
    let f = v["vibration"]["vertical_frequency"].as_f64().unwrap();
    assert!(f > 1.0 && f < 20.0, "{f}");
    assert!(v["vibration"]["deflection"]["value"].as_f64().unwrap() > 0.0);
}

/// The text report names the clauses beside the numbers.
#[test]
fn stability_command_text() {
    let path = common::temp_model("pony.ron", &demo());
    let (code, stdout, stderr) = common::run(&["stability", path.to_str().unwrap()]);
    assert_eq!(code, 0, "{stderr}");
    for needle in [
        "qualified engineer",
        "EN 1993-2",
        "6.14.2.9",
        "Pedestrian Bridges",
        "EN 1990",
        "span/360",
    ] {
        assert!(stdout.contains(needle), "missing {needle}:\n{stdout}");
    }
}

/// `rate` takes the chord's k_out from the U-frames when the model says
/// so, and says so; without `use_in_rate` it keeps the user's K.
#[test]
fn rate_uses_u_frame_k_when_asked() {
    let path = common::temp_model("pony.ron", &demo());
    let (code, stdout, stderr) = common::run(&["rate", path.to_str().unwrap()]);
    assert_eq!(code, 0, "{stderr}");
    assert!(stdout.contains("from its U-frames"), "{stdout}");
    assert!(stdout.contains("member \"U2-U3\": k_out"));
    let off = demo().replace("use_in_rate: true", "use_in_rate: false");
    let path = common::temp_model("pony.ron", &off);
    let (code, stdout, _) = common::run(&["rate", path.to_str().unwrap()]);
    assert_eq!(code, 0);
    assert!(!stdout.contains("from its U-frames"));
}

/// Bad stability input: an unknown chord node and a chord gap are named,
/// exit 2, nothing on standard output.
#[test]
fn bad_stability_input_is_named() {
    let bad = demo().replace("chord: [\"L0\", \"U1\"", "chord: [\"L0\", \"U9\"");
    let path = common::temp_model("pony.ron", &bad);
    let (code, stdout, stderr) = common::run(&["stability", path.to_str().unwrap()]);
    assert_eq!(code, 2);
    assert!(stdout.is_empty());
    assert!(stderr.contains("\"U9\""), "{stderr}");
    let gap = demo().replace(
        "chord: [\"L0\", \"U1\", \"U2\"",
        "chord: [\"L0\", \"U2\", \"U1\"",
    );
    let path = common::temp_model("pony.ron", &gap);
    let (code, _, stderr) = common::run(&["stability", path.to_str().unwrap()]);
    assert_eq!(code, 2);
    assert!(
        stderr.contains("no member joins \"L0\" and \"U2\""),
        "{stderr}"
    );
}

/// The sparse subspace iteration (on the project's sparse Cholesky) gives
/// the dense solver's λcr on the four-panel truss, rigid and pinned joints,
/// to 10⁻⁸, with a checked residual; and a pinned Euler column through it
/// within 0.1 % (closed form π²EI/L²).
#[test]
fn sparse_subspace_iteration_matches_dense() {
    use panelpoint::analysis::eigen_sparse::{smallest_positive as sparse, SparseSym};
    use panelpoint::stability::frame::Matrix;
    use panelpoint::stability::in_plane::{buckling_with, Solver};
    let (m, a) = common::solve(common::FOUR_PANEL);
    let effects: Vec<(String, Vec<f64>)> = a
        .cases
        .iter()
        .map(|c| (c.id.clone(), c.forces.clone()))
        .collect();
    for rigid in [false, true] {
        let r = vec![rigid; m.nodes.len()];
        let d = buckling_with(&m, &r, 4, &effects, Solver::Dense).unwrap();
        let s = buckling_with(&m, &r, 4, &effects, Solver::Sparse).unwrap();
        for (x, y) in d.iter().zip(&s) {
            match (x.critical_factor, y.critical_factor) {
                (Some(p), Some(q)) => {
                    assert!(
                        (p - q).abs() / p < 1e-8,
                        "{}: dense {p} sparse {q}",
                        x.effect
                    );
                    assert!(y.residual < 1e-6);
                }
                (p, q) => assert_eq!(p, q),
            }
        }
    }
    let (l, ei) = (5.0, 1.0e6);
    let mut f = Frame::default();
    let na = f.node(0.0, 0.0, PIN);
    let nb = f.node(l, 0.0, ROLL);
    f.member(
        &na,
        &nb,
        na.dofs[2],
        nb.dofs[2],
        8,
        [1e4 * ei, ei, 0.0],
        -1.0,
        0,
    );
    let k = SparseSym::new(f.n_dofs, f.triplets(Matrix::Stiffness));
    let g = SparseSym::new(f.n_dofs, f.triplets(Matrix::Geometric));
    let p = sparse(&k, &g, 2).unwrap();
    let euler = PI * PI * ei / (l * l);
    assert!((p[0].value - euler).abs() / euler < 1e-3, "{}", p[0].value);
    // Second mode: two half-waves, 4π²EI/L² (closed form), within 0.5 %.
    assert!(
        (p[1].value - 4.0 * euler).abs() / (4.0 * euler) < 5e-3,
        "{}",
        p[1].value
    );
}

/// The SVG of the mode parses, carries the critical factor of the case
/// asked for (the same number as the JSON) and the caution; an unknown
/// case is a usage error (exit 2).
#[test]
fn stability_mode_svg() {
    let path = common::temp_model("pony.ron", &demo());
    let svg = path.with_extension("svg");
    let (code, _, stderr) = common::run(&[
        "stability",
        path.to_str().unwrap(),
        "--format",
        "svg",
        "--case",
        "strength-i",
        "-o",
        svg.to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{stderr}");
    let text = std::fs::read_to_string(&svg).unwrap();
    let doc = roxmltree::Document::parse(&text).unwrap();
    assert!(doc.descendants().any(|n| n.has_tag_name("polyline")));
    let (_, json, _) = common::run(&["stability", path.to_str().unwrap(), "--format", "json"]);
    let v: serde_json::Value = serde_json::from_str(&json).unwrap();
    let lam = v["in_plane"][2]["critical_factor"].as_f64().unwrap();
    assert!(text.contains(&format!("= {lam:.3}")), "{lam}");
    assert!(text.contains("strength-i") && text.contains("qualified engineer"));
    let (code, _, stderr) = common::run(&[
        "stability",
        path.to_str().unwrap(),
        "--format",
        "svg",
        "--case",
        "nope",
    ]);
    assert_eq!(code, 2);
    assert!(stderr.contains("\"nope\""));
}

/// Rayleigh's method (any structural-dynamics text): with the static
/// deflection (u, v) under the masses' own weights as the trial shape,
/// ω² ≈ g·Σm·|v| / Σm·(u² + v²) is an upper bound of the fundamental ω² and,
/// for a simply supported truss, close to it. The demo's lowest vertical
/// frequency must lie at or below Rayleigh's value and within 3 % of it.
#[test]
fn vertical_frequency_agrees_with_rayleigh() {
    use panelpoint::model::{CaseKind, LoadCase, NodalLoad};
    use panelpoint::stability::vibration::{node_masses, vibration};
    let m = common::load(&demo());
    let v = m.stability.vibration.clone().unwrap();
    let res = vibration(&m, &v, 4).unwrap();
    let f = res.modes[res.vertical.unwrap()].frequency;
    let (masses, _) = node_masses(&m, &v);
    let g = panelpoint::stability::chord::G;
    let mut mm = m.clone();
    mm.combinations.clear();
    mm.cases = vec![LoadCase {
        id: "weight".into(),
        kind: CaseKind::Dead,
        nodal: masses
            .iter()
            .enumerate()
            .map(|(node, &mi)| NodalLoad {
                node,
                fx: 0.0,
                fy: -mi * g,
            })
            .collect(),
        ..Default::default()
    }];
    let a = panelpoint::analysis::analyse(&mm).unwrap();
    let d = &a.cases[0].displacements;
    let (mut num, mut den) = (0.0, 0.0);
    for (i, &mi) in masses.iter().enumerate() {
        num += mi * g * d[i][1].abs();
        den += mi * (d[i][0].powi(2) + d[i][1].powi(2));
    }
    let rayleigh = (num / den).sqrt() / (2.0 * PI);
    assert!(
        f <= rayleigh * (1.0 + 1e-9),
        "{f} above Rayleigh's {rayleigh}"
    );
    assert!((rayleigh - f) / f < 0.03, "{f} vs Rayleigh {rayleigh}");
}

/// A temperature change on a statically determinate truss causes no
/// member force (statics, by hand: the truss is free to expand), so its
/// round-off forces must give no critical factor, while the dead load
/// does.
#[test]
fn round_off_forces_give_no_critical_factor() {
    let text = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/models/four_panel_live.ron"
    ))
    .unwrap();
    let (m, a) = common::solve(&text);
    let r = panelpoint::stability::run::run(&m, &a).unwrap();
    let get = |id: &str| {
        r.in_plane
            .iter()
            .find(|e| e.effect == id)
            .and_then(|e| e.buckling.as_ref())
            .and_then(|b| b.critical_factor)
    };
    assert_eq!(get("warm"), None);
    assert!(get("dead").unwrap() > 1.0);
}
