//! The row layout of the `setting` table, as flat CSV and as JSON.
//!
//! JSON, one object per sample:
//! `{"sample": "…", "line": 2, "qfl": {…}, "qmflt": {…}, …, "caution": "…", "metadata": {…}}`,
//! one key per diagram that has a field set, each
//! `{"field": "craton interior" | null, "group": "continental block" | null,
//!   "boundary_distance": 4.2 | null, "nearest_field": null | "…", "reason": null | "…",
//!   "interpretation": {"provenance", "receiving_basins", "remark"} | null,
//!   "fields": "dickinson1985-qfl", "composition": {"Q": …, "F": …, "L": …} | null}`.
//!
//! CSV: `sample`, the metadata columns, then per diagram `{d}_field`, `{d}_group`,
//! `{d}_boundary_distance`, `{d}_nearest_field`, `{d}_provenance`, `{d}_receiving_basins`
//! (`; `-separated), `{d}_reason`, and last `caution`.
//!
//! With [`super::Likelihoods`] on the locator, each diagram's block and object also carry
//! membership, and each sample the provenance summary and classifier (see
//! [`super::likelihood`]).
//!
//! Later per-diagram keys go in
//! [`SettingTable::diagram_columns`] / [`SettingTable::push_diagram`] and in
//! `DiagramJson::serialize`, after the keys above.

use super::{reason, DiagramSetting, Locator, SampleSetting};
use crate::counts::Sample;
use crate::fields::{FieldSet, Placement, CAUTION};
use crate::output::number::{push_fixed, round, PERCENT_DECIMALS};
use crate::output::push_csv_cell;
use serde::ser::{SerializeMap, Serializer};
use serde::Serialize;

/// Distances as written: two decimals, like percentages.
fn r2(x: f64) -> f64 {
    round(x, PERCENT_DECIMALS)
}

/// The boundary distance of an entry: to the field's own boundary with other ground when
/// inside, to the nearest field when outside.
fn distance(p: &Placement) -> Option<f64> {
    match p {
        Placement::Inside {
            boundary_distance, ..
        } => *boundary_distance,
        Placement::Outside { nearest } => nearest.map(|n| n.1),
    }
}

fn nearest<'a>(set: &'a FieldSet, p: &Placement) -> Option<&'a str> {
    match p {
        Placement::Outside {
            nearest: Some((i, _)),
        } => set.fields.get(*i).map(|f| f.name.as_str()),
        _ => None,
    }
}

/// Flat CSV layout of the setting table.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::setting::{Locator, SettingTable};
/// let locator = Locator::embedded().unwrap();
/// let t = SettingTable { metadata: vec!["formation".into()], locator: &locator };
/// let h = t.header();
/// assert_eq!(&h[..4], ["sample", "formation", "qfl_field", "qfl_group"]);
/// assert_eq!(h.last().unwrap(), "caution");
/// let mut s = Sample::counted("A", Framework { qm: 380.0, qp: 5.0, p: 5.0, k: 5.0, lm: 5.0, ..Default::default() });
/// s.metadata = vec!["Upper".into()];
/// let mut row = Vec::new();
/// t.push_row(&mut row, &s, &locator.locate(&s));
/// assert!(String::from_utf8(row).unwrap().starts_with("A,Upper,craton interior,continental block,"));
/// ```
#[derive(Debug, Clone)]
pub struct SettingTable<'a> {
    /// Metadata column names, carried after the sample id.
    pub metadata: Vec<String>,
    /// The field sets looked up.
    pub locator: &'a Locator,
}

