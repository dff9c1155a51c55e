//! `sandprov plot` end to end, on an invented table written by the test.

use std::path::Path;
use std::process::Command;

const TABLE: &str = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,formation\n\
VX-01,60,8,3,90,20,110,6,5,Lower Vell\n\
VX-02,70,6,2,80,25,100,8,4,Lower Vell\n\
VX-03,140,20,8,60,40,40,25,20,Middle Vell\n\
VX-04,230,15,10,25,30,10,20,15,Upper Vell\n";

fn sandprov(args: &[&str], dir: &Path) -> std::process::Output {
    Command::new(env!("CARGO_BIN_EXE_sandprov"))
        .args(args)
        .current_dir(dir)
        .output()
        .expect("the binary runs")
}

#[test]
fn plot_writes_svg_png_and_pdf() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("counts.csv"), TABLE).unwrap();
    for (out, magic) in [
        ("fig.svg", &b"<?xml"[..]),
        ("fig.png", &b"\x89PNG"[..]),
        ("fig.pdf", &b"%PDF-"[..]),
    ] {
        let o = sandprov(
            &[
                "plot",
                "counts.csv",
                "--diagram",
                "qfl,qmflt",
                "--by",
                "formation",
                "--labels",
                "--size",
                "double",
                "-o",
                out,
            ],
            dir.path(),
        );
        assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
        let bytes = std::fs::read(dir.path().join(out)).unwrap();
        assert!(bytes.starts_with(magic), "{out}");
    }
    let svg = std::fs::read_to_string(dir.path().join("fig.svg")).unwrap();
    assert!(svg.contains("width=\"175.00mm\""));
    assert!(svg.contains("Middle Vell") && svg.contains("VX-04"));
}

#[test]
fn plot_refuses_bad_requests_and_writes_nothing() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("counts.csv"), TABLE).unwrap();
    // Unknown output type: usage error.
    let o = sandprov(
        &["plot", "counts.csv", "--diagram", "qfl", "-o", "fig.jpg"],
        dir.path(),
    );
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains(".svg, .png or .pdf"));
    // Unknown diagram and bad size: usage errors.
    let o = sandprov(
        &["plot", "counts.csv", "--diagram", "qxl", "-o", "f.svg"],
        dir.path(),
    );
    assert_eq!(o.status.code(), Some(2));
    let o = sandprov(
        &[
            "plot",
            "counts.csv",
            "--diagram",
            "qfl",
            "--size",
            "9mm",
            "-o",
            "f.svg",
        ],
        dir.path(),
    );
    assert_eq!(o.status.code(), Some(2));
    // A grouping column that does not exist: input refused, naming the file and the choices.
    let o = sandprov(
        &[
            "plot",
            "counts.csv",
            "--diagram",
            "qfl",
            "--by",
            "member",
            "-o",
            "f.svg",
        ],
        dir.path(),
    );
    assert_eq!(o.status.code(), Some(3));
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(
        err.contains("counts.csv") && err.contains("formation"),
        "{err}"
    );
    assert!(!dir.path().join("f.svg").exists());
    // The output may not overwrite the input.
    let o = sandprov(
        &["plot", "counts.csv", "--diagram", "qfl", "-o", "counts.csv"],
        dir.path(),
    );
    assert_ne!(o.status.code(), Some(0));
    assert_eq!(
        std::fs::read_to_string(dir.path().join("counts.csv")).unwrap(),
        TABLE
    );
}
