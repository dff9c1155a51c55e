//! A multinomial logistic classifier of provenance on log-ratio coordinates.
//!
//! Weltje (2006, Geol. Soc. Spec. Publ. 264:79-99) treated provenance fields as a classifier
//! and refitted them by multinomial logistic regression on log-ratios of reference sands of
//! known setting, giving probabilities instead of crisp fields (details from memory). sandprov
//! fits the same kind of model with linfa-logistic on the ilr coordinates (Egozcue et al. 2003,
//! Math. Geol. 35:279-300) of a diagram's composition or of the seven-part framework (Qm,
//! Qp + C, P, K, Lv, Ls, Lm), after multiplicative replacement of zeros.
//!
//! - [`FeatureSpace`]: which composition, and its features.
//! - [`TrainingSet`]: labelled compositions, read from a count table's label column.
//! - [`fit`] with [`FitOptions`]: L2-penalised maximum likelihood, convergence checked.
//! - [`cross_validate`]: stratified k-fold accuracy, log-loss, confusion matrix.
//! - [`Model`]: the saved model (JSON), with its features, classes, penalty, training size,
//!   data checksum and date.
//! - [`default_model`]: a field set's default model, a smooth version of its fields.
//! - [`NamedModel::resolve`]: a model as a command names it (a model file, or an embedded
//!   field set's id for its default model), applied to samples by [`NamedModel::apply`].
//!
//! A classifier's probabilities describe its training data. They support, and do not replace,
//! petrographic judgement.
//!
//! # Example
//! ```
//! use provenance_core::classifier::{cross_validate, fit, FeatureSpace, FitOptions, Model, TrainingSet};
//! use provenance_core::input::{CountReader, ReadOptions};
//! // An invented labelled table.
//! let mut table = String::from("sample,Qm,Qp,C,P,K,Lv,Ls,Lm,setting\n");
//! for i in 0..12 {
//!     table += &format!("C{i},{},8,2,{},{},5,6,4,craton\n", 250 + i * 3, 20 + i, 15);
//!     table += &format!("A{i},{},4,1,{},10,{},5,3,arc\n", 60 + i * 2, 120 + i, 110 - i);
//! }
//! let r = CountReader::from_reader("ref.csv", std::io::Cursor::new(table), ReadOptions::default())?;
//! let set = TrainingSet::read(r, "setting", FeatureSpace::Framework)?;
//! let opts = FitOptions::default();
//! let cv = cross_validate(&set, &opts, 4)?;
//! assert_eq!(cv.accuracy, 1.0);
//! let model = Model::new(fit(&set, &opts)?, &set, "2025-01-01", "ref.csv, column setting", Some(cv));
//! assert_eq!(model.classes, ["arc", "craton"]);
//! assert_eq!(model.training.samples, 24);
//! # Ok::<(), provenance_core::error::Error>(())
//! ```

mod cv;
mod features;
mod fit;
mod from_fields;
mod json_location;
mod model;
mod named;
mod newton;
#[cfg(test)]
mod tests;
mod training;

pub use cv::{cross_validate, CrossValidation, DEFAULT_FOLDS, LOG_LOSS_FLOOR};
pub use features::{FeatureProblem, FeatureSpace, FRAMEWORK_PARTS};
pub use fit::{
    fit, Convergence, FitOptions, LogisticFit, Solver, DEFAULT_L2, DEFAULT_TOLERANCE,
    NEWTON_MAX_PARAMETERS,
};
pub use from_fields::{
    default_model, default_training_set, COMPOSITIONS_PER_FIELD, DEFAULT_MODEL_NOTE,
    DEFAULT_MODEL_SEED, POINTS_PER_COMPOSITION,
};
pub use model::{utc_date, Features, Model, Training, MODEL_FORMAT, MODEL_NOTE, MODEL_VERSION};
pub use named::{ClassifierResult, ModelSource, NamedModel};
pub use training::TrainingSet;
