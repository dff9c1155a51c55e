//! Samples in stratigraphic order: the input of change-point detection and the section figure.

use super::grouping::{MetaColumn, Table};
use crate::counts::Sample;
use crate::error::Result;
use crate::modes::SampleModes;
use serde::Serialize;

/// How the position column runs.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::Ordering;
/// assert!(Ordering::Height.up_section(10.0, 20.0));
/// assert!(Ordering::Depth.up_section(20.0, 10.0));
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Ordering {
    /// Stratigraphic height: larger is higher (younger).
    Height,
    /// Depth (a core or well): larger is deeper (older).
    Depth,
}

impl Ordering {
    /// True when position `b` lies above (up-section of) position `a`.
    pub fn up_section(self, a: f64, b: f64) -> bool {
        match self {
            Ordering::Height => b > a,
            Ordering::Depth => b < a,
        }
    }
}

/// One sample of a section.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::petrofacies::SectionSample;
/// let s = SectionSample::new(Sample::counted("a", Framework { qm: 10.0, ..Default::default() }), 12.0, None);
/// assert_eq!(s.position, 12.0);
/// assert!(s.membership.is_none());
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct SectionSample {
    /// The sample.
    pub sample: Sample,
    /// Its recalculated modes.
    pub modes: SampleModes,
    /// Height or depth, in the units of the table.
    pub position: f64,
    /// The group (`--by`), if any.
    pub group: Option<String>,
    /// Setting membership for the stacked bar: (setting name, probability) pairs summing to 1,
    /// from the likelihoods of the sample (filled by the caller when available).
    pub membership: Option<Vec<(String, f64)>>,
}

impl SectionSample {
    /// A section sample without membership.
    pub fn new(sample: Sample, position: f64, group: Option<String>) -> SectionSample {
        SectionSample {
            modes: SampleModes::of(&sample),
            sample,
            position,
            group,
            membership: None,
        }
    }
}

/// The samples of a section, ordered up-section (oldest first).
///
/// # Example
/// ```
/// use provenance_core::input::CountReader;
/// use provenance_core::petrofacies::{Ordering, Section, Table};
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm,depth\nA,1,1,1,1,1,1,1,5\nB,1,1,1,1,1,1,1,9\n";
/// let table = Table::read(CountReader::from_reader("t.csv", t.as_bytes(), Default::default())?)?;
/// let s = Section::of(&table, &table.column("depth")?, Ordering::Depth, None)?;
/// assert_eq!(s.samples[0].sample.id, "B"); // deepest first
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Section {
    /// The position column's header.
    pub axis: String,
    /// Height or depth.
    pub ordering: Ordering,
    /// The grouping column's header, if grouped.
    pub by: Option<String>,
    /// Samples, up-section order; ties keep file order.
    pub samples: Vec<SectionSample>,
}

impl Section {
    /// Build the section from a table: positions from `position` (every sample needs a number
    /// there), groups from `by`.
    pub fn of(
        table: &Table,
        position: &MetaColumn,
        ordering: Ordering,
        by: Option<&MetaColumn>,
    ) -> Result<Section> {
        let mut samples = Vec::with_capacity(table.samples.len());
        for s in &table.samples {
            let pos = position.number(table, s)?;
            let group = by.map(|b| b.group_name(table, s)).transpose()?;
            samples.push(SectionSample::new(s.clone(), pos, group));
        }
        // total_cmp orders every finite value; the sort is stable, so ties keep file order.
        match ordering {
            Ordering::Height => samples.sort_by(|a, b| a.position.total_cmp(&b.position)),
            Ordering::Depth => samples.sort_by(|a, b| b.position.total_cmp(&a.position)),
        }
        Ok(Section {
            axis: position.name().to_string(),
            ordering,
            by: by.map(|b| b.name().to_string()),
            samples,
        })
    }

    /// Runs of consecutive samples (up-section) sharing a group: (group, first, last index).
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Framework, Sample};
    /// use provenance_core::petrofacies::{Ordering, Section, SectionSample};
    /// let s = |g: &str, h| SectionSample::new(Sample::counted("x", Framework::default()), h, Some(g.into()));
    /// let sec = Section { axis: "h".into(), ordering: Ordering::Height, by: Some("fm".into()),
    ///     samples: vec![s("A", 1.0), s("A", 2.0), s("B", 3.0), s("A", 4.0)] };
    /// assert_eq!(sec.group_runs(), vec![("A".to_string(), 0, 1), ("B".into(), 2, 2), ("A".into(), 3, 3)]);
    /// ```
    pub fn group_runs(&self) -> Vec<(String, usize, usize)> {
        let mut runs: Vec<(String, usize, usize)> = Vec::new();
        for (i, s) in self.samples.iter().enumerate() {
            let Some(g) = &s.group else { continue };
            match runs.last_mut() {
                Some(last) if &last.0 == g && last.2 + 1 == i => last.2 = i,
                _ => runs.push((g.clone(), i, i)),
            }
        }
        runs
    }

    /// Group names in order of first appearance up-section.
    pub fn group_names(&self) -> Vec<String> {
        let mut names: Vec<String> = Vec::new();
        for s in &self.samples {
            if let Some(g) = &s.group {
                if !names.contains(g) {
                    names.push(g.clone());
                }
            }
        }
        names
    }
}
