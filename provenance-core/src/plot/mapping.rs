//! The ternary-to-page mapping: where a composition lands on the page.
//!
//! Page coordinates have their origin at the top left and `y` growing downward, as in SVG and
//! PDF viewers. A triangle is placed by its bottom-left vertex (the second pole, B) and its side
//! length; the first pole (A) is at the top and the third (C) at the bottom right, the same
//! convention as [`crate::geometry`]. Library users can draw their own figures with it.

use crate::composition::Composition3;
use crate::geometry::{Cartesian, SQRT3_2};

/// A point on the page, in the page's units (sandprov's figures use 0.1 pt).
///
/// # Example
/// ```
/// use provenance_core::plot::PagePoint;
/// let p = PagePoint { x: 3.0, y: 4.0 };
/// assert_eq!(p.distance(PagePoint { x: 0.0, y: 0.0 }), 5.0);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PagePoint {
    /// Rightward from the left page edge.
    pub x: f64,
    /// Downward from the top page edge.
    pub y: f64,
}

impl PagePoint {
    /// Euclidean distance.
    pub fn distance(self, o: PagePoint) -> f64 {
        (self.x - o.x).hypot(self.y - o.y)
    }

    /// The point rounded to whole page units, as the SVG drawing backend writes it.
    ///
    /// # Example
    /// ```
    /// use provenance_core::plot::PagePoint;
    /// assert_eq!(PagePoint { x: 2.5, y: -0.4 }.rounded(), (3, 0));
    /// ```
    pub fn rounded(self) -> (i32, i32) {
        (self.x.round() as i32, self.y.round() as i32)
    }
}

/// An equilateral triangle placed on the page.
///
/// # Example
/// ```
/// use provenance_core::plot::{PagePoint, TernaryMapping};
/// // B pole at (100, 500), side 400 page units.
/// let m = TernaryMapping::new(PagePoint { x: 100.0, y: 500.0 }, 400.0);
/// let p = m.to_page([50.0, 25.0, 25.0]);
/// // x = 100 + 4·(25 + 50/2) = 300; y = 500 − 4·50·√3/2 = 326.795
/// assert!((p.x - 300.0).abs() < 1e-9 && (p.y - 326.794_919).abs() < 1e-6);
/// let back = m.to_parts(p);
/// assert!((back[0] - 50.0).abs() < 1e-9 && (back[2] - 25.0).abs() < 1e-9);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TernaryMapping {
    origin: PagePoint,
    side: f64,
}

impl TernaryMapping {
    /// A triangle with its B (bottom-left) vertex at `origin` and sides `side` page units long.
    pub fn new(origin: PagePoint, side: f64) -> TernaryMapping {
        TernaryMapping { origin, side }
    }

    /// The largest triangle that fits a box of `width` × `height` whose top-left corner is
    /// `top_left`, centred horizontally and resting on the bottom of the box.
    ///
    /// # Example
    /// ```
    /// use provenance_core::plot::{PagePoint, TernaryMapping};
    /// let m = TernaryMapping::fit(PagePoint { x: 0.0, y: 0.0 }, 200.0, 1000.0);
    /// assert_eq!(m.side(), 200.0);
    /// assert_eq!(m.vertex(1), PagePoint { x: 0.0, y: 1000.0 });
    /// ```
    pub fn fit(top_left: PagePoint, width: f64, height: f64) -> TernaryMapping {
        let side = width.min(height / SQRT3_2).max(0.0);
        TernaryMapping {
            origin: PagePoint {
                x: top_left.x + (width - side) / 2.0,
                y: top_left.y + height,
            },
            side,
        }
    }

    /// Side length in page units.
    pub fn side(&self) -> f64 {
        self.side
    }

    /// Height of the triangle in page units.
    pub fn height(&self) -> f64 {
        self.side * SQRT3_2
    }

    /// Page units per percentage point.
    pub fn scale(&self) -> f64 {
        self.side / 100.0
    }

    /// The page point of percentages `[a, b, c]` of the poles (they should sum to 100).
    pub fn to_page(&self, parts: [f64; 3]) -> PagePoint {
        self.cartesian_to_page(Cartesian::from_parts(parts))
    }

    /// The page point of a composition.
    ///
    /// # Example
    /// ```
    /// use provenance_core::composition::Composition3;
    /// use provenance_core::plot::{PagePoint, TernaryMapping};
    /// let m = TernaryMapping::new(PagePoint { x: 0.0, y: 100.0 }, 100.0);
    /// let c = Composition3::close([0.0, 1.0, 1.0]).unwrap();
    /// assert_eq!(m.composition_to_page(&c), PagePoint { x: 50.0, y: 100.0 });
    /// ```
    pub fn composition_to_page(&self, c: &Composition3) -> PagePoint {
        self.to_page(c.parts())
    }

    /// The page point of a point of the side-100 plane of [`crate::geometry`].
    pub fn cartesian_to_page(&self, c: Cartesian) -> PagePoint {
        let k = self.scale();
        PagePoint {
            x: self.origin.x + k * c.x,
            y: self.origin.y - k * c.y,
        }
    }

    /// The point of the side-100 plane under a page point.
    ///
    /// # Example
    /// ```
    /// use provenance_core::plot::{PagePoint, TernaryMapping};
    /// let m = TernaryMapping::new(PagePoint { x: 10.0, y: 210.0 }, 200.0);
    /// let c = m.page_to_cartesian(PagePoint { x: 110.0, y: 210.0 });
    /// assert_eq!((c.x, c.y), (50.0, 0.0));
    /// assert_eq!(m.cartesian_to_page(c), PagePoint { x: 110.0, y: 210.0 });
    /// assert_eq!((m.side(), m.scale()), (200.0, 2.0));
    /// ```
    pub fn page_to_cartesian(&self, p: PagePoint) -> Cartesian {
        let k = self.scale();
        Cartesian {
            x: (p.x - self.origin.x) / k,
            y: (self.origin.y - p.y) / k,
        }
    }

    /// The percentages `[a, b, c]` under a page point (negative outside the triangle).
    pub fn to_parts(&self, p: PagePoint) -> [f64; 3] {
        self.page_to_cartesian(p).to_parts()
    }

    /// The page point of vertex `i` (0 = A at the top, 1 = B bottom left, 2 = C bottom right).
    ///
    /// # Example
    /// ```
    /// use provenance_core::plot::{PagePoint, TernaryMapping};
    /// let m = TernaryMapping::new(PagePoint { x: 0.0, y: 0.0 }, 10.0);
    /// assert_eq!(m.vertex(2), PagePoint { x: 10.0, y: 0.0 });
    /// ```
    pub fn vertex(&self, i: usize) -> PagePoint {
        let mut parts = [0.0; 3];
        parts[i.min(2)] = 100.0;
        self.to_page(parts)
    }
}
