//! Areas where polygons overlap, and the ground of the triangle that none of them covers.
//!
//! Method (our own, exact for straight-edged polygons): cut the triangle into vertical slabs
//! at every vertex and at every crossing of two edges. Inside a slab no edges cross, so each
//! polygon's cross-section is a fixed set of intervals whose ends move linearly; the length
//! of any intersection, union or gap of them is then linear across the slab, and the slab's
//! area is its width times that length at mid-slab (the trapezoid rule is exact for linear
//! functions). Gaps in neighbouring slabs that touch join into one region.
//!
//! The work is done in the (c, a) coordinates of the percentages (an affine image of the
//! equilateral diagram with area factor √3/2), so that vertices shared by two fields are
//! evaluated identically in both. Areas are reported in the equilateral diagram of side 100.
//!
//! Polygons are read with the even-odd rule; for simple polygons that is their interior.
//!
//! Why not a general geometry crate's boolean operations: we need only areas and the location
//! of gaps, not the clipped polygons; the slab method gives them exactly in a page of code,
//! cannot fail on touching or collinear edges (the common case where fields share borders),
//! and works on the percentages as written, so shared vertices compare exactly.

pub use super::region::Region;
use super::ternary::SQRT3_2;
use super::Polygon;

/// Area of the whole triangle of side 100: 100² · √3/4.
pub const TRIANGLE_AREA: f64 = 2500.0 * 1.732_050_807_568_877_2;

/// Gap pieces narrower than this (percentage points across the slab) are rounding noise
/// where two fields share an edge (numerical tolerance, our choice).
const NOISE: f64 = 1e-9;

/// One straight edge in (c, a), endpoints ordered by (c, a) so shared edges agree exactly.
#[derive(Debug, Clone, Copy)]
struct Edge {
    c0: f64,
    a0: f64,
    c1: f64,
    a1: f64,
}

impl Edge {
    fn new(u: [f64; 3], v: [f64; 3]) -> Edge {
        let (mut p, mut q) = ((u[2], u[0]), (v[2], v[0]));
        if p > q {
            std::mem::swap(&mut p, &mut q);
        }
        Edge {
            c0: p.0,
            a0: p.1,
            c1: q.0,
            a1: q.1,
        }
    }

    fn spans(&self, c: f64) -> bool {
        self.c0 < c && c < self.c1
    }

    fn a_at(&self, c: f64) -> f64 {
        if self.c1 == self.c0 {
            return self.a0;
        }
        self.a0 + (c - self.c0) * (self.a1 - self.a0) / (self.c1 - self.c0)
    }
}

/// What bounds a gap piece from below or above.
#[derive(Debug, Clone, Copy)]
enum Bound {
    /// The side a = 0 (the A pole absent).
    Base,
    /// The side a = 100 − c (the B pole absent).
    Slope,
    /// A polygon edge.
    Edge(Edge),
}

impl Bound {
    fn at(&self, c: f64) -> f64 {
        match self {
            Bound::Base => 0.0,
            Bound::Slope => 100.0 - c,
            Bound::Edge(e) => e.a_at(c),
        }
    }
}

/// One polygon's cross-section in a slab: (lower edge, upper edge) pairs.
type Section = Vec<(Edge, Edge)>;

#[derive(Debug, Clone, Copy)]
struct Piece {
    c0: f64,
    c1: f64,
    lo: Bound,
    hi: Bound,
}

impl Piece {
    fn corners(&self) -> [(f64, f64); 4] {
        [
            (self.c0, self.lo.at(self.c0)),
            (self.c1, self.lo.at(self.c1)),
            (self.c1, self.hi.at(self.c1)),
            (self.c0, self.hi.at(self.c0)),
        ]
    }

