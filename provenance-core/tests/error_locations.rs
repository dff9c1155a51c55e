//! Every variant of `provenance_core::error::Error`, produced through the public API from a bad
//! input, names where the problem sits: the file, and the line and column (with the column's
//! header) wherever a single line or cell is at fault, plus the offending value.
//!
//! `every_variant_has_a_location_test` reads the enum from `src/error.rs`, so a new variant
//! without a case here fails the suite.

use provenance_core::classifier::{fit, FeatureSpace, FitOptions, Model, TrainingSet};
use provenance_core::counts::{Counting, Framework, Sample};
use provenance_core::error::Error;
use provenance_core::fields::{format, FieldSet};
use provenance_core::input::{CountReader, Mapping, ReadOptions};
use provenance_core::membership::MembershipOptions;
use provenance_core::output::{AtomicFile, Sink};
use provenance_core::petrofacies::Table;
use provenance_core::plot::{Figure, GroupBy, MAX_GROUPS};
use provenance_core::setting::Locator;
use std::path::Path;

const HEAD: &str = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,formation";

/// An error and the pieces of text its message must hold.
type Case = (Error, Vec<String>);

fn reader(name: &str, text: impl Into<Vec<u8>>) -> Result<CountReader, Error> {
    CountReader::from_reader(
        name,
        std::io::Cursor::new(text.into()),
        ReadOptions::default(),
    )
}

/// The first error of reading the whole table.
fn read_all(name: &str, text: impl Into<Vec<u8>>) -> Error {
    match reader(name, text) {
        Err(e) => e,
        Ok(r) => r
            .into_iter()
            .find_map(|row| row.err())
            .expect("the table is refused"),
    }
}

fn case(e: Error, needles: &[&str]) -> Case {
    (e, needles.iter().map(|s| s.to_string()).collect())
}

/// The variant's name, from its `Debug` form (`Name { .. }`).
fn variant(e: &Error) -> String {
    format!("{e:?}")
        .split(|c: char| !c.is_alphanumeric())
        .next()
        .unwrap_or_default()
        .to_string()
}

fn check(name: &str, cases: Vec<Case>) {
    assert!(!cases.is_empty());
    for (e, needles) in cases {
        assert_eq!(variant(&e), name, "{e:?}");
        let msg = e.to_string();
        for n in &needles {
            assert!(msg.contains(n.as_str()), "{name}: {msg:?} lacks {n:?}");
        }
    }
}

fn tmp() -> tempfile::TempDir {
    tempfile::tempdir().unwrap()
}

fn missing_path(dir: &tempfile::TempDir, name: &str) -> std::path::PathBuf {
    dir.path().join("no-such-folder").join(name)
}

fn read_cases() -> Vec<Case> {
    let d = tmp();
    let p = |n: &str| missing_path(&d, n);
    let shown = |n: &str| format!("cannot read {}", p(n).display());
    vec![
        case(
            CountReader::from_path(&p("c.csv"), ReadOptions::default())
                .err()
                .unwrap(),
            &[&shown("c.csv")],
        ),
        case(
            Mapping::from_path(&p("m.toml")).unwrap_err(),
            &[&shown("m.toml")],
        ),
        case(
            format::from_path(&p("f.toml")).unwrap_err(),
            &[&shown("f.toml")],
        ),
        case(
            Model::load(&p("model.json")).unwrap_err(),
            &[&shown("model.json")],
        ),
    ]
}

/// A writer that always fails, like a full disk.
struct Full;
impl std::io::Write for Full {
    fn write(&mut self, _: &[u8]) -> std::io::Result<usize> {
        Err(std::io::Error::other("no space left"))
    }
    fn flush(&mut self) -> std::io::Result<()> {
        Err(std::io::Error::other("no space left"))
    }
}

