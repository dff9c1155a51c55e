//! Reading count tables: every dialect, every kind of refusal, and where it is reported.

use provenance_core::counts::{Category, Counting};
use provenance_core::error::Error;
use provenance_core::input::{CountReader, Mapping, ReadOptions};
use provenance_core::prelude::Sample;

const HEAD: &str = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm";

fn read_with(text: &[u8], options: ReadOptions) -> Result<Vec<Sample>, Error> {
    let r = CountReader::from_reader("t.csv", text.to_vec().as_slice().to_owned_reader(), options)?;
    r.collect()
}

trait Owned {
    fn to_owned_reader(&self) -> std::io::Cursor<Vec<u8>>;
}
impl Owned for &[u8] {
    fn to_owned_reader(&self) -> std::io::Cursor<Vec<u8>> {
        std::io::Cursor::new(self.to_vec())
    }
}

fn read(text: &str) -> Result<Vec<Sample>, Error> {
    read_with(text.as_bytes(), ReadOptions::default())
}

fn refusal(text: &str) -> String {
    read(text)
        .expect_err("the table should be refused")
        .to_string()
}

// ---- dialects -------------------------------------------------------------------------

#[test]
fn comma_semicolon_and_tab_give_the_same_counts() {
    let comma = read(&format!("{HEAD}\nA,1,2,3,4,5,6,7,8\n")).unwrap();
    let semi = read("sample;Qm;Qp;C;P;K;Lv;Ls;Lm\nA;1;2;3;4;5;6;7;8\n").unwrap();
    let tab = read("sample\tQm\tQp\tC\tP\tK\tLv\tLs\tLm\nA\t1\t2\t3\t4\t5\t6\t7\t8\n").unwrap();
    assert_eq!(comma[0].framework, semi[0].framework);
    assert_eq!(comma[0].framework, tab[0].framework);
    assert_eq!(comma[0].framework.total(), 36.0);
}

#[test]
fn bom_crlf_and_trailing_blank_lines_are_accepted() {
    let text = format!("\u{feff}{HEAD}\r\nA,1,2,3,4,5,6,7,8\r\nB,1,1,1,1,1,1,1,1\r\n\r\n\r\n");
    let s = read(&text).unwrap();
    assert_eq!(s.len(), 2);
    assert_eq!(s[1].id, "B");
    assert_eq!(s[1].line, 3);
}

#[test]
fn a_bom_before_blank_lines_leaves_the_header_below_them() {
    // Regression: the mark alone made line 1 look like a (cell-less) header.
    let text = format!("\u{feff}\r\n\r\n{HEAD}\r\nA,1,2,3,4,5,6,7,8\r\n");
    let s = read(&text).unwrap();
    assert_eq!((s[0].id.as_str(), s[0].line), ("A", 4));
}

#[test]
fn crlf_files_report_editor_lines_and_keep_line_breaks_inside_quoted_cells() {
    for note in ["plain", "\"two\r\nlines\""] {
        let t = format!("{HEAD},notes\r\nA,1,1,1,1,1,1,1,1,{note}\r\n\r\nB,x,1,1,1,1,1,1,1,n\r\n");
        let bad = if note == "plain" { 4 } else { 5 };
        let e = refusal(&t);
        assert!(
            e.starts_with(&format!("t.csv, line {bad}, column 2")),
            "{e}"
        );
        let ok = read(&t.replace(",x,", ",2,")).unwrap();
        assert_eq!(ok[1].line, bad);
        assert_eq!(ok[0].metadata[0], note.trim_matches('"'));
    }
}

#[test]
fn spreadsheet_trailer_rows_of_empty_cells_are_skipped() {
    let s = read("sample;Qm;Qp;P;K;Lv;Ls;Lm\nA;1;2;3;4;5;6;7\n;;;;;;;\n;;;;;;;\n").unwrap();
    assert_eq!(s.len(), 1);
}

