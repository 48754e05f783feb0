//! The fast reader of long `nodes` and `members` lists must never change
//! what a file means. Reference: the RON parser itself (`parse_ron`), run
//! on the same text. Every model in the repository and thousands of
//! altered rows are read both ways, with the fast reader forced on and its
//! lists cut into tiny pieces; the results (or the errors, with their line
//! and column) must be identical.

use panelpoint::input::{parse_ron, parse_str_fast};

/// Both readers, as comparable text: the parsed schema (Debug prints
/// every float exactly, sign of zero included) or the error.
fn both(text: &str, piece: usize) -> (String, String) {
    let show =
        |r: Result<panelpoint::input::schema::ModelFile, panelpoint::input::Diagnostics>| match r {
            Ok(f) => format!("{f:?}"),
            Err(d) => format!("error: {d}"),
        };
    (show(parse_str_fast(text, piece)), show(parse_ron(text)))
}

fn assert_same(text: &str, what: &str) {
    for piece in [1, 13, 200, 1 << 22] {
        let (fast, ron) = both(text, piece);
        assert_eq!(fast, ron, "{what}, pieces of {piece} bytes:\n{text}");
    }
}

fn repository_models() -> Vec<(String, String)> {
    let mut out = Vec::new();
    for dir in ["models", "tests/data", "tests/regressions", "fuzz/seeds"] {
        let root = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join(dir);
        let mut paths: Vec<_> = std::fs::read_dir(&root)
            .unwrap()
            .map(|e| e.unwrap().path())
            .filter(|p| p.extension().is_some_and(|e| e == "ron"))
            .collect();
        paths.sort();
        for p in paths {
            let text = std::fs::read_to_string(&p).unwrap();
            out.push((p.display().to_string(), text));
        }
    }
    out
}

#[test]
fn every_repository_model_reads_the_same() {
    let models = repository_models();
    assert!(models.len() >= 10, "the model files are found");
    for (name, text) in &models {
        assert_same(text, name);
    }
}

#[test]
fn the_fast_reader_really_reads_plain_lists() {
    // Not only agreement by giving up: on the plain demo model the lists are
    // blanked out of the text the RON parser sees, so RON alone on a text
    // with the lists removed must give no nodes, while the fast path gives
    // them all.
    let text = include_str!("data/four_panel.ron");
    let fast = parse_str_fast(text, 64).unwrap();
    assert!(fast.nodes.len() >= 8 && fast.members.len() >= 13);
    let open = text.find("nodes: [").unwrap() + "nodes: [".len();
    let close = open + text[open..].find(']').unwrap();
    let without = format!("{}{}", &text[..open], &text[close..]);
    assert!(parse_ron(&without).unwrap().nodes.is_empty());
}

