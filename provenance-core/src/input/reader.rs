//! The streaming count-table reader.

use super::cell;
use super::crlf::CrlfToLf;
use super::layout::{resolve, Layout, Role};
use super::mapping::Mapping;
use crate::counts::{Counting, Framework, NonFramework, Sample};
use crate::error::{Column, Error, Location, Result};
use std::collections::HashMap;
use std::hash::{BuildHasherDefault, Hasher};
use std::io::{BufRead, BufReader, Cursor, Read};

pub use super::cell::MAX_COUNT;

/// How to read a table.
///
/// # Example
/// ```
/// use provenance_core::input::ReadOptions;
/// let o = ReadOptions { percent: true, ..Default::default() };
/// assert!(o.mapping.is_none());
/// ```
#[derive(Debug, Clone, Default)]
pub struct ReadOptions {
    /// Cells are percentages (published tables), not counts.
    pub percent: bool,
    /// A column mapping (`--scheme`).
    pub mapping: Option<Mapping>,
}

/// The detected text dialect of a table.
///
/// # Example
/// ```
/// use provenance_core::input::{CountReader, ReadOptions};
/// let text = "sample;Qm;Qp;P;K;Lv;Ls;Lm\nA;1;2;3;4;5;6;7\n";
/// let r = CountReader::from_reader("t.csv", text.as_bytes(), ReadOptions::default()).unwrap();
/// assert_eq!(r.dialect().delimiter, b';');
/// assert!(r.dialect().decimal_comma);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Dialect {
    /// Field delimiter: comma, semicolon or tab.
    pub delimiter: u8,
    /// Decimal commas are read (only with a semicolon delimiter).
    pub decimal_comma: bool,
    /// The file began with a UTF-8 byte-order mark.
    pub bom: bool,
}

/// Reads a count table row by row, validating every cell.
///
/// Memory stays flat: one row is held at a time, plus a 16-byte entry per sample id to detect
/// duplicates.
///
/// # Example
/// ```
/// use provenance_core::input::{CountReader, ReadOptions};
/// let text = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,formation\nA-1,200,10,5,40,25,10,6,4,Upper\n";
/// let mut r = CountReader::from_reader("t.csv", text.as_bytes(), ReadOptions::default()).unwrap();
/// assert_eq!(r.metadata_columns(), ["formation"]);
/// let s = r.next().unwrap().unwrap();
/// assert_eq!(s.id, "A-1");
/// assert_eq!(s.line, 2);
/// assert_eq!(s.framework.total(), 300.0);
/// assert_eq!(s.metadata, ["Upper"]);
/// assert!(r.next().is_none());
/// ```
pub struct CountReader {
    csv: csv::Reader<Box<dyn Read + Send>>,
    meta_names: Vec<String>,
    parser: RowParser,
    seen: HashMap<u64, u64, BuildHasherDefault<PassThrough>>,
    record: csv::ByteRecord,
    done: bool,
}

/// Everything needed to validate one row, shared read-only by parallel workers.
#[derive(Debug, Clone)]
pub(crate) struct RowParser {
    file: String,
    headers: Vec<String>,
    layout: Layout,
    dialect: Dialect,
    percent: bool,
}

fn sniff_delimiter(line: &[u8]) -> u8 {
    let mut counts = [0usize; 3];
    let mut quoted = false;
    for b in line {
        match b {
            b'"' => quoted = !quoted,
            b',' if !quoted => counts[0] += 1,
            b';' if !quoted => counts[1] += 1,
            b'\t' if !quoted => counts[2] += 1,
            _ => {}
        }
    }
    let best = (0..3).max_by_key(|i| (counts[*i], *i)).unwrap_or(0);
    if counts[best] == 0 {
        b','
    } else {
        [b',', b';', b'\t'][best]
    }
}

impl CountReader {
    /// Open a file.
    pub fn from_path(path: &std::path::Path, options: ReadOptions) -> Result<CountReader> {
        let name = path.display().to_string();
        let f = std::fs::File::open(path).map_err(|source| Error::Read {
            path: name.clone(),
            source,
        })?;
        CountReader::from_reader(&name, f, options)
    }

