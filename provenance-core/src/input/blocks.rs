//! Cutting the byte stream of a table into blocks of whole rows, so that rows can be split
//! into cells and validated in parallel.
//!
//! A cut may only fall after a row terminator that lies outside a quoted cell. The scan
//! follows the quoting rules of the CSV reader used everywhere else (the `csv` crate with its
//! defaults: `"` quotes, a doubled `""` is a literal quote, a quote only opens a quoted cell
//! at the start of a cell, and `\r`, `\n` or `\r\n` end a row), so blocks parse exactly as the
//! whole stream would.

use crate::error::{Error, Result};
use std::io::Read;

/// Bytes read per block (whole rows are kept together, so blocks can be a little shorter).
pub(crate) const BLOCK_BYTES: usize = 1 << 19;

/// Rows per part: the unit of parallel work within a block.
pub(crate) const PART_ROWS: usize = 512;

/// A run of whole rows within a block.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) struct Part {
    /// Byte range in the block.
    pub start: usize,
    /// End of the byte range (exclusive).
    pub end: usize,
    /// File line (1-based) of the part's first byte.
    pub line: u64,
}

/// Whole rows of the table and where each part starts.
#[derive(Debug, Default)]
pub(crate) struct Block {
    /// The bytes of whole rows.
    pub bytes: Vec<u8>,
    /// Consecutive parts covering `bytes`.
    pub parts: Vec<Part>,
}

/// Reads a table's data rows (after its header) block by block.
pub(crate) struct Splitter {
    source: Box<dyn Read + Send>,
    file: String,
    carry: Vec<u8>,
    next_line: u64,
    eof: bool,
}

#[derive(Clone, Copy)]
enum State {
    StartCell,
    InCell,
    InQuoted,
    QuoteInQuoted,
}

/// Ends of the rows in `bytes`, scanned from the start of a row; each end is the index just
/// after a terminator outside quotes. Calls `end(i, newlines_so_far)`.
fn scan(bytes: &[u8], delimiter: u8, mut end: impl FnMut(usize, u64)) {
    let mut newlines = 0u64;
    if memchr::memchr(b'"', bytes).is_none() {
        // No quotes: every terminator ends a row.
        for i in memchr::memchr2_iter(b'\n', b'\r', bytes) {
            if bytes[i] == b'\n' {
                newlines += 1;
            }
            end(i + 1, newlines);
        }
        return;
    }
    let mut state = State::StartCell;
    for (i, &b) in bytes.iter().enumerate() {
        if b == b'\n' {
            newlines += 1;
        }
        let term = b == b'\n' || b == b'\r';
        state = match state {
            State::InQuoted => {
                if b == b'"' {
                    State::QuoteInQuoted
                } else {
                    State::InQuoted
                }
            }
            State::StartCell if b == b'"' => State::InQuoted,
            State::QuoteInQuoted if b == b'"' => State::InQuoted,
            _ if b == delimiter => State::StartCell,
            _ if term => {
                end(i + 1, newlines);
                State::StartCell
            }
            _ => State::InCell,
        };
    }
}

impl Splitter {
    /// Split `source`, whose first byte lies on file line `first_line`.
    pub(crate) fn new(source: Box<dyn Read + Send>, file: &str, first_line: u64) -> Splitter {
        Splitter {
            source,
            file: file.to_string(),
            carry: Vec::new(),
            next_line: first_line,
            eof: false,
        }
    }

    /// Fill `block` with the next whole rows; `false` when the table has ended.
    pub(crate) fn fill(&mut self, block: &mut Block, delimiter: u8) -> Result<bool> {
        block.bytes.clear();
        block.parts.clear();
        block.bytes.append(&mut self.carry);
        let mut want = BLOCK_BYTES;
        loop {
            while !self.eof && block.bytes.len() < want {
                let old = block.bytes.len();
                block.bytes.resize(old + (want - old).max(1 << 16), 0);
                let n = loop {
                    match self.source.read(&mut block.bytes[old..]) {
                        Err(e) if e.kind() == std::io::ErrorKind::Interrupted => {}
                        r => break r,
                    }
                };
                match n {
                    Ok(n) => {
                        block.bytes.truncate(old + n);
                        self.eof = n == 0;
                    }
                    Err(source) => {
                        block.bytes.truncate(old);
                        return Err(Error::Read {
                            path: self.file.clone(),
                            source,
                        });
                    }
                }
            }
            if block.bytes.is_empty() {
                return Ok(false);
            }
            let (mut start, mut start_nl, mut rows) = (0usize, 0u64, 0usize);
            let (mut last, mut last_nl) = (0usize, 0u64);
            let base = self.next_line;
            let parts = &mut block.parts;
            scan(&block.bytes, delimiter, |i, nl| {
                rows += 1;
                last = i;
                last_nl = nl;
                if rows == PART_ROWS {
                    parts.push(Part {
                        start,
                        end: i,
                        line: base + start_nl,
                    });
                    (start, start_nl, rows) = (i, nl, 0);
                }
            });
            if self.eof {
                last = block.bytes.len();
                last_nl = block.bytes.iter().filter(|b| **b == b'\n').count() as u64;
            } else if last == 0 {
                // One row longer than the block: read on.
                block.parts.clear();
                want = block.bytes.len() * 2;
                continue;
            }
            if start < last {
                block.parts.push(Part {
                    start,
                    end: last,
                    line: base + start_nl,
                });
            }
            self.carry.extend_from_slice(&block.bytes[last..]);
            block.bytes.truncate(last);
            self.next_line = base + last_nl;
            return Ok(true);
        }
    }
}

