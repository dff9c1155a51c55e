//! Petrofacies: how groups of samples (formations, members, sections) plot, whether they
//! differ, and where the composition changes up-section.
//!
//! - [`Table`] holds a count table in memory; [`Table::column`] picks a metadata column
//!   (`--by formation`, `--height height_m`) and [`Table::groups`] splits the samples by it.
//! - [`DiagramSummary`] gives, for one group in one diagram: the number of samples, the closed
//!   geometric mean (Aitchison 1986) of the zero-replaced compositions, the pooled composition
//!   of the summed counts, the ilr covariance, the 95% confidence region of the mean and the
//!   95% prediction region (Weltje 2002) as closed curves in the triangle, the traditional
//!   arithmetic mean ± 1σ polygon, and a χ² homogeneity check of the counts.
//! - [`Petrofacies`] does that for every group and diagram and compares every pair of groups
//!   with Hotelling's two-sample T² in ilr space, with a permutation test where groups are
//!   small ([`Comparison`]).
//! - [`ChangePoints`] finds shifts in the ilr sequence up-section by binary segmentation with
//!   a penalised Gaussian likelihood.
//! - [`section_svg`] draws the stratigraphic figure.
//!
//! Zeros get multiplicative replacement with δ = 0.65/n points (Martín-Fernández et al. 2003;
//! see [`Coordinates`]).
//!
//! These statistics describe the counts; whether two formations had different sources, or a
//! shift marks an unroofing sequence or a new source terrane, is a petrographic and geological
//! judgement that they support and never replace.
//!
//! ## Example
//! ```
//! use provenance_core::diagram::Diagram;
//! use provenance_core::input::CountReader;
//! use provenance_core::petrofacies::{GroupOptions, Petrofacies, Table};
//! let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm,fm\n\
//!          a,100,5,40,10,50,5,5,X\nb,120,4,35,12,40,6,4,X\nc,90,6,50,9,55,4,6,X\n\
//!          d,200,9,10,4,10,20,9,Y\ne,210,8,12,3,9,25,8,Y\nf,190,10,9,5,12,22,10,Y\n";
//! let table = Table::read(CountReader::from_reader("t.csv", t.as_bytes(), Default::default())?)?;
//! let p = Petrofacies::of(&table, &table.column("fm")?, GroupOptions::default())?;
//! let x = p.groups[0].get(Diagram::Qfl).unwrap();
//! assert_eq!(x.n, 3);
//! assert!(x.mean.part(0) > 40.0);
//! let regions = x.regions.as_ref().unwrap();
//! assert_eq!(regions.confidence.first(), regions.confidence.last());
//! # Ok::<(), provenance_core::error::Error>(())
//! ```

mod analysis;
mod changepoint;
mod compare;
mod coordinates;
mod grouping;
mod homogeneity;
mod linalg;
mod regions;
mod section;
mod section_layout;
mod section_membership;
pub mod section_svg;
mod sigma_polygon;
mod summary;
mod svg_layers;

pub use analysis::{Comparison, GroupOptions, Petrofacies, TestMethod};
pub use changepoint::{ChangeOptions, ChangePoint, ChangePoints, Segment};
pub use compare::{
    holm, Hotelling, Permutation, PermutationKind, DEFAULT_PERMUTATIONS, DEFAULT_SEED,
    EXACT_SPLITS, SMALL_GROUP,
};
pub use coordinates::{Coordinates, ASSUMED_POINTS};
pub use grouping::{Group, MetaColumn, Table};
pub use homogeneity::{Homogeneity, HOMOGENEITY_ALPHA};
pub use linalg::{Cholesky, SymMatrix};
pub use regions::{
    confidence_bound, ellipse_curve, prediction_bound, RegionGap, Regions, CURVE_POINTS,
    DEFAULT_LEVEL,
};
pub use section::{Ordering, Section, SectionSample};
pub use sigma_polygon::SigmaPolygon;
pub use summary::{DiagramSummary, GroupSummary};
