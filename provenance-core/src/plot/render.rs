//! Drawing a [`Figure`] into SVG, one plotters document per layer.

use super::density::{hexbin, DensityClasses, HexBins, CELLS_ACROSS};
use super::figure::Figure;
use super::labels::{fit_name, place_sample_labels, Align, Rect, LINE_HEIGHT};
use super::layout::{self, Layout, LegendKey, PanelLayout, GAP_PT, MARKER_PT, TICK_PT};
use super::mapping::{PagePoint, TernaryMapping};
use super::overlay::RegionKind;
use super::painter::{Baseline, Painter};
use super::palette::{MarkerShape, Symbol, DENSITY_RAMP, FIELD_INK, GRID, INK};
use super::size::pt;
use super::svg::{compose, LAYERS};
use super::text::{fit_width, sanitize, text_width, trade_notation, CAP_HEIGHT};
use crate::error::Result;

/// Line widths, points.
const FRAME_PT: f64 = 0.7;
const GRID_PT: f64 = 0.3;
const FIELD_PT: f64 = 0.5;
const REGION_PT: f64 = 0.6;
const MARKER_EDGE_PT: f64 = 0.35;

impl Figure {
    /// Where everything goes on the page (internal units of 0.1 pt).
    ///
    /// # Example
    /// ```
    /// use provenance_core::diagram::Diagram;
    /// use provenance_core::plot::{Figure, FigureOptions, FigureSize};
    /// let fig = Figure::builder(&[Diagram::Qfl, Diagram::Qmflt], None)
    ///     .finish(FigureOptions { size: FigureSize::DoubleColumn, ..Default::default() });
    /// let l = fig.layout();
    /// // 175 mm = 496.06 pt; two panels side by side.
    /// assert!((l.width - 4960.63).abs() < 0.01);
    /// assert!(l.panels[1].left > l.panels[0].left && l.panels[1].top == l.panels[0].top);
    /// ```
    pub fn layout(&self) -> Layout {
        let (_, classes) = self.density();
        layout::layout(self, classes.as_ref())
    }

    fn density(&self) -> (Vec<Option<HexBins>>, Option<DensityClasses>) {
        let bins: Vec<Option<HexBins>> =
            self.panels
                .iter()
                .map(|p| {
                    self.options.density.shades(p.points.len()).then(|| {
                        hexbin(p.points.iter().map(|q| q.composition.parts()), CELLS_ACROSS)
                    })
                })
                .collect();
        let max = bins.iter().flatten().map(HexBins::max).max();
        let classes = max.map(|m| DensityClasses::new(m, DENSITY_RAMP.len()));
        (bins, classes)
    }

    /// The figure as an SVG document: layers `grid`, `fields`, `frame`, `regions`, `samples`,
    /// `labels` and `legend` as `<g>` elements with those ids, text as `<text>`, and the printed
    /// size in millimetres.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Framework, Sample};
    /// use provenance_core::diagram::Diagram;
    /// use provenance_core::plot::{Figure, FigureOptions};
    /// let mut b = Figure::builder(&[Diagram::Qmflt], None);
    /// b.push(&Sample::counted("<b>", Framework { qm: 100.0, p: 50.0, lv: 50.0, ..Default::default() }))?;
    /// let svg = b.finish(FigureOptions { labels: true, ..Default::default() }).to_svg()?;
    /// assert!(svg.contains("<g id=\"samples\">") && svg.contains("&lt;b&gt;"));
    /// assert!(svg.contains("width=\"85.00mm\""));
    /// # Ok::<(), provenance_core::error::Error>(())
    /// ```
    pub fn to_svg(&self) -> Result<String> {
        let (bins, classes) = self.density();
        let layout = layout::layout(self, classes.as_ref());
        let size = (layout.width.ceil() as u32, layout.height.ceil() as u32);
        let mut docs: Vec<(&str, String)> = Vec::with_capacity(LAYERS.len());
        for id in LAYERS {
            let mut buf = String::new();
            {
                let mut p = Painter::new(&mut buf, size);
                match id {
                    "grid" => self.draw_grid(&mut p, &layout),
                    "fields" => self.draw_fields(&mut p, &layout),
                    "frame" => self.draw_frame(&mut p, &layout),
                    "regions" => self.draw_regions(&mut p, &layout),
                    "samples" => self.draw_samples(&mut p, &layout, &bins, classes.as_ref()),
                    "labels" => self.draw_labels(&mut p, &layout, &bins),
                    _ => self.draw_legend(&mut p, &layout),
                }
                p.finish()?;
            }
            docs.push((id, buf));
        }
        Ok(compose(layout.width, layout.height, &docs))
    }

