//! The RON model schema: plain serde types mirroring the file, nothing
//! converted or checked yet. Every struct denies unknown fields, so a typo
//! in a field name is an error with its line and column.

use super::quantity::Quantity;
use serde::Deserialize;

/// An id in the two long lists (nodes, members): kept inline up to 24
/// bytes, so reading a million rows allocates nothing per id.
pub type Id = compact_str::CompactString;

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
    /// Named linear combinations of load cases, for capacity checks.
    #[serde(default)]
    pub combinations: Vec<CombinationFile>,
    /// Model-wide capacity and rating settings.
    #[serde(default)]
    pub rating: Option<RatingFile>,
    // Optional moving-load fields; see `docs/loads.md` and `input/loads.rs`.
    /// Ordered deck nodes (panel points where floor beams deliver load),
    /// as a list or with the transverse layout: `(nodes: [...], width, lanes)`.
    #[serde(default)]
    pub deck: DeckFile,
    /// Vehicle definitions: axle trains and lane loads.
    #[serde(default)]
    pub vehicles: Vec<VehicleFile>,
    /// A file of further vehicles, relative to the model file.
    #[serde(default)]
    pub vehicles_file: Option<String>,
    /// Vehicles rolled across the deck.
    #[serde(default)]
    pub moving_loads: Vec<MovingLoadFile>,
    /// Load cases whose sum is the dead load reported beside the envelopes.
    #[serde(default)]
    pub dead_cases: Vec<String>,
    /// Whole-truss stability and vibration (`panelpoint stability`); see
    /// `input/stability.rs`.
    #[serde(default)]
    pub stability: Option<super::stability::StabilityFile>,
    /// Pins of a pin-connected truss and their stacks of bars; see
    /// `input/pins.rs`.
    #[serde(default)]
    pub pins: Vec<super::pins::PinFile>,
    /// Fatigue vehicle, traffic and evaluation parameters; see
    /// `docs/fatigue.md` and `input/fatigue.rs`.
    #[serde(default)]
    pub fatigue: Option<FatigueFile>,
    /// Riveted or bolted gusset-plate joints at panel points; see
    /// `docs/joints.md` and `input/joints.rs`.
    #[serde(default)]
    pub gusset_joints: Vec<super::joints::GussetJointFile>,
}

/// `fatigue: (vehicle: "truck", impact: 0.15, adtt: 500.0, age: 80.0, growth: 0.0, ...)`.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct FatigueFile {
    /// Id of one of the model's vehicles (its axles; a lane load is not used).
    pub vehicle: String,
    /// Dynamic allowance on the axles as a fraction (default 0.15).
    #[serde(default)]
    pub impact: Option<f64>,
    /// Present single-lane average daily truck traffic, (ADTT)SL.
    pub adtt: f64,
    /// Present age of the structure, years.
    pub age: f64,
    /// Yearly traffic growth rate (0.02 = 2 %), default 0.
    #[serde(default)]
    pub growth: Option<f64>,
    /// `Net` (default) or `Gross`: the area that turns force into stress.
    #[serde(default)]
    pub area: Option<StressAreaFile>,
    /// AASHTO category of members without a `detail` (default "D").
    #[serde(default)]
    pub category: Option<String>,
    /// EN 1993-1-9 category Δσ_C in MPa of members without one (default 71).
    #[serde(default)]
    pub en_category: Option<f64>,
    /// EN 1993-1-9 partial factors (defaults 1.35 and 1.0).
    #[serde(default)]
    pub gamma_mf: Option<f64>,
    #[serde(default)]
    pub gamma_ff: Option<f64>,
    /// MBE parameters (defaults in `fatigue/mbe.rs`).
    #[serde(default)]
    pub rs: Option<f64>,
    #[serde(default)]
    pub load_factor: Option<f64>,
    #[serde(default)]
    pub infinite_factor: Option<f64>,
    #[serde(default)]
    pub rr_minimum: Option<f64>,
    #[serde(default)]
    pub rr_evaluation: Option<f64>,
    #[serde(default)]
    pub rr_mean: Option<f64>,
    /// Replacement detail constants: (category, A in ksi³, (ΔF)TH in ksi).
    #[serde(default)]
    pub constants: Vec<(String, f64, f64)>,
}

#[derive(Debug, Deserialize, Clone, Copy, PartialEq, Eq)]
pub enum StressAreaFile {
    Net,
    Gross,
}

/// `(id: "strength", factors: [("deck", 1.25), ("crowd", 1.75)])`.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct CombinationFile {
    pub id: String,
    pub factors: Vec<(String, f64)>,
}

