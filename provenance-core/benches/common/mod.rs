//! Deterministic invented benchmark data, generated identically by benches/peers/bench_data.py:
//! SplitMix64 uniforms and only +, *, / and floor, so both produce the same numbers bit for bit.

#![allow(dead_code)]

use provenance_core::counts::Framework;

pub fn splitmix(mut z: u64) -> u64 {
    z = z.wrapping_add(0x9e37_79b9_7f4a_7c15);
    z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
    z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
    z ^ (z >> 31)
}

pub fn uniform(i: u64, j: u64) -> f64 {
    (splitmix(i.wrapping_mul(16).wrapping_add(j)) >> 11) as f64 * (1.0 / 9_007_199_254_740_992.0)
}

fn framework(c: [f64; 8]) -> Framework {
    Framework {
        qm: c[0],
        qp: c[1],
        c: c[2],
        p: c[3],
        k: c[4],
        lv: c[5],
        ls: c[6],
        lm: c[7],
    }
}

/// Counts of membership benchmark sample `i` (300 to 600 points).
pub fn membership_framework(i: u64) -> Framework {
    let n = 300.0 + (uniform(i, 0) * 301.0).floor();
    let mut w = [0.0; 8];
    for (j, v) in w.iter_mut().enumerate() {
        let u = uniform(i, 1 + j as u64);
        let u2 = u * u;
        *v = u2 * u2;
    }
    let mut s = 0.0;
    for v in w {
        s += v;
    }
    framework(w.map(|v| (n * v / s).floor()))
}

const CENTRES: [[f64; 8]; 4] = [
    [60.0, 4.0, 2.0, 8.0, 12.0, 3.0, 6.0, 5.0],
    [30.0, 3.0, 1.0, 25.0, 8.0, 22.0, 6.0, 5.0],
    [40.0, 10.0, 8.0, 8.0, 5.0, 6.0, 15.0, 8.0],
    [45.0, 5.0, 2.0, 15.0, 15.0, 8.0, 6.0, 4.0],
];

/// Label and counts of classifier benchmark sample `i`.
pub fn classifier_sample(i: u64) -> (String, Framework) {
    let k = (i % 4) as usize;
    let mut w = [0.0; 8];
    for (j, v) in w.iter_mut().enumerate() {
        *v = CENTRES[k][j] * (0.25 + 1.5 * uniform(i + 1_000_000, j as u64));
    }
    let mut s = 0.0;
    for v in w {
        s += v;
    }
    (
        format!("class-{k}"),
        framework(w.map(|v| (400.0 * v / s).floor() + 1.0)),
    )
}
