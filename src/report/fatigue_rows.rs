//! The fatigue evaluation flattened into display-unit rows and a list of
//! the parameters with their sources, shared by the text, JSON, CSV and
//! HTML writers so the formats cannot disagree.

use super::Scale;
use crate::fatigue::{Fatigue, StressArea};
use crate::model::Model;

/// The sources of the evaluation, in one line (CSV carries it per row).
pub const BASIS: &str = "AASHTO MBE 2nd ed. (2011) Section 7 and AASHTO LRFD 7th ed. (2014) 6.6.1.2 detail constants; EN 1993-1-9:2005 S-N curves and Miner's rule; ASTM E1049-85 rainflow; constants from memory, overridable";

/// One parameter: name, value as shown, where it comes from.
pub struct Parameter {
    pub name: &'static str,
    pub value: String,
    pub source: &'static str,
}

/// Every parameter of `f` with its source (the default's edition, or the
/// model when it sets the value).
pub fn parameters(model: &Model, f: &Fatigue) -> Vec<Parameter> {
    let s = &f.settings;
    let p = |name, value: String, source| Parameter {
        name,
        value,
        source,
    };
    let rr = |v: Option<f64>| {
        v.map_or("per category (MBE Table 7.2.5.2-1)".into(), |v| {
            format!("{v}")
        })
    };
    let mut out = vec![
        p("fatigue vehicle", f.vehicle.clone(), "model fatigue.vehicle (axles only; a lane load is not used)"),
        p("dynamic allowance", format!("{}", s.impact), "model fatigue.impact; default 0.15 (AASHTO LRFD Table 3.6.2.1-1, fatigue, from memory)"),
        p("(ADTT)SL", format!("{}", s.traffic.adtt), "model fatigue.adtt: present single-lane trucks per day"),
        p("present age, years", format!("{}", s.traffic.age), "model fatigue.age"),
        p("traffic growth per year", format!("{}", s.traffic.growth), "model fatigue.growth; past and future traffic grow at this rate (geometric sum)"),
        p("stress area", match s.area { StressArea::Net => "net (gross where no net area is given)".into(), StressArea::Gross => "gross".into() }, "model fatigue.area; default net: riveted details crack through the holes (common practice)"),
        p("default AASHTO category", s.default_category.name().into(), "model fatigue.category; default D for riveted members (common practice, from memory)"),
        p("rainflow", "repeating passage, history started and closed at its maximum".into(), "ASTM E1049-85 5.4.4 / 5.4.5 (from memory); the worse travel direction by sum n*range^3"),
        p("infinite-life factor (Df)max/(Df)eff", format!("{}", s.mbe.infinite_factor), "MBE 2nd ed. 7.2.4: 2.0*(Df)eff <= (DF)TH (from memory)"),
        p("stress-range estimate factor R_s", format!("{}", s.mbe.rs), "MBE 7.2.2.1; default 1.0 (never lowers a range)"),
        p("fatigue load factor", format!("{}", s.mbe.load_factor), "MBE 7.2.2; default 1.0 (never lowers a range)"),
        p("R_R minimum", format!("{}", s.mbe.rr_minimum), "MBE 2nd ed. Table 7.2.5.2-1 (from memory)"),
        p("R_R evaluation", rr(s.mbe.rr_evaluation), "MBE 2nd ed. Table 7.2.5.2-1 (from memory)"),
        p("R_R mean", rr(s.mbe.rr_mean), "MBE 2nd ed. Table 7.2.5.2-1 (from memory)"),
        p("finite life", "Y = R_R*A / (365*n*(ADTT)SL*(Df)eff^3)".into(), "MBE 2nd ed. Eq. 7.2.5.1-1 (from memory); n = rainflow cycles per passage"),
        p("default EN category, MPa", format!("{}", s.default_en / 1e6), "model fatigue.en_category; default 71 for riveted details (common practice, from memory)"),
        p("gamma_Mf", format!("{}", s.en.gamma_mf), "EN 1993-1-9:2005 Table 3.1, default 1.35 safe life / high consequence (from memory)"),
        p("gamma_Ff", format!("{}", s.en.gamma_ff), "EN 1993-1-9:2005 6.1, recommended 1.0 (from memory)"),
        p("members evaluated", "all, including those in permanent compression".into(), "the LRFD 6.6.1.2.1 net-compression exemption is not applied (conservative)"),
        p("EN S-N curve", "m = 3 to 5e6, m = 5 to the cut-off at 1e8".into(), "EN 1993-1-9:2005 7.1, Eq. 7.1-7.2, Fig. 7.1 (from memory)"),
    ];
    let used: Vec<_> = {
        let mut c: Vec<_> = f.members.iter().map(|m| m.category).collect();
        c.sort_by_key(|c| c.name());
        c.dedup();
        c
    };
    let stress = Scale::of(model);
    for c in used {
        let (a, th) = s.mbe.constants_si(c);
        let given = s.mbe.constants.iter().any(|o| o.0 == c);
        out.push(p(
            "category constants",
            {
                let ksi = crate::fatigue::mbe::KSI;
                let mut v = format!(
                    "{}: A = {:.3e} ksi^3, (DF)TH = {} ksi",
                    c.name(),
                    a / ksi.powi(3),
                    super::table::sig(th / ksi, 3)
                );
                if stress.stress_name != "ksi" {
                    v += &format!(
                        " = {} {}",
                        super::table::sig(th / stress.stress, 4),
                        stress.stress_name
                    );
                }
                v
            },
            if given {
                "model fatigue.constants"
            } else {
                "AASHTO LRFD 7th ed. Tables 6.6.1.2.5-1 and -3 (from memory)"
            },
        ));
    }
    out
}

