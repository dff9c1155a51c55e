//! Closed three-part compositions (percent of three poles).

use serde::{Deserialize, Serialize};

/// A three-part composition closed to 100 (percent of the three poles).
///
/// Closure C(x) = 100·x/Σx (Aitchison 1986, The Statistical Analysis of Compositional Data).
///
/// # Example
/// ```
/// use provenance_core::composition::Composition3;
/// let c = Composition3::close([2.0, 1.0, 1.0]).unwrap();
/// assert_eq!(c.parts(), [50.0, 25.0, 25.0]);
/// assert!(Composition3::close([0.0, 0.0, 0.0]).is_none());
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Composition3([f64; 3]);

impl Composition3 {
    /// Close non-negative amounts to percent; `None` when they sum to zero or are not finite.
    pub fn close(amounts: [f64; 3]) -> Option<Composition3> {
        let sum: f64 = amounts.iter().sum();
        if !(sum.is_finite() && sum > 0.0) || amounts.iter().any(|a| *a < 0.0) {
            return None;
        }
        Some(Composition3(amounts.map(|a| 100.0 * a / sum)))
    }

    /// The three parts, in percent, in pole order.
    pub fn parts(&self) -> [f64; 3] {
        self.0
    }

    /// One part, in percent.
    ///
    /// # Example
    /// ```
    /// let c = provenance_core::composition::Composition3::close([1.0, 3.0, 0.0]).unwrap();
    /// assert_eq!(c.part(1), 75.0);
    /// ```
    pub fn part(&self, i: usize) -> f64 {
        self.0[i]
    }
}
