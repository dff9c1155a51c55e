//! A saved classifier: what it reads, what it learned and where it came from, as JSON.

use super::cv::CrossValidation;
use super::features::{FeatureProblem, FeatureSpace};
use super::fit::{softmax, Convergence, LogisticFit};
use super::json_location::{self, JsonText};
use super::training::TrainingSet;
use crate::counts::Sample;
use crate::error::{Error, Result};
use serde::{Deserialize, Serialize};
use sha2::{Digest, Sha256};
use std::path::Path;

/// The `format` value of every model file.
pub const MODEL_FORMAT: &str = "sandprov-model";
/// The model file version this build reads and writes. Version 2 added the top-level
/// `checksum` key (see [`Model::checksum`]); version 1 files carry none and are refused.
pub const MODEL_VERSION: u32 = 2;

/// Where the training data came from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Training {
    /// Number of training samples.
    pub samples: usize,
    /// Samples per class, in class order.
    pub per_class: Vec<(String, usize)>,
    /// Checksum of the training data (see [`TrainingSet::checksum`]).
    pub checksum: String,
    /// Date of the fit, `YYYY-MM-DD` (UTC).
    pub date: String,
    /// The data's origin in words: a file and label column, or how it was generated.
    pub source: String,
}

/// The features a model reads.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Features {
    /// The composition: a diagram id or `framework`.
    pub composition: FeatureSpace,
    /// Its parts, in order.
    pub parts: Vec<String>,
    /// Feature names (`ilr1`, …).
    pub names: Vec<String>,
    /// How the features are made, in words.
    pub transform: String,
}

/// A multinomial logistic classifier on ilr coordinates, as saved and loaded.
///
/// # Example
/// ```
/// use provenance_core::classifier::{fit, FeatureSpace, FitOptions, Model, TrainingSet};
/// use provenance_core::counts::{Counting, Framework, Sample};
/// use provenance_core::diagram::Diagram;
/// let mut t = TrainingSet::new(FeatureSpace::Diagram(Diagram::Qfl));
/// for (q, f, l, label) in [(80.0, 10.0, 10.0, "q"), (70.0, 20.0, 10.0, "q"), (30.0, 40.0, 30.0, "f"), (20.0, 50.0, 30.0, "f"), (60.0, 30.0, 10.0, "f"), (40.0, 20.0, 40.0, "q")] {
///     t.push_amounts(label, &[q, f, l], Counting::Counted).unwrap();
/// }
/// let model = Model::new(fit(&t, &FitOptions::default()).unwrap(), &t, "2025-01-01", "six invented sands", None);
/// let text = model.to_json();
/// let back = Model::from_json("m.json", &text).unwrap();
/// assert_eq!(back, model);
/// let s = Sample::counted("x", Framework { qm: 300.0, p: 20.0, lv: 30.0, ..Default::default() });
/// let p = back.probabilities(&s).unwrap();
/// assert!(p[1] > p[0]); // quartz-rich: class "q"
/// assert!((p.iter().sum::<f64>() - 1.0).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Model {
    /// Always [`MODEL_FORMAT`].
    pub format: String,
    /// Always [`MODEL_VERSION`].
    pub version: u32,
    /// The kind of model, in words.
    pub kind: String,
    /// What the model reads.
    pub features: Features,
    /// Class labels, sorted.
    pub classes: Vec<String>,
    /// The L2 penalty α (scikit-learn's 1/C).
    pub l2: f64,
    /// Coefficients, one row per class, one column per feature.
    pub weights: Vec<Vec<f64>>,
    /// Intercepts, one per class.
    pub intercepts: Vec<f64>,
    /// The training data.
    pub training: Training,
    /// The convergence check of the fit.
    pub convergence: Convergence,
    /// Cross-validated performance, when run.
    pub cross_validation: Option<CrossValidation>,
    /// A caution for whoever uses the model.
    pub note: String,
}

/// What every model says about itself.
pub const MODEL_NOTE: &str = "Probabilities of the classes this model was trained on, from the \
composition alone. They are only as good as the training data, say nothing about settings \
absent from it, and support rather than replace petrographic judgement.";

fn transform_text() -> String {
    "ilr, Helmert-type basis (Egozcue et al. 2003); zeros replaced multiplicatively with \
     delta = 0.65/n, n the points in the composition (Martin-Fernandez et al. 2003)"
        .to_string()
}

