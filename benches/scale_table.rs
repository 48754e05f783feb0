//! One-shot scale table: times every pipeline stage once on generated
//! lattices (10^3 … 10^6 DOF) with `Instant`, runs the release CLI and a
//! bare faer factorization of the same matrix in subprocesses for wall time
//! and peak memory (in turn, 5 or 6 times each, fastest kept), and prints a
//! Markdown table of stage times and ratios.
//! Criterion's repetitions are far too slow at 10^6 DOF, hence harness = false.
//!
//! `cargo bench --bench scale_table -- 1000 10000 100000 1000000`
//! (no sizes: 10^3, 10^4, 10^5). `benches/run_table.sh` runs the full table.
//! Helper modes for profiling: `write DOFS PATH` (the lattice model),
//! `writek DOFS PATH` (its K), `bare PATH` and `ours PATH [MODEL]` (faer's
//! and panelpoint's factorization of a K file in a fresh process),
//! `analyse MODEL` (the CLI's analysis alone; set PANELPOINT_TIMINGS=1),
//! `throughput` (only the sweep, influence and small-model rows).

mod common;

use common::*;
use faer::dyn_stack::{MemBuffer, MemStack};
use faer::linalg::cholesky::llt::factor::LltRegularization;
use faer::sparse::linalg::cholesky::{factorize_symbolic_cholesky, LltRef};
use faer::sparse::{SparseColMatRef, SymbolicSparseColMatRef};
use faer::{Conj, MatMut, Par, Side};
use panelpoint::analysis::assemble::Csc;
use panelpoint::analysis::results::{Analysis, Prepared};
use panelpoint::analysis::solve::{self, Symbolic};
use panelpoint::generate::{generate, lattice, Family, GenerateOptions, UnitSystem};
use panelpoint::input::{self, ron_writer::layout_to_ron};
use panelpoint::model::{LoadCase, NodalLoad};
use std::io::{Read, Write};
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::Instant;

fn secs<T>(f: impl FnOnce() -> T) -> (T, f64) {
    let t = Instant::now();
    let v = f();
    (v, t.elapsed().as_secs_f64())
}

/// Peak resident memory of this process so far, bytes (VmHWM).
fn peak_rss() -> Option<u64> {
    let s = std::fs::read_to_string("/proc/self/status").ok()?;
    let line = s.lines().find(|l| l.starts_with("VmHWM:"))?;
    let kb: u64 = line.split_whitespace().nth(1)?.parse().ok()?;
    Some(kb * 1024)
}

// ---------------------------------------------------------------- bare faer

fn write_csc(path: &Path, k: &Csc) {
    let mut f = std::io::BufWriter::new(std::fs::File::create(path).unwrap());
    let w = |f: &mut dyn Write, v: u64| f.write_all(&v.to_le_bytes()).unwrap();
    w(&mut f, k.n as u64);
    w(&mut f, k.row_idx.len() as u64);
    for &p in &k.col_ptr {
        w(&mut f, p as u64);
    }
    for &r in &k.row_idx {
        w(&mut f, r as u64);
    }
    for &v in &k.values {
        f.write_all(&v.to_le_bytes()).unwrap();
    }
    // Flushed to disk now, so write-back does not run during the timings.
    f.into_inner().unwrap().sync_all().unwrap();
}

fn read_csc(path: &Path) -> Csc {
    let mut bytes = Vec::new();
    std::fs::File::open(path)
        .unwrap()
        .read_to_end(&mut bytes)
        .unwrap();
    let word = |i: usize| u64::from_le_bytes(bytes[8 * i..8 * i + 8].try_into().unwrap());
    let (n, nnz) = (word(0) as usize, word(1) as usize);
    let col_ptr = (0..=n).map(|i| word(2 + i) as usize).collect();
    let row_idx = (0..nnz).map(|i| word(3 + n + i) as usize).collect();
    let values = (0..nnz)
        .map(|i| f64::from_bits(word(3 + n + nnz + i)))
        .collect();
    Csc {
        n,
        col_ptr,
        row_idx,
        values,
    }
}

