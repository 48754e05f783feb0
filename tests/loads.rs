//! Loads for rating against outside sources: influence lines against beam
//! statics (M/h, V/sin θ, reactions), moving-load envelopes against a
//! brute-force scan of direct solves, temperature and lack of fit against
//! hand compatibility calculations, self-weight against statics.

use panelpoint::analysis::results::Prepared;
use panelpoint::input::load_str;
use panelpoint::loads::{self, influence_lines, Deck, Direction};
use panelpoint::model::{LoadCase, Model, NodalLoad};

// 1 kip = 1000 lbf = 4448.2216152605 N (international pound, exact).
const KIP: f64 = 4_448.221_615_260_5;
const FT: f64 = 0.3048;

/// Parallel-chord Pratt truss of `n` (even) panels of `a` ft, `h` ft deep:
/// bottom nodes L0..Ln (the deck), top U1..U(n-1), diagonals falling
/// towards midspan, pin at L0 and roller at Ln. `extra` goes inside the
/// top-level parentheses, `cases` inside `load_cases: [...]`.
fn pratt(n: usize, a: f64, h: f64, cases: &str, extra: &str) -> String {
    let mut s = String::from(
        "(title: \"test Pratt\", units: (length: \"ft\", force: \"kip\", section: \"in\", stress: \"ksi\"),\n\
         materials: [(id: \"steel\", e: 29000.0, density: \"490 pcf\", alpha: \"6.5e-6 /F\")],\n\
         sections: [(id: \"chord\", area: 14.7, i_in: 310.0, i_out: 355.0), (id: \"web\", area: 6.2, i_in: 41.0, i_out: 18.5)],\nnodes: [",
    );
    for i in 0..=n {
        s += &format!("(id: \"L{i}\", x: {}, y: 0.0),", i as f64 * a);
    }
    for i in 1..n {
        s += &format!("(id: \"U{i}\", x: {}, y: {h}),", i as f64 * a);
    }
    s += "],\nmembers: [";
    let mut mem = |p: &str, q: &str, sec: &str| {
        s += &format!("(id: \"{p}-{q}\", start: \"{p}\", end: \"{q}\", section: \"{sec}\", material: \"steel\"),");
    };
    for i in 0..n {
        mem(&format!("L{i}"), &format!("L{}", i + 1), "chord");
    }
    for i in 1..n - 1 {
        mem(&format!("U{i}"), &format!("U{}", i + 1), "chord");
    }
    mem("L0", "U1", "chord");
    mem(&format!("U{}", n - 1), &format!("L{n}"), "chord");
    for i in 1..n {
        mem(&format!("L{i}"), &format!("U{i}"), "web");
    }
    for i in 1..n / 2 {
        mem(&format!("U{i}"), &format!("L{}", i + 1), "web");
    }
    for i in n / 2 + 1..n {
        mem(&format!("L{}", i - 1), &format!("U{i}"), "web");
    }
    s += &format!(
        "],\nsupports: [(node: \"L0\", kind: Pin), (node: \"L{n}\", kind: Roller)],\nload_cases: [{cases}],\n{extra})"
    );
    s
}

fn deck_text(n: usize) -> String {
    let ids: Vec<String> = (0..=n).map(|i| format!("\"L{i}\"")).collect();
    format!("deck: [{}],", ids.join(","))
}

fn model(text: &str) -> Model {
    match load_str(text) {
        Ok(c) => c.model,
        Err(d) => panic!("model did not load: {d}"),
    }
}

fn member(m: &Model, id: &str) -> usize {
    m.members.iter().position(|x| x.id == id).unwrap()
}

/// Influence ordinate of the simple-beam bending moment at x for a unit
/// load at ξ (statics: M = ξ(L − x)/L for ξ ≤ x, x(L − ξ)/L for ξ ≥ x).
fn beam_moment(l: f64, x: f64, xi: f64) -> f64 {
    if xi <= x {
        xi * (l - x) / l
    } else {
        x * (l - xi) / l
    }
}

/// Influence ordinate of the shear in the panel between panel points x1
/// and x2 for a unit load at a panel point ξ (statics: V = R_left − loads left).
fn panel_shear(l: f64, x1: f64, x2: f64, xi: f64) -> f64 {
    if xi <= x1 {
        -xi / l
    } else if xi >= x2 {
        (l - xi) / l
    } else {
        unreachable!("load at a panel point only")
    }
}

fn close(got: f64, want: f64, scale: f64) -> bool {
    (got - want).abs() <= 1e-6 * want.abs().max(scale)
}

