//! Issue 21: defects a new user and a rating engineer found. Each test
//! failed before its fix. The demo model is models/millrace-footbridge.ron
//! (an invented scenario).

mod common;
use common::*;

fn demo() -> String {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("models/millrace-footbridge.ron")
        .display()
        .to_string()
}

fn demo_text() -> String {
    std::fs::read_to_string(demo()).unwrap()
}

/// Parse CSV the simple way (no quoted commas in these outputs' numbers):
/// every line must have as many fields as the header (RFC 4180's rule),
/// counting a quoted field as one.
fn csv_rows(text: &str) -> Vec<Vec<String>> {
    let mut rows = Vec::new();
    for line in text.lines() {
        let mut fields = Vec::new();
        let mut cur = String::new();
        let mut quoted = false;
        for ch in line.chars() {
            match ch {
                '"' => quoted = !quoted,
                ',' if !quoted => fields.push(std::mem::take(&mut cur)),
                c => cur.push(c),
            }
        }
        fields.push(cur);
        rows.push(fields);
    }
    rows
}

// Defect 6: `--format csv` printed JSON for these two commands.
#[test]
fn redundancy_and_sensitivity_write_csv_when_asked() {
    for cmd in ["redundancy", "sensitivity"] {
        let (code, out, err) = run(&[cmd, &demo(), "--format", "csv"]);
        assert_eq!(code, 0, "{cmd}: {err}");
        assert!(
            !out.trim_start().starts_with('{'),
            "{cmd} printed JSON:\n{out}"
        );
        let rows = csv_rows(&out);
        assert!(rows.len() > 2, "{cmd}: {out}");
        let width = rows[0].len();
        assert!(width >= 4, "{cmd}: header {:?}", rows[0]);
        for r in &rows {
            assert_eq!(r.len(), width, "{cmd}: ragged row {r:?}");
        }
    }
    // One row per member for redundancy (21 members in the demo).
    let (_, out, _) = run(&["redundancy", &demo(), "--format", "csv"]);
    assert_eq!(out.lines().count(), 1 + 21);
}

/// The demo with one edit applied to its text.
fn demo_edited(edit: impl Fn(&str) -> String) -> String {
    let t = edit(&demo_text());
    assert_ne!(t, demo_text(), "the edit changed nothing");
    t
}

fn both_rollers() -> String {
    demo_edited(|t| {
        t.replace(
            r#"(node: "L0", kind: Pin)"#,
            r#"(node: "L0", kind: Roller)"#,
        )
    })
}

