//! Label placement: sample labels that avoid each other and the markers, and field names
//! that fit inside their polygons.

use super::mapping::{PagePoint, TernaryMapping};
use super::size::{pt, MIN_FONT_PT};
use super::text::text_width;
use crate::geometry::Polygon;

/// An axis-aligned box on the page.
///
/// # Example
/// ```
/// use provenance_core::plot::labels::Rect;
/// let a = Rect { x0: 0.0, y0: 0.0, x1: 2.0, y1: 2.0 };
/// assert!(a.overlaps(&Rect { x0: 1.0, y0: 1.0, x1: 3.0, y1: 3.0 }));
/// assert!(!a.overlaps(&Rect { x0: 2.5, y0: 0.0, x1: 3.0, y1: 1.0 }));
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Rect {
    /// Left.
    pub x0: f64,
    /// Top.
    pub y0: f64,
    /// Right.
    pub x1: f64,
    /// Bottom.
    pub y1: f64,
}

impl Rect {
    /// True when the boxes share some area.
    pub fn overlaps(&self, o: &Rect) -> bool {
        self.x0 < o.x1 && o.x0 < self.x1 && self.y0 < o.y1 && o.y0 < self.y1
    }

    /// True when `o` lies wholly inside.
    pub fn contains(&self, o: &Rect) -> bool {
        o.x0 >= self.x0 && o.x1 <= self.x1 && o.y0 >= self.y0 && o.y1 <= self.y1
    }
}

/// Horizontal alignment of a placed label.
///
/// # Example
/// ```
/// use provenance_core::plot::labels::Align;
/// assert_ne!(Align::Start, Align::End);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Align {
    /// The text starts at the point.
    Start,
    /// The text is centred on the point.
    Middle,
    /// The text ends at the point.
    End,
}

/// A label placed beside its marker: the text's anchor (vertical centre) and alignment.
///
/// # Example
/// ```
/// use provenance_core::plot::labels::{place_sample_labels, Align, Rect};
/// use provenance_core::plot::PagePoint;
/// let frame = Rect { x0: 0.0, y0: 0.0, x1: 500.0, y1: 500.0 };
/// let p = place_sample_labels(&[PagePoint { x: 100.0, y: 100.0 }], &["S"], 17.0, 55.0, frame, &[])[0];
/// assert_eq!(p.align, Align::Start);
/// assert!(p.at.x > 100.0 && !p.leader && !p.crowded);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Placement {
    /// Anchor point.
    pub at: PagePoint,
    /// Horizontal alignment at the anchor.
    pub align: Align,
    /// The label's box.
    pub bounds: Rect,
    /// True when no candidate position was free and the label overlaps something.
    pub crowded: bool,
    /// True when the label sits away from its marker and needs a leader line.
    pub leader: bool,
}

impl Placement {
    /// The point of the label's box nearest to `p`, where a leader line ends.
    pub fn nearest_edge(&self, p: PagePoint) -> PagePoint {
        PagePoint {
            x: p.x.clamp(self.bounds.x0, self.bounds.x1),
            y: p.y.clamp(self.bounds.y0, self.bounds.y1),
        }
    }
}

fn label_box(at: PagePoint, align: Align, w: f64, h: f64) -> Rect {
    let x0 = match align {
        Align::Start => at.x,
        Align::Middle => at.x - w / 2.0,
        Align::End => at.x - w,
    };
    Rect {
        x0,
        y0: at.y - h / 2.0,
        x1: x0 + w,
        y1: at.y + h / 2.0,
    }
}

