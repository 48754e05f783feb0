//! The library's top-level error: every failure a command can meet, each
//! knowing whether it is the user's input (exit 2) or ours (exit 1).

use crate::analysis::results::AnalysisError;
use crate::input::Diagnostics;
use std::path::PathBuf;

#[derive(Debug, thiserror::Error)]
pub enum Error {
    #[error("{path}: {diagnostics}")]
    Model {
        path: PathBuf,
        diagnostics: Diagnostics,
    },
    #[error("{path}: {source}")]
    Analysis {
        path: PathBuf,
        source: AnalysisError,
    },
    #[error("{path}: {source}")]
    Rate {
        path: PathBuf,
        source: crate::rate::RateError,
    },
    #[error("cannot read {path}: {source}")]
    Read {
        path: PathBuf,
        source: std::io::Error,
    },
    #[error("cannot write {what}: {source}")]
    Write {
        what: String,
        source: std::io::Error,
    },
    #[error("{path}: {source}")]
    Loads {
        path: PathBuf,
        source: crate::loads::LoadError,
    },
    #[error("{path}: {source}")]
    Stability {
        path: PathBuf,
        source: crate::stability::StabilityError,
    },
    #[error("{0}")]
    Usage(String),
}

impl Error {
    /// 2 for anything wrong with what the user gave; 1 for our own failures.
    pub fn exit_code(&self) -> u8 {
        match self {
            Error::Model { .. } | Error::Read { .. } | Error::Usage(_) | Error::Rate { .. } => 2,
            Error::Analysis { source, .. } => match source {
                AnalysisError::Internal => 1,
                _ => 2,
            },
            // A refused --out target (read-only, a dangling symlink, a
            // folder, a .partial another run holds) is the user's choice.
            Error::Write { source, .. } => {
                if crate::report::atomic::is_refusal(source) {
                    2
                } else {
                    1
                }
            }
            Error::Stability { source, .. } => {
                if source.is_internal() {
                    1
                } else {
                    2
                }
            }
            Error::Loads { source, .. } => {
                if source.is_internal() {
                    1
                } else {
                    2
                }
            }
        }
    }

    /// One line per problem, for the terminal.
    pub fn lines(&self) -> Vec<String> {
        match self {
            Error::Model { path, diagnostics } => diagnostics
                .errors
                .iter()
                .map(|d| format!("{}: {d}", path.display()))
                .collect(),
            other => vec![other.to_string()],
        }
    }
}
