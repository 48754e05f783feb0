//! panelpoint: rating and alteration checks for existing pin-jointed trusses.
//!
//! Data flow: [`input`] (RON, units, validation) → [`model::Model`] →
//! [`analysis`] (DOFs, sparse assembly, faer Cholesky, member forces) →
//! [`report`] (text, JSON, CSV), written atomically.
//!
//! Results are screening calculations for review by a qualified engineer;
//! local codes, the owner's rating rules and licensed practice govern.

pub mod analysis;
pub mod capacity;
pub mod cli;
pub mod error;
pub mod fatigue;
pub mod generate;
pub mod geometry;
pub mod input;
pub mod joint;
pub mod loads;
pub mod method;
pub mod model;
pub mod rate;
pub mod report;
pub mod section;
pub mod sensitivity;
pub mod stability;
pub mod sweep;
pub mod textsafe;
pub mod timing;
pub mod units;
