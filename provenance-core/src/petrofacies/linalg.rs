//! Small dense symmetric matrices for log-ratio statistics (dimension 2 for one diagram, up to
//! 2 × 5 when coordinates of several diagrams are stacked).

use serde::Serialize;

/// A symmetric d × d matrix stored row-major (a covariance in log-ratio coordinates).
///
/// # Example
/// ```
/// use provenance_core::petrofacies::SymMatrix;
/// let s = SymMatrix::covariance(&[vec![0.0, 0.0], vec![2.0, 0.0], vec![0.0, 2.0]]).unwrap();
/// // Hand-computed: means (2/3, 2/3); var = (4/9 + 16/9 + 4/9)/2 = 4/3; cov = −2/3.
/// assert!((s.get(0, 0) - 4.0 / 3.0).abs() < 1e-12);
/// assert!((s.get(0, 1) + 2.0 / 3.0).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SymMatrix {
    d: usize,
    v: Vec<f64>,
}

/// The lower Cholesky factor L of a positive definite matrix (S = L·Lᵀ), row-major.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::SymMatrix;
/// let mut s = SymMatrix::identity(2);
/// s.scale(4.0); // S = 4·I, so L = 2·I and det S = 16
/// let l = s.cholesky().unwrap();
/// assert_eq!((l.get(0, 0), l.get(1, 0), l.get(1, 1)), (2.0, 0.0, 2.0));
/// assert_eq!(l.apply(&[1.0, -1.0]), vec![2.0, -2.0]);
/// assert!((l.ln_det() - 16f64.ln()).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Cholesky {
    d: usize,
    l: Vec<f64>,
}

/// Column means of equally long rows; `None` for no rows.
pub(crate) fn mean(rows: &[Vec<f64>]) -> Option<Vec<f64>> {
    let d = rows.first()?.len();
    let mut m = vec![0.0; d];
    for r in rows {
        for (mi, ri) in m.iter_mut().zip(r) {
            *mi += ri;
        }
    }
    let n = rows.len() as f64;
    Some(m.into_iter().map(|x| x / n).collect())
}

impl SymMatrix {
    /// A zero matrix of dimension `d`.
    pub fn zeros(d: usize) -> SymMatrix {
        SymMatrix {
            d,
            v: vec![0.0; d * d],
        }
    }

    /// The identity matrix of dimension `d`.
    pub fn identity(d: usize) -> SymMatrix {
        let mut m = SymMatrix::zeros(d);
        for i in 0..d {
            m.v[i * d + i] = 1.0;
        }
        m
    }

    /// Sample covariance (divisor n − 1) of the rows; `None` for fewer than two rows.
    pub fn covariance(rows: &[Vec<f64>]) -> Option<SymMatrix> {
        if rows.len() < 2 {
            return None;
        }
        let m = mean(rows)?;
        let mut s = SymMatrix::scatter(rows, &m);
        s.scale(1.0 / (rows.len() as f64 - 1.0));
        Some(s)
    }

    /// The scatter matrix Σ (x − m)(x − m)ᵀ about `m`.
    pub fn scatter(rows: &[Vec<f64>], m: &[f64]) -> SymMatrix {
        let d = m.len();
        let mut s = SymMatrix::zeros(d);
        for r in rows {
            s.add_outer(r, m, 1.0);
        }
        s
    }

    /// Add w·(x − m)(x − m)ᵀ.
    pub(crate) fn add_outer(&mut self, x: &[f64], m: &[f64], w: f64) {
        let d = self.d;
        for i in 0..d {
            let di = x[i] - m[i];
            for j in 0..d {
                self.v[i * d + j] += w * di * (x[j] - m[j]);
            }
        }
    }

    /// Multiply every entry by `f`.
    pub fn scale(&mut self, f: f64) {
        self.v.iter_mut().for_each(|x| *x *= f);
    }

    /// `self` + `w`·`other` (same dimension).
    pub fn add_scaled(&mut self, other: &SymMatrix, w: f64) {
        for (a, b) in self.v.iter_mut().zip(&other.v) {
            *a += w * b;
        }
    }

