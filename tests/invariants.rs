//! Invariants of linear statics checked on random stable trusses
//! (triangulated strips: two chords, verticals, one diagonal per panel in
//! a random sense, random top-chord heights, random loads):
//! equilibrium of every joint by the method of joints, superposition,
//! indifference to rigid rotation and translation, to mirroring, to the
//! unit system and to the order of nodes and members in the file.

use panelpoint::analysis::analyse;
use panelpoint::input::load_str;
use panelpoint::model::Model;
use proptest::prelude::*;
use std::collections::HashMap;

#[derive(Clone, Debug)]
struct Strip {
    a: f64,
    heights: Vec<f64>,
    /// Per panel: diagonal from bottom-left to top-right when true.
    rising: Vec<bool>,
    /// (node index, fx, fy) in kN, two cases.
    loads: [Vec<(usize, f64, f64)>; 2],
    /// Area per member, mm².
    areas: Vec<f64>,
}

impl Strip {
    fn panels(&self) -> usize {
        self.rising.len()
    }
    /// Nodes: bottom B0..Bn then top T0..Tn, in metres.
    fn nodes(&self) -> Vec<(String, f64, f64)> {
        let n = self.panels();
        let mut v = Vec::new();
        for i in 0..=n {
            v.push((format!("B{i}"), i as f64 * self.a, 0.0));
        }
        for i in 0..=n {
            v.push((format!("T{i}"), i as f64 * self.a, self.heights[i]));
        }
        v
    }
    fn members(&self) -> Vec<(String, String, String)> {
        let n = self.panels();
        let mut v = Vec::new();
        for i in 0..n {
            v.push((format!("b{i}"), format!("B{i}"), format!("B{}", i + 1)));
            v.push((format!("t{i}"), format!("T{i}"), format!("T{}", i + 1)));
            let (s, e) = if self.rising[i] {
                (format!("B{i}"), format!("T{}", i + 1))
            } else {
                (format!("T{i}"), format!("B{}", i + 1))
            };
            v.push((format!("d{i}"), s, e));
        }
        for i in 0..=n {
            v.push((format!("v{i}"), format!("B{i}"), format!("T{i}")));
        }
        v
    }
}

/// How to write a strip: a rigid motion (rotation θ about the origin, then
/// a shift), a mirror in x, US units, and an order of nodes and members.
#[derive(Clone, Debug, Default)]
struct Writing {
    theta: f64,
    shift: (f64, f64),
    mirror: bool,
    us: bool,
    node_order: Option<Vec<usize>>,
    member_order: Option<Vec<usize>>,
    /// Cases: 0, 1, and 2 = the sum of both when true.
    sum_case: bool,
}

const FT: f64 = 0.3048; // exact, by definition of the international foot
const KIP: f64 = 4_448.221_615_260_5; // 1000 lbf, lbf = 4.4482216152605 N exact
const INCH: f64 = 0.0254; // exact
const KSI: f64 = 6.894_757_293_168_361e6; // 1000 lbf/in²

fn write(s: &Strip, w: &Writing) -> String {
    let (c, sn) = (w.theta.cos(), w.theta.sin());
    let m = if w.mirror { -1.0 } else { 1.0 };
    let place = |x: f64, y: f64| {
        let x = m * x;
        (c * x - sn * y + w.shift.0, sn * x + c * y + w.shift.1)
    };
    let turn = |fx: f64, fy: f64| {
        let fx = m * fx;
        (c * fx - sn * fy, sn * fx + c * fy)
    };
    let (len, force, sec, stress) = if w.us {
        (1.0 / FT, 1000.0 / KIP, 1e-3 / INCH, 1e6 / KSI)
    } else {
        (1.0, 1.0, 1.0, 1.0)
    };
    let units = if w.us {
        r#"(length: "ft", force: "kip", section: "in", stress: "ksi")"#
    } else {
        r#"(length: "m", force: "kN", section: "mm", stress: "MPa")"#
    };
    let nodes = s.nodes();
    let order: Vec<usize> = w.node_order.clone().unwrap_or((0..nodes.len()).collect());
    let mut nt = Vec::new();
    for &i in &order {
        let (id, x, y) = &nodes[i];
        let (x, y) = place(*x, *y);
        nt.push(format!(
            "(id: \"{id}\", x: {:?}, y: {:?})",
            x * len,
            y * len
        ));
    }
    let members = s.members();
    let morder: Vec<usize> = w
        .member_order
        .clone()
        .unwrap_or((0..members.len()).collect());
    let mut mt = Vec::new();
    for &k in &morder {
        let (id, a, b) = &members[k];
        mt.push(format!(
            "(id: \"{id}\", start: \"{a}\", end: \"{b}\", section: \"s{k}\", material: \"steel\")"
        ));
    }
    let sections: Vec<String> = s
        .areas
        .iter()
        .enumerate()
        .map(|(k, a)| {
            let a = a * sec * sec;
            let i = 1e6 * sec.powi(4);
            format!("(id: \"s{k}\", area: {a:?}, i_in: {i:?}, i_out: {i:?})")
        })
        .collect();
    let n = s.panels();
    // The roller rolls along the (rotated) bottom chord.
    let roller = format!("InclinedRoller(angle: \"{:?} rad\")", w.theta);
    let case = |loads: &[(usize, f64, f64)]| {
        loads
            .iter()
            .map(|&(i, fx, fy)| {
                let (fx, fy) = turn(fx, fy);
                format!(
                    "(node: \"{}\", fx: {:?}, fy: {:?})",
                    nodes[i].0,
                    fx * force,
                    fy * force
                )
            })
            .collect::<Vec<_>>()
            .join(", ")
    };
    let mut cases = vec![
        format!("(id: \"c0\", loads: [{}])", case(&s.loads[0])),
        format!("(id: \"c1\", loads: [{}])", case(&s.loads[1])),
    ];
    if w.sum_case {
        let all: Vec<_> = s.loads[0].iter().chain(&s.loads[1]).copied().collect();
        cases.push(format!("(id: \"sum\", loads: [{}])", case(&all)));
    }
    format!(
        "(units: {units},\n materials: [(id: \"steel\", e: {e:?}, fy: {fy:?})],\n sections: [{}],\n nodes: [{}],\n members: [{}],\n supports: [(node: \"B0\", kind: Pin), (node: \"B{n}\", kind: {roller})],\n load_cases: [{}])",
        sections.join(", "),
        nt.join(", "),
        mt.join(", "),
        cases.join(", "),
        e = 200_000.0 * stress,
        fy = 250.0 * stress,
    )
}

