//! Tension-only members (issue 16): the active-set analysis against statics
//! by hand, the force method for the one redundant of a counter-braced
//! panel, equilibrium, the event-traced rating factor, redundancy and the
//! typed errors.
//!
//! The truss: a three-panel Pratt, panels a = 16 ft, height h = 12 ft, so a
//! diagonal is 20 ft long with sin θ = 0.6, cos θ = 0.8. The middle panel
//! L1-L2-U2-U1 has crossed rods U1-L2 (b) and L1-U2 (a), both tension-only.
//! Sections: chords and end posts 10 in², verticals 4 in², rods 2 in²;
//! E = 29,000 ksi.

mod common;
use common::*;
use panelpoint::analysis::{self, results::AnalysisError};

const SIN: f64 = 0.6;

/// The truss with `extra_member` lines, the rods' own fields, and cases.
fn pratt(rod_a: &str, rod_b: &str, cases: &str, extra: &str) -> String {
    format!(
        r#"(
    title: "three-panel counter test",
    units: (length: "ft", force: "kip", section: "in", stress: "ksi"),
    materials: [(id: "s", e: 29000.0, fy: 36.0, fu: 58.0)],
    sections: [
        (id: "chord", area: 10.0, i_in: 100.0, i_out: 100.0),
        (id: "vert", area: 4.0, i_in: 20.0, i_out: 20.0),
        (id: "rod", area: 2.0, i_in: 0.3, i_out: 0.3),
    ],
    nodes: [
        (id: "L0", x: 0.0, y: 0.0), (id: "L1", x: 16.0, y: 0.0),
        (id: "L2", x: 32.0, y: 0.0), (id: "L3", x: 48.0, y: 0.0),
        (id: "U1", x: 16.0, y: 12.0), (id: "U2", x: 32.0, y: 12.0),
    ],
    members: [
        (id: "L0-L1", start: "L0", end: "L1", section: "chord", material: "s"),
        (id: "L1-L2", start: "L1", end: "L2", section: "chord", material: "s"),
        (id: "L2-L3", start: "L2", end: "L3", section: "chord", material: "s"),
        (id: "U1-U2", start: "U1", end: "U2", section: "chord", material: "s"),
        (id: "L0-U1", start: "L0", end: "U1", section: "chord", material: "s"),
        (id: "U2-L3", start: "U2", end: "L3", section: "chord", material: "s"),
        (id: "L1-U1", start: "L1", end: "U1", section: "vert", material: "s"),
        (id: "L2-U2", start: "L2", end: "U2", section: "vert", material: "s"),
        (id: "a", start: "L1", end: "U2", section: "rod", material: "s"{rod_a}),
        (id: "b", start: "U1", end: "L2", section: "rod", material: "s"{rod_b}),
        {extra}
    ],
    supports: [(node: "L0", kind: Pin), (node: "L3", kind: Roller)],
    load_cases: [{cases}],
)"#
    )
}

const TO: &str = ", tension_only: true";

fn force(m: &panelpoint::model::Model, a: &analysis::Analysis, case: usize, id: &str) -> f64 {
    a.cases[case].forces[member(m, id)] / KIP
}

/// Statics by hand (method of sections through the middle panel): P at L1
/// gives R0 = 2P/3, so the panel shear is V = R0 − P = −P/3; only a rod
/// pulling the left part up can carry it, rod a (L1 → U2), with
/// N_a·sin θ = P/3, N_a = P/(3·0.6) = 5P/9; rod b would be compressed and is
/// slack (N_b = 0). P at L2 is the mirror image: N_b = 5P/9, N_a = 0.
#[test]
fn counter_panel_by_hand_statics() {
    let text = pratt(
        TO,
        TO,
        r#"(id: "left", loads: [(node: "L1", fy: -18.0)]), (id: "right", loads: [(node: "L2", fy: -18.0)])"#,
        "",
    );
    let (m, a) = solve(&text);
    assert!(
        force(&m, &a, 0, "b").abs() < 1e-9,
        "slack rod b carries no force"
    );
    assert_close!(force(&m, &a, 0, "a"), 5.0 * 18.0 / 9.0, 1e-9);
    assert!(force(&m, &a, 1, "a").abs() < 1e-9);
    assert_close!(force(&m, &a, 1, "b"), 10.0, 1e-9);
    // The panel shear through the other diagonal: V / sin θ (hand statics).
    assert_close!(force(&m, &a, 0, "a") * SIN, 18.0 / 3.0, 1e-9);
    // The same truss with the rods able to push shares the shear between
    // them and compresses b: what the linear analysis got wrong.
    let (ml, al) = solve(&pratt(
        "",
        "",
        r#"(id: "left", loads: [(node: "L1", fy: -18.0)])"#,
        "",
    ));
    assert!(force(&ml, &al, 0, "b") < -1.0);
    // Equilibrium of the nonlinear solution: reactions balance the load
    // (ΣFy = 0: R0 + R3 = 18 kip, R0 = 2/3·18 = 12 kip by moments about L3),
    // residual within the analysis limit.
    for r in &a.cases {
        assert!(
            r.relative_residual < 1e-9,
            "residual {}",
            r.relative_residual
        );
        assert!((r.load_sum[1] + r.reaction_sum[1]).abs() < 1e-9 * KIP);
    }
    assert_close!(a.cases[0].reactions[0][1] / KIP, 12.0, 1e-9);
    assert!(a
        .warnings
        .iter()
        .any(|w| w.contains("slack") && w.contains("\"left\"")));
}