#[test]
fn decimal_commas_are_read_with_semicolons_in_percent_mode() {
    let text = "sample;Qm;Qp;C;P;K;Lv;Ls;Lm;n\nA;50,5;4,5;0;20;5;10;5;5;400\n";
    let s = read_with(
        text.as_bytes(),
        ReadOptions {
            percent: true,
            mapping: None,
        },
    )
    .unwrap();
    assert_eq!(s[0].counting, Counting::FromPercent { points: 400.0 });
    // 50.5% of 400 points = 202 estimated points.
    assert!((s[0].framework.qm - 202.0).abs() < 1e-9);
}

#[test]
fn header_matching_ignores_case_spaces_and_underscores() {
    let s = read("Sample, q m ,QP,c,p,K_,l_v,LS,lm\nA,1,2,3,4,5,6,7,8\n").unwrap();
    assert_eq!(s[0].framework.qm, 1.0);
    assert_eq!(s[0].framework.lm, 8.0);
}

#[test]
fn chert_is_found_by_its_name_and_a_second_chert_column_is_refused() {
    let s = read("sample,Qm,Qp,Chert,P,K,Lv,Ls,Lm\nA,1,2,3,4,5,6,7,8\n").unwrap();
    assert_eq!(s[0].framework.c, 3.0);
    assert!(s[0].metadata.is_empty());
    let e = read("sample,Qm,Qp,C,P,K,Lv,Ls,Lm,chert\nA,1,2,3,4,5,6,7,8,9\n").unwrap_err();
    assert!(matches!(e, Error::DuplicateColumn { .. }), "{e}");
}

#[test]
fn chert_column_is_optional_and_metadata_is_carried() {
    let text = "sample,formation,Qm,Qp,P,K,Lv,Ls,Lm,height\nA,\"Upper, west\",1,2,4,5,6,7,8,12.5\n";
    let r = CountReader::from_reader("t.csv", text.as_bytes(), ReadOptions::default()).unwrap();
    assert_eq!(r.metadata_columns(), ["formation", "height"]);
    assert!(!r.has_category(Category::C));
    let s: Vec<_> = r.collect::<Result<_, _>>().unwrap();
    assert_eq!(s[0].framework.c, 0.0);
    assert_eq!(s[0].metadata, ["Upper, west", "12.5"]);
}

#[test]
fn blank_count_cells_count_as_zero() {
    let s = read(&format!("{HEAD}\nA,10,,,5,,,,\n")).unwrap();
    assert_eq!(s[0].framework.total(), 15.0);
}

#[test]
fn percent_mode_without_points_has_no_counting_statistics() {
    let text = format!("{HEAD}\nA,60,5,5,10,10,5,3,2\n");
    let s = read_with(
        text.as_bytes(),
        ReadOptions {
            percent: true,
            mapping: None,
        },
    )
    .unwrap();
    assert_eq!(s[0].counting, Counting::Unknown);
    let m = provenance_core::modes::SampleModes::of(&s[0]);
    assert!(m
        .get(provenance_core::diagram::Diagram::Qfl)
        .unwrap()
        .sd()
        .is_none());
}

#[test]
fn mapping_sums_sub_categories() {
    let mapping = Mapping::parse(
        "lab.toml",
        "id = \"Slide\"\n[categories]\nQm = [\"Qm nu\", \"Qm u\"]\nLv = [\"Lv felsitic\", \"Lv lathwork\"]\n",
    )
    .unwrap();
    let text = "Slide,Qm nu,Qm u,Qp,P,K,Lv felsitic,Lv lathwork,Ls,Lm,Qm\nS1,100,50,10,30,20,12,8,5,5,999\n";
    let s = read_with(
        text.as_bytes(),
        ReadOptions {
            percent: false,
            mapping: Some(mapping),
        },
    )
    .unwrap();
    assert_eq!(s[0].id, "S1");
    assert_eq!(s[0].framework.qm, 150.0);
    assert_eq!(s[0].framework.lv, 20.0);
    // The table's own "Qm" total is kept as metadata, not double-counted.
    assert_eq!(s[0].metadata, ["999"]);
}