/// Member forces by id, N, per case.
fn solve(text: &str) -> (Model, Vec<HashMap<String, f64>>) {
    let c = load_str(text).unwrap_or_else(|d| panic!("{d}\n{text}"));
    let a = analyse(&c.model).unwrap_or_else(|e| panic!("{e}"));
    let forces = a
        .cases
        .iter()
        .map(|case| {
            c.model
                .members
                .iter()
                .zip(&case.forces)
                .map(|(m, f)| (m.id.to_string(), *f))
                .collect()
        })
        .collect();
    (c.model, forces)
}

fn strip() -> impl Strategy<Value = Strip> {
    (2usize..7).prop_flat_map(|n| {
        let nn = 2 * (n + 1);
        let load = (0..nn, -50.0f64..50.0, -80.0f64..20.0);
        (
            2.0f64..6.0,
            prop::collection::vec(1.0f64..4.0, n + 1),
            prop::collection::vec(any::<bool>(), n),
            prop::collection::vec(load.clone(), 1..5),
            prop::collection::vec(load, 1..5),
            prop::collection::vec(500.0f64..20_000.0, 4 * n + 1),
        )
            .prop_map(|(a, heights, rising, l0, l1, areas)| Strip {
                a,
                heights,
                rising,
                loads: [l0, l1],
                areas,
            })
    })
}

fn scale(f: &HashMap<String, f64>) -> f64 {
    f.values().fold(1.0f64, |m, v| m.max(v.abs()))
}