#[test]
fn chord_lines_are_beam_moment_over_depth() {
    for &(n, a, h) in &[(4usize, 18.0, 16.0), (8, 15.0, 20.0)] {
        let m = model(&pratt(n, a, h, "", &deck_text(n)));
        let p = Prepared::new(&m).unwrap();
        let deck = Deck::of_model(&m).unwrap();
        let lines = influence_lines(&m, &p, &deck).unwrap();
        let l = n as f64 * a;
        for k in 0..=n {
            let xi = k as f64 * a;
            for i in 0..n {
                // Bottom chord L_i–L_(i+1): moments about the top node of the
                // cut, U_i in the left half, U_(i+1) in the right (M/h).
                let about = if i < n / 2 {
                    i.max(1)
                } else {
                    (i + 1).min(n - 1)
                };
                let want = beam_moment(l, about as f64 * a, xi) / h;
                let got = lines.member(member(&m, &format!("L{i}-L{}", i + 1)))[k];
                assert!(
                    close(got, want, 1e-3),
                    "n={n} L{i}-L{} at L{k}: {got} vs {want}",
                    i + 1
                );
            }
            for i in 1..n - 1 {
                // Top chord U_i–U_(i+1): moment about the bottom node of the
                // cut, L_(i+1) left of midspan, L_i right of it; −M/h.
                let about = if i < n / 2 { i + 1 } else { i };
                let want = -beam_moment(l, about as f64 * a, xi) / h;
                let got = lines.member(member(&m, &format!("U{i}-U{}", i + 1)))[k];
                assert!(
                    close(got, want, 1e-3),
                    "n={n} U{i}-U{} at L{k}: {got} vs {want}",
                    i + 1
                );
            }
        }
    }
}

#[test]
fn four_panel_ordinates_by_hand() {
    let m = model(&pratt(4, 18.0, 16.0, "", &deck_text(4)));
    let p = Prepared::new(&m).unwrap();
    let lines = influence_lines(&m, &p, &Deck::of_model(&m).unwrap()).unwrap();
    // M/h by hand: unit load at L1, moment about U1 = 18·54/72 = 13.5; /16 = 0.84375.
    assert!((lines.member(member(&m, "L1-L2"))[1] - 0.84375).abs() < 1e-9);
    // Between panel points the line is linear: at 27 ft, midway L1–L2,
    // (0.84375 + 0.5625)/2 = 0.703125 (M at U1 for load at L2 is 18·36/72/16).
    assert!((lines.member_at(member(&m, "L1-L2"), 27.0 * FT) - 0.703125).abs() < 1e-9);
}

#[test]
fn reaction_line_runs_linearly_from_one_to_zero() {
    let n = 6;
    let m = model(&pratt(n, 20.0, 24.0, "", &deck_text(n)));
    let p = Prepared::new(&m).unwrap();
    let lines = influence_lines(&m, &p, &Deck::of_model(&m).unwrap()).unwrap();
    let (left, right) = (lines.reaction_y(0), lines.reaction_y(1));
    for k in 0..=n {
        // Statics of a simple span: R_left = (L − ξ)/L, R_right = ξ/L.
        let want = 1.0 - k as f64 / n as f64;
        assert!(close(left[k], want, 1e-3), "L0 at L{k}: {}", left[k]);
        assert!(
            close(right[k], 1.0 - want, 1e-3),
            "L{n} at L{k}: {}",
            right[k]
        );
    }
    // A vertical load gives no horizontal reaction at the pin (statics).
    assert!(lines.reaction_x(0).iter().all(|v| v.abs() < 1e-9));
}

#[test]
fn diagonal_line_is_panel_shear_over_sin_theta() {
    let (n, a, h) = (8usize, 15.0, 20.0);
    let m = model(&pratt(n, a, h, "", &deck_text(n)));
    let p = Prepared::new(&m).unwrap();
    let lines = influence_lines(&m, &p, &Deck::of_model(&m).unwrap()).unwrap();
    let l = n as f64 * a;
    let sin = h / a.hypot(h);
    for k in 0..=n {
        let xi = k as f64 * a;
        for i in 1..n / 2 {
            // U_i–L_(i+1) falls to the right: on the left free body its
            // tension pulls U_i down-right, so ΣFy: V − T sin θ = 0, T = V/sin θ.
            let want = panel_shear(l, i as f64 * a, (i + 1) as f64 * a, xi) / sin;
            let got = lines.member(member(&m, &format!("U{i}-L{}", i + 1)))[k];
            assert!(
                close(got, want, 1e-3),
                "U{i}-L{} at L{k}: {got} vs {want}",
                i + 1
            );
        }
        for i in n / 2 + 1..n {
            // L_(i−1)–U_i rises to the right: its tension pulls L_(i−1) up on
            // the left free body, ΣFy: V + T sin θ = 0, T = −V/sin θ.
            let want = -panel_shear(l, (i - 1) as f64 * a, i as f64 * a, xi) / sin;
            let got = lines.member(member(&m, &format!("L{}-U{i}", i - 1)))[k];
            assert!(
                close(got, want, 1e-3),
                "L{}-U{i} at L{k}: {got} vs {want}",
                i - 1
            );
        }
    }
}