    /// The dimension d.
    pub fn dim(&self) -> usize {
        self.d
    }

    /// Entry (i, j).
    pub fn get(&self, i: usize, j: usize) -> f64 {
        self.v[i * self.d + j]
    }

    /// The rows, for output.
    pub fn rows(&self) -> Vec<Vec<f64>> {
        self.v.chunks(self.d.max(1)).map(<[f64]>::to_vec).collect()
    }

    /// The trace.
    pub fn trace(&self) -> f64 {
        (0..self.d).map(|i| self.get(i, i)).sum()
    }

    /// The Cholesky factor, or `None` when the matrix is not numerically positive definite
    /// (a pivot below 1e-12 × the largest diagonal entry, or not finite).
    ///
    /// # Example
    /// ```
    /// use provenance_core::petrofacies::SymMatrix;
    /// let s = SymMatrix::covariance(&[vec![0.0, 0.0], vec![1.0, 1.0], vec![2.0, 2.0]]).unwrap();
    /// assert!(s.cholesky().is_none()); // the points are collinear: singular
    /// assert!(SymMatrix::identity(3).cholesky().is_some());
    /// ```
    pub fn cholesky(&self) -> Option<Cholesky> {
        let d = self.d;
        let scale = (0..d).map(|i| self.get(i, i).abs()).fold(0.0, f64::max);
        if !(scale > 0.0 && scale.is_finite()) {
            return None;
        }
        let mut l = vec![0.0; d * d];
        for i in 0..d {
            for j in 0..=i {
                let mut s = self.get(i, j);
                for k in 0..j {
                    s -= l[i * d + k] * l[j * d + k];
                }
                if i == j {
                    // Also refuses NaN pivots.
                    if s.is_nan() || s <= 1e-12 * scale {
                        return None;
                    }
                    l[i * d + i] = s.sqrt();
                } else {
                    l[i * d + j] = s / l[j * d + j];
                }
            }
        }
        Some(Cholesky { d, l })
    }
}

impl Cholesky {
    /// Entry (i, j) of L (zero above the diagonal).
    pub fn get(&self, i: usize, j: usize) -> f64 {
        self.l[i * self.d + j]
    }

    /// L·u.
    pub fn apply(&self, u: &[f64]) -> Vec<f64> {
        (0..self.d)
            .map(|i| (0..=i).map(|j| self.get(i, j) * u[j]).sum())
            .collect()
    }

    /// w = L⁻¹x (forward substitution): coordinates in which S becomes the identity.
    ///
    /// # Example
    /// ```
    /// use provenance_core::petrofacies::SymMatrix;
    /// let mut s = SymMatrix::identity(2);
    /// s.scale(4.0);
    /// assert_eq!(s.cholesky().unwrap().whiten(&[2.0, -4.0]), vec![1.0, -2.0]);
    /// ```
    pub fn whiten(&self, x: &[f64]) -> Vec<f64> {
        let d = self.d;
        let mut w: Vec<f64> = Vec::with_capacity(d);
        for (i, xi) in x.iter().enumerate().take(d) {
            let s = xi
                - w.iter()
                    .enumerate()
                    .map(|(j, wj)| self.get(i, j) * wj)
                    .sum::<f64>();
            w.push(s / self.get(i, i));
        }
        w
    }

    /// The squared Mahalanobis length xᵀS⁻¹x, by forward substitution L·w = x, then |w|².
    ///
    /// # Example
    /// ```
    /// use provenance_core::petrofacies::SymMatrix;
    /// let mut s = SymMatrix::identity(2);
    /// s.scale(4.0);
    /// assert!((s.cholesky().unwrap().mahalanobis2(&[2.0, 2.0]) - 2.0).abs() < 1e-12);
    /// ```
    pub fn mahalanobis2(&self, x: &[f64]) -> f64 {
        self.whiten(x).iter().map(|v| v * v).sum()
    }

    /// ln det S = 2 Σ ln Lᵢᵢ.
    pub fn ln_det(&self) -> f64 {
        2.0 * (0..self.d).map(|i| self.get(i, i).ln()).sum::<f64>()
    }
}
