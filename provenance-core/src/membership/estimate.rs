//! Monte Carlo membership with an exact shortcut for samples far from every boundary.

use super::integrate::integrate;
use super::posterior::{stream, Posterior, DEFAULT_SEED};
use super::regions::{RegionIndex, Regions};
use super::sampler::GammaSampler;
use crate::error::{Error, Result};
use rand::RngCore;
use rayon::prelude::*;

/// Default number of posterior draws: 10,000. The Monte Carlo standard error of a probability
/// p estimated from N draws is √(p(1 − p)/N), at most 0.5/√N (at p = 1/2), so N = 10,000 keeps
/// it at or below 0.005 for every field.
pub const DEFAULT_DRAWS: u32 = 10_000;

/// Default tolerance of the exact shortcut: a sample gets membership 1 without sampling only
/// when the posterior mass that could lie outside its field is proven below 1e-6, far below the
/// Monte Carlo error of sampling (0.005) and the four decimals of the output.
pub const DEFAULT_BOUND_TOLERANCE: f64 = 1e-6;

/// A top probability below this flags the assignment as ambiguous: 0.95, so an assignment that
/// is not flagged holds with the 95% confidence used for every interval sandprov reports
/// (95% is common practice).
pub const AMBIGUOUS_BELOW: f64 = 0.95;

/// How membership is computed.
///
/// # Example
/// ```
/// use provenance_core::membership::MembershipOptions;
/// let o = MembershipOptions::default();
/// assert_eq!(o.draws, 10_000);
/// assert!(o.shortcut);
/// assert!(MembershipOptions { draws: 0, ..o }.check().is_err());
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct MembershipOptions {
    /// Posterior draws per sample and diagram (see [`DEFAULT_DRAWS`]).
    pub draws: u32,
    /// Seed of the run; each sample's stream is derived from it and the sample's position.
    pub seed: u64,
    /// Use the exact shortcut (see [`Estimator::bound`]) where it applies.
    pub shortcut: bool,
    /// Integrate the posterior deterministically (see [`Estimator::integrate`]) where it
    /// applies, instead of sampling.
    pub integrate: bool,
    /// Largest proven error the shortcut may carry (see [`DEFAULT_BOUND_TOLERANCE`]).
    pub bound_tolerance: f64,
}

impl Default for MembershipOptions {
    fn default() -> Self {
        MembershipOptions {
            draws: DEFAULT_DRAWS,
            seed: DEFAULT_SEED,
            shortcut: true,
            integrate: true,
            bound_tolerance: DEFAULT_BOUND_TOLERANCE,
        }
    }
}

impl MembershipOptions {
    /// Refuse options that cannot work: no draws, or a tolerance outside (0, 0.01].
    pub fn check(&self) -> Result<()> {
        if self.draws == 0 {
            return Err(Error::Usage {
                message: "--draws 0: expected at least 1 posterior draw (default 10000)".into(),
            });
        }
        if self.bound_tolerance.is_nan()
            || self.bound_tolerance <= 0.0
            || self.bound_tolerance > 0.01
        {
            return Err(Error::Usage {
                message: format!(
                    "shortcut tolerance {}: expected a value above 0 and at most 0.01",
                    self.bound_tolerance
                ),
            });
        }
        Ok(())
    }
}

/// How a membership was obtained.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Method {
    /// The fraction of posterior draws in each region.
    Sampled {
        /// Number of draws.
        draws: u32,
    },
    /// Proven: all posterior mass but at most `max_error` lies in one region (or outside all).
    Bound {
        /// Upper bound of the mass that may lie elsewhere.
        max_error: f64,
    },
    /// Deterministic integration of the posterior over each region.
    Integrated,
}

/// Accuracy of the integration, as established by the tests (not a proven bound): every
/// probability within 1e-6 of the reference.
pub const INTEGRATION_ACCURACY: f64 = 1e-6;

/// The most probable outcome: a region, or outside every region.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Top {
    /// The region's index; `None` for "outside".
    pub region: Option<usize>,
    /// Its probability.
    pub probability: f64,
}

