//! Running one parsed command: load, compute, write.

use super::args::{Cli, Command, FormatArg, SectionFormat, ShowArg};
use crate::analysis;
use crate::error::Error;
use crate::input::{self, Converted};
use crate::rate;
use crate::report::{self, atomic::write_output, Format};
use std::io::Write;
use std::path::{Path, PathBuf};

pub(super) fn format(f: FormatArg) -> Format {
    match f {
        FormatArg::Text => Format::Text,
        FormatArg::Json => Format::Json,
        FormatArg::Csv => Format::Csv,
    }
}

/// Read and validate a model file.
pub fn load(path: &Path) -> Result<Converted, Error> {
    load_deferred(path).map(|(c, check)| check.apply(c))
}

/// [`load`] with the crossing-members check handed back, for a command that
/// runs it beside the analysis.
fn load_deferred(path: &Path) -> Result<(Converted, input::convert::CrossingCheck), Error> {
    super::guard::input(path);
    let bytes = crate::timing::stage("read file", || input::file::read_bounded(path)).map_err(
        |source| Error::Read {
            path: path.to_path_buf(),
            source,
        },
    )?;
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
    let (c, check) =
        input::load_str_deferred(&text, path.parent()).map_err(|diagnostics| Error::Model {
            path: path.to_path_buf(),
            diagnostics,
        })?;
    if let Some(v) = &c.vehicles_path {
        super::guard::input(v);
    }
    Ok((c, check))
}

pub(super) fn write(
    out: &Option<PathBuf>,
    body: impl FnOnce(&mut dyn Write) -> std::io::Result<()>,
) -> Result<(), Error> {
    super::guard::check(out)?;
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

/// Drop large results on a thread of their own: freeing millions of ids
/// and the factor takes a noticeable share of a large run, and the process
/// may exit before it is done (the system reclaims the memory then). If no
/// thread can be started the results are dropped here.
fn free_in_background<T: Send + 'static>(big: T) {
    let slot = std::sync::Arc::new(std::sync::Mutex::new(Some(big)));
    let theirs = std::sync::Arc::clone(&slot);
    let spawned = std::thread::Builder::new().spawn(move || {
        drop(theirs.lock().ok().and_then(|mut g| g.take()));
    });
    if spawned.is_err() {
        drop(slot.lock().ok().and_then(|mut g| g.take()));
    }
}

/// CSV carries numbers only: the model's and the analysis's warnings go to
/// stderr instead, one line each, as `validate` prints them.
pub(super) fn warnings_to_stderr(path: &Path, model: &[input::Diagnostic], analysis: &[String]) {
    let mut err = std::io::stderr();
    let all = model.iter().map(|d| d.to_string());
    for d in all.chain(analysis.iter().cloned()) {
        let _ = writeln!(err, "panelpoint: warning: {}: {d}", path.display());
    }
}