    /// Area in (c, a) and its first moments.
    fn moments(&self) -> (f64, f64, f64) {
        let k = self.corners();
        let (mut area, mut mc, mut ma) = (0.0, 0.0, 0.0);
        for i in 0..4 {
            let (p, q) = (k[i], k[(i + 1) % 4]);
            let w = p.0 * q.1 - q.0 * p.1;
            area += w;
            mc += (p.0 + q.0) * w;
            ma += (p.1 + q.1) * w;
        }
        (area / 2.0, mc / 6.0, ma / 6.0)
    }
}

/// The slab decomposition of a set of polygons over the triangle.
///
/// # Example
/// ```
/// use provenance_core::geometry::{overlay::Overlay, Polygon};
/// // Q ≥ 50 and L ≤ 25 overlap in Q ≥ 50, L ≤ 25: in (L, Q) a trapezoid of width 25 and
/// // heights 50 and 25, area 937.5, times √3/2 in the equilateral diagram.
/// let a = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
/// let b = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 75.0, 25.0], [75.0, 0.0, 25.0]]);
/// let o = Overlay::of(&[a, b]);
/// assert!((o.overlap(0, 1) - 937.5 * 0.866_025_403_784_438_6).abs() < 1e-9);
/// ```
#[derive(Debug, Clone)]
pub struct Overlay {
    n: usize,
    overlaps: Vec<f64>,
    areas: Vec<f64>,
    gaps: Vec<Region>,
}

fn section(edges: &[Edge], c: f64) -> Section {
    let mut cut: Vec<(f64, Edge)> = edges
        .iter()
        .filter(|e| e.spans(c))
        .map(|e| (e.a_at(c), *e))
        .collect();
    cut.sort_by(|x, y| x.0.total_cmp(&y.0));
    cut.chunks_exact(2).map(|w| (w[0].1, w[1].1)).collect()
}

fn clip(lo: f64, hi: f64, top: f64) -> f64 {
    (hi.min(top) - lo.max(0.0)).max(0.0)
}

fn events(polys: &[Vec<Edge>]) -> Vec<f64> {
    let all: Vec<Edge> = polys.iter().flatten().copied().collect();
    let mut ev: Vec<f64> = vec![0.0, 100.0];
    for e in &all {
        ev.push(e.c0);
        ev.push(e.c1);
    }
    for (i, e) in all.iter().enumerate() {
        for f in &all[i + 1..] {
            let (lo, hi) = (e.c0.max(f.c0), e.c1.min(f.c1));
            if lo >= hi || lo.is_nan() || hi.is_nan() {
                continue;
            }
            let (d0, d1) = (e.a_at(lo) - f.a_at(lo), e.a_at(hi) - f.a_at(hi));
            if (d0 > 0.0 && d1 < 0.0) || (d0 < 0.0 && d1 > 0.0) {
                ev.push(lo + (hi - lo) * d0 / (d0 - d1));
            }
        }
    }
    ev.retain(|c| (0.0..=100.0).contains(c));
    ev.sort_by(f64::total_cmp);
    ev.dedup();
    ev
}

fn find(parent: &mut [usize], mut i: usize) -> usize {
    while parent[i] != i {
        parent[i] = parent[parent[i]];
        i = parent[i];
    }
    i
}

