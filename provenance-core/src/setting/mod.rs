//! Tectonic setting: where each sample falls in the provenance fields of each diagram that has
//! a field set, and what that field means for source and receiving basin.
//!
//! A [`Locator`] holds at most one [`FieldSet`] per diagram; [`Locator::locate`] gives a
//! [`SampleSetting`] per sample, and [`write_setting`] streams a whole table. The row layout
//! of the output (CSV and JSON) lives in [`table`].
//!
//! Field assignments and their interpretation support, and never replace, petrographic
//! judgement.
//!
//! # Example
//! ```
//! use provenance_core::counts::{Framework, Sample};
//! use provenance_core::setting::Locator;
//! let locator = Locator::embedded()?;
//! let s = Sample::counted("KR-01", Framework { qm: 380.0, qp: 5.0, p: 5.0, k: 5.0, lm: 5.0, ..Default::default() });
//! let setting = locator.locate(&s);
//! let qfl = &setting.diagrams[0];
//! assert_eq!(locator.field_name(0, qfl), Some("craton interior"));
//! # Ok::<(), provenance_core::error::Error>(())
//! ```

pub mod likelihood;
pub mod table;

use crate::counts::Sample;
use crate::diagram::Diagram;
use crate::error::{Error, Result};
use crate::fields::{embedded, FieldSet, Placement};
use crate::input::CountReader;
use crate::modes::DiagramMode;
use crate::output::Format;
use std::io::Write;

pub use likelihood::{
    ClassifierResult, DiagramLikelihood, Likelihoods, NamedModel, SampleLikelihood,
};
pub use table::{SettingJson, SettingTable};

/// One sample on one diagram.
///
/// # Example
/// ```
/// use provenance_core::setting::DiagramSetting;
/// let d = DiagramSetting { mode: None, placement: None };
/// assert!(d.placement.is_none());
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct DiagramSetting {
    /// The recalculated mode; `None` when the diagram has no points.
    pub mode: Option<DiagramMode>,
    /// Where the composition falls; `None` when the diagram has no points.
    pub placement: Option<Placement>,
}

/// One sample on every diagram of a [`Locator`], in the locator's order.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::setting::Locator;
/// let l = Locator::embedded().unwrap();
/// let s = l.locate(&Sample::counted("a", Framework { qm: 300.0, ..Default::default() }));
/// assert_eq!(s.diagrams.len(), l.sets().len());
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct SampleSetting {
    /// One entry per field set of the locator.
    pub diagrams: Vec<DiagramSetting>,
    /// Membership, group summary and classifier, when the locator has [`Likelihoods`].
    pub likelihood: Option<SampleLikelihood>,
}

/// Looks samples up in one field set per diagram.
///
/// # Example
/// ```
/// use provenance_core::fields::FieldSet;
/// use provenance_core::setting::Locator;
/// let qfl = FieldSet::load("dickinson1985-qfl").unwrap();
/// let again = qfl.clone();
/// assert!(Locator::new(vec![qfl, again]).is_err()); // two sets for one diagram
/// ```
#[derive(Debug, Clone)]
pub struct Locator {
    sets: Vec<FieldSet>,
    likelihoods: Option<Likelihoods>,
}

impl Locator {
    /// A locator over `sets`, ordered by diagram; refuses two sets for the same diagram.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Framework, Sample};
    /// use provenance_core::diagram::Diagram;
    /// use provenance_core::fields::FieldSet;
    /// use provenance_core::setting::Locator;
    /// let l = Locator::new(vec![FieldSet::load("dickinson1985-qmflt").unwrap(), FieldSet::load("dickinson1985-qfl").unwrap()]).unwrap();
    /// assert_eq!(l.sets()[0].diagram, Diagram::Qfl); // ordered by diagram
    /// let s = l.locate(&Sample::counted("a", Framework { qm: 40.0, qp: 40.0, ls: 20.0, ..Default::default() }));
    /// assert_eq!(l.field_name(0, &s.diagrams[0]), Some("recycled orogen"));
    /// ```
    pub fn new(mut sets: Vec<FieldSet>) -> Result<Locator> {
        sets.sort_by_key(|s| s.diagram);
        for w in sets.windows(2) {
            if w[0].diagram == w[1].diagram {
                return Err(Error::Usage {
                    message: format!(
                        "field sets {} and {} are both for the {} diagram, expected at most one set per diagram",
                        w[0].id, w[1].id, w[0].diagram
                    ),
                });
            }
        }
        Ok(Locator {
            sets,
            likelihoods: None,
        })
    }

