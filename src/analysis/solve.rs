//! The sparse Cholesky factorization of K, through faer.
//!
//! The symbolic step (fill-reducing ordering, elimination tree, supernode
//! layout) depends only on the sparsity pattern and is kept apart from the
//! numeric step, so variants with the same connectivity reuse it. A zero or
//! tiny pivot means a mechanism; its index is mapped back through the
//! ordering to the DOF that is free to move.

use super::assemble::Csc;
use faer::dyn_stack::{MemBuffer, MemStack};
use faer::linalg::cholesky::llt::factor::LltRegularization;
use faer::sparse::linalg::cholesky::{
    factorize_symbolic_cholesky, supernodal::SupernodalLltRef, LltRef, SymbolicCholesky,
    SymbolicCholeskyRaw,
};
use faer::sparse::{SparseColMatRef, SymbolicSparseColMatRef};
use faer::{Conj, MatMut, Par, Side};
use std::sync::Arc;

/// A pivot this small relative to its diagonal means the DOF has (almost)
/// no stiffness once the DOFs eliminated before it are free: a mechanism.
pub const MECHANISM_PIVOT_RATIO: f64 = 1e-10;

#[derive(Clone, Copy, Debug, PartialEq)]
pub enum FactorError {
    /// The matrix is singular or nearly so at this (original) DOF index.
    Singular { dof: usize, pivot_ratio: f64 },
    /// faer could not allocate or the pattern was malformed.
    Internal,
}

/// The symbolic factorization, shareable between numeric factorizations.
#[derive(Clone)]
pub struct Symbolic {
    inner: Arc<SymbolicCholesky<usize>>,
}

/// A numeric factorization with its pivot statistics.
pub struct Factor {
    symbolic: Symbolic,
    values: Vec<f64>,
    /// Smallest pivot L_ii² / K_ii over all DOFs (1 for a diagonal K).
    pub min_pivot_ratio: f64,
    /// The original DOF with that smallest ratio.
    pub min_pivot_dof: usize,
}

fn pattern(k: &Csc) -> SymbolicSparseColMatRef<'_, usize> {
    SymbolicSparseColMatRef::new_checked(k.n, k.n, &k.col_ptr, None, &k.row_idx)
}

impl Symbolic {
    /// Symbolic analysis of the upper triangle `k` (CSC, sorted rows).
    pub fn new(k: &Csc) -> Result<Symbolic, FactorError> {
        let sym = factorize_symbolic_cholesky(
            pattern(k),
            Side::Upper,
            Default::default(),
            Default::default(),
        )
        .map_err(|_| FactorError::Internal)?;
        Ok(Symbolic {
            inner: Arc::new(sym),
        })
    }

    pub fn n(&self) -> usize {
        self.inner.nrows()
    }

    /// Original index of the `i`th eliminated DOF.
    fn original(&self, i: usize) -> usize {
        match self.inner.perm() {
            Some(p) => p.arrays().0[i],
            None => i,
        }
    }

    /// Numeric factorization of `k`, which must have the pattern this was built from.
    pub fn factor(&self, k: &Csc) -> Result<Factor, FactorError> {
        let n = self.n();
        let mut values = vec![0.0; self.inner.len_val()];
        let par = if n > 20_000 { Par::rayon(0) } else { Par::Seq };
        let req = self
            .inner
            .factorize_numeric_llt_scratch::<f64>(par, Default::default());
        let mut buf = MemBuffer::try_new(req).map_err(|_| FactorError::Internal)?;
        let a = SparseColMatRef::new(pattern(k), &k.values);
        let result = self.inner.factorize_numeric_llt(
            &mut values,
            a,
            Side::Upper,
            LltRegularization::default(),
            par,
            MemStack::new(&mut buf),
            Default::default(),
        );
        drop(buf);
        // Original diagonal, in elimination order.
        let mut diag = vec![0.0; n];
        for (j, d) in diag.iter_mut().enumerate() {
            *d = k.get(j, j);
        }
        match result {
            Err(faer::linalg::cholesky::llt::factor::LltError::NonPositivePivot { index }) => {
                // faer's simplicial path reports the failing column 1-based
                // (k + 1), its supernodal path 0-based; clamp in any case so
                // a mechanism can never become an out-of-bounds panic.
                let index = match self.inner.raw() {
                    SymbolicCholeskyRaw::Simplicial(_) => index.saturating_sub(1),
                    SymbolicCholeskyRaw::Supernodal(_) => index,
                };
                return Err(FactorError::Singular {
                    dof: self.original(index.min(n.saturating_sub(1))),
                    pivot_ratio: 0.0,
                });
            }
            Ok(_) => {}
        }
        let pivots = self.pivots(&values);
        let mut min_ratio = f64::INFINITY;
        let mut min_dof = 0;
        for (i, l) in pivots.iter().enumerate() {
            let dof = self.original(i);
            let d = diag[dof];
            let ratio = if d > 0.0 { l * l / d } else { 0.0 };
            if ratio < min_ratio {
                min_ratio = ratio;
                min_dof = dof;
            }
        }
        if n == 0 {
            min_ratio = 1.0;
        }
        if min_ratio.is_nan() || min_ratio < MECHANISM_PIVOT_RATIO {
            return Err(FactorError::Singular {
                dof: min_dof,
                pivot_ratio: min_ratio.max(0.0),
            });
        }
        Ok(Factor {
            symbolic: self.clone(),
            values,
            min_pivot_ratio: min_ratio,
            min_pivot_dof: min_dof,
        })
    }

    /// Diagonal of L, in elimination order.
    fn pivots(&self, values: &[f64]) -> Vec<f64> {
        let n = self.n();
        let mut out = vec![0.0; n];
        match self.inner.raw() {
            SymbolicCholeskyRaw::Simplicial(s) => {
                let l = s.factor();
                let cp = l.col_ptr();
                let ri = l.row_idx();
                for j in 0..n {
                    for p in cp[j]..cp[j + 1] {
                        if ri[p] == j {
                            out[j] = values[p];
                        }
                    }
                }
            }
            SymbolicCholeskyRaw::Supernodal(s) => {
                let l = SupernodalLltRef::new(s, values);
                for k in 0..s.n_supernodes() {
                    let node = l.supernode(k);
                    let start = node.start();
                    let v = node.val();
                    for c in 0..v.ncols() {
                        out[start + c] = v[(c, c)];
                    }
                }
            }
        }
        out
    }
}

impl Factor {
    pub fn n(&self) -> usize {
        self.symbolic.n()
    }

    pub fn symbolic(&self) -> &Symbolic {
        &self.symbolic
    }

    /// Solve K x = b in place for `ncols` right-hand sides stored column by
    /// column in `rhs` (length n × ncols).
    pub fn solve_in_place(&self, rhs: &mut [f64], ncols: usize) {
        let n = self.n();
        if n == 0 || ncols == 0 {
            return;
        }
        assert_eq!(rhs.len(), n * ncols);
        let par = if n * ncols > 200_000 {
            Par::rayon(0)
        } else {
            Par::Seq
        };
        let sym = &*self.symbolic.inner;
        let mut buf = MemBuffer::new(sym.solve_in_place_scratch::<f64>(ncols, par));
        let llt = LltRef::new(sym, &self.values);
        let mat = MatMut::from_column_major_slice_mut(rhs, n, ncols);
        llt.solve_in_place_with_conj(Conj::No, mat, par, MemStack::new(&mut buf));
    }
}
