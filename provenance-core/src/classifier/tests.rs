//! Unit tests of the classifier.

use super::*;
use crate::counts::Counting;
use crate::diagram::Diagram;
use crate::input::{CountReader, ReadOptions};

fn qfl() -> FeatureSpace {
    FeatureSpace::Diagram(Diagram::Qfl)
}

/// Three overlapping invented classes in QFL.
fn three_classes() -> TrainingSet {
    let mut t = TrainingSet::new(qfl());
    for i in 0..40 {
        let s = (i * 37 % 23) as f64;
        t.push_amounts("a", &[200.0 + 3.0 * s, 60.0 + s, 40.0], Counting::Counted)
            .unwrap();
        t.push_amounts(
            "b",
            &[120.0 + 2.0 * s, 150.0 - s, 30.0 + s],
            Counting::Counted,
        )
        .unwrap();
        t.push_amounts(
            "c",
            &[90.0 + s, 60.0 + 2.0 * s, 150.0 - s],
            Counting::Counted,
        )
        .unwrap();
    }
    t
}

#[test]
fn our_probabilities_equal_linfas() {
    use linfa::prelude::*;
    use linfa_logistic::MultiLogisticRegression;
    let t = three_classes();
    let f = fit(&t, &FitOptions::default()).unwrap();
    let x = ndarray::Array2::from_shape_vec(
        (t.len(), 2),
        t.features().iter().flatten().copied().collect(),
    )
    .unwrap();
    let y: Vec<usize> = t
        .labels()
        .iter()
        .map(|l| (l.as_bytes()[0] - b'a') as usize)
        .collect();
    let lin = MultiLogisticRegression::default()
        .alpha(1.0)
        .max_iterations(2000)
        .gradient_tolerance(1e-9)
        .fit(&linfa::Dataset::new(x.clone(), ndarray::Array1::from(y)))
        .unwrap();
    let p = lin.predict_probabilities(&x);
    for (i, z) in t.features().iter().enumerate() {
        let ours = fit::softmax(&f.weights, &f.intercepts, z);
        for c in 0..3 {
            assert!((ours[c] - p[[i, c]]).abs() < 1e-5, "row {i} class {c}");
        }
    }
}

#[test]
fn the_fit_meets_its_tolerance_and_the_penalty_shrinks_weights() {
    let t = three_classes();
    let loose = fit(
        &t,
        &FitOptions {
            l2: 0.01,
            ..Default::default()
        },
    )
    .unwrap();
    let tight = fit(
        &t,
        &FitOptions {
            l2: 100.0,
            ..Default::default()
        },
    )
    .unwrap();
    assert!(loose.convergence.gradient_max <= DEFAULT_TOLERANCE);
    assert!(tight.convergence.gradient_max <= DEFAULT_TOLERANCE);
    let norm = |f: &LogisticFit| f.weights.iter().flatten().map(|w| w * w).sum::<f64>();
    assert!(norm(&tight) < 0.5 * norm(&loose));
    assert!(tight.convergence.training_log_loss > loose.convergence.training_log_loss);
}

#[test]
fn unpenalised_fit_of_separable_classes_is_refused_not_returned() {
    let mut t = TrainingSet::new(qfl());
    for i in 0..10 {
        let s = i as f64;
        t.push_amounts("q", &[90.0 + s, 5.0, 5.0], Counting::Counted)
            .unwrap();
        t.push_amounts("l", &[5.0, 5.0, 90.0 + s], Counting::Counted)
            .unwrap();
    }
    let opts = FitOptions {
        l2: 0.0,
        max_iterations: 50,
        newton_steps: 20,
        ..Default::default()
    };
    let e = fit(&t, &opts).unwrap_err();
    assert!(e.to_string().contains("separable"), "{e}");
    assert!(e.to_string().contains("--l2"), "{e}");
    // With a penalty the same data fit fine.
    assert!(fit(&t, &FitOptions { l2: 1.0, ..opts }).is_ok());
}

