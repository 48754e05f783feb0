//! CSV output: one long table, one row per quantity, the unit of every
//! column in its header, so a spreadsheet can filter by case and kind.

use super::Scale;
use crate::analysis::Analysis;
use crate::model::Model;
use std::io::{self, Write};

/// A CSV text field (an id, a name, a message), quoted when it needs to
/// be. Text beginning with `=`, `+`, `-`, `@`, a tab or a carriage return
/// gets a leading apostrophe, so a spreadsheet shows it as text instead of
/// running it as a formula (CSV formula injection; common practice, as the
/// OWASP guidance on CSV injection recommends, from memory). Numbers are
/// written by [`num`] and never altered; JSON keeps every id exact.
pub fn field(s: &str) -> String {
    let s = if s.starts_with(['=', '+', '-', '@', '\t', '\r']) {
        std::borrow::Cow::Owned(format!("'{s}"))
    } else {
        std::borrow::Cow::Borrowed(s)
    };
    if s.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.into_owned()
    }
}

/// A number in shortest round-trip form (empty for non-finite).
pub fn num(v: f64) -> String {
    if v.is_finite() {
        format!("{v:?}")
    } else {
        String::new()
    }
}

/// `panelpoint solve --format csv`.
pub fn solve(w: &mut dyn Write, model: &Model, analysis: &Analysis) -> io::Result<()> {
    let s = Scale::of(model);
    writeln!(
        w,
        "case,kind,id,ux_{d},uy_{d},rx_{f},ry_{f},force_{f},stress_{st}",
        d = s.disp_name,
        f = s.force_name,
        st = s.stress_name
    )?;
    for case in &analysis.cases {
        let c = field(&case.id);
        for (mem, f) in model.members.iter().zip(&case.forces) {
            let area = model.sections[mem.section].area;
            writeln!(
                w,
                "{c},member,{},,,,,{},{}",
                field(&mem.id),
                num(f / s.force),
                num(f / area / s.stress)
            )?;
        }
        for (sup, r) in model.supports.iter().zip(&case.reactions) {
            writeln!(
                w,
                "{c},reaction,{},,,{},{},,",
                field(&model.nodes[sup.node].id),
                num(r[0] / s.force),
                num(r[1] / s.force)
            )?;
        }
        for (node, u) in model.nodes.iter().zip(&case.displacements) {
            writeln!(
                w,
                "{c},displacement,{},{},{},,,,",
                field(&node.id),
                num(u[0] / s.disp),
                num(u[1] / s.disp)
            )?;
        }
    }
    Ok(())
}

#[cfg(test)]
mod injection {
    use super::*;

    #[test]
    fn formula_like_text_is_neutralised_and_numbers_are_not() {
        // Each leading character a spreadsheet treats as a formula.
        assert_eq!(field("=1+2"), "'=1+2");
        assert_eq!(field("+A1"), "'+A1");
        assert_eq!(field("-AB"), "'-AB");
        assert_eq!(field("@SUM(A1)"), "'@SUM(A1)");
        assert_eq!(field("\tx"), "'\tx");
        assert_eq!(field("\rx"), "\"'\rx\"");
        // Quoting still applies after the apostrophe.
        assert_eq!(
            field("=HYPERLINK(\"a\",\"b\")"),
            "\"'=HYPERLINK(\"\"a\"\",\"\"b\"\")\""
        );
        // Ordinary text is untouched, and a negative number stays a number.
        assert_eq!(field("U1-L2"), "U1-L2");
        assert_eq!(num(-2.5), "-2.5");
    }
}
