//! Pins of pin-connected trusses (issue 16): a pin at the heel of a
//! triangular truss worked by hand statics (the bars' forces from the
//! joint's equilibrium, the moment diagram of the layered bars, the LRFD
//! interaction and bearing), its rating factor against the interaction
//! equation solved by hand, and the validation of pin stacks.

use panelpoint::model::Model;

/// A triangle A(0,0) – B(8 ft,0) – C(4 ft, 3 ft), P at C; at A a 4 in pin
/// carries the tie A-B (two 1 in eyebars), the rafter A-C (two 1 in webs)
/// and the shoe (2 in), packed symmetrically: tie 0.5 | rafter 1.5 | shoe
/// 3.0 | rafter 4.5 | tie 5.5 in (mid-thickness).
fn triangle(extra_pin: &str, stack: &str) -> String {
    format!(
        r#"(
    units: (length: "ft", force: "kip", section: "in", stress: "ksi"),
    materials: [(id: "s", e: 29000.0, fy: 33.0, fu: 60.0)],
    sections: [
        (id: "tie", parts: [
            EyeBar(width: 4.0, thickness: 1.0, x: -3.0, y: 0.0),
            EyeBar(width: 4.0, thickness: 1.0, x: 3.0, y: 0.0),
        ]),
        (id: "rafter", area: 12.0, i_in: 100.0, i_out: 100.0),
    ],
    nodes: [(id: "A", x: 0.0, y: 0.0), (id: "B", x: 8.0, y: 0.0), (id: "C", x: 4.0, y: 3.0)],
    members: [
        (id: "A-B", start: "A", end: "B", section: "tie", material: "s", bars: 2),
        (id: "A-C", start: "A", end: "C", section: "rafter", material: "s"),
        (id: "B-C", start: "B", end: "C", section: "rafter", material: "s"),
    ],
    supports: [(node: "A", kind: Pin), (node: "B", kind: Roller)],
    load_cases: [
        (id: "dead", kind: Dead, loads: [(node: "C", fy: -100.0)]),
        (id: "live", kind: Live, loads: [(node: "C", fy: -50.0)]),
    ],
    rating: (method: "lrfr"),
    pins: [(node: "A", diameter: "4 in", fy: "36 ksi", stack: [{stack}]){extra_pin}],
)"#
    )
}

const STACK: &str = r#"
        (member: "A-B", thickness: 1.0, eyebar: ()),
        (member: "A-C", thickness: 1.0),
        (load: "shoe", thickness: 2.0),
        (member: "A-C", thickness: 1.0),
        (member: "A-B", thickness: 1.0, eyebar: ()),
    "#;

fn load(text: &str) -> Model {
    match panelpoint::input::load_str(text) {
        Ok(c) => c.model,
        Err(d) => panic!("{d:?}"),
    }
}

fn errors(text: &str) -> String {
    match panelpoint::input::load_str(text) {
        Ok(_) => panic!("the model was accepted"),
        Err(d) => format!("{d:?}"),
    }
}

/// Hand statics of the heel under P = 100 kip at C: reactions 50 kip
/// each; rafter A-C: 50/(3/5) = 83.33 kip compression; tie A-B:
/// 83.33 × 4/5 = 66.67 kip tension. On the pin (kip), per bar: tie
/// (+33.33, 0); rafter −41.67·(0.8, 0.6) = (−33.33, −25); shoe (0, +50).
/// From z = 0.5 in: M(1.5) = (33.33, 0); V(1.5..3.0) = (0, −25);
/// M(3.0) = (33.33, −37.5), |M| = √(33.33² + 37.5²) = 50.173 kip·in;
/// |V|max = 33.33 kip (outer spans).
#[test]
fn heel_pin_by_hand_statics() {
    let model = load(&triangle("", STACK));
    let analysis = panelpoint::analysis::analyse(&model).unwrap();
    let forces = &analysis.cases[0].forces;
    let pin = &model.pins[0];
    let r = panelpoint::joint::pin::resolve::Resolved::new(pin, &model.nodes, &model.members);
    let loads = r.loads(pin, forces);
    let d = panelpoint::joint::pin::statics::diagram("A", &loads).unwrap();
    let kip = 4448.2216152605;
    let kip_in = kip * 0.0254;
    assert!((d.max_moment / kip_in - (100.0f64 / 3.0).hypot(37.5)).abs() < 1e-6);
    assert!((d.max_moment_at / 0.0254 - 3.0).abs() < 1e-9);
    assert!((d.max_shear / kip - 100.0 / 3.0).abs() < 1e-6);
    // The pin's rows under the dead case: LRFD Eq. 6.7.6.2.1-1 by hand,
    // D = 4 in, Fy = 36 ksi, φ = 1: 6·50.173/(64·36) + (2.2·33.33/(16·36))³
    // = 0.130660 + 0.002064 = 0.132724.
    let method = panelpoint::rate::choose_method(&model, None).unwrap();
    let rating = panelpoint::rate::rate(&model, &analysis, method).unwrap();
    let joints = rating.joints.as_ref().expect("pin checks");
    let dead = rating.effects.iter().position(|e| e.id == "dead").unwrap();
    let pin_row = joints
        .rows
        .iter()
        .find(|r| r.effect == dead && joints.checks[r.check].kind() == "pin moment and shear")
        .unwrap();
    let hand = 6.0 * 50.173_194 / (64.0 * 36.0) + (2.2 * (100.0f64 / 3.0) / (16.0 * 36.0)).powi(3);
    assert!(
        (pin_row.eval.demand - hand).abs() < 1e-6,
        "{}",
        pin_row.eval.demand
    );
    assert_eq!(pin_row.eval.resistance, 0.95);
    // Bearing of a tie bar (two eyebars, k = 1.10): 1.10 × 33.33 = 36.67
    // kip against φb·1.5·t·D·Fy = 1.5 × 1 × 4 × min(36, 33) = 198 kip
    // (LRFD Eq. 6.7.6.2.2-1, from memory).
    let tie = joints
        .rows
        .iter()
        .find(|r| {
            r.effect == dead
                && joints.checks[r.check].kind() == "pin bearing"
                && joints.checks[r.check].member() == Some(0)
        })
        .unwrap();
    assert!((tie.eval.demand / kip - 1.1 * 100.0 / 3.0).abs() < 1e-6);
    assert!((tie.eval.resistance / kip - 198.0).abs() < 1e-6);
}

