//! Turns the parsed file into a validated [`Model`]: resolves units,
//! interns ids, checks every reference and value. It collects every
//! problem it finds before giving up, so one run lists them all.

use super::diagnostics::{Diagnostic, Diagnostics, Locator, Severity};
use super::quantity::Quantity;
use super::schema::*;
use crate::geometry;
use crate::model::*;
use crate::units::{self, Dimension, DisplayUnits, Unit};
use std::collections::HashMap;
use std::fmt;

/// Ids of one kind to their indices. Fx hashing: ids are short and the
/// files are the engineer's own, so a keyed hash buys nothing and SipHash
/// costs a large share of loading a million-member model.
pub(super) type IdMap<'f> = rustc_hash::FxHashMap<&'f str, usize>;

/// `kind "id"` for a message, written only if a message is: building it
/// eagerly for every row of a million-member model would cost seconds.
pub(super) struct Named<'a>(pub &'a str, pub &'a str);

impl fmt::Display for Named<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{} \"{}\"", self.0, self.1)
    }
}

/// `kind "id" field` for a message, written only if a message is.
pub(super) struct Field<'a>(pub &'a str, pub &'a str, pub &'a str);

impl fmt::Display for Field<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{} \"{}\" {}", self.0, self.1, self.2)
    }
}

/// A converted model and the warnings found on the way.
pub struct Converted {
    pub model: Model,
    pub warnings: Vec<Diagnostic>,
    /// The `vehicles_file` read for this model, if any (the CLI refuses an
    /// `--out` naming it).
    pub vehicles_path: Option<std::path::PathBuf>,
}

/// A combination factor within ±[`super::MAX_FACTOR`].
fn plausible_factor(f: f64) -> bool {
    f.is_finite() && f.abs() <= super::MAX_FACTOR
}

fn bad_factor(combination: &str, case: &str, f: f64) -> String {
    format!(
        "combination \"{combination}\" factor on \"{case}\" must be a finite number from -{m} to {m}, not {f:?}",
        m = super::MAX_FACTOR
    )
}

/// Errors kept per model: a file with a million bad rows needs the first few.
pub const ERROR_LIMIT: usize = 200;

pub(super) struct Ctx<'a> {
    pub loc: Locator<'a>,
    pub errors: Vec<Diagnostic>,
    pub warnings: Vec<Diagnostic>,
}

impl<'a> Ctx<'a> {
    pub fn error(&mut self, message: String, location: Option<(usize, usize)>) {
        // Bound the list: a file with a million bad rows needs the first few.
        if self.errors.len() < ERROR_LIMIT {
            self.errors.push(Diagnostic {
                severity: Severity::Error,
                message,
                location,
            });
        }
    }

    /// Where `key: "value"` sits in the text, as [`Locator::field`]; `None`
    /// once the error list is full, since each search reads the whole text.
    pub fn locate(&self, key: &str, value: &str, nth: usize) -> Option<(usize, usize)> {
        if self.errors.len() < ERROR_LIMIT {
            self.loc.field(key, value, nth)
        } else {
            None
        }
    }

    pub fn warn(&mut self, message: String, location: Option<(usize, usize)>) {
        self.warnings.push(Diagnostic {
            severity: Severity::Warning,
            message,
            location,
        });
    }
}

/// The larger of the nodes' spans in x and y, and the two nodes at its
/// ends, checked against the size of real trusses.
fn warn_size(ctx: &mut Ctx, nodes: &[Node], u: &DisplayUnits) {
    let ends = |f: fn(&Node) -> f64| {
        let lo = (0..nodes.len()).min_by(|&a, &b| f(&nodes[a]).total_cmp(&f(&nodes[b])));
        let hi = (0..nodes.len()).max_by(|&a, &b| f(&nodes[a]).total_cmp(&f(&nodes[b])));
        lo.zip(hi)
            .map(|(lo, hi)| (f(&nodes[hi]) - f(&nodes[lo]), lo, hi))
    };
    let (Some(x), Some(y)) = (ends(|n| n.x), ends(|n| n.y)) else {
        return;
    };
    let (extent, a, b) = if x.0 >= y.0 { x } else { y };
    super::plausible::check_size(ctx, extent, &nodes[a].id, &nodes[b].id, u);
}

/// Reads a quantity that must be a finite number, reporting `what` on failure.
pub(super) fn value(
    ctx: &mut Ctx,
    q: &Quantity,
    dim: Dimension,
    units: &DisplayUnits,
    what: &dyn fmt::Display,
    at: Option<(usize, usize)>,
) -> Option<f64> {
    match q.to_si(dim, units.factor_for(dim)) {
        Ok(v) => Some(v),
        Err(e) => {
            ctx.error(format!("{what}: {e}"), at);
            None
        }
    }
}

