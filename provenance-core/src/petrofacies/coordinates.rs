//! One sample's log-ratio coordinates in one diagram, after zero replacement.

use crate::logratio::{ilr, replace_zeros, DELTA_FRACTION};
use crate::modes::DiagramMode;

/// Points assumed when a percent table gives no number of points (`--percent` without an `n`
/// column): the minimum count per slide of common practice (300 points; see METHODS, point
/// counting). It only sets the zero-replacement δ = 0.65/300 for such samples.
pub const ASSUMED_POINTS: f64 = 300.0;

/// A diagram mode ready for log-ratio statistics.
///
/// Zeros get multiplicative replacement (Martín-Fernández, Barceló-Vidal & Pawlowsky-Glahn
/// 2003) with δ = 0.65/n for n points in the diagram, n at least 2 so that two zero parts
/// never take more than the whole ([`ASSUMED_POINTS`] when n is unknown). A mode without zeros
/// is only closed.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::diagram::Diagram;
/// use provenance_core::modes::DiagramMode;
/// use provenance_core::petrofacies::Coordinates;
/// let s = Sample::counted("a", Framework { qm: 200.0, p: 125.0, ..Default::default() });
/// let m = DiagramMode::of(&s, Diagram::Qfl).unwrap();
/// let c = Coordinates::of(&m);
/// // 325 points: δ = 0.65/325 = 0.002 for the zero L; Q : F stays 200 : 125.
/// assert!((c.proportions[2] - 0.002).abs() < 1e-15);
/// assert!((c.proportions[0] / c.proportions[1] - 1.6).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Coordinates {
    /// Zero-replaced proportions, closed to 1, in pole order.
    pub proportions: [f64; 3],
    /// ilr coordinates (Helmert-type basis of [`crate::logratio`]).
    pub ilr: [f64; 2],
}

impl Coordinates {
    /// The coordinates of one diagram mode.
    pub fn of(mode: &DiagramMode) -> Coordinates {
        let n = mode.points.unwrap_or(ASSUMED_POINTS).max(2.0);
        let delta = DELTA_FRACTION / n;
        // A mode always has a positive, finite pole sum, so closure succeeds; the fallback keeps
        // the percentages if it ever did not.
        let p = replace_zeros(&mode.amounts, delta)
            .unwrap_or_else(|| mode.percent.parts().iter().map(|v| v / 100.0).collect());
        let proportions = [p[0], p[1], p[2]];
        let z = ilr(&proportions);
        Coordinates {
            proportions,
            ilr: [z[0], z[1]],
        }
    }
}