impl Overlay {
    /// Decompose `polygons` (vertices in percent) over the triangle.
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::{overlay::Overlay, Polygon};
    /// let top = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
    /// assert!((Overlay::of(&[top.clone()]).area(0) - top.area()).abs() < 1e-9);
    /// ```
    pub fn of(polygons: &[Polygon]) -> Overlay {
        let polys: Vec<Vec<Edge>> = polygons
            .iter()
            .map(|p| p.edges().map(|(_, u, v)| Edge::new(u, v)).collect())
            .collect();
        let n = polys.len();
        let ev = events(&polys);
        let mut overlaps = vec![0.0; n * n];
        let mut areas = vec![0.0; n];
        let mut pieces: Vec<Piece> = Vec::new();
        let mut slab_of: Vec<usize> = Vec::new();
        for (s, w) in ev.windows(2).enumerate() {
            let (c0, c1) = (w[0], w[1]);
            let width = c1 - c0;
            if width <= 0.0 {
                continue;
            }
            let cm = 0.5 * (c0 + c1);
            let top = 100.0 - cm;
            let secs: Vec<Section> = polys.iter().map(|e| section(e, cm)).collect();
            for (i, si) in secs.iter().enumerate() {
                areas[i] += width
                    * si.iter()
                        .map(|(l, h)| clip(l.a_at(cm), h.a_at(cm), top))
                        .sum::<f64>();
                for (j, sj) in secs.iter().enumerate().skip(i + 1) {
                    let mut len = 0.0;
                    for (l1, h1) in si {
                        for (l2, h2) in sj {
                            let lo = l1.a_at(cm).max(l2.a_at(cm));
                            let hi = h1.a_at(cm).min(h2.a_at(cm));
                            len += clip(lo, hi, top);
                        }
                    }
                    overlaps[i * n + j] += width * len;
                }
            }
            // Union of all sections, then the gaps between 0 and the top of the triangle.
            let mut ivs: Vec<(f64, Bound, f64, Bound)> = secs
                .iter()
                .flatten()
                .map(|(l, h)| (l.a_at(cm), Bound::Edge(*l), h.a_at(cm), Bound::Edge(*h)))
                .collect();
            ivs.sort_by(|x, y| x.0.total_cmp(&y.0));
            let (mut reach, mut below) = (0.0, Bound::Base);
            for (lo, lo_b, hi, hi_b) in ivs {
                if lo > reach {
                    let hi_gap = lo.min(top);
                    let lo_b2 = below;
                    if hi_gap - reach > NOISE {
                        pieces.push(Piece {
                            c0,
                            c1,
                            lo: lo_b2,
                            hi: if lo >= top { Bound::Slope } else { lo_b },
                        });
                        slab_of.push(s);
                    }
                }
                if hi > reach {
                    reach = hi;
                    below = hi_b;
                }
            }
            if top - reach > NOISE {
                pieces.push(Piece {
                    c0,
                    c1,
                    lo: below,
                    hi: Bound::Slope,
                });
                slab_of.push(s);
            }
        }
        let f = SQRT3_2;
        for v in overlaps.iter_mut().chain(areas.iter_mut()) {
            *v *= f;
        }
        let gaps = regions(&pieces, &slab_of);
        Overlay {
            n,
            overlaps,
            areas,
            gaps,
        }
    }

    /// Area where polygons `i` and `j` overlap, in the equilateral diagram (percentage points
    /// squared); 0 for `i == j` or an index out of range.
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::{overlay::Overlay, Polygon};
    /// let top = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
    /// let o = Overlay::of(&[top.clone(), top.clone()]);
    /// assert!((o.overlap(1, 0) - top.area()).abs() < 1e-9);
    /// assert_eq!(o.overlap(0, 0), 0.0);
    /// ```
    pub fn overlap(&self, i: usize, j: usize) -> f64 {
        let (i, j) = (i.min(j), i.max(j));
        if i == j || j >= self.n {
            return 0.0;
        }
        self.overlaps[i * self.n + j]
    }

    /// Area of polygon `i` inside the triangle, by the same slabs (for checks).
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::{overlay::{Overlay, TRIANGLE_AREA}, Polygon};
    /// let whole = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]);
    /// assert!((Overlay::of(&[whole]).area(0) - TRIANGLE_AREA).abs() < 1e-9);
    /// ```
    pub fn area(&self, i: usize) -> f64 {
        self.areas.get(i).copied().unwrap_or(0.0)
    }

    /// The connected regions covered by no polygon, largest first.
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::{overlay::Overlay, Polygon};
    /// let whole = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]);
    /// assert!(Overlay::of(&[whole]).uncovered().is_empty());
    /// ```
    pub fn uncovered(&self) -> &[Region] {
        &self.gaps
    }