fn write_cases() -> Vec<Case> {
    let d = tmp();
    let target = missing_path(&d, "out.csv");
    let r = reader("t.csv", format!("{HEAD}\nA,1,1,1,1,1,1,1,1,x\n")).unwrap();
    let streamed = provenance_core::batch::write_modes(r, &mut Full, "out.csv", Default::default())
        .unwrap_err();
    // The output's path and the operating system's reason, without the temporary file's
    // name (the unit tests of `output::atomic` check the whole message).
    let reason = std::fs::File::create(&target).unwrap_err();
    vec![
        case(
            AtomicFile::create(&target).err().unwrap(),
            &[&format!("cannot write {}: {reason}", target.display())],
        ),
        case(streamed, &["cannot write out.csv", "no space left"]),
    ]
}

fn invalid_value_cases() -> Vec<Case> {
    let bad_count = read_all(
        "t.csv",
        format!("{HEAD}\nA,1,1,1,1,1,1,1,1,x\nB,1,1,1,x,1,1,1,1,y\n"),
    );
    let negative = read_all("t.csv", format!("{HEAD}\nA,1,1,1,1,1,1,1,-2,x\n"));
    let labels = "sample,Qm,Qp,P,K,Lv,Ls,Lm,setting\nA,200,10,40,25,10,6,4,craton\nB,60,10,90,25,100,6,4, \n";
    let training = TrainingSet::read(
        reader("ref.csv", labels).unwrap(),
        "setting",
        FeatureSpace::Diagram(provenance_core::diagram::Diagram::Qfl),
    )
    .unwrap_err();
    let heights =
        "sample,Qm,Qp,P,K,Lv,Ls,Lm,height_m\nA,1,1,1,1,1,1,1,12.5\nB,1,1,1,1,1,1,1,high\n";
    let table = Table::read(reader("sec.csv", heights).unwrap()).unwrap();
    let h = table.column("height_m").unwrap();
    let height = h.number(&table, &table.samples[1]).unwrap_err();
    vec![
        case(bad_count, &["t.csv, line 3, column 5 (\"P\")", "\"x\""]),
        case(negative, &["t.csv, line 2, column 9 (\"Lm\")", "\"-2\""]),
        case(training, &["ref.csv, line 3, column 9 (\"setting\")"]),
        case(
            height,
            &["sec.csv, line 3, column 9 (\"height_m\")", "\"high\""],
        ),
    ]
}

fn missing_id_cases() -> Vec<Case> {
    let e = read_all(
        "t.csv",
        format!("{HEAD}\nA,1,1,1,1,1,1,1,1,x\n  ,1,1,1,1,1,1,1,1,x\n"),
    );
    vec![case(e, &["t.csv, line 3, column 1 (\"sample\")"])]
}

fn duplicate_id_cases() -> Vec<Case> {
    let e = read_all(
        "t.csv",
        format!("{HEAD}\nA,1,1,1,1,1,1,1,1,x\nB,1,1,1,1,1,1,1,1,x\nA,2,1,1,1,1,1,1,1,x\n"),
    );
    vec![case(
        e,
        &["t.csv, line 4, column 1 (\"sample\")", "\"A\"", "line 2"],
    )]
}

fn ragged_row_cases() -> Vec<Case> {
    let e = read_all("t.csv", format!("{HEAD}\nA,1,1,1,1,1,1,1,1,x\nB,1,1,1,1\n"));
    vec![case(e, &["t.csv, line 3:", "5 cells", "expected 10"])]
}

fn empty_input_cases() -> Vec<Case> {
    vec![
        case(reader("empty.csv", "").err().unwrap(), &["empty.csv:"]),
        case(
            reader("blank.csv", "\n \n\t\n").err().unwrap(),
            &["blank.csv:"],
        ),
    ]
}

