//! Counting-error check values from outside the project.

use provenance_core::stats::special::beta_inc;
use provenance_core::stats::{clopper_pearson, points_needed, sd_percent, wilson, Z95};

const SCIPY: &str = include_str!("../../tests/reference/counting_intervals.csv");

/// Rows of the SciPy 1.17.1 reference file (tests/peers/counting_intervals.py), by section.
fn section(header: &str) -> Vec<Vec<f64>> {
    let mut rows = Vec::new();
    let mut on = false;
    for line in SCIPY.lines() {
        if line.starts_with('#') {
            continue;
        }
        if line.chars().next().is_some_and(|c| c.is_alphabetic()) {
            on = line == header;
            continue;
        }
        if on {
            rows.push(line.split(',').map(|v| v.parse().unwrap()).collect());
        }
    }
    rows
}

#[test]
fn van_der_plas_tobi_chart_300_points_at_50_percent() {
    // Van der Plas & Tobi (1965, Am. J. Sci. 263:87-90) chart: n = 300, p = 50% gives 2σ ≈ 5.8%
    // (read from the chart; from memory, high confidence). Exact: 2·√(50·50/300) = 5.7735.
    let two_sigma = 2.0 * sd_percent(50.0, 300.0);
    assert!((two_sigma - 5.8).abs() < 0.05, "{two_sigma}");
    assert!((two_sigma - 5.773_502_69).abs() < 1e-6);
}

#[test]
fn van_der_plas_tobi_points_needed_hand_worked() {
    // n = 4p(100 − p)/E² (Van der Plas & Tobi 1965), worked by hand:
    // p = 50, E = 5 → 4·2500/25 = 400; p = 20, E = 4 → 4·1600/16 = 400; p = 5, E = 2 → 475;
    // p = 30, E = 3 → 4·2100/9 = 933.3 → 934.
    assert_eq!(points_needed(50.0, 5.0), Some(400));
    assert_eq!(points_needed(20.0, 4.0), Some(400));
    assert_eq!(points_needed(5.0, 2.0), Some(475));
    assert_eq!(points_needed(30.0, 3.0), Some(934));
    assert_eq!(points_needed(0.0, 3.0), Some(0));
    assert_eq!(points_needed(30.0, 0.0), None);
    assert_eq!(points_needed(130.0, 2.0), None);
}

#[test]
fn sd_hand_worked() {
    // 252 of 412 points: p = 61.165%, σ = √(61.165·38.835/412) = 2.4011 (hand-worked).
    let p = 100.0 * 252.0 / 412.0;
    assert!((sd_percent(p, 412.0) - 2.4011).abs() < 1e-4);
    // Scaling: four times the points halves σ.
    assert!((sd_percent(p, 1648.0) - sd_percent(p, 412.0) / 2.0).abs() < 1e-12);
}

#[test]
fn wilson_and_clopper_pearson_match_scipy() {
    let rows = section("k,n,wilson_lo,wilson_hi,cp_lo,cp_hi");
    assert_eq!(rows.len(), 13);
    for r in rows {
        let (k, n) = (r[0], r[1]);
        let w = wilson(k, n, Z95);
        let c = clopper_pearson(k, n, 0.05);
        for (ours, scipy) in [
            (w.lower, r[2]),
            (w.upper, r[3]),
            (c.lower, r[4]),
            (c.upper, r[5]),
        ] {
            assert!(
                (ours - 100.0 * scipy).abs() < 1e-7,
                "k={k} n={n}: ours {ours} vs SciPy {}",
                100.0 * scipy
            );
        }
    }
}

#[test]
fn incomplete_beta_matches_scipy() {
    for r in section("a,b,x,value") {
        let ours = beta_inc(r[0], r[1], r[2]);
        assert!((ours - r[3]).abs() < 1e-12, "{r:?}: {ours}");
    }
}
