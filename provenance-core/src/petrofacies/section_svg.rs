//! The stratigraphic section figure, drawn with plotters' SVG backend.
//!
//! Up-section is up the page, whether the table gives heights or depths. From left to right:
//! the position axis; Q, F and L in percent of Q + F + L; Lv, Ls and Lm in percent of L; and,
//! when the caller supplies setting membership per sample, a stacked bar of it. Each percentage
//! carries a ±1σ counting-error bar (Van der Plas & Tobi 1965). Group bands (`--by`) run across
//! the panels, named in a label column on the right; change points are dashed lines, labelled
//! with the positions of the two samples they separate. The SVG is grouped in layers with ids
//! (background, bands, grid, axes, changes, samples, labels, legend). Every user-supplied text
//! (group names, column names, titles) passes through [`sanitize`] and is escaped by plotters.
//!
//! Palette and symbols are sandprov's own choice from the colour-blind-safe set of Okabe & Ito
//! (2008, "Color universal design"), with a different marker shape per pole so that the figure
//! survives greyscale printing.

use super::changepoint::ChangePoints;
use super::section::Section;
use super::section_layout::{
    pt, spread, text_width, tick_label, ticks, wrap, Layout, LayoutInput, Panel, PanelKind,
    CAPTION_PT, HEADING_PT, LABEL_PT, LEADER_PT, TICK_PT, TITLE_PT,
};
use super::svg_layers::{layered_svg, render_error, Area};
pub use super::svg_layers::{sanitize, PT_PER_MM, UNITS_PER_PT};
use crate::diagram::Diagram;
use crate::error::Result;
use crate::modes::SampleModes;
use plotters::element::{Circle, DashedPathElement, PathElement, Polygon, Rectangle};
use plotters::style::text_anchor::{HPos, Pos, VPos};
use plotters::style::{
    Color, FontDesc, FontFamily, FontStyle, FontTransform, IntoFont, RGBColor, ShapeStyle,
    TextStyle, BLACK, WHITE,
};

/// Most samples a section figure draws. Measured sections hold tens to hundreds of samples;
/// beyond a few thousand the markers merge and the SVG grows past a few tens of megabytes
/// (100,000 samples made 297 MB), so larger tables are refused with a usage error; split the
/// table by section. sandprov's choice.
pub const MAX_FIGURE_SAMPLES: usize = 5_000;

/// How the figure looks.
///
/// # Example
/// ```
/// let o = provenance_core::petrofacies::section_svg::FigureOptions::default();
/// assert_eq!((o.width_mm, o.height_mm), (175.0, 230.0));
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct FigureOptions {
    /// Page width in millimetres (175 mm: a double journal column).
    pub width_mm: f64,
    /// Page height in millimetres.
    pub height_mm: f64,
    /// A heading above the panels.
    pub title: Option<String>,
    /// Title of the membership panel (shown only when samples carry membership).
    pub membership_title: String,
    /// The font family written into the SVG.
    pub font_family: String,
}

impl Default for FigureOptions {
    fn default() -> Self {
        FigureOptions {
            width_mm: 175.0,
            height_mm: 230.0,
            title: None,
            membership_title: "setting membership".into(),
            font_family: "DejaVu Sans".into(),
        }
    }
}

/// A marker shape.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Shape {
    Circle,
    Square,
    Triangle,
}

/// One plotted quantity.
struct Series {
    label: &'static str,
    panel: PanelKind,
    color: RGBColor,
    shape: Shape,
    diagram: Diagram,
    part: usize,
}

// Okabe & Ito (2008) colours.
const BLUE: RGBColor = RGBColor(0, 114, 178);
const VERMILLION: RGBColor = RGBColor(213, 94, 0);
const GREEN: RGBColor = RGBColor(0, 158, 115);
const PURPLE: RGBColor = RGBColor(204, 121, 167);
const ORANGE: RGBColor = RGBColor(230, 159, 0);
const SKY: RGBColor = RGBColor(86, 180, 233);
const YELLOW: RGBColor = RGBColor(240, 228, 66);
const GRID: RGBColor = RGBColor(215, 215, 215);
const BAND_TINTS: [RGBColor; 2] = [RGBColor(236, 236, 236), RGBColor(250, 250, 250)];
const MEMBERSHIP: [RGBColor; 7] = [BLUE, ORANGE, GREEN, PURPLE, SKY, VERMILLION, YELLOW];
const OUTSIDE: RGBColor = RGBColor(190, 190, 190);

