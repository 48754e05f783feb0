//! The command line: argument parsing (clap) kept apart from running a
//! command. No engineering happens here; each command loads, calls the
//! library and hands the result to a report writer.

mod args;
mod commands;
mod fatigue;
mod guard;
mod k_from;
mod loads;
mod whatif;

pub use args::Cli;
pub use commands::run;