fn not_text_cases() -> Vec<Case> {
    let header = reader("t.csv", b"sample,Qm\xff,Qp\n".to_vec())
        .err()
        .unwrap();
    let below_blank_lines = reader("t.csv", b"\n\nsample,Qm,Q\0p\n".to_vec())
        .err()
        .unwrap();
    let mut row = format!("{HEAD}\nA,1,1,1,1,1,1,1,1,").into_bytes();
    row.extend_from_slice(b"Upp\xe9r\n");
    let cell = read_all("t.csv", row);
    let d = tmp();
    let model = d.path().join("model.json");
    std::fs::write(&model, b"{\"format\": \"\xff\"}").unwrap();
    let set = d.path().join("set.toml");
    std::fs::write(&set, b"id = \"\xfe\"\n").unwrap();
    let map = d.path().join("map.toml");
    std::fs::write(&map, b"[categories]\nQm = \"Qm \xe9\"\n").unwrap();
    let at = |p: &Path, rest: &str| format!("{}, {rest}", p.display());
    vec![
        case(
            header,
            &["t.csv, line 1, column 10:", "expected a CSV table"],
        ),
        case(below_blank_lines, &["t.csv, line 3, column 12:"]),
        case(
            cell,
            &["t.csv, line 2, column 10 (\"formation\")", "a CSV table"],
        ),
        case(
            Model::load(&model).unwrap_err(),
            &[
                &at(&model, "line 1, column 13:"),
                "expected a sandprov model file",
            ],
        ),
        case(
            format::from_path(&set).unwrap_err(),
            &[&at(&set, "line 1, column 7:"), "expected a field set"],
        ),
        case(
            Mapping::from_path(&map).unwrap_err(),
            &[&at(&map, "line 2, column 10:"), "expected a column mapping"],
        ),
    ]
}

fn no_count_columns_cases() -> Vec<Case> {
    let e = reader("t.csv", "sample,colour,grain size\nA,red,fine\n")
        .err()
        .unwrap();
    // Below two blank lines the header sits on line 3.
    let below = reader("t.csv", "\n\nsample,colour\nA,red\n").err().unwrap();
    vec![
        case(e, &["t.csv, line 1:", "\"colour\"", "\"grain size\""]),
        case(below, &["t.csv, line 3:", "\"colour\""]),
    ]
}

fn missing_columns_cases() -> Vec<Case> {
    let e = reader("t.csv", "sample,Qm,Qp,C,P,K,Lv\nA,1,1,1,1,1,1\n")
        .err()
        .unwrap();
    let bom = reader(
        "t.csv",
        "\u{feff}\r\nsample,Qm,Qp,C,P,K,Lv\r\nA,1,1,1,1,1,1\r\n",
    )
    .err()
    .unwrap();
    vec![
        case(e, &["t.csv, line 1:", "Ls, Lm"]),
        case(bom, &["t.csv, line 2:", "Ls, Lm"]),
    ]
}

fn duplicate_column_cases() -> Vec<Case> {
    let e = reader("t.csv", format!("{HEAD},Qm\nA,1,1,1,1,1,1,1,1,x,2\n"))
        .err()
        .unwrap();
    let below = reader("t.csv", format!("\n{HEAD},Qm\nA,1,1,1,1,1,1,1,1,x,2\n"))
        .err()
        .unwrap();
    vec![
        case(e, &["t.csv, line 1, column 11 (\"Qm\")", "column 2"]),
        case(below, &["t.csv, line 2, column 11 (\"Qm\")"]),
    ]
}

const SET: &str = r#"id = "demo"
title = "Two fields"
diagram = "qfl"
note = "Invented for this test."
[source]
author = "Nobody"
year = 2024
figure = "none"
reference = "this test"
[[fields]]
name = "upper"
group = "continental block"
vertices = [[100, 0, 0], [50, 50, 0], [50, 0, 50]]
[[fields]]
name = "lower"
group = "magmatic arc"
vertices = [[50, 50, 0], [0, 100, 0], [0, 0, 100], [50, 0, 50]]
"#;

