//! What a figure shows: panels (one per diagram) with their samples and overlays, the groups
//! of the legend, and the drawing options.

use super::overlay::{MeanMarker, PolygonLayer, RegionLayer};
use super::palette::MAX_GROUPS;
use super::size::{FigureSize, FontSizes};
use crate::composition::Composition3;
use crate::counts::Sample;
use crate::diagram::Diagram;
use crate::error::{Error, Location, Result};
use crate::modes::DiagramMode;
use std::collections::HashMap;

/// One sample in one diagram.
///
/// # Example
/// ```
/// use provenance_core::composition::Composition3;
/// use provenance_core::plot::PlotPoint;
/// let p = PlotPoint { composition: Composition3::close([1.0, 1.0, 2.0]).unwrap(), group: 0, label: "S-1".into() };
/// assert_eq!(p.composition.part(2), 50.0);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct PlotPoint {
    /// The composition in the diagram's poles.
    pub composition: Composition3,
    /// The group (index into [`Groups::names`]).
    pub group: usize,
    /// The label drawn beside the marker when labels are on (normally the sample id).
    pub label: String,
}

/// One ternary diagram of a figure.
///
/// # Example
/// ```
/// use provenance_core::diagram::Diagram;
/// use provenance_core::plot::Panel;
/// let p = Panel::new(Diagram::Qmflt);
/// assert!(p.points.is_empty() && p.fields.is_none());
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Panel {
    /// The diagram.
    pub diagram: Diagram,
    /// The samples that have points in this diagram.
    pub points: Vec<PlotPoint>,
    /// Samples left out because the diagram has no points for them.
    pub without_points: usize,
    /// Labelled polygons under the samples (a field set), if any.
    pub fields: Option<PolygonLayer>,
    /// Regions around samples or group means, if any.
    pub regions: Option<RegionLayer>,
    /// Group means drawn as large markers.
    pub means: Vec<MeanMarker>,
}

impl Panel {
    /// An empty panel of `diagram`.
    pub fn new(diagram: Diagram) -> Panel {
        Panel {
            diagram,
            points: Vec::new(),
            without_points: 0,
            fields: None,
            regions: None,
            means: Vec::new(),
        }
    }
}

/// The groups of a figure, in legend order.
///
/// # Example
/// ```
/// use provenance_core::plot::Groups;
/// let g = Groups::default();
/// assert!(g.title.is_none() && g.names.is_empty());
/// ```
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Groups {
    /// The legend title (the grouping column); `None` when samples are not grouped.
    pub title: Option<String>,
    /// Group names, in order of first appearance.
    pub names: Vec<String>,
}

/// Ticks and grid lines every 10% or every 20%.
///
/// # Example
/// ```
/// use provenance_core::plot::GridStep;
/// assert_eq!(GridStep::Ten.percent(), 10.0);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum GridStep {
    /// Grid every 10%, tick values every 20%.
    #[default]
    Ten,
    /// Grid and tick values every 20%.
    Twenty,
}

impl GridStep {
    /// The grid spacing in percent.
    pub fn percent(self) -> f64 {
        match self {
            GridStep::Ten => 10.0,
            GridStep::Twenty => 20.0,
        }
    }
}

/// Markers or density shading.
///
/// # Example
/// ```
/// use provenance_core::plot::{DensityMode, density::DENSITY_THRESHOLD};
/// assert!(!DensityMode::Auto.shades(DENSITY_THRESHOLD));
/// assert!(DensityMode::Auto.shades(DENSITY_THRESHOLD + 1));
/// assert!(DensityMode::Always.shades(1));
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum DensityMode {
    /// Shade when a diagram holds more than [`super::density::DENSITY_THRESHOLD`] samples.
    #[default]
    Auto,
    /// Always draw markers.
    Never,
    /// Always shade.
    Always,
}

impl DensityMode {
    /// True when a diagram with `n` samples is shaded.
    pub fn shades(self, n: usize) -> bool {
        match self {
            DensityMode::Auto => n > super::density::DENSITY_THRESHOLD,
            DensityMode::Never => false,
            DensityMode::Always => n > 0,
        }
    }
}

