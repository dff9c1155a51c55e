//! Membership benchmark: 5,000 invented samples × 4,000 posterior draws × 2 region sets, the
//! work of benches/peers/membership_numpy.py.
//!
//! `cargo bench -p provenance-core --bench membership` prints the time per batch of all
//! 10,000 sample-diagram memberships: plain sampling (the peer's algorithm), the exact
//! shortcut then sampling, and the default (shortcut, then integration, then sampling).

mod common;

use criterion::{criterion_group, criterion_main, Criterion, Throughput};
use provenance_core::diagram::Diagram;
use provenance_core::geometry::Polygon;
use provenance_core::membership::{Estimator, MembershipOptions, Method, Posterior};
use std::time::Duration;

/// A geometric tiling (not provenance fields), and the shipped QFL and QmFLt sets.
const REGION_FILES: [(&str, &str); 2] = [
    (
        "tiling",
        include_str!("../../benches/peers/membership_regions.json"),
    ),
    (
        "shipped",
        include_str!("../../benches/peers/membership_regions_shipped.json"),
    ),
];
const SAMPLES: u64 = 5_000;
const DRAWS: u32 = 4_000;

fn region_sets(text: &str) -> Vec<Vec<(String, Polygon)>> {
    let v: serde_json::Value = serde_json::from_str(text).expect("bench regions parse");
    v["diagrams"]
        .as_array()
        .expect("diagrams")
        .iter()
        .map(|d| {
            d["regions"]
                .as_array()
                .expect("regions")
                .iter()
                .map(|r| {
                    let vs = r["vertices"]
                        .as_array()
                        .expect("vertices")
                        .iter()
                        .map(|p| {
                            let p: Vec<f64> = p
                                .as_array()
                                .expect("vertex")
                                .iter()
                                .map(|x| x.as_f64().expect("number"))
                                .collect();
                            [p[0], p[1], p[2]]
                        })
                        .collect();
                    (
                        r["name"].as_str().expect("name").to_string(),
                        Polygon::new(vs),
                    )
                })
                .collect()
        })
        .collect()
}

fn bench(c: &mut Criterion) {
    let diagrams = [Diagram::Qfl, Diagram::Qmflt];
    let posteriors: Vec<Vec<Posterior>> = diagrams
        .iter()
        .map(|d| {
            (0..SAMPLES)
                .map(|i| {
                    let f = common::membership_framework(i);
                    Posterior::jeffreys(d.pole_amounts(&f)).expect("counts are valid")
                })
                .collect()
        })
        .collect();
    let points: f64 = (0..SAMPLES)
        .map(|i| common::membership_framework(i).total())
        .sum();
    eprintln!("bench data: {SAMPLES} samples, {points} points in all");
    for (label, text) in REGION_FILES {
        bench_regions(c, label, &region_sets(text), &posteriors);
    }
}

fn bench_regions(
    c: &mut Criterion,
    label: &str,
    sets: &[Vec<(String, Polygon)>],
    posteriors: &[Vec<Posterior>],
) {
    let diagrams = [Diagram::Qfl, Diagram::Qmflt];
    let mut g = c.benchmark_group(format!("membership {label}"));
    g.sample_size(10)
        .measurement_time(Duration::from_secs(15))
        .throughput(Throughput::Elements(SAMPLES * u64::from(DRAWS) * 2));
    for (name, shortcut, integrate) in [
        ("5000x4000x2 plain sampling", false, false),
        ("5000x4000x2 shortcut then sampling", true, false),
        (
            "5000x4000x2 default: shortcut, integration, sampling",
            true,
            true,
        ),
    ] {
        let opts = MembershipOptions {
            draws: DRAWS,
            shortcut,
            integrate,
            ..Default::default()
        };
        let est0 = Estimator::new(&sets[0][..], opts).expect("options are valid");
        let methods = est0.estimate_many(&posteriors[0], 0, 0);
        let count = |f: fn(&Method) -> bool| methods.iter().filter(|m| f(&m.method())).count();
        let k = sets[0].len() + 1;
        let mean: Vec<String> = (0..k)
            .map(|j| {
                let s: f64 = methods
                    .iter()
                    .map(|m| {
                        if j + 1 < k {
                            m.probability(j)
                        } else {
                            m.outside()
                        }
                    })
                    .sum();
                format!("{:.4}", s / methods.len() as f64)
            })
            .collect();
        eprintln!(
            "{label} {name}: mean membership, first set: {}",
            mean.join(" ")
        );
        eprintln!(
            "{label} {name}: first set, {} bounded, {} integrated, {} sampled",
            count(|m| matches!(m, Method::Bound { .. })),
            count(|m| matches!(m, Method::Integrated)),
            count(|m| matches!(m, Method::Sampled { .. }))
        );
        let estimators: Vec<Estimator> = sets
            .iter()
            .map(|s| Estimator::new(&s[..], opts).expect("options are valid"))
            .collect();
        g.bench_function(name, |b| {
            b.iter(|| {
                estimators
                    .iter()
                    .zip(posteriors)
                    .zip(diagrams)
                    .map(|((e, p), d)| e.estimate_many(p, 0, d.index() as u64).len())
                    .sum::<usize>()
            })
        });
    }
    g.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
