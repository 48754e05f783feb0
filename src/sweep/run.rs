//! Running a sweep fast: variants are taken in chunks of consecutive
//! indices by a pool of rayon workers (each worker takes the next chunk
//! when it finishes one, so work proceeds roughly in index order), and
//! within a chunk
//!
//! * variants that change loads only share the base model's ONE numeric
//!   factorization: their right-hand sides are built into one column-major
//!   block and solved together;
//! * variants that change stiffness or geometry but not connectivity reuse
//!   the base model's symbolic analysis (ordering, elimination tree) and
//!   only refactor numerically;
//! * variants that remove members are analysed from scratch.
//!
//! Finished results go back through a channel; the caller's callback sees
//! them strictly in variant order (a small reorder buffer holds results
//! that finish early), so a report written as rows arrive is always a
//! prefix of the full one.

use super::variant::{apply, Kind};
use super::{Sweep, Variant};
use crate::analysis::assemble::stiffness;
use crate::analysis::dofs::Dofs;
use crate::analysis::results::{AnalysisError, Prepared};
use crate::analysis::solve::Symbolic;
use crate::analysis::CaseResult;
use crate::method::Method;
use crate::model::Model;
use crate::rate::{self, Rating};
use std::collections::BTreeMap;
use std::sync::atomic::{AtomicUsize, Ordering};
use std::sync::mpsc;

/// Variants per unit of work.
pub const CHUNK: usize = 32;

#[derive(Clone, Debug)]
pub struct RunOptions {
    pub method: Method,
    /// Worker threads; None: one per core.
    pub jobs: Option<usize>,
    /// Keep per-member results in each outcome.
    pub detail: bool,
}

/// The worst of one member over every case and combination (SI).
#[derive(Clone, Debug, PartialEq)]
pub struct MemberDetail {
    pub member: String,
    pub utilization: f64,
    pub case: String,
    /// Lowest inventory rating factor over the live cases.
    pub rating_factor: Option<f64>,
}

/// The summary of one analysed variant (SI).
#[derive(Clone, Debug, PartialEq)]
pub struct Outcome {
    pub max_utilization: Option<f64>,
    pub controlling_member: Option<String>,
    pub controlling_case: Option<String>,
    pub lowest_rating_factor: Option<f64>,
    pub rating_member: Option<String>,
    pub rating_case: Option<String>,
    /// Largest node displacement over the load cases, m.
    pub max_deflection: f64,
    pub deflection_node: Option<String>,
    pub deflection_case: Option<String>,
    /// Per member, when asked for.
    pub members: Vec<MemberDetail>,
}

/// One row of the sweep.
#[derive(Clone, Debug, PartialEq)]
pub struct VariantResult {
    /// Index in the whole sweep (0-based; shards keep the global index).
    pub index: usize,
    pub name: String,
    pub parameters: String,
    pub kind: Kind,
    /// The summary, or why the variant could not be analysed.
    pub outcome: Result<Outcome, String>,
}

/// Everything shared by the workers.
struct Base<'a> {
    model: &'a Model,
    symbolic: Option<Symbolic>,
    /// Pattern of the base K, to confirm a variant keeps it.
    pattern: (Vec<usize>, Vec<usize>),
    prepared: Result<Prepared, AnalysisError>,
}

