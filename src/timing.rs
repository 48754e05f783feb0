//! Stage timings on request: with `PANELPOINT_TIMINGS=1` in the environment
//! each named stage of a run prints its wall time to standard error, so an
//! engineer (or a benchmark) can see where a large model's time goes
//! without a profiler. Off by default; when off a stage costs one load of a
//! cached flag.

use std::sync::OnceLock;
use std::time::Instant;

fn enabled() -> bool {
    static ON: OnceLock<bool> = OnceLock::new();
    *ON.get_or_init(|| std::env::var_os("PANELPOINT_TIMINGS").is_some_and(|v| v != "0"))
}

/// Run `f`, printing `panelpoint: time: NAME 12.345 ms` when timings are on.
pub fn stage<T>(name: &str, f: impl FnOnce() -> T) -> T {
    if !enabled() {
        return f();
    }
    let t = Instant::now();
    let v = f();
    eprintln!(
        "panelpoint: time: {name} {:.3} ms",
        t.elapsed().as_secs_f64() * 1e3
    );
    v
}

/// Consecutive sub-stages of one stage: each [`Lap::mark`] prints the time
/// since the previous mark, as `panelpoint: time: PREFIX: NAME 1.234 ms`.
pub struct Lap {
    prefix: &'static str,
    last: Option<Instant>,
}

impl Lap {
    pub fn new(prefix: &'static str) -> Lap {
        Lap {
            prefix,
            last: enabled().then(Instant::now),
        }
    }

    pub fn mark(&mut self, name: &str) {
        if let Some(t) = self.last {
            eprintln!(
                "panelpoint: time: {}: {name} {:.3} ms",
                self.prefix,
                t.elapsed().as_secs_f64() * 1e3
            );
            self.last = Some(Instant::now());
        }
    }
}
