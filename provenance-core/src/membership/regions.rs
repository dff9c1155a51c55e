//! Named regions of a ternary diagram, and a grid index that finds the region of a point fast.

use crate::geometry::polygon::segment_distance;
use crate::geometry::{Cartesian, Polygon};

/// One named region (a provenance field, or any polygon a user supplies).
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::membership::{Region, Regions};
/// let top = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
/// let set = [Region { name: "quartz-rich", group: Some("example"), polygon: &top }];
/// assert_eq!(set[..].len(), 1);
/// assert_eq!(set[..].name(0), "quartz-rich");
/// assert_eq!(set[..].group(0), Some("example"));
/// ```
#[derive(Debug, Clone, Copy)]
pub struct Region<'a> {
    /// The region's name, as it should appear in outputs.
    pub name: &'a str,
    /// The provenance group it belongs to, when it has one.
    pub group: Option<&'a str>,
    /// Its outline, in percent of the diagram's three poles.
    pub polygon: &'a Polygon,
}

/// An ordered set of named regions of one diagram.
///
/// Membership treats the regions in this order: a composition inside two overlapping regions
/// counts for the first. A field set implements this trait to be used for membership.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::membership::Regions;
/// let p = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]);
/// let set: [(&str, &Polygon); 1] = [("whole", &p)];
/// assert_eq!(set[..].len(), 1);
/// assert_eq!(set[..].group(0), None);
/// assert!(set[..].polygon(0).contains([20.0, 30.0, 50.0]));
/// ```
pub trait Regions: Sync {
    /// Number of regions.
    fn len(&self) -> usize;
    /// The name of region `i`.
    fn name(&self, i: usize) -> &str;
    /// The outline of region `i`.
    fn polygon(&self, i: usize) -> &Polygon;
    /// The provenance group of region `i`, if any.
    fn group(&self, _i: usize) -> Option<&str> {
        None
    }
    /// True when there are no regions.
    fn is_empty(&self) -> bool {
        self.len() == 0
    }
}