    /// Total area covered by no polygon.
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::{overlay::{Overlay, TRIANGLE_AREA}, Polygon};
    /// assert!((Overlay::of(&[]).uncovered_area() - TRIANGLE_AREA).abs() < 1e-9);
    /// ```
    pub fn uncovered_area(&self) -> f64 {
        // + 0.0 turns the -0.0 of an empty sum into 0.
        self.gaps.iter().map(|g| g.area).sum::<f64>() + 0.0
    }
}

/// Area of the intersection of two polygons, in the equilateral diagram (percentage points
/// squared).
///
/// # Example
/// ```
/// use provenance_core::geometry::{overlay::intersection_area, Polygon};
/// let top = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
/// let bottom = Polygon::new(vec![[50.0, 50.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0], [50.0, 0.0, 50.0]]);
/// assert!(intersection_area(&top, &bottom).abs() < 1e-9); // they share an edge only
/// assert!((intersection_area(&top, &top) - top.area()).abs() < 1e-9);
/// ```
pub fn intersection_area(a: &Polygon, b: &Polygon) -> f64 {
    Overlay::of(&[a.clone(), b.clone()]).overlap(0, 1)
}

/// Running sums of one region: area and first moments in (c, a), pole ranges, sides reached.
#[derive(Debug, Clone, Copy)]
struct Acc {
    area: f64,
    mc: f64,
    ma: f64,
    range: [[f64; 2]; 3],
    touches: [bool; 3],
}

impl Acc {
    fn new() -> Acc {
        Acc {
            area: 0.0,
            mc: 0.0,
            ma: 0.0,
            range: [[f64::INFINITY, f64::NEG_INFINITY]; 3],
            touches: [false; 3],
        }
    }

    fn add(&mut self, p: &Piece) {
        let (a, mc, ma) = p.moments();
        self.area += a;
        self.mc += mc;
        self.ma += ma;
        for (c, av) in p.corners() {
            let parts = [av, 100.0 - av - c, c];
            for (r, v) in self.range.iter_mut().zip(parts) {
                r[0] = r[0].min(v);
                r[1] = r[1].max(v);
            }
        }
        self.touches[0] |= matches!(p.lo, Bound::Base);
        self.touches[1] |= matches!(p.hi, Bound::Slope);
        self.touches[2] |= p.c0 == 0.0 && p.hi.at(0.0) - p.lo.at(0.0) > NOISE;
    }

    fn region(self) -> Option<Region> {
        if self.area <= 0.0 {
            return None;
        }
        let (c, av) = (self.mc / self.area, self.ma / self.area);
        Some(Region {
            area: self.area * SQRT3_2,
            centroid: [av, 100.0 - av - c, c],
            range: self.range.map(|[lo, hi]| [lo.max(0.0), hi.min(100.0)]),
            touches: self.touches,
        })
    }
}

