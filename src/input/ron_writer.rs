//! Writes a generated [`TrussLayout`] as RON text in the model schema, so a
//! generated truss can be saved, edited and read back like any hand-written
//! model. Only the input layer knows RON; the generator stays format-free.
//!
//! The layout carries no sections or material, so placeholder values for the
//! layout's unit system are written (an older medium steel and two generic
//! built-up sections, `chord` and `web`); the header comment tells the user to
//! edit them before use.

use crate::generate::{TrussLayout, UnitSystem};
use std::fmt::Write as _;

/// Placeholder material and sections for one unit system.
struct Placeholders {
    units: [&'static str; 4],
    /// `e`, `fy`, `fu`.
    steel: [f64; 3],
    /// `area`, `i_in`, `i_out` of the `chord` and `web` sections.
    chord: [f64; 3],
    web: [f64; 3],
}

fn placeholders(units: UnitSystem) -> Placeholders {
    match units {
        UnitSystem::Us => Placeholders {
            units: ["ft", "kip", "in", "ksi"],
            steel: [29000.0, 33.0, 60.0],
            chord: [14.7, 310.0, 355.0],
            web: [6.2, 41.0, 18.5],
        },
        UnitSystem::Si => Placeholders {
            units: ["m", "kN", "mm", "MPa"],
            steel: [200000.0, 235.0, 360.0],
            chord: [9500.0, 1.3e8, 1.5e8],
            web: [4000.0, 1.7e7, 7.7e6],
        },
    }
}

/// Load lists up to this length are written on one line.
const INLINE_LOADS: usize = 6;

/// The layout as a complete RON model document. Deterministic: the same
/// layout always gives the same text, and every number reads back as the
/// same `f64`.
pub fn layout_to_ron(layout: &TrussLayout) -> String {
    let p = placeholders(layout.units);
    let mut out = String::new();
    for line in layout.comment.lines() {
        let _ = writeln!(out, "// {line}");
    }
    out.push_str("(\n");
    let _ = writeln!(out, "    title: {},", string(&layout.title));
    let _ = writeln!(
        out,
        "    units: (length: {}, force: {}, section: {}, stress: {}),",
        string(p.units[0]),
        string(p.units[1]),
        string(p.units[2]),
        string(p.units[3])
    );

    let materials = [format!(
        "(id: \"steel\", e: {}, fy: {}, fu: {})",
        number(p.steel[0]),
        number(p.steel[1]),
        number(p.steel[2])
    )];
    list(&mut out, "materials", materials);

    let section = |id: &str, v: [f64; 3]| {
        format!(
            "(id: {}, area: {}, i_in: {}, i_out: {})",
            string(id),
            number(v[0]),
            number(v[1]),
            number(v[2])
        )
    };
    list(
        &mut out,
        "sections",
        [section("chord", p.chord), section("web", p.web)],
    );

    list(
        &mut out,
        "nodes",
        layout.nodes.iter().map(|(id, x, y)| {
            format!("(id: {}, x: {}, y: {})", string(id), number(*x), number(*y))
        }),
    );
    list(
        &mut out,
        "members",
        layout.members.iter().map(|(id, start, end, section)| {
            format!(
                "(id: {}, start: {}, end: {}, section: {}, material: \"steel\")",
                string(id),
                string(start),
                string(end),
                string(section)
            )
        }),
    );
    list(
        &mut out,
        "supports",
        layout.supports.iter().map(|(node, kind)| {
            debug_assert!(is_identifier(kind), "support kind {kind:?}");
            format!("(node: {}, kind: {kind})", string(node))
        }),
    );

    let loads: Vec<String> = layout
        .loads
        .iter()
        .map(|(node, fy)| format!("(node: {}, fy: {})", string(node), number(*fy)))
        .collect();
    // The panel load stands for the deck's weight: a Dead case, so the
    // rating takes it as the dead load.
    let cases: Vec<String> = if loads.is_empty() {
        Vec::new()
    } else if loads.len() <= INLINE_LOADS {
        vec![format!(
            "(id: \"panel\", kind: Dead, loads: [{}])",
            loads.join(", ")
        )]
    } else {
        let mut case = String::from("(id: \"panel\", kind: Dead, loads: [\n");
        for load in &loads {
            let _ = writeln!(case, "            {load},");
        }
        case.push_str("        ])");
        vec![case]
    };
    list(&mut out, "load_cases", cases);
    let deck = deck_line(layout);
    if !deck.is_empty() {
        out.push_str(
            "    // The deck line: the loaded (bottom) chord's panel points, where the floor\n    // beams deliver vehicle loads. Add `vehicles_file` or `vehicles` and\n    // `moving_loads` to rate a vehicle (docs/loads.md).\n",
        );
        let ids: Vec<String> = deck.iter().map(|id| string(id)).collect();
        let _ = writeln!(out, "    deck: [{}],", ids.join(", "));
    }
    out.push_str(")\n");
    out
}

/// The loaded chord's panel points in order: the generator's bottom chord
/// `L0`…`Ln` (ordered by their number); empty for a layout without them.
fn deck_line(layout: &TrussLayout) -> Vec<String> {
    let mut bottom: Vec<(usize, &str)> = layout
        .nodes
        .iter()
        .filter_map(|(id, _, _)| {
            let n = id.strip_prefix('L')?;
            if n.is_empty() || !n.bytes().all(|b| b.is_ascii_digit()) {
                return None;
            }
            Some((n.parse::<usize>().ok()?, id.as_str()))
        })
        .collect();
    bottom.sort();
    if bottom.len() < 2 {
        return Vec::new();
    }
    bottom.into_iter().map(|(_, id)| id.to_string()).collect()
}

/// `    name: [` + one entry per line + `    ],`, or `    name: [],` when empty.
fn list(out: &mut String, name: &str, items: impl IntoIterator<Item = String>) {
    let mut items = items.into_iter().peekable();
    if items.peek().is_none() {
        let _ = writeln!(out, "    {name}: [],");
        return;
    }
    let _ = writeln!(out, "    {name}: [");
    for item in items {
        let _ = writeln!(out, "        {item},");
    }
    out.push_str("    ],\n");
}

/// A RON string literal.
fn string(s: &str) -> String {
    let mut out = String::with_capacity(s.len() + 2);
    out.push('"');
    for c in s.chars() {
        match c {
            '"' => out.push_str("\\\""),
            '\\' => out.push_str("\\\\"),
            '\n' => out.push_str("\\n"),
            '\r' => out.push_str("\\r"),
            '\t' => out.push_str("\\t"),
            c if c.is_control() => {
                let _ = write!(out, "\\u{{{:x}}}", c as u32);
            }
            c => out.push(c),
        }
    }
    out.push('"');
    out
}

/// A RON float that reads back as exactly `v`: the shortest round-trip form,
/// always with a decimal point (`18.0`, `0.1`, `1.0e20`).
fn number(v: f64) -> String {
    let s = format!("{v:?}");
    if v.is_finite() && !s.contains('.') {
        match s.find('e') {
            Some(e) => format!("{}.0{}", &s[..e], &s[e..]),
            None => format!("{s}.0"),
        }
    } else {
        s
    }
}

fn is_identifier(s: &str) -> bool {
    let mut chars = s.chars();
    matches!(chars.next(), Some(c) if c.is_ascii_alphabetic() || c == '_')
        && chars.all(|c| c.is_ascii_alphanumeric() || c == '_')
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::generate::{generate, lattice, Family, GenerateOptions};
    use serde::Deserialize;

    #[derive(Deserialize, Debug)]
    #[serde(deny_unknown_fields)]
    struct Model {
        title: String,
        units: Units,
        materials: Vec<Material>,
        sections: Vec<Section>,
        nodes: Vec<Node>,
        members: Vec<Member>,
        supports: Vec<Support>,
        load_cases: Vec<LoadCase>,
        #[serde(default)]
        deck: Vec<String>,
    }

    #[derive(Deserialize, Debug)]
    #[serde(deny_unknown_fields)]
    struct Units {
        length: String,
        force: String,
        section: String,
        stress: String,
    }

    #[derive(Deserialize, Debug)]
    #[serde(deny_unknown_fields)]
    struct Material {
        id: String,
        e: f64,
        fy: f64,
        fu: f64,
    }

    #[derive(Deserialize, Debug)]
    #[serde(deny_unknown_fields)]
    struct Section {
        id: String,
        area: f64,
        i_in: f64,
        i_out: f64,
    }

    #[derive(Deserialize, Debug)]
    #[serde(deny_unknown_fields)]
    struct Node {
        id: String,
        x: f64,
        y: f64,
    }

    #[derive(Deserialize, Debug)]
    #[serde(deny_unknown_fields)]
    struct Member {
        id: String,
        start: String,
        end: String,
        section: String,
        material: String,
    }

    #[derive(Deserialize, Debug, PartialEq)]
    enum Kind {
        Pin,
        Roller,
    }

    #[derive(Deserialize, Debug)]
    #[serde(deny_unknown_fields)]
    struct Support {
        node: String,
        kind: Kind,
    }

    #[derive(Deserialize, Debug)]
    #[serde(deny_unknown_fields)]
    struct LoadCase {
        id: String,
        kind: CaseKind,
        loads: Vec<Load>,
    }

    #[derive(Deserialize, Debug, PartialEq)]
    enum CaseKind {
        Dead,
    }

    #[derive(Deserialize, Debug)]
    #[serde(deny_unknown_fields)]
    struct Load {
        node: String,
        fy: f64,
    }

    fn parse(text: &str) -> Model {
        ron::from_str(text).unwrap_or_else(|e| panic!("{e}\n{text}"))
    }

    /// Everything in the layout reads back unchanged.
    fn assert_matches(m: &Model, t: &TrussLayout) {
        assert_eq!(m.title, t.title);
        assert_eq!(m.nodes.len(), t.nodes.len());
        assert_eq!(m.members.len(), t.members.len());
        for (n, (id, x, y)) in m.nodes.iter().zip(&t.nodes) {
            assert_eq!((&n.id, n.x, n.y), (id, *x, *y));
        }
        for (m, (id, s, e, sec)) in m.members.iter().zip(&t.members) {
            assert_eq!((&m.id, &m.start, &m.end), (id, s, e));
            assert_eq!((m.section.as_str(), m.material.as_str()), (*sec, "steel"));
        }
        assert_eq!(m.supports.len(), t.supports.len());
        for (s, (node, kind)) in m.supports.iter().zip(&t.supports) {
            assert_eq!(&s.node, node);
            let expected = if *kind == "Pin" {
                Kind::Pin
            } else {
                Kind::Roller
            };
            assert_eq!(s.kind, expected);
        }
        if t.loads.is_empty() {
            assert!(m.load_cases.is_empty());
        } else {
            assert_eq!(m.load_cases.len(), 1);
            assert_eq!(m.load_cases[0].id, "panel");
            assert_eq!(m.load_cases[0].kind, CaseKind::Dead);
            let loads = &m.load_cases[0].loads;
            assert_eq!(loads.len(), t.loads.len());
            for (l, (node, fy)) in loads.iter().zip(&t.loads) {
                assert_eq!((&l.node, l.fy), (node, *fy));
            }
        }
        // The deck is the bottom chord (the generator's L nodes at y = 0),
        // left to right; a layout without them (the lattice) has none.
        let at = |id: &str| t.nodes.iter().find(|n| n.0 == id).unwrap();
        let bottom = t
            .nodes
            .iter()
            .filter(|(id, _, y)| id.starts_with('L') && *y == 0.0)
            .count();
        assert_eq!(m.deck.len(), if bottom >= 2 { bottom } else { 0 });
        for w in m.deck.windows(2) {
            assert!(
                at(&w[0]).1 < at(&w[1]).1 && at(&w[1]).2 == 0.0,
                "{:?}",
                m.deck
            );
        }
    }

    fn opts(family: Family, panels: usize) -> GenerateOptions {
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

    #[test]
    fn every_family_round_trips() {
        for name in Family::names() {
            let family = Family::from_name(name).unwrap();
            for panels in [4, 6, 12] {
                let t = generate(&opts(family, panels)).unwrap();
                let text = layout_to_ron(&t);
                assert_matches(&parse(&text), &t);
                assert_eq!(text, layout_to_ron(&t), "not deterministic");
            }
        }
    }

    #[test]
    fn pratt_text_has_the_schema_shape() {
        let t = generate(&opts(Family::Pratt, 4)).unwrap();
        let text = layout_to_ron(&t);
        let mut lines = text.lines();
        assert_eq!(
            lines.next().unwrap(),
            "// Generated by panelpoint: Pratt truss, 4 panels of 18 ft, 16 ft deep. \
             Panel load 20 kip down at L1 to L3. Placeholder sections and material: edit before use."
        );
        assert_eq!(lines.next().unwrap(), "(");
        for expected in [
            "    title: \"Pratt truss, 4 panels\",",
            "    units: (length: \"ft\", force: \"kip\", section: \"in\", stress: \"ksi\"),",
            "        (id: \"steel\", e: 29000.0, fy: 33.0, fu: 60.0),",
            "        (id: \"chord\", area: 14.7, i_in: 310.0, i_out: 355.0),",
            "        (id: \"web\", area: 6.2, i_in: 41.0, i_out: 18.5),",
            "        (id: \"U1\", x: 18.0, y: 16.0),",
            "        (id: \"L0-L1\", start: \"L0\", end: \"L1\", section: \"chord\", material: \"steel\"),",
            "        (node: \"L0\", kind: Pin),",
            "        (node: \"L4\", kind: Roller),",
            "        (id: \"panel\", kind: Dead, loads: [(node: \"L1\", fy: -20.0), (node: \"L2\", fy: -20.0), (node: \"L3\", fy: -20.0)]),",
            "    deck: [\"L0\", \"L1\", \"L2\", \"L3\", \"L4\"],",
        ] {
            assert!(text.lines().any(|l| l == expected), "missing {expected}\n{text}");
        }
        assert!(text.ends_with(")\n"));
    }

    #[test]
    fn si_placeholders_and_no_load() {
        let mut o = opts(Family::Warren, 5);
        o.units = UnitSystem::Si;
        o.panel_load = None;
        o.panel_width = 4.5;
        o.height = 3.2;
        let t = generate(&o).unwrap();
        let text = layout_to_ron(&t);
        assert!(text.contains("    load_cases: [],\n"));
        let m = parse(&text);
        assert_matches(&m, &t);
        assert_eq!(
            (
                m.units.length.as_str(),
                m.units.force.as_str(),
                m.units.section.as_str(),
                m.units.stress.as_str()
            ),
            ("m", "kN", "mm", "MPa")
        );
        let steel = &m.materials[0];
        assert_eq!(
            (steel.id.as_str(), steel.e, steel.fy, steel.fu),
            ("steel", 200000.0, 235.0, 360.0)
        );
        let chord = &m.sections[0];
        assert_eq!(
            (chord.id.as_str(), chord.area, chord.i_in, chord.i_out),
            ("chord", 9500.0, 1.3e8, 1.5e8)
        );
        let web = &m.sections[1];
        assert_eq!(
            (web.id.as_str(), web.area, web.i_in, web.i_out),
            ("web", 4000.0, 1.7e7, 7.7e6)
        );
    }

    #[test]
    fn lattice_round_trips_with_long_load_list() {
        let t = lattice(8, 3, 2.5, UnitSystem::Si);
        let text = layout_to_ron(&t);
        assert_matches(&parse(&text), &t);
    }

    #[test]
    fn awkward_ids_numbers_and_comments_survive() {
        let t = TrussLayout {
            title: "quote \" back\\slash\ttab".into(),
            comment: "first line\nsecond line".into(),
            units: UnitSystem::Us,
            nodes: vec![
                ("a\"b".into(), 0.1 + 0.2, -0.0),
                ("c\\d\n\u{1}".into(), 1e20, 1.5e-7),
                ("é".into(), 123456789.125, f64::MAX),
            ],
            members: vec![(
                "a\"b-c\\d".into(),
                "a\"b".into(),
                "c\\d\n\u{1}".into(),
                "web",
            )],
            supports: vec![("a\"b".into(), "Pin"), ("é".into(), "Roller")],
            loads: vec![("é".into(), -f64::MIN_POSITIVE)],
        };
        let text = layout_to_ron(&t);
        assert!(text.starts_with("// first line\n// second line\n(\n"));
        assert_matches(&parse(&text), &t);
        assert_eq!(number(1e20), "1.0e20");
        assert_eq!(number(18.0), "18.0");
        assert_eq!(number(-2.5e-8), "-2.5e-8");
    }
}
