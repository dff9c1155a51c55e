//! `sandprov report`.

use crate::cli::ReportArgs;
use provenance_core::classifier::NamedModel;
use provenance_core::error::Result;
use provenance_core::petrofacies::Table;
use provenance_core::report::{build_observed, Observer, ReportOptions};
use std::path::Path;

/// The `--model` value resolved (a model file, or an embedded set's default model).
pub(crate) fn model(spec: Option<&str>) -> Result<Option<NamedModel>> {
    spec.map(|s| NamedModel::resolve(s, &super::train::today()))
        .transpose()
}

pub fn run(a: ReportArgs) -> Result<()> {
    let progress = crate::progress::Progress::start(a.quiet, "reading the count table");
    let data = Table::read(super::open_counts(&a.input)?)?;
    let options = ReportOptions {
        by: a.by,
        height: a.height,
        fields: a.fields,
        model: model(a.model.as_deref())?,
    };
    // Field-set and model files are inputs too: never inside the folder that is replaced.
    let mut inputs = super::input_paths(&a.input);
    inputs.extend(options.fields.iter().map(Path::new).filter(|p| p.exists()));
    inputs.extend(options.model.as_ref().and_then(NamedModel::file));
    let files = build_observed(&data, &options, &progress)?;
    progress.step("writing the report folder", 0);
    files.write_to(&a.output, &inputs)?;
    progress.finish();
    if !a.quiet {
        println!("{}", a.output.join("report.html").display());
    }
    Ok(())
}
