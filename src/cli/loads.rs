//! The `influence` and `envelope` commands: load the model, factor it
//! once, compute influence lines or envelopes, hand them to a writer.

use super::commands::{load, write};
use crate::analysis::results::Prepared;
use crate::error::Error;
use crate::loads::{self, Deck, LoadError};
use crate::report::{influence_csv, influence_json, influence_text, Format};
use std::path::{Path, PathBuf};

/// Factor the model, and add the analysis warnings (ill-conditioning,
/// near-mechanism) to the model's: in the report for text and JSON, on
/// standard error for CSV (issue 22, item 16).
fn prepare(
    path: &Path,
    c: &mut crate::input::Converted,
    format: Format,
) -> Result<Prepared, Error> {
    let (p, label) = factor(path, &c.model)?;
    let mut warnings = crate::analysis::results::prepared_warnings(&c.model, &p);
    warnings.extend(label);
    if format == Format::Csv {
        super::commands::warnings_to_stderr(path, &c.warnings, &warnings);
    }
    c.warnings.extend(
        warnings
            .into_iter()
            .map(|message| crate::input::Diagnostic {
                severity: crate::input::Severity::Warning,
                message,
                location: None,
            }),
    );
    Ok(p)
}

/// The model's factorization: with tension-only members that of the
/// dead-load active set, with the label the output carries (issue 16).
fn factor(path: &Path, m: &crate::model::Model) -> Result<(Prepared, Option<String>), Error> {
    let err = |source| Error::Analysis {
        path: path.to_path_buf(),
        source,
    };
    if m.has_tension_only() {
        let (p, slack) = crate::analysis::active_set::dead_prepared(m).map_err(err)?;
        Ok((
            p,
            Some(crate::analysis::active_set::influence_label(&slack)),
        ))
    } else {
        Ok((Prepared::new(m).map_err(err)?, None))
    }
}

fn loads_error(path: &Path) -> impl Fn(LoadError) -> Error + '_ {
    move |source| Error::Loads {
        path: path.to_path_buf(),
        source,
    }
}

/// `panelpoint influence`.
pub fn influence(
    path: &Path,
    members: &[String],
    deck: Option<&[String]>,
    format: Format,
    out: &Option<PathBuf>,
) -> Result<u8, Error> {
    let mut c = load(path)?;
    let prepared = prepare(path, &mut c, format)?;
    let m = &c.model;
    let deck = match deck {
        Some(ids) => Deck::from_ids(m, ids),
        None => Deck::of_model(m),
    }
    .map_err(loads_error(path))?;
    let mut chosen = Vec::with_capacity(members.len());
    for id in members {
        let i = m
            .members
            .iter()
            .position(|x| x.id == id)
            .ok_or_else(|| loads_error(path)(LoadError::UnknownMember(id.clone())))?;
        if !chosen.contains(&i) {
            chosen.push(i);
        }
    }
    let supports: Vec<usize> = if members.is_empty() {
        chosen = (0..m.members.len()).collect();
        (0..m.supports.len()).collect()
    } else {
        Vec::new()
    };
    let lines = loads::influence_lines(m, &prepared, &deck).map_err(loads_error(path))?;
    write(out, |w| match format {
        Format::Text => influence_text::influence(w, m, &lines, &chosen, &supports, &c.warnings),
        Format::Json => influence_json::influence(w, m, &lines, &chosen, &supports, &c.warnings),
        Format::Csv => influence_csv::influence(w, m, &lines, &chosen, &supports),
    })?;
    Ok(0)
}

/// The influence lines of members `ids` along the model's deck, as strips
/// for a drawing (`draw --influence ID`): x at each deck node's x, m; the
/// member force per unit downward load (tension +).
pub fn influence_strips(
    path: &Path,
    m: &crate::model::Model,
    ids: &[String],
) -> Result<Vec<crate::report::svg::InfluenceLine>, Error> {
    let deck = Deck::of_model(m).map_err(loads_error(path))?;
    // The drawing's own warnings are printed by `draw`; only the factor is
    // needed here.
    let (prepared, label) = factor(path, m)?;
    let lines = loads::influence_lines(m, &prepared, &deck).map_err(loads_error(path))?;
    let mut out = Vec::with_capacity(ids.len());
    for id in ids {
        let i = m
            .members
            .iter()
            .position(|x| x.id == *id)
            .ok_or_else(|| loads_error(path)(LoadError::UnknownMember(id.clone())))?;
        out.push(crate::report::svg::InfluenceLine {
            name: match &label {
                None => format!("force in {id}, tension +"),
                Some(_) => format!("force in {id}, tension + (dead-load active set)"),
            },
            unit: "per unit load moving along the deck".into(),
            ordinates: deck
                .nodes
                .iter()
                .zip(lines.member(i))
                .map(|(&n, &v)| (m.nodes[n].x, v))
                .collect(),
        });
    }
    Ok(out)
}

/// `panelpoint envelope`.
pub fn envelope(path: &Path, format: Format, out: &Option<PathBuf>) -> Result<u8, Error> {
    let mut c = load(path)?;
    if c.model.live.moving.is_empty() {
        return Err(loads_error(path)(LoadError::NoMovingLoads));
    }
    let prepared = prepare(path, &mut c, format)?;
    let m = &c.model;
    let envs = if m.has_tension_only() {
        loads::envelope_nonlinear::envelopes(m)
    } else {
        loads::envelopes(m, &prepared)
    }
    .map_err(loads_error(path))?;
    write(out, |w| match format {
        Format::Text => influence_text::envelopes(w, m, &envs, &c.warnings),
        Format::Json => influence_json::envelopes(w, m, &envs, &c.warnings),
        Format::Csv => influence_csv::envelopes(w, m, &envs),
    })?;
    Ok(0)
}
