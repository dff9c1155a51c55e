//! Barycentric (percent) ↔ Cartesian conversion.

use crate::composition::Composition3;
use serde::{Deserialize, Serialize};

/// √3/2, the height of an equilateral triangle of unit side.
pub const SQRT3_2: f64 = 0.866_025_403_784_438_6;

/// A point in the plane of the triangle of side 100 (see the [module](super) convention).
///
/// # Example
/// ```
/// use provenance_core::composition::Composition3;
/// use provenance_core::geometry::Cartesian;
/// let top = Cartesian::from_composition(&Composition3::close([1.0, 0.0, 0.0]).unwrap());
/// assert!((top.x - 50.0).abs() < 1e-12 && (top.y - 86.602_540_378).abs() < 1e-9);
/// let back = top.to_composition().unwrap();
/// assert!((back.part(0) - 100.0).abs() < 1e-9);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Cartesian {
    /// Horizontal, from the B pole toward the C pole.
    pub x: f64,
    /// Vertical, toward the A pole.
    pub y: f64,
}

impl Cartesian {
    /// The point of a composition.
    pub fn from_composition(c: &Composition3) -> Cartesian {
        Cartesian::from_parts(c.parts())
    }

    /// The point of percentages `[a, b, c]` summing to 100 (not checked).
    pub fn from_parts([a, _b, c]: [f64; 3]) -> Cartesian {
        Cartesian {
            x: c + a / 2.0,
            y: a * SQRT3_2,
        }
    }

    /// The barycentric percentages `[a, b, c]` of this point (they sum to 100; some may be
    /// negative when the point is outside the triangle).
    pub fn to_parts(&self) -> [f64; 3] {
        let a = self.y / SQRT3_2;
        let c = self.x - a / 2.0;
        [a, 100.0 - a - c, c]
    }

    /// The composition of this point; `None` outside the triangle (beyond 1e-9).
    pub fn to_composition(&self) -> Option<Composition3> {
        let p = self.to_parts();
        if p.iter().any(|v| *v < -1e-9) {
            return None;
        }
        Composition3::close(p.map(|v| v.max(0.0)))
    }

    /// Euclidean distance, in percentage points.
    pub fn distance(&self, o: &Cartesian) -> f64 {
        (self.x - o.x).hypot(self.y - o.y)
    }
}
