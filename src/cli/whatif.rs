//! Running the what-if commands: `new`, `sweep`, `redundancy`,
//! `sensitivity`. The streamed sweep output lives here because it is about
//! files and terminals, not engineering.

use super::commands::{load, write};
use crate::analysis;
use crate::error::Error;
use crate::generate::{self, Family, GenerateOptions, UnitSystem};
use crate::input::{self, ron_writer::layout_to_ron};
use crate::rate;
use crate::report::{self, Format};
use crate::sweep::{self, RunOptions};
use std::fs;
use std::io::{self, IsTerminal, Write};
use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

pub struct NewArgs {
    pub family: String,
    pub panels: usize,
    pub panel_width: Option<f64>,
    pub span: Option<f64>,
    pub height: f64,
    pub panel_load: Option<f64>,
    pub units: String,
    pub top_heights: Option<Vec<f64>>,
    pub out: Option<PathBuf>,
}

pub fn new(a: NewArgs) -> Result<u8, Error> {
    let family = Family::from_name(&a.family).ok_or_else(|| {
        Error::Usage(format!(
            "\"{}\" is not a truss family; use one of {}",
            a.family,
            Family::names().join(", ")
        ))
    })?;
    let units = match a.units.trim().to_ascii_lowercase().as_str() {
        "us" => UnitSystem::Us,
        "si" => UnitSystem::Si,
        other => {
            return Err(Error::Usage(format!(
                "--units \"{other}\": use us (ft, kip) or si (m, kN)"
            )))
        }
    };
    let panel_width = match (a.panel_width, a.span) {
        (Some(w), _) => w,
        (None, Some(s)) if a.panels > 0 => s / a.panels as f64,
        (None, Some(_)) => 0.0,
        (None, None) => {
            return Err(Error::Usage(
                "give --panel-width W or --span S for the panel length".into(),
            ))
        }
    };
    let layout = generate::generate(&GenerateOptions {
        family,
        panels: a.panels,
        panel_width,
        height: a.height,
        panel_load: a.panel_load,
        units,
        top_heights: a.top_heights,
    })
    .map_err(|e| Error::Usage(format!("cannot generate: {e}")))?;
    let text = layout_to_ron(&layout);
    write(&a.out, |w| w.write_all(text.as_bytes()))?;
    Ok(0)
}

pub struct SweepArgs {
    pub model: PathBuf,
    pub sweep: PathBuf,
    pub jobs: Option<usize>,
    pub shard: Option<String>,
    pub method: Option<String>,
    pub format: Format,
    pub out: Option<PathBuf>,
    pub detail: bool,
}

/// Where streamed rows go: standard output, a special file (written
/// directly), or a locked `<out>.partial` renamed to `<out>` only once the
/// sweep is complete (see `report::atomic`). Rows are gathered in memory and
/// handed on in whole rows only, so an interrupted or failed run leaves
/// whole rows; on a failed write the partial file is cut back to the last
/// whole row.
struct Sink {
    w: Vec<u8>,
    dest: Dest,
    committed: u64,
    last_flush: Instant,
}

enum Dest {
    Stdout(io::Stdout),
    File(fs::File, Box<report::atomic::Streamed>),
}

/// The name an interrupted sweep's rows are kept under.
pub fn partial_path(out: &Path) -> PathBuf {
    let mut name = out.file_name().unwrap_or_default().to_os_string();
    name.push(".partial");
    out.with_file_name(name)
}

impl Sink {
    fn open(out: &Option<PathBuf>) -> io::Result<Sink> {
        let dest = match out {
            None => Dest::Stdout(io::stdout()),
            Some(p) => {
                let s = report::atomic::Streamed::open(p, &partial_path(p))?;
                Dest::File(s.writer()?, Box::new(s))
            }
        };
        Ok(Sink {
            w: Vec::with_capacity(1 << 16),
            dest,
            committed: 0,
            last_flush: Instant::now(),
        })
    }

    fn partial(&self) -> Option<&Path> {
        match &self.dest {
            Dest::Stdout(_) => None,
            Dest::File(_, s) => s.partial(),
        }
    }

    /// Hand the gathered whole rows on.
    fn commit(&mut self) -> io::Result<()> {
        let r = match &mut self.dest {
            Dest::Stdout(o) => o.write_all(&self.w).and_then(|_| o.flush()),
            Dest::File(f, s) => {
                let r = f.write_all(&self.w);
                if r.is_err() && s.partial().is_some() {
                    let _ = f.set_len(self.committed);
                }
                r
            }
        };
        r?;
        self.committed += self.w.len() as u64;
        self.w.clear();
        self.last_flush = Instant::now();
        Ok(())
    }

    /// After each row: pass the rows on at most twice a second, or when
    /// 64 kB have gathered, so an interrupted run keeps its rows.
    fn tick(&mut self) -> io::Result<()> {
        if self.w.len() >= 1 << 16 || self.last_flush.elapsed() > Duration::from_millis(500) {
            self.commit()?;
        }
        Ok(())
    }

    fn finish(mut self) -> io::Result<()> {
        self.commit()?;
        match self.dest {
            Dest::Stdout(_) => Ok(()),
            Dest::File(f, s) => {
                drop(f);
                s.finish()
            }
        }
    }
}

