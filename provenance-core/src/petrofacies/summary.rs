//! Statistics of one group of samples in one diagram.

use super::coordinates::Coordinates;
use super::homogeneity::Homogeneity;
use super::linalg::SymMatrix;
use super::regions::{RegionGap, Regions};
use super::sigma_polygon::SigmaPolygon;
use crate::composition::Composition3;
use crate::counts::{Counting, Sample};
use crate::diagram::Diagram;
use crate::logratio::{geometric_mean, ilr};
use crate::modes::DiagramMode;

/// One group in one diagram: centre, spread, regions and the pooling check.
///
/// Only samples with points in the diagram take part (`n` of them).
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::diagram::Diagram;
/// use provenance_core::petrofacies::DiagramSummary;
/// let s = |q, f, l| Sample::counted("x", Framework { qm: q, p: f, lv: l, ..Default::default() });
/// let group = [s(100.0, 100.0, 100.0), s(400.0, 100.0, 100.0), s(100.0, 400.0, 100.0), s(100.0, 100.0, 400.0)];
/// let refs: Vec<&Sample> = group.iter().collect();
/// let d = DiagramSummary::of(&refs, Diagram::Qfl, 0.95).unwrap();
/// assert_eq!(d.n, 4);
/// // Each pole's product is 4·10⁸ in every column: the geometric mean is the barycentre.
/// for v in d.mean.parts() { assert!((v - 100.0 / 3.0).abs() < 1e-9); }
/// // Pooled: 700, 700, 700 points.
/// for v in d.pooled.unwrap().parts() { assert!((v - 100.0 / 3.0).abs() < 1e-9); }
/// assert!(d.regions.is_ok());
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct DiagramSummary {
    /// The diagram.
    pub diagram: Diagram,
    /// Samples of the group with points in this diagram.
    pub n: usize,
    /// Points in the diagram summed over those samples; `None` when some sample's number of
    /// points is unknown.
    pub points: Option<f64>,
    /// The closed geometric mean of the zero-replaced compositions (Aitchison 1986), percent.
    pub mean: Composition3,
    /// The composition of the summed counts; `None` when some sample's points are unknown.
    pub pooled: Option<Composition3>,
    /// The mean ilr coordinates (the ilr of [`DiagramSummary::mean`]).
    pub ilr_mean: [f64; 2],
    /// The sample covariance (divisor n − 1) of the ilr coordinates; `None` for n < 2.
    pub ilr_covariance: Option<SymMatrix>,
    /// Confidence and prediction regions (Weltje 2002), or why there are none.
    pub regions: Result<Regions, RegionGap>,
    /// The arithmetic mean ± 1σ polygon; `None` for n < 2.
    pub sigma_polygon: Option<SigmaPolygon>,
    /// The χ² homogeneity check of the counts; `None` for n < 2 or unknown points.
    pub homogeneity: Option<Homogeneity>,
    /// Each sample's ilr coordinates, in group order (for comparisons between groups).
    pub coordinates: Vec<[f64; 2]>,
}

impl DiagramSummary {
    /// Summarise the samples of one group in `diagram`, regions at `level` (e.g. 0.95);
    /// `None` when no sample has points in the diagram.
    pub fn of(samples: &[&Sample], diagram: Diagram, level: f64) -> Option<DiagramSummary> {
        let modes: Vec<DiagramMode> = samples
            .iter()
            .filter_map(|s| DiagramMode::of(s, diagram))
            .collect();
        if modes.is_empty() {
            return None;
        }
        let coords: Vec<Coordinates> = modes.iter().map(Coordinates::of).collect();
        let props: Vec<Vec<f64>> = coords.iter().map(|c| c.proportions.to_vec()).collect();
        let g = geometric_mean(&props)?;
        let mean = Composition3::close([g[0], g[1], g[2]])?;
        let z = ilr(&g);
        let rows: Vec<Vec<f64>> = coords.iter().map(|c| c.ilr.to_vec()).collect();
        let cov = SymMatrix::covariance(&rows);
        let regions = match &cov {
            Some(c) => Regions::new([z[0], z[1]], c, modes.len(), level),
            None => Err(RegionGap::TooFewSamples),
        };
        let known = samples
            .iter()
            .filter(|s| DiagramMode::of(s, diagram).is_some())
            .all(|s| s.counting != Counting::Unknown);
        let counts: Vec<[f64; 3]> = modes.iter().map(|m| m.amounts).collect();
        let summed = [0, 1, 2].map(|j| counts.iter().map(|c| c[j]).sum::<f64>());
        let percent: Vec<[f64; 3]> = modes.iter().map(|m| m.percent.parts()).collect();
        Some(DiagramSummary {
            diagram,
            n: modes.len(),
            points: known.then(|| summed.iter().sum()),
            mean,
            pooled: if known {
                Composition3::close(summed)
            } else {
                None
            },
            ilr_mean: [z[0], z[1]],
            ilr_covariance: cov,
            regions,
            sigma_polygon: SigmaPolygon::of(&percent),
            homogeneity: if known {
                Homogeneity::of(&counts)
            } else {
                None
            },
            coordinates: coords.iter().map(|c| c.ilr).collect(),
        })
    }
}

/// Every diagram's statistics of one group.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::diagram::Diagram;
/// use provenance_core::petrofacies::GroupSummary;
/// let s = Sample::counted("x", Framework { qm: 100.0, p: 50.0, ..Default::default() });
/// let g = GroupSummary::of("Upper", &[&s], 0.95);
/// assert_eq!(g.samples, 1);
/// assert!(g.get(Diagram::Qfl).is_some());
/// assert!(g.get(Diagram::Lmlvls).is_none()); // no lithics: no points in LmLvLs
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct GroupSummary {
    /// The group's name (the value of the grouping column).
    pub name: String,
    /// Samples in the group.
    pub samples: usize,
    /// One entry per diagram in [`Diagram::ALL`] order; `None` where no sample has points.
    pub diagrams: [Option<DiagramSummary>; 5],
}

impl GroupSummary {
    /// Summarise a group in every diagram.
    pub fn of(name: &str, samples: &[&Sample], level: f64) -> GroupSummary {
        GroupSummary {
            name: name.to_string(),
            samples: samples.len(),
            diagrams: Diagram::ALL.map(|d| DiagramSummary::of(samples, d, level)),
        }
    }

    /// The statistics in one diagram.
    pub fn get(&self, d: Diagram) -> Option<&DiagramSummary> {
        self.diagrams[d.index()].as_ref()
    }
}
