//! Write a synthetic count table for benchmarks: `cargo run --release -p provenance-core
//! --example synthetic_counts -- ROWS [SEED] > big.csv`.

fn main() {
    let mut args = std::env::args().skip(1);
    let rows = args.next().and_then(|a| a.parse().ok()).unwrap_or(300_000);
    let seed = args.next().and_then(|a| a.parse().ok()).unwrap_or(1);
    let stdout = std::io::stdout();
    if let Err(e) = provenance_core::synthetic::write_table(&mut stdout.lock(), rows, seed) {
        eprintln!("synthetic_counts: {e}");
        std::process::exit(4);
    }
}
