//! Figure-ready ternary diagrams: SVG, PNG and PDF.
//!
//! A [`Figure`] holds one [`Panel`] per diagram, each with its samples, an optional layer of
//! labelled polygons (a field set, [`PolygonLayer`]), optional regions ([`RegionLayer`]) and
//! group means ([`MeanMarker`]). [`Figure::to_svg`] draws it with plotters' SVG backend on a
//! canvas of 0.1 pt units, in layers with ids (`grid`, `fields`, `frame`, `regions`, `samples`,
//! `labels`, `legend`), with every user string escaped; [`export`] renders the same SVG to PNG
//! or PDF with an embedded font, so output is identical on every machine.
//!
//! - [`mapping`]: the ternary-to-page mapping ([`TernaryMapping`]), public for own drawings.
//! - [`size`]: printed widths (single column 85 mm, double 175 mm, any width) and font sizes.
//! - [`layout`]: panels side by side with a shared legend.
//! - [`palette`]: group colours, marker shapes and the density ramp (our own).
//! - [`density`]: hexagonal binning above [`density::DENSITY_THRESHOLD`] samples.
//! - [`labels`]: placement of sample labels and field names.
//! - [`overlay`]: the generic polygon and region layers.
//! - [`text`]: the embedded font, measured widths, safe strings, trade notation.
//! - [`export`]: PNG and PDF.
//!
//! Figures show data and published fields; reading a provenance from them supports, and never
//! replaces, petrographic judgement.
//!
//! # Example
//! ```
//! use provenance_core::counts::{Framework, Sample};
//! use provenance_core::diagram::Diagram;
//! use provenance_core::plot::{export, Figure, FigureOptions};
//! let mut b = Figure::builder(&[Diagram::Qfl], None);
//! b.push(&Sample::counted("KR-07", Framework { qm: 180.0, qp: 12.0, p: 52.0, k: 30.0, lv: 40.0, ..Default::default() }))?;
//! let svg = b.finish(FigureOptions::default()).to_svg()?;
//! let pdf = export::svg_to_pdf(&svg)?;
//! assert!(pdf.starts_with(b"%PDF-"));
//! # Ok::<(), provenance_core::error::Error>(())
//! ```

pub mod density;
pub mod export;
mod fields_layer;
pub mod figure;
mod group_layers;
pub mod labels;
pub mod layout;
pub mod mapping;
pub mod overlay;
mod painter;
pub mod palette;
mod render;
pub mod size;
pub mod svg;
pub mod text;

pub use fields_layer::choose_field_sets;
pub use figure::{
    DensityMode, Figure, FigureBuilder, FigureOptions, GridStep, GroupBy, Groups, Panel, PlotPoint,
};
pub use group_layers::group_overlays;
pub use mapping::{PagePoint, TernaryMapping};
pub use overlay::{LabelledPolygon, MeanMarker, PolygonLayer, Region, RegionKind, RegionLayer};
pub use palette::{MarkerShape, Rgb, Symbol, MAX_GROUPS};
pub use size::{FigureSize, FontSizes};
