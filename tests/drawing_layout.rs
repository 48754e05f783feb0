//! Labels on the truss drawings do not collide (issue 21, defect 11): no
//! two text boxes intersect, and no text box meets an arrow, a support
//! symbol or a node circle, on the demo's drawings, a four-panel truss with
//! self-weight at its supports and two loads on some nodes, and a generated
//! K-braced truss. Text boxes are estimated as the drawing code estimates
//! them (common practice for a sans-serif face): 0.56 × font size per
//! character wide, 0.78 × size above the baseline and 0.22 × size below,
//! turned with the text.

mod common;
use common::*;

type Quad = [(f64, f64); 4];

fn intersects(a: &Quad, b: &Quad) -> bool {
    for q in [a, b] {
        for i in 0..4 {
            let (p, r) = (q[i], q[(i + 1) % 4]);
            let (nx, ny) = (-(r.1 - p.1), r.0 - p.0);
            let proj = |x: &Quad| {
                x.iter()
                    .map(|v| v.0 * nx + v.1 * ny)
                    .fold((f64::MAX, f64::MIN), |(lo, hi), d| (lo.min(d), hi.max(d)))
            };
            let ((a0, a1), (b0, b1)) = (proj(a), proj(b));
            let eps = 1e-6 * (nx.abs() + ny.abs()).max(1.0);
            if a1 <= b0 + eps || b1 <= a0 + eps {
                return false;
            }
        }
    }
    true
}

fn rect(x0: f64, y0: f64, x1: f64, y1: f64) -> Quad {
    [(x0, y0), (x1, y0), (x1, y1), (x0, y1)]
}

fn num(n: &roxmltree::Node, a: &str) -> f64 {
    n.attribute(a).map_or(0.0, |v| v.parse().unwrap())
}

/// `translate(a b) rotate(c)` → (a, b, c).
fn transform(n: &roxmltree::Node) -> (f64, f64, f64) {
    let Some(t) = n.attribute("transform") else {
        return (0.0, 0.0, 0.0);
    };
    let nums: Vec<f64> = t
        .split(|c: char| !(c.is_ascii_digit() || c == '.' || c == '-' || c == 'e'))
        .filter(|s| !s.is_empty() && *s != "e")
        .map(|s| s.parse().unwrap())
        .collect();
    (nums[0], nums[1], nums.get(2).copied().unwrap_or(0.0))
}

fn text_box(n: &roxmltree::Node) -> (String, Quad) {
    let text: String = n
        .descendants()
        .filter(|t| t.is_text())
        .filter_map(|t| t.text())
        .collect();
    let size = num(n, "font-size");
    let w = 0.56 * size * text.chars().count() as f64;
    let (x0, x1) = match n.attribute("text-anchor").unwrap_or("start") {
        "start" => (0.0, w),
        "end" => (-w, 0.0),
        _ => (-w / 2.0, w / 2.0),
    };
    let (x, y) = (num(n, "x"), num(n, "y"));
    let (tx, ty, rot) = transform(n);
    let (sn, cs) = rot.to_radians().sin_cos();
    let corner = |px: f64, py: f64| {
        let (px, py) = (px + x, py + y);
        (tx + px * cs - py * sn, ty + px * sn + py * cs)
    };
    let (y0, y1) = (-0.78 * size, 0.22 * size);
    (
        text,
        [
            corner(x0, y0),
            corner(x1, y0),
            corner(x1, y1),
            corner(x0, y1),
        ],
    )
}

/// Points of a group's lines and paths (absolute coordinates).
fn points(g: &roxmltree::Node) -> Vec<(f64, f64)> {
    let mut out = Vec::new();
    for n in g.descendants() {
        if n.has_tag_name("line") {
            out.push((num(&n, "x1"), num(&n, "y1")));
            out.push((num(&n, "x2"), num(&n, "y2")));
        } else if n.has_tag_name("path") {
            let v: Vec<f64> = n
                .attribute("d")
                .unwrap()
                .split(|c: char| c == 'M' || c == 'L' || c == 'Z' || c.is_whitespace())
                .filter(|s| !s.is_empty())
                .map(|s| s.parse().unwrap())
                .collect();
            out.extend(v.chunks(2).map(|c| (c[0], c[1])));
        }
    }
    out
}

fn obstacles(doc: &roxmltree::Document) -> Vec<(String, Quad)> {
    let mut out = Vec::new();
    for g in doc.descendants().filter(|n| n.has_tag_name("g")) {
        let class = g.attribute("class").unwrap_or("");
        let in_legend = g
            .ancestors()
            .any(|a| a.attribute("class") == Some("legend"));
        if in_legend {
            continue;
        }
        if class == "load" || class == "reaction" {
            let p = points(&g);
            let (x0, x1) = p
                .iter()
                .fold((f64::MAX, f64::MIN), |a, q| (a.0.min(q.0), a.1.max(q.0)));
            let (y0, y1) = p
                .iter()
                .fold((f64::MAX, f64::MIN), |a, q| (a.0.min(q.1), a.1.max(q.1)));
            out.push((
                class.to_string(),
                rect(x0 - 0.5, y0 - 0.5, x1 + 0.5, y1 + 0.5),
            ));
        } else if class.starts_with("support") {
            // The symbol: triangle from the node down, ground and hatching,
            // ±1.5 × 11 px wide and about 2.4 × 11 px deep (truss.rs).
            let (x, y, _) = transform(&g);
            out.push((
                "support".into(),
                rect(x - 16.5, y + 4.0, x + 16.5, y + 25.0),
            ));
        }
    }
    for c in doc.descendants().filter(|n| n.has_tag_name("circle")) {
        let in_nodes = c.ancestors().any(|a| a.attribute("class") == Some("nodes"));
        if in_nodes {
            let (x, y, r) = (num(&c, "cx"), num(&c, "cy"), num(&c, "r"));
            out.push(("node".into(), rect(x - r, y - r, x + r, y + r)));
        }
    }
    out
}

