//! Do two groups differ in composition? Hotelling's two-sample T² in ilr space, and a
//! permutation test of the same statistic where groups are small.
//!
//! Hotelling (1931, Ann. Math. Stat. 2:360-378): with group sizes n₁, n₂ (N = n₁ + n₂), ilr
//! means ȳ₁, ȳ₂, pooled covariance Sₚ = ((n₁ − 1)S₁ + (n₂ − 1)S₂)/(N − 2) and p = 2 coordinates,
//! T² = (n₁n₂/N)·dᵀSₚ⁻¹d with d = ȳ₁ − ȳ₂, and F = (N − p − 1)/(p(N − 2))·T² follows
//! F(p, N − p − 1) under equal means and normal ilr coordinates with a common covariance.
//!
//! The permutation test (Fisher 1935; Good 2005, Permutation, Parametric and Bootstrap Tests of
//! Hypotheses) needs no normality: it compares T² with its values over re-splittings of the
//! pooled samples into groups of the same sizes. Every split is enumerated when there are at
//! most [`EXACT_SPLITS`]; otherwise random splits are drawn from a seeded generator and
//! p = (1 + #{T²* ≥ T²})/(R + 1) (Phipson & Smyth 2010, Stat. Appl. Genet. Mol. Biol. 9:39).
//! Since the within-group scatter is the total scatter minus (n₁n₂/N)·d·dᵀ, T² is a monotone
//! function of q = dᵀT⁻¹d with T the total scatter (Sherman-Morrison), so each split costs
//! only a sum.

use super::linalg::{mean, Cholesky, SymMatrix};
use crate::synthetic::SplitMix64;
use serde::Serialize;

/// Below this many samples in either group the permutation p-value is the one reported: with
/// so few samples the normality of ilr coordinates behind the F reference cannot be judged
/// (sandprov's choice, not a published threshold).
pub const SMALL_GROUP: usize = 10;

/// Largest number of splits enumerated exactly.
pub const EXACT_SPLITS: u64 = 50_000;

/// Random splits drawn when exact enumeration is too long (unless asked otherwise).
pub const DEFAULT_PERMUTATIONS: usize = 9_999;

/// The default seed of the permutation tests.
pub const DEFAULT_SEED: u64 = 20_260_101;

/// Hotelling's two-sample T² test.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::Hotelling;
/// let a = vec![vec![0.0, 0.0], vec![1.0, 0.0], vec![0.0, 1.0]];
/// let b = vec![vec![3.0, 3.0], vec![4.0, 3.0], vec![3.0, 4.0]];
/// let h = Hotelling::test(&a, &b).unwrap();
/// assert_eq!((h.df1, h.df2), (2.0, 3.0));
/// assert!(h.p_value < 0.01);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Hotelling {
    /// T².
    pub t2: f64,
    /// The F statistic (N − p − 1)/(p(N − 2))·T².
    pub f: f64,
    /// Numerator degrees of freedom, p.
    pub df1: f64,
    /// Denominator degrees of freedom, N − p − 1.
    pub df2: f64,
    /// P(F ≥ f).
    pub p_value: f64,
}

impl Hotelling {
    /// The test of two groups of equally long coordinate rows; `None` when N − p − 1 < 1 or
    /// the pooled covariance is singular.
    pub fn test(a: &[Vec<f64>], b: &[Vec<f64>]) -> Option<Hotelling> {
        let p = a.first()?.len();
        let (n1, n2) = (a.len(), b.len());
        let n = n1 + n2;
        if n < p + 2 || n1 == 0 || n2 == 0 {
            return None;
        }
        let (ma, mb) = (mean(a)?, mean(b)?);
        let mut w = SymMatrix::scatter(a, &ma);
        w.add_scaled(&SymMatrix::scatter(b, &mb), 1.0);
        w.scale(1.0 / (n as f64 - 2.0));
        let chol = w.cholesky()?;
        let d: Vec<f64> = ma.iter().zip(&mb).map(|(x, y)| x - y).collect();
        let (n1f, n2f, nf, pf) = (n1 as f64, n2 as f64, n as f64, p as f64);
        let t2 = n1f * n2f / nf * chol.mahalanobis2(&d);
        let f = (nf - pf - 1.0) / (pf * (nf - 2.0)) * t2;
        let (df1, df2) = (pf, nf - pf - 1.0);
        Some(Hotelling {
            t2,
            f,
            df1,
            df2,
            p_value: crate::stats::distributions::f_sf(f, df1, df2),
        })
    }
}

