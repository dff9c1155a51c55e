//! The one-page report: every result for a count table as a self-contained HTML page (inline
//! CSS and SVG, no external requests), with the machine-readable tables beside it.
//!
//! With a classifier ([`ReportOptions::model`]) the report adds its most likely class and all
//! class probabilities per sample, compared with the field placement, and the model's method
//! note; `classifier.csv` holds the same per sample, and `setting.csv` and `results.json`
//! carry the probabilities as `sandprov setting --model` writes them.

mod classifier;
mod dir;
mod figures;
pub mod html;
mod observe;
mod sections;

pub use dir::{ReportFiles, MARKER};
pub use observe::{Observer, Silent};

use crate::classifier::NamedModel;
use crate::error::{Error, Result};
use crate::fields::FieldSet;
use crate::modes::SampleModes;
use crate::naming::{Naming, SchemeSet};
use crate::output::changes_table::ChangesJson;
use crate::output::groups_table::GroupsJson;
use crate::output::{ModesJson, ModesTable, NamesJson, NamesTable};
use crate::petrofacies::{
    ChangeOptions, ChangePoints, GroupOptions, Ordering, Petrofacies, Section, Table,
};
use crate::setting::{Locator, SampleSetting, SettingJson, SettingTable};
use rayon::prelude::*;

/// What the report should contain beyond the defaults.
///
/// # Example
/// ```
/// use provenance_core::classifier::NamedModel;
/// let o = provenance_core::report::ReportOptions { by: Some("formation".into()), ..Default::default() };
/// assert!(o.height.is_none() && o.model.is_none());
/// let with_model = provenance_core::report::ReportOptions {
///     model: Some(NamedModel::resolve("dickinson1985-qfl", "2025-01-01")?),
///     ..o
/// };
/// assert_eq!(with_model.model.unwrap().model.classes.len(), 7);
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
#[derive(Debug, Clone, Default)]
pub struct ReportOptions {
    /// Group samples by this metadata column.
    pub by: Option<String>,
    /// Stratigraphic height column for the up-section figure.
    pub height: Option<String>,
    /// Field sets (ids or files), at most one per diagram; empty: every embedded set.
    pub fields: Vec<String>,
    /// A classifier to apply to every sample (see [`NamedModel::resolve`]). Its composition
    /// must have grains in at least one sample, or [`build`] refuses it.
    pub model: Option<NamedModel>,
}

/// Everything computed once for the report.
pub(crate) struct Computed<'a> {
    pub data: &'a Table,
    pub modes: Vec<SampleModes>,
    pub groups: Option<Vec<String>>,
    pub petrofacies: Option<Petrofacies>,
    pub section: Option<(Section, ChangePoints)>,
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

/// The field sets a report uses: the named ones, or every embedded set; membership under
/// counting error is always computed, with the default options, and the classifier if any.
fn locator(specs: &[String], model: Option<&NamedModel>) -> Result<Locator> {
    let l = if specs.is_empty() {
        Locator::embedded()?
    } else {
        Locator::new(
            specs
                .iter()
                .map(|s| FieldSet::load(s))
                .collect::<Result<_>>()?,
        )?
    };
    l.with_membership(
        crate::membership::MembershipOptions::default(),
        model.cloned(),
    )
}

/// Build the report's files: `report.html`, `modes.csv`, `names.csv`, `setting.csv`,
/// `results.json`, and `classifier.csv` with a model.
///
/// # Errors
/// Besides the table's own refusals, [`Error::Training`] naming the model when its
/// composition has no grains in any sample.
///
/// # Example
/// ```
/// use provenance_core::input::{CountReader, ReadOptions};
/// use provenance_core::petrofacies::Table;
/// use provenance_core::report::{build, ReportOptions};
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm\n<b>A</b>,10,1,2,3,4,5,6\n";
/// let r = CountReader::from_reader("t.csv", t.as_bytes(), ReadOptions::default()).unwrap();
/// let files = build(&Table::read(r).unwrap(), &ReportOptions::default()).unwrap();
/// let html = String::from_utf8(files.files()[0].1.clone()).unwrap();
/// assert!(html.contains("&lt;b&gt;A&lt;/b&gt;") && !html.contains("<b>A</b>"));
/// ```
pub fn build(data: &Table, options: &ReportOptions) -> Result<ReportFiles> {
    build_observed(data, options, &Silent)
}

