//! Confidence regions of a sample's true composition: the logistic-normal approximation in
//! log-ratio space (Weltje 2002, Earth-Sci. Rev. 57:211-253), drawn back in the triangle.

use super::posterior::Posterior;
use crate::error::{Error, Result};
use crate::logratio::ilr_inverse;
use crate::stats::polygamma::{digamma, trigamma};

/// Level of the regions sandprov reports: 95% (common practice).
pub const REGION_LEVEL: f64 = 0.95;

/// Points on each region's curve (one every 5°), before the first is repeated to close it.
pub const CURVE_POINTS: usize = 72;

/// A confidence region for the true composition of one sample in one diagram.
///
/// Weltje (2002) models compositions as normal in log-ratio coordinates and maps the ellipse
/// back to the triangle, where it becomes a curved closed line that never leaves the triangle.
/// Here the ilr coordinates (Helmert-type basis of [`crate::logratio`]) of the Dirichlet
/// posterior get their exact mean and covariance: for x ~ Dirichlet(α),
/// E[ln xᵢ] = ψ(αᵢ) − ψ(α₀) and Cov(ln xᵢ, ln xⱼ) = ψ′(αᵢ)δᵢⱼ − ψ′(α₀) (standard Dirichlet
/// results, as in Aitchison 1986, The Statistical Analysis of Compositional Data, ch. 3; the
/// chapter from memory; ψ, ψ′ digamma and trigamma, checked in the tests against draws), so
/// μ = Vᵀψ(α) and Σ = Vᵀ diag(ψ′(α)) V, the α₀ terms cancelling because Vᵀ1 = 0. The normal
/// shape is the approximation. The covariance is known rather than estimated from replicates,
/// so the bound on (z − μ)ᵀΣ⁻¹(z − μ) is the χ² quantile with 2 degrees of freedom,
/// −2 ln(1 − level), the limit of Weltje's Hotelling T² bound for many replicates.
///
/// # Example
/// ```
/// use provenance_core::membership::{ConfidenceRegion, Posterior};
/// let post = Posterior::jeffreys([240.0, 100.0, 60.0]).unwrap();
/// let r = ConfidenceRegion::logistic_normal(&post, 0.95).unwrap();
/// let curve = r.curve();
/// assert_eq!(curve.len(), 73);
/// assert_eq!(curve[0], curve[72]); // closed
/// assert!(curve.iter().all(|p| p.iter().all(|v| *v > 0.0) && (p.iter().sum::<f64>() - 100.0).abs() < 1e-9));
/// assert!(r.contains(post.mean()));
/// assert!(!r.contains([40.0, 30.0, 30.0]));
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct ConfidenceRegion {
    level: f64,
    mean: [f64; 2],
    cov: [[f64; 2]; 2],
    curve: Vec<[f64; 3]>,
}

/// The ilr basis of [`crate::logratio::ilr`] for three parts, as columns v₁, v₂.
const V: [[f64; 2]; 3] = [
    [std::f64::consts::FRAC_1_SQRT_2, 0.408_248_290_463_863],
    [-std::f64::consts::FRAC_1_SQRT_2, 0.408_248_290_463_863],
    [0.0, -0.816_496_580_927_726],
];

impl ConfidenceRegion {
    /// The region at `level` (between 0 and 1, exclusive) for a posterior.
    pub fn logistic_normal(posterior: &Posterior, level: f64) -> Result<ConfidenceRegion> {
        if level.is_nan() || level <= 0.0 || level >= 1.0 {
            return Err(Error::Usage {
                message: format!("confidence level {level}: expected a value between 0 and 1"),
            });
        }
        let alpha = posterior.alpha();
        let psi = alpha.map(digamma);
        let tri = alpha.map(trigamma);
        let mut mean = [0.0; 2];
        let mut cov = [[0.0; 2]; 2];
        for k in 0..2 {
            mean[k] = (0..3).map(|i| V[i][k] * psi[i]).sum();
            for l in 0..2 {
                cov[k][l] = (0..3).map(|i| V[i][k] * tri[i] * V[i][l]).sum();
            }
        }
        // Cholesky factor L of Σ (2 × 2; Σ is positive definite since every ψ′ > 0).
        let l11 = cov[0][0].sqrt();
        let l21 = cov[1][0] / l11;
        let l22 = (cov[1][1] - l21 * l21).sqrt();
        let radius = (-2.0 * (1.0 - level).ln()).sqrt();
        let mut curve: Vec<[f64; 3]> = (0..CURVE_POINTS)
            .map(|k| {
                let t = 2.0 * std::f64::consts::PI * k as f64 / CURVE_POINTS as f64;
                let (u, w) = (radius * t.cos(), radius * t.sin());
                let z = [mean[0] + l11 * u, mean[1] + l21 * u + l22 * w];
                let x = ilr_inverse(&z);
                [100.0 * x[0], 100.0 * x[1], 100.0 * x[2]]
            })
            .collect();
        curve.push(curve[0]);
        Ok(ConfidenceRegion {
            level,
            mean,
            cov,
            curve,
        })
    }