    /// The same locator, also computing likelihoods (membership under counting error, the
    /// group summary and an optional classifier) for every sample.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Framework, Sample};
    /// use provenance_core::membership::MembershipOptions;
    /// use provenance_core::setting::Locator;
    /// let l = Locator::embedded()?.with_membership(MembershipOptions::default(), None)?;
    /// let f = Framework { qm: 388.0, qp: 4.0, c: 2.0, p: 3.0, k: 1.0, ls: 1.0, lm: 1.0, ..Default::default() };
    /// let s = l.locate(&Sample::counted("a", f));
    /// let m = s.likelihood.unwrap().diagrams[0].membership.clone().unwrap();
    /// assert!(m.probability(0) > 0.95); // craton interior
    /// # Ok::<(), provenance_core::error::Error>(())
    /// ```
    pub fn with_membership(
        mut self,
        options: crate::membership::MembershipOptions,
        classifier: Option<NamedModel>,
    ) -> Result<Locator> {
        self.likelihoods = Some(Likelihoods::new(&self.sets, options, classifier)?);
        Ok(self)
    }

    /// The likelihood settings, when present.
    pub fn likelihoods(&self) -> Option<&Likelihoods> {
        self.likelihoods.as_ref()
    }

    /// Every embedded set (one per diagram that has one), checked.
    ///
    /// # Example
    /// ```
    /// let l = provenance_core::setting::Locator::embedded().unwrap();
    /// assert_eq!(l.sets().len(), 4);
    /// ```
    pub fn embedded() -> Result<Locator> {
        let sets = embedded::ids()
            .into_iter()
            .map(FieldSet::load)
            .collect::<Result<Vec<_>>>()?;
        Locator::new(sets)
    }

    /// The field sets, in diagram order.
    ///
    /// # Example
    /// ```
    /// use provenance_core::diagram::Diagram;
    /// use provenance_core::fields::FieldSet;
    /// use provenance_core::setting::Locator;
    /// let l = Locator::new(vec![FieldSet::load("dickinson1985-qmflt").unwrap(), FieldSet::load("dickinson1985-qfl").unwrap()]).unwrap();
    /// assert_eq!(l.sets()[0].diagram, Diagram::Qfl); // ordered by diagram
    /// ```
    pub fn sets(&self) -> &[FieldSet] {
        &self.sets
    }

    /// Locate one sample on every diagram.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Framework, Sample};
    /// use provenance_core::setting::Locator;
    /// let l = Locator::embedded().unwrap();
    /// let s = l.locate(&Sample::counted("a", Framework { lv: 90.0, ls: 10.0, ..Default::default() }));
    /// assert!(s.diagrams[2].placement.is_none()); // QmPK: no Qm, P or K
    /// ```
    pub fn locate(&self, sample: &Sample) -> SampleSetting {
        let diagrams: Vec<DiagramSetting> = self
            .sets
            .iter()
            .map(|set| {
                let mode = DiagramMode::of(sample, set.diagram);
                let placement = mode.map(|m| set.locate(m.percent.parts()));
                DiagramSetting { mode, placement }
            })
            .collect();
        let likelihood = self.likelihoods.as_ref().map(|l| {
            let modes: Vec<Option<DiagramMode>> = diagrams.iter().map(|d| d.mode).collect();
            l.assess(&self.sets, sample, &modes)
        });
        SampleSetting {
            diagrams,
            likelihood,
        }
    }

