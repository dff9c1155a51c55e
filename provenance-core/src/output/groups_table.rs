//! Outputs of `groups`: the JSON document, the wide CSV summary, and the long CSV tables of
//! pairwise tests and region curves.
//!
//! JSON shape (an object, so that settings and comparisons sit beside the groups):
//! `{"by", "level", "zero_replacement", "groups": [{"group", "n", "qfl": {…}, "qmflt": …}, …],
//! "comparisons": [{"diagram", "groups", "n", "method", "p_value", "p_holm", "differ",
//! "hotelling", "permutation", "note"}, …]}`. A diagram in which no sample of the group has
//! points is `null`.

use super::number::{round, PERCENT_DECIMALS};
use super::push_csv_cell;
use crate::composition::Composition3;
use crate::diagram::Diagram;
use crate::petrofacies::{
    Comparison, DiagramSummary, Homogeneity, Hotelling, Permutation, Petrofacies, TestMethod,
};
use serde::ser::{SerializeMap, Serializer};
use serde::Serialize;

/// Significance level of the `differ` flag, applied to Holm-adjusted p-values (5%, common
/// practice).
pub const DIFFER_ALPHA: f64 = 0.05;

/// Round to `digits` significant digits (statistics and p-values).
///
/// # Example
/// ```
/// use provenance_core::output::groups_table::significant;
/// assert_eq!(significant(0.000123456789, 4), 0.0001235);
/// assert_eq!(significant(0.0, 4), 0.0);
/// ```
pub fn significant(x: f64, digits: i32) -> f64 {
    if x == 0.0 || !x.is_finite() {
        return x;
    }
    // Through decimal text, so the result is the double nearest the rounded decimal and
    // prints without binary noise (9.55715e-18, not 9.557150000000002e-18).
    let d = (digits.max(1) - 1) as usize;
    format!("{x:.d$e}").parse().unwrap_or(x)
}

/// A number as CSV text: plain decimals in the usual range, exponent notation for very small
/// or very large magnitudes (p-values such as 6.91156e-16).
///
/// # Example
/// ```
/// use provenance_core::output::groups_table::csv_number;
/// assert_eq!(csv_number(0.0093), "0.0093");
/// assert_eq!(csv_number(6.91156e-16), "6.91156e-16");
/// assert_eq!(csv_number(200.0), "200");
/// ```
pub fn csv_number(x: f64) -> String {
    if x != 0.0 && (x.abs() < 1e-4 || x.abs() >= 1e15) {
        format!("{x:e}")
    } else {
        format!("{x}")
    }
}

fn r2(x: f64) -> f64 {
    round(x, PERCENT_DECIMALS)
}

fn r6(x: f64) -> f64 {
    round(x, 6)
}

fn sig(x: f64) -> f64 {
    significant(x, 6)
}

/// A map from the diagram's pole symbols to values, in pole order.
struct Poles<T>([&'static str; 3], [T; 3]);

impl<T: Serialize> Serialize for Poles<T> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut m = s.serialize_map(Some(3))?;
        for i in 0..3 {
            m.serialize_entry(self.0[i], &self.1[i])?;
        }
        m.end()
    }
}

fn poles(d: Diagram, c: &Composition3) -> Poles<f64> {
    Poles(d.poles(), c.parts().map(r2))
}

fn curve(v: &[[f64; 3]]) -> Vec<[f64; 3]> {
    v.iter().map(|p| p.map(r2)).collect()
}

#[derive(Serialize)]
struct SigmaJson {
    mean: Poles<f64>,
    sd: Poles<f64>,
    vertices: Vec<[f64; 3]>,
    spills_outside: bool,
}

#[derive(Serialize)]
struct HomogeneityJson {
    chi2: f64,
    df: usize,
    p_value: f64,
    pooling_justified: bool,
    expected_below_5: usize,
    cells: usize,
}