    /// The confidence level.
    pub fn level(&self) -> f64 {
        self.level
    }

    /// Mean of the ilr coordinates.
    pub fn ilr_mean(&self) -> [f64; 2] {
        self.mean
    }

    /// Covariance of the ilr coordinates.
    pub fn ilr_covariance(&self) -> [[f64; 2]; 2] {
        self.cov
    }

    /// The centre of the region in the triangle (percent): the composition at the ilr mean.
    pub fn centre(&self) -> [f64; 3] {
        let x = ilr_inverse(&self.mean);
        [100.0 * x[0], 100.0 * x[1], 100.0 * x[2]]
    }

    /// The closed boundary curve, percent of the three poles; the last point repeats the first.
    pub fn curve(&self) -> &[[f64; 3]] {
        &self.curve
    }

    /// True when the composition `p` (percent, all parts positive) lies inside the region.
    pub fn contains(&self, p: [f64; 3]) -> bool {
        if p.iter().any(|v| v.is_nan() || *v <= 0.0) {
            return false;
        }
        let z = crate::logratio::ilr(&p);
        let d = [z[0] - self.mean[0], z[1] - self.mean[1]];
        let c = self.cov;
        let det = c[0][0] * c[1][1] - c[0][1] * c[1][0];
        let q = (c[1][1] * d[0] * d[0] - 2.0 * c[0][1] * d[0] * d[1] + c[0][0] * d[1] * d[1]) / det;
        q <= -2.0 * (1.0 - self.level).ln()
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::logratio::ilr;

    #[test]
    fn basis_matches_the_crate_ilr() {
        let x = [0.5, 0.3, 0.2];
        let z = ilr(&x);
        for k in 0..2 {
            let via_v: f64 = (0..3).map(|i| V[i][k] * x[i].ln()).sum();
            assert!((via_v - z[k]).abs() < 1e-12);
        }
    }

    #[test]
    fn mean_and_covariance_match_the_posterior_draws() {
        use rand_distr::{Distribution, Gamma};
        let post = Posterior::jeffreys([30.0, 5.0, 2.0]).unwrap();
        let r = ConfidenceRegion::logistic_normal(&post, 0.95).unwrap();
        let mut rng = crate::membership::stream(11, 0, 0);
        let g = post.alpha().map(|a| Gamma::new(a, 1.0).unwrap());
        let n = 200_000;
        let (mut s, mut ss) = ([0.0; 2], [[0.0; 2]; 2]);
        for _ in 0..n {
            let x: Vec<f64> = g.iter().map(|g| g.sample(&mut rng)).collect();
            let z = ilr(&x);
            for k in 0..2 {
                s[k] += z[k];
                for l in 0..2 {
                    ss[k][l] += z[k] * z[l];
                }
            }
        }
        let nf = n as f64;
        for k in 0..2 {
            let m = s[k] / nf;
            assert!((m - r.ilr_mean()[k]).abs() < 0.01, "mean {k}: {m}");
            for l in 0..2 {
                let c = ss[k][l] / nf - (s[k] / nf) * (s[l] / nf);
                assert!(
                    (c - r.ilr_covariance()[k][l]).abs() < 0.01 * r.ilr_covariance()[0][0],
                    "cov {k}{l}: {c}"
                );
            }
        }
    }

    #[test]
    fn region_covers_about_its_level_of_the_posterior() {
        use rand_distr::{Distribution, Gamma};
        // 400 points: the logistic-normal shape is close, so coverage is close to 95%.
        let post = Posterior::jeffreys([220.0, 120.0, 60.0]).unwrap();
        let r = ConfidenceRegion::logistic_normal(&post, 0.95).unwrap();
        let mut rng = crate::membership::stream(5, 0, 0);
        let g = post.alpha().map(|a| Gamma::new(a, 1.0).unwrap());
        let n = 40_000;
        let inside = (0..n)
            .filter(|_| {
                r.contains([
                    g[0].sample(&mut rng),
                    g[1].sample(&mut rng),
                    g[2].sample(&mut rng),
                ])
            })
            .count();
        let cover = inside as f64 / n as f64;
        assert!((cover - 0.95).abs() < 0.006, "coverage {cover}");
    }

    #[test]
    fn region_shrinks_as_counts_grow() {
        let area = |k: f64| {
            let post = Posterior::jeffreys([0.6 * k, 0.3 * k, 0.1 * k]).unwrap();
            let c = ConfidenceRegion::logistic_normal(&post, 0.95).unwrap();
            crate::geometry::Polygon::new(c.curve()[..CURVE_POINTS].to_vec()).area()
        };
        let (a1, a4) = (area(100.0), area(400.0));
        // Area scales as 1/n for large n: four times the points, about a quarter of the area.
        assert!((a4 / a1 - 0.25).abs() < 0.03, "{}", a4 / a1);
    }

    #[test]
    fn bad_levels_are_refused() {
        let post = Posterior::jeffreys([1.0, 1.0, 1.0]).unwrap();
        for l in [0.0, 1.0, f64::NAN, 1.5] {
            assert!(ConfidenceRegion::logistic_normal(&post, l).is_err());
        }
    }
}
