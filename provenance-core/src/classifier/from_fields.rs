//! Default classifiers: a smooth version of a published field set.

use super::features::FeatureSpace;
use super::fit::{fit, FitOptions};
use super::model::Model;
use super::training::TrainingSet;
use crate::counts::Counting;
use crate::error::Result;
use crate::fields::FieldSet;
use crate::membership::stream;
use rand::Rng;

/// Compositions drawn per field for a default model.
pub const COMPOSITIONS_PER_FIELD: usize = 400;
/// Points of the count each drawn composition is rounded to, so its zeros are replaced as a
/// real count's would be (400 points: between the 300 and 500 points of common practice).
pub const POINTS_PER_COMPOSITION: f64 = 400.0;
/// Seed of the draws, fixed so the model rebuilds identically.
pub const DEFAULT_MODEL_SEED: u64 = 1985;

/// What every default model says about itself.
pub const DEFAULT_MODEL_NOTE: &str = "Default model: fitted to compositions drawn uniformly \
over each field of the shipped field set, so its probabilities are a smooth version of the \
published fields (with boundaries straight in ilr coordinates), not a fit to sands of known \
setting. The shipped vertices are transcribed from memory and approximate. Probabilities \
support rather than replace petrographic judgement.";

/// The default model of a field set: [`COMPOSITIONS_PER_FIELD`] compositions drawn uniformly
/// over the area of each field (rejection from its bounding box in the plane of the triangle,
/// with a fixed seed), each rounded to a count of [`POINTS_PER_COMPOSITION`] points, labelled
/// with the field's name, fitted by [`fit`] with the default penalty. The result is the same
/// on every run; `date` only fills the model's date.
///
/// # Example
/// ```
/// use provenance_core::classifier::default_model;
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::fields::FieldSet;
/// let set = FieldSet::load("dickinson1985-qfl").unwrap();
/// let m = default_model(&set, "2025-01-01").unwrap();
/// assert_eq!(m.classes.len(), 7);
/// assert_eq!(m.training.samples, 7 * 400);
/// let quartzose = Sample::counted("q", Framework { qm: 380.0, qp: 10.0, p: 5.0, lm: 5.0, ..Default::default() });
/// let p = m.probabilities(&quartzose).unwrap();
/// let top = m.classes[(0..7).max_by(|a, b| p[*a].total_cmp(&p[*b])).unwrap()].as_str();
/// assert_eq!(top, "craton interior");
/// assert_eq!(default_model(&set, "2025-01-01").unwrap(), m); // deterministic
/// ```
pub fn default_model(set: &FieldSet, date: &str) -> Result<Model> {
    let training = default_training_set(set);
    let fitted = fit(&training, &FitOptions::default())?;
    let source = format!(
        "{COMPOSITIONS_PER_FIELD} compositions drawn uniformly over each field of {} (seed {DEFAULT_MODEL_SEED}), rounded to {POINTS_PER_COMPOSITION}-point counts",
        set.id
    );
    let mut model = Model::new(fitted, &training, date, &source, None);
    model.note = DEFAULT_MODEL_NOTE.into();
    Ok(model)
}

/// The training data of [`default_model`]: the drawn compositions, labelled by field.
///
/// # Example
/// ```
/// use provenance_core::classifier::default_training_set;
/// use provenance_core::fields::FieldSet;
/// let t = default_training_set(&FieldSet::load("dickinson-suczek1979-qmpk").unwrap());
/// assert_eq!(t.len(), 400 * t.classes().len());
/// ```
pub fn default_training_set(set: &FieldSet) -> TrainingSet {
    let space = FeatureSpace::Diagram(set.diagram);
    let mut training = TrainingSet::new(space).named(&set.file);
    for (k, field) in set.fields.iter().enumerate() {
        let v = field.polygon.vertices();
        let (mut a0, mut a1, mut c0, mut c1) = (100.0f64, 0.0f64, 100.0f64, 0.0f64);
        for p in v {
            a0 = a0.min(p[0]);
            a1 = a1.max(p[0]);
            c0 = c0.min(p[2]);
            c1 = c1.max(p[2]);
        }
        let mut rng = stream(DEFAULT_MODEL_SEED, k as u64, set.diagram.index() as u64);
        let mut drawn = 0;
        let mut tries = 0u64;
        while drawn < COMPOSITIONS_PER_FIELD && tries < 10_000_000 {
            tries += 1;
            let a = a0 + (a1 - a0) * rng.random::<f64>();
            let c = c0 + (c1 - c0) * rng.random::<f64>();
            let p = [a, 100.0 - a - c, c];
            if p[1] < 0.0 || !field.polygon.contains(p) {
                continue;
            }
            let counts: Vec<f64> = p
                .iter()
                .map(|x| (x / 100.0 * POINTS_PER_COMPOSITION).round())
                .collect();
            if training
                .push_amounts(&field.name, &counts, Counting::Counted)
                .is_ok()
            {
                drawn += 1;
            }
        }
    }
    training
}