/// How a figure is drawn.
///
/// # Example
/// ```
/// use provenance_core::plot::{FigureOptions, FigureSize};
/// let o = FigureOptions { size: FigureSize::DoubleColumn, labels: true, ..Default::default() };
/// assert!(o.labels);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct FigureOptions {
    /// The printed width.
    pub size: FigureSize,
    /// Font sizes in points.
    pub fonts: FontSizes,
    /// Grid spacing.
    pub grid: GridStep,
    /// Draw sample labels beside markers.
    pub labels: bool,
    /// Markers or density shading.
    pub density: DensityMode,
}

/// A figure: one or several ternary diagrams side by side with a shared legend.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::diagram::Diagram;
/// use provenance_core::plot::{Figure, FigureOptions};
/// let s = Sample::counted("S-1", Framework { qm: 200.0, p: 60.0, k: 20.0, lv: 20.0, ..Default::default() });
/// let mut b = Figure::builder(&[Diagram::Qfl, Diagram::Qmpk], None);
/// b.push(&s)?;
/// let fig = b.finish(FigureOptions::default());
/// assert_eq!(fig.panels.len(), 2);
/// assert!(fig.to_svg()?.contains("<svg"));
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Figure {
    /// The diagrams, left to right then top to bottom.
    pub panels: Vec<Panel>,
    /// The legend groups.
    pub groups: Groups,
    /// Drawing options.
    pub options: FigureOptions,
}

impl Figure {
    /// Collect samples into a figure of `diagrams`, grouped by a metadata column when
    /// `group_by` is given.
    pub fn builder(diagrams: &[Diagram], group_by: Option<GroupBy>) -> FigureBuilder {
        FigureBuilder {
            panels: diagrams.iter().map(|d| Panel::new(*d)).collect(),
            group_by,
            names: Vec::new(),
            index: HashMap::new(),
        }
    }
}

/// The metadata column that groups samples.
///
/// # Example
/// ```
/// use provenance_core::input::{CountReader, ReadOptions};
/// use provenance_core::plot::GroupBy;
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm,Formation\nA,1,1,1,1,1,1,1,Upper\n";
/// let r = CountReader::from_reader("t.csv", t.as_bytes(), ReadOptions::default())?;
/// let g = GroupBy::find(&r, "formation")?;
/// assert_eq!((g.column.as_str(), g.index, g.file_column), ("Formation", 0, 9));
/// assert!(GroupBy::find(&r, "height").is_err());
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct GroupBy {
    /// The input file, for messages.
    pub file: String,
    /// The column's header.
    pub column: String,
    /// The column's position among the reader's metadata columns (0-based).
    pub index: usize,
    /// The column's position in the file (1-based, as a spreadsheet counts).
    pub file_column: usize,
}

impl GroupBy {
    /// The metadata column of `reader` named `name`: an exact match first, then one that
    /// ignores case, spaces and underscores. Refused, with the metadata columns listed, when
    /// there is none.
    pub fn find(reader: &crate::input::CountReader, name: &str) -> Result<GroupBy> {
        let meta = reader.metadata_columns();
        let key = crate::counts::normalize_header(name);
        let index = meta
            .iter()
            .position(|m| m == name)
            .or_else(|| {
                meta.iter()
                    .position(|m| crate::counts::normalize_header(m) == key)
            })
            .ok_or_else(|| Error::Malformed {
                at: Location::new(reader.file()).line(1),
                message: format!("no metadata column {name:?} to group by"),
                expected: if meta.is_empty() {
                    "a table with a metadata column such as formation (this one has none)"
                        .to_string()
                } else {
                    format!("one of {meta:?}")
                },
            })?;
        let column = meta[index].clone();
        let file_column = reader
            .headers()
            .iter()
            .position(|h| *h == column)
            .map_or(0, |i| i + 1);
        Ok(GroupBy {
            file: reader.file().to_string(),
            column,
            index,
            file_column,
        })
    }
}

