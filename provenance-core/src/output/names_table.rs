//! The `name` table: flat CSV, the JSON interface, and the plain-words explanation.

use super::number::{push_fixed, push_points, round, PERCENT_DECIMALS, RATIO_DECIMALS};
use super::push_csv_cell;
use crate::counts::{Counting, Sample};
use crate::naming::{Measure, Naming, NamingScheme, Poles, SchemeSet, Unit, Verdict};
use serde::ser::{SerializeMap, Serializer};
use serde::Serialize;
use std::fmt::Write as _;

fn measure_value(naming: &Naming, symbol: &str) -> Option<(f64, Unit)> {
    let m = naming.measure(symbol)?;
    m.value.map(|v| (v, m.unit))
}

fn decimals(unit: Unit) -> u32 {
    match unit {
        Unit::Percent => PERCENT_DECIMALS,
        Unit::Ratio => RATIO_DECIMALS,
    }
}

/// Flat CSV layout of the names table.
///
/// Per scheme, in order: `{id}` (the name, blank when there is none), `{id}_rule` (the rule
/// that fired, or the reason for a blank name), `{id}_subtype` and `{id}_subtype_rule` where
/// the scheme has a second level, one percent column per pole (`folk_Q`), and one column per
/// measure with `/` written `_` (`folk_F_R`). Metadata columns follow the sample id.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::naming::SchemeSet;
/// use provenance_core::output::NamesTable;
/// let schemes = SchemeSet::standard();
/// let t = NamesTable { metadata: vec!["formation".into()], schemes: &schemes };
/// let h = t.header();
/// assert_eq!(&h[..6], ["sample", "formation", "folk", "folk_rule", "folk_subtype", "folk_subtype_rule"]);
/// assert!(h.contains(&"pettijohn_matrix".to_string()));
/// let mut s = Sample::counted("A", Framework { qm: 290.0, p: 10.0, ..Default::default() });
/// s.metadata = vec!["Upper".into()];
/// let mut row = Vec::new();
/// t.push_row(&mut row, &s, &schemes.classify(&s));
/// assert!(String::from_utf8(row).unwrap().starts_with("A,Upper,quartzarenite,"));
/// ```
pub struct NamesTable<'a> {
    /// Metadata column names, carried after the sample id.
    pub metadata: Vec<String>,
    /// The schemes, in column order.
    pub schemes: &'a SchemeSet,
}

impl NamesTable<'_> {
    /// Column names.
    pub fn header(&self) -> Vec<String> {
        let mut h = vec!["sample".to_string()];
        h.extend(self.metadata.iter().cloned());
        for s in self.schemes.iter() {
            let id = s.id();
            h.push(id.to_string());
            h.push(format!("{id}_rule"));
            if s.has_subtype() {
                h.push(format!("{id}_subtype"));
                h.push(format!("{id}_subtype_rule"));
            }
            for p in s.pole_symbols() {
                h.push(format!("{id}_{p}"));
            }
            for m in s.measure_symbols() {
                h.push(format!("{id}_{}", m.replace('/', "_")));
            }
        }
        h
    }

    /// The header as one CSV line.
    pub fn push_header(&self, buf: &mut Vec<u8>) {
        for (i, h) in self.header().iter().enumerate() {
            if i > 0 {
                buf.push(b',');
            }
            push_csv_cell(buf, h);
        }
        buf.push(b'\n');
    }

    /// One sample's row, ending in a newline; `namings` in the order of the schemes.
    pub fn push_row(&self, buf: &mut Vec<u8>, sample: &Sample, namings: &[Naming]) {
        push_csv_cell(buf, &sample.id);
        for v in &sample.metadata {
            buf.push(b',');
            push_csv_cell(buf, v);
        }
        for (s, n) in self.schemes.iter().zip(namings) {
            push_verdict_cells(buf, &n.verdict);
            if s.has_subtype() {
                match &n.subtype {
                    Some(v) => push_verdict_cells(buf, v),
                    None => buf.extend_from_slice(b",,"),
                }
            }
            for i in 0..3 {
                buf.push(b',');
                if let Some(p) = &n.poles {
                    push_fixed(buf, p.parts[i].percent, PERCENT_DECIMALS);
                }
            }
            for m in s.measure_symbols() {
                buf.push(b',');
                if let Some((v, unit)) = measure_value(n, m) {
                    push_fixed(buf, v, decimals(unit));
                }
            }
        }
        buf.push(b'\n');
    }
}

fn push_verdict_cells(buf: &mut Vec<u8>, v: &Verdict) {
    buf.push(b',');
    if let Some(name) = v.name() {
        push_csv_cell(buf, name);
    }
    buf.push(b',');
    push_csv_cell(buf, v.explanation());
}

