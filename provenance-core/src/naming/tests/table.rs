//! The names table: CSV shape, JSON shape, explanation, and a lab's own scheme.

use super::{counts, with_matrix};
use crate::counts::Sample;
use crate::input::{CountReader, ReadOptions};
use crate::naming::{write_names, NamesOutput, Naming, NamingScheme, Poles, SchemeSet, Verdict};
use crate::output::Format;

fn run(table: &str, schemes: &SchemeSet, output: NamesOutput) -> String {
    let r = CountReader::from_reader(
        "t.csv",
        std::io::Cursor::new(table.as_bytes().to_vec()),
        ReadOptions::default(),
    )
    .unwrap();
    let mut out = Vec::new();
    write_names(r, &mut out, "out", schemes, output).unwrap();
    String::from_utf8(out).unwrap()
}

const TABLE: &str = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,matrix,formation\n\
    A-1,270,0,30,0,0,0,0,0,10,\"Lower, red\"\n\
    A-2,60,6,4,20,4,150,30,26,120,Upper\n\
    A-3,0,0,0,0,0,0,0,0,5,Upper\n";

#[test]
fn csv_rows_have_as_many_cells_as_the_header() {
    let set = SchemeSet::standard();
    let text = run(TABLE, &set, NamesOutput::Table(Format::Csv));
    let mut rdr = csv::Reader::from_reader(text.as_bytes());
    let header = rdr.headers().unwrap().clone();
    assert_eq!(&header[0], "sample");
    assert_eq!(&header[1], "formation");
    let rows: Vec<csv::StringRecord> = rdr.records().map(|r| r.unwrap()).collect();
    assert_eq!(rows.len(), 3);
    for row in &rows {
        assert_eq!(row.len(), header.len());
    }
    let col = |name: &str| header.iter().position(|h| h == name).unwrap();
    assert_eq!(&rows[0][1], "Lower, red");
    assert_eq!(&rows[0][col("folk")], "sublitharenite");
    assert_eq!(&rows[0][col("folk_Q")], "90.00");
    assert_eq!(&rows[1][col("folk_subtype")], "volcanic arenite");
    assert_eq!(&rows[1][col("pettijohn")], "lithic greywacke");
    assert_eq!(&rows[1][col("pettijohn_matrix")], "28.57");
    assert_eq!(&rows[1][col("folk_F_R")], "0.1143");
    // The empty framework: blank names, reasons in the rule columns, blank poles.
    assert_eq!(&rows[2][col("folk")], "");
    assert!(rows[2][col("folk_rule")].contains("no framework grains"));
    assert_eq!(&rows[2][col("garzanti_Q")], "");
}

#[test]
fn json_follows_the_interface() {
    let set = SchemeSet::standard();
    let text = run(TABLE, &set, NamesOutput::Table(Format::Json));
    let v: serde_json::Value = serde_json::from_str(&text).unwrap();
    let a = &v[0];
    // Key order as written (serde_json's Value sorts keys, so read the text).
    let line = text.lines().nth(1).unwrap();
    let at = |k: &str| line.find(&format!("\"{k}\":")).unwrap();
    let order = [
        "sample",
        "folk",
        "garzanti",
        "pettijohn",
        "basis",
        "metadata",
    ]
    .map(at);
    assert!(order.windows(2).all(|w| w[0] < w[1]), "{line}");
    assert_eq!(a.as_object().unwrap().len(), 6);
    assert_eq!(a["sample"], "A-1");
    assert_eq!(a["folk"], "sublitharenite");
    assert_eq!(a["basis"]["folk"]["chert"], "lithic");
    assert_eq!(a["basis"]["folk"]["subtype"], serde_json::Value::Null);
    assert_eq!(a["basis"]["folk"]["poles"]["R"]["amount"], 30);
    assert_eq!(a["basis"]["pettijohn"]["measures"]["matrix"], 3.23);
    assert_eq!(a["metadata"]["formation"], "Lower, red");
    let b = &v[1];
    assert_eq!(b["basis"]["folk"]["subtype"]["name"], "volcanic arenite");
    let c = &v[2];
    assert_eq!(c["folk"], serde_json::Value::Null);
    assert!(c["basis"]["folk"]["reason"]
        .as_str()
        .unwrap()
        .contains("no framework grains"));
    assert_eq!(c["basis"]["folk"]["poles"], serde_json::Value::Null);
}

