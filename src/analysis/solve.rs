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

/// The value a regularized pivot is given: 2⁻¹⁰, whose square root 2⁻⁵ is
/// exact, so a marked pivot is recognised by equality; no genuine pivot of
/// a unit-diagonal matrix is expected to hit it to the last bit.
const MARKER_PIVOT: f64 = 0.0009765625;
const MARKER_ROOT: f64 = 0.03125;

#[derive(Clone, Debug, PartialEq)]
pub enum FactorError {
    /// The matrix is singular or nearly so at this (original) DOF index.
    /// `mode` is the free motion found (a null vector of K, one entry per
    /// DOF, largest entry ±1), when it could be computed.
    Singular {
        dof: usize,
        pivot_ratio: f64,
        mode: Option<Vec<f64>>,
    },
    /// A pivot came out negative (or NaN) despite the regularization: K̃ is
    /// no longer positive definite in floating point, the mark of severe
    /// ill-conditioning, at this (original) DOF index (issue 22, item 11).
    NotPositive { dof: usize },
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
    /// Jacobi scaling D^-½ applied before factoring.
    scale: Vec<f64>,
    /// Smallest pivot L_ii² / K_ii over all DOFs (1 for a diagonal K).
    pub min_pivot_ratio: f64,
    /// The original DOF with that smallest ratio.
    pub min_pivot_dof: usize,
}

/// Run `f` on a thread of the rayon pool when `par` is parallel.
///
/// Called from outside the pool, each of faer's parallel sections is sent
/// to the pool and the caller sleeps until it is done: two thread wake-ups
/// for every supernode large enough to split, and the sequential parts in
/// between run on a thread the pool does not count. Run from inside the
/// pool, the splits are plain work-stealing joins. Measured on a 10⁶-DOF
/// lattice (2 cores): about 1 s less of numeric factorization, most of it
/// system time spent waking threads.
pub fn in_pool<R: Send>(par: Par, f: impl FnOnce() -> R + Send) -> R {
    if par == Par::Seq || rayon::current_thread_index().is_some() {
        f()
    } else {
        rayon::scope(|_| f())
    }
}

