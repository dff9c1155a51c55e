//! `sandprov fields …` and `sandprov setting …`, run as the real binary.
//!
//! Expected field assignments rest on the shipped sets, whose vertices are from memory,
//! unverified (see reference-fields/README.md); the samples below sit well inside their
//! fields so that the placements checked are the published arrangement (Dickinson & Suczek
//! 1979; Dickinson 1985), not fine boundary positions. Sample data are invented.

use sandprov_tests::{assert_no_file, reference_fields, run, Sandbox};
use serde_json::Value;

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

#[test]
fn list_gives_id_then_title_per_embedded_set() {
    let text = run(["fields", "list"]).ok().stdout();
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
    let v = run(["fields", "show", "dickinson1985-qfl", "--format", "json"])
        .ok()
        .json();
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
    let v = run(["fields", "show", "dickinson1985-qmflt", "--format", "json"])
        .ok()
        .json();
    assert_eq!(v["fields"].as_array().unwrap().len(), 10);
    assert_eq!(v["poles"], serde_json::json!(["Qm", "F", "Lt"]));
}

#[test]
fn every_shipped_file_passes_the_check() {
    for id in SHIPPED {
        let file = reference_fields(&format!("{id}.toml"));
        let ran = run(["fields", "check"])
            .arg(&file)
            .ok()
            .stdout_has(&["overlap: 0.000 pp²", "uncovered:"]);
        assert!(ran.stdout().ends_with("valid\n"), "{ran}");
    }
    // QFL and QmFLt leave no ground uncovered.
    for id in ["dickinson1985-qfl", "dickinson1985-qmflt"] {
        run(["fields", "check", id])
            .ok()
            .stdout_has(&["uncovered: 0.000 pp² (0.000% of the triangle) in 0 region(s)"]);
    }
    // The QmPK gap is measured and located: the triangle Qm 70, P 15, K 15 / P 75, K 25 /
    // P 50, K 50, area ½ · 25 · 70 · √3/2 = 757.772 (hand value).
    run(["fields", "check", "dickinson-suczek1979-qmpk"])
        .ok()
        .stdout_has(&["gap 1: 757.772 pp² (17.500%)", "reaching the P-K side"]);
}

const HEAD: &str = "id = \"lab\"\ntitle = \"Lab set\"\ndiagram = \"qfl\"\nnote = \"Invented for a test.\"\n[source]\nauthor = \"Nobody\"\nyear = 2024\nfigure = \"none\"\nreference = \"none\"\n";

#[test]
fn check_refuses_overlapping_fields_and_reports_the_area() {
    let sb = Sandbox::new();
    // Q ≥ 40 and F ≥ 40 overlap in a triangle of side 20: 0.04 · 4330.127 = 173.205.
    let text = format!(
        "{HEAD}[[fields]]\nname = \"q\"\ngroup = \"mixed\"\nvertices = [[100, 0, 0], [40, 60, 0], [40, 0, 60]]\n[[fields]]\nname = \"f\"\ngroup = \"mixed\"\nvertices = [[0, 100, 0], [0, 40, 60], [60, 40, 0]]\n"
    );
    let file = sb.write("overlap.toml", &text);
    sb.run(["fields", "check"])
        .arg(&file)
        .refused(3, &["overlap.toml, line 15, column 8 (\"name\")"])
        .stdout_has(&[
            "overlap: 173.205 pp² (4.000% of the triangle)",
            "uncovered: 1385.641 pp² (32.000% of the triangle)",
        ]);
}

#[test]
fn check_names_line_key_value_and_expectation_of_bad_vertices() {
    let sb = Sandbox::new();
    let text = format!(
        "{HEAD}[[fields]]\nname = \"q\"\ngroup = \"mixed\"\nvertices = [[100, 0, 0], [40, 50, 0], [40, 0, 60]]\n"
    );
    let file = sb.write("sum.toml", &text);
    sb.run(["fields", "check"]).arg(&file).refused(
        3,
        &[
            "sum.toml, line 13, column 26 (\"vertices\")",
            "[40, 50, 0] and sums to 90",
            "expected [Q, F, L] each from 0 to 100, summing to 100 ± 0.01",
        ],
    );
    let file = sb.write("group.toml", text.replace("\"mixed\"", "\"volcanic\""));
    sb.run(["fields", "check"]).arg(&file).refused(
        3,
        &[
            "group.toml, line 12, column 9 (\"group\")",
            "\"volcanic\"",
            "expected one of continental block",
        ],
    );
}

#[test]
fn unknown_set_id_is_a_usage_error() {
    run(["fields", "show", "qfl-fields"]).refused(
        2,
        &["unknown field set \"qfl-fields\"", "dickinson1985-qmflt"],
    );
}

