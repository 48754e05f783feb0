//! Scale test: the 10^6-DOF benchmark lattice solved end to end, checked for
//! equilibrium. Ignored by default (minutes in a debug build); run with
//! `cargo test --release --test scale -- --ignored` (benches/run_table.sh does).

use panelpoint::analysis::analyse;
use panelpoint::generate::{lattice, UnitSystem};
use panelpoint::input::{load_str, ron_writer::layout_to_ron};

fn check(side: usize) {
    let text = layout_to_ron(&lattice(side, side, 4.0, UnitSystem::Si));
    let c = load_str(&text).expect("the generated lattice loads");
    let model = &c.model;
    // One warning line per crossing would be a million lines: the loader
    // shows a few and a count (every panel has crossing diagonals).
    assert!(c.warnings.len() <= 6, "{} warnings", c.warnings.len());
    let a = analyse(model).expect("the lattice is stable");
    let case = &a.cases[0];
    // Statics by hand: the reactions carry the whole applied load, 45 kN at
    // each of the side + 1 top nodes (the generator's load), straight down.
    let total = 45e3 * (side + 1) as f64;
    assert!((case.load_sum[1] + total).abs() < 1e-6 * total);
    assert!(
        (case.reaction_sum[1] - total).abs() < 1e-6 * total,
        "{:?}",
        case.reaction_sum
    );
    assert!(case.reaction_sum[0].abs() < 1e-6 * total);
    assert!(case.relative_residual < 1e-8, "{}", case.relative_residual);
    // Independent residual: K·q − f with the assembled matrix itself.
    let p = &a.prepared;
    let n = p.n();
    let mut q = vec![0.0; n];
    for (d, qd) in q.iter_mut().enumerate() {
        let node = p.dofs.node[d] as usize;
        let dir = p.dofs.direction[d];
        let u = case.displacements[node];
        *qd = u[0] * dir[0] + u[1] * dir[1];
    }
    let mut f = vec![0.0; n];
    p.load_vector(model, &model.cases[0], &mut f);
    let mut kq = vec![0.0; n];
    p.k.sym_mul(&q, &mut kq);
    let worst = kq
        .iter()
        .zip(&f)
        .map(|(a, b)| (a - b).abs())
        .fold(0.0, f64::max);
    assert!(worst < 1e-9 * total, "max |Kq - f| = {worst} N");
}

#[test]
fn lattice_small_equilibrium() {
    // The same checks at 10^3 DOF, so the test itself runs in every suite.
    check(21);
}

#[test]
fn lattice_parallel_factor_equilibrium() {
    // About 29,000 DOF: above the size where the factorization runs on all
    // cores (its pages touched first, inside the thread pool), so that path
    // is checked in every suite too.
    check(120);
}

#[test]
#[ignore = "10^6 DOF: run with --release --ignored (benches/run_table.sh)"]
fn lattice_million_dof_equilibrium() {
    check(706);
}
