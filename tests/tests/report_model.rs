//! `sandprov report --model` and `sandprov demo --model`, run as a user would: the classifier's
//! probabilities in report.html, classifier.csv, setting.csv and results.json, and the
//! refusals that leave no report folder.
//!
//! The trained-model check compares the report's probabilities with scikit-learn 1.9.1
//! `LogisticRegression` (lbfgs, multinomial; numpy 2.4.6, scipy 1.17.1), computed once by
//! tests/peers/sklearn_logistic.py on the invented table tests/peers/classifier_reference.csv.

use provenance_core::output::column_slug;
use sandprov_tests::{assert_no_file, demo_counts, repo_root, Sandbox};
use serde_json::Value;

const SKLEARN: &str = include_str!("../peers/sklearn_logistic.json");

fn reference_counts() -> std::path::PathBuf {
    repo_root().join("tests/peers/classifier_reference.csv")
}

/// A CSV file as a header and rows of cells.
fn read_csv(path: &std::path::Path) -> (Vec<String>, Vec<Vec<String>>) {
    let mut r = csv::Reader::from_path(path).unwrap();
    let header = r.headers().unwrap().iter().map(String::from).collect();
    let rows = r
        .records()
        .map(|x| x.unwrap().iter().map(String::from).collect())
        .collect();
    (header, rows)
}

/// The class probabilities of every row (columns `classifier_p_*`), checked to sum to 1
/// within the rounding of four decimals, with `classifier_top` and `classifier_top_p` the
/// largest of them.
fn checked_probabilities(header: &[String], rows: &[Vec<String>]) -> Vec<Vec<f64>> {
    let cols: Vec<usize> = (0..header.len())
        .filter(|i| header[*i].starts_with("classifier_p_"))
        .collect();
    assert!(cols.len() >= 2, "{header:?}");
    let top = header.iter().position(|h| h == "classifier_top").unwrap();
    let top_p = header.iter().position(|h| h == "classifier_top_p").unwrap();
    rows.iter()
        .map(|r| {
            let p: Vec<f64> = cols.iter().map(|i| r[*i].parse().unwrap()).collect();
            let sum: f64 = p.iter().sum();
            // Each of k cells is rounded to 4 decimals: at most k * 0.00005 off.
            assert!(
                (sum - 1.0).abs() <= cols.len() as f64 * 5e-5 + 1e-12,
                "{}: probabilities sum to {sum}",
                r[0]
            );
            let best = (0..p.len()).max_by(|a, b| p[*a].total_cmp(&p[*b])).unwrap();
            assert_eq!(r[top_p].parse::<f64>().unwrap(), p[best], "{}", r[0]);
            assert_eq!(
                header[cols[best]],
                format!("classifier_p_{}", column_slug(&r[top])),
                "{}",
                r[0]
            );
            p
        })
        .collect()
}

/// The classifier section of report.html.
fn classifier_section(html: &str) -> &str {
    let start = html
        .find("<h2 id=\"classifier\">")
        .expect("the report has a classifier section");
    let rest = &html[start..];
    let end = rest[4..].find("<h2").map_or(rest.len(), |i| i + 4);
    &rest[..end]
}