impl Model {
    /// A model from a fit of `set`, dated `date` (`YYYY-MM-DD`), with its data's `source`.
    pub fn new(
        fit: LogisticFit,
        set: &TrainingSet,
        date: &str,
        source: &str,
        cross_validation: Option<CrossValidation>,
    ) -> Model {
        let space = set.space();
        Model {
            format: MODEL_FORMAT.into(),
            version: MODEL_VERSION,
            kind: "multinomial logistic regression".into(),
            features: Features {
                composition: space,
                parts: space.parts().iter().map(|p| p.to_string()).collect(),
                names: space.feature_names(),
                transform: transform_text(),
            },
            classes: fit.classes,
            l2: fit.l2,
            weights: fit.weights,
            intercepts: fit.intercepts,
            training: Training {
                samples: set.len(),
                per_class: set.class_counts(),
                checksum: set.checksum(),
                date: date.into(),
                source: source.into(),
            },
            convergence: fit.convergence,
            cross_validation,
            note: MODEL_NOTE.into(),
        }
    }

    /// A plain-text summary: data, penalty, convergence and cross-validation.
    ///
    /// # Example
    /// ```
    /// use provenance_core::classifier::{fit, FeatureSpace, FitOptions, Model, TrainingSet};
    /// use provenance_core::counts::Counting;
    /// use provenance_core::diagram::Diagram;
    /// let mut t = TrainingSet::new(FeatureSpace::Diagram(Diagram::Qmpk));
    /// t.push_amounts("k-rich", &[50.0, 10.0, 40.0], Counting::Counted).unwrap();
    /// t.push_amounts("p-rich", &[50.0, 40.0, 10.0], Counting::Counted).unwrap();
    /// let m = Model::new(fit(&t, &FitOptions::default()).unwrap(), &t, "2025-01-01", "two sands", None);
    /// assert!(m.summary().starts_with("multinomial logistic regression on 2 samples, qmpk (ilr1, ilr2), 2 classes, l2 = 1\n"));
    /// ```
    pub fn summary(&self) -> String {
        let c = &self.convergence;
        let mut s = format!(
            "{} on {} samples, {} ({}), {} classes, l2 = {}\n",
            self.kind,
            self.training.samples,
            self.features.composition,
            self.features.names.join(", "),
            self.classes.len(),
            self.l2
        );
        s += &format!("data checksum {}\n", self.training.checksum);
        s += &format!("model checksum {}\n", self.checksum());
        s += &format!(
            "converged: largest gradient component {:.2e} (tolerance {:.0e}), training log-loss {:.4}\n",
            c.gradient_max, c.tolerance, c.training_log_loss
        );
        match &self.cross_validation {
            Some(cv) => s += &cv.to_string(),
            None => s += "cross-validation skipped\n",
        }
        s
    }

    /// Class probabilities for a feature vector, in class order.
    pub fn probabilities_of_features(&self, z: &[f64]) -> Vec<f64> {
        softmax(&self.weights, &self.intercepts, z)
    }

    /// Class probabilities for a sample, in class order.
    pub fn probabilities(&self, sample: &Sample) -> std::result::Result<Vec<f64>, FeatureProblem> {
        let z = self.features.composition.features(sample)?;
        Ok(self.probabilities_of_features(&z))
    }

    /// SHA-256 of the model's content, `sha256:` and 64 hex digits: the compact JSON of every
    /// key of the model file except `checksum`, in the order written (numbers in the shortest
    /// form that reads back exactly). The model file stores it under `checksum`, and
    /// [`Model::from_json`] refuses a file whose content no longer matches, so a model edited
    /// by hand or damaged in transit is never applied. Layout and whitespace do not count.
    ///
    /// # Example
    /// ```
    /// use provenance_core::classifier::{fit, FeatureSpace, FitOptions, Model, TrainingSet};
    /// use provenance_core::counts::Counting;
    /// use provenance_core::diagram::Diagram;
    /// let mut t = TrainingSet::new(FeatureSpace::Diagram(Diagram::Qfl));
    /// t.push_amounts("a", &[60.0, 30.0, 10.0], Counting::Counted).unwrap();
    /// t.push_amounts("b", &[20.0, 30.0, 50.0], Counting::Counted).unwrap();
    /// let mut m = Model::new(fit(&t, &FitOptions::default()).unwrap(), &t, "2025-01-01", "two sands", None);
    /// let before = m.checksum();
    /// assert!(before.starts_with("sha256:") && before.len() == 7 + 64);
    /// m.intercepts[0] += 1e-9;
    /// assert_ne!(m.checksum(), before);
    /// ```
    pub fn checksum(&self) -> String {
        // A struct of strings, numbers and vectors always serializes.
        let text = serde_json::to_string(self).unwrap_or_default();
        sha256_hex(text.as_bytes())
    }