impl From<&Homogeneity> for HomogeneityJson {
    fn from(h: &Homogeneity) -> Self {
        HomogeneityJson {
            chi2: sig(h.chi2),
            df: h.df,
            p_value: sig(h.p_value),
            pooling_justified: h.pooling_justified,
            expected_below_5: h.expected_below_5,
            cells: h.cells,
        }
    }
}

#[derive(Serialize)]
struct DiagramJson {
    n: usize,
    points: Option<f64>,
    mean: Poles<f64>,
    pooled: Option<Poles<f64>>,
    ilr_mean: [f64; 2],
    ilr_covariance: Option<Vec<Vec<f64>>>,
    confidence_region: Option<Vec<[f64; 3]>>,
    prediction_region: Option<Vec<[f64; 3]>>,
    regions_note: Option<&'static str>,
    sigma_polygon: Option<SigmaJson>,
    homogeneity: Option<HomogeneityJson>,
}

impl From<&DiagramSummary> for DiagramJson {
    fn from(s: &DiagramSummary) -> Self {
        let d = s.diagram;
        let (conf, pred, note) = match &s.regions {
            Ok(r) => (Some(curve(&r.confidence)), Some(curve(&r.prediction)), None),
            Err(gap) => (None, None, Some(gap.reason())),
        };
        DiagramJson {
            n: s.n,
            points: s.points.map(r2),
            mean: poles(d, &s.mean),
            pooled: s.pooled.as_ref().map(|p| poles(d, p)),
            ilr_mean: s.ilr_mean.map(r6),
            ilr_covariance: s.ilr_covariance.as_ref().map(|c| {
                c.rows()
                    .into_iter()
                    .map(|r| r.into_iter().map(sig).collect())
                    .collect()
            }),
            confidence_region: conf,
            prediction_region: pred,
            regions_note: note,
            sigma_polygon: s.sigma_polygon.as_ref().map(|p| SigmaJson {
                mean: Poles(d.poles(), p.mean.map(r2)),
                sd: Poles(d.poles(), p.sd.map(r2)),
                vertices: curve(&p.vertices),
                spills_outside: p.spills_outside,
            }),
            homogeneity: s.homogeneity.as_ref().map(HomogeneityJson::from),
        }
    }
}

struct GroupJson<'a>(&'a crate::petrofacies::GroupSummary);

impl Serialize for GroupJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let g = self.0;
        let mut m = s.serialize_map(None)?;
        m.serialize_entry("group", &g.name)?;
        m.serialize_entry("n", &g.samples)?;
        for d in Diagram::ALL {
            m.serialize_entry(d.id(), &g.get(d).map(DiagramJson::from))?;
        }
        m.end()
    }
}

#[derive(Serialize)]
struct HotellingJson {
    t2: f64,
    f: f64,
    df1: f64,
    df2: f64,
    p_value: f64,
}

impl From<&Hotelling> for HotellingJson {
    fn from(h: &Hotelling) -> Self {
        HotellingJson {
            t2: sig(h.t2),
            f: sig(h.f),
            df1: h.df1,
            df2: h.df2,
            p_value: sig(h.p_value),
        }
    }
}

#[derive(Serialize)]
struct PermutationJson {
    kind: crate::petrofacies::PermutationKind,
    splits: u64,
    p_value: f64,
    seed: Option<u64>,
}

impl From<&Permutation> for PermutationJson {
    fn from(p: &Permutation) -> Self {
        PermutationJson {
            kind: p.kind,
            splits: p.splits,
            p_value: sig(p.p_value),
            seed: p.seed,
        }
    }
}

#[derive(Serialize)]
struct ComparisonJson<'a> {
    diagram: Diagram,
    groups: &'a [String; 2],
    n: [usize; 2],
    method: Option<TestMethod>,
    p_value: Option<f64>,
    p_holm: Option<f64>,
    differ: Option<bool>,
    hotelling: Option<HotellingJson>,
    permutation: Option<PermutationJson>,
    note: Option<&'static str>,
}