fn without_member(id: &str) -> String {
    let key = format!(r#"(id: "{id}","#);
    demo_edited(|t| {
        without_joints(t)
            .lines()
            .filter(|l| !l.trim_start().starts_with(&key))
            .collect::<Vec<_>>()
            .join("\n")
    })
}

/// The demo without its `gusset_joints` block (they name every member;
/// a test that removes a member removes the joint descriptions with it).
fn without_joints(t: &str) -> String {
    let start = t.find("    gusset_joints: [").expect("the demo's joints");
    let end = start
        + t[start..]
            .find("\n    ],\n")
            .expect("the end of the joints")
        + "\n    ],\n".len();
    format!("{}{}", &t[..start], &t[end..])
}

/// Check a free motion by statics/kinematics alone (not through K): a
/// mechanism's mode stretches no member (c·Δu = 0 for every bar, the
/// definition of an inextensional mechanism) and moves no support along a
/// restrained direction.
fn assert_is_inextensional(m: &panelpoint::model::Model, u: &[[f64; 2]]) {
    let largest = u.iter().fold(0.0f64, |a, d| a.max(d[0].hypot(d[1])));
    assert!(largest > 0.0);
    for (j, mem) in m.members.iter().enumerate() {
        let c = m.direction(j);
        let (a, b) = (u[mem.start], u[mem.end]);
        let e = c[0] * (b[0] - a[0]) + c[1] * (b[1] - a[1]);
        assert!(
            e.abs() <= 1e-8 * largest,
            "member {} stretches by {e}",
            mem.id
        );
    }
    for s in &m.supports {
        let d = u[s.node];
        match s.restraint.free_direction() {
            None => assert!(d[0].hypot(d[1]) <= 1e-8 * largest),
            Some(f) => {
                let across = d[0] * f[1] - d[1] * f[0];
                assert!(across.abs() <= 1e-8 * largest);
            }
        }
    }
}

/// The DOF a message names must be the largest entry of the mode.
fn assert_named_dof_moves_most(
    m: &panelpoint::model::Model,
    u: &[[f64; 2]],
    node: &str,
    axis: usize,
) {
    let largest = u
        .iter()
        .fold(0.0f64, |a, d| a.max(d[0].abs()).max(d[1].abs()));
    let v = u[common::node(m, node)][axis];
    assert!(
        v.abs() >= 0.999 * largest,
        "node {node} axis {axis}: {v} against the largest entry {largest}"
    );
}

// Defect 5: three different mechanisms all reported `node "U1" is free to
// move in x`.
#[test]
fn mechanism_messages_name_the_node_and_direction_that_move() {
    // (a) Both supports rollers: nothing holds the truss in x; the free
    // motion is the rigid-body translation in x (a roller restrains only
    // the vertical; statics: r = 2 < 3).
    let text = both_rollers();
    let path = temp_model("rollers.ron", &text);
    let (code, _, err) = run(&["solve", path.to_str().unwrap()]);
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains("the whole truss is free to move in x as a rigid body"),
        "{err}"
    );
    let m = load(&text);
    let f = panelpoint::analysis::free_motion(&m).expect("a mechanism");
    assert_is_inextensional(&m, &f.displacements);
    for d in &f.displacements {
        // Hand: a rigid translation in x, every node moves the same.
        assert!(
            (d[0].abs() - 1.0).abs() < 1e-9 && d[1].abs() < 1e-9,
            "{d:?}"
        );
    }

    // (b) Bottom chord L3-L4 removed: the left part (pinned at L0) and
    // the right part (L4..L6, U4, U5; roller at L6) meet only at U4, a
    // three-hinged arrangement that is one degree short. Hand kinematics:
    // the left part turns θ about L0, so U4 (64, 20 ft) moves θ(−20, 64);
    // the right part's instantaneous centre lies on line L0-U4 and on the
    // vertical through the roller L6: (96, 30), with rotation −2θ. Then
    // L4 (64, 0) moves −2θ·k×(−32, −30) = θ(−60, 64), L5 θ(−60, 32),
    // U5 θ(−20, 32), L3 θ(0, 48): the largest entry is L4 in y (64θ).
    let text = without_member("L3-L4");
    let path = temp_model("no-l3l4.ron", &text);
    let (code, _, err) = run(&["solve", path.to_str().unwrap()]);
    assert_eq!(code, 2, "{err}");
    assert!(err.contains(r#"node "L4" is free to move in y"#), "{err}");
    let m = load(&text);
    let f = panelpoint::analysis::free_motion(&m).expect("a mechanism");
    assert!(f.rigid.is_none());
    assert_is_inextensional(&m, &f.displacements);
    assert_named_dof_moves_most(&m, &f.displacements, "L4", 1);
    let l4 = f.displacements[node(&m, "L4")];
    assert!((l4[0] / l4[1] + 60.0 / 64.0).abs() < 1e-6, "{l4:?}");

    // (c) Diagonal U2-L3 removed: panel L2-L3-U3-U2 is a rectangle with no
    // diagonal and shears. Hand: the left part turns θ about L0; the two
    // horizontal chords U2-U3 and L2-L3 carry the x motion across (U3
    // −20θ, L3 0), so the right part turns θ too, and the roller at L6
    // fixes its vertical: L3 and U3 move −48θ in y, the largest entry
    // (L2, U2 32θ; L4, U4 −32θ).
    let text = without_member("U2-L3");
    let path = temp_model("no-u2l3.ron", &text);
    let (code, _, err) = run(&["solve", path.to_str().unwrap()]);
    assert_eq!(code, 2, "{err}");
    let m = load(&text);
    let f = panelpoint::analysis::free_motion(&m).expect("a mechanism");
    assert_is_inextensional(&m, &f.displacements);
    let named = if err.contains(r#"node "L3" is free to move in y"#) {
        "L3"
    } else {
        assert!(err.contains(r#"node "U3" is free to move in y"#), "{err}");
        "U3"
    };
    assert_named_dof_moves_most(&m, &f.displacements, named, 1);
    let (l2, l3) = (
        f.displacements[node(&m, "L2")],
        f.displacements[node(&m, "L3")],
    );
    assert!((l2[1] / l3[1] + 32.0 / 48.0).abs() < 1e-6, "{l2:?} {l3:?}");
}

// Defect 4: `validate` said "valid" (exit 0) for a mechanism.
#[test]
fn validate_refuses_a_mechanism_with_node_and_direction() {
    let path = temp_model("no-l3l4.ron", &without_member("L3-L4"));
    let (code, out, err) = run(&["validate", path.to_str().unwrap()]);
    assert_eq!(code, 2, "{out}{err}");
    assert!(!out.contains("valid"), "{out}");
    assert!(
        err.contains(r#"mechanism: node "L4" is free to move in y"#),
        "{err}"
    );
    // The intact demo is still valid.
    let (code, out, err) = run(&["validate", &demo()]);
    assert_eq!(code, 0, "{err}");
    assert!(out.contains("valid"));
}

// Defect 2: `redundancy` ignored moving loads, so members the vehicle puts
// in tension were labelled "critical" instead of "fracture-critical".
#[test]
fn redundancy_counts_the_moving_load_in_the_service_force() {
    let (code, out, err) = run(&["redundancy", &demo(), "--format", "json"]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let row = |id: &str| {
        v["members"]
            .as_array()
            .unwrap()
            .iter()
            .find(|r| r["member"] == id)
            .unwrap()
            .clone()
    };
    // Hand calculation for the post L2-U2 (Pratt, diagonal U2-L3 in the
    // panel to its right): its force is minus the shear in panel L2-L3.
    // Dead: R = 5 × 5.8 / 2 = 14.5 kip, shear 14.5 − 2 × 5.8 = 2.9, so
    // −2.90 kip. Influence line for a unit load at x (ft): x/96 for
    // x ≤ 32, falling linearly to −48/96 at x = 48. The truck (6, 16, 16
    // kip at 0, 12, 16.5 ft) running toward L0 with its rear axle on L2:
    // 16·32/96 + 16·27.5/96 + 6·15.5/96 = 10.885 kip, × 1.15 impact =
    // 12.518 kip; dead + truck = +9.618 kip: tension.
    for id in ["L2-U2", "L4-U4"] {
        let r = row(id);
        assert_eq!(r["critical"], true, "{id}");
        assert_eq!(r["fracture_critical"], true, "{id}: {r}");
        let f = r["service_force"].as_f64().unwrap();
        assert!((f - 9.618).abs() < 0.002, "{id}: {f}");
        assert!(
            r["service_effect"].as_str().unwrap().contains("truck"),
            "{r}"
        );
    }
    // The centre post L3-U3 meets two collinear chords at U3 and carries
    // nothing under deck loads (joint statics): critical, not fracture-critical.
    assert_eq!(row("L3-U3")["fracture_critical"], false);

    // The utilization after a loss is the damaged truss's rating with its
    // own envelopes: with a counter-diagonal L2-U3 added, losing U2-L3
    // leaves a stable truss whose `rate` governs the same number.
    let text = demo_edited(|t| {
        t.replace(
            r#"        (id: "U2-L3","#,
            "        (id: \"L2-U3\", start: \"L2\", end: \"U3\", section: \"diagonal\", material: \"medium-steel\"),\n        (id: \"U2-L3\",",
        )
    });
    let (m, a) = solve(&text);
    let curve = panelpoint::rate::choose_method(&m, None).unwrap();
    let opts = panelpoint::sweep::RunOptions {
        method: curve.clone(),
        jobs: Some(1),
        detail: false,
    };
    let losses = panelpoint::sweep::redundancy::scan(&m, &a, &opts).unwrap();
    let loss = losses
        .iter()
        .find(|l| m.members[l.member].id == "U2-L3")
        .unwrap();
    assert!(!loss.critical);
    let damaged = load(&without_member_in(&text, "U2-L3"));
    let da = panelpoint::analysis::analyse(&damaged).unwrap();
    let r = panelpoint::rate::rate(&damaged, &da, curve).unwrap();
    let worst = &r.checks[r.controlling.unwrap()];
    assert!(close(
        loss.max_utilization_after.unwrap(),
        worst.utilization,
        1e-9,
        0.0
    ));
    assert_eq!(
        loss.controlling_case.as_deref(),
        Some(r.effects[worst.effect].id.as_str())
    );
    assert!(
        r.effects[worst.effect].id.contains("truck"),
        "{}",
        r.effects[worst.effect].id
    );
}

fn without_member_in(text: &str, id: &str) -> String {
    let key = format!(r#"(id: "{id}","#);
    without_joints(text)
        .lines()
        .filter(|l| !l.trim_start().starts_with(&key))
        .collect::<Vec<_>>()
        .join("\n")
}

// Defect 16: a sweep could not vary a moving load (`no load case "truck"`).
#[test]
fn a_sweep_scales_a_moving_load_and_changes_its_impact() {
    let sweep = r#"(
        variants: [
            (name: "heavier", scale: [("truck", 1.5)]),
            (name: "rougher deck", impact: [("truck", 0.33)]),
        ],
        axes: [
            (name: "truck", scale: "truck", values: [0.5, 2.0]),
            (name: "impact", impact: "truck", values: [0.0]),
        ],
    )"#;
    let model = temp_model("m.ron", &demo_text());
    let sweep_path = model.with_file_name("s.ron");
    std::fs::write(&sweep_path, sweep).unwrap();
    let (code, out, err) = run(&[
        "sweep",
        model.to_str().unwrap(),
        sweep_path.to_str().unwrap(),
        "--format",
        "json",
    ]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let rows = v["variants"].as_array().unwrap_or_else(|| panic!("{v}"));
    assert_eq!(rows.len(), 5);
    let rf = |i: usize| rows[i]["lowest_rating_factor"].as_f64().unwrap();
    // The load rating factor RF = (φC − γD·D) / (γL·L(1 + I)) (AASHTO MBE
    // 6A.4.2.1, the form `rate` uses) is inversely proportional to the
    // live load with impact, for the same governing member (L3-U4 under
    // the truck in every variant). Base impact 0.15.
    for (i, factor, impact) in [(1, 1.5, 0.15), (2, 1.0, 0.33), (3, 0.5, 0.0), (4, 2.0, 0.0)] {
        assert_eq!(rows[i]["rating_member"], "L3-U4", "{}", rows[i]);
        assert_eq!(rows[i]["kind"], "loads");
        let expected = rf(0) * 1.15 / (factor * (1.0 + impact));
        assert!(
            close(rf(i), expected, 1e-9, 0.0),
            "{i}: {} vs {expected}",
            rf(i)
        );
    }
    // An unknown id is named as what it could have been.
    std::fs::write(&sweep_path, r#"(variants: [(scale: [("vehicle", 2.0)])])"#).unwrap();
    let (code, _, err) = run(&[
        "sweep",
        model.to_str().unwrap(),
        sweep_path.to_str().unwrap(),
    ]);
    assert_eq!(code, 2);
    assert!(
        err.contains(r#"no load case or moving load "vehicle""#),
        "{err}"
    );
}

/// Issue 18: a sweep axis over vehicles. H10 is H5 doubled axle by axle
/// (2 + 8 kip and 4 + 16 kip at 14 ft: the H truck of W tons puts 0.2·W on
/// the front axle and 0.8·W on the rear, 14 ft apart; AASHTO Standard
/// Specifications 3.7.6, from memory — and by the designation, common
/// practice), with the same impact (the model gives 0.15), so every live
/// force doubles and the rating factor RF = (φC − γD·D)/(γL·L(1 + I))
/// (AASHTO MBE 6A.4.2.1) halves, for the same governing member.
#[test]
fn a_sweep_varies_the_vehicle_of_a_moving_load() {
    let model = temp_model("m.ron", &demo_text());
    let sweep_path = model.with_file_name("v.ron");
    std::fs::write(
        &sweep_path,
        r#"(axes: [(name: "vehicle", vehicle: "truck", values: ["h5", "h10", "maintenance-truck"])])"#,
    )
    .unwrap();
    let (code, out, err) = run(&[
        "sweep",
        model.to_str().unwrap(),
        sweep_path.to_str().unwrap(),
        "--format",
        "json",
    ]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let rows = v["variants"].as_array().unwrap_or_else(|| panic!("{v}"));
    assert_eq!(rows.len(), 4);
    let rf = |i: usize| rows[i]["lowest_rating_factor"].as_f64().unwrap();
    for (i, name) in [(1, "h5"), (2, "h10"), (3, "maintenance-truck")] {
        assert_eq!(rows[i]["name"], name, "{}", rows[i]);
        assert_eq!(rows[i]["kind"], "loads");
        assert_eq!(rows[i]["rating_member"], "L3-U4", "{}", rows[i]);
        assert_eq!(rows[i]["rating_case"], "truck", "{}", rows[i]);
    }
    assert!(
        close(rf(1), 2.0 * rf(2), 1e-9, 0.0),
        "{} vs 2 × {}",
        rf(1),
        rf(2)
    );
    // The model's own vehicle by name gives the base model back.
    assert!(close(rf(3), rf(0), 1e-12, 0.0), "{} vs {}", rf(3), rf(0));
    // An unknown name is an error naming the axis, before anything runs.
    std::fs::write(
        &sweep_path,
        r#"(axes: [(name: "vehicle", vehicle: "truck", values: ["h5", "h7"])])"#,
    )
    .unwrap();
    let (code, out, err) = run(&[
        "sweep",
        model.to_str().unwrap(),
        sweep_path.to_str().unwrap(),
    ]);
    assert_eq!(code, 2, "{err}");
    assert!(out.is_empty(), "{out}");
    assert!(
        err.contains(r#"axis "vehicle": vehicle "h7" for moving load "truck" is neither a vehicle of the model nor a library model"#),
        "{err}"
    );
    // A list entry too, naming its variant; and an unknown moving load.
    std::fs::write(
        &sweep_path,
        r#"(variants: [(name: "heavy", vehicles: [("truck", "cooper-e99x")]), (vehicles: [("lorry", "h10")])])"#,
    )
    .unwrap();
    let (code, _, err) = run(&[
        "sweep",
        model.to_str().unwrap(),
        sweep_path.to_str().unwrap(),
    ]);
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains(r#"variant "heavy": vehicle "cooper-e99x""#),
        "{err}"
    );
    assert!(err.contains(r#"no moving load "lorry""#), "{err}");
}

/// Utilization of the check (member, effect id) of a model rated as `rate` does.
fn utilization_of(m: &panelpoint::model::Model, member: usize, effect: &str) -> f64 {
    let a = panelpoint::analysis::analyse(m).unwrap();
    let curve = panelpoint::rate::choose_method(m, None).unwrap();
    let r = panelpoint::rate::rate(m, &a, curve).unwrap();
    let e = r.effects.iter().position(|e| e.id == effect).unwrap();
    r.checks
        .iter()
        .find(|c| c.member == member && c.effect == e)
        .unwrap()
        .utilization
}

/// The adjoint derivatives of `sensitivity --case` against central finite
/// differences of the full `rate` (influence lines, envelopes and all
/// re-run) at every coordinate except the deck nodes' x. h = 1 mm: the envelope keeps its governing position
/// (piecewise linear in position), and the central difference of a smooth
/// function is exact to O(h²) (any numerical analysis text).
fn check_sensitivity_against_rate(m: &panelpoint::model::Model, case: Option<&str>) -> String {
    let a = panelpoint::analysis::analyse(m).unwrap();
    let curve = panelpoint::rate::choose_method(m, None).unwrap();
    let r = panelpoint::rate::rate(m, &a, curve).unwrap();
    let s = panelpoint::sensitivity::sensitivity(m, &a, &r, case).unwrap();
    let effect = r.effects[s.effect].id.clone();
    assert!(close(
        utilization_of(m, s.member, &effect),
        s.utilization,
        1e-12,
        0.0
    ));
    let h = 1e-3;
    let mut compared = 0;
    for c in &s.coordinates {
        // Held as nodal forces, the vehicle does not follow a deck node
        // moved along the (level) deck, while `rate` re-rolls it; a
        // vertical move changes the chainages only to second order.
        if m.live.deck.contains(&c.node) && c.axis == 0 {
            continue;
        }
        let moved = |d: f64| {
            let mut v = m.clone();
            if c.axis == 0 {
                v.nodes[c.node].x += d;
            } else {
                v.nodes[c.node].y += d;
            }
            utilization_of(&v, s.member, &effect)
        };
        let fd = (moved(h) - moved(-h)) / (2.0 * h);
        assert!(
            close(c.d_utilization, fd, 1e-4, 1e-6),
            "{effect}: node {} axis {}: adjoint {} vs finite difference {fd}",
            m.nodes[c.node].id,
            c.axis,
            c.d_utilization
        );
        compared += 1;
    }
    assert!(compared >= 10, "{compared}");
    effect
}

// Defect 3: `sensitivity` ignored moving loads and combinations with them:
// it reported 0.43 under strength-crowd while `rate` governs at 2.18 under
// strength-truck.
#[test]
fn sensitivity_differentiates_the_check_rate_governs_including_the_vehicle() {
    let m = load(&demo_text());
    // No --case: the check `rate` reports as controlling (2.290 under LRFR, L3-U4,
    // strength-truck with the truck's compression envelope).
    let effect = check_sensitivity_against_rate(&m, None);
    assert_eq!(
        effect,
        "strength-truck (1.75 × truck placed for greatest compression)"
    );
    // --case takes what `draw --case` takes (cases, combinations) and a
    // moving load's id.
    for case in ["strength-truck", "truck", "crowd", "deck", "strength-crowd"] {
        check_sensitivity_against_rate(&m, Some(case));
    }
    // A lane (crowd) load: the lane is placed over the parts of the
    // influence line of the envelope's sign; held as nodal loads it must
    // rebuild the envelope's force exactly (sensitivity refuses otherwise).
    let text = demo_text().replace(
        r#"(id: "truck", vehicle: "maintenance-truck", step: "1 ft", impact: 0.15),"#,
        r#"(id: "truck", vehicle: "maintenance-truck", step: "1 ft", impact: 0.15),
        (id: "cart", vehicle: "inspection-cart", step: "1 ft", impact: 0.2, impact_on_lane: true),"#,
    );
    assert_ne!(text, demo_text());
    let m = load(&text);
    let effect = check_sensitivity_against_rate(&m, Some("cart"));
    assert!(effect.contains("cart"), "{effect}");

    // The command says where the vehicle stood and that the envelope is
    // piecewise linear in the position.
    let (code, out, err) = run(&["sensitivity", &demo()]);
    assert_eq!(code, 0, "{err}");
    assert!(
        out.contains("governing utilization 2.290 of member L3-U4 under strength-truck"),
        "{out}"
    );
    assert!(
        out.contains("truck held where it governs this check"),
        "{out}"
    );
    assert!(
        out.contains("piecewise linear in the vehicle position"),
        "{out}"
    );
    let (code, _, err) = run(&["sensitivity", &demo(), "--case", "nope"]);
    assert_eq!(code, 2);
    assert!(err.contains(r#""strength-truck", "truck""#), "{err}");
}

// Defect 14: `-o` and `--out` on every command that writes; a narrow
// terminal; `new` writes a deck line and a Dead panel case.
#[test]
fn every_writing_command_takes_dash_o_and_long_out() {
    let model = temp_model("m.ron", &demo_text());
    let m = model.to_str().unwrap();
    let dir = model.parent().unwrap();
    let sweep = dir.join("s.ron");
    std::fs::write(&sweep, r#"(variants: [(scale: [("truck", 1.5)])])"#).unwrap();
    let s = sweep.to_str().unwrap();
    let commands: Vec<Vec<&str>> = vec![
        vec!["solve", m],
        vec!["rate", m],
        vec!["section", m],
        vec!["influence", m],
        vec!["envelope", m],
        vec!["sweep", m, s],
        vec!["redundancy", m],
        vec!["sensitivity", m],
        vec!["draw", m],
        vec!["report", m],
        vec!["new", "pratt", "--height", "20", "--panel-width", "16"],
    ];
    for (k, args) in commands.iter().enumerate() {
        for flag in ["-o", "--out"] {
            let target = dir.join(format!("out-{k}-{}", flag.trim_start_matches('-')));
            let mut a = args.clone();
            a.extend([flag, target.to_str().unwrap()]);
            let (code, out, err) = run(&a);
            assert_eq!(code, 0, "{a:?}: {err}");
            assert!(out.is_empty(), "{a:?} wrote to standard output");
            let written = std::fs::read_to_string(&target).unwrap();
            assert!(!written.is_empty(), "{a:?}");
        }
    }
}

/// `rate` text at `COLUMNS=cols`: every table line fits; returns the text.
fn rate_at_width(cols: usize) -> String {
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_panelpoint"))
        .args(["rate", &demo()])
        .env("COLUMNS", cols.to_string())
        .env("NO_COLOR", "1")
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(0));
    let text = String::from_utf8(out.stdout).unwrap();
    // Every table line fits (prose lines wrap in any terminal and lose
    // nothing; table lines wrapped by the terminal scramble the columns).
    let mut in_table = false;
    for line in text.lines() {
        if line.starts_with("== ") {
            in_table = true;
        } else if line.trim().is_empty() {
            in_table = false;
        }
        // Parenthesised notes are prose.
        if in_table && !line.starts_with('(') {
            assert!(
                line.chars().count() <= cols,
                "{} chars: {line}",
                line.chars().count()
            );
        }
    }
    text
}

#[test]
fn a_narrow_terminal_loses_no_column_silently() {
    let text = rate_at_width(80);
    // Columns left out are named, with how to see them.
    let flat = text.replace('\n', " ");
    assert!(
        flat.contains("left out to fit 80 columns: Fe ksi, Fcr ksi"),
        "{text}"
    );
    assert!(flat.contains("--format csv"), "{text}");
    // The rest are all there: headers over two lines where needed, the
    // long case names whole.
    assert!(
        text.contains("strength-truck (1.75 × truck placed for greatest compression)"),
        "{text}"
    );
    for h in ["RF", "inventory", "operating", "LL+IM", "C kip", "level"] {
        assert!(flat.contains(h), "{h}: {text}");
    }
    // Narrower still: the case column wraps, and says so; no word is cut.
    let text = rate_at_width(60);
    let flat = text.replace('\n', " ");
    assert!(
        flat.contains("column \"case\" wrapped to fit 60 columns"),
        "{text}"
    );
    assert!(text.contains("compression)") && text.contains("strength-truck"));
}

#[test]
fn a_generated_truss_with_a_panel_load_has_a_deck_and_a_dead_case() {
    let dir = temp_model("unused.ron", "");
    let path = dir.with_file_name("gen.ron");
    let (code, _, err) = run(&[
        "new",
        "pratt",
        "--panels",
        "6",
        "--panel-width",
        "16",
        "--height",
        "20",
        "--panel-load",
        "10",
        "-o",
        path.to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{err}");
    let text = std::fs::read_to_string(&path).unwrap();
    let m = load(&text);
    // The deck is the loaded (bottom) chord L0..L6, in order.
    let deck: Vec<&str> = m
        .live
        .deck
        .iter()
        .map(|&n| m.nodes[n].id.as_str())
        .collect();
    assert_eq!(deck, ["L0", "L1", "L2", "L3", "L4", "L5", "L6"]);
    assert_eq!(m.cases[0].kind, panelpoint::model::CaseKind::Dead);
    // It rates, and the moving-load commands find their deck, unedited.
    for cmd in ["rate", "influence", "validate"] {
        let (code, _, err) = run(&[cmd, path.to_str().unwrap()]);
        assert_eq!(code, 0, "{cmd}: {err}");
    }
    // With a vehicle added (and nothing else edited) it gets rating
    // factors on the panel load as dead load. Hand: the dead force of the
    // end post L0-U1 of a 6-panel Pratt with 10 kip at L1..L5: R = 25 kip,
    // F = −R·L/h = −25 × √(16² + 20²)/20 = −32.02 kip (method of joints).
    let with_truck = text.replace(
        "    deck: [",
        "    vehicles_file: \"vehicles.ron\",\n    moving_loads: [(id: \"truck\", vehicle: \"maintenance-truck\", step: \"1 ft\", impact: 0.15)],\n    deck: [",
    );
    let p2 = temp_model("gen-truck.ron", &with_truck);
    let (code, out, err) = run(&["rate", p2.to_str().unwrap(), "--format", "json"]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let ratings = v["ratings"].as_array().unwrap_or_else(|| panic!("{v}"));
    let post = ratings.iter().find(|r| r["member"] == "L0-U1").unwrap();
    let dead = post["dead"].as_f64().unwrap();
    assert!(
        (dead + 25.0 * (16.0f64.hypot(20.0)) / 20.0).abs() < 1e-6,
        "{dead}"
    );
}

// Defect 1: a combination naming a moving load was drawn (and reported)
// with its load cases alone (L3-U4 +4.64 kip), while `rate` checked the
// envelope (−24.71 kip). The drawing and the report now show what `rate`
// checks, and say how.
#[test]
fn combinations_with_a_moving_load_show_the_vehicle() {
    let out = std::env::temp_dir().join(format!("pp-combo-{}.svg", std::process::id()));
    let (code, _, err) = run(&[
        "draw",
        &demo(),
        "--case",
        "strength-truck",
        "-o",
        out.to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{err}");
    let svg = std::fs::read_to_string(&out).unwrap();
    std::fs::remove_file(&out).ok();
    // The force `rate` checks for L3-U4 under this combination (its
    // controlling row): read from `rate`'s own JSON, not recomputed.
    let (code, json, _) = run(&["rate", &demo(), "--format", "json"]);
    assert_eq!(code, 0);
    let v: serde_json::Value = serde_json::from_str(&json).unwrap();
    let force = v["checks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| {
            c["member"] == "L3-U4"
                && c["case"] == "strength-truck (1.75 × truck placed for greatest compression)"
        })
        .unwrap()["force"]
        .as_f64()
        .unwrap();
    assert!(force < -20.0, "{force}");
    let label = format!("{:.1} C", force.abs());
    assert!(svg.contains(&label), "no {label} in the drawing");
    assert!(!svg.contains("4.64 T"), "the load cases alone were drawn");
    assert!(
        svg.contains("moving load &quot;truck&quot;"),
        "no note of the vehicle"
    );
    // The report's combinations table names the moving load and its factor.
    let html = std::env::temp_dir().join(format!("pp-combo-{}.html", std::process::id()));
    let (code, _, err) = run(&["report", &demo(), "-o", html.to_str().unwrap()]);
    assert_eq!(code, 0, "{err}");
    let text = std::fs::read_to_string(&html).unwrap();
    std::fs::remove_file(&html).ok();
    assert!(
        text.contains("1.750 × moving load “truck”"),
        "combination table"
    );
    assert!(text.contains("Moving loads"), "moving-load section");
}
