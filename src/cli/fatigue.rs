//! The `fatigue` command: load the model, factor it once, evaluate every
//! member's fatigue, hand the result to a writer.

use super::commands::{load, write};
use crate::analysis::results::Prepared;
use crate::error::Error;
use crate::fatigue::{self, FatigueError};
use crate::report::{self, fatigue_csv, fatigue_json, fatigue_text, Format};
use std::io::Write;
use std::path::{Path, PathBuf};

/// `panelpoint fatigue`.
pub fn fatigue(
    path: &Path,
    format: Format,
    out: &Option<PathBuf>,
    all: bool,
    draw: &Option<PathBuf>,
) -> Result<u8, Error> {
    let c = load(path)?;
    let m = &c.model;
    let to_error = |e: FatigueError| match e {
        FatigueError::NoSettings => Error::Usage(format!("{}: {e}", path.display())),
        FatigueError::Loads(source) => Error::Loads {
            path: path.to_path_buf(),
            source,
        },
    };
    if m.fatigue.is_none() {
        return Err(to_error(FatigueError::NoSettings));
    }
    let prepared = Prepared::new(m).map_err(|source| Error::Analysis {
        path: path.to_path_buf(),
        source,
    })?;
    let f = fatigue::evaluate(m, &prepared).map_err(to_error)?;
    if format == Format::Csv {
        let mut err = std::io::stderr();
        for d in &c.warnings {
            let _ = writeln!(err, "panelpoint: warning: {}: {d}", path.display());
        }
        for line in fatigue_csv::notes(m, &f) {
            let _ = writeln!(err, "panelpoint: {line}");
        }
    }
    if draw.is_some() {
        let svg = report::fatigue_svg::draw(m, &f, 900.0);
        write(draw, |w| w.write_all(svg.as_bytes()))?;
    }
    write(out, |w| match format {
        Format::Text => fatigue_text::fatigue(w, m, &f, &c.warnings, all),
        Format::Json => fatigue_json::fatigue(w, m, &f, &c.warnings),
        Format::Csv => fatigue_csv::fatigue(w, m, &f),
    })?;
    Ok(0)
}
