//! Stage timings on request: with `PANELPOINT_TIMINGS=1` in the environment
//! each named stage of a run prints its wall time to standard error, so an
//! engineer (or a benchmark) can see where a large model's time goes
//! without a profiler. Off by default; when off a stage costs one load of a
//! cached flag.

use std::io::Write;
use std::sync::OnceLock;
use std::time::Instant;

fn enabled() -> bool {
    static ON: OnceLock<bool> = OnceLock::new();
    *ON.get_or_init(|| std::env::var_os("PANELPOINT_TIMINGS").is_some_and(|v| v != "0"))
}

/// The process's CPU seconds in user and system mode and its minor page
/// faults so far, all threads together (getrusage(2), RUSAGE_SELF).
fn usage() -> (f64, f64, i64) {
    // SAFETY: getrusage only writes the struct it is given.
    let mut u: libc::rusage = unsafe { std::mem::zeroed() };
    if unsafe { libc::getrusage(libc::RUSAGE_SELF, &mut u) } != 0 {
        return (0.0, 0.0, 0);
    }
    let secs = |t: libc::timeval| t.tv_sec as f64 + t.tv_usec as f64 * 1e-6;
    (secs(u.ru_utime), secs(u.ru_stime), u.ru_minflt)
}

/// Run `f`, printing `panelpoint: time: NAME 12.345 ms` when timings are on,
/// followed by the CPU time all threads spent in it (user and system) and
/// its minor page faults: on a shared machine wall time varies with the
/// neighbours, CPU time and faults much less.
pub fn stage<T>(name: &str, f: impl FnOnce() -> T) -> T {
    if !enabled() {
        return f();
    }
    let (u0, s0, f0) = usage();
    let t = Instant::now();
    let v = f();
    let wall = t.elapsed().as_secs_f64() * 1e3;
    let (u1, s1, f1) = usage();
    let _ = writeln!(
        std::io::stderr(),
        "panelpoint: time: {name} {wall:.3} ms (cpu user {:.0} ms, sys {:.0} ms; {} minor faults)",
        (u1 - u0) * 1e3,
        (s1 - s0) * 1e3,
        f1 - f0
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
            let _ = writeln!(
                std::io::stderr(),
                "panelpoint: time: {}: {name} {:.3} ms",
                self.prefix,
                t.elapsed().as_secs_f64() * 1e3
            );
            self.last = Some(Instant::now());
        }
    }
}