    /// The model as pretty-printed JSON, its [`Model::checksum`] last.
    pub fn to_json(&self) -> String {
        #[derive(Serialize)]
        struct Stored<'a> {
            #[serde(flatten)]
            model: &'a Model,
            checksum: String,
        }
        let stored = Stored {
            model: self,
            checksum: self.checksum(),
        };
        // A struct of strings, numbers and vectors always serializes.
        serde_json::to_string_pretty(&stored).unwrap_or_default() + "\n"
    }

    /// Write the model to `path`, whole or not at all.
    pub fn save(&self, path: &Path) -> Result<()> {
        use std::io::Write;
        let mut f = crate::output::AtomicFile::create(path)?;
        f.write_all(self.to_json().as_bytes())
            .map_err(|source| Error::Write {
                path: path.display().to_string(),
                source,
            })?;
        f.commit()
    }

    /// Read a model file.
    pub fn load(path: &Path) -> Result<Model> {
        let (name, text) = crate::text::read_text(path, EXPECTED_FILE)?;
        Model::from_json(&name, &text)
    }

    /// Parse and check model text; `file` names it in messages, each refusal with the line
    /// and column of the key or element at fault (a missing key: of the object that lacks it).
    ///
    /// # Example
    /// ```
    /// use provenance_core::classifier::Model;
    /// let text = "{\n  \"format\": \"sandprov-model\",\n  \"version\": \"2\"\n}\n";
    /// let e = Model::from_json("m.json", text).unwrap_err().to_string();
    /// assert!(e.starts_with("m.json, line 3, column 3 (\"version\"): key \"version\": found \"2\""), "{e}");
    /// ```
    pub fn from_json(file: &str, text: &str) -> Result<Model> {
        let json = JsonText { file, text };
        let value: serde_json::Value = serde_json::from_str(text).map_err(|e| {
            let (at, reason) = json.syntax_error(&e);
            Error::Malformed {
                at,
                message: format!("not valid JSON ({reason})"),
                expected: EXPECTED_FILE.into(),
            }
        })?;
        let bad = |key: &str, message: String, expected: String| Error::Malformed {
            at: json.at(&[json_location::key(key)]),
            message: format!("key {key:?}: {message}"),
            expected,
        };
        if value.get("format").and_then(|v| v.as_str()) != Some(MODEL_FORMAT) {
            return Err(bad(
                "format",
                found(value.get("format")),
                format!("{MODEL_FORMAT:?} ({EXPECTED_FILE})"),
            ));
        }
        if value.get("version").and_then(|v| v.as_u64()) != Some(u64::from(MODEL_VERSION)) {
            return Err(bad(
                "version",
                found(value.get("version")),
                format!("{MODEL_VERSION} (this build reads model version {MODEL_VERSION})"),
            ));
        }
        let mut value = value;
        let stored = match value.as_object_mut().and_then(|m| m.remove("checksum")) {
            Some(serde_json::Value::String(s)) => s,
            other => {
                return Err(bad(
                    "checksum",
                    found(other.as_ref()),
                    "the \"sha256:…\" checksum of the model's content, as `sandprov train` \
                     writes it"
                        .into(),
                ))
            }
        };
        let model: Model = serde_path_to_error::deserialize(value).map_err(|e| {
            let path = steps(e.path());
            let shown = json_location::path_text(&path);
            Error::Malformed {
                at: json.at(&path),
                message: if shown.is_empty() {
                    e.inner().to_string()
                } else {
                    format!("key {shown:?}: {}", e.inner())
                },
                expected: format!("the keys and types of {EXPECTED_FILE}"),
            }
        })?;
        model.validate(&json)?;
        let computed = model.checksum();
        if computed != stored {
            return Err(bad(
                "checksum",
                format!("the model's content gives {computed}, the file says {stored}"),
                "an unaltered model file (the content was changed after `sandprov train` wrote \
                 it: retrain rather than edit a model)"
                    .into(),
            ));
        }
        Ok(model)
    }

    /// Check the shapes and values that the types alone do not; each refusal points at the
    /// key or element at fault in `json`.
    fn validate(&self, json: &JsonText) -> Result<()> {
        use json_location::{key, Step};
        let bad = |path: &[Step], message: String, expected: String| {
            // The key in words: the path without the indices that point into its value.
            let keys = path.iter().rposition(|s| matches!(s, Step::Key(_)));
            let shown = json_location::path_text(&path[..keys.map_or(0, |k| k + 1)]);
            Err(Error::Malformed {
                at: json.at(path),
                message: format!("key {shown:?}: {message}"),
                expected,
            })
        };
        let (k, d) = (self.classes.len(), self.features.composition.dimension());
        if k < 2 {
            return bad(
                &[key("classes")],
                format!("{k} class(es)"),
                "at least two classes".into(),
            );
        }
        let mut sorted = self.classes.clone();
        sorted.sort();
        sorted.dedup();
        if sorted != self.classes {
            return bad(
                &[key("classes")],
                format!("{:?}", self.classes),
                "distinct labels in sorted order".into(),
            );
        }
        let per_row = format!(
            "{d} numbers (one per {} feature) in each of {k} rows (one per class)",
            self.features.composition
        );
        if self.weights.len() != k {
            return bad(
                &[key("weights")],
                format!("{} rows", self.weights.len()),
                per_row,
            );
        }
        if let Some(i) = self.weights.iter().position(|w| w.len() != d) {
            return bad(
                &[key("weights"), Step::Index(i)],
                format!("row {} has {} numbers", i + 1, self.weights[i].len()),
                per_row,
            );
        }
        if self.intercepts.len() != k {
            return bad(
                &[key("intercepts")],
                format!("{} numbers", self.intercepts.len()),
                format!("{k} numbers, one per class"),
            );
        }
        if self.features.names.len() != d {
            return bad(
                &[key("features"), key("names")],
                format!("{} names", self.features.names.len()),
                format!("{d} names"),
            );
        }
        let finite = "finite coefficients and intercepts".to_string();
        for (i, row) in self.weights.iter().enumerate() {
            if let Some(j) = row.iter().position(|v| !v.is_finite()) {
                let at = [key("weights"), Step::Index(i), Step::Index(j)];
                return bad(&at, format!("{}", row[j]), finite);
            }
        }
        if let Some(i) = self.intercepts.iter().position(|v| !v.is_finite()) {
            let at = [key("intercepts"), Step::Index(i)];
            return bad(&at, format!("{}", self.intercepts[i]), finite);
        }
        if !self.l2.is_finite() || self.l2 < 0.0 {
            return bad(
                &[key("l2")],
                format!("{}", self.l2),
                "a penalty of 0 or more".into(),
            );
        }
        Ok(())
    }
}

