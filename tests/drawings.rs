//! Drawings and the HTML report as a person meets them: the SVG parses as
//! XML and renders (resvg) with tension and compression members in their
//! own colours where statics puts them, utilization in the ramp colour,
//! the HTML is well formed and self-contained, a headless browser opens it
//! without console errors, and text tables fit a narrow terminal.

mod common;
use common::*;
use panelpoint::report::svg::{self, palette, Drawing, InfluenceLine, Show};
use std::path::Path;

/// Render SVG text to a pixmap with resvg (no fonts: text is not drawn,
/// which keeps member pixels clear of labels).
fn render(svg_text: &str) -> resvg::tiny_skia::Pixmap {
    let tree = resvg::usvg::Tree::from_str(svg_text, &resvg::usvg::Options::default())
        .expect("usvg parses the drawing");
    let size = tree.size().to_int_size();
    let mut pix = resvg::tiny_skia::Pixmap::new(size.width(), size.height()).unwrap();
    resvg::render(
        &tree,
        resvg::tiny_skia::Transform::default(),
        &mut pix.as_mut(),
    );
    pix
}

fn pixel(p: &resvg::tiny_skia::Pixmap, x: f64, y: f64) -> [u8; 3] {
    let c = p
        .pixel(x.round() as u32, y.round() as u32)
        .expect("pixel inside the drawing");
    [c.red(), c.green(), c.blue()]
}

fn near(a: [u8; 3], b: [u8; 3], tol: i32) -> bool {
    (0..3).all(|i| (a[i] as i32 - b[i] as i32).abs() <= tol)
}

/// Page coordinates of the first `<line>` with this member id and class.
fn member_line(doc: &roxmltree::Document, id: &str, class: &str) -> ((f64, f64), (f64, f64)) {
    let n = doc
        .descendants()
        .find(|n| {
            n.has_tag_name("line")
                && n.attribute("data-member") == Some(id)
                && n.attribute("class")
                    .is_some_and(|c| c.split(' ').any(|w| w == class))
        })
        .unwrap_or_else(|| panic!("no {class} line for member {id}"));
    let f = |a: &str| n.attribute(a).unwrap().parse::<f64>().unwrap();
    ((f("x1"), f("y1")), (f("x2"), f("y2")))
}

/// Colours found across the member at its midpoint (±8 px normal to it).
fn across(p: &resvg::tiny_skia::Pixmap, a: (f64, f64), b: (f64, f64)) -> Vec<[u8; 3]> {
    let (mx, my) = ((a.0 + b.0) / 2.0, (a.1 + b.1) / 2.0);
    let l = (b.0 - a.0).hypot(b.1 - a.1);
    let (nx, ny) = (-(b.1 - a.1) / l, (b.0 - a.0) / l);
    (-8..=8)
        .map(|k| pixel(p, mx + nx * k as f64, my + ny * k as f64))
        .collect()
}

fn four_panel() -> (panelpoint::model::Model, panelpoint::analysis::Analysis) {
    solve(FOUR_PANEL)
}

#[test]
fn forces_drawing_parses_and_shows_tension_and_compression_where_statics_puts_them() {
    let (m, a) = four_panel();
    let effects = svg::effects(&m, &a);
    let mut d = Drawing::new(&m, Show::Forces);
    d.effect = Some(&effects[0]);
    let text = svg::draw(&d);
    let doc = roxmltree::Document::parse(&text).expect("the SVG is well-formed XML");
    assert_eq!(doc.root_element().tag_name().name(), "svg");
    let pix = render(&text);

    // Gravity loads on a simply supported Pratt truss: the bottom chord is in
    // tension and the top chord in compression (method of sections, M/h).
    let (ta, tb) = member_line(&doc, "L1-L2", "tension");
    let (ca, cb) = member_line(&doc, "U1-U2", "compression");
    let t = palette::rgb(palette::TENSION);
    let c = palette::rgb(palette::COMPRESSION);
    let tension_px = across(&pix, ta, tb);
    assert!(tension_px.iter().any(|&p| near(p, t, 12)), "{tension_px:?}");
    assert!(
        !tension_px.iter().any(|&p| near(p, c, 40)),
        "{tension_px:?}"
    );
    let mid = pixel(&pix, (ca.0 + cb.0) / 2.0, (ca.1 + cb.1) / 2.0);
    assert!(near(mid, c, 12), "compression midpoint {mid:?}");
    // The middle of a tension member shows the pale core: a double line.
    let core = palette::rgb(palette::TENSION_CORE);
    assert!(
        tension_px.iter().any(|&p| near(p, core, 16)),
        "{tension_px:?}"
    );

    // Not blank: a good share of the pixels are not paper.
    let inked = pix
        .pixels()
        .iter()
        .filter(|p| (p.red(), p.green(), p.blue()) != (255, 255, 255))
        .count();
    assert!(inked > 5_000, "only {inked} inked pixels");

    // Legend, units, title and caution are in the drawing.
    for s in [
        "Legend",
        "compression (C)",
        "tension (T)",
        "kip",
        "ft",
        "Four-panel example",
        "CAUTION",
    ] {
        assert!(text.contains(s), "drawing lacks {s:?}");
    }
    // A label gives the force of L1-L2: 3 × 9 kip loads, R = 13.5 kip, cut
    // at L1–L2 about U1: 13.5 × 18 / 16 = 15.19 kip (method of sections).
    assert!(text.contains("15.2 T"), "no 15.2 T label");
}

