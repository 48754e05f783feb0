//! The RON model schema: plain serde types mirroring the file, nothing
//! converted or checked yet. Every struct denies unknown fields, so a typo
//! in a field name is an error with its line and column.

use super::quantity::Quantity;
use serde::Deserialize;

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ModelFile {
    #[serde(default)]
    pub title: Option<String>,
    pub units: UnitsFile,
    #[serde(default)]
    pub materials: Vec<MaterialFile>,
    #[serde(default)]
    pub sections: Vec<SectionFile>,
    #[serde(default)]
    pub nodes: Vec<NodeFile>,
    #[serde(default)]
    pub members: Vec<MemberFile>,
    #[serde(default)]
    pub supports: Vec<SupportFile>,
    #[serde(default)]
    pub load_cases: Vec<LoadCaseFile>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct UnitsFile {
    pub length: String,
    pub force: String,
    pub section: String,
    pub stress: String,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct MaterialFile {
    pub id: String,
    pub e: Quantity,
    #[serde(default)]
    pub fy: Option<Quantity>,
    #[serde(default)]
    pub fu: Option<Quantity>,
    /// Weight density (force per volume), for self-weight.
    #[serde(default)]
    pub density: Option<Quantity>,
    /// Coefficient of thermal expansion, per degree.
    #[serde(default)]
    pub alpha: Option<Quantity>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SectionFile {
    pub id: String,
    #[serde(default)]
    pub area: Option<Quantity>,
    #[serde(default)]
    pub i_in: Option<Quantity>,
    #[serde(default)]
    pub i_out: Option<Quantity>,
    /// Net area for the tension fracture check, if known.
    #[serde(default)]
    pub net_area: Option<Quantity>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct NodeFile {
    pub id: String,
    pub x: Quantity,
    pub y: Quantity,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct MemberFile {
    pub id: String,
    pub start: String,
    pub end: String,
    pub section: String,
    pub material: String,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SupportFile {
    pub node: String,
    pub kind: SupportKindFile,
}

/// `Pin`, `Roller`, or `InclinedRoller(angle: 30.0)` (degrees, or `"0.5 rad"`):
/// the rolling surface's angle from the global x axis, anticlockwise.
#[derive(Debug, Deserialize)]
pub enum SupportKindFile {
    Pin,
    Roller,
    InclinedRoller { angle: Quantity },
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LoadCaseFile {
    pub id: String,
    #[serde(default)]
    pub loads: Vec<NodalLoadFile>,
    /// Prescribed support displacements, in the section unit.
    #[serde(default)]
    pub settlements: Vec<SettlementFile>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct NodalLoadFile {
    pub node: String,
    #[serde(default)]
    pub fx: Option<Quantity>,
    #[serde(default)]
    pub fy: Option<Quantity>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SettlementFile {
    pub node: String,
    #[serde(default)]
    pub dx: Option<Quantity>,
    #[serde(default)]
    pub dy: Option<Quantity>,
}