fn regions(pieces: &[Piece], slab_of: &[usize]) -> Vec<Region> {
    let m = pieces.len();
    let mut parent: Vec<usize> = (0..m).collect();
    // Runs of pieces by slab, in slab order.
    let mut runs: Vec<(usize, usize, usize)> = Vec::new(); // (slab, start, end)
    for (k, s) in slab_of.iter().enumerate() {
        match runs.last_mut() {
            Some(r) if r.0 == *s => r.2 = k + 1,
            _ => runs.push((*s, k, k + 1)),
        }
    }
    // Join pieces of consecutive slabs whose spans overlap at the shared c.
    for w in runs.windows(2) {
        let ((s, a0, a1), (t, b0, b1)) = (w[0], w[1]);
        if t != s + 1 {
            continue;
        }
        for i in a0..a1 {
            let c = pieces[i].c1;
            let (l1, h1) = (pieces[i].lo.at(c), pieces[i].hi.at(c));
            for (j, q) in pieces.iter().enumerate().take(b1).skip(b0) {
                let (l2, h2) = (q.lo.at(c), q.hi.at(c));
                if h1.min(h2) - l1.max(l2) > NOISE {
                    let (ri, rj) = (find(&mut parent, i), find(&mut parent, j));
                    parent[ri] = rj;
                }
            }
        }
    }
    let mut acc: Vec<Option<Acc>> = vec![None; m];
    for (i, p) in pieces.iter().enumerate() {
        let r = find(&mut parent, i);
        acc[r].get_or_insert_with(Acc::new).add(p);
    }
    let mut out: Vec<Region> = acc.into_iter().flatten().filter_map(Acc::region).collect();
    out.sort_by(|x, y| y.area.total_cmp(&x.area));
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn poly(v: &[[f64; 3]]) -> Polygon {
        Polygon::new(v.to_vec())
    }

    #[test]
    fn two_separate_gaps_stay_separate() {
        // One field, the band 40 ≤ Q ≤ 60: the gaps are the apex triangle (Q > 60, area
        // 0.4² of the whole) and the base trapezoid (Q < 40, area 1 − 0.6²).
        let band = poly(&[
            [60.0, 40.0, 0.0],
            [40.0, 60.0, 0.0],
            [40.0, 0.0, 60.0],
            [60.0, 0.0, 40.0],
        ]);
        let o = Overlay::of(&[band]);
        let g = o.uncovered();
        assert_eq!(g.len(), 2, "{g:?}");
        assert!((g[0].percent_of_triangle() - 64.0).abs() < 1e-9);
        assert!((g[1].percent_of_triangle() - 16.0).abs() < 1e-9);
        assert!((g[1].range[0][0] - 60.0).abs() < 1e-9 && (g[1].range[0][1] - 100.0).abs() < 1e-9);
        assert_eq!(g[1].touches, [false, true, true]);
        // The apex triangle's centroid is its vertex mean: Q = (100 + 60 + 60)/3.
        assert!(
            (g[1].centroid[0] - 220.0 / 3.0).abs() < 1e-9,
            "{:?}",
            g[1].centroid
        );
    }

    #[test]
    fn a_tiling_leaves_nothing_and_overlaps_nothing() {
        // Three fields meeting at the centroid tile the triangle exactly.
        let m = [100.0 / 3.0; 3];
        let q = [100.0, 0.0, 0.0];
        let f = [0.0, 100.0, 0.0];
        let l = [0.0, 0.0, 100.0];
        let polys = [poly(&[q, f, m]), poly(&[f, l, m]), poly(&[l, q, m])];
        let o = Overlay::of(&polys);
        assert!(o.uncovered_area() < 1e-9, "{:?}", o.uncovered());
        for (i, j) in [(0, 1), (0, 2), (1, 2)] {
            assert!(o.overlap(i, j) < 1e-9);
        }
        for (i, p) in polys.iter().enumerate() {
            assert!((o.area(i) - TRIANGLE_AREA / 3.0).abs() < 1e-9);
            assert!((p.area() - TRIANGLE_AREA / 3.0).abs() < 1e-9);
        }
    }

    #[test]
    fn crossing_triangles_overlap_by_hand_value() {
        // Q ≥ 50 (apex quarter) and F ≥ 50 (F-corner quarter) share only the point
        // Q 50, F 50; Q ≥ 40 and F ≥ 40 overlap in the triangle Q ≥ 40, F ≥ 40, L ≥ 0, which
        // is similar to the whole with side 20: area 0.2² of the triangle.
        let qa = poly(&[[100.0, 0.0, 0.0], [40.0, 60.0, 0.0], [40.0, 0.0, 60.0]]);
        let fa = poly(&[[0.0, 100.0, 0.0], [0.0, 40.0, 60.0], [60.0, 40.0, 0.0]]);
        assert!((intersection_area(&qa, &fa) - 0.04 * TRIANGLE_AREA).abs() < 1e-9);
    }
}