const SERIES: [Series; 6] = [
    Series {
        label: "Q",
        panel: PanelKind::Qfl,
        color: BLUE,
        shape: Shape::Circle,
        diagram: Diagram::Qfl,
        part: 0,
    },
    Series {
        label: "F",
        panel: PanelKind::Qfl,
        color: VERMILLION,
        shape: Shape::Square,
        diagram: Diagram::Qfl,
        part: 1,
    },
    Series {
        label: "L",
        panel: PanelKind::Qfl,
        color: GREEN,
        shape: Shape::Triangle,
        diagram: Diagram::Qfl,
        part: 2,
    },
    // LmLvLs poles are [Lm, Lv, Ls]: Lv is part 1, Ls part 2, Lm part 0.
    Series {
        label: "Lv",
        panel: PanelKind::Lithics,
        color: PURPLE,
        shape: Shape::Circle,
        diagram: Diagram::Lmlvls,
        part: 1,
    },
    Series {
        label: "Ls",
        panel: PanelKind::Lithics,
        color: ORANGE,
        shape: Shape::Square,
        diagram: Diagram::Lmlvls,
        part: 2,
    },
    Series {
        label: "Lm",
        panel: PanelKind::Lithics,
        color: SKY,
        shape: Shape::Triangle,
        diagram: Diagram::Lmlvls,
        part: 0,
    },
];

impl Series {
    /// Percentage and 1σ (when points are known) of one sample.
    fn value(&self, m: &SampleModes) -> Option<(f64, Option<f64>)> {
        let mode = m.get(self.diagram)?;
        Some((
            mode.percent.part(self.part),
            mode.sd().map(|s| s[self.part]),
        ))
    }
}

fn font<'a>(family: &'a str, pt_size: f64) -> FontDesc<'a> {
    // plotters' SVG backend divides font sizes by 1.24 (CRATE-NOTES).
    (FontFamily::Name(family), pt(pt_size) * 1.24).into_font()
}

fn text_style<'a>(family: &'a str, pt_size: f64, h: HPos, v: VPos) -> TextStyle<'a> {
    font(family, pt_size).color(&BLACK).pos(Pos::new(h, v))
}

fn px(x: f64, y: f64) -> (i32, i32) {
    (x.round() as i32, y.round() as i32)
}

fn stroke(c: RGBColor, width_pt: f64) -> ShapeStyle {
    c.stroke_width(pt(width_pt).round().max(1.0) as u32)
}

fn marker(area: &Area, shape: Shape, x: f64, y: f64, c: RGBColor) -> Result<()> {
    let r = pt(1.9);
    let fill = c.filled();
    let edge = stroke(BLACK, 0.3);
    match shape {
        Shape::Circle => {
            area.draw(&Circle::new(px(x, y), r.round() as i32, fill))
                .map_err(render_error)?;
            area.draw(&Circle::new(px(x, y), r.round() as i32, edge))
                .map_err(render_error)?;
        }
        Shape::Square => {
            let s = r * 0.85;
            let corners = [px(x - s, y - s), px(x + s, y + s)];
            area.draw(&Rectangle::new(corners, fill))
                .map_err(render_error)?;
            area.draw(&Rectangle::new(corners, edge))
                .map_err(render_error)?;
        }
        Shape::Triangle => {
            let s = r * 1.2;
            let pts = vec![
                px(x, y - s),
                px(x + s * 0.866, y + s * 0.5),
                px(x - s * 0.866, y + s * 0.5),
            ];
            let mut closed = pts.clone();
            closed.push(pts[0]);
            area.draw(&Polygon::new(pts, fill)).map_err(render_error)?;
            area.draw(&PathElement::new(closed, edge))
                .map_err(render_error)?;
        }
    }
    Ok(())
}

/// Everything the layers need, computed once.
struct Figure<'a> {
    section: &'a Section,
    changes: Option<&'a ChangePoints>,
    options: &'a FigureOptions,
    layout: Layout,
    labels: Vec<RightLabel>,
    legend: Vec<Vec<LegendItem>>,
    caption: Vec<String>,
    settings: Vec<String>,
}

