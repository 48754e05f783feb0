//! JSON output, streamed straight to the writer so that a million-DOF
//! result is never held in memory twice. Field names carry no units; the
//! `units` object at the top says what every number is in.

use super::{Scale, CAUTION};
use crate::analysis::Analysis;
use crate::input::Diagnostic;
use crate::model::Model;
use std::fmt::{self, Write as _};
use std::io::{self, Write};

/// A finite number in its shortest round-trip form; `null` otherwise.
pub fn num(v: f64) -> String {
    Num(v).to_string()
}

/// A JSON number written straight to the output, as [`num`] without the
/// allocation: the shortest text that reads back to the same f64, with no
/// trailing ".0"; `null` if not finite. Streams a million-row report.
pub struct Num(pub f64);

impl fmt::Display for Num {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if !self.0.is_finite() {
            return f.write_str("null");
        }
        let mut buf = Stack::default();
        write!(buf, "{:?}", self.0)?;
        let s = buf.as_str();
        f.write_str(s.strip_suffix(".0").unwrap_or(s))
    }
}

/// A small text buffer on the stack for one number.
#[derive(Default)]
struct Stack {
    bytes: [u8; 32],
    len: usize,
}

impl Stack {
    fn as_str(&self) -> &str {
        // Only whole `&str`s are ever appended.
        std::str::from_utf8(&self.bytes[..self.len]).unwrap_or("null")
    }
}

impl fmt::Write for Stack {
    fn write_str(&mut self, s: &str) -> fmt::Result {
        let end = self.len + s.len();
        if end > self.bytes.len() {
            return Err(fmt::Error);
        }
        self.bytes[self.len..end].copy_from_slice(s.as_bytes());
        self.len = end;
        Ok(())
    }
}

/// A JSON string literal.
pub fn string(s: &str) -> String {
    Str(s).to_string()
}

/// A JSON string literal written straight to the output, as [`string`].
pub struct Str<'a>(pub &'a str);

impl fmt::Display for Str<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_char('"')?;
        let s = self.0;
        let plain = |c: char| !(c == '"' || c == '\\' || (c as u32) < 0x20);
        if s.chars().all(plain) {
            f.write_str(s)?;
        } else {
            for c in s.chars() {
                match c {
                    '"' => f.write_str("\\\"")?,
                    '\\' => f.write_str("\\\\")?,
                    '\n' => f.write_str("\\n")?,
                    '\r' => f.write_str("\\r")?,
                    '\t' => f.write_str("\\t")?,
                    c if (c as u32) < 0x20 => write!(f, "\\u{:04x}", c as u32)?,
                    c => f.write_char(c)?,
                }
            }
        }
        f.write_char('"')
    }
}

/// The opening fields every command shares: title, units, caution, warnings.
pub fn write_header(
    w: &mut dyn Write,
    model: &Model,
    warnings: &[Diagnostic],
    extra_warnings: &[String],
) -> io::Result<()> {
    let s = Scale::of(model);
    write!(
        w,
        "{{\"title\":{},\"units\":{{\"length\":{},\"section\":{},\"force\":{},\"stress\":{}}},\"caution\":{}",
        string(&model.title),
        string(s.length_name),
        string(s.disp_name),
        string(s.force_name),
        string(s.stress_name),
        string(CAUTION)
    )?;
    write!(w, ",\"warnings\":[")?;
    let all = warnings
        .iter()
        .map(|d| d.to_string())
        .chain(extra_warnings.iter().cloned());
    for (i, text) in all.enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        w.write_all(string(&text).as_bytes())?;
    }
    w.write_all(b"]")
}

/// The `determinacy` and `cases` fields of a solved model (no braces).
pub fn write_cases(w: &mut dyn Write, model: &Model, analysis: &Analysis) -> io::Result<()> {
    // A buffer of a concrete type: the million small writes of a large
    // model are then plain copies, not calls through `dyn Write`.
    let w = &mut io::BufWriter::with_capacity(1 << 16, w);
    let s = Scale::of(model);
    let d = model.determinacy();
    write!(
        w,
        ",\"determinacy\":{{\"members\":{},\"reactions\":{},\"joints\":{},\"degree\":{}}}",
        d.members,
        d.reactions,
        d.joints,
        d.degree()
    )?;
    write!(
        w,
        ",\"smallest_pivot_ratio\":{}",
        Num(analysis.prepared.factor.min_pivot_ratio)
    )?;
    w.write_all(b",\"cases\":[")?;
    for (c, case) in analysis.cases.iter().enumerate() {
        if c > 0 {
            w.write_all(b",")?;
        }
        write!(w, "{{\"id\":{},\"displacements\":[", Str(&case.id))?;
        rows(w, model.nodes.len(), |i, b| {
            let u = case.displacements[i];
            write!(
                b,
                "{{\"node\":{},\"ux\":{},\"uy\":{}}}",
                Str(&model.nodes[i].id),
                Num(u[0] / s.disp),
                Num(u[1] / s.disp)
            )
        })?;
        w.write_all(b"],\"reactions\":[")?;
        for (i, (sup, r)) in model.supports.iter().zip(&case.reactions).enumerate() {
            if i > 0 {
                w.write_all(b",")?;
            }
            write!(
                w,
                "{{\"node\":{},\"rx\":{},\"ry\":{}}}",
                Str(&model.nodes[sup.node].id),
                Num(r[0] / s.force),
                Num(r[1] / s.force)
            )?;
        }
        w.write_all(b"],\"members\":[")?;
        rows(w, model.members.len(), |i, b| {
            let (mem, f) = (&model.members[i], case.forces[i]);
            let area = model.sections[mem.section].area;
            write!(
                b,
                "{{\"id\":{},\"force\":{},\"stress\":{}}}",
                Str(&mem.id),
                Num(f / s.force),
                Num(f / area / s.stress)
            )
        })?;
        write!(
            w,
            "],\"equilibrium\":{{\"max_residual\":{},\"relative_residual\":{},\"load_sum\":{{\"fx\":{},\"fy\":{}}},\"reaction_sum\":{{\"rx\":{},\"ry\":{}}}}}}}",
            Num(case.residual / s.force),
            Num(case.relative_residual),
            Num(case.load_sum[0] / s.force),
            Num(case.load_sum[1] / s.force),
            Num(case.reaction_sum[0] / s.force),
            Num(case.reaction_sum[1] / s.force)
        )?;
    }
    w.write_all(b"]")?;
    w.flush()
}

