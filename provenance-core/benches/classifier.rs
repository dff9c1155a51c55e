//! Classifier benchmark: fitting 10,000 invented labelled samples (four classes, seven-part
//! framework, six ilr features, L2 penalty 1), the work of benches/peers/classifier_sklearn.py.
//!
//! `cargo bench -p provenance-core --bench classifier` prints the time per fit; the fit's mean
//! penalised log-loss is printed once so it can be compared with scikit-learn's.

mod common;

use criterion::{criterion_group, criterion_main, Criterion};
use provenance_core::classifier::{fit, FeatureSpace, FitOptions, TrainingSet};
use provenance_core::counts::Counting;
use std::time::Duration;

const SAMPLES: u64 = 10_000;

fn bench(c: &mut Criterion) {
    let space = FeatureSpace::Framework;
    let mut set = TrainingSet::new(space);
    for i in 0..SAMPLES {
        let (label, f) = common::classifier_sample(i);
        set.push_amounts(&label, &space.amounts(&f), Counting::Counted)
            .expect("benchmark samples have grains");
    }
    let opts = FitOptions::default();
    let once = fit(&set, &opts).expect("the benchmark fit converges");
    eprintln!(
        "classifier fit: mean penalised log-loss {:.10}, training log-loss {:.10}, largest gradient {:.2e}, Newton steps {}",
        once.convergence.objective,
        once.convergence.training_log_loss,
        once.convergence.gradient_max,
        once.convergence.newton_steps
    );
    let mut g = c.benchmark_group("classifier");
    g.sample_size(10).measurement_time(Duration::from_secs(10));
    g.bench_function("fit 10000 samples framework l2=1", |b| {
        b.iter(|| fit(&set, &opts).expect("converges").convergence.objective)
    });
    let loose = FitOptions {
        tolerance: 1e-4,
        ..opts
    };
    let l = fit(&set, &loose).expect("converges");
    eprintln!(
        "classifier fit at tolerance 1e-4: mean penalised log-loss {:.10}",
        l.convergence.objective
    );
    g.bench_function("fit 10000 samples framework l2=1 tol 1e-4", |b| {
        b.iter(|| fit(&set, &loose).expect("converges").convergence.objective)
    });
    g.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
