//! `sandprov groups`.

use crate::cli::GroupsArgs;
use provenance_core::error::{Error, Result};
use provenance_core::output::groups_table::{
    comparisons_csv, groups_csv, groups_json, regions_csv,
};
use provenance_core::output::{check_not_input, Format, Sink};
use provenance_core::petrofacies::{GroupOptions, Petrofacies, Table};
use std::io::Write;

pub fn run(a: GroupsArgs) -> Result<()> {
    let format: Format = a
        .output
        .format
        .parse()
        .map_err(|message| Error::Usage { message })?;
    let options = GroupOptions {
        level: a.level,
        permutations: a.permutations,
        seed: a.seed,
        ..Default::default()
    };
    options.check()?;
    let inputs = super::input_paths(&a.input);
    let extra: Vec<&std::path::Path> = a
        .pairwise
        .iter()
        .chain(&a.regions)
        .map(|p| p.as_path())
        .collect();
    for (i, p) in extra.iter().enumerate() {
        check_not_input(p, &inputs)?;
        if a.output.output.as_deref() == Some(*p) || extra[..i].contains(p) {
            return Err(Error::Usage {
                message: format!(
                    "{} is named for two outputs, expected a different path for each",
                    p.display()
                ),
            });
        }
    }
    let table = Table::read(super::open_counts(&a.input)?)?;
    let by = table.column(&a.by)?;
    let result = Petrofacies::of(&table, &by, options)?;
    let main = match format {
        Format::Json => groups_json(&result),
        Format::Csv => groups_csv(&result),
    };
    // Every output is complete in memory before any file is committed.
    let mut sinks = vec![(Sink::open(a.output.output.as_deref(), &inputs)?, main)];
    if let Some(p) = &a.pairwise {
        sinks.push((Sink::open(Some(p), &inputs)?, comparisons_csv(&result)));
    }
    if let Some(p) = &a.regions {
        sinks.push((Sink::open(Some(p), &inputs)?, regions_csv(&result)));
    }
    for (mut sink, bytes) in sinks {
        let name = sink.name();
        sink.write_all(&bytes)
            .map_err(|source| Error::Write { path: name, source })?;
        sink.finish()?;
    }
    Ok(())
}
