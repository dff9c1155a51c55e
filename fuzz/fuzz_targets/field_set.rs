//! Field-set parsing on arbitrary bytes, then the check and look-ups on what parses: never a
//! panic.
#![no_main]

use libfuzzer_sys::fuzz_target;
use provenance_core::fields::{check, format};

/// Points on the corners, sides, centre and inside of the triangle (percent of the poles).
const PROBES: [[f64; 3]; 7] = [
    [100.0, 0.0, 0.0],
    [0.0, 100.0, 0.0],
    [0.0, 0.0, 100.0],
    [50.0, 50.0, 0.0],
    [100.0 / 3.0, 100.0 / 3.0, 100.0 / 3.0],
    [80.0, 15.0, 5.0],
    [10.0, 30.0, 60.0],
];

fuzz_target!(|data: &[u8]| {
    let Ok(text) = std::str::from_utf8(data) else {
        return;
    };
    let Ok(set) = format::parse("fuzz.toml", text) else {
        return;
    };
    let report = check::check(&set);
    let _ = report.problem_lines();
    let _ = report.render(&set);
    let json = set.to_json();
    assert!(
        serde_json_check::from_str::<serde_json_check::Value>(&json).is_ok(),
        "the field-set JSON must always parse"
    );
    if report.is_valid() {
        for p in PROBES {
            if let Some(i) = set.field_index(p) {
                assert!(i < set.fields.len());
            }
            let _ = set.locate(p);
        }
    }
});