/// Every collision in `svg`, described.
fn collisions(svg: &str) -> Vec<String> {
    let doc = roxmltree::Document::parse(svg).unwrap();
    let texts: Vec<(String, Quad)> = doc
        .descendants()
        .filter(|n| n.has_tag_name("text"))
        .map(|n| text_box(&n))
        .filter(|(t, _)| !t.trim().is_empty())
        .collect();
    let obs = obstacles(&doc);
    let mut out = Vec::new();
    for i in 0..texts.len() {
        for j in i + 1..texts.len() {
            if intersects(&texts[i].1, &texts[j].1) {
                out.push(format!("text {:?} meets text {:?}", texts[i].0, texts[j].0));
            }
        }
        for (what, q) in &obs {
            if intersects(&texts[i].1, q) {
                out.push(format!("text {:?} meets a {what}", texts[i].0));
            }
        }
    }
    out
}

fn drawing(model: &std::path::Path, extra: &[&str]) -> String {
    let mut args = vec!["draw", model.to_str().unwrap()];
    args.extend_from_slice(extra);
    let (code, svg, err) = run(&args);
    assert_eq!(code, 0, "{err}");
    svg
}

fn repo(rel: &str) -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join(rel)
}

#[test]
fn demo_drawings_have_no_colliding_labels() {
    let demo = repo("models/millrace-footbridge.ron");
    for extra in [
        &["--show", "forces"][..],
        &["--show", "model"],
        &["--show", "utilization"],
        &["--show", "deflection"],
        &["--case", "strength-truck"],
        &["--show", "model", "--influence", "L3-U4"],
    ] {
        let c = collisions(&drawing(&demo, extra));
        assert!(c.is_empty(), "{extra:?}:\n{}", c.join("\n"));
    }
}

/// models/four_panel_live.ron: self-weight puts loads on the supports and
/// a second load on nodes that carry a panel load.
#[test]
fn self_weight_at_supports_and_two_loads_on_a_node() {
    let m = repo("models/four_panel_live.ron");
    let svg = drawing(&m, &[]);
    let c = collisions(&svg);
    assert!(c.is_empty(), "{}", c.join("\n"));
    // Two loads on one node, one arrow labelled with the sum and its parts
    // (9.00 panel load + 1.12 self-weight, the values the drawing shows).
    assert!(svg.contains("(9.00 + 1.12)"), "{svg}");
    let d = repo("models/four_panel_live.ron");
    for show in ["model", "deflection"] {
        let c = collisions(&drawing(&d, &["--show", show]));
        assert!(c.is_empty(), "{show}: {}", c.join("\n"));
    }
}

#[test]
fn generated_k_truss_has_no_colliding_labels() {
    let (code, model, err) = run(&[
        "new",
        "k-braced",
        "--panels",
        "6",
        "--span",
        "96",
        "--height",
        "20",
        "--panel-load",
        "5",
    ]);
    assert_eq!(code, 0, "{err}");
    let path = temp_model("k.ron", &model);
    for show in ["forces", "model", "deflection"] {
        let c = collisions(&drawing(&path, &["--show", show]));
        assert!(c.is_empty(), "{show}: {}", c.join("\n"));
    }
}

/// Symmetric members carry equal forces and read the same: the demo's
/// U2-L2 and U4-L4 under 1.25 × its deck load (1.25 × −2.90 = −3.6250 kip
/// each, a tie at three figures; half rounds away from zero, common
/// practice).
#[test]
fn symmetric_members_read_alike() {
    let text = std::fs::read_to_string(repo("models/millrace-footbridge.ron"))
        .unwrap()
        .replace(
            "combinations: [",
            "combinations: [\n        (id: \"deck-factored\", factors: [(\"deck\", 1.25)]),",
        );
    let demo = temp_model("sym.ron", &text);
    let svg = drawing(&demo, &["--case", "deck-factored"]);
    assert!(
        !svg.contains(">3.62 C<"),
        "one of a symmetric pair rounded down"
    );
    assert_eq!(svg.matches(">3.63 C<").count(), 2, "{svg}");
}

/// A displacement component that is round-off prints as 0: the four-panel
/// truss on two pins under symmetric load has no horizontal movement at
/// mid-span (symmetry), which the solve gives as about 4e-19 in.
#[test]
fn deflection_note_has_no_round_off() {
    let text = FOUR_PANEL.replace("kind: Roller", "kind: Pin");
    assert_ne!(text, FOUR_PANEL);
    let path = temp_model("pins.ron", &text);
    let svg = drawing(&path, &["--show", "deflection"]);
    assert!(svg.contains("ux 0, uy -0.0602 in"), "{svg}");
    let c = collisions(&svg);
    assert!(c.is_empty(), "{}", c.join("\n"));
}
