//! Gusset plates and rivet groups rated through `rate` (issue 17): the
//! demo's joints worked by hand from statics and the rating equation, and
//! the input's errors naming the joint and field.

use panelpoint::model::Model;

fn demo() -> Model {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models");
    let text = std::fs::read_to_string(dir.join("millrace-footbridge.ron")).unwrap();
    panelpoint::input::load_str_in(&text, Some(&dir))
        .unwrap()
        .model
}

fn rating_of(model: &Model, method: Option<&str>) -> panelpoint::rate::Rating {
    let analysis = panelpoint::analysis::analyse(model).unwrap();
    let m = panelpoint::rate::choose_method(model, method).unwrap();
    panelpoint::rate::rate(model, &analysis, m).unwrap()
}

fn member(model: &Model, id: &str) -> usize {
    model.members.iter().position(|m| m.id == id).unwrap()
}

/// RF of the check of `kind` for `member` at node `node` under `live`, `level`.
fn rf(
    model: &Model,
    r: &panelpoint::rate::Rating,
    node: &str,
    kind: &str,
    m: Option<&str>,
    live: &str,
    level: &str,
) -> f64 {
    let j = r.joints.as_ref().unwrap();
    let n = model.nodes.iter().position(|x| x.id == node).unwrap();
    let ci = (0..j.checks.len())
        .find(|&i| {
            let c = &j.checks[i];
            c.node() == n && c.kind() == kind && c.member() == m.map(|id| member(model, id))
        })
        .unwrap_or_else(|| panic!("no {kind} at {node}"));
    j.ratings
        .iter()
        .find(|x| x.check == ci && x.live_id == live && x.level == level)
        .unwrap()
        .rf
        .unwrap()
}

const KIP: f64 = 4_448.221_615_260_5;

#[test]
fn every_panel_point_is_rated() {
    let model = demo();
    let r = rating_of(&model, None);
    let j = r.joints.as_ref().unwrap();
    for n in 0..model.nodes.len() {
        assert!(
            j.checks.iter().any(|c| c.node() == n),
            "node {}",
            model.nodes[n].id
        );
    }
    // Every member is fastened at both its ends.
    for m in 0..model.members.len() {
        let ends = j
            .checks
            .iter()
            .filter(|c| c.kind() == "fastener shear" && c.uses().contains(&m))
            .count();
        assert!(ends >= 2, "member {}", model.members[m].id);
    }
}

#[test]
fn hanger_rivets_by_the_rating_equation() {
    // Hanger L1-U1 carries the floor-beam load at L1 (statics: the only
    // member at L1 with a vertical component): DC 5.8 kip, crowd 8.64 kip.
    // 8 rivets 7/8 in, driven 1908: Fv = 18 ksi (MBE Table 6A.6.12.5.1-1,
    // from memory), double shear: Rn = 8 × 18 × 0.601 32 × 2 = 173.18 kip;
    // φ = 0.80, φc·φs = 0.95 × 0.90 = 0.855 (gusset φs, from memory):
    // C = 118.46 kip. RF = (118.46 − 1.25 × 5.8)/(1.75 × 8.64) = 7.356
    // at inventory, /(1.35 × 8.64) = 9.535 at operating (MBE Eq. 6A.4.2.1-1).
    let model = demo();
    let r = rating_of(&model, None);
    let ab = std::f64::consts::PI * 0.875f64.powi(2) / 4.0;
    let c = 0.80 * 0.95 * 0.90 * 8.0 * 18.0 * ab * 2.0;
    for (level, gl) in [("inventory", 1.75), ("operating", 1.35)] {
        let got = rf(
            &model,
            &r,
            "L1",
            "fastener shear",
            Some("L1-U1"),
            "crowd",
            level,
        );
        let hand = (c - 1.25 * 5.8) / (gl * 8.64);
        assert!((got - hand).abs() < 1e-6 * hand, "{level}: {got} vs {hand}");
    }
}

#[test]
fn hanger_rivets_under_allowable_stress_rating() {
    // ASR: 0.50 × Rn at both levels (13.5 ksi on a 27 ksi rivet, from
    // memory): C = 0.5 × 173.18 = 86.59 kip; RF = (86.59 − 5.8)/8.64 = 9.351.
    let model = demo();
    let r = rating_of(&model, Some("asr"));
    let ab = std::f64::consts::PI * 0.875f64.powi(2) / 4.0;
    let c = 0.5 * 8.0 * 18.0 * ab * 2.0;
    let got = rf(
        &model,
        &r,
        "L1",
        "fastener shear",
        Some("L1-U1"),
        "crowd",
        "inventory",
    );
    let hand = (c - 5.8) / 8.64;
    assert!((got - hand).abs() < 1e-6 * hand, "{got} vs {hand}");
}

