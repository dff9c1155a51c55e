//! Membership checked against an independent calculation: for a field bounded by one line of
//! constant pole, the exact probability is a Beta tail, computed once with SciPy 1.17.1
//! (`scipy.stats.beta`, see tests/peers/scipy_beta_tail.py and its JSON). Counts are invented.

use provenance_core::geometry::Polygon;
use provenance_core::membership::{Estimator, MembershipOptions, Method, Posterior};

const SCIPY: &str = include_str!("../peers/scipy_beta_tail.json");

struct Case {
    field: Polygon,
    name: String,
    counts: [f64; 3],
    exact: f64,
}

fn field(name: &str) -> Polygon {
    let v = match name {
        // Q ≥ 60, L ≤ 5 and Q ≤ 2 in QFL, each bounded inside the triangle by one line.
        "Q >= 60" => vec![[100.0, 0.0, 0.0], [60.0, 40.0, 0.0], [60.0, 0.0, 40.0]],
        "L <= 5" => vec![
            [100.0, 0.0, 0.0],
            [0.0, 100.0, 0.0],
            [0.0, 95.0, 5.0],
            [95.0, 0.0, 5.0],
        ],
        "Q <= 2" => vec![
            [2.0, 98.0, 0.0],
            [0.0, 100.0, 0.0],
            [0.0, 0.0, 100.0],
            [2.0, 0.0, 98.0],
        ],
        other => panic!("unknown field {other}"),
    };
    Polygon::new(v)
}

fn cases() -> Vec<Case> {
    let v: serde_json::Value = serde_json::from_str(SCIPY).unwrap();
    assert_eq!(v["versions"]["scipy"], "1.17.1");
    let mut out = Vec::new();
    for f in v["fields"].as_array().unwrap() {
        let name = f["name"].as_str().unwrap();
        for c in f["cases"].as_array().unwrap() {
            let k: Vec<f64> = c["counts"]
                .as_array()
                .unwrap()
                .iter()
                .map(|x| x.as_f64().unwrap())
                .collect();
            out.push(Case {
                field: field(name),
                name: name.into(),
                counts: [k[0], k[1], k[2]],
                exact: c["p_inside"].as_f64().unwrap(),
            });
        }
    }
    assert_eq!(out.len(), 19);
    out
}

#[test]
fn plain_sampling_matches_the_scipy_beta_tails() {
    let draws = 100_000;
    for (i, c) in cases().into_iter().enumerate() {
        let set: [(&str, &Polygon); 1] = [(&c.name, &c.field)];
        let opts = MembershipOptions {
            draws,
            shortcut: false,
            integrate: false,
            ..Default::default()
        };
        let est = Estimator::new(&set[..], opts).unwrap();
        let m = est.estimate(&Posterior::jeffreys(c.counts).unwrap(), i as u64, 0);
        let se = (c.exact * (1.0 - c.exact) / draws as f64)
            .sqrt()
            .max(1.0 / draws as f64);
        let got = m.probability(0);
        assert!(
            (got - c.exact).abs() <= 4.0 * se,
            "{} {:?}: sampled {got}, SciPy {}",
            c.name,
            c.counts,
            c.exact
        );
        assert!((got + m.outside() - 1.0).abs() < 1e-12);
    }
}

#[test]
fn integration_matches_the_scipy_beta_tails_within_1e_8() {
    for c in cases() {
        let set: [(&str, &Polygon); 1] = [(&c.name, &c.field)];
        let opts = MembershipOptions {
            shortcut: false,
            ..Default::default()
        };
        let est = Estimator::new(&set[..], opts).unwrap();
        let m = est
            .integrate(&Posterior::jeffreys(c.counts).unwrap())
            .expect("whole counts integrate");
        let got = m.probability(0);
        assert!(
            (got - c.exact).abs() < 1e-8,
            "{} {:?}: integrated {got}, SciPy {}",
            c.name,
            c.counts,
            c.exact
        );
    }
}

#[test]
fn the_default_method_matches_the_scipy_beta_tails() {
    let mut bounded = 0;
    for (i, c) in cases().into_iter().enumerate() {
        let set: [(&str, &Polygon); 1] = [(&c.name, &c.field)];
        let est = Estimator::new(&set[..], MembershipOptions::default()).unwrap();
        let m = est.estimate(&Posterior::jeffreys(c.counts).unwrap(), i as u64, 0);
        match m.method() {
            Method::Bound { max_error } => {
                bounded += 1;
                // The proven error bound covers the exact mass on the other side.
                let other = if m.probability(0) == 1.0 {
                    1.0 - c.exact
                } else {
                    c.exact
                };
                assert!(
                    other <= max_error,
                    "{:?}: exact {other} above bound {max_error}",
                    c.counts
                );
            }
            Method::Integrated => {
                assert!((m.probability(0) - c.exact).abs() < 1e-8, "{:?}", c.counts)
            }
            Method::Sampled { .. } => {
                panic!("whole counts are never sampled by default: {:?}", c.counts)
            }
        }
    }
    // Samples far from their line take the shortcut.
    assert!(bounded >= 2, "{bounded}");
}

#[test]
fn probabilities_sharpen_as_counts_grow_for_the_same_proportions() {
    let f = field("Q >= 60");
    let set: [(&str, &Polygon); 1] = [("Q at least 60", &f)];
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