/// A label in the right-hand column, pointing at a page y.
struct RightLabel {
    lines: Vec<String>,
    target: f64,
    y: f64,
    change: bool,
}

enum LegendKey {
    Marker(Shape, RGBColor),
    ErrorBar,
    Dashed,
    Swatch(RGBColor),
}

struct LegendItem {
    key: LegendKey,
    text: String,
}

fn shorten(text: &str, max_width: f64, pt_size: f64) -> String {
    if text_width(text, pt_size) <= max_width {
        return text.to_string();
    }
    let mut out: String = text.chars().collect();
    while !out.is_empty() && text_width(&format!("{out}…"), pt_size) > max_width {
        out.pop();
    }
    format!("{out}…")
}

/// Percent ticks from 0 to 100 every `step`.
fn x_ticks(step: f64) -> Vec<f64> {
    let n = (100.0 / step).round() as usize;
    (0..=n).map(|k| step * k as f64).collect()
}

/// Line spacing of right-column labels.
fn label_line() -> f64 {
    pt(LABEL_PT) * 1.2
}

/// A label wrapped to `width` in at most two lines; the second is shortened if still too long.
fn label_lines(text: &str, width: f64) -> Vec<String> {
    let mut lines = wrap(text, width, LABEL_PT);
    if lines.len() > 2 {
        let rest = lines[1..].join(" ");
        lines.truncate(1);
        lines.push(rest);
    }
    lines
        .into_iter()
        .map(|l| shorten(&l, width, LABEL_PT))
        .collect()
}

fn band_extent(section: &Section, first: usize, last: usize, layout: &Layout) -> (f64, f64) {
    let pos: Vec<f64> = section.samples.iter().map(|s| s.position).collect();
    let below = if first == 0 {
        layout.position(layout.plot_bottom)
    } else {
        0.5 * (pos[first - 1] + pos[first])
    };
    let above = if last + 1 >= pos.len() {
        layout.position(layout.plot_top)
    } else {
        0.5 * (pos[last] + pos[last + 1])
    };
    (layout.y(below), layout.y(above))
}