/// Run the variants at `indices` (ascending) of `sweep` on `base`,
/// calling `on_result` for each in index order. Stops at the first error
/// the callback returns.
pub fn run<E: Send>(
    base: &Model,
    sweep: &Sweep,
    indices: &[usize],
    opts: &RunOptions,
    mut on_result: impl FnMut(VariantResult) -> Result<(), E>,
) -> Result<(), E> {
    let dofs = Dofs::new(base);
    let k = stiffness(base, &dofs);
    let symbolic = Symbolic::new(&k).ok();
    let pattern = (k.col_ptr.clone(), k.row_idx.clone());
    let prepared = match &symbolic {
        Some(s) => Prepared::with_symbolic(base, dofs, k, s),
        None => Prepared::new(base),
    };
    let shared = Base {
        model: base,
        symbolic,
        pattern,
        prepared,
    };
    let chunks: Vec<&[usize]> = indices.chunks(CHUNK).collect();
    let next = AtomicUsize::new(0);
    let stop = std::sync::atomic::AtomicBool::new(false);
    let threads = opts
        .jobs
        .unwrap_or_else(|| std::thread::available_parallelism().map_or(1, |n| n.get()))
        .clamp(1, 256)
        .min(chunks.len().max(1));
    let pool = rayon::ThreadPoolBuilder::new()
        .num_threads(threads)
        .build()
        .ok();
    let (tx, rx) = mpsc::channel::<Vec<VariantResult>>();
    let work = |tx: mpsc::Sender<Vec<VariantResult>>| loop {
        if stop.load(Ordering::Relaxed) {
            break;
        }
        let c = next.fetch_add(1, Ordering::Relaxed);
        let Some(chunk) = chunks.get(c) else { break };
        let rows = run_chunk(&shared, sweep, chunk, opts);
        if tx.send(rows).is_err() {
            break;
        }
    };
    std::thread::scope(|scope| {
        let work = &work;
        let producer = {
            let tx = tx.clone();
            let pool = pool.as_ref();
            scope.spawn(move || match pool {
                Some(pool) => pool.scope(|s| {
                    for _ in 0..threads {
                        let tx = tx.clone();
                        s.spawn(move |_| work(tx));
                    }
                }),
                None => work(tx),
            })
        };
        drop(tx);
        let mut pending: BTreeMap<usize, VariantResult> = BTreeMap::new();
        let mut expected = indices.iter().copied();
        let mut want = expected.next();
        let mut result = Ok(());
        for rows in rx {
            for r in rows {
                pending.insert(r.index, r);
            }
            while let Some(w) = want {
                let Some(r) = pending.remove(&w) else { break };
                if result.is_ok() {
                    result = on_result(r);
                    if result.is_err() {
                        stop.store(true, Ordering::Relaxed);
                    }
                }
                want = expected.next();
            }
        }
        let _ = producer.join();
        result
    })
}

/// Analyse one chunk: the loads-only variants in one block solve, the rest one by one.
fn run_chunk(base: &Base, sweep: &Sweep, chunk: &[usize], opts: &RunOptions) -> Vec<VariantResult> {
    let mut out: Vec<VariantResult> = Vec::with_capacity(chunk.len());
    let mut block: Vec<(usize, Model)> = Vec::new();
    for &i in chunk {
        let v = sweep.variant(i);
        let v = &*v;
        let kind = v.kind();
        let model = match apply(base.model, v) {
            Ok(m) => m,
            Err(e) => {
                out.push(row(i, v, kind, Err(e.to_string())));
                continue;
            }
        };
        if model.has_tension_only() {
            // Tension-only members: each variant re-run by the active-set
            // iteration (no shared factorization, no superposition).
            let r = crate::analysis::analyse(&model)
                .map_err(|e| e.to_string())
                .and_then(|a| summarise(&model, &a.cases, &a.prepared, opts));
            out.push(row(i, v, kind, r));
            continue;
        }
        match kind {
            Kind::LoadsOnly => block.push((i, model)),
            Kind::Stiffness => {
                let r = stiffness_variant(base, &model).and_then(|p| {
                    let c = p
                        .solve_cases(&model, &model.cases)
                        .map_err(|e| e.to_string())?;
                    summarise(&model, &c, &p, opts)
                });
                out.push(row(i, v, kind, r));
            }
            Kind::Topology => {
                let r = Prepared::new(&model)
                    .map_err(|e| e.to_string())
                    .and_then(|p| {
                        let c = p
                            .solve_cases(&model, &model.cases)
                            .map_err(|e| e.to_string())?;
                        summarise(&model, &c, &p, opts)
                    });
                out.push(row(i, v, kind, r));
            }
        }
    }
    if !block.is_empty() {
        match &base.prepared {
            Err(e) => {
                for (i, _) in &block {
                    let v = sweep.variant(*i);
                    let v = &*v;
                    out.push(row(*i, v, Kind::LoadsOnly, Err(e.to_string())));
                }
            }
            Ok(p) => {
                for (i, model, r) in solve_block(p, block) {
                    let v = sweep.variant(i);
                    let v = &*v;
                    let r = r.and_then(|c| summarise(&model, &c, p, opts));
                    out.push(row(i, v, Kind::LoadsOnly, r));
                }
            }
        }
    }
    out
}

fn row(i: usize, v: &Variant, kind: Kind, outcome: Result<Outcome, String>) -> VariantResult {
    VariantResult {
        index: i,
        name: v.name.clone(),
        parameters: v.describe(),
        kind,
        outcome,
    }
}

type Solved = (usize, Model, Result<Vec<CaseResult>, String>);