fn malformed_cases() -> Vec<Case> {
    let no_id = reader("t.csv", "name,Qm,Qp,C,P,K,Lv,Ls,Lm\nA,1,1,1,1,1,1,1,1\n")
        .err()
        .unwrap();
    let mapping_syntax =
        Mapping::parse("map.toml", "id = \"sample\"\n[categories\nQm = [\"a\"]\n").unwrap_err();
    let mapping = Mapping::parse("map.toml", "[categories]\nQm = [\"quartz mono\"]\n").unwrap();
    let unmapped = CountReader::from_reader(
        "t.csv",
        std::io::Cursor::new(format!("{HEAD}\nA,1,1,1,1,1,1,1,1,x\n").into_bytes()),
        ReadOptions {
            percent: false,
            mapping: Some(mapping),
        },
    )
    .err()
    .unwrap();
    let field_set = format::parse("demo.toml", &SET.replace("magmatic arc", "arc")).unwrap_err();
    let field_syntax =
        format::parse("demo.toml", &SET.replace("year = 2024", "year = = 2024")).unwrap_err();
    let model_json = Model::from_json(
        "m.json",
        "{\n  \"format\": \"sandprov-model\",\n  \"version\": 1,,\n}",
    )
    .unwrap_err();
    let model_key = Model::from_json("m.json", "{\"format\": \"something else\"}").unwrap_err();
    let model_type = Model::from_json(
        "m.json",
        &model_text().replace("\"l2\": 1.0", "\"l2\": \"one\""),
    )
    .unwrap_err();
    let model_unknown =
        Model::from_json("m.json", &model_text().replace("\"date\"", "\"day\"")).unwrap_err();
    let without_date = model_text().replace("\"date\": \"2025-01-01\",", "");
    let model_missing = Model::from_json("m.json", &without_date).unwrap_err();
    let r = reader("t.csv", format!("{HEAD}\nA,1,1,1,1,1,1,1,1,x\n")).unwrap();
    let group_by = GroupBy::find(&r, "basin").unwrap_err();
    vec![
        case(no_id, &["t.csv, line 1:", "\"sample\""]),
        case(mapping_syntax, &["map.toml, line 2:"]),
        case(unmapped, &["map.toml, line 2:", "\"quartz mono\"", "t.csv"]),
        case(
            field_set,
            &["demo.toml, line 16, column 9 (\"group\")", "arc"],
        ),
        case(field_syntax, &["demo.toml, line 7, column", "(\"year\")"]),
        case(
            model_json,
            &["m.json, line 3, column 16:", "not valid JSON"],
        ),
        case(
            model_key,
            &["m.json, line 1, column 2 (\"format\"):", "something else"],
        ),
        case(
            model_type,
            &[
                &model_at("\"l2\"", "l2"),
                "invalid type: string \"one\", expected f64",
            ],
        ),
        case(
            model_unknown,
            &[
                &model_at("\"date\"", "training.day"),
                "key \"training.day\": unknown field `day`",
            ],
        ),
        case(
            model_missing,
            &[
                &model_at("\"training\"", "training"),
                "key \"training\": missing field `date`",
            ],
        ),
        case(group_by, &["t.csv, line 1:", "\"basin\"", "formation"]),
    ]
}

/// A model file as `sandprov train` writes it, of two invented sands.
fn model_text() -> String {
    let mut t = TrainingSet::new(FeatureSpace::Diagram(
        provenance_core::diagram::Diagram::Qfl,
    ));
    t.push_amounts("a", &[60.0, 30.0, 10.0], Counting::Counted)
        .unwrap();
    t.push_amounts("b", &[20.0, 30.0, 50.0], Counting::Counted)
        .unwrap();
    let fit = fit(&t, &FitOptions::default()).unwrap();
    Model::new(fit, &t, "2025-01-01", "two invented sands", None).to_json()
}

/// `m.json, line L, column C ("path")` of the first `key` of [`model_text`].
fn model_at(key: &str, path: &str) -> String {
    let text = model_text();
    let i = text.find(key).expect("the key");
    let line = text[..i].matches('\n').count() + 1;
    let column = i - text[..i].rfind('\n').map_or(0, |n| n + 1) + 1;
    format!("m.json, line {line}, column {column} ({path:?}):")
}

