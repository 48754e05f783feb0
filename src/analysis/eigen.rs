//! Generalized symmetric eigenproblems A·φ = λ·B·φ with A symmetric
//! positive definite and B symmetric (possibly indefinite or singular):
//! the buckling problem K·φ = λ·G·φ and the vibration problem K·φ = ω²·M·φ.
//!
//! Dense method (small models): Cholesky A = L·Lᵀ reduces the problem to the
//! standard symmetric one C·y = μ·y with C = L⁻¹·B·L⁻ᵀ, μ = 1/λ, φ = L⁻ᵀ·y
//! (the reduction through the stiffness, so a singular lumped mass matrix or
//! an indefinite geometric stiffness needs no special care). The positive μ
//! give the positive λ, largest μ first. Each pair's residual
//! ‖A·φ − λ·B·φ‖ / ‖A·φ‖ is computed and returned.
//!
//! Larger models: `eigen_sparse.rs` (subspace iteration on the sparse
//! Cholesky of `analysis::solve`), which uses this for its Ritz step.

use nalgebra::{DMatrix, DVector};

/// A pair whose relative residual exceeds this is refused as inaccurate.
pub const EIGEN_RESIDUAL_LIMIT: f64 = 1e-6;

/// Largest order solved by the dense method.
pub const DENSE_LIMIT: usize = 3000;

#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum EigenError {
    #[error("the stiffness matrix is not positive definite (the structure is a mechanism or unstable before loading)")]
    NotPositiveDefinite,
    #[error(
        "no positive eigenvalue: the loading causes no instability (no member in compression)"
    )]
    NoPositive,
    #[error(
        "eigenpair {index}: residual {residual:.1e} exceeds {limit:.0e}; the result is not trusted"
    )]
    Residual {
        index: usize,
        residual: f64,
        limit: f64,
    },
    #[error("the sparse factorization failed")]
    Sparse,
}

/// One eigenpair with its check.
#[derive(Clone, Debug, PartialEq)]
pub struct EigenPair {
    /// λ (critical load factor, or ω² in (rad/s)²).
    pub value: f64,
    /// φ, scaled to a largest component of magnitude 1 (sign: largest positive).
    pub vector: DVector<f64>,
    /// ‖A·φ − λ·B·φ‖₂ / ‖A·φ‖₂.
    pub residual: f64,
}

/// The `count` smallest positive λ of A·φ = λ·B·φ (dense; A must be
/// symmetric positive definite). Pairs with μ = 1/λ below `1e-12·max|μ|`
/// (infinite λ: massless or unloaded directions) are dropped.
pub fn smallest_positive(
    a: &DMatrix<f64>,
    b: &DMatrix<f64>,
    count: usize,
) -> Result<Vec<EigenPair>, EigenError> {
    Reduced::new(a)?.smallest_positive(b, count)
}

/// A factored A, reused for several B (one stiffness, many load effects).
pub struct Reduced {
    a: DMatrix<f64>,
    l: DMatrix<f64>,
}

impl Reduced {
    pub fn new(a: &DMatrix<f64>) -> Result<Reduced, EigenError> {
        let chol = nalgebra::Cholesky::new(a.clone()).ok_or(EigenError::NotPositiveDefinite)?;
        Ok(Reduced {
            a: a.clone(),
            l: chol.l(),
        })
    }

    /// Every pair of C = L⁻¹·B·L⁻ᵀ: μ = 1/λ (largest first) and the
    /// A-orthonormal vectors φ = L⁻ᵀ·y as columns (the Ritz step of the
    /// subspace iteration needs the whole set, negative μ included).
    pub fn all(&self, b: &DMatrix<f64>) -> Result<(Vec<f64>, DMatrix<f64>), EigenError> {
        let l = &self.l;
        let n = l.nrows();
        let x = l
            .solve_lower_triangular(b)
            .ok_or(EigenError::NotPositiveDefinite)?;
        let c = l
            .solve_lower_triangular(&x.transpose())
            .ok_or(EigenError::NotPositiveDefinite)?;
        let c = (&c + c.transpose()) * 0.5;
        let eig = nalgebra::SymmetricEigen::new(c);
        let mut order: Vec<usize> = (0..n).collect();
        order.sort_by(|&i, &j| eig.eigenvalues[j].total_cmp(&eig.eigenvalues[i]));
        let lt = l.transpose();
        let mut phi = DMatrix::zeros(n, n);
        for (c, &i) in order.iter().enumerate() {
            let y = eig.eigenvectors.column(i).into_owned();
            let v = lt
                .solve_upper_triangular(&y)
                .ok_or(EigenError::NotPositiveDefinite)?;
            phi.set_column(c, &v);
        }
        Ok((order.iter().map(|&i| eig.eigenvalues[i]).collect(), phi))
    }

