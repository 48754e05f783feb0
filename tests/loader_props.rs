//! Bounded property tests at the loader: generated malformed models —
//! random RON-like text, random references, extreme numbers, random cuts
//! of a good file — must each end in an error or a result, never a panic.
//! (Each case finishing at all is the time bound; no timing is asserted.)

use panelpoint::analysis;
use panelpoint::input::load_str;
use proptest::prelude::*;

const EXAMPLE: &str = include_str!("data/four_panel.ron");

fn token() -> impl Strategy<Value = &'static str> {
    prop::sample::select(vec![
        "(",
        ")",
        "[",
        "]",
        ",",
        ":",
        "\"",
        "id",
        "x",
        "y",
        "nodes",
        "members",
        "units",
        "length",
        "\"m\"",
        "\"ft\"",
        "Pin",
        "Roller",
        "InclinedRoller",
        "NaN",
        "inf",
        "1e300",
        "-0.0",
        "0",
        "12.5",
        "\"A\"",
        "\"B\"",
        "Some",
        "None",
        "true",
        "//",
        "\n",
        " ",
    ])
}

/// A number as the file might write it: literal or string, sane or not.
fn number() -> impl Strategy<Value = String> {
    let v = prop_oneof![
        Just("NaN".to_string()),
        Just("inf".to_string()),
        Just("-inf".to_string()),
        Just("1e300".to_string()),
        Just("-1e300".to_string()),
        Just("1e-300".to_string()),
        Just("0.0".to_string()),
        Just("-0.0".to_string()),
        (-1e3f64..1e3).prop_map(|v| format!("{v:?}")),
    ];
    let unit = prop::sample::select(vec![
        "", " m", " ft", " kN", " ksi", " furlong", "mm", " in4",
    ]);
    (v, unit, any::<bool>()).prop_map(|(v, u, text)| {
        if text || !u.is_empty() {
            format!("\"{v}{u}\"")
        } else {
            v
        }
    })
}

fn name() -> impl Strategy<Value = String> {
    prop::sample::select(vec!["A", "B", "C", "D", "", "A ", "Ω", "x\\ny"]).prop_map(str::to_string)
}

fn model_text() -> impl Strategy<Value = String> {
    let node = (name(), number(), number())
        .prop_map(|(id, x, y)| format!("(id: \"{id}\", x: {x}, y: {y})"));
    let member = (name(), name(), name(), name(), name()).prop_map(|(id, s, e, sec, mat)| {
        format!("(id: \"m{id}\", start: \"{s}\", end: \"{e}\", section: \"{sec}\", material: \"{mat}\")")
    });
    let support = (name(), 0..3u8, number()).prop_map(|(n, k, a)| {
        let kind = match k {
            0 => "Pin".to_string(),
            1 => "Roller".to_string(),
            _ => format!("InclinedRoller(angle: {a})"),
        };
        format!("(node: \"{n}\", kind: {kind})")
    });
    let load = (name(), number(), number())
        .prop_map(|(n, fx, fy)| format!("(node: \"{n}\", fx: {fx}, fy: {fy})"));
    (
        number(),
        number(),
        prop::collection::vec(node, 0..6),
        prop::collection::vec(member, 0..8),
        prop::collection::vec(support, 0..3),
        prop::collection::vec(load, 0..4),
    )
        .prop_map(|(e, a, nodes, members, supports, loads)| {
            format!(
                "(units: (length: \"m\", force: \"kN\", section: \"mm\", stress: \"MPa\"),\n\
                 materials: [(id: \"A\", e: {e}, fy: 250.0)],\n\
                 sections: [(id: \"A\", area: {a}, i_in: 1e6, i_out: 1e6)],\n\
                 nodes: [{}],\nmembers: [{}],\nsupports: [{}],\n\
                 load_cases: [(id: \"c\", loads: [{}])])",
                nodes.join(", "),
                members.join(", "),
                supports.join(", "),
                loads.join(", ")
            )
        })
}

/// Load, and if it loads, analyse; a result must be finite.
fn exercise(text: &str) {
    if let Ok(c) = load_str(text) {
        if let Ok(a) = analysis::analyse(&c.model) {
            for case in &a.cases {
                assert!(case.forces.iter().all(|f| f.is_finite()));
                assert!(case.displacements.iter().flatten().all(|v| v.is_finite()));
            }
        }
    } else if let Err(d) = load_str(text) {
        assert!(!d.errors.is_empty() && d.errors.len() <= 200);
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 128, ..ProptestConfig::default() })]

    #[test]
    fn random_token_soup(tokens in prop::collection::vec(token(), 0..200)) {
        exercise(&tokens.concat());
    }

    #[test]
    fn random_references_and_extreme_numbers(text in model_text()) {
        exercise(&text);
    }

    #[test]
    fn cut_and_spliced_example(a in 0..EXAMPLE.len(), len in 0..200usize, ins in token()) {
        let b = (a + len).min(EXAMPLE.len());
        let (a, b) = (EXAMPLE.floor_char_boundary(a), EXAMPLE.floor_char_boundary(b));
        let text = format!("{}{}{}", &EXAMPLE[..a], ins, &EXAMPLE[b..]);
        exercise(&text);
    }

    #[test]
    fn random_bytes_as_text(bytes in prop::collection::vec(any::<u8>(), 0..300)) {
        exercise(&String::from_utf8_lossy(&bytes));
    }
}

#[test]
fn generated_models_sometimes_load() {
    // Guard that the structured generator is not all syntax errors: a
    // hand-picked instance of its shape loads and solves.
    let text = "(units: (length: \"m\", force: \"kN\", section: \"mm\", stress: \"MPa\"),\n\
        materials: [(id: \"A\", e: 200000.0, fy: 250.0)],\n\
        sections: [(id: \"A\", area: 1000.0, i_in: 1e6, i_out: 1e6)],\n\
        nodes: [(id: \"A\", x: 0.0, y: 0.0), (id: \"B\", x: 4.0, y: 0.0), (id: \"C\", x: 2.0, y: 1.0)],\n\
        members: [(id: \"m1\", start: \"A\", end: \"B\", section: \"A\", material: \"A\"), \
                  (id: \"m2\", start: \"B\", end: \"C\", section: \"A\", material: \"A\"), \
                  (id: \"m3\", start: \"C\", end: \"A\", section: \"A\", material: \"A\")],\n\
        supports: [(node: \"A\", kind: Pin), (node: \"B\", kind: Roller)],\n\
        load_cases: [(id: \"c\", loads: [(node: \"C\", fx: 0.0, fy: -1.0)])])";
    let c = load_str(text).expect("loads");
    analysis::analyse(&c.model).expect("solves");
}