/// What a model file is, for refusals of the whole file.
const EXPECTED_FILE: &str = "a sandprov model file (JSON written by `sandprov train`)";

/// A checked value as found: compact JSON (cut short past 80 characters), or `missing`.
fn found(v: Option<&serde_json::Value>) -> String {
    let Some(v) = v else {
        return "missing".into();
    };
    let text = v.to_string();
    match text.char_indices().nth(80) {
        Some((cut, _)) => format!("found {}…", &text[..cut]),
        None => format!("found {text}"),
    }
}

/// The steps of a failed deserialization's path, up to the first that names no key or index.
fn steps(path: &serde_path_to_error::Path) -> Vec<json_location::Step> {
    use serde_path_to_error::Segment;
    path.iter()
        .map_while(|s| match s {
            Segment::Seq { index } => Some(json_location::Step::Index(*index)),
            Segment::Map { key } | Segment::Enum { variant: key } => {
                Some(json_location::Step::Key(key.clone()))
            }
            Segment::Unknown => None,
        })
        .collect()
}

/// `sha256:` and the 64 hex digits of the SHA-256 of `bytes`.
pub(crate) fn sha256_hex(bytes: &[u8]) -> String {
    let mut s = String::from("sha256:");
    for b in Sha256::digest(bytes) {
        s.push_str(&format!("{b:02x}"));
    }
    s
}

/// The date `YYYY-MM-DD` (UTC, proleptic Gregorian) of a Unix time in seconds, by the
/// days-from-civil inverse of Hinnant (2013, "chrono-Compatible Low-Level Date Algorithms").
///
/// # Example
/// ```
/// use provenance_core::classifier::utc_date;
/// assert_eq!(utc_date(0), "1970-01-01");
/// assert_eq!(utc_date(951_782_400), "2000-02-29");
/// assert_eq!(utc_date(1_735_689_599), "2024-12-31");
/// ```
pub fn utc_date(unix_seconds: i64) -> String {
    let z = unix_seconds.div_euclid(86_400) + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z - era * 146_097;
    let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let d = doy - (153 * mp + 2) / 5 + 1;
    let m = if mp < 10 { mp + 3 } else { mp - 9 };
    let y = yoe + era * 400 + i64::from(m <= 2);
    format!("{y:04}-{m:02}-{d:02}")
}