#[test]
fn utilization_drawing_uses_the_ramp_colour_of_the_rated_utilization() {
    let (m, a) = four_panel();
    let method = panelpoint::rate::choose_method(&m, None).unwrap();
    let r = panelpoint::rate::rate(&m, &a, method).unwrap();
    let mut d = Drawing::new(&m, Show::Utilization);
    d.rating = Some(&r);
    let text = svg::draw(&d);
    let doc = roxmltree::Document::parse(&text).unwrap();
    let pix = render(&text);
    let ctrl = &r.checks[r.controlling.unwrap()];
    let id = &m.members[ctrl.member].id;
    let (p, q) = member_line(&doc, id, "member");
    let mid = pixel(&pix, (p.0 + q.0) / 2.0, (p.1 + q.1) / 2.0);
    let want = palette::rgb(&palette::utilization(ctrl.utilization));
    assert!(near(mid, want, 10), "{id}: {mid:?} against {want:?}");
    // The envelope: the controlling member's stated utilization is the
    // highest of all its checks.
    let stated: f64 = doc
        .descendants()
        .find(|n| {
            n.attribute("data-member") == Some(id.as_str())
                && n.attribute("data-utilization").is_some()
        })
        .and_then(|n| n.attribute("data-utilization"))
        .unwrap()
        .parse()
        .unwrap();
    assert_close!(stated, ctrl.utilization, 1e-3);
    assert!(text.contains("&gt; 1 fails"));
}

#[test]
fn failing_member_leaves_the_ramp_for_the_failure_colour() {
    // One bar of 1 in² with Fy 36 ksi under 100 kip tension: far past
    // yield (Fy·A = 36 kip), so it must fail (statics: N = 100 kip).
    let text = model_text(
        &[("A", 0.0, 0.0), ("B", 10.0, 0.0)],
        &[("AB", "A", "B")],
        &[("A", "Pin"), ("B", "Roller")],
        &[("B", 100.0, 0.0)],
    );
    let (m, a) = solve(&text.replace("area: 10.0", "area: 1.0"));
    let r =
        panelpoint::rate::rate(&m, &a, panelpoint::rate::choose_method(&m, None).unwrap()).unwrap();
    let mut d = Drawing::new(&m, Show::Utilization);
    d.rating = Some(&r);
    let svg_text = svg::draw(&d);
    let doc = roxmltree::Document::parse(&svg_text).unwrap();
    let (p, q) = member_line(&doc, "AB", "fails");
    let pix = render(&svg_text);
    let colours = across(&pix, p, q);
    assert!(
        colours
            .iter()
            .any(|&c| near(c, palette::rgb(palette::FAIL), 12)),
        "{colours:?}"
    );
}

#[test]
fn deflected_shape_sags_and_states_its_magnification() {
    let (m, a) = four_panel();
    let effects = svg::effects(&m, &a);
    let mut d = Drawing::new(&m, Show::Deflection);
    d.effect = Some(&effects[0]);
    let text = svg::draw(&d);
    let doc = roxmltree::Document::parse(&text).unwrap();
    let mag = svg::truss::magnification(&m, &effects[0].displacements);
    assert!(text.contains(&format!(
        "magnified ×{}",
        panelpoint::report::table::sig(mag, 3)
    )));
    // Gravity loads make a simply supported truss sag: the deflected
    // bottom chord at L2 lies below (larger page y) the undeformed one.
    let (u0, _) = member_line(&doc, "L2-L3", "undeformed");
    let (d0, _) = member_line(&doc, "L2-L3", "deflected");
    assert!(d0.1 > u0.1 + 5.0, "deflected {d0:?} undeformed {u0:?}");
    // The magnification is a 1-2-5 number.
    let lead = mag / 10f64.powf(mag.log10().floor());
    assert!(
        [1.0, 2.0, 5.0].iter().any(|v| (lead - v).abs() < 1e-9),
        "{mag}"
    );
    render(&text);
}