impl<'a> Figure<'a> {
    fn new(
        section: &'a Section,
        changes: Option<&'a ChangePoints>,
        options: &'a FigureOptions,
    ) -> Figure<'a> {
        let membership = section.samples.iter().any(|s| s.membership.is_some());
        let mut settings: Vec<String> = Vec::new();
        for s in &section.samples {
            for (name, _) in s.membership.iter().flatten() {
                if !settings.contains(name) {
                    settings.push(name.clone());
                }
            }
        }
        let runs = section.group_runs();
        let change_text: Vec<String> = changes
            .map(|c| {
                c.changes
                    .iter()
                    .map(|ch| {
                        format!(
                            "change {}–{}",
                            tick_label(ch.below_position),
                            tick_label(ch.above_position)
                        )
                    })
                    .collect()
            })
            .unwrap_or_default();
        let mut texts: Vec<String> = runs.iter().map(|r| sanitize(&r.0)).collect();
        texts.extend(change_text.iter().cloned());
        // Legend rows: poles; error bars and change lines; membership swatches.
        let mut legend = vec![SERIES
            .iter()
            .map(|s| LegendItem {
                key: LegendKey::Marker(s.shape, s.color),
                text: s.label.to_string(),
            })
            .collect::<Vec<_>>()];
        let mut row2 = vec![LegendItem {
            key: LegendKey::ErrorBar,
            text: "±1σ counting error".into(),
        }];
        if changes.is_some() {
            row2.push(LegendItem {
                key: LegendKey::Dashed,
                text: "change point".into(),
            });
        }
        legend.push(row2);
        if membership {
            legend.push(
                settings
                    .iter()
                    .enumerate()
                    .map(|(k, name)| LegendItem {
                        key: LegendKey::Swatch(setting_color(name, k)),
                        text: sanitize(name),
                    })
                    .collect(),
            );
        }
        let width_units = options.width_mm * PT_PER_MM * UNITS_PER_PT;
        let caption_text = caption(section, changes);
        let caption = wrap(&caption_text, width_units - pt(12.0), CAPTION_PT);
        let positions: Vec<f64> = section.samples.iter().map(|s| s.position).collect();
        let legend_rows = legend_rows(&legend, width_units - pt(12.0));
        let mut titles = vec![
            // No-break spaces keep "(% of …)" on one line when a narrow panel wraps its title.
            "Q, F, L (%\u{a0}of\u{a0}Q+F+L)".to_string(),
            "Lv, Ls, Lm (%\u{a0}of\u{a0}L)".to_string(),
        ];
        if membership {
            titles.push(sanitize(&options.membership_title));
        }
        let layout = Layout::new(&LayoutInput {
            width_mm: options.width_mm,
            height_mm: options.height_mm,
            heading: options.title.is_some(),
            membership,
            positions: &positions,
            depth: section.ordering == super::Ordering::Depth,
            labels: &texts,
            titles: &titles,
            legend_rows,
            caption_lines: caption.len(),
        });
        let max_label = layout.label_x1 - layout.label_x0 - pt(LEADER_PT) - pt(2.0);
        let mut labels: Vec<RightLabel> = runs
            .iter()
            .map(|(g, first, last)| {
                let (y0, y1) = band_extent(section, *first, *last, &layout);
                RightLabel {
                    lines: label_lines(&sanitize(g), max_label),
                    target: 0.5 * (y0 + y1),
                    y: 0.0,
                    change: false,
                }
            })
            .collect();
        if let Some(c) = changes {
            for (ch, text) in c.changes.iter().zip(&change_text) {
                labels.push(RightLabel {
                    lines: label_lines(text, max_label),
                    target: layout.y(ChangePoints::midpoint(ch)),
                    y: 0.0,
                    change: true,
                });
            }
        }
        let targets: Vec<f64> = labels.iter().map(|l| l.target).collect();
        let heights: Vec<f64> = labels
            .iter()
            .map(|l| l.lines.len() as f64 * label_line())
            .collect();
        let ys = spread(
            &targets,
            &heights,
            pt(LABEL_PT) * 0.3,
            layout.plot_top,
            layout.plot_bottom,
        );
        for (l, y) in labels.iter_mut().zip(ys) {
            l.y = y;
        }
        Figure {
            section,
            changes,
            options,
            layout,
            labels,
            legend,
            caption,
            settings,
        }
    }

    fn family(&self) -> &str {
        &self.options.font_family
    }

    fn background(&self, area: &Area) -> Result<()> {
        area.fill(&WHITE).map_err(render_error)
    }

    fn bands(&self, area: &Area) -> Result<()> {
        let (x0, x1) = self.layout.plots_x();
        let names = self.section.group_names();
        for (g, first, last) in self.section.group_runs() {
            let (y0, y1) = band_extent(self.section, first, last, &self.layout);
            let k = names.iter().position(|n| *n == g).unwrap_or(0);
            let tint = BAND_TINTS[k % BAND_TINTS.len()];
            for p in &self.layout.panels {
                area.draw(&Rectangle::new([px(p.x0, y1), px(p.x1, y0)], tint.filled()))
                    .map_err(render_error)?;
            }
            // A thin rule at the band's lower edge (not at the plot's bottom).
            if first > 0 {
                area.draw(&PathElement::new(
                    vec![px(x0, y0), px(x1, y0)],
                    stroke(RGBColor(160, 160, 160), 0.4),
                ))
                .map_err(render_error)?;
            }
        }
        Ok(())
    }

    fn grid(&self, area: &Area) -> Result<()> {
        let l = &self.layout;
        for p in &l.panels {
            for v in ticks(l.v_lo, l.v_hi) {
                let y =
                    l.plot_bottom - (v - l.v_lo) / (l.v_hi - l.v_lo) * (l.plot_bottom - l.plot_top);
                area.draw(&PathElement::new(
                    vec![px(p.x0, y), px(p.x1, y)],
                    stroke(GRID, 0.3),
                ))
                .map_err(render_error)?;
            }
            for v in x_ticks(l.x_step)
                .into_iter()
                .filter(|v| *v > 0.0 && *v < 100.0)
            {
                let x = p.x(v);
                area.draw(&PathElement::new(
                    vec![px(x, l.plot_top), px(x, l.plot_bottom)],
                    stroke(GRID, 0.3),
                ))
                .map_err(render_error)?;
            }
        }
        Ok(())
    }

    fn axes(&self, area: &Area) -> Result<()> {
        let l = &self.layout;
        let fam = self.family();
        let tick = pt(2.0);
        for (j, p) in l.panels.iter().enumerate() {
            area.draw(&Rectangle::new(
                [px(p.x0, l.plot_top), px(p.x1, l.plot_bottom)],
                stroke(BLACK, 0.6),
            ))
            .map_err(render_error)?;
            // Titles are bottom-aligned over their panel: a one-line title sits on the last line.
            let lines = &l.titles[j];
            let skip = l.title_line_y.len().saturating_sub(lines.len());
            for (line, y) in lines.iter().zip(&l.title_line_y[skip..]) {
                area.draw_text(
                    line,
                    &text_style(fam, TITLE_PT, HPos::Center, VPos::Center),
                    px(0.5 * (p.x0 + p.x1), *y),
                )
                .map_err(render_error)?;
            }
            for v in x_ticks(l.x_step) {
                let x = p.x(v);
                area.draw(&PathElement::new(
                    vec![px(x, l.plot_bottom), px(x, l.plot_bottom + tick)],
                    stroke(BLACK, 0.5),
                ))
                .map_err(render_error)?;
                area.draw_text(
                    &tick_label(v),
                    &text_style(fam, TICK_PT, HPos::Center, VPos::Top),
                    px(x, l.plot_bottom + tick + pt(1.0)),
                )
                .map_err(render_error)?;
            }
            let xt = if p.kind == PanelKind::Membership {
                "probability (%)"
            } else {
                "percent"
            };
            area.draw_text(
                xt,
                &text_style(fam, TITLE_PT, HPos::Center, VPos::Top),
                px(
                    0.5 * (p.x0 + p.x1),
                    l.plot_bottom + tick + pt(TICK_PT) * 1.5,
                ),
            )
            .map_err(render_error)?;
            if j == 0 {
                for v in ticks(l.v_lo, l.v_hi) {
                    let y = l.plot_bottom
                        - (v - l.v_lo) / (l.v_hi - l.v_lo) * (l.plot_bottom - l.plot_top);
                    area.draw(&PathElement::new(
                        vec![px(p.x0 - tick, y), px(p.x0, y)],
                        stroke(BLACK, 0.5),
                    ))
                    .map_err(render_error)?;
                    let shown = if l.depth { -v } else { v };
                    area.draw_text(
                        &tick_label(shown),
                        &text_style(fam, TICK_PT, HPos::Right, VPos::Center),
                        px(p.x0 - tick - pt(1.5), y),
                    )
                    .map_err(render_error)?;
                }
            }
        }
        let axis = if l.depth {
            format!("{} (depth)", sanitize(&self.section.axis))
        } else {
            sanitize(&self.section.axis)
        };
        let style = font(self.family(), TITLE_PT)
            .transform(FontTransform::Rotate270)
            .color(&BLACK)
            .pos(Pos::new(HPos::Center, VPos::Center));
        area.draw_text(
            &axis,
            &style,
            px(l.axis_title_x, 0.5 * (l.plot_top + l.plot_bottom)),
        )
        .map_err(render_error)?;
        if let (Some(t), Some(y)) = (&self.options.title, l.heading_y) {
            let style = FontDesc::new(
                FontFamily::Name(fam),
                pt(HEADING_PT) * 1.24,
                FontStyle::Bold,
            )
            .color(&BLACK)
            .pos(Pos::new(HPos::Left, VPos::Center));
            area.draw_text(&sanitize(t), &style, px(l.plots_x().0, y))
                .map_err(render_error)?;
        }
        Ok(())
    }

    fn change_lines(&self, area: &Area) -> Result<()> {
        let Some(c) = self.changes else { return Ok(()) };
        let (x0, x1) = self.layout.plots_x();
        for ch in &c.changes {
            let y = self.layout.y(ChangePoints::midpoint(ch));
            let dash = DashedPathElement::new(
                vec![px(x0, y), px(x1, y)],
                pt(3.0) as i32,
                pt(2.0) as i32,
                stroke(BLACK, 0.9),
            );
            area.draw(&dash).map_err(render_error)?;
        }
        Ok(())
    }

    fn panel(&self, kind: PanelKind) -> Option<&Panel> {
        self.layout.panels.iter().find(|p| p.kind == kind)
    }

    fn samples(&self, area: &Area) -> Result<()> {
        let l = &self.layout;
        for s in &SERIES {
            let Some(p) = self.panel(s.panel) else {
                continue;
            };
            // Thin line up-section, broken where a sample has no points in the diagram.
            let mut run: Vec<(i32, i32)> = Vec::new();
            for smp in &self.section.samples {
                match s.value(&smp.modes) {
                    Some((v, _)) => run.push(px(p.x(v), l.y(smp.position))),
                    None => {
                        if run.len() > 1 {
                            area.draw(&PathElement::new(run.clone(), stroke(s.color, 0.5)))
                                .map_err(render_error)?;
                        }
                        run.clear();
                    }
                }
            }
            if run.len() > 1 {
                area.draw(&PathElement::new(run, stroke(s.color, 0.5)))
                    .map_err(render_error)?;
            }
            for smp in &self.section.samples {
                let Some((v, sd)) = s.value(&smp.modes) else {
                    continue;
                };
                let y = l.y(smp.position);
                if let Some(sd) = sd {
                    let (a, b) = (p.x(v - sd), p.x(v + sd));
                    let cap = pt(1.2);
                    let st = stroke(BLACK, 0.4);
                    area.draw(&PathElement::new(vec![px(a, y), px(b, y)], st))
                        .map_err(render_error)?;
                    for e in [a, b] {
                        area.draw(&PathElement::new(vec![px(e, y - cap), px(e, y + cap)], st))
                            .map_err(render_error)?;
                    }
                }
                marker(area, s.shape, p.x(v), y, s.color)?;
            }
        }
        if let Some(p) = self.panel(PanelKind::Membership) {
            self.membership_bars(area, p)?;
        }
        Ok(())
    }

    fn membership_bars(&self, area: &Area, p: &Panel) -> Result<()> {
        let l = &self.layout;
        let ys: Vec<f64> = self
            .section
            .samples
            .iter()
            .map(|s| l.y(s.position))
            .collect();
        let min_gap = ys
            .windows(2)
            .map(|w| (w[0] - w[1]).abs())
            .filter(|g| *g > 0.0)
            .fold(f64::INFINITY, f64::min);
        let half = (0.35 * min_gap).clamp(pt(0.5), pt(2.5));
        for (s, y) in self.section.samples.iter().zip(&ys) {
            let Some(parts) = &s.membership else { continue };
            let mut acc = 0.0;
            for (name, prob) in parts {
                let k = self.settings.iter().position(|n| n == name).unwrap_or(0);
                let w = 100.0 * prob.clamp(0.0, 1.0);
                if w <= 0.0 {
                    continue;
                }
                let rect = [px(p.x(acc), y - half), px(p.x(acc + w), y + half)];
                area.draw(&Rectangle::new(rect, setting_color(name, k).filled()))
                    .map_err(render_error)?;
                acc += w;
            }
        }
        Ok(())
    }

    fn right_labels(&self, area: &Area) -> Result<()> {
        let l = &self.layout;
        let (_, x1) = l.plots_x();
        let text_x = l.label_x0 + pt(LEADER_PT);
        for lab in &self.labels {
            let color = if lab.change {
                BLACK
            } else {
                RGBColor(60, 60, 60)
            };
            let pts = vec![
                px(x1, lab.target),
                px(x1 + pt(LEADER_PT) * 0.4, lab.target),
                px(text_x - pt(1.5), lab.y),
            ];
            if lab.change {
                area.draw(&DashedPathElement::new(
                    pts,
                    pt(1.5) as i32,
                    pt(1.0) as i32,
                    stroke(color, 0.5),
                ))
                .map_err(render_error)?;
            } else {
                area.draw(&PathElement::new(pts, stroke(color, 0.4)))
                    .map_err(render_error)?;
            }
            let style = if lab.change {
                FontDesc::new(
                    FontFamily::Name(self.family()),
                    pt(LABEL_PT) * 1.24,
                    FontStyle::Italic,
                )
                .color(&BLACK)
                .pos(Pos::new(HPos::Left, VPos::Center))
            } else {
                text_style(self.family(), LABEL_PT, HPos::Left, VPos::Center)
            };
            let n = lab.lines.len() as f64;
            for (k, line) in lab.lines.iter().enumerate() {
                let y = lab.y + (k as f64 - 0.5 * (n - 1.0)) * label_line();
                area.draw_text(line, &style, px(text_x, y))
                    .map_err(render_error)?;
            }
        }
        Ok(())
    }

    fn legend(&self, area: &Area) -> Result<()> {
        let l = &self.layout;
        let fam = self.family();
        let row_h = pt(LABEL_PT) * 1.9;
        let x_start = l.plots_x().0;
        let x_max = l.width - pt(6.0);
        let mut y = l.legend_top + row_h * 0.5;
        for row in &self.legend {
            let mut x = x_start;
            for item in row {
                let w = pt(12.0) + text_width(&item.text, LABEL_PT) + pt(8.0);
                if x > x_start && x + w > x_max {
                    x = x_start;
                    y += row_h;
                }
                let kx = x + pt(5.0);
                match item.key {
                    LegendKey::Marker(shape, c) => marker(area, shape, kx, y, c)?,
                    LegendKey::ErrorBar => {
                        let st = stroke(BLACK, 0.4);
                        area.draw(&PathElement::new(
                            vec![px(kx - pt(4.0), y), px(kx + pt(4.0), y)],
                            st,
                        ))
                        .map_err(render_error)?;
                        for e in [kx - pt(4.0), kx + pt(4.0)] {
                            area.draw(&PathElement::new(
                                vec![px(e, y - pt(1.2)), px(e, y + pt(1.2))],
                                st,
                            ))
                            .map_err(render_error)?;
                        }
                    }
                    LegendKey::Dashed => {
                        let d = DashedPathElement::new(
                            vec![px(kx - pt(5.0), y), px(kx + pt(5.0), y)],
                            pt(3.0) as i32,
                            pt(2.0) as i32,
                            stroke(BLACK, 0.9),
                        );
                        area.draw(&d).map_err(render_error)?;
                    }
                    LegendKey::Swatch(c) => {
                        area.draw(&Rectangle::new(
                            [px(kx - pt(4.0), y - pt(2.0)), px(kx + pt(4.0), y + pt(2.0))],
                            c.filled(),
                        ))
                        .map_err(render_error)?;
                    }
                }
                area.draw_text(
                    &item.text,
                    &text_style(fam, LABEL_PT, HPos::Left, VPos::Center),
                    px(x + pt(12.0), y),
                )
                .map_err(render_error)?;
                x += w;
            }
            y += row_h;
        }
        let mut cy = l.caption_top + pt(CAPTION_PT) * 0.7;
        for line in &self.caption {
            area.draw_text(
                line,
                &text_style(fam, CAPTION_PT, HPos::Left, VPos::Center),
                px(pt(6.0), cy),
            )
            .map_err(render_error)?;
            cy += pt(CAPTION_PT) * 1.35;
        }
        Ok(())
    }
}

