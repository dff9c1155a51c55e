//! χ² homogeneity test of replicate counts: may a group's counts be pooled?
//!
//! The counts form a contingency table, samples × poles. Under homogeneity (every sample drawn
//! from one composition) the expected count of cell (i, j) is Eᵢⱼ = Rᵢ·Cⱼ/N, and
//! X² = Σ (Oᵢⱼ − Eᵢⱼ)²/Eᵢⱼ follows χ² with (r − 1)(c − 1) degrees of freedom (Pearson 1900;
//! the test of homogeneity for replicate counts, common practice). Poles with no points in the
//! whole group are left out (their expected counts are 0), reducing c. No continuity
//! correction is applied.
//!
//! Point counts of different thin sections of one formation usually differ by more than
//! counting error (the rocks vary), so the test usually says "do not pool": the pooled
//! composition then describes the points counted, not a population of sands.

use crate::stats::distributions::chi2_sf;
use serde::Serialize;

/// Significance level below which pooling is judged unjustified (5%, common practice).
pub const HOMOGENEITY_ALPHA: f64 = 0.05;

/// The outcome of the χ² homogeneity test.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::Homogeneity;
/// // Two identical counts are perfectly homogeneous.
/// let h = Homogeneity::of(&[[100.0, 50.0, 50.0], [100.0, 50.0, 50.0]]).unwrap();
/// assert_eq!(h.chi2, 0.0);
/// assert_eq!(h.df, 2);
/// assert!((h.p_value - 1.0).abs() < 1e-12);
/// assert!(h.pooling_justified);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Homogeneity {
    /// Pearson's X².
    pub chi2: f64,
    /// Degrees of freedom (r − 1)(c − 1), c counting poles with points.
    pub df: usize,
    /// P(χ²_df ≥ X²); 1 when df is 0.
    pub p_value: f64,
    /// p ≥ [`HOMOGENEITY_ALPHA`]: the counts are consistent with one composition.
    pub pooling_justified: bool,
    /// Cells with expected count below 5, where the χ² approximation is rough (Cochran 1954,
    /// Biometrics 10:417-451: at most 20% of cells below 5 is the usual rule; common practice).
    pub expected_below_5: usize,
    /// Cells in the table (r × c).
    pub cells: usize,
}

impl Homogeneity {
    /// The test on rows of pole counts (one row per sample); `None` for fewer than two rows
    /// with points.
    pub fn of(counts: &[[f64; 3]]) -> Option<Homogeneity> {
        let rows: Vec<&[f64; 3]> = counts
            .iter()
            .filter(|r| r.iter().sum::<f64>() > 0.0)
            .collect();
        if rows.len() < 2 {
            return None;
        }
        let col_tot = [0, 1, 2].map(|j| rows.iter().map(|r| r[j]).sum::<f64>());
        let cols: Vec<usize> = (0..3).filter(|j| col_tot[*j] > 0.0).collect();
        let total: f64 = col_tot.iter().sum();
        let mut chi2 = 0.0;
        let mut below = 0;
        for r in &rows {
            let rt: f64 = r.iter().sum();
            for &j in &cols {
                let e = rt * col_tot[j] / total;
                chi2 += (r[j] - e).powi(2) / e;
                if e < 5.0 {
                    below += 1;
                }
            }
        }
        let df = (rows.len() - 1) * (cols.len() - 1);
        let p_value = if df == 0 {
            1.0
        } else {
            chi2_sf(chi2, df as f64)
        };
        Some(Homogeneity {
            chi2,
            df,
            p_value,
            pooling_justified: p_value >= HOMOGENEITY_ALPHA,
            expected_below_5: below,
            cells: rows.len() * cols.len(),
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn hand_worked_two_by_three_table() {
        // Rows (30, 10, 10) and (10, 30, 10): totals 50, 50; columns 40, 40, 20; N = 100.
        // E = 20, 20, 10 in both rows; X² = 2·(100/20 + 100/20 + 0) = 20; df = 2;
        // p = e^(−10) (χ² with 2 df).
        let h = Homogeneity::of(&[[30.0, 10.0, 10.0], [10.0, 30.0, 10.0]]).unwrap();
        assert!((h.chi2 - 20.0).abs() < 1e-12);
        assert_eq!(h.df, 2);
        assert!((h.p_value - (-10.0f64).exp()).abs() < 1e-15);
        assert!(!h.pooling_justified);
    }

    #[test]
    fn an_empty_pole_is_left_out() {
        let h =
            Homogeneity::of(&[[30.0, 10.0, 0.0], [10.0, 30.0, 0.0], [20.0, 20.0, 0.0]]).unwrap();
        assert_eq!(h.df, 2);
        assert_eq!(h.cells, 6);
    }
}