/// Write `value` over `buf` on all cores, so the operating system maps
/// and zeroes its pages now, on every core at once, rather than one page
/// at a time inside the factorization's sequential stretches. On a
/// 10⁶-DOF lattice the factor is 1.7 GB (400,000 pages); touched first
/// the numeric factorization took about 1.3 s less in total.
pub fn touch_in_parallel<T: Copy + Send + Sync>(buf: &mut [T], value: T) {
    use rayon::prelude::*;
    // 2 MB a task: one page table's worth, so two cores seldom take the
    // same page-table lock (faults in one 2 MB span from both cores at once
    // were several times dearer here than apart).
    let chunk = (1 << 21) / std::mem::size_of::<T>().max(1);
    buf.par_chunks_mut(chunk.max(1)).for_each(|c| c.fill(value));
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
    ///
    /// K is first scaled symmetrically to unit diagonal, K̃ = D^-½·K·D^-½
    /// (Jacobi scaling), so every pivot of K̃ is directly the ratio
    /// L_ii²/K_ii and stiffness ratios between members do not distort it.
    /// Pivots below [`MECHANISM_PIVOT_RATIO`] are replaced by a marker value
    /// (faer's dynamic regularization) so the factorization completes and
    /// the first marked pivot names the DOF that is free to move.
    pub fn factor(&self, k: &Csc) -> Result<Factor, FactorError> {
        let n = self.n();
        let mut scale = vec![0.0; n];
        for (j, sc) in scale.iter_mut().enumerate() {
            let d = k.get(j, j);
            if d.is_nan() || d <= 0.0 || !d.is_finite() {
                // No stiffness at all along DOF j: K being positive
                // semidefinite, its row is zero and e_j itself is free.
                let mut mode = vec![0.0; n];
                mode[j] = 1.0;
                return Err(FactorError::Singular {
                    dof: j,
                    pivot_ratio: 0.0,
                    mode: (d == 0.0).then_some(mode),
                });
            }
            *sc = 1.0 / d.sqrt();
        }
        let mut scaled = k.values.clone();
        for j in 0..n {
            for p in k.col_ptr[j]..k.col_ptr[j + 1] {
                scaled[p] *= scale[k.row_idx[p]] * scale[j];
            }
        }
        let par = if n > 20_000 { Par::rayon(0) } else { Par::Seq };
        let mut values = vec![0.0; self.inner.len_val()];
        let req = self
            .inner
            .factorize_numeric_llt_scratch::<f64>(par, Default::default());
        let mut buf = MemBuffer::try_new(req).map_err(|_| FactorError::Internal)?;
        if par != Par::Seq {
            crate::timing::stage("numeric: touch pages", || {
                touch_in_parallel(&mut values, 0.0);
                touch_in_parallel(&mut buf, std::mem::MaybeUninit::new(0u8));
            });
        }
        let a = SparseColMatRef::new(pattern(k), &scaled);
        let inner = &self.inner;
        let result = in_pool(par, || {
            inner
                .factorize_numeric_llt(
                    &mut values,
                    a,
                    Side::Upper,
                    LltRegularization {
                        dynamic_regularization_delta: MARKER_PIVOT,
                        dynamic_regularization_epsilon: MECHANISM_PIVOT_RATIO,
                    },
                    par,
                    MemStack::new(&mut buf),
                    Default::default(),
                )
                .map(|_| ())
        });
        drop(buf);
        drop(scaled);
        if let Err(e) = result {
            use faer::linalg::cholesky::llt::factor::LltError;
            let LltError::NonPositivePivot { index } = e;
            // The simplicial path reports the column 1-based, the
            // supernodal path 0-based (see docs/robustness.md).
            let i = match self.inner.raw() {
                SymbolicCholeskyRaw::Simplicial(_) => index.saturating_sub(1),
                SymbolicCholeskyRaw::Supernodal(_) => index,
            };
            return Err(FactorError::NotPositive {
                dof: self.original(i.min(n.saturating_sub(1))),
            });
        }
        let pivots = self.pivots(&values);
        let mut min_ratio = 1.0f64;
        let mut min_dof = 0;
        for (i, l) in pivots.iter().enumerate() {
            let ratio = l * l;
            if *l == MARKER_ROOT {
                let dof = self.original(i);
                let regularized = Factor {
                    symbolic: self.clone(),
                    values,
                    scale,
                    min_pivot_ratio: 0.0,
                    min_pivot_dof: dof,
                };
                return Err(FactorError::Singular {
                    dof,
                    pivot_ratio: 0.0,
                    mode: regularized.null_vector(dof),
                });
            }
            if ratio < min_ratio {
                min_ratio = ratio;
                min_dof = self.original(i);
            }
        }
        Ok(Factor {
            symbolic: self.clone(),
            values,
            scale,
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
    /// The free motion behind the first regularized pivot, at DOF `dof`.
    ///
    /// Regularizing the pivot of the i-th eliminated DOF factors
    /// K̃' = K̃ + δ·e_i·e_iᵀ (K̃ the Jacobi-scaled K). The DOFs eliminated
    /// before i are stiff (their pivots were accepted), so the leading block
    /// up to i has a null vector v with v_i = 1 and zeros after i; K being
    /// positive semidefinite, vᵀK̃v = 0 makes v a null vector of the whole
    /// K̃, and then K̃'v = δ·e_i: one solve with e_i gives the mode. In the
    /// unscaled DOFs the same solve through [`Factor::solve_in_place`]
    /// (which applies D^-½ on both sides) returns D^-½·v/δ·√K_ii: the
    /// displacements of the mechanism. Normalized to a largest entry of 1.
    fn null_vector(&self, dof: usize) -> Option<Vec<f64>> {
        let n = self.n();
        let mut x = vec![0.0; n];
        x[dof] = 1.0;
        self.solve_in_place(&mut x, 1);
        let largest = x.iter().fold(0.0f64, |a, v| a.max(v.abs()));
        if !largest.is_finite() || largest == 0.0 {
            return None;
        }
        x.iter_mut().for_each(|v| *v /= largest);
        Some(x)
    }

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
        // K⁻¹ = D^-½ K̃⁻¹ D^-½.
        for col in rhs.chunks_mut(n) {
            col.iter_mut().zip(&self.scale).for_each(|(v, s)| *v *= s);
        }
        let mat = MatMut::from_column_major_slice_mut(rhs, n, ncols);
        in_pool(par, || {
            llt.solve_in_place_with_conj(Conj::No, mat, par, MemStack::new(&mut buf))
        });
        for col in rhs.chunks_mut(n) {
            col.iter_mut().zip(&self.scale).for_each(|(v, s)| *v *= s);
        }
    }
}
