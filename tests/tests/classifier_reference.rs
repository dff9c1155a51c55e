//! Classifier probabilities checked against scikit-learn 1.9.1 `LogisticRegression`
//! (solver lbfgs, multinomial; numpy 2.4.6, scipy 1.17.1), computed once by
//! tests/peers/sklearn_logistic.py on the invented table tests/peers/classifier_reference.csv.

use provenance_core::classifier::{fit, FeatureSpace, FitOptions, Model, TrainingSet};
use provenance_core::input::{CountReader, ReadOptions};
use sandprov_tests::{assert_no_file, run};
use std::path::PathBuf;

const SKLEARN: &str = include_str!("../peers/sklearn_logistic.json");

fn data_path() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("peers/classifier_reference.csv")
}

fn reference() -> serde_json::Value {
    let v: serde_json::Value = serde_json::from_str(SKLEARN).unwrap();
    assert_eq!(v["versions"]["scikit-learn"], "1.9.1");
    v
}

fn probabilities(case: &serde_json::Value) -> Vec<Vec<f64>> {
    case["probabilities"]
        .as_array()
        .unwrap()
        .iter()
        .map(|r| {
            r.as_array()
                .unwrap()
                .iter()
                .map(|x| x.as_f64().unwrap())
                .collect()
        })
        .collect()
}

#[test]
fn probabilities_equal_scikit_learn_within_1e_4() {
    for case in reference()["cases"].as_array().unwrap() {
        let space: FeatureSpace = case["composition"].as_str().unwrap().parse().unwrap();
        let reader = CountReader::from_path(&data_path(), ReadOptions::default()).unwrap();
        let set = TrainingSet::read(reader, "group", space).unwrap();
        let l2 = case["l2"].as_f64().unwrap();
        let f = fit(
            &set,
            &FitOptions {
                l2,
                ..Default::default()
            },
        )
        .unwrap();
        let classes: Vec<String> = case["classes"]
            .as_array()
            .unwrap()
            .iter()
            .map(|c| c.as_str().unwrap().to_string())
            .collect();
        assert_eq!(f.classes, classes);
        let model = Model::new(f, &set, "2025-01-01", "reference", None);
        let expected = probabilities(case);
        assert_eq!(expected.len(), set.len());
        let mut worst: f64 = 0.0;
        for (z, want) in set.features().iter().zip(&expected) {
            for (got, want) in model.probabilities_of_features(z).iter().zip(want) {
                worst = worst.max((got - want).abs());
            }
        }
        eprintln!(
            "{}: largest difference from scikit-learn {worst:.1e}",
            case["name"]
        );
        assert!(
            worst < 1e-4,
            "{}: largest difference {worst:e}",
            case["name"]
        );
    }
}

#[test]
fn train_command_writes_a_model_that_reproduces_scikit_learn() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("model.json");
    run(["train"])
        .arg(data_path())
        .args(["--label", "group", "--diagram", "qfl", "--l2", "0"])
        .args(["--folds", "3", "-o"])
        .arg(&out)
        .env("SOURCE_DATE_EPOCH", "1735689600")
        .ok()
        .stdout_has(&["3-fold cross-validation: accuracy", "confusion matrix"]);
    let model = Model::load(&out).unwrap();
    assert_eq!(model.training.date, "2025-01-01");
    assert_eq!(model.training.samples, 90);
    assert_eq!(model.l2, 0.0);
    assert!(model.training.checksum.starts_with("sha256:"));
    let cv = model.cross_validation.as_ref().unwrap();
    assert_eq!(cv.confusion.iter().flatten().sum::<u64>(), 90);
    let case = &reference()["cases"][0];
    assert_eq!(case["name"], "qfl unpenalised");
    let reader = CountReader::from_path(&data_path(), ReadOptions::default()).unwrap();
    for (s, want) in reader.zip(probabilities(case)) {
        let got = model.probabilities(&s.unwrap()).unwrap();
        for (g, w) in got.iter().zip(&want) {
            assert!((g - w).abs() < 1e-4);
        }
    }
}

#[test]
fn train_command_refuses_bad_requests_with_exit_codes() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("m.json");
    let data = data_path();
    let cases: [(&[&str], i32, &str); 4] = [
        (
            &["--label", "basin", "--diagram", "qfl"],
            3,
            "no label column \"basin\"",
        ),
        (
            &["--label", "group", "--diagram", "qfl", "--folds", "40"],
            3,
            "too few for 40-fold",
        ),
        (
            &["--label", "group", "--diagram", "qfl", "--l2", "-1"],
            2,
            "--l2 -1",
        ),
        (
            &["--label", "group", "--diagram", "qxl"],
            2,
            "invalid value",
        ),
    ];
    for (args, code, needle) in cases {
        run(["train"])
            .arg(&data)
            .args(args)
            .arg("-o")
            .arg(&out)
            .refused(code, &[needle]);
        assert_no_file(&out);
    }
}
