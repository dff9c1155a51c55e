//! Confidence region of a group mean and prediction region of a new sample, in ilr space,
//! mapped back to closed curves in the triangle (Weltje 2002, Earth-Sci. Rev. 57:211-253).
//!
//! With n samples, ilr mean ȳ and sample covariance S (divisor n − 1) in p = 2 coordinates:
//! - the 100q% confidence region of the true mean μ is
//!   (ȳ − μ)ᵀS⁻¹(ȳ − μ) ≤ p(n − 1)/(n(n − p)) · F_{p,n−p}(q), Hotelling's T²;
//! - the 100q% prediction region of one new sample y is the same ellipse about ȳ with the bound
//!   multiplied by (n + 1).
//!
//! For p = 2 the F quantile has the closed form F_{2,m}(q) = (m/2)((1 − q)^(−2/m) − 1)
//! ([`f2_quantile`]). The ellipse boundary is ȳ + c·L·(cos θ, sin θ) with S = L·Lᵀ (Cholesky) and
//! c² the bound; each boundary point is mapped back with the inverse ilr. Ellipses in ilr space
//! become curved closed lines in the triangle that never leave it.

use super::linalg::{Cholesky, SymMatrix};
use crate::logratio::ilr_inverse;
use crate::stats::distributions::f2_quantile;
use serde::Serialize;

/// The level of the regions unless asked otherwise (95%, common practice).
pub const DEFAULT_LEVEL: f64 = 0.95;

/// Points on each region curve before the closing point (every 3.75°).
pub const CURVE_POINTS: usize = 96;

/// Why a group has no regions.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::RegionGap;
/// assert!(RegionGap::TooFewSamples.reason().contains("3 samples"));
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum RegionGap {
    /// Fewer than p + 1 = 3 samples: the F quantile has no degrees of freedom.
    TooFewSamples,
    /// The covariance is singular (for example identical compositions).
    SingularCovariance,
}

impl RegionGap {
    /// The reason in words, for outputs.
    pub fn reason(self) -> &'static str {
        match self {
            RegionGap::TooFewSamples => {
                "regions need at least 3 samples with points in this diagram"
            }
            RegionGap::SingularCovariance => {
                "the log-ratio covariance is singular (the samples do not spread in two directions)"
            }
        }
    }
}

/// The bound c² on the Mahalanobis distance of the mean's confidence region:
/// p(n − 1)/(n(n − p)) · F_{p,n−p}(level) with p = 2; `None` for n < 3.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::confidence_bound;
/// // n = 4: 2·3/(4·2) · F_{2,2}(0.95) = 0.75 · 19 = 14.25 (hand-computed).
/// assert!((confidence_bound(4, 0.95).unwrap() - 14.25).abs() < 1e-12);
/// ```
pub fn confidence_bound(n: usize, level: f64) -> Option<f64> {
    if n < 3 {
        return None;
    }
    let (n, p) = (n as f64, 2.0);
    Some(p * (n - 1.0) / (n * (n - p)) * f2_quantile(level, n - p))
}

/// The bound of the prediction region: (n + 1) times [`confidence_bound`].
///
/// # Example
/// ```
/// use provenance_core::petrofacies::prediction_bound;
/// assert!((prediction_bound(4, 0.95).unwrap() - 5.0 * 14.25).abs() < 1e-12);
/// ```
pub fn prediction_bound(n: usize, level: f64) -> Option<f64> {
    confidence_bound(n, level).map(|c| c * (n as f64 + 1.0))
}

/// The closed curve {ȳ + √c2·L·(cos θ, sin θ)} mapped to percent of the three poles:
/// [`CURVE_POINTS`] points from θ = 0 counter-clockwise, then the first point again.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::{ellipse_curve, SymMatrix};
/// let chol = SymMatrix::identity(2).cholesky().unwrap();
/// let curve = ellipse_curve([0.0, 0.0], &chol, 1.0);
/// assert_eq!(curve.len(), 97);
/// assert_eq!(curve[0], curve[96]);
/// // θ = 0 is z = (1, 0): Q/F = e^√2 with L = √(QF).
/// let [q, f, l] = curve[0];
/// assert!((q / f - 2f64.sqrt().exp()).abs() < 1e-9 && (l - (q * f).sqrt()).abs() < 1e-9);
/// ```
pub fn ellipse_curve(mean: [f64; 2], chol: &Cholesky, c2: f64) -> Vec<[f64; 3]> {
    let c = c2.max(0.0).sqrt();
    let mut out: Vec<[f64; 3]> = (0..CURVE_POINTS)
        .map(|k| {
            let t = std::f64::consts::TAU * k as f64 / CURVE_POINTS as f64;
            let d = chol.apply(&[c * t.cos(), c * t.sin()]);
            let x = ilr_inverse(&[mean[0] + d[0], mean[1] + d[1]]);
            [100.0 * x[0], 100.0 * x[1], 100.0 * x[2]]
        })
        .collect();
    out.push(out[0]);
    out
}

/// The regions of one group in one diagram.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::{Regions, SymMatrix};
/// let mut s = SymMatrix::identity(2);
/// s.scale(0.01);
/// let r = Regions::new([0.0, 0.0], &s, 10, 0.95).unwrap();
/// assert!(r.prediction_bound > r.confidence_bound);
/// assert_eq!(r.confidence.len(), 97);
/// ```
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Regions {
    /// The level, for example 0.95.
    pub level: f64,
    /// c² of the confidence region.
    pub confidence_bound: f64,
    /// c² of the prediction region.
    pub prediction_bound: f64,
    /// The confidence region of the mean, percent triples, closed.
    pub confidence: Vec<[f64; 3]>,
    /// The prediction region of a new sample, percent triples, closed.
    pub prediction: Vec<[f64; 3]>,
}

impl Regions {
    /// The regions about ilr mean `mean` with covariance `cov` from `n` samples.
    pub fn new(
        mean: [f64; 2],
        cov: &SymMatrix,
        n: usize,
        level: f64,
    ) -> Result<Regions, RegionGap> {
        let (Some(cb), Some(pb)) = (confidence_bound(n, level), prediction_bound(n, level)) else {
            return Err(RegionGap::TooFewSamples);
        };
        let chol = cov.cholesky().ok_or(RegionGap::SingularCovariance)?;
        Ok(Regions {
            level,
            confidence_bound: cb,
            prediction_bound: pb,
            confidence: ellipse_curve(mean, &chol, cb),
            prediction: ellipse_curve(mean, &chol, pb),
        })
    }
}