    /// The name of the field entry `d` (of set `i`) falls in, if any.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Framework, Sample};
    /// use provenance_core::diagram::Diagram;
    /// use provenance_core::fields::FieldSet;
    /// use provenance_core::setting::Locator;
    /// let l = Locator::new(vec![FieldSet::load("dickinson1985-qmflt").unwrap(), FieldSet::load("dickinson1985-qfl").unwrap()]).unwrap();
    /// assert_eq!(l.sets()[0].diagram, Diagram::Qfl); // ordered by diagram
    /// let s = l.locate(&Sample::counted("a", Framework { qm: 40.0, qp: 40.0, ls: 20.0, ..Default::default() }));
    /// assert_eq!(l.field_name(0, &s.diagrams[0]), Some("recycled orogen"));
    /// ```
    pub fn field_name<'a>(&'a self, i: usize, d: &DiagramSetting) -> Option<&'a str> {
        let f = d.placement?.field()?;
        Some(self.sets.get(i)?.fields.get(f)?.name.as_str())
    }
}

/// Why a diagram's entry has no field, in words; `None` when it has one.
///
/// # Example
/// ```
/// use provenance_core::diagram::Diagram;
/// use provenance_core::setting::{reason, DiagramSetting};
/// let d = DiagramSetting { mode: None, placement: None };
/// assert_eq!(reason(Diagram::Qmpk, "dickinson-suczek1979-qmpk", &d).unwrap(), "no points in qmpk: Qm, P and K are all zero");
/// ```
pub fn reason(diagram: Diagram, set_id: &str, d: &DiagramSetting) -> Option<String> {
    match d.placement {
        None => {
            let p = diagram.poles();
            Some(format!(
                "no points in {diagram}: {}, {} and {} are all zero",
                p[0], p[1], p[2]
            ))
        }
        Some(Placement::Outside { .. }) => Some(format!("outside every field of {set_id}")),
        Some(Placement::Inside { .. }) => None,
    }
}

/// Write the setting table of every sample in `reader` to `out`, streaming (memory holds one
/// chunk of rows).
///
/// # Example
/// ```
/// use provenance_core::input::{CountReader, ReadOptions};
/// use provenance_core::output::Format;
/// use provenance_core::setting::{write_setting, Locator};
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm\nA,380,5,5,5,0,0,5\n";
/// let r = CountReader::from_reader("t.csv", t.as_bytes(), ReadOptions::default()).unwrap();
/// let mut out = Vec::new();
/// write_setting(r, &mut out, "out", &Locator::embedded().unwrap(), Format::Json).unwrap();
/// let v: serde_json::Value = serde_json::from_slice(&out).unwrap();
/// assert_eq!(v[0]["qfl"]["field"], "craton interior");
/// assert_eq!(v[0]["qfl"]["interpretation"]["provenance"], "stable craton");
/// ```
pub fn write_setting<W: Write + ?Sized>(
    reader: CountReader,
    out: &mut W,
    out_name: &str,
    locator: &Locator,
    format: Format,
) -> Result<usize> {
    let metadata = reader.metadata_columns().to_vec();
    match format {
        Format::Csv => {
            let table = SettingTable { metadata, locator };
            let mut header = Vec::new();
            table.push_header(&mut header);
            crate::batch::stream_rows(reader, out, out_name, &header, b"", b"", |s, buf| {
                table.push_row(buf, s, &locator.locate(s));
            })
        }
        Format::Json => {
            crate::batch::stream_rows(reader, out, out_name, b"[\n", b",\n", b"\n]\n", |s, buf| {
                let setting = locator.locate(s);
                let rec = SettingJson {
                    sample: s,
                    setting: &setting,
                    locator,
                    metadata: &metadata,
                };
                // Serializing maps of numbers and strings into memory cannot fail.
                let _ = serde_json::to_writer(&mut *buf, &rec);
            })
        }
    }
}
