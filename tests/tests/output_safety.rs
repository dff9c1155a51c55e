//! Output safety of the streaming commands `modes`, `name` and `setting`, run as a user would:
//! a bad last row of a large table leaves nothing at `-o` (exit 3), an output path equal to an
//! input is refused (exit 2) and the input is left as it was, and a good run writes every row.

use predicates::prelude::*;
use sandprov_tests::Sandbox;

const HEAD: &str = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,matrix,formation";
const ROWS: usize = 20_000;

/// A table of `ROWS` good samples (compositions spread over the diagrams), then `last`.
fn big_table(last: &str) -> String {
    table(ROWS, last)
}

/// A table of `rows` good samples, then `last`.
fn table(rows: usize, last: &str) -> String {
    let mut t = String::with_capacity(rows * 48);
    t.push_str(HEAD);
    t.push('\n');
    for i in 0..rows {
        let j = i % 97;
        t.push_str(&format!(
            "S{i},{},{},{},{},{},{},{},{},{},Unit {}\n",
            20 + 3 * j,
            j % 11,
            j % 5,
            10 + (j * 7) % 90,
            5 + (j * 3) % 40,
            (j * 13) % 70,
            (j * 5) % 30,
            (j * 2) % 20,
            j % 50,
            i % 3
        ));
    }
    t.push_str(last);
    t.push('\n');
    t
}

