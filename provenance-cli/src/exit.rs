//! Exit codes, documented in `--help` and the README.

use provenance_core::error::{Error, ErrorKind};

/// Success.
pub const OK: i32 = 0;
/// An internal failure (a bug: please report it).
pub const INTERNAL: i32 = 1;
/// A usage error: bad arguments (clap also exits with 2), or an output equal to an input.
pub const USAGE: i32 = 2;
/// The input data were refused.
pub const BAD_INPUT: i32 = 3;
/// A file could not be read or written.
pub const IO: i32 = 4;

/// The exit code for an error.
pub fn code_for(e: &Error) -> i32 {
    match e.kind() {
        ErrorKind::Input => BAD_INPUT,
        ErrorKind::Io => IO,
        ErrorKind::Usage => USAGE,
        _ => INTERNAL,
    }
}

/// The text appended to `--help`.
pub const HELP: &str = "Exit codes:
  0  success
  1  internal failure (a bug; please report it)
  2  usage error (bad arguments, or an output path equal to an input)
  3  input refused (the message names file, line, column, value and what was expected)
  4  a file could not be read or written

Interpretations support, and never replace, petrographic judgement.";
