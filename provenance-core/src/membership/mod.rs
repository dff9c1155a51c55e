//! Field membership under counting error: how sure we are that a sample belongs to a field.
//!
//! A point count is a sample of the slide, so the true composition of a diagram is uncertain.
//! With a multinomial likelihood for the pole counts k and the Jeffreys prior, the posterior of
//! the true proportions is Dirichlet(k + 1/2) ([`Posterior`]). The probability that the true
//! composition lies in a field is the posterior mass inside its polygon; mass outside every
//! field goes under "outside", and the probabilities sum to 1.
//!
//! - [`Estimator`] computes it by drawing from the posterior (seeded; each sample's stream comes
//!   from the seed, its position and a lane, see [`stream`]), with an exact shortcut for
//!   samples far from every boundary ([`Estimator::bound`]).
//! - [`RegionIndex`] locates draws quickly and exactly as [`crate::geometry::Polygon::contains`]
//!   would.
//! - [`ConfidenceRegion`] is the logistic-normal region of Weltje (2002), for plotting.
//! - [`group_probabilities`] and [`ProvenanceSummary`] sum fields into provenance groups.
//!
//! Membership measures counting error only: it does not say whether the field boundaries
//! themselves are right, nor whether the sand's setting is one the fields describe. It supports,
//! and does not replace, petrographic judgement.
//!
//! # Example
//! ```
//! use provenance_core::counts::{Framework, Sample};
//! use provenance_core::diagram::Diagram;
//! use provenance_core::geometry::Polygon;
//! use provenance_core::membership::{Estimator, MembershipOptions, Posterior, Region, AMBIGUOUS_BELOW};
//! use provenance_core::modes::DiagramMode;
//!
//! // Two invented regions split by the line Q = 50%.
//! let q_rich = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
//! let q_poor = Polygon::new(vec![[50.0, 50.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0], [50.0, 0.0, 50.0]]);
//! let set = [
//!     Region { name: "quartz-rich", group: None, polygon: &q_rich },
//!     Region { name: "quartz-poor", group: None, polygon: &q_poor },
//! ];
//! let est = Estimator::new(&set[..], MembershipOptions::default())?;
//! let s = Sample::counted("KR-3", Framework { qm: 150.0, qp: 10.0, p: 60.0, k: 20.0, lv: 60.0, ..Default::default() });
//! let mode = DiagramMode::of(&s, Diagram::Qfl).unwrap();
//! let post = Posterior::of_mode(&mode).unwrap();
//! let m = est.estimate(&post, 0, Diagram::Qfl.index() as u64);
//! // Q = 53.3% of 300 points, about 1.2 sd above the line.
//! assert!(m.probability(0) > 0.85 && m.probability(0) < 0.93);
//! assert!(m.is_ambiguous(AMBIGUOUS_BELOW));
//! # Ok::<(), provenance_core::error::Error>(())
//! ```

mod estimate;
mod fields;
mod integrate;
mod posterior;
mod region;
mod regions;
mod sampler;
mod summary;

pub use estimate::{
    Estimator, Membership, MembershipOptions, Method, Top, AMBIGUOUS_BELOW,
    DEFAULT_BOUND_TOLERANCE, DEFAULT_DRAWS, INTEGRATION_ACCURACY,
};
pub use integrate::INTEGRATE_MIN_COUNT;
pub use posterior::{stream, Posterior, DEFAULT_SEED, JEFFREYS};
pub use region::{ConfidenceRegion, CURVE_POINTS, REGION_LEVEL};
pub use regions::{Region, RegionIndex, Regions};
pub use summary::{group_probabilities, top_group, ProvenanceSummary, OUTSIDE};
