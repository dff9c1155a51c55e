//! Log-ratio geometry of compositions (Aitchison 1986; Egozcue et al. 2003, Math. Geol.
//! 35:279-300) and zero replacement (Martín-Fernández, Barceló-Vidal & Pawlowsky-Glahn 2003,
//! Math. Geol. 35:253-278).
//!
//! Conventions, fixed for the crate: compositions are given as positive parts in any scale;
//! the ilr basis is the Helmert-type sequential basis
//! zᵢ = √(i/(i+1))·ln(g(x₁…xᵢ)/xᵢ₊₁), i = 1 … D−1, with g the geometric mean. For three
//! parts this is z₁ = (1/√2)·ln(x₁/x₂), z₂ = √(2/3)·ln(√(x₁x₂)/x₃).

/// Detection-limit fraction for multiplicative replacement: δ = 0.65 × (1/n) for n points
/// (Martín-Fernández et al. 2003 suggest 65% of the detection limit; the 0.65 is from memory).
pub const DELTA_FRACTION: f64 = 0.65;

/// Closure to proportions summing to 1; `None` when the sum is not positive and finite.
///
/// # Example
/// ```
/// assert_eq!(provenance_core::logratio::close(&[1.0, 1.0, 2.0]).unwrap(), vec![0.25, 0.25, 0.5]);
/// ```
pub fn close(x: &[f64]) -> Option<Vec<f64>> {
    let s: f64 = x.iter().sum();
    (s.is_finite() && s > 0.0 && x.iter().all(|v| *v >= 0.0))
        .then(|| x.iter().map(|v| v / s).collect())
}

/// Centred log-ratio: ln(xᵢ/g(x)). All parts must be positive.
///
/// # Example
/// ```
/// let c = provenance_core::logratio::clr(&[1.0, 1.0, 1.0]);
/// assert!(c.iter().all(|v| v.abs() < 1e-15));
/// ```
pub fn clr(x: &[f64]) -> Vec<f64> {
    let logs: Vec<f64> = x.iter().map(|v| v.ln()).collect();
    let mean = logs.iter().sum::<f64>() / logs.len() as f64;
    logs.into_iter().map(|l| l - mean).collect()
}

/// Isometric log-ratio coordinates (D − 1 of them) in the Helmert-type basis above.
///
/// # Example
/// ```
/// use provenance_core::logratio::ilr;
/// let z = ilr(&[2.0, 1.0, 1.0]);
/// assert!((z[0] - 2f64.ln() / 2f64.sqrt()).abs() < 1e-12);
/// assert!((z[1] - (2.0f64 / 3.0).sqrt() * 2f64.sqrt().ln()).abs() < 1e-12);
/// ```
pub fn ilr(x: &[f64]) -> Vec<f64> {
    let mut out = Vec::with_capacity(x.len().saturating_sub(1));
    let mut log_sum = 0.0;
    for i in 1..x.len() {
        log_sum += x[i - 1].ln();
        let fi = i as f64;
        out.push((fi / (fi + 1.0)).sqrt() * (log_sum / fi - x[i].ln()));
    }
    out
}

/// Inverse ilr: the composition (closed to 1) with coordinates `z`.
///
/// # Example
/// ```
/// use provenance_core::logratio::{ilr, ilr_inverse};
/// let x = ilr_inverse(&ilr(&[0.5, 0.3, 0.2]));
/// assert!((x[0] - 0.5).abs() < 1e-12 && (x[2] - 0.2).abs() < 1e-12);
/// ```
pub fn ilr_inverse(z: &[f64]) -> Vec<f64> {
    let d = z.len() + 1;
    let mut c = vec![0.0; d];
    for (k, zk) in z.iter().enumerate() {
        let i = (k + 1) as f64;
        let a = (1.0 / (i * (i + 1.0))).sqrt();
        for cj in c.iter_mut().take(k + 1) {
            *cj += zk * a;
        }
        c[k + 1] -= zk * (i / (i + 1.0)).sqrt();
    }
    let m = c.iter().cloned().fold(f64::NEG_INFINITY, f64::max);
    let e: Vec<f64> = c.iter().map(|v| (v - m).exp()).collect();
    let s: f64 = e.iter().sum();
    e.into_iter().map(|v| v / s).collect()
}

/// Multiplicative replacement of zeros: each zero part becomes `delta` (in proportions) and
/// every non-zero part is multiplied by (1 − Σδ), so ratios among non-zero parts are kept
/// (Martín-Fernández et al. 2003). A composition without zeros is returned closed and
/// otherwise unchanged. `None` when every part is zero.
///
/// # Example
/// ```
/// use provenance_core::logratio::replace_zeros;
/// let r = replace_zeros(&[3.0, 1.0, 0.0], 0.01).unwrap();
/// assert_eq!(r[2], 0.01);
/// assert!((r[0] / r[1] - 3.0).abs() < 1e-12);
/// assert!((r.iter().sum::<f64>() - 1.0).abs() < 1e-12);
/// ```
pub fn replace_zeros(x: &[f64], delta: f64) -> Option<Vec<f64>> {
    let p = close(x)?;
    let zeros = p.iter().filter(|v| **v == 0.0).count() as f64;
    let keep = 1.0 - zeros * delta;
    Some(
        p.into_iter()
            .map(|v| if v == 0.0 { delta } else { v * keep })
            .collect(),
    )
}

/// The δ for counts of `n` points: 0.65/n (see [`DELTA_FRACTION`]).
///
/// # Example
/// ```
/// assert!((provenance_core::logratio::delta_for_points(325.0) - 0.002).abs() < 1e-15);
/// ```
pub fn delta_for_points(n: f64) -> f64 {
    DELTA_FRACTION / n
}

/// Closed geometric mean of compositions (the compositional centre; Aitchison 1986), closed
/// to 1. All parts must be positive. `None` for an empty set.
///
/// # Example
/// ```
/// use provenance_core::logratio::geometric_mean;
/// let g = geometric_mean(&[vec![0.5, 0.25, 0.25], vec![0.125, 0.5, 0.375]]).unwrap();
/// // √(0.5·0.125) : √(0.25·0.5) : √(0.25·0.375), closed.
/// let raw = [0.0625f64.sqrt(), 0.125f64.sqrt(), 0.09375f64.sqrt()];
/// let s: f64 = raw.iter().sum();
/// for i in 0..3 { assert!((g[i] - raw[i] / s).abs() < 1e-12); }
/// ```
pub fn geometric_mean(xs: &[Vec<f64>]) -> Option<Vec<f64>> {
    let d = xs.first()?.len();
    let mut logs = vec![0.0; d];
    for x in xs {
        for (l, v) in logs.iter_mut().zip(x) {
            *l += v.ln();
        }
    }
    let n = xs.len() as f64;
    let m: Vec<f64> = logs.iter().map(|l| (l / n).exp()).collect();
    close(&m)
}