    fn draw_grid(&self, p: &mut Painter, layout: &Layout) {
        let step = self.options.grid.percent();
        for pl in &layout.panels {
            let m = &pl.mapping;
            let mut v = step;
            while v < 100.0 - 1e-9 {
                let w = 100.0 - v;
                for (from, to) in [
                    ([v, w, 0.0], [v, 0.0, w]),
                    ([w, v, 0.0], [0.0, v, w]),
                    ([w, 0.0, v], [0.0, w, v]),
                ] {
                    p.line(&[m.to_page(from), m.to_page(to)], GRID, pt(GRID_PT), false);
                }
                v += step;
            }
        }
    }

    fn draw_fields(&self, p: &mut Painter, layout: &Layout) {
        let size = self.options.fonts.fields;
        for (panel, pl) in self.panels.iter().zip(&layout.panels) {
            let Some(fields) = &panel.fields else {
                continue;
            };
            let m = &pl.mapping;
            for f in &fields.polygons {
                let outline: Vec<PagePoint> =
                    f.polygon.vertices().iter().map(|v| m.to_page(*v)).collect();
                p.line(&outline, FIELD_INK, pt(FIELD_PT), true);
            }
            for f in &fields.polygons {
                let name = sanitize(&f.name);
                let fitted = fit_name(&name, &f.polygon, f.label_anchor(), m, size);
                let s = pt(fitted.size_pt);
                let n = fitted.lines.len() as f64;
                for (i, line) in fitted.lines.iter().enumerate() {
                    let dy = (i as f64 - (n - 1.0) / 2.0) * s * LINE_HEIGHT;
                    let at = PagePoint {
                        x: fitted.at.x,
                        y: fitted.at.y + dy,
                    };
                    p.text(line, at, s, FIELD_INK, Align::Middle, Baseline::Middle);
                }
            }
        }
    }

    fn draw_frame(&self, p: &mut Painter, layout: &Layout) {
        let size = pt(self.options.fonts.ticks);
        for pl in &layout.panels {
            let m = &pl.mapping;
            let corners: Vec<PagePoint> = (0..3).map(|i| m.vertex(i)).collect();
            p.line(&corners, INK, pt(FRAME_PT), true);
            for t in ticks(m, self.options.grid.percent()) {
                self.tick(p, t.at, t.dir, pt(TICK_PT));
                if let Some(value) = &t.value {
                    p.text(value, t.label_at, size, INK, t.align, t.baseline);
                }
            }
        }
    }

    fn tick(&self, p: &mut Painter, at: PagePoint, dir: (f64, f64), len: f64) {
        let end = PagePoint {
            x: at.x + dir.0 * len,
            y: at.y + dir.1 * len,
        };
        p.line(&[at, end], INK, pt(FRAME_PT * 0.7), false);
    }

    fn draw_regions(&self, p: &mut Painter, layout: &Layout) {
        for (panel, pl) in self.panels.iter().zip(&layout.panels) {
            let Some(regions) = &panel.regions else {
                continue;
            };
            for r in &regions.regions {
                let outline: Vec<PagePoint> = r
                    .outline
                    .vertices()
                    .iter()
                    .map(|v| pl.mapping.to_page(*v))
                    .collect();
                let c = Symbol::for_group(r.group).colour;
                match r.kind {
                    RegionKind::Confidence => p.line(&outline, c, pt(REGION_PT), true),
                    RegionKind::Prediction => {
                        p.dashed(&outline, c, pt(REGION_PT), pt(2.0), pt(1.5))
                    }
                }
            }
        }
    }

    fn draw_samples(
        &self,
        p: &mut Painter,
        layout: &Layout,
        bins: &[Option<HexBins>],
        classes: Option<&DensityClasses>,
    ) {
        let r = pt(MARKER_PT);
        for ((panel, pl), bins) in self.panels.iter().zip(&layout.panels).zip(bins) {
            let m = &pl.mapping;
            match (bins, classes) {
                (Some(bins), Some(classes)) => {
                    for cell in &bins.cells {
                        let outline: Vec<PagePoint> = cell
                            .outline
                            .iter()
                            .map(|c| m.cartesian_to_page(*c))
                            .collect();
                        let colour =
                            DENSITY_RAMP[classes.class_of(cell.count).min(DENSITY_RAMP.len() - 1)];
                        p.fill(&outline, colour, 1.0);
                    }
                }
                _ => {
                    for point in &panel.points {
                        let at = m.composition_to_page(&point.composition);
                        marker(p, at, Symbol::for_group(point.group), r, pt(MARKER_EDGE_PT));
                    }
                }
            }
            for mean in &panel.means {
                let at = m.composition_to_page(&mean.composition);
                marker(
                    p,
                    at,
                    Symbol::for_group(mean.group),
                    r * 1.9,
                    pt(MARKER_EDGE_PT * 2.5),
                );
            }
        }
    }

