//! CSV output: one long table, one row per quantity, the unit of every
//! column in its header, so a spreadsheet can filter by case and kind.

use super::Scale;
use crate::analysis::Analysis;
use crate::model::Model;
use std::io::{self, Write};

/// A CSV field, quoted when it needs to be.
pub fn field(s: &str) -> String {
    if s.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_string()
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
