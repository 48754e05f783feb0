//! The solver against statics worked by hand, beam theory and a dense
//! reference solve: the outside checks of the core analysis.
#![allow(clippy::needless_range_loop)]

mod common;
use common::*;
use nalgebra::{DMatrix, DVector};

/// The four-panel example under `dead` (9 kip at L1, L2, L3), every member
/// by the method of joints and sections, worked by hand (the method as in
/// any structural-analysis text, e.g. Hibbeler, Structural Analysis, ch. 3):
/// R = 27/2 = 13.5 kip at each support; end post L0-U1 has sin θ = 16/√(18²+16²).
#[test]
fn four_panel_by_method_of_joints() {
    let (m, a) = solve(FOUR_PANEL);
    let dead = &a.cases[0];
    let l = (18.0f64 * 18.0 + 16.0 * 16.0).sqrt(); // 24.083 ft
    let hand = [
        ("L0-L1", 13.5 * 18.0 / 16.0),                 // joint L0, horizontal
        ("L1-L2", 13.5 * 18.0 / 16.0),                 // section through panel 2, moments about U1
        ("L2-L3", 13.5 * 18.0 / 16.0),                 // symmetry
        ("L3-L4", 13.5 * 18.0 / 16.0),                 // joint L4
        ("L0-U1", -13.5 * l / 16.0),                   // joint L0, vertical
        ("U3-L4", -13.5 * l / 16.0),                   // joint L4, vertical
        ("U1-U2", -(13.5 * 36.0 - 9.0 * 18.0) / 16.0), // moments about L2: M = 324 kip·ft, /h
        ("U2-U3", -(13.5 * 36.0 - 9.0 * 18.0) / 16.0),
        ("L1-U1", 9.0), // joint L1, vertical
        ("L3-U3", 9.0),
        ("L2-U2", 0.0),                     // joint U2, vertical: no load at U2
        ("U1-L2", (13.5 - 9.0) * l / 16.0), // panel shear 4.5 kip / sin θ
        ("L2-U3", (13.5 - 9.0) * l / 16.0),
    ];
    for (id, kip) in hand {
        let f = dead.forces[member(&m, id)] / KIP;
        assert_close!(f, kip, 1e-9, 1e-9);
    }
    // Reactions by statics.
    for r in &dead.reactions {
        assert_close!(r[1] / KIP, 13.5, 1e-12);
        assert!(r[0].abs() < 1e-9 * KIP);
    }
    // The values quoted for this model: L1 (0.0077, −0.0592) in, L0-L1 stress 1.033 ksi.
    let u = dead.displacements[node(&m, "L1")];
    assert_close!(u[0] / INCH, 0.0077, 0.01);
    assert_close!(u[1] / INCH, -0.0592, 0.002);
}

/// Chord forces of a parallel-chord truss equal M/h of the simply
/// supported beam with the same loads (beam statics). Generated Pratt,
/// 6 panels × 18 ft, 22 ft deep, 20 kip at each interior bottom panel point.
#[test]
fn chords_are_moment_over_depth() {
    use panelpoint::generate::{generate, Family, GenerateOptions, UnitSystem};
    let layout = generate(&GenerateOptions {
        family: Family::Pratt,
        panels: 6,
        panel_width: 18.0,
        height: 22.0,
        panel_load: Some(20.0),
        units: UnitSystem::Us,
        top_heights: None,
    })
    .unwrap();
    let (m, a) = solve(&panelpoint::input::ron_writer::layout_to_ron(&layout));
    let case = &a.cases[0];
    let r = 5.0 * 20.0 / 2.0; // 50 kip each end
    let moment = |x: f64| {
        // Beam moment at x ft: reaction minus the loads at 18, 36, ... left of x.
        r * x
            - (1..6)
                .map(|k| 18.0 * k as f64)
                .filter(|&p| p < x)
                .map(|p| 20.0 * (x - p))
                .sum::<f64>()
    };
    for k in 0..6 {
        // Bottom chord L_k-L_(k+1): moment at the top panel point opposite (method of sections).
        let id = format!("L{}-L{}", k, k + 1);
        // Pratt: the diagonal cut with the chord meets the top chord at U_k
        // (left half) or U_(k+1) (right half); the end panels use U1, U5.
        let top = if k < 3 { k.max(1) } else { (k + 1).min(5) };
        let expected = moment(18.0 * top as f64) / 22.0;
        assert_close!(case.forces[member(&m, &id)] / KIP, expected, 1e-9);
    }
    for k in 1..5 {
        let id = format!("U{}-U{}", k, k + 1);
        let bottom = if k < 3 { k + 1 } else { k };
        let expected = -moment(18.0 * bottom as f64) / 22.0;
        assert_close!(case.forces[member(&m, &id)] / KIP, expected, 1e-9);
    }
}

