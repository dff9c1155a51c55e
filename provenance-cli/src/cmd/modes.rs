//! `sandprov modes`.

use crate::cli::ModesArgs;
use provenance_core::batch::{write_modes, ModesOptions};
use provenance_core::error::Result;
use provenance_core::output::Sink;

pub fn run(a: ModesArgs) -> Result<()> {
    let mut sink = Sink::open(a.output.output.as_deref(), &super::input_paths(&a.input))?;
    let reader = super::open_counts(&a.input)?;
    let options = ModesOptions {
        format: a
            .output
            .format
            .parse()
            .map_err(|message| provenance_core::error::Error::Usage { message })?,
        intervals: a.intervals,
    };
    let name = sink.name();
    write_modes(reader, &mut sink, &name, options)?;
    sink.finish()
}