#[test]
fn mapping_naming_an_absent_column_names_the_mapping_line() {
    let mapping = Mapping::parse("lab.toml", "[categories]\nQm = \"Qm total\"\n").unwrap();
    let text = format!("{HEAD}\nA,1,2,3,4,5,6,7,8\n");
    let e = read_with(
        text.as_bytes(),
        ReadOptions {
            percent: false,
            mapping: Some(mapping),
        },
    )
    .unwrap_err()
    .to_string();
    assert!(e.starts_with("lab.toml, line 2:"), "{e}");
    assert!(e.contains("\"Qm total\""), "{e}");
}

// ---- refusals, each naming file, line, column, value and expectation --------------------

#[test]
fn empty_id_is_refused_with_its_line_and_column() {
    let e = refusal(&format!("{HEAD}\nA,1,1,1,1,1,1,1,1\n  ,1,1,1,1,1,1,1,1\n"));
    assert_eq!(
        e,
        "t.csv, line 3, column 1 (\"sample\"): the sample id is empty, expected a non-empty id"
    );
}

#[test]
fn duplicate_id_names_both_lines() {
    let e = refusal(&format!(
        "{HEAD}\nA,1,1,1,1,1,1,1,1\nB,1,1,1,1,1,1,1,1\nA,2,2,2,2,2,2,2,2\n"
    ));
    assert!(
        e.starts_with(
            "t.csv, line 4, column 1 (\"sample\"): sample id \"A\" was already used on line 2"
        ),
        "{e}"
    );
}

#[test]
fn bad_counts_are_refused_with_location_value_and_expectation() {
    for (cell, shown) in [
        ("abc", "\"abc\""),
        ("NaN", "\"NaN\""),
        ("inf", "\"inf\""),
        ("-3", "\"-3\""),
        ("2.5", "\"2.5\""),
        ("1e9", "\"1e9\""),
    ] {
        let e = refusal(&format!("{HEAD}\nA,1,1,1,1,1,{cell},1,1\n"));
        assert!(e.starts_with(&format!("t.csv, line 2, column 7 (\"Lv\"): found {shown}, expected a whole number of points from 0 to 10000000")), "{e}");
    }
}

#[test]
fn bad_percentages_are_refused() {
    let text = format!("{HEAD}\nA,101,1,1,1,1,1,1,1\n");
    let e = read_with(
        text.as_bytes(),
        ReadOptions {
            percent: true,
            mapping: None,
        },
    )
    .unwrap_err();
    assert!(
        e.to_string()
            .contains("column 2 (\"Qm\"): found \"101\", expected a percentage from 0 to 100"),
        "{e}"
    );
}

#[test]
fn ragged_rows_are_refused() {
    let e = refusal(&format!("{HEAD}\nA,1,1,1,1,1,1,1,1\nB,1,1,1\n"));
    assert_eq!(
        e,
        "t.csv, line 3: the row has 4 cells, expected 9 as in the header"
    );
    let e = refusal(&format!("{HEAD}\nA,1,1,1,1,1,1,1,1,9\n"));
    assert!(e.contains("has 10 cells, expected 9"), "{e}");
}

#[test]
fn empty_files_are_refused() {
    assert_eq!(
        refusal(""),
        "t.csv: the file is empty, expected a header line and one row per sample"
    );
    assert!(refusal("\n\n  \n").contains("the file is empty"));
}

