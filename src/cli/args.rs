//! Command-line arguments, close to what the user typed.

use clap::{Parser, Subcommand, ValueEnum};
use std::path::PathBuf;

#[derive(Parser, Debug)]
#[command(
    name = "panelpoint",
    version,
    about = "Rating and alteration checks for existing pin-jointed trusses",
    long_about = "Rating and alteration checks for existing pin-jointed trusses.\n\n\
Results are screening calculations for review by a qualified engineer; local codes, \
the owner's rating rules and licensed practice govern."
)]
pub struct Cli {
    #[command(subcommand)]
    pub command: Command,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum FormatArg {
    Text,
    Json,
    Csv,
}

/// What `panelpoint draw` shows.
#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum ShowArg {
    Forces,
    Utilization,
    Deflection,
    Model,
}

#[derive(Subcommand, Debug)]
pub enum Command {
    /// Check a model file and list every problem found, without analysing it.
    Validate {
        /// The model file (RON).
        model: PathBuf,
    },
    /// Analyse every load case: member forces, reactions, displacements.
    Solve {
        model: PathBuf,
        #[arg(long, value_enum, default_value_t = FormatArg::Text)]
        format: FormatArg,
        /// Write to this file (atomically) instead of standard output.
        #[arg(long)]
        out: Option<PathBuf>,
    },
    /// Check every member's capacity (slenderness, buckling, tension) under every
    /// case and combination, and compute rating factors from the dead and live cases.
    Rate {
        model: PathBuf,
        /// Column curve: euler, johnson, aisc360 (default), aisc360-asd, en1993-a0, en1993-a,
        /// en1993-b, en1993-c, en1993-d, csa-s16, csa-s16-2.24, bridge-asd.
        #[arg(long)]
        curve: Option<String>,
        #[arg(long, value_enum, default_value_t = FormatArg::Text)]
        format: FormatArg,
        #[arg(long)]
        out: Option<PathBuf>,
        /// Show every row in the text tables (default: the 40 highest).
        #[arg(long)]
        all: bool,
    },
    /// Draw the truss as SVG: geometry to scale with labels, supports and
    /// loads, and member forces, utilization or the deflected shape.
    Draw {
        model: PathBuf,
        /// Write to this file (atomically) instead of standard output.
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
        /// Load case or combination to draw (default: the first load case).
        #[arg(long)]
        case: Option<String>,
        #[arg(long, value_enum, default_value_t = ShowArg::Forces)]
        show: ShowArg,
        /// Column curve for --show utilization (as for `rate`).
        #[arg(long)]
        curve: Option<String>,
    },
    /// Write one self-contained HTML report: summary, model tables, results
    /// per case, capacity checks with clauses and formulas, drawings, cautions.
    Report {
        model: PathBuf,
        /// Write to this file (atomically) instead of standard output.
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
        /// Column curve (as for `rate`).
        #[arg(long)]
        curve: Option<String>,
    },
}