/// Splits the rows of one part into records, with editor line numbers.
///
/// A part without quotes is split here directly: a row ends at `\n` or `\r`, empty rows are
/// skipped (as the CSV reader skips them), cells end at the delimiter. A part with quotes goes
/// through the CSV reader, kept from part to part (building one costs more than splitting a
/// few hundred rows), and its line numbers are moved past the blank lines the reader skipped
/// before a record (it reports the line where its search began).
pub(crate) struct PartRows {
    /// Built on the first part with quotes: most tables never need it.
    quoted: Option<csv::Reader<std::io::Cursor<Vec<u8>>>>,
    delimiter: u8,
    plain: bool,
    at: usize,
    line: u64,
}

impl PartRows {
    pub(crate) fn new(delimiter: u8) -> PartRows {
        PartRows {
            quoted: None,
            delimiter,
            plain: true,
            at: 0,
            line: 1,
        }
    }

    /// Begin the part `text`, whose first byte lies on file line `line`.
    pub(crate) fn start(&mut self, text: &[u8], line: u64) -> csv::Result<()> {
        self.at = 0;
        self.line = line;
        self.plain = memchr::memchr(b'"', text).is_none();
        if !self.plain {
            let delimiter = self.delimiter;
            let quoted = self.quoted.get_or_insert_with(|| {
                csv::ReaderBuilder::new()
                    .delimiter(delimiter)
                    .flexible(true)
                    .has_headers(false)
                    .from_reader(std::io::Cursor::new(Vec::new()))
            });
            let copy = quoted.get_mut().get_mut();
            copy.clear();
            copy.extend_from_slice(text);
            // Seeking to the start clears the reader's end-of-input state.
            quoted.seek(csv::Position::new())?;
        }
        Ok(())
    }