/// Name shown for samples whose grouping cell is empty.
pub const BLANK_GROUP: &str = "(blank)";

/// Collects samples into a [`Figure`]; see [`Figure::builder`].
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::diagram::Diagram;
/// use provenance_core::plot::{Figure, FigureOptions, GroupBy};
/// let by = GroupBy { file: "t.csv".into(), column: "unit".into(), index: 0, file_column: 10 };
/// let mut b = Figure::builder(&[Diagram::Lmlvls], Some(by));
/// let mut s = Sample::counted("A", Framework { qm: 10.0, lv: 5.0, ..Default::default() });
/// s.metadata = vec!["lower".into()];
/// b.push(&s)?;
/// // Lm = Ls = 0 but Lv > 0: the sample plots at the Lv pole.
/// assert_eq!(b.group_index("lower"), Some(0));
/// let fig = b.finish(FigureOptions::default());
/// assert_eq!(fig.groups.names, ["lower"]);
/// assert_eq!(fig.panels[0].points[0].composition.part(1), 100.0);
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
#[derive(Debug)]
pub struct FigureBuilder {
    panels: Vec<Panel>,
    group_by: Option<GroupBy>,
    names: Vec<String>,
    index: HashMap<String, usize>,
}

impl FigureBuilder {
    /// Add one sample to every panel where it has points.
    ///
    /// Refuses the sample (naming file, line and column) when its group would exceed
    /// [`MAX_GROUPS`] groups.
    pub fn push(&mut self, sample: &Sample) -> Result<()> {
        let group = self.group_of(sample)?;
        for panel in &mut self.panels {
            match DiagramMode::of(sample, panel.diagram) {
                Some(m) => panel.points.push(PlotPoint {
                    composition: m.percent,
                    group,
                    label: sample.id.clone(),
                }),
                None => panel.without_points += 1,
            }
        }
        Ok(())
    }

    /// The group index of an already pushed sample (0 when ungrouped or unknown).
    pub(crate) fn known_group(&self, sample: &Sample) -> usize {
        let Some(by) = &self.group_by else {
            return 0;
        };
        let value = sample
            .metadata
            .get(by.index)
            .map(|v| v.trim())
            .filter(|v| !v.is_empty())
            .unwrap_or(BLANK_GROUP);
        self.index.get(value).copied().unwrap_or(0)
    }

    fn group_of(&mut self, sample: &Sample) -> Result<usize> {
        let Some(by) = &self.group_by else {
            return Ok(0);
        };
        let value = sample
            .metadata
            .get(by.index)
            .map(|v| v.trim())
            .filter(|v| !v.is_empty())
            .unwrap_or(BLANK_GROUP);
        if let Some(i) = self.index.get(value) {
            return Ok(*i);
        }
        if self.names.len() >= MAX_GROUPS {
            return Err(Error::TooManyGroups {
                at: Location::new(by.file.clone())
                    .line(sample.line)
                    .column(crate::error::Column {
                        index: by.file_column,
                        name: by.column.clone(),
                    }),
                column: by.column.clone(),
                max: MAX_GROUPS,
            });
        }
        let i = self.names.len();
        self.names.push(value.to_string());
        self.index.insert(value.to_string(), i);
        Ok(i)
    }

    /// The panels collected so far (to attach fields, regions or means before finishing).
    pub fn panels_mut(&mut self) -> &mut [Panel] {
        &mut self.panels
    }

    /// Index of a group name, if a sample of that group was pushed.
    pub fn group_index(&self, name: &str) -> Option<usize> {
        self.index.get(name).copied()
    }

    /// The finished figure.
    pub fn finish(self, options: FigureOptions) -> Figure {
        let groups = match self.group_by {
            Some(by) => Groups {
                title: Some(by.column),
                names: self.names,
            },
            None => Groups::default(),
        };
        Figure {
            panels: self.panels,
            groups,
            options,
        }
    }
}
