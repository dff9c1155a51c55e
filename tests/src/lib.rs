//! Helpers for the integration and reference checks that run the real `sandprov` binary.
//!
//! The binary is built once per test run with the same cargo and profile, then each test gets
//! a fresh temporary folder to run it in. A [`Run`] names the arguments of one run and then
//! what the run must do: [`Run::ok`] expects exit 0, [`Run::refused`] an exit code and words in
//! stderr. Either returns the [`Ran`] output for further checks; every failed expectation
//! shows the command line, the exit code, stdout and stderr.

use std::ffi::{OsStr, OsString};
use std::path::{Path, PathBuf};
use std::process::{Command, Output};
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

    /// The text of a file in the folder.
    pub fn read(&self, name: &str) -> String {
        let p = self.path(name);
        std::fs::read_to_string(&p).unwrap_or_else(|e| panic!("cannot read {}: {e}", p.display()))
    }

    /// A JSON file in the folder.
    pub fn read_json(&self, name: &str) -> serde_json::Value {
        json(self.read(name).as_bytes())
    }

    /// A run of `sandprov` with these arguments, in the folder.
    pub fn run<I, S>(&self, args: I) -> Run
    where
        I: IntoIterator<Item = S>,
        S: AsRef<OsStr>,
    {
        let mut run = run(args);
        run.cmd.current_dir(self.dir.path());
        run
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

/// The shipped field-set file `name` in `reference-fields/`.
pub fn reference_fields(name: &str) -> PathBuf {
    repo_root().join("reference-fields").join(name)
}

/// Parse JSON, showing the text when it is not JSON.
pub fn json(bytes: &[u8]) -> serde_json::Value {
    serde_json::from_slice(bytes)
        .unwrap_or_else(|e| panic!("not JSON ({e}):\n{}", String::from_utf8_lossy(bytes)))
}

/// Assert that nothing exists at `path` (a refused run writes nothing).
pub fn assert_no_file(path: impl AsRef<Path>) {
    let path = path.as_ref();
    assert!(
        !path.exists(),
        "{} exists: a refused run must leave nothing behind",
        path.display()
    );
}

/// A run of `sandprov` with these arguments, in the test's own working folder.
pub fn run<I, S>(args: I) -> Run
where
    I: IntoIterator<Item = S>,
    S: AsRef<OsStr>,
{
    Run {
        cmd: Command::new(sandprov_path()),
        args: Vec::new(),
    }
    .args(args)
}

/// One run of the `sandprov` binary, being set up: add arguments and environment, then run it
/// with [`Run::ok`] or [`Run::refused`].
#[must_use = "a Run does nothing until `ok` or `refused` runs it"]
pub struct Run {
    cmd: Command,
    args: Vec<OsString>,
}

impl Run {
    /// One more argument.
    pub fn arg(mut self, arg: impl AsRef<OsStr>) -> Run {
        self.cmd.arg(arg.as_ref());
        self.args.push(arg.as_ref().to_owned());
        self
    }

    /// More arguments.
    pub fn args<I, S>(self, args: I) -> Run
    where
        I: IntoIterator<Item = S>,
        S: AsRef<OsStr>,
    {
        args.into_iter().fold(self, |run, a| run.arg(a))
    }

    /// An environment variable for the run.
    pub fn env(mut self, key: &str, value: &str) -> Run {
        self.cmd.env(key, value);
        self
    }

    /// Run it and expect exit 0.
    pub fn ok(self) -> Ran {
        let ran = self.output();
        assert!(ran.output.status.success(), "expected success: {ran}");
        ran
    }

    /// Run it and expect exit `code`, with each of `parts` in stderr.
    pub fn refused(self, code: i32, parts: &[&str]) -> Ran {
        let ran = self.output();
        assert_eq!(ran.output.status.code(), Some(code), "exit code: {ran}");
        ran.stderr_has(parts)
    }

    fn output(mut self) -> Ran {
        let output = self
            .cmd
            .output()
            .expect("the sandprov binary can be started");
        let line: Vec<String> = self
            .args
            .iter()
            .map(|a| a.to_string_lossy().into_owned())
            .collect();
        Ran {
            output,
            line: line.join(" "),
        }
    }
}

/// The outcome of a [`Run`], for checks on its output.
pub struct Ran {
    /// Exit status, stdout and stderr.
    pub output: Output,
    line: String,
}

impl Ran {
    /// Stdout as text.
    pub fn stdout(&self) -> String {
        String::from_utf8(self.output.stdout.clone())
            .unwrap_or_else(|e| panic!("stdout is not UTF-8 ({e}): {self}"))
    }

    /// Stdout parsed as JSON.
    pub fn json(&self) -> serde_json::Value {
        json(&self.output.stdout)
    }

    /// Assert that stdout holds each of `parts`.
    pub fn stdout_has(self, parts: &[&str]) -> Ran {
        self.has("stdout", &self.output.stdout, parts);
        self
    }

    /// Assert that stderr holds each of `parts`.
    pub fn stderr_has(self, parts: &[&str]) -> Ran {
        self.has("stderr", &self.output.stderr, parts);
        self
    }

    fn has(&self, stream: &str, bytes: &[u8], parts: &[&str]) {
        let text = String::from_utf8_lossy(bytes);
        for part in parts {
            assert!(text.contains(part), "{part:?} not in {stream}: {self}");
        }
    }
}

impl std::fmt::Display for Ran {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "sandprov {}\nexit: {:?}\nstdout:\n{}\nstderr:\n{}",
            self.line,
            self.output.status.code(),
            String::from_utf8_lossy(&self.output.stdout),
            String::from_utf8_lossy(&self.output.stderr)
        )
    }
}