#[test]
fn explanation_gives_poles_and_rules_per_sample() {
    let set = SchemeSet::standard();
    let text = run(TABLE, &set, NamesOutput::Explain);
    assert!(text.starts_with("Sandstone names by published rules"));
    assert!(text.contains("A-1 (line 2)\n  Folk (1980): sublitharenite\n    poles: Q 90.0% (Qm + Qp, 270 points), F 0.0% (P + K, 0 points), R 10.0% (C + Lv + Ls + Lm, 30 points); F/R 0.00\n    rule: Q is 90.0% of Q + F + R, from 75% up to but not including 95%, and R (10.0%) exceeds F (0.0%): sublitharenite\n"), "{text}");
    assert!(text.contains("  Pettijohn, Potter & Siever (1987): lithic greywacke\n"));
    assert!(text.contains("    subtype rule: R is 71.4% volcanic (Lv)"));
    assert!(text
        .contains("A-3 (line 4)\n  Folk (1980): no name\n    reason: no framework grains counted"));
}

/// A lab's own scheme, added without touching the others: Q at or above 90% of Q + F + R
/// (a lab's house rule, invented for this test) is "quartz-rich".
struct HouseRule;

impl NamingScheme for HouseRule {
    fn id(&self) -> &'static str {
        "house"
    }
    fn title(&self) -> &'static str {
        "House rule (test)"
    }
    fn source(&self) -> &'static str {
        "invented for this test"
    }
    fn pole_symbols(&self) -> [&'static str; 3] {
        ["Q", "F", "R"]
    }
    fn classify(&self, sample: &Sample) -> Naming {
        let Some(poles) = Poles::qfr(
            ["Q", "F", "R"],
            crate::naming::ChertPlacement::Quartz,
            &sample.framework,
        ) else {
            return Naming::unnamed("no grains");
        };
        let verdict = if poles.parts[0].percent >= 90.0 {
            Verdict::named("quartz-rich", "Q at or above 90%")
        } else {
            Verdict::unnamed("Q below 90%")
        };
        Naming {
            verdict,
            subtype: None,
            poles: Some(poles),
            measures: Vec::new(),
        }
    }
}

#[test]
fn a_lab_scheme_joins_the_table() {
    let mut set = SchemeSet::standard();
    set.push(Box::new(HouseRule)).unwrap();
    let v: serde_json::Value =
        serde_json::from_str(&run(TABLE, &set, NamesOutput::Table(Format::Json))).unwrap();
    assert_eq!(v[0]["house"], "quartz-rich");
    assert_eq!(v[1]["house"], serde_json::Value::Null);
    assert_eq!(v[1]["basis"]["house"]["reason"], "Q below 90%");
    let csv = run(TABLE, &set, NamesOutput::Table(Format::Csv));
    assert!(csv
        .lines()
        .next()
        .unwrap()
        .ends_with(",house,house_rule,house_Q,house_F,house_R"));
    assert!(set.push(Box::new(HouseRule)).is_err());
}

#[test]
fn scheme_without_chert_choice_refuses_the_option() {
    let mut set = SchemeSet::new();
    set.push(Box::new(HouseRule)).unwrap();
    let e = set.apply_chert_option("house=lithic").unwrap_err();
    assert!(e.to_string().contains("no chert placement"), "{e}");
    let e = SchemeSet::standard()
        .apply_chert_option("folk")
        .unwrap_err();
    assert!(e.to_string().contains("SCHEME=WHERE"), "{e}");
    let e = SchemeSet::standard()
        .apply_chert_option("folk=rock")
        .unwrap_err();
    assert!(e.to_string().contains("quartz, lithic or omit"), "{e}");
}

#[test]
fn explanation_of_a_sample_built_in_code_has_no_line() {
    let set = SchemeSet::standard();
    let s = with_matrix(counts([190, 0, 0, 5, 0, 5, 0, 0]), 0);
    let mut buf = Vec::new();
    crate::output::names_table::push_explanation(&mut buf, &s, &set, &set.classify(&s));
    let t = String::from_utf8(buf).unwrap();
    assert!(t.starts_with("test\n  Folk (1980): quartzarenite\n"), "{t}");
}
