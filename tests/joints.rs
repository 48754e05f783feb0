//! The joint-check framework (src/joint/) against the member rating it must
//! reproduce and against the rating equation worked by hand: a check that is
//! one member's axial force against that member's capacity gives exactly the
//! member's rating factor (MBE Eq. 6A.4.2.1-1, the same equation), for live
//! cases and moving loads, at every level; a check of two members under a
//! live case is worked by hand.

mod common;

use panelpoint::joint::{rate_joint_set, Eval, JointCheck, JointSet};
use panelpoint::method::{Level, Method};
use panelpoint::model::Model;
use panelpoint::units::Dimension;

/// |F_m| against the member's own capacity in the sense of F_m.
struct AxialOf {
    member: usize,
    tension: f64,
    compression: f64,
}

impl JointCheck for AxialOf {
    fn node(&self) -> usize {
        0
    }
    fn kind(&self) -> &'static str {
        "member axial (test)"
    }
    fn member(&self) -> Option<usize> {
        Some(self.member)
    }
    fn part(&self) -> String {
        "test".into()
    }
    fn uses(&self) -> Vec<usize> {
        vec![self.member]
    }
    fn clause(&self, _: &Method) -> &'static str {
        "test"
    }
    fn equation(&self, _: &Method) -> String {
        "|F| ≤ C".into()
    }
    fn inputs(&self) -> Vec<(&'static str, f64, Option<Dimension>)> {
        vec![]
    }
    fn dimension(&self) -> Option<Dimension> {
        Some(Dimension::Force)
    }
    fn evaluate(&self, forces: &[f64], _: &Method, _: &Level) -> Eval {
        let f = forces[self.member];
        Eval {
            demand: f.abs(),
            resistance: if f >= 0.0 {
                self.tension
            } else {
                self.compression
            },
        }
    }
}

fn load(name: &str) -> Model {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models");
    let text = std::fs::read_to_string(dir.join(name)).unwrap();
    panelpoint::input::load_str_in(&text, Some(&dir))
        .unwrap()
        .model
}

#[test]
fn one_member_check_gives_the_member_rating_factor() {
    for name in ["millrace-footbridge.ron", "kettle-creek-e80.ron"] {
        let model = load(name);
        let analysis = panelpoint::analysis::analyse(&model).unwrap();
        let method = panelpoint::rate::choose_method(&model, None).unwrap();
        let envelopes = panelpoint::rate::moving_envelopes(&model, &analysis.prepared).unwrap();
        let rating = panelpoint::rate::rate(&model, &analysis, method).unwrap();
        let mut compared = 0;
        for level in rating
            .method
            .design_levels
            .iter()
            .chain(&rating.method.legal_levels)
        {
            // Capacity in each sense at this level, as the member rows took it.
            let mut checks: Vec<Box<dyn JointCheck>> = Vec::new();
            let mut members = Vec::new();
            // C = φc·φs·φ·Rn in each sense, as the member rows take it.
            let cs = rating.method.condition_system(level);
            for (m, cap) in rating.members.iter().enumerate() {
                checks.push(Box::new(AxialOf {
                    member: m,
                    tension: cs * cap.tension_at(&level.resistance).0,
                    compression: cs * cap.compression_at(&level.resistance),
                }));
                members.push(m);
            }
            let set = JointSet {
                checks,
                notes: vec![],
            };
            let joints = rate_joint_set(&model, &analysis, &rating, &envelopes, set).unwrap();
            for jr in joints.ratings.iter().filter(|r| r.level == level.name) {
                let m = members[jr.check];
                let Some(mr) = rating
                    .ratings
                    .iter()
                    .find(|r| r.member == m && r.level == level.name && r.live_id == jr.live_id)
                else {
                    continue;
                };
                let (Some(a), Some(b)) = (jr.rf, mr.rf) else {
                    continue;
                };
                if b <= 0.0 {
                    continue; // dead load alone over capacity: extrapolated alike or 0
                }
                assert!(
                    (a - b).abs() <= 1e-9 * b.abs().max(1.0),
                    "{name} member {} {} {}: joint {a} vs member {b}",
                    model.members[m].id,
                    jr.live_id,
                    level.name
                );
                compared += 1;
            }
        }
        assert!(compared > 20, "{name}: only {compared} factors compared");
    }
}

/// |F_a − F_b| against R under the live case "crowd" of the footbridge,
/// worked by hand from the case forces: RF = min over γDC ∈ {max, min} of
/// (R − s·γDC·(Da − Db)) / (γL·|La − Lb|), s = sign(La − Lb)
/// (MBE Eq. 6A.4.2.1-1 with the dead factor both ways, the lower kept).
struct Difference {
    a: usize,
    b: usize,
    r: f64,
}