/// Probabilities that the true composition lies in each region, and outside all; they sum to 1.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::membership::{Estimator, MembershipOptions, Posterior};
/// let upper = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
/// let set: [(&str, &Polygon); 1] = [("upper", &upper)];
/// let est = Estimator::new(&set[..], MembershipOptions::default()).unwrap();
/// // 80% of 400 points on the A pole: far above the line a = 50.
/// let m = est.estimate(&Posterior::jeffreys([320.0, 40.0, 40.0]).unwrap(), 0, 0);
/// assert_eq!(m.probability(0), 1.0);
/// assert_eq!(m.top().region, Some(0));
/// assert!(!m.is_ambiguous(0.95));
/// // Right on the line, a coin toss.
/// let m = est.estimate(&Posterior::jeffreys([200.0, 100.0, 100.0]).unwrap(), 1, 0);
/// assert!((m.probability(0) - 0.5).abs() < 0.03);
/// assert!((m.probability(0) + m.outside() - 1.0).abs() < 1e-12);
/// assert!(m.is_ambiguous(0.95));
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Membership {
    /// One probability per region, then "outside" last.
    probabilities: Vec<f64>,
    method: Method,
}

impl Membership {
    /// Probability of region `i`.
    pub fn probability(&self, i: usize) -> f64 {
        self.probabilities[i]
    }

    /// The region probabilities, in set order (without "outside").
    pub fn regions(&self) -> &[f64] {
        &self.probabilities[..self.probabilities.len() - 1]
    }

    /// Probability of lying outside every region.
    pub fn outside(&self) -> f64 {
        self.probabilities[self.probabilities.len() - 1]
    }

    /// How it was obtained.
    pub fn method(&self) -> Method {
        self.method
    }

    /// The most probable outcome; ties go to the first region in set order, "outside" last.
    pub fn top(&self) -> Top {
        let mut best = 0;
        for (i, p) in self.probabilities.iter().enumerate() {
            if *p > self.probabilities[best] {
                best = i;
            }
        }
        Top {
            region: (best + 1 < self.probabilities.len()).then_some(best),
            probability: self.probabilities[best],
        }
    }

    /// True when the top probability is below `threshold` (see [`AMBIGUOUS_BELOW`]).
    pub fn is_ambiguous(&self, threshold: f64) -> bool {
        self.top().probability < threshold
    }

    /// The largest Monte Carlo standard error √(p(1 − p)/N) over all outcomes; for a bound,
    /// the proven maximum error; for integration, [`INTEGRATION_ACCURACY`].
    pub fn standard_error(&self) -> f64 {
        match self.method {
            Method::Integrated => INTEGRATION_ACCURACY,
            Method::Sampled { draws } => self
                .probabilities
                .iter()
                .map(|p| (p * (1.0 - p) / draws as f64).sqrt())
                .fold(0.0, f64::max),
            Method::Bound { max_error } => max_error,
        }
    }
}

/// Computes memberships for one region set: builds the point-location index once.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::membership::{Estimator, MembershipOptions, Posterior};
/// let left = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 50.0, 50.0]]);
/// let set: [(&str, &Polygon); 1] = [("B side", &left)];
/// let opts = MembershipOptions { draws: 2000, integrate: false, ..Default::default() };
/// let est = Estimator::new(&set[..], opts).unwrap();
/// // On the region's edge b = c, so not bounded; integration is off, so sampled.
/// let posts = vec![Posterior::jeffreys([30.0, 3.0, 3.0]).unwrap(); 3];
/// let ms = est.estimate_many(&posts, 0, 0);
/// assert_eq!(ms.len(), 3);
/// assert_ne!(ms[0], ms[1]); // different positions, different streams
/// assert_eq!(est.estimate_many(&posts, 0, 0), ms); // same seed, same result
/// // By default whole counts are integrated: no randomness.
/// let est = Estimator::new(&set[..], MembershipOptions::default()).unwrap();
/// let m = est.estimate(&posts[0], 0, 0);
/// assert_eq!(m.method(), provenance_core::membership::Method::Integrated);
/// ```
#[derive(Debug, Clone)]
pub struct Estimator {
    index: RegionIndex,
    options: MembershipOptions,
}