struct VerdictJson<'a>(&'a Verdict);

impl Serialize for VerdictJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut m = s.serialize_map(Some(3))?;
        verdict_entries(&mut m, self.0)?;
        m.end()
    }
}

/// `name`, `rule` and `reason`, with null for the ones that do not apply.
fn verdict_entries<M: SerializeMap>(m: &mut M, v: &Verdict) -> Result<(), M::Error> {
    m.serialize_entry("name", &v.name())?;
    match v {
        Verdict::Named { rule, .. } => {
            m.serialize_entry("rule", rule)?;
            m.serialize_entry("reason", &None::<()>)
        }
        Verdict::Unnamed { reason } => {
            m.serialize_entry("rule", &None::<()>)?;
            m.serialize_entry("reason", reason)
        }
    }
}

/// An amount: an integer in JSON when whole, else rounded to two decimals.
fn amount_json(x: f64) -> serde_json::Value {
    if x.fract() == 0.0 && (0.0..9e15).contains(&x) {
        serde_json::Value::from(x as u64)
    } else {
        serde_json::Value::from(round(x, PERCENT_DECIMALS))
    }
}

#[derive(Serialize)]
struct PoleJson<'a> {
    percent: f64,
    amount: serde_json::Value,
    categories: Vec<&'a str>,
}

struct PolesJson<'a>(&'a Poles);

impl Serialize for PolesJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut m = s.serialize_map(Some(3))?;
        for p in &self.0.parts {
            let categories: Vec<&str> = p.categories.iter().map(|c| c.symbol()).collect();
            let pole = PoleJson {
                percent: round(p.percent, PERCENT_DECIMALS),
                amount: amount_json(p.amount),
                categories,
            };
            m.serialize_entry(p.symbol, &pole)?;
        }
        m.end()
    }
}

struct MeasuresJson<'a>(&'a [Measure]);

impl Serialize for MeasuresJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut m = s.serialize_map(Some(self.0.len()))?;
        for x in self.0 {
            m.serialize_entry(x.symbol, &x.value.map(|v| round(v, decimals(x.unit))))?;
        }
        m.end()
    }
}

struct BasisJson<'a>(&'a dyn NamingScheme, &'a Naming);

impl Serialize for BasisJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let (scheme, n) = (self.0, self.1);
        let mut m = s.serialize_map(None)?;
        m.serialize_entry("scheme", scheme.title())?;
        if let Some(chert) = scheme.chert() {
            m.serialize_entry("chert", &chert)?;
        }
        verdict_entries(&mut m, &n.verdict)?;
        m.serialize_entry("subtype", &n.subtype.as_ref().map(VerdictJson))?;
        m.serialize_entry("poles", &n.poles.as_ref().map(PolesJson))?;
        m.serialize_entry("measures", &MeasuresJson(&n.measures))?;
        m.end()
    }
}

/// One sample in the JSON interface of `name`:
/// `{"sample", "<scheme id>": name or null, …, "basis": {"<scheme id>": {…}}, "metadata": {…}}`.
///
/// Each basis entry holds `scheme` (author and year), `chert` (where chert went, for schemes
/// that let it move), `name`, `rule` (or `reason` when the name is null), `subtype` (second
/// level, or null), `poles` (`percent`, `amount`, `categories` per pole) and `measures`.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::naming::SchemeSet;
/// use provenance_core::output::NamesJson;
/// let schemes = SchemeSet::standard();
/// let s = Sample::counted("A", Framework { qm: 240.0, p: 40.0, lv: 20.0, ..Default::default() });
/// let namings = schemes.classify(&s);
/// let v = serde_json::to_value(NamesJson { sample: &s, namings: &namings, schemes: &schemes, metadata: &[] }).unwrap();
/// assert_eq!(v["folk"], "subarkose");
/// assert_eq!(v["pettijohn"], serde_json::Value::Null);
/// assert!(v["basis"]["pettijohn"]["reason"].as_str().unwrap().contains("matrix"));
/// assert_eq!(v["basis"]["folk"]["poles"]["Q"]["percent"], 80.0);
/// assert_eq!(v["basis"]["folk"]["poles"]["R"]["categories"], serde_json::json!(["C", "Lv", "Ls", "Lm"]));
/// ```
pub struct NamesJson<'a> {
    /// The sample.
    pub sample: &'a Sample,
    /// Its namings, in the order of `schemes`.
    pub namings: &'a [Naming],
    /// The schemes.
    pub schemes: &'a SchemeSet,
    /// Metadata column names, matching `sample.metadata`.
    pub metadata: &'a [String],
}

