//! `sandprov fields …` and `sandprov setting …`, run as the real binary.
//!
//! Expected field assignments rest on the shipped sets, whose vertices are from memory,
//! unverified (see reference-fields/README.md); the samples below sit well inside their
//! fields so that the placements checked are the published arrangement (Dickinson & Suczek
//! 1979; Dickinson 1985), not fine boundary positions. Sample data are invented.

use assert_cmd::Command;
use predicates::prelude::*;
use serde_json::Value;
use std::path::{Path, PathBuf};

fn sandprov() -> Command {
    Command::cargo_bin("sandprov").expect("the sandprov binary (built by `cargo test --workspace`)")
}

fn reference(file: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("../reference-fields")
        .join(file)
}

const SHIPPED: [&str; 4] = [
    "dickinson1985-qfl",
    "dickinson1985-qmflt",
    "dickinson-suczek1979-qmpk",
    "dickinson-suczek1979-qplvlsm",
];

/// Invented counts: a quartz arenite, a volcanic-lithic arc sand, a quartz-lithic recycled
/// sand, an all-lithic sand (no Qm, P or K), and a feldspathic sand in the QmPK gap.
const COUNTS: &str = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,formation
INV-01,388,4,2,3,1,0,1,1,Upper
INV-02,30,4,2,110,20,210,6,18,Lower
INV-03,160,30,20,10,5,10,50,45,Middle
INV-04,0,6,4,0,0,250,20,20,Lower
INV-05,20,0,0,100,80,60,20,20,Middle
";

fn write(dir: &Path, name: &str, text: &str) -> PathBuf {
    let p = dir.join(name);
    std::fs::write(&p, text).unwrap();
    p
}

fn json(out: &[u8]) -> Value {
    serde_json::from_slice(out)
        .unwrap_or_else(|e| panic!("not JSON ({e}):\n{}", String::from_utf8_lossy(out)))
}

#[test]
fn list_gives_id_then_title_per_embedded_set() {
    let out = sandprov().args(["fields", "list"]).assert().success();
    let text = String::from_utf8(out.get_output().stdout.clone()).unwrap();
    let lines: Vec<&str> = text.lines().collect();
    assert_eq!(lines.len(), SHIPPED.len(), "{text}");
    for (line, id) in lines.iter().zip(SHIPPED) {
        let (first, rest) = line.split_once(' ').unwrap();
        assert_eq!(first, id);
        assert!(rest.trim_start().contains("from memory"), "{line}");
    }
}

#[test]
fn show_json_has_exactly_the_documented_keys() {
    let out = sandprov()
        .args(["fields", "show", "dickinson1985-qfl", "--format", "json"])
        .assert()
        .success();
    let v = json(&out.get_output().stdout);
    let keys: Vec<&str> = v.as_object().unwrap().keys().map(String::as_str).collect();
    let mut want = vec!["id", "diagram", "poles", "source", "note", "fields"];
    let mut got = keys.clone();
    got.sort();
    want.sort();
    assert_eq!(got, want);
    assert_eq!(v["id"], "dickinson1985-qfl");
    assert_eq!(v["diagram"], "qfl");
    assert_eq!(v["poles"], serde_json::json!(["Q", "F", "L"]));
    assert!(v["source"]
        .as_str()
        .unwrap()
        .starts_with("Dickinson (1985)"));
    assert!(v["note"].as_str().unwrap().contains("from memory"));
    let fields = v["fields"].as_array().unwrap();
    assert_eq!(fields.len(), 7);
    assert_eq!(fields[0]["name"], "craton interior");
    assert_eq!(fields[0]["group"], "continental block");
    for f in fields {
        let mut k: Vec<&String> = f.as_object().unwrap().keys().collect();
        k.sort();
        assert_eq!(k, ["group", "name", "vertices"]);
        for vx in f["vertices"].as_array().unwrap() {
            let parts: Vec<f64> = vx
                .as_array()
                .unwrap()
                .iter()
                .map(|x| x.as_f64().unwrap())
                .collect();
            assert_eq!(parts.len(), 3);
            assert!((parts.iter().sum::<f64>() - 100.0).abs() <= 0.01);
        }
    }
    // The 10 QmFLt fields, with their Qm-F-Lt poles.
    let out = sandprov()
        .args(["fields", "show", "dickinson1985-qmflt", "--format", "json"])
        .assert()
        .success();
    let v = json(&out.get_output().stdout);
    assert_eq!(v["fields"].as_array().unwrap().len(), 10);
    assert_eq!(v["poles"], serde_json::json!(["Qm", "F", "Lt"]));
}

