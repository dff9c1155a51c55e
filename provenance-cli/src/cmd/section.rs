//! `sandprov section`.

use crate::cli::SectionArgs;
use provenance_core::diagram::Diagram;
use provenance_core::error::{Error, Result};
use provenance_core::membership::MembershipOptions;
use provenance_core::output::changes_table::{changes_csv, changes_json};
use provenance_core::output::{check_not_input, Sink};
use provenance_core::petrofacies::section_svg::{render, FigureOptions};
use provenance_core::petrofacies::{ChangeOptions, ChangePoints, Ordering, Section, Table};
use provenance_core::plot::export::{encode, ImageFormat};
use provenance_core::setting::Locator;
use std::io::Write;
use std::path::Path;

fn extension(p: &Path) -> String {
    p.extension()
        .map(|e| e.to_string_lossy().to_ascii_lowercase())
        .unwrap_or_default()
}

fn usage(message: String) -> Error {
    Error::Usage { message }
}

/// The figure format from `-o`.
fn figure_format(p: &Path) -> Result<ImageFormat> {
    ImageFormat::from_path(p).ok_or_else(|| {
        usage(format!(
            "-o {}: expected a path ending in .svg, .png or .pdf",
            p.display()
        ))
    })
}

pub fn run(a: SectionArgs) -> Result<()> {
    let format = figure_format(&a.output)?;
    let changes_csv_format = match &a.changes {
        None => None,
        Some(p) => match extension(p).as_str() {
            "json" => Some(false),
            "csv" => Some(true),
            _ => {
                return Err(usage(format!(
                    "--changes {}: expected a path ending in .json or .csv",
                    p.display()
                )))
            }
        },
    };
    let diagrams = a
        .diagram
        .iter()
        .map(|d| d.parse::<Diagram>().map_err(usage))
        .collect::<Result<Vec<_>>>()?;
    let options = ChangeOptions {
        diagrams,
        penalty_factor: a.penalty,
        min_segment: a.min_segment,
    };
    options.check()?;
    if !(a.width_mm >= 60.0 && a.width_mm <= 1000.0 && a.height_mm >= 60.0 && a.height_mm <= 1000.0)
    {
        return Err(usage(format!(
            "page {} × {} mm: expected a width and height from 60 to 1000 mm",
            a.width_mm, a.height_mm
        )));
    }
    let inputs = super::input_paths(&a.input);
    check_not_input(&a.output, &inputs)?;
    if let Some(c) = &a.changes {
        check_not_input(c, &inputs)?;
        if c == &a.output {
            return Err(usage(format!(
                "{} is named for both the figure and the change points, expected two paths",
                c.display()
            )));
        }
    }
    let table = Table::read(super::open_counts(&a.input)?)?;
    let position = table.column(&a.height)?;
    let by = a.by.as_deref().map(|b| table.column(b)).transpose()?;
    let ordering = if a.depth {
        Ordering::Depth
    } else {
        Ordering::Height
    };
    let mut section = Section::of(&table, &position, ordering, by.as_ref())?;
    // The stacked bar of provenance-group membership on QFL (Dickinson 1985 fields).
    let locator = Locator::embedded()?.with_membership(MembershipOptions::default(), None)?;
    section.fill_membership(&locator, Diagram::Qfl);
    let changes = ChangePoints::of_section(&section, &options)?;
    let figure = FigureOptions {
        width_mm: a.width_mm,
        height_mm: a.height_mm,
        title: a.title.clone(),
        ..Default::default()
    };
    let svg = render(&section, Some(&changes), &figure)?;
    // Both outputs are complete in memory before either file is committed.
    let mut outputs = vec![(Sink::open(Some(&a.output), &inputs)?, encode(svg, format)?)];
    if let (Some(p), Some(csv)) = (&a.changes, changes_csv_format) {
        let bytes = if csv {
            changes_csv(&changes)
        } else {
            changes_json(&changes)
        };
        outputs.push((Sink::open(Some(p), &inputs)?, bytes));
    }
    for (mut sink, bytes) in outputs {
        let name = sink.name();
        sink.write_all(&bytes)
            .map_err(|source| Error::Write { path: name, source })?;
        sink.finish()?;
    }
    let found: Vec<String> = changes
        .changes
        .iter()
        .map(|c| {
            format!(
                "{} ({}) | {} ({})",
                c.below_position, c.below_sample, c.above_position, c.above_sample
            )
        })
        .collect();
    match changes.note {
        Some(note) => eprintln!("sandprov: no change-point search: {note}"),
        None => eprintln!(
            "sandprov: {} change point(s) in {} up-section{}{}",
            found.len(),
            section.axis,
            if found.is_empty() { "" } else { ": " },
            found.join("; ")
        ),
    }
    Ok(())
}
