//! Errors. Every refusal says where (file, line, column), what was found and what was expected.
//!
//! Core never prints and never exits: it returns an [`Error`] and the caller decides.

use std::fmt;

/// A column of an input table: its 1-based position and its header text.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Column {
    /// 1-based position, as a spreadsheet counts.
    pub index: usize,
    /// The header text of the column; in a model, mapping or field-set file, the key written
    /// there. Not shown when empty (a position with no header or key, such as a stray byte).
    pub name: String,
}

/// Where in an input a problem sits.
///
/// # Example
/// ```
/// use provenance_core::error::{Column, Location};
/// let at = Location::new("counts.csv").line(7).column(Column { index: 5, name: "Lv".into() });
/// assert_eq!(at.to_string(), "counts.csv, line 7, column 5 (\"Lv\")");
/// let stray = Location::new("m.json").line(2).column(Column { index: 9, name: String::new() });
/// assert_eq!(stray.to_string(), "m.json, line 2, column 9");
/// ```
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Location {
    /// The file, as the user named it.
    pub file: String,
    /// 1-based line, as an editor shows it.
    pub line: Option<u64>,
    /// The column, when one cell is at fault (boxed to keep errors small).
    pub column: Option<Box<Column>>,
}

impl Location {
    /// A location naming only a file.
    pub fn new(file: impl Into<String>) -> Self {
        Location {
            file: file.into(),
            line: None,
            column: None,
        }
    }

    /// The same location at a line.
    pub fn line(mut self, line: u64) -> Self {
        self.line = Some(line);
        self
    }

    /// The same location at a column.
    pub fn column(mut self, column: Column) -> Self {
        self.column = Some(Box::new(column));
        self
    }
}

impl fmt::Display for Location {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}", self.file)?;
        if let Some(line) = self.line {
            write!(f, ", line {line}")?;
        }
        if let Some(c) = &self.column {
            write!(f, ", column {}", c.index)?;
            if !c.name.is_empty() {
                write!(f, " ({:?})", c.name)?;
            }
        }
        Ok(())
    }
}

/// Broad classes of error, for mapping to exit codes.
///
/// # Example
/// ```
/// use provenance_core::error::{Error, ErrorKind};
/// let e = Error::EmptyInput { file: "a.csv".into() };
/// assert_eq!(e.kind(), ErrorKind::Input);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum ErrorKind {
    /// The data were refused: fix the input.
    Input,
    /// A file could not be read or written.
    Io,
    /// The request itself was inconsistent (for example an output path equal to an input).
    Usage,
    /// A failure inside sandprov (a bug), not caused by the input.
    Internal,
}

