//! `sandprov groups` and `sandprov section`, run as a user would.

use sandprov_tests::{demo_counts, json, Run, Sandbox};

const HEAD: &str = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,formation,height_m";

/// `sandprov section --height height_m` with `args`, in the sandbox; the table comes next.
fn section(sb: &Sandbox, args: &[&str]) -> Run {
    sb.run(["section", "--height", "height_m"]).args(args)
}

#[test]
fn groups_json_on_the_demo_has_three_formations_and_their_tests() {
    let sb = Sandbox::new();
    let v = sb
        .run(["groups", "--by", "formation", "--format", "json"])
        .arg(demo_counts())
        .ok()
        .json();
    assert_eq!(v["by"], "formation");
    assert_eq!(v["level"], 0.95);
    let groups = v["groups"].as_array().unwrap();
    let names: Vec<&str> = groups
        .iter()
        .map(|g| g["group"].as_str().unwrap())
        .collect();
    assert_eq!(
        names,
        [
            "Tarn Hollow Formation",
            "Velmor Formation",
            "Askel Formation"
        ]
    );
    let counts: Vec<u64> = groups.iter().map(|g| g["n"].as_u64().unwrap()).collect();
    assert_eq!(counts, [14, 12, 14]);
    for g in groups {
        let qfl = &g["qfl"];
        let m = &qfl["mean"];
        let sum = m["Q"].as_f64().unwrap() + m["F"].as_f64().unwrap() + m["L"].as_f64().unwrap();
        assert!((sum - 100.0).abs() < 0.02);
        for key in ["confidence_region", "prediction_region"] {
            let curve = qfl[key].as_array().unwrap();
            assert_eq!(curve.len(), 97);
            assert_eq!(curve[0], curve[96], "closed curve");
        }
        assert!(qfl["pooled"]["Q"].is_number());
        assert!(qfl["homogeneity"]["pooling_justified"].is_boolean());
        assert!(qfl["sigma_polygon"]["vertices"].is_array());
        assert!(g["lmlvls"]["mean"]["Lv"].is_number());
    }
    // Arc (Tarn Hollow) is lithic-rich, the recycled Askel sands quartz-rich (demo/README.md).
    assert!(groups[0]["qfl"]["mean"]["L"].as_f64().unwrap() > 45.0);
    assert!(groups[2]["qfl"]["mean"]["Q"].as_f64().unwrap() > 55.0);
    let comps = v["comparisons"].as_array().unwrap();
    assert_eq!(comps.len(), 3 * 5);
    for c in comps {
        assert_eq!(c["method"], "hotelling"); // 12-14 samples each: not small
        assert_eq!(c["differ"], true);
        assert!(c["hotelling"]["df2"].is_number());
    }
}

#[test]
fn groups_csv_and_side_tables() {
    let sb = Sandbox::new();
    sb.run(["groups", "--by", "formation", "-o", "g.csv"])
        .args(["--pairwise", "p.csv", "--regions", "r.csv"])
        .arg(demo_counts())
        .ok();
    let g = sb.read("g.csv");
    assert!(g.starts_with("group,n,qfl_n,qfl_points,qfl_mean_Q,qfl_mean_F,qfl_mean_L,"));
    assert_eq!(g.lines().count(), 4);
    let width = g.lines().next().unwrap().split(',').count();
    assert!(
        g.lines().all(|l| l.split(',').count() == width),
        "rectangular table"
    );
    let p = sb.read("p.csv");
    assert_eq!(p.lines().count(), 1 + 15);
    assert!(p
        .lines()
        .nth(1)
        .unwrap()
        .starts_with("qfl,Tarn Hollow Formation,Velmor Formation,14,12,hotelling,"));
    let r = sb.read("r.csv");
    assert!(r.starts_with("group,diagram,region,vertex,p1,p2,p3\n"));
    assert!(r.contains(",qfl,prediction,96,"));
}