/// The pin's inventory rating factor: every load is at C, so the factored
/// state is s × (the 100 kip state) with s = 1.25 + λ·1.75·0.5; the
/// interaction 0.130660·s + 0.002064·s³ = 0.95 solved by hand (bisection
/// of the cubic below), RF = (s − 1.25)/0.875 (MBE Eq. 6A.4.2.1-1 with
/// γDC = 1.25 adding, γL = 1.75; φc = φs = 1).
#[test]
fn heel_pin_rating_factor_solves_the_interaction() {
    let model = load(&triangle("", STACK));
    let analysis = panelpoint::analysis::analyse(&model).unwrap();
    let method = panelpoint::rate::choose_method(&model, None).unwrap();
    let rating = panelpoint::rate::rate(&model, &analysis, method).unwrap();
    let joints = rating.joints.as_ref().unwrap();
    let row = joints
        .ratings
        .iter()
        .find(|r| r.level == "inventory" && joints.checks[r.check].kind() == "pin moment and shear")
        .unwrap();
    let a = 6.0 * (100.0f64 / 3.0).hypot(37.5) / (64.0 * 36.0);
    let b = (2.2 * (100.0f64 / 3.0) / (16.0 * 36.0)).powi(3);
    let (mut lo, mut hi) = (0.0, 100.0);
    for _ in 0..200 {
        let s = 0.5 * (lo + hi);
        if a * s + b * s.powi(3) < 0.95 {
            lo = s;
        } else {
            hi = s;
        }
    }
    let rf = (lo - 1.25) / 0.875;
    let got = row.rf.unwrap();
    assert!(
        (got - rf).abs() < 1e-4 * rf,
        "RF {got} against {rf} by hand"
    );
}

#[test]
fn stacks_are_validated_in_model_terms() {
    // A support with no load bar: the pin could not be in equilibrium.
    let no_shoe = STACK.replace(
        r#"(load: "shoe", thickness: 2.0),"#,
        r#"(member: "A-C", thickness: 2.0),"#,
    );
    let e = errors(&triangle("", &no_shoe));
    assert!(e.contains("pin at node \\\"A\\\": it is supported"), "{e}");
    // An unsymmetric stack: the tie's bars centred elsewhere than the rest.
    // (the last tie bar 0.5 in further out: the tie centred at 3.25 in).
    let lopsided = STACK.replace(
        r#"(member: "A-C", thickness: 1.0),
        (member: "A-B", thickness: 1.0, eyebar: ()),"#,
        r#"(member: "A-C", thickness: 1.0),
        (member: "A-B", thickness: 1.0, eyebar: (), gap: 0.5),"#,
    );
    let e = errors(&triangle("", &lopsided));
    // Tie bars at 0.5 and 6.0 in: centred at 3.25 in; the rafter's at 3.0 in.
    assert!(
        e.contains("the bars of \\\"A-B\\\" are centred at 3.25 in along the pin, those of \\\"A-C\\\" at 3.0 in"),
        "{e}"
    );
    // bars: 2 with one eyebar on the pin.
    let one_bar = STACK.replacen(
        r#"(member: "A-B", thickness: 1.0, eyebar: ()),"#,
        r#"(member: "A-B", thickness: 1.0),"#,
        1,
    );
    let e = errors(&triangle("", &one_bar));
    assert!(
        e.contains("has bars: 2 but the stack holds 1 of its eyebars"),
        "{e}"
    );
    // A member that does not meet the node; overlapping bars.
    let e = errors(&triangle(
        r#", (node: "C", diameter: "4 in", fy: "36 ksi", stack: [(member: "A-B", thickness: 1.0), (load: "x", thickness: 1.0, position: 0.2)])"#,
        STACK,
    ));
    assert!(
        e.contains("member \\\"A-B\\\" does not meet node \\\"C\\\""),
        "{e}"
    );
    // Bad numbers: zero diameter, a half-described eyebar head.
    let e = errors(&triangle("", STACK).replace("diameter: \"4 in\"", "diameter: 0.0"));
    assert!(
        e.contains("pin at node \\\"A\\\" diameter must be positive"),
        "{e}"
    );
    let half = STACK.replacen("eyebar: ()", "eyebar: (body: 4.0)", 1);
    let e = errors(&triangle("", &half));
    assert!(e.contains("give all of body, head, beyond and hole"), "{e}");
}