#[test]
fn one_class_is_refused() {
    let mut t = TrainingSet::new(qfl());
    t.push_amounts("a", &[1.0, 2.0, 3.0], Counting::Counted)
        .unwrap();
    t.push_amounts("a", &[3.0, 2.0, 1.0], Counting::Counted)
        .unwrap();
    assert!(fit(&t, &FitOptions::default())
        .unwrap_err()
        .to_string()
        .contains("at least two classes"));
}

#[test]
fn zeros_are_replaced_keeping_ratios_and_unchanged_without_zeros() {
    let sp = FeatureSpace::Framework;
    let amounts = [100.0, 0.0, 50.0, 25.0, 0.0, 15.0, 10.0];
    let z = sp.features_of(&amounts, Counting::Counted).unwrap();
    let x = crate::logratio::ilr_inverse(&z);
    let delta = 0.65 / 200.0;
    assert!((x[1] - delta).abs() < 1e-12 && (x[4] - delta).abs() < 1e-12);
    assert!((x[0] / x[2] - 2.0).abs() < 1e-12 && (x[3] / x[6] - 2.5).abs() < 1e-12);
    let whole = [100.0, 5.0, 50.0, 25.0, 5.0, 10.0, 5.0];
    let z = sp.features_of(&whole, Counting::Counted).unwrap();
    assert_eq!(z, crate::logratio::ilr(&whole));
}

#[test]
fn checksum_follows_the_data() {
    let mut a = TrainingSet::new(qfl());
    let mut b = TrainingSet::new(qfl());
    a.push_amounts("x", &[1.0, 2.0, 3.0], Counting::Counted)
        .unwrap();
    b.push_amounts("x", &[1.0, 2.0, 3.0], Counting::Counted)
        .unwrap();
    assert_eq!(a.checksum(), b.checksum());
    b.push_amounts("y", &[1.0, 2.0, 3.0], Counting::Counted)
        .unwrap();
    assert_ne!(a.checksum(), b.checksum());
    // SHA-256 of "x\t1\t2\t3\n" (sha256sum, GNU coreutils).
    assert_eq!(
        a.checksum(),
        "sha256:3c7bcabbc1b7c9edc3abc2f639f30277176eaf99bc52f7312937ebb067262b8b"
    );
}

fn model() -> Model {
    let t = three_classes();
    Model::new(
        fit(&t, &FitOptions::default()).unwrap(),
        &t,
        "2025-03-04",
        "invented",
        None,
    )
}

#[test]
fn model_files_round_trip_and_bad_ones_name_the_key() {
    let m = model();
    let text = m.to_json();
    assert_eq!(Model::from_json("m.json", &text).unwrap(), m);
    let mut v: serde_json::Value = serde_json::from_str(&text).unwrap();
    let check = |v: &serde_json::Value, needle: &str| {
        let e = Model::from_json("m.json", &v.to_string()).unwrap_err();
        let s = e.to_string();
        assert!(s.starts_with("m.json") && s.contains(needle), "{s}");
    };
    let mut w = v.clone();
    w["weights"][0] = serde_json::json!([1.0]);
    check(&w, "key \"weights\"");
    let mut w = v.clone();
    w["classes"] = serde_json::json!(["b", "a", "c"]);
    check(&w, "sorted order");
    let mut w = v.clone();
    w["format"] = serde_json::json!("other");
    check(&w, "key \"format\"");
    let mut w = v.clone();
    w["version"] = serde_json::json!(99);
    check(&w, "key \"version\"");
    let mut w = v.clone();
    w.as_object_mut().unwrap().remove("intercepts");
    check(&w, "missing field `intercepts`");
    let mut w = v.clone();
    w["features"]["composition"] = serde_json::json!("qxl");
    check(&w, "unknown composition");
    v["l2"] = serde_json::json!(-1.0);
    check(&v, "key \"l2\"");
    let e = Model::from_json("m.json", "{\n\"format\": \"sandprov-model\",\n oops}").unwrap_err();
    assert!(e.to_string().starts_with("m.json, line 3"), "{e}");
}

/// "line L, column C" of the byte `skip` bytes into the first `needle` of `text` (ASCII).
fn line_col(text: &str, needle: &str, skip: usize) -> String {
    let i = text.find(needle).expect(needle) + skip;
    let line = text[..i].matches('\n').count() + 1;
    let column = i - text[..i].rfind('\n').map_or(0, |n| n + 1) + 1;
    format!("line {line}, column {column}")
}