/// Row alterations: each replaces the first occurrence of `from` in the
/// nodes or members list of the four-panel model.
const ALTERATIONS: &[(&str, &str)] = &[
    ("x: 18.0", "x: 1e3"),
    ("x: 18.0", "x: 1E-3"),
    ("x: 18.0", "x: 18"),
    ("x: 18.0", "x: -0"),
    ("x: 18.0", "x: -0.0"),
    ("x: 18.0", "x: +18.0"),
    ("x: 18.0", "x: .5"),
    ("x: 18.0", "x: 18."),
    ("x: 18.0", "x: 1_8.0"),
    ("x: 18.0", "x: 0x12"),
    ("x: 18.0", "x: 018"),
    ("x: 18.0", "x: inf"),
    ("x: 18.0", "x: NaN"),
    ("x: 18.0", "x: 1e400"),
    ("x: 18.0", "x: 18.0f64"),
    ("x: 18.0", "x: 18.0f32"),
    ("x: 18.0", "x: 123456789012345678901234"),
    ("x: 18.0", "x: 1234567890123456"),
    ("x: 18.0", "x: 0.1000000000000000055511151231257827"),
    ("x: 18.0", "x: \"18 ft\""),
    ("x: 18.0", "x: \"18\\\" ft\""),
    ("x: 18.0", "x: Some(18.0)"),
    ("x: 18.0", "x: 18.0 /* mid */"),
    ("x: 18.0", "x: 18.0 // note\n"),
    ("x: 18.0", "x:18.0"),
    ("x: 18.0", "x :\t18.0"),
    ("x: 18.0", "x: 18.0,"),
    ("x: 18.0", "x: 18.0, x: 2.0"),
    ("x: 18.0", "z: 18.0"),
    ("x: 18.0", "X: 18.0"),
    ("x: 18.0", "r#x: 18.0"),
    ("x: 18.0", ""),
    ("x: 18.0", "x: 18.0 y: 0.0"),
    ("(id: \"L1\"", "Node(id: \"L1\""),
    ("(id: \"L1\"", "(id: \"L\\u{31}\""),
    ("(id: \"L1\"", "(id: r\"L1\""),
    ("(id: \"L1\"", "(id: \"L\u{e9}1\""),
    ("(id: \"L1\"", "(id: \"L\n1\""),
    ("(id: \"L1\"", "(id: \"L\t1\""),
    ("(id: \"L1\"", "(id: 'L'"),
    ("(id: \"L1\"", "(  id : \"L1\""),
    ("(id: \"L1\"", "(\u{a0}id: \"L1\""),
    ("(id: \"L1\"", "()"),
    ("(id: \"L1\"", "(id: \"L1\", )"),
    ("y: 0.0),", "y: 0.0),,"),
    ("y: 0.0),", "y: 0.0)"),
    ("y: 0.0),", "y: 0.0), // a comment, with a comma,"),
    ("y: 0.0),", "y: 0.0), /* block */"),
    ("y: 0.0),", "y: 0.0)\n,"),
    ("y: 0.0),", "y: 0.0),\n\n\n"),
    ("y: 0.0),", "y: 0.0),\r\n"),
    ("y: 0.0),", "y: 0.0)],"),
    ("y: 0.0),", "y: 0.0),]"),
    ("y: 0.0),", "y: 0.0), ("),
    ("section: \"chord\"", "section: \"chord\", k_in: 0.9"),
    ("section: \"chord\"", "section: \"chord\", k_in: 1"),
    ("section: \"chord\"", "section: \"chord\", k_in: -0"),
    ("section: \"chord\"", "section: \"chord\", k_in: Some(0.9)"),
    ("section: \"chord\"", "section: \"chord\", k_in: None"),
    ("section: \"chord\"", "section: \"chord\", k_in: \"0.9\""),
    (
        "section: \"chord\"",
        "section: \"chord\", unbraced_out: \"9 ft\"",
    ),
    ("section: \"chord\"", "section: \"chord\", unbraced_out: 9"),
    (
        "section: \"chord\"",
        "section: \"chord\", k_in: 0.9, k_in: 0.8",
    ),
    ("section: \"chord\"", "section: \"chord\", colour: \"red\""),
    ("section: \"chord\"", "section: chord"),
    ("section: \"chord\"", ""),
    ("members: [", "members: [ // the members\n"),
    ("members: [", "members : ["),
    ("members: [", "members: ( "),
    ("members: [", "members: [],\n    more: ["),
    ("nodes: [", "nodes: [\n        /* */"),
    ("nodes: [", "nodes: []\n, nodes: ["),
    ("nodes: [", "#![enable(implicit_some)]\nnodes: ["),
];

#[test]
fn altered_rows_read_the_same() {
    let base = include_str!("data/four_panel.ron");
    let mut changed = 0;
    for &(from, to) in ALTERATIONS {
        let text = base.replacen(from, to, 1);
        if text != base {
            changed += 1;
        }
        assert_same(&text, &format!("{from:?} -> {to:?}"));
    }
    assert!(changed >= ALTERATIONS.len() - 2, "the alterations apply");
}

#[test]
fn random_edits_read_the_same() {
    // Deterministic random edits (insert, delete or replace a character
    // from RON's alphabet) inside and around the two lists.
    let base = include_str!("data/four_panel.ron");
    let chars_to = |byte: usize| base[..byte].chars().count();
    let lo = chars_to(base.find("nodes: [").unwrap()).saturating_sub(20);
    let hi = chars_to(base.find("supports").unwrap_or(base.len()));
    let alphabet: Vec<char> = "()[]{},:\"\\/* \n\t.-+e0123456789_xyidSomeNone#r'\u{e9}"
        .chars()
        .collect();
    let mut state = 0x2545_f491_4f6c_dd1du64;
    let mut rnd = |n: usize| {
        state ^= state << 13;
        state ^= state >> 7;
        state ^= state << 17;
        (state % n as u64) as usize
    };
    for _ in 0..3000 {
        let mut text: Vec<char> = base.chars().collect();
        let edits = 1 + rnd(3);
        for _ in 0..edits {
            let at = lo + rnd(hi - lo);
            let c = alphabet[rnd(alphabet.len())];
            match rnd(3) {
                0 => text.insert(at, c),
                1 => {
                    text.remove(at);
                }
                _ => text[at] = c,
            }
        }
        let text: String = text.into_iter().collect();
        let (fast, ron) = both(&text, 1 + rnd(300));
        assert_eq!(fast, ron, "edited text:\n{text}");
    }
}
