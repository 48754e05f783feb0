//! The `panelpoint` binary: parse arguments, run, print one clear line per
//! error and exit 0 (success), 1 (internal failure) or 2 (bad input).

use clap::Parser;
use std::io::Write;
use std::process::ExitCode;

fn main() -> ExitCode {
    let cli = panelpoint::cli::Cli::parse();
    match panelpoint::timing::stage("whole run", || panelpoint::cli::run(cli)) {
        Ok(code) => ExitCode::from(code),
        Err(e) => {
            // A failing standard error (full, closed) must not turn an
            // error into a panic: the exit status still tells.
            let mut err = std::io::stderr().lock();
            for line in e.lines() {
                let _ = writeln!(err, "panelpoint: error: {line}");
            }
            ExitCode::from(e.exit_code())
        }
    }
}