#[test]
fn inclined_roller_is_turned_to_its_surface_and_text_is_escaped() {
    let text = model_text(
        &[("A", 0.0, 0.0), ("B", 12.0, 0.0), ("C", 6.0, 8.0)],
        &[("AB", "A", "B"), ("AC", "A", "C"), ("CB", "C", "B")],
        &[("A", "Pin"), ("B", "InclinedRoller(angle: 30.0)")],
        &[("C", 0.0, -10.0)],
    )
    .replace("title: \"test\"", "title: \"Shed <east> & \\\"west\\\"\"");
    let (m, a) = solve(&text);
    let effects = svg::effects(&m, &a);
    let mut d = Drawing::new(&m, Show::Model);
    d.effect = Some(&effects[0]);
    let s = svg::draw(&d);
    let doc = roxmltree::Document::parse(&s).expect("escaped title keeps the XML well-formed");
    let title = doc.descendants().find(|n| n.has_tag_name("title")).unwrap();
    assert!(title.text().unwrap().starts_with("Shed <east> & \"west\""));
    let g = doc
        .descendants()
        .find(|n| n.attribute("class") == Some("support inclined-roller"))
        .expect("an inclined roller symbol");
    // 30° anticlockwise in the model is −30° in page coordinates (y down).
    assert!(
        g.attribute("transform").unwrap().contains("rotate(-30)"),
        "{:?}",
        g.attribute("transform")
    );
    assert!(doc
        .descendants()
        .any(|n| n.attribute("class") == Some("support pin")));
    assert!(s.contains("10.0 kip"), "load value with unit");
}

#[test]
fn influence_hook_plots_ordinates_under_the_truss() {
    let (m, _) = four_panel();
    // Left reaction of a simple span: R = 1 − x/L (statics by hand).
    let l = 72.0 * FT;
    let ords: Vec<(f64, f64)> = (0..=8)
        .map(|i| (l * i as f64 / 8.0, 1.0 - i as f64 / 8.0))
        .collect();
    let lines = [InfluenceLine {
        name: "reaction at L0".into(),
        unit: "kip per kip".into(),
        ordinates: ords,
    }];
    let mut d = Drawing::new(&m, Show::Model);
    d.influence = &lines;
    let s = svg::draw(&d);
    let doc = roxmltree::Document::parse(&s).unwrap();
    let g = doc
        .descendants()
        .find(|n| n.attribute("class") == Some("influence"))
        .expect("an influence strip");
    assert!(g.descendants().any(|n| n.has_tag_name("path")));
    assert!(s.contains("Influence line: reaction at L0 (kip per kip)"));
    render(&s);
}

