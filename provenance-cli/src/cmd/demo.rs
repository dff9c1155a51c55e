//! `sandprov demo`: the report on the bundled, invented demo data.

use crate::cli::DemoArgs;
use provenance_core::classifier::NamedModel;
use provenance_core::demo;
use provenance_core::error::Result;
use provenance_core::report::{build_observed, Observer};

pub fn run(a: DemoArgs) -> Result<()> {
    let progress = crate::progress::Progress::start(a.quiet, "building the demo report");
    let mut options = demo::report_options();
    options.model = super::report::model(a.model.as_deref())?;
    let inputs: Vec<&std::path::Path> = options.model.iter().filter_map(NamedModel::file).collect();
    let files = build_observed(&demo::dataset()?, &options, &progress)?;
    progress.step("writing the report folder", 0);
    files.write_to(&a.output, &inputs)?;
    progress.finish();
    if !a.quiet {
        println!("{}", a.output.join("report.html").display());
    }
    Ok(())
}
