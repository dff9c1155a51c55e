//! Page layout: panels side by side (wrapping into rows when they would get too narrow), a
//! shared legend below them and the source lines at the foot.

use super::density::DensityClasses;
use super::figure::Figure;
use super::mapping::{PagePoint, TernaryMapping};
use super::size::{mm_to_units, pt};
use super::text::{fit_width, sanitize, text_width, trade_notation, CAP_HEIGHT};

/// Outer margin, points.
pub const MARGIN_PT: f64 = 4.0;
/// Space between panels, points.
pub const PANEL_GAP_PT: f64 = 8.0;
/// Panels narrower than this wrap into a new row, millimetres (our choice: a triangle much
/// narrower than 55 mm cannot hold field names at 6 pt).
pub const MIN_PANEL_MM: f64 = 55.0;
/// Length of tick marks, points.
pub const TICK_PT: f64 = 2.0;
/// Gap between a tick and its value, and between a vertex and its pole label, points.
pub const GAP_PT: f64 = 1.5;
/// Half-width of a sample marker, points.
pub const MARKER_PT: f64 = 1.7;

/// Where one panel sits.
///
/// # Example
/// ```
/// use provenance_core::diagram::Diagram;
/// use provenance_core::plot::{Figure, FigureOptions};
/// let fig = Figure::builder(&[Diagram::Qfl], None).finish(FigureOptions::default());
/// let layout = fig.layout();
/// let p = &layout.panels[0];
/// assert!(p.mapping.vertex(1).x > p.left && p.mapping.vertex(2).x < p.left + p.width);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct PanelLayout {
    /// The triangle.
    pub mapping: TernaryMapping,
    /// Left edge of the panel box.
    pub left: f64,
    /// Top edge of the panel box.
    pub top: f64,
    /// Width of the panel box.
    pub width: f64,
    /// Height of the panel box.
    pub height: f64,
}

/// What a legend entry shows.
///
/// # Example
/// ```
/// use provenance_core::plot::layout::LegendKey;
/// assert_ne!(LegendKey::Group(0), LegendKey::Density(0));
/// ```
#[derive(Debug, Clone, PartialEq)]
pub enum LegendKey {
    /// The legend title.
    Title,
    /// A group's symbol (index into the groups).
    Group(usize),
    /// A density class swatch (class index).
    Density(usize),
}

/// One legend entry: its key, text, and where it starts (left edge, vertical centre).
#[derive(Debug, Clone, PartialEq)]
pub struct LegendItem {
    /// What it shows.
    pub key: LegendKey,
    /// Its text.
    pub text: String,
    /// Left edge of the entry.
    pub x: f64,
    /// Vertical centre of the entry's row.
    pub y: f64,
}

/// A line of text at the foot of the figure.
#[derive(Debug, Clone, PartialEq)]
pub struct FootLine {
    /// The text.
    pub text: String,
    /// Left edge.
    pub x: f64,
    /// Baseline.
    pub y: f64,
}

/// The whole page, in internal units (0.1 pt).
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::diagram::Diagram;
/// use provenance_core::plot::layout::LegendKey;
/// use provenance_core::plot::{Figure, FigureOptions, GroupBy};
/// let by = GroupBy { file: "t.csv".into(), column: "unit".into(), index: 0, file_column: 10 };
/// let mut b = Figure::builder(&[Diagram::Qfl], Some(by));
/// let mut s = Sample::counted("A", Framework { qm: 10.0, p: 5.0, ..Default::default() });
/// s.metadata = vec!["lower".into()];
/// b.push(&s)?;
/// let l = b.finish(FigureOptions::default()).layout();
/// // A title and one entry below the triangle; no overlays, so no foot lines.
/// assert_eq!(l.legend.len(), 2);
/// assert_eq!((l.legend[1].key.clone(), l.legend[1].text.as_str()), (LegendKey::Group(0), "lower"));
/// assert!(l.legend[0].y > l.panels[0].top + l.panels[0].height);
/// assert!(l.foot.is_empty() && l.height > l.legend[0].y);
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Layout {
    /// Page width.
    pub width: f64,
    /// Page height.
    pub height: f64,
    /// One entry per panel, in figure order.
    pub panels: Vec<PanelLayout>,
    /// Legend entries.
    pub legend: Vec<LegendItem>,
    /// Source lines.
    pub foot: Vec<FootLine>,
}

/// Horizontal room a panel keeps on each side of its triangle for tick values and the lower
/// pole labels.
fn side_pad(fig: &Figure) -> f64 {
    let f = &fig.options.fonts;
    let ticks = pt(TICK_PT + GAP_PT) + text_width("80", pt(f.ticks));
    let poles = fig
        .panels
        .iter()
        .flat_map(|p| p.diagram.poles()[1..].to_vec())
        .map(|s| text_width(&trade_notation(s), pt(f.poles)) / 2.0)
        .fold(0.0, f64::max);
    ticks.max(poles) + pt(1.0)
}

/// Room above the apex for the top pole label.
pub(crate) fn top_pad(fig: &Figure) -> f64 {
    let f = &fig.options.fonts;
    pt(GAP_PT * 2.0) + pt(f.poles) * CAP_HEIGHT + pt(f.notes).max(pt(2.0))
}

