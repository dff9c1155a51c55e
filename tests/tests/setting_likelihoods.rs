//! `sandprov setting` with likelihoods: membership under counting error per diagram, the
//! provenance-group summary, and a classifier, run as the real binary. Sample data are
//! invented; the shipped field vertices are from memory, unverified, so the checks here are of
//! the calculation (probabilities sum to 1, determinism, sharpening), not of boundary positions.

use sandprov_tests::{repo_root, Sandbox};
use serde_json::Value;
use std::path::Path;

/// Invented counts: a quartz arenite deep in craton interior, an arc sand, a recycled sand,
/// one with only 2 points of L, and the same proportions as INV-03 counted with 4 times the
/// points.
const COUNTS: &str = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,formation
INV-01,388,4,2,3,1,0,1,1,Upper
INV-02,30,4,2,110,20,210,6,18,Lower
INV-03,160,30,20,10,5,10,50,45,Middle
INV-04,150,10,0,60,30,2,0,0,Middle
INV-05,640,120,80,40,20,40,200,180,Middle
";

/// Split one CSV line, honouring double quotes.
fn cells(line: &str) -> Vec<String> {
    let (mut out, mut cur, mut quoted) = (Vec::new(), String::new(), false);
    let mut chars = line.chars().peekable();
    while let Some(c) = chars.next() {
        match (c, quoted) {
            ('"', true) if chars.peek() == Some(&'"') => {
                cur.push('"');
                chars.next();
            }
            ('"', _) => quoted = !quoted,
            (',', false) => out.push(std::mem::take(&mut cur)),
            _ => cur.push(c),
        }
    }
    out.push(cur);
    out
}

fn run_json(args: &[&str], counts: &Path) -> Value {
    sandprov_tests::run(["setting"])
        .arg(counts)
        .args(["--format", "json"])
        .args(args)
        .ok()
        .json()
}

#[test]
fn every_diagram_gets_membership_summing_to_one() {
    let sb = Sandbox::new();
    let counts = sb.write("counts.csv", COUNTS);
    let v = run_json(&[], &counts);
    for row in v.as_array().unwrap() {
        for d in ["qfl", "qmflt", "qmpk", "qplvlsm"] {
            let m = row[d]["membership"].as_object().unwrap();
            assert!(m.contains_key("outside"));
            let s: f64 = m.values().map(|p| p.as_f64().unwrap()).sum();
            assert!((s - 1.0).abs() < 2e-3, "{} {d}: {s}", row["sample"]);
            let top = &row[d]["top"];
            let p = top["probability"].as_f64().unwrap();
            assert_eq!(row[d]["ambiguous"], Value::Bool(p < 0.95));
            let curve = row[d]["region95"]["curve"].as_array().unwrap();
            assert_eq!(curve.first(), curve.last());
        }
        let sum = &row["provenance_summary"];
        assert!(sum["top"]["qfl"]["group"].is_string());
        assert!(sum["qfl_qmflt_disagree"].is_boolean());
    }
    let quartz = &v[0];
    assert_eq!(quartz["qfl"]["top"]["field"], "craton interior");
    assert!(
        quartz["qfl"]["membership"]["craton interior"]
            .as_f64()
            .unwrap()
            > 0.99
    );
    assert_eq!(
        quartz["provenance_summary"]["top"]["qfl"]["group"],
        "continental block"
    );
    // Whole counts are never sampled: bounded, or integrated (INV-04's 2 points of L too).
    assert_eq!(v[3]["qfl"]["membership_error"]["method"], "integrated");
    for row in v.as_array().unwrap() {
        let method = row["qfl"]["membership_error"]["method"].as_str().unwrap();
        assert!(method == "bound" || method == "integrated", "{method}");
    }
}

/// Published percentages with the points counted: estimated, fractional counts. P-1 has
/// 0.9% of 350 points of L (3.15 points, fractional and few: sampled); P-2's counts come out
/// whole (integrated).
const PERCENTS: &str = "sample,Qm,Qp,P,K,Lv,Ls,Lm,n
P-1,60,2,20,17.1,0.3,0.3,0.3,350
P-2,40,10,20,10,10,5,5,400
";

#[test]
fn more_points_sharpen_the_top_probability() {
    let sb = Sandbox::new();
    let counts = sb.write("counts.csv", COUNTS);
    let v = run_json(&[], &counts);
    // INV-05 is INV-03 counted four times over.
    for d in ["qfl", "qmflt"] {
        let (few, many) = (&v[2][d]["top"], &v[4][d]["top"]);
        assert_eq!(few["field"], many["field"]);
        assert!(
            many["probability"].as_f64().unwrap() >= few["probability"].as_f64().unwrap(),
            "{d}"
        );
    }
}

