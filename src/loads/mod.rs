//! Loads that rating needs beyond plain nodal forces: self-weight,
//! temperature and lack of fit (as initial member elongations), and
//! vehicles rolled across a deck line, evaluated through influence lines
//! into per-member force envelopes. Everything here is SI and does no I/O.

pub mod envelope;
pub mod influence;
pub mod moving;
pub mod self_weight;
pub mod thermal;

pub use envelope::{
    envelopes, envelopes_with, Extreme, MemberEnvelope, MovingEnvelope, ReactionEnvelope,
};
pub use influence::{influence_lines, InfluenceLines};
pub use moving::{Deck, Direction, Placement};

use crate::analysis::results::AnalysisError;

/// One axle of a vehicle.
#[derive(Clone, Debug, PartialEq)]
pub struct Axle {
    /// Axle load, N (acting downward).
    pub load: f64,
    /// Distance behind the front axle, m (0 for the front axle).
    pub offset: f64,
}

/// A vehicle: an axle train and an optional uniform lane (crowd) load.
#[derive(Clone, Debug, PartialEq)]
pub struct Vehicle {
    pub id: String,
    /// Front axle first; offsets non-decreasing.
    pub axles: Vec<Axle>,
    /// Uniform load per unit length of deck, N/m (downward).
    pub lane: Option<f64>,
}

impl Vehicle {
    /// Distance from the front axle to the rear axle, m.
    pub fn length(&self) -> f64 {
        self.axles.last().map_or(0.0, |a| a.offset)
    }
}

/// A vehicle rolled across the deck.
#[derive(Clone, Debug, PartialEq)]
pub struct MovingLoad {
    pub id: String,
    /// Index into [`LiveLoads::vehicles`].
    pub vehicle: usize,
    /// Step between positions of the front axle, m.
    pub step: f64,
    /// Dynamic allowance as a fraction: axle effects are multiplied by 1 + impact.
    pub impact: f64,
    /// Whether the lane load is multiplied by 1 + impact too.
    pub impact_on_lane: bool,
}

/// The moving-load part of a model.
#[derive(Clone, Debug, PartialEq, Default)]
pub struct LiveLoads {
    /// Deck nodes in order along the deck (indices into `model.nodes`).
    pub deck: Vec<usize>,
    pub vehicles: Vec<Vehicle>,
    pub moving: Vec<MovingLoad>,
    /// Load cases (indices into `model.cases`) summed as the dead load.
    pub dead_cases: Vec<usize>,
}

/// What can go wrong computing influence lines and envelopes.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum LoadError {
    #[error("no deck line: give `deck: [...]` in the model or --deck on the command line")]
    NoDeck,
    #[error("the deck line needs at least two nodes")]
    ShortDeck,
    #[error("deck node \"{0}\" appears more than once")]
    RepeatedDeckNode(String),
    #[error("deck nodes \"{0}\" and \"{1}\" are at the same place")]
    ZeroDeckSegment(String, String),
    #[error("deck node \"{0}\" is not defined")]
    UnknownDeckNode(String),
    #[error("deck node \"{0}\" has no member and no support, so it cannot carry load")]
    LooseDeckNode(String),
    #[error("unknown member \"{0}\"")]
    UnknownMember(String),
    #[error("the model has no moving loads: add `vehicles: [...]` and `moving_loads: [...]`")]
    NoMovingLoads,
    #[error("moving load \"{id}\": {positions} positions × {axles} axles = {work:.3e} axle placements (limits: {max_positions:.0e} positions, {max_work:.0e} axle placements); {advice}")]
    TooManyPositions {
        id: String,
        positions: f64,
        axles: usize,
        work: f64,
        max_positions: f64,
        max_work: f64,
        advice: String,
    },
    /// An envelope value overflowed (issue 22, item 12).
    #[error("moving load \"{id}\": the envelope of {of} is not a finite number (overflow); the axle loads or impact are out of range")]
    NonFinite { id: String, of: String },
    #[error(transparent)]
    Analysis(#[from] AnalysisError),
}

impl LoadError {
    /// True when the fault is ours rather than the input's.
    pub fn is_internal(&self) -> bool {
        matches!(self, LoadError::Analysis(AnalysisError::Internal))
    }
}