/// As [`value`], and the value must be strictly positive.
pub(super) fn positive(
    ctx: &mut Ctx,
    q: &Quantity,
    dim: Dimension,
    units: &DisplayUnits,
    what: &dyn fmt::Display,
    at: Option<(usize, usize)>,
) -> Option<f64> {
    let v = value(ctx, q, dim, units, what, at)?;
    if v <= 0.0 {
        ctx.error(format!("{what} must be positive, not {}", q.show()), at);
        return None;
    }
    Some(v)
}

fn unit_of(ctx: &mut Ctx, name: &str, want: Dimension, field: &str) -> Unit {
    let at = ctx.loc.field(field, name, 0);
    match units::lookup(name) {
        Some(u) if u.dimension == want => u,
        Some(u) => {
            ctx.error(
                format!(
                    "units.{field}: \"{name}\" is a {} unit, not a {want} unit",
                    u.dimension
                ),
                at,
            );
            units::lookup("m").unwrap()
        }
        None => {
            ctx.error(
                format!(
                    "units.{field}: unknown unit \"{name}\" (use one of {})",
                    units::names_of(want).join(", ")
                ),
                at,
            );
            units::lookup("m").unwrap()
        }
    }
}

/// An id for a message: escaped, and cut short if very long.
pub(super) fn shown(name: &str) -> String {
    if name.chars().count() > 60 {
        format!(
            "{}…",
            name.chars().take(40).collect::<String>().escape_debug()
        )
    } else {
        name.escape_debug().to_string()
    }
}

/// Largest coordinate accepted, m: far beyond any structure, still well
/// inside the range where squared lengths stay accurate.
pub const MAX_COORDINATE: f64 = 1e8;

/// Most parallel eyebars in one member: old chords had up to a dozen or so.
pub const MAX_BARS: u32 = 64;

/// Longest id accepted, in characters: ids head table columns.
pub const MAX_ID_CHARS: usize = 256;

/// Interns ids of one kind, reporting duplicates and empty ids.
pub(super) fn intern<'f, T>(
    ctx: &mut Ctx,
    kind: &str,
    items: &'f [T],
    id: impl Fn(&'f T) -> &'f str,
) -> IdMap<'f> {
    let mut map = IdMap::with_capacity_and_hasher(items.len(), Default::default());
    let mut seen: HashMap<&str, usize> = HashMap::new();
    for (i, item) in items.iter().enumerate() {
        let name = id(item);
        if name.trim().is_empty() {
            ctx.error(format!("{kind} number {} has an empty id", i + 1), None);
            continue;
        }
        if name.chars().count() > MAX_ID_CHARS {
            ctx.error(
                format!(
                    "{kind} number {} has an id of {} characters (\"{}…\"); ids are at most {MAX_ID_CHARS}",
                    i + 1,
                    name.chars().count(),
                    name.chars().take(24).collect::<String>().escape_debug()
                ),
                None,
            );
        } else if crate::textsafe::has_unsafe(name) {
            ctx.error(
                format!(
                    "{kind} number {} id \"{}\" contains a control character or a bidirectional mark (newline, tab, ESC, U+202E ...); ids must print on one line as written",
                    i + 1,
                    name.escape_debug()
                ),
                None,
            );
        }
        if map.insert(name, i).is_some() {
            let n = seen.entry(name).or_insert(0);
            *n += 1;
            let at = ctx.locate("id", name, *n);
            ctx.error(format!("duplicate {kind} id \"{}\"", shown(name)), at);
        }
    }
    map
}

/// Ids of a long list, checked now and mapped only when first looked up:
/// a million-member model whose loads name no member never builds the map.
/// If any id has a problem the map is built at once by [`intern`], which
/// reports every problem in file order.
pub(super) struct LazyIds<'f, T> {
    items: &'f [T],
    id: fn(&'f T) -> &'f str,
    map: std::cell::OnceCell<IdMap<'f>>,
}

