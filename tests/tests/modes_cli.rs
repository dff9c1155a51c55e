//! `sandprov modes` and `sandprov plan`, run as a user would.

use sandprov_tests::{demo_counts, Sandbox};

const HEAD: &str = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,formation";

#[test]
fn modes_csv_on_the_demo_has_one_row_per_sample() {
    let sb = Sandbox::new();
    let text = sb.run(["modes"]).arg(demo_counts()).ok().stdout();
    let mut lines = text.lines();
    let header = lines.next().unwrap();
    assert!(header.starts_with(
        "sample,formation,height_m,notes,framework_total,matrix_pct,qfl_n,qfl_Q,qfl_Q_sd"
    ));
    assert_eq!(lines.count(), 40);
}

#[test]
fn modes_json_is_the_stable_interface() {
    let sb = Sandbox::new();
    // 252 + 83 + 77 = 412 points: Q 61.17, F 20.15, L 18.69 (hand-worked, as in the interface).
    let input = sb.write(
        "c.csv",
        format!("{HEAD}\nKR-1,240,8,4,50,33,40,20,17,Upper\n"),
    );
    let v = sb
        .run(["modes", "--format", "json"])
        .arg(&input)
        .ok()
        .json();
    let s = &v[0];
    assert_eq!(s["sample"], "KR-1");
    assert_eq!(s["qfl"]["n"], 412);
    assert_eq!(s["qfl"]["Q"], 61.17);
    assert_eq!(s["qfl"]["F"], 20.15);
    assert_eq!(s["qfl"]["L"], 18.69);
    assert_eq!(s["qfl"]["sd"]["Q"], 2.4);
    assert!(s["qfl"]["ci95"]["wilson"]["Q"].is_array());
    assert!(s["qfl"]["ci95"]["clopper_pearson"]["L"].is_array());
    for (d, poles) in [
        ("qmflt", ["Qm", "F", "Lt"]),
        ("qmpk", ["Qm", "P", "K"]),
        ("qplvlsm", ["Qp", "Lv", "Lsm"]),
        ("lmlvls", ["Lm", "Lv", "Ls"]),
    ] {
        for p in poles {
            assert!(s[d][p].is_number(), "{d}.{p}");
        }
    }
    assert_eq!(s["metadata"]["formation"], "Upper");
    assert!(s["ratios"]["P/F"].is_number());
}

#[test]
fn bad_input_exits_3_and_names_the_place() {
    let sb = Sandbox::new();
    let input = sb.write(
        "bad.csv",
        format!("{HEAD}\nA,1,1,1,1,1,1,1,1,x\nB,1,1,1,-4,1,1,1,1,y\n"),
    );
    sb.run(["modes"]).arg(&input).refused(
        3,
        &["bad.csv, line 3, column 5 (\"P\"): found \"-4\", expected a whole number"],
    );
}

#[test]
fn failed_runs_leave_no_output_file() {
    let sb = Sandbox::new();
    let mut text = format!("{HEAD}\n");
    for i in 0..20_000 {
        text.push_str(&format!("S{i},100,5,5,40,20,10,10,10,x\n"));
    }
    text.push_str("LAST,1,1,1,1,1,1,1,oops,x\n");
    let input = sb.write("big.csv", text);
    sb.run(["modes"])
        .arg(&input)
        .args(["-o", "out.csv"])
        .refused(3, &[]);
    assert_eq!(
        sb.files(),
        ["big.csv"],
        "no partial or temporary file is left"
    );
}

#[test]
fn an_output_equal_to_the_input_is_refused() {
    let sb = Sandbox::new();
    let text = format!("{HEAD}\nA,1,1,1,1,1,1,1,1,x\n");
    let input = sb.write("c.csv", &text);
    sb.run(["modes", "c.csv", "-o", "./c.csv"])
        .refused(2, &["is also an input"]);
    assert_eq!(std::fs::read_to_string(input).unwrap(), text);
}

#[test]
fn successful_output_is_written_whole() {
    let sb = Sandbox::new();
    sb.write("c.csv", format!("{HEAD}\nA,1,1,1,1,1,1,1,1,x\n"));
    sb.run(["modes", "c.csv", "-o", "m.json", "--format", "json"])
        .ok();
    let v = sb.read_json("m.json");
    assert_eq!(v.as_array().unwrap().len(), 1);
    assert_eq!(sb.files(), ["c.csv", "m.json"]);
}

#[test]
fn missing_file_exits_4() {
    let sb = Sandbox::new();
    sb.run(["modes", "nope.csv"])
        .refused(4, &["cannot read nope.csv"]);
}

#[test]
fn usage_errors_exit_2_and_help_lists_exit_codes() {
    let sb = Sandbox::new();
    sb.run(["modes"]).refused(2, &[]);
    sb.run(["--help"]).ok().stdout_has(&["3  input refused"]);
}

#[test]
fn binary_garbage_is_refused_without_a_panic() {
    let sb = Sandbox::new();
    sb.write("g.csv", [0u8, 159, 146, 150, 0, 255, 10, 1, 2]);
    sb.run(["modes", "g.csv"]).refused(3, &["not UTF-8 text"]);
}

#[test]
fn intervals_add_wilson_and_clopper_pearson_columns() {
    let sb = Sandbox::new();
    sb.write("c.csv", format!("{HEAD}\nA,150,0,0,150,0,0,0,0,x\n"));
    let text = sb.run(["modes", "c.csv", "--intervals"]).ok().stdout();
    let rows: Vec<Vec<&str>> = text.lines().map(|l| l.split(',').collect()).collect();
    let col = |name: &str| rows[0].iter().position(|h| *h == name).unwrap();
    // 150 of 300: SciPy 1.17.1 binomtest Wilson (44.38, 55.62), exact (44.20, 55.80)
    // (tests/reference/counting_intervals.csv).
    assert_eq!(rows[1][col("qfl_Q_wilson_lo")], "44.38");
    assert_eq!(rows[1][col("qfl_Q_wilson_hi")], "55.62");
    assert_eq!(rows[1][col("qfl_Q_cp_lo")], "44.20");
    assert_eq!(rows[1][col("qfl_Q_cp_hi")], "55.80");
}

#[test]
fn plan_gives_points_needed() {
    let sb = Sandbox::new();
    // n = 4p(100 − p)/E² (Van der Plas & Tobi 1965): p = 50, E = 5 → 400.
    sb.run(["plan", "--proportion", "50", "--two-sigma", "5"])
        .ok()
        .stdout_has(&["50,5,400"]);
    sb.run(["plan", "--two-sigma", "0"]).refused(2, &[]);
}
