//! The validated model: every id interned to an index, every number in SI
//! (m, N, Pa), every reference known to exist. Nothing here knows RON.

use crate::units::DisplayUnits;

#[derive(Clone, Debug, PartialEq)]
pub struct Material {
    pub id: String,
    /// Young's modulus, Pa.
    pub e: f64,
    /// Yield stress, Pa.
    pub fy: Option<f64>,
    /// Tensile strength, Pa.
    pub fu: Option<f64>,
    /// Weight density, N/m³.
    pub density: Option<f64>,
    /// Thermal expansion, per degree.
    pub alpha: Option<f64>,
    /// Year of construction when fy/fu were taken from the MBE table of
    /// steel of unknown grade (MBE Table 6A.6.2.1-1), for the report.
    pub year: Option<i32>,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Section {
    pub id: String,
    /// Gross area, m².
    pub area: f64,
    /// Second moment for buckling in the truss plane, m⁴.
    pub i_in: f64,
    /// Second moment for buckling out of the truss plane, m⁴.
    pub i_out: f64,
    /// Net area for tension fracture, m²; the gross area when not given.
    pub net_area: f64,
    /// The parts and their properties, for a built-up section.
    pub built_up: Option<BuiltUp>,
    /// Shear-lag factor U of the end connections (AASHTO LRFD 6.8.2.2,
    /// AISC 360-16 §D3): 1.0 unless the model gives it.
    pub shear_lag: f64,
    /// Whether the model gave `shear_lag` (the report notes the default).
    pub shear_lag_given: bool,
    /// Holes punched full size (Rp = 0.90, AASHTO LRFD 6.8.2.1) or drilled
    /// or reamed (Rp = 1.0); None when the model does not say, taken as
    /// punched (the conservative value) and noted in the report.
    pub holes_punched: Option<bool>,
    /// J, Cw and the shear centre given with a section by its properties
    /// (SI; shear centre from the centroid, x across the truss plane, y in
    /// it, so that i_in = Ix); `None` when not given or built up.
    pub torsion: Option<crate::section::TorsionProperties>,
}

/// A section computed from its parts (all in SI).
#[derive(Clone, Debug, PartialEq)]
pub struct BuiltUp {
    pub parts: Vec<crate::section::PlacedPart>,
    /// Properties as built and after the recorded section loss.
    pub original: crate::section::SectionProperties,
    pub reduced: crate::section::SectionProperties,
    /// Whether the section's x axis (rather than y) lies in the truss plane.
    pub x_in_plane: bool,
    pub lacing: Option<Lacing>,
    /// Shear centre, J and Cw of the section as inspected (SI, section
    /// coordinates); `None` when a part is known only by table properties.
    pub torsion: Option<crate::section::TorsionProperties>,
    /// For a single angle: the leg its end connections go through (AISC
    /// 360-16 §E5); `None` when not said (the leg giving the larger
    /// §E5 slenderness is assumed).
    pub connected_leg: Option<ConnectedLeg>,
}

/// The leg through which a single-angle member is connected at its ends.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ConnectedLeg {
    Long,
    Short,
    /// Connected through both legs: no eccentricity of §E5 to allow for.
    Both,
}

/// Lacing or battens of a built-up member (AISC 360-16 §E6).
#[derive(Clone, Debug, PartialEq)]
pub struct Lacing {
    /// Connector spacing a, m.
    pub spacing: f64,
    pub connector: crate::section::Connector,
    pub k_i: f64,
    /// Least radius of gyration of one component, m.
    pub component_r: f64,
    /// True when the lacing modifies the out-of-plane slenderness.
    pub out_of_plane: bool,
    /// The lacing bars, when described (for their own checks).
    pub bars: Option<LacingBars>,
    /// Tie plates at the ends (§E6.2); `None` when not said.
    pub tie_plates: Option<bool>,
}

/// Flat lacing bars of a laced member (SI).
#[derive(Clone, Debug, PartialEq)]
pub struct LacingBars {
    pub width: f64,
    pub thickness: f64,
    /// Angle to the member axis, radians, and whether it was given.
    pub angle: f64,
    pub angle_given: bool,
    pub system: crate::section::LacingSystem,
    /// Laced faces sharing the shear.
    pub planes: u32,
}

impl Section {
    pub fn r_in(&self) -> f64 {
        (self.i_in / self.area).sqrt()
    }
    pub fn r_out(&self) -> f64 {
        (self.i_out / self.area).sqrt()
    }
}

