//! Criterion benchmarks of each pipeline stage on generated lattices
//! (about 10^3, 10^4 and 10^5 DOF), and of throughput on one factorization:
//! a 10,000-variant load sweep against bare triangular solves, and the
//! influence lines of a 100-panel deck. 10^6 DOF is timed once by
//! `benches/scale_table.rs`, where repetitions would take too long.

mod common;

use common::*;
use criterion::{criterion_group, criterion_main, BatchSize, Criterion};
use panelpoint::analysis::results::{Analysis, Prepared};
use panelpoint::analysis::solve::Symbolic;
use panelpoint::generate::{generate, lattice, Family, GenerateOptions, UnitSystem};
use panelpoint::input::{self, ron_writer::layout_to_ron};
use panelpoint::model::{LoadCase, NodalLoad};
use std::hint::black_box;
use std::time::Duration;

fn stages(c: &mut Criterion) {
    for dofs in [1_000usize, 10_000, 100_000] {
        let mut g = c.benchmark_group(format!("stages_{dofs}"));
        g.sample_size(10)
            .warm_up_time(Duration::from_millis(300))
            .measurement_time(Duration::from_secs(if dofs >= 100_000 { 8 } else { 2 }));
        let text = lattice_text(dofs);
        g.bench_function("load_parse", |b| {
            b.iter(|| input::parse_str(&text).unwrap())
        });
        g.bench_function("validate_convert", |b| {
            b.iter_batched(
                || input::parse_str(&text).unwrap(),
                |f| input::convert::convert(f, &text).unwrap(),
                BatchSize::LargeInput,
            )
        });
        let conv = load(&text);
        let model = &conv.model;
        g.bench_function("dof_numbering", |b| {
            b.iter(|| panelpoint::analysis::dofs::Dofs::new(model))
        });
        let (dofs_, k) = assemble(model);
        g.bench_function("assembly", |b| {
            b.iter(|| panelpoint::analysis::assemble::stiffness(model, &dofs_))
        });
        g.bench_function("assembly_sprs_triplets", |b| {
            b.iter(|| panelpoint::analysis::assemble::stiffness_triplets(model, &dofs_))
        });
        g.bench_function("symbolic_factorization", |b| {
            b.iter(|| Symbolic::new(&k).unwrap())
        });
        let symbolic = Symbolic::new(&k).unwrap();
        g.bench_function("numeric_factorization", |b| {
            b.iter(|| symbolic.factor(&k).unwrap())
        });
        let prepared = Prepared::with_symbolic(model, dofs_.clone(), k.clone(), &symbolic).unwrap();
        let n = prepared.n();
        let mut f = vec![0.0; n];
        prepared.load_vector(model, &model.cases[0], &mut f);
        g.bench_function("solve", |b| {
            b.iter(|| {
                let mut q = f.clone();
                prepared.factor.solve_in_place(&mut q, 1);
                q
            })
        });
        let mut q = f.clone();
        prepared.factor.solve_in_place(&mut q, 1);
        g.bench_function("member_forces", |b| {
            b.iter(|| prepared.recover(model, &model.cases[0], &q).unwrap())
        });
        g.bench_function("capacity_checks", |b| b.iter(|| capacities(model)));
        let case = prepared.recover(model, &model.cases[0], &q).unwrap();
        let analysis = Analysis {
            prepared,
            cases: vec![case],
            warnings: vec![],
        };
        g.bench_function("json_output", |b| {
            b.iter(|| json_to_sink(model, &analysis, &conv))
        });
        g.finish();
    }
}

fn throughput(c: &mut Criterion) {
    let mut g = c.benchmark_group("throughput");
    g.sample_size(10)
        .warm_up_time(Duration::from_millis(300))
        .measurement_time(Duration::from_secs(3));
    // ~200-member truss, 10,000 load variants on one factorization.
    let conv = input::load_str(&layout_to_ron(&lattice(22, 2, 4.0, UnitSystem::Si))).unwrap();
    let model = &conv.model;
    let prepared = Prepared::new(model).unwrap();
    let top: Vec<usize> = (0..model.nodes.len())
        .filter(|&i| model.nodes[i].y > 7.0)
        .collect();
    let cases: Vec<LoadCase> = (0..10_000)
        .map(|v| LoadCase {
            id: format!("v{v}"),
            nodal: vec![NodalLoad {
                node: top[v % top.len()],
                fx: 0.0,
                fy: -1e3 * (1 + v % 7) as f64,
            }],
            ..Default::default()
        })
        .collect();
    g.bench_function("sweep_10000_variants", |b| {
        b.iter(|| prepared.solve_cases(model, &cases).unwrap())
    });
    let n = prepared.n();
    g.bench_function("bare_10000_triangular_solves", |b| {
        let mut rhs = vec![1.0; n];
        b.iter(|| {
            for _ in 0..10_000 {
                prepared.factor.solve_in_place(black_box(&mut rhs), 1);
            }
        })
    });
    // Influence lines: every member of a 100-panel Pratt deck, one unit
    // load per bottom-chord node, one block solve.
    let deck = input::load_str(&layout_to_ron(
        &generate(&GenerateOptions {
            family: Family::Pratt,
            panels: 100,
            panel_width: 5.0,
            height: 6.0,
            panel_load: Some(10.0),
            units: UnitSystem::Si,
            top_heights: None,
        })
        .unwrap(),
    ))
    .unwrap();
    let dm = &deck.model;
    let unit: Vec<LoadCase> = (0..dm.nodes.len())
        .filter(|&i| dm.nodes[i].y.abs() < 1e-9)
        .map(|node| LoadCase {
            id: dm.nodes[node].id.clone(),
            nodal: vec![NodalLoad {
                node,
                fx: 0.0,
                fy: -1.0,
            }],
            ..Default::default()
        })
        .collect();
    g.bench_function("influence_lines_100_panel_deck", |b| {
        b.iter(|| {
            let p = Prepared::new(dm).unwrap();
            p.solve_cases(dm, &unit).unwrap()
        })
    });
    g.finish();
}

criterion_group!(benches, stages, throughput);
criterion_main!(benches);