fn report_html() -> String {
    let dir = std::env::temp_dir().join(format!("panelpoint-draw-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let out = dir.join("report.html");
    let model = Path::new(env!("CARGO_MANIFEST_DIR")).join("models/millrace-footbridge.ron");
    let (code, _, err) = run(&[
        "report",
        model.to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{err}");
    std::fs::read_to_string(out).unwrap()
}

#[test]
fn report_is_well_formed_self_contained_and_complete() {
    let html = report_html();
    let doc = roxmltree::Document::parse_with_options(
        &html,
        roxmltree::ParsingOptions {
            allow_dtd: true,
            ..Default::default()
        },
    )
    .expect("the report is well-formed (XHTML-compatible) markup");
    assert_eq!(doc.root_element().tag_name().name(), "html");
    let lower = html.to_lowercase();
    for bad in [
        "http:", "https:", "src=", "@import", "url(", "<link", "<script", "file:",
    ] {
        assert!(
            !lower.contains(bad),
            "the report holds an outside reference: {bad}"
        );
    }
    let svgs = doc.descendants().filter(|n| n.has_tag_name("svg")).count();
    // Model, forces and deflections per case and combination, utilization,
    // and a drawing of each of the demo's three built-up sections.
    assert!(svgs >= 8, "{svgs} drawings");
    assert_eq!(html.matches("section-drawing").count(), 3);
    for id in [
        "summary", "drawings", "model", "results", "checks", "ratings", "sections", "cautions",
    ] {
        assert!(
            doc.descendants().any(|n| n.attribute("id") == Some(id)),
            "no section {id}"
        );
    }
    for s in [
        "Controlling, inventory",
        "MBE Eq. 6A.4.2.1-1",
        "Controlling",
        "@media print",
        "break-before: page",
        "AASHTO LRFD 6.9.4.1.1",
        "qualified engineer",
        "bottom-chord",
        "millrace",
    ] {
        assert!(lower.contains(&s.to_lowercase()), "report lacks {s:?}");
    }
}

#[test]
fn headless_browser_opens_the_report_without_console_errors() {
    let Some(chromium) = ["chromium", "chromium-browser"].iter().find(|b| {
        std::process::Command::new("sh")
            .arg("-c")
            .arg(format!("command -v {b}"))
            .output()
            .is_ok_and(|o| o.status.success())
    }) else {
        println!("skipped: chromium is not on PATH (.ci/system-packages installs it in CI)");
        return;
    };
    let html = report_html();
    let dir = std::env::temp_dir().join(format!("panelpoint-chromium-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(dir.join("profile")).unwrap();
    let page = dir.join("report.html");
    std::fs::write(&page, html).unwrap();
    let png = dir.join("shot.png");
    let out = std::process::Command::new(chromium)
        .args([
            "--headless",
            "--no-sandbox",
            "--disable-gpu",
            "--disable-quic",
            "--no-first-run",
            "--disable-background-networking",
            "--disable-component-update",
            "--disable-sync",
            "--enable-logging=stderr",
            "--v=0",
        ])
        .arg(format!("--user-data-dir={}", dir.join("profile").display()))
        .arg(format!("--screenshot={}", png.display()))
        .arg("--window-size=1200,2000")
        .arg(format!("file://{}", page.display()))
        .output()
        .expect("run chromium");
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        !err.contains("Uncaught") && !err.contains("ERROR:CONSOLE"),
        "console errors:\n{err}"
    );
    let bytes =
        std::fs::read(&png).unwrap_or_else(|_| panic!("no screenshot; chromium said:\n{err}"));
    assert!(bytes.starts_with(b"\x89PNG"), "not a PNG");
    assert!(
        bytes.len() > 20_000,
        "screenshot suspiciously small: {} bytes",
        bytes.len()
    );
}

#[test]
fn draw_command_writes_svg_and_refuses_an_unknown_case() {
    let dir = std::env::temp_dir().join(format!("panelpoint-drawcli-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let model = Path::new(env!("CARGO_MANIFEST_DIR")).join("models/millrace-footbridge.ron");
    let out = dir.join("u.svg");
    let (code, _, err) = run(&[
        "draw",
        model.to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
        "--show",
        "utilization",
        "--case",
        "strength-crowd",
    ]);
    assert_eq!(code, 0, "{err}");
    let s = std::fs::read_to_string(&out).unwrap();
    roxmltree::Document::parse(&s).unwrap();
    assert!(
        s.contains("combination \"strength-crowd\"")
            || s.contains("combination &quot;strength-crowd&quot;")
    );
    let bad = dir.join("bad.svg");
    let (code, _, err) = run(&[
        "draw",
        model.to_str().unwrap(),
        "-o",
        bad.to_str().unwrap(),
        "--case",
        "nope",
    ]);
    assert_eq!(code, 2);
    assert!(
        err.contains("\"nope\"") && err.contains("\"deck\""),
        "{err}"
    );
    assert!(!bad.exists(), "no file on a usage error");
}

#[test]
fn rate_text_fits_a_narrow_terminal_and_has_no_colour_in_a_pipe() {
    let model = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/data/four_panel.ron");
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_panelpoint"))
        .args(["rate", model.to_str().unwrap()])
        .env("COLUMNS", "72")
        .env_remove("NO_COLOR")
        .output()
        .unwrap();
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(out.status.success());
    assert!(!text.contains('\x1b'), "colour in a pipe");
    assert!(text.contains("left out to fit 72 columns"), "{text}");
    // The check table's header and rule lines fit.
    let header = text
        .lines()
        .find(|l| l.starts_with("member  case"))
        .unwrap();
    assert!(header.chars().count() <= 72, "{header}");
    // Without COLUMNS, in a pipe, every column is there.
    let (_, full, _) = run(&["rate", model.to_str().unwrap()]);
    assert!(full.contains("Fe ksi") && !full.contains("left out"));
}