/// Load factors of one rating level.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LevelFile {
    #[serde(default)]
    pub gamma_dead: Option<f64>,
    #[serde(default)]
    pub gamma_live: Option<f64>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RatingFile {
    /// Rating method name (see `panelpoint rate --help`); default "lrfr".
    #[serde(default)]
    pub method: Option<String>,
    /// Replaced by `method`; kept so that old models get a clear message.
    #[serde(default)]
    pub curve: Option<String>,
    /// Single-lane ADTT, for the LRFR legal-load factor.
    #[serde(default)]
    pub adtt: Option<f64>,
    /// Legal-load live-load factor, given directly.
    #[serde(default)]
    pub gamma_legal: Option<f64>,
    /// Condition factor φc and system factor φs (bridge-evaluation practice), default 1.0.
    #[serde(default)]
    pub condition_factor: Option<f64>,
    #[serde(default)]
    pub system_factor: Option<f64>,
    /// EN 1993-1-1 partial factor γM1 (recommended 1.0).
    #[serde(default)]
    pub gamma_m1: Option<f64>,
    /// Safety factor of a screening curve (euler, johnson): RF only with it.
    #[serde(default)]
    pub safety_factor: Option<f64>,
    /// CSA S16 exponent n (1.34, or 2.24 for low residual stress sections).
    #[serde(default)]
    pub csa_n: Option<f64>,
    #[serde(default)]
    pub inventory: Option<LevelFile>,
    #[serde(default)]
    pub operating: Option<LevelFile>,
}

/// What a load case is, for rating.
#[derive(Debug, Deserialize, Clone, Copy, PartialEq, Eq)]
pub enum CaseKindFile {
    Dead,
    /// Wearing surfaces and utilities (DW).
    Wearing,
    Live,
    Other,
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
    /// Year of construction, for steel of unknown grade (MBE Table
    /// 6A.6.2.1-1) in place of `fy`/`fu`.
    #[serde(default)]
    pub year: Option<i32>,
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
    /// Or the net area as a fraction of the gross area.
    #[serde(default)]
    pub net_ratio: Option<f64>,
    /// A built-up section: parts placed in the section plane (instead of
    /// `area`, `i_in`, `i_out`).
    #[serde(default)]
    pub parts: Option<Vec<super::parts::PartFile>>,
    /// Which section axis lies in the truss plane (default `Y`: i_in = Ix).
    #[serde(default)]
    pub truss_plane: Option<super::parts::PlaneAxisFile>,
    /// Lacing or battens of a built-up member.
    #[serde(default)]
    pub lacing: Option<super::parts::LacingFile>,
    /// For a section given by its properties: St-Venant torsion constant J
    /// (second-moment unit), warping constant Cw (a plain number in the section
    /// unit to the sixth power) and the shear centre's offsets x0 (across the
    /// truss plane) and y0 (in it) from the centroid, for AISC 360-16 §E4.
    #[serde(default)]
    pub j: Option<Quantity>,
    #[serde(default)]
    pub cw: Option<f64>,
    #[serde(default)]
    pub x0: Option<Quantity>,
    #[serde(default)]
    pub y0: Option<Quantity>,
    /// Shear-lag factor of the end connections: `0.85`, or
    /// `(length: .., eccentricity: ..)` for U = 1 − x̄/L.
    #[serde(default)]
    pub shear_lag: Option<ShearLagFile>,
    /// Holes punched full size (Rp = 0.90).
    #[serde(default)]
    pub holes_punched: Option<bool>,
    /// A single angle's connected leg (AISC 360-16 §E5): `Long`, `Short`
    /// or `Both`; not given: the leg with the larger §E5 slenderness.
    #[serde(default)]
    pub connected_leg: Option<ConnectedLegFile>,
}

#[derive(Debug, Deserialize, Clone, Copy, PartialEq, Eq)]
pub enum ConnectedLegFile {
    Long,
    Short,
    Both,
}

