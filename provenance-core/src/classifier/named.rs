//! A model as a command names it: a model file, or the default model of an embedded field
//! set; and its verdict on one sample.

use super::features::FeatureProblem;
use super::from_fields::default_model;
use super::model::Model;
use crate::counts::Sample;
use crate::error::Result;
use crate::fields::{embedded, FieldSet};
use crate::output::number::{push_fixed, RATIO_DECIMALS};
use crate::output::{column_slug, push_csv_cell};
use std::path::{Path, PathBuf};

/// Where a [`NamedModel`] came from.
///
/// # Example
/// ```
/// use provenance_core::classifier::ModelSource;
/// let s = ModelSource::File("my-model.json".into());
/// assert!(matches!(s, ModelSource::File(_)));
/// ```
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum ModelSource {
    /// A model file, as written by `sandprov train` (an input: never overwritten).
    File(PathBuf),
    /// The default model of the embedded field set with this id, rebuilt from its polygons
    /// (see [`default_model`]).
    FieldSet(String),
}

/// A classifier to apply to every sample, with the name it is reported under.
///
/// # Example
/// ```
/// use provenance_core::classifier::{ModelSource, NamedModel};
/// let m = NamedModel::resolve("dickinson-suczek1979-qmpk", "2025-01-01")?;
/// assert_eq!(m.name, "default model of dickinson-suczek1979-qmpk");
/// assert!(m.file().is_none());
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
#[derive(Debug, Clone)]
pub struct NamedModel {
    /// The model file or default-model id, as given.
    pub name: String,
    /// The model.
    pub model: Model,
    /// Where it came from.
    pub source: ModelSource,
}

/// The classifier's verdict on one sample.
///
/// # Example
/// ```
/// use provenance_core::classifier::ClassifierResult;
/// let r = ClassifierResult { probabilities: Some(vec![0.2, 0.7, 0.1]), note: None };
/// assert_eq!(r.top(), Some((1, 0.7)));
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct ClassifierResult {
    /// Class probabilities in the model's class order; `None` with `note`.
    pub probabilities: Option<Vec<f64>>,
    /// Why there are none.
    pub note: Option<&'static str>,
}

impl ClassifierResult {
    /// The most probable class (its index in the model's class order) and its probability;
    /// the first of equals wins. `None` without probabilities.
    pub fn top(&self) -> Option<(usize, f64)> {
        let p = self.probabilities.as_deref()?;
        let mut best = 0;
        for (i, v) in p.iter().enumerate() {
            if *v > p[best] {
                best = i;
            }
        }
        p.get(best).map(|v| (best, *v))
    }
}

impl NamedModel {
    /// Resolve a model as a user names it. `spec` is the path of a model file (from
    /// `sandprov train`, checked by [`Model::load`]: format, version, checksum, shapes), or,
    /// when no such file exists, the id of an embedded field set, whose default model is then
    /// rebuilt (deterministically, see [`default_model`]) and dated `date` (`YYYY-MM-DD`). An
    /// existing file wins over an id of the same name.
    ///
    /// # Errors
    /// [`crate::error::Error::Read`] when `spec` is neither an existing file nor an embedded
    /// id; [`crate::error::Error::Malformed`] naming the file and key for a corrupt model file
    /// or one whose content does not match its checksum.
    ///
    /// # Example
    /// ```
    /// use provenance_core::classifier::{fit, FeatureSpace, FitOptions, Model, ModelSource, NamedModel, TrainingSet};
    /// use provenance_core::counts::Counting;
    /// use provenance_core::diagram::Diagram;
    /// // The default model of an embedded field set.
    /// let d = NamedModel::resolve("dickinson1985-qfl", "2025-01-01")?;
    /// assert_eq!(d.source, ModelSource::FieldSet("dickinson1985-qfl".into()));
    /// assert_eq!(d.model.classes.len(), 7);
    /// // A model file.
    /// let mut t = TrainingSet::new(FeatureSpace::Diagram(Diagram::Qfl));
    /// t.push_amounts("quartzose", &[80.0, 10.0, 10.0], Counting::Counted).unwrap();
    /// t.push_amounts("lithic", &[20.0, 20.0, 60.0], Counting::Counted).unwrap();
    /// let m = Model::new(fit(&t, &FitOptions::default())?, &t, "2025-01-01", "two invented sands", None);
    /// let dir = tempfile::tempdir().unwrap();
    /// let path = dir.path().join("m.json");
    /// m.save(&path)?;
    /// let f = NamedModel::resolve(path.to_str().unwrap(), "2025-06-30")?;
    /// assert_eq!(f.file(), Some(path.as_path()));
    /// assert_eq!(f.model, m);
    /// // Neither a file nor an id.
    /// assert!(NamedModel::resolve("no-such-model.json", "2025-01-01").is_err());
    /// # Ok::<(), provenance_core::error::Error>(())
    /// ```
    pub fn resolve(spec: &str, date: &str) -> Result<NamedModel> {
        let path = Path::new(spec);
        if !path.exists() && embedded::ids().contains(&spec) {
            let set = FieldSet::load(spec)?;
            return Ok(NamedModel {
                name: format!("default model of {spec}"),
                model: default_model(&set, date)?,
                source: ModelSource::FieldSet(spec.to_string()),
            });
        }
        Ok(NamedModel {
            name: spec.to_string(),
            model: Model::load(path)?,
            source: ModelSource::File(path.to_path_buf()),
        })
    }

