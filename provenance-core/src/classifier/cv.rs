//! Stratified k-fold cross-validation: accuracy, log-loss and a confusion matrix.

use super::fit::{fit, softmax, FitOptions};
use super::training::TrainingSet;
use crate::error::{Error, Result};
use rayon::prelude::*;
use serde::{Deserialize, Serialize};

/// Default number of folds: 5 (common practice).
pub const DEFAULT_FOLDS: usize = 5;

/// Probabilities below this are raised to it in the log-loss, so one confident mistake gives a
/// large finite loss (common practice).
pub const LOG_LOSS_FLOOR: f64 = 1e-15;

/// Cross-validated performance.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CrossValidation {
    /// Number of folds.
    pub folds: usize,
    /// Fraction of held-out samples whose most probable class is the true one.
    pub accuracy: f64,
    /// Mean held-out −ln p(true class).
    pub log_loss: f64,
    /// Class labels, in matrix order.
    pub classes: Vec<String>,
    /// `confusion[i][j]`: held-out samples of true class i predicted as class j.
    pub confusion: Vec<Vec<u64>>,
}

/// Fold of every sample: within each class, samples in input order are dealt to folds 0, 1,
/// …, k − 1 in turn, continuing from where the previous class stopped (stratified and
/// deterministic).
fn assign_folds(set: &TrainingSet, classes: &[String], k: usize) -> Vec<usize> {
    let mut fold = vec![0; set.len()];
    let mut next = 0;
    for c in classes {
        for (i, l) in set.labels().iter().enumerate() {
            if l == c {
                fold[i] = next % k;
                next += 1;
            }
        }
    }
    fold
}

/// Held-out samples of one fold: index and predicted probabilities.
type Held = Vec<(usize, Vec<f64>)>;

/// Stratified k-fold cross-validation of [`fit`] with `options`; folds are fitted in parallel.
///
/// Every class needs at least k samples, so each training part holds every class.
///
/// # Example
/// ```
/// use provenance_core::classifier::{cross_validate, FeatureSpace, FitOptions, TrainingSet};
/// use provenance_core::counts::Counting;
/// use provenance_core::diagram::Diagram;
/// let mut t = TrainingSet::new(FeatureSpace::Diagram(Diagram::Qfl));
/// for i in 0..30 {
///     let s = i as f64;
///     t.push_amounts("quartzose", &[70.0 + s % 20.0, 10.0 + s % 7.0, 10.0], Counting::Counted).unwrap();
///     t.push_amounts("lithic", &[20.0 + s % 9.0, 20.0, 50.0 + s % 13.0], Counting::Counted).unwrap();
/// }
/// let cv = cross_validate(&t, &FitOptions::default(), 5).unwrap();
/// assert_eq!(cv.accuracy, 1.0);
/// assert_eq!(cv.confusion, vec![vec![30, 0], vec![0, 30]]);
/// assert!(cross_validate(&t, &FitOptions::default(), 31).is_err());
/// ```
pub fn cross_validate(
    set: &TrainingSet,
    options: &FitOptions,
    k: usize,
) -> Result<CrossValidation> {
    let classes = set.classes();
    if k < 2 {
        return Err(Error::Usage {
            message: format!("--folds {k}: expected 2 or more folds"),
        });
    }
    for (c, n) in set.class_counts() {
        if n < k {
            return Err(Error::Training {
                file: set.name().to_string(),
                message: format!(
                    "class {c:?} has {n} sample(s), too few for {k}-fold cross-validation"
                ),
                expected: format!("at least {k} samples per class (or fewer --folds)"),
            });
        }
    }
    let fold = assign_folds(set, &classes, k);
    let results: Vec<Result<Held>> = (0..k)
        .into_par_iter()
        .map(|f| {
            let train: Vec<usize> = (0..set.len()).filter(|i| fold[*i] != f).collect();
            let model = fit(&set.subset(&train), options)?;
            Ok((0..set.len())
                .filter(|i| fold[*i] == f)
                .map(|i| {
                    (
                        i,
                        softmax(&model.weights, &model.intercepts, &set.features()[i]),
                    )
                })
                .collect())
        })
        .collect();
    let mut confusion = vec![vec![0u64; classes.len()]; classes.len()];
    let (mut right, mut loss) = (0usize, 0.0);
    for r in results {
        for (i, p) in r? {
            let truth = classes.binary_search(&set.labels()[i]).unwrap_or(0);
            let mut best = 0;
            for (j, v) in p.iter().enumerate() {
                if *v > p[best] {
                    best = j;
                }
            }
            confusion[truth][best] += 1;
            right += usize::from(best == truth);
            loss -= p[truth].max(LOG_LOSS_FLOOR).ln();
        }
    }
    let n = set.len() as f64;
    Ok(CrossValidation {
        folds: k,
        accuracy: right as f64 / n,
        log_loss: loss / n,
        classes,
        confusion,
    })
}

impl std::fmt::Display for CrossValidation {
    /// Accuracy, log-loss and the confusion matrix as a plain-text table.
    ///
    /// # Example
    /// ```
    /// use provenance_core::classifier::CrossValidation;
    /// let cv = CrossValidation {
    ///     folds: 5,
    ///     accuracy: 0.9,
    ///     log_loss: 0.25,
    ///     classes: vec!["arc".into(), "craton".into()],
    ///     confusion: vec![vec![9, 1], vec![1, 9]],
    /// };
    /// let t = cv.to_string();
    /// assert!(t.starts_with("5-fold cross-validation: accuracy 0.9000, log-loss 0.2500\n"));
    /// let row: Vec<&str> = t.lines().nth(3).unwrap().split_whitespace().collect();
    /// assert_eq!(row, ["arc", "9", "1"]);
    /// ```
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        writeln!(
            f,
            "{}-fold cross-validation: accuracy {:.4}, log-loss {:.4}",
            self.folds, self.accuracy, self.log_loss
        )?;
        writeln!(
            f,
            "confusion matrix (rows: true class, columns: predicted class)"
        )?;
        let width = self
            .classes
            .iter()
            .map(|c| c.chars().count())
            .chain(std::iter::once(5))
            .max()
            .unwrap_or(5);
        write!(f, "{:width$}", "")?;
        for c in &self.classes {
            write!(f, "  {c:>width$}")?;
        }
        writeln!(f)?;
        for (c, row) in self.classes.iter().zip(&self.confusion) {
            write!(f, "{c:width$}")?;
            for v in row {
                write!(f, "  {v:>width$}")?;
            }
            writeln!(f)?;
        }
        Ok(())
    }
}
