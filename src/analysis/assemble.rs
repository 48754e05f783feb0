//! Direct-stiffness assembly of the global stiffness matrix.
//!
//! A pin-jointed bar of axial stiffness k = EA/L and direction c has
//! elongation e = c·(u_end − u_start); with nodal displacements written on
//! the free directions d, e = Σ b_p q_p with b_p = ±c·d_p, and the bar adds
//! k·b·bᵀ to K (the classic 4 × 4 bar matrix in global axes when d are the
//! x and y axes). Only the upper triangle is stored: K is symmetric.
//!
//! [`stiffness`] builds the sparsity pattern straight from the node
//! adjacency (two nodes joined by a member couple all their free DOFs), then
//! adds every member's entries in place: no triplet list, so assembly needs
//! little more memory than K itself. [`stiffness_triplets`] is the plain
//! triplet route through sprs, kept as the reference the tests compare with.

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

/// Upper triangle of K, assembled directly in compressed sparse column form.
pub fn stiffness(model: &Model, dofs: &Dofs) -> Csc {
    let n = dofs.len();
    let nn = model.nodes.len();
    // Earlier neighbours of each node (CSR by counting), sorted, unique.
    let mut first = vec![0usize; nn + 1];
    for m in &model.members {
        first[m.start.max(m.end) + 1] += 1;
    }
    for i in 0..nn {
        first[i + 1] += first[i];
    }
    let mut fill = first.clone();
    let mut lower = vec![0u32; first[nn]];
    for m in &model.members {
        let (lo, hi) = (m.start.min(m.end), m.start.max(m.end));
        lower[fill[hi]] = lo as u32;
        fill[hi] += 1;
    }
    drop(fill);
    // Column q at node j holds the DOFs of j's earlier neighbours, then j's
    // own DOFs up to q: DOFs are numbered node by node, so rows come sorted.
    let mut col_ptr = Vec::with_capacity(n + 1);
    let mut row_idx = Vec::new();
    col_ptr.push(0);
    for j in 0..nn {
        let nbrs = &mut lower[first[j]..first[j + 1]];
        nbrs.sort_unstable();
        let mut last = u32::MAX;
        let own = dofs.of_node(j);
        if own.is_empty() {
            continue;
        }
        let before = row_idx.len();
        for &i in nbrs.iter() {
            if i != last {
                row_idx.extend(dofs.of_node(i as usize));
                last = i;
            }
        }
        let shared = row_idx.len() - before;
        for q in own.clone() {
            if q > own.start {
                row_idx.extend_from_within(before..before + shared);
            }
            row_idx.extend(own.start..=q);
            col_ptr.push(row_idx.len());
        }
    }
    debug_assert_eq!(col_ptr.len(), n + 1);
    let mut values = vec![0.0; row_idx.len()];
    for m in 0..model.members.len() {
        let k = model.axial_stiffness(m);
        let b = b_row(model, dofs, m);
        for (p, bp) in b.iter() {
            for (q, bq) in b.iter() {
                if p <= q {
                    let (lo, hi) = (col_ptr[q], col_ptr[q + 1]);
                    let at = row_idx[lo..hi]
                        .binary_search(&p)
                        .expect("pattern holds every member entry");
                    values[lo + at] += k * bp * bq;
                }
            }
        }
    }
    Csc {
        n,
        col_ptr,
        row_idx,
        values,
    }
}

/// Upper triangle of K, assembled from triplets through sprs (duplicates
/// summed): the straightforward route, the reference for [`stiffness`].
pub fn stiffness_triplets(model: &Model, dofs: &Dofs) -> Csc {
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

#[cfg(test)]
mod tests {
    use super::*;
    use crate::generate::{generate, lattice, Family, GenerateOptions, UnitSystem};
    use crate::input::{load_str, ron_writer::layout_to_ron};

    fn same(model: &Model) {
        let dofs = Dofs::new(model);
        let direct = stiffness(model, &dofs);
        let reference = stiffness_triplets(model, &dofs);
        assert_eq!(direct.n, reference.n);
        assert_eq!(direct.col_ptr, reference.col_ptr, "pattern (columns)");
        assert_eq!(direct.row_idx, reference.row_idx, "pattern (rows)");
        let scale = reference.values.iter().fold(0.0f64, |a, v| a.max(v.abs()));
        for (d, r) in direct.values.iter().zip(&reference.values) {
            // Same sums in a different order: equal to round-off.
            assert!((d - r).abs() <= 1e-12 * scale, "{d} vs {r}");
        }
    }

    #[test]
    fn direct_assembly_matches_sprs_triplets() {
        // Reference: the sprs triplet-to-CSC conversion (duplicates summed).
        let lat = layout_to_ron(&lattice(5, 3, 2.5, UnitSystem::Si));
        same(&load_str(&lat).unwrap().model);
        let pratt = layout_to_ron(
            &generate(&GenerateOptions {
                family: Family::Pratt,
                panels: 6,
                panel_width: 20.0,
                height: 24.0,
                panel_load: Some(10.0),
                units: UnitSystem::Us,
                top_heights: None,
            })
            .unwrap(),
        );
        same(&load_str(&pratt).unwrap().model);
        let four = include_str!("../../tests/data/four_panel.ron");
        same(&load_str(four).unwrap().model);
    }
}