impl<'f, T: Sync> LazyIds<'f, T> {
    pub fn new(ctx: &mut Ctx, kind: &str, items: &'f [T], id: fn(&'f T) -> &'f str) -> Self {
        let lazy = LazyIds {
            items,
            id,
            map: std::cell::OnceCell::new(),
        };
        if !Self::all_good(items, id) {
            let _ = lazy.map.set(intern(ctx, kind, items, id));
        }
        lazy
    }

    /// Every id printable, at most [`MAX_ID_CHARS`] long and unique: checked
    /// on all cores, uniqueness by sorting 64-bit hashes and comparing the
    /// ids of equal hashes.
    fn all_good(items: &'f [T], id: fn(&'f T) -> &'f str) -> bool {
        use rayon::prelude::*;
        use std::hash::BuildHasher;
        let good = |name: &str| {
            !name.trim().is_empty()
                && name.chars().count() <= MAX_ID_CHARS
                && !crate::textsafe::has_unsafe(name)
        };
        let hasher = rustc_hash::FxBuildHasher;
        let mut hashes: Vec<(u64, u32)> = match items
            .par_iter()
            .enumerate()
            .map(|(i, item)| {
                let name = id(item);
                good(name).then(|| (hasher.hash_one(name), i as u32))
            })
            .collect::<Option<Vec<_>>>()
        {
            Some(h) => h,
            None => return false,
        };
        hashes.par_sort_unstable();
        !hashes
            .par_windows(2)
            .any(|w| w[0].0 == w[1].0 && id(&items[w[0].1 as usize]) == id(&items[w[1].1 as usize]))
    }

    /// The index of the item with this id.
    pub fn get(&self, name: &str) -> Option<usize> {
        self.map
            .get_or_init(|| {
                let mut map = IdMap::with_capacity_and_hasher(self.items.len(), Default::default());
                for (i, item) in self.items.iter().enumerate() {
                    map.insert((self.id)(item), i);
                }
                map
            })
            .get(name)
            .copied()
    }
}

fn reference(
    ctx: &mut Ctx,
    map: &IdMap,
    kind: &str,
    name: &str,
    field: &str,
    owner: &dyn fmt::Display,
) -> Option<usize> {
    match map.get(name) {
        Some(&i) => Some(i),
        None => {
            let at = ctx.locate(field, name, 0);
            ctx.error(
                format!(
                    "{owner} refers to {kind} \"{}\", which is not defined",
                    shown(name)
                ),
                at,
            );
            None
        }
    }
}

/// What a member row needs to be resolved without any message.
struct PlainRefs<'a, 'f> {
    nodes: &'a [Node],
    node_ids: &'a IdMap<'f>,
    section_ids: &'a IdMap<'f>,
    material_ids: &'a IdMap<'f>,
    /// The zero-length tolerance, if the node values were all good.
    tol: Option<f64>,
}

impl PlainRefs<'_, '_> {
    /// The member of a row with nothing to report: all four references
    /// found, two distinct nodes, a length above the tolerance, default or
    /// good effective-length factors and no unbraced lengths. `None` sends
    /// the row through the full checks, which report what is wrong.
    fn member(&self, m: &MemberFile) -> Option<Member> {
        let start = *self.node_ids.get(m.start.as_str())?;
        let end = *self.node_ids.get(m.end.as_str())?;
        let section = *self.section_ids.get(m.section.as_str())?;
        let material = *self.material_ids.get(m.material.as_str())?;
        let (a, b) = (&self.nodes[start], &self.nodes[end]);
        if start == end || (b.x - a.x).hypot(b.y - a.y) <= self.tol? {
            return None;
        }
        let good = |k: Option<f64>| match k {
            None => Some(1.0),
            Some(k) if k.is_finite() && k > 0.0 => Some(k),
            Some(_) => None,
        };
        if m.unbraced_in.is_some() || m.unbraced_out.is_some() || m.slack.is_some() {
            return None;
        }
        let bars = match m.bars {
            None => 1,
            Some(n) if (1..=MAX_BARS).contains(&n) => n,
            Some(_) => return None,
        };
        Some(Member {
            id: m.id.clone(),
            start,
            end,
            section,
            material,
            k_in: good(m.k_in)?,
            k_out: good(m.k_out)?,
            unbraced_in: None,
            unbraced_out: None,
            tension_only: m.tension_only,
            bars,
        })
    }
}

pub fn convert(file: ModelFile, text: &str) -> Result<Converted, Diagnostics> {
    convert_deferred(file, text).map(|(c, check)| check.apply(c))
}

/// The crossing-members check of [`convert`], kept apart: it only warns,
/// and on a large model it is one of the longer checks (0.3 s at 10⁶ DOF),
/// so a caller that analyses the model next can run it beside the
/// analysis. Its warnings come after all others, as from [`convert`].
pub struct CrossingCheck {
    tol: f64,
}

impl CrossingCheck {
    /// `c` with this check's warnings added after its own.
    pub fn apply(&self, mut c: Converted) -> Converted {
        c.warnings.extend(self.run(&c.model));
        c
    }

