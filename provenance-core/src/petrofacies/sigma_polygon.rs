//! The traditional arithmetic mean ± 1σ polygon of a group, for comparison with older work.
//!
//! Older provenance studies summarised a suite by the arithmetic mean of each pole's percentage
//! and a band of one standard deviation about it; the three bands intersect in a hexagon
//! (common practice in the older literature, for example the mean ± σ fields of Ingersoll &
//! Suczek 1979, from memory). Raw percentages are not a sound space for compositions
//! (Aitchison 1986; Weltje 2002): the hexagon can reach past the edges of the triangle, where
//! no composition exists. sandprov therefore offers it only beside the log-ratio regions, and
//! **clips** it to the triangle, setting [`SigmaPolygon::spills_outside`] when clipping cut
//! something off. The unclipped hexagon is kept in [`SigmaPolygon::unclipped`].

use serde::Serialize;

/// Arithmetic mean ± 1σ of the three pole percentages and the polygon they bound.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::SigmaPolygon;
/// // Q 40/50/60, F 30/20/10, L 30/30/30: means 50, 20, 30; sd 10, 10, 0 (hand-computed).
/// let p = SigmaPolygon::of(&[[40.0, 30.0, 30.0], [50.0, 20.0, 30.0], [60.0, 10.0, 30.0]]).unwrap();
/// assert_eq!(p.mean, [50.0, 20.0, 30.0]);
/// assert_eq!(p.sd, [10.0, 10.0, 0.0]);
/// assert!(!p.spills_outside);
/// ```
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SigmaPolygon {
    /// Arithmetic mean of each pole's percentage.
    pub mean: [f64; 3],
    /// Sample standard deviation (divisor n − 1) of each pole's percentage.
    pub sd: [f64; 3],
    /// The polygon {x : |xᵢ − meanᵢ| ≤ sdᵢ for each pole}, clipped to the triangle; percent
    /// triples, closed (the first vertex repeated at the end).
    pub vertices: Vec<[f64; 3]>,
    /// The same polygon before clipping (vertices may have negative parts).
    pub unclipped: Vec<[f64; 3]>,
    /// True when the unclipped polygon reaches outside the triangle.
    pub spills_outside: bool,
}

/// Keep the part of a convex polygon where `f(x) ≥ 0` for the linear function
/// f(x) = s·(xᵢ − t) (Sutherland & Hodgman 1974, one clip edge).
fn clip(poly: &[[f64; 3]], i: usize, t: f64, s: f64) -> Vec<[f64; 3]> {
    let f = |x: &[f64; 3]| s * (x[i] - t);
    let mut out = Vec::with_capacity(poly.len() + 1);
    for k in 0..poly.len() {
        let (a, b) = (poly[k], poly[(k + 1) % poly.len()]);
        let (fa, fb) = (f(&a), f(&b));
        if fa >= 0.0 {
            out.push(a);
        }
        if (fa >= 0.0) != (fb >= 0.0) {
            let u = fa / (fa - fb);
            out.push([0, 1, 2].map(|j| a[j] + u * (b[j] - a[j])));
        }
    }
    out.dedup_by(|a, b| (0..3).all(|j| (a[j] - b[j]).abs() < 1e-9));
    if out.len() > 1 && (0..3).all(|j| (out[0][j] - out[out.len() - 1][j]).abs() < 1e-9) {
        out.pop();
    }
    out
}

fn closed(mut v: Vec<[f64; 3]>) -> Vec<[f64; 3]> {
    if let Some(first) = v.first().copied() {
        v.push(first);
    }
    v
}

impl SigmaPolygon {
    /// The polygon of percent triples (each summing to 100); `None` for fewer than 2.
    pub fn of(percent: &[[f64; 3]]) -> Option<SigmaPolygon> {
        if percent.len() < 2 {
            return None;
        }
        let n = percent.len() as f64;
        let mean = [0, 1, 2].map(|i| percent.iter().map(|p| p[i]).sum::<f64>() / n);
        let sd = [0, 1, 2].map(|i| {
            let ss: f64 = percent.iter().map(|p| (p[i] - mean[i]).powi(2)).sum();
            (ss / (n - 1.0)).sqrt()
        });
        // A triangle far larger than any band (every part ≥ −100), clipped by the six bands.
        let mut poly = vec![
            [300.0, -100.0, -100.0],
            [-100.0, 300.0, -100.0],
            [-100.0, -100.0, 300.0],
        ];
        for i in 0..3 {
            poly = clip(&poly, i, mean[i] - sd[i], 1.0);
            poly = clip(&poly, i, mean[i] + sd[i], -1.0);
        }
        let spills_outside = poly.iter().any(|v| v.iter().any(|x| *x < -1e-9));
        let mut inside = poly.clone();
        for i in 0..3 {
            inside = clip(&inside, i, 0.0, 1.0);
        }
        Some(SigmaPolygon {
            mean,
            sd,
            vertices: closed(inside),
            unclipped: closed(poly),
            spills_outside,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn has(v: &[[f64; 3]], p: [f64; 3]) -> bool {
        v.iter().any(|q| (0..3).all(|j| (q[j] - p[j]).abs() < 1e-9))
    }

    #[test]
    fn hexagon_vertices_are_hand_computed_band_corners() {
        // A symmetric set, so all three sd are equal (s = √80, hand-computed): the six corners
        // are the mean moved by +s on one pole and −s on another.
        let s: [[f64; 3]; 6] = [
            [60.0, 20.0, 20.0],
            [40.0, 40.0, 20.0],
            [50.0, 20.0, 30.0],
            [50.0, 40.0, 10.0],
            [60.0, 30.0, 10.0],
            [40.0, 30.0, 30.0],
        ];
        let p = SigmaPolygon::of(&s).unwrap();
        assert_eq!(p.mean, [50.0, 30.0, 20.0]);
        let sd = (400.0f64 / 5.0).sqrt(); // each pole deviates ±10 four times, 0 twice
        for v in p.sd {
            assert!((v - sd).abs() < 1e-12);
        }
        assert_eq!(p.vertices.len(), 7);
        for (a, b) in [(1.0, -1.0), (-1.0, 1.0)] {
            assert!(has(&p.vertices, [50.0 + a * sd, 30.0 + b * sd, 20.0]));
            assert!(has(&p.vertices, [50.0 + a * sd, 30.0, 20.0 + b * sd]));
            assert!(has(&p.vertices, [50.0, 30.0 + a * sd, 20.0 + b * sd]));
        }
        assert!(!p.spills_outside);
    }

    #[test]
    fn a_band_past_an_edge_is_clipped_and_flagged() {
        // L 0, 0, 12: mean 4, sd √48 ≈ 6.93 reaches L < 0.
        let p =
            SigmaPolygon::of(&[[50.0, 50.0, 0.0], [60.0, 40.0, 0.0], [44.0, 44.0, 12.0]]).unwrap();
        assert!(p.spills_outside);
        assert!(p.unclipped.iter().any(|v| v[2] < 0.0));
        assert!(p.vertices.iter().all(|v| v.iter().all(|x| *x >= -1e-9)));
    }
}