fn differ(c: &Comparison) -> Option<bool> {
    c.p_holm.map(|p| p < DIFFER_ALPHA)
}

impl<'a> From<&'a Comparison> for ComparisonJson<'a> {
    fn from(c: &'a Comparison) -> Self {
        ComparisonJson {
            diagram: c.diagram,
            groups: &c.groups,
            n: c.n,
            method: c.method,
            p_value: c.p_value.map(sig),
            p_holm: c.p_holm.map(sig),
            differ: differ(c),
            hotelling: c.hotelling.as_ref().map(HotellingJson::from),
            permutation: c.permutation.as_ref().map(PermutationJson::from),
            note: c.note,
        }
    }
}

/// The `groups` JSON document.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::output::groups_table::GroupsJson;
/// use provenance_core::petrofacies::{GroupOptions, Petrofacies};
/// let s = Sample::counted("a", Framework { qm: 100.0, p: 50.0, lv: 50.0, ..Default::default() });
/// let p = Petrofacies::from_groups("fm", &[("X".into(), vec![&s])], GroupOptions::default())?;
/// let v = serde_json::to_value(GroupsJson(&p)).unwrap();
/// assert_eq!(v["groups"][0]["group"], "X");
/// assert_eq!(v["groups"][0]["qfl"]["mean"]["Q"], 50.0);
/// assert!(v["groups"][0]["qfl"]["confidence_region"].is_null());
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub struct GroupsJson<'a>(pub &'a Petrofacies);

impl Serialize for GroupsJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let p = self.0;
        let mut m = s.serialize_map(None)?;
        m.serialize_entry("by", &p.by)?;
        m.serialize_entry("level", &p.options.level)?;
        m.serialize_entry(
            "zero_replacement",
            "multiplicative, delta = 0.65/n for n points in the diagram (Martín-Fernández et al. 2003)",
        )?;
        let groups: Vec<GroupJson> = p.groups.iter().map(GroupJson).collect();
        m.serialize_entry("groups", &groups)?;
        let comps: Vec<ComparisonJson> = p.comparisons.iter().map(ComparisonJson::from).collect();
        m.serialize_entry("comparisons", &comps)?;
        m.end()
    }
}

/// The `groups` JSON document as pretty-printed bytes, ending in a newline.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::output::groups_table::groups_json;
/// use provenance_core::petrofacies::{GroupOptions, Petrofacies};
/// let s = Sample::counted("a", Framework { qm: 100.0, p: 50.0, lv: 50.0, ..Default::default() });
/// let p = Petrofacies::from_groups("fm", &[("X".into(), vec![&s])], GroupOptions::default())?;
/// assert!(groups_json(&p).starts_with(b"{\n  \"by\": \"fm\""));
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub fn groups_json(p: &Petrofacies) -> Vec<u8> {
    // Maps of numbers and strings serialize into memory without failure.
    let mut v = serde_json::to_vec_pretty(&GroupsJson(p)).unwrap_or_default();
    v.push(b'\n');
    v
}

fn cell(buf: &mut Vec<u8>, v: Option<f64>) {
    buf.push(b',');
    if let Some(v) = v {
        buf.extend_from_slice(csv_number(v).as_bytes());
    }
}

fn text(buf: &mut Vec<u8>, v: &str) {
    buf.push(b',');
    push_csv_cell(buf, v);
}

