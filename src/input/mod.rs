//! The input layer: the only part of panelpoint that knows RON. It parses
//! a model file, converts units and checks everything, and hands back a
//! validated [`Model`](crate::model::Model) or every problem it found.

mod bulk;
pub mod convert;
pub mod diagnostics;
mod fatigue;
pub mod file;
pub mod joints;
mod library;
mod loads;
pub mod parts;
mod pins;
mod plausible;
pub mod quantity;
mod rating;
pub mod ron_writer;
pub mod schema;
mod section_errors;
mod sections;
pub mod stability;
pub mod sweep;
pub mod syntax;

pub use convert::Converted;
pub use diagnostics::{Diagnostic, Diagnostics, Severity};
pub use loads::allow_outside_files;

/// Largest model file accepted, bytes; a guard against feeding the loader
/// something that is not a model at all.
pub const MAX_FILE_BYTES: usize = 1 << 31;

/// Largest dynamic (impact) allowance accepted, a fraction: 2.0 = 200 %.
/// Code allowances stay at or below about 1.0 (from memory: HL-93's 0.33,
/// old railway impact formulas near 1.0 on the shortest spans); above 2 the
/// number is a typo (a percentage written as a fraction), and huge values
/// would overflow the forces (issue 22, item 12).
pub const MAX_IMPACT: f64 = 2.0;

/// Largest magnitude of a combination factor, rating load factor or sweep
/// scale factor: 100 (load factors in practice are below about 3; common
/// practice). Past it the input is refused, so no force can overflow.
pub const MAX_FACTOR: f64 = 100.0;

/// Parse and validate model text; a `vehicles_file` is read relative to
/// the current folder.
pub fn load_str(text: &str) -> Result<Converted, Diagnostics> {
    load_str_in(text, None)
}

/// Parse and validate model text read from a file in folder `dir`, which
/// a `vehicles_file` is relative to.
pub fn load_str_in(text: &str, dir: Option<&std::path::Path>) -> Result<Converted, Diagnostics> {
    load_str_deferred(text, dir).map(|(c, check)| check.apply(c))
}

/// [`load_str_in`] with the crossing-members check handed back to run
/// later (beside the analysis, say); see [`convert::CrossingCheck`].
pub fn load_str_deferred(
    text: &str,
    dir: Option<&std::path::Path>,
) -> Result<(Converted, convert::CrossingCheck), Diagnostics> {
    if text.trim().is_empty() {
        return Err(single("the model file is empty", None));
    }
    if text.len() > MAX_FILE_BYTES {
        return Err(single("the model file is larger than 2 GiB", None));
    }
    let mut file = crate::timing::stage("parse", || parse_str(text))?;
    let vehicles_path = loads::merge_vehicles_file(&mut file, dir)?;
    let (mut c, check) = crate::timing::stage("validate + convert", || {
        convert::convert_deferred(file, text)
    })?;
    c.vehicles_path = vehicles_path;
    Ok((c, check))
}

/// The syntax step of [`load_str`] alone: RON text to the schema types,
/// nothing converted or checked (public so benchmarks can time it apart).
/// Long `nodes` and `members` lists in the plain form are read by the fast
/// reader of [`bulk`], the rest by the RON parser; the result is the same.
pub fn parse_str(text: &str) -> Result<schema::ModelFile, Diagnostics> {
    merge_bulk(bulk::read(text), text)
}

fn merge_bulk(b: bulk::Bulk, text: &str) -> Result<schema::ModelFile, Diagnostics> {
    let mut file = crate::timing::stage("parse: RON", || {
        parse_ron(b.rest.as_deref().unwrap_or(text))
    })?;
    if let Some(nodes) = b.nodes {
        file.nodes = nodes;
    }
    if let Some(members) = b.members {
        file.members = members;
    }
    Ok(file)
}

/// [`parse_str`] with the fast reader's thresholds set (any list length,
/// pieces of `piece_bytes`), for tests comparing it with the RON parser.
#[doc(hidden)]
pub fn parse_str_fast(text: &str, piece_bytes: usize) -> Result<schema::ModelFile, Diagnostics> {
    merge_bulk(bulk::read_with(text, 0, piece_bytes), text)
}

/// RON text to the schema types by the RON parser alone.
#[doc(hidden)]
pub fn parse_ron(text: &str) -> Result<schema::ModelFile, Diagnostics> {
    let options = ron::Options::default()
        .with_default_extension(ron::extensions::Extensions::IMPLICIT_SOME)
        .with_recursion_limit(64);
    syntax::read(&options, text)
}

fn single(message: &str, location: Option<(usize, usize)>) -> Diagnostics {
    Diagnostics {
        errors: vec![Diagnostic {
            severity: Severity::Error,
            message: message.to_string(),
            location,
        }],
    }
}