    /// As [`smallest_positive`], on this A.
    pub fn smallest_positive(
        &self,
        b: &DMatrix<f64>,
        count: usize,
    ) -> Result<Vec<EigenPair>, EigenError> {
        let (a, l) = (&self.a, &self.l);
        let n = a.nrows();
        // X = L⁻¹·B, then C = L⁻¹·Xᵀ = L⁻¹·B·L⁻ᵀ (B symmetric).
        let x = l
            .solve_lower_triangular(b)
            .ok_or(EigenError::NotPositiveDefinite)?;
        let mut c = l
            .solve_lower_triangular(&x.transpose())
            .ok_or(EigenError::NotPositiveDefinite)?;
        // Symmetrize the round-off.
        for i in 0..n {
            for j in 0..i {
                let m = 0.5 * (c[(i, j)] + c[(j, i)]);
                c[(i, j)] = m;
                c[(j, i)] = m;
            }
        }
        let eig = nalgebra::SymmetricEigen::new(c);
        let scale = eig.eigenvalues.iter().fold(0.0f64, |m, v| m.max(v.abs()));
        let mut order: Vec<usize> = (0..n)
            .filter(|&i| eig.eigenvalues[i] > 1e-12 * scale)
            .collect();
        if order.is_empty() {
            return Err(EigenError::NoPositive);
        }
        order.sort_by(|&i, &j| eig.eigenvalues[j].total_cmp(&eig.eigenvalues[i]));
        let lt = l.transpose();
        let mut out = Vec::with_capacity(count.min(order.len()));
        for &i in order.iter().take(count) {
            let y = eig.eigenvectors.column(i).into_owned();
            let phi = lt
                .solve_upper_triangular(&y)
                .ok_or(EigenError::NotPositiveDefinite)?;
            out.push(pair(a, b, 1.0 / eig.eigenvalues[i], phi));
        }
        check(&out)?;
        Ok(out)
    }
}

/// Builds a checked, normalized pair.
pub fn pair(a: &DMatrix<f64>, b: &DMatrix<f64>, value: f64, phi: DVector<f64>) -> EigenPair {
    let vector = normalize(phi);
    let residual = relative_residual(a, b, value, &vector);
    EigenPair {
        value,
        vector,
        residual,
    }
}

/// ‖A·φ − λ·B·φ‖₂ / ‖A·φ‖₂.
pub fn relative_residual(
    a: &DMatrix<f64>,
    b: &DMatrix<f64>,
    value: f64,
    phi: &DVector<f64>,
) -> f64 {
    let aphi = a * phi;
    let r = &aphi - (b * phi) * value;
    let d = aphi.norm();
    if d > 0.0 {
        r.norm() / d
    } else {
        f64::INFINITY
    }
}

/// Refuses a set whose residuals exceed [`EIGEN_RESIDUAL_LIMIT`].
pub fn check(pairs: &[EigenPair]) -> Result<(), EigenError> {
    for (index, p) in pairs.iter().enumerate() {
        if p.residual.is_nan() || p.residual > EIGEN_RESIDUAL_LIMIT {
            return Err(EigenError::Residual {
                index: index + 1,
                residual: p.residual,
                limit: EIGEN_RESIDUAL_LIMIT,
            });
        }
    }
    Ok(())
}

/// Scales to a largest component of +1.
pub fn normalize(mut phi: DVector<f64>) -> DVector<f64> {
    let (mut big, mut at) = (0.0f64, 0);
    for (i, v) in phi.iter().enumerate() {
        if v.abs() > big {
            big = v.abs();
            at = i;
        }
    }
    if big > 0.0 {
        let s = phi[at].signum() / big;
        phi *= s;
    }
    phi
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Two equal masses m in a chain of two equal springs k (ground–m1–m2):
    /// K = k·[[2, −1], [−1, 1]], M = m·I. By hand, det(K − ω²M) = 0 gives
    /// (2 − x)(1 − x) − 1 = 0 with x = ω²m/k, so x = (3 ∓ √5)/2 =
    /// 0.381966…, 2.618034…; mode 1 has φ₂/φ₁ = 1/(1 − x) = 1.618034 (the
    /// golden ratio, by hand).
    #[test]
    fn two_mass_spring_chain_by_hand() {
        let (k, m) = (1000.0, 2.0);
        let a = DMatrix::from_row_slice(2, 2, &[2.0 * k, -k, -k, k]);
        let b = DMatrix::from_row_slice(2, 2, &[m, 0.0, 0.0, m]);
        let p = smallest_positive(&a, &b, 2).unwrap();
        let x1 = (3.0 - 5f64.sqrt()) / 2.0 * k / m;
        let x2 = (3.0 + 5f64.sqrt()) / 2.0 * k / m;
        assert!((p[0].value - x1).abs() < 1e-9 * x1, "{}", p[0].value);
        assert!((p[1].value - x2).abs() < 1e-9 * x2, "{}", p[1].value);
        let ratio = p[0].vector[0] / p[0].vector[1];
        assert!((1.0 / ratio - 1.618_033_988_75).abs() < 1e-9);
        assert!(p[0].residual < 1e-12 && p[1].residual < 1e-12);
    }

    /// Singular B: spring k1 = 3 from ground to mass m1 = 1, spring k2 = 1
    /// from m1 to a massless DOF 2 with nothing beyond: K = [[4, −1], [−1, 1]],
    /// M = diag(1, 0). By hand (static condensation of DOF 2):
    /// ω² = (K11 − K12²/K22)/m1 = (4 − 1)/1 = 3, the only finite root.
    #[test]
    fn singular_mass_is_condensed() {
        let a = DMatrix::from_row_slice(2, 2, &[4.0, -1.0, -1.0, 1.0]);
        let b = DMatrix::from_row_slice(2, 2, &[1.0, 0.0, 0.0, 0.0]);
        let p = smallest_positive(&a, &b, 5).unwrap();
        assert_eq!(p.len(), 1);
        assert!((p[0].value - 3.0).abs() < 1e-12);
    }

    #[test]
    fn indefinite_b_without_positive_root_is_an_error() {
        let a = DMatrix::identity(2, 2);
        let b = -DMatrix::identity(2, 2);
        assert_eq!(smallest_positive(&a, &b, 1), Err(EigenError::NoPositive));
        let bad = DMatrix::from_row_slice(2, 2, &[1.0, 2.0, 2.0, 1.0]);
        assert_eq!(
            smallest_positive(&bad, &a, 1),
            Err(EigenError::NotPositiveDefinite)
        );
    }
}
