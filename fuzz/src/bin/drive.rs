//! A mutation fuzzer that runs on the stable toolchain, for machines where
//! libFuzzer (nightly) is not available. It is NOT coverage-guided: it
//! keeps an input when the pipeline's outcome signature (which check fired,
//! or how far the model got) is new, a coarse stand-in for coverage.
//!
//! Two kinds of mutation, chosen at random per input: byte-level edits
//! (flips, dictionary splices, chunk copies) and a structure-aware mode
//! that keeps the text a well-formed model and edits it in place: a number
//! replaced by another (sign, scale, extreme, a number from elsewhere in
//! the input), a quoted id or quantity swapped for another quoted string of
//! the input or a unit-bearing value, a whole line duplicated or removed.
//! Inputs may carry a vehicles and a sweep file after marker lines (see
//! `tests/regressions/pipeline.rs`), so both are mutated with the model.
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

/// Byte ranges (start, end) of tokens.
type Spans = Vec<(usize, usize)>;

/// Byte ranges of the number tokens and of the quoted strings (quotes
/// included) of `v`; comments are not skipped (a number in a comment is
/// harmless to edit).
fn tokens(v: &[u8]) -> (Spans, Spans) {
    let (mut nums, mut strs) = (Vec::new(), Vec::new());
    let mut i = 0;
    while i < v.len() {
        let b = v[i];
        if b == b'"' {
            let s = i;
            i += 1;
            while i < v.len() && v[i] != b'"' && v[i] != b'\n' {
                i += if v[i] == b'\\' { 2 } else { 1 };
            }
            if i < v.len() && v[i] == b'"' {
                strs.push((s, i + 1));
            }
            i += 1;
        } else if b.is_ascii_digit() && (i == 0 || !v[i - 1].is_ascii_alphanumeric()) {
            let mut s = i;
            if s > 0 && v[s - 1] == b'-' {
                s -= 1;
            }
            while i < v.len() && (v[i].is_ascii_digit() || b".eE".contains(&v[i])) {
                if (v[i] == b'e' || v[i] == b'E') && i + 1 < v.len() && v[i + 1] == b'-' {
                    i += 1;
                }
                i += 1;
            }
            nums.push((s, i));
        } else {
            i += 1;
        }
    }
    (nums, strs)
}

/// Another number for the one in `old`.
fn new_number(rng: &mut Rng, old: &str, v: &[u8], nums: &[(usize, usize)]) -> String {
    let x: f64 = old.parse().unwrap_or(1.0);
    match rng.below(12) {
        0 => format!("{}", -x),
        1 => format!("{:?}", x * 10.0),
        2 => format!("{:?}", x / 10.0),
        3 => format!("{:?}", x * 1e6),
        4 => format!("{:?}", x * 1e-6),
        5 => "0.0".into(),
        6 => [
            "1e-9",
            "1e9",
            "1e300",
            "-1e300",
            "5e-324",
            "1.7976931348623157e308",
        ][rng.below(6)]
        .into(),
        7 => format!("{}", rng.below(20)),
        8 => format!("{:?}", x + 1.0),
        9 => format!("{:?}", x * (1.0 + 1e-9)),
        _ => {
            let (s, e) = nums[rng.below(nums.len())];
            String::from_utf8_lossy(&v[s..e]).into_owned()
        }
    }
}

/// Quoted strings that are not in most inputs: quantities with units,
/// library models, odd ids.
const QUOTED: &[&str] = &[
    "\"3 ft\"",
    "\"0 ft\"",
    "\"-2 ft\"",
    "\"1e9 kip\"",
    "\"0 kip\"",
    "\"0.5 kip/ft\"",
    "\"30 ksi\"",
    "\"0 ksi\"",
    "\"2 m\"",
    "\"10 kN\"",
    "\"HL-93\"",
    "\"E80\"",
    "\"LM71\"",
    "\"vehicles.ron\"",
    "\"../vehicles.ron\"",
    "\"/dev/zero\"",
    "\"\"",
    "\"L0\"",
    "\"U1\"",
];

