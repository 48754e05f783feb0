//! Issue 19: the stability section of the HTML report, `--k-from buckling`
//! on `rate` and `report`; issue 22 item 9: the report is streamed.

mod common;

use panelpoint::report::table::sig;
use std::f64::consts::PI;

fn pony() -> String {
    std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/models/tanners-brook-pony.ron"
    ))
    .unwrap()
}

/// `report` of a model written to a temporary folder; the page.
fn report_of(text: &str, extra: &[&str]) -> String {
    let path = common::temp_model("m.ron", text);
    let out = path.with_extension("html");
    let mut args = vec![
        "report",
        path.to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
    ];
    args.extend_from_slice(extra);
    let (code, stdout, stderr) = common::run(&args);
    assert_eq!(code, 0, "{stderr}");
    assert!(stdout.is_empty());
    std::fs::read_to_string(out).unwrap()
}

fn json_of(text: &str, cmd: &[&str]) -> serde_json::Value {
    let path = common::temp_model("m.ron", text);
    let mut args = cmd.to_vec();
    args.insert(1, path.to_str().unwrap());
    let (code, stdout, stderr) = common::run(&args);
    assert_eq!(code, 0, "{stderr}");
    serde_json::from_str(&stdout).unwrap()
}

/// The part of the page between the stability section's start and the next
/// section.
fn section(html: &str) -> &str {
    let i = html
        .find(r#"<section class="major" id="stability">"#)
        .expect("no stability section");
    let j = html[i + 10..]
        .find("<section ")
        .map_or(html.len(), |j| i + 10 + j);
    &html[i..j]
}

fn xml_ok(html: &str) {
    roxmltree::Document::parse_with_options(
        html,
        roxmltree::ParsingOptions {
            allow_dtd: true,
            ..Default::default()
        },
    )
    .expect("the report is well-formed (XHTML-compatible) markup");
}

/// The pony demo's report carries every number `stability --format json`
/// gives (the same analysis): λcr per effect with its mode drawn, the
/// U-frame spring, each chord member's K per effect, the K the rating used
/// (the largest over the effects, not below 1.0, as `rate` reports in its
/// notes), the frequencies against the limits and the deflection check.
#[test]
fn pony_report_shows_the_stability_numbers() {
    let html = report_of(&pony(), &[]);
    xml_ok(&html);
    let sec = section(&html);
    let v = json_of(&pony(), &["stability", "--format", "json"]);
    for e in v["in_plane"].as_array().unwrap() {
        let lam = e["critical_factor"].as_f64().unwrap();
        let row = format!(
            "<tr><td>{}</td><td>{}</td><td class=\"n\">{}</td>",
            e["case"].as_str().unwrap(),
            e["kind"].as_str().unwrap(),
            sig(lam, 4)
        );
        assert!(sec.contains(&row), "no row {row}");
        // Its mode is drawn, with λcr in the caption.
        let caption = format!("mode of “{}”", e["case"].as_str().unwrap());
        assert!(sec.contains(&caption), "no mode drawing {caption}");
        for m in e["members"].as_array().unwrap() {
            let k = format!(
                "{} {}",
                m["member"].as_str().unwrap(),
                sig(m["k"].as_f64().unwrap(), 3)
            );
            assert!(sec.contains(&k), "no in-plane K {k}");
        }
    }
    assert!(sec.matches("<svg").count() >= 3);
    assert!(sec.contains("<polyline"));
    let u = &v["u_frame"];
    let cd = u["spring"]["stiffness"].as_f64().unwrap();
    assert!(sec.contains(&format!("= {} kip/ft", sig(cd, 4))), "{cd}");
    let mut largest = std::collections::BTreeMap::<String, f64>::new();
    for r in u["results"].as_array().unwrap() {
        let lam = sig(r["critical_factor"].as_f64().unwrap(), 4);
        assert!(
            sec.contains(&format!(
                "<td>{}</td><td class=\"n\">{lam}</td>",
                r["case"].as_str().unwrap()
            )),
            "no chord row {lam}"
        );
        for m in r["members"].as_array().unwrap() {
            let (id, k) = (m["member"].as_str().unwrap(), m["k"].as_f64().unwrap());
            let kl = m["effective_length"].as_f64().unwrap();
            assert!(sec.contains(&format!("{id} {} ({} ft)", sig(k, 3), sig(kl, 3))));
            let e = largest.entry(id.to_string()).or_insert(0.0);
            *e = e.max(k);
        }
    }
    // The K used by rate: its notes give k_out with three decimals.
    let r = json_of(&pony(), &["rate", "--format", "json"]);
    let notes: Vec<&str> = r["notes"]
        .as_array()
        .unwrap()
        .iter()
        .map(|n| n.as_str().unwrap())
        .collect();
    for (id, k) in &largest {
        let used = k.max(1.0);
        let note = format!("member \"{id}\": k_out {used:.3} from the U-frame analysis");
        assert!(notes.iter().any(|n| n.contains(&note)), "rate lacks {note}");
        let row = format!(
            "<tr><td>{id}</td><td>out of plane</td><td class=\"n\">{}</td>",
            sig(used, 3)
        );
        assert!(sec.contains(&row), "no K-used row {row}");
    }
    // The report's rating used the same K: its notes are in the page.
    assert!(html.contains("from its U-frames"));
    let vib = &v["vibration"];
    for m in vib["modes"].as_array().unwrap() {
        let f = sig(m["frequency"].as_f64().unwrap(), 4);
        assert!(
            sec.contains(&format!("<td class=\"n\">{f}</td>")),
            "no mode {f} Hz"
        );
    }
    for c in vib["criteria"].as_array().unwrap() {
        let value = c["value"].as_f64().map_or("-".into(), |f| sig(f, 3));
        let ok = match c["ok"].as_bool() {
            Some(true) => "yes",
            Some(false) => "NO",
            None => "-",
        };
        let check = c["check"]
            .as_str()
            .unwrap()
            .replace('<', "&lt;")
            .replace('>', "&gt;");
        let row = format!("<td>{check}</td><td class=\"n\">{value}</td>");
        assert!(sec.contains(&row), "no criterion {row}");
        assert!(sec.contains(&format!(
            "{row}<td>{}</td><td>{ok}</td>",
            c["limit"].as_str().unwrap().replace('>', "&gt;")
        )));
    }
    let d = &vib["deflection"];
    let text = format!(
        "deflection {} in against span/{} = {} in: <strong>{}</strong>",
        sig(d["value"].as_f64().unwrap(), 3),
        d["ratio"].as_f64().unwrap(),
        sig(d["limit"].as_f64().unwrap(), 3),
        if d["ok"].as_bool().unwrap() {
            "ok"
        } else {
            "EXCEEDS"
        }
    );
    assert!(sec.contains(&text), "no deflection check {text}");
    for clause in ["EN 1993-2", "6.14.2.9", "Pedestrian Bridges", "EN 1990"] {
        assert!(sec.contains(clause), "no clause {clause}");
    }
    // Listed in the contents.
    assert!(html.contains(r##"<a href="#stability">"##));
}

/// Ids and the title reach the page escaped: a case named with markup
/// shows as text, and the page still parses as XML.
#[test]
fn stability_section_escapes_text() {
    let text = pony()
        .replace("id: \"crowd\"", "id: \"crowd <b>&\"")
        .replace("(\"crowd\", 1.75)", "(\"crowd <b>&\", 1.75)");
    let html = report_of(&text, &[]);
    xml_ok(&html);
    let sec = section(&html);
    assert!(sec.contains("crowd &lt;b&gt;&amp;"));
    assert!(!html.contains("crowd <b>"));
}

/// A model without a stability section gets no stability section (and
/// its report is otherwise unchanged by this feature).
#[test]
fn no_stability_section_without_its_data() {
    let html = report_of(common::FOUR_PANEL, &[]);
    assert!(!html.contains(r#"id="stability""#));
    assert!(!html.contains(r##"href="#stability""##));
}

/// The check rows of a `rate --format json` run: member, case → row.
fn checks(v: &serde_json::Value) -> Vec<serde_json::Value> {
    v["checks"].as_array().unwrap().clone()
}

/// A pin-jointed truss buckles member by member: the mode of each effect
/// is its weakest compression member as a pinned-pinned strut, K = 1
/// (Euler; the four elements per member give π²EI/L² within 0.01 %, see
/// tests/stability.rs). The demo truss's k_in is 1.0, so
/// `--k-from buckling` changes no capacity (to 1e-4) and says which
/// members took K ≈ 1.000.
#[test]
fn k_from_buckling_on_a_pinned_truss_changes_nothing() {
    let plain = json_of(common::FOUR_PANEL, &["rate", "--format", "json"]);
    let from = json_of(
        common::FOUR_PANEL,
        &["rate", "--format", "json", "--k-from", "buckling"],
    );
    let (a, b) = (checks(&plain), checks(&from));
    assert_eq!(a.len(), b.len());
    for (x, y) in a.iter().zip(&b) {
        assert_eq!(x["member"], y["member"]);
        let (cx, cy) = (
            x["capacity"].as_f64().unwrap(),
            y["capacity"].as_f64().unwrap(),
        );
        assert!((cx - cy).abs() <= 1e-4 * cx.abs(), "{x} vs {y}");
    }
    let notes: Vec<String> = from["notes"]
        .as_array()
        .unwrap()
        .iter()
        .map(|n| n.as_str().unwrap().to_string())
        .collect();
    assert!(notes.iter().any(|n| n.contains("--k-from buckling")));
    let taken: Vec<&String> = notes.iter().filter(|n| n.contains(": k_in ")).collect();
    assert!(!taken.is_empty(), "{notes:?}");
    for n in taken {
        assert!(n.contains("k_in 1.000") || n.contains("k_in 0.999"), "{n}");
    }
    // Without the flag, nothing is taken from buckling.
    assert!(!plain["notes"].to_string().contains("--k-from buckling"));
}

/// A two-span continuous strut, by hand. A–B–C straight, spans L = 4 m,
/// pinned at A and C, held laterally at B, continuous (rigid) at B;
/// span AB has I₁ = 2·10⁶ mm⁴, span BC I₂ = 4·10⁶ mm⁴ (i_in), same P in
/// both. Slope-deflection with the stability function of a strut pinned at
/// its far end (near-end stiffness (EI/L)·u²·tan u/(tan u − u), u = L√(P/EI);
/// Timoshenko & Gere, Theory of Elastic Stability, §2.x, from memory): the
/// joint B buckles when I₁·f(u₁) + I₂·f(u₂) = 0 with u₂ = u₁·√(I₁/I₂);
/// bisection on (π, 4.4934) gives u₁ = 3.67100, u₂ = 2.59579, so
/// K₁ = π/u₁ = 0.85579 (restrained by the stiffer span) and
/// K₂ = π/u₂ = 1.21027 (it restrains, so it is longer than its length).
/// `rate --k-from buckling` must check AB and BC in plane with these K:
/// slenderness_in = K·L/r_in, r = √(I/A), A = 2000 mm².
#[test]
fn k_from_buckling_two_span_strut_by_hand() {
    let model = r#"(
    units: (length: "m", force: "kN", section: "mm", stress: "MPa"),
    materials: [(id: "s", e: 200000.0, fy: 250.0, fu: 400.0)],
    sections: [
        (id: "weak", area: 2000.0, i_in: 2.0e6, i_out: 1.0e8),
        (id: "stiff", area: 2000.0, i_in: 4.0e6, i_out: 1.0e8),
    ],
    nodes: [(id: "A", x: 0.0, y: 0.0), (id: "B", x: 4.0, y: 0.0), (id: "C", x: 8.0, y: 0.0)],
    members: [
        (id: "AB", start: "A", end: "B", section: "weak", material: "s"),
        (id: "BC", start: "B", end: "C", section: "stiff", material: "s"),
    ],
    supports: [(node: "A", kind: Pin), (node: "B", kind: Roller), (node: "C", kind: Roller)],
    load_cases: [(id: "push", kind: Dead, loads: [(node: "C", fx: -100.0)])],
    stability: (rigid_joints: ["B"]),
)"#;
    // The hand solution, checked here by the same characteristic equation.
    let f = |u: f64| u * u * u.tan() / (u.tan() - u);
    let g = |u1: f64| 2.0e6 * f(u1) + 4.0e6 * f(u1 * 0.5f64.sqrt());
    let (mut lo, mut hi) = (PI + 1e-9, 4.4934);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if g(lo) * g(mid) <= 0.0 {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    let u1 = lo;
    assert!((u1 - 3.67100).abs() < 1e-4, "{u1}");
    let k1 = PI / u1;
    let k2 = PI / (u1 * 0.5f64.sqrt());
    let plain = json_of(model, &["rate", "--format", "json"]);
    let from = json_of(model, &["rate", "--format", "json", "--k-from", "buckling"]);
    let find = |v: &serde_json::Value, id: &str| {
        checks(v)
            .into_iter()
            .find(|c| c["member"] == id && c["case"] == "push")
            .unwrap()
    };
    for (id, i, k) in [("AB", 2.0e6f64, k1), ("BC", 4.0e6, k2)] {
        let r = (i / 2000.0).sqrt();
        let l = 4000.0;
        let user = find(&plain, id)["slenderness_in"].as_f64().unwrap();
        assert!((user - l / r).abs() < 1e-6 * user, "{id} {user}");
        let got = find(&from, id)["slenderness_in"].as_f64().unwrap();
        let want = k * l / r;
        assert!(
            (got - want).abs() < 2e-3 * want,
            "{id}: {got} vs K L/r = {want}"
        );
    }
    let notes = from["notes"].to_string();
    assert!(notes.contains("member \\\"AB\\\": k_in 0.85"), "{notes}");
    assert!(notes.contains("member \\\"BC\\\": k_in 1.21"), "{notes}");
    assert!(notes.contains("largest over the effects"));
    // The report says the same, in the stability section.
    let html = report_of(model, &["--k-from", "buckling"]);
    let sec = section(&html);
    assert!(
        sec.contains(&format!(
            "<tr><td>AB</td><td>in plane</td><td class=\"n\">{}</td>",
            sig(k1, 3)
        )),
        "{sec}"
    );
    assert!(sec.contains(&format!(
        "<tr><td>BC</td><td>in plane</td><td class=\"n\">{}</td>",
        sig(k2, 3)
    )));
    assert!(sec.contains("in-plane buckling of “push”"));
}

/// Issue 22 item 9: the page goes to the writer section by section (many
/// writes, none near the whole page) and is the same bytes as the
/// one-string form.
#[test]
fn report_is_streamed_to_the_writer() {
    struct Counting {
        bytes: Vec<u8>,
        writes: usize,
        largest: usize,
    }
    impl std::io::Write for Counting {
        fn write(&mut self, b: &[u8]) -> std::io::Result<usize> {
            self.writes += 1;
            self.largest = self.largest.max(b.len());
            self.bytes.extend_from_slice(b);
            Ok(b.len())
        }
        fn flush(&mut self) -> std::io::Result<()> {
            Ok(())
        }
    }
    let text = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/models/millrace-footbridge.ron"
    ))
    .unwrap();
    let m = common::load(&text);
    let a = panelpoint::analysis::analyse(&m).unwrap();
    let method = panelpoint::rate::choose_method(&m, None).unwrap();
    let r = panelpoint::rate::rate(&m, &a, method).unwrap();
    let whole = panelpoint::report::html::report(&m, &a, Ok(&r), &[]);
    let mut w = Counting {
        bytes: Vec::new(),
        writes: 0,
        largest: 0,
    };
    panelpoint::report::html::write_report(
        &mut w,
        &m,
        &a,
        Ok(&r),
        &[],
        &panelpoint::report::html::Extras::default(),
    )
    .unwrap();
    assert_eq!(w.bytes, whole.as_bytes());
    assert!(w.writes >= 10, "{} writes", w.writes);
    assert!(
        w.largest * 4 < whole.len(),
        "largest write {} of {}",
        w.largest,
        whole.len()
    );
}