    /// Read from any byte source; `file` names it in messages.
    pub fn from_reader<R: Read + Send + 'static>(
        file: &str,
        reader: R,
        options: ReadOptions,
    ) -> Result<CountReader> {
        let read_err = |source| Error::Read {
            path: file.to_string(),
            source,
        };
        let mut buf = BufReader::with_capacity(1 << 16, reader);
        // Keep leading blank lines (so line numbers stay right) and the header line.
        let mut head = Vec::new();
        let header_start = loop {
            let start = head.len();
            let n = (&mut buf)
                .take(1 << 20)
                .read_until(b'\n', &mut head)
                .map_err(read_err)?;
            if n == 0 {
                return Err(Error::EmptyInput { file: file.into() });
            }
            if head[start..].iter().any(|b| !b.is_ascii_whitespace()) {
                break start;
            }
        };
        let bom = head.starts_with(b"\xEF\xBB\xBF");
        if bom {
            head.drain(..3);
        }
        let header_start = if bom && header_start >= 3 {
            header_start - 3
        } else {
            header_start
        };
        if head.contains(&0) || std::str::from_utf8(&head).is_err() {
            return Err(Error::NotText {
                at: Location::new(file).line(1),
            });
        }
        let delimiter = sniff_delimiter(&head[header_start..]);
        let dialect = Dialect {
            delimiter,
            decimal_comma: delimiter == b';',
            bom,
        };
        let source: Box<dyn Read + Send> = Box::new(CrlfToLf::new(Cursor::new(head).chain(buf)));
        let mut csv = csv::ReaderBuilder::new()
            .delimiter(delimiter)
            .flexible(true)
            .has_headers(true)
            .from_reader(source);
        let headers: Vec<String> = csv
            .headers()
            .map_err(|e| csv_error(file, e))?
            .iter()
            .map(|h| h.trim().to_string())
            .collect();
        let layout = resolve(file, &headers, options.mapping.as_ref(), options.percent)?;
        let meta_names = layout.meta.iter().map(|i| headers[*i].clone()).collect();
        Ok(CountReader {
            csv,
            meta_names,
            parser: RowParser {
                file: file.to_string(),
                headers,
                layout,
                dialect,
                percent: options.percent,
            },
            seen: HashMap::default(),
            record: csv::ByteRecord::new(),
            done: false,
        })
    }

    /// The file name used in messages.
    pub fn file(&self) -> &str {
        &self.parser.file
    }

    /// The detected dialect.
    pub fn dialect(&self) -> Dialect {
        self.parser.dialect
    }

    /// The header cells, trimmed.
    pub fn headers(&self) -> &[String] {
        &self.parser.headers
    }

    /// Names of the metadata columns, in table order.
    pub fn metadata_columns(&self) -> &[String] {
        &self.meta_names
    }

    /// True when the table has a column feeding `category`.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::Category;
    /// use provenance_core::input::{CountReader, ReadOptions};
    /// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm\nA,1,1,1,1,1,1,1\n";
    /// let r = CountReader::from_reader("t.csv", t.as_bytes(), ReadOptions::default()).unwrap();
    /// assert!(!r.has_category(Category::Matrix));
    /// assert!(r.has_category(Category::Lm));
    /// ```
    pub fn has_category(&self, category: crate::counts::Category) -> bool {
        self.parser.layout.present[category.index()]
    }

    /// The row validator, for parallel use.
    pub(crate) fn parser(&self) -> &RowParser {
        &self.parser
    }

    /// Read the next non-blank row into `rec` without validating it; `false` at the end.
    /// Rows of empty cells (spreadsheet trailers such as ";;;;") are skipped.
    pub(crate) fn read_raw(&mut self, rec: &mut csv::ByteRecord) -> Result<bool> {
        if self.done {
            return Ok(false);
        }
        loop {
            match self.csv.read_byte_record(rec) {
                Ok(false) => {
                    self.done = true;
                    return Ok(false);
                }
                Ok(true) => {}
                Err(e) => {
                    self.done = true;
                    return Err(csv_error(&self.parser.file, e));
                }
            }
            if !rec.iter().all(|f| cell::trimmed(f).is_empty()) {
                return Ok(true);
            }
        }
    }

    /// Refuse a row whose id was used before (the only check that needs earlier rows).
    /// Rows whose id cell is empty or not text are left to [`CountReader::parse_record`].
    pub(crate) fn check_unique(&mut self, rec: &csv::ByteRecord) -> Result<()> {
        let Some(raw) = rec.get(self.parser.layout.id) else {
            return Ok(());
        };
        let id = cell::trimmed(raw);
        if id.is_empty() {
            return Ok(());
        }
        let line = line_of(rec);
        let key = fnv1a(id);
        if let Some(first) = self.seen.insert(key, line) {
            self.seen.insert(key, first);
            return Err(Error::DuplicateId {
                at: self.parser.location(line, self.parser.layout.id),
                id: String::from_utf8_lossy(id).into_owned(),
                first_line: first,
            });
        }
        Ok(())
    }
}

impl RowParser {
    fn location(&self, line: u64, col: usize) -> Location {
        Location::new(&self.file).line(line).column(Column {
            index: col + 1,
            name: self.headers.get(col).cloned().unwrap_or_default(),
        })
    }