/// The wide CSV summary: one row per group, flat columns per diagram (`qfl_n`,
/// `qfl_mean_Q`, …, `qfl_chi2_p`, `qfl_pooling_justified`).
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::output::groups_table::groups_csv;
/// use provenance_core::petrofacies::{GroupOptions, Petrofacies};
/// let s = Sample::counted("a", Framework { qm: 100.0, p: 50.0, lv: 50.0, ..Default::default() });
/// let p = Petrofacies::from_groups("fm", &[("X".into(), vec![&s])], GroupOptions::default())?;
/// let csv = String::from_utf8(groups_csv(&p)).unwrap();
/// assert!(csv.starts_with("group,n,qfl_n,qfl_points,qfl_mean_Q,"));
/// assert!(csv.lines().nth(1).unwrap().starts_with("X,1,1,200,50,25,25,"));
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub fn groups_csv(p: &Petrofacies) -> Vec<u8> {
    let mut buf = Vec::new();
    buf.extend_from_slice(b"group,n");
    for d in Diagram::ALL {
        let id = d.id();
        let mut cols = vec![format!("{id}_n"), format!("{id}_points")];
        cols.extend(d.poles().iter().map(|q| format!("{id}_mean_{q}")));
        cols.extend(d.poles().iter().map(|q| format!("{id}_pooled_{q}")));
        cols.extend(
            ["ilr1", "ilr2", "cov11", "cov12", "cov22"]
                .iter()
                .map(|c| format!("{id}_{c}")),
        );
        cols.extend(d.poles().iter().map(|q| format!("{id}_sd_{q}")));
        cols.extend(
            ["chi2", "chi2_df", "chi2_p", "pooling_justified"]
                .iter()
                .map(|c| format!("{id}_{c}")),
        );
        for c in cols {
            text(&mut buf, &c);
        }
    }
    buf.push(b'\n');
    for g in &p.groups {
        push_csv_cell(&mut buf, &g.name);
        cell(&mut buf, Some(g.samples as f64));
        for d in Diagram::ALL {
            let Some(s) = g.get(d) else {
                buf.extend(std::iter::repeat_n(b',', 20));
                continue;
            };
            cell(&mut buf, Some(s.n as f64));
            cell(&mut buf, s.points.map(r2));
            for v in s.mean.parts() {
                cell(&mut buf, Some(r2(v)));
            }
            for i in 0..3 {
                cell(&mut buf, s.pooled.map(|c| r2(c.part(i))));
            }
            cell(&mut buf, Some(r6(s.ilr_mean[0])));
            cell(&mut buf, Some(r6(s.ilr_mean[1])));
            for (i, j) in [(0, 0), (0, 1), (1, 1)] {
                cell(
                    &mut buf,
                    s.ilr_covariance.as_ref().map(|c| sig(c.get(i, j))),
                );
            }
            for i in 0..3 {
                cell(&mut buf, s.sigma_polygon.as_ref().map(|p| r2(p.sd[i])));
            }
            let h = s.homogeneity.as_ref();
            cell(&mut buf, h.map(|h| sig(h.chi2)));
            cell(&mut buf, h.map(|h| h.df as f64));
            cell(&mut buf, h.map(|h| sig(h.p_value)));
            text(
                &mut buf,
                h.map_or("", |h| if h.pooling_justified { "true" } else { "false" }),
            );
        }
        buf.push(b'\n');
    }
    buf
}

