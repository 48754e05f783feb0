//! Starting layouts for common truss families, so a rating job can begin from
//! a correct, statically determinate geometry instead of hand-typed
//! coordinates. The layouts carry only geometry, topology, supports and an
//! optional panel-point load; sections and material are placeholders that the
//! input layer writes out and the user edits before use.
//!
//! Conventions shared by every family (except the benchmark [`lattice`]):
//!
//! * bottom panel points `L0`…`Ln` at `x = i·w`, `y = 0`;
//! * top panel points `U1`…`U(n−1)` directly above the bottom point with the
//!   same number (the Warren truss without verticals is the exception, see
//!   [`Family::Warren`]);
//! * each member is named `A-B` after its start and end nodes; chords run
//!   left to right, verticals bottom to top, inclined members from their left
//!   end to their right end;
//! * `Pin` at `L0`, `Roller` at `Ln`;
//! * the optional panel load `P` acts downward (`fy = −P`) at every interior
//!   bottom panel point `L1`…`L(n−1)`, in the load case `"panel"`.

mod kbraced;
mod lattice;
mod parallel;
mod polygonal;

pub use lattice::lattice;
pub use polygonal::DEFAULT_END_HEIGHT_RATIO;

/// A truss family that [`generate`] can lay out.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Family {
    /// Parallel chords, verticals at `L1`…`L(n−1)`, inclined end posts
    /// `L0-U1` and `U(n−1)-Ln`, and one diagonal per interior panel running
    /// down from the top of a vertical towards mid-span (tension under
    /// gravity).
    Pratt,
    /// As [`Family::Pratt`], but the diagonals run down towards the supports
    /// (compression under gravity).
    Howe,
    /// Triangulated web without verticals. The top panel points sit over the
    /// middle of the bottom panels: `Uk` is above the midpoint of panel `k`,
    /// between `L(k−1)` and `Lk`, at `x = (k − ½)·w`, for `k = 1…n`.
    Warren,
    /// Parallel chords with verticals at `L1`…`L(n−1)`; the end posts and the
    /// diagonals alternate in direction panel by panel. The alternation starts
    /// from both ends, so the layout is symmetric for an even panel count; for
    /// an odd count the centre panel repeats the direction of its left
    /// neighbour.
    WarrenVerticals,
    /// Pratt web with the top panel points on a curve: by default a parabola
    /// through `height` at mid-span and [`DEFAULT_END_HEIGHT_RATIO`]`·height`
    /// at the two bearings (`x = 0` and `x = n·w`), sampled at the panel
    /// points; or the heights given in [`GenerateOptions::top_heights`].
    Polygonal,
    /// Parallel chords, even panel count ≥ 4. The end panels are plain
    /// triangles (end post, vertical, bottom chord). Every vertical except the
    /// one at mid-span is split at mid-height by a node `Mi`; in each interior
    /// panel two half-diagonals run from the top and bottom of the vertical
    /// nearer mid-span and meet at the `M` node of the vertical nearer the
    /// support, so each "K" opens towards mid-span. The centre vertical
    /// `L(n/2)-U(n/2)` is not split.
    KBraced,
}

const FAMILY_NAMES: [&str; 6] = [
    "pratt",
    "howe",
    "warren",
    "warren-verticals",
    "polygonal",
    "k-braced",
];

const FAMILIES: [Family; 6] = [
    Family::Pratt,
    Family::Howe,
    Family::Warren,
    Family::WarrenVerticals,
    Family::Polygonal,
    Family::KBraced,
];

impl Family {
    /// The family for a command-line style name (see [`Family::names`]);
    /// case-insensitive, surrounding whitespace ignored.
    pub fn from_name(s: &str) -> Option<Family> {
        let s = s.trim();
        FAMILY_NAMES
            .iter()
            .position(|n| n.eq_ignore_ascii_case(s))
            .map(|i| FAMILIES[i])
    }

