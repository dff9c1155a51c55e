//! The `modes` table, as flat CSV and as the stable JSON interface.

use super::number::{round, Cells, PERCENT_DECIMALS, RATIO_DECIMALS};
use super::push_csv_cell;
use crate::counts::{Counting, Sample};
use crate::diagram::Diagram;
use crate::modes::{DiagramMode, SampleModes};
use crate::stats::Interval;
use serde::ser::{SerializeMap, Serializer};
use serde::Serialize;

/// Column suffixes of the ratios, in [`crate::modes::Ratios::named`] order.
pub const RATIO_COLUMNS: [&str; 5] = ["P_F", "K_F", "Lv_L", "Qp_Q", "C_Q"];

/// Flags a row can carry.
fn flags(modes: &SampleModes, sample: &Sample) -> Vec<&'static str> {
    let mut f = Vec::new();
    if modes.empty_framework() {
        f.push("empty framework: no grains counted, all modes null");
    }
    if sample.counting == Counting::Unknown {
        f.push("points unknown: no counting statistics");
    }
    f
}

/// Flat CSV layout of the modes table.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::modes::SampleModes;
/// use provenance_core::output::ModesTable;
/// let t = ModesTable { metadata: vec!["formation".into()], intervals: false };
/// let h = t.header();
/// assert_eq!(&h[..4], ["sample", "formation", "framework_total", "matrix_pct"]);
/// assert!(h.contains(&"qfl_Q_sd".to_string()));
/// let mut s = Sample::counted("A", Framework { qm: 3.0, p: 1.0, ..Default::default() });
/// s.metadata = vec!["Upper".into()];
/// let mut row = Vec::new();
/// t.push_row(&mut row, &s, &SampleModes::of(&s));
/// assert!(String::from_utf8(row).unwrap().starts_with("A,Upper,4,,4,75.00,21.65,25.00,"));
/// ```
#[derive(Debug, Clone, Default)]
pub struct ModesTable {
    /// Metadata column names, carried after the sample id.
    pub metadata: Vec<String>,
    /// Add 95% Wilson and Clopper-Pearson bounds per pole.
    pub intervals: bool,
}

impl ModesTable {
    /// Column names.
    pub fn header(&self) -> Vec<String> {
        let mut h = vec!["sample".to_string()];
        h.extend(self.metadata.iter().cloned());
        h.push("framework_total".into());
        h.push("matrix_pct".into());
        for d in Diagram::ALL {
            h.push(format!("{}_n", d.id()));
            for p in d.poles() {
                h.push(format!("{}_{p}", d.id()));
                h.push(format!("{}_{p}_sd", d.id()));
                if self.intervals {
                    for s in ["wilson_lo", "wilson_hi", "cp_lo", "cp_hi"] {
                        h.push(format!("{}_{p}_{s}", d.id()));
                    }
                }
            }
        }
        h.extend(RATIO_COLUMNS.iter().map(|r| r.to_string()));
        h.push("flags".into());
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

    fn push_mode(&self, c: &mut Cells<'_>, m: Option<&DiagramMode>) {
        let per_pole = if self.intervals { 6 } else { 2 };
        let Some(m) = m else {
            for _ in 0..1 + 3 * per_pole {
                c.byte(b',');
            }
            return;
        };
        c.byte(b',');
        if let Some(n) = m.points {
            c.points(n);
        }
        let sd = m.sd();
        let (wil, cp) = if self.intervals {
            (m.wilson95(), m.clopper_pearson95())
        } else {
            (None, None)
        };
        for i in 0..3 {
            c.byte(b',');
            c.fixed(m.percent.part(i), PERCENT_DECIMALS);
            c.byte(b',');
            if let Some(sd) = sd {
                c.fixed(sd[i], PERCENT_DECIMALS);
            }
            if self.intervals {
                for iv in [wil.map(|w| w[i]), cp.map(|c| c[i])] {
                    for bound in [iv.map(|v| v.lower), iv.map(|v| v.upper)] {
                        c.byte(b',');
                        if let Some(b) = bound {
                            c.fixed(b, PERCENT_DECIMALS);
                        }
                    }
                }
            }
        }
    }

    /// One sample's row, ending in a newline.
    pub fn push_row(&self, buf: &mut Vec<u8>, sample: &Sample, modes: &SampleModes) {
        push_csv_cell(buf, &sample.id);
        for v in &sample.metadata {
            buf.push(b',');
            push_csv_cell(buf, v);
        }
        let mut c = Cells::new(buf);
        c.byte(b',');
        c.points(modes.framework_total);
        c.byte(b',');
        if let Some(m) = modes.matrix_percent {
            c.fixed(m, PERCENT_DECIMALS);
        }
        for d in Diagram::ALL {
            self.push_mode(&mut c, modes.get(d));
        }
        for (_, r) in modes.ratios.named() {
            c.byte(b',');
            if let Some(r) = r {
                c.fixed(r, RATIO_DECIMALS);
            }
        }
        c.byte(b',');
        c.finish();
        if modes.empty_framework() || sample.counting == Counting::Unknown {
            push_csv_cell(buf, &flags(modes, sample).join("; "));
        }
        buf.push(b'\n');
    }
}

struct Poles<'a, T>(&'a [&'static str; 3], [T; 3]);

impl<T: Serialize> Serialize for Poles<'_, T> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut m = s.serialize_map(Some(3))?;
        for i in 0..3 {
            m.serialize_entry(self.0[i], &self.1[i])?;
        }
        m.end()
    }
}