    /// The model file, when the model came from one (an input of the command).
    pub fn file(&self) -> Option<&Path> {
        match &self.source {
            ModelSource::File(p) => Some(p),
            ModelSource::FieldSet(_) => None,
        }
    }

    /// The classifier's verdict on one sample: its class probabilities, or why there are
    /// none.
    ///
    /// # Example
    /// ```
    /// use provenance_core::classifier::NamedModel;
    /// use provenance_core::counts::{Framework, Sample};
    /// let m = NamedModel::resolve("dickinson1985-qfl", "2025-01-01")?;
    /// let s = Sample::counted("q", Framework { qm: 380.0, qp: 10.0, p: 5.0, lm: 5.0, ..Default::default() });
    /// let (top, p) = m.apply(&s).top().unwrap();
    /// assert_eq!(m.model.classes[top], "craton interior");
    /// assert!(p > 0.5);
    /// let empty = Sample::counted("e", Framework::default());
    /// assert!(m.apply(&empty).probabilities.is_none());
    /// # Ok::<(), provenance_core::error::Error>(())
    /// ```
    pub fn apply(&self, sample: &Sample) -> ClassifierResult {
        match self.model.probabilities(sample) {
            Ok(p) => ClassifierResult {
                probabilities: Some(p),
                note: None,
            },
            Err(problem) => ClassifierResult {
                probabilities: None,
                note: Some(match problem {
                    FeatureProblem::NoPoints => "the model's composition has no grains",
                    FeatureProblem::ZeroWithoutPoints => {
                        "a part is zero and the points are unknown, so the zero cannot be replaced"
                    }
                }),
            },
        }
    }

    /// The CSV columns of the classifier block: `classifier_model`, `classifier_top`,
    /// `classifier_top_p`, then `classifier_p_{class}` per class (class names as
    /// [`column_slug`] writes them).
    ///
    /// # Example
    /// ```
    /// use provenance_core::classifier::NamedModel;
    /// let m = NamedModel::resolve("dickinson1985-qfl", "2025-01-01")?;
    /// let h = m.csv_columns();
    /// assert_eq!(&h[..3], ["classifier_model", "classifier_top", "classifier_top_p"]);
    /// assert!(h.contains(&"classifier_p_craton_interior".to_string()));
    /// # Ok::<(), provenance_core::error::Error>(())
    /// ```
    pub fn csv_columns(&self) -> Vec<String> {
        let mut h: Vec<String> = ["classifier_model", "classifier_top", "classifier_top_p"]
            .map(String::from)
            .to_vec();
        h.extend(
            self.model
                .classes
                .iter()
                .map(|k| format!("classifier_p_{}", column_slug(k))),
        );
        h
    }

    /// Append the cells of [`NamedModel::csv_columns`] for one verdict, each preceded by a
    /// comma; all but the model's name empty without probabilities.
    ///
    /// # Example
    /// ```
    /// use provenance_core::classifier::{ClassifierResult, NamedModel};
    /// let m = NamedModel::resolve("dickinson-suczek1979-qmpk", "2025-01-01")?;
    /// let mut buf = Vec::new();
    /// m.push_csv_cells(&mut buf, &ClassifierResult { probabilities: None, note: Some("none") });
    /// let cells = String::from_utf8(buf).unwrap();
    /// assert_eq!(cells.matches(',').count(), m.csv_columns().len());
    /// # Ok::<(), provenance_core::error::Error>(())
    /// ```
    pub fn push_csv_cells(&self, buf: &mut Vec<u8>, r: &ClassifierResult) {
        buf.push(b',');
        push_csv_cell(buf, &self.name);
        match (&r.probabilities, r.top()) {
            (Some(p), Some((best, pbest))) => {
                buf.push(b',');
                push_csv_cell(buf, &self.model.classes[best]);
                buf.push(b',');
                push_fixed(buf, pbest, RATIO_DECIMALS);
                for v in p {
                    buf.push(b',');
                    push_fixed(buf, *v, RATIO_DECIMALS);
                }
            }
            _ => buf.extend(std::iter::repeat_n(b',', 2 + self.model.classes.len())),
        }
    }
}
