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
    /// Let a model's vehicles_file name a file outside the model's folder.
    #[arg(long, global = true)]
    pub allow_outside_files: bool,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum FormatArg {
    Text,
    Json,
    Csv,
}

/// Output formats of `panelpoint stability`.
#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum StabilityFormat {
    Text,
    Json,
    Svg,
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
    /// Check a model file and list every problem found, then check that it is
    /// stable (factors the stiffness; a mechanism is named by node and direction).
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
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
    },
    /// Check every member's capacity (slenderness, buckling, tension) under every
    /// case and combination, and compute rating factors from the dead and live cases.
    Rate {
        model: PathBuf,
        /// Rating method: lrfr (default), lfr, asr, aisc360, aisc360-asd, en1993-a0,
        /// en1993-a, en1993-b, en1993-c, en1993-d, csa-s16, csa-s16-2.24, euler, johnson.
        #[arg(long)]
        method: Option<String>,
        #[arg(long, value_enum, default_value_t = FormatArg::Text)]
        format: FormatArg,
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
        /// Show every row in the text tables (default: the 40 highest).
        #[arg(long)]
        all: bool,
        /// Where in-plane effective-length factors come from: the model's
        /// k_in (default) or the in-plane elastic buckling of the truss.
        #[arg(long, value_enum, default_value_t = KFrom::Model)]
        k_from: KFrom,
    },
    /// Whole-truss stability and vibration: in-plane elastic buckling of every
    /// case and combination (critical factor, effective lengths from the mode),
    /// the compression chord on its U-frames, natural frequencies for footbridges.
    Stability {
        model: PathBuf,
        /// text, json, or svg (the in-plane buckling mode).
        #[arg(long, value_enum, default_value_t = StabilityFormat::Text)]
        format: StabilityFormat,
        /// With --format svg: the case or combination whose mode is drawn
        /// (default: the lowest critical factor).
        #[arg(long)]
        case: Option<String>,
        /// Write to this file (atomically) instead of standard output.
        #[arg(short = 'o', long)]
        out: Option<PathBuf>,
    },
    /// Section properties (built-up sections: as built and after section loss),
    /// or a drawing of one section's parts.
    Section {
        model: PathBuf,
        /// Only this section (required for --format svg when several are built up).
        #[arg(long)]
        id: Option<String>,
        #[arg(long, value_enum, default_value_t = SectionFormat::Text)]
        format: SectionFormat,
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
    },
    /// Influence lines of member forces and support reactions for a unit
    /// downward load moving along the deck line.
    Influence {
        model: PathBuf,
        /// Only this member (repeatable); without it every member and every reaction.
        #[arg(long = "member", value_name = "ID")]
        members: Vec<String>,
        /// Deck nodes in order, comma-separated, instead of the model's `deck`.
        #[arg(long, value_delimiter = ',', value_name = "NODES")]
        deck: Option<Vec<String>>,
        #[arg(long, value_enum, default_value_t = FormatArg::Text)]
        format: FormatArg,
        /// Write to this file (atomically) instead of standard output.
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
    },
    /// Greatest tension and compression in every member (and reactions)
    /// under each of the model's moving loads, with the dead-load force.
    Envelope {
        model: PathBuf,
        #[arg(long, value_enum, default_value_t = FormatArg::Text)]
        format: FormatArg,
        /// Write to this file (atomically) instead of standard output.
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
    },
    /// List the library of published load models (axles, spacings,
    /// uniform loads, dynamic allowance, sources), or the one named.
    Vehicles {
        /// A library name (hs20, hl93, cooper-e80, lm71, ...); all when absent.
        name: Option<String>,
        #[arg(long, value_enum, default_value_t = FormatArg::Text)]
        format: FormatArg,
        /// Write to this file (atomically) instead of standard output.
        #[arg(long)]
        out: Option<PathBuf>,
    },
    /// Write a starting model of a truss family (RON) to standard output or a file.
    New {
        /// pratt, howe, warren, warren-verticals, polygonal, k-braced.
        family: String,
        #[arg(long, default_value_t = 6)]
        panels: usize,
        /// Bottom-chord panel length (model length unit).
        #[arg(long, conflicts_with = "span")]
        panel_width: Option<f64>,
        /// Overall span; the panel width is span / panels.
        #[arg(long)]
        span: Option<f64>,
        /// Depth between chord centrelines (polygonal: at mid-span).
        #[arg(long)]
        height: f64,
        /// Downward load at every interior bottom panel point, case "panel".
        #[arg(long, allow_negative_numbers = true)]
        panel_load: Option<f64>,
        /// us (ft, kip, in, ksi) or si (m, kN, mm, MPa).
        #[arg(long, default_value = "us")]
        units: String,
        /// Polygonal only: heights of U1..U(n-1), comma separated.
        #[arg(long, value_delimiter = ',')]
        top_heights: Option<Vec<f64>>,
        /// Write to this file (atomically) instead of standard output.
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
    },
    /// Analyse and rate many variants of a model described by a sweep file.
    Sweep {
        model: PathBuf,
        sweep: PathBuf,
        /// Worker threads (default: one per core).
        #[arg(long)]
        jobs: Option<usize>,
        /// Run only variants whose index % N == I-1.
        #[arg(long)]
        shard: Option<String>,
        /// Rating method (as for `rate`).
        #[arg(long)]
        method: Option<String>,
        #[arg(long, value_enum, default_value_t = FormatArg::Text)]
        format: FormatArg,
        /// Write rows here as they finish (kept as OUT.partial if interrupted).
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
        /// Per-member results of every variant.
        #[arg(long)]
        detail: bool,
    },
    /// Remove each member in turn: mechanism (non-redundant) or the worst utilization after the loss.
    Redundancy {
        model: PathBuf,
        /// Rating method (as for `rate`).
        #[arg(long)]
        method: Option<String>,
        #[arg(long, value_enum, default_value_t = FormatArg::Text)]
        format: FormatArg,
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
    },
    /// Derivatives of the governing utilization and largest deflection with respect to node coordinates.
    Sensitivity {
        model: PathBuf,
        /// Differentiate the worst check and deflection of this load case.
        #[arg(long)]
        case: Option<String>,
        /// Rating method (as for `rate`).
        #[arg(long)]
        method: Option<String>,
        #[arg(long, value_enum, default_value_t = FormatArg::Text)]
        format: FormatArg,
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
    },
    /// Draw one pin as SVG: its stack of bars in order with their forces,
    /// and the moment and shear along it (the model's `pins`).
    Pin {
        model: PathBuf,
        /// The pin's node.
        #[arg(long)]
        node: String,
        /// Load case or combination without a moving load (default: the first load case).
        #[arg(long)]
        case: Option<String>,
        /// Write to this file (atomically) instead of standard output.
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
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
        /// Rating method for --show utilization (as for `rate`).
        #[arg(long)]
        method: Option<String>,
        /// Plot this member's influence line under the truss (repeatable;
        /// the model needs a `deck`).
        #[arg(long = "influence", value_name = "MEMBER")]
        influence: Vec<String>,
    },
    /// Fatigue of every member under the model's fatigue vehicle and traffic:
    /// rainflow-counted stress ranges, AASHTO MBE Section 7 lives and the
    /// EN 1993-1-9 damage (see docs/fatigue.md).
    Fatigue {
        model: PathBuf,
        #[arg(long, value_enum, default_value_t = FormatArg::Text)]
        format: FormatArg,
        /// Write to this file (atomically) instead of standard output.
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
        /// Show every member in the text table (default: the first 40).
        #[arg(long)]
        all: bool,
        /// Also write the truss coloured by fatigue life used to this SVG file.
        #[arg(long, value_name = "FILE.svg")]
        draw: Option<PathBuf>,
    },
    /// Write one self-contained HTML report: summary, model tables, results
    /// per case, capacity checks with clauses and formulas, drawings, cautions.
    Report {
        model: PathBuf,
        /// Write to this file (atomically) instead of standard output.
        #[arg(short = 'o', long = "out")]
        out: Option<PathBuf>,
        /// Rating method (as for `rate`).
        #[arg(long)]
        method: Option<String>,
        /// Where in-plane effective-length factors come from (as for `rate`).
        #[arg(long, value_enum, default_value_t = KFrom::Model)]
        k_from: KFrom,
    },
}

/// Where `rate` takes the in-plane effective-length factors K from.
#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum KFrom {
    /// The model's k_in (and unbraced_in) of every member.
    Model,
    /// The in-plane elastic buckling of the truss, for the members that take
    /// part in a mode (the largest K over the load effects); others keep k_in.
    Buckling,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum SectionFormat {
    Text,
    Json,
    Svg,
}
