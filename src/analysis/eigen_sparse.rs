//! Sparse generalized symmetric eigenproblems A·φ = λ·B·φ (A positive
//! definite) by subspace iteration with Rayleigh–Ritz projection, on the
//! project's sparse Cholesky of A (`analysis::solve`, faer): Bathe's
//! subspace iteration (K. J. Bathe, *Finite Element Procedures*, §11.6, the
//! standard form), i.e. inverse iteration (shift-invert at σ = 0) on a
//! block of q = max(2p, p + 8) vectors:
//!
//! Y = B·X, solve A·X̄ = Y, A_r = X̄ᵀ·Y, B_r = X̄ᵀ·B·X̄, A_r·Q = B_r·Q·Λ
//! (dense, [`super::eigen::smallest_positive`]), X = X̄·Q;
//!
//! until the p wanted λ change by less than 10⁻¹⁰ relatively; then each
//! pair's residual ‖A·φ − λ·B·φ‖/‖A·φ‖ is checked.

use super::assemble::Csc;
use super::eigen::{normalize, EigenError, EigenPair, EIGEN_RESIDUAL_LIMIT};
use super::solve::Symbolic;
use nalgebra::{DMatrix, DVector};

/// A symmetric matrix as summed triplets (both triangles), for products.
pub struct SparseSym {
    n: usize,
    entries: Vec<(usize, usize, f64)>,
}

impl SparseSym {
    /// From unsummed triplets of both triangles.
    pub fn new(n: usize, mut t: Vec<(usize, usize, f64)>) -> SparseSym {
        t.sort_unstable_by_key(|&(i, j, _)| (j, i));
        let mut entries: Vec<(usize, usize, f64)> = Vec::with_capacity(t.len());
        for (i, j, v) in t {
            match entries.last_mut() {
                Some(last) if last.0 == i && last.1 == j => last.2 += v,
                _ => entries.push((i, j, v)),
            }
        }
        SparseSym { n, entries }
    }

    pub fn mul(&self, x: &DVector<f64>) -> DVector<f64> {
        let mut y = DVector::zeros(self.n);
        for &(i, j, v) in &self.entries {
            y[i] += v * x[j];
        }
        y
    }

    fn mul_block(&self, x: &DMatrix<f64>) -> DMatrix<f64> {
        let mut y = DMatrix::zeros(self.n, x.ncols());
        for c in 0..x.ncols() {
            for &(i, j, v) in &self.entries {
                y[(i, c)] += v * x[(j, c)];
            }
        }
        y
    }

    /// The upper triangle in CSC (rows sorted), as faer factors it.
    fn upper(&self) -> Csc {
        let mut col_ptr = vec![0usize; self.n + 1];
        let mut row_idx = Vec::new();
        let mut values = Vec::new();
        for &(i, j, v) in self.entries.iter().filter(|e| e.0 <= e.1) {
            col_ptr[j + 1] += 1;
            row_idx.push(i);
            values.push(v);
        }
        for j in 0..self.n {
            col_ptr[j + 1] += col_ptr[j];
        }
        Csc {
            n: self.n,
            col_ptr,
            row_idx,
            values,
        }
    }
}

/// Iterations allowed before giving up.
pub const MAX_ITERATIONS: usize = 300;

/// The `count` smallest positive λ of A·φ = λ·B·φ (sparse).
pub fn smallest_positive(
    a: &SparseSym,
    b: &SparseSym,
    count: usize,
) -> Result<Vec<EigenPair>, EigenError> {
    let n = a.n;
    let upper = a.upper();
    let symbolic = Symbolic::new(&upper).map_err(|_| EigenError::Sparse)?;
    let factor = symbolic
        .factor(&upper)
        .map_err(|_| EigenError::NotPositiveDefinite)?;
    let q = (2 * count).max(count + 8).min(n);
    // Start: the diagonal of B over that of A picks the DOFs most loaded
    // relative to their stiffness, plus a deterministic spread (Bathe).
    let mut x = DMatrix::zeros(n, q);
    let mut ratio: Vec<(f64, usize)> = (0..n).map(|i| (0.0, i)).collect();
    for &(i, j, v) in &b.entries {
        if i == j {
            ratio[i].0 += v.abs();
        }
    }
    for &(i, j, v) in &a.entries {
        if i == j && v > 0.0 {
            ratio[i].0 /= v;
        }
    }
    ratio.sort_by(|p, r| r.0.total_cmp(&p.0));
    for i in 0..n {
        x[(i, 0)] = 1.0 + ((i * 7919) % 101) as f64 * 1e-3;
    }
    for c in 1..q {
        x[(ratio[(c - 1) % n].1, c)] = 1.0;
        for i in 0..n {
            x[(i, c)] += (((i + 1) * (c + 3) * 104_729) % 1009) as f64 * 1e-6;
        }
    }
    let mut previous = vec![f64::INFINITY; count];
    let mut worst = f64::INFINITY;
    for _ in 0..MAX_ITERATIONS {
        let y = b.mul_block(&x);
        let mut xb = y.clone();
        factor.solve_in_place(xb.as_mut_slice(), q);
        let ar = xb.transpose() * &y;
        let br = xb.transpose() * b.mul_block(&xb);
        let ar = (&ar + ar.transpose()) * 0.5;
        let br = (&br + br.transpose()) * 0.5;
        let (mu, ritz) = super::eigen::Reduced::new(&ar)?.all(&br)?;
        // Next block: every Ritz vector (A-orthogonal, so independent),
        // largest μ = smallest positive λ first, scaled to unit length.
        let mut next = &xb * ritz;
        for mut c in next.column_iter_mut() {
            let norm = c.norm().max(f64::MIN_POSITIVE);
            c /= norm;
        }
        x = next;
        let scale = mu.iter().fold(0.0f64, |m, v| m.max(v.abs()));
        let values: Vec<f64> = mu
            .iter()
            .take_while(|&&m| m > 1e-12 * scale)
            .take(count)
            .map(|m| 1.0 / m)
            .collect();
        if values.is_empty() {
            return Err(EigenError::NoPositive);
        }
        let converged = values
            .iter()
            .zip(&previous)
            .all(|(v, p)| ((v - p) / v).abs() < 1e-10);
        previous = values.clone();
        if converged {
            let mut out = Vec::with_capacity(values.len());
            for (c, &value) in values.iter().enumerate() {
                let phi = normalize(x.column(c).into_owned());
                let aphi = a.mul(&phi);
                let r = (&aphi - b.mul(&phi) * value).norm() / aphi.norm();
                out.push(EigenPair {
                    value,
                    vector: phi,
                    residual: r,
                });
            }
            // The values settle before the vectors: go on until the
            // vectors pass the residual check with a margin of 10.
            worst = out.iter().fold(0.0f64, |m, p| m.max(p.residual));
            if worst <= 0.1 * EIGEN_RESIDUAL_LIMIT {
                return Ok(out);
            }
        }
    }
    Err(EigenError::Residual {
        index: 1,
        residual: worst,
        limit: EIGEN_RESIDUAL_LIMIT,
    })
}