/// Lever rule written out again for the brute force: deck along x.
fn axle_loads(m: &Model, n: usize, a_ft: f64, axles: &[(f64, f64)], s_ft: f64) -> Vec<NodalLoad> {
    let mut out = Vec::new();
    for &(p_kip, pos_ft) in axles {
        let s = s_ft + pos_ft;
        if s < 0.0 || s > n as f64 * a_ft {
            continue;
        }
        let k = ((s / a_ft).floor() as usize).min(n - 1);
        let t = s / a_ft - k as f64;
        let node = |i: usize| {
            m.nodes
                .iter()
                .position(|x| x.id == format!("L{i}"))
                .unwrap()
        };
        out.push(NodalLoad {
            node: node(k),
            fx: 0.0,
            fy: -p_kip * KIP * (1.0 - t),
        });
        out.push(NodalLoad {
            node: node(k + 1),
            fx: 0.0,
            fy: -p_kip * KIP * t,
        });
    }
    out
}

#[test]
fn envelope_matches_brute_force_scan_of_direct_solves() {
    let (n, a) = (4usize, 18.0);
    let extra = format!(
        "{} vehicles: [(id: \"train\", axles: [(load: \"8 kip\"), (load: \"12 kip\", spacing: \"9 ft\"), (load: \"12 kip\", spacing: \"5 ft\")])],\n\
         moving_loads: [(id: \"t\", vehicle: \"train\", step: \"0.5 ft\", impact: 0.0), (id: \"t-coarse\", vehicle: \"train\", step: \"7.3 ft\", impact: 0.25)],",
        deck_text(n)
    );
    let m = model(&pratt(n, a, 16.0, "", &extra));
    let p = Prepared::new(&m).unwrap();
    let envs = loads::envelopes(&m, &p).unwrap();
    // Brute force: every 0.5 ft (which includes every axle-on-panel-point
    // position, spacings and panels being multiples of 0.5 ft), both ways,
    // each position solved as an ordinary load case.
    let forward = [(8.0, 0.0), (12.0, -9.0), (12.0, -14.0)];
    let reverse = [(8.0, 0.0), (12.0, 9.0), (12.0, 14.0)];
    let mut cases = Vec::new();
    let steps = ((n as f64 * a + 14.0) / 0.5) as usize;
    for k in 0..=steps {
        let s = k as f64 * 0.5;
        for (axles, front) in [(&forward, s), (&reverse, n as f64 * a - s)] {
            cases.push(LoadCase {
                id: format!("{front}"),
                nodal: axle_loads(&m, n, a, axles, front),
                ..Default::default()
            });
        }
    }
    let results = p.solve_cases(&m, &cases).unwrap();
    // Round-off scale: the largest force anywhere (zero-force members).
    let scale = results
        .iter()
        .flat_map(|r| r.forces.iter())
        .fold(0.0f64, |a, f| a.max(f.abs()));
    for (j, mem) in m.members.iter().enumerate() {
        let hi = results.iter().map(|r| r.forces[j]).fold(0.0, f64::max);
        let lo = results.iter().map(|r| r.forces[j]).fold(0.0, f64::min);
        let e = &envs[0].per_member[j];
        assert!(
            (e.max_tension() - hi).abs() <= 1e-9 * scale,
            "{}: {} vs {hi}",
            mem.id,
            e.max_tension()
        );
        assert!(
            (e.max_compression() - lo).abs() <= 1e-9 * scale,
            "{}: {} vs {lo}",
            mem.id,
            e.max_compression()
        );
        // The coarse step still finds the exact extremes (axle-on-panel-point
        // positions are always visited), times 1 + impact.
        let c = &envs[1].per_member[j];
        assert!(
            (c.max_tension() - 1.25 * hi).abs() <= 1e-9 * scale,
            "{}",
            mem.id
        );
        assert!(
            (c.max_compression() - 1.25 * lo).abs() <= 1e-9 * scale,
            "{}",
            mem.id
        );
        // The reported placement reproduces the extreme when solved directly.
        if let Some(at) = e.tension.at {
            let axles = if at.direction == Direction::Forward {
                &forward
            } else {
                &reverse
            };
            let case = LoadCase {
                id: "check".into(),
                nodal: axle_loads(&m, n, a, axles, at.position / FT),
                ..Default::default()
            };
            let r = p.solve_cases(&m, &[case]).unwrap();
            assert!((r[0].forces[j] - hi).abs() <= 1e-9 * scale, "{}", mem.id);
        }
    }
}