/// Everything that can go wrong in sandprov's core.
///
/// # Example
/// ```
/// use provenance_core::error::{Error, Location};
/// let e = Error::InvalidValue {
///     at: Location::new("c.csv").line(3),
///     value: "-2".into(),
///     expected: "a whole number of points, 0 or more".into(),
/// };
/// assert!(e.to_string().contains("line 3"));
/// ```
#[derive(Debug, thiserror::Error)]
#[non_exhaustive]
pub enum Error {
    /// A file could not be opened or read.
    #[error("cannot read {path}: {source}")]
    Read {
        /// The file.
        path: String,
        /// The operating system's reason.
        source: std::io::Error,
    },
    /// An output could not be written.
    #[error("cannot write {path}: {source}")]
    Write {
        /// The file.
        path: String,
        /// The operating system's reason.
        source: std::io::Error,
    },
    /// A cell holds a value of the wrong kind.
    #[error("{at}: found {value:?}, expected {expected}")]
    InvalidValue {
        /// Where.
        at: Location,
        /// The offending text.
        value: String,
        /// What would have been accepted.
        expected: String,
    },
    /// A row has no sample id.
    #[error("{at}: the sample id is empty, expected a non-empty id")]
    MissingId {
        /// Where.
        at: Location,
    },
    /// Two rows share a sample id.
    #[error("{at}: sample id {id:?} was already used on line {first_line}, expected unique ids")]
    DuplicateId {
        /// Where the second use is.
        at: Location,
        /// The id.
        id: String,
        /// The line of the first use.
        first_line: u64,
    },
    /// A row has more or fewer cells than the header.
    #[error("{at}: the row has {found} cells, expected {expected} as in the header")]
    RaggedRow {
        /// Where.
        at: Location,
        /// Cells found.
        found: usize,
        /// Cells in the header.
        expected: usize,
    },
    /// The file holds no header and no rows.
    #[error("{file}: the file is empty, expected a header line and one row per sample")]
    EmptyInput {
        /// The file.
        file: String,
    },
    /// The input is not UTF-8 text (or holds a NUL byte).
    #[error("{at}: the bytes are not UTF-8 text, expected {expected}")]
    NotText {
        /// Where the first offending byte is.
        at: Location,
        /// What kind of file was expected, such as "a CSV table".
        expected: String,
    },
    /// The header names no count column at all.
    #[error("{at}: no recognisable count columns among {headers:?}, expected Qm, Qp, C, P, K, Lv, Ls, Lm (or a --scheme mapping)")]
    NoCountColumns {
        /// The header line.
        at: Location,
        /// The header cells found.
        headers: Vec<String>,
    },
    /// Some framework columns are missing.
    #[error("{at}: missing column(s) {missing}, expected every framework category (Qm, Qp, P, K, Lv, Ls, Lm; C optional) or a --scheme mapping")]
    MissingColumns {
        /// The header line.
        at: Location,
        /// The missing categories, comma-separated.
        missing: String,
    },
    /// Two header cells claim the same role.
    #[error("{at}: column {name:?} repeats column {first} for the same category, expected each category once (use a --scheme mapping to sum columns)")]
    DuplicateColumn {
        /// Where the second column is.
        at: Location,
        /// The category it would feed.
        name: String,
        /// The 1-based index of the first column.
        first: usize,
    },
    /// A mapping, field-set or model file is malformed.
    #[error("{at}: {message}, expected {expected}")]
    Malformed {
        /// Where.
        at: Location,
        /// What is wrong.
        message: String,
        /// What would have been accepted.
        expected: String,
    },
    /// A classifier cannot be trained or applied as asked.
    #[error("{file}: {message}, expected {expected}")]
    Training {
        /// The labelled table or model file.
        file: String,
        /// What is wrong.
        message: String,
        /// What would have worked.
        expected: String,
    },
    /// An output path equals an input path.
    #[error("output {path} is also an input, expected a different output path (inputs are never overwritten)")]
    OutputIsInput {
        /// The path.
        path: String,
    },
    /// A `--fields` value is neither an embedded field-set id nor a file.
    #[error("unknown field set {spec:?}: not an embedded id and no such file, expected one of {known} or the path of a field-set file")]
    UnknownFieldSet {
        /// The value given.
        spec: String,
        /// The embedded ids, comma-separated.
        known: String,
    },
    /// A field set failed its check (bad vertices, non-simple polygons, overlapping fields).
    #[error("{file}: the field set is invalid, expected one that passes the field-set check:\n  {}", problems.join("\n  "))]
    InvalidFieldSet {
        /// The set's file (or `embedded:ID`).
        file: String,
        /// Every problem, each naming its line, key, value and what was expected.
        problems: Vec<String>,
    },
    /// The request is inconsistent.
    #[error("{message}")]
    Usage {
        /// What is wrong, in words.
        message: String,
    },
    /// A grouping column has more distinct values than a figure can give distinct symbols.
    #[error("{at}: column {column:?} has more than {max} distinct values, expected at most {max} groups for distinct plot symbols (choose a coarser column)")]
    TooManyGroups {
        /// Where the first value over the limit is.
        at: Location,
        /// The grouping column.
        column: String,
        /// The largest number of groups.
        max: usize,
    },
    /// Drawing or converting a figure failed inside sandprov (a bug).
    #[error("cannot render the figure: {message}")]
    Render {
        /// What failed.
        message: String,
    },
}

impl Error {
    /// The broad class of this error.
    ///
    /// # Example
    /// ```
    /// use provenance_core::error::{Error, ErrorKind};
    /// let e = Error::OutputIsInput { path: "a.csv".into() };
    /// assert_eq!(e.kind(), ErrorKind::Usage);
    /// ```
    pub fn kind(&self) -> ErrorKind {
        match self {
            Error::Read { .. } | Error::Write { .. } => ErrorKind::Io,
            Error::OutputIsInput { .. } | Error::Usage { .. } | Error::UnknownFieldSet { .. } => {
                ErrorKind::Usage
            }
            Error::Render { .. } => ErrorKind::Internal,
            _ => ErrorKind::Input,
        }
    }

    /// The line of a refusal that sits in one row of a table, if it does.
    pub(crate) fn row_line(&self) -> Option<u64> {
        match self {
            Error::InvalidValue { at, .. }
            | Error::MissingId { at, .. }
            | Error::DuplicateId { at, .. }
            | Error::RaggedRow { at, .. }
            | Error::NotText { at, .. }
            | Error::Malformed { at, .. } => at.line,
            _ => None,
        }
    }
}

/// Result with sandprov's [`Error`].
pub type Result<T> = std::result::Result<T, Error>;
