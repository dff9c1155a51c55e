//! `sandprov report`.

use crate::cli::ReportArgs;
use provenance_core::error::Result;
use provenance_core::petrofacies::Table;
use provenance_core::report::{build, ReportOptions};

pub fn run(a: ReportArgs) -> Result<()> {
    let data = Table::read(super::open_counts(&a.input)?)?;
    let options = ReportOptions {
        by: a.by,
        height: a.height,
        fields: a.fields,
    };
    let files = build(&data, &options)?;
    files.write_to(&a.output, &super::input_paths(&a.input))?;
    if !a.quiet {
        println!("{}", a.output.join("report.html").display());
    }
    Ok(())
}
