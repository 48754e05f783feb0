//! Fatigue of riveted members and eyebars: the live-load stress history of
//! each member as the fatigue vehicle crosses the deck (`history`), counted
//! by rainflow (`rainflow`), and evaluated by AASHTO MBE Section 7 (`mbe`)
//! and EN 1993-1-9 (`en1993_1_9`); `evaluate` runs them for every member.
//! SI throughout, no I/O.

pub mod en1993_1_9;
pub mod evaluate;
pub mod history;
pub mod mbe;
pub mod rainflow;

pub use evaluate::{evaluate, evaluate_model, Fatigue, MemberFatigue};

use crate::loads::LoadError;
use en1993_1_9::EnParameters;
use mbe::{Category, MbeParameters, Traffic};

/// A member's fatigue detail as given (`detail: "D"`, `"71"`, `"D 71"`):
/// an AASHTO category, an EN 1993-1-9 category (Δσ_C, Pa), or both.
#[derive(Clone, Copy, Debug, PartialEq, Default)]
pub struct Detail {
    pub aashto: Option<Category>,
    pub en: Option<f64>,
}

/// Which area turns a member force into a stress.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum StressArea {
    /// The section's net area (the gross area where none is given): riveted
    /// details fail through the holes (LRFD 6.6.1.2.3, net section for
    /// riveted and bolted connections, from memory).
    Net,
    Gross,
}

/// The model's fatigue settings (its `fatigue: (...)` block).
#[derive(Clone, Debug, PartialEq)]
pub struct Settings {
    /// Index into `model.live.vehicles` of the fatigue vehicle.
    pub vehicle: usize,
    /// Dynamic allowance on the axles, as a fraction (0.15).
    pub impact: f64,
    pub traffic: Traffic,
    pub area: StressArea,
    /// Category of members without a given AASHTO category (D: riveted
    /// members, common practice from memory).
    pub default_category: Category,
    /// EN category Δσ_C (Pa) of members without a given one (71 MPa,
    /// common practice for riveted details, from memory).
    pub default_en: f64,
    pub mbe: MbeParameters,
    pub en: EnParameters,
    /// Details given by members, sorted by member index (into
    /// `model.members`); the rest take the defaults.
    pub details: Vec<(usize, Detail)>,
}

impl Settings {
    /// Settings with the stated defaults for `vehicle` and traffic.
    pub fn new(vehicle: usize, traffic: Traffic) -> Settings {
        Settings {
            vehicle,
            impact: 0.15,
            traffic,
            area: StressArea::Net,
            default_category: Category::D,
            default_en: 71.0e6,
            mbe: MbeParameters::default(),
            en: EnParameters::default(),
            details: Vec::new(),
        }
    }

    /// The detail of member `m` as given (both parts None when not given).
    pub fn detail(&self, m: usize) -> Detail {
        self.details
            .binary_search_by_key(&m, |d| d.0)
            .map_or(Detail::default(), |i| self.details[i].1)
    }
}

/// What can go wrong in a fatigue evaluation.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum FatigueError {
    #[error(
        "the model has no fatigue block: add `fatigue: (vehicle: \"...\", adtt: ..., age: ...)`"
    )]
    NoSettings,
    #[error(transparent)]
    Loads(#[from] LoadError),
}
