//! `sandprov name` through the real binary. The expected names are derived from the published
//! rules: Folk (1980) classes (from memory, high confidence), Garzanti (2019, Earth-Sci. Rev.
//! 192:545-563; checked), Pettijohn, Potter & Siever (1987; from memory). Sample ids are
//! invented.

use sandprov_tests::{assert_no_file, demo_counts, Sandbox};
use serde_json::Value;
use std::fs;

// Derivations (Qm, Qp, C, P, K, Lv, Ls, Lm; matrix):
// T-1: Q (Folk, no chert) 270/300 = 90%, R = C = 30 > F = 0: sublitharenite. Garzanti, chert in
//      Q: Q 100%: quartzose. Matrix 10/310 = 3.2%, Q 100%: quartz arenite.
// T-2: Folk Q 66/300 = 22%, F/R = 24/210 = 0.11 < 1/3: litharenite, Lv 150 of R 210: volcanic
//      arenite. Garzanti Q 23.3%, F 8.0%, L 68.7%: quartzo-lithic. Matrix 120/420 = 28.6%
//      (wacke), Q 23.3% < 95, R > F: lithic greywacke.
// T-3: Folk Q 150/300 = 50%, F/R = 130/20 = 6.5 > 3: arkose (K 70 > P 60: K-feldspar arkose).
//      Garzanti Q 50%, F 43.3%, L 6.7% (left out): feldspatho-quartzose. Matrix 0: arenite,
//      Q 50% < 75, F > R: arkosic arenite.
const COUNTS: &str = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,matrix,formation,height_m\n\
T-1,270,0,30,0,0,0,0,0,10,Invented Lower Fm,12.5\n\
T-2,60,6,4,20,4,150,30,26,120,Invented Upper Fm,80\n\
T-3,140,10,0,60,70,8,6,6,0,Invented Upper Fm,95\n";

#[test]
fn json_names_every_sample_under_three_schemes() {
    let sb = Sandbox::new();
    let input = sb.write("counts.csv", COUNTS);
    let v = sb
        .run(["name"])
        .arg(&input)
        .args(["--format", "json"])
        .ok()
        .json();
    let names: Vec<[&str; 3]> = v
        .as_array()
        .unwrap()
        .iter()
        .map(|s| {
            [
                s["folk"].as_str().unwrap(),
                s["garzanti"].as_str().unwrap(),
                s["pettijohn"].as_str().unwrap(),
            ]
        })
        .collect();
    assert_eq!(
        names,
        [
            ["sublitharenite", "quartzose", "quartz arenite"],
            ["litharenite", "quartzo-lithic", "lithic greywacke"],
            ["arkose", "feldspatho-quartzose", "arkosic arenite"],
        ]
    );
    assert_eq!(v[1]["basis"]["folk"]["subtype"]["name"], "volcanic arenite");
    assert_eq!(
        v[2]["basis"]["folk"]["subtype"]["name"],
        "K-feldspar arkose"
    );
    assert_eq!(v[1]["basis"]["pettijohn"]["measures"]["matrix"], 28.57);
    assert_eq!(
        v[0]["basis"]["folk"]["poles"]["R"]["categories"],
        serde_json::json!(["C", "Lv", "Ls", "Lm"])
    );
    assert_eq!(v[0]["metadata"]["formation"], "Invented Lower Fm");
    assert_eq!(v[0]["metadata"]["height_m"], "12.5");
}

#[test]
fn csv_without_matrix_gives_null_pettijohn_with_the_reason() {
    let sb = Sandbox::new();
    let input = sb.write(
        "counts.csv",
        "sample,Qm,Qp,C,P,K,Lv,Ls,Lm\nT-4,230,10,0,25,20,5,5,5\n",
    );
    let out = sb.run(["name"]).arg(&input).ok();
    let mut r = csv::Reader::from_reader(out.output.stdout.as_slice());
    let h = r.headers().unwrap().clone();
    let row = r.records().next().unwrap().unwrap();
    let col = |n: &str| h.iter().position(|x| x == n).unwrap();
    // Q 240/300 = 80%, F 45 > R 15: subarkose (Folk 1980).
    assert_eq!(&row[col("folk")], "subarkose");
    assert_eq!(&row[col("folk_Q")], "80.00");
    assert_eq!(&row[col("pettijohn")], "");
    assert!(row[col("pettijohn_rule")].contains("no matrix column"));
    assert_eq!(&row[col("pettijohn_matrix")], "");
}

#[test]
fn explain_writes_poles_and_rules_in_words() {
    let sb = Sandbox::new();
    let input = sb.write("counts.csv", COUNTS);
    let out = sb.path("names.txt");
    let ran = sb
        .run(["name"])
        .arg(&input)
        .args(["--explain", "-o"])
        .arg(&out)
        .ok();
    assert_eq!(ran.stdout(), "");
    let text = fs::read_to_string(&out).unwrap();
    assert!(text.contains("T-2 (line 3)\n  Folk (1980): litharenite; subtype volcanic arenite\n"));
    assert!(text.contains("R 70.0% (C + Lv + Ls + Lm, 210 points)"));
    assert!(text.contains("F/R is 0.11, below 1/3: litharenite"));
    assert!(text.contains("matrix is 28.6% of framework plus matrix, from 15% to 75%: a wacke"));
    assert!(text.contains("do not replace, the petrographer's"));
}