/// Rows formatted per batch.
const ROWS_PER_BATCH: usize = 8192;
/// Batches formatted at once, on all cores, before they are written in
/// order: the output streams in windows of this many batches.
const BATCHES_PER_WINDOW: usize = 16;

/// Write `count` comma-separated rows, `row(i, buffer)` formatting row `i`.
/// Large tables are formatted in batches on all cores and written in
/// order, a window at a time, so the output is the same as a plain loop's
/// and is never held whole in memory.
fn rows(
    w: &mut impl Write,
    count: usize,
    row: impl Fn(usize, &mut Vec<u8>) -> io::Result<()> + Sync,
) -> io::Result<()> {
    use rayon::prelude::*;
    let batch = |range: std::ops::Range<usize>| -> io::Result<Vec<u8>> {
        let mut b = Vec::with_capacity(range.len() * 64);
        for i in range {
            if i > 0 {
                b.push(b',');
            }
            row(i, &mut b)?;
        }
        Ok(b)
    };
    if count <= ROWS_PER_BATCH {
        return w.write_all(&batch(0..count)?);
    }
    let window = ROWS_PER_BATCH * BATCHES_PER_WINDOW;
    for start in (0..count).step_by(window) {
        let end = (start + window).min(count);
        let parts: Vec<io::Result<Vec<u8>>> = (start..end)
            .step_by(ROWS_PER_BATCH)
            .collect::<Vec<_>>()
            .into_par_iter()
            .map(|a| batch(a..(a + ROWS_PER_BATCH).min(end)))
            .collect();
        for p in parts {
            w.write_all(&p?)?;
        }
    }
    Ok(())
}

/// `panelpoint solve --format json`.
pub fn solve(
    w: &mut dyn Write,
    model: &Model,
    analysis: &Analysis,
    warnings: &[Diagnostic],
) -> io::Result<()> {
    write_header(w, model, warnings, &analysis.warnings)?;
    write_cases(w, model, analysis)?;
    w.write_all(b"}\n")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_and_strings() {
        assert_eq!(num(15.0), "15");
        assert_eq!(num(0.1), "0.1");
        assert_eq!(num(f64::NAN), "null");
        assert_eq!(num(-1e-7), "-1e-7");
        assert_eq!(string("a\"b\\c\n"), "\"a\\\"b\\\\c\\n\"");
        assert_eq!(string("plain id"), "\"plain id\"");
        assert_eq!(string("tab\there\u{1}"), "\"tab\\there\\u0001\"");
    }

    #[test]
    fn batched_rows_are_the_plain_loop_in_order() {
        // Reference: the rows joined by commas in a plain loop, for counts
        // below one batch, across batches and across windows.
        let window = ROWS_PER_BATCH * BATCHES_PER_WINDOW;
        for count in [0, 1, 7, ROWS_PER_BATCH + 1, 2 * window + 3] {
            let mut out = Vec::new();
            rows(&mut out, count, |i, b| {
                write!(b, "{{\"i\":{}}}", Num(i as f64 * 0.5))
            })
            .unwrap();
            let want: Vec<String> = (0..count)
                .map(|i| format!("{{\"i\":{}}}", num(i as f64 * 0.5)))
                .collect();
            assert_eq!(String::from_utf8(out).unwrap(), want.join(","));
        }
    }

    #[test]
    fn numbers_on_the_stack_match_the_shortest_round_trip_form() {
        // Reference: Rust's own shortest round-trip Debug form of f64, with
        // a trailing ".0" dropped, for the widest values there are.
        for v in [
            0.0,
            -0.0,
            1.0,
            -2.5,
            f64::MAX,
            f64::MIN,
            f64::MIN_POSITIVE,
            -f64::MIN_POSITIVE,
            5e-324,
            -2.2250738585072014e-308,
            1.2345678901234568e20,
            0.1 + 0.2,
            1e16,
            123456789.125,
        ] {
            let s = format!("{v:?}");
            let want = s.strip_suffix(".0").unwrap_or(&s);
            assert_eq!(num(v), want);
            assert_eq!(v, num(v).parse::<f64>().unwrap());
        }
        assert_eq!(num(f64::INFINITY), "null");
    }
}
