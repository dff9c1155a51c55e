//! Page geometry of the section figure: where panels, axes, labels and legend go, and the
//! mapping from (percent, position) to page units. Pure arithmetic, so it can be tested.

use super::svg_layers::{PT_PER_MM, UNITS_PER_PT};

/// Font sizes in points.
pub(crate) const TICK_PT: f64 = 7.0;
pub(crate) const TITLE_PT: f64 = 8.0;
pub(crate) const LABEL_PT: f64 = 7.0;
pub(crate) const CAPTION_PT: f64 = 6.5;
pub(crate) const HEADING_PT: f64 = 10.0;

/// Estimated advance of an average character of DejaVu Sans, in em (about 0.55 em for mixed
/// text; 0.6 leaves room).
const CHAR_EM: f64 = 0.6;

/// Estimated width of `text` at `pt` points, in page units.
pub(crate) fn text_width(text: &str, pt: f64) -> f64 {
    text.chars().count() as f64 * CHAR_EM * pt * UNITS_PER_PT
}

/// Page units of `pt` points.
pub(crate) fn pt(pt: f64) -> f64 {
    pt * UNITS_PER_PT
}

/// What a panel shows.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum PanelKind {
    /// Q, F, L percentages.
    Qfl,
    /// Lv, Ls, Lm as percentages of L.
    Lithics,
    /// The stacked membership bar.
    Membership,
}

/// One panel's horizontal extent.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Panel {
    pub kind: PanelKind,
    pub x0: f64,
    pub x1: f64,
}

impl Panel {
    /// Page x of a percentage.
    pub fn x(&self, percent: f64) -> f64 {
        self.x0 + (self.x1 - self.x0) * percent.clamp(0.0, 100.0) / 100.0
    }
}

/// The whole page.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Layout {
    pub width: f64,
    pub height: f64,
    pub heading_y: Option<f64>,
    /// Page y of each panel-title line (shared by all panels).
    pub title_line_y: Vec<f64>,
    /// Each panel's title, wrapped to its width.
    pub titles: Vec<Vec<String>>,
    /// Spacing of the percent ticks, chosen so their labels fit the panel width.
    pub x_step: f64,
    pub plot_top: f64,
    pub plot_bottom: f64,
    pub panels: Vec<Panel>,
    pub axis_title_x: f64,
    pub label_x0: f64,
    pub label_x1: f64,
    pub legend_top: f64,
    pub legend_rows: usize,
    pub caption_top: f64,
    pub caption_lines: usize,
    /// The plotted value range (height, or minus depth), bottom to top.
    pub v_lo: f64,
    pub v_hi: f64,
    pub depth: bool,
}

/// What the layout needs to know.
pub(crate) struct LayoutInput<'a> {
    pub width_mm: f64,
    pub height_mm: f64,
    pub heading: bool,
    pub membership: bool,
    pub positions: &'a [f64],
    pub depth: bool,
    pub labels: &'a [String],
    /// One title per panel, in panel order (Q-F-L, lithics, then membership when shown).
    pub titles: &'a [String],
    pub legend_rows: usize,
    pub caption_lines: usize,
}

pub(crate) const LABEL_COLUMN_MIN_PT: f64 = 48.0;
pub(crate) const LEADER_PT: f64 = 10.0;