#[test]
fn same_seed_gives_identical_bytes_whatever_the_threads() {
    let sb = Sandbox::new();
    let counts = sb.write("percents.csv", PERCENTS);
    let run = |threads: &str, seed: &str| {
        sb.run(["setting"])
            .arg(&counts)
            .args([
                "--percent",
                "--format",
                "json",
                "--draws",
                "2000",
                "--seed",
                seed,
            ])
            .env("RAYON_NUM_THREADS", threads)
            .ok()
            .output
            .stdout
    };
    let a = run("1", "7");
    assert!(a == run("2", "7"), "one and two threads differ");
    assert!(a == run("1", "7"), "two runs differ");
    // Another seed moves the sampled memberships (P-1's QFL) only.
    let b = run("2", "8");
    assert!(a != b, "the seed has no effect");
    let (va, vb): (Value, Value) = (
        serde_json::from_slice(&a).unwrap(),
        serde_json::from_slice(&b).unwrap(),
    );
    assert_eq!(va[0]["qfl"]["membership_error"]["method"], "sampled");
    assert_eq!(va[0]["qfl"]["membership_error"]["draws"], 2000);
    // Only sampled memberships may change with the seed.
    for (ra, rb) in va.as_array().unwrap().iter().zip(vb.as_array().unwrap()) {
        for d in ["qfl", "qmflt", "qmpk", "qplvlsm"] {
            if ra[d]["membership_error"]["method"] != "sampled" {
                assert!(ra[d] == rb[d], "{} {d} changed with the seed", ra["sample"]);
            }
        }
    }
    assert_eq!(va[1]["qfl"]["membership_error"]["method"], "integrated");
}

#[test]
fn percentages_without_points_get_no_membership() {
    let sb = Sandbox::new();
    let table = "sample;Qm;Qp;P;K;Lv;Ls;Lm\nPUB-1;20;2;35;5;30;4;4\n";
    let counts = sb.write("published.csv", table);
    let v = run_json(&["--percent"], &counts);
    assert!(v[0]["qfl"]["field"].is_string());
    assert_eq!(v[0]["qfl"]["membership"], Value::Null);
    assert!(v[0]["qfl"]["membership_note"]
        .as_str()
        .unwrap()
        .contains("points unknown"));
    assert_eq!(
        v[0]["provenance_summary"]["qfl_qmflt_disagree"],
        Value::Null
    );
}

#[test]
fn a_trained_model_and_a_default_model_add_classifier_probabilities() {
    let sb = Sandbox::new();
    let counts = sb.write("counts.csv", COUNTS);
    let model = sb.path("model.json");
    let reference = repo_root().join("tests/peers/classifier_reference.csv");
    sb.run(["train"])
        .arg(&reference)
        .args([
            "--label",
            "group",
            "--diagram",
            "framework",
            "--folds",
            "0",
            "-o",
        ])
        .arg(&model)
        .ok()
        .stdout_has(&["cross-validation skipped"]);
    let v = run_json(&["--model", model.to_str().unwrap()], &counts);
    let c = &v[0]["classifier"];
    assert_eq!(c["composition"], "framework");
    let s: f64 = c["probabilities"]
        .as_object()
        .unwrap()
        .values()
        .map(|p| p.as_f64().unwrap())
        .sum();
    assert!((s - 1.0).abs() < 1e-3);
    // INV-01 has no Lv: with the points known, the zero is replaced and the model applies.
    assert!(c["probabilities"]["class-a"].is_number());

    let v = run_json(&["--model", "dickinson1985-qfl"], &counts);
    let c = &v[0]["classifier"];
    assert_eq!(c["model"], "default model of dickinson1985-qfl");
    assert!(c["note"]
        .as_str()
        .unwrap()
        .contains("smooth version of the published fields"));
    let p = c["probabilities"].as_object().unwrap();
    let top = p
        .iter()
        .max_by(|a, b| a.1.as_f64().unwrap().total_cmp(&b.1.as_f64().unwrap()))
        .unwrap();
    assert_eq!(top.0, "craton interior");

    // A broken model file is refused, naming the file and the key.
    let bad = sb.write(
        "bad.json",
        sb.read("model.json")
            .replace("\"intercepts\"", "\"intercept\""),
    );
    sb.run(["setting"])
        .arg(&counts)
        .arg("--model")
        .arg(&bad)
        .refused(3, &["bad.json", "intercept"]);
}

#[test]
fn csv_has_membership_columns_and_no_membership_leaves_them_out() {
    let sb = Sandbox::new();
    let counts = sb.write("counts.csv", COUNTS);
    let text = sb.run(["setting"]).arg(&counts).ok().stdout();
    let header = cells(text.lines().next().unwrap());
    let header: Vec<&str> = header.iter().map(String::as_str).collect();
    for col in [
        "qfl_p_craton_interior",
        "qfl_p_outside",
        "qfl_top",
        "qfl_top_p",
        "qfl_ambiguous",
        "qmflt_top_group",
        "qfl_qmflt_disagree",
    ] {
        assert!(header.contains(&col), "{col}");
    }
    assert_eq!(header.last(), Some(&"caution"));
    let row = cells(text.lines().nth(1).unwrap());
    assert_eq!(row.len(), header.len());
    let i = header.iter().position(|h| *h == "qfl_top").unwrap();
    assert_eq!(row[i], "craton interior");

    let text = sb
        .run(["setting"])
        .arg(&counts)
        .arg("--no-membership")
        .ok()
        .stdout();
    assert!(!text.lines().next().unwrap().contains("qfl_p_"));
}
