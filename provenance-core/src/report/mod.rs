//! The one-page report: every result for a count table as a self-contained HTML page (inline
//! CSS and SVG, no external requests), with the machine-readable tables beside it.

mod dir;
pub mod html;
mod sections;

pub use dir::{ReportFiles, MARKER};

use crate::counts::Sample;
use crate::error::{Error, Result};
use crate::fields::FieldSet;
use crate::input::CountReader;
use crate::modes::SampleModes;
use crate::naming::{Naming, SchemeSet};
use crate::output::{ModesJson, ModesTable, NamesJson, NamesTable};
use crate::setting::{Locator, SampleSetting, SettingJson, SettingTable};

/// A count table held in memory for reporting.
///
/// # Example
/// ```
/// use provenance_core::input::{CountReader, ReadOptions};
/// use provenance_core::report::Dataset;
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm,formation\nA,10,1,2,3,4,5,6,Upper\n";
/// let r = CountReader::from_reader("t.csv", t.as_bytes(), ReadOptions::default()).unwrap();
/// let d = Dataset::read(r).unwrap();
/// assert_eq!(d.samples.len(), 1);
/// assert_eq!(d.column("formation").unwrap(), vec!["Upper"]);
/// assert!(d.column("height").is_err());
/// ```
#[derive(Debug, Clone)]
pub struct Dataset {
    /// The input's name, as the user gave it.
    pub source: String,
    /// Metadata column names.
    pub metadata: Vec<String>,
    /// The samples, in table order.
    pub samples: Vec<Sample>,
}

impl Dataset {
    /// Read every sample of a table (refusing the table on the first bad row).
    pub fn read(reader: CountReader) -> Result<Dataset> {
        let source = reader.file().to_string();
        let metadata = reader.metadata_columns().to_vec();
        let samples = reader.collect::<Result<Vec<_>>>()?;
        Ok(Dataset {
            source,
            metadata,
            samples,
        })
    }

    /// The values of one metadata column (matched ignoring case), or a usage error naming the
    /// columns there are.
    pub fn column(&self, name: &str) -> Result<Vec<&str>> {
        let i = self
            .metadata
            .iter()
            .position(|m| m.eq_ignore_ascii_case(name.trim()))
            .ok_or_else(|| Error::Usage {
                message: format!(
                    "{}: no metadata column {name:?}, expected one of {:?}",
                    self.source, self.metadata
                ),
            })?;
        Ok(self
            .samples
            .iter()
            .map(|s| s.metadata[i].as_str())
            .collect())
    }
}

/// What the report should contain beyond the defaults.
///
/// # Example
/// ```
/// let o = provenance_core::report::ReportOptions { by: Some("formation".into()), ..Default::default() };
/// assert!(o.height.is_none());
/// ```
#[derive(Debug, Clone, Default)]
pub struct ReportOptions {
    /// Group samples by this metadata column.
    pub by: Option<String>,
    /// Stratigraphic height column for the up-section figure.
    pub height: Option<String>,
    /// Field sets (ids or files), at most one per diagram; empty: every embedded set.
    pub fields: Vec<String>,
}

/// Everything computed once for the report.
pub(crate) struct Computed<'a> {
    pub data: &'a Dataset,
    pub modes: Vec<SampleModes>,
    pub groups: Option<Vec<&'a str>>,
    pub schemes: SchemeSet,
    pub names: Vec<Vec<Naming>>,
    pub locator: Locator,
    pub settings: Vec<SampleSetting>,
}

impl Computed<'_> {
    /// Index of the locator's set for a diagram.
    pub fn set_index(&self, d: crate::diagram::Diagram) -> Option<usize> {
        self.locator.sets().iter().position(|s| s.diagram == d)
    }
}

/// The field sets a report uses: the named ones, or every embedded set.
fn locator(specs: &[String]) -> Result<Locator> {
    if specs.is_empty() {
        Locator::embedded()
    } else {
        Locator::new(
            specs
                .iter()
                .map(|s| FieldSet::load(s))
                .collect::<Result<_>>()?,
        )
    }
}

