//! `sandprov plot`.

use crate::cli::PlotArgs;
use provenance_core::diagram::Diagram;
use provenance_core::error::{Error, Result};
use provenance_core::output::{check_not_input, AtomicFile};
use provenance_core::petrofacies::{GroupOptions, Petrofacies, Table};
use provenance_core::plot::export::{render, ImageFormat};
use provenance_core::plot::{
    choose_field_sets, DensityMode, Figure, FigureOptions, FigureSize, GridStep, GroupBy,
};
use std::io::Write;

pub fn run(a: PlotArgs) -> Result<()> {
    let usage = |message: String| Error::Usage { message };
    let format = ImageFormat::from_path(&a.output).ok_or_else(|| {
        usage(format!(
            "output {} has no known extension, expected .svg, .png or .pdf",
            a.output.display()
        ))
    })?;
    let mut diagrams: Vec<Diagram> = Vec::new();
    for id in &a.diagram {
        let d: Diagram = id.parse().map_err(usage)?;
        if !diagrams.contains(&d) {
            diagrams.push(d);
        }
    }
    let size: FigureSize = a.size.parse().map_err(usage)?;
    let options = FigureOptions {
        size,
        labels: a.labels,
        grid: if a.grid == "20" {
            GridStep::Twenty
        } else {
            GridStep::Ten
        },
        density: match a.density.as_str() {
            "markers" => DensityMode::Never,
            "density" => DensityMode::Always,
            _ => DensityMode::Auto,
        },
        ..FigureOptions::default()
    };
    check_not_input(&a.output, &super::input_paths(&a.input))?;

    let reader = super::open_counts(&a.input)?;
    let group_by =
        a.by.as_deref()
            .map(|name| GroupBy::find(&reader, name))
            .transpose()?;
    let field_sets = choose_field_sets(&diagrams, &a.fields)?;
    let mut builder = Figure::builder(&diagrams, group_by);
    let table = if a.means || a.regions {
        Some(Table::read(reader)?)
    } else {
        for sample in reader {
            builder.push(&sample?)?;
        }
        None
    };
    if let Some(table) = &table {
        for sample in &table.samples {
            builder.push(sample)?;
        }
        if let (true, Some(by)) = (a.means, a.by.as_deref()) {
            let column = table.column(by)?;
            builder.draw_group_means(&Petrofacies::of(table, &column, GroupOptions::default())?);
        }
        if a.regions {
            builder.draw_sample_regions(&table.samples, 0.95);
        }
    }
    builder.draw_field_sets(&field_sets);
    let bytes = render(&builder.finish(options), format)?;

    let mut file = AtomicFile::create(&a.output)?;
    file.write_all(&bytes).map_err(|source| Error::Write {
        path: a.output.display().to_string(),
        source,
    })?;
    file.commit()
}