#[test]
fn explain_refuses_a_format() {
    let sb = Sandbox::new();
    let input = sb.write("counts.csv", COUNTS);
    sb.run(["name"])
        .arg(&input)
        .args(["--explain", "--format", "json"])
        .refused(2, &[]);
}

/// The chert-placement check through the command line: Qm 270 and chert 30 is a
/// sublitharenite under Folk's rule (chert in R) and a quartzarenite with chert counted as Q.
#[test]
fn chert_option_moves_chert() {
    let sb = Sandbox::new();
    let input = sb.write("counts.csv", COUNTS);
    let run = |extra: &[&str]| -> Value {
        sb.run(["name"])
            .arg(&input)
            .args(["--format", "json"])
            .args(extra)
            .ok()
            .json()
    };
    assert_eq!(run(&[])[0]["folk"], "sublitharenite");
    let v = run(&["--chert", "folk=quartz", "--chert", "garzanti=lithic"]);
    assert_eq!(v[0]["folk"], "quartzarenite");
    assert_eq!(v[0]["basis"]["folk"]["chert"], "quartz");
    // Garzanti with chert in L: Q 90%, L 10% exactly (not above 10%): still quartzose.
    assert_eq!(v[0]["garzanti"], "quartzose");
    assert_eq!(v[0]["basis"]["garzanti"]["poles"]["L"]["percent"], 10.0);
    sb.run(["name"])
        .arg(&input)
        .args(["--chert", "dott=quartz"])
        .refused(2, &["unknown naming scheme \"dott\""]);
    sb.run(["name"])
        .arg(&input)
        .args(["--chert", "folk=rock"])
        .refused(2, &["quartz, lithic or omit"]);
}

#[test]
fn bad_input_is_refused_and_nothing_is_written() {
    let sb = Sandbox::new();
    let input = sb.write("counts.csv",
        "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,matrix\nT-1,270,0,30,0,0,0,0,0,10\nT-2,60,6,4,x,4,150,30,26,120\n",
    );
    let out = sb.path("names.csv");
    sb.run(["name"])
        .arg(&input)
        .arg("-o")
        .arg(&out)
        .refused(3, &["line 3, column 5 (\"P\")", "\"x\""]);
    assert_no_file(&out);
    assert_eq!(sb.files(), ["counts.csv"], "no partial file left");
}

#[test]
fn output_over_the_input_is_refused() {
    let sb = Sandbox::new();
    let input = sb.write("counts.csv", COUNTS);
    sb.run(["name"])
        .arg(&input)
        .arg("-o")
        .arg(&input)
        .refused(2, &[]);
    assert_eq!(fs::read_to_string(&input).unwrap(), COUNTS);
}

#[test]
fn mapping_and_percent_mode_give_the_same_names() {
    let sb = Sandbox::new();
    // T-2 again, its volcanic lithics split in two lab columns, and as percentages of the
    // framework with matrix in the same basis (120 points of 300 framework = 40%).
    let lab = sb.write(
        "lab.csv",
        "Slide;Qm;Qp;C;P;K;Lv felsitic;Lv microlitic;Ls;Lm;matrix\n\
         T-2;20;2;1,3333;6,6667;1,3333;30;20;10;8,6667;40\n",
    );
    let map = sb.write(
        "map.toml",
        "id = \"Slide\"\n[categories]\nLv = [\"Lv felsitic\", \"Lv microlitic\"]\n",
    );
    let v = sb
        .run(["name"])
        .arg(&lab)
        .arg("--scheme")
        .arg(&map)
        .args(["--percent", "--format", "json"])
        .ok()
        .json();
    assert_eq!(v[0]["sample"], "T-2");
    assert_eq!(v[0]["folk"], "litharenite");
    assert_eq!(v[0]["garzanti"], "quartzo-lithic");
    assert_eq!(v[0]["pettijohn"], "lithic greywacke");
    assert_eq!(v[0]["basis"]["folk"]["subtype"]["name"], "volcanic arenite");
}

/// The bundled demo (invented data): every sample gets a name under each scheme, since the demo
/// counts matrix; the names follow the demo's up-section change from volcanic-lithic arc sand to
/// quartz-rich recycled sand.
#[test]
fn demo_is_named_throughout() {
    let sb = Sandbox::new();
    let v = sb
        .run(["name", "--format", "json"])
        .arg(demo_counts())
        .ok()
        .json();
    let samples = v.as_array().unwrap();
    assert_eq!(samples.len(), 40);
    for s in samples {
        for scheme in ["folk", "garzanti", "pettijohn"] {
            assert!(
                s[scheme].is_string(),
                "{} {scheme}: {}",
                s["sample"],
                s["basis"][scheme]
            );
        }
        assert!(s["metadata"]["formation"].is_string());
    }
    let first = &samples[0];
    assert_eq!(first["metadata"]["formation"], "Tarn Hollow Formation");
    // KB-001: Folk Q 20 of 394 = 5.1%, F/R = 171/203 = 0.84: feldspathic litharenite.
    assert_eq!(first["folk"], "feldspathic litharenite");
}