/// How the permutation distribution was obtained.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::PermutationKind;
/// assert_eq!(serde_json::to_value(PermutationKind::Exact).unwrap(), "exact");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum PermutationKind {
    /// Every split was enumerated.
    Exact,
    /// Random splits from a seeded generator.
    MonteCarlo,
}

/// A permutation test of Hotelling's T².
///
/// # Example
/// ```
/// use provenance_core::petrofacies::{Permutation, PermutationKind};
/// let a = vec![vec![0.0, 0.0], vec![1.0, 0.2], vec![0.1, 1.0]];
/// let b = vec![vec![3.0, 3.0], vec![4.0, 3.1], vec![3.2, 4.0]];
/// let t = Permutation::test(&a, &b, 9_999, 1).unwrap();
/// assert_eq!(t.kind, PermutationKind::Exact);
/// assert_eq!(t.splits, 20); // C(6, 3)
/// // Only the observed split and its mirror image are as extreme: p = 2/20.
/// assert!((t.p_value - 0.1).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Permutation {
    /// Exact enumeration or Monte Carlo.
    pub kind: PermutationKind,
    /// Splits evaluated (all of them, or the random draws).
    pub splits: u64,
    /// The permutation p-value.
    pub p_value: f64,
    /// The seed of the random splits (`None` when exact).
    pub seed: Option<u64>,
}

/// C(n, k) as a saturating u64.
fn binomial(n: usize, k: usize) -> u64 {
    let k = k.min(n - k);
    let mut c: u128 = 1;
    for i in 0..k {
        c = c * (n - i) as u128 / (i + 1) as u128;
        if c > u64::MAX as u128 {
            return u64::MAX;
        }
    }
    c as u64
}

/// Work shared by all splits: q(sum of group A) = dᵀT⁻¹d.
struct Splitter {
    rows: Vec<Vec<f64>>,
    total: Vec<f64>,
    chol: Cholesky,
    n1: usize,
}

impl Splitter {
    fn q(&self, sum_a: &[f64]) -> f64 {
        let (n1, n2) = (self.n1 as f64, (self.rows.len() - self.n1) as f64);
        let d: Vec<f64> = sum_a
            .iter()
            .zip(&self.total)
            .map(|(sa, t)| sa / n1 - (t - sa) / n2)
            .collect();
        self.chol.mahalanobis2(&d)
    }

    fn sum(&self, idx: &[usize]) -> Vec<f64> {
        let mut s = vec![0.0; self.total.len()];
        for &i in idx {
            for (sj, x) in s.iter_mut().zip(&self.rows[i]) {
                *sj += x;
            }
        }
        s
    }
}

impl Permutation {
    /// The test of two groups; `permutations` random splits when the exact enumeration would
    /// exceed [`EXACT_SPLITS`], drawn from `seed`. `None` when the total scatter is singular
    /// or a group is empty.
    pub fn test(a: &[Vec<f64>], b: &[Vec<f64>], permutations: usize, seed: u64) -> Option<Self> {
        Permutation::run(a, b, permutations, seed, EXACT_SPLITS)
    }

    fn run(
        a: &[Vec<f64>],
        b: &[Vec<f64>],
        permutations: usize,
        seed: u64,
        exact_limit: u64,
    ) -> Option<Self> {
        if a.is_empty() || b.is_empty() {
            return None;
        }
        let rows: Vec<Vec<f64>> = a.iter().chain(b).cloned().collect();
        let m = mean(&rows)?;
        let chol = SymMatrix::scatter(&rows, &m).cholesky()?;
        let total: Vec<f64> = m.iter().map(|x| x * rows.len() as f64).collect();
        let n = rows.len();
        let sp = Splitter {
            rows,
            total,
            chol,
            n1: a.len(),
        };
        let observed = sp.q(&sp.sum(&(0..a.len()).collect::<Vec<_>>()));
        // Ties: a split counts as extreme when within a relative 1e-9 of the observed value.
        let extreme = |q: f64| q >= observed * (1.0 - 1e-9);
        let splits = binomial(n, a.len());
        if splits <= exact_limit {
            let k = a.len();
            let mut idx: Vec<usize> = (0..k).collect();
            let mut hits = 0u64;
            loop {
                if extreme(sp.q(&sp.sum(&idx))) {
                    hits += 1;
                }
                // Next k-combination of 0..n in lexicographic order.
                let Some(i) = (0..k).rev().find(|&i| idx[i] < n - k + i) else {
                    break;
                };
                idx[i] += 1;
                for j in i + 1..k {
                    idx[j] = idx[j - 1] + 1;
                }
            }
            return Some(Permutation {
                kind: PermutationKind::Exact,
                splits,
                p_value: hits as f64 / splits as f64,
                seed: None,
            });
        }
        let r = permutations.max(1);
        let mut rng = SplitMix64::new(seed);
        let mut order: Vec<usize> = (0..n).collect();
        let mut hits = 0u64;
        for _ in 0..r {
            // Partial Fisher-Yates: the first n₁ positions become group A.
            for i in 0..sp.n1 {
                let j = i + rng.below((n - i) as u32) as usize;
                order.swap(i, j);
            }
            if extreme(sp.q(&sp.sum(&order[..sp.n1]))) {
                hits += 1;
            }
        }
        Some(Permutation {
            kind: PermutationKind::MonteCarlo,
            splits: r as u64,
            p_value: (1 + hits) as f64 / (r + 1) as f64,
            seed: Some(seed),
        })
    }
}

