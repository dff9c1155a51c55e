//! The help text lists the field and setting commands. (Being an integration test of this
//! package, it also makes `cargo test --workspace` build the `sandprov` binary that the
//! cross-crate tests in `tests/` run.)

use std::process::Command;

#[test]
fn help_lists_fields_and_setting() {
    let out = Command::new(env!("CARGO_BIN_EXE_sandprov"))
        .arg("--help")
        .output()
        .expect("run sandprov --help");
    assert!(out.status.success());
    let text = String::from_utf8_lossy(&out.stdout);
    for word in ["fields", "setting", "petrographic judgement"] {
        assert!(text.contains(word), "--help lacks {word:?}:\n{text}");
    }
    let out = Command::new(env!("CARGO_BIN_EXE_sandprov"))
        .args(["setting", "--help"])
        .output()
        .expect("run sandprov setting --help");
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains("--fields <ID|FILE>"), "{text}");
}