/// The membership colour of a setting: grey for "outside", else the palette in order.
fn setting_color(name: &str, k: usize) -> RGBColor {
    if name == "outside" {
        OUTSIDE
    } else {
        MEMBERSHIP[k % MEMBERSHIP.len()]
    }
}

fn legend_rows(legend: &[Vec<LegendItem>], width: f64) -> usize {
    legend
        .iter()
        .map(|row| {
            let mut rows = 1;
            let mut x = 0.0;
            for item in row {
                let w = pt(12.0) + text_width(&item.text, LABEL_PT) + pt(8.0);
                if x > 0.0 && x + w > width {
                    rows += 1;
                    x = 0.0;
                }
                x += w;
            }
            rows
        })
        .sum()
}

fn caption(section: &Section, changes: Option<&ChangePoints>) -> String {
    let mut text = format!(
        "{} samples, up-section upward. Error bars: ±1σ counting error, √(p(100 − p)/n) (Van der Plas & Tobi 1965); none where the number of points is unknown.",
        section.samples.len()
    );
    match changes {
        Some(ChangePoints {
            note: Some(note), ..
        }) => {
            text.push_str(&format!(" No change-point search: {note}."));
        }
        Some(c) => {
            let ids: Vec<&str> = c.options.diagrams.iter().map(|d| d.id()).collect();
            text.push_str(&format!(
                " Dashed lines: change points of the {} ilr sequence (binary segmentation, penalty {}·(d + 1)·ln n = {:.1} for d = {} coordinates and n = {} samples), drawn midway between the two samples whose positions the label gives.",
                ids.join("+"),
                tick_label(c.options.penalty_factor),
                c.penalty,
                c.dimension,
                c.n
            ));
            if c.changes.is_empty() {
                text.push_str(" No change point was found.");
            }
        }
        None => {}
    }
    text.push_str(" Statistics support, and never replace, petrographic judgement.");
    text
}