#[test]
fn setting_json_places_samples_and_interprets_them() {
    let sb = Sandbox::new();
    let counts = sb.write("counts.csv", COUNTS);
    let v = sb
        .run(["setting"])
        .arg(&counts)
        .args(["--format", "json"])
        .ok()
        .json();
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
    let sb = Sandbox::new();
    let counts = sb.write("counts.csv", COUNTS);
    // Only QFL, by id: only its key appears.
    let v = sb
        .run(["setting"])
        .arg(&counts)
        .args(["--fields", "dickinson1985-qfl", "--format", "json"])
        .ok()
        .json();
    assert!(v[0].get("qfl").is_some() && v[0].get("qmflt").is_none());
    // A lab's own file: two fields split at Q = 50.
    let lab = format!(
        "{HEAD}[[fields]]\nname = \"quartz-rich\"\ngroup = \"continental block\"\nvertices = [[100, 0, 0], [50, 50, 0], [50, 0, 50]]\n[[fields]]\nname = \"quartz-poor\"\ngroup = \"magmatic arc\"\nvertices = [[50, 50, 0], [0, 100, 0], [0, 0, 100], [50, 0, 50]]\n"
    );
    let file = sb.write("lab.toml", &lab);
    let v = sb
        .run(["setting"])
        .arg(&counts)
        .arg("--fields")
        .arg(&file)
        .args(["--fields", "dickinson1985-qmflt", "--format", "json"])
        .ok()
        .json();
    assert_eq!(v[0]["qfl"]["field"], "quartz-rich");
    assert_eq!(v[0]["qfl"]["fields"], "lab");
    assert_eq!(v[1]["qfl"]["field"], "quartz-poor");
    assert_eq!(v[0]["qmflt"]["field"], "craton interior");
    // Two sets for one diagram are refused.
    sb.run(["setting"])
        .arg(&counts)
        .arg("--fields")
        .arg(&file)
        .args(["--fields", "dickinson1985-qfl"])
        .refused(2, &["both for the qfl diagram"]);
}

#[test]
fn setting_csv_is_flat_and_written_whole_or_not_at_all() {
    let sb = Sandbox::new();
    let counts = sb.write("counts.csv", COUNTS);
    sb.run(["setting"])
        .arg(&counts)
        .arg("-o")
        .arg(sb.path("setting.csv"))
        .ok();
    let text = sb.read("setting.csv");
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
    let bad = sb.write("bad.csv", COUNTS.replace("INV-03,160", "INV-03,-160"));
    let out2 = sb.path("never.csv");
    sb.run(["setting"])
        .arg(&bad)
        .arg("-o")
        .arg(&out2)
        .refused(3, &["bad.csv, line 4, column 2 (\"Qm\")"]);
    assert_no_file(&out2);
    // The output may not be one of the inputs, field-set files included.
    let lab = sb.write(
        "lab.toml",
        std::fs::read_to_string(reference_fields("dickinson1985-qfl.toml")).unwrap(),
    );
    sb.run(["setting"])
        .arg(&counts)
        .arg("--fields")
        .arg(&lab)
        .arg("-o")
        .arg(&lab)
        .refused(2, &[]);
    assert!(sb.read("lab.toml").contains("dickinson1985-qfl"));
}

#[test]
fn setting_refuses_an_invalid_lab_file() {
    let sb = Sandbox::new();
    let counts = sb.write("counts.csv", COUNTS);
    let bow = format!(
        "{HEAD}[[fields]]\nname = \"bow\"\ngroup = \"mixed\"\nvertices = [[0, 100, 0], [50, 0, 50], [50, 50, 0], [0, 50, 50]]\n"
    );
    let file = sb.write("bow.toml", &bow);
    sb.run(["setting"])
        .arg(&counts)
        .arg("--fields")
        .arg(&file)
        .refused(
            3,
            &[
                "bow.toml, line 13",
                "not a simple polygon: edge 1 and edge 3 meet at [25.000, 50.000, 25.000]",
            ],
        );
}

#[test]
fn embedded_sets_equal_their_files() {
    for id in SHIPPED {
        let by_id = run(["fields", "show", id, "--format", "json"]).ok();
        let by_file = run(["fields", "show", "--format", "json"])
            .arg(reference_fields(&format!("{id}.toml")))
            .ok();
        assert_eq!(by_id.output.stdout, by_file.output.stdout, "{id}");
    }
}

#[test]
fn setting_reads_published_percentages() {
    // A published table in percent of the framework, without point totals (invented values).
    let sb = Sandbox::new();
    let table = "sample;Qm;Qp;P;K;Lv;Ls;Lm\nPUB-1;20;2;35;5;30;4;4\nPUB-2;96;2;0,5;0,5;0;0,5;0,5\n";
    let counts = sb.write("published.csv", table);
    let v = sb
        .run(["setting"])
        .arg(&counts)
        .args(["--percent", "--format", "json"])
        .ok()
        .json();
    assert_eq!(v[0]["qfl"]["group"], "magmatic arc");
    assert_eq!(v[1]["qfl"]["field"], "craton interior");
}
