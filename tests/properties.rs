//! Property tests: random stable trusses satisfy equilibrium, and rotating
//! a whole model (supports included) leaves every member force unchanged.
#![allow(clippy::needless_range_loop)]

mod common;
use common::*;
use proptest::prelude::*;

/// A random panel strip: bottom and top chords with jittered panel points,
/// verticals and one diagonal per panel — triangulated, so stable and
/// statically determinate with a pin and a roller (m + r = 2j).
fn strip(
    panels: usize,
    jitter: &[(f64, f64)],
    diag_up: &[bool],
    loads: &[(f64, f64)],
    angle: f64,
) -> String {
    let rot = |x: f64, y: f64| {
        let (s, c) = angle.sin_cos();
        (c * x - s * y, s * x + c * y)
    };
    let mut nodes = Vec::new();
    for i in 0..=panels {
        let (jx, jy) = jitter[i];
        let (x, y) = rot(10.0 * i as f64 + jx, jy);
        nodes.push((format!("B{i}"), x, y));
        let (jx2, jy2) = jitter[i + panels + 1];
        let (x, y) = rot(10.0 * i as f64 + jx2, 8.0 + jy2);
        nodes.push((format!("T{i}"), x, y));
    }
    let mut members = Vec::new();
    for i in 0..panels {
        members.push((format!("b{i}"), format!("B{i}"), format!("B{}", i + 1)));
        members.push((format!("t{i}"), format!("T{i}"), format!("T{}", i + 1)));
        let (a, b) = if diag_up[i] {
            (format!("B{i}"), format!("T{}", i + 1))
        } else {
            (format!("T{i}"), format!("B{}", i + 1))
        };
        members.push((format!("d{i}"), a, b));
    }
    for i in 0..=panels {
        members.push((format!("v{i}"), format!("B{i}"), format!("T{i}")));
    }
    let roller = if angle == 0.0 {
        "Roller".to_string()
    } else {
        format!("InclinedRoller(angle: \"{} rad\")", angle)
    };
    let mut load_list = Vec::new();
    for (i, &(fx, fy)) in loads.iter().enumerate() {
        let (px, py) = rot(fx, fy);
        load_list.push((format!("T{}", i % (panels + 1)), px, py));
    }
    let n: Vec<(&str, f64, f64)> = nodes.iter().map(|(a, x, y)| (a.as_str(), *x, *y)).collect();
    let m: Vec<(&str, &str, &str)> = members
        .iter()
        .map(|(a, b, c)| (a.as_str(), b.as_str(), c.as_str()))
        .collect();
    let last = format!("B{panels}");
    let l: Vec<(&str, f64, f64)> = load_list
        .iter()
        .map(|(a, x, y)| (a.as_str(), *x, *y))
        .collect();
    model_text(
        &n,
        &m,
        &[("B0", "Pin"), (last.as_str(), roller.as_str())],
        &l,
    )
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(48))]

    #[test]
    fn equilibrium_and_rotation(
        panels in 2usize..7,
        jitter in prop::collection::vec((-2.0f64..2.0, -1.5f64..1.5), 16),
        diag_up in prop::collection::vec(any::<bool>(), 7),
        loads in prop::collection::vec((-20.0f64..20.0, -50.0f64..0.0), 1..6),
        angle in -3.0f64..3.0,
    ) {
        let base = strip(panels, &jitter, &diag_up, &loads, 0.0);
        let (m, a) = solve(&base);
        let c = &a.cases[0];
        // Equilibrium: residual tiny, reactions cancel the loads (statics).
        prop_assert!(c.relative_residual < 1e-9);
        prop_assert!((c.load_sum[0] + c.reaction_sum[0]).abs() < 1e-8 * KIP * 100.0);
        prop_assert!((c.load_sum[1] + c.reaction_sum[1]).abs() < 1e-8 * KIP * 100.0);
        prop_assert_eq!(m.determinacy().degree(), 0);
        // Moment equilibrium about the origin: Σ r × (P + R) = 0.
        let mut moment = 0.0;
        for l in &m.cases[0].nodal {
            let n = &m.nodes[l.node];
            moment += n.x * l.fy - n.y * l.fx;
        }
        for (s, r) in m.supports.iter().zip(&c.reactions) {
            let n = &m.nodes[s.node];
            moment += n.x * r[1] - n.y * r[0];
        }
        prop_assert!(moment.abs() < 1e-7 * KIP * 100.0 * 100.0, "moment {}", moment);
        // The same truss rotated as a whole: same member forces.
        let turned = strip(panels, &jitter, &diag_up, &loads, angle);
        let (_, b) = solve(&turned);
        let scale = c.forces.iter().fold(1.0f64, |s, f| s.max(f.abs()));
        for (fa, fb) in c.forces.iter().zip(&b.cases[0].forces) {
            prop_assert!((fa - fb).abs() < 1e-7 * scale, "{} vs {}", fa, fb);
        }
    }
}
