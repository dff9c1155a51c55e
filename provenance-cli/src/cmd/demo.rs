//! `sandprov demo`: the report on the bundled, invented demo data.

use crate::cli::DemoArgs;
use provenance_core::demo;
use provenance_core::error::Result;
use provenance_core::report::build;

pub fn run(a: DemoArgs) -> Result<()> {
    let progress = crate::progress::Progress::start(a.quiet, "building the demo report");
    let files = build(&demo::dataset()?, &demo::report_options())?;
    progress.step("writing the report folder");
    files.write_to(&a.output, &[])?;
    progress.finish();
    if !a.quiet {
        println!("{}", a.output.join("report.html").display());
    }
    Ok(())
}