#[test]
fn single_axle_closed_form_and_lane_areas() {
    let (n, a, h) = (4usize, 18.0, 16.0);
    let extra = format!(
        "{} vehicles: [(id: \"one\", axles: [(load: \"10 kip\")]), (id: \"lane\", lane: \"0.5 kip/ft\")],\n\
         moving_loads: [(id: \"one\", vehicle: \"one\", step: \"1 ft\", impact: 0.1), (id: \"lane\", vehicle: \"lane\", step: \"1 ft\")],",
        deck_text(n)
    );
    let m = model(&pratt(n, a, h, "", &extra));
    let p = Prepared::new(&m).unwrap();
    let envs = loads::envelopes(&m, &p).unwrap();
    let l = n as f64 * a;
    // One axle P on L1–L2: greatest with P at L1, P·18·54/72/16 = 0.84375 P
    // (M/h, statics), times 1.1 impact.
    let e = &envs[0].per_member[member(&m, "L1-L2")];
    assert!((e.max_tension() - 1.1 * 10.0 * KIP * 0.84375).abs() < 1e-6 * KIP);
    let at = e.tension.at.unwrap();
    assert!((at.position - 18.0 * FT).abs() < 1e-9);
    assert_eq!(e.compression.force, 0.0);
    assert!(e.compression.at.is_none());
    // Lane w on the bottom chord L1–L2, line a triangle of apex
    // 18·54/72/16 at L1: area ½·72·0.84375 ft; force = w·area (statics).
    let w = 0.5 * KIP / FT;
    let lane = &envs[1].per_member[member(&m, "L1-L2")];
    assert!((lane.max_tension() - w * 0.5 * l * FT * 0.84375).abs() < 1e-6 * KIP);
    assert!(lane.max_compression().abs() < 1e-6);
    // Diagonal U1–L2: line −ξ/L/sin θ up to L1, (L − ξ)/L/sin θ from L2,
    // zero where the straight line between crosses: ξ0 = 18 + 18·(0.25/0.75)
    // = 24 ft. Positive area = ½(72 − 24)·0.5/sin θ; negative = −½·24·0.25/sin θ
    // (triangles, by hand).
    let sin = h / a.hypot(h);
    let d = &envs[1].per_member[member(&m, "U1-L2")];
    assert!((d.max_tension() - w * 0.5 * 48.0 * FT * 0.5 / sin).abs() < 1e-6 * KIP);
    assert!((d.max_compression() + w * 0.5 * 24.0 * FT * 0.25 / sin).abs() < 1e-6 * KIP);
    // Reaction at L0 under the lane load: w·L/2 (statics).
    let r = &envs[1].per_support[0];
    assert!((r.up.force - w * l * FT / 2.0).abs() < 1e-6 * KIP);
}

#[test]
fn superposition_of_loads_and_of_axle_and_lane() {
    let (n, a) = (6usize, 20.0);
    let extra = format!(
        "{} vehicles: [(id: \"both\", axles: [(load: \"10 kip\"), (load: \"10 kip\", spacing: \"14 ft\")], lane: \"0.3 kip/ft\"),\n\
         (id: \"axles\", axles: [(load: \"10 kip\"), (load: \"10 kip\", spacing: \"14 ft\")]), (id: \"lane\", lane: \"0.3 kip/ft\"),\n\
         (id: \"double\", axles: [(load: \"20 kip\"), (load: \"20 kip\", spacing: \"14 ft\")])],\n\
         moving_loads: [(id: \"b\", vehicle: \"both\", step: \"1 ft\"), (id: \"a\", vehicle: \"axles\", step: \"1 ft\"), (id: \"l\", vehicle: \"lane\", step: \"1 ft\"), (id: \"d\", vehicle: \"double\", step: \"1 ft\")],",
        deck_text(n)
    );
    let cases = "(id: \"A\", loads: [(node: \"L2\", fy: -10.0)]), (id: \"B\", loads: [(node: \"L5\", fy: -7.0), (node: \"U3\", fx: 3.0)]),\n\
                 (id: \"AB\", loads: [(node: \"L2\", fy: -10.0), (node: \"L5\", fy: -7.0), (node: \"U3\", fx: 3.0)])";
    let m = model(&pratt(n, a, 24.0, cases, &extra));
    let p = Prepared::new(&m).unwrap();
    // Linear elasticity: the forces of A + B are the sum (superposition).
    let r = p.solve_cases(&m, &m.cases).unwrap();
    for j in 0..m.members.len() {
        assert!((r[2].forces[j] - r[0].forces[j] - r[1].forces[j]).abs() < 1e-6 * KIP);
    }
    let envs = loads::envelopes(&m, &p).unwrap();
    for j in 0..m.members.len() {
        let (b, ax, la, d) = (
            &envs[0].per_member[j],
            &envs[1].per_member[j],
            &envs[2].per_member[j],
            &envs[3].per_member[j],
        );
        // The lane load is placed independently of the axles, so the
        // extremes add; doubled axle loads double the axle extremes.
        assert!((b.max_tension() - ax.max_tension() - la.max_tension()).abs() < 1e-6 * KIP);
        assert!(
            (b.max_compression() - ax.max_compression() - la.max_compression()).abs() < 1e-6 * KIP
        );
        assert!((d.max_tension() - 2.0 * ax.max_tension()).abs() < 1e-6 * KIP);
        assert!((d.max_compression() - 2.0 * ax.max_compression()).abs() < 1e-6 * KIP);
    }
}