#[test]
fn overlapping_bars_are_named() {
    let overlap = r#"
        (member: "A-B", thickness: 1.0, position: 0.5),
        (member: "A-C", thickness: 1.0, position: 1.2),
        (load: "shoe", thickness: 2.0, position: 3.0),
        (member: "A-C", thickness: 1.0, position: 4.8),
        (member: "A-B", thickness: 1.0, position: 5.5),
    "#;
    let e = errors(&triangle("", overlap).replace(", bars: 2", ""));
    assert!(
        e.contains("stack bars 1 (A-B) and 2 (A-C) overlap by 0.3 in"),
        "{e}"
    );
}

/// The demo: every bottom-chord pin rated, eyebar members at φs = 0.90.
#[test]
fn demo_rates_its_pins() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models");
    let text = std::fs::read_to_string(dir.join("alder-mill-pins.ron")).unwrap();
    let model = panelpoint::input::load_str_in(&text, Some(&dir))
        .unwrap()
        .model;
    assert_eq!(model.pins.len(), 7);
    let analysis = panelpoint::analysis::analyse(&model).unwrap();
    let method = panelpoint::rate::choose_method(&model, None).unwrap();
    let rating = panelpoint::rate::rate(&model, &analysis, method).unwrap();
    let joints = rating.joints.as_ref().unwrap();
    for kind in ["pin moment and shear", "pin bearing", "eyebar body tension"] {
        assert!(
            joints
                .ratings
                .iter()
                .any(|r| joints.checks[r.check].kind() == kind && r.rf.is_some()),
            "{kind}"
        );
    }
    // MBE Table 6A.4.2.4-1 (from memory): the eyebar chord at φs = 0.90.
    let chord = model.members.iter().position(|m| m.id == "L2-L3").unwrap();
    assert_eq!(rating.members[chord].phi_s, 0.90);
}

mod common;

/// `panelpoint pin`: the SVG of a pin on standard output; an unknown pin
/// node or a combination with a moving load is refused with exit 2.
#[test]
fn pin_command_draws_and_refuses() {
    let model = concat!(env!("CARGO_MANIFEST_DIR"), "/models/alder-mill-pins.ron");
    let (code, out, err) = common::run(&["pin", model, "--node", "L2", "--case", "deck"]);
    assert_eq!(code, 0, "{err}");
    assert!(out.starts_with("<svg") && out.contains("3 U1-L2 eyebar"));
    let (code, out, err) = common::run(&["pin", model, "--node", "U2"]);
    assert_eq!(code, 2);
    assert!(
        out.is_empty() && err.contains("no pin at that node") && err.contains("\"L0\""),
        "{err}"
    );
    let (code, _, err) = common::run(&["pin", model, "--node", "L2", "--case", "strength-truck"]);
    assert_eq!(code, 2, "{err}");
}

/// A member removed (sweeps, the redundancy scan) leaves the pins' stacks
/// naming the same members: its own bars go, later indices move down.
#[test]
fn removing_a_member_keeps_the_stacks() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models");
    let text = std::fs::read_to_string(dir.join("alder-mill-pins.ron")).unwrap();
    let model = panelpoint::input::load_str_in(&text, Some(&dir))
        .unwrap()
        .model;
    let names = |m: &Model| -> Vec<Vec<String>> {
        m.pins
            .iter()
            .map(|p| {
                p.stack
                    .iter()
                    .map(|b| match b.carrier {
                        panelpoint::joint::pin::Carrier::Member(k) => m.members[k].id.to_string(),
                        panelpoint::joint::pin::Carrier::Load => b.label.clone(),
                    })
                    .collect()
            })
            .collect()
    };
    let before = names(&model);
    let j = model.members.iter().position(|m| m.id == "L2-U2").unwrap();
    let after = panelpoint::sweep::variant::without_member(&model, j).unwrap();
    let expected: Vec<Vec<String>> = before
        .iter()
        .map(|s| s.iter().filter(|n| *n != "L2-U2").cloned().collect())
        .collect();
    assert_eq!(names(&after), expected);
    assert_eq!(after.pins[2].stack.len(), 7); // L2: 11 bars less the post's 4
}

