//! `sandprov report`.

use crate::cli::ReportArgs;
use provenance_core::error::Result;
use provenance_core::petrofacies::Table;
use provenance_core::report::{build, ReportOptions};

pub fn run(a: ReportArgs) -> Result<()> {
    let progress = crate::progress::Progress::start(a.quiet, "reading the count table");
    let data = Table::read(super::open_counts(&a.input)?)?;
    progress.step("computing modes, names, fields, groups and figures");
    let options = ReportOptions {
        by: a.by,
        height: a.height,
        fields: a.fields,
    };
    let files = build(&data, &options)?;
    progress.step("writing the report folder");
    files.write_to(&a.output, &super::input_paths(&a.input))?;
    progress.finish();
    if !a.quiet {
        println!("{}", a.output.join("report.html").display());
    }
    Ok(())
}