#[test]
fn every_shipped_file_passes_the_check() {
    for id in SHIPPED {
        let file = reference(&format!("{id}.toml"));
        sandprov()
            .args(["fields", "check"])
            .arg(&file)
            .assert()
            .success()
            .stdout(predicate::str::contains("overlap: 0.000 pp²"))
            .stdout(predicate::str::contains("uncovered:"))
            .stdout(predicate::str::ends_with("valid\n"));
    }
    // QFL and QmFLt leave no ground uncovered.
    for id in ["dickinson1985-qfl", "dickinson1985-qmflt"] {
        sandprov()
            .args(["fields", "check", id])
            .assert()
            .success()
            .stdout(predicate::str::contains(
                "uncovered: 0.000 pp² (0.000% of the triangle) in 0 region(s)",
            ));
    }
    // The QmPK gap is measured and located: the triangle Qm 70, P 15, K 15 / P 75, K 25 /
    // P 50, K 50, area ½ · 25 · 70 · √3/2 = 757.772 (hand value).
    sandprov()
        .args(["fields", "check", "dickinson-suczek1979-qmpk"])
        .assert()
        .success()
        .stdout(predicate::str::contains("gap 1: 757.772 pp² (17.500%)"))
        .stdout(predicate::str::contains("reaching the P-K side"));
}

const HEAD: &str = "id = \"lab\"\ntitle = \"Lab set\"\ndiagram = \"qfl\"\nnote = \"Invented for a test.\"\n[source]\nauthor = \"Nobody\"\nyear = 2024\nfigure = \"none\"\nreference = \"none\"\n";

#[test]
fn check_refuses_overlapping_fields_and_reports_the_area() {
    let dir = tempfile::tempdir().unwrap();
    // Q ≥ 40 and F ≥ 40 overlap in a triangle of side 20: 0.04 · 4330.127 = 173.205.
    let text = format!(
        "{HEAD}[[fields]]\nname = \"q\"\ngroup = \"mixed\"\nvertices = [[100, 0, 0], [40, 60, 0], [40, 0, 60]]\n[[fields]]\nname = \"f\"\ngroup = \"mixed\"\nvertices = [[0, 100, 0], [0, 40, 60], [60, 40, 0]]\n"
    );
    let file = write(dir.path(), "overlap.toml", &text);
    sandprov()
        .args(["fields", "check"])
        .arg(&file)
        .assert()
        .code(3)
        .stdout(predicate::str::contains(
            "overlap: 173.205 pp² (4.000% of the triangle)",
        ))
        .stdout(predicate::str::contains(
            "uncovered: 1385.641 pp² (32.000% of the triangle)",
        ))
        .stderr(predicate::str::contains(
            "overlap.toml, line 15, column 8 (\"name\")",
        ));
}

#[test]
fn check_names_line_key_value_and_expectation_of_bad_vertices() {
    let dir = tempfile::tempdir().unwrap();
    let text = format!(
        "{HEAD}[[fields]]\nname = \"q\"\ngroup = \"mixed\"\nvertices = [[100, 0, 0], [40, 50, 0], [40, 0, 60]]\n"
    );
    let file = write(dir.path(), "sum.toml", &text);
    sandprov()
        .args(["fields", "check"])
        .arg(&file)
        .assert()
        .code(3)
        .stderr(predicate::str::contains(
            "sum.toml, line 13, column 26 (\"vertices\")",
        ))
        .stderr(predicate::str::contains("[40, 50, 0] and sums to 90"))
        .stderr(predicate::str::contains(
            "expected [Q, F, L] each from 0 to 100, summing to 100 ± 0.01",
        ));
    let file = write(
        dir.path(),
        "group.toml",
        &text.replace("\"mixed\"", "\"volcanic\""),
    );
    sandprov()
        .args(["fields", "check"])
        .arg(&file)
        .assert()
        .code(3)
        .stderr(predicate::str::contains(
            "group.toml, line 12, column 9 (\"group\")",
        ))
        .stderr(predicate::str::contains("\"volcanic\""))
        .stderr(predicate::str::contains(
            "expected one of continental block",
        ));
}