/// Eyebars are drawn as their own kind of part in the section drawing.
#[test]
fn eyebars_have_their_own_look_in_section_drawings() {
    let model = concat!(env!("CARGO_MANIFEST_DIR"), "/models/alder-mill-pins.ron");
    let (code, out, err) = common::run(&["section", model, "--id", "chord-5x1", "--format", "svg"]);
    assert_eq!(code, 0, "{err}");
    assert_eq!(out.matches(r#"class="part eyebar""#).count(), 2);
    assert!(out.contains("1 south bar: eyebar"));
}

/// Allowable stress rating (`asr`): the heel pin's bending stress
/// M/(π·D³/32) = 50.173/6.2832 = 7.985 ksi against 0.80·36 = 28.8 ksi
/// (0.2773) and its shear V/(π·D²/4) = 33.33/12.566 = 2.653 ksi against
/// 0.40·36 = 14.4 ksi (0.1842): the check is the larger ratio, 0.2773
/// (Standard Specifications Table 10.32.1A pin allowables, from memory).
/// Bearing of a tie bar: 0.80·33·1·4 = 105.6 kip against 1.10 × 33.33.
#[test]
fn heel_pin_allowable_stresses_by_hand() {
    let model = load(&triangle("", STACK));
    let analysis = panelpoint::analysis::analyse(&model).unwrap();
    let method = panelpoint::rate::choose_method(&model, Some("asr")).unwrap();
    let rating = panelpoint::rate::rate(&model, &analysis, method).unwrap();
    let joints = rating.joints.as_ref().unwrap();
    let dead = rating.effects.iter().position(|e| e.id == "dead").unwrap();
    let row = |kind: &str, member: Option<usize>| {
        joints
            .rows
            .iter()
            .find(|r| {
                r.effect == dead
                    && joints.checks[r.check].kind() == kind
                    && joints.checks[r.check].member() == member
            })
            .unwrap()
            .eval
    };
    let pin = row("pin moment and shear", None);
    let m = (100.0f64 / 3.0).hypot(37.5);
    let fb = m / (std::f64::consts::PI * 64.0 / 32.0) / (0.8 * 36.0);
    let fv = (100.0 / 3.0) / (std::f64::consts::PI * 4.0) / (0.4 * 36.0);
    assert!(fb > fv);
    assert!(
        (pin.demand - fb).abs() < 1e-6 && pin.resistance == 1.0,
        "{pin:?}"
    );
    let kip = 4448.2216152605;
    let tie = row("pin bearing", Some(0));
    assert!((tie.resistance / kip - 105.6).abs() < 1e-6);
    assert!((tie.demand / kip - 1.1 * 100.0 / 3.0).abs() < 1e-6);
}

#[test]
fn bars_and_load_only_stacks_are_refused() {
    let e = errors(&triangle("", STACK).replace("bars: 2", "bars: 0"));
    assert!(
        e.contains(
            "member \\\"A-B\\\" bars must be a count of parallel eyebars from 1 to 64, not 0"
        ),
        "{e}"
    );
    let e = errors(&triangle(
        r#", (node: "C", diameter: "4 in", fy: "36 ksi", stack: [(load: "x", thickness: 1.0)])"#,
        STACK,
    ));
    assert!(
        e.contains("pin at node \\\"C\\\": the stack has no member's bar"),
        "{e}"
    );
}

/// Per-pin factors override the defaults; a sharing factor below 1 is refused.
#[test]
fn factors_override_and_are_checked() {
    let text = triangle("", STACK).replace(
        r#"stack: ["#,
        r#"factors: (sharing: 1.25, interaction_limit: 0.9), stack: ["#,
    );
    let model = load(&text);
    assert_eq!(model.pins[0].factors.sharing, 1.25);
    assert_eq!(model.pins[0].factors.interaction_limit, 0.9);
    assert_eq!(model.pins[0].factors.phi_flexure, 1.0);
    let e = errors(&text.replace("sharing: 1.25", "sharing: 0.9"));
    assert!(e.contains("factors.sharing must be at least 1"), "{e}");
    let e = errors(&text.replace("sharing: 1.25", "shearing: 1.25"));
    assert!(e.contains("shearing"), "{e}");
}