#[test]
fn report_with_a_default_model_id_shows_the_classifier_for_every_sample() {
    let sb = Sandbox::new();
    // The id comes from the list of embedded field sets, as a user would find it.
    let list = sb.run(["fields", "list"]).ok().stdout();
    let id = list
        .lines()
        .filter_map(|l| l.split_whitespace().next())
        .find(|id| id.starts_with("dickinson") && id.ends_with("-qfl"))
        .expect("an embedded QFL field set");
    assert_eq!(id, "dickinson1985-qfl");
    sb.run(["report"])
        .arg(demo_counts())
        .args(["-o", "out", "--model", id, "--quiet"])
        .ok();
    let html = sb.read("out/report.html");
    assert!(html.contains("<a href=\"#classifier\">Classifier</a>"));
    let section = classifier_section(&html);
    let counts = std::fs::read_to_string(demo_counts()).unwrap();
    let ids: Vec<&str> = counts
        .lines()
        .skip(1)
        .map(|l| l.split(',').next().unwrap())
        .collect();
    assert_eq!(ids.len(), 40);
    for id in &ids {
        assert!(
            section.contains(&format!("<td>{id}</td>")),
            "{id} missing from the classifier section"
        );
    }
    assert!(section.contains("not independent evidence of setting"));
    assert!(html.contains("<dt>classifier</dt>"));
    assert!(html.contains("<h3>Classifier model</h3>"));
    // The citations of the method (Cox 1958; Weltje 2006; Egozcue et al. 2003).
    assert!(html.contains("Cox, D.R. (1958)") && html.contains("Special Publications 264:79-99"));
    assert!(html.contains("href=\"#classifier\""));

    let (header, rows) = read_csv(&sb.path("out/classifier.csv"));
    assert_eq!(rows.len(), 40);
    let p = checked_probabilities(&header, &rows);
    assert_eq!(p[0].len(), 7, "one probability per QFL field");
    // The default model is a smooth version of the fields: for samples deep inside a field
    // (membership 1 under counting error) it names the same field.
    let agrees = header.iter().position(|h| h == "agrees").unwrap();
    let placement = header.iter().position(|h| h == "placement").unwrap();
    let compared = header.iter().position(|h| h == "compared_with").unwrap();
    assert!(rows
        .iter()
        .all(|r| r[compared] == "QFL field (dickinson1985-qfl)"));
    let top = header.iter().position(|h| h == "classifier_top").unwrap();
    for r in &rows {
        assert_eq!(r[agrees], (r[top] == r[placement]).to_string(), "{}", r[0]);
    }

    // setting.csv carries the same probabilities, as `sandprov setting --model` writes them.
    let (sh, srows) = read_csv(&sb.path("out/setting.csv"));
    let sp = checked_probabilities(&sh, &srows);
    assert_eq!(sp, p);

    let json = sb.read_json("out/results.json");
    let block = &json["classifier"];
    assert_eq!(block["model"], "default model of dickinson1985-qfl");
    assert_eq!(block["source"]["default_model_of"], "dickinson1985-qfl");
    assert_eq!(block["classes"].as_array().unwrap().len(), 7);
    assert_eq!(block["features"]["composition"], "qfl");
    let checksum = block["checksum"].as_str().unwrap();
    assert!(checksum.starts_with("sha256:") && html.contains(checksum));
    let predicted: u64 = block["predicted"]
        .as_object()
        .unwrap()
        .values()
        .map(|v| v.as_u64().unwrap())
        .sum();
    assert_eq!(predicted, 40);
    assert_eq!(block["samples"].as_array().unwrap().len(), 40);
    for (i, s) in json["setting"].as_array().unwrap().iter().enumerate() {
        let probs = s["classifier"]["probabilities"].as_object().unwrap();
        assert_eq!(probs.len(), 7);
        let sum: f64 = probs.values().map(|v| v.as_f64().unwrap()).sum();
        assert!((sum - 1.0).abs() < 7.0 * 5e-5, "{sum}");
        assert_eq!(block["samples"][i]["sample"], s["sample"]);
    }
}

#[test]
fn report_with_a_trained_model_reproduces_scikit_learn() {
    let sb = Sandbox::new();
    sb.run(["train"])
        .arg(reference_counts())
        .args(["--label", "group", "--diagram", "framework", "--l2", "1"])
        .args(["--folds", "3", "-o", "model.json"])
        .env("SOURCE_DATE_EPOCH", "1735689600")
        .ok();
    sb.run(["report"])
        .arg(reference_counts())
        .args(["-o", "out", "--model", "model.json", "--by", "group"])
        .ok()
        .stdout_has(&["out/report.html"]);
    let (header, rows) = read_csv(&sb.path("out/classifier.csv"));
    let got = checked_probabilities(&header, &rows);
    let v: Value = serde_json::from_str(SKLEARN).unwrap();
    assert_eq!(v["versions"]["scikit-learn"], "1.9.1");
    let case = v["cases"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["name"] == "framework C=1")
        .unwrap();
    let want = case["probabilities"].as_array().unwrap();
    assert_eq!(got.len(), want.len());
    for (g, w) in got.iter().zip(want) {
        for (a, b) in g.iter().zip(w.as_array().unwrap()) {
            // Four decimals in the CSV; the fit itself agrees to about 3e-6.
            assert!((a - b.as_f64().unwrap()).abs() < 1e-4, "{a} vs {b}");
        }
    }
    let html = sb.read("out/report.html");
    let section = classifier_section(&html);
    for r in &rows {
        assert!(section.contains(&format!("<td>{}</td>", r[0])), "{}", r[0]);
    }
    // Its own labels are neither fields nor groups: no comparison is claimed.
    assert!(html.contains("not compared with the field placement"));
    assert!(section.contains("describes its training data"));
    // The method note shows the model's own metadata: date, source, cross-validation.
    assert!(html.contains("2025-01-01"));
    assert!(html.contains("label column &quot;group&quot;"));
    assert!(html.contains("3-fold: accuracy"));
    let json = sb.read_json("out/results.json");
    assert_eq!(json["classifier"]["source"]["file"], "model.json");
    assert_eq!(json["classifier"]["compared_with"], Value::Null);
    assert_eq!(json["classifier"]["training"]["samples"], 90);
}