/// Holm's (1979, Scand. J. Stat. 6:65-70) step-down adjustment of a family of p-values, in the
/// input order; `None` entries are skipped and stay `None`.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::holm;
/// let adj = holm(&[Some(0.01), None, Some(0.04), Some(0.03)]);
/// // Sorted 0.01, 0.03, 0.04 × 3, 2, 1 → 0.03, 0.06, max(0.06, 0.04) = 0.06.
/// assert_eq!(adj, vec![Some(0.03), None, Some(0.06), Some(0.06)]);
/// ```
pub fn holm(p: &[Option<f64>]) -> Vec<Option<f64>> {
    let mut idx: Vec<usize> = (0..p.len()).filter(|i| p[*i].is_some()).collect();
    idx.sort_by(|a, b| {
        p[*a]
            .partial_cmp(&p[*b])
            .unwrap_or(std::cmp::Ordering::Equal)
    });
    let m = idx.len();
    let mut out = vec![None; p.len()];
    let mut running: f64 = 0.0;
    for (rank, &i) in idx.iter().enumerate() {
        let v = p[i].unwrap_or(1.0);
        running = running.max(((m - rank) as f64 * v).min(1.0));
        out[i] = Some(running);
    }
    out
}

/// The seed of one pair's permutation stream, from the run's seed and the pair's position
/// (never from scheduling), so reruns give identical output.
pub(crate) fn pair_seed(seed: u64, diagram: usize, i: usize, j: usize) -> u64 {
    let key = ((diagram as u64) << 48) ^ ((i as u64) << 24) ^ j as u64;
    SplitMix64::new(seed ^ key.wrapping_mul(0x9E37_79B9_7F4A_7C15)).next_u64()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn holm_of_floating_values() {
        let adj = holm(&[Some(0.01), Some(0.04), Some(0.03)]);
        assert!((adj[0].unwrap() - 0.03).abs() < 1e-15);
        assert!((adj[1].unwrap() - 0.06).abs() < 1e-15);
        assert!((adj[2].unwrap() - 0.06).abs() < 1e-15);
    }

    #[test]
    fn binomial_coefficients() {
        assert_eq!(binomial(6, 3), 20);
        assert_eq!(binomial(40, 20), 137_846_528_820);
        assert_eq!(binomial(2000, 1000), u64::MAX);
    }

    #[test]
    fn monte_carlo_and_exact_agree_on_a_mid_sized_split() {
        // 8 + 8 samples: C(16, 8) = 12870 splits, enumerated; a Monte Carlo run of 20000 draws
        // must land within 4 binomial standard errors of the exact p.
        let mut rng = SplitMix64::new(5);
        let mut u = || (rng.next_u64() >> 11) as f64 / (1u64 << 53) as f64;
        let a: Vec<Vec<f64>> = (0..8).map(|_| vec![u(), u()]).collect();
        let b: Vec<Vec<f64>> = (0..8).map(|_| vec![u() + 0.3, u()]).collect();
        let exact = Permutation::run(&a, &b, 0, 0, EXACT_SPLITS).unwrap();
        assert_eq!(exact.kind, PermutationKind::Exact);
        assert_eq!(exact.splits, 12_870);
        let mc = Permutation::run(&a, &b, 20_000, 9, 0).unwrap();
        assert_eq!(mc.kind, PermutationKind::MonteCarlo);
        assert_eq!(mc.seed, Some(9));
        let p = exact.p_value;
        let se = (p * (1.0 - p) / 20_000.0).sqrt();
        assert!(
            p > 0.001 && p < 0.999,
            "the example should not be extreme: {p}"
        );
        assert!(
            (mc.p_value - p).abs() < 4.0 * se + 1e-4,
            "{} vs {p}",
            mc.p_value
        );
        // Same seed, same answer.
        assert_eq!(Permutation::run(&a, &b, 20_000, 9, 0), Some(mc));
    }
}