impl JointCheck for Difference {
    fn node(&self) -> usize {
        0
    }
    fn kind(&self) -> &'static str {
        "difference (test)"
    }
    fn member(&self) -> Option<usize> {
        None
    }
    fn part(&self) -> String {
        "test".into()
    }
    fn uses(&self) -> Vec<usize> {
        vec![self.a, self.b]
    }
    fn clause(&self, _: &Method) -> &'static str {
        "test"
    }
    fn equation(&self, _: &Method) -> String {
        "|Fa − Fb| ≤ R".into()
    }
    fn inputs(&self) -> Vec<(&'static str, f64, Option<Dimension>)> {
        vec![]
    }
    fn dimension(&self) -> Option<Dimension> {
        Some(Dimension::Force)
    }
    fn evaluate(&self, forces: &[f64], _: &Method, _: &Level) -> Eval {
        Eval {
            demand: (forces[self.a] - forces[self.b]).abs(),
            resistance: self.r,
        }
    }
}

#[test]
fn two_member_check_under_a_live_case_by_hand() {
    let model = load("millrace-footbridge.ron");
    let analysis = panelpoint::analysis::analyse(&model).unwrap();
    let method = panelpoint::rate::choose_method(&model, None).unwrap();
    let envelopes = panelpoint::rate::moving_envelopes(&model, &analysis.prepared).unwrap();
    let rating = panelpoint::rate::rate(&model, &analysis, method).unwrap();
    let crowd = model.cases.iter().position(|c| c.id == "crowd").unwrap();
    let (dc_cases, _) = model.dead_cases_split();
    let (a, b) = (0, model.members.len() - 1);
    let r = 400e3;
    let d: f64 = dc_cases
        .iter()
        .map(|&c| analysis.cases[c].forces[a] - analysis.cases[c].forces[b])
        .sum();
    let l = (analysis.cases[crowd].forces[a] - analysis.cases[crowd].forces[b])
        * (1.0 + model.cases[crowd].impact);
    let set = JointSet {
        checks: vec![Box::new(Difference { a, b, r })],
        notes: vec![],
    };
    let joints = rate_joint_set(&model, &analysis, &rating, &envelopes, set).unwrap();
    let level = &rating.method.design_levels[0];
    let s = l.signum();
    let by_hand = [level.dc.max, level.dc.min]
        .iter()
        .map(|g| (r - s * g * d) / (level.gamma_live * l.abs()))
        .fold(f64::INFINITY, f64::min);
    let got = joints
        .ratings
        .iter()
        .find(|x| x.live_id == "crowd" && x.level == level.name)
        .unwrap()
        .rf
        .unwrap();
    assert!(
        (got - by_hand).abs() <= 1e-9 * by_hand,
        "{got} vs {by_hand}"
    );
}

