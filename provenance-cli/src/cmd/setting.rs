//! `sandprov setting`.

use crate::cli::SettingArgs;
use provenance_core::classifier::NamedModel;
use provenance_core::error::{Error, Result};
use provenance_core::fields::FieldSet;
use provenance_core::membership::MembershipOptions;
use provenance_core::output::Sink;
use provenance_core::setting::{write_setting, Locator};
use std::path::Path;

pub fn run(a: SettingArgs) -> Result<()> {
    let mut locator = if a.fields.is_empty() {
        Locator::embedded()?
    } else {
        Locator::new(
            a.fields
                .iter()
                .map(|s| FieldSet::load(s))
                .collect::<Result<Vec<_>>>()?,
        )?
    };
    if !a.no_membership {
        let options = MembershipOptions {
            draws: a.draws,
            seed: a.seed,
            ..MembershipOptions::default()
        };
        let classifier = a
            .model
            .as_deref()
            .map(|spec| NamedModel::resolve(spec, &super::train::today()))
            .transpose()?;
        locator = locator.with_membership(options, classifier)?;
    }
    let format = a
        .output
        .format
        .parse()
        .map_err(|message| Error::Usage { message })?;
    let mut inputs = super::input_paths(&a.input);
    inputs.extend(a.fields.iter().map(Path::new).filter(|p| p.exists()));
    inputs.extend(a.model.iter().map(Path::new).filter(|p| p.exists()));
    let mut sink = Sink::open(a.output.output.as_deref(), &inputs)?;
    let reader = super::open_counts(&a.input)?;
    let name = sink.name();
    write_setting(reader, &mut sink, &name, &locator, format)?;
    sink.finish()
}