/// The bare factorization: faer's symbolic + numeric LLᵀ and one solve of
/// the matrix in `path`, no checks, no model. Prints the three times.
/// `tuned` calls faer the way panelpoint does (factor pages touched on all
/// cores first, numeric step and solve run inside the rayon pool), so the
/// table can show the gain of those two changes apart from the rest.
fn bare(path: &Path, tuned: bool) {
    let k = read_csc(path);
    let n = k.n;
    let par = Par::rayon(0);
    let pattern = SymbolicSparseColMatRef::new_checked(n, n, &k.col_ptr, None, &k.row_idx);
    let (sym, t_sym) = secs(|| {
        factorize_symbolic_cholesky(pattern, Side::Upper, Default::default(), Default::default())
            .unwrap()
    });
    let pool = |f: &mut (dyn FnMut() + Send)| {
        if tuned {
            solve::in_pool(par, f)
        } else {
            f()
        }
    };
    let (values, t_num) = secs(|| {
        let mut values = vec![0.0; sym.len_val()];
        let req = sym.factorize_numeric_llt_scratch::<f64>(par, Default::default());
        let mut buf = MemBuffer::new(req);
        if tuned {
            solve::touch_in_parallel(&mut values, 0.0);
            solve::touch_in_parallel(&mut buf, std::mem::MaybeUninit::new(0u8));
        }
        pool(&mut || {
            sym.factorize_numeric_llt(
                &mut values,
                SparseColMatRef::new(pattern, &k.values),
                Side::Upper,
                LltRegularization::default(),
                par,
                MemStack::new(&mut buf),
                Default::default(),
            )
            .unwrap();
        });
        values
    });
    let mut rhs = vec![1.0; n];
    let ((), t_solve) = secs(|| {
        let mut buf = MemBuffer::new(sym.solve_in_place_scratch::<f64>(1, par));
        pool(&mut || {
            LltRef::new(&sym, &values).solve_in_place_with_conj(
                Conj::No,
                MatMut::from_column_major_slice_mut(&mut rhs, n, 1),
                par,
                MemStack::new(&mut buf),
            )
        });
    });
    assert!(rhs.iter().all(|v| v.is_finite()));
    println!("{t_sym} {t_num} {t_solve} {}", values.len());
}

/// Touch and free `bytes` of memory just before a timed child at 10⁶ DOF.
///
/// On this project's virtual machines the guest hands freed memory back to
/// the host (virtio-balloon free page reporting, 2 MB blocks, after about
/// 2 s), and the first touch of such a page costs about 3 × a touch of one
/// still backed: touching the 1.7 GB factor took 0.34 s in a process
/// started right after another had freed its memory but 1.0 s otherwise.
/// Run in turn, each child would inherit what the one before it freed, and
/// the CLI (which needs more pages than the bare run before it freed) would
/// pay for the order. Every child, CLI and bare alike, starts after this.
fn warm_memory(bytes: usize) {
    let v = vec![1u8; bytes];
    std::hint::black_box(&v);
}

/// Wall seconds (timed here) and peak RSS bytes (from `/usr/bin/time`) of a child.
fn timed_child(args: &[&str], stdout: Stdio) -> (f64, u64, String) {
    let t = Instant::now();
    let out = Command::new("/usr/bin/time")
        .args(["-f", "@@ %e %M"])
        .args(args)
        .stdout(stdout)
        .stderr(Stdio::piped())
        .output()
        .expect("run /usr/bin/time");
    let wall = t.elapsed().as_secs_f64();
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(out.status.success(), "{args:?} failed: {err}");
    let line = err.lines().rev().find(|l| l.starts_with("@@")).unwrap();
    let mut it = line.split_whitespace().skip(1);
    let _coarse_wall = it.next();
    let kb: u64 = it.next().unwrap().parse().unwrap();
    (wall, kb * 1024, String::from_utf8_lossy(&out.stdout).into())
}