/// Force method by hand for the one redundant of the panel (unit-load
/// method). The self-stress state per unit tension X in both rods: rods
/// +1, verticals L1-U1 and L2-U2 −sin θ = −0.6, chords U1-U2 and L1-L2
/// −cos θ = −0.8, every other member 0 (joint equilibrium at L1, L2, U1,
/// U2). Flexibilities f = L/EA (in/kip): rod 240/(29000·2), vertical
/// 144/(29000·4), chord 192/(29000·10). Rod a drawn up by δ = 0.05 in
/// (stress-free elongation −δ): X = δ / Σ s²f, both rods in tension.
/// Under P at L1 with both rods taut, the primary truss (b cut) carries
/// N_a = 5P/9, L1-U1 = 2P/3, U1-U2 = −8P/9, L1-L2 = 4P/9 (joints by hand),
/// so X_P = −Σ N₀ s f / Σ s²f and N_b = X + X_P; and always
/// N_a − N_b = 5P/9 (the panel shear, statics). A light load keeps both
/// rods taut; a heavy one slackens b and a carries 5P/9 alone.
#[test]
fn drawn_up_counter_taut_then_slack() {
    let e = 29000.0;
    let (fd, fv, fc) = (240.0 / (e * 2.0), 144.0 / (e * 4.0), 192.0 / (e * 10.0));
    let ssf = 2.0 * fd + 2.0 * 0.36 * fv + 2.0 * 0.64 * fc;
    let x = 0.05 / ssf;
    let sum_n0sf = |p: f64| {
        5.0 * p / 9.0 * fd - 0.6 * (2.0 * p / 3.0) * fv + 0.8 * (8.0 * p / 9.0) * fc
            - 0.8 * (4.0 * p / 9.0) * fc
    };
    let text = pratt(
        ", tension_only: true, slack: \"-0.05 in\"",
        TO,
        r#"(id: "none", loads: [(node: "L0", fy: -1.0)]),
           (id: "light", loads: [(node: "L1", fy: -2.0)]),
           (id: "heavy", loads: [(node: "L1", fy: -40.0)])"#,
        "",
    );
    let (m, a) = solve(&text);
    // No load in the members (the load sits on the pin): the self-stress.
    assert_close!(force(&m, &a, 0, "a"), x, 1e-6);
    assert_close!(force(&m, &a, 0, "b"), x, 1e-6);
    assert_close!(force(&m, &a, 0, "L1-U1"), -0.6 * x, 1e-6);
    // Light: both taut, the force method's share and the statics difference.
    let nb = x - sum_n0sf(2.0) / ssf;
    assert!(nb > 0.0);
    assert_close!(force(&m, &a, 1, "b"), nb, 1e-6);
    assert_close!(
        force(&m, &a, 1, "a") - force(&m, &a, 1, "b"),
        10.0 / 9.0,
        1e-9
    );
    // Heavy: X − 0.2034·40 < 0, so b is slack; a = 5·40/9.
    assert!(x - sum_n0sf(40.0) / ssf < 0.0);
    assert!(force(&m, &a, 2, "b").abs() < 1e-9);
    assert_close!(force(&m, &a, 2, "a"), 200.0 / 9.0, 1e-9);
}

