//! Outputs that appear whole or not at all, and never over an input.

use crate::error::{Error, Result};
use std::io::{BufWriter, Write};
use std::path::{Path, PathBuf};

fn resolved(p: &Path) -> PathBuf {
    if let Ok(c) = p.canonicalize() {
        return c;
    }
    let parent = p
        .parent()
        .filter(|q| !q.as_os_str().is_empty())
        .unwrap_or(Path::new("."));
    match (parent.canonicalize(), p.file_name()) {
        (Ok(dir), Some(name)) => dir.join(name),
        _ => p.to_path_buf(),
    }
}

/// Refuse an output path that names one of the inputs (after resolving links and `..`).
///
/// # Example
/// ```
/// use provenance_core::output::check_not_input;
/// use std::path::Path;
/// assert!(check_not_input(Path::new("out.csv"), &[Path::new("in.csv")]).is_ok());
/// assert!(check_not_input(Path::new("./in.csv"), &[Path::new("in.csv")]).is_err());
/// ```
pub fn check_not_input(output: &Path, inputs: &[&Path]) -> Result<()> {
    let out = resolved(output);
    if inputs.iter().any(|i| resolved(i) == out) {
        return Err(Error::OutputIsInput {
            path: output.display().to_string(),
        });
    }
    Ok(())
}

/// A file written under a temporary name beside its target and renamed into place by
/// [`AtomicFile::commit`]. Dropped without commit, it leaves nothing behind.
///
/// # Example
/// ```
/// use provenance_core::output::AtomicFile;
/// use std::io::Write;
/// let dir = tempfile::tempdir().unwrap();
/// let path = dir.path().join("out.csv");
/// let mut f = AtomicFile::create(&path).unwrap();
/// f.write_all(b"a,b\n").unwrap();
/// assert!(!path.exists());
/// f.commit().unwrap();
/// assert_eq!(std::fs::read(&path).unwrap(), b"a,b\n");
/// ```
///
/// A target that exists and is not a regular file (`/dev/null`, `/dev/stdout`, a named pipe)
/// is written directly: a stream cannot be replaced whole, and renaming over it would put a
/// plain file in its place.
pub struct AtomicFile {
    // The file and its temporary path apart: writes to a plain file report the operating
    // system's reason alone, where tempfile's own file adds its temporary name to each error.
    tmp: BufWriter<std::fs::File>,
    /// The temporary path; `None` when the target is a stream written directly.
    tmp_path: Option<tempfile::TempPath>,
    path: PathBuf,
    writeback: Writeback,
}

/// Bytes written between requests to start flushing the file to disk.
const WRITEBACK_BYTES: u64 = 8 << 20;

/// Flushes a large output to disk on a background thread while it is still being written, so
/// that the final `sync_all` before the rename (the durability half of atomic replacement,
/// common practice) waits only for the last few megabytes.
struct Writeback {
    written: u64,
    requested_at: u64,
    /// Off for streams, which have nothing to flush to disk (a pipe refuses `sync_data`).
    enabled: bool,
    worker: Option<(
        std::sync::mpsc::SyncSender<()>,
        std::thread::JoinHandle<std::io::Result<()>>,
    )>,
}

impl Writeback {
    fn off() -> Writeback {
        Writeback {
            written: 0,
            requested_at: 0,
            worker: None,
            enabled: false,
        }
    }

    fn wrote(&mut self, n: usize, file: &std::fs::File) {
        if !self.enabled {
            return;
        }
        self.written += n as u64;
        if self.written - self.requested_at < WRITEBACK_BYTES {
            return;
        }
        self.requested_at = self.written;
        if self.worker.is_none() {
            // Without a second handle the final sync does all the work: no loss, only time.
            let Ok(file) = file.try_clone() else { return };
            let (tx, rx) = std::sync::mpsc::sync_channel::<()>(1);
            let handle = std::thread::spawn(move || {
                for () in rx {
                    file.sync_data()?;
                }
                Ok(())
            });
            self.worker = Some((tx, handle));
        }
        if let Some((tx, _)) = &self.worker {
            // A request still pending covers this one.
            let _ = tx.try_send(());
        }
    }

