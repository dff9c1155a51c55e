//! One module per subcommand; each maps its arguments to core calls.

mod demo;
mod fields;
mod groups;
mod modes;
mod name;
mod plan;
mod plot;
mod report;
mod section;
mod setting;
mod train;

use crate::cli::{Cli, Command, InputArgs};
use provenance_core::error::Result;
use provenance_core::input::{CountReader, Mapping, ReadOptions};

/// Run a parsed command line.
pub fn run(cli: Cli) -> Result<()> {
    match cli.command {
        Command::Modes(a) => modes::run(a),
        Command::Plan(a) => plan::run(a),
        Command::Name(a) => name::run(a),
        Command::Report(a) => report::run(a),
        Command::Demo(a) => demo::run(a),
        Command::Train(a) => train::run(a),
        Command::Fields(c) => fields::run(c),
        Command::Setting(a) => setting::run(a),
        Command::Plot(a) => plot::run(a),
        Command::Groups(a) => groups::run(a),
        Command::Section(a) => section::run(a),
    }
}

/// Open the count table as the input arguments say.
pub fn open_counts(a: &InputArgs) -> Result<CountReader> {
    let mapping = a.scheme.as_deref().map(Mapping::from_path).transpose()?;
    CountReader::from_path(
        &a.counts,
        ReadOptions {
            percent: a.percent,
            mapping,
        },
    )
}

/// Every input path of the arguments, to refuse an output over one of them.
pub fn input_paths(a: &InputArgs) -> Vec<&std::path::Path> {
    let mut v = vec![a.counts.as_path()];
    v.extend(a.scheme.as_deref());
    v
}
