//! Ternary geometry: barycentric ↔ Cartesian coordinates and polygons in the triangle.
//!
//! Convention (fixed for the whole crate): for poles `[A, B, C]` (for QFL: Q, F, L) the triangle
//! has side 100, B at the origin (bottom left), C at (100, 0) (bottom right) and A at
//! (50, 50·√3) (top). A composition (a, b, c) in percent maps to x = c + a/2, y = a·√3/2.
//! Distances measured in this plane are in percentage points of a pole.
//!
//! - [`Polygon`]: area, point-in-polygon with a documented boundary rule, distance to the
//!   boundary, simplicity ([`Polygon::check_simple`]), label anchor ([`Polygon::label_anchor`]).
//! - [`overlay`]: overlap areas of polygons and the uncovered ground of the triangle.

pub mod anchor;
pub mod overlay;
pub mod polygon;
pub mod region;
pub mod simple;
pub mod ternary;

pub use anchor::Anchor;
pub use overlay::{intersection_area, Overlay, Region};
pub use polygon::Polygon;
pub use simple::Defect;
pub use ternary::{Cartesian, SQRT3_2};