impl Serialize for NamesJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut map = s.serialize_map(None)?;
        map.serialize_entry("sample", &self.sample.id)?;
        for (scheme, n) in self.schemes.iter().zip(self.namings) {
            map.serialize_entry(scheme.id(), &n.name())?;
        }
        struct Basis<'a>(&'a SchemeSet, &'a [Naming]);
        impl Serialize for Basis<'_> {
            fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
                let mut m = s.serialize_map(None)?;
                for (scheme, n) in self.0.iter().zip(self.1) {
                    m.serialize_entry(scheme.id(), &BasisJson(scheme, n))?;
                }
                m.end()
            }
        }
        map.serialize_entry("basis", &Basis(self.schemes, self.namings))?;
        map.serialize_entry(
            "metadata",
            &crate::output::MetadataJson(self.metadata, &self.sample.metadata),
        )?;
        map.end()
    }
}

/// The opening lines of an explanation.
///
/// # Example
/// ```
/// assert!(provenance_core::output::names_table::EXPLAIN_PREAMBLE.contains("do not replace"));
/// ```
pub const EXPLAIN_PREAMBLE: &str = "Sandstone names by published rules, applied to the recalculated counts.\nEach rule is given as applied; the names support, and do not replace, the petrographer's\njudgement of the thin section.\n\n";

/// One sample's explanation in plain words: per scheme, the name, the recalculated poles with
/// the categories in each, and the rule behind the name (or the reason there is none).
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::naming::SchemeSet;
/// use provenance_core::output::names_table::push_explanation;
/// let schemes = SchemeSet::standard();
/// let s = Sample::counted("A", Framework { qm: 120.0, p: 30.0, lm: 150.0, ..Default::default() });
/// let mut buf = Vec::new();
/// push_explanation(&mut buf, &s, &schemes, &schemes.classify(&s));
/// let text = String::from_utf8(buf).unwrap();
/// /// assert!(text.contains("R 50.0% (C + Lv + Ls + Lm, 150 points)"));
/// assert!(text.contains("Folk (1980): litharenite; subtype phyllarenite"));
/// ```
pub fn push_explanation(
    buf: &mut Vec<u8>,
    sample: &Sample,
    schemes: &SchemeSet,
    namings: &[Naming],
) {
    let mut t = String::with_capacity(1024);
    if sample.line > 0 {
        let _ = writeln!(t, "{} (line {})", sample.id, sample.line);
    } else {
        let _ = writeln!(t, "{}", sample.id);
    }
    for (scheme, n) in schemes.iter().zip(namings) {
        let _ = write!(t, "  {}: {}", scheme.title(), n.name().unwrap_or("no name"));
        if let Some(sub) = n.subtype_name() {
            let _ = write!(t, "; subtype {sub}");
        }
        t.push('\n');
        if let Some(p) = &n.poles {
            let poles = p
                .parts
                .iter()
                .map(|x| {
                    let amount = match sample.counting {
                        Counting::Unknown => String::new(),
                        _ => {
                            let mut b = Vec::new();
                            push_points(&mut b, x.amount);
                            format!(", {} points", String::from_utf8_lossy(&b))
                        }
                    };
                    format!("{} {:.1}% ({}{amount})", x.symbol, x.percent, x.categories)
                })
                .collect::<Vec<_>>()
                .join(", ");
            let _ = write!(t, "    poles: {poles}");
            for m in &n.measures {
                match (m.value, m.unit) {
                    (Some(v), Unit::Percent) => {
                        let _ = write!(t, "; {} {v:.1}%", m.symbol);
                    }
                    (Some(v), Unit::Ratio) => {
                        let _ = write!(t, "; {} {v:.2}", m.symbol);
                    }
                    (None, _) => {
                        let _ = write!(t, "; {} undefined", m.symbol);
                    }
                }
            }
            t.push('\n');
        }
        match &n.verdict {
            Verdict::Named { rule, .. } => {
                let _ = writeln!(t, "    rule: {rule}");
            }
            Verdict::Unnamed { reason } => {
                let _ = writeln!(t, "    reason: {reason}");
            }
        }
        match &n.subtype {
            Some(Verdict::Named { rule, .. }) => {
                let _ = writeln!(t, "    subtype rule: {rule}");
            }
            Some(Verdict::Unnamed { reason }) => {
                let _ = writeln!(t, "    no subtype: {reason}");
            }
            None => {}
        }
    }
    buf.extend_from_slice(t.as_bytes());
}
