//! Membership checked against an independent calculation: for a field bounded by one line of
//! constant Q, the exact probability is a Beta tail, computed once with SciPy 1.17.1
//! (`scipy.stats.beta.sf`, see tests/peers/scipy_beta_tail.py and its JSON).

use provenance_core::geometry::Polygon;
use provenance_core::membership::{Estimator, MembershipOptions, Method, Posterior};

const SCIPY: &str = include_str!("../peers/scipy_beta_tail.json");

fn q_field() -> Polygon {
    // Q ≥ 60% in QFL: bounded inside the triangle by the single line Q = 60.
    Polygon::new(vec![
        [100.0, 0.0, 0.0],
        [60.0, 40.0, 0.0],
        [60.0, 0.0, 40.0],
    ])
}

fn cases() -> Vec<([f64; 3], f64)> {
    let v: serde_json::Value = serde_json::from_str(SCIPY).unwrap();
    assert_eq!(v["versions"]["scipy"], "1.17.1");
    v["cases"]
        .as_array()
        .unwrap()
        .iter()
        .map(|c| {
            let k: Vec<f64> = c["counts"]
                .as_array()
                .unwrap()
                .iter()
                .map(|x| x.as_f64().unwrap())
                .collect();
            ([k[0], k[1], k[2]], c["p_inside"].as_f64().unwrap())
        })
        .collect()
}

#[test]
fn sampled_membership_matches_the_scipy_beta_tail() {
    let field = q_field();
    let set: [(&str, &Polygon); 1] = [("Q at least 60", &field)];
    let draws = 100_000;
    let est = Estimator::new(
        &set[..],
        MembershipOptions {
            draws,
            shortcut: false,
            ..Default::default()
        },
    )
    .unwrap();
    for (i, (counts, exact)) in cases().into_iter().enumerate() {
        let m = est.estimate(&Posterior::jeffreys(counts).unwrap(), i as u64, 0);
        let se = (exact * (1.0 - exact) / draws as f64)
            .sqrt()
            .max(1.0 / draws as f64);
        let got = m.probability(0);
        assert!(
            (got - exact).abs() <= 4.0 * se,
            "{counts:?}: sampled {got}, SciPy {exact}"
        );
        assert!((got + m.outside() - 1.0).abs() < 1e-12);
    }
}

#[test]
fn default_membership_with_its_exact_methods_matches_the_scipy_beta_tail() {
    let field = q_field();
    let set: [(&str, &Polygon); 1] = [("Q at least 60", &field)];
    let est = Estimator::new(&set[..], MembershipOptions::default()).unwrap();
    let (mut bounded, mut integrated) = (0, 0);
    for (i, (counts, exact)) in cases().into_iter().enumerate() {
        let m = est.estimate(&Posterior::jeffreys(counts).unwrap(), i as u64, 0);
        match m.method() {
            Method::Bound { max_error } => {
                bounded += 1;
                // The proven error bound covers the exact mass on the other side.
                let other = if m.probability(0) == 1.0 {
                    1.0 - exact
                } else {
                    exact
                };
                assert!(
                    other <= max_error,
                    "{counts:?}: exact {other} above bound {max_error}"
                );
            }
            Method::Integrated => {
                integrated += 1;
                let got = m.probability(0);
                assert!(
                    (got - exact).abs() < 1e-8,
                    "{counts:?}: integrated {got}, SciPy {exact}"
                );
            }
            Method::Sampled { draws } => {
                let se = (exact * (1.0 - exact) / draws as f64)
                    .sqrt()
                    .max(1.0 / draws as f64);
                assert!((m.probability(0) - exact).abs() <= 4.0 * se, "{counts:?}");
                assert!(m.standard_error() <= 0.005);
            }
        }
    }
    // (0, 200, 100) and (285, 10, 5) are far from the line and take the shortcut; (30, 10, 0)
    // has a zero pole and is sampled; the other five are integrated.
    assert_eq!((bounded, integrated), (2, 5));
}

#[test]
fn probabilities_sharpen_as_counts_grow_for_the_same_proportions() {
    let field = q_field();
    let set: [(&str, &Polygon); 1] = [("Q at least 60", &field)];
    let est = Estimator::new(&set[..], MembershipOptions::default()).unwrap();
    for (q, towards) in [(0.63, 1.0f64), (0.57, 0.0)] {
        let mut last: Option<(f64, f64)> = None;
        for n in [100.0, 400.0, 1600.0, 6400.0] {
            let counts = [q * n, 0.6 * (1.0 - q) * n, 0.4 * (1.0 - q) * n];
            let m = est.estimate(&Posterior::jeffreys(counts).unwrap(), n as u64, 0);
            let p = m.probability(0);
            let top = m.top().probability;
            if let Some((lp, ltop)) = last {
                assert!(
                    (p - towards).abs() < (lp - towards).abs(),
                    "Q {q}, n {n}: {p} vs {lp}"
                );
                assert!(top > ltop, "top probability sharpens: {top} vs {ltop}");
            }
            last = Some((p, top));
        }
        let (p, _) = last.unwrap();
        assert!((p - towards).abs() < 0.01, "Q {q} at 6400 points: {p}");
    }
}