    fn text(&self, rec: &csv::ByteRecord, line: u64, col: usize) -> Result<String> {
        std::str::from_utf8(&rec[col])
            .map(str::to_string)
            .map_err(|_| Error::NotText {
                at: self.location(line, col),
            })
    }

    /// Validate one raw row into a sample. Needs no earlier rows, so chunks of rows can be
    /// validated in parallel.
    pub(crate) fn parse_record(&self, rec: &csv::ByteRecord) -> Result<Sample> {
        let line = line_of(rec);
        let width = self.headers.len();
        if rec.len() != width {
            return Err(Error::RaggedRow {
                at: Location::new(&self.file).line(line),
                found: rec.len(),
                expected: width,
            });
        }
        let id = self.text(rec, line, self.layout.id)?.trim().to_string();
        if id.is_empty() {
            return Err(Error::MissingId {
                at: self.location(line, self.layout.id),
            });
        }
        let mut framework = Framework::default();
        let mut other = NonFramework::default();
        let mut points = None;
        let comma = self.dialect.decimal_comma;
        for (i, role) in self.layout.roles.iter().enumerate() {
            let cell = &rec[i];
            let parsed = match role {
                Role::Feeds(c) => {
                    let v = if self.percent {
                        cell::percent(cell, comma)
                    } else {
                        cell::count(cell, comma)
                    };
                    v.map(|v| {
                        if c.is_framework() {
                            framework.add(*c, v);
                        } else {
                            other.add(*c, v);
                        }
                    })
                }
                Role::Points => cell::points(cell, comma).map(|p| points = p),
                Role::Id | Role::Meta => Ok(()),
            };
            if let Err(expected) = parsed {
                return Err(Error::InvalidValue {
                    at: self.location(line, i),
                    value: String::from_utf8_lossy(cell::trimmed(cell)).into_owned(),
                    expected: expected.to_string(),
                });
            }
        }
        let counting = match (self.percent, points) {
            (false, _) => Counting::Counted,
            (true, Some(n)) => {
                framework = framework.scaled(n / 100.0);
                other = other.scaled(n / 100.0);
                Counting::FromPercent { points: n }
            }
            (true, None) => Counting::Unknown,
        };
        let mut metadata = Vec::with_capacity(self.layout.meta.len());
        for &j in &self.layout.meta {
            metadata.push(self.text(rec, line, j)?);
        }
        Ok(Sample {
            id,
            line,
            framework,
            other,
            counting,
            metadata,
        })
    }
}

/// FNV-1a, 64 bits (Fowler, Noll & Vo; public-domain reference parameters): the key under
/// which an id is remembered. Two different ids share a key with probability about n²/2⁶⁵
/// (below 10⁻⁸ for a million samples); such a pair would be reported as a duplicate.
fn fnv1a(bytes: &[u8]) -> u64 {
    let mut h: u64 = 0xcbf2_9ce4_8422_2325;
    for b in bytes {
        h ^= u64::from(*b);
        h = h.wrapping_mul(0x0000_0100_0000_01b3);
    }
    h
}

/// The id keys are already hashes: the map uses them as they are.
#[derive(Default)]
struct PassThrough(u64);

impl Hasher for PassThrough {
    fn finish(&self) -> u64 {
        self.0
    }
    fn write(&mut self, bytes: &[u8]) {
        self.0 = fnv1a(bytes);
    }
    fn write_u64(&mut self, v: u64) {
        self.0 = v;
    }
}

fn line_of(rec: &csv::ByteRecord) -> u64 {
    rec.position().map_or(0, |p| p.line())
}

fn csv_error(file: &str, e: csv::Error) -> Error {
    let line = e.position().map(|p| p.line());
    match e.into_kind() {
        csv::ErrorKind::Io(source) => Error::Read {
            path: file.into(),
            source,
        },
        other => Error::Malformed {
            at: Location {
                file: file.into(),
                line,
                column: None,
            },
            message: format!("unreadable CSV ({other:?})"),
            expected: "a delimited text table".into(),
        },
    }
}

impl Iterator for CountReader {
    type Item = Result<Sample>;

    fn next(&mut self) -> Option<Result<Sample>> {
        let mut rec = std::mem::take(&mut self.record);
        let r = match self.read_raw(&mut rec) {
            Ok(false) => None,
            Ok(true) => Some(
                self.check_unique(&rec)
                    .and_then(|()| self.parser.parse_record(&rec)),
            ),
            Err(e) => Some(Err(e)),
        };
        self.record = rec;
        if matches!(r, Some(Err(_))) {
            self.done = true;
        }
        r
    }
}