/// A model without tension-only members takes the linear path: the same
/// numbers bit for bit as the solve of the same stiffness (the demo model,
/// analysed both ways through the library's two entry points).
#[test]
fn no_tension_only_member_is_unchanged() {
    let m = load(include_str!("../models/four_panel_live.ron"));
    assert!(!m.has_tension_only());
    let a = analysis::analyse(&m).unwrap();
    let p = analysis::results::Prepared::new(&m).unwrap();
    let c = p.solve_cases(&m, &m.cases).unwrap();
    for (x, y) in a.cases.iter().zip(&c) {
        assert_eq!(x.forces, y.forces);
    }
}

/// A truss that needs a rod to push is a mechanism once its rods are
/// slack: the typed error names the slack members, the node and the
/// direction. Both rods of the middle panel run L1–U2 here (b turned to lie
/// beside a); P at L2 gives a panel shear only a U1–L2 rod could carry in
/// tension (statics, as above), so both rods would be compressed, both go
/// slack, and the panel is a parallelogram with no diagonal.
#[test]
fn slack_mechanism_is_a_typed_error() {
    let text = pratt(
        TO,
        ", tension_only: true",
        r#"(id: "right", loads: [(node: "L2", fy: -18.0)])"#,
        "",
    )
    .replace(r#"start: "U1", end: "L2""#, r#"start: "U2", end: "L1""#);
    let m = load(&text);
    match analysis::analyse(&m) {
        Err(AnalysisError::SlackMechanism {
            state,
            slack,
            motion,
        }) => {
            assert!(state.contains("right"), "{state}");
            assert!(slack.contains('a') && slack.contains('b'), "{slack}");
            assert!(motion.contains("node"), "{motion}");
            let text = AnalysisError::SlackMechanism {
                state,
                slack,
                motion,
            }
            .to_string();
            assert!(text.contains("mechanism"), "{text}");
        }
        other => panic!("expected a slack mechanism, got {:?}", other.err()),
    }
}

/// Validation: slack on a member that is not tension-only, and a slack as
/// long as the member, are errors naming the member in the model's units.
#[test]
fn slack_validation_names_the_member() {
    let text = pratt(
        ", slack: \"0.1 in\"",
        ", tension_only: true, slack: \"30 in\"",
        r#"(id: "d", loads: [(node: "L1", fy: -1.0)])"#,
        "",
    );
    let err = panelpoint::input::load_str(&text)
        .err()
        .expect("refused")
        .to_string();
    assert!(
        err.contains("member \"a\"") && err.contains("not tension_only"),
        "{err}"
    );
    assert!(
        err.contains("member \"b\"") && err.contains("30.0 in"),
        "{err}"
    );
}

/// The event-traced rating factor against a hand calculation (LRFR,
/// inventory: γDC = 1.25/0.90, γL = 1.75, AASHTO LRFD 3.4.1 and MBE
/// 6A.4.2.2). Dead D = 5 kip at L1 and L2 (panel shear zero), live P = 30
/// kip at L1 with IM = 0.33, rod a drawn up 0.05 in. As the live load grows
/// rod b, taut under the dead load, loses its pretension and goes slack;
/// from there the truss is determinate and a carries the panel shear alone:
/// N_a(λ) = 5/9·λ·γL·P·(1 + IM) (the symmetric dead load adds no shear).
/// RF = C_a / (5/9·γL·P·(1 + IM)), C_a = φc·φs·φy·Fy·Ag = 0.95 × 36 × 2
/// = 68.4 kip times φc·φs (AASHTO LRFD 6.8.2.1-1; fracture 0.80 × 58 × 2 ×
/// 0.90 = 83.5 kip does not govern). The pretension does not enter: a
/// superposition of the cases would have given a different (wrong) factor.
#[test]
fn traced_rating_factor_by_hand() {
    let text = pratt(
        ", tension_only: true, slack: \"-0.05 in\"",
        TO,
        r#"(id: "dead", kind: Dead, loads: [(node: "L1", fy: -5.0), (node: "L2", fy: -5.0)]),
           (id: "live", kind: Live, impact: 0.33, loads: [(node: "L1", fy: -30.0)])"#,
        "",
    );
    let (m, a) = solve(&text);
    let method = panelpoint::rate::choose_method(&m, Some("lrfr")).unwrap();
    let r = panelpoint::rate::rate(&m, &a, method).unwrap();
    let row = |id: &str| {
        r.ratings
            .iter()
            .find(|x| x.member == member(&m, id) && x.level == "inventory")
            .unwrap()
    };
    let ra = row("a");
    assert_close!(ra.capacity / KIP, 68.4 * ra.phi_cs, 1e-9);
    let hand = ra.capacity / KIP / (5.0 / 9.0 * 1.75 * 30.0 * 1.33);
    assert_close!(ra.rf.unwrap(), hand, 1e-6);
    // The superposed factor differs: (C − γDC·Na,D) / (γL·Na,L) with both
    // cases solved alone.
    let (d, l) = (force(&m, &a, 0, "a"), force(&m, &a, 1, "a") * 1.33);
    let superposed = (ra.capacity / KIP - 1.25 * d) / (1.75 * l);
    assert!(
        (superposed - hand).abs() > 0.01 * hand,
        "{superposed} vs {hand}"
    );
    // Rod b is relieved by the live load and slack under dead + live: a
    // "slack" row without a factor, never a compression check.
    let rb = row("b");
    assert_eq!(rb.governs, "slack");
    assert!(rb.rf.is_none());
    let live_effect = r.effects.iter().position(|e| e.id == "live").unwrap();
    let check = r
        .checks
        .iter()
        .find(|c| c.effect == live_effect && c.member == member(&m, "b"))
        .unwrap();
    assert_eq!(check.regime, panelpoint::capacity::Regime::Slack);
    assert_eq!(check.utilization, 0.0);
}

/// Redundancy with a slack member (common practice: a member whose loss
/// leaves a mechanism is not redundant). Under P at L1 only rod a can carry
/// the panel shear (statics above); lose a and the remaining rod b would
/// have to push: with b tension-only the damaged truss is a mechanism and a
/// is critical. Were the rods able to push, b would carry the shear in
/// compression and a would be redundant.
#[test]
fn redundancy_with_a_slack_member() {
    let cases = r#"(id: "dead", kind: Dead, loads: [(node: "L0", fy: -1.0)]),
                   (id: "live", kind: Live, loads: [(node: "L1", fy: -18.0)])"#;
    let scan = |text: &str| {
        let (m, a) = solve(text);
        let opts = panelpoint::sweep::RunOptions {
            method: panelpoint::rate::choose_method(&m, Some("lrfr")).unwrap(),
            jobs: Some(1),
            detail: false,
        };
        let losses = panelpoint::sweep::redundancy::scan(&m, &a, &opts).unwrap();
        losses[member(&m, "a")].clone()
    };
    let tension_only = scan(&pratt(TO, TO, cases, ""));
    assert!(tension_only.critical, "{tension_only:?}");
    assert!(tension_only.fracture_critical);
    assert!(tension_only.mechanism.unwrap().contains("slack"));
    let linear = scan(&pratt("", "", cases, ""));
    assert!(!linear.critical, "{linear:?}");
}

/// A loose rod (slack s = 0.05 in) must first take up its slack: the truss
/// racks freely (a mechanism with the rod out) until it does. Statics are
/// unchanged (a = 5P/9, b = 0, the truss being determinate with b slack),
/// and by the unit-load method (virtual work, δ = Σ n·e with e including
/// the slack) the load point L1 moves down by n_a·s = 5/9 × 0.05 in more
/// than with a tight rod.
#[test]
fn loose_rod_takes_up_its_slack() {
    let cases = r#"(id: "left", loads: [(node: "L1", fy: -18.0)])"#;
    let (m, a) = solve(&pratt(
        ", tension_only: true, slack: \"0.05 in\"",
        TO,
        cases,
        "",
    ));
    let (_, tight) = solve(&pratt(TO, TO, cases, ""));
    assert_close!(force(&m, &a, 0, "a"), 10.0, 1e-9);
    assert!(force(&m, &a, 0, "b").abs() < 1e-9);
    let l1 = node(&m, "L1");
    let extra = (a.cases[0].displacements[l1][1] - tight.cases[0].displacements[l1][1]) / INCH;
    assert_close!(extra, -5.0 / 9.0 * 0.05, 1e-6);
}

/// The demo model (models/quarry-lane-pin.ron) rated by LRFR: no
/// tension-only member (eyebar, rod, counter) is ever checked or rated in
/// compression (the definition of a tension-only member, issue 16); its
/// counters show slack rows; the loose counter is slack under the dead
/// load; every case is in equilibrium.
#[test]
fn demo_model_never_pushes_an_eyebar() {
    let (m, a) = solve(include_str!("../models/quarry-lane-pin.ron"));
    for r in &a.cases {
        assert!(r.relative_residual < 1e-9);
        assert!((r.load_sum[1] + r.reaction_sum[1]).abs() < 1e-6 * KIP);
    }
    assert!(
        a.cases[0].forces[member(&m, "U4-L5")] == 0.0,
        "the loose counter"
    );
    let method = panelpoint::rate::choose_method(&m, None).unwrap();
    let r = panelpoint::rate::rate(&m, &a, method).unwrap();
    use panelpoint::capacity::Regime;
    let mut slack_rows = 0;
    for c in &r.checks {
        if m.members[c.member].tension_only {
            assert!(c.force >= 0.0, "{} pushed", m.members[c.member].id);
            assert!(matches!(c.regime, Regime::Tension | Regime::Slack));
            slack_rows += usize::from(c.regime == Regime::Slack);
        }
    }
    assert!(slack_rows > 0);
    for x in r
        .ratings
        .iter()
        .filter(|x| m.members[x.member].tension_only)
    {
        assert_ne!(x.governs, "compression");
    }
    let low = r.lowest.map(|i| &r.ratings[i]).expect("a lowest factor");
    assert!(low.rf.unwrap() > 0.0);
}

/// The command line on the demo model: `rate` shows slack rows and exits 0;
/// `sensitivity` refuses with exit 2 and says why (issue 16); `influence`
/// labels its lines as those of the dead-load active set.
#[test]
fn command_line_on_the_demo() {
    let model = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models/quarry-lane-pin.ron");
    let path = model.to_str().unwrap();
    let (code, out, err) = run(&["rate", path, "--all"]);
    assert_eq!(code, 0, "{err}");
    assert!(out.contains(" slack "), "{out}");
    let (code, out, err) = run(&["sensitivity", path]);
    assert_eq!(code, 2);
    assert!(out.is_empty());
    assert!(err.contains("tension-only members"), "{err}");
    let (code, out, err) = run(&["influence", path, "--member", "L3-U4"]);
    assert_eq!(code, 0, "{err}");
    assert!(out.contains("dead-load active set"), "{out}");
}

/// A combination is solved as the whole factored load, not summed. D = 18
/// kip at L2 alone puts rod b in tension (panel shear R0 = D/3: N_b =
/// 5D/9), P = 6 kip at L1 alone rod a (5P/9). Together, 1.25·D + 1.75·P,
/// the panel shear by statics is V = R0 − 1.75P with R0 = (1.25D + 2·1.75P)/3,
/// V = (1.25D − 1.75P)/3 = (22.5 − 10.5)/3 = 4 kip: b carries V/sin θ =
/// 6.667 kip and a is slack, where the sum of the cases would give
/// a = 1.75·5P/9 = 5.833 and b = 1.25·5D/9 = 12.5 kip. With the dead case at
/// LRFR's minimum 0.90 (also tried by `rate`) both rods stay taut (the
/// redundant's share keeps a in tension), and statics still fix their
/// difference: N_b − N_a = V/sin θ, V = (16.2 − 10.5)/3 = 1.9 kip. Each
/// member keeps the more severe state: b = 6.667 kip.
#[test]
fn combination_is_solved_whole() {
    use panelpoint::analysis::active_set::{factored_state, Solver};
    let text = pratt(
        TO,
        TO,
        r#"(id: "d", kind: Dead, loads: [(node: "L2", fy: -18.0)]),
           (id: "l", kind: Live, loads: [(node: "L1", fy: -6.0)])"#,
        "",
    )
    .replace(
        "    load_cases:",
        r#"    combinations: [(id: "c", factors: [("d", 1.25), ("l", 1.75)])],
    load_cases:"#,
    );
    let (m, a) = solve(&text);
    assert_close!(force(&m, &a, 0, "b"), 10.0, 1e-9);
    assert_close!(force(&m, &a, 1, "a"), 10.0 / 3.0, 1e-9);
    let (ia, ib) = (member(&m, "a"), member(&m, "b"));
    let solver = Solver::new(&m).unwrap();
    let full = solver
        .solve(&factored_state(&m, "full", &[(0, 1.25), (1, 1.75)]), None)
        .unwrap();
    assert_eq!(full.slack_ids(&m), vec!["a".to_string()]);
    assert_close!(full.result.forces[ib] / KIP, 4.0 / SIN, 1e-9);
    let low = solver
        .solve(&factored_state(&m, "low", &[(0, 0.9), (1, 1.75)]), None)
        .unwrap();
    let (la, lb) = (low.result.forces[ia] / KIP, low.result.forces[ib] / KIP);
    assert!(la > 0.0 && lb > 0.0, "both taut: {la} {lb}");
    assert_close!(lb - la, 1.9 / SIN, 1e-9);
    let method = panelpoint::rate::choose_method(&m, Some("lrfr")).unwrap();
    let r = panelpoint::rate::rate(&m, &a, method).unwrap();
    let c = r.effects.iter().find(|e| e.id == "c").unwrap();
    assert_close!(c.forces[ib] / KIP, 4.0 / SIN, 1e-9);
    assert_close!(c.forces[ia] / KIP, la, 1e-9);
    assert!(c.forces[ia] / KIP < 1.75 * 5.0 * 6.0 / 9.0);
}

/// Issue 16's "Done when" on one demo: models/quarry-lane-pin.ron has both
/// tension-only counters and pins. From the rate JSON: every pin has a "pin
/// moment and shear" check with a finite rating factor; no tension-only
/// member has a compression row (tension or slack only); some counter is
/// slack in some effect. Hand check of one single-member bearing row, the
/// L1-U1 hanger's plates on the pin at L1 (t = 0.75 in, D = 5 in, Fy the
/// lower of pin 33 and bar 30 ksi): AASHTO LRFD 6.7.6.2.2 (from memory),
/// Pr = φb·1.5·t·D·Fy with φb = 1.00, times the model's condition factor
/// φc = 0.95 (φs = 1.00): 0.95·1.5·0.75·5·30 = 160.31 kip. The rating
/// equation RF = (C − γDC·DC)/(γL·LL) with DC = share·|F_dead| of the
/// member's dead-load row and the live part LL taken as (demand − γDC·DC)/γL
/// from the row's own factored demand; the reported factor may be lower (a
/// truss that gives way first caps every factor, docs/joints.md) but never
/// higher than this linear value (project rule: never above the code).
#[test]
fn demo_rates_pins_and_counters_together() {
    let model = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models/quarry-lane-pin.ron");
    let (code, out, err) = run(&["rate", model.to_str().unwrap(), "--format", "json"]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let joints = v["joints"].as_array().unwrap();
    assert_eq!(joints.len(), 8, "pins at L0…L7");
    for j in joints {
        let ms = j["checks"]
            .as_array()
            .unwrap()
            .iter()
            .find(|c| c["kind"] == "pin moment and shear");
        let rf = ms.and_then(|c| c["rf"].as_f64()).unwrap_or(f64::NAN);
        assert!(rf.is_finite() && rf > 0.0, "pin at {}: {rf}", j["node"]);
    }
    let to = [
        "L0-L1", "L1-L2", "L2-L3", "L3-L4", "L4-L5", "L5-L6", "L6-L7", "U1-L2", "U2-L3", "U5-L4",
        "U6-L5",
    ];
    let counters = ["L2-U3", "U3-L4", "L3-U4", "U4-L5"];
    let checks = v["checks"].as_array().unwrap();
    for c in checks {
        let id = c["member"].as_str().unwrap_or("");
        if to.contains(&id) || counters.contains(&id) {
            let regime = c["regime"].as_str().unwrap();
            assert!(regime == "tension" || regime == "slack", "{id}: {regime}");
        }
    }
    assert!(checks
        .iter()
        .any(|c| counters.contains(&c["member"].as_str().unwrap_or("")) && c["regime"] == "slack"));
    // The hand check of the hanger's bearing at L1.
    let l1 = joints.iter().find(|j| j["node"] == "L1").unwrap();
    let b = l1["checks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["kind"] == "pin bearing" && c["member"] == "L1-U1")
        .unwrap();
    let resistance = 0.95 * 1.00 * 1.5 * 0.75 * 5.0 * 30.0;
    assert_close!(b["resistance"].as_f64().unwrap(), resistance, 1e-9);
    let dead = checks
        .iter()
        .find(|c| c["member"] == "L1-U1" && c["case"] == "dead")
        .unwrap()["force"]
        .as_f64()
        .unwrap();
    let share = b["inputs"]["share"]["value"].as_f64().unwrap();
    let r = &b["ratings"][0];
    let (g_dc, g_l) = (
        r["gamma_dc"].as_f64().unwrap(),
        r["gamma_live"].as_f64().unwrap(),
    );
    let dc = g_dc * share * dead.abs();
    let live = (b["demand"].as_f64().unwrap() - dc) / g_l;
    assert!(live > 0.0, "live part {live}");
    let linear = (resistance - dc) / (g_l * live);
    let rf = r["rf"].as_f64().unwrap();
    assert!(rf > 0.0 && rf <= linear * (1.0 + 1e-9), "{rf} vs {linear}");
}