    /// Warnings for members that cross without a shared node: the first
    /// few pairs by name, then a count of the rest.
    pub fn run(&self, model: &Model) -> Vec<Diagnostic> {
        let crossings = crate::timing::stage("crossing members", || {
            geometry::crossing_members(model, self.tol)
        });
        let shown = 5;
        let warn = |message| Diagnostic {
            severity: Severity::Warning,
            message,
            location: None,
        };
        let mut out: Vec<Diagnostic> = crossings
            .iter()
            .take(shown)
            .map(|&(a, b)| {
                warn(format!(
                    "members \"{}\" and \"{}\" cross without a shared node",
                    model.members[a].id, model.members[b].id
                ))
            })
            .collect();
        if crossings.len() > shown {
            out.push(warn(format!(
                "{} more pairs of members cross without a shared node",
                crossings.len() - shown
            )));
        }
        out
    }
}

/// [`convert`] without the crossing-members check, which is handed back to
/// run when the caller chooses.
pub fn convert_deferred(
    file: ModelFile,
    text: &str,
) -> Result<(Converted, CrossingCheck), Diagnostics> {
    let mut lap = crate::timing::Lap::new("convert");
    let mut ctx = Ctx {
        loc: Locator::new(text),
        errors: Vec::new(),
        warnings: Vec::new(),
    };
    let units = DisplayUnits {
        length: unit_of(&mut ctx, &file.units.length, Dimension::Length, "length"),
        force: unit_of(&mut ctx, &file.units.force, Dimension::Force, "force"),
        section: unit_of(&mut ctx, &file.units.section, Dimension::Length, "section"),
        stress: unit_of(&mut ctx, &file.units.stress, Dimension::Stress, "stress"),
    };
    if !ctx.errors.is_empty() {
        return Err(Diagnostics { errors: ctx.errors });
    }
    let u = &units;

    // Materials.
    let material_ids = intern(&mut ctx, "material", &file.materials, |m| &m.id);
    let mut materials = Vec::with_capacity(file.materials.len());
    for m in &file.materials {
        let at = ctx.loc.field("id", &m.id, 0);
        let what = |f: &str| format!("material \"{}\" {f}", m.id);
        let e = positive(&mut ctx, &m.e, Dimension::Stress, u, &what("e"), at);
        let opt = |ctx: &mut Ctx, q: &Option<Quantity>, dim, f: &str| {
            q.as_ref()
                .and_then(|q| positive(ctx, q, dim, u, &what(f), at))
        };
        let mut fy = opt(&mut ctx, &m.fy, Dimension::Stress, "fy");
        let mut fu = opt(&mut ctx, &m.fu, Dimension::Stress, "fu");
        if let Some(year) = m.year {
            if !(1800..=2100).contains(&year) {
                ctx.error(
                    format!(
                        "material \"{}\" year {year} is not a plausible year of construction (1800 to 2100)",
                        m.id
                    ),
                    at,
                );
            } else {
                // MBE Table 6A.6.2.1-1: steel of unknown grade by year.
                let (y, t, _) = crate::method::steel_year::strengths(year);
                fy = fy.or(Some(y));
                fu = fu.or(Some(t));
            }
        }
        let density = opt(&mut ctx, &m.density, Dimension::Density, "density");
        let alpha = m.alpha.as_ref().and_then(|q| {
            value(
                &mut ctx,
                q,
                Dimension::PerTemperature,
                u,
                &what("alpha"),
                at,
            )
        });
        if let (Some(fy), Some(fu)) = (fy, fu) {
            if fu < fy {
                ctx.warn(
                    format!("material \"{}\": fu is below fy; check the values", m.id),
                    at,
                );
            }
        }
        super::plausible::check_material(
            &mut ctx,
            &m.id,
            [
                (&super::plausible::E, e),
                (&super::plausible::FY, fy),
                (&super::plausible::FU, fu),
                (&super::plausible::DENSITY, density),
            ],
            u,
            at,
        );
        materials.push(Material {
            id: m.id.clone(),
            e: e.unwrap_or(1.0),
            fy,
            fu,
            density,
            alpha,
            year: m.year.filter(|_| m.fy.is_none() || m.fu.is_none()),
        });
    }

    // Sections.
    let section_ids = intern(&mut ctx, "section", &file.sections, |s| &s.id);
    let mut sections = Vec::with_capacity(file.sections.len());
    for s in &file.sections {
        sections.push(super::sections::convert_section(&mut ctx, s, u));
    }

    lap.mark("materials and sections");
    // Nodes.
    let node_ids = intern(&mut ctx, "node", &file.nodes, |n| n.id.as_str());
    let mut nodes = Vec::with_capacity(file.nodes.len());
    for n in &file.nodes {
        let at = || None;
        let x = value(
            &mut ctx,
            &n.x,
            Dimension::Length,
            u,
            &Field("node", &n.id, "x"),
            at(),
        );
        let y = value(
            &mut ctx,
            &n.y,
            Dimension::Length,
            u,
            &Field("node", &n.id, "y"),
            at(),
        );
        for (axis, v) in [("x", x), ("y", y)] {
            if v.is_some_and(|v| v.abs() > MAX_COORDINATE) {
                let at = ctx.loc.field("id", &n.id, 0);
                ctx.error(
                    format!(
                        "node \"{}\" coordinate {axis} = {} {} is beyond ±{} {}; check the value and the length unit",
                        shown(&n.id),
                        crate::units::plain(v.unwrap_or(0.0) / u.length.to_si),
                        u.length.name,
                        crate::units::plain(MAX_COORDINATE / u.length.to_si),
                        u.length.name,
                    ),
                    at,
                );
            }
        }
        nodes.push(Node {
            id: n.id.to_string(),
            x: x.unwrap_or(0.0),
            y: y.unwrap_or(0.0),
        });
    }
    if file.nodes.is_empty() {
        ctx.error("the model has no nodes".into(), None);
    }
    let values_ok = ctx.errors.is_empty();
    if values_ok {
        warn_size(&mut ctx, &nodes, u);
    }
    lap.mark("nodes");
    let tol = geometry::tolerance(&nodes);
    if values_ok {
        for (a, b) in geometry::coincident_nodes(&nodes, tol) {
            let at = ctx.locate("id", &nodes[b].id, 0);
            ctx.error(
                format!(
                    "nodes \"{}\" and \"{}\" are at the same place; join them into one node",
                    nodes[a].id, nodes[b].id
                ),
                at,
            );
        }
    }

    lap.mark("coincident nodes");
    // Members: every plain row is resolved on all cores first (its four
    // references found, nothing to report); rows with anything to say go
    // through the full checks below, in file order, as before. The member
    // ids are interned meanwhile.
    let (member_ids, plain) = rayon::join(
        || {
            crate::timing::stage("convert: member ids (beside the rows)", || {
                LazyIds::new(&mut ctx, "member", &file.members, |m| m.id.as_str())
            })
        },
        || {
            use rayon::prelude::*;
            let refs = PlainRefs {
                nodes: &nodes,
                node_ids: &node_ids,
                section_ids: &section_ids,
                material_ids: &material_ids,
                tol: values_ok.then_some(tol),
            };
            crate::timing::stage("convert: plain member rows", || {
                file.members
                    .par_iter()
                    .map(|m| refs.member(m))
                    .collect::<Vec<Option<Member>>>()
            })
        },
    );
    lap.mark("members: join");
    // Usually every row is plain: then the members are moved out on all
    // cores (at 10⁶ DOF, 2·10⁶ rows into fresh pages) and the loop below,
    // which keeps file order for the rows it checks, has nothing to do.
    let (mut members, plain) = if plain.iter().all(Option::is_some) {
        use rayon::prelude::*;
        let all: Vec<Member> = plain
            .into_par_iter()
            .map(|m| m.expect("every row is plain"))
            .collect();
        (all, Vec::new())
    } else {
        (Vec::with_capacity(file.members.len()), plain)
    };
    let mut slack = Vec::new();
    for (m, plain) in file.members.iter().zip(plain) {
        if let Some(member) = plain {
            members.push(member);
            continue;
        }
        let owner = Named("member", &m.id);
        let start = reference(&mut ctx, &node_ids, "node", &m.start, "start", &owner);
        let end = reference(&mut ctx, &node_ids, "node", &m.end, "end", &owner);
        let section = reference(
            &mut ctx,
            &section_ids,
            "section",
            &m.section,
            "section",
            &owner,
        );
        let material = reference(
            &mut ctx,
            &material_ids,
            "material",
            &m.material,
            "material",
            &owner,
        );
        if let (Some(s), Some(e), Some(sec), Some(mat)) = (start, end, section, material) {
            // Located only on error: a search of the whole text per member
            // would make loading quadratic in the model size.
            if s == e {
                let at = ctx.locate("id", &m.id, 0);
                ctx.error(
                    format!("{owner} starts and ends at the same node \"{}\"", m.start),
                    at,
                );
                continue;
            }
            let l = (nodes[e].x - nodes[s].x).hypot(nodes[e].y - nodes[s].y);
            if values_ok && l <= tol {
                let at = ctx.locate("id", &m.id, 0);
                ctx.error(format!("{owner} has zero length"), at);
                continue;
            }
            let at = None;
            let factor = |ctx: &mut Ctx, k: Option<f64>, name: &str| match k {
                Some(k) if !(k.is_finite() && k > 0.0) => {
                    ctx.error(
                        format!("{owner} {name} must be a positive number, not {k}"),
                        at,
                    );
                    1.0
                }
                Some(k) => k,
                None => 1.0,
            };
            let k_in = factor(&mut ctx, m.k_in, "k_in");
            let k_out = factor(&mut ctx, m.k_out, "k_out");
            let len = |ctx: &mut Ctx, q: &Option<Quantity>, name: &str| {
                q.as_ref().and_then(|q| {
                    positive(
                        ctx,
                        q,
                        Dimension::Length,
                        u,
                        &Field("member", &m.id, name),
                        at,
                    )
                })
            };
            let unbraced_in = len(&mut ctx, &m.unbraced_in, "unbraced_in");
            let unbraced_out = len(&mut ctx, &m.unbraced_out, "unbraced_out");
            if let Some(q) = &m.slack {
                let what = Field("member", &m.id, "slack");
                let at = ctx.locate("id", &m.id, 0);
                if !m.tension_only {
                    ctx.error(
                        format!("{what} is given but the member is not tension_only: true; only a tension-only member (rod, eyebar, counter) can be slack"),
                        at,
                    );
                } else if let Some(v) = value(&mut ctx, q, Dimension::Length, u, &what, at) {
                    if v.abs() >= 0.1 * l {
                        let (sec, len) = (u.section, u.length);
                        ctx.error(
                            format!(
                                "{what} {} {} is not less than a tenth of the member's length {} {}; give the slack or draw-up of the turnbuckle, not a length",
                                crate::units::plain(v / sec.to_si),
                                sec.name,
                                crate::units::plain(l / len.to_si),
                                len.name
                            ),
                            at,
                        );
                    } else if v != 0.0 {
                        slack.push((members.len(), v));
                    }
                }
            }
            let bars = match m.bars {
                None => 1,
                Some(n) if (1..=MAX_BARS).contains(&n) => n,
                Some(n) => {
                    let at = ctx.locate("id", &m.id, 0);
                    ctx.error(
                        format!("{owner} bars must be a count of parallel eyebars from 1 to {MAX_BARS}, not {n}"),
                        at,
                    );
                    1
                }
            };
            members.push(Member {
                id: m.id.clone(),
                start: s,
                end: e,
                section: sec,
                material: mat,
                k_in,
                k_out,
                unbraced_in,
                unbraced_out,
                tension_only: m.tension_only,
                bars,
            });
        }
    }
    if file.members.is_empty() {
        ctx.error("the model has no members".into(), None);
    }

    lap.mark("members");
    // Supports.
    let mut supports = Vec::with_capacity(file.supports.len());
    let mut supported = vec![false; nodes.len()];
    for s in &file.supports {
        let Some(node) = reference(&mut ctx, &node_ids, "node", &s.node, "node", &"a support")
        else {
            continue;
        };
        if supported[node] {
            let at = ctx.locate("node", &s.node, 1);
            ctx.error(format!("node \"{}\" has more than one support", s.node), at);
            continue;
        }
        supported[node] = true;
        let restraint = match &s.kind {
            SupportKindFile::Pin => Restraint::Pin,
            SupportKindFile::Roller => Restraint::Roller,
            SupportKindFile::InclinedRoller { angle } => {
                let what = format!("inclined roller at node \"{}\" angle", s.node);
                match value(&mut ctx, angle, Dimension::Angle, u, &what, None) {
                    // Beyond one turn either way the number is a mistake
                    // (1e300° used to be accepted; issue 22, item 16).
                    Some(a) if a.abs() <= 2.0 * std::f64::consts::PI => {
                        Restraint::InclinedRoller { angle: a }
                    }
                    Some(a) => {
                        let at = ctx.loc.field("node", &s.node, 0);
                        ctx.error(
                            format!("{what} {:.3e}° is beyond ±360°", a.to_degrees()),
                            at,
                        );
                        continue;
                    }
                    None => continue,
                }
            }
        };
        supports.push(Support { node, restraint });
    }
    if file.supports.is_empty() {
        ctx.error(
            "the model has no supports; add at least a Pin and a Roller".into(),
            None,
        );
    }

    // Members meeting at each node, for warnings and load checks.
    let mut degree = vec![0usize; nodes.len()];
    for m in &members {
        degree[m.start] += 1;
        degree[m.end] += 1;
    }

    lap.mark("supports");
    // Load cases.
    let case_ids = intern(&mut ctx, "load case", &file.load_cases, |c| &c.id);
    let mut cases = Vec::with_capacity(file.load_cases.len());
    let parts = super::loads::Parts {
        units: u,
        nodes: &nodes,
        members: &members,
        sections: &sections,
        materials: &materials,
        member_ids: &member_ids,
        members_ok: members.len() == file.members.len(),
    };
    for c in &file.load_cases {
        let kind = match c.kind {
            Some(CaseKindFile::Dead) => CaseKind::Dead,
            Some(CaseKindFile::Wearing) => CaseKind::Wearing,
            Some(CaseKindFile::Live) => CaseKind::Live,
            Some(CaseKindFile::Other) | None => CaseKind::Other,
        };
        let impact = c.impact.unwrap_or(0.0);
        if !(impact.is_finite() && (0.0..=super::MAX_IMPACT).contains(&impact)) {
            let at = ctx.loc.field("id", &c.id, 0);
            ctx.error(
                format!(
                    "case \"{}\" impact must be a fraction from 0 to {} (0.10 for 10 %), not {impact:?}",
                    c.id,
                    super::MAX_IMPACT
                ),
                at,
            );
        } else if impact > 0.0 && kind != CaseKind::Live {
            let at = ctx.loc.field("id", &c.id, 0);
            ctx.warn(
                format!(
                    "case \"{}\" has an impact allowance but is not a Live case; it is ignored",
                    c.id
                ),
                at,
            );
        }
        if c.legal == Some(true) && kind != CaseKind::Live {
            let at = ctx.loc.field("id", &c.id, 0);
            ctx.error(
                format!(
                    "case \"{}\" is marked legal but is not a Live case; only live loads are rated as legal loads",
                    c.id
                ),
                at,
            );
        }
        let mut case = LoadCase {
            id: c.id.clone(),
            kind,
            impact: if kind == CaseKind::Live { impact } else { 0.0 },
            legal: c.legal == Some(true),
            ..Default::default()
        };
        let owner = format!("a load in case \"{}\"", c.id);
        for l in &c.loads {
            let Some(node) = reference(&mut ctx, &node_ids, "node", &l.node, "node", &owner) else {
                continue;
            };
            let what = |f: &str| format!("load on node \"{}\" in case \"{}\" {f}", l.node, c.id);
            let fx = l.fx.as_ref().map_or(Some(0.0), |q| {
                value(&mut ctx, q, Dimension::Force, u, &what("fx"), None)
            });
            let fy = l.fy.as_ref().map_or(Some(0.0), |q| {
                value(&mut ctx, q, Dimension::Force, u, &what("fy"), None)
            });
            if degree[node] == 0 && !supported[node] {
                let at = ctx.locate("node", &l.node, 0);
                ctx.error(
                    format!(
                        "case \"{}\" loads node \"{}\", which no member meets",
                        c.id, l.node
                    ),
                    at,
                );
            }
            if let (Some(fx), Some(fy)) = (fx, fy) {
                case.nodal.push(NodalLoad { node, fx, fy });
            }
        }
        let owner = format!("a settlement in case \"{}\"", c.id);
        for s in &c.settlements {
            let Some(node) = reference(&mut ctx, &node_ids, "node", &s.node, "node", &owner) else {
                continue;
            };
            if !supported[node] {
                let at = ctx.locate("node", &s.node, 0);
                ctx.error(
                    format!(
                        "case \"{}\" settles node \"{}\", which has no support",
                        c.id, s.node
                    ),
                    at,
                );
                continue;
            }
            let what =
                |f: &str| format!("settlement of node \"{}\" in case \"{}\" {f}", s.node, c.id);
            let f = u.section.to_si;
            let read = |ctx: &mut Ctx, q: &Option<Quantity>, name: &str| {
                q.as_ref().map_or(Some(0.0), |q| {
                    q.to_si(Dimension::Length, f)
                        .map_err(|e| ctx.error(format!("{}: {e}", what(name)), None))
                        .ok()
                })
            };
            let dx = read(&mut ctx, &s.dx, "dx");
            let dy = read(&mut ctx, &s.dy, "dy");
            if let (Some(dx), Some(dy)) = (dx, dy) {
                case.settlements.push(Settlement { node, dx, dy });
            }
        }
        super::loads::case_loads(&mut ctx, c, &mut case, &parts);
        cases.push(case);
    }
    let carries: Vec<bool> = (0..nodes.len())
        .map(|i| degree[i] > 0 || supported[i])
        .collect();
    let live = super::loads::live_loads(&mut ctx, &file, &parts, &node_ids, &carries);
    let fatigue = super::fatigue::settings(&mut ctx, &file, &live);
    let stability = super::stability::convert(&mut ctx, &file.stability, &node_ids, u, &materials);
    let pins = if file.pins.is_empty() || members.len() != file.members.len() {
        Vec::new()
    } else {
        let lookup = |id: &str| member_ids.get(id);
        let pc = super::pins::Context {
            units: u,
            node_ids: &node_ids,
            member_ids: &lookup,
            members: &members,
            materials: &materials,
            cases: &cases,
            supported: &supported,
            deck: &live.deck,
        };
        super::pins::convert(&mut ctx, &file.pins, &pc)
    };
    let gussets = super::joints::convert(&mut ctx, &file.gusset_joints, &node_ids, &parts);

    // Combinations.
    let _ = intern(&mut ctx, "combination", &file.combinations, |c| &c.id);
    let mut combinations = Vec::with_capacity(file.combinations.len());
    for c in &file.combinations {
        let at = ctx.loc.field("id", &c.id, 0);
        if case_ids.contains_key(c.id.as_str()) {
            ctx.error(
                format!("combination \"{}\" has the id of a load case", c.id),
                at,
            );
        }
        let mut factors = Vec::with_capacity(c.factors.len());
        let mut moving = Vec::new();
        for (case, f) in &c.factors {
            if let Some(k) = live.moving.iter().position(|ml| &ml.id == case) {
                if plausible_factor(*f) {
                    moving.push((k, *f));
                } else {
                    ctx.error(bad_factor(&c.id, case, *f), at);
                }
                continue;
            }
            if file.moving_loads.iter().any(|ml| &ml.id == case) {
                // A moving load the file declares but that has its own error
                // (an undefined vehicle, say): that error was reported once.
                continue;
            }
            match case_ids.get(case.as_str()) {
                Some(&i) if plausible_factor(*f) => factors.push((i, *f)),
                Some(_) => ctx.error(bad_factor(&c.id, case, *f), at),
                None => ctx.error(
                    format!(
                        "combination \"{}\" refers to load case \"{case}\", which is not defined (nor is a moving load of that id)",
                        c.id
                    ),
                    at,
                ),
            }
        }
        if c.factors.is_empty() {
            ctx.error(format!("combination \"{}\" has no factors", c.id), at);
        }
        if moving.len() > 1 {
            ctx.error(
                format!(
                    "combination \"{}\" names more than one moving load; give one per combination",
                    c.id
                ),
                at,
            );
        }
        combinations.push(Combination {
            id: c.id.clone(),
            factors,
            moving,
        });
    }

    // Rating settings.
    let rating = match &file.rating {
        Some(r) => super::rating::convert_rating(&mut ctx, r),
        None => RatingSettings::default(),
    };

    if !ctx.errors.is_empty() {
        return Err(Diagnostics { errors: ctx.errors });
    }

    lap.mark("loads and settings");
    // Warnings: isolated nodes here, members crossing without a joint in
    // [`CrossingCheck`].
    // Only the first few are located: each search reads the whole text.
    let mut isolated = 0;
    for (i, n) in nodes.iter().enumerate() {
        if degree[i] == 0 {
            isolated += 1;
            let at = if isolated <= ERROR_LIMIT {
                ctx.loc.field("id", &n.id, 0)
            } else {
                None
            };
            ctx.warn(format!("node \"{}\" has no member", n.id), at);
        }
    }
    // Free text: control characters and bidirectional marks are removed
    // (they would reach the terminal, HTML and SVG), with a warning.
    let mut title = file.title.unwrap_or_default();
    if crate::textsafe::has_unsafe(&title) {
        title = crate::textsafe::strip(&title);
        ctx.warn(
            "title: control characters and bidirectional marks removed".into(),
            None,
        );
    }
    let model = Model {
        title,
        units,
        materials,
        sections,
        nodes,
        members,
        supports,
        cases,
        combinations,
        rating,
        live,
        fatigue,
        stability,
        slack,
        pins,
        gussets,
    };
    lap.mark("isolated nodes");
    Ok((
        Converted {
            model,
            warnings: ctx.warnings,
            vehicles_path: None,
        },
        CrossingCheck { tol },
    ))
}