#[test]
fn small_groups_get_a_seeded_permutation_test() {
    let sb = Sandbox::new();
    let rows = [
        "a1,100,3,2,40,10,50,5,5,X,1",
        "a2,120,4,1,35,12,40,6,4,X,2",
        "a3,90,5,2,50,9,55,4,6,X,3",
        "a4,110,2,3,45,11,48,5,5,X,4",
        "b1,200,6,3,10,4,10,20,9,Y,5",
        "b2,210,5,3,12,3,9,25,8,Y,6",
        "b3,190,7,3,9,5,12,22,10,Y,7",
    ];
    let input = sb.write("c.csv", format!("{HEAD}\n{}\n", rows.join("\n")));
    let run = |seed: &str| {
        sb.run([
            "groups",
            "--by",
            "formation",
            "--format",
            "json",
            "--seed",
            seed,
        ])
        .arg(&input)
        .ok()
        .output
        .stdout
    };
    let first = run("5");
    assert_eq!(first, run("5"), "same seed, same bytes");
    let v = json(&first);
    let c = &v["comparisons"][0];
    assert_eq!(c["method"], "permutation");
    // 4 + 3 samples: C(7, 3) = 35 splits, enumerated exactly; the observed split is the most
    // extreme, so p = 1/35.
    assert_eq!(c["permutation"]["kind"], "exact");
    assert_eq!(c["permutation"]["splits"], 35);
    assert!((c["p_value"].as_f64().unwrap() - 1.0 / 35.0).abs() < 1e-5);
}

#[test]
fn groups_refusals_name_the_problem() {
    let sb = Sandbox::new();
    let input = sb.write(
        "c.csv",
        format!("{HEAD}\na,1,1,1,1,1,1,1,1,X,1\nb,1,1,1,1,1,1,1,1, ,2\n"),
    );
    sb.run(["groups", "--by", "formaton"])
        .arg(&input)
        .refused(2, &["formaton"]);
    sb.run(["groups", "--by", "formation", "-o", "o.json"])
        .arg(&input)
        .refused(3, &["line 3", "column 10 (\"formation\")", "group name"]);
    assert!(
        !sb.files().contains(&"o.json".to_string()),
        "nothing written on refusal"
    );
    sb.run(["groups", "--by", "formation", "--level", "1.5"])
        .arg(&input)
        .refused(2, &[]);
    // An output over the input is refused.
    sb.run(["groups", "--by", "formation", "--pairwise", "c.csv"])
        .arg(&input)
        .refused(2, &[]);
}

#[test]
fn section_on_the_demo_finds_the_formation_changes() {
    let sb = Sandbox::new();
    section(
        &sb,
        &["--by", "formation", "-o", "s.svg", "--changes", "c.json"],
    )
    .arg(demo_counts())
    .ok();
    let v = sb.read_json("c.json");
    let changes = v["changes"].as_array().unwrap();
    // demo/README.md: formations change at about 390 m and 770 m.
    let between: Vec<(f64, f64)> = changes
        .iter()
        .map(|c| {
            (
                c["below"]["position"].as_f64().unwrap(),
                c["above"]["position"].as_f64().unwrap(),
            )
        })
        .collect();
    assert_eq!(between, [(378.3, 398.2), (763.3, 784.7)]);
    assert_eq!(changes[0]["below"]["sample"], "KB-014");
    assert_eq!(changes[1]["above"]["sample"], "KB-027");
    assert_eq!(v["segments"].as_array().unwrap().len(), 3);
    let svg = sb.read("s.svg");
    let doc = roxmltree::Document::parse(&svg).expect("the SVG parses as XML");
    let ids: Vec<&str> = doc
        .descendants()
        .filter_map(|n| n.attribute("id"))
        .collect();
    assert_eq!(
        ids,
        [
            "background",
            "bands",
            "grid",
            "axes",
            "changes",
            "samples",
            "labels",
            "legend"
        ]
    );
    let texts: Vec<String> = doc
        .descendants()
        .filter(|n| n.has_tag_name("text"))
        .map(|n| n.text().unwrap_or("").trim().to_string())
        .collect();
    for want in [
        "Tarn Hollow Formation",
        "Velmor Formation",
        "Askel Formation",
        "change 378.3–398.2",
        "change 763.3–784.7",
        "height_m",
    ] {
        assert!(texts.iter().any(|t| t == want), "{want} missing");
    }
    assert_eq!(doc.root_element().attribute("width"), Some("175.00mm"));
}

#[test]
fn section_csv_changes_and_depth_axis() {
    let sb = Sandbox::new();
    section(&sb, &["--depth", "-o", "s.svg", "--changes", "c.csv"])
        .arg(demo_counts())
        .ok();
    let csv = sb.read("c.csv");
    let mut lines = csv.lines();
    assert_eq!(lines.next().unwrap(), "change,below_sample,below_position,above_sample,above_position,midpoint,gain,penalty,diagrams,ordering");
    // Read as depths, the deepest sample (KB-040) is the oldest: the same two breaks, listed
    // up-section with the deeper sample below.
    let first: Vec<&str> = lines.next().unwrap().split(',').collect();
    assert_eq!(
        &first[..6],
        ["1", "KB-027", "784.7", "KB-026", "763.3", "774"]
    );
    assert_eq!(first[9], "depth");
    assert_eq!(lines.count(), 1);
}