#[test]
fn uniform_temperature_leaves_a_determinate_truss_unstressed() {
    let m = model(&pratt(
        6,
        20.0,
        24.0,
        "(id: \"warm\", temperature_all: \"50 F\")",
        "",
    ));
    assert_eq!(m.cases[0].elongations.len(), m.members.len());
    let r = Prepared::new(&m)
        .unwrap()
        .solve_cases(&m, &m.cases)
        .unwrap();
    // A determinate truss takes any member length changes without stress
    // (statics: the forces follow from equilibrium alone). Scale: EAαΔT of
    // a chord ≈ 29000·14.7·6.5e-6·50 ≈ 139 kip.
    let scale = 29000.0 * 14.7 * 6.5e-6 * 50.0 * KIP;
    for f in &r[0].forces {
        assert!(f.abs() < 1e-9 * scale, "{f}");
    }
}

/// A straight bar of two segments A–B–C between pins at A and C, with a
/// roller at B holding it vertically; SI model.
fn pinned_bar(area2_mm2: f64, case: &str) -> Model {
    model(&format!(
        "(units: (length: \"m\", force: \"kN\", section: \"mm\", stress: \"MPa\"),\n\
         materials: [(id: \"s\", e: 200000.0, alpha: \"12e-6 /C\")],\n\
         sections: [(id: \"a\", area: \"1000 mm2\", i_in: 1e6, i_out: 1e6), (id: \"b\", area: \"{area2_mm2} mm2\", i_in: 1e6, i_out: 1e6)],\n\
         nodes: [(id: \"A\", x: 0, y: 0), (id: \"B\", x: 4, y: 0), (id: \"C\", x: 10, y: 0)],\n\
         members: [(id: \"AB\", start: \"A\", end: \"B\", section: \"a\", material: \"s\"), (id: \"BC\", start: \"B\", end: \"C\", section: \"b\", material: \"s\")],\n\
         supports: [(node: \"A\", kind: Pin), (node: \"B\", kind: Roller), (node: \"C\", kind: Pin)],\n\
         load_cases: [{case}])"
    ))
}

#[test]
fn heated_bar_between_pins() {
    // Equal sections: the bar cannot lengthen, N = −EAαΔT (compatibility,
    // by hand) = −200 GPa · 1000 mm² · 12e-6 · 30 = −72 kN.
    let m = pinned_bar(1000.0, "(id: \"t\", temperature_all: \"30 C\")");
    let r = Prepared::new(&m)
        .unwrap()
        .solve_cases(&m, &m.cases)
        .unwrap();
    for f in &r[0].forces {
        assert!((f + 72_000.0).abs() < 1e-6, "{f}");
    }
    // Unequal sections (1000 and 2000 mm²), only BC heated by 30 °C: the
    // free elongation αΔT·6 m = 2.16 mm is taken up elastically by both:
    // N = −2.16e-3 / (4/(E·1e-3) + 6/(E·2e-3)) = −2.16e-3·2e8/7 = −61.714 kN
    // (two bars in series, by hand).
    let m = pinned_bar(
        2000.0,
        "(id: \"t\", temperature: [(member: \"BC\", change: \"30 C\")])",
    );
    let r = Prepared::new(&m)
        .unwrap()
        .solve_cases(&m, &m.cases)
        .unwrap();
    let want = -2.16e-3 * 2e8 / 7.0;
    for f in &r[0].forces {
        assert!((f - want).abs() < 1e-6 * want.abs(), "{f} vs {want}");
    }
    // The bar pushes the pins apart; the reaction at A pushes back towards
    // C: rx = −N > 0 (statics at joint A).
    assert!((r[0].reactions[0][0] + want).abs() < 1e-6 * want.abs());
}