/// One in-place edit that keeps the text's structure.
fn mutate_structured(rng: &mut Rng, v: &mut Vec<u8>) {
    let (nums, strs) = tokens(v);
    match rng.below(8) {
        0..=3 if !nums.is_empty() => {
            let (s, e) = nums[rng.below(nums.len())];
            let old = String::from_utf8_lossy(&v[s..e]).into_owned();
            let new = new_number(rng, &old, v, &nums);
            v.splice(s..e, new.into_bytes());
        }
        4 | 5 if !strs.is_empty() => {
            let (s, e) = strs[rng.below(strs.len())];
            let new = if rng.below(3) == 0 {
                QUOTED[rng.below(QUOTED.len())].as_bytes().to_vec()
            } else {
                let (a, b) = strs[rng.below(strs.len())];
                v[a..b].to_vec()
            };
            v.splice(s..e, new);
        }
        _ => {
            // Duplicate or remove a whole line (a row of a list).
            let starts: Vec<usize> = std::iter::once(0)
                .chain(
                    v.iter()
                        .enumerate()
                        .filter(|(_, &b)| b == b'\n')
                        .map(|(i, _)| i + 1),
                )
                .filter(|&i| i < v.len())
                .collect();
            if starts.is_empty() {
                return;
            }
            let s = starts[rng.below(starts.len())];
            let e = v[s..]
                .iter()
                .position(|&b| b == b'\n')
                .map_or(v.len(), |p| s + p + 1);
            if rng.below(2) == 0 {
                let line = v[s..e].to_vec();
                v.splice(s..s, line);
            } else {
                v.drain(s..e);
            }
        }
    }
}

fn mutate(rng: &mut Rng, input: &[u8], corpus: &[Vec<u8>]) -> Vec<u8> {
    let mut v = input.to_vec();
    if rng.below(3) != 0 {
        for _ in 0..1 + rng.below(3) {
            mutate_structured(rng, &mut v);
        }
        v.truncate(1 << 16);
        return v;
    }
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
    // Corpus entries that reached a full solve: three bases in four are
    // taken from these, so the later stages are exercised.
    let mut deep: Vec<usize> = Vec::new();
    for (i, c) in corpus.iter().enumerate() {
        if let Ok(sig) = panic::catch_unwind(|| panelpoint_fuzz::fuzz_one(c)) {
            if sig.starts_with("solved") {
                deep.push(i);
            }
            seen.insert(sig);
        }
    }
    let mut rng = Rng(seed | 1);
    let start = Instant::now();
    let limit = Duration::from_secs(seconds);
    let (mut execs, mut crashes, mut last_report) = (0u64, 0u64, Instant::now());
    let mut crash_sigs: HashSet<String> = HashSet::new();
    while start.elapsed() < limit {
        let pick = if !deep.is_empty() && rng.below(4) != 0 {
            deep[rng.below(deep.len())]
        } else {
            rng.below(corpus.len())
        };
        let base = corpus[pick].clone();
        let input = mutate(&mut rng, &base, &corpus);
        execs += 1;
        match panic::catch_unwind(|| panelpoint_fuzz::fuzz_one(&input)) {
            Ok(sig) => {
                // Outcome classes: how far the input got, and which of
                // the later stages it reached.
                let stage = sig.split(':').next().unwrap_or("");
                let class = if stage == "solved" {
                    let later: Vec<&str> = [
                        "rated",
                        "rate:",
                        "stability ",
                        "stability:",
                        "fatigue",
                        "sweep ",
                    ]
                    .into_iter()
                    .filter(|k| sig.contains(k))
                    .collect();
                    format!("solved+{}", later.join("+"))
                } else {
                    stage.to_string()
                };
                *counts.entry(class).or_default() += 1;
                if sig.starts_with("solved") && !seen.contains(&sig) {
                    deep.push(corpus.len());
                }
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
        "done: {:.0} s, {execs} execs, corpus {} ({} solved), {crashes} crashing inputs ({} distinct messages), outcomes {counts:?}",
        start.elapsed().as_secs_f64(),
        corpus.len(),
        deep.len(),
        crash_sigs.len()
    );
}