/// [`build`], telling `observer` each step as it begins and each sample placed in the fields
/// (the long step on a large table). Samples are placed in parallel; the files are the same.
///
/// # Example
/// ```
/// use provenance_core::input::{CountReader, ReadOptions};
/// use provenance_core::petrofacies::Table;
/// use provenance_core::report::{build_observed, Observer, ReportOptions};
/// use std::sync::Mutex;
/// struct Log(Mutex<Vec<(String, u64)>>);
/// impl Observer for Log {
///     fn step(&self, name: &str, total: u64) {
///         self.0.lock().unwrap().push((name.to_string(), total));
///     }
///     fn advance(&self, _n: u64) {}
/// }
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm\nA,10,1,2,3,4,5,6\nB,5,1,2,3,4,5,6\n";
/// let r = CountReader::from_reader("t.csv", t.as_bytes(), ReadOptions::default()).unwrap();
/// let log = Log(Mutex::new(Vec::new()));
/// build_observed(&Table::read(r).unwrap(), &ReportOptions::default(), &log).unwrap();
/// let steps = log.0.into_inner().unwrap();
/// assert!(steps.contains(&("placing samples in the fields".to_string(), 2)));
/// ```
pub fn build_observed(
    data: &Table,
    options: &ReportOptions,
    observer: &dyn Observer,
) -> Result<ReportFiles> {
    let n = data.samples.len() as u64;
    observer.step("grouping and ordering the samples", 0);
    let by = options.by.as_deref().map(|b| data.column(b)).transpose()?;
    let groups = by
        .as_ref()
        .map(|b| {
            data.samples
                .iter()
                .map(|s| b.group_name(data, s))
                .collect::<Result<Vec<_>>>()
        })
        .transpose()?;
    let petrofacies = by
        .as_ref()
        .map(|b| Petrofacies::of(data, b, GroupOptions::default()))
        .transpose()?;
    let section = match options.height.as_deref() {
        None => None,
        Some(h) => {
            let position = data.column(h)?;
            let mut section = Section::of(data, &position, Ordering::Height, by.as_ref())?;
            let l = Locator::embedded()?
                .with_membership(crate::membership::MembershipOptions::default(), None)?;
            section.fill_membership(&l, crate::diagram::Diagram::Qfl);
            let changes = ChangePoints::of_section(&section, &ChangeOptions::default())?;
            Some((section, changes))
        }
    };
    let schemes = SchemeSet::standard();
    let locator = locator(&options.fields, options.model.as_ref())?;
    observer.step("recalculating modes and naming the samples", 0);
    let modes = data.samples.iter().map(SampleModes::of).collect();
    let names = data.samples.iter().map(|s| schemes.classify(s)).collect();
    observer.step("placing samples in the fields", n);
    let settings = data
        .samples
        .par_chunks(observe::CHUNK)
        .flat_map_iter(|chunk| {
            let placed: Vec<SampleSetting> = chunk.iter().map(|s| locator.locate(s)).collect();
            observer.advance(chunk.len() as u64);
            placed
        })
        .collect();
    let c = Computed {
        data,
        modes,
        groups,
        petrofacies,
        section,
        names,
        settings,
        schemes,
        locator,
    };
    classifier::check(&c)?;
    let verdicts = classifier::verdicts(&c);
    observer.step("drawing the figures and writing the tables", 0);
    let figs = figures::figures(&c, options.by.as_deref())?;
    let mut files = ReportFiles::default();
    files.add(
        "report.html",
        sections::page(&c, options, &figs, verdicts.as_ref()).into_bytes(),
    );
    for f in &figs {
        files.add(format!("figures/{}", f.file), f.svg.clone().into_bytes());
    }
    files.add("modes.csv", modes_csv(&c));
    files.add("names.csv", names_csv(&c));
    files.add("setting.csv", setting_csv(&c));
    if let Some(v) = &verdicts {
        files.add("classifier.csv", classifier::csv(&c, v));
    }
    files.add("results.json", results_json(&c, verdicts.as_ref())?);
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

fn results_json(c: &Computed, verdicts: Option<&classifier::Verdicts>) -> Result<Vec<u8>> {
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
    // Serialised as it stands, not through a `serde_json::Value` tree: on 20,000 samples the
    // whole run peaked at 3.7 GB resident with the tree and 1.3 GB without. The groups and
    // change points use the serialisers of the `groups` and `section` commands' JSON.
    let doc = ResultsDoc {
        caution: sections::CAUTION,
        changes: c.section.as_ref().map(|(_, ch)| ChangesJson(ch)),
        classifier: verdicts.map(|v| classifier::json(c, v)),
        generator: format!("sandprov {}", env!("CARGO_PKG_VERSION")),
        groups: c.petrofacies.as_ref().map(GroupsJson),
        modes,
        names,
        samples: c.data.samples.len(),
        setting,
        source: &c.data.file,
    };
    serde_json::to_vec_pretty(&doc).map_err(|e| Error::Usage {
        message: format!("results.json could not be serialised: {e}"),
    })
}

/// The whole of results.json.
#[derive(serde::Serialize)]
struct ResultsDoc<'a> {
    caution: &'a str,
    changes: Option<ChangesJson<'a>>,
    classifier: Option<serde_json::Value>,
    generator: String,
    groups: Option<GroupsJson<'a>>,
    modes: Vec<ModesJson<'a>>,
    names: Vec<NamesJson<'a>>,
    samples: usize,
    setting: Vec<SettingJson<'a>>,
    source: &'a str,
}
