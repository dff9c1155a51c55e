//! The posterior of a diagram's true composition given its pole counts, and seeded streams.

use crate::counts::Counting;
use crate::error::{Error, Result};
use crate::modes::DiagramMode;
use crate::stats::special::beta_inc;
use rand::SeedableRng;
use rand_xoshiro::Xoshiro256PlusPlus;

/// The Jeffreys prior's pseudo-count per pole: Dirichlet(1/2, 1/2, 1/2)
/// (Jeffreys 1946, Proc. R. Soc. A 186:453-461; the multinomial's Jeffreys prior).
pub const JEFFREYS: f64 = 0.5;

/// The posterior of the true pole proportions of one diagram: Dirichlet(k + 1/2), with k the
/// pole counts (a multinomial likelihood with the Jeffreys prior).
///
/// # Example
/// ```
/// use provenance_core::membership::Posterior;
/// let post = Posterior::jeffreys([240.0, 60.0, 0.0]).unwrap();
/// assert_eq!(post.alpha(), [240.5, 60.5, 0.5]);
/// // Posterior mean, percent: (k + 1/2)/(n + 3/2).
/// assert!((post.mean()[0] - 100.0 * 240.5 / 301.5).abs() < 1e-12);
/// assert!(Posterior::jeffreys([1.0, -1.0, 3.0]).is_err());
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Posterior {
    alpha: [f64; 3],
}

impl Posterior {
    /// The posterior for pole counts `k` (points, or points estimated from percentages).
    /// Refuses negative or non-finite counts.
    pub fn jeffreys(counts: [f64; 3]) -> Result<Posterior> {
        if let Some(bad) = counts.iter().find(|k| !k.is_finite() || **k < 0.0) {
            return Err(Error::Usage {
                message: format!(
                    "pole count {bad} for a membership posterior: expected a finite count of 0 or more"
                ),
            });
        }
        Ok(Posterior {
            alpha: counts.map(|k| k + JEFFREYS),
        })
    }

    /// The posterior of one diagram's mode; `None` when the number of points is unknown
    /// (percent tables without `n`: there is no counting error to propagate).
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Framework, Sample};
    /// use provenance_core::diagram::Diagram;
    /// use provenance_core::membership::Posterior;
    /// use provenance_core::modes::DiagramMode;
    /// let s = Sample::counted("a", Framework { qm: 200.0, p: 50.0, lv: 50.0, ..Default::default() });
    /// let m = DiagramMode::of(&s, Diagram::Qfl).unwrap();
    /// assert_eq!(Posterior::of_mode(&m).unwrap().alpha(), [200.5, 50.5, 50.5]);
    /// ```
    pub fn of_mode(mode: &DiagramMode) -> Option<Posterior> {
        mode.points?;
        Posterior::jeffreys(mode.amounts).ok()
    }

    /// The posterior for counts of a sample whose counting is `counting`; `None` when the
    /// points are unknown.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::Counting;
    /// use provenance_core::membership::Posterior;
    /// assert!(Posterior::for_counting([10.0, 5.0, 5.0], Counting::Unknown).is_none());
    /// assert!(Posterior::for_counting([10.0, 5.0, 5.0], Counting::Counted).is_some());
    /// ```
    pub fn for_counting(counts: [f64; 3], counting: Counting) -> Option<Posterior> {
        if !counting.has_points() {
            return None;
        }
        Posterior::jeffreys(counts).ok()
    }

    /// The Dirichlet parameters, counts + 1/2.
    pub fn alpha(&self) -> [f64; 3] {
        self.alpha
    }

    /// Sum of the parameters, n + 3/2.
    pub fn total(&self) -> f64 {
        self.alpha.iter().sum()
    }

    /// Posterior mean, percent.
    pub fn mean(&self) -> [f64; 3] {
        let t = self.total();
        self.alpha.map(|a| 100.0 * a / t)
    }

    /// Posterior standard deviation of each pole, percentage points: the Beta marginal's
    /// √(m(1 − m)/(α₀ + 1)).
    ///
    /// # Example
    /// ```
    /// use provenance_core::membership::Posterior;
    /// let sd = Posterior::jeffreys([149.5, 149.5, 0.0]).unwrap().sd();
    /// // Mean 150/300.5 = 49.92%: sd = √(0.4992·0.5008/301.5) = 2.880 percentage points.
    /// assert!((sd[0] - 2.880).abs() < 1e-3);
    /// ```
    pub fn sd(&self) -> [f64; 3] {
        let t = self.total();
        self.alpha.map(|a| {
            let m = a / t;
            100.0 * (m * (1.0 - m) / (t + 1.0)).sqrt()
        })
    }

    /// P(|xᵢ − cᵢ| ≥ t for some pole i) bounded by the sum over poles of the exact Beta
    /// marginal tails, for a centre `c` and half-width `t` in percent.
    ///
    /// The marginal of pole i is Beta(αᵢ, α₀ − αᵢ), the aggregation property of the Dirichlet
    /// (common practice).
    pub fn tail_bound(&self, centre: [f64; 3], t: f64) -> f64 {
        let total = self.total();
        let mut sum = 0.0;
        for (a, c) in self.alpha.iter().zip(centre) {
            let b = total - a;
            let lo = (c - t) / 100.0;
            let hi = (c + t) / 100.0;
            sum += beta_inc(*a, b, lo.clamp(0.0, 1.0));
            sum += 1.0 - beta_inc(*a, b, hi.clamp(0.0, 1.0));
        }
        sum
    }
}

/// The default seed of every membership run (a fixed value, so repeated runs agree).
pub const DEFAULT_SEED: u64 = 0x7361_6e64_7072_6f76;

/// SplitMix64's finaliser (Steele, Lea & Flood 2014, OOPSLA; the mixer of `java.util.SplittableRandom`).
fn splitmix(mut z: u64) -> u64 {
    z = z.wrapping_add(0x9e37_79b9_7f4a_7c15);
    z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
    z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
    z ^ (z >> 31)
}

/// The random stream of one sample in one lane (for example one diagram): seeded from the run's
/// seed, the sample's position and the lane only, so results never depend on thread scheduling.
///
/// The generator is xoshiro256++ (Blackman & Vigna 2021, ACM TOMS 47:36), whose output sequence
/// is fixed by its published definition.
///
/// # Example
/// ```
/// use provenance_core::membership::stream;
/// use rand::Rng;
/// let a: u64 = stream(7, 12, 0).random();
/// let b: u64 = stream(7, 12, 0).random();
/// let c: u64 = stream(7, 13, 0).random();
/// assert_eq!(a, b);
/// assert_ne!(a, c);
/// ```
pub fn stream(seed: u64, position: u64, lane: u64) -> Xoshiro256PlusPlus {
    let key = splitmix(seed ^ splitmix(position ^ splitmix(lane.wrapping_add(0x5bd1_e995))));
    Xoshiro256PlusPlus::seed_from_u64(key)
}