#[test]
fn a_model_of_provenance_groups_is_compared_with_the_field_group() {
    let sb = Sandbox::new();
    // The invented reference table relabelled with provenance group names.
    let table = std::fs::read_to_string(reference_counts())
        .unwrap()
        .replace(",class-a,", ",continental block,")
        .replace(",class-b,", ",magmatic arc,")
        .replace(",class-c,", ",recycled orogen,");
    sb.write("groups.csv", table);
    sb.run([
        "train",
        "groups.csv",
        "--label",
        "group",
        "--diagram",
        "qfl",
    ])
    .args(["--folds", "0", "-o", "groups-model.json"])
    .ok();
    sb.run(["demo", "-q", "-o", "out", "--model", "groups-model.json"])
        .ok();
    let (header, rows) = read_csv(&sb.path("out/classifier.csv"));
    checked_probabilities(&header, &rows);
    let col = |name: &str| header.iter().position(|h| h == name).unwrap();
    let groups = [
        "continental block",
        "magmatic arc",
        "recycled orogen",
        "mixed",
    ];
    for r in &rows {
        assert_eq!(
            r[col("compared_with")],
            "QFL provenance group (dickinson1985-qfl)"
        );
        assert!(groups.contains(&r[col("placement")].as_str()), "{r:?}");
        assert_eq!(
            r[col("agrees")],
            (r[col("classifier_top")] == r[col("placement")]).to_string()
        );
    }
    let html = sb.read("out/report.html");
    assert!(html.contains("QFL provenance group (dickinson1985-qfl)"));
}

#[test]
fn refused_models_leave_no_report_folder() {
    let sb = Sandbox::new();
    sb.run(["train"])
        .arg(reference_counts())
        .args(["--label", "group", "--diagram", "qmpk", "--folds", "0"])
        .args(["-o", "qmpk.json"])
        .ok();
    // Invented: no Qm, P or K in any sample, so QmPK has no data.
    sb.write(
        "no-qmpk.csv",
        "sample,Qm,Qp,P,K,Lv,Ls,Lm\nX-1,0,40,0,0,30,20,10\nX-2,0,35,0,0,25,30,10\n",
    );
    // `sandprov report no-qmpk.csv -o out --model MODEL` is refused and leaves no file.
    let refuse = |model: &str, code: i32, needles: &[&str]| {
        let before = sb.files();
        sb.run(["report", "no-qmpk.csv", "-o", "out", "--model", model])
            .refused(code, needles);
        assert_eq!(sb.files(), before, "--model {model} left files behind");
    };
    // A model for a diagram with no data, file and embedded id alike.
    refuse(
        "qmpk.json",
        3,
        &["qmpk.json", "no sample of", "qmpk composition (Qm, P, K)"],
    );
    refuse(
        "dickinson-suczek1979-qmpk",
        3,
        &["default model of dickinson-suczek1979-qmpk", "qfl"],
    );
    // A corrupt model file.
    sb.write(
        "broken.json",
        "{\"format\": \"sandprov-model\", \"version\": 2,",
    );
    refuse("broken.json", 3, &["broken.json, line 1", "not valid JSON"]);
    // A model whose content no longer matches its checksum (one class renamed, still in
    // sorted order so that only the checksum can tell).
    let text = std::fs::read_to_string(sb.path("qmpk.json")).unwrap();
    assert!(text.contains("\"class-b\""));
    sb.write("edited.json", text.replace("\"class-b\"", "\"class-bb\""));
    // The refusal points at the checksum key, the last of the file.
    let line = 1 + text
        .lines()
        .position(|l| l.starts_with("  \"checksum\""))
        .expect("a checksum key");
    let checksum_at =
        format!("edited.json, line {line}, column 3 (\"checksum\"): key \"checksum\"");
    refuse("edited.json", 3, &[&checksum_at, "an unaltered model file"]);
    // Neither a file nor an embedded id.
    refuse("missing.json", 4, &["cannot read missing.json"]);
    // The model file as the output.
    sb.write(
        "ok.csv",
        "sample,Qm,Qp,P,K,Lv,Ls,Lm\nA,300,10,30,20,10,10,20\n",
    );
    let before = sb.files();
    let model = std::fs::read(sb.path("qmpk.json")).unwrap();
    sb.run([
        "report",
        "ok.csv",
        "-o",
        "qmpk.json",
        "--model",
        "qmpk.json",
    ])
    .refused(2, &["qmpk.json is also an input"]);
    assert_eq!(sb.files(), before);
    assert_eq!(std::fs::read(sb.path("qmpk.json")).unwrap(), model);
    // A model inside an earlier report folder that would be replaced.
    sb.run(["report", "ok.csv", "-o", "old", "-q"]).ok();
    std::fs::copy(sb.path("qmpk.json"), sb.path("old/qmpk.json")).unwrap();
    sb.run(["report", "ok.csv", "-o", "old", "--model", "old/qmpk.json"])
        .refused(2, &["is also an input"]);
    assert_eq!(std::fs::read(sb.path("old/qmpk.json")).unwrap(), model);
    assert_no_file(sb.path("old/classifier.csv"));
    // demo refuses the same way.
    sb.run(["demo", "-o", "d", "--model", "edited.json"])
        .refused(3, &["edited.json"]);
    assert_no_file(sb.path("d"));
}