#[test]
fn hostile_group_names_cannot_inject_markup() {
    let sb = Sandbox::new();
    let evil = "\"<script>alert(1)</script><g onload='x'>&amp;\"";
    let rows: Vec<String> = (0..8)
        .map(|i| {
            format!(
                "s{i},{},3,2,40,10,{},5,5,{},{}",
                100 + i * 7,
                50 - i * 3,
                if i < 4 { evil } else { "Plain" },
                i * 10
            )
        })
        .collect();
    let input = sb.write("c.csv", format!("{HEAD}\n{}\n", rows.join("\n")));
    let title = "<b>T</b> & \u{7}";
    section(&sb, &["--by", "formation", "-o", "s.svg", "--title", title])
        .arg(&input)
        .ok();
    let svg = sb.read("s.svg");
    let doc = roxmltree::Document::parse(&svg).expect("the SVG parses as XML");
    assert!(!doc
        .descendants()
        .any(|n| n.has_tag_name("script") || n.attribute("onload").is_some()));
    let texts: Vec<&str> = doc
        .descendants()
        .filter(|n| n.has_tag_name("text"))
        .filter_map(|n| n.text())
        .collect();
    assert!(
        texts
            .iter()
            .any(|t| t.contains("<script>alert(1)</script>")),
        "shown as text"
    );
    assert!(texts.iter().any(|t| t.contains("<b>T</b> & \u{FFFD}")));
}

#[test]
fn section_writes_png_and_pdf_from_the_same_figure() {
    let sb = Sandbox::new();
    for (name, magic) in [("s.png", &b"\x89PNG"[..]), ("s.pdf", &b"%PDF-"[..])] {
        section(&sb, &["--by", "formation", "-o", name])
            .arg(demo_counts())
            .ok();
        let bytes = std::fs::read(sb.path(name)).unwrap();
        assert!(bytes.starts_with(magic), "{name}");
    }
}

#[test]
fn section_refuses_unknown_figure_formats_and_bad_columns() {
    let sb = Sandbox::new();
    for (args, code, words) in [
        (vec!["-o", "s.txt"], 2, ".svg, .png or .pdf"),
        (vec!["-o", "s.jpg"], 2, ".svg, .png or .pdf"),
        (
            vec!["-o", "s.svg", "--changes", "c.txt"],
            2,
            ".json or .csv",
        ),
        (
            vec!["-o", "s.svg", "--diagram", "qfz"],
            2,
            "unknown diagram",
        ),
        (vec!["-o", "s.svg", "--penalty", "0"], 2, "penalty"),
    ] {
        section(&sb, &args)
            .arg(demo_counts())
            .refused(code, &[words]);
    }
    assert!(sb.files().is_empty(), "nothing written: {:?}", sb.files());
    let input = sb.write(
        "c.csv",
        format!("{HEAD}\na,1,1,1,1,1,1,1,1,X,12\nb,1,1,1,1,1,1,1,1,X,twelve\n"),
    );
    section(&sb, &["-o", "s.svg"])
        .arg(&input)
        .refused(3, &["line 3", "\"twelve\"", "finite number"]);
    assert_eq!(sb.files(), ["c.csv"]);
}

#[test]
fn percent_tables_without_points_get_means_but_no_pooling() {
    // Published percentages without a number of points: no summed counts, so no pooled
    // composition and no χ² check; the means and regions need only the compositions.
    let sb = Sandbox::new();
    let rows = [
        "p1,40,2,1,20,5,25,4,3,X,1",
        "p2,45,1,1,18,6,22,4,3,X,2",
        "p3,38,3,2,22,4,24,4,3,X,3",
        "p4,42,2,0,21,5,23,4,3,X,4",
    ];
    let input = sb.write("p.csv", format!("{HEAD}\n{}\n", rows.join("\n")));
    let v = sb
        .run([
            "groups",
            "--percent",
            "--by",
            "formation",
            "--format",
            "json",
        ])
        .arg(&input)
        .ok()
        .json();
    let qfl = &v["groups"][0]["qfl"];
    assert!(qfl["pooled"].is_null() && qfl["homogeneity"].is_null() && qfl["points"].is_null());
    assert!(qfl["confidence_region"].is_array());
    assert_eq!(qfl["n"], 4);
}