impl Layout {
    pub fn new(i: &LayoutInput) -> Layout {
        let width = i.width_mm * PT_PER_MM * UNITS_PER_PT;
        let height = i.height_mm * PT_PER_MM * UNITS_PER_PT;
        let margin = pt(6.0);
        // Horizontal: y-axis title (rotated) and tick labels, panels, then the label column.
        let axis_title_x = margin + pt(TITLE_PT) * 0.7;
        let longest_tick = 6.0; // "−1180.5" at most, in characters
        let plot_left =
            margin + pt(TITLE_PT) * 1.8 + longest_tick * CHAR_EM * pt(TICK_PT) + pt(4.0);
        let widest = i
            .labels
            .iter()
            .map(|l| text_width(l, LABEL_PT))
            .fold(0.0, f64::max);
        let label_w = (widest + pt(LEADER_PT) + pt(3.0))
            .max(pt(LABEL_COLUMN_MIN_PT))
            .min(0.34 * width);
        let label_x1 = width - margin;
        let label_x0 = label_x1 - label_w;
        // Room for the "100" and "0" tick labels of neighbouring panels.
        let gap = pt(16.0);
        let kinds: Vec<PanelKind> = if i.membership {
            vec![PanelKind::Qfl, PanelKind::Lithics, PanelKind::Membership]
        } else {
            vec![PanelKind::Qfl, PanelKind::Lithics]
        };
        let k = kinds.len() as f64;
        let panel_w = (label_x0 - plot_left - gap * k).max(pt(30.0)) / k;
        let panels: Vec<Panel> = kinds
            .iter()
            .enumerate()
            .map(|(j, kind)| {
                let x0 = plot_left + j as f64 * (panel_w + gap);
                Panel {
                    kind: *kind,
                    x0,
                    x1: x0 + panel_w,
                }
            })
            .collect();
        // Percent ticks every 20, 25 or 50 (or only 0 and 100): the densest whose labels fit.
        let label_room = text_width("100", TICK_PT) + pt(4.0);
        let x_step = [20.0, 25.0, 50.0]
            .into_iter()
            .find(|step| (100.0 / step + 1.0) * label_room <= panel_w)
            .unwrap_or(100.0);
        let titles: Vec<Vec<String>> = (0..panels.len())
            .map(|j| {
                let t = i.titles.get(j).map_or("", String::as_str);
                wrap(t, panel_w + gap * 0.8, TITLE_PT)
            })
            .collect();
        let title_lines = titles.iter().map(Vec::len).max().unwrap_or(1).max(1);
        // Vertical: heading, panel titles, plots, tick labels and x title, legend, caption.
        let mut y = margin;
        let heading_y = i.heading.then(|| {
            let h = y + pt(HEADING_PT) * 0.6;
            y += pt(HEADING_PT) * 1.6;
            h
        });
        let title_line_y: Vec<f64> = (0..title_lines)
            .map(|k| y + pt(TITLE_PT) * (0.6 + 1.25 * k as f64))
            .collect();
        y += pt(TITLE_PT) * (0.75 + 1.25 * title_lines as f64);
        let plot_top = y;
        let caption_h = i.caption_lines as f64 * pt(CAPTION_PT) * 1.35;
        let legend_h = i.legend_rows as f64 * pt(LABEL_PT) * 1.9;
        let caption_top = height - margin - caption_h;
        let legend_top = caption_top - pt(4.0) - legend_h;
        let plot_bottom = legend_top - pt(TICK_PT) * 1.6 - pt(TITLE_PT) * 1.8 - pt(4.0);
        let values: Vec<f64> = i
            .positions
            .iter()
            .map(|p| if i.depth { -p } else { *p })
            .collect();
        let lo = values.iter().cloned().fold(f64::INFINITY, f64::min);
        let hi = values.iter().cloned().fold(f64::NEG_INFINITY, f64::max);
        let (lo, hi) = if lo.is_finite() { (lo, hi) } else { (0.0, 1.0) };
        let pad = if hi > lo { 0.03 * (hi - lo) } else { 1.0 };
        Layout {
            width,
            height,
            heading_y,
            title_line_y,
            titles,
            x_step,
            plot_top,
            plot_bottom,
            panels,
            axis_title_x,
            label_x0,
            label_x1,
            legend_top,
            legend_rows: i.legend_rows,
            caption_top,
            caption_lines: i.caption_lines,
            v_lo: lo - pad,
            v_hi: hi + pad,
            depth: i.depth,
        }
    }

    /// Page y of a position (height or depth) in the table's units.
    pub fn y(&self, position: f64) -> f64 {
        let v = if self.depth { -position } else { position };
        self.plot_bottom
            - (v - self.v_lo) / (self.v_hi - self.v_lo) * (self.plot_bottom - self.plot_top)
    }

    /// The position at page y (inverse of [`Layout::y`]).
    pub fn position(&self, y: f64) -> f64 {
        let v = self.v_lo
            + (self.plot_bottom - y) / (self.plot_bottom - self.plot_top) * (self.v_hi - self.v_lo);
        if self.depth {
            -v
        } else {
            v
        }
    }

    /// Left edge of the first panel and right edge of the last.
    pub fn plots_x(&self) -> (f64, f64) {
        (
            self.panels.first().map_or(0.0, |p| p.x0),
            self.panels.last().map_or(0.0, |p| p.x1),
        )
    }
}

/// Round ticks for the position axis: a step of 1, 2, 2.5 or 5 × 10ᵏ giving at most 10 ticks.
pub(crate) fn ticks(lo: f64, hi: f64) -> Vec<f64> {
    let span = (hi - lo).abs();
    if !(span > 0.0 && span.is_finite()) {
        return vec![lo];
    }
    let raw = span / 8.0;
    let mag = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 2.5, 5.0, 10.0]
        .iter()
        .map(|m| m * mag)
        .find(|s| span / s <= 10.0)
        .unwrap_or(10.0 * mag);
    let first = (lo.min(hi) / step).ceil() * step;
    let mut out = Vec::new();
    let mut k = 0.0;
    while first + k * step <= lo.max(hi) + 1e-9 * step {
        out.push(first + k * step);
        k += 1.0;
    }
    out
}

