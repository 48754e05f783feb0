//! Joint checks. PLACEHOLDER until the lead's framework (src/joint/mod.rs on
//! main) is merged: the trait and types below copy JOINT_API.md so the pin
//! module compiles meanwhile; the merge takes main's file and keeps the one
//! line `pub mod pin;` and the `pin::checks` entry in `all_checks`.

pub mod pin;

use crate::method::{Level, Method};
use crate::units::Dimension;

/// Demand and resistance of one check under one set of member forces.
pub struct Eval {
    pub demand: f64,
    pub resistance: f64,
}

pub trait JointCheck: Send + Sync {
    fn node(&self) -> usize;
    fn kind(&self) -> &'static str;
    fn member(&self) -> Option<usize>;
    fn part(&self) -> String;
    fn uses(&self) -> Vec<usize>;
    fn clause(&self, method: &Method) -> &'static str;
    fn equation(&self, method: &Method) -> String;
    fn inputs(&self) -> Vec<(&'static str, f64, Option<Dimension>)>;
    fn dimension(&self) -> Option<Dimension>;
    fn evaluate(&self, forces: &[f64], method: &Method, level: &Level) -> Eval;
}

pub struct JointSet {
    pub checks: Vec<Box<dyn JointCheck>>,
    pub notes: Vec<String>,
}