/// Draw the section figure as an SVG document.
///
/// `changes`, when given, are marked as dashed lines. Samples with
/// [`super::SectionSample::membership`] set get a stacked bar in a third panel.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::petrofacies::section_svg::{render, FigureOptions};
/// use provenance_core::petrofacies::{Ordering, Section, SectionSample};
/// let f = Framework { qm: 150.0, p: 80.0, lv: 50.0, ls: 20.0, lm: 10.0, ..Default::default() };
/// let s = SectionSample::new(Sample::counted("KB-1", f), 12.0, Some("<Lower & Upper>".into()));
/// let sec = Section { axis: "height_m".into(), ordering: Ordering::Height, by: Some("fm".into()), samples: vec![s] };
/// let svg = render(&sec, None, &FigureOptions::default())?;
/// assert!(svg.starts_with("<svg width=\"175.00mm\""));
/// assert!(svg.contains("&lt;Lower &amp; Upper&gt;"));
/// assert!(!svg.contains("<Lower"));
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub fn render(
    section: &Section,
    changes: Option<&ChangePoints>,
    options: &FigureOptions,
) -> Result<String> {
    if section.samples.len() > MAX_FIGURE_SAMPLES {
        return Err(crate::error::Error::Usage {
            message: format!(
                "{} samples: a section figure draws at most {MAX_FIGURE_SAMPLES}, expected one section (split the table by section)",
                section.samples.len()
            ),
        });
    }
    let fig = Figure::new(section, changes, options);
    let size = (
        fig.layout.width.round() as u32,
        fig.layout.height.round() as u32,
    );
    layered_svg(
        size,
        options.width_mm,
        options.height_mm,
        &[
            ("background", &|a: &Area| fig.background(a)),
            ("bands", &|a: &Area| fig.bands(a)),
            ("grid", &|a: &Area| fig.grid(a)),
            ("axes", &|a: &Area| fig.axes(a)),
            ("changes", &|a: &Area| fig.change_lines(a)),
            ("samples", &|a: &Area| fig.samples(a)),
            ("labels", &|a: &Area| fig.right_labels(a)),
            ("legend", &|a: &Area| fig.legend(a)),
        ],
    )
}

