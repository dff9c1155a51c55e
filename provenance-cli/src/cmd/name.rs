//! `sandprov name`.

use crate::cli::NameArgs;
use provenance_core::error::{Error, Result};
use provenance_core::naming::{write_names, NamesOutput, SchemeSet};
use provenance_core::output::Sink;

pub fn run(a: NameArgs) -> Result<()> {
    let mut schemes = SchemeSet::standard();
    for spec in &a.chert {
        schemes.apply_chert_option(spec)?;
    }
    let output = if a.explain {
        NamesOutput::Explain
    } else {
        NamesOutput::Table(
            a.output
                .format
                .parse()
                .map_err(|message| Error::Usage { message })?,
        )
    };
    let mut sink = Sink::open(a.output.output.as_deref(), &super::input_paths(&a.input))?;
    let reader = super::open_counts(&a.input)?;
    let name = sink.name();
    write_names(reader, &mut sink, &name, &schemes, output)?;
    sink.finish()
}
