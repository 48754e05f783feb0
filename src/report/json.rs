//! JSON output, streamed straight to the writer so that a million-DOF
//! result is never held in memory twice. Field names carry no units; the
//! `units` object at the top says what every number is in.

use super::{Scale, CAUTION};
use crate::analysis::Analysis;
use crate::input::Diagnostic;
use crate::model::Model;
use std::io::{self, Write};

/// A finite number in its shortest round-trip form; `null` otherwise.
pub fn num(v: f64) -> String {
    if v.is_finite() {
        let s = format!("{v:?}");
        s.strip_suffix(".0").map(str::to_string).unwrap_or(s)
    } else {
        "null".into()
    }
}

/// A JSON string literal.
pub fn string(s: &str) -> String {
    let mut out = String::with_capacity(s.len() + 2);
    out.push('"');
    for c in s.chars() {
        match c {
            '"' => out.push_str("\\\""),
            '\\' => out.push_str("\\\\"),
            '\n' => out.push_str("\\n"),
            '\r' => out.push_str("\\r"),
            '\t' => out.push_str("\\t"),
            c if (c as u32) < 0x20 => out.push_str(&format!("\\u{:04x}", c as u32)),
            c => out.push(c),
        }
    }
    out.push('"');
    out
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
        num(analysis.prepared.factor.min_pivot_ratio)
    )?;
    w.write_all(b",\"cases\":[")?;
    for (c, case) in analysis.cases.iter().enumerate() {
        if c > 0 {
            w.write_all(b",")?;
        }
        write!(w, "{{\"id\":{},\"displacements\":[", string(&case.id))?;
        for (i, (node, u)) in model.nodes.iter().zip(&case.displacements).enumerate() {
            if i > 0 {
                w.write_all(b",")?;
            }
            write!(
                w,
                "{{\"node\":{},\"ux\":{},\"uy\":{}}}",
                string(&node.id),
                num(u[0] / s.disp),
                num(u[1] / s.disp)
            )?;
        }
        w.write_all(b"],\"reactions\":[")?;
        for (i, (sup, r)) in model.supports.iter().zip(&case.reactions).enumerate() {
            if i > 0 {
                w.write_all(b",")?;
            }
            write!(
                w,
                "{{\"node\":{},\"rx\":{},\"ry\":{}}}",
                string(&model.nodes[sup.node].id),
                num(r[0] / s.force),
                num(r[1] / s.force)
            )?;
        }
        w.write_all(b"],\"members\":[")?;
        for (i, (mem, f)) in model.members.iter().zip(&case.forces).enumerate() {
            if i > 0 {
                w.write_all(b",")?;
            }
            let area = model.sections[mem.section].area;
            write!(
                w,
                "{{\"id\":{},\"force\":{},\"stress\":{}}}",
                string(&mem.id),
                num(f / s.force),
                num(f / area / s.stress)
            )?;
        }
        write!(
            w,
            "],\"equilibrium\":{{\"max_residual\":{},\"relative_residual\":{},\"load_sum\":{{\"fx\":{},\"fy\":{}}},\"reaction_sum\":{{\"rx\":{},\"ry\":{}}}}}}}",
            num(case.residual / s.force),
            num(case.relative_residual),
            num(case.load_sum[0] / s.force),
            num(case.load_sum[1] / s.force),
            num(case.reaction_sum[0] / s.force),
            num(case.reaction_sum[1] / s.force)
        )?;
    }
    w.write_all(b"]")
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
    }
}
