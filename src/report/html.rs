//! `panelpoint report`: one self-contained HTML file a person reads and
//! prints. Inline CSS and inline SVG only (no scripts, no network, no
//! external assets); markup kept XHTML-compatible (every element closed,
//! attributes quoted) so it can be checked with an XML parser.
//!
//! Order: summary, drawings, model tables, results per effect, capacity
//! checks with clause, formula and inputs, rating factors, sections,
//! cautions.

use super::html_table::{esc, foot_html, n, on, row_html, t, Flush, HTable};
use super::rate_rows::{by_utilization, check_row};
use super::svg::{self, Drawing, Effect, Show};
use super::table::sig;
use super::{Scale, CAUTION};
use crate::analysis::Analysis;
use crate::capacity::Regime;
use crate::input::Diagnostic;
use crate::model::{CaseKind, Model, Restraint};
use crate::rate::Rating;
use std::fmt::Write;

const STYLE: &str = r#"
:root { --ink:#1d2430; --faint:#9aa3ad; --rule:#d5dae0; --band:#f4f6f8; --fail:#d0451b; --ok:#2f6f4f; --accent:#1b4482; }
* { box-sizing: border-box; }
body { font-family: "DejaVu Sans", Arial, Helvetica, sans-serif; color: var(--ink); margin: 0 auto; max-width: 1120px; padding: 18px 26px 40px; line-height: 1.4; font-size: 14px; background: #fff; }
h1 { font-size: 24px; margin: 4px 0 6px; }
h2 { font-size: 19px; border-bottom: 2px solid var(--ink); padding-bottom: 3px; margin-top: 34px; }
h3 { font-size: 15.5px; margin: 22px 0 6px; }
.caution { border: 2px solid var(--ink); padding: 8px 12px; font-weight: bold; margin: 10px 0; }
.meta { color: #3d4653; margin: 2px 0; }
nav ol { columns: 2; margin: 6px 0; }
nav a, a { color: var(--accent); }
.wide { overflow-x: auto; max-width: 100%; }
table { border-collapse: collapse; margin: 6px 0 12px; font-size: 12.5px; }
th, td { border: 1px solid var(--rule); padding: 3px 7px; vertical-align: top; }
th { text-align: left; border-bottom: 2px solid var(--ink); }
td.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
tbody tr:nth-child(even) { background: var(--band); }
tr.fails td { font-weight: bold; }
tr.fails td.flag { color: var(--fail); }
tr.controlling td { border-top: 2px solid var(--ink); border-bottom: 2px solid var(--ink); }
.verdict { font-size: 17px; font-weight: bold; padding: 8px 12px; border-left: 8px solid var(--ok); margin: 8px 0; }
.verdict.fails { border-left-color: var(--fail); }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: 3px 16px; margin: 8px 0; }
dl.facts dt { font-weight: bold; }
dl.facts dd { margin: 0; }
.ubar { display: inline-block; position: relative; width: 120px; height: 10px; border: 1px solid var(--ink); vertical-align: middle; margin-right: 6px; }
.ubar span { position: absolute; left: 0; top: 0; bottom: 0; background: var(--accent); }
.ubar.fails span { background: var(--fail); }
.ubar i { position: absolute; top: -3px; bottom: -3px; border-left: 2px solid var(--ink); }
.ubar.big { width: 420px; height: 16px; }
figure { margin: 12px 0 20px; }
figure svg { max-width: 100%; height: auto; border: 1px solid var(--rule); }
figcaption { font-size: 12.5px; color: #3d4653; margin-top: 3px; }
code, .formula { font-family: "DejaVu Sans Mono", Consolas, monospace; font-size: 12px; }
.note { color: #3d4653; }
footer { margin-top: 30px; border-top: 1px solid var(--ink); padding-top: 8px; font-size: 12px; }
@media print {
  body { max-width: none; padding: 0; font-size: 11px; }
  nav { display: none; }
  .wide { overflow: visible; }
  section.major { break-before: page; page-break-before: always; }
  h2, h3 { break-after: avoid; page-break-after: avoid; }
  table { font-size: 9.5px; }
  thead { display: table-header-group; }
  tr, figure, .verdict, dl.facts { break-inside: avoid; page-break-inside: avoid; }
  tbody tr:nth-child(even) { background: none; }
  .ubar span { background: none; border-right: 2px solid #000; }
  .ubar.fails span { background: none; border-right: 4px double #000; }
  a { color: inherit; text-decoration: none; }
  figure svg { border: none; }
}
"#;

/// A utilization bar with its value; the tick marks 1.0 on a 0–1.5 scale.
fn ubar(u: f64, big: bool) -> String {
    let frac = if u.is_finite() {
        (u / 1.5).clamp(0.0, 1.0)
    } else {
        0.0
    };
    format!(
        r#"<span class="ubar{}{}"><span style="width:{:.1}%"></span><i style="left:66.7%"></i></span>{}{}"#,
        if big { " big" } else { "" },
        if u > 1.0 { " fails" } else { "" },
        frac * 100.0,
        // Only a zero capacity makes |force|/C not finite (issue 22 item 16).
        if u.is_finite() {
            esc(&sig(u, 3))
        } else {
            "zero capacity".into()
        },
        if u > 1.0 { " FAILS" } else { "" }
    )
}

fn clean(v: f64, largest: f64, d: usize) -> (bool, String) {
    if v.abs() <= 1e-10 * largest {
        (true, "0".into())
    } else {
        n(v, d)
    }
}

/// Inline SVG for HTML: the namespace is implied there, so the attribute
/// (a URI) is dropped and the report holds no outside address at all.
fn inline(svg: &str) -> String {
    svg.replacen(r#" xmlns="http://www.w3.org/2000/svg""#, "", 1)
}

/// The whole report as one HTML string. `rating` is the rating, or why
/// the capacity checks could not be made.
pub fn report(
    model: &Model,
    analysis: &Analysis,
    rating: Result<&Rating, String>,
    warnings: &[Diagnostic],
) -> String {
    report_with_fatigue(model, analysis, rating, warnings, None)
}

/// [`report`] with a fatigue section when `fatigue` is given (the
/// evaluation, or why it could not be made).
pub fn report_with_fatigue(
    model: &Model,
    analysis: &Analysis,
    rating: Result<&Rating, String>,
    warnings: &[Diagnostic],
    fatigue: Option<Result<&crate::fatigue::Fatigue, String>>,
) -> String {
    let extras = Extras {
        fatigue,
        stability: None,
    };
    let mut out = Vec::with_capacity(1 << 18);
    // Writing into a Vec cannot fail, and every piece written is a &str.
    let _ = write_report(&mut out, model, analysis, rating, warnings, &extras);
    String::from_utf8(out).unwrap_or_default()
}

/// The report's optional sections.
#[derive(Default)]
pub struct Extras<'a> {
    /// The fatigue evaluation, or why it could not be made.
    pub fatigue: Option<Result<&'a crate::fatigue::Fatigue, String>>,
    /// Whole-truss stability and vibration (issue 19).
    pub stability: Option<StabilityPart<'a>>,
}

/// What the stability section shows.
pub struct StabilityPart<'a> {
    /// The analysis, or why it could not be made.
    pub report: Result<&'a crate::stability::run::StabilityReport, String>,
    /// Whether the rating took in-plane K from the buckling modes.
    pub k_from_buckling: bool,
    /// The model file's own (k_in, k_out) of each member, before any K
    /// taken from these analyses.
    pub given_k: Vec<(f64, f64)>,
}

/// The report written section by section into `w` (issue 22, item 9: the
/// page is never held whole in memory; at most one section is).
pub fn write_report(
    w: &mut dyn std::io::Write,
    model: &Model,
    analysis: &Analysis,
    rating: Result<&Rating, String>,
    warnings: &[Diagnostic],
    extras: &Extras,
) -> std::io::Result<()> {
    let fatigue = &extras.fatigue;
    let s = Scale::of(model);
    let effects = svg::effects_rated(model, analysis, rating.as_ref().ok().copied());
    let title = if model.title.is_empty() {
        "(untitled model)".to_string()
    } else {
        model.title.clone()
    };
    let mut h = String::with_capacity(1 << 16);
    let mut flush = |h: &mut String| -> std::io::Result<()> {
        w.write_all(h.as_bytes())?;
        h.clear();
        Ok(())
    };
    h.push_str("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n");
    h.push_str("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"/>\n");
    let _ = writeln!(h, "<title>{} — panelpoint report</title>", esc(&title));
    let _ = writeln!(h, "<style>{STYLE}</style>\n</head>\n<body>");

    // Header.
    h.push_str("<header>\n");
    let _ = writeln!(h, "<h1>{}</h1>", esc(&title));
    let _ = writeln!(h, r#"<p class="caution">CAUTION: {}</p>"#, esc(CAUTION));
    let _ = writeln!(
        h,
        r#"<p class="meta">panelpoint {} report. Units: lengths {}, forces {}, sections and displacements {}, stresses {}.</p>"#,
        env!("CARGO_PKG_VERSION"),
        esc(s.length_name),
        esc(s.force_name),
        esc(s.disp_name),
        esc(s.stress_name)
    );
    let _ = writeln!(
        h,
        r#"<p class="meta">{} nodes, {} members, {} supports, {} load cases, {} combinations. Determinacy: {}.</p>"#,
        model.nodes.len(),
        model.members.len(),
        model.supports.len(),
        model.cases.len(),
        model.combinations.len(),
        esc(&model.determinacy().describe())
    );
    h.push_str("</header>\n<nav><strong>Contents</strong><ol>");
    for (id, name) in [
        ("summary", "Summary"),
        ("moving", "Moving loads"),
        ("ratings", "Rating factors"),
        ("checks", "Capacity of each member"),
        ("joints", "Joints"),
        ("drawings", "Drawings"),
        ("model", "Model"),
        ("results", "Results per load case and combination"),
        ("sections", "Sections"),
        ("fatigue", "Fatigue"),
        ("stability", "Stability and vibration"),
        ("appendix", "Appendix: every check"),
        ("cautions", "Cautions"),
    ] {
        if (id == "moving" && model.live.moving.is_empty())
            || (id == "fatigue" && fatigue.is_none())
            || (id == "joints" && model.gussets.is_empty() && model.pins.is_empty())
            || (id == "stability" && extras.stability.is_none())
        {
            continue;
        }
        let _ = write!(h, r##"<li><a href="#{id}">{name}</a></li>"##);
    }
    h.push_str("</ol></nav>\n");
    flush(&mut h)?;

    summary(&mut h, model, analysis, &rating, warnings, &s);
    summary_drawing(&mut h, model, rating.as_ref().ok().copied());
    flush(&mut h)?;
    super::html_loads::moving_loads(&mut h, model, rating.as_ref().ok().copied(), &s);
    flush(&mut h)?;
    ratings(&mut h, model, &rating, &s);
    flush(&mut h)?;
    checks(&mut h, model, &rating, &s);
    flush(&mut h)?;
    super::html_joints::joints(&mut h, model, rating.as_ref().ok().copied(), &mut flush)?;
    flush(&mut h)?;
    drawings(
        &mut h,
        model,
        &effects,
        rating.as_ref().ok().copied(),
        &mut flush,
    )?;
    model_tables(&mut h, model, &s);
    flush(&mut h)?;
    results(&mut h, model, analysis, &effects, &s, &mut flush)?;
    flush(&mut h)?;
    sections(&mut h, model, &s);
    flush(&mut h)?;
    if let Some(f) = fatigue {
        fatigue_section(&mut h, model, f);
        flush(&mut h)?;
    }
    if let Some(st) = &extras.stability {
        super::html_stability::stability(&mut h, model, st);
        flush(&mut h)?;
    }
    appendix(&mut h, model, &rating, &s, &mut flush)?;
    flush(&mut h)?;

    h.push_str(r#"<section class="major" id="cautions"><h2>Cautions</h2>"#);
    let _ = writeln!(h, "<p><strong>{}</strong></p>", esc(CAUTION));
    h.push_str("<ul>\n<li>These are screening results for review by a qualified engineer; they are not a load rating or an approval by themselves.</li>\n");
    h.push_str("<li>The analysis assumes an ideal pin-jointed plane truss: axial members, loads at panel points, small displacements, linear elastic material.</li>\n");
    h.push_str("<li>Section properties, material strengths, condition and effective lengths are as entered in the model file; verify them against the structure as found.</li>\n");
    if !model.gussets.is_empty() {
        h.push_str("<li>Gusset plates and fastener groups are rated only where the model describes them (see Joints), with the member force shared equally by a concentric group; rivet strengths and several clause numbers are from memory.</li>\n");
    }
    let connections = if model.gussets.is_empty() {
        "Connections, gusset plates"
    } else {
        "Connections and gusset plates the model does not describe"
    };
    let _ = writeln!(h, "<li>{connections}, pins, bearings, fracture toughness, out-of-plane stability of the whole truss and deck, and local buckling of built-up parts are not checked here; fatigue only where the model has a fatigue block (see its section).</li>");
    h.push_str("<li>Local codes, the owner's rating rules and licensed practice govern.</li>\n</ul>\n</section>\n");
    let _ = writeln!(
        h,
        "<footer>Generated by panelpoint {}. {}</footer>\n</body>\n</html>",
        env!("CARGO_PKG_VERSION"),
        esc(CAUTION)
    );
    flush(&mut h)
}

fn summary(
    h: &mut String,
    model: &Model,
    analysis: &Analysis,
    rating: &Result<&Rating, String>,
    warnings: &[Diagnostic],
    s: &Scale,
) {
    h.push_str(r#"<section id="summary"><h2>Summary</h2>"#);
    match rating {
        Err(why) => {
            let _ = writeln!(
                h,
                r#"<p class="verdict fails">Capacity checks not made: {}</p>"#,
                esc(why)
            );
        }
        Ok(r) => {
            let failing: Vec<usize> = by_utilization(r)
                .into_iter()
                .filter(|&i| !r.checks[i].service && r.checks[i].utilization > 1.0)
                .collect();
            let counted = r.checks.iter().filter(|c| !c.service).count();
            if failing.is_empty() {
                let _ = writeln!(
                    h,
                    r#"<p class="verdict">All {counted} strength checks within capacity (utilization ≤ 1).</p>"#
                );
            } else {
                let _ = writeln!(
                    h,
                    r#"<p class="verdict fails">{} of {counted} strength checks exceed capacity (utilization &gt; 1).</p>"#,
                    failing.len()
                );
            }
            h.push_str(r#"<dl class="facts">"#);
            let _ = write!(
                h,
                "<dt>Rating method</dt><dd>{} — {}</dd>",
                esc(&r.method.name),
                esc(r.method.equation)
            );
            if r.lowest_by_level.is_empty() {
                h.push_str(
                    "<dt>Rating factors</dt><dd>none: the model declares no Live load case or moving load, or the method is a screening curve without a safety factor</dd>",
                );
            }
            for &(level, i) in &r.lowest_by_level {
                let row = super::rate_rows::rating_row(model, r, &r.ratings[i]);
                let _ = write!(
                    h,
                    "<dt>Controlling, {}</dt><dd>RF <strong>{}</strong> — member <strong>{}</strong> for “{}”{} <span class=\"note\">({})</span></dd>",
                    esc(level),
                    esc(&row.rf.map_or("-".into(), |v| sig(v, 3))),
                    esc(row.member),
                    esc(row.live),
                    row.at.map_or(String::new(), |a| format!(", {}", esc(a))),
                    esc(&row.factors)
                );
            }
            super::html_joints::summary_facts(h, model, r);
            for p in &r.postings {
                let v = super::rate_rows::posting_view(model, r, p);
                let _ = write!(
                    h,
                    "<dt>Posting, “{}”</dt><dd>W = {} {} ({} {}); lowest legal RF {} at member {}: <strong>{}</strong> <span class=\"note\">({})</span></dd>",
                    esc(v.vehicle),
                    esc(&sig(v.weight, 4)),
                    esc(s.force_name),
                    esc(&sig(v.weight_tons, 3)),
                    v.ton_name,
                    esc(&sig(v.rf, 3)),
                    esc(&v.member),
                    esc(&super::rate_rows::posting_words(&v)),
                    esc(v.clause)
                );
            }
            if let Some(i) = r.controlling {
                let c = check_row(model, r, &r.checks[i]);
                let _ = write!(
                    h,
                    "<dt>Controlling</dt><dd>member <strong>{}</strong> under “{}”: {} {} against a capacity of {} {} ({}, {})</dd><dt>Highest utilization</dt><dd>{}</dd>",
                    esc(c.member),
                    esc(c.case),
                    esc(&sig(c.force, 4)),
                    esc(s.force_name),
                    esc(&sig(c.capacity, 4)),
                    esc(s.force_name),
                    esc(c.regime),
                    esc(c.clause),
                    ubar(c.utilization, true)
                );
            }
            h.push_str("</dl>\n");
            if !failing.is_empty() {
                h.push_str("<h3>Checks that fail</h3>\n");
                let fu = format!("force {}", s.force_name);
                let cu = format!("capacity {}", s.force_name);
                let mut tb = HTable::new(&[
                    "member",
                    "case",
                    &fu,
                    &cu,
                    "regime",
                    "utilization",
                    "clause",
                ]);
                for &i in failing.iter().take(60) {
                    let c = check_row(model, r, &r.checks[i]);
                    tb.row(
                        "fails",
                        vec![
                            t(c.member),
                            t(c.case),
                            n(c.force, 4),
                            n(c.capacity, 4),
                            t(c.regime),
                            (true, ubar(c.utilization, false)),
                            t(c.clause),
                        ],
                    );
                }
                tb.html(h);
                if failing.len() > 60 {
                    let _ = writeln!(
                        h,
                        r#"<p class="note">… and {} more; all are in the checks table.</p>"#,
                        failing.len() - 60
                    );
                }
            }
            // Stated defaults and assumptions stay on the summary page; the
            // per-member notes (limits, modes, lacing) are collapsed.
            let (general, per_member): (Vec<&String>, Vec<&String>) =
                r.notes.iter().partition(|n| !n.starts_with("member \""));
            if !general.is_empty() {
                h.push_str("<h3>Notes: defaults taken and assumptions</h3>\n<ul>");
                for note in general {
                    let _ = write!(h, "<li>{}</li>", esc(note));
                }
                h.push_str("</ul>\n");
            }
            if !per_member.is_empty() {
                let _ = write!(
                    h,
                    "<details><summary>Notes on members ({}): slenderness limits, buckling modes, lacing (open to read or print)</summary>\n<ul>",
                    per_member.len()
                );
                for note in per_member {
                    let _ = write!(h, "<li>{}</li>", esc(note));
                }
                h.push_str("</ul></details>\n");
            }
        }
    }
    if !warnings.is_empty() || !analysis.warnings.is_empty() {
        h.push_str("<h3>Warnings</h3>\n<ul>");
        for w in warnings {
            let _ = write!(h, "<li>{}</li>", esc(&w.to_string()));
        }
        for w in &analysis.warnings {
            let _ = write!(h, "<li>{}</li>", esc(w));
        }
        h.push_str("</ul>\n");
    }
    // The section is closed by `summary_drawing`.
}

pub(super) fn figure(h: &mut String, svg_text: &str, caption: &str) {
    let _ = writeln!(
        h,
        "<figure>\n{}\n<figcaption>{}</figcaption>\n</figure>",
        inline(svg_text),
        esc(caption)
    );
}

/// The summary page's drawing: utilization of every member (or the model
/// when no checks were made), so the first page answers the owner alone.
fn summary_drawing(h: &mut String, model: &Model, rating: Option<&Rating>) {
    if let Some(r) = rating {
        let mut d = Drawing::new(model, Show::Utilization);
        d.rating = Some(r);
        figure(
            h,
            &svg::draw(&d),
            "Utilization of each member: the highest of every counted check (strength combinations, or the method's own service checks).",
        );
    }
    h.push_str("</section>\n");
}

fn drawings(
    h: &mut String,
    model: &Model,
    effects: &[Effect],
    rating: Option<&Rating>,
    flush: &mut Flush,
) -> std::io::Result<()> {
    h.push_str(r#"<section class="major" id="drawings"><h2>Drawings</h2>"#);
    let mut d = Drawing::new(model, Show::Model);
    d.effect = effects.first();
    figure(
        h,
        &svg::draw(&d),
        "The model to scale: node and member labels, supports, and the loads of the first load case.",
    );
    h.push_str("<h3>Member forces</h3>\n<details><summary>Member forces of each load case and combination (open to read or print)</summary>\n");
    for e in effects {
        flush(h)?;
        let mut d = Drawing::new(model, Show::Forces);
        d.effect = Some(e);
        figure(
            h,
            &svg::draw(&d),
            &format!(
                "Member forces, {} “{}”: compression solid amber, tension blue double line, width in proportion to the force.",
                if e.combination { "combination" } else { "load case" },
                e.id
            ),
        );
    }
    h.push_str("</details>\n");
    if let Some(r) = rating {
        h.push_str("<h3>Utilization</h3>\n");
        let mut d = Drawing::new(model, Show::Utilization);
        d.rating = Some(r);
        figure(
            h,
            &svg::draw(&d),
            "Utilization, the highest of every load case and combination for each member.",
        );
    }
    h.push_str("<h3>Deflected shape</h3>\n<details><summary>Deflected shape of each load case and combination (open to read or print)</summary>\n");
    for e in effects {
        flush(h)?;
        let mut d = Drawing::new(model, Show::Deflection);
        d.effect = Some(e);
        figure(
            h,
            &svg::draw(&d),
            &format!(
                "Deflected shape, {} “{}”, magnified as stated on the drawing.",
                if e.combination {
                    "combination"
                } else {
                    "load case"
                },
                e.id
            ),
        );
    }
    h.push_str("</details>\n</section>\n");
    flush(h)
}

fn model_tables(h: &mut String, model: &Model, s: &Scale) {
    h.push_str(r#"<section class="major" id="model"><h2>Model</h2>"#);
    h.push_str("<h3>Nodes</h3>\n");
    let xu = format!("x {}", s.length_name);
    let yu = format!("y {}", s.length_name);
    let mut tb = HTable::new(&["node", &xu, &yu]);
    for nd in &model.nodes {
        tb.row(
            "",
            vec![t(&nd.id), n(nd.x / s.length, 6), n(nd.y / s.length, 6)],
        );
    }
    tb.html(h);

    h.push_str("<h3>Members</h3>\n");
    let lu = format!("length {}", s.length_name);
    let ui = format!("unbraced in {}", s.length_name);
    let uo = format!("unbraced out {}", s.length_name);
    let mut tb = HTable::new(&[
        "member", "start", "end", "section", "material", &lu, "K in", "K out", &ui, &uo,
    ]);
    for (m, mem) in model.members.iter().enumerate() {
        tb.row(
            "",
            vec![
                t(&mem.id),
                t(&model.nodes[mem.start].id),
                t(&model.nodes[mem.end].id),
                t(&model.sections[mem.section].id),
                t(&model.materials[mem.material].id),
                n(model.length(m) / s.length, 5),
                n(mem.k_in, 3),
                n(mem.k_out, 3),
                on(mem.unbraced_in.map(|v| v / s.length), 4),
                on(mem.unbraced_out.map(|v| v / s.length), 4),
            ],
        );
    }
    tb.html(h);
    h.push_str(r#"<p class="note">Unbraced length “-”: the member length.</p>"#);

    h.push_str("<h3>Materials</h3>\n");
    let eu = format!("E {}", s.stress_name);
    let fyu = format!("Fy {}", s.stress_name);
    let fuu = format!("Fu {}", s.stress_name);
    let du = format!("density {}/{}³", s.force_name, s.length_name);
    let density_unit = s.force / s.length.powi(3);
    let mut tb = HTable::new(&["material", &eu, &fyu, &fuu, &du, "α per degree"]);
    for mat in &model.materials {
        tb.row(
            "",
            vec![
                t(&mat.id),
                n(mat.e / s.stress, 5),
                on(mat.fy.map(|v| v / s.stress), 4),
                on(mat.fu.map(|v| v / s.stress), 4),
                on(mat.density.map(|d| d / density_unit), 4),
                on(mat.alpha, 3),
            ],
        );
    }
    tb.html(h);

    h.push_str("<h3>Supports</h3>\n");
    let mut tb = HTable::new(&["node", "kind", "held", "surface angle °"]);
    for sup in &model.supports {
        let (held, angle) = match sup.restraint {
            Restraint::Pin => ("x and y", None),
            Restraint::Roller => ("y", None),
            Restraint::InclinedRoller { angle } => {
                ("normal to the surface", Some(angle.to_degrees()))
            }
        };
        tb.row(
            "",
            vec![
                t(&model.nodes[sup.node].id),
                t(sup.restraint.name()),
                t(held),
                on(angle, 4),
            ],
        );
    }
    tb.html(h);

    h.push_str("<h3>Load cases</h3>\n");
    for case in &model.cases {
        let kind = match case.kind {
            CaseKind::Dead => "dead (DC)",
            CaseKind::Wearing => "wearing surface (DW)",
            CaseKind::Live => "live",
            CaseKind::Other => "other",
        };
        let _ = writeln!(
            h,
            "<p><strong>“{}”</strong> — {kind}{}</p>",
            esc(&case.id),
            if case.kind == CaseKind::Live {
                format!(", impact allowance {}", sig(case.impact, 3))
            } else {
                String::new()
            }
        );
        if !case.nodal.is_empty() {
            let fx = format!("fx {}", s.force_name);
            let fy = format!("fy {}", s.force_name);
            let mut tb = HTable::new(&["node", &fx, &fy]);
            for l in &case.nodal {
                tb.row(
                    "",
                    vec![
                        t(&model.nodes[l.node].id),
                        n(l.fx / s.force, 5),
                        n(l.fy / s.force, 5),
                    ],
                );
            }
            tb.html(h);
        }
        if !case.settlements.is_empty() {
            let dx = format!("dx {}", s.disp_name);
            let dy = format!("dy {}", s.disp_name);
            let mut tb = HTable::new(&["settled node", &dx, &dy]);
            for st in &case.settlements {
                tb.row(
                    "",
                    vec![
                        t(&model.nodes[st.node].id),
                        n(st.dx / s.disp, 4),
                        n(st.dy / s.disp, 4),
                    ],
                );
            }
            tb.html(h);
        }
        if !case.elongations.is_empty() {
            let eu = format!("initial elongation {}", s.disp_name);
            let mut tb = HTable::new(&["member", &eu]);
            for el in &case.elongations {
                tb.row(
                    "",
                    vec![
                        t(&model.members[el.member].id),
                        n(el.elongation / s.disp, 4),
                    ],
                );
            }
            tb.html(h);
        }
    }
    if !model.combinations.is_empty() {
        h.push_str("<h3>Combinations</h3>\n");
        let mut tb = HTable::new(&["combination", "Σ factor × case (live cases × (1 + impact))"]);
        for c in &model.combinations {
            let terms: Vec<String> = c
                .factors
                .iter()
                .map(|&(ci, f)| format!("{} × “{}”", sig(f, 4), model.cases[ci].id))
                .chain(c.moving.iter().map(|&(k, f)| {
                    format!(
                        "{} × moving load “{}” (its envelope, impact included: greatest tension and greatest compression of each member)",
                        sig(f, 4),
                        model.live.moving[k].id
                    )
                }))
                .collect();
            tb.row("", vec![t(&c.id), t(&terms.join(" + "))]);
        }
        tb.html(h);
    }
    h.push_str("<h3>Rating settings</h3>\n");
    let r = &model.rating;
    let name = r.method.as_deref().unwrap_or(crate::method::DEFAULT);
    let st = &r.settings;
    let _ = writeln!(
        h,
        r#"<dl class="facts"><dt>Rating method in the model</dt><dd>{}</dd><dt>Condition factor φc</dt><dd>{}</dd><dt>System factor φs</dt><dd>{}</dd><dt>ADTT (legal-load factor)</dt><dd>{}</dd></dl>"#,
        esc(name),
        st.condition_factor
            .map_or("1.0 (not given)".into(), |v| sig(v, 3)),
        st.system_factor
            .map_or("1.0 (not given)".into(), |v| sig(v, 3)),
        st.adtt.map_or("not given".into(), |v| sig(v, 4)),
    );
    if let Ok(m) = crate::method::Method::from_name(name, st) {
        let mut tb = HTable::new(&[
            "level",
            "for",
            "γL",
            "γDC max / min",
            "γDW max / min",
            "compression factor",
            "tension yield factor",
            "tension fracture factor",
            "φc·φs as applied",
            "clause",
        ]);
        let rows = m
            .design_levels
            .iter()
            .map(|l| (l, "design loads"))
            .chain(m.legal_levels.iter().map(|l| (l, "legal loads")));
        for (l, what) in rows {
            tb.row(
                "",
                vec![
                    t(l.name),
                    t(what),
                    n(l.gamma_live, 3),
                    t(&format!("{} / {}", sig(l.dc.max, 3), sig(l.dc.min, 3))),
                    t(&format!("{} / {}", sig(l.dw.max, 3), sig(l.dw.min, 3))),
                    n(l.resistance.compression, 4),
                    n(l.resistance.tension_yield, 4),
                    n(l.resistance.tension_fracture, 4),
                    n(m.condition_system(l), 3),
                    t(l.clause),
                ],
            );
        }
        tb.html(h);
    }
    h.push_str("</section>\n");
}

fn results(
    h: &mut String,
    model: &Model,
    analysis: &Analysis,
    effects: &[Effect],
    s: &Scale,
    flush: &mut Flush,
) -> std::io::Result<()> {
    h.push_str(
        r#"<section class="major" id="results"><h2>Results per load case and combination</h2>"#,
    );
    for (k, e) in effects.iter().enumerate() {
        flush(h)?;
        let _ = writeln!(
            h,
            "<details><summary><strong>{} “{}”</strong> (open to read or print)</summary>",
            if e.combination {
                "Combination"
            } else {
                "Load case"
            },
            esc(&e.id)
        );
        let fmax = e.forces.iter().fold(0.0f64, |a, f| a.max(f.abs()));
        let fu = format!("force {}", s.force_name);
        let su = format!("stress {}", s.stress_name);
        let mut tb = HTable::new(&["member", &fu, &su, "sense"]);
        for (m, mem) in model.members.iter().enumerate() {
            let f = e.forces[m];
            let area = model.sections[mem.section].area;
            let sense = if f.abs() <= 1e-10 * fmax {
                "zero"
            } else if f > 0.0 {
                "tension"
            } else {
                "compression"
            };
            tb.row(
                "",
                vec![
                    t(&mem.id),
                    clean(f / s.force, fmax / s.force, 5),
                    clean(f / area / s.stress, fmax / area / s.stress, 4),
                    t(sense),
                ],
            );
        }
        tb.html(h);
        let rx = format!("Rx {}", s.force_name);
        let ry = format!("Ry {}", s.force_name);
        let rmax = e
            .reactions
            .iter()
            .flatten()
            .fold(fmax, |a, r| a.max(r.abs()));
        let mut tb = HTable::new(&["support", "kind", &rx, &ry]);
        for (sup, r) in model.supports.iter().zip(&e.reactions) {
            tb.row(
                "",
                vec![
                    t(&model.nodes[sup.node].id),
                    t(sup.restraint.name()),
                    clean(r[0] / s.force, rmax / s.force, 5),
                    clean(r[1] / s.force, rmax / s.force, 5),
                ],
            );
        }
        tb.html(h);
        let ux = format!("ux {}", s.disp_name);
        let uy = format!("uy {}", s.disp_name);
        let umax = e
            .displacements
            .iter()
            .flatten()
            .fold(0.0f64, |a, u| a.max(u.abs()));
        let mut tb = HTable::new(&["node", &ux, &uy]);
        for (nd, u) in model.nodes.iter().zip(&e.displacements) {
            tb.row(
                "",
                vec![
                    t(&nd.id),
                    clean(u[0] / s.disp, umax / s.disp, 4),
                    clean(u[1] / s.disp, umax / s.disp, 4),
                ],
            );
        }
        tb.html(h);
        if let Some(c) = (!e.combination).then(|| analysis.cases.get(k)).flatten() {
            // Sums below 1e-9 of the largest are round-off: shown as 0.
            let big = c
                .load_sum
                .iter()
                .chain(&c.reaction_sum)
                .fold(0.0f64, |a, v| a.max(v.abs()));
            let show = |v: f64| {
                if v.abs() <= 1e-9 * big {
                    "0".to_string()
                } else {
                    sig(v / s.force, 5)
                }
            };
            let residual = if c.relative_residual < 1e-9 {
                "below 10⁻⁹ of the largest force".to_string()
            } else {
                format!(
                    "{} {} ({} of the largest force)",
                    sig(c.residual / s.force, 2),
                    s.force_name,
                    sig(c.relative_residual, 2)
                )
            };
            let _ = writeln!(
                h,
                r#"<p class="note">Equilibrium: largest |K·u − f| {}; loads ({}, {}) {f}, reactions ({}, {}) {f}.</p>"#,
                esc(&residual),
                esc(&show(c.load_sum[0])),
                esc(&show(c.load_sum[1])),
                esc(&show(c.reaction_sum[0])),
                esc(&show(c.reaction_sum[1])),
                f = esc(s.force_name)
            );
        }
        if let Some(combo) = model
            .combinations
            .iter()
            .find(|c| e.combination && c.id == e.id)
        {
            for &(k, f) in &combo.moving {
                let _ = writeln!(
                    h,
                    r#"<p class="note">This combination also holds {} × moving load “{}”: the member forces above include it at each member's governing position (the envelope side with the greater utilization, as the checks use it); the reactions and displacements are those of its load cases alone (see Moving loads and the rating factors).</p>"#,
                    esc(&sig(f, 4)),
                    esc(&model.live.moving[k].id)
                );
            }
        }
        h.push_str("</details>\n");
    }
    h.push_str("</section>\n");
    Ok(())
}

fn checks(h: &mut String, model: &Model, rating: &Result<&Rating, String>, s: &Scale) {
    h.push_str(r#"<section class="major" id="checks"><h2>Capacity of each member</h2>"#);
    let r = match rating {
        Ok(r) => *r,
        Err(why) => {
            let _ = writeln!(h, "<p>Not made: {}</p></section>", esc(why));
            return;
        }
    };
    let _ = writeln!(
        h,
        "<p>Rating method: <strong>{}</strong>. Each member is checked on its governing axis (the larger of KL/r in and out of plane) in compression, and on gross-section yield and net-section fracture in tension. The capacity C is the method's factor ({}) on the nominal strength{}. Rows marked “service” are unfactored effects shown against C for information; they are not strength checks and are not counted.</p>",
        esc(&r.method.name),
        esc(r.method.check.symbol),
        if r.method.family == crate::method::Family::Lrfr { ", times φc·φs (MBE Eq. 6A.4.2.1-2)" } else { "" }
    );
    h.push_str("<h3>Capacity of each member: inputs, formula and clause</h3>\n");
    let au = format!("A {}²", s.disp_name);
    let anu = format!("An {}²", s.disp_name);
    let fyu = format!("Fy {}", s.stress_name);
    let eu = format!("E {}", s.stress_name);
    let feu = format!("Fe {}", s.stress_name);
    let fcu = format!("Fcr {}", s.stress_name);
    let pcu = format!("compression C {}", s.force_name);
    let ptu = format!("tension C {}", s.force_name);
    let mut tb = HTable::new(&[
        "member",
        &au,
        &anu,
        &fyu,
        &eu,
        "KL/r in",
        "KL/r out",
        "governing mode",
        "KL/r of the mode",
        &feu,
        &fcu,
        "regime",
        "compression formula",
        "compression clause",
        &pcu,
        &ptu,
        "tension governs",
        "tension clause",
    ]);
    for (m, cap) in r.members.iter().enumerate() {
        let sec = &model.sections[model.members[m].section];
        tb.row(
            "",
            vec![
                t(&model.members[m].id),
                n(sec.area / s.area, 4),
                n(sec.net_area / s.area, 4),
                n(cap.fy / s.stress, 4),
                n(cap.e / s.stress, 5),
                n(cap.slenderness_in, 4),
                n(cap.slenderness_out, 4),
                t(&{
                    let g = cap.modes.governing().kind;
                    format!("{} (Fe by {})", g.name(), g.clause())
                }),
                n(cap.slenderness(), 4),
                n(cap.compression.euler_stress / s.stress, 4),
                n(cap.compression.critical_stress / s.stress, 4),
                t(cap.compression.regime.as_str()),
                (
                    false,
                    format!(
                        r#"<span class="formula">{}</span>"#,
                        esc(cap.compression.check.formula)
                    ),
                ),
                t(cap.compression.clause),
                n(cap.compression.capacity / s.force, 4),
                n(cap.tension_capacity / s.force, 4),
                t(cap.tension_governs),
                t(cap.tension_clause),
            ],
        );
    }
    tb.html(h);
    let _ = writeln!(
        h,
        r#"<p class="note">Fe = π²E/(KL/r)² (Euler). Fcr is the curve's nominal critical stress; the design capacity applies the curve's resistance or safety factor to Fcr·A. Tension: min(yield on gross area, fracture on net area), with the factors of the clause shown. Capacities include the condition and system factors where the method applies them (LRFR: φc·φs ≥ 0.85).</p>"#
    );
    super::html_lacing::lacing_bars(h, model, r, s);

    h.push_str("</section>\n");
}

/// The appendix: every check, collapsed on screen.
fn appendix(
    h: &mut String,
    model: &Model,
    rating: &Result<&Rating, String>,
    s: &Scale,
    flush: &mut Flush,
) -> std::io::Result<()> {
    let Ok(r) = rating else {
        return Ok(());
    };
    h.push_str(r#"<section class="major" id="appendix"><h2>Appendix: every check</h2>"#);
    let _ = writeln!(
        h,
        "<details><summary>Every member under every load case and combination, highest utilization first ({} rows; open to read or print)</summary>",
        r.checks.len()
    );

    let fu = format!("force {}", s.force_name);
    let su = format!("stress {}", s.stress_name);
    let cu = format!("capacity {}", s.force_name);
    let fcu = format!("Fcr or Ft {}", s.stress_name);
    let tb = HTable::new(&[
        "member",
        "case",
        &fu,
        &su,
        "KL/r",
        &fcu,
        "regime",
        &cu,
        "utilization",
        "margin",
        "RF inv",
        "clause",
        "formula",
    ]);
    tb.head_html(h);
    for (k, &i) in by_utilization(r).iter().enumerate() {
        if k % 1024 == 1023 {
            flush(h)?;
        }
        let c = check_row(model, r, &r.checks[i]);
        let class = match (k == 0, c.utilization > 1.0) {
            (true, true) => "controlling fails",
            (true, false) => "controlling",
            (false, true) => "fails",
            (false, false) => "",
        };
        row_html(
            h,
            class,
            &[
                t(c.member),
                t(c.case),
                n(c.force, 4),
                n(c.stress, 4),
                if r.checks[i].regime == Regime::Tension {
                    t("-")
                } else {
                    n(c.slenderness, 4)
                },
                n(c.critical_stress, 4),
                t(c.regime),
                n(c.capacity, 4),
                (true, ubar(c.utilization, false)),
                on(c.margin, 3),
                on(c.rating_factor, 3),
                t(c.clause),
                (
                    false,
                    format!(r#"<span class="formula">{}</span>"#, esc(c.formula)),
                ),
            ],
        );
    }
    foot_html(h);
    h.push_str(r#"<p class="note">utilization = |force| / C; margin = critical stress / |stress|; the first counted row controls; rows marked service or factored are not the method's own comparison and are not counted.</p>"#);
    h.push_str("</details></section>\n");
    Ok(())
}

fn ratings(h: &mut String, model: &Model, rating: &Result<&Rating, String>, s: &Scale) {
    h.push_str(r#"<section class="major" id="ratings"><h2>Rating factors</h2>"#);
    let r = match rating {
        Ok(r) => *r,
        Err(why) => {
            let _ = writeln!(h, "<p>Not computed: {}</p></section>", esc(why));
            return;
        }
    };
    if r.ratings.is_empty() {
        h.push_str("<p>None: the model declares no Live load case (set kind: Live, and kind: Dead on dead cases).</p></section>\n");
        return;
    }
    let _ = writeln!(
        h,
        "<p>{} Each permanent-load factor is at its maximum where that load adds to the live effect and at its minimum where it relieves it. One row per member, live load and level, lowest first.</p>",
        esc(r.method.equation)
    );
    let idx = super::rate_rows::by_rating(r);
    let dcu = format!("DC {}", s.force_name);
    let dwu = format!("DW {}", s.force_name);
    let lu = format!("LL + IM {}", s.force_name);
    let cu = format!("C = φc·φs·φ·Rn {}", s.force_name);
    let mut tb = HTable::new(&[
        "member",
        "live load",
        "level",
        &dcu,
        &dwu,
        &lu,
        &cu,
        "governs",
        "factors",
        "RF",
    ]);
    for &i in &idx {
        let row = super::rate_rows::rating_row(model, r, &r.ratings[i]);
        let class = if row.rf.is_some_and(|v| v < 1.0) {
            "fails"
        } else {
            ""
        };
        tb.row(
            class,
            vec![
                t(row.member),
                t(row.live),
                t(row.level),
                n(row.dc, 4),
                n(row.dw, 4),
                n(row.live_force, 4),
                n(row.capacity, 4),
                t(row.governs),
                t(&row.factors),
                on(row.rf, 3),
            ],
        );
    }
    tb.html(h);
    h.push_str("</section>\n");
}

fn sections(h: &mut String, model: &Model, s: &Scale) {
    h.push_str(r#"<section class="major" id="sections"><h2>Sections</h2>"#);
    h.push_str("<p>Section properties used by the checks (built-up sections after the recorded section loss):</p>\n");
    let au = format!("A {}²", s.disp_name);
    let anu = format!("An {}²", s.disp_name);
    let iin = format!("I in-plane {}⁴", s.disp_name);
    let iout = format!("I out-of-plane {}⁴", s.disp_name);
    let rin = format!("r in-plane {}", s.disp_name);
    let rout = format!("r out-of-plane {}", s.disp_name);
    let mut tb = HTable::new(&["section", &au, &anu, &iin, &iout, &rin, &rout, "used by"]);
    let i4 = s.disp.powi(4);
    for (k, sec) in model.sections.iter().enumerate() {
        let used: Vec<&str> = model
            .members
            .iter()
            .filter(|m| m.section == k)
            .map(|m| m.id.as_str())
            .collect();
        let used = if used.len() > 12 {
            format!("{} members", used.len())
        } else {
            used.join(", ")
        };
        tb.row(
            "",
            vec![
                t(&sec.id),
                n(sec.area / s.area, 4),
                n(sec.net_area / s.area, 4),
                n(sec.i_in / i4, 4),
                n(sec.i_out / i4, 4),
                n(sec.r_in() / s.disp, 4),
                n(sec.r_out() / s.disp, 4),
                t(&used),
            ],
        );
    }
    tb.html(h);
    // Built-up sections: as built against after the recorded loss, and the parts drawn.
    for sec in model.sections.iter().filter(|x| x.built_up.is_some()) {
        let b = sec.built_up.as_ref().unwrap();
        let g = |v: f64| super::table::sig(v, 4);
        h.push_str(&format!(
            "<h3>Built-up section {}</h3><p>Area {} {u}² as built, {} {u}² after section loss; Ix {} → {} {u}⁴, Iy {} → {} {u}⁴; net area {} {u}²; balance I_minor/I_major {}.</p>\n",
            esc(&sec.id),
            g(b.original.area / s.area),
            g(b.reduced.area / s.area),
            g(b.original.ix / i4),
            g(b.reduced.ix / i4),
            g(b.original.iy / i4),
            g(b.reduced.iy / i4),
            g(sec.net_area / s.area),
            super::table::sig(b.reduced.balance, 3),
            u = esc(s.disp_name),
        ));
        let mut svg = Vec::new();
        if super::sections::svg(&mut svg, model, sec).is_ok() {
            let svg = String::from_utf8_lossy(&svg);
            // Inline SVG needs neither the XML declaration nor the namespace.
            let body = svg.replacen(r#" xmlns="http://www.w3.org/2000/svg""#, "", 1);
            let body = body.trim_start();
            let body = match body.strip_prefix("<?xml") {
                Some(rest) => rest.split_once("?>").map_or(rest, |(_, b)| b),
                None => body,
            };
            h.push_str("<div class=\"figure section-drawing\">");
            h.push_str(body.trim());
            h.push_str("</div>\n");
        }
    }
    h.push_str("</section>\n");
}

/// The fatigue section: the drawing by life used, the parameters with
/// their sources and one row per member (finite remaining life first).
fn fatigue_section(h: &mut String, model: &Model, f: &Result<&crate::fatigue::Fatigue, String>) {
    use super::fatigue_rows::{parameters, rows};
    h.push_str(r#"<section class="major" id="fatigue"><h2>Fatigue</h2>"#);
    let f = match f {
        Ok(f) => *f,
        Err(why) => {
            let _ = writeln!(
                h,
                "<p>The fatigue evaluation could not be made: {}</p></section>",
                esc(why)
            );
            return;
        }
    };
    h.push_str("<p class=\"note\">Stress history of each member under one crossing of the fatigue vehicle (influence lines, the worse direction), counted by rainflow as a repeating passage (ASTM E1049); AASHTO MBE Section 7 lives at the minimum, evaluation and mean levels and the EN 1993-1-9 damage. Constants from memory of the editions stated, overridable in the model; a * marks a stated default category.</p>\n");
    figure(
        h,
        &super::fatigue_svg::draw(model, f, 900.0),
        "Fatigue life used at the MBE minimum level: present age over the minimum life, on the utilization ramp; spent members in the failure colour with a broken core.",
    );
    let mut p = HTable::new(&["parameter", "value", "source"]);
    for x in parameters(model, f) {
        p.row("", vec![t(x.name), t(&x.value), t(x.source)]);
    }
    p.html(h);
    let st = Scale::of(model).stress_name;
    let eff = format!("(Δf)eff {st}");
    let max = format!("(Δf)max {st}");
    let th = format!("(ΔF)TH {st}");
    let mut m = HTable::new(&[
        "member",
        "category",
        &eff,
        "cycles / passage",
        &max,
        &th,
        "life min yr",
        "life eval yr",
        "life mean yr",
        "remaining min yr",
        "EN cat MPa",
        "EN damage / passage",
        "EN remaining yr",
    ]);
    let yrs = |v: Option<f64>| {
        (
            true,
            v.map_or("infinite".into(), |v| esc(&format!("{v:.1}"))),
        )
    };
    for r in rows(model, f) {
        let star = |d: bool| if d { "*" } else { "" };
        let class = if r.remaining[0].is_some_and(|y| y < 0.0) {
            "fails"
        } else {
            ""
        };
        m.row(
            class,
            vec![
                t(r.member),
                t(&format!("{}{}", r.category, star(r.category_default))),
                n(r.mbe_effective_range, 4),
                n(r.cycles_per_passage, 3),
                n(r.max_range, 4),
                n(r.threshold, 4),
                yrs(r.life[0]),
                yrs(r.life[1]),
                yrs(r.life[2]),
                yrs(r.remaining[0]),
                t(&format!("{}{}", sig(r.en_category, 3), star(r.en_default))),
                n(r.en_damage, 3),
                yrs(r.en_remaining),
            ],
        );
    }
    m.html(h);
    h.push_str("<p class=\"note\">Lives are years from opening; remaining = life − present age, negative (bold) when the calculated life is spent. Infinite life when (Δf)max = factor·(Δf)eff ≤ (ΔF)TH (MBE 7.2.4).</p>\n</section>\n");
}