#[test]
fn refusals_of_a_pretty_model_file_name_the_line_and_column_of_the_key() {
    let v: serde_json::Value = serde_json::from_str(&model().to_json()).unwrap();
    // Each edit, a needle that finds the key or element at fault in the edited text (the
    // first byte past `skip`), the key path the location names, and the message's rest.
    type Edit = fn(&mut serde_json::Value);
    let cases: [(Edit, &str, usize, &str, &str); 9] = [
        (
            |w| w["features"]["parts"][2] = serde_json::json!(777),
            "777",
            0,
            "features.parts[2]",
            "key \"features.parts[2]\": invalid type: integer `777`, expected a string",
        ),
        (
            |w| w["features"]["composition"] = serde_json::json!("qxl"),
            "\n    \"composition\"",
            5,
            "features.composition",
            "unknown composition",
        ),
        (
            |w| w["weights"][1] = serde_json::json!([0.125]),
            "[\n      0.125",
            0,
            "weights[1]",
            "key \"weights\": row 2 has 1 numbers",
        ),
        (
            |w| w["colour"] = serde_json::json!("red"),
            "\n  \"colour\"",
            3,
            "colour",
            "key \"colour\": unknown field `colour`",
        ),
        (
            |w| {
                w["training"].as_object_mut().unwrap().remove("date");
            },
            "\n  \"training\"",
            3,
            "training",
            "key \"training\": missing field `date`",
        ),
        (
            |w| w["format"] = serde_json::json!("other"),
            "\n  \"format\"",
            3,
            "format",
            "key \"format\": found \"other\", expected \"sandprov-model\"",
        ),
        (
            |w| w["version"] = serde_json::json!("2"),
            "\n  \"version\"",
            3,
            "version",
            "key \"version\": found \"2\", expected 2",
        ),
        (
            |w| w["l2"] = serde_json::json!(-1.5),
            "\n  \"l2\"",
            3,
            "l2",
            "key \"l2\": -1.5, expected a penalty of 0 or more",
        ),
        (
            |w| w["checksum"] = serde_json::json!(12),
            "\n  \"checksum\"",
            3,
            "checksum",
            "key \"checksum\": found 12,",
        ),
    ];
    for (edit, needle, skip, path, rest) in cases {
        let mut w = v.clone();
        edit(&mut w);
        let text = serde_json::to_string_pretty(&w).unwrap();
        let e = Model::from_json("m.json", &text).unwrap_err().to_string();
        let at = format!("m.json, {} ({path:?}): ", line_col(&text, needle, skip));
        assert!(
            e.starts_with(&at) && e.contains(rest),
            "{e}\nwanted {at}…{rest}"
        );
    }
    // A key missing from the whole model: the model's own first line.
    let mut w = v.clone();
    w.as_object_mut().unwrap().remove("kind");
    let text = format!("\n\n{}", serde_json::to_string_pretty(&w).unwrap());
    let e = Model::from_json("m.json", &text).unwrap_err().to_string();
    assert!(e.starts_with("m.json, line 3: missing field `kind`"), "{e}");
    // Not JSON: the line and column of the character where parsing stopped, said once.
    let e = Model::from_json(
        "m.json",
        "{\n  \"format\": \"sandprov-model\",\n  \"version\" 2\n}",
    )
    .unwrap_err()
    .to_string();
    assert!(
        e.starts_with("m.json, line 3, column 13: not valid JSON (expected `:`), expected a sandprov model file"),
        "{e}"
    );
}

