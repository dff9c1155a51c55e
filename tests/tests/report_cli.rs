//! `sandprov report` and `sandprov demo`, run as a user would.

use predicates::prelude::*;
use sandprov_tests::{demo_counts, Sandbox};

fn external_references(html: &str) -> Vec<String> {
    // Anything that would make a browser fetch: src/href to a scheme, url(), @import.
    let mut found = Vec::new();
    for needle in [
        "src=\"http",
        "href=\"http",
        "url(",
        "@import",
        "src='http",
        "href='http",
        "<link",
        "<script",
    ] {
        if html.contains(needle) {
            found.push(needle.to_string());
        }
    }
    found
}

#[test]
fn demo_report_holds_every_sample_and_makes_no_external_requests() {
    let sb = Sandbox::new();
    sb.sandprov()
        .arg("demo")
        .assert()
        .success()
        .stdout(predicate::str::contains("sandprov-demo/report.html"));
    let html = std::fs::read_to_string(sb.path("sandprov-demo/report.html")).unwrap();
    let counts = std::fs::read_to_string(demo_counts()).unwrap();
    for line in counts.lines().skip(1) {
        let id = line.split(',').next().unwrap();
        assert!(
            html.contains(&format!("<td>{id}</td>")),
            "{id} missing from the report"
        );
    }
    assert!(
        external_references(&html).is_empty(),
        "{:?}",
        external_references(&html)
    );
    assert!(html.contains("support, and do not replace, petrographic judgement"));
    for f in ["modes.csv", "results.json"] {
        assert!(sb.path("sandprov-demo").join(f).exists(), "{f}");
    }
    let json: serde_json::Value =
        serde_json::from_slice(&std::fs::read(sb.path("sandprov-demo/results.json")).unwrap())
            .unwrap();
    assert_eq!(json["modes"].as_array().unwrap().len(), 40);
}

#[test]
fn report_escapes_user_text() {
    let sb = Sandbox::new();
    sb.write(
        "c.csv",
        "sample,Qm,Qp,P,K,Lv,Ls,Lm,formation\n\"<script>alert(1)</script>\",10,1,2,3,4,5,6,\"<img src=x onerror=alert(2)>\"\n",
    );
    sb.sandprov()
        .args(["report", "c.csv", "-o", "out", "--by", "formation"])
        .assert()
        .success();
    let html = std::fs::read_to_string(sb.path("out/report.html")).unwrap();
    assert!(!html.contains("<script>alert(1)"));
    assert!(!html.contains("<img src=x"));
    assert!(html.contains("&lt;script&gt;alert(1)&lt;/script&gt;"));
    // No --height: no section, and no link to one.
    assert!(!html.contains("href=\"#changes\""));
}

#[test]
fn a_section_too_short_to_search_says_why_and_prints_no_nan() {
    // Three samples are too few for a change between two segments of the minimum size.
    let sb = Sandbox::new();
    sb.write(
        "c.csv",
        "sample,Qm,Qp,P,K,Lv,Ls,Lm,unit,h\n\
         A,200,10,40,20,5,8,4,lower,1\n\
         B,195,12,42,19,6,7,5,lower,2\n\
         C,90,30,20,5,80,30,20,upper,3\n",
    );
    sb.sandprov()
        .args([
            "report", "c.csv", "-o", "out", "--by", "unit", "--height", "h",
        ])
        .assert()
        .success();
    let html = std::fs::read_to_string(sb.path("out/report.html")).unwrap();
    assert!(html.contains("No change-point search: "), "no reason given");
    assert!(!html.contains("NaN"), "a NaN reached the page");
    // p-values read as decimals (three places), not as 9.72e-1: the two near-identical
    // `lower` samples pass the pooling check with a p-value well above 0.001.
    let p = html
        .split_once("df 2, p = ")
        .map(|(_, rest)| &rest[..6])
        .expect("no pooling check of the lower group");
    let b = p.as_bytes();
    assert!(
        b[0] == b'0' && b[1] == b'.' && b[2..5].iter().all(u8::is_ascii_digit) && b[5] == b':',
        "p-value not as three decimals: {p:?}"
    );
    assert!(!html.contains("e-1<"), "p-value in scientific notation");
    // The contents bar links every section the page holds.
    for id in [
        "summary",
        "figures",
        "samples",
        "provenance",
        "groups",
        "changes",
        "methods",
        "cautions",
    ] {
        assert!(
            html.contains(&format!("<a href=\"#{id}\">")),
            "no link to #{id}"
        );
        assert!(
            html.contains(&format!("<h2 id=\"{id}\">")),
            "no section #{id}"
        );
    }
}

#[test]
fn report_refuses_an_unknown_column_and_a_foreign_folder() {
    let sb = Sandbox::new();
    sb.write("c.csv", "sample,Qm,Qp,P,K,Lv,Ls,Lm\nA,10,1,2,3,4,5,6\n");
    sb.sandprov()
        .args(["report", "c.csv", "-o", "out", "--by", "formation"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains(
            "metadata column named \"formation\"",
        ));
    assert!(!sb.path("out").exists());
    std::fs::create_dir(sb.path("mine")).unwrap();
    sb.write("mine/notes.txt", "keep me");
    sb.sandprov()
        .args(["report", "c.csv", "-o", "mine"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("is not a sandprov report folder"));
    assert_eq!(
        std::fs::read_to_string(sb.path("mine/notes.txt")).unwrap(),
        "keep me"
    );
}

#[test]
fn a_refused_table_leaves_no_report() {
    let sb = Sandbox::new();
    sb.write(
        "c.csv",
        "sample,Qm,Qp,P,K,Lv,Ls,Lm\nA,10,1,2,3,4,5,6\nA,1,1,1,1,1,1,1\n",
    );
    sb.sandprov()
        .args(["report", "c.csv", "-o", "out"])
        .assert()
        .code(3);
    assert_eq!(sb.files(), ["c.csv"]);
}

#[test]
fn plot_draws_fields_means_and_sample_regions() {
    let sb = Sandbox::new();
    sb.sandprov()
        .arg("plot")
        .arg(demo_counts())
        .args([
            "--diagram",
            "qfl",
            "--by",
            "formation",
            "--means",
            "--regions",
            "-o",
            "f.svg",
        ])
        .assert()
        .success();
    let svg = std::fs::read_to_string(sb.path("f.svg")).unwrap();
    // Dickinson (1985) QFL field names from the embedded set (names may wrap onto two lines).
    for word in ["craton", "recycled", "dissected", "undissected", "basement"] {
        assert!(svg.contains(word), "{word}");
    }
    assert!(svg.contains("Weltje"));
    let regions = svg
        .split("<g id=\"regions\">")
        .nth(1)
        .unwrap()
        .split("</g>")
        .next()
        .unwrap();
    // 40 sample regions plus 2 per group for 3 groups.
    let outlines = regions.matches("<polyline").count()
        + regions.matches("<path").count()
        + regions.matches("<polygon").count();
    assert!(outlines >= 46, "{outlines} outlines in the regions layer");
    sb.sandprov()
        .arg("plot")
        .arg(demo_counts())
        .args(["--diagram", "qfl", "--fields", "none", "-o", "g.svg"])
        .assert()
        .success();
    assert!(!std::fs::read_to_string(sb.path("g.svg"))
        .unwrap()
        .contains("craton"));
}
