//! The README and docs say what the repository does (issue 21, defect 15):
//! an install line so `panelpoint` works as the command table shows, the
//! cost of the test suite, "try also" outputs in a git-ignored folder, and
//! the influence-line drawing docs/drawings.md describes made by a command.

mod common;
use common::*;

fn read(rel: &str) -> String {
    std::fs::read_to_string(std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join(rel)).unwrap()
}

#[test]
fn readme_installs_states_test_cost_and_keeps_outputs_in_scratch() {
    let readme = read("README.md");
    assert!(readme.contains("cargo install --path ."), "no install line");
    assert!(
        readme.contains("12 minutes and 5 GB"),
        "test cost not stated"
    );
    // Every `-o` of the quick start writes under scratch/, which git ignores.
    let quick = &readme[readme.find("Try also").unwrap()..readme.find("## Commands").unwrap()];
    for line in quick.lines().filter(|l| l.contains(" -o ")) {
        assert!(line.contains("-o scratch/"), "{line}");
    }
    assert!(read(".gitignore").lines().any(|l| l.trim() == "/scratch"));
}

/// docs/drawings.md shows `draw --influence`; the drawing must carry the
/// strip. L3-U4 of the demo: its influence line changes sign (the truck
/// reverses it, README), so the strip's labels show a positive greatest
/// and a negative least ordinate.
#[test]
fn influence_drawing_the_docs_describe_exists() {
    let doc = read("docs/drawings.md");
    assert!(doc.contains("--influence L3-U4"));
    let model =
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models/millrace-footbridge.ron");
    let (code, svg, err) = run(&[
        "draw",
        model.to_str().unwrap(),
        "--show",
        "model",
        "--influence",
        "L3-U4",
    ]);
    assert_eq!(code, 0, "{err}");
    let tree = roxmltree::Document::parse(&svg).unwrap();
    let strip = tree
        .descendants()
        .find(|n| n.attribute("class") == Some("influence"))
        .expect("an influence strip");
    let texts: Vec<String> = strip
        .descendants()
        .filter(|n| n.has_tag_name("text"))
        .filter_map(|n| n.text().map(str::to_string))
        .collect();
    assert!(texts.iter().any(|t| t.contains("L3-U4")), "{texts:?}");
    let values: Vec<f64> = texts.iter().filter_map(|t| t.trim().parse().ok()).collect();
    assert!(
        values.iter().any(|v| *v > 0.0) && values.iter().any(|v| *v < 0.0),
        "{texts:?}"
    );
    // An unknown member is a usage error naming it.
    let (code, _, err) = run(&["draw", model.to_str().unwrap(), "--influence", "L9-U9"]);
    assert_eq!(code, 2);
    assert!(err.contains("L9-U9"), "{err}");
}
