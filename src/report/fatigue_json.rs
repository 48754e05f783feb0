//! `panelpoint fatigue --format json`: units, caution, the parameters with
//! their sources, and one object per member (finite remaining life first;
//! lives in years, null where infinite).

use super::fatigue_rows::{parameters, rows, BASIS};
use super::json::{num, string, write_header};
use crate::fatigue::Fatigue;
use crate::input::Diagnostic;
use crate::model::Model;
use std::io::{self, Write};

fn opt(v: Option<f64>) -> String {
    v.map_or("null".into(), num)
}

pub fn fatigue(
    w: &mut dyn Write,
    model: &Model,
    f: &Fatigue,
    warnings: &[Diagnostic],
) -> io::Result<()> {
    write_header(w, model, warnings, &[])?;
    write!(w, ",\"basis\":{},\"parameters\":[", string(BASIS))?;
    for (i, p) in parameters(model, f).iter().enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        write!(
            w,
            "{{\"name\":{},\"value\":{},\"source\":{}}}",
            string(p.name),
            string(&p.value),
            string(p.source)
        )?;
    }
    w.write_all(b"],\"members\":[")?;
    for (i, r) in rows(model, f).iter().enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        let cycles: Vec<String> = r
            .cycles
            .iter()
            .map(|&(a, n)| format!("[{},{}]", num(a), num(n)))
            .collect();
        write!(
            w,
            "\n{{\"member\":{},\"category\":{},\"category_default\":{},\"en_category\":{},\"en_category_default\":{},\"area\":{},\"direction\":{},\"max_stress\":{},\"min_stress\":{},\"cycles\":[{}],\"cycles_per_passage\":{},\"calculated_effective_range\":{},\"effective_range\":{},\"max_range\":{},\"threshold\":{},\"rr\":[{},{},{}],\"life_minimum\":{},\"life_evaluation\":{},\"life_mean\":{},\"remaining\":{},\"remaining_minimum\":{},\"remaining_evaluation\":{},\"remaining_mean\":{},\"en_damage_per_passage\":{},\"en_passages\":{},\"en_life\":{},\"en_remaining\":{}}}",
            string(r.member),
            string(r.category),
            r.category_default,
            num(r.en_category),
            r.en_default,
            num(r.area),
            string(r.direction),
            num(r.max_stress),
            num(r.min_stress),
            cycles.join(","),
            num(r.cycles_per_passage),
            num(r.effective_range),
            num(r.mbe_effective_range),
            num(r.max_range),
            num(r.threshold),
            num(r.rr[0]),
            num(r.rr[1]),
            num(r.rr[2]),
            opt(r.life[0]),
            opt(r.life[1]),
            opt(r.life[2]),
            opt(r.remaining[0]),
            opt(r.remaining[0]),
            opt(r.remaining[1]),
            opt(r.remaining[2]),
            num(r.en_damage),
            opt(r.en_passages),
            opt(r.en_life),
            opt(r.en_remaining),
        )?;
    }
    w.write_all(b"\n]}\n")
}