/// The shear-lag factor U given directly or from the connection.
#[derive(Debug, Deserialize)]
#[serde(untagged)]
pub enum ShearLagFile {
    Factor(f64),
    Connection {
        /// Connection length L (first to last fastener), section unit.
        length: Quantity,
        /// Connection eccentricity x̄, section unit.
        eccentricity: Quantity,
    },
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct NodeFile {
    pub id: Id,
    pub x: Quantity,
    pub y: Quantity,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct MemberFile {
    pub id: Id,
    pub start: Id,
    pub end: Id,
    pub section: Id,
    pub material: Id,
    /// Effective-length factor for buckling in the truss plane (default 1).
    #[serde(default)]
    pub k_in: Option<f64>,
    /// Effective-length factor out of the truss plane (default 1).
    #[serde(default)]
    pub k_out: Option<f64>,
    /// Unbraced length in the truss plane (default: the member length).
    #[serde(default)]
    pub unbraced_in: Option<Quantity>,
    /// Unbraced length out of the truss plane (default: the member length).
    #[serde(default)]
    pub unbraced_out: Option<Quantity>,
    /// Fatigue detail: an AASHTO category ("D"), an EN 1993-1-9 category
    /// ("71"), or both ("D 71").
    #[serde(default)]
    pub detail: Option<String>,
    /// Carries tension only (eyebar, rod, counter): slack when it would be
    /// compressed (issue 16; `analysis/active_set.rs`).
    #[serde(default)]
    pub tension_only: bool,
    /// Of a tension-only member: how much longer than the distance between
    /// its pins it is when unloaded (slack); negative when drawn up by its
    /// turnbuckle (an initial tension, as a lack of fit).
    #[serde(default)]
    pub slack: Option<Quantity>,
    /// Parallel eyebars making up the member (default 1); see
    /// `joint/pin/eyebar.rs`.
    #[serde(default)]
    pub bars: Option<u32>,
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
    /// `Dead`, `Live` or `Other` (default): rating keeps dead and live apart.
    #[serde(default)]
    pub kind: Option<CaseKindFile>,
    /// Dynamic load allowance of a live case, as a fraction (0.10 = 10 %).
    #[serde(default)]
    pub impact: Option<f64>,
    /// A live case rated at the legal level.
    #[serde(default)]
    pub legal: Option<bool>,
    #[serde(default)]
    pub loads: Vec<NodalLoadFile>,
    /// Prescribed support displacements, in the section unit.
    #[serde(default)]
    pub settlements: Vec<SettlementFile>,
    /// Self-weight of every member times this factor (connection material).
    #[serde(default)]
    pub self_weight: Option<f64>,
    /// Temperature change of single members (replaces `temperature_all` for them).
    #[serde(default)]
    pub temperature: Vec<TemperatureFile>,
    /// Temperature change of every member.
    #[serde(default)]
    pub temperature_all: Option<Quantity>,
    /// Members made too long (positive) or too short, in the section unit.
    #[serde(default)]
    pub lack_of_fit: Vec<LackOfFitFile>,
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

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct TemperatureFile {
    pub member: String,
    pub change: Quantity,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LackOfFitFile {
    pub member: String,
    pub elongation: Quantity,
}

/// The deck line: a list of node ids, or the nodes with the transverse
/// layout used to give the truss its share of each load (lever rule).
#[derive(Debug, Deserialize)]
#[serde(untagged)]
pub enum DeckFile {
    Nodes(Vec<String>),
    Layout(DeckLayoutFile),
}

impl Default for DeckFile {
    fn default() -> Self {
        DeckFile::Nodes(Vec::new())
    }
}

impl DeckFile {
    /// The deck node ids in order.
    pub fn nodes(&self) -> &[String] {
        match self {
            DeckFile::Nodes(n) => n,
            DeckFile::Layout(l) => &l.nodes,
        }
    }
}

/// `deck: (nodes: [...], width: "18 ft", lanes: ["5 ft"], ...)`.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DeckLayoutFile {
    pub nodes: Vec<String>,
    /// Centre-to-centre spacing of the two trusses (the floor beam's span).
    #[serde(default)]
    pub width: Option<Quantity>,
    /// Lane (or track) centres, measured from the truss analysed.
    #[serde(default)]
    pub lanes: Vec<Quantity>,
    /// Wheel lines of one vehicle, measured from the truss analysed.
    #[serde(default)]
    pub wheel_lines: Vec<Quantity>,
    /// Width of deck whose area load this truss carries (default width/2).
    #[serde(default)]
    pub tributary: Option<Quantity>,
}

/// A vehicle: axles front to back, each `spacing` behind the one before.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct VehicleFile {
    pub id: String,
    #[serde(default)]
    pub axles: Vec<AxleFile>,
    /// Uniform lane or crowd load, force per length.
    #[serde(default)]
    pub lane: Option<Quantity>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct AxleFile {
    pub load: Quantity,
    /// Distance behind the axle in front (zero or absent for the first).
    #[serde(default)]
    pub spacing: Option<Quantity>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct MovingLoadFile {
    pub id: String,
    pub vehicle: String,
    pub step: Quantity,
    /// Dynamic allowance as a fraction (0.10 = 10 %), on the axles.
    #[serde(default)]
    pub impact: Option<f64>,
    /// Apply the dynamic allowance to the lane load too.
    #[serde(default)]
    pub impact_on_lane: Option<bool>,
    /// A legal load: rated at the legal level and posted.
    #[serde(default)]
    pub legal: Option<bool>,
    /// Multiplies every load of the vehicle (LM71's α, a tonnage factor).
    #[serde(default)]
    pub scale: Option<f64>,
}

/// The separate vehicles file: `(vehicles: [...])`.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct VehiclesFile {
    #[serde(default)]
    pub vehicles: Vec<VehicleFile>,
}