impl SettingTable<'_> {
    /// The column names of one diagram's block.
    ///
    /// # Example
    /// ```
    /// use provenance_core::setting::{Locator, SettingTable};
    /// let locator = Locator::embedded().unwrap();
    /// let t = SettingTable { metadata: vec![], locator: &locator };
    /// assert_eq!(t.diagram_columns(&locator.sets()[1])[0], "qmflt_field");
    /// ```
    pub fn diagram_columns(&self, set: &FieldSet) -> Vec<String> {
        let d = set.diagram.id();
        [
            "field",
            "group",
            "boundary_distance",
            "nearest_field",
            "provenance",
            "receiving_basins",
            "reason",
        ]
        .iter()
        .map(|c| format!("{d}_{c}"))
        .collect()
    }

    /// Column names.
    ///
    /// # Example
    /// ```
    /// use provenance_core::setting::{Locator, SettingTable};
    /// let locator = Locator::embedded().unwrap();
    /// let t = SettingTable { metadata: vec!["height".into()], locator: &locator };
    /// assert_eq!(t.header().len(), 2 + 4 * 7 + 1);
    /// ```
    pub fn header(&self) -> Vec<String> {
        let mut h = vec!["sample".to_string()];
        h.extend(self.metadata.iter().cloned());
        let likelihoods = self.locator.likelihoods();
        for set in self.locator.sets() {
            h.extend(self.diagram_columns(set));
            if let Some(l) = likelihoods {
                h.extend(l.diagram_columns(set));
            }
        }
        if let Some(l) = likelihoods {
            h.extend(l.sample_columns(self.locator.sets()));
        }
        h.push("caution".into());
        h
    }

    /// The header as one CSV line.
    ///
    /// # Example
    /// ```
    /// use provenance_core::setting::{Locator, SettingTable};
    /// let locator = Locator::embedded().unwrap();
    /// let mut buf = Vec::new();
    /// SettingTable { metadata: vec![], locator: &locator }.push_header(&mut buf);
    /// assert!(buf.starts_with(b"sample,qfl_field,") && buf.ends_with(b",caution\n"));
    /// ```
    pub fn push_header(&self, buf: &mut Vec<u8>) {
        for (i, h) in self.header().iter().enumerate() {
            if i > 0 {
                buf.push(b',');
            }
            push_csv_cell(buf, h);
        }
        buf.push(b'\n');
    }

    /// One diagram's cells, each preceded by a comma.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Framework, Sample};
    /// use provenance_core::fields::FieldSet;
    /// use provenance_core::setting::{Locator, SettingTable};
    /// let locator = Locator::new(vec![FieldSet::load("dickinson1985-qfl").unwrap()]).unwrap();
    /// let t = SettingTable { metadata: vec![], locator: &locator };
    /// let s = Sample::counted("B", Framework { lv: 100.0, ..Default::default() });
    /// let mut block = Vec::new();
    /// t.push_diagram(&mut block, &locator.sets()[0], &locator.locate(&s).diagrams[0]);
    /// assert!(block.starts_with(b",undissected arc,magmatic arc,"));
    /// ```
    pub fn push_diagram(&self, buf: &mut Vec<u8>, set: &FieldSet, d: &DiagramSetting) {
        let field = d
            .placement
            .and_then(|p| p.field())
            .and_then(|i| set.fields.get(i));
        buf.push(b',');
        if let Some(f) = field {
            push_csv_cell(buf, &f.name);
        }
        buf.push(b',');
        if let Some(f) = field {
            push_csv_cell(buf, f.group.name());
        }
        buf.push(b',');
        if let Some(x) = d.placement.as_ref().and_then(distance) {
            push_fixed(buf, x, PERCENT_DECIMALS);
        }
        buf.push(b',');
        if let Some(n) = d.placement.as_ref().and_then(|p| nearest(set, p)) {
            push_csv_cell(buf, n);
        }
        let interp = field.map(|f| f.interpretation());
        buf.push(b',');
        if let Some(i) = interp {
            push_csv_cell(buf, i.provenance);
        }
        buf.push(b',');
        if let Some(i) = interp {
            push_csv_cell(buf, &i.receiving_basins.join("; "));
        }
        buf.push(b',');
        if let Some(r) = reason(set.diagram, &set.id, d) {
            push_csv_cell(buf, &r);
        }
    }

    /// One sample's row, ending in a newline.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Framework, Sample};
    /// use provenance_core::fields::FieldSet;
    /// use provenance_core::setting::{Locator, SettingTable};
    /// let locator = Locator::new(vec![FieldSet::load("dickinson1985-qfl").unwrap()]).unwrap();
    /// let t = SettingTable { metadata: vec![], locator: &locator };
    /// let s = Sample::counted("B", Framework { lv: 100.0, ..Default::default() });
    /// let mut row = Vec::new();
    /// t.push_row(&mut row, &s, &locator.locate(&s));
    /// assert!(row.starts_with(b"B,undissected arc,magmatic arc,"));
    /// ```
    pub fn push_row(&self, buf: &mut Vec<u8>, sample: &Sample, setting: &SampleSetting) {
        push_csv_cell(buf, &sample.id);
        for v in &sample.metadata {
            buf.push(b',');
            push_csv_cell(buf, v);
        }
        let likely = self.locator.likelihoods().zip(setting.likelihood.as_ref());
        for (i, (set, d)) in self
            .locator
            .sets()
            .iter()
            .zip(&setting.diagrams)
            .enumerate()
        {
            self.push_diagram(buf, set, d);
            if let Some((l, sl)) = likely {
                l.push_diagram(buf, set, &sl.diagrams[i]);
            }
        }
        if let Some((l, sl)) = likely {
            l.push_sample(buf, self.locator.sets(), sl);
        }
        buf.push(b',');
        push_csv_cell(buf, CAUTION);
        buf.push(b'\n');
    }
}

