//! The validated description of a riveted or bolted joint (SI, indices),
//! built by `input/joints.rs`. Joint coordinates: metres from the panel
//! point's work point, x and y as the truss's.

pub use super::outline::P;
pub use super::splice::SplicePlates;

/// A gusset-plate joint at one panel point.
#[derive(Clone, Debug, PartialEq)]
pub struct GussetJoint {
    pub node: usize,
    pub plates: Plates,
    /// The plate outline, counter-clockwise or not, joint coordinates.
    pub outline: Vec<P>,
    pub groups: Vec<FastenerGroup>,
    pub planes: Vec<ShearPlane>,
    pub splice: Option<Splice>,
    /// Defaults taken and data missing, for the report.
    pub notes: Vec<String>,
}

impl GussetJoint {
    /// The joint after member `j` is removed from the model (a member-loss
    /// scan, a sweep): its fastener group and splice go, later indices shift.
    pub fn without_member(&mut self, j: usize) {
        let shift = |m: &mut usize| {
            if *m > j {
                *m -= 1;
            }
        };
        self.groups.retain(|g| !g.members.contains(&j));
        for g in &mut self.groups {
            g.members.iter_mut().for_each(shift);
        }
        if self.splice.as_ref().is_some_and(|s| s.members.contains(&j)) {
            self.splice = None;
        }
        if let Some(s) = &mut self.splice {
            s.members.iter_mut().for_each(shift);
        }
    }
}

/// The gusset plates of a joint (identical plates, all carrying the joint).
#[derive(Clone, Debug, PartialEq)]
pub struct Plates {
    pub count: u32,
    /// Thickness used in every check: measured (or nominal) less the loss, m.
    pub thickness: f64,
    /// As built, m (for the report).
    pub nominal_thickness: f64,
    pub fy: f64,
    pub fu: f64,
    pub e: f64,
    /// Rp of AASHTO LRFD 6.8.2.1: 0.90 punched or not known, 1.0 drilled.
    pub rp: f64,
}

/// What the fasteners are.
#[derive(Clone, Debug, PartialEq)]
pub enum Fastener {
    /// Rivet of shear strength `fv` (Pa); `basis` says where it came from.
    Rivet { fv: f64, basis: String },
    /// Bolt of tensile strength `fub` (Pa).
    Bolt {
        fub: f64,
        threads_excluded: bool,
        grade: String,
    },
}

/// The fasteners joining one member (or a chord running through) to the plates.
#[derive(Clone, Debug, PartialEq)]
pub struct FastenerGroup {
    /// The member; a second one when the chord runs through the joint
    /// continuous, the group then carrying the difference of their forces.
    pub members: Vec<usize>,
    /// Unit vector from the work point along the (first) member.
    pub axis: P,
    pub fastener: Fastener,
    pub diameter: f64,
    pub hole: f64,
    /// Gauge lines along the member, rows along each line.
    pub lines: u32,
    pub rows: u32,
    pub pitch: f64,
    pub gauge: f64,
    /// Work point to the row nearest it, along the axis, m.
    pub first_row: f64,
    /// Shift of the pattern across the axis (to the axis's left), m.
    pub offset: f64,
    /// Outermost row to the plate edge along the axis, m.
    pub edge: f64,
    pub planes: u32,
    /// Free length of the Whitmore column, m.
    pub lmid: f64,
}

impl FastenerGroup {
    pub fn count(&self) -> u32 {
        self.lines * self.rows
    }

    /// Fastener centres in joint coordinates.
    pub fn positions(&self) -> Vec<P> {
        let n = [-self.axis[1], self.axis[0]];
        super::outline::fastener_positions(
            self.axis,
            self.first_row,
            self.rows,
            self.pitch,
            self.lines,
            self.gauge,
        )
        .into_iter()
        .map(|p| [p[0] + n[0] * self.offset, p[1] + n[1] * self.offset])
        .collect()
    }

    /// The pattern's centroid in joint coordinates.
    pub fn centroid(&self) -> P {
        let p = self.positions();
        let k = p.len().max(1) as f64;
        let s = p.iter().fold([0.0, 0.0], |a, q| [a[0] + q[0], a[1] + q[1]]);
        [s[0] / k, s[1] / k]
    }

    /// The middle of the Whitmore section: the row nearest the work point, on the pattern's centre line.
    pub fn whitmore_centre(&self) -> P {
        let n = [-self.axis[1], self.axis[0]];
        [
            self.axis[0] * self.first_row + n[0] * self.offset,
            self.axis[1] * self.first_row + n[1] * self.offset,
        ]
    }
}

/// Orientation of a full shear plane through the joint.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum PlaneDir {
    Horizontal,
    Vertical,
}

/// A full plane through the plates at `at` (y of a horizontal, x of a vertical plane, m).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ShearPlane {
    pub dir: PlaneDir,
    pub at: f64,
}

/// A chord splice in the joint: the plates carry the larger chord force.
#[derive(Clone, Debug, PartialEq)]
pub struct Splice {
    pub members: Vec<usize>,
    pub plates: Vec<SplicePlates>,
    pub hole: f64,
}