fn training_cases() -> Vec<Case> {
    let labels =
        "sample,Qm,Qp,P,K,Lv,Ls,Lm,setting\nA,200,10,40,25,10,6,4,craton\nB,0,0,0,0,0,0,0,arc\n";
    let no_features = TrainingSet::read(
        reader("ref.csv", labels).unwrap(),
        "setting",
        FeatureSpace::Diagram(provenance_core::diagram::Diagram::Qfl),
    )
    .unwrap_err();
    let one = "sample,Qm,Qp,P,K,Lv,Ls,Lm,setting\nA,200,10,40,25,10,6,4,craton\nB,190,10,40,25,10,6,4,craton\n";
    let set = TrainingSet::read(
        reader("one.csv", one).unwrap(),
        "setting",
        FeatureSpace::Diagram(provenance_core::diagram::Diagram::Qfl),
    )
    .unwrap();
    let one_class = fit(&set, &FitOptions::default()).unwrap_err();
    let mut t = TrainingSet::new(FeatureSpace::Diagram(
        provenance_core::diagram::Diagram::Qmpk,
    ))
    .named("hand.csv");
    t.push_amounts("only", &[50.0, 10.0, 40.0], Counting::Counted)
        .unwrap();
    let hand = fit(&t, &FitOptions::default()).unwrap_err();
    vec![
        case(no_features, &["ref.csv, line 3 (sample \"B\")"]),
        case(one_class, &["one.csv", "\"craton\""]),
        case(hand, &["hand.csv:"]),
    ]
}

fn output_is_input_cases() -> Vec<Case> {
    let d = tmp();
    let input = d.path().join("c.csv");
    std::fs::write(&input, "x").unwrap();
    let same = d.path().join(".").join("c.csv");
    let e = Sink::open(Some(&same), &[input.as_path()]).err().unwrap();
    let check = provenance_core::output::check_not_input(&input, &[Path::new("a.csv"), &input])
        .unwrap_err();
    vec![
        case(e, &[&format!("output {} is also an input", same.display())]),
        case(check, &[&input.display().to_string()]),
    ]
}

fn unknown_field_set_cases() -> Vec<Case> {
    let e = FieldSet::resolve("no-such-set").unwrap_err();
    vec![case(e, &["\"no-such-set\"", "dickinson1985-qfl"])]
}

fn invalid_field_set_cases() -> Vec<Case> {
    let d = tmp();
    let path = d.path().join("bad.toml");
    // The second vertex of the first field sums to 90: refused by the check, with its line.
    std::fs::write(
        &path,
        SET.replace("[50, 50, 0], [50, 0, 50]]", "[50, 40, 0], [50, 0, 50]]"),
    )
    .unwrap();
    let e = FieldSet::load(path.to_str().unwrap()).unwrap_err();
    vec![case(
        e,
        &[
            &format!("{}:", path.display()),
            &format!("{}, line 13", path.display()),
        ],
    )]
}

fn usage_cases() -> Vec<Case> {
    let draws = MembershipOptions {
        draws: 0,
        ..Default::default()
    }
    .check()
    .unwrap_err();
    let l2 = FitOptions {
        l2: -1.0,
        ..Default::default()
    }
    .check()
    .unwrap_err();
    let qfl = FieldSet::load("dickinson1985-qfl").unwrap();
    let twice = Locator::new(vec![qfl.clone(), qfl]).unwrap_err();
    let ambiguous = "sample,Qm,Qp,P,K,Lv,Ls,Lm,Unit,unit\nA,1,1,1,1,1,1,1,a,b\n";
    let table = Table::read(reader("amb.csv", ambiguous).unwrap()).unwrap();
    let column = table.column("UNIT").unwrap_err();
    vec![
        case(draws, &["--draws 0"]),
        case(l2, &["--l2 -1"]),
        case(twice, &["dickinson1985-qfl and dickinson1985-qfl", "qfl"]),
        case(column, &["amb.csv:", "\"UNIT\""]),
    ]
}

fn too_many_groups_cases() -> Vec<Case> {
    let by = GroupBy {
        file: "t.csv".into(),
        column: "unit".into(),
        index: 0,
        file_column: 10,
    };
    let mut b = Figure::builder(&[provenance_core::diagram::Diagram::Qfl], Some(by));
    let mut last = None;
    for i in 0..=MAX_GROUPS {
        let mut s = Sample::counted(
            format!("S{i}"),
            Framework {
                qm: 10.0,
                p: 5.0,
                lv: 5.0,
                ..Default::default()
            },
        );
        s.line = i as u64 + 2;
        s.metadata = vec![format!("unit {i}")];
        if let Err(e) = b.push(&s) {
            last = Some(e);
        }
    }
    let line = format!("t.csv, line {}, column 10 (\"unit\")", MAX_GROUPS + 2);
    vec![case(last.expect("one group too many"), &[&line])]
}

