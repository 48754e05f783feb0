//! Pins of pin-connected trusses (issue 16): the stack of bars on each pin,
//! their forces resolved in the truss plane, the shear and moment along the
//! pin, the pin's strength in combined bending and shear, the bearing of each
//! bar, the body of each bar of a multiple-eyebar member, and the proportions
//! of eyebar heads and pin plates.
//!
//! - [`statics`]: the pin as a free body under point loads (no model).
//! - [`strength`]: LRFD 6.7.6.2, load-factor and allowable-stress values.
//! - [`eyebar`]: LRFD 6.8.6 / 6.8.7 proportions, sharing, system factor.
//! - [`resolve`]: the bars' forces from the member forces of the model.
//! - [`checks`]: the joint checks the framework rates.
//!
//! The model's `pins` (input/pins.rs) become [`Pin`]s: every length in m,
//! every stress in Pa, members by index, the stack in order along the pin.

pub mod checks;
pub mod eyebar;
pub mod resolve;
pub mod statics;
pub mod strength;

pub use checks::checks;
pub use eyebar::EyebarHead;
pub use strength::Factors;

/// One pin: at `node`, of `diameter` and yield stress `fy`, with its stack.
#[derive(Clone, Debug, PartialEq)]
pub struct Pin {
    pub node: usize,
    pub diameter: f64,
    pub fy: f64,
    /// The bars in order along the pin (as given in the model).
    pub stack: Vec<Bar>,
    pub factors: Factors,
}

/// What a bar's force comes from.
#[derive(Clone, Debug, PartialEq)]
pub enum Carrier {
    /// A share of this member's axial force (by thickness among its bars).
    Member(usize),
    /// A share of whatever balances the members' forces on the pin: the
    /// node's applied load (a floor-beam hanger) or its support.
    Load,
}

/// The form of a bar, for its proportions and its bearing.
#[derive(Clone, Debug, PartialEq)]
pub enum BarKind {
    /// A member's plate or web bearing on the pin, no head described.
    Plain,
    /// An eyebar; its head when described.
    Eyebar(Option<EyebarHead>),
    /// A pin plate (or the main plate) with what is known of it at the hole:
    /// width across the hole's centre, the plate beyond the hole, the hole.
    Plate {
        name: String,
        width: Option<f64>,
        beyond: Option<f64>,
        hole: Option<f64>,
    },
}

/// One bar of a pin's stack.
#[derive(Clone, Debug, PartialEq)]
pub struct Bar {
    pub carrier: Carrier,
    /// The member's id, or the load entry's name.
    pub label: String,
    pub kind: BarKind,
    /// Thickness and mid-thickness position along the pin, m.
    pub thickness: f64,
    pub position: f64,
    /// Yield stress of the bar's steel, Pa (the member's material, or given
    /// for a load entry); None: no bearing check for this bar.
    pub fy: Option<f64>,
}

impl Bar {
    /// The bar's name for the reader: "L2-L3 eyebar", "U3-L3 pin plate".
    pub fn name(&self) -> String {
        match &self.kind {
            BarKind::Plain => self.label.clone(),
            BarKind::Eyebar(_) => format!("{} eyebar", self.label),
            BarKind::Plate { name, .. } => format!("{} {name}", self.label),
        }
    }

    pub fn is_plate(&self) -> bool {
        matches!(self.kind, BarKind::Plate { .. })
    }
}