impl Estimator {
    /// An estimator for `regions` with `options` (checked).
    pub fn new<R: Regions + ?Sized>(regions: &R, options: MembershipOptions) -> Result<Estimator> {
        options.check()?;
        Ok(Estimator {
            index: RegionIndex::new(regions),
            options,
        })
    }

    /// The options in use.
    pub fn options(&self) -> &MembershipOptions {
        &self.options
    }

    /// The region index.
    pub fn index(&self) -> &RegionIndex {
        &self.index
    }

    /// Membership of one sample: the exact shortcut where it applies, else integration where
    /// it applies, otherwise sampling from the stream of (`seed`, `position`, `lane`).
    pub fn estimate(&self, posterior: &Posterior, position: u64, lane: u64) -> Membership {
        if self.options.shortcut {
            if let Some(m) = self.bound(posterior) {
                return m;
            }
        }
        if self.options.integrate {
            if let Some(m) = self.integrate(posterior) {
                return m;
            }
        }
        self.sample(posterior, position, lane)
    }

    /// Deterministic integration of the posterior over every region, for whole counts (and
    /// for fractional counts of at least [`super::INTEGRATE_MIN_COUNT`] points on every pole);
    /// `None` otherwise. Stick-breaking makes the
    /// A pole and c/(b + c) independent Beta variables, so each region's mass is a
    /// one-dimensional Gauss-Legendre integral over a of differences of a Beta distribution
    /// function (details in the module source; accuracy [`INTEGRATION_ACCURACY`] in tests).
    pub fn integrate(&self, posterior: &Posterior) -> Option<Membership> {
        integrate(posterior, &self.index).map(|probabilities| Membership {
            probabilities,
            method: Method::Integrated,
        })
    }

    /// Memberships of many samples in parallel; sample `i` has position `first_position + i`.
    /// The result does not depend on the number of threads.
    pub fn estimate_many(
        &self,
        posteriors: &[Posterior],
        first_position: u64,
        lane: u64,
    ) -> Vec<Membership> {
        posteriors
            .par_iter()
            .enumerate()
            .map(|(i, p)| self.estimate(p, first_position + i as u64, lane))
            .collect()
    }

    /// The exact shortcut. Let m be the posterior mean and D its distance to the nearest
    /// boundary of any region inside the triangle ([`RegionIndex::inner_boundary_distance`]).
    /// Every composition whose three parts each lie within D of m's lies within D of m in the
    /// plane (the hexagon of such points is inscribed in the circle of radius D), so if its
    /// parts are positive it is in m's region. The posterior mass outside that hexagon is at most the
    /// sum of the six exact Beta marginal tails ([`Posterior::tail_bound`]). When that sum is
    /// at most the tolerance, the membership is 1 for m's region (or "outside") with that proven
    /// maximum error; otherwise `None`.
    pub fn bound(&self, posterior: &Posterior) -> Option<Membership> {
        let centre = posterior.mean();
        let d = self.index.inner_boundary_distance(centre);
        // A margin far above the rounding of the containment test.
        let t = d - 1e-9;
        if t.is_nan() || t <= 0.0 {
            return None;
        }
        let err = posterior.tail_bound(centre, t);
        if err.is_nan() || err > self.options.bound_tolerance {
            return None;
        }
        let n = self.index.len();
        let mut probabilities = vec![0.0; n + 1];
        probabilities[self.index.locate(centre).unwrap_or(n)] = 1.0;
        Some(Membership {
            probabilities,
            method: Method::Bound { max_error: err },
        })
    }