/// One member in display units (stress in the model's unit, lives in
/// years; None where infinite).
pub struct Row<'a> {
    pub member: &'a str,
    pub category: &'static str,
    pub category_default: bool,
    pub en_category: f64,
    pub en_default: bool,
    pub area: f64,
    pub direction: &'static str,
    pub max_stress: f64,
    pub min_stress: f64,
    pub cycles: Vec<(f64, f64)>,
    pub cycles_per_passage: f64,
    pub effective_range: f64,
    pub mbe_effective_range: f64,
    pub max_range: f64,
    pub threshold: f64,
    pub rr: [f64; 3],
    pub life: [Option<f64>; 3],
    pub remaining: [Option<f64>; 3],
    pub en_damage: f64,
    pub en_passages: Option<f64>,
    pub en_life: Option<f64>,
    pub en_remaining: Option<f64>,
}

/// Every member's row, in the evaluation's order.
pub fn rows<'a>(model: &'a Model, f: &Fatigue) -> Vec<Row<'a>> {
    let s = Scale::of(model);
    let st = s.stress;
    f.members
        .iter()
        .map(|m| Row {
            member: &model.members[m.member].id,
            category: m.category.name(),
            category_default: m.category_default,
            en_category: m.en_category / 1e6,
            en_default: m.en_default,
            area: m.area / s.area,
            direction: m.direction.name(),
            max_stress: m.max_stress / st,
            min_stress: m.min_stress / st,
            cycles: m.cycles.iter().map(|&(r, n)| (r / st, n)).collect(),
            cycles_per_passage: m.cycles_per_passage,
            effective_range: m.effective_range / st,
            mbe_effective_range: m.mbe.effective_range / st,
            max_range: m.mbe.max_range / st,
            threshold: m.mbe.threshold / st,
            rr: m.mbe.rr,
            life: m.mbe.life,
            remaining: m.mbe.remaining,
            en_damage: m.en.damage_per_passage,
            en_passages: m.en.passages,
            en_life: m.en.life,
            en_remaining: m.en.remaining,
        })
        .collect()
}