impl Regions for [Region<'_>] {
    fn len(&self) -> usize {
        <[Region<'_>]>::len(self)
    }
    fn name(&self, i: usize) -> &str {
        self[i].name
    }
    fn polygon(&self, i: usize) -> &Polygon {
        self[i].polygon
    }
    fn group(&self, i: usize) -> Option<&str> {
        self[i].group
    }
}

impl Regions for [(&str, &Polygon)] {
    fn len(&self) -> usize {
        <[(&str, &Polygon)]>::len(self)
    }
    fn name(&self, i: usize) -> &str {
        self[i].0
    }
    fn polygon(&self, i: usize) -> &Polygon {
        self[i].1
    }
}

impl Regions for [(String, Polygon)] {
    fn len(&self) -> usize {
        <[(String, Polygon)]>::len(self)
    }
    fn name(&self, i: usize) -> &str {
        &self[i].0
    }
    fn polygon(&self, i: usize) -> &Polygon {
        &self[i].1
    }
}

/// Cells per side of the index grid.
const GRID: usize = 128;
/// Padding (percent) around each cell when deciding whether an edge touches it: far above the
/// rounding error of the crossing test (about 1e-12 percent), so an untouched cell can hold no
/// point whose containment differs from the cell's centre.
const PAD: f64 = 1e-7;
/// Marks an entry whose polygon must be tested exactly.
const CHECK: u32 = 1 << 31;
/// Fast-table value: the cell needs the entry list.
const MIXED: u32 = u32::MAX;
/// Fast-table value: no region covers the cell.
const NONE: u32 = u32::MAX - 1;

/// A point-location index over an ordered region set.
///
/// The triangle is cut into a 128 × 128 grid in the (c, a) plane. A cell that no polygon edge
/// inside the triangle touches has the same containment at every point with three positive
/// parts, decided once at a representative point; only cells that such an edge crosses, and
/// points on or beyond the triangle's sides, are tested exactly with [`Polygon::contains`]. [`RegionIndex::locate`]
/// therefore returns exactly what a scan of the regions in order with [`Polygon::contains`]
/// returns, including its shared-edge rule.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::membership::RegionIndex;
/// let low = Polygon::new(vec![[50.0, 50.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0], [50.0, 0.0, 50.0]]);
/// let set: [(&str, &Polygon); 1] = [("lower half", &low)];
/// let index = RegionIndex::new(&set[..]);
/// assert_eq!(index.locate([10.0, 45.0, 45.0]), Some(0));
/// assert_eq!(index.locate([60.0, 20.0, 20.0]), None);
/// ```
#[derive(Debug, Clone)]
pub struct RegionIndex {
    polygons: Vec<Polygon>,
    /// Polygon edges that do not lie on a side of the triangle, in the plane.
    inner_edges: Vec<(Cartesian, Cartesian)>,
    /// Every non-horizontal edge as (a₀, a₁, c at a₀, dc/da) with a₀ < a₁, percent.
    spans: Vec<(f64, f64, f64, f64)>,
    /// Whether each span lies on a side of the triangle.
    span_on_side: Vec<bool>,
    /// Distinct vertex levels of the A pole, sorted, percent.
    levels: Vec<f64>,
    fast: Vec<u32>,
    starts: Vec<u32>,
    entries: Vec<u32>,
}

/// Does the segment u–v (in (c, a) coordinates) touch the box [x0, x1] × [y0, y1]?
/// Conservative: rounding can only report a touch that is not there.
fn segment_touches_box(u: (f64, f64), v: (f64, f64), x0: f64, x1: f64, y0: f64, y1: f64) -> bool {
    if u.0.max(v.0) < x0 || u.0.min(v.0) > x1 || u.1.max(v.1) < y0 || u.1.min(v.1) > y1 {
        return false;
    }
    // The line through u and v separates the corners only if they all lie on one side.
    let side = |x: f64, y: f64| (v.0 - u.0) * (y - u.1) - (v.1 - u.1) * (x - u.0);
    let s = [side(x0, y0), side(x1, y0), side(x0, y1), side(x1, y1)];
    let tol = 1e-9 * ((v.0 - u.0).abs() + (v.1 - u.1).abs() + 1.0);
    !(s.iter().all(|v| *v > tol) || s.iter().all(|v| *v < -tol))
}

impl RegionIndex {
    /// Build the index of a region set (it keeps copies of the polygons).
    pub fn new<R: Regions + ?Sized>(regions: &R) -> RegionIndex {
        let polygons: Vec<Polygon> = (0..regions.len())
            .map(|i| regions.polygon(i).clone())
            .collect();
        let cell = 100.0 / GRID as f64;
        // touched[r][cell]: an edge of polygon r touches the padded cell.
        let mut touched = vec![vec![false; GRID * GRID]; polygons.len()];
        for (r, poly) in polygons.iter().enumerate() {
            let v = poly.vertices();
            for k in 0..v.len() {
                let (a, b) = (v[k], v[(k + 1) % v.len()]);
                // An edge on a side of the triangle is never crossed by a composition with three
                // positive parts, which is all `locate` answers from the grid.
                if (0..3).any(|pole| a[pole].abs() < 1e-9 && b[pole].abs() < 1e-9) {
                    continue;
                }
                let (u, w) = ((a[2], a[0]), (b[2], b[0]));
                let lo = |t: f64| (((t - PAD) / cell).floor().max(0.0) as usize).min(GRID - 1);
                let hi = |t: f64| (((t + PAD) / cell).floor().max(0.0) as usize).min(GRID - 1);
                for j in lo(u.1.min(w.1))..=hi(u.1.max(w.1)) {
                    for i in lo(u.0.min(w.0))..=hi(u.0.max(w.0)) {
                        let (x0, y0) = (i as f64 * cell - PAD, j as f64 * cell - PAD);
                        let (x1, y1) = (x0 + cell + 2.0 * PAD, y0 + cell + 2.0 * PAD);
                        if segment_touches_box(u, w, x0, x1, y0, y1) {
                            touched[r][j * GRID + i] = true;
                        }
                    }
                }
            }
        }
        let mut fast = vec![NONE; GRID * GRID];
        let mut starts = Vec::with_capacity(GRID * GRID + 1);
        let mut entries = Vec::new();
        for j in 0..GRID {
            for i in 0..GRID {
                let id = j * GRID + i;
                starts.push(entries.len() as u32);
                // A representative point of the cell inside the triangle: the centre, or for
                // cells cut by the side b = 0 a point near the lower-left corner; cells with
                // no such point test every polygon exactly.
                let (x0, y0) = (i as f64 * cell, j as f64 * cell);
                let (a, c) = if x0 + y0 + cell < 100.0 {
                    (y0 + 0.5 * cell, x0 + 0.5 * cell)
                } else {
                    (y0 + 0.25 * cell, x0 + 0.25 * cell)
                };
                let outside_triangle = x0 + y0 + 0.5 * cell >= 100.0;
                let centre = [a, 100.0 - a - c, c];
                let mut list = Vec::new();
                for (r, poly) in polygons.iter().enumerate() {
                    if touched[r][id] || outside_triangle {
                        list.push(r as u32 | CHECK);
                    } else if poly.contains(centre) {
                        list.push(r as u32);
                        break;
                    }
                }
                fast[id] = match list.as_slice() {
                    [] => NONE,
                    [only] if only & CHECK == 0 => *only,
                    _ => MIXED,
                };
                entries.extend(list);
            }
        }
        starts.push(entries.len() as u32);
        let mut inner_edges = Vec::new();
        let (mut spans, mut span_on_side, mut levels) = (Vec::new(), Vec::new(), Vec::new());
        for poly in &polygons {
            let (v, q) = (poly.vertices(), poly.plane());
            for k in 0..v.len() {
                let k1 = (k + 1) % v.len();
                let on_side =
                    (0..3).any(|pole| v[k][pole].abs() < 1e-9 && v[k1][pole].abs() < 1e-9);
                if !on_side {
                    inner_edges.push((q[k], q[k1]));
                }
                levels.push(v[k][0]);
                let (mut u, mut w) = (v[k], v[k1]);
                if u[0] > w[0] {
                    std::mem::swap(&mut u, &mut w);
                }
                if w[0] > u[0] {
                    spans.push((u[0], w[0], u[2], (w[2] - u[2]) / (w[0] - u[0])));
                    span_on_side.push(on_side);
                }
            }
        }
        levels.sort_by(f64::total_cmp);
        levels.dedup();
        RegionIndex {
            polygons,
            inner_edges,
            spans,
            span_on_side,
            levels,
            fast,
            starts,
            entries,
        }
    }

    /// Number of regions indexed.
    pub fn len(&self) -> usize {
        self.polygons.len()
    }

    /// True when no regions are indexed.
    pub fn is_empty(&self) -> bool {
        self.polygons.is_empty()
    }

    /// The first region (in set order) containing the point `[a, b, c]` (percent), or `None`.
    #[inline]
    pub fn locate(&self, p: [f64; 3]) -> Option<usize> {
        let scale = GRID as f64 / 100.0;
        let i = ((p[2] * scale) as usize).min(GRID - 1);
        let j = ((p[0] * scale) as usize).min(GRID - 1);
        let id = j * GRID + i;
        // On or beyond a side of the triangle the grid does not answer (see `new`).
        if p[0] <= 0.0 || p[2] <= 0.0 || p[0] + p[2] >= 100.0 {
            return self.scan(p);
        }
        match self.fast[id] {
            NONE => None,
            MIXED => self.locate_slow(id, p),
            r => Some(r as usize),
        }
    }

    #[cold]
    fn scan(&self, p: [f64; 3]) -> Option<usize> {
        self.polygons.iter().position(|q| q.contains(p))
    }

    #[cold]
    fn locate_slow(&self, id: usize, p: [f64; 3]) -> Option<usize> {
        let (s, e) = (self.starts[id] as usize, self.starts[id + 1] as usize);
        for &entry in &self.entries[s..e] {
            let r = (entry & !CHECK) as usize;
            if entry & CHECK == 0 || self.polygons[r].contains(p) {
                return Some(r);
            }
        }
        None
    }

    /// Distinct levels (percent of the A pole) of all vertices, sorted.
    pub fn vertex_levels(&self) -> &[f64] {
        &self.levels
    }

    /// Append the c values (percent) where region boundaries cross the line of constant A at
    /// `level` (percent); edges are taken half-open, from their lower end.
    pub fn crossings(&self, level: f64, out: &mut Vec<f64>) {
        for &(a0, a1, c0, slope) in &self.spans {
            if a0 <= level && level < a1 {
                out.push(c0 + (level - a0) * slope);
            }
        }
    }

    /// The fastest rate (per percent of A) at which a boundary edge crossing the level `level`
    /// moves t = c/(100 − a) along it, excluding edges on the triangle's sides (t fixed at 0
    /// or 1 there); 0 when no edge crosses.
    pub fn t_speed(&self, level: f64) -> f64 {
        let w = (100.0 - level).max(1e-12);
        let mut fastest: f64 = 0.0;
        for (&(a0, a1, c0, slope), &side) in self.spans.iter().zip(&self.span_on_side) {
            if !side && a0 <= level && level < a1 {
                let c = c0 + (level - a0) * slope;
                fastest = fastest.max(((slope * w + c) / (w * w)).abs());
            }
        }
        fastest
    }

    /// Shortest distance (percentage points) from `p` to any region's boundary inside the
    /// triangle: edges lying on a side of the triangle (both ends with the same pole at 0) are
    /// left out, since no composition with three positive parts can cross them. Infinite when
    /// no such edge exists.
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::Polygon;
    /// use provenance_core::membership::RegionIndex;
    /// let cap = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
    /// let set: [(&str, &Polygon); 1] = [("cap", &cap)];
    /// let index = RegionIndex::new(&set[..]);
    /// // Only the line a = 50 counts: 20 points of A above it is 20·√3/2 in the plane.
    /// let d = index.inner_boundary_distance([70.0, 29.0, 1.0]);
    /// assert!((d - 20.0 * 0.866_025_403_784_438_6).abs() < 1e-9);
    /// ```
    pub fn inner_boundary_distance(&self, p: [f64; 3]) -> f64 {
        let q = Cartesian::from_parts(p);
        self.inner_edges
            .iter()
            .map(|(a, b)| segment_distance(q, *a, *b))
            .fold(f64::INFINITY, f64::min)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn scan(polys: &[Polygon], p: [f64; 3]) -> Option<usize> {
        polys.iter().position(|q| q.contains(p))
    }

    /// A small tiling with a shared edge, an oblique edge and a gap.
    fn tiling() -> Vec<(String, Polygon)> {
        vec![
            (
                "top".into(),
                Polygon::new(vec![
                    [100.0, 0.0, 0.0],
                    [60.0, 40.0, 0.0],
                    [60.0, 0.0, 40.0],
                ]),
            ),
            (
                "left".into(),
                Polygon::new(vec![
                    [60.0, 40.0, 0.0],
                    [0.0, 100.0, 0.0],
                    [0.0, 63.3, 36.7],
                    [60.0, 20.0, 20.0],
                ]),
            ),
            (
                "right".into(),
                Polygon::new(vec![
                    [60.0, 20.0, 20.0],
                    [0.0, 63.3, 36.7],
                    [0.0, 10.0, 90.0],
                    [60.0, 0.0, 40.0],
                ]),
            ),
        ]
    }

    #[test]
    fn index_agrees_with_a_plain_scan_everywhere() {
        let set = tiling();
        let polys: Vec<Polygon> = set.iter().map(|s| s.1.clone()).collect();
        let index = RegionIndex::new(&set[..]);
        let mut checked = 0;
        // A fine lattice, including points exactly on edges and vertices.
        for ai in 0..=400 {
            for ci in 0..=(400 - ai) {
                let (a, c) = (ai as f64 / 4.0, ci as f64 / 4.0);
                let p = [a, 100.0 - a - c, c];
                assert_eq!(index.locate(p), scan(&polys, p), "{p:?}");
                checked += 1;
            }
        }
        assert!(checked > 80_000);
        // Points on the shared edge top/left at a = 60 and on the oblique left/right edge.
        for c in [1.0, 5.0, 19.9] {
            assert_eq!(
                index.locate([60.0, 40.0 - c, c]),
                scan(&polys, [60.0, 40.0 - c, c])
            );
        }
    }

    #[test]
    fn index_agrees_with_a_plain_scan_at_random_and_near_the_sides() {
        use rand::Rng;
        let set = tiling();
        let polys: Vec<Polygon> = set.iter().map(|s| s.1.clone()).collect();
        let index = RegionIndex::new(&set[..]);
        let mut rng = crate::membership::stream(3, 0, 0);
        for k in 0..200_000 {
            let mut x: [f64; 3] = [rng.random(), rng.random(), rng.random()];
            // Every third point has one part pushed very close to zero.
            if k % 3 == 0 {
                x[k % 9 / 3] *= 1e-12;
            }
            let s = x[0] + x[1] + x[2];
            let p = x.map(|v| 100.0 * v / s);
            assert_eq!(index.locate(p), scan(&polys, p), "{p:?}");
        }
    }

    #[test]
    fn gap_and_first_of_overlapping_regions() {
        let a = Polygon::new(vec![
            [100.0, 0.0, 0.0],
            [0.0, 100.0, 0.0],
            [0.0, 0.0, 100.0],
        ]);
        let b = Polygon::new(vec![
            [100.0, 0.0, 0.0],
            [50.0, 50.0, 0.0],
            [50.0, 0.0, 50.0],
        ]);
        let set: [(&str, &Polygon); 2] = [("b", &b), ("a", &a)];
        let index = RegionIndex::new(&set[..]);
        assert_eq!(index.locate([80.0, 10.0, 10.0]), Some(0));
        assert_eq!(index.locate([20.0, 40.0, 40.0]), Some(1));
        let only_b: [(&str, &Polygon); 1] = [("b", &b)];
        assert_eq!(
            RegionIndex::new(&only_b[..]).locate([20.0, 40.0, 40.0]),
            None
        );
    }
}
