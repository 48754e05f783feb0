//! Text reports for the terminal: aligned tables, units in every header.

use super::table::{sig, Table};
use super::term::Term;
use super::{Scale, CAUTION};
use crate::analysis::Analysis;
use crate::input::Diagnostic;
use crate::model::Model;
use std::io::{self, Write};

/// `v` in display units, with round-off below 1e-10 of the column's largest
/// value shown as zero.
fn clean(v: f64, largest: f64, digits: usize) -> String {
    if v.abs() <= 1e-10 * largest {
        "0".into()
    } else {
        sig(v, digits)
    }
}

fn largest<'a>(values: impl Iterator<Item = &'a f64>) -> f64 {
    values.fold(0.0f64, |a, b| a.max(b.abs()))
}

pub fn header(
    w: &mut dyn Write,
    model: &Model,
    command: &str,
    warnings: &[Diagnostic],
    extra: &[String],
) -> io::Result<()> {
    let title = if model.title.is_empty() {
        "(untitled model)"
    } else {
        &model.title
    };
    writeln!(w, "panelpoint {command}: {title}")?;
    writeln!(w, "CAUTION: {CAUTION}")?;
    let s = Scale::of(model);
    writeln!(
        w,
        "Units: length {}, force {}, sections and displacements {}, stress {}",
        s.length_name, s.force_name, s.disp_name, s.stress_name
    )?;
    writeln!(w, "Determinacy: {}", model.determinacy().describe())?;
    for d in warnings {
        writeln!(w, "warning: {d}")?;
    }
    for d in extra {
        writeln!(w, "warning: {d}")?;
    }
    Ok(())
}

/// `panelpoint solve` as text.
pub fn solve(
    w: &mut dyn Write,
    model: &Model,
    analysis: &Analysis,
    warnings: &[Diagnostic],
) -> io::Result<()> {
    solve_term(w, model, analysis, warnings, &Term::plain())
}

/// `panelpoint solve` as text for `term`: tables fitted to its width (the
/// start and end node columns go first, then stress).
pub fn solve_term(
    w: &mut dyn Write,
    model: &Model,
    analysis: &Analysis,
    warnings: &[Diagnostic],
    term: &Term,
) -> io::Result<()> {
    header(w, model, "solve", warnings, &analysis.warnings)?;
    let s = Scale::of(model);
    for case in &analysis.cases {
        writeln!(w, "\n== Load case \"{}\" ==", case.id)?;
        let mut t = Table::new(&[
            "member",
            "start",
            "end",
            &format!("length {}", s.length_name),
            &format!("force {}", s.force_name),
            &format!("stress {}", s.stress_name),
            "sense",
        ]);
        // Round-off is judged against the case's own force scale, so a case
        // whose forces are all zero (a determinate truss warmed evenly) prints zeros.
        let fmax = case.force_scale.max(largest(case.forces.iter()) * 1e-300);
        for (m, (mem, f)) in model.members.iter().zip(&case.forces).enumerate() {
            let area = model.sections[mem.section].area;
            let sense = if f.abs() <= 1e-10 * fmax {
                "zero"
            } else if *f > 0.0 {
                "tension"
            } else {
                "compression"
            };
            t.row(vec![
                mem.id.to_string(),
                model.nodes[mem.start].id.clone(),
                model.nodes[mem.end].id.clone(),
                sig(model.length(m) / s.length, 5),
                clean(f / s.force, fmax / s.force, 5),
                clean(f / area / s.stress, fmax / area / s.stress, 4),
                sense.into(),
            ]);
        }
        let su = format!("stress {}", s.stress_name);
        t.optional(&["start", "end", su.as_str()]);
        write!(w, "{}", t.render_for(term))?;
        writeln!(w)?;
        let mut t = Table::new(&[
            "support",
            "kind",
            &format!("rx {}", s.force_name),
            &format!("ry {}", s.force_name),
        ]);
        let rmax = largest(case.reactions.iter().flatten()).max(fmax) / s.force;
        for (sup, r) in model.supports.iter().zip(&case.reactions) {
            t.row(vec![
                model.nodes[sup.node].id.clone(),
                sup.restraint.name().into(),
                clean(r[0] / s.force, rmax, 5),
                clean(r[1] / s.force, rmax, 5),
            ]);
        }
        write!(w, "{}", t.render_for(term))?;
        writeln!(w)?;
        let mut t = Table::new(&[
            "node",
            &format!("ux {}", s.disp_name),
            &format!("uy {}", s.disp_name),
        ]);
        let umax = largest(case.displacements.iter().flatten()) / s.disp;
        for (node, u) in model.nodes.iter().zip(&case.displacements) {
            t.row(vec![
                node.id.clone(),
                clean(u[0] / s.disp, umax, 4),
                clean(u[1] / s.disp, umax, 4),
            ]);
        }
        write!(w, "{}", t.render_for(term))?;
        writeln!(
            w,
            "Equilibrium: largest |K·u − f| = {} {} ({} of the largest force); loads ({}, {}) {f}, reactions ({}, {}) {f}",
            sig(case.residual / s.force, 2),
            s.force_name,
            sig(case.relative_residual, 2),
            clean(case.load_sum[0] / s.force, rmax, 5),
            clean(case.load_sum[1] / s.force, rmax, 5),
            clean(case.reaction_sum[0] / s.force, rmax, 5),
            clean(case.reaction_sum[1] / s.force, rmax, 5),
            f = s.force_name,
        )?;
    }
    Ok(())
}