    fn draw_labels(&self, p: &mut Painter, layout: &Layout, bins: &[Option<HexBins>]) {
        let fonts = &self.options.fonts;
        let pole = pt(fonts.poles);
        let gap = pt(GAP_PT);
        for ((panel, pl), bins) in self.panels.iter().zip(&layout.panels).zip(bins) {
            let m = &pl.mapping;
            let poles = panel.diagram.poles().map(trade_notation);
            let [a, b, c] = [m.vertex(0), m.vertex(1), m.vertex(2)];
            p.text(
                &poles[0],
                PagePoint {
                    x: a.x,
                    y: a.y - gap * 2.0,
                },
                pole,
                INK,
                Align::Middle,
                Baseline::Above,
            );
            let below = gap * 2.0;
            p.text(
                &poles[1],
                PagePoint {
                    x: b.x,
                    y: b.y + below,
                },
                pole,
                INK,
                Align::Middle,
                Baseline::Below,
            );
            p.text(
                &poles[2],
                PagePoint {
                    x: c.x,
                    y: c.y + below,
                },
                pole,
                INK,
                Align::Middle,
                Baseline::Below,
            );

            let total = panel.points.len() + panel.without_points;
            let caption = if panel.without_points > 0 {
                format!("n = {} of {}", panel.points.len(), total)
            } else {
                format!("n = {}", panel.points.len())
            };
            p.text(
                &caption,
                PagePoint {
                    x: pl.left,
                    y: pl.top,
                },
                pt(fonts.notes),
                INK,
                Align::Start,
                Baseline::Below,
            );

            if self.options.labels && bins.is_none() && !panel.points.is_empty() {
                self.draw_sample_labels(p, panel, pl, pole);
            }
        }
    }

    fn draw_sample_labels(
        &self,
        p: &mut Painter,
        panel: &super::figure::Panel,
        pl: &PanelLayout,
        pole: f64,
    ) {
        let m: &TernaryMapping = &pl.mapping;
        let size = pt(self.options.fonts.samples);
        let points: Vec<PagePoint> = panel
            .points
            .iter()
            .map(|q| m.composition_to_page(&q.composition))
            .collect();
        // A label wider than half the panel could not sit beside its marker: shorten it.
        let texts: Vec<String> = panel
            .points
            .iter()
            .map(|q| fit_width(&sanitize(&q.label), pl.width / 2.0, size))
            .collect();
        let refs: Vec<&str> = texts.iter().map(String::as_str).collect();
        let frame = Rect {
            x0: pl.left,
            y0: pl.top,
            x1: pl.left + pl.width,
            y1: pl.top + pl.height,
        };
        // Keep the pole labels and tick values clear.
        let poles = panel.diagram.poles().map(trade_notation);
        let tick_size = pt(self.options.fonts.ticks);
        let tick_boxes: Vec<Rect> = ticks(m, self.options.grid.percent())
            .into_iter()
            .filter_map(|t| {
                let v = t.value?;
                let w = text_width(&v, tick_size);
                let h = tick_size;
                let x0 = match t.align {
                    Align::Start => t.label_at.x,
                    Align::Middle => t.label_at.x - w / 2.0,
                    Align::End => t.label_at.x - w,
                };
                let y0 = match t.baseline {
                    Baseline::Below => t.label_at.y,
                    Baseline::Middle => t.label_at.y - h / 2.0,
                    Baseline::Above => t.label_at.y - h,
                };
                Some(Rect {
                    x0,
                    y0,
                    x1: x0 + w,
                    y1: y0 + h,
                })
            })
            .collect();
        let clear: Vec<Rect> = (0..3)
            .map(|i| {
                let v = m.vertex(i);
                let w = text_width(&poles[i], pole) / 2.0 + pt(1.0);
                let (y0, y1) = if i == 0 {
                    (v.y - pole * (CAP_HEIGHT + 0.6), v.y)
                } else {
                    (v.y, v.y + pole * 1.2)
                };
                Rect {
                    x0: v.x - w,
                    y0,
                    x1: v.x + w,
                    y1,
                }
            })
            .chain(tick_boxes)
            .collect();
        let placed = place_sample_labels(&points, &refs, pt(MARKER_PT), size, frame, &clear);
        for ((pl, text), marker) in placed.iter().zip(&texts).zip(&points) {
            if pl.leader {
                let end = pl.nearest_edge(*marker);
                let (dx, dy) = (end.x - marker.x, end.y - marker.y);
                let len = dx.hypot(dy);
                let r = pt(MARKER_PT);
                if len > r * 1.5 {
                    let start = PagePoint {
                        x: marker.x + dx / len * r,
                        y: marker.y + dy / len * r,
                    };
                    p.line(&[start, end], FIELD_INK, pt(GRID_PT), false);
                }
            }
            p.text(text, pl.at, size, INK, pl.align, Baseline::Middle);
        }
    }

