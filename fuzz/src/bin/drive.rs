//! A mutation fuzzer that runs on the stable toolchain, for machines where
//! libFuzzer (nightly) is not available. It is NOT coverage-guided: it
//! keeps an input when the pipeline's outcome signature (which check fired,
//! or how far the model got) is new, a coarse stand-in for coverage.
//!
//! Usage: `drive <corpus-dir> <artifact-dir> <seconds> [seed]`. Every input
//! that panics is written to the artifact dir as `crash-<hash>.ron`.

use std::collections::{HashMap, HashSet};
use std::hash::{DefaultHasher, Hash, Hasher};
use std::panic;
use std::path::Path;
use std::time::{Duration, Instant};

/// Fragments of the model language to splice in.
const DICT: &[&str] = &[
    "(",
    ")",
    "[",
    "]",
    ",",
    ":",
    "\"",
    "id: \"A\"",
    "x: ",
    "y: ",
    "node: \"L0\"",
    "start: \"L0\"",
    "end: \"L1\"",
    "section: \"chord\"",
    "material: \"steel\"",
    "kind: Pin",
    "kind: Roller",
    "kind: InclinedRoller(angle: 30.0)",
    "angle: \"1 rad\"",
    "NaN",
    "inf",
    "-inf",
    "1e300",
    "-1e300",
    "1e-300",
    "0.0",
    "-0.0",
    "1e-12",
    "0",
    "\"18 ft\"",
    "\"1e308 kip\"",
    "\"3 furlong\"",
    "\"5 ksi\"",
    "\"2 m\"",
    "\"nan m\"",
    "Some(",
    "None",
    "true",
    "\"\"",
    "\"\\n\"",
    "\"\\u{1F600}\"",
    "r#\"raw\"#",
    "//",
    "/*",
    "*/",
    "fx: ",
    "fy: ",
    "dx: ",
    "dy: ",
    "settlements: [",
    "loads: [",
    "(node: \"L2\", fy: -9.0)",
    "(id: \"X\", x: 1.0, y: 1e-12)",
    "net_area: ",
    "area: ",
    "i_in: ",
    "i_out: ",
    "e: ",
    "fu: ",
    "density: ",
    "alpha: ",
    "units: (length: \"m\", force: \"N\", section: \"mm\", stress: \"MPa\"),",
    "18446744073709551616",
    "-9223372036854775809",
    "0x10",
    "1_000",
    "1.",
    ".5",
];

struct Rng(u64);

impl Rng {
    fn next(&mut self) -> u64 {
        // xorshift64*
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        self.0.wrapping_mul(0x2545_F491_4F6C_DD1D)
    }
    fn below(&mut self, n: usize) -> usize {
        if n == 0 {
            0
        } else {
            (self.next() % n as u64) as usize
        }
    }
}

fn mutate(rng: &mut Rng, input: &[u8], corpus: &[Vec<u8>]) -> Vec<u8> {
    let mut v = input.to_vec();
    for _ in 0..1 + rng.below(4) {
        let at = rng.below(v.len() + 1);
        match rng.below(9) {
            0 if !v.is_empty() => {
                let i = rng.below(v.len());
                v[i] ^= 1 << rng.below(8);
            }
            1 if !v.is_empty() => {
                let i = rng.below(v.len());
                v[i] = rng.next() as u8;
            }
            2 if !v.is_empty() => {
                let len = 1 + rng.below(16.min(v.len() - at.min(v.len())).max(1));
                let end = (at + len).min(v.len());
                v.drain(at.min(end)..end);
            }
            3 | 4 => {
                let word = DICT[rng.below(DICT.len())].as_bytes();
                v.splice(at..at, word.iter().copied());
            }
            5 if !v.is_empty() => {
                // Duplicate a chunk (repeated rows, deeper nesting).
                let start = rng.below(v.len());
                let end = (start + 1 + rng.below(64)).min(v.len());
                let chunk = v[start..end].to_vec();
                for _ in 0..1 + rng.below(3) {
                    v.splice(at..at, chunk.iter().copied());
                }
            }
            6 if !corpus.is_empty() => {
                // Splice with another corpus entry.
                let other = &corpus[rng.below(corpus.len())];
                let s = rng.below(other.len() + 1);
                let e = (s + rng.below(256)).min(other.len());
                v.splice(at..at, other[s..e].iter().copied());
            }
            7 => {
                // Replace a number-looking run with an extreme one.
                let word = ["1e300", "NaN", "-0.0", "1e-12", "inf", "0"][rng.below(6)];
                if let Some(pos) = v[at.min(v.len())..].iter().position(|b| b.is_ascii_digit()) {
                    let s = at + pos;
                    let mut e = s;
                    while e < v.len() && (v[e].is_ascii_digit() || v[e] == b'.') {
                        e += 1;
                    }
                    v.splice(s..e, word.bytes());
                }
            }
            _ => {
                let b = [b'"', b'(', b')', b',', b'\n', 0xff, 0xc3, b'\\'][rng.below(8)];
                v.insert(at, b);
            }
        }
    }
    v.truncate(1 << 16);
    v
}