/// A tick label: no trailing zeros, at most two decimals.
pub(crate) fn tick_label(v: f64) -> String {
    let s = format!("{:.2}", v);
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" {
        "0".into()
    } else {
        s.to_string()
    }
}

/// Spread label centres so that labels of the given heights do not overlap (with `pad`
/// between them), staying within [lo, hi] when there is room; the order of the targets is kept.
pub(crate) fn spread(targets: &[f64], heights: &[f64], pad: f64, lo: f64, hi: f64) -> Vec<f64> {
    let mut order: Vec<usize> = (0..targets.len()).collect();
    order.sort_by(|a, b| targets[*a].total_cmp(&targets[*b]));
    let h: Vec<f64> = order.iter().map(|i| heights[*i]).collect();
    let mut ys: Vec<f64> = order.iter().map(|i| targets[*i].clamp(lo, hi)).collect();
    let gap = |k: usize| 0.5 * (h[k - 1] + h[k]) + pad;
    for k in 1..ys.len() {
        ys[k] = ys[k].max(ys[k - 1] + gap(k));
    }
    if let Some(last) = ys.last().copied() {
        if last > hi {
            let n = ys.len();
            ys[n - 1] = hi;
            for k in (1..n).rev() {
                ys[k - 1] = ys[k - 1].min(ys[k] - gap(k));
            }
        }
    }
    let mut out = vec![0.0; targets.len()];
    for (k, i) in order.iter().enumerate() {
        out[*i] = ys[k];
    }
    out
}

/// Greedy word wrap to `width` page units at `pt` points. Only plain spaces break lines, so a
/// no-break space (U+00A0) keeps a phrase together.
pub(crate) fn wrap(text: &str, width: f64, pt_size: f64) -> Vec<String> {
    let mut lines = Vec::new();
    let mut line = String::new();
    for word in text.split(' ').filter(|w| !w.is_empty()) {
        let candidate = if line.is_empty() {
            word.to_string()
        } else {
            format!("{line} {word}")
        };
        if !line.is_empty() && text_width(&candidate, pt_size) > width {
            lines.push(std::mem::take(&mut line));
            line = word.to_string();
        } else {
            line = candidate;
        }
    }
    if !line.is_empty() {
        lines.push(line);
    }
    lines
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ticks_are_round_and_cover_the_range() {
        assert_eq!(
            ticks(0.0, 1200.0),
            vec![0.0, 200.0, 400.0, 600.0, 800.0, 1000.0, 1200.0]
        );
        assert_eq!(ticks(-35.3, 1220.5).first(), Some(&0.0));
        assert_eq!(ticks(3.0, 4.0).len(), 11);
        assert_eq!(tick_label(250.0), "250");
        assert_eq!(tick_label(2.5), "2.5");
        assert_eq!(tick_label(-0.0), "0");
    }

    #[test]
    fn spread_keeps_order_and_gap() {
        let ys = spread(&[10.0, 11.0, 12.0, 50.0], &[4.0; 4], 1.0, 0.0, 100.0);
        assert_eq!(ys, vec![10.0, 15.0, 20.0, 50.0]);
        let ys = spread(&[98.0, 99.0], &[4.0, 4.0], 1.0, 0.0, 100.0);
        assert_eq!(ys, vec![95.0, 100.0]);
        // A two-line label (height 8) needs 4 + 2 + 1 below a one-line one.
        let ys = spread(&[10.0, 10.0], &[4.0, 8.0], 1.0, 0.0, 100.0);
        assert_eq!(ys, vec![10.0, 17.0]);
    }

    #[test]
    fn positions_map_to_the_plot_and_back() {
        let positions = [0.0, 1000.0];
        let input = |depth, membership| LayoutInput {
            width_mm: 175.0,
            height_mm: 230.0,
            heading: false,
            membership,
            positions: &positions,
            depth,
            labels: &[],
            titles: &[],
            legend_rows: 2,
            caption_lines: 2,
        };
        let l = Layout::new(&input(false, false));
        // 3% padding: 0 m sits 30/1060 of the plot height above its bottom (hand-computed).
        let h = l.plot_bottom - l.plot_top;
        assert!((l.y(0.0) - (l.plot_bottom - h * 30.0 / 1060.0)).abs() < 1e-9);
        assert!((l.position(l.y(637.0)) - 637.0).abs() < 1e-9);
        assert!(l.y(1000.0) < l.y(0.0));
        // 175 mm at 10 units per point: 175 / 25.4 × 72 × 10 = 4960.6 units.
        assert!((l.width - 4_960.629_921).abs() < 1e-3);
        assert_eq!(l.panels.len(), 2);
        let d = Layout::new(&input(true, true));
        assert!(d.y(1000.0) > d.y(0.0), "depth grows downward");
        assert_eq!(d.panels.len(), 3);
    }
}