/// Reactions of an unsymmetric load by moments about each support
/// (statics): 10 kip at L1 of the four-panel truss, span 72 ft.
#[test]
fn reactions_by_moments() {
    let text = FOUR_PANEL.replace(
        "(id: \"dead\", loads: [(node: \"L1\", fy: -9.0), (node: \"L2\", fy: -9.0), (node: \"L3\", fy: -9.0)]),",
        "(id: \"dead\", loads: [(node: \"L1\", fy: -10.0), (node: \"U3\", fx: 4.0)]),",
    );
    let (m, a) = solve(&text);
    let r = &a.cases[0].reactions;
    let (l0, l4) = (&r[0], &r[1]);
    assert_eq!(m.nodes[m.supports[1].node].id, "L4");
    // ΣM about L0: R4·72 = 10·18 + 4·16 → R4 = 244/72; ΣFy: R0 = 10 − R4; ΣFx: H0 = −4.
    assert_close!(l4[1] / KIP, 244.0 / 72.0, 1e-10);
    assert_close!(l0[1] / KIP, 10.0 - 244.0 / 72.0, 1e-10);
    assert_close!(l0[0] / KIP, -4.0, 1e-10);
}

/// One bar: elongation PL/EA (Hooke's law), P = 50 kip, L = 20 ft,
/// A = 10 in², E = 29000 ksi → δ = 50·240/(10·29000) = 0.041379 in.
#[test]
fn single_bar_elongation() {
    let text = model_text(
        &[("A", 0.0, 0.0), ("B", 20.0, 0.0)],
        &[("A-B", "A", "B")],
        &[("A", "Pin"), ("B", "Roller")],
        &[("B", 50.0, 0.0)],
    );
    let (m, a) = solve(&text);
    let u = a.cases[0].displacements[node(&m, "B")];
    assert_close!(u[0] / INCH, 50.0 * 240.0 / (10.0 * 29000.0), 1e-12);
    assert_close!(a.cases[0].forces[0] / KIP, 50.0, 1e-12);
}

/// Dense reference: assemble the full 2n × 2n stiffness with the classic
/// 4 × 4 bar matrix in global axes, strike restrained rows and columns and
/// solve with nalgebra's LU — an independent general-purpose solve.
fn dense_reference(m: &panelpoint::model::Model, fx: &[(usize, f64, f64)]) -> (Vec<f64>, Vec<f64>) {
    let n = m.nodes.len();
    let mut k = DMatrix::<f64>::zeros(2 * n, 2 * n);
    for mem in &m.members {
        let (a, b) = (&m.nodes[mem.start], &m.nodes[mem.end]);
        let (dx, dy) = (b.x - a.x, b.y - a.y);
        let l = dx.hypot(dy);
        let (c, s) = (dx / l, dy / l);
        let ea = m.materials[mem.material].e * m.sections[mem.section].area / l;
        let kk = [[c * c, c * s], [c * s, s * s]];
        let idx = [
            2 * mem.start,
            2 * mem.start + 1,
            2 * mem.end,
            2 * mem.end + 1,
        ];
        for i in 0..4 {
            for j in 0..4 {
                let sign = if (i < 2) == (j < 2) { 1.0 } else { -1.0 };
                k[(idx[i], idx[j])] += sign * ea * kk[i % 2][j % 2];
            }
        }
    }
    let mut fixed = vec![false; 2 * n];
    for s in &m.supports {
        fixed[2 * s.node + 1] = true;
        if matches!(s.restraint, panelpoint::model::Restraint::Pin) {
            fixed[2 * s.node] = true;
        }
    }
    let free: Vec<usize> = (0..2 * n).filter(|&i| !fixed[i]).collect();
    let kf = DMatrix::from_fn(free.len(), free.len(), |i, j| k[(free[i], free[j])]);
    let mut f = DVector::zeros(2 * n);
    for &(node, px, py) in fx {
        f[2 * node] += px;
        f[2 * node + 1] += py;
    }
    let ff = DVector::from_fn(free.len(), |i, _| f[free[i]]);
    let uf = kf.lu().solve(&ff).expect("dense solve");
    let mut u = vec![0.0; 2 * n];
    for (i, &d) in free.iter().enumerate() {
        u[d] = uf[i];
    }
    let forces = m
        .members
        .iter()
        .map(|mem| {
            let (a, b) = (&m.nodes[mem.start], &m.nodes[mem.end]);
            let (dx, dy) = (b.x - a.x, b.y - a.y);
            let l = dx.hypot(dy);
            let e = (dx * (u[2 * mem.end] - u[2 * mem.start])
                + dy * (u[2 * mem.end + 1] - u[2 * mem.start + 1]))
                / l;
            m.materials[mem.material].e * m.sections[mem.section].area / l * e
        })
        .collect();
    (u, forces)
}