    /// The next record of the part `text` given to [`PartRows::start`]; `false` at its end.
    pub(crate) fn read(&mut self, text: &[u8], rec: &mut csv::ByteRecord) -> csv::Result<bool> {
        if let (false, Some(quoted)) = (self.plain, self.quoted.as_mut()) {
            if !quoted.read_byte_record(rec)? {
                return Ok(false);
            }
            let (byte, line) = rec.position().map_or((0, 1), |p| (p.byte(), p.line()));
            let skipped = text
                .get(byte as usize..)
                .unwrap_or_default()
                .iter()
                .take_while(|b| matches!(b, b'\n' | b'\r'))
                .filter(|b| **b == b'\n')
                .count() as u64;
            let mut pos = csv::Position::new();
            pos.set_line(self.line + line - 1 + skipped);
            rec.set_position(Some(pos));
            return Ok(true);
        }
        loop {
            let rest = &text[self.at.min(text.len())..];
            if rest.is_empty() {
                return Ok(false);
            }
            let (row, used, newline) = match memchr::memchr2(b'\n', b'\r', rest) {
                Some(i) => (&rest[..i], i + 1, rest[i] == b'\n'),
                None => (rest, rest.len(), false),
            };
            self.at += used;
            let line = self.line;
            if newline {
                self.line += 1;
            }
            if row.is_empty() {
                continue;
            }
            rec.clear();
            for cell in row.split(|b| *b == self.delimiter) {
                rec.push_field(cell);
            }
            let mut pos = csv::Position::new();
            pos.set_line(line);
            rec.set_position(Some(pos));
            return Ok(true);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn ends(text: &str) -> Vec<usize> {
        let mut v = Vec::new();
        scan(text.as_bytes(), b',', |i, _| v.push(i));
        v
    }

    /// Records and editor lines of `text` through [`PartRows`].
    fn records(text: &[u8], delimiter: u8) -> Vec<(Vec<Vec<u8>>, u64)> {
        let mut rows = PartRows::new(delimiter);
        rows.start(text, 1).unwrap();
        let mut rec = csv::ByteRecord::new();
        let mut out = Vec::new();
        while rows.read(text, &mut rec).unwrap() {
            let line = rec.position().unwrap().line();
            out.push((rec.iter().map(<[u8]>::to_vec).collect(), line));
        }
        out
    }

    /// The same text with its first row quoted (`"a"` reads as `a`), so it takes the other path.
    fn quoted_twin(text: &[u8], delimiter: u8) -> Vec<(Vec<Vec<u8>>, u64)> {
        let mut t = b"\"".to_vec();
        t.extend_from_slice(text);
        let first_end = t[1..]
            .iter()
            .position(|b| *b == delimiter || *b == b'\n' || *b == b'\r')
            .map_or(t.len(), |i| i + 1);
        t.insert(first_end, b'"');
        records(&t, delimiter)
    }

    #[test]
    fn both_paths_give_the_same_records_and_editor_lines() {
        for text in [
            &b"a,b,c\nd,e\n\n\nf,,\n  ,\n"[..],
            b"a;b\rc;d\re",
            b"a\n\nx\n",
            b"a,\n,,\n",
            b"a\tb\n\tc\t\n",
            b"last,row,without,end",
        ] {
            for delimiter in [b',', b';', b'\t'] {
                assert_eq!(
                    records(text, delimiter),
                    quoted_twin(text, delimiter),
                    "{text:?}"
                );
            }
        }
        // Editor lines after blank lines: "f,," is on line 5.
        let r = records(b"a,b,c\nd,e\n\n\nf,,\n", b',');
        assert_eq!(r.iter().map(|x| x.1).collect::<Vec<_>>(), [1, 2, 5]);
    }

    #[test]
    fn quoted_terminators_do_not_end_rows() {
        assert_eq!(ends("a,b\nc,d\n"), [4, 8]);
        assert_eq!(ends("a,\"x\ny\"\nc\n"), [8, 10]);
        // A doubled quote stays inside the cell; a quote inside an unquoted cell is literal.
        assert_eq!(ends("\"a\"\"\n\",b\nc\n"), [9, 11]);
        assert_eq!(ends("5\" core,b\nc\n"), [10, 12]);
        assert_eq!(ends("a\r\nb\rc"), [2, 3, 5]);
    }

    fn split(text: &str) -> Vec<(String, u64)> {
        let mut s = Splitter::new(Box::new(std::io::Cursor::new(text.to_string())), "t", 2);
        let mut b = Block::default();
        let mut out = Vec::new();
        while s.fill(&mut b, b',').unwrap() {
            for p in &b.parts {
                out.push((
                    String::from_utf8(b.bytes[p.start..p.end].to_vec()).unwrap(),
                    p.line,
                ));
            }
        }
        out
    }

    #[test]
    fn parts_cover_the_stream_with_their_lines() {
        let mut t = String::new();
        for i in 0..2000 {
            if i % 7 == 0 {
                t.push_str(&format!("S{i},\"two\nlines\"\n"));
            } else {
                t.push_str(&format!("S{i},1\n"));
            }
        }
        let parts = split(&t);
        let joined: String = parts.iter().map(|p| p.0.as_str()).collect();
        assert_eq!(joined, t);
        // Each part's line is 2 plus the newlines before it.
        let mut before = 0u64;
        for (text, line) in &parts {
            assert_eq!(*line, 2 + before);
            before += text.matches('\n').count() as u64;
        }
        assert!(parts.len() >= 2000 / PART_ROWS);
    }

    #[test]
    fn a_row_longer_than_a_block_is_kept_whole() {
        let long = "x".repeat(BLOCK_BYTES * 2 + 5);
        let t = format!("A,{long}\nB,1\n");
        let parts = split(&t);
        let joined: String = parts.iter().map(|p| p.0.as_str()).collect();
        assert_eq!(joined, t);
        assert!(parts[0].0.ends_with('\n'));
    }

    #[test]
    fn an_unterminated_last_row_is_kept() {
        let parts = split("A,1\nB,2");
        assert_eq!(parts, [("A,1\nB,2".to_string(), 2)]);
    }
}
