//! Membership results as JSON entries and CSV columns, for the commands that report them.

use super::number::{push_fixed, round, PERCENT_DECIMALS, RATIO_DECIMALS};
use super::push_csv_cell;
use crate::membership::{ConfidenceRegion, Membership, Method, Regions, OUTSIDE};
use serde::ser::{SerializeMap, Serializer};
use serde::Serialize;

/// One diagram's membership in the JSON outputs.
///
/// [`MembershipJson::write_entries`] adds these keys to an existing object (the diagram's
/// entry of a sample), and serializing the value alone gives an object with only them:
/// - `"membership"`: `{"field name": p, …, "outside": p}`, probabilities rounded to four
///   decimals; `null` when unavailable;
/// - `"top"`: `{"field": name or null for outside, "probability": p}`;
/// - `"ambiguous"`: true when the top probability is below the threshold;
/// - `"membership_error"`: `{"method": "sampled", "draws": N, "standard_error": se}`,
///   `{"method": "bound", "max_error": ε}` or `{"method": "integrated", "accuracy": 1e-6}`;
/// - `"region95"`: `{"level": 0.95, "centre": [a, b, c], "curve": [[a, b, c], …]}` in percent,
///   a closed curve whose last point repeats the first;
/// - `"membership_note"`: why membership is unavailable, when it is.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::membership::{ConfidenceRegion, Estimator, MembershipOptions, Posterior, AMBIGUOUS_BELOW};
/// use provenance_core::output::MembershipJson;
/// let cap = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
/// let set: [(&str, &Polygon); 1] = [("quartz-rich", &cap)];
/// let est = Estimator::new(&set[..], MembershipOptions::default()).unwrap();
/// let post = Posterior::jeffreys([330.0, 40.0, 30.0]).unwrap();
/// let m = est.estimate(&post, 0, 0);
/// let r = ConfidenceRegion::logistic_normal(&post, 0.95).unwrap();
/// let j = MembershipJson { regions: &set[..], membership: Some(&m), region: Some(&r), ambiguous_below: AMBIGUOUS_BELOW, note: None };
/// let v = serde_json::to_value(&j).unwrap();
/// assert_eq!(v["membership"]["quartz-rich"], 1.0);
/// assert_eq!(v["membership"]["outside"], 0.0);
/// assert_eq!(v["top"]["field"], "quartz-rich");
/// assert_eq!(v["ambiguous"], false);
/// assert_eq!(v["membership_error"]["method"], "bound");
/// assert_eq!(v["region95"]["curve"].as_array().unwrap().len(), 73);
/// ```
pub struct MembershipJson<'a, R: Regions + ?Sized> {
    /// The regions the probabilities refer to.
    pub regions: &'a R,
    /// The membership; `None` when unavailable.
    pub membership: Option<&'a Membership>,
    /// The confidence region, when computed.
    pub region: Option<&'a ConfidenceRegion>,
    /// The ambiguity threshold (see [`crate::membership::AMBIGUOUS_BELOW`]).
    pub ambiguous_below: f64,
    /// Why membership is unavailable (for example, points unknown).
    pub note: Option<&'a str>,
}

struct Probabilities<'a, R: Regions + ?Sized>(&'a R, &'a Membership);

impl<R: Regions + ?Sized> Serialize for Probabilities<'_, R> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut m = s.serialize_map(Some(self.0.len() + 1))?;
        for (i, p) in self.1.regions().iter().enumerate() {
            m.serialize_entry(self.0.name(i), &round(*p, RATIO_DECIMALS))?;
        }
        m.serialize_entry(OUTSIDE, &round(self.1.outside(), RATIO_DECIMALS))?;
        m.end()
    }
}

struct TopJson<'a>(Option<&'a str>, f64);

impl Serialize for TopJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut m = s.serialize_map(Some(2))?;
        m.serialize_entry("field", &self.0)?;
        m.serialize_entry("probability", &round(self.1, RATIO_DECIMALS))?;
        m.end()
    }
}

struct ErrorJson(Method, f64);

impl Serialize for ErrorJson {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut m = s.serialize_map(None)?;
        match self.0 {
            Method::Sampled { draws } => {
                m.serialize_entry("method", "sampled")?;
                m.serialize_entry("draws", &draws)?;
                m.serialize_entry("standard_error", &round(self.1, RATIO_DECIMALS))?;
            }
            Method::Bound { max_error } => {
                m.serialize_entry("method", "bound")?;
                m.serialize_entry("max_error", &max_error)?;
            }
            Method::Integrated => {
                m.serialize_entry("method", "integrated")?;
                m.serialize_entry("accuracy", &self.1)?;
            }
        }
        m.end()
    }
}

struct RegionJson<'a>(&'a ConfidenceRegion);

impl Serialize for RegionJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let r2 = |p: [f64; 3]| p.map(|v| round(v, PERCENT_DECIMALS));
        let curve: Vec<[f64; 3]> = self.0.curve().iter().map(|p| r2(*p)).collect();
        let mut m = s.serialize_map(Some(3))?;
        m.serialize_entry("level", &self.0.level())?;
        m.serialize_entry("centre", &r2(self.0.centre()))?;
        m.serialize_entry("curve", &curve)?;
        m.end()
    }
}