/// The pairwise tests as CSV, one row per diagram and pair.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::output::groups_table::comparisons_csv;
/// use provenance_core::petrofacies::{GroupOptions, Petrofacies};
/// let s = Sample::counted("a", Framework { qm: 100.0, p: 50.0, lv: 50.0, ..Default::default() });
/// let p = Petrofacies::from_groups("fm", &[("X".into(), vec![&s]), ("Y".into(), vec![&s])], GroupOptions::default())?;
/// let csv = String::from_utf8(comparisons_csv(&p)).unwrap();
/// assert!(csv.starts_with("diagram,group_a,group_b,n_a,n_b,method,p_value,p_holm,differ,"));
/// assert!(csv.lines().nth(1).unwrap().starts_with("qfl,X,Y,1,1,,,,,"));
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub fn comparisons_csv(p: &Petrofacies) -> Vec<u8> {
    let mut buf = b"diagram,group_a,group_b,n_a,n_b,method,p_value,p_holm,differ,hotelling_t2,hotelling_f,hotelling_df1,hotelling_df2,hotelling_p,permutation_kind,permutation_splits,permutation_p,permutation_seed,note\n".to_vec();
    for c in &p.comparisons {
        buf.extend_from_slice(c.diagram.id().as_bytes());
        text(&mut buf, &c.groups[0]);
        text(&mut buf, &c.groups[1]);
        cell(&mut buf, Some(c.n[0] as f64));
        cell(&mut buf, Some(c.n[1] as f64));
        text(
            &mut buf,
            match c.method {
                Some(TestMethod::Hotelling) => "hotelling",
                Some(TestMethod::Permutation) => "permutation",
                None => "",
            },
        );
        cell(&mut buf, c.p_value.map(sig));
        cell(&mut buf, c.p_holm.map(sig));
        text(
            &mut buf,
            differ(c).map_or("", |d| if d { "true" } else { "false" }),
        );
        let h = c.hotelling.as_ref();
        cell(&mut buf, h.map(|h| sig(h.t2)));
        cell(&mut buf, h.map(|h| sig(h.f)));
        cell(&mut buf, h.map(|h| h.df1));
        cell(&mut buf, h.map(|h| h.df2));
        cell(&mut buf, h.map(|h| sig(h.p_value)));
        let q = c.permutation.as_ref();
        text(
            &mut buf,
            q.map_or("", |q| match q.kind {
                crate::petrofacies::PermutationKind::Exact => "exact",
                crate::petrofacies::PermutationKind::MonteCarlo => "monte_carlo",
            }),
        );
        cell(&mut buf, q.map(|q| q.splits as f64));
        cell(&mut buf, q.map(|q| sig(q.p_value)));
        cell(&mut buf, q.and_then(|q| q.seed).map(|s| s as f64));
        text(&mut buf, c.note.unwrap_or(""));
        buf.push(b'\n');
    }
    buf
}

/// The region curves as a long CSV: `group, diagram, region, vertex, p1, p2, p3`, with p1-p3
/// the diagram's poles in order (qfl: Q, F, L) and region one of `confidence`, `prediction`,
/// `sigma` (the clipped mean ± 1σ polygon).
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::output::groups_table::regions_csv;
/// use provenance_core::petrofacies::{GroupOptions, Petrofacies};
/// let s = |q| Sample::counted("a", Framework { qm: q, p: 50.0, lv: 40.0 + q / 3.0, ..Default::default() });
/// let (a, b, c) = (s(100.0), s(130.0), s(90.0));
/// let p = Petrofacies::from_groups("fm", &[("X".into(), vec![&a, &b, &c])], GroupOptions::default())?;
/// let csv = String::from_utf8(regions_csv(&p)).unwrap();
/// assert!(csv.starts_with("group,diagram,region,vertex,p1,p2,p3\nX,qfl,confidence,0,"));
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub fn regions_csv(p: &Petrofacies) -> Vec<u8> {
    let mut buf = b"group,diagram,region,vertex,p1,p2,p3\n".to_vec();
    for g in &p.groups {
        for d in Diagram::ALL {
            let Some(s) = g.get(d) else { continue };
            let mut curves: Vec<(&str, &[[f64; 3]])> = Vec::new();
            if let Ok(r) = &s.regions {
                curves.push(("confidence", &r.confidence));
                curves.push(("prediction", &r.prediction));
            }
            if let Some(sp) = &s.sigma_polygon {
                curves.push(("sigma", &sp.vertices));
            }
            for (name, pts) in curves {
                for (k, v) in pts.iter().enumerate() {
                    push_csv_cell(&mut buf, &g.name);
                    text(&mut buf, d.id());
                    text(&mut buf, name);
                    cell(&mut buf, Some(k as f64));
                    for x in v {
                        cell(&mut buf, Some(r2(*x)));
                    }
                    buf.push(b'\n');
                }
            }
        }
    }
    buf
}