/// A joint weaker than every member controls the truss: the demo with the
/// L1 hanger held by two rivets (invented weakening). The rate JSON names the
/// joint as the controlling element at every level, with the factor its own
/// check row carries, below the lowest member's; a legal load's posting is
/// set by it where it is lower (MBE 6A.8.3 takes the bridge's lowest factor).
#[test]
fn a_weak_joint_controls_the_rating_and_the_posting() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models");
    let text = std::fs::read_to_string(dir.join("millrace-footbridge.ron")).unwrap();
    let old =
        r#"(member: "L1-U1", fastener: Rivet(year: 1908), diameter: 0.875, lines: 2, rows: 4,"#;
    assert!(text.contains(old), "demo changed: update this test");
    let weak = text.replace(
        old,
        r#"(member: "L1-U1", fastener: Rivet(year: 1908), diameter: 0.875, lines: 2, rows: 1,"#,
    );
    // And a legal load to post: the type 3 truck of the library.
    let moving = r#"(id: "truck", vehicle: "maintenance-truck", step: "1 ft", impact: 0.15),"#;
    assert!(weak.contains(moving), "demo changed: update this test");
    let weak = weak.replace(
        moving,
        &format!(r#"{moving} (id: "legal", vehicle: "type3", step: "1 ft", legal: true),"#),
    );
    let path = common::temp_model("weak-joint.ron", &weak);
    let (code, out, err) = common::run(&["rate", path.to_str().unwrap(), "--format", "json"]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let ctrl = v["controlling_element_by_level"].as_array().unwrap();
    assert!(!ctrl.is_empty());
    let members = v["controlling_by_level"].as_array().unwrap();
    for (c, m) in ctrl.iter().zip(members) {
        assert_eq!(c["element"], "joint", "{c}");
        assert_eq!(c["node"], "L1", "{c}");
        assert!(
            c["rf"].as_f64().unwrap() < m["rf"].as_f64().unwrap(),
            "{c} {m}"
        );
    }
    // The same factor as the joint's own fastener-shear row at the first level.
    let l1 = v["joints"]
        .as_array()
        .unwrap()
        .iter()
        .find(|j| j["node"] == "L1")
        .unwrap();
    let row = l1["checks"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|c| c["member"] == "L1-U1")
        .filter_map(|c| c["rf"].as_f64())
        .fold(f64::INFINITY, f64::min);
    assert!((row - ctrl[0]["rf"].as_f64().unwrap()).abs() < 1e-12);
    // Two rivets of 7/8 in at 18 ksi in double shear against a hanger: well
    // below 1 (10 rivets rate 1.4 or more in the demo).
    assert!(row < 0.5, "{row}");
    let postings = v["postings"].as_array().unwrap();
    assert_eq!(postings.len(), 1);
    for p in postings {
        assert!(p["member"].as_str().unwrap().starts_with("joint L1"), "{p}");
    }
    // The text names the joint as controlling.
    let (_, text_out, _) = common::run(&["rate", path.to_str().unwrap()]);
    assert!(text_out.contains("the joint controls"), "{text_out}");
}

/// Two independent computations of the same joint rating factors: the pin
/// demo with only its bottom-chord eyebars marked tension-only (they stay in
/// tension under every load, so no member ever goes slack) is rated on the
/// event-traced nonlinear path (`joint/nonlinear.rs`), the same model
/// without the marks by the linear path (each vehicle position block-solved,
/// RF by bisection, `joint/solve_rf.rs`). With no event on the path the two
/// must agree for every check, the pins' moment-and-shear interaction of
/// several members included.
#[test]
fn tension_only_path_without_events_equals_the_linear_path() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models");
    let text = std::fs::read_to_string(dir.join("alder-mill-pins.ron")).unwrap();
    let chords: Vec<&str> = ["L0-L1", "L1-L2", "L2-L3", "L3-L4", "L4-L5", "L5-L6"].to_vec();
    let mut marked = text.clone();
    for id in &chords {
        let head = format!("(id: \"{id}\",");
        let at = marked.find(&head).expect("demo changed: update this test");
        let end = at + marked[at..].find(')').unwrap();
        marked.insert_str(end, ", tension_only: true");
    }
    let rfs = |t: &str| {
        let path = common::temp_model("alder.ron", t);
        let (code, out, err) = common::run(&["rate", path.to_str().unwrap(), "--format", "json"]);
        assert_eq!(code, 0, "{err}");
        let v: serde_json::Value = serde_json::from_str(&out).unwrap();
        let mut out = Vec::new();
        for j in v["joints"].as_array().unwrap() {
            for c in j["checks"].as_array().unwrap() {
                for r in c["ratings"].as_array().unwrap() {
                    out.push((
                        format!("{} {} {} {}", j["node"], c["kind"], c["part"], r["level"]),
                        r["rf"].as_f64(),
                    ));
                }
            }
        }
        out
    };
    let (a, b) = (rfs(&text), rfs(&marked));
    assert_eq!(a.len(), b.len());
    assert!(a.iter().any(|(k, _)| k.contains("pin moment and shear")));
    let mut compared = 0;
    for ((ka, ra), (kb, rb)) in a.iter().zip(&b) {
        assert_eq!(ka, kb);
        if let (Some(x), Some(y)) = (ra, rb) {
            assert!(
                (x - y).abs() <= 1e-7 * x.abs(),
                "{ka}: linear {x}, traced {y}"
            );
            compared += 1;
        }
    }
    assert!(compared > 50, "{compared}");
}

/// The owner's report shows every pin of the pin demo with its drawing and
/// its checks (one "pin moment and shear" row per pin), the joints section
/// listed in the contents, and its streamed page parses as XML-safe text.
#[test]
fn report_shows_every_pin_with_its_checks() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models");
    let text = std::fs::read_to_string(dir.join("alder-mill-pins.ron")).unwrap();
    let pins = text.matches("(node: \"L").count();
    let path = common::temp_model("alder.ron", &text);
    let out = path.with_extension("html");
    let (code, _, err) = common::run(&[
        "report",
        path.to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{err}");
    let html = std::fs::read_to_string(&out).unwrap();
    assert!(html.contains("href=\"#joints\""));
    let drawn = html.matches("<h3>Pin at ").count();
    assert!(
        drawn >= 7 && drawn <= pins,
        "{drawn} pins drawn, {pins} node entries"
    );
    assert_eq!(html.matches("<td>pin moment and shear</td>").count(), drawn);
}
