//! Density shading for large data sets: a hexagonal binning of the ternary plane.
//!
//! Above [`DENSITY_THRESHOLD`] samples in a diagram, individual markers overplot into a solid
//! blot, so sandprov counts samples in hexagonal cells (hexbin; Carr et al. 1987, J. Am. Stat.
//! Assoc. 82:424-436) clipped to the triangle and shades each cell by its count class.

use crate::geometry::{Cartesian, SQRT3_2};
use std::collections::HashMap;

/// Samples per diagram above which figures switch from markers to density shading (our
/// choice: beyond about two thousand 3-pt markers in a single-column triangle, markers cover
/// most of the occupied area and hide where samples concentrate).
pub const DENSITY_THRESHOLD: usize = 2000;

/// Hexagonal cells across the base of the triangle.
pub const CELLS_ACROSS: usize = 24;

/// One occupied cell.
///
/// # Example
/// ```
/// use provenance_core::plot::density::hexbin;
/// let bins = hexbin([[100.0 / 3.0; 3]; 5].into_iter(), 20);
/// assert_eq!(bins.cells.len(), 1);
/// assert_eq!(bins.cells[0].count, 5);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct HexCell {
    /// Samples in the cell.
    pub count: u32,
    /// The cell outline clipped to the triangle, in the side-100 plane.
    pub outline: Vec<Cartesian>,
}

/// The occupied cells of one diagram.
///
/// # Example
/// ```
/// use provenance_core::plot::density::hexbin;
/// let bins = hexbin([[100.0, 0.0, 0.0], [0.0, 0.0, 100.0], [0.0, 0.0, 100.0]].into_iter(), 10);
/// assert_eq!((bins.cells.len(), bins.max()), (2, 2));
/// ```
#[derive(Debug, Clone, PartialEq, Default)]
pub struct HexBins {
    /// Cells with at least one sample, in a fixed order (by cell coordinates).
    pub cells: Vec<HexCell>,
}

impl HexBins {
    /// The largest count of any cell (0 when empty).
    pub fn max(&self) -> u32 {
        self.cells.iter().map(|c| c.count).max().unwrap_or(0)
    }
}

/// Bin points given as percentages `[a, b, c]` into pointy-top hexagons `across` cells wide
/// along the base. Points that are not finite are skipped.
///
/// # Example
/// ```
/// use provenance_core::plot::density::hexbin;
/// let bins = hexbin([[50.0, 25.0, 25.0], [50.2, 24.9, 24.9], [f64::NAN, 0.0, 0.0]].into_iter(), 24);
/// assert_eq!(bins.cells.iter().map(|c| c.count).sum::<u32>(), 2);
/// ```
pub fn hexbin(points: impl Iterator<Item = [f64; 3]>, across: usize) -> HexBins {
    let width = 100.0 / across.max(1) as f64;
    let r = width / 3f64.sqrt();
    let mut counts: HashMap<(i64, i64), u32> = HashMap::new();
    for p in points {
        let c = Cartesian::from_parts(p);
        if !(c.x.is_finite() && c.y.is_finite()) {
            continue;
        }
        *counts.entry(cell_of(c, r)).or_insert(0) += 1;
    }
    let mut keys: Vec<_> = counts.into_iter().collect();
    keys.sort_unstable_by_key(|(k, _)| (k.1, k.0));
    let cells = keys
        .into_iter()
        .filter_map(|((q, s), count)| {
            let outline = clip_to_triangle(hexagon(q, s, r));
            (outline.len() >= 3).then_some(HexCell { count, outline })
        })
        .collect();
    HexBins { cells }
}

/// Axial coordinates of the hexagon holding `c` (cube rounding).
fn cell_of(c: Cartesian, r: f64) -> (i64, i64) {
    let q = (3f64.sqrt() / 3.0 * c.x - c.y / 3.0) / r;
    let s = (2.0 / 3.0 * c.y) / r;
    let (x, z) = (q, s);
    let y = -x - z;
    let (mut rx, ry, mut rz) = (x.round(), y.round(), z.round());
    let (dx, dy, dz) = ((rx - x).abs(), (ry - y).abs(), (rz - z).abs());
    if dx > dy && dx > dz {
        rx = -ry - rz;
    } else if dy <= dz {
        rz = -rx - ry;
    }
    (rx as i64, rz as i64)
}

fn hexagon(q: i64, s: i64, r: f64) -> Vec<Cartesian> {
    let cx = r * 3f64.sqrt() * (q as f64 + s as f64 / 2.0);
    let cy = r * 1.5 * s as f64;
    (0..6)
        .map(|i| {
            let t = std::f64::consts::PI / 180.0 * (30.0 + 60.0 * i as f64);
            Cartesian {
                x: cx + r * t.cos(),
                y: cy + r * t.sin(),
            }
        })
        .collect()
}