    /// All accepted family names, in a fixed order.
    pub fn names() -> &'static [&'static str] {
        &FAMILY_NAMES
    }

    /// The short name accepted by [`Family::from_name`].
    pub fn name(self) -> &'static str {
        FAMILY_NAMES[FAMILIES.iter().position(|f| *f == self).unwrap_or(0)]
    }

    /// A human-readable label used in titles and messages.
    pub fn label(self) -> &'static str {
        match self {
            Family::Pratt => "Pratt truss",
            Family::Howe => "Howe truss",
            Family::Warren => "Warren truss",
            Family::WarrenVerticals => "Warren truss with verticals",
            Family::Polygonal => "Polygonal-chord Pratt truss",
            Family::KBraced => "K-braced truss",
        }
    }

    /// Smallest panel count the family accepts.
    pub fn min_panels(self) -> usize {
        match self {
            Family::KBraced => 4,
            _ => 2,
        }
    }
}

/// Unit system of a generated model.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum UnitSystem {
    /// ft, kip; sections in in; stresses in ksi.
    Us,
    /// m, kN; sections in mm; stresses in MPa.
    Si,
}

impl UnitSystem {
    /// Length unit of node coordinates.
    pub fn length_unit(self) -> &'static str {
        match self {
            UnitSystem::Us => "ft",
            UnitSystem::Si => "m",
        }
    }

    /// Force unit of loads.
    pub fn force_unit(self) -> &'static str {
        match self {
            UnitSystem::Us => "kip",
            UnitSystem::Si => "kN",
        }
    }
}

/// What to generate.
#[derive(Clone, Debug, PartialEq)]
pub struct GenerateOptions {
    pub family: Family,
    /// Number of bottom-chord panels `n`.
    pub panels: usize,
    /// Bottom-chord panel length `w`.
    pub panel_width: f64,
    /// Depth between chord centrelines (for [`Family::Polygonal`], the depth
    /// at mid-span of the default parabola).
    pub height: f64,
    /// Downward load `P` at every interior bottom panel point, case `"panel"`.
    pub panel_load: Option<f64>,
    pub units: UnitSystem,
    /// [`Family::Polygonal`] only: heights of `U1`…`U(n−1)` above the bottom
    /// chord. `None` selects the default parabola. Giving heights for any
    /// other family is an error.
    pub top_heights: Option<Vec<f64>>,
}

