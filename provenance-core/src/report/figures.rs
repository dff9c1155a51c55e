//! The report's figures: the ternary diagrams with fields (and group means when grouped) and,
//! with a height column, the stratigraphic section.

use super::Computed;
use crate::diagram::Diagram;
use crate::error::Result;
use crate::petrofacies::section_svg;
use crate::plot::{choose_field_sets, Figure, FigureOptions, FigureSize, GroupBy};

/// One figure: its file name under `figures/`, a caption, and the SVG.
pub(crate) struct ReportFigure {
    pub file: String,
    pub caption: String,
    pub svg: String,
}

/// QFL and QmFLt always; the other diagrams when some sample has points in them.
fn diagrams(c: &Computed) -> Vec<Diagram> {
    Diagram::ALL
        .into_iter()
        .filter(|d| {
            matches!(d, Diagram::Qfl | Diagram::Qmflt)
                || c.modes.iter().any(|m| m.get(*d).is_some())
        })
        .collect()
}

pub(crate) fn figures(c: &Computed, by: Option<&str>) -> Result<Vec<ReportFigure>> {
    let mut out = Vec::new();
    let group_by = match by {
        Some(name) => {
            let column = c.data.column(name)?;
            Some(GroupBy {
                file: c.data.file.clone(),
                column: column.name().to_string(),
                index: column.index,
                file_column: column.column.index,
            })
        }
        None => None,
    };
    for d in diagrams(c) {
        let mut b = Figure::builder(&[d], group_by.clone());
        for s in &c.data.samples {
            b.push(s)?;
        }
        // The report's own field sets where it has one for this diagram.
        let set = c.locator.sets().iter().find(|s| s.diagram == d).cloned();
        let sets = match set {
            Some(s) => vec![Some(s)],
            None => choose_field_sets(&[d], &[]).unwrap_or_else(|_| vec![None]),
        };
        b.draw_field_sets(&sets);
        if let Some(p) = &c.petrofacies {
            b.draw_group_means(p);
        }
        let fig = b.finish(FigureOptions {
            size: FigureSize::Width(120.0),
            ..FigureOptions::default()
        });
        let caption = match &sets[0] {
            Some(s) => format!(
                "{}: samples with the {} fields ({} {}; vertices from memory, check against the original).",
                d.label(),
                s.title,
                s.source.author,
                s.source.year
            ),
            None => format!("{}: samples (no published field set is shipped for this diagram).", d.label()),
        };
        out.push(ReportFigure {
            file: format!("{}.svg", d.id()),
            caption: if c.petrofacies.is_some() {
                format!("{caption} Large symbols: group geometric means with 95% confidence (solid) and prediction (dashed) regions (Weltje 2002).")
            } else {
                caption
            },
            svg: fig.to_svg()?,
        });
    }
    if let Some((section, changes)) = &c.section {
        let svg = section_svg::render(
            section,
            Some(changes),
            &section_svg::FigureOptions::default(),
        )?;
        out.push(ReportFigure {
            file: "section.svg".into(),
            caption: format!(
                "Up-section: Q, F, L and Lv, Ls, Lm with ±1σ counting error, and {} change point(s) in the QFL ilr sequence.",
                changes.changes.len()
            ),
            svg,
        });
    }
    Ok(out)
}

/// The SVG ready to sit inline in HTML: no XML declaration, ids made unique per figure.
pub(crate) fn inline(svg: &str, prefix: &str) -> String {
    let body = match svg.find("<svg") {
        Some(i) => &svg[i..],
        None => svg,
    };
    body.replace(" id=\"", &format!(" id=\"{prefix}-"))
}