/// A number of points: an integer in JSON when whole, else rounded to two decimals.
struct PointsJson(f64);

impl Serialize for PointsJson {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        if self.0.fract() == 0.0 && self.0 >= 0.0 && self.0 < 9e15 {
            s.serialize_u64(self.0 as u64)
        } else {
            s.serialize_f64(r2(self.0))
        }
    }
}

fn r2(x: f64) -> f64 {
    round(x, PERCENT_DECIMALS)
}

fn iv(i: Interval) -> [f64; 2] {
    [r2(i.lower), r2(i.upper)]
}

struct ModeJson<'a>(&'a DiagramMode);

impl Serialize for ModeJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let m = self.0;
        let poles = m.diagram.poles();
        let mut map = s.serialize_map(None)?;
        map.serialize_entry("n", &m.points.map(PointsJson))?;
        for (i, p) in poles.iter().enumerate() {
            map.serialize_entry(p, &r2(m.percent.part(i)))?;
        }
        map.serialize_entry("sd", &m.sd().map(|sd| Poles(&poles, sd.map(r2))))?;
        match (m.wilson95(), m.clopper_pearson95()) {
            (Some(w), Some(c)) => {
                struct Ci<'a>(&'a [&'static str; 3], [Interval; 3], [Interval; 3]);
                impl Serialize for Ci<'_> {
                    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
                        let mut m = s.serialize_map(Some(2))?;
                        m.serialize_entry("wilson", &Poles(self.0, self.1.map(iv)))?;
                        m.serialize_entry("clopper_pearson", &Poles(self.0, self.2.map(iv)))?;
                        m.end()
                    }
                }
                map.serialize_entry("ci95", &Ci(&poles, w, c))?;
            }
            _ => map.serialize_entry("ci95", &None::<()>)?,
        }
        map.end()
    }
}

/// One sample in the stable JSON interface of `modes`.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::modes::SampleModes;
/// use provenance_core::output::ModesJson;
/// let s = Sample::counted("A", Framework { qm: 252.0, p: 83.0, lv: 77.0, ..Default::default() });
/// let m = SampleModes::of(&s);
/// let v = serde_json::to_value(ModesJson { sample: &s, modes: &m, metadata: &[] }).unwrap();
/// assert_eq!(v["qfl"]["n"], 412);
/// assert_eq!(v["qfl"]["Q"], 61.17);
/// assert_eq!(v["qfl"]["sd"]["Q"], 2.4);
/// assert_eq!(v["qplvlsm"]["n"], 77);
/// ```
pub struct ModesJson<'a> {
    /// The sample.
    pub sample: &'a Sample,
    /// Its recalculated modes.
    pub modes: &'a SampleModes,
    /// Metadata column names, matching `sample.metadata`.
    pub metadata: &'a [String],
}

impl Serialize for ModesJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let (sample, modes) = (self.sample, self.modes);
        let mut map = s.serialize_map(None)?;
        map.serialize_entry("sample", &sample.id)?;
        map.serialize_entry("line", &sample.line)?;
        let counting = match sample.counting {
            Counting::Counted => "counted",
            Counting::FromPercent { .. } => "estimated from percentages",
            Counting::Unknown => "unknown",
        };
        map.serialize_entry("points", counting)?;
        map.serialize_entry("framework_total", &PointsJson(modes.framework_total))?;
        map.serialize_entry("matrix_percent", &modes.matrix_percent.map(r2))?;
        for d in Diagram::ALL {
            map.serialize_entry(d.id(), &modes.get(d).map(ModeJson))?;
        }
        struct Ratios<'a>(&'a SampleModes);
        impl Serialize for Ratios<'_> {
            fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
                let mut m = s.serialize_map(Some(5))?;
                for (name, v) in self.0.ratios.named() {
                    m.serialize_entry(name, &v.map(|v| round(v, RATIO_DECIMALS)))?;
                }
                m.end()
            }
        }
        map.serialize_entry("ratios", &Ratios(modes))?;
        map.serialize_entry("flags", &flags(modes, sample))?;
        map.serialize_entry(
            "metadata",
            &crate::output::MetadataJson(self.metadata, &sample.metadata),
        )?;
        map.end()
    }
}