/// Place labels of `size` beside markers of half-width `marker` at `points`, greedily in the
/// order given: each label takes the first of eight positions around its marker (right, left,
/// upper right, lower right, above, below, upper left, lower left), tried close to the marker
/// and then at 2.2 to 12.5 times the distance (see `RINGS`; with a leader line), that overlaps no marker, no label placed before it and
/// no box in `keep_clear`, and stays inside `frame`. When none is free it takes the position
/// with the least overlap (text over text costs 10, text over a marker 3, each ring beyond the first 1) and is marked
/// crowded. The most crowded markers are labelled first. Placements come back in the order of
/// `points` (`texts` must have one entry per point).
///
/// # Example
/// ```
/// use provenance_core::plot::labels::{place_sample_labels, Rect};
/// use provenance_core::plot::PagePoint;
/// let pts = [PagePoint { x: 100.0, y: 100.0 }, PagePoint { x: 160.0, y: 100.0 }];
/// let frame = Rect { x0: 0.0, y0: 0.0, x1: 1000.0, y1: 1000.0 };
/// let placed = place_sample_labels(&pts, &["AAAA", "BBBB"], 17.0, 55.0, frame, &[]);
/// assert!(!placed[0].bounds.overlaps(&placed[1].bounds));
/// assert!(placed.iter().all(|p| !p.crowded));
/// ```
pub fn place_sample_labels(
    points: &[PagePoint],
    texts: &[&str],
    marker: f64,
    size: f64,
    frame: Rect,
    keep_clear: &[Rect],
) -> Vec<Placement> {
    let h = size * 1.0;
    let g = marker + size * 0.25;
    let d = (marker + size * 0.1) * std::f64::consts::FRAC_1_SQRT_2;
    let markers: Vec<Rect> = points
        .iter()
        .map(|p| Rect {
            x0: p.x - marker,
            y0: p.y - marker,
            x1: p.x + marker,
            y1: p.y + marker,
        })
        .collect();
    let grid = Grid::new(&markers, size * 2.0);
    let mut placed_grid = Grid::new(&[], size * 2.0);
    let mut placed: Vec<Rect> = Vec::with_capacity(points.len());
    let mut out: Vec<Option<Placement>> = vec![None; points.len()];
    // Most crowded markers choose first, while free positions remain near them.
    let reach = size * 3.0;
    let mut order: Vec<(usize, usize)> = points
        .iter()
        .enumerate()
        .map(|(i, p)| {
            let area = Rect {
                x0: p.x - reach,
                y0: p.y - reach,
                x1: p.x + reach,
                y1: p.y + reach,
            };
            (i, grid.count_overlaps(&area, &markers, i))
        })
        .collect();
    order.sort_by_key(|(i, n)| (std::cmp::Reverse(*n), *i));
    for (i, _) in order {
        let (p, text) = (&points[i], texts.get(i).copied().unwrap_or(""));
        let w = text_width(text, size);
        let ring = |k: f64| {
            let (g, d, hh) = (g * k, d * k, h / 2.0);
            [
                (g, 0.0, Align::Start),
                (-g, 0.0, Align::End),
                (d, -d - hh, Align::Start),
                (d, d + hh, Align::Start),
                (0.0, -g - hh, Align::Middle),
                (0.0, g + hh, Align::Middle),
                (-d, -d - hh, Align::End),
                (-d, d + hh, Align::End),
            ]
        };
        let candidates = RINGS
            .iter()
            .enumerate()
            .flat_map(|(k, r)| ring(*r).into_iter().map(move |c| (c, k)));
        let mut best: Option<(usize, Placement)> = None;
        for ((dx, dy, align), k) in candidates {
            let leader = k > 0;
            let at = PagePoint {
                x: p.x + dx,
                y: p.y + dy,
            };
            let b = label_box(at, align, w, h);
            // Leaving the panel is worst, covering text next, covering a marker least; the
            // second ring costs a little so that near positions win ties.
            let bound = best.as_ref().map_or(usize::MAX, |(n, _)| *n);
            let mut hits = if frame.contains(&b) { k } else { 1000 };
            hits += 10 * keep_clear.iter().filter(|q| q.overlaps(&b)).count();
            if hits < bound {
                let left = (bound - hits).div_ceil(10);
                hits += 10 * placed_grid.count_overlaps_upto(&b, &placed, usize::MAX, left);
            }
            if hits < bound {
                let left = (bound - hits).div_ceil(3);
                hits += 3 * grid.count_overlaps_upto(&b, &markers, i, left);
            }
            let candidate = Placement {
                at,
                align,
                bounds: b,
                crowded: hits > k,
                leader,
            };
            if best.as_ref().is_none_or(|(n, _)| hits < *n) {
                best = Some((hits, candidate));
            }
            if hits <= k {
                break;
            }
        }
        if let Some((_, chosen)) = best {
            placed_grid.insert(placed.len(), &chosen.bounds);
            placed.push(chosen.bounds);
            out[i] = Some(chosen);
        }
    }
    out.into_iter().flatten().collect()
}