    /// Wait for the background flushes; their errors are the file's errors.
    fn finish(&mut self) -> std::io::Result<()> {
        match self.worker.take() {
            Some((tx, handle)) => {
                drop(tx);
                handle
                    .join()
                    .unwrap_or_else(|_| Err(std::io::Error::other("writeback thread failed")))
            }
            None => Ok(()),
        }
    }
}

impl AtomicFile {
    /// Start writing `path`.
    pub fn create(path: &Path) -> Result<AtomicFile> {
        let werr = |source| Error::Write {
            path: path.display().to_string(),
            source,
        };
        let special = std::fs::metadata(path).is_ok_and(|m| !m.is_file() && !m.is_dir());
        if special {
            let stream = std::fs::OpenOptions::new()
                .write(true)
                .open(path)
                .map_err(werr)?;
            return Ok(AtomicFile {
                tmp: BufWriter::with_capacity(1 << 16, stream),
                tmp_path: None,
                path: path.to_path_buf(),
                writeback: Writeback::off(),
            });
        }
        let dir = path
            .parent()
            .filter(|p| !p.as_os_str().is_empty())
            .unwrap_or(Path::new("."));
        let (tmp, tmp_path) = tempfile::Builder::new()
            .prefix(".sandprov-")
            .suffix(".partial")
            .tempfile_in(dir)
            .map_err(|source| Error::Write {
                path: path.display().to_string(),
                source: without_temporary_name(source),
            })?
            .into_parts();
        Ok(AtomicFile {
            tmp: BufWriter::with_capacity(1 << 16, tmp),
            tmp_path: Some(tmp_path),
            path: path.to_path_buf(),
            writeback: Writeback {
                written: 0,
                requested_at: 0,
                worker: None,
                enabled: true,
            },
        })
    }

    /// The final path.
    pub fn path(&self) -> &Path {
        &self.path
    }

    /// Flush and move the file into place.
    pub fn commit(mut self) -> Result<()> {
        let path = self.path.display().to_string();
        let err = |source| Error::Write {
            path: path.clone(),
            source,
        };
        self.tmp.flush().map_err(err)?;
        self.writeback.finish().map_err(err)?;
        let tmp = self.tmp.into_inner().map_err(|e| err(e.into_error()))?;
        let Some(tmp_path) = self.tmp_path else {
            // A stream: everything is written once it is flushed.
            return Ok(());
        };
        // Temporary files are created private (0600); a finished output gets the usual
        // permissions of a new file (0644 before the umask), as any other program's would.
        #[cfg(unix)]
        {
            use std::os::unix::fs::PermissionsExt;
            let mode = 0o666 & !current_umask();
            tmp.set_permissions(std::fs::Permissions::from_mode(mode))
                .map_err(err)?;
        }
        tmp.sync_all().map_err(err)?;
        drop(tmp);
        tmp_path.persist(&self.path).map_err(|e| err(e.error))?;
        Ok(())
    }
}

/// The operating system's reason for a failure to create the temporary file, without the
/// temporary file's name that tempfile appends (`… at path "…/.sandprov-….partial"`): the
/// user asked for the output path, which the message names already.
fn without_temporary_name(e: std::io::Error) -> std::io::Error {
    if e.raw_os_error().is_some() {
        return e;
    }
    let text = e.to_string();
    match text.rfind(" at path \"") {
        Some(i) if text.ends_with('"') => std::io::Error::new(e.kind(), &text[..i]),
        _ => e,
    }
}

impl Write for AtomicFile {
    fn write(&mut self, buf: &[u8]) -> std::io::Result<usize> {
        let n = self.tmp.write(buf)?;
        self.writeback.wrote(n, self.tmp.get_ref());
        Ok(n)
    }
    fn flush(&mut self) -> std::io::Result<()> {
        self.tmp.flush()
    }
}

/// The process umask, read without changing it for longer than the call (Linux reports it in
/// /proc; elsewhere 022, the common default).
#[cfg(unix)]
fn current_umask() -> u32 {
    std::fs::read_to_string("/proc/self/status")
        .ok()
        .and_then(|s| {
            s.lines()
                .find_map(|l| l.strip_prefix("Umask:"))
                .and_then(|v| u32::from_str_radix(v.trim(), 8).ok())
        })
        .unwrap_or(0o022)
}