fn hash(bytes: &[u8]) -> u64 {
    let mut h = DefaultHasher::new();
    bytes.hash(&mut h);
    h.finish()
}

fn main() {
    let args: Vec<String> = std::env::args().collect();
    if args.len() < 4 {
        eprintln!("usage: drive <corpus-dir> <artifact-dir> <seconds> [seed]");
        std::process::exit(2);
    }
    let corpus_dir = Path::new(&args[1]);
    let artifacts = Path::new(&args[2]);
    let seconds: u64 = args[3].parse().expect("seconds");
    let seed: u64 = args.get(4).map_or(0x5eed, |s| s.parse().expect("seed"));
    std::fs::create_dir_all(corpus_dir).unwrap();
    std::fs::create_dir_all(artifacts).unwrap();
    let mut corpus: Vec<Vec<u8>> = Vec::new();
    let mut entries: Vec<_> = std::fs::read_dir(corpus_dir)
        .unwrap()
        .filter_map(|e| e.ok().map(|e| e.path()))
        .collect();
    entries.sort();
    for p in entries {
        if let Ok(b) = std::fs::read(&p) {
            corpus.push(b);
        }
    }
    if corpus.is_empty() {
        corpus.push(b"()".to_vec());
    }
    panic::set_hook(Box::new(|_| {}));
    let mut seen: HashSet<String> = HashSet::new();
    let mut counts: HashMap<String, u64> = HashMap::new();
    for c in &corpus {
        if let Ok(sig) = panic::catch_unwind(|| panelpoint_fuzz::fuzz_one(c)) {
            seen.insert(sig);
        }
    }
    let mut rng = Rng(seed | 1);
    let start = Instant::now();
    let limit = Duration::from_secs(seconds);
    let (mut execs, mut crashes, mut last_report) = (0u64, 0u64, Instant::now());
    let mut crash_sigs: HashSet<String> = HashSet::new();
    while start.elapsed() < limit {
        let base = corpus[rng.below(corpus.len())].clone();
        let input = mutate(&mut rng, &base, &corpus);
        execs += 1;
        match panic::catch_unwind(|| panelpoint_fuzz::fuzz_one(&input)) {
            Ok(sig) => {
                *counts
                    .entry(sig.split(':').next().unwrap_or("").to_string())
                    .or_default() += 1;
                if seen.insert(sig) {
                    let name = corpus_dir.join(format!("{:016x}.ron", hash(&input)));
                    std::fs::write(name, &input).unwrap();
                    corpus.push(input);
                }
            }
            Err(payload) => {
                let msg = payload
                    .downcast_ref::<String>()
                    .cloned()
                    .or_else(|| payload.downcast_ref::<&str>().map(|s| s.to_string()))
                    .unwrap_or_default();
                crashes += 1;
                let name = artifacts.join(format!("crash-{:016x}.ron", hash(&input)));
                std::fs::write(&name, &input).unwrap();
                if crash_sigs.insert(msg.clone()) {
                    eprintln!("CRASH {}: {msg}", name.display());
                }
            }
        }
        if last_report.elapsed() > Duration::from_secs(30) {
            last_report = Instant::now();
            eprintln!(
                "{:>6.0}s {execs} execs, corpus {}, {crashes} crashes, outcomes {counts:?}",
                start.elapsed().as_secs_f64(),
                corpus.len()
            );
        }
    }
    println!(
        "done: {:.0} s, {execs} execs, corpus {}, {crashes} crashing inputs ({} distinct messages), outcomes {counts:?}",
        start.elapsed().as_secs_f64(),
        corpus.len(),
        crash_sigs.len()
    );
}