#[derive(Clone, Debug, PartialEq)]
pub struct Node {
    pub id: String,
    /// Coordinates, m.
    pub x: f64,
    pub y: f64,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Member {
    /// Inline up to 24 bytes (no allocation for a typical id): a model of
    /// 10⁶ DOF has two million members.
    pub id: compact_str::CompactString,
    pub start: usize,
    pub end: usize,
    pub section: usize,
    pub material: usize,
    /// Effective-length factors in and out of the truss plane.
    pub k_in: f64,
    pub k_out: f64,
    /// Unbraced lengths in and out of plane, m (None: the member length).
    pub unbraced_in: Option<f64>,
    pub unbraced_out: Option<f64>,
    /// Carries tension only: slack when it would be compressed (eyebars,
    /// rods, counters; `analysis::active_set`).
    pub tension_only: bool,
    /// Parallel eyebars (or bars) making up the member, 1 for an ordinary
    /// member (`bars: N`; see `joint/pin/eyebar.rs` for the sharing and the
    /// MBE system factor of multiple-eyebar members).
    pub bars: u32,
}

/// How a support holds its node.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Restraint {
    /// Both directions held.
    Pin,
    /// Vertical direction held; free to roll horizontally.
    Roller,
    /// Free to roll along a surface at `angle` radians from the x axis;
    /// held normal to it.
    InclinedRoller { angle: f64 },
}

impl Restraint {
    /// Number of restrained directions.
    pub fn count(self) -> usize {
        match self {
            Restraint::Pin => 2,
            Restraint::Roller | Restraint::InclinedRoller { .. } => 1,
        }
    }

    /// The unit vector of the direction left free: none for a pin, one for
    /// a roller (no allocation: it is asked once per support per variant).
    pub fn free_direction(self) -> Option<[f64; 2]> {
        match self {
            Restraint::Pin => None,
            Restraint::Roller => Some([1.0, 0.0]),
            Restraint::InclinedRoller { angle } => Some([angle.cos(), angle.sin()]),
        }
    }

    pub fn name(self) -> &'static str {
        match self {
            Restraint::Pin => "pin",
            Restraint::Roller => "roller",
            Restraint::InclinedRoller { .. } => "inclined roller",
        }
    }
}

#[derive(Clone, Debug, PartialEq)]
pub struct Support {
    pub node: usize,
    pub restraint: Restraint,
}

#[derive(Clone, Debug, PartialEq)]
pub struct NodalLoad {
    pub node: usize,
    /// Global force components, N.
    pub fx: f64,
    pub fy: f64,
}

/// A prescribed displacement of a supported node, m (global components;
/// only the part along the restrained directions has an effect).
#[derive(Clone, Debug, PartialEq)]
pub struct Settlement {
    pub node: usize,
    pub dx: f64,
    pub dy: f64,
}

/// A member's stress-free length differs from the distance between its
/// nodes by `elongation` (m): thermal strain, lack of fit.
#[derive(Clone, Debug, PartialEq)]
pub struct InitialElongation {
    pub member: usize,
    pub elongation: f64,
}

/// What a load case is, for rating.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
pub enum CaseKind {
    /// Dead load of components and attachments (DC).
    Dead,
    /// Wearing surfaces and utilities (DW).
    Wearing,
    Live,
    #[default]
    Other,
}