pub fn sweep(a: SweepArgs) -> Result<u8, Error> {
    let c = load(&a.model)?;
    let model = &c.model;
    let method = rate::choose_method(model, a.method.as_deref()).map_err(Error::Usage)?;
    super::guard::input(&a.sweep);
    let bytes = input::file::read_bounded(&a.sweep).map_err(|source| Error::Read {
        path: a.sweep.clone(),
        source,
    })?;
    let text = String::from_utf8(bytes).map_err(|e| Error::Read {
        path: a.sweep.clone(),
        source: io::Error::new(
            io::ErrorKind::InvalidData,
            format!(
                "the file is not UTF-8 text (bad byte at offset {})",
                e.utf8_error().valid_up_to()
            ),
        ),
    })?;
    let sw = input::sweep::load_sweep(&text, model).map_err(|diagnostics| Error::Model {
        path: a.sweep.clone(),
        diagnostics,
    })?;
    let shard = a
        .shard
        .as_deref()
        .map(sweep::parse_shard)
        .transpose()
        .map_err(Error::Usage)?;
    if a.jobs == Some(0) {
        return Err(Error::Usage("--jobs must be at least 1".into()));
    }
    let indices = sweep::shard_indices(sw.len(), shard);
    let opts = RunOptions {
        method,
        jobs: a.jobs,
        detail: a.detail,
    };
    let what = a
        .out
        .as_ref()
        .map_or("standard output".into(), |p| p.display().to_string());
    let werr = |source: io::Error| Error::Write {
        what: what.clone(),
        source,
    };
    super::guard::check(&a.out)?;
    if let Some(out) = &a.out {
        super::guard::check_out(&partial_path(out))?;
    }
    let mut sink = Sink::open(&a.out).map_err(werr)?;
    let mut writer = report::whatif::SweepWriter::new(a.format, a.detail, model);
    let shard_text = shard.map_or(String::new(), |(i, n)| {
        format!(" (shard {i}/{n}: {} of them)", indices.len())
    });
    let progress = (std::io::stderr().is_terminal() && indices.len() >= 50).then(|| {
        let bar = indicatif::ProgressBar::new(indices.len() as u64);
        bar.set_style(
            indicatif::ProgressStyle::with_template(
                "{bar:40} {pos}/{len} variants, {per_sec}, eta {eta}",
            )
            .unwrap_or_else(|_| indicatif::ProgressStyle::default_bar()),
        );
        bar
    });
    let (mut rows, mut failed) = (0usize, 0usize);
    let result = writer
        .header(&mut sink.w, model, sw.len(), &shard_text)
        .and_then(|_| {
            sweep::run(model, &sw, &indices, &opts, |row| {
                rows += 1;
                failed += usize::from(row.outcome.is_err());
                writer.row(&mut sink.w, &row)?;
                if let Some(p) = &progress {
                    p.inc(1);
                }
                sink.tick()
            })
        })
        .and_then(|_| writer.footer(&mut sink.w));
    if let Some(p) = progress {
        p.finish_and_clear();
    }
    match result {
        Ok(()) => {
            sink.finish().map_err(werr)?;
            // Every row an error (a model without fy, say): the output is
            // kept, but the run did not rate anything (issue 22, item 16).
            if rows > 0 && failed == rows {
                let _ = writeln!(
                    io::stderr(),
                    "panelpoint: error: {}: every one of the {rows} variants failed (see the error column); nothing was rated",
                    a.sweep.display()
                );
                return Ok(2);
            }
            Ok(0)
        }
        Err(e) => {
            let _ = sink.commit();
            let kept = sink.partial().map_or(String::new(), |p| {
                format!("; rows so far kept in {}", p.display())
            });
            Err(Error::Write {
                what: format!("{what}{kept}"),
                source: e,
            })
        }
    }
}

fn analysed(
    path: &Path,
    method: Option<&str>,
) -> Result<(input::Converted, analysis::Analysis, rate::Rating), Error> {
    let c = load(path)?;
    let m = &c.model;
    let chosen = rate::choose_method(m, method).map_err(Error::Usage)?;
    let a = analysis::analyse(m).map_err(|source| Error::Analysis {
        path: path.to_path_buf(),
        source,
    })?;
    let r = rate::rate(m, &a, chosen).map_err(|e| Error::Rate {
        path: path.to_path_buf(),
        source: e,
    })?;
    Ok((c, a, r))
}

pub fn redundancy(
    path: &Path,
    method: Option<&str>,
    format: Format,
    out: &Option<PathBuf>,
) -> Result<u8, Error> {
    let (c, a, r) = analysed(path, method)?;
    let opts = RunOptions {
        method: r.method,
        jobs: None,
        detail: false,
    };
    let losses = sweep::redundancy::scan(&c.model, &a, &opts)
        .map_err(|e| Error::Usage(format!("{}: {e}", path.display())))?;
    write(out, |w| {
        report::whatif::redundancy(w, &c.model, &losses, format)
    })?;
    Ok(0)
}

pub fn sensitivity(
    path: &Path,
    case: Option<&str>,
    method: Option<&str>,
    format: Format,
    out: &Option<PathBuf>,
) -> Result<u8, Error> {
    let (c, a, r) = analysed(path, method)?;
    let m = &c.model;
    use crate::sensitivity::SensitivityError as S;
    let s = crate::sensitivity::sensitivity(m, &a, &r, case).map_err(|e| match e {
        S::Loads(source) => Error::Loads {
            path: path.to_path_buf(),
            source,
        },
        S::Analysis(source) => Error::Analysis {
            path: path.to_path_buf(),
            source,
        },
        // Ours, not the input's: exit 1.
        S::Rebuilt { .. } => Error::Write {
            what: format!("the sensitivity of {}", path.display()),
            source: io::Error::other(e.to_string()),
        },
        e => Error::Usage(format!("{}: {e}", path.display())),
    })?;
    let effect = r.effects[s.effect].id.clone();
    write(out, |w| {
        report::whatif::sensitivity(w, m, &s, &effect, format)
    })?;
    Ok(0)
}
