//! Helpers for the integration and reference checks that run the real `sandprov` binary.
//!
//! The binary is built once per test run with the same cargo and profile, then each test gets
//! a fresh temporary folder to run it in.

use std::path::{Path, PathBuf};
use std::process::Command;
use std::sync::OnceLock;

/// The workspace root.
pub fn repo_root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .parent()
        .expect("the tests crate sits in the workspace root")
        .to_path_buf()
}

/// Path of the `sandprov` binary, built on first use (`cargo build -p provenance-cli`).
pub fn sandprov_path() -> &'static Path {
    static BIN: OnceLock<PathBuf> = OnceLock::new();
    BIN.get_or_init(|| {
        let cargo = std::env::var("CARGO").unwrap_or_else(|_| "cargo".into());
        let release = !cfg!(debug_assertions);
        let mut c = Command::new(cargo);
        c.args([
            "build",
            "--quiet",
            "-p",
            "provenance-cli",
            "--bin",
            "sandprov",
        ]);
        if release {
            c.arg("--release");
        }
        c.current_dir(repo_root());
        let status = c.status().expect("cargo can be started");
        assert!(status.success(), "building the sandprov binary failed");
        let target = std::env::var_os("CARGO_TARGET_DIR")
            .map(PathBuf::from)
            .unwrap_or_else(|| repo_root().join("target"));
        let bin = target
            .join(if release { "release" } else { "debug" })
            .join(format!("sandprov{}", std::env::consts::EXE_SUFFIX));
        assert!(bin.exists(), "no binary at {}", bin.display());
        bin
    })
}

/// A temporary working folder for one test.
pub struct Sandbox {
    dir: tempfile::TempDir,
}

impl Default for Sandbox {
    fn default() -> Self {
        Self::new()
    }
}

impl Sandbox {
    /// A fresh empty folder.
    pub fn new() -> Sandbox {
        Sandbox {
            dir: tempfile::tempdir().expect("a temporary folder can be made"),
        }
    }

    /// A path inside the folder.
    pub fn path(&self, name: &str) -> PathBuf {
        self.dir.path().join(name)
    }

    /// Write a file and return its path.
    pub fn write(&self, name: &str, contents: impl AsRef<[u8]>) -> PathBuf {
        let p = self.path(name);
        std::fs::write(&p, contents).expect("the sandbox is writable");
        p
    }

    /// A `sandprov` command running in the folder.
    pub fn sandprov(&self) -> assert_cmd::Command {
        let mut c = assert_cmd::Command::new(sandprov_path());
        c.current_dir(self.dir.path());
        c
    }

    /// The names of the files in the folder, sorted.
    pub fn files(&self) -> Vec<String> {
        let mut v: Vec<String> = std::fs::read_dir(self.dir.path())
            .expect("the sandbox is readable")
            .filter_map(|e| e.ok().map(|e| e.file_name().to_string_lossy().into_owned()))
            .collect();
        v.sort();
        v
    }
}

/// The bundled demo count table.
pub fn demo_counts() -> PathBuf {
    repo_root().join("demo").join("kessra-basin-counts.csv")
}