/// Where a table goes: standard output, or an atomic file.
///
/// # Example
/// ```
/// use provenance_core::output::Sink;
/// use std::io::Write;
/// let dir = tempfile::tempdir().unwrap();
/// let path = dir.path().join("t.csv");
/// let mut s = Sink::open(Some(&path), &[]).unwrap();
/// writeln!(s, "x").unwrap();
/// s.finish().unwrap();
/// assert!(path.exists());
/// ```
pub enum Sink {
    /// Standard output, buffered.
    Stdout(BufWriter<std::io::Stdout>),
    /// A file that appears only on success.
    File(AtomicFile),
}

impl Sink {
    /// Standard output when `path` is `None` or `-`, otherwise an atomic file; refuses a path
    /// equal to one of `inputs`.
    pub fn open(path: Option<&Path>, inputs: &[&Path]) -> Result<Sink> {
        match path {
            None => Ok(Sink::Stdout(BufWriter::with_capacity(
                1 << 16,
                std::io::stdout(),
            ))),
            Some(p) if p.as_os_str() == "-" => Ok(Sink::Stdout(BufWriter::with_capacity(
                1 << 16,
                std::io::stdout(),
            ))),
            Some(p) => {
                check_not_input(p, inputs)?;
                Ok(Sink::File(AtomicFile::create(p)?))
            }
        }
    }

    /// A name for messages.
    pub fn name(&self) -> String {
        match self {
            Sink::Stdout(_) => "standard output".into(),
            Sink::File(f) => f.path().display().to_string(),
        }
    }

    /// Flush standard output, or commit the file.
    pub fn finish(self) -> Result<()> {
        match self {
            Sink::Stdout(mut w) => w.flush().map_err(|source| Error::Write {
                path: "standard output".into(),
                source,
            }),
            Sink::File(f) => f.commit(),
        }
    }
}

impl Write for Sink {
    fn write(&mut self, buf: &[u8]) -> std::io::Result<usize> {
        match self {
            Sink::Stdout(w) => w.write(buf),
            Sink::File(f) => f.write(buf),
        }
    }
    fn flush(&mut self) -> std::io::Result<()> {
        match self {
            Sink::Stdout(w) => w.flush(),
            Sink::File(f) => f.flush(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[cfg(unix)]
    #[test]
    fn a_device_is_written_through_and_stays_a_device() {
        // Regression: committing renamed a temporary file over /dev/null. Opening it for
        // writing is harmless; after the fix the device must still be a character device.
        use std::os::unix::fs::FileTypeExt;
        let null = Path::new("/dev/null");
        if !std::fs::metadata(null).is_ok_and(|m| m.file_type().is_char_device()) {
            eprintln!("skipped: /dev/null is not a character device here");
            return;
        }
        let mut f = AtomicFile::create(null).unwrap();
        f.write_all(&[b'x'; 100_000]).unwrap();
        f.commit().unwrap();
        assert!(std::fs::metadata(null)
            .unwrap()
            .file_type()
            .is_char_device());
    }

    #[test]
    fn a_missing_folder_is_reported_once_under_the_output_path() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("no-such-folder").join("out.csv");
        // The operating system's own words for the same failure.
        let reason = std::fs::File::create(&target).unwrap_err();
        let e = AtomicFile::create(&target).err().unwrap().to_string();
        assert_eq!(e, format!("cannot write {}: {reason}", target.display()));
    }

    #[test]
    fn only_an_appended_temporary_name_is_taken_off() {
        let named = std::io::Error::new(
            std::io::ErrorKind::PermissionDenied,
            "Permission denied (os error 13) at path \"/data/.sandprov-x1.partial\"",
        );
        let plain = without_temporary_name(named);
        assert_eq!(plain.kind(), std::io::ErrorKind::PermissionDenied);
        assert_eq!(plain.to_string(), "Permission denied (os error 13)");
        let other = std::io::Error::other("disk on fire");
        assert_eq!(without_temporary_name(other).to_string(), "disk on fire");
        let os = std::io::Error::from_raw_os_error(2);
        let shown = os.to_string();
        assert_eq!(without_temporary_name(os).to_string(), shown);
    }
}
