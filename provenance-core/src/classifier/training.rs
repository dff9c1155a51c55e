//! Labelled training data: features, labels and a checksum of what went in.

use super::features::{FeatureProblem, FeatureSpace};
use crate::counts::normalize_header;
use crate::error::{Column, Error, Location, Result};
use crate::input::CountReader;
use sha2::{Digest, Sha256};

/// Labelled compositions in one feature space.
///
/// # Example
/// ```
/// use provenance_core::classifier::{FeatureSpace, TrainingSet};
/// use provenance_core::counts::Counting;
/// use provenance_core::diagram::Diagram;
/// let mut t = TrainingSet::new(FeatureSpace::Diagram(Diagram::Qfl));
/// t.push_amounts("recycled", &[60.0, 10.0, 30.0], Counting::Counted).unwrap();
/// t.push_amounts("arc", &[20.0, 40.0, 40.0], Counting::Counted).unwrap();
/// assert_eq!(t.len(), 2);
/// assert_eq!(t.classes(), ["arc", "recycled"]);
/// assert!(t.checksum().starts_with("sha256:"));
/// ```
#[derive(Debug, Clone)]
pub struct TrainingSet {
    space: FeatureSpace,
    features: Vec<Vec<f64>>,
    labels: Vec<String>,
    hasher: Sha256,
    name: String,
}

impl TrainingSet {
    /// An empty set.
    pub fn new(space: FeatureSpace) -> TrainingSet {
        TrainingSet {
            space,
            features: Vec::new(),
            labels: Vec::new(),
            hasher: Sha256::new(),
            name: "training data".into(),
        }
    }

    /// Add one labelled composition given by its amounts in [`FeatureSpace::parts`] order.
    pub fn push_amounts(
        &mut self,
        label: &str,
        amounts: &[f64],
        counting: crate::counts::Counting,
    ) -> std::result::Result<(), FeatureProblem> {
        let z = self.space.features_of(amounts, counting)?;
        // The checksum covers what the user supplied: one line per sample,
        // label TAB amount TAB … newline, numbers in shortest round-trip form.
        let mut line = label.to_string();
        for a in amounts {
            line.push('\t');
            line.push_str(&a.to_string());
        }
        line.push('\n');
        self.hasher.update(line.as_bytes());
        self.features.push(z);
        self.labels.push(label.to_string());
        Ok(())
    }

    /// The name used in messages: the file read, or "training data".
    pub fn name(&self) -> &str {
        &self.name
    }

    /// The same set under another name for messages.
    pub fn named(mut self, name: &str) -> TrainingSet {
        self.name = name.to_string();
        self
    }

    /// The feature space.
    pub fn space(&self) -> FeatureSpace {
        self.space
    }

    /// Number of samples.
    pub fn len(&self) -> usize {
        self.labels.len()
    }

    /// True when empty.
    pub fn is_empty(&self) -> bool {
        self.labels.is_empty()
    }

    /// Features, one row per sample.
    pub fn features(&self) -> &[Vec<f64>] {
        &self.features
    }

    /// Labels, one per sample.
    pub fn labels(&self) -> &[String] {
        &self.labels
    }

    /// Distinct labels, sorted (the class order of every model).
    pub fn classes(&self) -> Vec<String> {
        let mut c = self.labels.clone();
        c.sort();
        c.dedup();
        c
    }

    /// Samples per class, in class order.
    pub fn class_counts(&self) -> Vec<(String, usize)> {
        self.classes()
            .into_iter()
            .map(|c| {
                let n = self.labels.iter().filter(|l| **l == c).count();
                (c, n)
            })
            .collect()
    }

    /// SHA-256 of the supplied data, `sha256:` and 64 hex digits: the lines
    /// `label\tamount\t…\n` of every sample in order, amounts as Rust prints `f64` (shortest
    /// form that reads back exactly).
    pub fn checksum(&self) -> String {
        let digest = self.hasher.clone().finalize();
        let mut s = String::from("sha256:");
        for b in digest {
            s.push_str(&format!("{b:02x}"));
        }
        s
    }

    /// A subset by sample indices (for cross-validation). The checksum of a subset is not
    /// meaningful and is left empty.
    pub fn subset(&self, rows: &[usize]) -> TrainingSet {
        TrainingSet {
            space: self.space,
            features: rows.iter().map(|i| self.features[*i].clone()).collect(),
            labels: rows.iter().map(|i| self.labels[*i].clone()).collect(),
            hasher: Sha256::new(),
            name: self.name.clone(),
        }
    }

    /// Read a labelled count table: every sample's composition in `space`, labelled by the
    /// metadata column `label` (matched exactly, else ignoring case, spaces and underscores).
    ///
    /// Refuses (naming file, line and column) a missing label column, an empty label, and a
    /// sample without features (no grains, or zeros with the number of points unknown).
    ///
    /// # Example
    /// ```
    /// use provenance_core::classifier::{FeatureSpace, TrainingSet};
    /// use provenance_core::diagram::Diagram;
    /// use provenance_core::input::{CountReader, ReadOptions};
    /// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm,setting\nA,200,10,40,25,10,6,4,craton\nB,60,10,90,25,100,6,4,arc\n";
    /// let r = CountReader::from_reader("ref.csv", t.as_bytes(), ReadOptions::default()).unwrap();
    /// let set = TrainingSet::read(r, "Setting", FeatureSpace::Diagram(Diagram::Qfl)).unwrap();
    /// assert_eq!(set.labels(), ["craton", "arc"]);
    /// let r = CountReader::from_reader("ref.csv", t.as_bytes(), ReadOptions::default()).unwrap();
    /// let e = TrainingSet::read(r, "basin", FeatureSpace::Framework).unwrap_err();
    /// assert!(e.to_string().contains("no label column \"basin\""));
    /// ```
    pub fn read(reader: CountReader, label: &str, space: FeatureSpace) -> Result<TrainingSet> {
        let file = reader.file().to_string();
        let meta = reader.metadata_columns();
        let pick = meta
            .iter()
            .position(|m| m.trim() == label.trim())
            .or_else(|| {
                meta.iter()
                    .position(|m| normalize_header(m) == normalize_header(label))
            })
            .ok_or_else(|| Error::Malformed {
                at: Location::new(&file).line(1),
                message: format!("no label column {label:?} among the metadata columns {meta:?}"),
                expected: "--label naming a column that is not a count column".into(),
            })?;
        let name = meta[pick].clone();
        let index = reader
            .headers()
            .iter()
            .position(|h| *h == name)
            .map_or(0, |i| i + 1);
        let column = Column { index, name };
        let mut set = TrainingSet::new(space).named(&file);
        for sample in reader {
            let s = sample?;
            let at = || Location::new(&file).line(s.line).column(column.clone());
            let lab = s.metadata[pick].trim();
            if lab.is_empty() {
                return Err(Error::InvalidValue {
                    at: at(),
                    value: String::new(),
                    expected: "a non-empty class label for every training sample".into(),
                });
            }
            let amounts = space.amounts(&s.framework);
            set.push_amounts(lab, &amounts, s.counting)
                .map_err(|p| Error::Training {
                    file: format!("{file}, line {} (sample {:?})", s.line, s.id),
                    message: format!("no {} features: {}", space.id(), p.describe()),
                    expected:
                        "grains in the composition, and an n column for percentages with zeros"
                            .into(),
                })?;
        }
        Ok(set)
    }
}
