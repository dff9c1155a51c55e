//! A thin drawing layer over plotters' SVG backend: page points in, whole units out, errors
//! collected instead of unwrapped.

use super::labels::Align;
use super::mapping::PagePoint;
use super::palette::Rgb;
use super::text::FONT_FAMILY;
use crate::error::{Error, Result};
use plotters::prelude::{
    Color, DrawingBackend, FontDesc, FontFamily, FontStyle, RGBColor, SVGBackend, ShapeStyle,
    TextStyle,
};
use plotters::style::text_anchor::{HPos, Pos, VPos};

/// Vertical placement of text relative to its anchor.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Baseline {
    /// The anchor is above the text.
    Below,
    /// The text is centred on the anchor.
    Middle,
    /// The anchor is below the text.
    Above,
}

/// Scale between the size plotters is asked for and the size it writes (plotters-svg 0.3.7:
/// the SVG backend divides font sizes by 1.24).
const PLOTTERS_FONT_SCALE: f64 = 1.24;

pub(crate) struct Painter<'a> {
    backend: SVGBackend<'a>,
    error: Option<String>,
}

fn colour(c: Rgb) -> RGBColor {
    RGBColor(c.0, c.1, c.2)
}

fn coords(points: &[PagePoint]) -> Vec<(i32, i32)> {
    points.iter().map(|p| p.rounded()).collect()
}

impl<'a> Painter<'a> {
    pub(crate) fn new(buf: &'a mut String, size: (u32, u32)) -> Painter<'a> {
        Painter {
            backend: SVGBackend::with_string(buf, size),
            error: None,
        }
    }

    fn note<E: std::fmt::Display>(&mut self, r: std::result::Result<(), E>) {
        if let (Err(e), None) = (r, &self.error) {
            self.error = Some(e.to_string());
        }
    }

    /// Finish the layer; the buffer then holds a complete SVG document.
    pub(crate) fn finish(mut self) -> Result<()> {
        let r = self.backend.present();
        self.note(r);
        match self.error {
            Some(message) => Err(Error::Render { message }),
            None => Ok(()),
        }
    }

    pub(crate) fn fill(&mut self, points: &[PagePoint], c: Rgb, alpha: f64) {
        let style = ShapeStyle {
            color: colour(c).mix(alpha),
            filled: true,
            stroke_width: 0,
        };
        let r = self.backend.fill_polygon(coords(points), &style);
        self.note(r);
    }

    /// A polyline of `width` units; `closed` returns to the first point.
    pub(crate) fn line(&mut self, points: &[PagePoint], c: Rgb, width: f64, closed: bool) {
        let mut pts = coords(points);
        if closed {
            if let Some(first) = pts.first().copied() {
                pts.push(first);
            }
        }
        let style = ShapeStyle {
            color: colour(c).to_rgba(),
            filled: false,
            stroke_width: width.round().max(1.0) as u32,
        };
        let r = self.backend.draw_path(pts, &style);
        self.note(r);
    }

    /// A dashed closed outline: dashes of `dash` and gaps of `gap` units.
    pub(crate) fn dashed(&mut self, points: &[PagePoint], c: Rgb, width: f64, dash: f64, gap: f64) {
        let n = points.len();
        let mut pos = 0.0;
        let mut current: Vec<PagePoint> = Vec::new();
        let period = dash + gap;
        for i in 0..n {
            let (a, b) = (points[i], points[(i + 1) % n]);
            let len = a.distance(b);
            let mut t = 0.0;
            while t < len {
                let phase = pos % period;
                let step = if phase < dash {
                    dash - phase
                } else {
                    period - phase
                }
                .min(len - t);
                let p = PagePoint {
                    x: a.x + (b.x - a.x) * t / len,
                    y: a.y + (b.y - a.y) * t / len,
                };
                let q = PagePoint {
                    x: a.x + (b.x - a.x) * (t + step) / len,
                    y: a.y + (b.y - a.y) * (t + step) / len,
                };
                if phase < dash {
                    if current.is_empty() {
                        current.push(p);
                    }
                    current.push(q);
                } else if !current.is_empty() {
                    let done = std::mem::take(&mut current);
                    self.line(&done, c, width, false);
                }
                t += step.max(1e-9);
                pos += step.max(1e-9);
            }
        }
        if current.len() > 1 {
            self.line(&current, c, width, false);
        }
    }

    pub(crate) fn circle(
        &mut self,
        at: PagePoint,
        r: f64,
        fill: Option<Rgb>,
        stroke: Option<(Rgb, f64)>,
    ) {
        let centre = at.rounded();
        let radius = r.round().max(1.0) as u32;
        if let Some(c) = fill {
            let style = ShapeStyle {
                color: colour(c).to_rgba(),
                filled: true,
                stroke_width: 0,
            };
            let res = self.backend.draw_circle(centre, radius, &style, true);
            self.note(res);
        }
        if let Some((c, w)) = stroke {
            let style = ShapeStyle {
                color: colour(c).to_rgba(),
                filled: false,
                stroke_width: w.round().max(1.0) as u32,
            };
            let res = self.backend.draw_circle(centre, radius, &style, false);
            self.note(res);
        }
    }

    /// Text of `size` units (the size written into the SVG) anchored at `at`.
    pub(crate) fn text(
        &mut self,
        s: &str,
        at: PagePoint,
        size: f64,
        c: Rgb,
        align: Align,
        baseline: Baseline,
    ) {
        if s.is_empty() {
            return;
        }
        let h = match align {
            Align::Start => HPos::Left,
            Align::Middle => HPos::Center,
            Align::End => HPos::Right,
        };
        let v = match baseline {
            Baseline::Below => VPos::Top,
            Baseline::Middle => VPos::Center,
            Baseline::Above => VPos::Bottom,
        };
        let rgb = colour(c);
        let font = FontDesc::new(
            FontFamily::Name(FONT_FAMILY),
            size * PLOTTERS_FONT_SCALE,
            FontStyle::Normal,
        );
        let style = TextStyle::from(font).color(&rgb).pos(Pos::new(h, v));
        let r = self.backend.draw_text(s, &style, at.rounded());
        self.note(r);
    }
}