/// Distances of the candidate rings, in multiples of the nearest ring; every ring beyond the
/// first adds one to a position's cost and draws a leader line.
const RINGS: [f64; 8] = [1.0, 2.2, 3.6, 5.0, 6.5, 8.0, 10.0, 12.5];

/// A uniform grid over boxes (markers, placed labels), so overlap tests stay fast for
/// thousands of labels.
struct Grid {
    cell: f64,
    buckets: std::collections::HashMap<(i64, i64), Vec<usize>>,
}

impl Grid {
    fn new(boxes: &[Rect], cell: f64) -> Grid {
        let cell = cell.max(1.0);
        let mut grid = Grid {
            cell,
            buckets: std::collections::HashMap::new(),
        };
        for (i, b) in boxes.iter().enumerate() {
            grid.insert(i, b);
        }
        grid
    }

    fn insert(&mut self, i: usize, b: &Rect) {
        for key in Grid::keys(b, self.cell) {
            self.buckets.entry(key).or_default().push(i);
        }
    }

    fn keys(b: &Rect, cell: f64) -> impl Iterator<Item = (i64, i64)> {
        let (i0, i1) = ((b.x0 / cell).floor() as i64, (b.x1 / cell).floor() as i64);
        let (j0, j1) = ((b.y0 / cell).floor() as i64, (b.y1 / cell).floor() as i64);
        (i0..=i1).flat_map(move |i| (j0..=j1).map(move |j| (i, j)))
    }

    fn count_overlaps(&self, b: &Rect, boxes: &[Rect], skip: usize) -> usize {
        self.count_overlaps_upto(b, boxes, skip, usize::MAX)
    }

    /// Like `count_overlaps`, but stops counting at `limit`.
    fn count_overlaps_upto(&self, b: &Rect, boxes: &[Rect], skip: usize, limit: usize) -> usize {
        let cell = self.cell;
        let (i0, j0) = ((b.x0 / cell).floor() as i64, (b.y0 / cell).floor() as i64);
        let mut n = 0;
        for key in Grid::keys(b, cell) {
            if let Some(list) = self.buckets.get(&key) {
                for &k in list {
                    let o = &boxes[k];
                    // A box listed in several cells counts once: in the first cell it shares
                    // with the query.
                    let home = (
                        ((o.x0 / cell).floor() as i64).max(i0),
                        ((o.y0 / cell).floor() as i64).max(j0),
                    );
                    if k != skip && home == key && o.overlaps(b) {
                        n += 1;
                        if n >= limit {
                            return n;
                        }
                    }
                }
            }
        }
        n
    }
}

/// A field name fitted into its polygon: its lines, font size (points) and centre
/// (see [`fit_name`] for an example).
#[derive(Debug, Clone, PartialEq)]
pub struct FittedName {
    /// One or two lines of text.
    pub lines: Vec<String>,
    /// Font size in points.
    pub size_pt: f64,
    /// Centre of the text block.
    pub at: PagePoint,
    /// False when even the smallest size on two lines sticks out of the polygon.
    pub fits: bool,
}

/// Fit `name` into `polygon` around `anchor` (percent): the largest size from `size_pt` down
/// to [`MIN_FONT_PT`] (in half-point steps) at which the name on one line, or else split into
/// two lines at the space nearest its middle, lies wholly inside the polygon.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::plot::labels::fit_name;
/// use provenance_core::plot::{PagePoint, TernaryMapping};
/// let m = TernaryMapping::new(PagePoint { x: 0.0, y: 1500.0 }, 1500.0);
/// let big = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]);
/// let f = fit_name("whole triangle", &big, [100.0 / 3.0; 3], &m, 6.0);
/// assert!(f.fits && f.lines.len() == 1 && f.size_pt == 6.0);
/// ```
pub fn fit_name(
    name: &str,
    polygon: &Polygon,
    anchor: [f64; 3],
    mapping: &TernaryMapping,
    size_pt: f64,
) -> FittedName {
    let at = mapping.to_page(anchor);
    let arrangements = arrangements(name);
    let mut size = size_pt;
    loop {
        for lines in &arrangements {
            if block_fits(lines, pt(size), at, polygon, mapping) {
                return FittedName {
                    lines: lines.clone(),
                    size_pt: size,
                    at,
                    fits: true,
                };
            }
        }
        if size - 0.5 < MIN_FONT_PT - 1e-9 {
            break;
        }
        size -= 0.5;
    }
    FittedName {
        lines: arrangements.last().cloned().unwrap_or_default(),
        size_pt: size,
        at,
        fits: false,
    }
}

