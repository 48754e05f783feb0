//! Running one parsed command: load, compute, write.

use super::args::{Cli, Command, FormatArg, ShowArg};
use crate::analysis;
use crate::error::Error;
use crate::input::{self, Converted};
use crate::rate;
use crate::report::{self, atomic::write_output, Format};
use std::io::Write;
use std::path::{Path, PathBuf};

fn format(f: FormatArg) -> Format {
    match f {
        FormatArg::Text => Format::Text,
        FormatArg::Json => Format::Json,
        FormatArg::Csv => Format::Csv,
    }
}

/// Read and validate a model file.
pub fn load(path: &Path) -> Result<Converted, Error> {
    let bytes = std::fs::read(path).map_err(|source| Error::Read {
        path: path.to_path_buf(),
        source,
    })?;
    let text = String::from_utf8(bytes).map_err(|e| Error::Model {
        path: path.to_path_buf(),
        diagnostics: input::Diagnostics {
            errors: vec![input::Diagnostic {
                severity: input::Severity::Error,
                message: format!(
                    "the file is not UTF-8 text (bad byte at offset {})",
                    e.utf8_error().valid_up_to()
                ),
                location: None,
            }],
        },
    })?;
    input::load_str(&text).map_err(|diagnostics| Error::Model {
        path: path.to_path_buf(),
        diagnostics,
    })
}

fn write(
    out: &Option<PathBuf>,
    body: impl FnOnce(&mut dyn Write) -> std::io::Result<()>,
) -> Result<(), Error> {
    write_output(out.as_deref(), body).map_err(|source| Error::Write {
        what: out
            .as_ref()
            .map_or("standard output".into(), |p| p.display().to_string()),
        source,
    })
}

/// The terminal a text report goes to: standard output as it is, or a
/// plain file for --out.
fn term(out: &Option<PathBuf>) -> report::term::Term {
    if out.is_none() {
        report::term::Term::stdout()
    } else {
        report::term::Term::plain()
    }
}

/// Run a command; `Ok` carries the exit status of a successful run.
pub fn run(cli: Cli) -> Result<u8, Error> {
    match cli.command {
        Command::Validate { model } => {
            let c = load(&model)?;
            let m = &c.model;
            let mut err = std::io::stderr();
            for d in &c.warnings {
                let _ = writeln!(err, "panelpoint: warning: {}: {d}", model.display());
            }
            println!(
                "{}: valid: {} nodes, {} members, {} supports, {} load cases; {}",
                model.display(),
                m.nodes.len(),
                m.members.len(),
                m.supports.len(),
                m.cases.len(),
                m.determinacy().describe()
            );
            Ok(0)
        }
        Command::Solve {
            model,
            format: f,
            out,
        } => {
            let c = load(&model)?;
            let a = analysis::analyse(&c.model).map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            let (m, warn) = (&c.model, &c.warnings);
            write(&out, |w| match format(f) {
                Format::Text => report::text::solve_term(w, m, &a, warn, &term(&out)),
                Format::Json => report::json::solve(w, m, &a, warn),
                Format::Csv => report::csv::solve(w, m, &a),
            })?;
            Ok(0)
        }
        Command::Rate {
            model,
            curve,
            format: f,
            out,
            all,
        } => {
            let c = load(&model)?;
            let m = &c.model;
            let chosen = rate::choose_curve(m, curve.as_deref()).map_err(Error::Usage)?;
            let a = analysis::analyse(m).map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            let r = rate::rate(m, &a, chosen).map_err(|e| Error::Rate {
                path: model.clone(),
                source: e,
            })?;
            let warn = &c.warnings;
            write(&out, |w| match format(f) {
                Format::Text => report::rate_text::rate_term(w, m, &a, &r, warn, all, &term(&out)),
                Format::Json => report::rate_json::rate(w, m, &a, &r, warn),
                Format::Csv => report::rate_csv::rate(w, m, &r),
            })?;
            Ok(0)
        }
        Command::Draw {
            model,
            out,
            case,
            show,
            curve,
        } => {
            let c = load(&model)?;
            let m = &c.model;
            let a = analysis::analyse(m).map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            let effects = report::svg::effects(m, &a);
            let effect = match &case {
                None => effects.first(),
                Some(id) => Some(effects.iter().find(|e| &e.id == id).ok_or_else(|| {
                    Error::Usage(format!(
                        "--case \"{id}\": no load case or combination of that id in {}; the model has: {}",
                        model.display(),
                        effects
                            .iter()
                            .map(|e| format!("\"{}\"", e.id))
                            .collect::<Vec<_>>()
                            .join(", ")
                    ))
                })?),
            };
            let show = match show {
                ShowArg::Forces => report::svg::Show::Forces,
                ShowArg::Utilization => report::svg::Show::Utilization,
                ShowArg::Deflection => report::svg::Show::Deflection,
                ShowArg::Model => report::svg::Show::Model,
            };
            let rating = if show == report::svg::Show::Utilization {
                let chosen = rate::choose_curve(m, curve.as_deref()).map_err(Error::Usage)?;
                Some(rate::rate(m, &a, chosen).map_err(|e| Error::Rate {
                    path: model.clone(),
                    source: e,
                })?)
            } else {
                None
            };
            let mut d = report::svg::Drawing::new(m, show);
            // Utilization without --case is the envelope of every effect.
            d.effect = if show == report::svg::Show::Utilization && case.is_none() {
                None
            } else {
                effect
            };
            d.rating = rating.as_ref();
            let svg = report::svg::draw(&d);
            write(&out, |w| w.write_all(svg.as_bytes()))?;
            Ok(0)
        }
        Command::Report { model, out, curve } => {
            let c = load(&model)?;
            let m = &c.model;
            let chosen = rate::choose_curve(m, curve.as_deref()).map_err(Error::Usage)?;
            let a = analysis::analyse(m).map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            // A model without fy/fu still gets a report, without the checks.
            let r = rate::rate(m, &a, chosen);
            let html =
                report::html::report(m, &a, r.as_ref().map_err(|e| e.to_string()), &c.warnings);
            write(&out, |w| w.write_all(html.as_bytes()))?;
            Ok(0)
        }
    }
}
