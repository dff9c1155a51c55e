//! Writing a report folder whole or not at all.

use crate::error::{Error, Result};
use std::path::{Path, PathBuf};

/// The marker file that identifies a folder written by sandprov, so that only such a folder is
/// ever replaced.
pub const MARKER: &str = ".sandprov-report";

/// Files of a report, by path relative to the report folder.
///
/// # Example
/// ```
/// use provenance_core::report::ReportFiles;
/// let mut f = ReportFiles::default();
/// f.add("report.html", b"<!DOCTYPE html>".to_vec());
/// assert_eq!(f.files().len(), 1);
/// ```
#[derive(Debug, Clone, Default)]
pub struct ReportFiles {
    files: Vec<(PathBuf, Vec<u8>)>,
}

impl ReportFiles {
    /// Add a file.
    pub fn add(&mut self, relative: impl Into<PathBuf>, bytes: Vec<u8>) {
        self.files.push((relative.into(), bytes));
    }

    /// The files, in the order added.
    pub fn files(&self) -> &[(PathBuf, Vec<u8>)] {
        &self.files
    }

    /// Write every file into a fresh temporary folder beside `dir`, then move it into place.
    /// An existing `dir` is replaced only when it is an earlier sandprov report (it holds the
    /// marker file); any other existing folder or file is refused. `inputs` may not lie inside.
    ///
    /// # Example
    /// ```
    /// use provenance_core::report::ReportFiles;
    /// let tmp = tempfile::tempdir().unwrap();
    /// let dir = tmp.path().join("out");
    /// let mut f = ReportFiles::default();
    /// f.add("figures/a.svg", b"<svg/>".to_vec());
    /// f.write_to(&dir, &[]).unwrap();
    /// assert!(dir.join("figures/a.svg").exists());
    /// f.write_to(&dir, &[]).unwrap(); // an earlier report is replaced
    /// ```
    pub fn write_to(&self, dir: &Path, inputs: &[&Path]) -> Result<()> {
        let werr = |path: &Path, source| Error::Write {
            path: path.display().to_string(),
            source,
        };
        for input in inputs {
            if let (Ok(i), Ok(d)) = (input.canonicalize(), dir.canonicalize()) {
                if i.starts_with(&d) {
                    return Err(Error::OutputIsInput {
                        path: dir.display().to_string(),
                    });
                }
            }
        }
        let empty = std::fs::read_dir(dir).is_ok_and(|mut d| d.next().is_none());
        if dir.exists() && !empty && !dir.join(MARKER).exists() {
            return Err(Error::Usage {
                message: format!(
                    "{} exists and is not a sandprov report folder, expected a new folder name (sandprov replaces only its own earlier reports)",
                    dir.display()
                ),
            });
        }
        let parent = dir
            .parent()
            .filter(|p| !p.as_os_str().is_empty())
            .unwrap_or(Path::new("."));
        std::fs::create_dir_all(parent).map_err(|e| werr(parent, e))?;
        let tmp = tempfile::Builder::new()
            .prefix(".sandprov-report-")
            .tempdir_in(parent)
            .map_err(|e| werr(dir, e))?;
        for (rel, bytes) in &self.files {
            let p = tmp.path().join(rel);
            if let Some(d) = p.parent() {
                std::fs::create_dir_all(d).map_err(|e| werr(d, e))?;
            }
            std::fs::write(&p, bytes).map_err(|e| werr(&p, e))?;
        }
        std::fs::write(tmp.path().join(MARKER), b"written by sandprov\n")
            .map_err(|e| werr(dir, e))?;
        let staged = tmp.keep();
        if dir.exists() && empty {
            std::fs::remove_dir(dir).map_err(|e| werr(dir, e))?;
        }
        if dir.exists() {
            let old = parent.join(format!(
                ".sandprov-old-{}",
                dir.file_name()
                    .map(|n| n.to_string_lossy().into_owned())
                    .unwrap_or_default()
            ));
            let _ = std::fs::remove_dir_all(&old);
            std::fs::rename(dir, &old).map_err(|e| werr(dir, e))?;
            std::fs::rename(&staged, dir).map_err(|e| werr(dir, e))?;
            let _ = std::fs::remove_dir_all(&old);
        } else {
            std::fs::rename(&staged, dir).map_err(|e| werr(dir, e))?;
        }
        Ok(())
    }
}