/// The three streaming commands. `setting` runs without membership here: membership changes
/// what is computed per row, not how rows are streamed and written (that path is checked on a
/// smaller table in `setting_with_membership_leaves_no_output`), and it would make a
/// 20,000-row debug run take minutes.
fn commands() -> [(&'static str, &'static [&'static str]); 3] {
    [
        ("modes", &[]),
        ("name", &[]),
        ("setting", &["--no-membership"]),
    ]
}

fn failing_last_row_leaves_nothing(last: &str, stderr_has: &str, formats: &[&str]) {
    let sb = Sandbox::new();
    sb.write("big.csv", big_table(last));
    for (cmd, extra) in commands() {
        for format in formats {
            sb.sandprov()
                .arg(cmd)
                .args(extra)
                .args(["big.csv", "--format", format, "-o", "out.txt"])
                .assert()
                .code(3)
                .stderr(predicate::str::contains(stderr_has));
            assert_eq!(
                sb.files(),
                ["big.csv"],
                "{cmd} {extra:?} --format {format}: no partial or temporary file is left"
            );
        }
    }
}

#[test]
fn a_bad_count_in_the_last_row_leaves_no_output() {
    let line = ROWS + 2;
    failing_last_row_leaves_nothing(
        "LAST,1,1,1,1,1,1,1,oops,0,Unit 0",
        &format!("big.csv, line {line}, column 9 (\"Lm\")"),
        &["csv", "json"],
    );
}

#[test]
fn a_duplicate_id_in_the_last_row_leaves_no_output() {
    let line = ROWS + 2;
    failing_last_row_leaves_nothing(
        "S0,1,1,1,1,1,1,1,1,0,Unit 0",
        &format!("big.csv, line {line}, column 1 (\"sample\")"),
        &["csv"],
    );
}

#[test]
fn a_short_last_row_leaves_no_output() {
    failing_last_row_leaves_nothing(
        "LAST,1,1",
        &format!("big.csv, line {}", ROWS + 2),
        &["json"],
    );
}

#[test]
fn setting_with_membership_leaves_no_output() {
    let sb = Sandbox::new();
    sb.write("c.csv", table(400, "LAST,1,1,1,1,1,1,1,1.5,0,Unit 0"));
    for format in ["csv", "json"] {
        sb.sandprov()
            .args(["setting", "c.csv", "--format", format, "-o", "out.txt"])
            .assert()
            .code(3)
            .stderr(predicate::str::contains(
                "c.csv, line 402, column 9 (\"Lm\")",
            ));
        assert_eq!(sb.files(), ["c.csv"], "--format {format}: nothing is left");
    }
}

#[test]
fn an_existing_output_is_kept_when_a_run_fails() {
    let sb = Sandbox::new();
    sb.write("big.csv", big_table("LAST,1,1,1,1,1,1,1,-4,0,Unit 0"));
    for (cmd, extra) in commands() {
        let before = format!("an earlier {cmd} result\n");
        sb.write("out.csv", &before);
        sb.sandprov()
            .arg(cmd)
            .args(extra)
            .args(["big.csv", "-o", "out.csv"])
            .assert()
            .code(3);
        assert_eq!(
            std::fs::read_to_string(sb.path("out.csv")).unwrap(),
            before,
            "{cmd}: the old output is untouched"
        );
        assert_eq!(
            sb.files(),
            ["big.csv", "out.csv"],
            "{cmd}: no temporary file is left"
        );
    }
}

#[test]
fn an_output_equal_to_the_input_is_refused() {
    let sb = Sandbox::new();
    let text = format!("{HEAD}\nA,100,5,5,40,20,10,10,10,3,Unit 0\n");
    let input = sb.write("c.csv", &text);
    let sub = sb.path("sub");
    std::fs::create_dir(&sub).unwrap();
    // Refused before any row is read, so membership costs nothing here.
    let with_membership: (&str, &[&str]) = ("setting", &[]);
    for (cmd, extra) in commands().into_iter().chain([with_membership]) {
        // The same file under three spellings: as given, with ./, and through a sub-folder.
        for out in ["c.csv", "./c.csv", "sub/../c.csv"] {
            sb.sandprov()
                .arg(cmd)
                .args(extra)
                .args(["c.csv", "-o", out])
                .assert()
                .code(2)
                .stderr(predicate::str::contains("is also an input"));
            assert_eq!(
                std::fs::read_to_string(&input).unwrap(),
                text,
                "{cmd} -o {out}: the input is unchanged"
            );
        }
        // The absolute path too.
        sb.sandprov()
            .arg(cmd)
            .args(extra)
            .arg("c.csv")
            .arg("-o")
            .arg(&input)
            .assert()
            .code(2);
        assert_eq!(std::fs::read_to_string(&input).unwrap(), text);
    }
}

#[test]
fn setting_refuses_to_write_over_its_field_set_or_model() {
    let sb = Sandbox::new();
    let text = format!("{HEAD}\nA,100,5,5,40,20,10,10,10,3,Unit 0\n");
    sb.write("c.csv", &text);
    let set = std::fs::read_to_string(
        sandprov_tests::repo_root()
            .join("reference-fields")
            .join("dickinson1985-qfl.toml"),
    )
    .unwrap();
    sb.write("lab.toml", &set);
    sb.sandprov()
        .args(["setting", "c.csv", "--fields", "lab.toml", "-o", "lab.toml"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("is also an input"));
    assert_eq!(std::fs::read_to_string(sb.path("lab.toml")).unwrap(), set);
}

#[test]
fn a_good_large_run_writes_every_row() {
    let sb = Sandbox::new();
    // The "bad" row is a good one here, so the table is whole.
    sb.write("big.csv", big_table("LAST,1,1,1,1,1,1,1,1,0,Unit 0"));
    for (cmd, extra) in commands() {
        sb.sandprov()
            .arg(cmd)
            .args(extra)
            .args(["big.csv", "-o", "out.csv"])
            .assert()
            .success();
        let mut r = csv::Reader::from_path(sb.path("out.csv")).unwrap();
        let ids: Vec<String> = r.records().map(|rec| rec.unwrap()[0].to_string()).collect();
        assert_eq!(ids.len(), ROWS + 1, "{cmd}");
        assert_eq!(ids[0], "S0");
        assert_eq!(
            ids[ROWS - 1],
            format!("S{}", ROWS - 1),
            "{cmd}: input order"
        );
        assert_eq!(ids[ROWS], "LAST");
        std::fs::remove_file(sb.path("out.csv")).unwrap();
    }
}

/// Regression: `-o /dev/null` (or any other device or pipe) was written beside and renamed
/// over, which put a plain file in place of the device. A named pipe stands in for the device
/// here, so that a failure cannot harm the machine: the table must come through the pipe and
/// the pipe must still be a pipe.
#[cfg(unix)]
#[test]
fn an_output_that_is_a_pipe_is_written_through_not_replaced() {
    use std::os::unix::fs::FileTypeExt;
    let sb = Sandbox::new();
    sb.write("t.csv", table(50, "Z,1,1,1,1,1,1,1,1,1,Unit 0"));
    let fifo = sb.path("pipe");
    let made = std::process::Command::new("mkfifo").arg(&fifo).status();
    if !made.is_ok_and(|s| s.success()) {
        eprintln!("skipped: mkfifo is not available here");
        return;
    }
    let reader = {
        let fifo = fifo.clone();
        std::thread::spawn(move || std::fs::read(fifo).unwrap())
    };
    sb.run(["modes", "t.csv", "-o", "pipe"]).ok();
    // Checked before waiting on the reader, which would wait for ever on a replaced pipe.
    let kind = std::fs::metadata(&fifo).unwrap().file_type();
    assert!(kind.is_fifo(), "the pipe is still a pipe");
    assert_eq!(sb.files(), ["pipe", "t.csv"], "no temporary file is left");
    let got = String::from_utf8(reader.join().unwrap()).unwrap();
    assert_eq!(
        got.lines().count(),
        52,
        "header and 51 rows through the pipe"
    );
    assert!(got.starts_with("sample,"));
}