/// Build the report's files: `report.html`, `modes.csv`, `names.csv`, `setting.csv`,
/// `results.json`.
///
/// # Example
/// ```
/// use provenance_core::input::{CountReader, ReadOptions};
/// use provenance_core::report::{build, Dataset, ReportOptions};
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm\n<b>A</b>,10,1,2,3,4,5,6\n";
/// let r = CountReader::from_reader("t.csv", t.as_bytes(), ReadOptions::default()).unwrap();
/// let files = build(&Dataset::read(r).unwrap(), &ReportOptions::default()).unwrap();
/// let html = String::from_utf8(files.files()[0].1.clone()).unwrap();
/// assert!(html.contains("&lt;b&gt;A&lt;/b&gt;") && !html.contains("<b>A</b>"));
/// ```
pub fn build(data: &Dataset, options: &ReportOptions) -> Result<ReportFiles> {
    let groups = options.by.as_deref().map(|b| data.column(b)).transpose()?;
    if let Some(h) = options.height.as_deref() {
        data.column(h)?;
    }
    let schemes = SchemeSet::standard();
    let locator = locator(&options.fields)?;
    let c = Computed {
        data,
        modes: data.samples.iter().map(SampleModes::of).collect(),
        groups,
        names: data.samples.iter().map(|s| schemes.classify(s)).collect(),
        settings: data.samples.iter().map(|s| locator.locate(s)).collect(),
        schemes,
        locator,
    };
    let mut files = ReportFiles::default();
    files.add("report.html", sections::page(&c, options).into_bytes());
    files.add("modes.csv", modes_csv(&c));
    files.add("names.csv", names_csv(&c));
    files.add("setting.csv", setting_csv(&c));
    files.add("results.json", results_json(&c)?);
    Ok(files)
}

fn modes_csv(c: &Computed) -> Vec<u8> {
    let t = ModesTable {
        metadata: c.data.metadata.clone(),
        intervals: true,
    };
    let mut buf = Vec::new();
    t.push_header(&mut buf);
    for (s, m) in c.data.samples.iter().zip(&c.modes) {
        t.push_row(&mut buf, s, m);
    }
    buf
}

fn names_csv(c: &Computed) -> Vec<u8> {
    let t = NamesTable {
        metadata: c.data.metadata.clone(),
        schemes: &c.schemes,
    };
    let mut buf = Vec::new();
    t.push_header(&mut buf);
    for (s, n) in c.data.samples.iter().zip(&c.names) {
        t.push_row(&mut buf, s, n);
    }
    buf
}

fn setting_csv(c: &Computed) -> Vec<u8> {
    let t = SettingTable {
        metadata: c.data.metadata.clone(),
        locator: &c.locator,
    };
    let mut buf = Vec::new();
    t.push_header(&mut buf);
    for (s, st) in c.data.samples.iter().zip(&c.settings) {
        t.push_row(&mut buf, s, st);
    }
    buf
}

fn results_json(c: &Computed) -> Result<Vec<u8>> {
    let modes: Vec<ModesJson> = c
        .data
        .samples
        .iter()
        .zip(&c.modes)
        .map(|(s, m)| ModesJson {
            sample: s,
            modes: m,
            metadata: &c.data.metadata,
        })
        .collect();
    let names: Vec<NamesJson> = c
        .data
        .samples
        .iter()
        .zip(&c.names)
        .map(|(s, n)| NamesJson {
            sample: s,
            namings: n,
            schemes: &c.schemes,
            metadata: &c.data.metadata,
        })
        .collect();
    let setting: Vec<SettingJson> = c
        .data
        .samples
        .iter()
        .zip(&c.settings)
        .map(|(s, st)| SettingJson {
            sample: s,
            setting: st,
            locator: &c.locator,
            metadata: &c.data.metadata,
        })
        .collect();
    let doc = serde_json::json!({
        "source": c.data.source,
        "generator": format!("sandprov {}", env!("CARGO_PKG_VERSION")),
        "samples": c.data.samples.len(),
        "caution": sections::CAUTION,
        "modes": modes,
        "names": names,
        "setting": setting,
    });
    serde_json::to_vec_pretty(&doc).map_err(|e| Error::Usage {
        message: format!("results.json could not be serialised: {e}"),
    })
}