/// Best (least) of `runs` wall times of the CLI, from inside: less noise
/// than `/usr/bin/time`'s 10 ms resolution for small models.
fn cli_mean(bin: &str, model: &Path, runs: usize) -> f64 {
    let t = Instant::now();
    for _ in 0..runs {
        let st = Command::new(bin)
            .args(["solve", model.to_str().unwrap(), "--format", "json"])
            .stdout(Stdio::null())
            .status()
            .unwrap();
        assert!(st.success());
    }
    t.elapsed().as_secs_f64() / runs as f64
}

// ------------------------------------------------------------------- sizes

struct Row {
    dofs: usize,
    members: usize,
    file_mb: f64,
    stages: Vec<(&'static str, f64)>,
    in_process: f64,
    in_process_rss: u64,
    cli_wall: f64,
    cli_rss: u64,
    bare_sym: f64,
    bare_num: f64,
    bare_solve: f64,
    bare_wall: f64,
    bare_rss: u64,
    /// Fastest symbolic + numeric + solve of the tuned bare run.
    tuned: f64,
    l_nnz: usize,
}

fn measure(target: usize, dir: &Path, bin: &str, me: &str) -> Row {
    let text = lattice_text(target);
    let model_path = dir.join(format!("lattice_{target}.ron"));
    std::fs::write(&model_path, &text).unwrap();
    std::fs::File::open(&model_path)
        .unwrap()
        .sync_all()
        .unwrap();
    let mut stages = Vec::new();
    let (file, t) = secs(|| input::parse_str(&text).unwrap());
    stages.push(("load (RON parse)", t));
    let (c, t) = secs(|| input::convert::convert(file, &text).unwrap());
    stages.push(("validate + convert", t));
    let model = &c.model;
    let (dofs, t) = secs(|| panelpoint::analysis::dofs::Dofs::new(model));
    stages.push(("DOF numbering", t));
    let (k, t) = secs(|| panelpoint::analysis::assemble::stiffness(model, &dofs));
    stages.push(("assembly", t));
    let (symbolic, t) = secs(|| Symbolic::new(&k).unwrap());
    stages.push(("symbolic factorization", t));
    write_csc(&dir.join(format!("k_{target}.bin")), &k);
    let (prepared, t) = secs(|| Prepared::with_symbolic(model, dofs, k, &symbolic).unwrap());
    stages.push(("numeric factorization", t));
    let n = prepared.n();
    let (q, t) = secs(|| {
        let mut q = vec![0.0; n];
        prepared.load_vector(model, &model.cases[0], &mut q);
        prepared.factor.solve_in_place(&mut q, 1);
        q
    });
    stages.push(("solve", t));
    let (case, t) = secs(|| prepared.recover(model, &model.cases[0], &q).unwrap());
    stages.push(("member forces + equilibrium", t));
    let (least, t) = secs(|| capacities(model));
    assert!(least.is_finite());
    stages.push(("capacity checks", t));
    let members = model.members.len();
    let analysis = Analysis {
        prepared,
        cases: vec![case],
        warnings: Vec::new(),
    };
    let (bytes, t) = secs(|| json_to_sink(model, &analysis, &c));
    assert!(bytes > members * 20);
    stages.push(("JSON output", t));
    let in_process = stages.iter().map(|s| s.1).sum();
    let in_process_rss = peak_rss().unwrap_or(0);
    let dofs_n = n;
    drop(analysis);
    drop(c);
    drop(text);

    // The CLI and the bare factorization run in turn, a few times each, and
    // the fastest run of each is kept: the machine is shared, and one stall
    // during one run must not decide the ratio.
    let kpath = dir.join(format!("k_{target}.bin"));
    let repeats = if target > 500_000 { 6 } else { 5 };
    let (mut cli_wall, mut cli_rss) = (f64::INFINITY, 0);
    let (mut bare_wall, mut bare_rss) = (f64::INFINITY, 0);
    let mut v: Vec<f64> = vec![f64::INFINITY; 4];
    let mut tuned = f64::INFINITY;
    let warm = |big: bool| {
        if big {
            warm_memory(3 << 30)
        }
    };
    let big = target > 500_000;
    for _ in 0..repeats {
        warm(big);
        let (wall, rss, _) = timed_child(
            &[
                bin,
                "solve",
                model_path.to_str().unwrap(),
                "--format",
                "json",
            ],
            Stdio::null(),
        );
        cli_wall = cli_wall.min(wall);
        cli_rss = cli_rss.max(rss);
        warm(big);
        let (wall, rss, out) = timed_child(&[me, "bare", kpath.to_str().unwrap()], Stdio::piped());
        let run: Vec<f64> = out.split_whitespace().map(|s| s.parse().unwrap()).collect();
        if run[0] + run[1] + run[2] < v[0] + v[1] + v[2] {
            v = run;
        }
        bare_wall = bare_wall.min(wall);
        bare_rss = bare_rss.max(rss);
        warm(big);
        let (_, _, out) = timed_child(&[me, "bare-tuned", kpath.to_str().unwrap()], Stdio::piped());
        let run: Vec<f64> = out.split_whitespace().map(|s| s.parse().unwrap()).collect();
        tuned = tuned.min(run[0] + run[1] + run[2]);
    }
    std::fs::remove_file(&kpath).ok();
    let file_mb = std::fs::metadata(&model_path).unwrap().len() as f64 / 1e6;
    std::fs::remove_file(&model_path).ok();
    Row {
        dofs: dofs_n,
        members,
        file_mb,
        stages,
        in_process,
        in_process_rss,
        cli_wall,
        cli_rss,
        bare_sym: v[0],
        bare_num: v[1],
        bare_solve: v[2],
        bare_wall,
        bare_rss,
        tuned,
        l_nnz: v[3] as usize,
    }
}

// -------------------------------------------------------------- throughput

/// ~200-member lattice truss with `count` load variants: a moving pair of
/// loads along the top chord with varying magnitudes.
fn sweep(count: usize) -> (f64, f64, f64, usize, usize) {
    let layout = lattice(22, 2, 4.0, UnitSystem::Si);
    let c = input::load_str(&layout_to_ron(&layout)).unwrap();
    let model = &c.model;
    let prepared = Prepared::new(model).unwrap();
    let top: Vec<usize> = (0..model.nodes.len())
        .filter(|&i| model.nodes[i].y > 7.0)
        .collect();
    let cases: Vec<LoadCase> = (0..count)
        .map(|v| LoadCase {
            id: format!("v{v}"),
            nodal: vec![
                NodalLoad {
                    node: top[v % top.len()],
                    fx: 0.0,
                    fy: -1e3 * (1 + v % 7) as f64,
                },
                NodalLoad {
                    node: top[(v / 3) % top.len()],
                    fx: 50.0 * (v % 5) as f64,
                    fy: -2e3,
                },
            ],
            ..Default::default()
        })
        .collect();
    // Best of a few repetitions of each, interleaved, so one stall of the
    // shared machine does not decide a ratio.
    const REPEATS: usize = 7;
    let mut t_sweep = f64::INFINITY;
    let mut t_single = f64::INFINITY;
    let mut t_block = f64::INFINITY;
    let n = prepared.n();
    // A pause before each timing lets the thread pool's idle workers stop
    // spinning, so one measurement does not slow the next.
    let settle = || std::thread::sleep(std::time::Duration::from_millis(30));
    for _ in 0..REPEATS {
        settle();
        let (results, t) = secs(|| prepared.solve_cases(model, &cases).unwrap());
        assert_eq!(results.len(), count);
        t_sweep = t_sweep.min(t);
        let mut rhs = vec![0.0; n];
        for (i, v) in rhs.iter_mut().enumerate() {
            *v = 1.0 + (i % 3) as f64;
        }
        settle();
        let ((), t) = secs(|| {
            for _ in 0..count {
                prepared.factor.solve_in_place(&mut rhs, 1);
            }
        });
        t_single = t_single.min(t);
        let mut block = vec![1.0; n * count];
        settle();
        let ((), t) = secs(|| prepared.factor.solve_in_place(&mut block, count));
        t_block = t_block.min(t);
    }
    (t_sweep, t_single, t_block, model.members.len(), n)
}

/// Influence lines of every member of a 100-panel Pratt deck: one unit
/// load per bottom-chord node, all solved as one block.
fn influence() -> (f64, usize, usize) {
    let layout = generate(&GenerateOptions {
        family: Family::Pratt,
        panels: 100,
        panel_width: 5.0,
        height: 6.0,
        panel_load: Some(10.0),
        units: UnitSystem::Si,
        top_heights: None,
    })
    .unwrap();
    let c = input::load_str(&layout_to_ron(&layout)).unwrap();
    let model = &c.model;
    let deck: Vec<usize> = (0..model.nodes.len())
        .filter(|&i| model.nodes[i].y.abs() < 1e-9)
        .collect();
    let ((), t) = secs(|| {
        let prepared = Prepared::new(model).unwrap();
        let cases: Vec<LoadCase> = deck
            .iter()
            .map(|&node| LoadCase {
                id: model.nodes[node].id.clone(),
                nodal: vec![NodalLoad {
                    node,
                    fx: 0.0,
                    fy: -1.0,
                }],
                ..Default::default()
            })
            .collect();
        let r = prepared.solve_cases(model, &cases).unwrap();
        assert_eq!(r.len(), deck.len());
    });
    (t, model.members.len(), deck.len())
}

fn ms(t: f64) -> String {
    if t >= 10.0 {
        format!("{t:.1} s")
    } else if t >= 0.1 {
        format!("{:.0} ms", t * 1e3)
    } else if t >= 1e-3 {
        format!("{:.2} ms", t * 1e3)
    } else {
        format!("{:.0} µs", t * 1e6)
    }
}

fn mb(b: u64) -> String {
    format!("{:.0} MB", b as f64 / 1e6)
}

fn main() {
    let args: Vec<String> = std::env::args()
        .skip(1)
        .filter(|a| !a.starts_with("--"))
        .collect();
    if args.first().map(String::as_str) == Some("bare") {
        bare(Path::new(&args[1]), false);
        return;
    }
    if args.first().map(String::as_str) == Some("bare-tuned") {
        bare(Path::new(&args[1]), true);
        return;
    }
    // `write DOFS PATH`: only write the lattice model, for profiling the CLI.
    if args.first().map(String::as_str) == Some("write") {
        let dofs: usize = args[1].parse().expect("a DOF count");
        std::fs::write(&args[2], lattice_text(dofs)).unwrap();
        return;
    }
    // `analyse MODEL`: the CLI's analysis alone (PANELPOINT_TIMINGS=1).
    if args.first().map(String::as_str) == Some("analyse") {
        let text = std::fs::read_to_string(&args[1]).unwrap();
        let c = load(&text);
        drop(text);
        let a = panelpoint::analysis::analyse(&c.model).unwrap();
        println!("{} cases", a.cases.len());
        return;
    }
    // `twice MODEL`: load, assemble, then factor the assembled K and a
    // fresh copy of it (and the K file, if given) in turn, for comparison.
    if args.first().map(String::as_str) == Some("twice") {
        let text = std::fs::read_to_string(&args[1]).unwrap();
        let c = load(&text);
        drop(text);
        let d = panelpoint::analysis::dofs::Dofs::new(&c.model);
        let k = panelpoint::analysis::assemble::stiffness(&c.model, &d);
        let s = Symbolic::new(&k).unwrap();
        let copy = Csc {
            n: k.n,
            col_ptr: k.col_ptr.clone(),
            row_idx: k.row_idx.clone(),
            values: k.values.clone(),
        };
        let file = args.get(2).map(|p| read_csc(Path::new(p)));
        for _ in 0..2 {
            let (_f, t) = secs(|| s.factor(&k).unwrap());
            println!("assembled K: numeric {t:.3} s");
            let (_f, t) = secs(|| s.factor(&copy).unwrap());
            println!("copied K:    numeric {t:.3} s");
            if let Some(f) = &file {
                let (_f, t) = secs(|| s.factor(f).unwrap());
                println!("file K:      numeric {t:.3} s");
            }
        }
        return;
    }
    // `ours PATH [MODEL]`: panelpoint's own factor of the K file, in a
    // fresh process, optionally after loading (and dropping) a model.
    if args.first().map(String::as_str) == Some("ours") {
        let k = read_csc(Path::new(&args[1]));
        if let Some(model) = args.get(2) {
            let text = std::fs::read_to_string(model).unwrap();
            let (c, t) = secs(|| load(&text));
            println!("loaded in {t:.3} s");
            let keep = std::env::var_os("KEEP").is_some();
            if keep {
                std::mem::forget(c);
            } else {
                drop(c);
            }
        }
        let (s, t_sym) = secs(|| Symbolic::new(&k).unwrap());
        let (_f, t_num) = secs(|| s.factor(&k).unwrap());
        println!("ours: symbolic {t_sym:.3} s, numeric {t_num:.3} s");
        return;
    }
    // `writek DOFS PATH`: only write the assembled K, for the bare mode.
    if args.first().map(String::as_str) == Some("writek") {
        let dofs: usize = args[1].parse().expect("a DOF count");
        let c = load(&lattice_text(dofs));
        let d = panelpoint::analysis::dofs::Dofs::new(&c.model);
        write_csc(
            Path::new(&args[2]),
            &panelpoint::analysis::assemble::stiffness(&c.model, &d),
        );
        return;
    }
    // `throughput`: only the sweep, influence and small-model rows.
    let sizes: Vec<usize> = if args.first().map(String::as_str) == Some("throughput") {
        Vec::new()
    } else if args.is_empty() {
        vec![1_000, 10_000, 100_000]
    } else {
        args.iter()
            .map(|a| a.parse().expect("a DOF count"))
            .collect()
    };
    let bin = env!("CARGO_BIN_EXE_panelpoint");
    let me = std::env::current_exe().unwrap();
    let me = me.to_str().unwrap();
    let dir: PathBuf = std::env::temp_dir().join(format!("pp-scale-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();

    let rows: Vec<Row> = sizes
        .iter()
        .map(|&s| {
            eprintln!("measuring ~{s} DOF ...");
            measure(s, &dir, bin, me)
        })
        .collect();

    // Stage table.
    if !rows.is_empty() {
        print!("| stage |");
        for r in &rows {
            print!(" {} DOF |", r.dofs);
        }
        println!();
        print!("|---|");
        for _ in &rows {
            print!("---:|");
        }
        println!();
        for (i, (name, _)) in rows[0].stages.iter().enumerate() {
            print!("| {name} |");
            for r in &rows {
                print!(" {} |", ms(r.stages[i].1));
            }
            println!();
        }
        let line = |name: &str, f: &dyn Fn(&Row) -> String| {
            print!("| {name} |");
            for r in &rows {
                print!(" {} |", f(r));
            }
            println!();
        };
        line("members", &|r| r.members.to_string());
        line("model file", &|r| format!("{:.1} MB", r.file_mb));
        line("nnz(L)", &|r| r.l_nnz.to_string());
        line("**sum of stages (in process)**", &|r| ms(r.in_process));
        line(
            "in-process peak RSS (cumulative)",
            &|r| mb(r.in_process_rss),
        );
        line(
            "**CLI `solve --format json > /dev/null`, wall (fastest of 5–6)**",
            &|r| ms(r.cli_wall),
        );
        line("CLI peak RSS", &|r| mb(r.cli_rss));
        line("bare faer symbolic", &|r| ms(r.bare_sym));
        line("bare faer numeric", &|r| ms(r.bare_num));
        line("bare faer solve", &|r| ms(r.bare_solve));
        line("**bare faer factor + solve (fastest of 5–6)**", &|r| {
            ms(r.bare_sym + r.bare_num + r.bare_solve)
        });
        line("bare process wall (incl. reading K)", &|r| ms(r.bare_wall));
        line("bare peak RSS", &|r| mb(r.bare_rss));
        line("**ratio CLI wall / bare factor+solve**", &|r| {
            format!(
                "{:.2}",
                r.cli_wall / (r.bare_sym + r.bare_num + r.bare_solve)
            )
        });
        line(
            "bare faer factor + solve, called as panelpoint calls it (fastest)",
            &|r| ms(r.tuned),
        );
        line("ratio CLI wall / that tuned bare factor+solve", &|r| {
            format!("{:.2}", r.cli_wall / r.tuned)
        });
        line("ratio CLI wall / bare process wall", &|r| {
            format!("{:.2}", r.cli_wall / r.bare_wall)
        });
        line("**ratio CLI peak RSS / bare peak RSS**", &|r| {
            format!("{:.2}", r.cli_rss as f64 / r.bare_rss as f64)
        });
        if rows.len() > 1 {
            println!();
            println!("Growth between sizes (time ratio, larger / smaller):");
            println!();
            println!("| from → to | DOF × | CLI wall × | bare factor+solve × |");
            println!("|---|---:|---:|---:|");
            for w in rows.windows(2) {
                let (a, b) = (&w[0], &w[1]);
                let bare = |r: &Row| r.bare_sym + r.bare_num + r.bare_solve;
                println!(
                    "| {} → {} | {:.1} | {:.1} | {:.1} |",
                    a.dofs,
                    b.dofs,
                    b.dofs as f64 / a.dofs as f64,
                    b.cli_wall / a.cli_wall,
                    bare(b) / bare(a)
                );
            }
        }
    }

    // Throughput.
    let variants = 10_000;
    let (t_sweep, t_single, t_block, members, n) = sweep(variants);
    let (t_infl, infl_members, deck) = influence();
    let small = dir.join("small.ron");
    let layout = lattice(22, 2, 4.0, UnitSystem::Si);
    std::fs::write(&small, layout_to_ron(&layout)).unwrap();
    let runs = 50;
    let t_cli = cli_mean(bin, &small, runs);
    println!();
    println!("| throughput | time | ratio |");
    println!("|---|---:|---:|");
    println!(
        "| {variants} load variants, {members}-member truss ({n} DOF): loads + block solve + forces + equilibrium | {} | {:.2} × single solves, {:.2} × block solve |",
        ms(t_sweep),
        t_sweep / t_single,
        t_sweep / t_block
    );
    println!(
        "| {variants} bare single-RHS triangular solves, same factor | {} | 1 |",
        ms(t_single)
    );
    println!(
        "| one {variants}-column block triangular solve, same factor | {} | |",
        ms(t_block)
    );
    println!(
        "| influence lines of all {infl_members} members, 100-panel Pratt deck, {deck} unit loads (prepare + block solve + forces) | {} | |",
        ms(t_infl)
    );
    println!(
        "| {}-member model, release CLI start-to-exit, mean of {runs} runs | {} | |",
        layout.members.len(),
        ms(t_cli)
    );
    std::fs::remove_dir_all(&dir).ok();
    let _ = std::io::stdout().lock().flush();
}
