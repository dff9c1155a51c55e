//! Property tests of the ternary geometry against independent reference calculations.

use proptest::prelude::*;
use provenance_core::composition::Composition3;
use provenance_core::geometry::overlay::{Overlay, TRIANGLE_AREA};
use provenance_core::geometry::{Cartesian, Polygon};
use std::f64::consts::PI;

/// Winding number of the polygon around `p`, by summing the signed angles its edges subtend
/// (the textbook definition; independent of the crossing-number test under check).
fn winding_number(poly: &Polygon, p: [f64; 3]) -> i64 {
    let q = Cartesian::from_parts(p);
    let pts = poly.plane();
    let n = pts.len();
    let mut total = 0.0;
    for i in 0..n {
        let (a, b) = (pts[i], pts[(i + 1) % n]);
        let (ax, ay, bx, by) = (a.x - q.x, a.y - q.y, b.x - q.x, b.y - q.y);
        total += (ax * by - ay * bx).atan2(ax * bx + ay * by);
    }
    (total / (2.0 * PI)).round() as i64
}

/// A star-shaped (hence simple) polygon around `centre` (percent), vertices at sorted angles.
fn star(centre: [f64; 3], spokes: &[(f64, f64)]) -> Polygon {
    let c = Cartesian::from_parts(centre);
    let mut s = spokes.to_vec();
    s.sort_by(|x, y| x.0.total_cmp(&y.0));
    Polygon::new(
        s.iter()
            .map(|(ang, r)| {
                Cartesian {
                    x: c.x + r * ang.cos(),
                    y: c.y + r * ang.sin(),
                }
                .to_parts()
            })
            .collect(),
    )
}

fn centre() -> impl Strategy<Value = [f64; 3]> {
    // Every part at least 20%: the centre is at least 17.3 points from every side.
    (0.0..40.0f64, 0.0..1.0f64).prop_map(|(x, t)| {
        let a = 20.0 + x;
        let b = 20.0 + t * (40.0 - x);
        [a, b, 100.0 - a - b]
    })
}

/// Four to eleven spokes, spoke i at angle 2π(i + u)/k with u < 0.8: no gap between
/// neighbouring spokes reaches π, so the centre sees every edge and the polygon is simple.
fn spokes() -> impl Strategy<Value = Vec<(f64, f64)>> {
    prop::collection::vec((0.0..0.8f64, 1.0..15.0f64), 4..12).prop_map(|v| {
        let k = v.len() as f64;
        v.iter()
            .enumerate()
            .map(|(i, (u, r))| (2.0 * PI * (i as f64 + u) / k, *r))
            .collect()
    })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(400))]

    #[test]
    fn point_in_polygon_agrees_with_winding_number(
        c in centre(), s in spokes(), a in 0.0..100.0f64, t in 0.0..1.0f64,
    ) {
        let poly = star(c, &s);
        prop_assert!(poly.is_simple());
        let p = [a, t * (100.0 - a), (1.0 - t) * (100.0 - a)];
        prop_assume!(poly.boundary_distance(p) > 1e-7);
        let w = winding_number(&poly, p);
        prop_assert_eq!(poly.contains(p), w != 0, "winding number {}", w);
    }

    #[test]
    fn barycentric_to_cartesian_round_trips(a in 0.0..1e3f64, b in 0.0..1e3f64, c in 0.0..1e3f64) {
        prop_assume!(a + b + c > 1e-6);
        let comp = Composition3::close([a, b, c]).unwrap();
        let back = Cartesian::from_composition(&comp).to_parts();
        for (x, y) in comp.parts().iter().zip(back) {
            prop_assert!((x - y).abs() < 1e-9, "{:?} vs {:?}", comp.parts(), back);
        }
    }

    #[test]
    fn cartesian_to_barycentric_round_trips(x in 0.0..100.0f64, h in 0.0..1.0f64) {
        // A point inside the triangle: at height y the width runs from y/√3 to 100 − y/√3.
        let y = h * 86.602_540_378_443_86;
        let span = 100.0 - 2.0 * y / 3f64.sqrt();
        let p = Cartesian { x: y / 3f64.sqrt() + x / 100.0 * span, y };
        let q = Cartesian::from_composition(&p.to_composition().unwrap());
        prop_assert!(p.distance(&q) < 1e-9, "{:?} vs {:?}", p, q);
    }

    #[test]
    fn slab_areas_agree_with_the_shoelace_and_inclusion_exclusion(
        c1 in centre(), s1 in spokes(), c2 in centre(), s2 in spokes(),
    ) {
        let (p, q) = (star(c1, &s1), star(c2, &s2));
        prop_assert!(p.is_simple() && q.is_simple());
        let o = Overlay::of(&[p.clone(), q.clone()]);
        prop_assert!((o.area(0) - p.area()).abs() < 1e-7 * (1.0 + p.area()));
        prop_assert!((o.area(1) - q.area()).abs() < 1e-7 * (1.0 + q.area()));
        let both = o.overlap(0, 1);
        prop_assert!(both >= 0.0 && both <= p.area().min(q.area()) + 1e-7);
        // Union from the uncovered sweep equals |P| + |Q| − |P ∩ Q| from the pairwise sweep.
        let union = TRIANGLE_AREA - o.uncovered_area();
        prop_assert!((union - (p.area() + q.area() - both)).abs() < 1e-6, "{} vs {}", union, p.area() + q.area() - both);
        // Symmetric.
        let r = Overlay::of(&[q, p]);
        prop_assert!((r.overlap(0, 1) - both).abs() < 1e-7);
    }
}

/// Intersection area against a count of lattice points (an estimate independent of the slab
/// method): two overlapping hexagon-like stars, grid step 0.1 point in (L, Q).
#[test]
fn intersection_area_agrees_with_a_lattice_count() {
    let p = star(
        [40.0, 30.0, 30.0],
        &[
            (0.1, 14.0),
            (1.2, 9.0),
            (2.3, 13.0),
            (3.5, 8.0),
            (4.4, 12.0),
            (5.6, 10.0),
        ],
    );
    let q = star(
        [33.0, 37.0, 30.0],
        &[
            (0.4, 12.0),
            (1.9, 14.0),
            (3.0, 9.0),
            (4.0, 13.0),
            (5.2, 11.0),
        ],
    );
    let exact = Overlay::of(&[p.clone(), q.clone()]).overlap(0, 1);
    let step = 0.1;
    let mut count = 0u64;
    let n = (100.0 / step) as usize;
    for i in 0..n {
        for j in 0..n {
            let (c, a) = ((i as f64 + 0.5) * step, (j as f64 + 0.5) * step);
            let pt = [a, 100.0 - a - c, c];
            if pt[1] >= 0.0 && p.contains(pt) && q.contains(pt) {
                count += 1;
            }
        }
    }
    let estimate = count as f64 * step * step * 0.866_025_403_784_438_6;
    assert!(exact > 50.0, "the shapes should overlap, got {exact}");
    assert!(
        (estimate - exact).abs() < 0.01 * exact,
        "lattice {estimate} vs slab {exact}"
    );
}