/// Sutherland-Hodgman clipping of a convex polygon to the triangle of side 100.
fn clip_to_triangle(mut poly: Vec<Cartesian>) -> Vec<Cartesian> {
    let top = Cartesian {
        x: 50.0,
        y: 100.0 * SQRT3_2,
    };
    let corners = [
        Cartesian { x: 0.0, y: 0.0 },
        Cartesian { x: 100.0, y: 0.0 },
        top,
    ];
    for i in 0..3 {
        let (a, b) = (corners[i], corners[(i + 1) % 3]);
        let side = |p: Cartesian| (b.x - a.x) * (p.y - a.y) - (b.y - a.y) * (p.x - a.x);
        let mut out = Vec::with_capacity(poly.len() + 2);
        for j in 0..poly.len() {
            let (p, q) = (poly[j], poly[(j + 1) % poly.len()]);
            let (sp, sq) = (side(p), side(q));
            if sp >= 0.0 {
                out.push(p);
            }
            if (sp >= 0.0) != (sq >= 0.0) {
                let t = sp / (sp - sq);
                out.push(Cartesian {
                    x: p.x + t * (q.x - p.x),
                    y: p.y + t * (q.y - p.y),
                });
            }
        }
        poly = out;
        if poly.is_empty() {
            break;
        }
    }
    poly
}

/// Count classes for shading: up to `k` classes with logarithmically spaced lower bounds from 1
/// to the largest count, so sparse and crowded cells both stay visible.
///
/// # Example
/// ```
/// use provenance_core::plot::density::DensityClasses;
/// let c = DensityClasses::new(100, 6);
/// assert_eq!(c.class_of(1), 0);
/// assert_eq!(c.class_of(100), c.len() - 1);
/// assert_eq!(c.label(0), "1");
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct DensityClasses {
    lower: Vec<u32>,
    max: u32,
}

impl DensityClasses {
    /// Classes for counts from 1 to `max`.
    pub fn new(max: u32, k: usize) -> DensityClasses {
        let max = max.max(1);
        let k = k.max(1);
        let mut lower: Vec<u32> = Vec::with_capacity(k);
        for i in 0..k {
            let b = (f64::from(max).powf(i as f64 / k as f64)).round().max(1.0) as u32;
            if lower.last().is_none_or(|l| b > *l) {
                lower.push(b);
            }
        }
        DensityClasses { lower, max }
    }

    /// Number of classes.
    pub fn len(&self) -> usize {
        self.lower.len()
    }

    /// True when there are no classes (never: there is always at least one).
    pub fn is_empty(&self) -> bool {
        self.lower.is_empty()
    }

    /// The class (0-based) of a count of at least 1.
    pub fn class_of(&self, count: u32) -> usize {
        self.lower.iter().rposition(|l| count >= *l).unwrap_or(0)
    }

    /// The range of class `i` in words, such as `"4–9"`.
    pub fn label(&self, i: usize) -> String {
        let lo = self.lower.get(i).copied().unwrap_or(1);
        let hi = match self.lower.get(i + 1) {
            Some(next) => next - 1,
            None => self.max,
        };
        if hi <= lo {
            lo.to_string()
        } else {
            format!("{lo}–{hi}")
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_point_lands_in_the_cell_whose_centre_is_nearest() {
        let r = 100.0 / CELLS_ACROSS as f64 / 3f64.sqrt();
        for i in 0..50 {
            for j in 0..50 {
                let c = Cartesian {
                    x: i as f64 * 2.01,
                    y: j as f64 * 1.73,
                };
                let (q, s) = cell_of(c, r);
                let centre = |q: i64, s: i64| Cartesian {
                    x: r * 3f64.sqrt() * (q as f64 + s as f64 / 2.0),
                    y: r * 1.5 * s as f64,
                };
                let d = c.distance(&centre(q, s));
                for (dq, ds) in [(1, 0), (-1, 0), (0, 1), (0, -1), (1, -1), (-1, 1)] {
                    assert!(d <= c.distance(&centre(q + dq, s + ds)) + 1e-9);
                }
            }
        }
    }

    #[test]
    fn counts_add_up_and_cells_stay_inside_the_triangle() {
        let pts: Vec<[f64; 3]> = (0..=100)
            .flat_map(|a| (0..=(100 - a)).map(move |b| [a as f64, b as f64, (100 - a - b) as f64]))
            .collect();
        let bins = hexbin(pts.iter().copied(), CELLS_ACROSS);
        let total: u32 = bins.cells.iter().map(|c| c.count).sum();
        assert_eq!(total as usize, pts.len());
        for cell in &bins.cells {
            for p in &cell.outline {
                let parts = p.to_parts();
                assert!(parts.iter().all(|v| *v > -1e-9), "{parts:?}");
            }
        }
        // Clipped cells tile the triangle: their areas add up to its area 100²·√3/4.
        let area: f64 = bins
            .cells
            .iter()
            .map(|c| {
                let n = c.outline.len();
                (0..n)
                    .map(|i| {
                        let (u, v) = (c.outline[i], c.outline[(i + 1) % n]);
                        u.x * v.y - v.x * u.y
                    })
                    .sum::<f64>()
                    / 2.0
            })
            .sum();
        assert!((area - 10_000.0 * 3f64.sqrt() / 4.0).abs() < 1e-6, "{area}");
    }

    #[test]
    fn classes_are_increasing_and_cover_every_count() {
        for max in [1, 2, 5, 37, 1000] {
            let c = DensityClasses::new(max, 6);
            let mut last = 0;
            for n in 1..=max {
                let k = c.class_of(n);
                assert!(k >= last && k < c.len());
                last = k;
            }
            assert_eq!(c.class_of(max), c.len() - 1);
        }
    }
}