#[test]
fn unknown_set_id_is_a_usage_error() {
    sandprov()
        .args(["fields", "show", "qfl-fields"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("unknown field set \"qfl-fields\""))
        .stderr(predicate::str::contains("dickinson1985-qmflt"));
}

#[test]
fn setting_json_places_samples_and_interprets_them() {
    let dir = tempfile::tempdir().unwrap();
    let counts = write(dir.path(), "counts.csv", COUNTS);
    let out = sandprov()
        .arg("setting")
        .arg(&counts)
        .args(["--format", "json"])
        .assert()
        .success();
    let v = json(&out.get_output().stdout);
    let rows = v.as_array().unwrap();
    assert_eq!(rows.len(), 5);
    let (quartz, arc, recycled, lithic, gap) = (&rows[0], &rows[1], &rows[2], &rows[3], &rows[4]);
    assert_eq!(quartz["sample"], "INV-01");
    assert_eq!(quartz["qfl"]["field"], "craton interior");
    assert_eq!(quartz["qfl"]["group"], "continental block");
    assert!(quartz["qfl"]["boundary_distance"].as_f64().unwrap() > 0.0);
    assert_eq!(
        quartz["qfl"]["interpretation"]["provenance"],
        "stable craton"
    );
    assert!(quartz["qfl"]["interpretation"]["receiving_basins"]
        .as_array()
        .unwrap()
        .contains(&Value::from("passive-margin wedges")));
    assert_eq!(quartz["qmflt"]["field"], "craton interior");
    assert_eq!(quartz["metadata"]["formation"], "Upper");
    assert!(quartz["caution"]
        .as_str()
        .unwrap()
        .contains("petrographic judgement"));

    assert_eq!(arc["qfl"]["group"], "magmatic arc");
    assert_eq!(
        arc["qfl"]["interpretation"]["receiving_basins"],
        serde_json::json!(["trenches", "forearc basins", "backarc basins"])
    );
    assert_eq!(arc["qplvlsm"]["field"], "arc orogen sources");

    assert_eq!(recycled["qfl"]["field"], "recycled orogen");
    assert_eq!(
        recycled["qfl"]["interpretation"]["receiving_basins"],
        serde_json::json!([
            "foreland basins",
            "successor basins",
            "remnant-ocean basins"
        ])
    );
    assert_eq!(recycled["qmflt"]["group"], "recycled orogen");

    // No Qm, P or K: QmPK is null with a reason.
    assert_eq!(lithic["qmpk"]["field"], Value::Null);
    assert_eq!(lithic["qmpk"]["composition"], Value::Null);
    assert_eq!(
        lithic["qmpk"]["reason"],
        "no points in qmpk: Qm, P and K are all zero"
    );
    assert_eq!(lithic["qfl"]["field"], "undissected arc");

    // In the unassigned QmPK wedge: null field, the nearest field and its distance.
    assert_eq!(gap["qmpk"]["field"], Value::Null);
    assert_eq!(
        gap["qmpk"]["reason"],
        "outside every field of dickinson-suczek1979-qmpk"
    );
    assert!(gap["qmpk"]["nearest_field"].is_string());
    assert!(gap["qmpk"]["boundary_distance"].as_f64().unwrap() > 0.0);
    assert_eq!(gap["qmpk"]["interpretation"], Value::Null);
}

#[test]
fn setting_with_chosen_sets_and_a_lab_file() {
    let dir = tempfile::tempdir().unwrap();
    let counts = write(dir.path(), "counts.csv", COUNTS);
    // Only QFL, by id: only its key appears.
    let out = sandprov()
        .arg("setting")
        .arg(&counts)
        .args(["--fields", "dickinson1985-qfl", "--format", "json"])
        .assert()
        .success();
    let v = json(&out.get_output().stdout);
    assert!(v[0].get("qfl").is_some() && v[0].get("qmflt").is_none());
    // A lab's own file: two fields split at Q = 50.
    let lab = format!(
        "{HEAD}[[fields]]\nname = \"quartz-rich\"\ngroup = \"continental block\"\nvertices = [[100, 0, 0], [50, 50, 0], [50, 0, 50]]\n[[fields]]\nname = \"quartz-poor\"\ngroup = \"magmatic arc\"\nvertices = [[50, 50, 0], [0, 100, 0], [0, 0, 100], [50, 0, 50]]\n"
    );
    let file = write(dir.path(), "lab.toml", &lab);
    let out = sandprov()
        .arg("setting")
        .arg(&counts)
        .arg("--fields")
        .arg(&file)
        .args(["--fields", "dickinson1985-qmflt", "--format", "json"])
        .assert()
        .success();
    let v = json(&out.get_output().stdout);
    assert_eq!(v[0]["qfl"]["field"], "quartz-rich");
    assert_eq!(v[0]["qfl"]["fields"], "lab");
    assert_eq!(v[1]["qfl"]["field"], "quartz-poor");
    assert_eq!(v[0]["qmflt"]["field"], "craton interior");
    // Two sets for one diagram are refused.
    sandprov()
        .arg("setting")
        .arg(&counts)
        .arg("--fields")
        .arg(&file)
        .args(["--fields", "dickinson1985-qfl"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("both for the qfl diagram"));
}

#[test]
fn setting_csv_is_flat_and_written_whole_or_not_at_all() {
    let dir = tempfile::tempdir().unwrap();
    let counts = write(dir.path(), "counts.csv", COUNTS);
    let out = dir.path().join("setting.csv");
    sandprov()
        .arg("setting")
        .arg(&counts)
        .arg("-o")
        .arg(&out)
        .assert()
        .success();
    let text = std::fs::read_to_string(&out).unwrap();
    let mut lines = text.lines();
    let header: Vec<&str> = lines.next().unwrap().split(',').collect();
    assert_eq!(
        &header[..5],
        [
            "sample",
            "formation",
            "qfl_field",
            "qfl_group",
            "qfl_boundary_distance"
        ]
    );
    assert!(header.contains(&"qmflt_receiving_basins") && header.contains(&"qplvlsm_reason"));
    assert_eq!(header.last(), Some(&"caution"));
    assert!(lines
        .next()
        .unwrap()
        .starts_with("INV-01,Upper,craton interior,continental block,"));
    assert_eq!(text.lines().count(), 6);

    // A bad row: exit 3, the message names file, line and column, nothing is written.
    let bad = write(
        dir.path(),
        "bad.csv",
        &COUNTS.replace("INV-03,160", "INV-03,-160"),
    );
    let out2 = dir.path().join("never.csv");
    sandprov()
        .arg("setting")
        .arg(&bad)
        .arg("-o")
        .arg(&out2)
        .assert()
        .code(3)
        .stderr(predicate::str::contains(
            "bad.csv, line 4, column 2 (\"Qm\")",
        ));
    assert!(!out2.exists());
    // The output may not be one of the inputs, field-set files included.
    let lab = write(
        dir.path(),
        "lab.toml",
        &std::fs::read_to_string(reference("dickinson1985-qfl.toml")).unwrap(),
    );
    sandprov()
        .arg("setting")
        .arg(&counts)
        .arg("--fields")
        .arg(&lab)
        .arg("-o")
        .arg(&lab)
        .assert()
        .code(2);
    assert!(std::fs::read_to_string(&lab)
        .unwrap()
        .contains("dickinson1985-qfl"));
}

#[test]
fn setting_refuses_an_invalid_lab_file() {
    let dir = tempfile::tempdir().unwrap();
    let counts = write(dir.path(), "counts.csv", COUNTS);
    let bow = format!(
        "{HEAD}[[fields]]\nname = \"bow\"\ngroup = \"mixed\"\nvertices = [[0, 100, 0], [50, 0, 50], [50, 50, 0], [0, 50, 50]]\n"
    );
    let file = write(dir.path(), "bow.toml", &bow);
    sandprov()
        .arg("setting")
        .arg(&counts)
        .arg("--fields")
        .arg(&file)
        .assert()
        .code(3)
        .stderr(predicate::str::contains("bow.toml, line 13"))
        .stderr(predicate::str::contains(
            "not a simple polygon: edge 1 and edge 3 meet at [25.000, 50.000, 25.000]",
        ));
}

#[test]
fn embedded_sets_equal_their_files() {
    for id in SHIPPED {
        let by_id = sandprov()
            .args(["fields", "show", id, "--format", "json"])
            .assert()
            .success();
        let by_file = sandprov()
            .args(["fields", "show", "--format", "json"])
            .arg(reference(&format!("{id}.toml")))
            .assert()
            .success();
        assert_eq!(
            by_id.get_output().stdout,
            by_file.get_output().stdout,
            "{id}"
        );
    }
}

#[test]
fn setting_reads_published_percentages() {
    // A published table in percent of the framework, without point totals (invented values).
    let dir = tempfile::tempdir().unwrap();
    let table = "sample;Qm;Qp;P;K;Lv;Ls;Lm\nPUB-1;20;2;35;5;30;4;4\nPUB-2;96;2;0,5;0,5;0;0,5;0,5\n";
    let counts = write(dir.path(), "published.csv", table);
    let out = sandprov()
        .arg("setting")
        .arg(&counts)
        .args(["--percent", "--format", "json"])
        .assert()
        .success();
    let v = json(&out.get_output().stdout);
    assert_eq!(v[0]["qfl"]["group"], "magmatic arc");
    assert_eq!(v[1]["qfl"]["field"], "craton interior");
}