#[derive(Clone, Debug, PartialEq, Default)]
pub struct LoadCase {
    pub id: String,
    pub kind: CaseKind,
    /// Dynamic load allowance (fraction) of a live case.
    pub impact: f64,
    /// A live case rated at the legal level (and posted).
    pub legal: bool,
    pub nodal: Vec<NodalLoad>,
    pub settlements: Vec<Settlement>,
    pub elongations: Vec<InitialElongation>,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Model {
    pub title: String,
    pub units: DisplayUnits,
    pub materials: Vec<Material>,
    pub sections: Vec<Section>,
    pub nodes: Vec<Node>,
    pub members: Vec<Member>,
    pub supports: Vec<Support>,
    pub cases: Vec<LoadCase>,
    pub combinations: Vec<Combination>,
    pub rating: RatingSettings,
    /// Deck line, vehicles and moving loads (empty when not given).
    pub live: crate::loads::LiveLoads,
    /// Fatigue vehicle, traffic and member details (the `fatigue` block).
    pub fatigue: Option<crate::fatigue::Settings>,
    /// Rigid joints, U-frames and vibration data (defaults when not given).
    pub stability: crate::stability::Settings,
    /// Initial slack of tension-only members, kept sparsely: (member index,
    /// stress-free elongation e₀, m). Positive: longer than the distance
    /// between its nodes (slack); negative: drawn up (initial tension).
    pub slack: Vec<(usize, f64)>,
    /// Pins of a pin-connected truss and their stacks of bars (`pins`).
    pub pins: Vec<crate::joint::pin::Pin>,
    /// Riveted or bolted gusset-plate joints (`joint::gusset`; empty when not given).
    pub gussets: Vec<crate::joint::gusset::GussetJoint>,
}

/// A named linear combination of load cases: Σ factor × case (live cases
/// also times 1 + impact).
#[derive(Clone, Debug, PartialEq)]
pub struct Combination {
    pub id: String,
    /// (load case index, factor).
    pub factors: Vec<(usize, f64)>,
    /// (moving load index, factor): the moving load's envelope enters the
    /// combination side by side (greatest tension, greatest compression).
    pub moving: Vec<(usize, f64)>,
}

/// Model-wide rating settings: the method's name and what the model sets
/// of its factors (`crate::method` supplies every default).
#[derive(Clone, Debug, PartialEq, Default)]
pub struct RatingSettings {
    /// Rating method name, if the model sets one.
    pub method: Option<String>,
    pub settings: crate::method::Settings,
}

impl Model {
    /// The load cases summed as the dead load: those listed in `dead_cases`
    /// of the model file, or else every case of kind `Dead` or `Wearing`.
    pub fn dead_cases(&self) -> Vec<usize> {
        if self.live.dead_cases.is_empty() {
            (0..self.cases.len())
                .filter(|&c| matches!(self.cases[c].kind, CaseKind::Dead | CaseKind::Wearing))
                .collect()
        } else {
            self.live.dead_cases.clone()
        }
    }

    /// The dead-load cases split into DC (components) and DW (wearing
    /// surfaces and utilities): a case of kind `Wearing` is DW, any other
    /// dead case DC.
    pub fn dead_cases_split(&self) -> (Vec<usize>, Vec<usize>) {
        self.dead_cases()
            .into_iter()
            .partition(|&c| self.cases[c].kind != CaseKind::Wearing)
    }

    /// Whether any member is tension-only: the analysis is then the
    /// active-set iteration and superposition no longer holds.
    pub fn has_tension_only(&self) -> bool {
        self.members.iter().any(|m| m.tension_only)
    }

    /// Length of member `m`, m.
    pub fn length(&self, m: usize) -> f64 {
        let mem = &self.members[m];
        let (a, b) = (&self.nodes[mem.start], &self.nodes[mem.end]);
        (b.x - a.x).hypot(b.y - a.y)
    }

    /// Unit vector from start to end of member `m`.
    pub fn direction(&self, m: usize) -> [f64; 2] {
        let mem = &self.members[m];
        let (a, b) = (&self.nodes[mem.start], &self.nodes[mem.end]);
        let l = self.length(m);
        [(b.x - a.x) / l, (b.y - a.y) / l]
    }

    /// Axial stiffness EA/L of member `m`, N/m.
    pub fn axial_stiffness(&self, m: usize) -> f64 {
        let mem = &self.members[m];
        self.materials[mem.material].e * self.sections[mem.section].area / self.length(m)
    }

    /// Restrained directions, supports and joints: (members + reactions, 2 × joints).
    pub fn determinacy(&self) -> Determinacy {
        let reactions = self.supports.iter().map(|s| s.restraint.count()).sum();
        Determinacy {
            members: self.members.len(),
            reactions,
            joints: self.nodes.len(),
        }
    }
}

/// The classic count m + r against 2j for a plane pin-jointed truss.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Determinacy {
    pub members: usize,
    pub reactions: usize,
    pub joints: usize,
}

impl Determinacy {
    /// m + r − 2j: negative means a mechanism for certain, zero statically
    /// determinate if stable, positive that degree of indeterminacy if stable.
    pub fn degree(&self) -> i64 {
        (self.members + self.reactions) as i64 - 2 * self.joints as i64
    }

    pub fn describe(&self) -> String {
        let d = self.degree();
        let verdict = match d {
            0 => "statically determinate (if stable)".to_string(),
            d if d > 0 => format!("statically indeterminate to degree {d} (if stable)"),
            _ => format!("a mechanism: {} too few members or reactions", -d),
        };
        format!(
            "members m = {}, reactions r = {}, joints j = {}: m + r = {} against 2j = {}; {verdict}",
            self.members,
            self.reactions,
            self.joints,
            self.members + self.reactions,
            2 * self.joints
        )
    }
}
