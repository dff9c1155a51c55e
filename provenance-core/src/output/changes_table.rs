//! Outputs of `section --changes`: the change points as JSON or CSV.
//!
//! JSON: `{"axis", "ordering", "diagrams", "n", "dimension", "penalty_factor", "penalty",
//! "min_segment", "covariance", "changes": [{"below": {"sample", "position"}, "above": {…},
//! "midpoint", "gain"}], "segments": [{"n", "from", "to", "means": {"qfl": {"Q", "F", "L"}}}],
//! "skipped", "note"}`. CSV: one row per change point.

use super::groups_table::csv_number;
use super::number::{round, PERCENT_DECIMALS};
use super::push_csv_cell;
use crate::petrofacies::{ChangePoints, Ordering};
use serde::ser::{SerializeMap, Serializer};
use serde::Serialize;

fn r2(x: f64) -> f64 {
    round(x, PERCENT_DECIMALS)
}

fn sig(x: f64) -> f64 {
    super::groups_table::significant(x, 6)
}

#[derive(Serialize)]
struct End<'a> {
    sample: &'a str,
    position: f64,
}

#[derive(Serialize)]
struct ChangeJson<'a> {
    below: End<'a>,
    above: End<'a>,
    midpoint: f64,
    gain: f64,
}

struct Means<'a>(&'a ChangePoints, &'a [crate::composition::Composition3]);

impl Serialize for Means<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut m = s.serialize_map(Some(self.1.len()))?;
        for (d, c) in self.0.options.diagrams.iter().zip(self.1) {
            struct P(crate::diagram::Diagram, crate::composition::Composition3);
            impl Serialize for P {
                fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
                    let mut m = s.serialize_map(Some(3))?;
                    for (k, v) in self.0.poles().iter().zip(self.1.parts()) {
                        m.serialize_entry(k, &r2(v))?;
                    }
                    m.end()
                }
            }
            m.serialize_entry(d.id(), &P(*d, *c))?;
        }
        m.end()
    }
}

#[derive(Serialize)]
struct SegmentJson<'a> {
    n: usize,
    from: f64,
    to: f64,
    means: Means<'a>,
}

/// The change points as the JSON document above.
///
/// # Example
/// ```
/// use provenance_core::output::changes_table::ChangesJson;
/// use provenance_core::petrofacies::{ChangeOptions, ChangePoints, Ordering, Section};
/// let sec = Section { axis: "height_m".into(), ordering: Ordering::Height, by: None, samples: vec![] };
/// let cp = ChangePoints::of_section(&sec, &ChangeOptions::default())?;
/// let v = serde_json::to_value(ChangesJson(&cp)).unwrap();
/// assert_eq!(v["axis"], "height_m");
/// assert_eq!(v["changes"].as_array().unwrap().len(), 0);
/// assert!(v["note"].is_string());
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub struct ChangesJson<'a>(pub &'a ChangePoints);

impl Serialize for ChangesJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let c = self.0;
        let mut m = s.serialize_map(None)?;
        m.serialize_entry("axis", &c.axis)?;
        m.serialize_entry("ordering", &c.ordering)?;
        let ids: Vec<&str> = c.options.diagrams.iter().map(|d| d.id()).collect();
        m.serialize_entry("diagrams", &ids)?;
        m.serialize_entry("n", &c.n)?;
        m.serialize_entry("dimension", &c.dimension)?;
        m.serialize_entry("penalty_factor", &c.options.penalty_factor)?;
        m.serialize_entry("penalty", &c.penalty.is_finite().then(|| sig(c.penalty)))?;
        m.serialize_entry("min_segment", &c.options.min_segment)?;
        m.serialize_entry(
            "covariance",
            &c.covariance.as_ref().map(|s| {
                s.rows()
                    .into_iter()
                    .map(|r| r.into_iter().map(sig).collect::<Vec<_>>())
                    .collect::<Vec<_>>()
            }),
        )?;
        let changes: Vec<ChangeJson> = c
            .changes
            .iter()
            .map(|ch| ChangeJson {
                below: End {
                    sample: &ch.below_sample,
                    position: ch.below_position,
                },
                above: End {
                    sample: &ch.above_sample,
                    position: ch.above_position,
                },
                midpoint: ChangePoints::midpoint(ch),
                gain: sig(ch.gain),
            })
            .collect();
        m.serialize_entry("changes", &changes)?;
        let segments: Vec<SegmentJson> = c
            .segments
            .iter()
            .map(|s| SegmentJson {
                n: s.n,
                from: s.from_position,
                to: s.to_position,
                means: Means(c, &s.means),
            })
            .collect();
        m.serialize_entry("segments", &segments)?;
        m.serialize_entry("skipped", &c.skipped)?;
        m.serialize_entry("note", &c.note)?;
        m.end()
    }
}

/// The change points JSON document as pretty-printed bytes, ending in a newline.
///
/// # Example
/// ```
/// use provenance_core::output::changes_table::changes_json;
/// use provenance_core::petrofacies::{ChangeOptions, ChangePoints, Ordering, Section};
/// let sec = Section { axis: "h".into(), ordering: Ordering::Depth, by: None, samples: vec![] };
/// let cp = ChangePoints::of_section(&sec, &ChangeOptions::default())?;
/// let v: serde_json::Value = serde_json::from_slice(&changes_json(&cp)).unwrap();
/// assert_eq!(v["ordering"], "depth");
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub fn changes_json(c: &ChangePoints) -> Vec<u8> {
    // Maps of numbers and strings serialize into memory without failure.
    let mut v = serde_json::to_vec_pretty(&ChangesJson(c)).unwrap_or_default();
    v.push(b'\n');
    v
}

/// The change points as CSV: `change, below_sample, below_position, above_sample,
/// above_position, midpoint, gain, penalty, diagrams, ordering`.
///
/// # Example
/// ```
/// use provenance_core::output::changes_table::changes_csv;
/// use provenance_core::petrofacies::{ChangeOptions, ChangePoints, Ordering, Section};
/// let sec = Section { axis: "h".into(), ordering: Ordering::Height, by: None, samples: vec![] };
/// let cp = ChangePoints::of_section(&sec, &ChangeOptions::default())?;
/// let csv = String::from_utf8(changes_csv(&cp)).unwrap();
/// assert_eq!(csv.lines().count(), 1); // the header only
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub fn changes_csv(c: &ChangePoints) -> Vec<u8> {
    let mut buf =
        b"change,below_sample,below_position,above_sample,above_position,midpoint,gain,penalty,diagrams,ordering\n"
            .to_vec();
    let ids: Vec<&str> = c.options.diagrams.iter().map(|d| d.id()).collect();
    for (k, ch) in c.changes.iter().enumerate() {
        buf.extend_from_slice(format!("{}", k + 1).as_bytes());
        buf.push(b',');
        push_csv_cell(&mut buf, &ch.below_sample);
        buf.extend_from_slice(format!(",{},", ch.below_position).as_bytes());
        push_csv_cell(&mut buf, &ch.above_sample);
        buf.extend_from_slice(
            format!(
                ",{},{},{},{},{},{}\n",
                ch.above_position,
                ChangePoints::midpoint(ch),
                csv_number(sig(ch.gain)),
                csv_number(sig(c.penalty)),
                ids.join("+"),
                match c.ordering {
                    Ordering::Height => "height",
                    Ordering::Depth => "depth",
                }
            )
            .as_bytes(),
        );
    }
    buf
}