#[test]
fn lack_of_fit_in_series_and_three_bar_truss() {
    // Two bars in series between pins, AB 0.5 mm too long:
    // N = −e/(L1/EA1 + L2/EA2) = −0.5e-3/(4/2e8 + 6/4e8) = −0.5e-3·4e8/14
    // = −14.2857 kN (compatibility, by hand).
    let m = pinned_bar(
        2000.0,
        "(id: \"f\", lack_of_fit: [(member: \"AB\", elongation: 0.5)])",
    );
    let r = Prepared::new(&m)
        .unwrap()
        .solve_cases(&m, &m.cases)
        .unwrap();
    let want = -0.5e-3 * 4e8 / 14.0;
    assert!((r[0].forces[0] - want).abs() < 1e-6 * want.abs());
    assert!((r[0].forces[1] - want).abs() < 1e-6 * want.abs());

    // Three-bar symmetric truss: pins at A(−3, 4), B(0, 4), C(3, 4), free
    // node D(0, 0); the middle bar BD (L = 4 m) is e = 2 mm too long.
    // cos θ = 4/5. Hand: D moves down v, N_BD = EA/L(v − e), N_side =
    // EA cos²θ v/L, ΣFy: N_BD + 2 N_side cos θ = 0 → v = e/(1 + 2cos³θ);
    // N_BD = −(EA e/L)·2c³/(1 + 2c³), N_side = (EA e/L)·c²/(1 + 2c³).
    let text = "(units: (length: \"m\", force: \"kN\", section: \"mm\", stress: \"MPa\"),\n\
         materials: [(id: \"s\", e: 200000.0, alpha: \"12e-6 /C\")],\n\
         sections: [(id: \"a\", area: \"1000 mm2\", i_in: 1e6, i_out: 1e6)],\n\
         nodes: [(id: \"A\", x: -3, y: 4), (id: \"B\", x: 0, y: 4), (id: \"C\", x: 3, y: 4), (id: \"D\", x: 0, y: 0)],\n\
         members: [(id: \"AD\", start: \"A\", end: \"D\", section: \"a\", material: \"s\"), (id: \"BD\", start: \"B\", end: \"D\", section: \"a\", material: \"s\"), (id: \"CD\", start: \"C\", end: \"D\", section: \"a\", material: \"s\")],\n\
         supports: [(node: \"A\", kind: Pin), (node: \"B\", kind: Pin), (node: \"C\", kind: Pin)],\n\
         load_cases: [(id: \"fit\", lack_of_fit: [(member: \"BD\", elongation: \"2 mm\")]),\n\
                      (id: \"hot\", temperature: [(member: \"BD\", change: \"41.6666666666666667 C\")])])";
    let m = model(text);
    let r = Prepared::new(&m)
        .unwrap()
        .solve_cases(&m, &m.cases)
        .unwrap();
    let (ea_l, e, c) = (200e9 * 1e-3 / 4.0, 2e-3, 0.8f64);
    let d = 1.0 + 2.0 * c.powi(3);
    let middle = -ea_l * e * 2.0 * c.powi(3) / d;
    let side = ea_l * e * c * c / d;
    // The same elongation from heat: αΔT·L = 12e-6·41.667·4 = 2 mm.
    for case in &r {
        assert!(
            (case.forces[1] - middle).abs() < 1e-6 * middle.abs(),
            "{}",
            case.forces[1]
        );
        assert!(
            (case.forces[0] - side).abs() < 1e-6 * side,
            "{}",
            case.forces[0]
        );
        assert!((case.forces[2] - side).abs() < 1e-6 * side);
    }
}

#[test]
fn self_weight_total_is_density_area_length_factor() {
    let m = model(&pratt(
        4,
        18.0,
        16.0,
        "(id: \"sw\", self_weight: Some(1.05))",
        "",
    ));
    let r = Prepared::new(&m)
        .unwrap()
        .solve_cases(&m, &m.cases)
        .unwrap();
    // Statics by hand: chords 14.7 in² over 72 + 36 + 2·√(18² + 16²) ft,
    // webs 6.2 in² over 3·16 + 2·√(18² + 16²) ft; 490 lb/ft³; in²·ft/144 = ft³.
    let d = (18.0f64 * 18.0 + 16.0 * 16.0).sqrt();
    let volume_ft3 = (14.7 * (72.0 + 36.0 + 2.0 * d) + 6.2 * (48.0 + 2.0 * d)) / 144.0;
    let weight = 490.0 * volume_ft3 * 1.05 * KIP / 1000.0;
    assert!((-r[0].load_sum[1] - weight).abs() < 1e-9 * weight);
    assert!((r[0].reaction_sum[1] - weight).abs() < 1e-6 * weight);
    // Symmetric truss: each reaction carries half (statics).
    assert!((r[0].reactions[0][1] - weight / 2.0).abs() < 1e-6 * weight);
}

