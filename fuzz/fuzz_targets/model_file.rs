//! Classifier model loading on arbitrary bytes: never a panic, and whatever loads can be saved
//! and loaded again.
#![no_main]

use libfuzzer_sys::fuzz_target;
use provenance_core::classifier::Model;
use provenance_core::counts::{Framework, Sample};

fuzz_target!(|data: &[u8]| {
    let Ok(text) = std::str::from_utf8(data) else {
        return;
    };
    let Ok(model) = Model::from_json("fuzz.json", text) else {
        return;
    };
    let _ = model.summary();
    let sample = Sample::counted(
        "probe",
        Framework {
            qm: 180.0,
            qp: 12.0,
            p: 52.0,
            k: 30.0,
            lv: 40.0,
            ls: 8.0,
            lm: 12.0,
            ..Default::default()
        },
    );
    if let Ok(p) = model.probabilities(&sample) {
        assert_eq!(p.len(), model.classes.len(), "one probability per class");
    }
    let again = Model::from_json("again.json", &model.to_json());
    assert!(
        again.is_ok(),
        "a loaded model must save and load again: {again:?}"
    );
});