/// A generated truss: geometry, topology, supports and the optional panel
/// load case. Sections and material are left to the writer as placeholders.
#[derive(Clone, Debug, PartialEq)]
pub struct TrussLayout {
    pub title: String,
    /// One-line description for the top of the written model.
    pub comment: String,
    pub units: UnitSystem,
    /// `(id, x, y)`.
    pub nodes: Vec<(String, f64, f64)>,
    /// `(id, start, end, section id "chord" | "web")`.
    pub members: Vec<(String, String, String, &'static str)>,
    /// `(node, "Pin" | "Roller")`.
    pub supports: Vec<(String, &'static str)>,
    /// Case `"panel"`: `(node, fy)`, `fy` negative for downward loads. Empty
    /// when no load was asked for.
    pub loads: Vec<(String, f64)>,
}

/// Most panels `new` generates: a real truss has tens, at most a few
/// hundred; 100,000 panels is already a 400,000-DOF model (the benchmark
/// lattice has its own generator). Past it: an error, not an allocation
/// that aborts (issue 22, item 9).
pub const MAX_PANELS: usize = 100_000;

/// Why a layout could not be generated.
#[derive(thiserror::Error, Debug, Clone, PartialEq)]
pub enum GenerateError {
    #[error("a {family} needs at least {min} panels, got {got}")]
    TooFewPanels {
        family: &'static str,
        min: usize,
        got: usize,
    },
    #[error("at most {max} panels can be generated, got {got}")]
    TooManyPanels { max: usize, got: usize },
    #[error("the truss would reach {extent:.3e} m, beyond the loader's ±{max:.0e} m coordinate bound; check the panel width, span or height and the units")]
    TooLarge { extent: f64, max: f64 },
    #[error("a K-braced truss needs an even number of panels, got {got}")]
    OddPanelCount { got: usize },
    #[error("panel width must be a positive finite number, got {0}")]
    InvalidPanelWidth(f64),
    #[error("height must be a positive finite number, got {0}")]
    InvalidHeight(f64),
    #[error("panel load must be a finite number, got {0}")]
    InvalidPanelLoad(f64),
    #[error("top heights are only used by the polygonal family, not by a {family}")]
    TopHeightsNotApplicable { family: &'static str },
    #[error("{panels} panels need {expected} top heights (U1 to U{expected}), got {got}")]
    TopHeightsLength {
        panels: usize,
        expected: usize,
        got: usize,
    },
    #[error("top height of U{node} must be a positive finite number, got {value}")]
    InvalidTopHeight { node: usize, value: f64 },
}

/// Lay out a truss of the requested family.
///
/// # Errors
/// Too few panels (fewer than 2, or fewer than 4 / odd for K-braced),
/// non-positive or non-finite panel width or height, a non-finite panel load,
/// and top heights that are given for a family other than polygonal, have the
/// wrong count (must be `panels − 1`) or are not positive and finite.
pub fn generate(opts: &GenerateOptions) -> Result<TrussLayout, GenerateError> {
    validate(opts)?;
    let n = opts.panels;
    let w = opts.panel_width;
    let h = opts.height;
    let mut b = Builder::default();
    match opts.family {
        Family::Pratt => parallel::pratt_like(&mut b, n, w, &vec![h; n - 1], true),
        Family::Howe => parallel::pratt_like(&mut b, n, w, &vec![h; n - 1], false),
        Family::WarrenVerticals => parallel::warren_verticals(&mut b, n, w, h),
        Family::Warren => parallel::warren(&mut b, n, w, h),
        Family::Polygonal => {
            let heights = match &opts.top_heights {
                Some(given) => given.clone(),
                None => polygonal::parabolic_heights(n, h),
            };
            parallel::pratt_like(&mut b, n, w, &heights, true);
        }
        Family::KBraced => kbraced::k_braced(&mut b, n, w, h),
    }
    b.supports.push((bottom(0), "Pin"));
    b.supports.push((bottom(n), "Roller"));
    if let Some(p) = opts.panel_load {
        for i in 1..n {
            b.loads.push((bottom(i), down(p)));
        }
    }

    let family = opts.family;
    let len = opts.units.length_unit();
    let depth = match (family, &opts.top_heights) {
        (Family::Polygonal, Some(_)) => "given top panel point heights".to_string(),
        (Family::Polygonal, None) => format!(
            "{} {len} deep at mid-span on a parabola with {} of that depth at the bearings",
            num(h),
            num(DEFAULT_END_HEIGHT_RATIO)
        ),
        _ => format!("{} {len} deep", num(h)),
    };
    let load = match opts.panel_load {
        Some(p) => format!(
            " Panel load {} {} down at L1 to L{}.",
            num(p),
            opts.units.force_unit(),
            n - 1
        ),
        None => String::new(),
    };
    let title = format!("{}, {n} panels", family.label());
    let comment = format!(
        "Generated by panelpoint: {title} of {} {len}, {depth}.{load} \
         Placeholder sections and material: edit before use.",
        num(w)
    );
    Ok(b.finish(title, comment, opts.units))
}

fn validate(opts: &GenerateOptions) -> Result<(), GenerateError> {
    let family = opts.family;
    let n = opts.panels;
    if n < family.min_panels() {
        return Err(GenerateError::TooFewPanels {
            family: family.label(),
            min: family.min_panels(),
            got: n,
        });
    }
    if n > MAX_PANELS {
        return Err(GenerateError::TooManyPanels {
            max: MAX_PANELS,
            got: n,
        });
    }
    if family == Family::KBraced && !n.is_multiple_of(2) {
        return Err(GenerateError::OddPanelCount { got: n });
    }
    if !(opts.panel_width.is_finite() && opts.panel_width > 0.0) {
        return Err(GenerateError::InvalidPanelWidth(opts.panel_width));
    }
    if !(opts.height.is_finite() && opts.height > 0.0) {
        return Err(GenerateError::InvalidHeight(opts.height));
    }
    // The loader refuses coordinates beyond ±MAX_COORDINATE m: refuse here
    // what it would refuse, so `new` never writes a model that cannot load.
    let unit = match opts.units {
        UnitSystem::Us => 0.3048,
        UnitSystem::Si => 1.0,
    };
    let top = opts
        .top_heights
        .iter()
        .flatten()
        .fold(opts.height, |a, &v| a.max(v));
    let extent = (n as f64 * opts.panel_width).max(top) * unit;
    let max = crate::input::convert::MAX_COORDINATE;
    if extent.is_nan() || extent > max {
        return Err(GenerateError::TooLarge { extent, max });
    }
    if let Some(p) = opts.panel_load {
        if !p.is_finite() {
            return Err(GenerateError::InvalidPanelLoad(p));
        }
    }
    if let Some(heights) = &opts.top_heights {
        if family != Family::Polygonal {
            return Err(GenerateError::TopHeightsNotApplicable {
                family: family.label(),
            });
        }
        if heights.len() != n - 1 {
            return Err(GenerateError::TopHeightsLength {
                panels: n,
                expected: n - 1,
                got: heights.len(),
            });
        }
        if let Some((i, &value)) = heights
            .iter()
            .enumerate()
            .find(|(_, v)| !(v.is_finite() && **v > 0.0))
        {
            return Err(GenerateError::InvalidTopHeight { node: i + 1, value });
        }
    }
    Ok(())
}

/// `fy` for a downward load of magnitude `p`, without a negative zero.
fn down(p: f64) -> f64 {
    -p + 0.0
}

/// A number for prose: integers without a trailing `.0`.
fn num(v: f64) -> String {
    format!("{v}")
}

pub(crate) fn bottom(i: usize) -> String {
    format!("L{i}")
}

pub(crate) fn top(i: usize) -> String {
    format!("U{i}")
}

pub(crate) fn mid(i: usize) -> String {
    format!("M{i}")
}

/// Collects nodes and members; members are named after their end nodes.
#[derive(Default)]
pub(crate) struct Builder {
    nodes: Vec<(String, f64, f64)>,
    members: Vec<(String, String, String, &'static str)>,
    supports: Vec<(String, &'static str)>,
    loads: Vec<(String, f64)>,
}

impl Builder {
    pub(crate) fn node(&mut self, id: String, x: f64, y: f64) {
        self.nodes.push((id, x, y));
    }

    /// Member `start-end`.
    pub(crate) fn member(&mut self, start: &str, end: &str, section: &'static str) {
        self.members
            .push((format!("{start}-{end}"), start.into(), end.into(), section));
    }

    pub(crate) fn chord(&mut self, start: &str, end: &str) {
        self.member(start, end, "chord");
    }

    pub(crate) fn web(&mut self, start: &str, end: &str) {
        self.member(start, end, "web");
    }

    fn finish(self, title: String, comment: String, units: UnitSystem) -> TrussLayout {
        TrussLayout {
            title,
            comment,
            units,
            nodes: self.nodes,
            members: self.members,
            supports: self.supports,
            loads: self.loads,
        }
    }
}

/// Test-only statics shared by the family tests: an equilibrium solve for
/// determinate layouts and a stiffness check for indeterminate ones.
#[cfg(test)]
pub(crate) mod test_support {
    use super::*;
    use std::collections::HashMap;

    pub(crate) fn opts(family: Family, panels: usize) -> GenerateOptions {
        GenerateOptions {
            family,
            panels,
            panel_width: 18.0,
            height: 16.0,
            panel_load: Some(20.0),
            units: UnitSystem::Us,
            top_heights: None,
        }
    }

    pub(crate) fn reactions(t: &TrussLayout) -> usize {
        t.supports
            .iter()
            .map(|(_, k)| match *k {
                "Pin" => 2,
                "Roller" => 1,
                other => panic!("unknown support kind {other}"),
            })
            .sum()
    }

    fn index(t: &TrussLayout) -> HashMap<&str, usize> {
        let mut map = HashMap::new();
        for (i, (id, _, _)) in t.nodes.iter().enumerate() {
            assert!(map.insert(id.as_str(), i).is_none(), "duplicate node {id}");
        }
        map
    }

    /// Basic integrity: unique ids, members join two distinct existing nodes,
    /// no zero-length members, no duplicated node pairs, supports and loads
    /// on existing nodes.
    pub(crate) fn check_integrity(t: &TrussLayout) {
        let idx = index(t);
        let mut ids = std::collections::HashSet::new();
        let mut pairs = std::collections::HashSet::new();
        for (id, a, b, s) in &t.members {
            assert!(ids.insert(id.clone()), "duplicate member {id}");
            assert!(*s == "chord" || *s == "web");
            let (ia, ib) = (idx[a.as_str()], idx[b.as_str()]);
            assert_ne!(ia, ib, "member {id} starts and ends at one node");
            assert!(
                pairs.insert((ia.min(ib), ia.max(ib))),
                "doubled member {id}"
            );
            let (_, xa, ya) = t.nodes[ia];
            let (_, xb, yb) = t.nodes[ib];
            assert!((xb - xa).hypot(yb - ya) > 1e-9, "zero-length member {id}");
        }
        for (n, _) in &t.supports {
            assert!(idx.contains_key(n.as_str()));
        }
        for (n, _) in &t.loads {
            assert!(idx.contains_key(n.as_str()));
        }
    }

    fn restrained_dofs(t: &TrussLayout, idx: &HashMap<&str, usize>) -> Vec<usize> {
        let mut dofs = Vec::new();
        for (n, kind) in &t.supports {
            let j = idx[n.as_str()];
            if *kind == "Pin" {
                dofs.push(2 * j);
            }
            dofs.push(2 * j + 1);
        }
        dofs
    }

    /// Solve `a x = b` by Gaussian elimination with partial pivoting; `None`
    /// when a pivot is negligible relative to the largest entry (singular).
    fn solve(mut a: Vec<Vec<f64>>, mut b: Vec<f64>) -> Option<Vec<f64>> {
        let n = b.len();
        let scale = a
            .iter()
            .flatten()
            .fold(0.0_f64, |m, v| m.max(v.abs()))
            .max(1.0);
        for k in 0..n {
            let p = (k..n).max_by(|&i, &j| a[i][k].abs().total_cmp(&a[j][k].abs()))?;
            if a[p][k].abs() < 1e-10 * scale {
                return None;
            }
            a.swap(k, p);
            b.swap(k, p);
            let (upper, lower) = a.split_at_mut(k + 1);
            let pivot_row = &upper[k];
            for (i, row) in lower.iter_mut().enumerate() {
                let f = row[k] / pivot_row[k];
                if f != 0.0 {
                    for (r, p) in row[k..].iter_mut().zip(&pivot_row[k..]) {
                        *r -= f * p;
                    }
                    b[k + 1 + i] -= f * b[k];
                }
            }
        }
        let mut x = vec![0.0; n];
        for k in (0..n).rev() {
            let s: f64 = (k + 1..n).map(|j| a[k][j] * x[j]).sum();
            x[k] = (b[k] - s) / a[k][k];
        }
        Some(x)
    }

    /// Member forces (tension positive) of a statically determinate layout
    /// under its panel loads, by joint equilibrium. `None` if the
    /// equilibrium matrix is singular (a mechanism). Panics when the counts
    /// do not make the matrix square.
    pub(crate) fn determinate_forces(t: &TrussLayout) -> Option<HashMap<String, f64>> {
        let idx = index(t);
        let dofs = 2 * t.nodes.len();
        let restrained = restrained_dofs(t, &idx);
        let unknowns = t.members.len() + restrained.len();
        assert_eq!(unknowns, dofs, "not a determinate count");
        let mut a = vec![vec![0.0; unknowns]; dofs];
        for (m, (_, s, e, _)) in t.members.iter().enumerate() {
            let (is, ie) = (idx[s.as_str()], idx[e.as_str()]);
            let (_, xs, ys) = t.nodes[is];
            let (_, xe, ye) = t.nodes[ie];
            let l = (xe - xs).hypot(ye - ys);
            let (c, sn) = ((xe - xs) / l, (ye - ys) / l);
            // A tension force pulls each end node towards the other.
            a[2 * is][m] += c;
            a[2 * is + 1][m] += sn;
            a[2 * ie][m] -= c;
            a[2 * ie + 1][m] -= sn;
        }
        for (r, &d) in restrained.iter().enumerate() {
            a[d][t.members.len() + r] = 1.0;
        }
        let mut rhs = vec![0.0; dofs];
        for (n, fy) in &t.loads {
            rhs[2 * idx[n.as_str()] + 1] -= fy;
        }
        let x = solve(a, rhs)?;
        Some(
            t.members
                .iter()
                .zip(x)
                .map(|((id, ..), f)| (id.clone(), f))
                .collect(),
        )
    }

    /// True when the supported stiffness matrix (unit axial stiffness per
    /// unit length) is non-singular, i.e. the layout is not a mechanism.
    pub(crate) fn is_stable(t: &TrussLayout) -> bool {
        let idx = index(t);
        let n = 2 * t.nodes.len();
        let mut k = vec![vec![0.0; n]; n];
        for (_, s, e, _) in &t.members {
            let (is, ie) = (idx[s.as_str()], idx[e.as_str()]);
            let (_, xs, ys) = t.nodes[is];
            let (_, xe, ye) = t.nodes[ie];
            let l = (xe - xs).hypot(ye - ys);
            let g = [(xe - xs) / l, (ye - ys) / l];
            let d = [2 * is, 2 * is + 1, 2 * ie, 2 * ie + 1];
            let v = [-g[0], -g[1], g[0], g[1]];
            for p in 0..4 {
                for q in 0..4 {
                    k[d[p]][d[q]] += v[p] * v[q] / l;
                }
            }
        }
        for d in restrained_dofs(t, &idx) {
            for row in k.iter_mut() {
                row[d] = 0.0;
            }
            k[d] = vec![0.0; n];
            k[d][d] = 1.0;
        }
        solve(k, vec![1.0; n]).is_some()
    }

    pub(crate) fn node_x(t: &TrussLayout, id: &str) -> f64 {
        t.nodes.iter().find(|n| n.0 == id).expect("node").1
    }

    pub(crate) fn node_y(t: &TrussLayout, id: &str) -> f64 {
        t.nodes.iter().find(|n| n.0 == id).expect("node").2
    }
}

#[cfg(test)]
mod tests {
    use super::test_support::*;
    use super::*;

    const ALL: [Family; 6] = FAMILIES;

    fn panel_counts(f: Family) -> Vec<usize> {
        match f {
            Family::KBraced => vec![4, 6, 8, 10, 12],
            _ => vec![2, 3, 4, 5, 6, 7, 8, 11],
        }
    }

    #[test]
    fn names_round_trip() {
        assert_eq!(Family::names().len(), ALL.len());
        for f in ALL {
            assert_eq!(Family::from_name(f.name()), Some(f));
        }
        assert_eq!(Family::from_name(" K-Braced "), Some(Family::KBraced));
        assert_eq!(
            Family::from_name("warren-verticals"),
            Some(Family::WarrenVerticals)
        );
        assert_eq!(Family::from_name("bowstring"), None);
    }

    #[test]
    fn every_family_is_determinate_and_stable() {
        for f in ALL {
            for n in panel_counts(f) {
                let t = generate(&opts(f, n)).unwrap();
                check_integrity(&t);
                assert_eq!(
                    t.members.len() + reactions(&t),
                    2 * t.nodes.len(),
                    "{f:?} with {n} panels is not determinate"
                );
                assert!(
                    determinate_forces(&t).is_some(),
                    "{f:?} with {n} panels is a mechanism"
                );
                assert!(is_stable(&t));
            }
        }
    }

    #[test]
    fn the_statics_checks_catch_a_mechanism() {
        let mut t = generate(&opts(Family::Pratt, 4)).unwrap();
        let k = t.members.iter().position(|m| m.0 == "U1-L2").unwrap();
        t.members.remove(k);
        assert!(!is_stable(&t));
        // Same count as before, but the extra bottom member is redundant
        // while panel 1 is a mechanism.
        t.members
            .push(("L0-L2".into(), "L0".into(), "L2".into(), "chord"));
        assert!(determinate_forces(&t).is_none());
        assert!(!is_stable(&t));
    }

    #[test]
    fn chord_forces_match_the_method_of_sections() {
        // 6 panels of 18 ft, 16 ft deep, 20 kip at L1..L5: reactions 50 kip,
        // moments M(2w) = 1440 and M(3w) = 1620 kip-ft, M(3.5w) = 1530 kip-ft.
        let cases = [
            (Family::Pratt, "U2-U3", -1620.0 / 16.0),
            (Family::Pratt, "L2-L3", 1440.0 / 16.0),
            (Family::Howe, "L2-L3", 1620.0 / 16.0),
            (Family::WarrenVerticals, "L2-L3", 1620.0 / 16.0),
            (Family::Warren, "U3-U4", -1620.0 / 16.0),
            (Family::Warren, "L3-L4", 1530.0 / 16.0),
            (Family::KBraced, "L2-L3", 1440.0 / 16.0),
            (Family::KBraced, "U2-U3", -1440.0 / 16.0),
        ];
        for (f, id, expected) in cases {
            let t = generate(&opts(f, 6)).unwrap();
            let forces = determinate_forces(&t).unwrap();
            assert!(
                (forces[id] - expected).abs() < 1e-9,
                "{f:?} {id}: {} vs {expected}",
                forces[id]
            );
        }
    }

    #[test]
    fn supports_loads_and_text() {
        let t = generate(&opts(Family::Pratt, 4)).unwrap();
        assert_eq!(
            t.supports,
            vec![("L0".to_string(), "Pin"), ("L4".to_string(), "Roller")]
        );
        let loaded: Vec<_> = t.loads.iter().map(|(n, fy)| (n.as_str(), *fy)).collect();
        assert_eq!(loaded, vec![("L1", -20.0), ("L2", -20.0), ("L3", -20.0)]);
        assert_eq!(t.title, "Pratt truss, 4 panels");
        assert!(t
            .comment
            .starts_with("Generated by panelpoint: Pratt truss, 4 panels of 18 ft, 16 ft deep."));
        assert!(t.comment.ends_with("edit before use."));

        let mut o = opts(Family::Howe, 4);
        o.panel_load = None;
        o.units = UnitSystem::Si;
        let t = generate(&o).unwrap();
        assert!(t.loads.is_empty());
        assert_eq!(t.units, UnitSystem::Si);
        assert!(t.comment.contains("18 m"));
    }

    #[test]
    fn invalid_options_are_rejected() {
        let e = |o: GenerateOptions| generate(&o).unwrap_err();
        assert!(matches!(
            e(opts(Family::Pratt, 1)),
            GenerateError::TooFewPanels { min: 2, got: 1, .. }
        ));
        assert!(matches!(
            e(opts(Family::KBraced, 2)),
            GenerateError::TooFewPanels { min: 4, .. }
        ));
        assert_eq!(
            e(opts(Family::KBraced, 5)),
            GenerateError::OddPanelCount { got: 5 }
        );
        for bad in [0.0, -3.0, f64::NAN, f64::INFINITY] {
            let mut o = opts(Family::Warren, 4);
            o.panel_width = bad;
            assert!(matches!(e(o), GenerateError::InvalidPanelWidth(_)));
            let mut o = opts(Family::Warren, 4);
            o.height = bad;
            assert!(matches!(e(o), GenerateError::InvalidHeight(_)));
        }
        let mut o = opts(Family::Pratt, 4);
        o.panel_load = Some(f64::NAN);
        assert!(matches!(e(o), GenerateError::InvalidPanelLoad(_)));
        let mut o = opts(Family::Pratt, 4);
        o.top_heights = Some(vec![10.0; 3]);
        assert!(matches!(
            e(o),
            GenerateError::TopHeightsNotApplicable { .. }
        ));
        let msg = e(opts(Family::KBraced, 5)).to_string();
        assert!(msg.contains("even"), "{msg}");
        let msg = e(opts(Family::Howe, 0)).to_string();
        assert_eq!(msg, "a Howe truss needs at least 2 panels, got 0");
    }
}
