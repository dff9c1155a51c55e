//! Petrofacies group means and their regions as figure overlays.

use super::figure::FigureBuilder;
use super::overlay::PolygonLayer;
use super::overlay::{MeanMarker, Region, RegionKind, RegionLayer};
use crate::diagram::Diagram;
use crate::fields::FieldSet;
use crate::geometry::Polygon;
use crate::petrofacies::{GroupSummary, Petrofacies};

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
            "group means, {:.0}% regions (mean solid, new sample dashed): Weltje (2002)",
            100.0 * level
        )),
        regions,
    };
    (means, layer)
}

impl FigureBuilder {
    /// Draw `sets[i]` (when present) on panel `i`; see [`super::choose_field_sets`].
    ///
    /// # Example
    /// ```
    /// use provenance_core::diagram::Diagram;
    /// use provenance_core::plot::{choose_field_sets, Figure};
    /// let mut b = Figure::builder(&[Diagram::Qfl], None);
    /// b.draw_field_sets(&choose_field_sets(&[Diagram::Qfl], &[]).unwrap());
    /// assert_eq!(b.panels_mut()[0].fields.as_ref().unwrap().polygons.len(), 7);
    /// ```
    pub fn draw_field_sets(&mut self, sets: &[Option<FieldSet>]) {
        for (panel, set) in self.panels_mut().iter_mut().zip(sets) {
            panel.fields = set.as_ref().map(PolygonLayer::from_field_set);
        }
    }

    /// Draw every group's mean and regions (see [`group_overlays`]) on every panel. Call it
    /// after pushing the samples, so that group colours are known.
    ///
    /// # Example
    /// ```
    /// use provenance_core::diagram::Diagram;
    /// use provenance_core::petrofacies::{GroupOptions, Petrofacies};
    /// use provenance_core::plot::{Figure, GroupBy};
    /// let table = provenance_core::demo::dataset().unwrap();
    /// let by = table.column("formation").unwrap();
    /// let result = Petrofacies::of(&table, &by, GroupOptions::default()).unwrap();
    /// let group_by = GroupBy { file: table.file.clone(), column: "formation".into(), index: 0, file_column: 2 };
    /// let mut b = Figure::builder(&[Diagram::Qfl], Some(group_by));
    /// for s in &table.samples { b.push(s).unwrap(); }
    /// b.draw_group_means(&result);
    /// assert_eq!(b.panels_mut()[0].means.len(), 3);
    /// ```
    pub fn draw_group_means(&mut self, result: &Petrofacies) {
        let level = result.options.level;
        let overlays: Vec<_> = (0..self.panels_mut().len())
            .map(|i| {
                let d = self.panels_mut()[i].diagram;
                group_overlays(d, &result.groups, |name| self.group_index(name), level)
            })
            .collect();
        for (panel, (means, regions)) in self.panels_mut().iter_mut().zip(overlays) {
            panel.means = means;
            panel.regions = Some(regions);
        }
    }

    /// Draw, on every panel, each sample's 95% confidence region of its composition under
    /// counting error: the logistic-normal approximation of its Dirichlet posterior in ilr
    /// space (after Weltje 2002), as a closed curve in its group's colour. Samples whose number
    /// of points is unknown have none. Call it after pushing the samples. Returns how many
    /// regions were drawn.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Framework, Sample};
    /// use provenance_core::diagram::Diagram;
    /// use provenance_core::plot::Figure;
    /// let s = Sample::counted("A", Framework { qm: 240.0, p: 100.0, lv: 60.0, ..Default::default() });
    /// let mut b = Figure::builder(&[Diagram::Qfl], None);
    /// b.push(&s).unwrap();
    /// assert_eq!(b.draw_sample_regions(&[s], 0.95), 1);
    /// ```
    pub fn draw_sample_regions(&mut self, samples: &[crate::counts::Sample], level: f64) -> usize {
        use crate::membership::{ConfidenceRegion, Posterior};
        use crate::modes::DiagramMode;
        let mut drawn = 0;
        let groups: Vec<usize> = samples.iter().map(|s| self.known_group(s)).collect();
        for panel in self.panels_mut().iter_mut() {
            let mut regions = panel.regions.take().unwrap_or_default();
            for (s, g) in samples.iter().zip(&groups) {
                let Some(mode) = DiagramMode::of(s, panel.diagram) else {
                    continue;
                };
                let Some(post) = Posterior::of_mode(&mode) else {
                    continue;
                };
                if let Ok(r) = ConfidenceRegion::logistic_normal(&post, level) {
                    regions.regions.push(Region {
                        group: *g,
                        outline: Polygon::new(r.curve().to_vec()),
                        kind: RegionKind::Confidence,
                    });
                    drawn += 1;
                }
            }
            let note = format!("samples: {:.0}% counting-error regions", 100.0 * level);
            regions.source = Some(match regions.source.take() {
                Some(s) => format!("{s}; {note}"),
                None => note,
            });
            panel.regions = Some(regions);
        }
        drawn
    }
}
