//! Fatigue evaluation end to end: a train's stress history on a simple
//! truss member by hand statics, the MBE finite-life equation and the
//! infinite-life branch through the command, the EN curve on the same
//! cycle, ordering and bad input.

mod common;

use common::{load, run, temp_model};
use panelpoint::analysis::results::Prepared;
use panelpoint::fatigue::{self, history};
use panelpoint::loads::{influence_lines, Deck};

/// The four-panel Pratt truss of tests/data/four_panel.ron (panels 18 ft,
/// depth 16 ft, diagonals falling towards midspan), chords of gross area
/// 10 in² and net area `net` in², a deck on the bottom chord, `vehicles`
/// and a fatigue block `fatigue` (inside its parentheses), member L1-L2
/// with `detail` when given.
fn truss(net: f64, vehicles: &str, fatigue: &str, detail: &str) -> String {
    let detail = if detail.is_empty() {
        String::new()
    } else {
        format!(", detail: \"{detail}\"")
    };
    format!(
        "(title: \"fatigue test\", units: (length: \"ft\", force: \"kip\", section: \"in\", stress: \"ksi\"),
 materials: [(id: \"steel\", e: 29000.0)],
 sections: [(id: \"chord\", area: 10.0, net_area: {net:?}, i_in: 310.0, i_out: 355.0), (id: \"web\", area: 6.2, i_in: 41.0, i_out: 18.5)],
 nodes: [(id: \"L0\", x: 0.0, y: 0.0), (id: \"L1\", x: 18.0, y: 0.0), (id: \"L2\", x: 36.0, y: 0.0), (id: \"L3\", x: 54.0, y: 0.0), (id: \"L4\", x: 72.0, y: 0.0),
         (id: \"U1\", x: 18.0, y: 16.0), (id: \"U2\", x: 36.0, y: 16.0), (id: \"U3\", x: 54.0, y: 16.0)],
 members: [
  (id: \"L0-L1\", start: \"L0\", end: \"L1\", section: \"chord\", material: \"steel\"),
  (id: \"L1-L2\", start: \"L1\", end: \"L2\", section: \"chord\", material: \"steel\"{detail}),
  (id: \"L2-L3\", start: \"L2\", end: \"L3\", section: \"chord\", material: \"steel\"),
  (id: \"L3-L4\", start: \"L3\", end: \"L4\", section: \"chord\", material: \"steel\"),
  (id: \"L0-U1\", start: \"L0\", end: \"U1\", section: \"chord\", material: \"steel\"),
  (id: \"U1-U2\", start: \"U1\", end: \"U2\", section: \"chord\", material: \"steel\"),
  (id: \"U2-U3\", start: \"U2\", end: \"U3\", section: \"chord\", material: \"steel\"),
  (id: \"U3-L4\", start: \"U3\", end: \"L4\", section: \"chord\", material: \"steel\"),
  (id: \"L1-U1\", start: \"L1\", end: \"U1\", section: \"web\", material: \"steel\"),
  (id: \"L2-U2\", start: \"L2\", end: \"U2\", section: \"web\", material: \"steel\"),
  (id: \"L3-U3\", start: \"L3\", end: \"U3\", section: \"web\", material: \"steel\"),
  (id: \"U1-L2\", start: \"U1\", end: \"L2\", section: \"web\", material: \"steel\"),
  (id: \"L2-U3\", start: \"L2\", end: \"U3\", section: \"web\", material: \"steel\")],
 supports: [(node: \"L0\", kind: Pin), (node: \"L4\", kind: Roller)],
 deck: [\"L0\", \"L1\", \"L2\", \"L3\", \"L4\"],
 vehicles: [{vehicles}],
 {fatigue})"
    )
}

/// Two 10-kip axles 60 ft apart (a two-car train).
const TRAIN: &str =
    "(id: \"train\", axles: [(load: \"10 kip\"), (load: \"10 kip\", spacing: \"60 ft\")])";

fn member_of<'a>(
    f: &'a fatigue::Fatigue,
    m: &panelpoint::model::Model,
    id: &str,
) -> &'a fatigue::MemberFatigue {
    f.members
        .iter()
        .find(|x| m.members[x.member].id == id)
        .unwrap()
}

#[test]
fn train_history_on_bottom_chord_by_hand_statics() {
    let m = load(&truss(
        8.0,
        TRAIN,
        "fatigue: (vehicle: \"train\", impact: 0.15, adtt: 500.0, age: 80.0)",
        "",
    ));
    let prepared = Prepared::new(&m).unwrap();
    let deck = Deck::of_model(&m).unwrap();
    let lines = influence_lines(&m, &prepared, &deck).unwrap();
    let [fw, _] = history::passages(&deck, &m.live.vehicles[0]).unwrap();
    let l1l2 = common::member(&m, "L1-L2");
    let h = history::force_history(&fw, lines.member(l1l2));
    // Hand statics: a section through panel 2 cut U1-U2, U1-L2 and L1-L2;
    // moments about U1 give F(L1-L2) = M(x = 18 ft)/16 ft with M the
    // simple-span moment, influence 0.75ξ for ξ ≤ 18 and 0.25(72 − ξ) for
    // ξ ≥ 18. Positions visited (front axle, ft): 0, 18, 36, 54, 60, 72,
    // 78, 96, 114, 132 (an axle on a panel point, plus entry and exit).
    // Front then rear axle (60 ft behind), times P/16 with P = 10 kip:
    // 0; 13.5; 9; 4.5; 3 + 0; 0 + 9; 13.5; 9; 4.5; 0.
    let want_ft = [0.0, 18.0, 36.0, 54.0, 60.0, 72.0, 78.0, 96.0, 114.0, 132.0];
    let got_ft: Vec<f64> = fw.positions.iter().map(|p| p / common::FT).collect();
    for (g, w) in got_ft.iter().zip(want_ft) {
        assert_close!(*g, w, 1e-9, 1e-9);
    }
    assert_eq!(got_ft.len(), want_ft.len());
    let want = [0.0, 13.5, 9.0, 4.5, 3.0, 9.0, 13.5, 9.0, 4.5, 0.0];
    for (g, w) in h.iter().zip(want) {
        assert_close!(g / common::KIP, w * 10.0 / 16.0, 1e-9, 1e-9);
    }
    // Rainflow of the repeating passage (by hand): reversals 0, 13.5, 3,
    // 13.5, 0 → cycles 10.5 (the dip) and 13.5 (the whole), one each.
    // Stress = (1 + 0.15)·F / A_net, A_net = 8 in²: per unit of P/16,
    // 1.15·10/16/8 = 0.08984375 ksi.
    let f = fatigue::evaluate(&m, &prepared).unwrap();
    let r = member_of(&f, &m, "L1-L2");
    let k = 1.15 * 10.0 / 16.0 / 8.0;
    let ksi = panelpoint::fatigue::mbe::KSI;
    assert_eq!(r.cycles.len(), 2);
    assert_close!(r.cycles[0].0 / ksi, 13.5 * k, 1e-9);
    assert_close!(r.cycles[1].0 / ksi, 10.5 * k, 1e-9);
    assert_eq!((r.cycles[0].1, r.cycles[1].1), (1.0, 1.0));
    assert_eq!(r.cycles_per_passage, 2.0);
    // (Σ n·Δf³ / Σ n)^(1/3) = k·((13.5³ + 10.5³)/2)^(1/3) = k·12.2149.
    let eff = k * ((13.5f64.powi(3) + 10.5f64.powi(3)) / 2.0).cbrt();
    assert_close!(r.effective_range / ksi, eff, 1e-9);
    assert_close!(r.max_stress / ksi, 13.5 * k, 1e-9);
    assert_eq!(r.min_stress, 0.0);
    assert_close!(r.area, 8.0 * common::INCH * common::INCH, 1e-12);
}

#[test]
fn gross_area_when_asked() {
    let m = load(&truss(
        8.0,
        TRAIN,
        "fatigue: (vehicle: \"train\", impact: 0.0, adtt: 500.0, age: 80.0, area: Gross)",
        "",
    ));
    let f = fatigue::evaluate_model(&m).unwrap();
    let r = member_of(&f, &m, "L1-L2");
    // 13.5·10/16/10 = 0.84375 ksi on the gross 10 in², no impact.
    assert_close!(r.max_stress / fatigue::mbe::KSI, 0.84375, 1e-9);
}

/// One 32-kip axle, no impact, net area 6 in²: L1-L2 sees one cycle of
/// 32·13.5/16/6 = 4.5 ksi per passage (statics as above).
fn single_axle(detail: &str, extra: &str) -> serde_json::Value {
    let text = truss(
        6.0,
        "(id: \"axle\", axles: [(load: \"32 kip\")])",
        &format!("fatigue: (vehicle: \"axle\", impact: 0.0, adtt: 500.0, age: 80.0{extra})"),
        detail,
    );
    let path = temp_model("fatigue.ron", &text);
    let (code, out, err) = run(&["fatigue", path.to_str().unwrap(), "--format", "json"]);
    assert_eq!(code, 0, "{err}");
    serde_json::from_str(&out).unwrap()
}

fn row<'a>(v: &'a serde_json::Value, id: &str) -> &'a serde_json::Value {
    v["members"]
        .as_array()
        .unwrap()
        .iter()
        .find(|r| r["member"] == id)
        .unwrap()
}

#[test]
fn finite_life_category_d_through_the_command() {
    let v = single_axle("", "");
    let r = row(&v, "L1-L2");
    assert_eq!(r["category"], "D");
    assert_eq!(r["category_default"], true);
    assert_close!(r["effective_range"].as_f64().unwrap(), 4.5, 1e-9);
    assert_eq!(r["cycles_per_passage"].as_f64().unwrap(), 1.0);
    // By hand (MBE Eq. 7.2.5.1-1): Y = 22·10⁸/(365·1·500·4.5³) = 132.29
    // years at R_R = 1.0; R_R = 1.3 and 1.6 for D (MBE Table 7.2.5.2-1,
    // from memory) give 171.98 and 211.67; remaining 132.29 − 80 = 52.29.
    assert_close!(r["life_minimum"].as_f64().unwrap(), 132.29, 1e-4);
    assert_close!(r["life_evaluation"].as_f64().unwrap(), 171.98, 1e-4);
    assert_close!(r["life_mean"].as_f64().unwrap(), 211.67, 1e-4);
    assert_close!(r["remaining"].as_f64().unwrap(), 52.29, 1e-3);
    // EN 1993-1-9, category 71, γMf = 1.35: 4.5 ksi = 31.026 MPa, ×1.35 =
    // 41.886 MPa, between Δσ_L = 28.73 and Δσ_D = 52.313 MPa, so m = 5:
    // N = 5·10⁶·(52.313/41.886)⁵ = 5·10⁶·3.0390 = 1.5195·10⁷ passages;
    // life = N/(365·500) = 83.26 years, remaining 3.26 (hand).
    assert_close!(r["en_passages"].as_f64().unwrap(), 1.5195e7, 1e-3);
    assert_close!(r["en_life"].as_f64().unwrap(), 83.26, 1e-3);
    assert!(v["caution"]
        .as_str()
        .unwrap()
        .contains("qualified engineer"));
    assert!(v["parameters"].as_array().unwrap().len() > 10);
    // Members with a finite remaining life come first.
    let rows = v["members"].as_array().unwrap();
    let first_infinite = rows.iter().position(|r| r["remaining"].is_null());
    if let Some(k) = first_infinite {
        assert!(rows[k..].iter().all(|r| r["remaining"].is_null()));
    }
    assert!(!rows[0]["remaining"].is_null());
}

#[test]
fn infinite_life_branch_and_growth() {
    // Category C: (ΔF)TH = 10 ksi (LRFD Table 6.6.1.2.5-3, from memory);
    // (Δf)max = 2·4.5 = 9 ≤ 10: infinite (null).
    let v = single_axle("C", "");
    let r = row(&v, "L1-L2");
    assert_eq!(r["category"], "C");
    assert!(r["life_minimum"].is_null() && r["remaining"].is_null());
    assert_close!(r["max_range"].as_f64().unwrap(), 9.0, 1e-9);
    // Growth 2 % a year at age 80: (1.02)^t = 1 + 0.02·132.29·1.02⁸⁰ =
    // 1 + 2.6458·4.8754 = 13.899; t = ln 13.899/ln 1.02 = 132.90 years,
    // remaining 52.90 (hand, closed form of docs/fatigue.md).
    let v = single_axle("", ", growth: 0.02");
    let r = row(&v, "L1-L2");
    assert_close!(r["life_minimum"].as_f64().unwrap(), 132.90, 1e-4);
}

#[test]
fn text_and_csv_carry_parameters_and_caution() {
    let text = truss(
        6.0,
        "(id: \"axle\", axles: [(load: \"32 kip\")])",
        "fatigue: (vehicle: \"axle\", adtt: 500.0, age: 80.0)",
        "E' 56",
    );
    let path = temp_model("fatigue.ron", &text);
    let (code, out, err) = run(&["fatigue", path.to_str().unwrap()]);
    assert_eq!(code, 0, "{err}");
    assert!(out.contains("CAUTION"));
    assert!(out.contains("MBE 2nd ed."));
    assert!(out.contains("EN 1993-1-9:2005"));
    assert!(out.contains("L1-L2   E'"), "{out}");
    let (code, out, err) = run(&["fatigue", path.to_str().unwrap(), "--format", "csv"]);
    assert_eq!(code, 0, "{err}");
    assert!(out.starts_with("member,category,"));
    assert!(
        out.lines()
            .nth(1)
            .unwrap()
            .starts_with("L1-L2,E',false,56.0,"),
        "{out}"
    );
    assert!(err.contains("caution") && err.contains("gamma_Mf"));
}

#[test]
fn bad_fatigue_input_is_named() {
    let cases = [
        (
            truss(
                6.0,
                TRAIN,
                "fatigue: (vehicle: \"ghost\", adtt: 500.0, age: 80.0)",
                "",
            ),
            "fatigue.vehicle \"ghost\" is not one of the model's vehicles",
        ),
        (
            truss(
                6.0,
                TRAIN,
                "fatigue: (vehicle: \"train\", adtt: -5.0, age: 80.0)",
                "",
            ),
            "fatigue.adtt must be a positive number, not -5",
        ),
        (
            truss(
                6.0,
                TRAIN,
                "fatigue: (vehicle: \"train\", adtt: 500.0, age: 80.0)",
                "Q",
            ),
            "member \"L1-L2\" detail \"Q\": \"Q\" is neither an AASHTO detail category",
        ),
        (truss(6.0, TRAIN, "", ""), "the model has no fatigue block"),
    ];
    for (text, want) in cases {
        let path = temp_model("bad.ron", &text);
        let (code, out, err) = run(&["fatigue", path.to_str().unwrap()]);
        assert_eq!(code, 2, "{err}");
        assert!(out.is_empty());
        assert!(err.contains(want), "{err}");
    }
}

#[test]
fn drawing_and_html_section() {
    // L1-L2 under the 32-kip axle: minimum life 132.29 years (above). At
    // age 80 it has used 80/132.29 = 0.605 of it; at age 140 it is spent.
    for (age, spent) in [(80.0, false), (140.0, true)] {
        let m = load(&truss(
            6.0,
            "(id: \"axle\", axles: [(load: \"32 kip\")])",
            &format!("fatigue: (vehicle: \"axle\", impact: 0.0, adtt: 500.0, age: {age:?})"),
            "",
        ));
        let f = fatigue::evaluate_model(&m).unwrap();
        let svg = panelpoint::report::fatigue_svg::draw(&m, &f, 900.0);
        let doc = roxmltree::Document::parse(&svg).expect("well-formed SVG");
        let r = member_of(&f, &m, "L1-L2");
        let u = panelpoint::report::fatigue_svg::used(age, r.mbe.life[0]);
        assert_close!(u, age / 132.2886, 1e-4);
        let colour = panelpoint::report::svg::palette::utilization(u);
        assert_eq!(colour == panelpoint::report::svg::palette::FAIL, spent);
        assert!(doc
            .descendants()
            .any(|n| n.attribute("stroke") == Some(colour.as_str())));
        let label = if spent { "L1-L2 spent" } else { "L1-L2 52 yr" };
        assert!(doc.descendants().any(|n| n.text() == Some(label)), "{svg}");
    }
    let path = temp_model(
        "fatigue.ron",
        &truss(
            6.0,
            "(id: \"axle\", axles: [(load: \"32 kip\")])",
            "fatigue: (vehicle: \"axle\", adtt: 500.0, age: 80.0)",
            "",
        ),
    );
    let svg = path.with_extension("svg");
    let (code, _, err) = run(&[
        "fatigue",
        path.to_str().unwrap(),
        "--draw",
        svg.to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{err}");
    let svg = std::fs::read_to_string(&svg).unwrap();
    assert!(roxmltree::Document::parse(&svg).is_ok());
    // Default impact 0.15 here: Y = 132.29/1.15³ = 86.98 years, 6.98 left.
    assert!(svg.contains("L1-L2 7 yr"), "{svg}");
    let html = path.with_extension("html");
    let (code, _, err) = run(&[
        "report",
        path.to_str().unwrap(),
        "-o",
        html.to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{err}");
    let text = std::fs::read_to_string(&html).unwrap();
    assert!(text.contains(r#"<section class="major" id="fatigue"><h2>Fatigue</h2>"#));
    assert!(text.contains("MBE 2nd ed. Eq. 7.2.5.1-1"));
}
