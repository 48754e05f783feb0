//! Shared by the benchmarks: the generated lattice at a requested size and
//! each pipeline stage as its own step, so every stage can be timed apart.
#![allow(dead_code)]

use panelpoint::analysis::assemble::{stiffness, Csc};
use panelpoint::analysis::dofs::Dofs;
use panelpoint::analysis::results::{Analysis, CaseResult, Prepared};
use panelpoint::analysis::solve::Symbolic;
use panelpoint::capacity::{self, Curve, DesignMethod};
use panelpoint::generate::{lattice, UnitSystem};
use panelpoint::input::{self, ron_writer::layout_to_ron, Converted};
use panelpoint::model::Model;

/// Panels each way of the square lattice with about `dofs` free DOFs
/// (2 per node less the support restraints).
pub fn side_for(dofs: usize) -> usize {
    let nodes = dofs as f64 / 2.0;
    (nodes.sqrt().round() as usize).saturating_sub(1).max(1)
}

/// RON text of the square lattice with about `dofs` free DOFs, 4 m panels.
pub fn lattice_text(dofs: usize) -> String {
    let n = side_for(dofs);
    layout_to_ron(&lattice(n, n, 4.0, UnitSystem::Si))
}

pub fn load(text: &str) -> Converted {
    input::load_str(text).expect("generated lattice loads")
}

/// Capacity check of every member on the AISC 360-16 curve (in-plane
/// radius of gyration, K = 1): the per-member work of a rating run.
/// Returns the smallest design stress so the work is not optimised away.
pub fn capacities(model: &Model) -> f64 {
    let curve = Curve::Aisc360 {
        method: DesignMethod::Lrfd,
    };
    let mut least = f64::INFINITY;
    for (m, mem) in model.members.iter().enumerate() {
        let mat = &model.materials[mem.material];
        let sec = &model.sections[mem.section];
        let kl_r = model.length(m) / sec.r_in().min(sec.r_out());
        let fy = mat.fy.unwrap_or(250e6);
        if let Ok(c) = capacity::column(&curve, fy, mat.e, kl_r) {
            least = least.min(c.design_stress);
        }
    }
    least
}

/// The numeric part of the pipeline, stage by stage, for in-process timing.
pub struct Stages {
    pub dofs: Dofs,
    pub k: Csc,
    pub symbolic: Symbolic,
}

/// One load case solved and recovered on a prepared model.
pub fn solve_and_recover(prepared: &Prepared, model: &Model) -> Vec<CaseResult> {
    prepared
        .solve_cases(model, &model.cases)
        .expect("lattice solves")
}

pub fn json_to_sink(model: &Model, analysis: &Analysis, c: &Converted) -> usize {
    let mut w = std::io::BufWriter::with_capacity(1 << 16, CountingSink(0));
    panelpoint::report::json::solve(&mut w, model, analysis, &c.warnings).unwrap();
    w.into_inner().map_err(|_| ()).unwrap().0
}

/// Discards output but counts the bytes, so the writing cannot be skipped.
pub struct CountingSink(pub usize);

impl std::io::Write for CountingSink {
    fn write(&mut self, buf: &[u8]) -> std::io::Result<usize> {
        self.0 += buf.len();
        Ok(buf.len())
    }
    fn flush(&mut self) -> std::io::Result<()> {
        Ok(())
    }
}

pub fn assemble(model: &Model) -> (Dofs, Csc) {
    let dofs = Dofs::new(model);
    let k = stiffness(model, &dofs);
    (dofs, k)
}