#[test]
fn bad_load_input_names_case_and_member() {
    let no_alpha = pratt(
        4,
        18.0,
        16.0,
        "(id: \"hot\", temperature_all: \"20 C\")",
        "",
    )
    .replace(", alpha: \"6.5e-6 /F\"", "");
    let e = load_str(&no_alpha).err().unwrap().to_string();
    assert!(
        e.contains("\"hot\"") && e.contains("\"steel\"") && e.contains("alpha"),
        "{e}"
    );
    let no_density = pratt(4, 18.0, 16.0, "(id: \"sw\", self_weight: 1.05)", "")
        .replace("density: \"490 pcf\", ", "");
    let e = load_str(&no_density).err().unwrap().to_string();
    assert!(
        e.contains("\"sw\"") && e.contains("density") && e.contains("\"steel\""),
        "{e}"
    );
    let unknown = pratt(
        4,
        18.0,
        16.0,
        "(id: \"f\", lack_of_fit: [(member: \"X9\", elongation: 0.1)])",
        "",
    );
    let e = load_str(&unknown).err().unwrap().to_string();
    assert!(e.contains("\"f\"") && e.contains("\"X9\""), "{e}");
    let twice = pratt(4, 18.0, 16.0, "(id: \"t\", temperature: [(member: \"L0-L1\", change: 5), (member: \"L0-L1\", change: 6)])", "");
    let e = load_str(&twice).err().unwrap().to_string();
    assert!(e.contains("\"t\"") && e.contains("\"L0-L1\""), "{e}");
    let wrong_unit = pratt(4, 18.0, 16.0, "(id: \"t\", temperature_all: \"20 ft\")", "");
    assert!(load_str(&wrong_unit).is_err());
    let bad_vehicle = pratt(
        4,
        18.0,
        16.0,
        "",
        &format!(
            "{} moving_loads: [(id: \"m\", vehicle: \"ghost\", step: 1)],",
            deck_text(4)
        ),
    );
    let e = load_str(&bad_vehicle).err().unwrap().to_string();
    assert!(e.contains("\"m\"") && e.contains("\"ghost\""), "{e}");
    let no_deck = pratt(4, 18.0, 16.0, "", "vehicles: [(id: \"v\", axles: [(load: 1)])], moving_loads: [(id: \"m\", vehicle: \"v\", step: 1)],");
    assert!(load_str(&no_deck)
        .err()
        .unwrap()
        .to_string()
        .contains("deck"));
    let first_spacing = pratt(
        4,
        18.0,
        16.0,
        "",
        "vehicles: [(id: \"v\", axles: [(load: 1, spacing: 3)])],",
    );
    assert!(load_str(&first_spacing)
        .err()
        .unwrap()
        .to_string()
        .contains("\"v\""));
    let bad_deck = pratt(4, 18.0, 16.0, "", "deck: [\"L0\", \"L0\"],");
    assert!(load_str(&bad_deck).is_err());
    let zero_step = pratt(4, 18.0, 16.0, "", &format!("{} vehicles: [(id: \"v\", axles: [(load: 1)])], moving_loads: [(id: \"m\", vehicle: \"v\", step: 0)],", deck_text(4)));
    assert!(load_str(&zero_step)
        .err()
        .unwrap()
        .to_string()
        .contains("\"m\" step"));
}

#[test]
fn core_example_still_loads_and_example_with_live_load_runs() {
    let core = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/data/four_panel.ron"
    ))
    .unwrap();
    let m = model(&core);
    assert!(m.live.deck.is_empty() && m.live.moving.is_empty());
    let dir = std::path::Path::new(concat!(env!("CARGO_MANIFEST_DIR"), "/models"));
    let text = std::fs::read_to_string(dir.join("four_panel_live.ron")).unwrap();
    let m = panelpoint::input::load_str_in(&text, Some(dir))
        .unwrap()
        .model;
    // Vehicles from the file and the model's own.
    assert_eq!(m.live.vehicles.len(), 4);
    let p = Prepared::new(&m).unwrap();
    let envs = loads::envelopes(&m, &p).unwrap();
    assert_eq!(envs.len(), 3);
    // Dead case: 9 kip at each of L1–L3 alone gives R = 13.5 kip,
    // M(18 ft) = 13.5·18 = 243 kip·ft, L1–L2 = 243/16 = 15.1875 kip (M/h);
    // the self-weight adds to it.
    let j = member(&m, "L1-L2");
    assert!(envs[0].per_member[j].dead > 15.1875 * KIP);
}