#[test]
fn tables_without_count_columns_are_refused() {
    let e = refusal("sample,depth,notes\nA,1,x\n");
    assert!(
        e.starts_with("t.csv, line 1: no recognisable count columns"),
        "{e}"
    );
    let e = refusal("sample,Qm,P,K\nA,1,2,3\n");
    assert!(
        e.starts_with("t.csv, line 1: missing column(s) Qp, Lv, Ls, Lm"),
        "{e}"
    );
    let e = refusal("id,Qm,Qp,P,K,Lv,Ls,Lm\nA,1,1,1,1,1,1,1\n");
    assert!(e.starts_with("t.csv, line 1: no sample id column"), "{e}");
}

#[test]
fn repeated_category_columns_are_refused() {
    let e = refusal("sample,Qm,Qp,P,K,Lv,Ls,Lm,q_m\nA,1,1,1,1,1,1,1,1\n");
    assert!(
        e.starts_with("t.csv, line 1, column 9 (\"q_m\"): column \"Qm\" repeats column 2"),
        "{e}"
    );
}

#[test]
fn binary_garbage_is_refused_as_not_text() {
    let e = read_with(b"\x00\x01\x02\xff\xfe", ReadOptions::default()).unwrap_err();
    assert_eq!(
        e.to_string(),
        "t.csv, line 1, column 1: the bytes are not UTF-8 text, expected a CSV table"
    );
    // Below two blank lines, the header's third character.
    let e = read_with(b"\n\nsa\xffmple,Qm\n", ReadOptions::default()).unwrap_err();
    assert_eq!(
        e.to_string(),
        "t.csv, line 3, column 3: the bytes are not UTF-8 text, expected a CSV table"
    );
    let mut text = format!("{HEAD},notes\nA,1,1,1,1,1,1,1,1,").into_bytes();
    text.extend_from_slice(b"\xff\xfe\n");
    let e = read_with(&text, ReadOptions::default()).unwrap_err();
    assert!(
        e.to_string()
            .starts_with("t.csv, line 2, column 10 (\"notes\"): the bytes are not UTF-8"),
        "{e}"
    );
}

#[test]
fn all_zero_framework_is_a_flagged_row_with_null_modes() {
    let s = read(&format!("{HEAD}\nA,0,0,0,0,0,0,0,0\n")).unwrap();
    let m = provenance_core::modes::SampleModes::of(&s[0]);
    assert!(m.empty_framework());
    assert!(m.diagrams.iter().all(Option::is_none));
}

#[test]
fn the_first_refusal_ends_the_stream() {
    let text = format!("{HEAD}\nA,1,1,1,1,1,1,1,1\nB,x,1,1,1,1,1,1,1\nC,1,1,1,1,1,1,1,1\n");
    let r = CountReader::from_reader(
        "t.csv",
        std::io::Cursor::new(text.into_bytes()),
        ReadOptions::default(),
    )
    .unwrap();
    let items: Vec<_> = r.collect();
    assert_eq!(items.len(), 2);
    assert!(items[0].is_ok() && items[1].is_err());
}

#[test]
fn a_missing_file_is_an_io_error_naming_the_path() {
    let e = CountReader::from_path(
        std::path::Path::new("/no/such/counts.csv"),
        ReadOptions::default(),
    )
    .err()
    .unwrap();
    assert_eq!(e.kind(), provenance_core::error::ErrorKind::Io);
    assert!(e.to_string().starts_with("cannot read /no/such/counts.csv"));
}

#[test]
fn lines_after_blank_lines_are_counted_as_an_editor_shows_them() {
    // Lines 3 and 4 are blank; the bad cell sits on line 5, with or without quotes in the table.
    for note in ["plain", "\"quoted, note\""] {
        let t = format!("{HEAD},notes\nA,1,1,1,1,1,1,1,1,{note}\n\n\nB,x,1,1,1,1,1,1,1,{note}\n");
        let e = refusal(&t);
        assert!(e.starts_with("t.csv, line 5, column 2"), "{e}");
        let ok = read(&t.replace(",x,", ",2,")).unwrap();
        assert_eq!(ok.iter().map(|s| s.line).collect::<Vec<_>>(), [2, 5]);
    }
}
