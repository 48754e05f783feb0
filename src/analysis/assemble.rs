//! Direct-stiffness assembly of the global stiffness matrix.
//!
//! A pin-jointed bar of axial stiffness k = EA/L and direction c has
//! elongation e = c·(u_end − u_start); with nodal displacements written on
//! the free directions d, e = Σ b_p q_p with b_p = ±c·d_p, and the bar adds
//! k·b·bᵀ to K (the classic 4 × 4 bar matrix in global axes when d are the
//! x and y axes). Only the upper triangle is stored: K is symmetric.

use super::dofs::Dofs;
use crate::model::Model;
use sprs::TriMat;

/// The free-DOF entries of a member's compatibility row b: at most four.
#[derive(Clone, Copy, Debug, Default)]
pub struct BRow {
    pub len: usize,
    pub dof: [u32; 4],
    pub value: [f64; 4],
}

impl BRow {
    pub fn iter(&self) -> impl Iterator<Item = (usize, f64)> + '_ {
        (0..self.len).map(|k| (self.dof[k] as usize, self.value[k]))
    }
}

/// Compatibility row of member `m`.
pub fn b_row(model: &Model, dofs: &Dofs, m: usize) -> BRow {
    let mem = &model.members[m];
    let c = model.direction(m);
    let mut row = BRow::default();
    for (node, sign) in [(mem.start, -1.0), (mem.end, 1.0)] {
        for d in dofs.of_node(node) {
            let dir = dofs.direction[d];
            let v = sign * (c[0] * dir[0] + c[1] * dir[1]);
            row.dof[row.len] = d as u32;
            row.value[row.len] = v;
            row.len += 1;
        }
    }
    row
}

/// A square matrix's upper triangle in compressed sparse column form,
/// rows sorted within each column: the layout faer factors.
#[derive(Clone, Debug, PartialEq)]
pub struct Csc {
    pub n: usize,
    pub col_ptr: Vec<usize>,
    pub row_idx: Vec<usize>,
    pub values: Vec<f64>,
}

impl Csc {
    /// Entry (i, j) of the stored triangle, zero when not stored.
    pub fn get(&self, i: usize, j: usize) -> f64 {
        let (lo, hi) = (self.col_ptr[j], self.col_ptr[j + 1]);
        match self.row_idx[lo..hi].binary_search(&i) {
            Ok(p) => self.values[lo + p],
            Err(_) => 0.0,
        }
    }

    /// y = K·x for the full symmetric matrix whose upper triangle this is.
    pub fn sym_mul(&self, x: &[f64], y: &mut [f64]) {
        y.iter_mut().for_each(|v| *v = 0.0);
        for j in 0..self.n {
            for p in self.col_ptr[j]..self.col_ptr[j + 1] {
                let (i, v) = (self.row_idx[p], self.values[p]);
                y[i] += v * x[j];
                if i != j {
                    y[j] += v * x[i];
                }
            }
        }
    }
}

/// Upper triangle of K, assembled from triplets through sprs (duplicates summed).
pub fn stiffness(model: &Model, dofs: &Dofs) -> Csc {
    let n = dofs.len();
    let mut tri = TriMat::with_capacity((n, n), model.members.len() * 10);
    for m in 0..model.members.len() {
        let k = model.axial_stiffness(m);
        let b = b_row(model, dofs, m);
        for (p, bp) in b.iter() {
            for (q, bq) in b.iter() {
                if p <= q {
                    tri.add_triplet(p, q, k * bp * bq);
                }
            }
        }
    }
    let csc: sprs::CsMat<f64> = tri.to_csc();
    let (indptr, indices, data) = csc.into_raw_storage();
    Csc {
        n,
        col_ptr: indptr,
        row_idx: indices,
        values: data,
    }
}