    /// Plain sampling: the fraction of `draws` posterior draws in each region.
    ///
    /// Each draw is a Dirichlet vector built from three Gamma(αᵢ, 1) draws normalised by their
    /// sum (the standard construction; Devroye 1986, Non-Uniform Random Variate Generation,
    /// ch. XI, from memory), the gammas by Marsaglia & Tsang (2000) on a ziggurat normal.
    pub fn sample(&self, posterior: &Posterior, position: u64, lane: u64) -> Membership {
        let draws = self.options.draws;
        let mut rng = stream(self.options.seed, position, lane);
        let counts = self.count_draws(posterior, &mut rng, draws);
        Membership {
            probabilities: counts
                .into_iter()
                .map(|c| c as f64 / draws as f64)
                .collect(),
            method: Method::Sampled { draws },
        }
    }

    fn count_draws<G: RngCore>(&self, posterior: &Posterior, rng: &mut G, draws: u32) -> Vec<u32> {
        let n = self.index.len();
        let mut counts = vec![0u32; n + 1];
        let [g0, g1, g2] = posterior.alpha().map(GammaSampler::new);
        for _ in 0..draws {
            let x = [g0.sample(rng), g1.sample(rng), g2.sample(rng)];
            let k = 100.0 / (x[0] + x[1] + x[2]);
            let slot = self
                .index
                .locate([x[0] * k, x[1] * k, x[2] * k])
                .unwrap_or(n);
            counts[slot] += 1;
        }
        counts
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geometry::Polygon;

    /// An invented tiling: a top cap, and the rest split by an oblique line.
    fn tiling() -> Vec<(String, Polygon)> {
        vec![
            (
                "cap".into(),
                Polygon::new(vec![
                    [100.0, 0.0, 0.0],
                    [70.0, 30.0, 0.0],
                    [70.0, 0.0, 30.0],
                ]),
            ),
            (
                "left".into(),
                Polygon::new(vec![
                    [70.0, 30.0, 0.0],
                    [0.0, 100.0, 0.0],
                    [0.0, 40.0, 60.0],
                    [70.0, 15.0, 15.0],
                ]),
            ),
            (
                "right".into(),
                Polygon::new(vec![
                    [70.0, 15.0, 15.0],
                    [0.0, 40.0, 60.0],
                    [0.0, 0.0, 100.0],
                    [70.0, 0.0, 30.0],
                ]),
            ),
        ]
    }

    fn posteriors() -> Vec<Posterior> {
        let mut v = Vec::new();
        for (i, n) in [40.0, 150.0, 400.0, 1200.0].into_iter().enumerate() {
            for a in [0.05, 0.3, 0.55, 0.69, 0.72, 0.9] {
                for c in [0.0, 0.1, 0.25] {
                    let c = c * (1.0 - a) * (1.0 + i as f64 * 0.3);
                    let b = (1.0 - a - c).max(0.0);
                    v.push(
                        Posterior::jeffreys([(a * n).round(), (b * n).round(), (c * n).round()])
                            .unwrap(),
                    );
                }
            }
        }
        v
    }

    #[test]
    fn probabilities_sum_to_one() {
        let set = tiling();
        let est = Estimator::new(
            &set[..],
            MembershipOptions {
                draws: 3000,
                ..Default::default()
            },
        )
        .unwrap();
        for (i, p) in posteriors().iter().enumerate() {
            let m = est.estimate(p, i as u64, 0);
            let s: f64 = m.regions().iter().sum::<f64>() + m.outside();
            assert!((s - 1.0).abs() < 1e-12, "{s}");
        }
    }

    #[test]
    fn shortcut_agrees_with_plain_sampling() {
        let set = tiling();
        let draws = 40_000;
        let est = Estimator::new(
            &set[..],
            MembershipOptions {
                draws,
                integrate: false,
                ..Default::default()
            },
        )
        .unwrap();
        let mut bounded = 0;
        for (i, p) in posteriors().iter().enumerate() {
            let sampled = est.sample(p, i as u64, 3);
            match est.bound(p) {
                Some(b) => {
                    bounded += 1;
                    let Method::Bound { max_error } = b.method() else {
                        panic!("bound method")
                    };
                    assert!(max_error <= DEFAULT_BOUND_TOLERANCE);
                    let top = b.top();
                    assert_eq!(top.probability, 1.0);
                    // Plain sampling finds (nearly) all draws in the same place: with ε ≤ 1e-6,
                    // the chance of even one draw of 40,000 elsewhere is below 4%.
                    let slot = top.region.unwrap_or(set.len());
                    let p_sampled = if slot < set.len() {
                        sampled.probability(slot)
                    } else {
                        sampled.outside()
                    };
                    assert!(
                        p_sampled >= 1.0 - 2.0 / draws as f64,
                        "sample {i}: {p_sampled}"
                    );
                }
                None => assert_eq!(est.estimate(p, i as u64, 3), sampled),
            }
        }
        // The grid has samples on both sides of the shortcut.
        assert!(
            bounded >= 10 && bounded < posteriors().len() - 10,
            "{bounded}"
        );
    }

    #[test]
    fn shortcut_declines_near_a_boundary() {
        let set = tiling();
        let est = Estimator::new(&set[..], MembershipOptions::default()).unwrap();
        // 69% of the A pole with 400 points: 0.4 sd below the cap's line.
        assert!(est
            .bound(&Posterior::jeffreys([276.0, 62.0, 62.0]).unwrap())
            .is_none());
        // 95% of the A pole with 400 points: 25 percentage points from the line, 10 sd.
        assert!(est
            .bound(&Posterior::jeffreys([380.0, 10.0, 10.0]).unwrap())
            .is_some());
    }

    #[test]
    fn same_seed_same_bytes_in_parallel_and_in_sequence() {
        let set = tiling();
        let opts = MembershipOptions {
            draws: 2000,
            seed: 42,
            integrate: false,
            ..Default::default()
        };
        let est = Estimator::new(&set[..], opts).unwrap();
        let posts = posteriors();
        let parallel = est.estimate_many(&posts, 100, 1);
        let sequential: Vec<Membership> = posts
            .iter()
            .enumerate()
            .map(|(i, p)| est.estimate(p, 100 + i as u64, 1))
            .collect();
        assert_eq!(parallel, sequential);
        let one_thread = rayon::ThreadPoolBuilder::new()
            .num_threads(1)
            .build()
            .unwrap();
        assert_eq!(
            one_thread.install(|| est.estimate_many(&posts, 100, 1)),
            parallel
        );
        let other_seed = Estimator::new(&set[..], MembershipOptions { seed: 43, ..opts }).unwrap();
        assert_ne!(other_seed.estimate_many(&posts, 100, 1), parallel);
    }

    #[test]
    fn sampling_error_is_within_its_standard_error() {
        // Exactly on the cap's line a = 70: the marginal of a is Beta(280.5, 121), whose mass
        // above 0.7 is 1 − I_0.7(280.5, 121); checked against the crate's beta_inc.
        let set = tiling();
        let est = Estimator::new(
            &set[..],
            MembershipOptions {
                draws: 40_000,
                shortcut: false,
                ..Default::default()
            },
        )
        .unwrap();
        let post = Posterior::jeffreys([280.0, 60.0, 60.0]).unwrap();
        let exact = 1.0 - crate::stats::special::beta_inc(280.5, 121.0, 0.7);
        let m = est.estimate(&post, 9, 0);
        let se = (exact * (1.0 - exact) / 40_000.0).sqrt();
        assert!(
            (m.probability(0) - exact).abs() < 4.0 * se,
            "{} vs {exact}",
            m.probability(0)
        );
        assert!(m.standard_error() <= 0.5 / 200.0);
    }

    #[test]
    fn top_and_ambiguity() {
        let m = Membership {
            probabilities: vec![0.2, 0.2, 0.6],
            method: Method::Sampled { draws: 10 },
        };
        assert_eq!(
            m.top(),
            Top {
                region: None,
                probability: 0.6
            }
        );
        assert!(m.is_ambiguous(AMBIGUOUS_BELOW));
        let m = Membership {
            probabilities: vec![0.4, 0.4, 0.2],
            method: Method::Sampled { draws: 10 },
        };
        assert_eq!(m.top().region, Some(0));
    }
}
