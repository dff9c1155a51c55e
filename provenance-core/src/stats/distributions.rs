//! Tails and quantiles of the χ² and F distributions, for the tests and regions of the
//! petrofacies statistics.
//!
//! - χ² tail: P(χ²_ν > x) = Q(ν/2, x/2), the regularized upper incomplete gamma function
//!   (Abramowitz & Stegun 1964, eq. 26.4.2 with 6.5.3).
//! - F tail: P(F_{d₁,d₂} > x) = I_{d₂/(d₂ + d₁x)}(d₂/2, d₁/2), the regularized incomplete beta
//!   function (Abramowitz & Stegun 1964, eq. 26.6.2 with 26.5.1).
//! - F quantile: x = d₂·b/(d₁·(1 − b)) with b the Beta(d₁/2, d₂/2) quantile; for d₁ = 2 the
//!   closed form F_{2,m}(q) = (m/2)·((1 − q)^(−2/m) − 1), which follows from the F(2, m)
//!   distribution function 1 − (1 + 2x/m)^(−m/2) (used by Weltje 2002 for confidence regions of
//!   three-part compositions).

use super::gamma::gamma_q;
use super::special::{beta_inc, beta_quantile};

/// Upper tail P(χ²_ν > x) of the χ² distribution with ν > 0 degrees of freedom.
/// 1 for x ≤ 0; NaN for ν ≤ 0.
///
/// # Example
/// ```
/// use provenance_core::stats::distributions::chi2_sf;
/// // With 2 degrees of freedom the tail is e^(−x/2): 5.991 is the 95% point.
/// assert!((chi2_sf(5.991_464_547_107_979, 2.0) - 0.05).abs() < 1e-12);
/// ```
pub fn chi2_sf(x: f64, df: f64) -> f64 {
    if df.is_nan() || df <= 0.0 {
        return f64::NAN;
    }
    if x <= 0.0 {
        return 1.0;
    }
    gamma_q(df / 2.0, x / 2.0)
}

/// Upper tail P(F > x) of the F distribution with d₁, d₂ > 0 degrees of freedom.
/// 1 for x ≤ 0; NaN for non-positive degrees of freedom.
///
/// # Example
/// ```
/// use provenance_core::stats::distributions::f_sf;
/// // F(2, m): the tail is (1 + 2x/m)^(−m/2).
/// let x = 3.2;
/// assert!((f_sf(x, 2.0, 10.0) - (1.0 + 2.0 * x / 10.0f64).powf(-5.0)).abs() < 1e-13);
/// ```
pub fn f_sf(x: f64, d1: f64, d2: f64) -> f64 {
    if !(d1 > 0.0 && d2 > 0.0) {
        return f64::NAN;
    }
    if x <= 0.0 {
        return 1.0;
    }
    beta_inc(d2 / 2.0, d1 / 2.0, d2 / (d2 + d1 * x))
}

/// Quantile of the F distribution: the x with P(F_{d₁,d₂} ≤ x) = q, for 0 ≤ q < 1.
///
/// # Example
/// ```
/// use provenance_core::stats::distributions::{f_quantile, f_sf};
/// let x = f_quantile(0.95, 3.0, 17.0);
/// assert!((f_sf(x, 3.0, 17.0) - 0.05).abs() < 1e-10);
/// ```
pub fn f_quantile(q: f64, d1: f64, d2: f64) -> f64 {
    if !(d1 > 0.0 && d2 > 0.0 && (0.0..1.0).contains(&q)) {
        return f64::NAN;
    }
    let b = beta_quantile(d1 / 2.0, d2 / 2.0, q);
    d2 * b / (d1 * (1.0 - b))
}

/// Quantile of the F(2, m) distribution in closed form: F_{2,m}(q) = (m/2)·((1 − q)^(−2/m) − 1)
/// (see the module notes). NaN unless m > 0 and 0 ≤ q < 1.
///
/// # Example
/// ```
/// use provenance_core::stats::distributions::f2_quantile;
/// // m = 2: F_{2,2}(q) = 1/(1 − q) − 1, so 19 at q = 0.95.
/// assert!((f2_quantile(0.95, 2.0) - 19.0).abs() < 1e-12);
/// ```
pub fn f2_quantile(q: f64, m: f64) -> f64 {
    if !(m > 0.0 && (0.0..1.0).contains(&q)) {
        return f64::NAN;
    }
    (m / 2.0) * ((1.0 - q).powf(-2.0 / m) - 1.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn closed_form_and_general_f_quantiles_agree() {
        for m in [1.0, 2.0, 3.0, 7.0, 25.0, 300.0] {
            for q in [0.5, 0.9, 0.95, 0.99] {
                let a = f2_quantile(q, m);
                let b = f_quantile(q, 2.0, m);
                assert!((a - b).abs() < 1e-9 * a.max(1.0), "m {m} q {q}: {a} vs {b}");
                assert!((f_sf(a, 2.0, m) - (1.0 - q)).abs() < 1e-12);
            }
        }
    }

    #[test]
    fn chi2_with_two_degrees_of_freedom_is_exponential() {
        for x in [0.1, 1.0, 4.0, 30.0, 200.0] {
            let exact = (-x / 2.0f64).exp();
            assert!((chi2_sf(x, 2.0) / exact - 1.0).abs() < 1e-12, "{x}");
        }
    }
}