/// Every case of every loads-only variant as one block of right-hand sides
/// on the base factorization.
pub fn solve_block(p: &Prepared, block: Vec<(usize, Model)>) -> Vec<Solved> {
    let n = p.n();
    let total: usize = block.iter().map(|(_, m)| m.cases.len()).sum();
    let mut rhs = vec![0.0; n * total];
    let mut col = 0;
    for (_, m) in &block {
        for case in &m.cases {
            p.load_vector(m, case, &mut rhs[col * n..(col + 1) * n]);
            col += 1;
        }
    }
    p.factor.solve_in_place(&mut rhs, total);
    let mut col = 0;
    block
        .into_iter()
        .map(|(i, m)| {
            let mut results = Vec::with_capacity(m.cases.len());
            let mut err = None;
            for case in &m.cases {
                match p.recover(&m, case, &rhs[col * n..(col + 1) * n]) {
                    Ok(r) => results.push(r),
                    Err(e) => err = err.or(Some(e.to_string())),
                }
                col += 1;
            }
            let r = match err {
                Some(e) => Err(e),
                None => Ok(results),
            };
            (i, m, r)
        })
        .collect()
}

/// A variant of the same connectivity: reuse the base symbolic analysis
/// when the pattern of K is unchanged (a move that zeroes a direction
/// cosine exactly may drop entries; then start afresh).
fn stiffness_variant(base: &Base, model: &Model) -> Result<Prepared, String> {
    let dofs = Dofs::new(model);
    let k = stiffness(model, &dofs);
    let same = base.pattern.0 == k.col_ptr && base.pattern.1 == k.row_idx;
    match (&base.symbolic, same) {
        (Some(s), true) => Prepared::with_symbolic(model, dofs, k, s),
        _ => Prepared::new(model),
    }
    .map_err(|e| e.to_string())
}

/// Rate one solved variant and reduce it to its summary row.
pub fn summarise(
    model: &Model,
    cases: &[CaseResult],
    prepared: &Prepared,
    opts: &RunOptions,
) -> Result<Outcome, String> {
    // Moving loads are rolled on each variant's own stiffness (with
    // tension-only members, position by position inside `rate_results`).
    let envelopes = if model.has_tension_only() {
        Vec::new()
    } else {
        rate::moving_envelopes(model, prepared).map_err(|e| e.to_string())?
    };
    let r = rate::rate_results(model, cases, opts.method.clone(), &envelopes)
        .map_err(|e| e.to_string())?;
    Ok(outcome(model, cases, &r, opts.detail))
}

/// The outcome of a model with tension-only members from its active-set
/// case results, the rating's own error kept typed (a combination or a
/// vehicle position the truss cannot carry is an analysis error).
pub fn summarise_tension_only(
    model: &Model,
    cases: &[CaseResult],
    opts: &RunOptions,
) -> Result<Outcome, rate::RateError> {
    let r = rate::rate_results(model, cases, opts.method.clone(), &[])?;
    Ok(outcome(model, cases, &r, opts.detail))
}

fn outcome(model: &Model, cases: &[CaseResult], r: &Rating, detail: bool) -> Outcome {
    let ctrl = r.controlling.map(|c| &r.checks[c]);
    let low = r.lowest.map(|l| &r.ratings[l]);
    let mut max_def = 0.0f64;
    let mut def_at = None;
    for (ci, c) in cases.iter().enumerate() {
        for (ni, d) in c.displacements.iter().enumerate() {
            let v = d[0].hypot(d[1]);
            if v > max_def {
                max_def = v;
                def_at = Some((ni, ci));
            }
        }
    }
    let mut members = Vec::new();
    if detail {
        for (m, mem) in model.members.iter().enumerate() {
            let worst = r
                .checks
                .iter()
                .filter(|c| c.member == m)
                .max_by(|a, b| a.utilization.total_cmp(&b.utilization));
            let rf = r
                .ratings
                .iter()
                .filter(|x| x.member == m && x.level == r.method.primary_level())
                .filter_map(|x| x.rf)
                .min_by(f64::total_cmp);
            members.push(MemberDetail {
                member: mem.id.to_string(),
                utilization: worst.map_or(0.0, |c| c.utilization),
                case: worst.map_or(String::new(), |c| r.effects[c.effect].id.clone()),
                rating_factor: rf,
            });
        }
    }
    Outcome {
        max_utilization: ctrl.map(|c| c.utilization),
        controlling_member: ctrl.map(|c| model.members[c.member].id.to_string()),
        controlling_case: ctrl.map(|c| r.effects[c.effect].id.clone()),
        lowest_rating_factor: low.and_then(|l| l.rf),
        rating_member: low.map(|l| model.members[l.member].id.to_string()),
        rating_case: low.map(|l| l.live_id.clone()),
        max_deflection: max_def,
        deflection_node: def_at.map(|(n, _)| model.nodes[n].id.clone()),
        deflection_case: def_at.map(|(_, c)| model.cases[c].id.clone()),
        members,
    }
}
