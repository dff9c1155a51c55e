//! The streaming count-table reader.

use super::blocks::{Block, PartRows, Splitter};
use super::cell;
use super::ids::{id_key, IdRegistry, Repeat};
use super::layout::{resolve_at, Layout, Role};
use super::mapping::Mapping;
use crate::counts::{Counting, Framework, NonFramework, Sample};
use crate::error::{Column, Error, Location, Result};
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
    /// The data rows after the header; taken when rows are first read.
    data: Option<Box<dyn Read + Send>>,
    /// The row splitter of the one-by-one path, built on first use.
    rows: Option<SerialRows>,
    /// File lines before the first data line (leading blank lines and the header).
    lines_before: u64,
    meta_names: Vec<String>,
    parser: RowParser,
    seen: IdRegistry,
    record: csv::ByteRecord,
    done: bool,
    /// The end (or a refusal) was reported: the iterator is finished.
    ended: bool,
}

/// The one-by-one path: the same block cuts and part splitting as the parallel path, in turn.
struct SerialRows {
    splitter: Splitter,
    block: Block,
    part: usize,
    rows: PartRows,
    active: bool,
}

/// A reader taken apart for the parallel path: the validator, the raw data rows and the file
/// line of their first byte.
pub(crate) struct RawRows {
    pub parser: RowParser,
    pub data: Box<dyn Read + Send>,
    pub first_line: u64,
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
            // A byte-order mark alone does not make the first line a header.
            let line = &head[start..];
            let line = match start {
                0 => line.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(line),
                _ => line,
            };
            if line.iter().any(|b| !b.is_ascii_whitespace()) {
                break start;
            }
        };
        // A quoted header cell may hold a line break: read on while a quote is open.
        while head[header_start..].iter().filter(|b| **b == b'"').count() % 2 == 1 {
            let n = (&mut buf)
                .take(1 << 20)
                .read_until(b'\n', &mut head)
                .map_err(read_err)?;
            if n == 0 || head.len() > 1 << 20 {
                break;
            }
        }
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
            return Err(crate::text::not_text(file, &head, "a CSV table"));
        }
        let delimiter = sniff_delimiter(&head[header_start..]);
        let dialect = Dialect {
            delimiter,
            decimal_comma: delimiter == b';',
            bom,
        };
        let lines_before = head.iter().filter(|b| **b == b'\n').count() as u64;
        let mut header_csv = csv::ReaderBuilder::new()
            .delimiter(delimiter)
            .flexible(true)
            .has_headers(true)
            .from_reader(Cursor::new(&head[header_start..]));
        let headers: Vec<String> = header_csv
            .headers()
            .map_err(|e| csv_error(file, e))?
            .iter()
            .map(|h| h.trim().to_string())
            .collect();
        // The header's own line, below any leading blank lines (a BOM adds no line).
        let header_line = head[..header_start].iter().filter(|b| **b == b'\n').count() as u64 + 1;
        let layout = resolve_at(
            file,
            header_line,
            &headers,
            options.mapping.as_ref(),
            options.percent,
        )?;
        let meta_names = layout.meta.iter().map(|i| headers[*i].clone()).collect();
        Ok(CountReader {
            data: Some(Box::new(buf)),
            rows: None,
            lines_before,
            meta_names,
            parser: RowParser {
                file: file.to_string(),
                headers,
                layout,
                dialect,
                percent: options.percent,
            },
            seen: IdRegistry::default(),
            record: csv::ByteRecord::new(),
            done: false,
            ended: false,
        })
    }

    /// Take the reader apart for the parallel path; `None` once rows were read one by one.
    pub(crate) fn into_raw_rows(self) -> std::result::Result<RawRows, Box<CountReader>> {
        match (self.rows.is_none(), self.data.is_some()) {
            (true, true) => {
                let CountReader {
                    data,
                    parser,
                    lines_before,
                    ..
                } = self;
                Ok(RawRows {
                    parser,
                    data: data.unwrap_or_else(|| Box::new(std::io::empty())),
                    first_line: lines_before + 1,
                })
            }
            _ => Err(Box::new(self)),
        }
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

    /// Read the next non-blank row into `rec` without validating it; `false` at the end.
    /// Rows of empty cells (spreadsheet trailers such as ";;;;") are skipped.
    pub(crate) fn read_raw(&mut self, rec: &mut csv::ByteRecord) -> Result<bool> {
        if self.done {
            return Ok(false);
        }
        let data = &mut self.data;
        let (file, delimiter) = (&self.parser.file, self.parser.dialect.delimiter);
        let first_line = self.lines_before + 1;
        let rows = self.rows.get_or_insert_with(|| SerialRows {
            splitter: Splitter::new(
                data.take().unwrap_or_else(|| Box::new(std::io::empty())),
                file,
                first_line,
            ),
            block: Block::default(),
            part: 0,
            rows: PartRows::new(delimiter),
            active: false,
        });
        loop {
            if rows.active {
                let p = rows.block.parts[rows.part];
                match rows.rows.read(&rows.block.bytes[p.start..p.end], rec) {
                    Ok(true) if is_blank(rec) => {}
                    Ok(true) => return Ok(true),
                    Ok(false) => {
                        rows.active = false;
                        rows.part += 1;
                    }
                    Err(e) => {
                        self.done = true;
                        return Err(csv_error(file, e));
                    }
                }
            } else if let Some(p) = rows.block.parts.get(rows.part).copied() {
                if let Err(e) = rows.rows.start(&rows.block.bytes[p.start..p.end], p.line) {
                    self.done = true;
                    return Err(csv_error(file, e));
                }
                rows.active = true;
            } else {
                rows.part = 0;
                match rows.splitter.fill(&mut rows.block, delimiter) {
                    Ok(true) => {}
                    Ok(false) => {
                        self.done = true;
                        return Ok(false);
                    }
                    Err(e) => {
                        self.done = true;
                        return Err(e);
                    }
                }
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
        self.parser
            .refuse_repeat(self.seen.insert(id_key(id), id, line))
    }
}

/// A refusal of the table as it stands: an id repeated before `e`'s line wins over `e`, so
/// the earliest problem is named whatever the order rows were checked in.
pub(crate) fn earliest_refusal(seen: &mut IdRegistry, parser: &RowParser, e: Error) -> Error {
    if matches!(e, Error::DuplicateId { .. }) {
        // Already the earliest: the registry looked before answering.
        return e;
    }
    match parser.refuse_repeat(seen.repeat_before(e.row_line().unwrap_or(u64::MAX))) {
        Ok(()) => e,
        Err(earlier) => earlier,
    }
}

/// The refusal when the temporary files holding sample ids fail.
fn id_store_error(source: std::io::Error) -> Error {
    Error::Write {
        path: format!(
            "a temporary file of sample ids in {}",
            std::env::temp_dir().display()
        ),
        source,
    }
}

impl CountReader {}

/// Rows of empty cells (spreadsheet trailers such as ";;;;") are skipped.
pub(crate) fn is_blank(rec: &csv::ByteRecord) -> bool {
    rec.iter().all(|f| cell::trimmed(f).is_empty())
}

impl RowParser {
    /// The file name used in messages.
    pub(crate) fn file(&self) -> &str {
        &self.file
    }

    /// The field delimiter.
    pub(crate) fn delimiter(&self) -> u8 {
        self.dialect.delimiter
    }

    /// The id registry's answer as a refusal: an id used a second time, or a failure of its
    /// temporary files.
    pub(crate) fn refuse_repeat(&self, answer: std::io::Result<Option<Repeat>>) -> Result<()> {
        match answer {
            Ok(None) => Ok(()),
            Ok(Some(repeat)) => Err(self.duplicate(&repeat)),
            Err(e) => Err(id_store_error(e)),
        }
    }

    /// The refusal of an id used a second time.
    fn duplicate(&self, repeat: &Repeat) -> Error {
        Error::DuplicateId {
            at: self.location(repeat.line, self.layout.id),
            id: String::from_utf8_lossy(&repeat.id).into_owned(),
            first_line: repeat.first,
        }
    }

    fn location(&self, line: u64, col: usize) -> Location {
        Location::new(&self.file).line(line).column(Column {
            index: col + 1,
            name: self.headers.get(col).cloned().unwrap_or_default(),
        })
    }

    /// Copy a text cell into `into`, reusing its allocation.
    fn text_into(
        &self,
        rec: &csv::ByteRecord,
        line: u64,
        col: usize,
        into: &mut String,
    ) -> Result<()> {
        let text = std::str::from_utf8(&rec[col]).map_err(|_| Error::NotText {
            at: self.location(line, col),
            expected: "a CSV table".into(),
        })?;
        into.clear();
        into.push_str(text);
        Ok(())
    }

    /// Validate one raw row into a sample. Needs no earlier rows, so chunks of rows can be
    /// validated in parallel.
    pub(crate) fn parse_record(&self, rec: &csv::ByteRecord) -> Result<Sample> {
        let mut sample = Sample::counted(String::new(), Framework::default());
        self.parse_into(rec, &mut sample)?;
        Ok(sample)
    }

    /// [`RowParser::parse_record`] into an existing sample, reusing its id and metadata
    /// strings (the streaming path allocates nothing per row). On error `into` is unspecified.
    pub(crate) fn parse_into(&self, rec: &csv::ByteRecord, into: &mut Sample) -> Result<()> {
        let line = line_of(rec);
        let width = self.headers.len();
        if rec.len() != width {
            return Err(Error::RaggedRow {
                at: Location::new(&self.file).line(line),
                found: rec.len(),
                expected: width,
            });
        }
        self.text_into(rec, line, self.layout.id, &mut into.id)?;
        let trimmed = into.id.trim();
        if trimmed.is_empty() {
            return Err(Error::MissingId {
                at: self.location(line, self.layout.id),
            });
        }
        if trimmed.len() != into.id.len() {
            into.id = trimmed.to_string();
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
        into.metadata
            .resize_with(self.layout.meta.len(), String::new);
        for (k, &j) in self.layout.meta.iter().enumerate() {
            self.text_into(rec, line, j, &mut into.metadata[k])?;
        }
        into.line = line;
        into.framework = framework;
        into.other = other;
        into.counting = counting;
        Ok(())
    }
}

pub(crate) fn line_of(rec: &csv::ByteRecord) -> u64 {
    rec.position().map_or(0, |p| p.line())
}

pub(crate) fn csv_error(file: &str, e: csv::Error) -> Error {
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
        if self.ended {
            return None;
        }
        let r = match self.read_raw(&mut rec) {
            Ok(false) => {
                // A repeat across ids written out to disk shows only now.
                self.ended = true;
                self.parser
                    .refuse_repeat(self.seen.repeat_before(u64::MAX))
                    .err()
                    .map(Err)
            }
            Ok(true) => Some(
                self.check_unique(&rec)
                    .and_then(|()| self.parser.parse_record(&rec)),
            ),
            Err(e) => Some(Err(e)),
        };
        self.record = rec;
        match r {
            Some(Err(e)) => {
                self.done = true;
                self.ended = true;
                Some(Err(earliest_refusal(&mut self.seen, &self.parser, e)))
            }
            r => r,
        }
    }
}