#[test]
fn a_labelled_table_names_bad_rows() {
    let text = "sample,Qm,Qp,P,K,Lv,Ls,Lm,setting\nA,10,1,1,1,1,1,1,x\nB,10,1,1,1,1,1,1, \n";
    let r = CountReader::from_reader("ref.csv", text.as_bytes(), ReadOptions::default()).unwrap();
    let e = TrainingSet::read(r, "setting", qfl())
        .unwrap_err()
        .to_string();
    assert!(
        e.contains("ref.csv, line 3, column 9 (\"setting\")")
            && e.contains("non-empty class label"),
        "{e}"
    );
    let text = "sample,Qm,Qp,P,K,Lv,Ls,Lm,setting\nA,0,0,0,0,0,0,0,x\n";
    let r = CountReader::from_reader("ref.csv", text.as_bytes(), ReadOptions::default()).unwrap();
    let e = TrainingSet::read(r, "setting", qfl())
        .unwrap_err()
        .to_string();
    assert!(e.contains("line 2") && e.contains("no grains"), "{e}");
    let text = "sample,Qm,Qp,P,K,Lv,Ls,Lm,setting\nA,50,0,20,10,10,5,5,x\n";
    let r = CountReader::from_reader(
        "ref.csv",
        text.as_bytes(),
        ReadOptions {
            percent: true,
            ..Default::default()
        },
    )
    .unwrap();
    let e = TrainingSet::read(r, "setting", FeatureSpace::Framework)
        .unwrap_err()
        .to_string();
    assert!(e.contains("number of points is unknown"), "{e}");
}

#[test]
fn running_out_of_iterations_is_refused() {
    let opts = FitOptions {
        max_iterations: 1,
        newton_steps: 0,
        solver: Solver::Lbfgs,
        ..Default::default()
    };
    let e = fit(&three_classes(), &opts).unwrap_err().to_string();
    assert!(
        e.contains("did not converge in 1 L-BFGS iterations and 0 Newton steps"),
        "{e}"
    );
    let newton = FitOptions {
        newton_steps: 2,
        solver: Solver::Newton,
        ..Default::default()
    };
    let e = fit(&three_classes(), &newton).unwrap_err().to_string();
    assert!(e.contains("did not converge in 2 Newton steps"), "{e}");
}

#[test]
fn newton_and_lbfgs_reach_the_same_optimum() {
    // Both solvers minimise one objective: at the tolerance their objectives agree to about
    // tolerance² and their coefficients closely.
    let t = three_classes();
    let run = |solver| {
        fit(
            &t,
            &FitOptions {
                solver,
                ..Default::default()
            },
        )
        .unwrap()
    };
    let (newton, lbfgs) = (run(Solver::Newton), run(Solver::Lbfgs));
    assert_eq!(run(Solver::Auto), newton, "9 parameters: Auto means Newton");
    let gap = (newton.convergence.objective - lbfgs.convergence.objective).abs();
    assert!(gap < 1e-10, "objectives differ by {gap:e}");
    for (a, b) in newton
        .weights
        .iter()
        .flatten()
        .zip(lbfgs.weights.iter().flatten())
    {
        assert!((a - b).abs() < 1e-4, "{a} vs {b}");
    }
    assert!(newton.convergence.newton_steps > 0);
}

#[test]
fn an_edited_model_file_fails_its_checksum() {
    let m = model();
    let text = m.to_json();
    let v: serde_json::Value = serde_json::from_str(&text).unwrap();
    assert_eq!(v["checksum"], m.checksum().as_str());
    assert_eq!(v["version"], 2);
    // Layout does not count: the same content, compact and with keys sorted, still loads.
    assert_eq!(Model::from_json("m.json", &v.to_string()).unwrap(), m);
    // One coefficient changed in the last digit that JSON keeps.
    let mut w = v.clone();
    let x = w["weights"][0][0].as_f64().unwrap();
    w["weights"][0][0] = serde_json::json!(x * (1.0 + 1e-12));
    let e = Model::from_json("m.json", &w.to_string())
        .unwrap_err()
        .to_string();
    assert!(
        e.starts_with("m.json, line 1, column 2 (\"checksum\"): key \"checksum\": the model's content gives sha256:")
            && e.contains("an unaltered model file"),
        "{e}"
    );
    // A changed note counts too: the note travels into every output.
    let mut w = v.clone();
    w["note"] = serde_json::json!("trust me");
    assert!(Model::from_json("m.json", &w.to_string()).is_err());
    // No checksum (as a version-1 file had none) and a checksum of the wrong type.
    let mut w = v.clone();
    w.as_object_mut().unwrap().remove("checksum");
    let e = Model::from_json("m.json", &w.to_string()).unwrap_err();
    assert!(e.to_string().contains("key \"checksum\": missing"), "{e}");
    let mut w = v.clone();
    w["checksum"] = serde_json::json!(12);
    let e = Model::from_json("m.json", &w.to_string()).unwrap_err();
    assert!(e.to_string().contains("key \"checksum\": found 12"), "{e}");
    // A file of version 1 is refused by its version, naming the key.
    let mut w = v;
    w["version"] = serde_json::json!(1);
    let e = Model::from_json("m.json", &w.to_string()).unwrap_err();
    assert!(e.to_string().contains("key \"version\": found 1,"), "{e}");
}

