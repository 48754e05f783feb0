//! Joint checks flattened into display-unit rows that the text, JSON, CSV
//! and HTML writers share. Small lengths (plates, pins, fasteners) are in
//! the model's section unit; forces and stresses in its own.

use super::Scale;
use crate::joint::{JointCheck, Joints};
use crate::model::Model;
use crate::rate::Rating;
use crate::units::Dimension;

/// A value in the model's units with the unit's name ("" for a number).
pub fn shown(model: &Model, dim: Option<Dimension>, si: f64) -> (f64, String) {
    let s = Scale::of(model);
    match dim {
        None => (si, String::new()),
        Some(Dimension::Force) => (si / s.force, s.force_name.to_string()),
        Some(Dimension::Stress) => (si / s.stress, s.stress_name.to_string()),
        Some(Dimension::Length) => (si / s.disp, s.disp_name.to_string()),
        Some(Dimension::Area) => (si / s.area, format!("{}²", s.disp_name)),
        Some(Dimension::SecondMoment) => (si / (s.area * s.area), format!("{}⁴", s.disp_name)),
        Some(Dimension::Angle) => (si.to_degrees(), "°".to_string()),
        Some(d) => (si, format!("SI {}", d.name())),
    }
}

/// One joint check for display: what, where, and its governing factor at
/// the method's first level.
pub struct JointView {
    pub node: String,
    pub kind: &'static str,
    pub member: Option<String>,
    pub part: String,
    pub clause: &'static str,
    pub equation: String,
    /// "name = value unit" of each input.
    pub inputs: Vec<(&'static str, f64, String)>,
    pub unit: String,
    /// Demand and resistance where the lowest first-level factor was found
    /// (factored dead load, λ = 1), else the highest-utilization case row.
    pub demand: f64,
    pub resistance: f64,
    pub rf: Option<f64>,
    pub live: Option<String>,
    pub at: Option<String>,
    pub level: Option<&'static str>,
}

fn view_of(model: &Model, rating: &Rating, joints: &Joints, ci: usize) -> JointView {
    let check: &dyn JointCheck = joints.checks[ci].as_ref();
    let method = &rating.method;
    let dim = check.dimension();
    let first = method.primary_level();
    let low = (0..joints.ratings.len())
        .filter(|&i| joints.ratings[i].check == ci && joints.ratings[i].level == first)
        .filter(|&i| joints.ratings[i].rf.is_some())
        .min_by(|&a, &b| {
            let (x, y) = (joints.ratings[a].rf, joints.ratings[b].rf);
            x.unwrap().total_cmp(&y.unwrap())
        });
    let (eval, rf, live, at, level) = match low {
        Some(i) => {
            let r = &joints.ratings[i];
            (
                r.factored,
                r.rf,
                Some(r.live_id.clone()),
                r.at.clone(),
                Some(r.level),
            )
        }
        None => {
            let row = joints
                .rows
                .iter()
                .filter(|r| r.check == ci)
                .max_by(|a, b| a.eval.utilization().total_cmp(&b.eval.utilization()));
            let eval = row.map_or(
                crate::joint::Eval {
                    demand: 0.0,
                    resistance: 0.0,
                },
                |r| r.eval,
            );
            let live = row.map(|r| rating.effects[r.effect].id.clone());
            (eval, None, live, None, None)
        }
    };
    let (demand, unit) = shown(model, dim, eval.demand);
    let (resistance, _) = shown(model, dim, eval.resistance);
    JointView {
        node: model.nodes[check.node()].id.to_string(),
        kind: check.kind(),
        member: check.member().map(|m| model.members[m].id.to_string()),
        part: check.part(),
        clause: check.clause(method),
        equation: check.equation(method),
        inputs: check
            .inputs()
            .into_iter()
            .map(|(name, v, d)| {
                let (x, u) = shown(model, d, v);
                (name, x, u)
            })
            .collect(),
        unit,
        demand,
        resistance,
        rf,
        live,
        at,
        level,
    }
}

/// Every joint check of the rating, in the builders' order.
pub fn joint_views(model: &Model, rating: &Rating) -> Vec<JointView> {
    let Some(j) = &rating.joints else {
        return Vec::new();
    };
    (0..j.checks.len())
        .map(|ci| view_of(model, rating, j, ci))
        .collect()
}

/// The inputs as one line: "t = 0.5 in, Fy = 36 ksi".
pub fn inputs_line(v: &JointView) -> String {
    v.inputs
        .iter()
        .map(|(n, x, u)| {
            if u.is_empty() {
                format!("{n} = {}", super::table::sig(*x, 4))
            } else {
                format!("{n} = {} {u}", super::table::sig(*x, 4))
            }
        })
        .collect::<Vec<_>>()
        .join(", ")
}

/// The element with the lowest rating factor at one level, member or joint.
pub struct Controlling {
    pub level: &'static str,
    pub joint: bool,
    /// The member's id, or the joint check described.
    pub element: String,
    pub node: Option<String>,
    pub live: String,
    pub rf: Option<f64>,
}

/// Per level, the lower of the lowest member factor and the lowest joint
/// factor: the controlling element of the truss (a joint where it is lower).
pub fn controlling_by_level(model: &Model, rating: &Rating) -> Vec<Controlling> {
    rating
        .lowest_by_level
        .iter()
        .map(|&(level, mi)| {
            let m = &rating.ratings[mi];
            let joint = rating.joints.as_ref().and_then(|j| {
                let i = j.lowest_at(level)?;
                let r = &j.ratings[i];
                (r.rf? < m.rf.unwrap_or(f64::INFINITY)).then_some((j, i))
            });
            match joint {
                Some((j, i)) => Controlling {
                    level,
                    joint: true,
                    element: super::rate_rows::rating_joint_words(model, rating, i),
                    node: Some(
                        model.nodes[j.checks[j.ratings[i].check].node()]
                            .id
                            .to_string(),
                    ),
                    live: j.ratings[i].live_id.clone(),
                    rf: j.ratings[i].rf,
                },
                None => Controlling {
                    level,
                    joint: false,
                    element: model.members[m.member].id.to_string(),
                    node: None,
                    live: m.live_id.clone(),
                    rf: m.rf,
                },
            }
        })
        .collect()
}