    fn draw_legend(&self, p: &mut Painter, layout: &Layout) {
        let size = pt(self.options.fonts.legend);
        let r = pt(MARKER_PT);
        let key_text = pt(MARKER_PT * 2.0 + 2.0);
        for item in &layout.legend {
            match item.key {
                LegendKey::Title => {
                    p.text(
                        &item.text,
                        PagePoint {
                            x: item.x,
                            y: item.y,
                        },
                        size,
                        INK,
                        Align::Start,
                        Baseline::Middle,
                    );
                }
                LegendKey::Group(g) => {
                    marker(
                        p,
                        PagePoint {
                            x: item.x + r,
                            y: item.y,
                        },
                        Symbol::for_group(g),
                        r,
                        pt(MARKER_EDGE_PT),
                    );
                    p.text(
                        &item.text,
                        PagePoint {
                            x: item.x + key_text,
                            y: item.y,
                        },
                        size,
                        INK,
                        Align::Start,
                        Baseline::Middle,
                    );
                }
                LegendKey::Density(k) => {
                    let s = r * 1.1;
                    let sq = [
                        PagePoint {
                            x: item.x,
                            y: item.y - s,
                        },
                        PagePoint {
                            x: item.x + 2.0 * s,
                            y: item.y - s,
                        },
                        PagePoint {
                            x: item.x + 2.0 * s,
                            y: item.y + s,
                        },
                        PagePoint {
                            x: item.x,
                            y: item.y + s,
                        },
                    ];
                    p.fill(&sq, DENSITY_RAMP[k.min(DENSITY_RAMP.len() - 1)], 1.0);
                    p.line(&sq, GRID, pt(GRID_PT), true);
                    p.text(
                        &item.text,
                        PagePoint {
                            x: item.x + key_text,
                            y: item.y,
                        },
                        size,
                        INK,
                        Align::Start,
                        Baseline::Middle,
                    );
                }
            }
        }
        for line in &layout.foot {
            p.text(
                &line.text,
                PagePoint {
                    x: line.x,
                    y: line.y,
                },
                pt(self.options.fonts.notes),
                INK,
                Align::Start,
                Baseline::Above,
            );
        }
    }
}

/// Draw one marker: filled shape with a thin dark edge.
fn marker(p: &mut Painter, at: PagePoint, s: Symbol, r: f64, edge: f64) {
    if s.shape == MarkerShape::Circle {
        p.circle(at, r * 0.92, Some(s.colour), Some((INK, edge)));
        return;
    }
    let outline: Vec<PagePoint> = s
        .shape
        .outline(r)
        .into_iter()
        .map(|(x, y)| PagePoint {
            x: at.x + x,
            y: at.y + y,
        })
        .collect();
    p.fill(&outline, s.colour, 1.0);
    p.line(&outline, INK, edge, true);
}

/// One tick on the frame: where it starts, its direction, and its value's text and place.
struct Tick {
    at: PagePoint,
    dir: (f64, f64),
    value: Option<String>,
    label_at: PagePoint,
    align: Align,
    baseline: Baseline,
}

/// The ticks of a triangle every `step` percent, values every 20%. Each edge carries one
/// pole's values, increasing toward that pole, with ticks along the grid lines of that pole:
/// the bottom edge the third pole's (ticks down-left), the right edge the first pole's (ticks
/// right), the left edge the second pole's (ticks up-left).
fn ticks(m: &TernaryMapping, step: f64) -> Vec<Tick> {
    let (len, gap) = (pt(TICK_PT), pt(GAP_PT));
    let s30 = crate::geometry::SQRT3_2;
    let mut out = Vec::new();
    let mut v = step;
    while v < 100.0 - 1e-9 {
        let w = 100.0 - v;
        let value = ((v.round() as i64) % 20 == 0).then(|| format!("{}", v.round() as i64));
        for (parts, dir, align, baseline) in [
            ([0.0, w, v], (-0.5, s30), Align::Middle, Baseline::Below),
            ([v, 0.0, w], (1.0, 0.0), Align::Start, Baseline::Middle),
            ([w, v, 0.0], (-0.5, -s30), Align::End, Baseline::Middle),
        ] {
            let at = m.to_page(parts);
            out.push(Tick {
                at,
                dir,
                value: value.clone(),
                label_at: PagePoint {
                    x: at.x + dir.0 * (len + gap),
                    y: at.y + dir.1 * (len + gap),
                },
                align,
                baseline,
            });
        }
        v += step;
    }
    out
}