#[test]
fn resolving_an_embedded_id_rebuilds_its_default_model() {
    let named = NamedModel::resolve("dickinson1985-qmflt", "2025-02-03").unwrap();
    let set = crate::fields::FieldSet::load("dickinson1985-qmflt").unwrap();
    assert_eq!(named.model, default_model(&set, "2025-02-03").unwrap());
    assert_eq!(named.name, "default model of dickinson1985-qmflt");
    assert_eq!(
        named.source,
        ModelSource::FieldSet("dickinson1985-qmflt".into())
    );
    assert_eq!(named.file(), None);
    assert_eq!(named.model.training.date, "2025-02-03");
    // The classes are the set's field names, sorted.
    let mut names: Vec<String> = set.fields.iter().map(|f| f.name.clone()).collect();
    names.sort();
    assert_eq!(named.model.classes, names);
}

#[test]
fn resolving_a_file_loads_and_checks_it() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("m.json");
    let m = model();
    m.save(&path).unwrap();
    let spec = path.to_str().unwrap();
    let named = NamedModel::resolve(spec, "2030-01-01").unwrap();
    assert_eq!(named.model, m);
    assert_eq!(named.name, spec);
    assert_eq!(named.file(), Some(path.as_path()));
    // The date is only for default models: a file keeps its own.
    assert_eq!(named.model.training.date, "2025-03-04");

    let broken = dir.path().join("broken.json");
    std::fs::write(&broken, "{\"format\": \"sandprov-model\", ").unwrap();
    let e = NamedModel::resolve(broken.to_str().unwrap(), "2030-01-01")
        .unwrap_err()
        .to_string();
    assert!(
        e.contains("broken.json, line 1") && e.contains("not valid JSON"),
        "{e}"
    );

    let edited = dir.path().join("edited.json");
    std::fs::write(&edited, m.to_json().replace("\"invented\"", "\"other\"")).unwrap();
    let e = NamedModel::resolve(edited.to_str().unwrap(), "2030-01-01").unwrap_err();
    assert_eq!(e.kind(), crate::error::ErrorKind::Input);
    let checksum_line = m
        .to_json()
        .lines()
        .position(|l| l.starts_with("  \"checksum\""))
        .unwrap()
        + 1;
    let shown =
        format!("edited.json, line {checksum_line}, column 3 (\"checksum\"): key \"checksum\"");
    assert!(e.to_string().contains(&shown), "{e}");

    let missing = dir.path().join("nope.json");
    let e = NamedModel::resolve(missing.to_str().unwrap(), "2030-01-01").unwrap_err();
    assert_eq!(e.kind(), crate::error::ErrorKind::Io);
    assert!(e.to_string().contains("nope.json"), "{e}");
}

#[test]
fn a_verdict_without_points_names_its_reason() {
    use crate::counts::{Framework, Sample};
    let named = NamedModel {
        name: "m".into(),
        model: model(),
        source: ModelSource::File("m.json".into()),
    };
    let r = named.apply(&Sample::counted("e", Framework::default()));
    assert_eq!(r.probabilities, None);
    assert_eq!(r.top(), None);
    assert_eq!(r.note, Some("the model's composition has no grains"));
    let s = Sample::counted(
        "q",
        Framework {
            qm: 300.0,
            p: 30.0,
            lv: 20.0,
            ..Default::default()
        },
    );
    let r = named.apply(&s);
    let p = r.probabilities.clone().unwrap();
    assert!((p.iter().sum::<f64>() - 1.0).abs() < 1e-12);
    let (i, top) = r.top().unwrap();
    assert!(p.iter().all(|v| *v <= top));
    assert_eq!(p[i], top);
}
