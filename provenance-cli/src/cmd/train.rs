//! `sandprov train`.

use crate::cli::TrainArgs;
use provenance_core::classifier::{
    cross_validate, fit, utc_date, FeatureSpace, FitOptions, Model, TrainingSet,
};
use provenance_core::error::{Error, Result};
use provenance_core::output::check_not_input;

/// Today's date (UTC), or the date of `SOURCE_DATE_EPOCH` when set, for reproducible rebuilds
/// (the reproducible-builds.org convention).
pub(crate) fn today() -> String {
    let epoch = std::env::var("SOURCE_DATE_EPOCH")
        .ok()
        .and_then(|v| v.trim().parse::<i64>().ok());
    let secs = epoch.unwrap_or_else(|| {
        std::time::SystemTime::now()
            .duration_since(std::time::UNIX_EPOCH)
            .map_or(0, |d| d.as_secs() as i64)
    });
    utc_date(secs)
}

pub fn run(a: TrainArgs) -> Result<()> {
    let space: FeatureSpace = a
        .diagram
        .parse()
        .map_err(|message| Error::Usage { message })?;
    if a.folds == 1 {
        return Err(Error::Usage {
            message: "--folds 1: expected at least 2 folds, or 0 to skip cross-validation".into(),
        });
    }
    let inputs = super::input_paths(&a.input);
    check_not_input(&a.output, &inputs)?;
    let reader = super::open_counts(&a.input)?;
    let file = reader.file().to_string();
    let set = TrainingSet::read(reader, &a.label, space)?;
    if set.is_empty() {
        return Err(Error::EmptyInput { file });
    }
    let options = FitOptions {
        l2: a.l2,
        ..FitOptions::default()
    };
    options.check()?;
    let cv = (a.folds >= 2)
        .then(|| cross_validate(&set, &options, a.folds))
        .transpose()?;
    let fitted = fit(&set, &options)?;
    let source = format!("{file}, label column {:?}", a.label);
    let model = Model::new(fitted, &set, &today(), &source, cv);
    model.save(&a.output)?;
    print!("{}", model.summary());
    println!("model written to {}", a.output.display());
    Ok(())
}