/// Run a command; `Ok` carries the exit status of a successful run.
pub fn run(cli: Cli) -> Result<u8, Error> {
    input::allow_outside_files(cli.allow_outside_files);
    match cli.command {
        Command::Validate { model } => {
            let c = load(&model)?;
            let m = &c.model;
            let mut err = std::io::stderr();
            for d in &c.warnings {
                let _ = writeln!(err, "panelpoint: warning: {}: {d}", model.display());
            }
            // A model that cannot be analysed is not valid: factor K (the
            // stability check) and name the free motion of a mechanism.
            analysis::results::Prepared::new(m).map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            write(&None, |w| {
                writeln!(
                    w,
                    "{}: valid: {} nodes, {} members, {} supports, {} load cases; {}",
                    model.display(),
                    m.nodes.len(),
                    m.members.len(),
                    m.supports.len(),
                    m.cases.len(),
                    m.determinacy().describe()
                )
            })?;
            Ok(0)
        }
        Command::Solve {
            model,
            format: f,
            out,
        } => {
            let (mut c, check) = load_deferred(&model)?;
            // The crossing check only warns: it runs on the second core
            // while the first orders K.
            let (a, crossing) = analysis::analyse_beside(&c.model, || check.run(&c.model));
            let a = a.map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            c.warnings.extend(crossing);
            let (m, warn) = (&c.model, &c.warnings);
            if format(f) == Format::Csv {
                warnings_to_stderr(&model, warn, &a.warnings);
            }
            crate::timing::stage("output", || {
                write(&out, |w| match format(f) {
                    Format::Text => report::text::solve_term(w, m, &a, warn, &term(&out)),
                    Format::Json => report::json::solve(w, m, &a, warn),
                    Format::Csv => report::csv::solve(w, m, &a),
                })
            })?;
            free_in_background((a, c));
            Ok(0)
        }
        Command::Section {
            model,
            id,
            format: f,
            out,
        } => {
            let c = load(&model)?;
            let m = &c.model;
            if let Some(id) = &id {
                if !m.sections.iter().any(|s| &s.id == id) {
                    return Err(Error::Usage(format!(
                        "{}: no section \"{id}\"",
                        model.display()
                    )));
                }
            }
            match f {
                SectionFormat::Text => {
                    write(&out, |w| report::sections::text(w, m, id.as_deref()))?
                }
                SectionFormat::Json => {
                    write(&out, |w| report::sections::json(w, m, id.as_deref()))?
                }
                SectionFormat::Svg => {
                    let built: Vec<_> = m
                        .sections
                        .iter()
                        .filter(|s| s.built_up.is_some() && id.as_ref().is_none_or(|i| &s.id == i))
                        .collect();
                    let s = match built.as_slice() {
                        [one] => *one,
                        [] => return Err(Error::Usage(
                            "no built-up section to draw (only sections with parts have a drawing)"
                                .into(),
                        )),
                        _ => {
                            return Err(Error::Usage(
                                "several built-up sections: choose one with --id".into(),
                            ))
                        }
                    };
                    write(&out, |w| report::sections::svg(w, m, s))?
                }
            }
            Ok(0)
        }
        Command::Rate {
            model,
            method,
            format: f,
            out,
            all,
            k_from,
        } => {
            let c = load(&model)?;
            let m = &c.model;
            let chosen = rate::choose_method(m, method.as_deref()).map_err(Error::Usage)?;
            let a = analysis::analyse(m).map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            // Chord k_out from the U-frames when the model asks, in-plane K
            // from buckling with --k-from buckling (cli/k_from.rs).
            let (adjusted, notes) = super::k_from::rated_model(&model, m, &a, k_from, None)?;
            let m = adjusted.as_ref().unwrap_or(m);
            let mut r = rate::rate(m, &a, chosen).map_err(|e| Error::Rate {
                path: model.clone(),
                source: e,
            })?;
            r.notes.extend(notes);
            let warn = &c.warnings;
            if format(f) == Format::Csv {
                warnings_to_stderr(&model, warn, &a.warnings);
            }
            write(&out, |w| match format(f) {
                Format::Text => report::rate_text::rate_term(w, m, &a, &r, warn, all, &term(&out)),
                Format::Json => report::rate_json::rate(w, m, &a, &r, warn),
                Format::Csv => report::rate_csv::rate(w, m, &r),
            })?;
            Ok(0)
        }
        Command::Stability {
            model,
            format: f,
            case,
            out,
        } => {
            let c = load(&model)?;
            let m = &c.model;
            let a = analysis::analyse(m).map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            let r = crate::stability::run::run(m, &a).map_err(|source| Error::Stability {
                path: model.clone(),
                source,
            })?;
            let warn = &c.warnings;
            if let Some(id) = &case {
                if !r.in_plane.iter().any(|e| &e.effect == id) {
                    return Err(Error::Usage(format!(
                        "--case \"{id}\": no such load case or combination"
                    )));
                }
            }
            write(&out, |w| match f {
                super::args::StabilityFormat::Text => {
                    report::stability_text::stability(w, m, &r, warn)
                }
                super::args::StabilityFormat::Json => {
                    report::stability_json::stability(w, m, &r, warn)
                }
                super::args::StabilityFormat::Svg => {
                    report::stability_svg::mode_svg(w, m, &r, case.as_deref())
                }
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
        Command::Fatigue {
            model,
            format: f,
            out,
            all,
            draw,
        } => super::fatigue::fatigue(&model, format(f), &out, all, &draw),
        Command::Vehicles {
            name,
            format: f,
            out,
        } => {
            let models = match name {
                None => crate::loads::library::catalogue(),
                Some(n) => vec![crate::loads::library::lookup(&n).ok_or_else(|| {
                    Error::Usage(format!(
                        "no library load model \"{n}\"; `panelpoint vehicles` lists them"
                    ))
                })?],
            };
            write(&out, |w| match format(f) {
                Format::Json => report::vehicles::json(w, &models),
                _ => report::vehicles::text(w, &models),
            })?;
            Ok(0)
        }
        Command::New {
            family,
            panels,
            panel_width,
            span,
            height,
            panel_load,
            units,
            top_heights,
            out,
        } => super::whatif::new(super::whatif::NewArgs {
            family,
            panels,
            panel_width,
            span,
            height,
            panel_load,
            units,
            top_heights,
            out,
        }),
        Command::Sweep {
            model,
            sweep,
            jobs,
            shard,
            method,
            format: f,
            out,
            detail,
        } => super::whatif::sweep(super::whatif::SweepArgs {
            model,
            sweep,
            jobs,
            shard,
            method,
            format: format(f),
            out,
            detail,
        }),
        Command::Redundancy {
            model,
            method,
            format: f,
            out,
        } => super::whatif::redundancy(&model, method.as_deref(), format(f), &out),
        Command::Sensitivity {
            model,
            case,
            method,
            format: f,
            out,
        } => {
            super::whatif::sensitivity(&model, case.as_deref(), method.as_deref(), format(f), &out)
        }
        Command::Draw {
            model,
            out,
            case,
            show,
            method,
            influence,
        } => {
            let c = load(&model)?;
            let m = &c.model;
            let a = analysis::analyse(m).map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            if m.has_tension_only() {
                // Combinations are solved whole: a failure is the model's.
                analysis::active_set::combination_results(m).map_err(|source| Error::Analysis {
                    path: model.clone(),
                    source,
                })?;
            }
            let show = match show {
                ShowArg::Forces => report::svg::Show::Forces,
                ShowArg::Utilization => report::svg::Show::Utilization,
                ShowArg::Deflection => report::svg::Show::Deflection,
                ShowArg::Model => report::svg::Show::Model,
            };
            // Utilization needs the rating, and so does a combination with a
            // moving load (its forces are the envelope `rate` checks).
            let with_vehicle = m.combinations.iter().any(|c| !c.moving.is_empty());
            let rating = if show == report::svg::Show::Utilization || with_vehicle {
                let chosen = rate::choose_method(m, method.as_deref()).map_err(Error::Usage)?;
                Some(rate::rate(m, &a, chosen).map_err(|e| Error::Rate {
                    path: model.clone(),
                    source: e,
                })?)
            } else {
                None
            };
            let effects = report::svg::effects_rated(m, &a, rating.as_ref());
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
            let mut d = report::svg::Drawing::new(m, show);
            // Utilization without --case is the envelope of every effect.
            d.effect = if show == report::svg::Show::Utilization && case.is_none() {
                None
            } else {
                effect
            };
            d.rating = rating
                .as_ref()
                .filter(|_| show == report::svg::Show::Utilization);
            let strips = if influence.is_empty() {
                Vec::new()
            } else {
                super::loads::influence_strips(&model, m, &influence)?
            };
            d.influence = &strips;
            let svg = report::svg::draw(&d);
            write(&out, |w| w.write_all(svg.as_bytes()))?;
            Ok(0)
        }
        Command::Pin {
            model,
            node,
            case,
            out,
        } => {
            let c = load(&model)?;
            let m = &c.model;
            let pin = m
                .pins
                .iter()
                .find(|p| m.nodes[p.node].id == node)
                .ok_or_else(|| {
                    let ids: Vec<String> = m
                        .pins
                        .iter()
                        .map(|p| format!("\"{}\"", m.nodes[p.node].id))
                        .collect();
                    Error::Usage(format!(
                        "--node \"{node}\": no pin at that node in {}; pins are at: {}",
                        model.display(),
                        if ids.is_empty() {
                            "none".into()
                        } else {
                            ids.join(", ")
                        }
                    ))
                })?;
            let a = analysis::analyse(m).map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            // Whole states only: a combination with a moving load is an
            // envelope, member by member, not one state of the pin.
            let effects: Vec<_> = report::svg::effects(m, &a)
                .into_iter()
                .filter(|e| {
                    !m.combinations
                        .iter()
                        .any(|c| c.id == e.id && !c.moving.is_empty())
                })
                .collect();
            let effect = match &case {
                None => effects.first(),
                Some(id) => effects.iter().find(|e| &e.id == id),
            }
            .ok_or_else(|| {
                Error::Usage(format!(
                    "--case \"{}\": no load case or combination (without a moving load) of that id in {}",
                    case.as_deref().unwrap_or(""),
                    model.display()
                ))
            })?;
            let svg = report::pin_svg::pin_svg(m, pin, &effect.forces, &effect.id);
            write(&out, |w| w.write_all(svg.as_bytes()))?;
            Ok(0)
        }
        Command::Report {
            model,
            out,
            method,
            k_from,
        } => {
            let c = load(&model)?;
            let m = &c.model;
            // The page is streamed (report::html::write_report); what stays
            // in memory is the analysis, the rating and the effects drawn:
            // about 0.4 kB per effect × (members + nodes) (measured: 24 MB
            // peak for 3,000 cases on the four-panel truss, 21 members and
            // nodes, a 115 MB page), taken as 0.5 kB. Refused before the
            // analysis when above the machine's memory (issue 22, item 9:
            // 10^6 cases used to abort).
            let effects = (m.cases.len() + m.combinations.len() + 2 * m.live.moving.len()).max(1);
            analysis::results::check_memory(
                500.0 * effects as f64 * (m.members.len() + m.nodes.len()) as f64,
                || {
                    format!(
                        "the HTML report of {effects} load effects × {} members",
                        m.members.len()
                    )
                },
                "rate the model with --format csv, or split its load cases",
            )
            .map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            let chosen = rate::choose_method(m, method.as_deref()).map_err(Error::Usage)?;
            let a = analysis::analyse(m).map_err(|source| Error::Analysis {
                path: model.clone(),
                source,
            })?;
            // The stability section (issue 19) when the model has a
            // `stability` section or K is taken from buckling.
            let wants = m.stability != crate::stability::Settings::default()
                || k_from == super::args::KFrom::Buckling;
            let stab = wants.then(|| crate::stability::run::run(m, &a));
            let in_plane = stab
                .as_ref()
                .and_then(|s| s.as_ref().ok())
                .map(|s| s.in_plane.as_slice());
            let (adjusted, notes) = match (&stab, k_from) {
                (Some(Err(e)), super::args::KFrom::Buckling) => {
                    return Err(Error::Stability {
                        path: model.clone(),
                        source: e.clone(),
                    })
                }
                _ => super::k_from::rated_model(&model, m, &a, k_from, in_plane)?,
            };
            let given_k: Vec<(f64, f64)> = m.members.iter().map(|x| (x.k_in, x.k_out)).collect();
            let m = adjusted.as_ref().unwrap_or(m);
            // A model without fy/fu still gets a report, without the checks.
            let r = rate::rate(m, &a, chosen).map(|mut r| {
                r.notes.extend(notes);
                r
            });
            // A model with a fatigue block gets a fatigue section.
            let fatigue = m
                .fatigue
                .as_ref()
                .map(|_| crate::fatigue::evaluate_model(m));
            let extras = report::html::Extras {
                fatigue: fatigue
                    .as_ref()
                    .map(|f| f.as_ref().map_err(|e| e.to_string())),
                stability: stab.as_ref().map(|s| report::html::StabilityPart {
                    report: s.as_ref().map_err(|e| e.to_string()),
                    k_from_buckling: k_from == super::args::KFrom::Buckling,
                    given_k,
                }),
            };
            let rating = r.as_ref().map_err(|e| e.to_string());
            write(&out, |w| {
                report::html::write_report(w, m, &a, rating, &c.warnings, &extras)
            })?;
            Ok(0)
        }
    }
}