#[test]
fn horizontal_plane_at_l2_carries_the_diagonal_component() {
    // At L2 the plane above the chord cuts the post L2-U2 (vertical, no
    // horizontal component) and the diagonal U1-L2 at 16 ft across, 20 ft
    // up: shear = F·16/√(16² + 20²) = 0.6247·F (statics). Under the dead
    // case the diagonal carries (5.8 × 2.5)·√656/20 kip: the reaction
    // 14.5 kip less the L1 load 5.8 = 8.7 kip vertical → F = 8.7 × 25.61/20
    // = 11.141 kip, shear 6.96 kip (method of joints, by hand).
    let model = demo();
    let analysis = panelpoint::analysis::analyse(&model).unwrap();
    let dead = model.cases.iter().position(|c| c.id == "deck").unwrap();
    let forces = &analysis.cases[dead].forces;
    let set = panelpoint::joint::all_checks(&model);
    let n = model.nodes.iter().position(|x| x.id == "L2").unwrap();
    let c = set
        .checks
        .iter()
        .find(|c| c.node() == n && c.kind() == "plane shear yield")
        .unwrap();
    let method = panelpoint::method::Method::from_name("lrfr", &Default::default()).unwrap();
    let e = c.evaluate(forces, &method, &method.design_levels[0]);
    let f = 8.7 * 656f64.sqrt() / 20.0;
    assert!((forces[member(&model, "U1-L2")] / KIP - f).abs() < 1e-6);
    assert!(
        (e.demand / KIP - f * 16.0 / 656f64.sqrt()).abs() < 1e-6,
        "{}",
        e.demand / KIP
    );
}

fn error_of(edit: impl Fn(String) -> String) -> String {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models");
    let text = edit(std::fs::read_to_string(dir.join("millrace-footbridge.ron")).unwrap());
    match panelpoint::input::load_str_in(&text, Some(&dir)) {
        Ok(_) => panic!("accepted"),
        Err(d) => d
            .errors
            .iter()
            .map(|e| e.message.clone())
            .collect::<Vec<_>>()
            .join("\n"),
    }
}

#[test]
fn bad_joints_are_named_by_node_and_field() {
    let e = error_of(|t| {
        t.replacen(
            "rows: 4, pitch: 3.0, gauge: 3.0, first_row: 9.0",
            "rows: 0, pitch: 3.0, gauge: 3.0, first_row: 9.0",
            1,
        )
    });
    assert!(
        e.contains("gusset joint at \"L1\": members[1].rows must be at least 1"),
        "{e}"
    );
    let e = error_of(|t| t.replacen("(member: \"L1-U1\"", "(member: \"L2-U2\"", 1));
    assert!(
        e.contains(
            "gusset joint at \"L1\": members[1].member: member \"L2-U2\" does not meet this node"
        ),
        "{e}"
    );
    let e = error_of(|t| {
        t.replacen(
            "thickness: 0.375, measured_thickness: 0.3125",
            "thickness: -0.375, measured_thickness: 0.3125",
            1,
        )
    });
    assert!(
        e.contains("gusset joint at \"L1\": plates.thickness must be positive, not -0.375"),
        "{e}"
    );
    let e = error_of(|t| t.replacen("first_row: 9.0, planes: 2", "first_row: 90.0, planes: 2", 1));
    assert!(e.contains("lies outside the plate outline"), "{e}");
}

#[test]
fn whitmore_and_block_shear_of_the_l1_hanger_by_hand() {
    // Hanger L1-U1 at L1: 2 lines at 3 in, 4 rows at 3 in from 9 in above
    // the work point; two plates measured 5/16 in, Fy 33, Fu 60 ksi,
    // punched (Rp 0.90); the outline reaches 2 in beyond the top row.
    // Whitmore (geometry): Lw = 3 + 2 × 9 × tan 30° = 13.392 in, inside the
    // plate; Ag = 13.392 × 0.3125 × 2 = 8.370 in²; φy·Fy·Ag = 0.95 × 33 ×
    // 8.370 = 262.4 kip; × φc·φs = 1.0 × 0.90 (the method's defaults, φc = 1;
    // gusset φs 0.90, from memory) = 236.2 kip.
    // Block shear (AASHTO LRFD 6.13.4, by hand): Lv = 9 + 2 = 11 in;
    // Avg = 2 × 11 × 0.625 = 13.75; Avn = 2 × (11 − 3.5 × 0.9375) × 0.625
    // = 9.6484; Atn = (3 − 0.9375) × 0.625 = 1.2891 in²; rupture 0.58 × 60
    // × 9.6484 + 60 × 1.2891 = 413.1 > yield 0.58 × 33 × 13.75 + 77.34 =
    // 340.5; Rn = 0.90 × 340.5 = 306.5; × 0.80 × 0.90 = 220.7 kip.
    let model = demo();
    let set = panelpoint::joint::all_checks(&model);
    let method = panelpoint::method::Method::from_name("lrfr", &Default::default()).unwrap();
    let level = &method.design_levels[0];
    let n = model.nodes.iter().position(|x| x.id == "L1").unwrap();
    let m = member(&model, "L1-U1");
    let zero = vec![0.0; model.members.len()];
    let res = |kind: &str| {
        let c = set
            .checks
            .iter()
            .find(|c| c.node() == n && c.kind() == kind && c.member() == Some(m))
            .unwrap();
        c.evaluate(&zero, &method, level).resistance / KIP
    };
    let lw = 3.0 + 18.0 * (30f64).to_radians().tan();
    let whitmore = 0.95 * 33.0 * lw * 0.3125 * 2.0 * 0.90;
    assert!(
        (res("Whitmore yield") - whitmore).abs() < 1e-6,
        "{}",
        res("Whitmore yield")
    );
    let atn = (3.0 - 0.9375) * 0.625;
    let block = 0.90 * (0.58 * 33.0 * 13.75 + 60.0 * atn) * 0.80 * 0.90;
    assert!(
        (res("block shear") - block).abs() < 1e-6,
        "{} vs {block}",
        res("block shear")
    );
    assert!((block - 220.7).abs() < 0.1, "{block}");
    assert!((whitmore - 236.2).abs() < 0.1, "{whitmore}");
}