fn arrangements(name: &str) -> Vec<Vec<String>> {
    let mut out = vec![vec![name.to_string()]];
    let mid = name.len() / 2;
    let split = name
        .char_indices()
        .filter(|(_, c)| *c == ' ')
        .map(|(i, _)| i)
        .min_by_key(|i| i.abs_diff(mid));
    if let Some(i) = split {
        out.push(vec![name[..i].to_string(), name[i + 1..].to_string()]);
    }
    out
}

/// Line height of field names relative to their size.
pub const LINE_HEIGHT: f64 = 1.1;

fn block_fits(
    lines: &[String],
    size: f64,
    at: PagePoint,
    polygon: &Polygon,
    mapping: &TernaryMapping,
) -> bool {
    let w = lines
        .iter()
        .map(|l| text_width(l, size))
        .fold(0.0, f64::max);
    let h = size * (LINE_HEIGHT * lines.len() as f64 - 0.1);
    let pad = size * 0.15;
    let (x0, x1) = (at.x - w / 2.0 - pad, at.x + w / 2.0 + pad);
    let (y0, y1) = (at.y - h / 2.0 - pad, at.y + h / 2.0 + pad);
    let xm = (x0 + x1) / 2.0;
    let ym = (y0 + y1) / 2.0;
    [
        (x0, y0),
        (xm, y0),
        (x1, y0),
        (x1, ym),
        (x1, y1),
        (xm, y1),
        (x0, y1),
        (x0, ym),
    ]
    .iter()
    .all(|&(x, y)| polygon.contains(mapping.to_parts(PagePoint { x, y })))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn crowded_labels_spread_around_their_marker() {
        // Four markers in a tight square: every label must find its own free side.
        let pts = [
            PagePoint { x: 500.0, y: 500.0 },
            PagePoint { x: 540.0, y: 500.0 },
            PagePoint { x: 500.0, y: 540.0 },
            PagePoint { x: 540.0, y: 540.0 },
        ];
        let frame = Rect {
            x0: 0.0,
            y0: 0.0,
            x1: 2000.0,
            y1: 2000.0,
        };
        let placed =
            place_sample_labels(&pts, &["S-1", "S-2", "S-3", "S-4"], 17.0, 55.0, frame, &[]);
        for (i, a) in placed.iter().enumerate() {
            for b in &placed[i + 1..] {
                assert!(!a.bounds.overlaps(&b.bounds));
            }
        }
    }

    #[test]
    fn a_long_name_in_a_narrow_field_is_split_or_shrunk() {
        let m = TernaryMapping::new(PagePoint { x: 0.0, y: 1500.0 }, 1500.0);
        // A band along the base, 10% of the A pole high.
        let band = Polygon::new(vec![
            [0.0, 100.0, 0.0],
            [0.0, 0.0, 100.0],
            [10.0, 0.0, 90.0],
            [10.0, 90.0, 0.0],
        ]);
        let f = fit_name(
            "transitional continental",
            &band,
            [5.0, 47.5, 47.5],
            &m,
            6.0,
        );
        assert!(f.fits);
        let wide = Polygon::new(vec![
            [100.0, 0.0, 0.0],
            [0.0, 100.0, 0.0],
            [0.0, 0.0, 100.0],
        ]);
        let g = fit_name(
            "transitional continental",
            &wide,
            [33.0, 33.0, 34.0],
            &m,
            6.0,
        );
        assert_eq!((g.lines.len(), g.size_pt), (1, 6.0));
    }
}