fn render_cases() -> Vec<Case> {
    // A failure inside sandprov, not caused by a data file; the message names the stage that
    // failed and where in the SVG text the parser stopped.
    let e = provenance_core::plot::export::svg_to_png(
        "<svg xmlns=\"http://www.w3.org/2000/svg\">\n<g =\"1\"/></svg>",
        300.0,
    )
    .unwrap_err();
    vec![case(e, &["the SVG does not parse", "2:"])]
}

/// Makes the cases of one variant.
type Cases = fn() -> Vec<Case>;

/// Each variant with the cases that produce it.
const CASES: &[(&str, Cases)] = &[
    ("Read", read_cases),
    ("Write", write_cases),
    ("InvalidValue", invalid_value_cases),
    ("MissingId", missing_id_cases),
    ("DuplicateId", duplicate_id_cases),
    ("RaggedRow", ragged_row_cases),
    ("EmptyInput", empty_input_cases),
    ("NotText", not_text_cases),
    ("NoCountColumns", no_count_columns_cases),
    ("MissingColumns", missing_columns_cases),
    ("DuplicateColumn", duplicate_column_cases),
    ("Malformed", malformed_cases),
    ("Training", training_cases),
    ("OutputIsInput", output_is_input_cases),
    ("UnknownFieldSet", unknown_field_set_cases),
    ("InvalidFieldSet", invalid_field_set_cases),
    ("Usage", usage_cases),
    ("TooManyGroups", too_many_groups_cases),
    ("Render", render_cases),
];

fn run(name: &str) {
    let (_, cases) = CASES
        .iter()
        .find(|(n, _)| *n == name)
        .expect("a listed variant");
    check(name, cases());
}

#[test]
fn every_variant_has_a_location_test() {
    let src = std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join("src/error.rs"))
        .unwrap();
    let body = &src[src.find("pub enum Error {").expect("the enum")..];
    let body = &body[..body.find("\n}\n").expect("its end")];
    let declared: Vec<&str> = body
        .lines()
        .filter(|l| l.starts_with("    ") && !l.starts_with("     "))
        .filter_map(|l| l.trim().strip_suffix(" {"))
        .filter(|n| n.chars().all(char::is_alphanumeric))
        .collect();
    let covered: Vec<&str> = CASES.iter().map(|(n, _)| *n).collect();
    assert_eq!(
        declared, covered,
        "add a case for every Error variant, in declaration order"
    );
}

#[test]
fn read_names_the_file() {
    run("Read");
}
#[test]
fn write_names_the_output() {
    run("Write");
}
#[test]
fn invalid_value_names_file_line_column_and_value() {
    run("InvalidValue");
}
#[test]
fn missing_id_names_file_line_and_column() {
    run("MissingId");
}
#[test]
fn duplicate_id_names_both_lines() {
    run("DuplicateId");
}
#[test]
fn ragged_row_names_file_and_line() {
    run("RaggedRow");
}
#[test]
fn empty_input_names_the_file() {
    run("EmptyInput");
}
#[test]
fn not_text_names_file_line_and_column() {
    run("NotText");
}
#[test]
fn no_count_columns_names_file_and_headers() {
    run("NoCountColumns");
}
#[test]
fn missing_columns_names_file_and_columns() {
    run("MissingColumns");
}
#[test]
fn duplicate_column_names_header_line_and_both_columns() {
    run("DuplicateColumn");
}
#[test]
fn malformed_names_file_and_line() {
    run("Malformed");
}
#[test]
fn training_names_the_table_and_sample() {
    run("Training");
}
#[test]
fn output_is_input_names_the_path() {
    run("OutputIsInput");
}
#[test]
fn unknown_field_set_names_the_value() {
    run("UnknownFieldSet");
}
#[test]
fn invalid_field_set_names_file_and_lines() {
    run("InvalidFieldSet");
}
#[test]
fn usage_names_the_option_or_file() {
    run("Usage");
}
#[test]
fn too_many_groups_names_file_line_and_column() {
    run("TooManyGroups");
}
#[test]
fn render_names_the_stage_and_position() {
    run("Render");
}
