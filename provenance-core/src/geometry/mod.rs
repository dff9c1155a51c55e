//! Ternary geometry: barycentric ↔ Cartesian coordinates and polygons in the triangle.
//!
//! Convention (fixed for the whole crate): for poles `[A, B, C]` (for QFL: Q, F, L) the triangle
//! has side 100, B at the origin (bottom left), C at (100, 0) (bottom right) and A at
//! (50, 50·√3) (top). A composition (a, b, c) in percent maps to x = c + a/2, y = a·√3/2.
//! Distances measured in this plane are in percentage points of a pole.

pub mod polygon;
pub mod ternary;

pub use polygon::Polygon;
pub use ternary::{Cartesian, SQRT3_2};