/// An indeterminate truss (the four-panel example with counter-diagonals
/// in both middle panels and an extra pin) against the dense solve.
#[test]
fn indeterminate_against_dense_solve() {
    let text = FOUR_PANEL
        .replace(
            "(id: \"L2-U3\", start: \"L2\", end: \"U3\", section: \"web\", material: \"steel\"),",
            "(id: \"L2-U3\", start: \"L2\", end: \"U3\", section: \"web\", material: \"steel\"),\n\
             (id: \"L1-U2\", start: \"L1\", end: \"U2\", section: \"web\", material: \"steel\"),\n\
             (id: \"U2-L3\", start: \"U2\", end: \"L3\", section: \"web\", material: \"steel\"),",
        )
        .replace("(node: \"L4\", kind: Roller)", "(node: \"L4\", kind: Pin)");
    let (m, a) = solve(&text);
    assert_eq!(m.determinacy().degree(), 3);
    let case = &m.cases[1];
    let loads: Vec<_> = case.nodal.iter().map(|l| (l.node, l.fx, l.fy)).collect();
    let (u, forces) = dense_reference(&m, &loads);
    let res = &a.cases[1];
    for (i, f) in forces.iter().enumerate() {
        assert_close!(res.forces[i], *f, 1e-9, 1e-6);
    }
    for i in 0..m.nodes.len() {
        assert_close!(res.displacements[i][0], u[2 * i], 1e-9, 1e-15);
        assert_close!(res.displacements[i][1], u[2 * i + 1], 1e-9, 1e-15);
    }
    // Crossing counter-diagonals are warned about, not rejected.
    let c = panelpoint::input::load_str(&text).unwrap();
    assert!(c
        .warnings
        .iter()
        .any(|w| w.message.contains("cross without a shared node")));
}

/// The same truss written in SI (m, kN, mm, MPa) and in US units gives the
/// same physical answers (exact unit definitions: 1 in = 25.4 mm, 1 lbf = 4.4482216152605 N).
#[test]
fn us_and_si_agree() {
    let (_, us) = solve(FOUR_PANEL);
    let mut si = FOUR_PANEL.replace(
        "units: (length: \"ft\", force: \"kip\", section: \"in\", stress: \"ksi\")",
        "units: (length: \"m\", force: \"kN\", section: \"mm\", stress: \"MPa\")",
    );
    let ksi_mpa = 6.894757293168361; // 1 ksi in MPa (exact definitions)
    let kn = KIP / 1000.0;
    si = si.replace(
        "(id: \"steel\", e: 29000.0, fy: 33.0, fu: 60.0)",
        &format!(
            "(id: \"steel\", e: {:?}, fy: {:?}, fu: {:?})",
            29000.0 * ksi_mpa,
            33.0 * ksi_mpa,
            60.0 * ksi_mpa
        ),
    );
    let mm2 = 645.16; // 1 in² in mm²
    for (id, a, i1, i2) in [("chord", 14.7, 310.0, 355.0), ("web", 6.2, 41.0, 18.5)] {
        si = si.replace(
            &format!("(id: \"{id}\", area: {a:?}, i_in: {i1:?}, i_out: {i2:?})"),
            &format!(
                "(id: \"{id}\", area: {:?}, i_in: {:?}, i_out: {:?})",
                a * mm2,
                i1 * mm2 * mm2,
                i2 * mm2 * mm2
            ),
        );
    }
    for x in [0.0f64, 18.0, 36.0, 54.0, 72.0, 16.0] {
        si = si.replace(&format!("x: {x:?},"), &format!("x: {:?},", x * FT));
        si = si.replace(&format!("y: {x:?})"), &format!("y: {:?})", x * FT));
    }
    si = si.replace("fy: -9.0", &format!("fy: {:?}", -9.0 * kn));
    si = si.replace("fy: -12.5", &format!("fy: {:?}", -12.5 * kn));
    assert!(
        !si.contains("29000.0") && !si.contains("x: 18.0") && !si.contains("y: 16.0)"),
        "{si}"
    );
    let (_, si_res) = solve(&si);
    for (a, b) in us.cases.iter().zip(&si_res.cases) {
        for (fa, fb) in a.forces.iter().zip(&b.forces) {
            assert_close!(*fb, *fa, 1e-9, 1e-6);
        }
        for (ua, ub) in a.displacements.iter().zip(&b.displacements) {
            assert_close!(ub[1], ua[1], 1e-9, 1e-15);
        }
    }
    // And a value with its own unit overrides the implied one.
    let mixed = FOUR_PANEL.replace(
        "(id: \"L4\", x: 72.0, y: 0.0)",
        "(id: \"L4\", x: \"864 in\", y: 0.0)",
    );
    let (_, mixed_res) = solve(&mixed);
    assert_close!(mixed_res.cases[0].forces[0], us.cases[0].forces[0], 1e-12);
}

