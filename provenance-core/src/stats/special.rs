//! Special functions needed by the interval and test statistics.
//!
//! Implemented here (rather than pulled from a statistics crate) to keep the core small; each is
//! checked in the tests against SciPy values.

/// Natural log of the gamma function, for x > 0.
///
/// Lanczos approximation with g = 7 and nine coefficients (Lanczos 1964, SIAM J. Numer. Anal.
/// B1:86-96; the coefficient set in common use, relative error below 1e-13), with the reflection
/// formula for x < 0.5.
///
/// # Example
/// ```
/// use provenance_core::stats::special::ln_gamma;
/// assert!((ln_gamma(5.0) - 24f64.ln()).abs() < 1e-12);
/// ```
pub fn ln_gamma(x: f64) -> f64 {
    const G: f64 = 7.0;
    const COEF: [f64; 9] = [
        0.999_999_999_999_809_9,
        676.520_368_121_885_1,
        -1_259.139_216_722_402_8,
        771.323_428_777_653_1,
        -176.615_029_162_140_6,
        12.507_343_278_686_905,
        -0.138_571_095_265_720_12,
        9.984_369_578_019_572e-6,
        1.505_632_735_149_311_6e-7,
    ];
    if x < 0.5 {
        let pi = std::f64::consts::PI;
        return (pi / (pi * x).sin()).ln() - ln_gamma(1.0 - x);
    }
    let x = x - 1.0;
    let mut a = COEF[0];
    let t = x + G + 0.5;
    for (i, c) in COEF.iter().enumerate().skip(1) {
        a += c / (x + i as f64);
    }
    0.5 * (2.0 * std::f64::consts::PI).ln() + (x + 0.5) * t.ln() - t + a.ln()
}

/// Log of the beta function B(a, b).
pub fn ln_beta(a: f64, b: f64) -> f64 {
    ln_gamma(a) + ln_gamma(b) - ln_gamma(a + b)
}

/// Continued fraction for the incomplete beta function, by the modified Lentz method
/// (Press et al., Numerical Recipes, 3rd ed., §6.4; Lentz 1976).
fn beta_cf(a: f64, b: f64, x: f64) -> f64 {
    const TINY: f64 = 1e-300;
    const EPS: f64 = 1e-15;
    let qab = a + b;
    let qap = a + 1.0;
    let qam = a - 1.0;
    let mut c = 1.0;
    let mut d = 1.0 - qab * x / qap;
    if d.abs() < TINY {
        d = TINY;
    }
    d = 1.0 / d;
    let mut h = d;
    for m in 1..=10_000 {
        let m = m as f64;
        let m2 = 2.0 * m;
        let aa = m * (b - m) * x / ((qam + m2) * (a + m2));
        d = 1.0 + aa * d;
        if d.abs() < TINY {
            d = TINY;
        }
        c = 1.0 + aa / c;
        if c.abs() < TINY {
            c = TINY;
        }
        d = 1.0 / d;
        h *= d * c;
        let aa = -(a + m) * (qab + m) * x / ((a + m2) * (qap + m2));
        d = 1.0 + aa * d;
        if d.abs() < TINY {
            d = TINY;
        }
        c = 1.0 + aa / c;
        if c.abs() < TINY {
            c = TINY;
        }
        d = 1.0 / d;
        let del = d * c;
        h *= del;
        if (del - 1.0).abs() < EPS {
            break;
        }
    }
    h
}

/// Regularized incomplete beta function I_x(a, b), for a, b > 0 and 0 ≤ x ≤ 1.
///
/// # Example
/// ```
/// use provenance_core::stats::special::beta_inc;
/// // I_x(1, 1) = x
/// assert!((beta_inc(1.0, 1.0, 0.3) - 0.3).abs() < 1e-14);
/// ```
pub fn beta_inc(a: f64, b: f64, x: f64) -> f64 {
    if x <= 0.0 {
        return 0.0;
    }
    if x >= 1.0 {
        return 1.0;
    }
    let ln_front = a * x.ln() + b * (1.0 - x).ln() - ln_beta(a, b);
    let front = ln_front.exp();
    if x < (a + 1.0) / (a + b + 2.0) {
        front * beta_cf(a, b, x) / a
    } else {
        1.0 - front * beta_cf(b, a, 1.0 - x) / b
    }
}

/// Quantile of the Beta(a, b) distribution: the x with I_x(a, b) = q.
///
/// Safeguarded Newton iteration inside a shrinking bracket; converges to about 1e-13.
///
/// # Example
/// ```
/// use provenance_core::stats::special::{beta_inc, beta_quantile};
/// let x = beta_quantile(3.0, 7.0, 0.025);
/// assert!((beta_inc(3.0, 7.0, x) - 0.025).abs() < 1e-12);
/// ```
pub fn beta_quantile(a: f64, b: f64, q: f64) -> f64 {
    if q <= 0.0 {
        return 0.0;
    }
    if q >= 1.0 {
        return 1.0;
    }
    let (mut lo, mut hi) = (0.0_f64, 1.0_f64);
    let ln_b = ln_beta(a, b);
    let mut x = (a / (a + b)).clamp(1e-12, 1.0 - 1e-12);
    for _ in 0..200 {
        let f = beta_inc(a, b, x) - q;
        if f.abs() < 1e-15 {
            return x;
        }
        if f < 0.0 {
            lo = x;
        } else {
            hi = x;
        }
        let ln_pdf = (a - 1.0) * x.ln() + (b - 1.0) * (1.0 - x).ln() - ln_b;
        let step = f / ln_pdf.exp();
        let mut next = x - step;
        if !next.is_finite() || next <= lo || next >= hi {
            next = 0.5 * (lo + hi);
        }
        if (next - x).abs() < 1e-15 * x.max(1e-300) || hi - lo < 1e-16 {
            return next;
        }
        x = next;
    }
    x
}