/// The page position (in SVG user units) of a percentage in one panel at one position, for
/// tests and for callers that add their own marks: `panel` 0 is Q/F/L, 1 is Lv/Ls/Lm.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::petrofacies::section_svg::{page_point, FigureOptions};
/// use provenance_core::petrofacies::{Ordering, Section, SectionSample};
/// let s = |h| SectionSample::new(Sample::counted("x", Framework { qm: 1.0, ..Default::default() }), h, None);
/// let sec = Section { axis: "h".into(), ordering: Ordering::Height, by: None, samples: vec![s(0.0), s(100.0)] };
/// let (x0, y0) = page_point(&sec, None, &FigureOptions::default(), 0, 0.0, 0.0).unwrap();
/// let (x1, y1) = page_point(&sec, None, &FigureOptions::default(), 0, 100.0, 100.0).unwrap();
/// assert!(x1 > x0 && y1 < y0);
/// ```
pub fn page_point(
    section: &Section,
    changes: Option<&ChangePoints>,
    options: &FigureOptions,
    panel: usize,
    percent: f64,
    position: f64,
) -> Option<(f64, f64)> {
    let fig = Figure::new(section, changes, options);
    let p = fig.layout.panels.get(panel)?;
    Some((p.x(percent), fig.layout.y(position)))
}
