//! The report layer: the only part of panelpoint that knows output
//! formats. Each format lives in its own file; `atomic` makes sure a
//! failed run never leaves a half-written or spoiled file.

pub mod atomic;
pub mod cleanup;
pub mod csv;
pub mod fatigue_csv;
pub mod fatigue_json;
pub mod fatigue_rows;
pub mod fatigue_svg;
pub mod fatigue_text;
pub mod html;
mod html_joints;
mod html_lacing;
mod html_loads;
mod html_stability;
mod html_table;
pub mod influence_csv;
pub mod influence_json;
pub mod influence_text;
pub mod joint_rows;
pub mod joint_text;
pub mod json;
pub mod pin_svg;
pub mod rate_csv;
pub mod rate_json;
pub mod rate_rows;
pub mod rate_text;
pub mod section_svg;
pub mod sections;
pub mod stability_json;
pub mod stability_svg;
pub mod stability_text;
pub mod svg;
pub mod table;
pub mod term;
pub mod text;
pub mod vehicles;
pub mod whatif;

use crate::model::Model;

/// The caution every report carries.
pub const CAUTION: &str = "Screening calculation for review by a qualified engineer. \
Local codes, the owner's rating rules and licensed practice govern.";

/// Output formats of the tabular commands.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Format {
    Text,
    Json,
    Csv,
}

/// SI → display-unit divisors of one model, and the unit names.
pub struct Scale {
    pub length: f64,
    pub force: f64,
    pub disp: f64,
    pub stress: f64,
    pub area: f64,
    pub length_name: &'static str,
    pub force_name: &'static str,
    pub disp_name: &'static str,
    pub stress_name: &'static str,
}

impl Scale {
    pub fn of(model: &Model) -> Scale {
        let u = &model.units;
        Scale {
            length: u.length.to_si,
            force: u.force.to_si,
            disp: u.section.to_si,
            stress: u.stress.to_si,
            area: u.area_to_si(),
            length_name: u.length.name,
            force_name: u.force.name,
            disp_name: u.section.name,
            stress_name: u.stress.name,
        }
    }
}
