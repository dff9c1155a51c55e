//! Reading plus recalculation plus CSV writing of a synthetic table (fixed seed).
//!
//! `cargo bench -p provenance-core --bench modes` reports samples per second.

use criterion::{criterion_group, criterion_main, Criterion, Throughput};
use provenance_core::batch::{write_modes, ModesOptions};
use provenance_core::input::{CountReader, ReadOptions};
use provenance_core::output::Format;
use std::hint::black_box;

fn bench_modes(c: &mut Criterion) {
    let rows = 100_000;
    let mut table = Vec::new();
    provenance_core::synthetic::write_table(&mut table, rows, 42).expect("in-memory write");
    let mut g = c.benchmark_group("modes");
    g.throughput(Throughput::Elements(rows as u64));
    g.sample_size(10);
    for (name, format) in [("csv", Format::Csv), ("json", Format::Json)] {
        g.bench_function(format!("parse+modes+{name}/100k"), |b| {
            b.iter(|| {
                let reader = CountReader::from_reader(
                    "bench.csv",
                    std::io::Cursor::new(table.clone()),
                    ReadOptions::default(),
                )
                .expect("valid table");
                let mut out = Vec::with_capacity(64 << 20);
                let options = ModesOptions {
                    format,
                    intervals: false,
                };
                let n = write_modes(reader, &mut out, "bench", options).expect("valid rows");
                black_box((n, out.len()))
            })
        });
    }
    g.finish();
}

criterion_group!(benches, bench_modes);
criterion_main!(benches);
