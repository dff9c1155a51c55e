//! SVG rendering speed: 10,000 samples in one QFL diagram (target: under 0.5 s), both with the
//! default density shading and with markers forced. Samples come from a fixed deterministic
//! generator.
//!
//! Run: `cargo bench -p provenance-core --bench plot`

use criterion::{criterion_group, criterion_main, Criterion};
use provenance_core::counts::{Framework, Sample};
use provenance_core::diagram::Diagram;
use provenance_core::plot::{DensityMode, Figure, FigureOptions, GroupBy};
use std::hint::black_box;

fn samples(n: usize) -> Vec<Sample> {
    let mut state: u64 = 0x9e37_79b9_7f4a_7c15;
    let mut next = move || {
        state ^= state << 13;
        state ^= state >> 7;
        state ^= state << 17;
        (state >> 11) as f64 / (1u64 << 53) as f64
    };
    (0..n)
        .map(|i| {
            let mut v = [0.0; 8];
            for x in v.iter_mut() {
                *x = (next() * 120.0).round();
            }
            let mut s = Sample::counted(
                format!("B-{i:05}"),
                Framework {
                    qm: v[0] + 20.0,
                    qp: v[1] * 0.2,
                    c: v[2] * 0.1,
                    p: v[3],
                    k: v[4] * 0.5,
                    lv: v[5],
                    ls: v[6] * 0.4,
                    lm: v[7] * 0.3,
                },
            );
            s.metadata = vec![format!("unit {}", i % 6)];
            s
        })
        .collect()
}

fn figure(samples: &[Sample], density: DensityMode) -> Figure {
    let by = GroupBy {
        file: "bench.csv".into(),
        column: "unit".into(),
        index: 0,
        file_column: 10,
    };
    let mut b = Figure::builder(&[Diagram::Qfl], Some(by));
    for s in samples {
        b.push(s).expect("valid");
    }
    b.finish(FigureOptions {
        density,
        ..FigureOptions::default()
    })
}

fn bench(c: &mut Criterion) {
    let data = samples(10_000);
    let shaded = figure(&data, DensityMode::Auto);
    let markers = figure(&data, DensityMode::Never);
    let mut g = c.benchmark_group("plot_svg_10k");
    g.sample_size(20);
    g.bench_function("density (default)", |b| {
        b.iter(|| black_box(shaded.to_svg().expect("renders")))
    });
    g.bench_function("markers", |b| {
        b.iter(|| black_box(markers.to_svg().expect("renders")))
    });
    g.bench_function("collect + markers", |b| {
        b.iter(|| black_box(figure(&data, DensityMode::Never).to_svg().expect("renders")))
    });
    g.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
