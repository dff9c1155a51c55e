//! Progress of a report build, for a caller that shows it (a progress bar, a log).

/// What [`build_observed`](super::build_observed) tells as it goes: each step as it begins,
/// then how many of that step's samples are done.
///
/// Calls may come from several threads at once, hence `Sync`.
///
/// # Example
/// ```
/// use provenance_core::report::Observer;
/// use std::sync::atomic::{AtomicU64, Ordering};
/// struct Count(AtomicU64);
/// impl Observer for Count {
///     fn step(&self, _name: &str, _total: u64) {}
///     fn advance(&self, n: u64) {
///         self.0.fetch_add(n, Ordering::Relaxed);
///     }
/// }
/// let c = Count(AtomicU64::new(0));
/// c.advance(3);
/// assert_eq!(c.0.load(Ordering::Relaxed), 3);
/// ```
pub trait Observer: Sync {
    /// A step begins; `total` is how many samples it goes through (0 when it is not counted
    /// by sample).
    fn step(&self, name: &str, total: u64);
    /// `n` more samples of the current step are done.
    fn advance(&self, n: u64);
}

/// An observer that shows nothing: what [`build`](super::build) uses.
///
/// # Example
/// ```
/// use provenance_core::report::{Observer, Silent};
/// Silent.step("placing samples in the fields", 10);
/// Silent.advance(10);
/// ```
#[derive(Debug, Clone, Copy, Default)]
pub struct Silent;

impl Observer for Silent {
    fn step(&self, _name: &str, _total: u64) {}
    fn advance(&self, _n: u64) {}
}

/// Samples handed to a worker at a time, and so between two progress reports.
pub(crate) const CHUNK: usize = 256;