impl<R: Regions + ?Sized> MembershipJson<'_, R> {
    /// Write the entries into an open JSON object.
    pub fn write_entries<M: SerializeMap>(&self, map: &mut M) -> Result<(), M::Error> {
        match self.membership {
            Some(m) => {
                let top = m.top();
                map.serialize_entry("membership", &Probabilities(self.regions, m))?;
                map.serialize_entry(
                    "top",
                    &TopJson(top.region.map(|i| self.regions.name(i)), top.probability),
                )?;
                map.serialize_entry("ambiguous", &m.is_ambiguous(self.ambiguous_below))?;
                map.serialize_entry(
                    "membership_error",
                    &ErrorJson(m.method(), m.standard_error()),
                )?;
            }
            None => {
                map.serialize_entry("membership", &None::<()>)?;
                map.serialize_entry("top", &None::<()>)?;
                map.serialize_entry("ambiguous", &None::<()>)?;
                map.serialize_entry("membership_error", &None::<()>)?;
            }
        }
        map.serialize_entry("region95", &self.region.map(RegionJson))?;
        if let Some(note) = self.note {
            map.serialize_entry("membership_note", note)?;
        }
        Ok(())
    }
}

impl<R: Regions + ?Sized> Serialize for MembershipJson<'_, R> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut map = s.serialize_map(None)?;
        self.write_entries(&mut map)?;
        map.end()
    }
}

/// A field name as part of a CSV column name: lower case, runs of anything but letters and
/// digits turned into one underscore ("craton interior" → "craton_interior").
///
/// # Example
/// ```
/// assert_eq!(provenance_core::output::column_slug("Transitional  Arc (1985)"), "transitional_arc_1985");
/// ```
pub fn column_slug(name: &str) -> String {
    let mut out = String::new();
    for ch in name.chars().flat_map(char::to_lowercase) {
        if ch.is_alphanumeric() {
            out.push(ch);
        } else if !out.ends_with('_') && !out.is_empty() {
            out.push('_');
        }
    }
    while out.ends_with('_') {
        out.pop();
    }
    out
}

/// One diagram's membership as flat CSV columns:
/// `{diagram}_p_{field}` per field, `{diagram}_p_outside`, `{diagram}_top`, `{diagram}_top_p`,
/// `{diagram}_ambiguous` (`true`/`false`), all empty when membership is unavailable.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::membership::{Estimator, MembershipOptions, Posterior};
/// use provenance_core::output::MembershipColumns;
/// let cap = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
/// let set: [(&str, &Polygon); 1] = [("quartz rich", &cap)];
/// let cols = MembershipColumns::new("qfl", &set[..]);
/// assert_eq!(cols.header(), ["qfl_p_quartz_rich", "qfl_p_outside", "qfl_top", "qfl_top_p", "qfl_ambiguous"]);
/// let est = Estimator::new(&set[..], MembershipOptions::default()).unwrap();
/// let m = est.estimate(&Posterior::jeffreys([330.0, 40.0, 30.0]).unwrap(), 0, 0);
/// let mut row = Vec::new();
/// cols.push_cells(&mut row, Some(&m), 0.95);
/// assert_eq!(String::from_utf8(row).unwrap(), ",1.0000,0.0000,quartz rich,1.0000,false");
/// let mut empty = Vec::new();
/// cols.push_cells(&mut empty, None, 0.95);
/// assert_eq!(empty, b",,,,,");
/// ```
#[derive(Debug, Clone)]
pub struct MembershipColumns {
    prefix: String,
    names: Vec<String>,
}

impl MembershipColumns {
    /// Columns for a diagram id (`qfl`, …) and its regions.
    pub fn new<R: Regions + ?Sized>(prefix: &str, regions: &R) -> MembershipColumns {
        MembershipColumns {
            prefix: prefix.to_string(),
            names: (0..regions.len())
                .map(|i| regions.name(i).to_string())
                .collect(),
        }
    }

    /// Column names.
    pub fn header(&self) -> Vec<String> {
        let p = &self.prefix;
        let mut h: Vec<String> = self
            .names
            .iter()
            .map(|n| format!("{p}_p_{}", column_slug(n)))
            .collect();
        h.push(format!("{p}_p_outside"));
        h.push(format!("{p}_top"));
        h.push(format!("{p}_top_p"));
        h.push(format!("{p}_ambiguous"));
        h
    }

    /// Append the cells, each preceded by a comma.
    pub fn push_cells(&self, buf: &mut Vec<u8>, m: Option<&Membership>, ambiguous_below: f64) {
        let Some(m) = m else {
            buf.extend(std::iter::repeat_n(b',', self.names.len() + 4));
            return;
        };
        for p in m.regions() {
            buf.push(b',');
            push_fixed(buf, *p, RATIO_DECIMALS);
        }
        buf.push(b',');
        push_fixed(buf, m.outside(), RATIO_DECIMALS);
        let top = m.top();
        buf.push(b',');
        push_csv_cell(buf, top.region.map_or(OUTSIDE, |i| &self.names[i]));
        buf.push(b',');
        push_fixed(buf, top.probability, RATIO_DECIMALS);
        buf.push(b',');
        buf.extend_from_slice(if m.is_ambiguous(ambiguous_below) {
            b"true"
        } else {
            b"false"
        });
    }
}