/// Room below the base for tick values and the lower pole labels.
fn bottom_pad(fig: &Figure) -> f64 {
    let f = &fig.options.fonts;
    let ticks = pt(TICK_PT * 0.87 + GAP_PT) + pt(f.ticks) * 1.05;
    let poles = pt(GAP_PT * 2.0) + pt(f.poles) * 1.05;
    ticks.max(poles) + pt(1.0)
}

/// Row height of the legend.
fn legend_row(fig: &Figure) -> f64 {
    (pt(fig.options.fonts.legend) * 1.45).max(pt(MARKER_PT * 2.0 + 2.0))
}

/// Lay out a figure; `density` gives the shading classes when any panel is shaded.
pub(crate) fn layout(fig: &Figure, density: Option<&DensityClasses>) -> Layout {
    let width = mm_to_units(fig.options.size.width_mm());
    let margin = pt(MARGIN_PT);
    let gap = pt(PANEL_GAP_PT);
    let n = fig.panels.len().max(1);
    let inner = width - 2.0 * margin;
    let fit = ((inner + gap) / (mm_to_units(MIN_PANEL_MM) + gap))
        .floor()
        .max(1.0) as usize;
    let columns = n.min(fit);
    let panel_w = (inner - gap * (columns as f64 - 1.0)) / columns as f64;
    let pad = side_pad(fig);
    let side = (panel_w - 2.0 * pad).max(pt(20.0));
    let (top, bottom) = (top_pad(fig), bottom_pad(fig));
    let panel_h = top + side * crate::geometry::SQRT3_2 + bottom;
    let rows = n.div_ceil(columns);

    let panels = (0..fig.panels.len())
        .map(|i| {
            let (row, col) = (i / columns, i % columns);
            let left = margin + col as f64 * (panel_w + gap);
            let top_edge = margin + row as f64 * (panel_h + pt(PANEL_GAP_PT * 0.75));
            let mapping = TernaryMapping::new(
                PagePoint {
                    x: left + (panel_w - side) / 2.0,
                    y: top_edge + panel_h - bottom,
                },
                side,
            );
            PanelLayout {
                mapping,
                left,
                top: top_edge,
                width: panel_w,
                height: panel_h,
            }
        })
        .collect();
    let mut y = margin + rows as f64 * panel_h + (rows as f64 - 1.0) * pt(PANEL_GAP_PT * 0.75);

    let legend = legend_items(fig, density, margin, inner, &mut y);

    let note = pt(fig.options.fonts.notes);
    let mut foot = Vec::new();
    for text in source_lines(fig) {
        y += note * 1.35;
        foot.push(FootLine {
            text: fit_width(&text, inner, note),
            x: margin,
            y,
        });
    }
    Layout {
        width,
        height: y + margin,
        panels,
        legend,
        foot,
    }
}

fn legend_items(
    fig: &Figure,
    density: Option<&DensityClasses>,
    left: f64,
    inner: f64,
    y: &mut f64,
) -> Vec<LegendItem> {
    let size = pt(fig.options.fonts.legend);
    let row = legend_row(fig);
    let key_w = pt(MARKER_PT * 2.0 + 2.0);
    let spacing = pt(6.0);
    let mut entries: Vec<(LegendKey, String, f64)> = Vec::new();
    if let Some(classes) = density {
        entries.push((LegendKey::Title, "samples per cell:".into(), 0.0));
        for i in 0..classes.len() {
            entries.push((LegendKey::Density(i), classes.label(i), key_w));
        }
    } else if let Some(title) = &fig.groups.title {
        entries.push((LegendKey::Title, format!("{}:", sanitize(title)), 0.0));
        for (i, name) in fig.groups.names.iter().enumerate() {
            entries.push((LegendKey::Group(i), sanitize(name), key_w));
        }
    }
    if entries.is_empty() {
        return Vec::new();
    }
    *y += pt(3.0);
    let mut items = Vec::new();
    let mut x = left;
    let mut line_y = *y + row / 2.0;
    for (key, text, key_w) in entries {
        let text = fit_width(&text, inner - key_w, size);
        let w = key_w + text_width(&text, size);
        if x > left && x + w > left + inner {
            x = left;
            line_y += row;
        }
        items.push(LegendItem {
            key,
            text,
            x,
            y: line_y,
        });
        x += w + spacing;
    }
    *y = line_y + row / 2.0;
    items
}

/// The distinct credit lines of the figure's overlays, in panel order.
pub(crate) fn source_lines(fig: &Figure) -> Vec<String> {
    let mut lines: Vec<String> = Vec::new();
    let mut add = |s: &Option<String>| {
        if let Some(s) = s {
            let s = super::text::sanitize(s);
            if !lines.contains(&s) {
                lines.push(s);
            }
        }
    };
    for p in &fig.panels {
        if let Some(f) = &p.fields {
            add(&f.source);
        }
        if let Some(r) = &p.regions {
            add(&r.source);
        }
    }
    if fig
        .panels
        .iter()
        .any(|p| fig.options.density.shades(p.points.len()))
    {
        add(&Some(format!(
            "density: samples per hexagonal cell, {} cells across the base (shown above {} samples)",
            super::density::CELLS_ACROSS,
            super::density::DENSITY_THRESHOLD
        )));
    }
    lines
}
