//! Running one parsed command: load, compute, write.

use super::args::{Cli, Command, FormatArg};
use crate::analysis;
use crate::error::Error;
use crate::input::{self, Converted};
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
    input::load_str_in(&text, path.parent()).map_err(|diagnostics| Error::Model {
        path: path.to_path_buf(),
        diagnostics,
    })
}

pub(super) fn write(
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
                Format::Text => report::text::solve(w, m, &a, warn),
                Format::Json => report::json::solve(w, m, &a, warn),
                Format::Csv => report::csv::solve(w, m, &a),
            })?;
            Ok(0)
        }
        Command::Influence {
            model,
            members,
            deck,
            format: f,
            out,
        } => super::loads::influence(&model, &members, deck.as_deref(), format(f), &out),
        Command::Envelope {
            model,
            format: f,
            out,
        } => super::loads::envelope(&model, format(f), &out),
    }
}