fn same(a: &HashMap<String, f64>, b: &HashMap<String, f64>, rel: f64) {
    let s = scale(a);
    assert_eq!(a.len(), b.len());
    for (id, fa) in a {
        let fb = b[id];
        assert!(
            (fa - fb).abs() <= rel * s,
            "member {id}: {fa} vs {fb} (scale {s})"
        );
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 32, ..ProptestConfig::default() })]

    /// Method of joints: at every free node the member forces and the load
    /// sum to zero (statics, ΣF = 0 at each joint), and the reactions
    /// balance the loads as a whole.
    #[test]
    fn every_joint_is_in_equilibrium(s in strip()) {
        let text = write(&s, &Writing::default());
        let c = load_str(&text).unwrap();
        let a = analyse(&c.model).unwrap();
        let m = &c.model;
        for case in &a.cases {
            let mut net = vec![[0.0f64; 2]; m.nodes.len()];
            for (k, mem) in m.members.iter().enumerate() {
                let (p, q) = (&m.nodes[mem.start], &m.nodes[mem.end]);
                let l = (q.x - p.x).hypot(q.y - p.y);
                let (cx, cy) = ((q.x - p.x) / l, (q.y - p.y) / l);
                let f = case.forces[k];
                net[mem.start][0] += f * cx;
                net[mem.start][1] += f * cy;
                net[mem.end][0] -= f * cx;
                net[mem.end][1] -= f * cy;
            }
            let cid = m.cases.iter().find(|x| x.id == case.id).unwrap();
            let (mut lx, mut ly) = (0.0, 0.0);
            for l in &cid.nodal {
                net[l.node][0] += l.fx;
                net[l.node][1] += l.fy;
                lx += l.fx;
                ly += l.fy;
            }
            for (sup, r) in m.supports.iter().zip(&case.reactions) {
                net[sup.node][0] += r[0];
                net[sup.node][1] += r[1];
            }
            let big = case.forces.iter().fold(lx.hypot(ly), |a, f| a.max(f.abs())).max(1.0);
            for (i, v) in net.iter().enumerate() {
                prop_assert!(v[0].abs() <= 1e-8 * big && v[1].abs() <= 1e-8 * big,
                    "node {} out of balance by {:?}", m.nodes[i].id, v);
            }
            let rx: f64 = case.reactions.iter().map(|r| r[0]).sum();
            let ry: f64 = case.reactions.iter().map(|r| r[1]).sum();
            prop_assert!((rx + lx).abs() <= 1e-8 * big && (ry + ly).abs() <= 1e-8 * big);
        }
    }

    /// Superposition (linearity): the case with both load sets equals the
    /// sum of the two cases.
    #[test]
    fn superposition(s in strip()) {
        let (_, f) = solve(&write(&s, &Writing { sum_case: true, ..Default::default() }));
        let sum: HashMap<String, f64> = f[0].iter().map(|(k, v)| (k.clone(), v + f[1][k])).collect();
        same(&f[2], &sum, 1e-9);
    }

    /// Objectivity: rotating and shifting the whole model (loads and the
    /// roller's surface with it) changes no member force.
    #[test]
    fn rigid_rotation_and_translation(s in strip(), theta in -3.1f64..3.1, dx in -1e3f64..1e3, dy in -1e3f64..1e3) {
        let (_, f0) = solve(&write(&s, &Writing::default()));
        let (_, f1) = solve(&write(&s, &Writing { theta, shift: (dx, dy), ..Default::default() }));
        same(&f0[0], &f1[0], 1e-7);
        same(&f0[1], &f1[1], 1e-7);
    }

    /// Mirror symmetry: reflecting the model and its loads in x gives each
    /// member the same force.
    #[test]
    fn mirror_symmetry(s in strip()) {
        let (_, f0) = solve(&write(&s, &Writing::default()));
        let (_, f1) = solve(&write(&s, &Writing { mirror: true, ..Default::default() }));
        same(&f0[0], &f1[0], 1e-9);
        same(&f0[1], &f1[1], 1e-9);
    }

    /// The same model in SI and in US customary units gives the same
    /// physical forces (conversion factors exact by definition, see consts).
    #[test]
    fn si_and_us_units_agree(s in strip()) {
        let (_, f0) = solve(&write(&s, &Writing::default()));
        let (_, f1) = solve(&write(&s, &Writing { us: true, ..Default::default() }));
        same(&f0[0], &f1[0], 1e-9);
        same(&f0[1], &f1[1], 1e-9);
    }

    /// The order of nodes and members in the file changes nothing.
    #[test]
    fn file_order_is_irrelevant(s in strip(), seed in any::<u64>()) {
        let shuffle = |n: usize, mut x: u64| {
            let mut v: Vec<usize> = (0..n).collect();
            for i in (1..n).rev() {
                x ^= x << 13; x ^= x >> 7; x ^= x << 17;
                v.swap(i, (x % (i as u64 + 1)) as usize);
            }
            v
        };
        let w = Writing {
            node_order: Some(shuffle(s.nodes().len(), seed | 1)),
            member_order: Some(shuffle(s.members().len(), seed.rotate_left(17) | 1)),
            ..Default::default()
        };
        let (_, f0) = solve(&write(&s, &Writing::default()));
        let (_, f1) = solve(&write(&s, &w));
        same(&f0[0], &f1[0], 1e-9);
        same(&f0[1], &f1[1], 1e-9);
    }
}

#[test]
fn a_strip_that_is_a_known_truss() {
    // Guard for the generator: 2 panels of 1 m, heights 1 m, diagonals
    // B0→T1 and T1→B2, 10 kN down at B1. By the method of joints: T0 and T2
    // carry only a chord and a vertical, so t0 = t1 = v0 = v2 = 0; B1 hangs
    // on v1 = +10 kN; at B0 (reaction 5 kN up) the 45° diagonal gives
    // d0 = −5√2 kN and b0 = +5 kN.
    let s = Strip {
        a: 1.0,
        heights: vec![1.0; 3],
        rising: vec![true, false],
        loads: [vec![(1, 0.0, -10.0)], vec![(4, 0.0, -10.0)]],
        areas: vec![1000.0; 9],
    };
    let (_, f) = solve(&write(&s, &Writing::default()));
    let close = |id: &str, want: f64| {
        assert!(
            (f[0][id] - want).abs() < 1e-6,
            "{id}: {} vs {want}",
            f[0][id]
        );
    };
    close("t0", 0.0);
    close("t1", 0.0);
    close("v1", 10_000.0);
    close("d0", -5000.0 * 2f64.sqrt());
    close("b0", 5000.0);
}