fn run(args: &[&str]) -> (i32, String, String) {
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_panelpoint"))
        .args(args)
        .current_dir(env!("CARGO_MANIFEST_DIR"))
        .output()
        .unwrap();
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

#[test]
fn influence_command_json_and_errors() {
    let (code, out, err) = run(&[
        "influence",
        "tests/data/four_panel.ron",
        "--deck",
        "L0,L1,L2,L3,L4",
        "--format",
        "json",
    ]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let lines = v["lines"].as_array().unwrap();
    // Every member and both reactions.
    assert_eq!(lines.len(), 13 + 2);
    let l1l2 = lines.iter().find(|l| l["member"] == "L1-L2").unwrap();
    let at_l1 = &l1l2["ordinates"][1];
    assert_eq!(at_l1["node"], "L1");
    // M/h by hand: 18·54/72/16 = 0.84375.
    assert!((at_l1["value"].as_f64().unwrap() - 0.84375).abs() < 1e-9);
    let r = lines.iter().find(|l| l["reaction"] == "L0").unwrap();
    // R_L0 at L2 = (72 − 36)/72 (statics).
    assert!((r["ordinates"][2]["ry"].as_f64().unwrap() - 0.5).abs() < 1e-9);

    let (code, out, _) = run(&[
        "influence",
        "models/four_panel_live.ron",
        "--member",
        "U1-L2",
        "--format",
        "csv",
    ]);
    assert_eq!(code, 0);
    assert_eq!(out.lines().count(), 1 + 5);
    assert!(
        out.starts_with("kind,id,node,chainage_ft,value\nmember,U1-L2,L0,0.0,0.0\n"),
        "{out}"
    );

    // Bad input: exit 2 with a message naming the thing.
    let (code, _, err) = run(&["influence", "tests/data/four_panel.ron"]);
    assert_eq!(code, 2);
    assert!(err.contains("deck"), "{err}");
    let (code, _, err) = run(&["influence", "tests/data/four_panel.ron", "--deck", "L0,Q7"]);
    assert_eq!(code, 2);
    assert!(err.contains("\"Q7\""), "{err}");
    let (code, _, err) = run(&[
        "influence",
        "models/four_panel_live.ron",
        "--member",
        "nope",
    ]);
    assert_eq!(code, 2);
    assert!(err.contains("\"nope\""), "{err}");
    let (code, _, err) = run(&["envelope", "tests/data/four_panel.ron"]);
    assert_eq!(code, 2);
    assert!(err.contains("moving loads"), "{err}");
}

#[test]
fn envelope_command_json() {
    let (code, out, err) = run(&["envelope", "models/four_panel_live.ron", "--format", "json"]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let cart = &v["envelopes"][0];
    assert_eq!(cart["moving_load"], "cart");
    let m = cart["members"]
        .as_array()
        .unwrap()
        .iter()
        .find(|m| m["id"] == "L1-L2")
        .unwrap();
    // By hand: 8 kip at 27 ft (ordinate (0.84375 + 0.5625)/2) and 12 kip at
    // 18 ft (0.84375): 15.75 kip; lane 0.2 kip/ft × ½·72·0.84375 = 6.075 kip;
    // with 10 % on the axles only: 1.1·15.75 + 6.075 = 23.4 kip.
    assert!((m["tension"]["force"].as_f64().unwrap() - 23.4).abs() < 1e-9);
    assert!((m["tension"]["position"].as_f64().unwrap() - 27.0).abs() < 1e-9);
    assert_eq!(m["tension"]["direction"], "forward");
    assert_eq!(m["compression"]["position"], serde_json::Value::Null);
}

#[test]
fn indeterminate_lines_match_a_dense_nalgebra_solve() {
    // The four-panel Pratt with a counter L1–U2 added: indeterminate to
    // degree 1, so the lines depend on the stiffnesses. Check against a
    // dense stiffness matrix assembled here and solved by nalgebra's LU.
    let text = pratt(4, 18.0, 16.0, "", &deck_text(4)).replace(
        "members: [",
        "members: [(id: \"L1-U2\", start: \"L1\", end: \"U2\", section: \"web\", material: \"steel\"),",
    );
    let m = model(&text);
    assert_eq!(m.determinacy().degree(), 1);
    let p = Prepared::new(&m).unwrap();
    let deck = Deck::of_model(&m).unwrap();
    let lines = influence_lines(&m, &p, &deck).unwrap();
    let nn = m.nodes.len();
    // Restrained global DOFs: pin at L0 (x, y), roller at L4 (y).
    let l0 = m.nodes.iter().position(|n| n.id == "L0").unwrap();
    let l4 = m.nodes.iter().position(|n| n.id == "L4").unwrap();
    let fixed = [2 * l0, 2 * l0 + 1, 2 * l4 + 1];
    let free: Vec<usize> = (0..2 * nn).filter(|d| !fixed.contains(d)).collect();
    let mut k = nalgebra::DMatrix::<f64>::zeros(2 * nn, 2 * nn);
    for mem in &m.members {
        let (a, b) = (&m.nodes[mem.start], &m.nodes[mem.end]);
        let l = (b.x - a.x).hypot(b.y - a.y);
        let (c, s) = ((b.x - a.x) / l, (b.y - a.y) / l);
        let ea_l = m.materials[mem.material].e * m.sections[mem.section].area / l;
        let dofs = [
            2 * mem.start,
            2 * mem.start + 1,
            2 * mem.end,
            2 * mem.end + 1,
        ];
        let g = [-c, -s, c, s];
        for r in 0..4 {
            for q in 0..4 {
                k[(dofs[r], dofs[q])] += ea_l * g[r] * g[q];
            }
        }
    }
    let kf = k.select_rows(&free).select_columns(&free);
    let lu = kf.lu();
    for (kd, &node) in deck.nodes.iter().enumerate() {
        let mut f = nalgebra::DVector::<f64>::zeros(free.len());
        if let Some(i) = free.iter().position(|&d| d == 2 * node + 1) {
            f[i] = -1.0;
        }
        let uf = lu.solve(&f).unwrap();
        let mut u = vec![0.0; 2 * nn];
        for (i, &d) in free.iter().enumerate() {
            u[d] = uf[i];
        }
        for (j, mem) in m.members.iter().enumerate() {
            let (a, b) = (&m.nodes[mem.start], &m.nodes[mem.end]);
            let l = (b.x - a.x).hypot(b.y - a.y);
            let (c, s) = ((b.x - a.x) / l, (b.y - a.y) / l);
            let ea_l = m.materials[mem.material].e * m.sections[mem.section].area / l;
            let e = c * (u[2 * mem.end] - u[2 * mem.start])
                + s * (u[2 * mem.end + 1] - u[2 * mem.start + 1]);
            let want = ea_l * e;
            let got = lines.member(j)[kd];
            assert!(
                (got - want).abs() < 1e-8,
                "{} at {}: {got} vs {want}",
                mem.id,
                m.nodes[node].id
            );
        }
    }
}
