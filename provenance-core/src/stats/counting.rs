//! Counting error of point-count proportions.
//!
//! A point count is a binomial sample of the slide: each pole's proportion has a standard
//! deviation and confidence intervals that depend only on the proportion and the number of
//! points in the diagram.

use super::special::beta_quantile;
use serde::{Deserialize, Serialize};

/// The standard normal quantile for a two-sided 95% interval, Φ⁻¹(0.975).
pub const Z95: f64 = 1.959_963_984_540_054;

/// A two-sided interval, in percent.
///
/// # Example
/// ```
/// let i = provenance_core::stats::Interval { lower: 40.0, upper: 60.0 };
/// assert!(i.contains(50.0));
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Interval {
    /// Lower bound, percent.
    pub lower: f64,
    /// Upper bound, percent.
    pub upper: f64,
}

impl Interval {
    /// True when `x` lies within the bounds.
    pub fn contains(&self, x: f64) -> bool {
        self.lower <= x && x <= self.upper
    }
}

/// One standard deviation of a point-count proportion, in percentage points:
/// σ = √(p(100 − p)/n), with p in percent and n the points counted
/// (Van der Plas & Tobi 1965, Am. J. Sci. 263:87-90).
///
/// # Example
/// ```
/// use provenance_core::stats::sd_percent;
/// // 300 points at p = 50%: 2σ ≈ 5.8 percentage points (Van der Plas & Tobi 1965 chart).
/// assert!((2.0 * sd_percent(50.0, 300.0) - 5.77).abs() < 0.01);
/// ```
pub fn sd_percent(p: f64, n: f64) -> f64 {
    if n <= 0.0 {
        return f64::NAN;
    }
    (p * (100.0 - p) / n).max(0.0).sqrt()
}

/// Points needed so that 2σ of a proportion p (percent) is at most `two_sigma` percentage points:
/// n = 4p(100 − p)/E² (Van der Plas & Tobi 1965), rounded up. `None` when E is not positive.
///
/// # Example
/// ```
/// use provenance_core::stats::points_needed;
/// assert_eq!(points_needed(50.0, 5.0), Some(400));
/// assert_eq!(points_needed(10.0, 2.0), Some(900));
/// ```
pub fn points_needed(p: f64, two_sigma: f64) -> Option<u64> {
    if !(two_sigma > 0.0 && two_sigma.is_finite() && (0.0..=100.0).contains(&p)) {
        return None;
    }
    let n = 4.0 * p * (100.0 - p) / (two_sigma * two_sigma);
    // Guard against 399.99999 from rounding of exact quotients.
    Some((n - 1e-9).ceil().max(0.0) as u64)
}

/// Wilson (1927, JASA 22:209-212) score interval for k successes in n trials, in percent.
///
/// Centre (p̂ + z²/2n)/(1 + z²/n), half-width z/(1 + z²/n)·√(p̂(1 − p̂)/n + z²/4n²).
///
/// # Example
/// ```
/// use provenance_core::stats::{wilson, Z95};
/// let i = wilson(0.0, 10.0, Z95);
/// assert_eq!(i.lower, 0.0);
/// assert!((i.upper - 27.753).abs() < 0.001);
/// ```
pub fn wilson(k: f64, n: f64, z: f64) -> Interval {
    let p = k / n;
    let z2n = z * z / n;
    let denom = 1.0 + z2n;
    let centre = (p + z2n / 2.0) / denom;
    let half = z / denom * (p * (1.0 - p) / n + z2n / (4.0 * n)).max(0.0).sqrt();
    Interval {
        lower: (100.0 * (centre - half)).max(0.0),
        upper: (100.0 * (centre + half)).min(100.0),
    }
}

/// Clopper-Pearson (1934, Biometrika 26:404-413) exact interval at level 1 − α, in percent:
/// lower = Beta⁻¹(α/2; k, n − k + 1), upper = Beta⁻¹(1 − α/2; k + 1, n − k). For k = 0 the
/// lower bound is 0 and the upper 1 − (α/2)^(1/n); for k = n symmetrically.
///
/// # Example
/// ```
/// use provenance_core::stats::clopper_pearson;
/// let i = clopper_pearson(0.0, 10.0, 0.05);
/// assert!((i.upper - 100.0 * (1.0 - 0.025f64.powf(0.1))).abs() < 1e-9);
/// ```
pub fn clopper_pearson(k: f64, n: f64, alpha: f64) -> Interval {
    let half = alpha / 2.0;
    let lower = if k <= 0.0 {
        0.0
    } else if k >= n {
        half.powf(1.0 / n)
    } else {
        beta_quantile(k, n - k + 1.0, half)
    };
    let upper = if k >= n {
        1.0
    } else if k <= 0.0 {
        1.0 - half.powf(1.0 / n)
    } else {
        beta_quantile(k + 1.0, n - k, 1.0 - half)
    };
    Interval {
        lower: 100.0 * lower,
        upper: 100.0 * upper,
    }
}
