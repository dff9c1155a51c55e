//! Statistics: special functions and counting error of point counts.

pub mod counting;
pub mod distributions;
pub mod gamma;
pub mod polygamma;
pub mod special;

pub use counting::{clopper_pearson, points_needed, sd_percent, wilson, Interval, Z95};