struct DiagramJson<'a>(
    &'a FieldSet,
    &'a DiagramSetting,
    Option<(&'a super::Likelihoods, &'a super::DiagramLikelihood)>,
);

impl Serialize for DiagramJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let (set, d) = (self.0, self.1);
        let field = d
            .placement
            .and_then(|p| p.field())
            .and_then(|i| set.fields.get(i));
        let mut m = s.serialize_map(None)?;
        m.serialize_entry("field", &field.map(|f| &f.name))?;
        m.serialize_entry("group", &field.map(|f| f.group.name()))?;
        m.serialize_entry(
            "boundary_distance",
            &d.placement.as_ref().and_then(distance).map(r2),
        )?;
        m.serialize_entry(
            "nearest_field",
            &d.placement.as_ref().and_then(|p| nearest(set, p)),
        )?;
        m.serialize_entry("reason", &reason(set.diagram, &set.id, d))?;
        struct Interp(crate::fields::Interpretation);
        impl Serialize for Interp {
            fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
                let mut m = s.serialize_map(Some(3))?;
                m.serialize_entry("provenance", self.0.provenance)?;
                m.serialize_entry("receiving_basins", self.0.receiving_basins)?;
                m.serialize_entry("remark", self.0.remark)?;
                m.end()
            }
        }
        m.serialize_entry("interpretation", &field.map(|f| Interp(f.interpretation())))?;
        m.serialize_entry("fields", &set.id)?;
        struct Comp<'a>(&'a FieldSet, [f64; 3]);
        impl Serialize for Comp<'_> {
            fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
                let poles = self.0.diagram.poles();
                let mut m = s.serialize_map(Some(3))?;
                for (p, v) in poles.iter().zip(self.1) {
                    m.serialize_entry(p, &r2(v))?;
                }
                m.end()
            }
        }
        m.serialize_entry(
            "composition",
            &d.mode.map(|md| Comp(set, md.percent.parts())),
        )?;
        if let Some((l, dl)) = self.2 {
            l.write_diagram_entries(&mut m, set, dl)?;
        }
        m.end()
    }
}

/// One sample in the JSON layout of the setting table.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::setting::{Locator, SettingJson};
/// let locator = Locator::embedded().unwrap();
/// let s = Sample::counted("A", Framework { lv: 300.0, lm: 100.0, ..Default::default() });
/// let setting = locator.locate(&s);
/// let v = serde_json::to_value(SettingJson { sample: &s, setting: &setting, locator: &locator, metadata: &[] }).unwrap();
/// assert_eq!(v["qfl"]["composition"]["L"], 100.0);
/// assert_eq!(v["qfl"]["field"], "undissected arc");
/// assert_eq!(v["qmpk"]["field"], serde_json::Value::Null);
/// assert_eq!(v["qmpk"]["reason"], "no points in qmpk: Qm, P and K are all zero");
/// ```
pub struct SettingJson<'a> {
    /// The sample.
    pub sample: &'a Sample,
    /// Where it falls.
    pub setting: &'a SampleSetting,
    /// The field sets looked up.
    pub locator: &'a Locator,
    /// Metadata column names, matching `sample.metadata`.
    pub metadata: &'a [String],
}

impl Serialize for SettingJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut map = s.serialize_map(None)?;
        map.serialize_entry("sample", &self.sample.id)?;
        map.serialize_entry("line", &self.sample.line)?;
        let likely = self
            .locator
            .likelihoods()
            .zip(self.setting.likelihood.as_ref());
        for (i, (set, d)) in self
            .locator
            .sets()
            .iter()
            .zip(&self.setting.diagrams)
            .enumerate()
        {
            let extra = likely.map(|(l, sl)| (l, &sl.diagrams[i]));
            map.serialize_entry(set.diagram.id(), &DiagramJson(set, d, extra))?;
        }
        if let Some((l, sl)) = likely {
            l.write_sample_entries(&mut map, sl)?;
        }
        map.serialize_entry("caution", CAUTION)?;
        map.serialize_entry(
            "metadata",
            &crate::output::MetadataJson(self.metadata, &self.sample.metadata),
        )?;
        map.end()
    }
}
