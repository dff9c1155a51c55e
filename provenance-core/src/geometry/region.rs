//! A connected piece of the triangle that no field covers, and how to say where it lies.

use super::overlay::TRIANGLE_AREA;

/// A connected region of the triangle covered by no polygon.
///
/// # Example
/// ```
/// use provenance_core::geometry::{overlay::Overlay, Polygon};
/// // Only the band Q ≥ 50 is covered: the gap is the lower three quarters.
/// let top = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
/// let overlay = Overlay::of(&[top]);
/// let gaps = overlay.uncovered();
/// assert_eq!(gaps.len(), 1);
/// assert!((gaps[0].percent_of_triangle() - 75.0).abs() < 1e-9);
/// assert!((gaps[0].range[0][1] - 50.0).abs() < 1e-9); // Q reaches 50 at most
/// assert_eq!(gaps[0].touches, [true, true, true]);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Region {
    /// Area in the equilateral diagram of side 100, percentage points squared.
    pub area: f64,
    /// Area centroid, in percent of the three poles.
    pub centroid: [f64; 3],
    /// Least and greatest percentage of each pole within the region.
    pub range: [[f64; 2]; 3],
    /// Which sides of the triangle the region reaches: `touches[k]` is the side where pole
    /// k is absent (for QFL: 0 the F-L side, 1 the Q-L side, 2 the Q-F side).
    pub touches: [bool; 3],
}

impl Region {
    /// Area as a percentage of the whole triangle.
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::overlay::{Region, TRIANGLE_AREA};
    /// let r = Region { area: TRIANGLE_AREA / 8.0, centroid: [0.0; 3], range: [[0.0; 2]; 3], touches: [false; 3] };
    /// assert!((r.percent_of_triangle() - 12.5).abs() < 1e-12);
    /// ```
    pub fn percent_of_triangle(&self) -> f64 {
        100.0 * self.area / TRIANGLE_AREA
    }

    /// Where the region lies, in words, with the diagram's pole symbols.
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::overlay::Region;
    /// let r = Region {
    ///     area: 10.0,
    ///     centroid: [40.0, 35.0, 25.0],
    ///     range: [[38.0, 42.0], [33.0, 37.0], [23.0, 27.0]],
    ///     touches: [false; 3],
    /// };
    /// assert_eq!(
    ///     r.describe(["Q", "F", "L"]),
    ///     "around Q 40.0, F 35.0, L 25.0 (Q 38.0-42.0, F 33.0-37.0, L 23.0-27.0), inside the triangle"
    /// );
    /// ```
    pub fn describe(&self, poles: [&str; 3]) -> String {
        let c = self.centroid;
        let r = self.range;
        let mut s = format!(
            "around {} {:.1}, {} {:.1}, {} {:.1} ({} {:.1}-{:.1}, {} {:.1}-{:.1}, {} {:.1}-{:.1})",
            poles[0],
            c[0],
            poles[1],
            c[1],
            poles[2],
            c[2],
            poles[0],
            r[0][0],
            r[0][1],
            poles[1],
            r[1][0],
            r[1][1],
            poles[2],
            r[2][0],
            r[2][1]
        );
        let sides: Vec<String> = (0..3)
            .filter(|k| self.touches[*k])
            .map(|k| {
                let others: Vec<&str> = (0..3).filter(|j| *j != k).map(|j| poles[j]).collect();
                format!("the {}-{} side", others[0], others[1])
            })
            .collect();
        if sides.is_empty() {
            s.push_str(", inside the triangle");
        } else {
            s.push_str(", reaching ");
            s.push_str(&sides.join(" and "));
        }
        s
    }
}
