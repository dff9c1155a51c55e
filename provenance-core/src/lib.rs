//! # provenance-core
//!
//! The computations of **sandprov**: from point counts of sandstone thin sections
//! (Gazzi-Dickinson method) to recalculated detrital modes with counting error.
//!
//! - [`input`] reads count tables (CSV in any common dialect, optional column mapping),
//!   validating every cell and naming file, line and column on refusal.
//! - [`counts`] holds the typed point counts of a thin section.
//! - [`diagram`] defines the five ternary diagrams (QFL, QmFLt, QmPK, QpLvLsm, LmLvLs).
//! - [`modes`] recalculates each diagram's poles and the usual grain ratios.
//! - [`stats`] gives counting error: σ (Van der Plas & Tobi 1965), Wilson and
//!   Clopper-Pearson intervals, and the points needed for a target precision.
//! - [`naming`] names each sample under Folk (1980), Garzanti (2019) and Pettijohn, Potter &
//!   Siever (1987), with the poles and the rule behind every name.
//! - [`output`] and [`batch`] write tables as CSV or JSON, streaming and atomically.
//! - [`geometry`] and [`fields`] hold ternary geometry and the published provenance fields;
//!   [`setting`] looks samples up in them.
//! - [`petrofacies`] summarises groups of samples (means, regions, comparisons) and finds
//!   provenance shifts up-section.
//!
//! ## Example
//! ```
//! use provenance_core::prelude::*;
//!
//! let table = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm\nKR-07,180,12,6,52,30,40,8,12\n";
//! let reader = CountReader::from_reader("counts.csv", table.as_bytes(), ReadOptions::default())?;
//! for sample in reader {
//!     let sample = sample?;
//!     let modes = SampleModes::of(&sample);
//!     let qfl = modes.get(Diagram::Qfl).expect("the framework has grains");
//!     assert_eq!(qfl.points, Some(340.0));
//!     let [q, f, l] = qfl.percent.parts();
//!     assert!((q - 58.235).abs() < 1e-3 && (f - 24.118).abs() < 1e-3 && (l - 17.647).abs() < 1e-3);
//! }
//! # Ok::<(), provenance_core::error::Error>(())
//! ```
//!
//! Interpretations built on these numbers support, and never replace, petrographic judgement.

#![deny(missing_docs)]

pub mod batch;
pub mod classifier;
pub mod composition;
pub mod counts;
pub mod demo;
pub mod diagram;
pub mod error;
pub mod fields;
pub mod geometry;
pub mod input;
pub mod logratio;
pub mod membership;
pub mod modes;
pub mod naming;
pub mod output;
pub mod petrofacies;
pub mod plot;
pub mod report;
pub mod setting;
pub mod stats;
pub mod synthetic;
mod text;

/// The types most programs need.
pub mod prelude {
    pub use crate::composition::Composition3;
    pub use crate::counts::{Category, Counting, Framework, NonFramework, Sample};
    pub use crate::diagram::Diagram;
    pub use crate::error::{Error, Result};
    pub use crate::input::{CountReader, Mapping, ReadOptions};
    pub use crate::modes::{DiagramMode, Ratios, SampleModes};
    pub use crate::naming::{Naming, NamingScheme, SchemeSet, Verdict};
}
