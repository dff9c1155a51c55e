//! Petrofacies group means and their regions as figure overlays.

use super::overlay::{MeanMarker, Region, RegionKind, RegionLayer};
use crate::diagram::Diagram;
use crate::geometry::Polygon;
use crate::petrofacies::GroupSummary;

/// The mean markers and regions of `groups` on one diagram: each group's closed geometric mean,
/// its confidence region of the mean (solid) and its prediction region for a new sample
/// (dashed), both from Hotelling's T² in ilr space (Weltje 2002). `index_of` maps a group
/// name to the figure's group index (for colour and symbol); groups it does not know are
/// skipped. Groups too small for regions get only their mean.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::diagram::Diagram;
/// use provenance_core::petrofacies::GroupSummary;
/// use provenance_core::plot::group_overlays;
/// let s: Vec<Sample> = (0..6)
///     .map(|i| Sample::counted(format!("s{i}"), Framework { qm: 200.0 + 10.0 * i as f64, p: 60.0, lv: 40.0 + 5.0 * (i % 3) as f64, ls: 20.0, ..Default::default() }))
///     .collect();
/// let refs: Vec<&Sample> = s.iter().collect();
/// let g = GroupSummary::of("Upper", &refs, 0.95);
/// let (means, regions) = group_overlays(Diagram::Qfl, &[g], |n| (n == "Upper").then_some(0), 0.95);
/// assert_eq!(means.len(), 1);
/// assert_eq!(regions.regions.len(), 2);
/// ```
pub fn group_overlays(
    diagram: Diagram,
    groups: &[GroupSummary],
    index_of: impl Fn(&str) -> Option<usize>,
    level: f64,
) -> (Vec<MeanMarker>, RegionLayer) {
    let mut means = Vec::new();
    let mut regions = Vec::new();
    for g in groups {
        let (Some(i), Some(d)) = (index_of(&g.name), g.get(diagram)) else {
            continue;
        };
        means.push(MeanMarker {
            group: i,
            composition: d.mean,
        });
        if let Ok(r) = &d.regions {
            for (curve, kind) in [
                (&r.confidence, RegionKind::Confidence),
                (&r.prediction, RegionKind::Prediction),
            ] {
                regions.push(Region {
                    group: i,
                    outline: Polygon::new(curve.clone()),
                    kind,
                });
            }
        }
    }
    let layer = RegionLayer {
        source: Some(format!(
            "means: closed geometric; {:.0}% regions of the mean (solid) and for a new sample (dashed), Weltje (2002)",
            100.0 * level
        )),
        regions,
    };
    (means, layer)
}