/// An inclined roller: a triangle A(0,0)–B(20,0)–C(10,10) ft, pin at A,
/// roller at B on a surface at 30° to the horizontal, 12 kip down at C.
/// Statics: the roller reaction R acts along the normal n = (−sin 30°, cos 30°);
/// moments about A: R·(n × r_B) = 12·10 → R·cos30°·20 = 120 → R = 6/cos 30°.
#[test]
fn inclined_roller_by_statics() {
    let text = model_text(
        &[("A", 0.0, 0.0), ("B", 20.0, 0.0), ("C", 10.0, 10.0)],
        &[("A-B", "A", "B"), ("A-C", "A", "C"), ("C-B", "C", "B")],
        &[("A", "Pin"), ("B", "InclinedRoller(angle: 30.0)")],
        &[("C", 0.0, -12.0)],
    );
    let (m, a) = solve(&text);
    let c = &a.cases[0];
    let r = 6.0 / 30f64.to_radians().cos();
    let rb = c.reactions[1];
    assert_close!(rb[0] / KIP, -r * 30f64.to_radians().sin(), 1e-10);
    assert_close!(rb[1] / KIP, r * 30f64.to_radians().cos(), 1e-10);
    let ra = c.reactions[0];
    assert_close!(ra[0] / KIP + rb[0] / KIP, 0.0, 0.0, 1e-10);
    assert_close!(ra[1] / KIP + rb[1] / KIP, 12.0, 1e-10);
    // B moves only along the rolling surface.
    let u = c.displacements[node(&m, "B")];
    assert!((u[1] - u[0] * 30f64.to_radians().tan()).abs() < 1e-12);
}

/// A support settlement leaves a statically determinate truss free of
/// force (statics: it can follow the support without straining), and
/// strains an indeterminate one: two collinear bars A–B–C pinned at A and
/// C, B settled? No — C is a roller in x pushed by δ: N = EA·δ/(2L) in both.
#[test]
fn settlements() {
    let mut text = FOUR_PANEL.replace(
        "(id: \"dead\", loads: [",
        "(id: \"dead\", settlements: [(node: \"L4\", dy: -0.5)], loads: [",
    );
    let (_, a) = solve(&text);
    let (_, b) = solve(FOUR_PANEL);
    for (fa, fb) in a.cases[0].forces.iter().zip(&b.cases[0].forces) {
        assert_close!(*fa, *fb, 1e-9, 1e-6);
    }
    // Indeterminate: bar A-B-C, pins at A and C, C pushed 0.1 in towards A.
    text = model_text(
        &[
            ("A", 0.0, 0.0),
            ("B", 10.0, 0.0),
            ("C", 20.0, 0.0),
            ("D", 10.0, 5.0),
        ],
        &[
            ("A-B", "A", "B"),
            ("B-C", "B", "C"),
            ("A-D", "A", "D"),
            ("D-C", "D", "C"),
            ("B-D", "B", "D"),
        ],
        &[("A", "Pin"), ("C", "Pin")],
        &[],
    )
    .replace(
        "load_cases: [(id: \"a\", loads: [\n])]",
        "load_cases: [(id: \"a\", settlements: [(node: \"C\", dx: -0.1)])]",
    );
    let (m, a) = solve(&text);
    // Symmetric: the push shortens the span by δ; compatibility of the two
    // load paths is solved by the dense reference with the settlement as a
    // load: compare against it through the equivalent nodal forces.
    let f = &a.cases[0].forces;
    let ab = f[member(&m, "A-B")];
    assert!(ab < 0.0, "pushed span is in compression");
    assert_close!(f[member(&m, "B-C")], ab, 1e-9);
    // Reactions balance each other (no external load).
    let r = &a.cases[0].reactions;
    assert_close!(r[0][0] + r[1][0], 0.0, 0.0, 1e-6);
}

/// `analyse_beside` hands back what ran beside it whether the analysis
/// succeeds or finds a mechanism (a diagonal removed from one panel), and
/// its analysis is the plain `analyse`'s.
#[test]
fn analyse_beside_returns_both_results() {
    let (m, a) = solve(FOUR_PANEL);
    let (b, seven) = panelpoint::analysis::analyse_beside(&m, || 7);
    assert_eq!(seven, 7);
    assert_eq!(b.unwrap().cases[1].forces, a.cases[1].forces);
    let broken = load(&FOUR_PANEL.replace(
        "(id: \"U1-L2\", start: \"U1\", end: \"L2\", section: \"web\", material: \"steel\"),",
        "",
    ));
    let (b, eight) = panelpoint::analysis::analyse_beside(&broken, || 8);
    assert_eq!(eight, 8);
    assert!(b.is_err());
}
