//! Streaming table jobs: read rows in blocks, compute in parallel, write in input order.
//!
//! Memory holds a few blocks of rows (half a megabyte of input each) at a time, whatever the
//! size of the input.

use crate::counts::Sample;
use crate::error::{Error, Result};
use crate::input::blocks::{Block, Part, PartRows, Splitter};
use crate::input::ids::{id_key, IdRegistry};
use crate::input::reader::{csv_error, earliest_refusal, is_blank, RawRows, RowParser};
use crate::input::CountReader;
use crate::modes::SampleModes;
use crate::output::{Format, ModesJson, ModesTable};
use rayon::prelude::*;
use std::io::Write;
use std::sync::mpsc;

/// Options of the modes table.
///
/// # Example
/// ```
/// let o = provenance_core::batch::ModesOptions::default();
/// assert!(!o.intervals);
/// ```
#[derive(Debug, Clone, Copy, Default)]
pub struct ModesOptions {
    /// Output format.
    pub format: Format,
    /// In CSV, add 95% Wilson and Clopper-Pearson bounds (JSON always has them).
    pub intervals: bool,
}

/// Run `each` over the reader's samples block by block, in parallel, writing each sample's
/// bytes to `out` in input order. `begin` and `end` write what comes before and after the rows;
/// `sep` is written between rows. Returns the number of samples.
///
/// # Example
/// ```
/// use provenance_core::batch::stream_rows;
/// use provenance_core::input::{CountReader, ReadOptions};
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm\nA,1,0,0,0,0,0,0\nB,2,0,0,0,0,0,0\n";
/// let r = CountReader::from_reader("t.csv", t.as_bytes(), ReadOptions::default()).unwrap();
/// let mut out = Vec::new();
/// let n = stream_rows(r, &mut out, "out", b"", b"", b"", |s, buf| {
///     buf.extend_from_slice(s.id.as_bytes());
///     buf.push(b'\n');
/// })
/// .unwrap();
/// assert_eq!((n, out.as_slice()), (2, &b"A\nB\n"[..]));
/// ```
pub fn stream_rows<W, F>(
    reader: CountReader,
    out: &mut W,
    out_name: &str,
    begin: &[u8],
    sep: &[u8],
    end: &[u8],
    each: F,
) -> Result<usize>
where
    W: Write + ?Sized,
    F: Fn(&Sample, &mut Vec<u8>) + Sync,
{
    let werr = |source| Error::Write {
        path: out_name.to_string(),
        source,
    };
    out.write_all(begin).map_err(werr)?;
    let mut writer = RowWriter {
        out,
        werr: &werr,
        sep,
        wrote: false,
        total: 0,
    };
    match reader.into_raw_rows() {
        Ok(raw) => parallel(raw, &mut writer, &each)?,
        Err(reader) => {
            // Rows were already read one by one: go on that way.
            let mut buf = Vec::new();
            for sample in *reader {
                buf.clear();
                each(&sample?, &mut buf);
                writer.row(&buf)?;
            }
        }
    }
    let total = writer.total;
    out.write_all(end).map_err(werr)?;
    Ok(total)
}

/// Writes rows in order, with the separator between them.
struct RowWriter<'a, W: Write + ?Sized, E: Fn(std::io::Error) -> Error> {
    out: &'a mut W,
    werr: &'a E,
    sep: &'a [u8],
    wrote: bool,
    total: usize,
}

impl<W: Write + ?Sized, E: Fn(std::io::Error) -> Error> RowWriter<'_, W, E> {
    /// Write one row.
    fn row(&mut self, bytes: &[u8]) -> Result<()> {
        self.rows(bytes, 1)
    }

    /// Write `n` rows already joined by the separator.
    fn rows(&mut self, bytes: &[u8], n: usize) -> Result<()> {
        if self.wrote {
            self.out.write_all(self.sep).map_err(self.werr)?;
        }
        self.out.write_all(bytes).map_err(self.werr)?;
        self.wrote = true;
        self.total += n;
        Ok(())
    }
}

/// What one part of a block produced: its rows' bytes, their id keys (for the in-order
/// duplicate check) and the first refusal, which ends the part.
struct PartOut {
    bytes: Vec<u8>,
    rows: usize,
    /// Key, line and end of the id in `id_text`, per row.
    ids: Vec<(u64, u64, usize)>,
    id_text: Vec<u8>,
    refusal: Option<Error>,
    splitter: PartRows,
    record: csv::ByteRecord,
    sample: Sample,
}

impl PartOut {
    fn new(delimiter: u8) -> PartOut {
        PartOut {
            bytes: Vec::new(),
            rows: 0,
            ids: Vec::new(),
            id_text: Vec::new(),
            refusal: None,
            splitter: PartRows::new(delimiter),
            record: csv::ByteRecord::new(),
            sample: Sample::counted(String::new(), crate::counts::Framework::default()),
        }
    }

    /// Validate, compute and format one part's rows.
    fn run<F>(&mut self, parser: &RowParser, block: &[u8], part: Part, sep: &[u8], each: &F)
    where
        F: Fn(&Sample, &mut Vec<u8>) + Sync,
    {
        self.bytes.clear();
        self.ids.clear();
        self.id_text.clear();
        self.rows = 0;
        self.refusal = None;
        let text = &block[part.start..part.end];
        if let Err(e) = self.splitter.start(text, part.line) {
            self.refusal = Some(csv_error(parser.file(), e));
            return;
        }
        loop {
            match self.splitter.read(text, &mut self.record) {
                Ok(true) => {}
                Ok(false) => return,
                Err(e) => {
                    self.refusal = Some(csv_error(parser.file(), e));
                    return;
                }
            }
            if is_blank(&self.record) {
                continue;
            }
            if let Err(e) = parser.parse_into(&self.record, &mut self.sample) {
                self.refusal = Some(e);
                return;
            }
            let id = self.sample.id.as_bytes();
            self.id_text.extend_from_slice(id);
            self.ids
                .push((id_key(id), self.sample.line, self.id_text.len()));
            if self.rows > 0 {
                self.bytes.extend_from_slice(sep);
            }
            each(&self.sample, &mut self.bytes);
            self.rows += 1;
        }
    }
}

/// A block read by the reader thread, or the refusal that ended reading.
type BlockMsg = std::result::Result<Block, Error>;

/// The parallel path. A reader thread cuts the stream into blocks of whole rows (the only
/// serial reading work); a second thread has the rayon pool validate, compute and format each
/// block's parts; this thread checks id uniqueness in row order and writes. Blocks, parts and
/// their buffers travel back to be reused, so memory stays at a few blocks whatever the input.
fn parallel<W, E, F>(raw: RawRows, writer: &mut RowWriter<'_, W, E>, each: &F) -> Result<()>
where
    W: Write + ?Sized,
    E: Fn(std::io::Error) -> Error,
    F: Fn(&Sample, &mut Vec<u8>) + Sync,
{
    let RawRows {
        parser,
        data,
        first_line,
    } = raw;
    let mut splitter = Splitter::new(data, parser.file(), first_line);
    let delimiter = parser.delimiter();
    let parser = &parser;
    let sep = writer.sep;
    let mut seen = IdRegistry::default();
    std::thread::scope(|scope| -> Result<()> {
        let (blocks, blocks_in) = mpsc::sync_channel::<BlockMsg>(1);
        let (spare_blocks, spare_blocks_in) = mpsc::channel::<Block>();
        let (done, done_in) = mpsc::sync_channel::<(Vec<PartOut>, Option<Error>)>(1);
        let (spare_outs, spare_outs_in) = mpsc::channel::<Vec<PartOut>>();
        scope.spawn(move || loop {
            let mut block = spare_blocks_in.try_recv().unwrap_or_default();
            let msg = match splitter.fill(&mut block, delimiter) {
                Ok(true) => Ok(block),
                Ok(false) => break,
                Err(e) => Err(e),
            };
            let last = msg.is_err();
            if blocks.send(msg).is_err() || last {
                break;
            }
        });
        scope.spawn(move || {
            for msg in blocks_in {
                let mut outs = spare_outs_in.try_recv().unwrap_or_default();
                let block = match msg {
                    Ok(block) => block,
                    Err(e) => {
                        let _ = done.send((outs, Some(e)));
                        return;
                    }
                };
                if outs.len() < block.parts.len() {
                    outs.resize_with(block.parts.len(), || PartOut::new(delimiter));
                }
                outs.truncate(block.parts.len());
                outs.par_iter_mut()
                    .zip(block.parts.par_iter())
                    .for_each(|(out, part)| out.run(parser, &block.bytes, *part, sep, each));
                // The reader may have ended; a closed return channel is no error.
                let _ = spare_blocks.send(block);
                if done.send((outs, None)).is_err() {
                    return;
                }
            }
        });
        for (mut outs, refusal) in done_in {
            for out in &mut outs {
                let mut id_start = 0;
                for &(key, line, id_end) in &out.ids {
                    let id = &out.id_text[id_start..id_end];
                    parser.refuse_repeat(seen.insert(key, id, line))?;
                    id_start = id_end;
                }
                if out.rows > 0 {
                    writer.rows(&out.bytes, out.rows)?;
                }
                if let Some(e) = out.refusal.take() {
                    return Err(earliest_refusal(&mut seen, parser, e));
                }
            }
            if let Some(e) = refusal {
                return Err(earliest_refusal(&mut seen, parser, e));
            }
            let _ = spare_outs.send(outs);
        }
        // A repeat across ids written out to disk shows only at the end.
        parser.refuse_repeat(seen.repeat_before(u64::MAX))
    })
}

/// Write the modes table of every sample in `reader` to `out`.
///
/// # Example
/// ```
/// use provenance_core::batch::{write_modes, ModesOptions};
/// use provenance_core::input::{CountReader, ReadOptions};
/// use provenance_core::output::Format;
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm\nA,300,0,0,0,0,0,0\n";
/// let r = CountReader::from_reader("t.csv", t.as_bytes(), ReadOptions::default()).unwrap();
/// let mut out = Vec::new();
/// let opts = ModesOptions { format: Format::Json, ..Default::default() };
/// assert_eq!(write_modes(r, &mut out, "out", opts).unwrap(), 1);
/// let v: serde_json::Value = serde_json::from_slice(&out).unwrap();
/// assert_eq!(v[0]["qfl"]["Q"], 100.0);
/// ```
pub fn write_modes<W: Write + ?Sized>(
    reader: CountReader,
    out: &mut W,
    out_name: &str,
    options: ModesOptions,
) -> Result<usize> {
    let metadata = reader.metadata_columns().to_vec();
    match options.format {
        Format::Csv => {
            let table = ModesTable {
                metadata,
                intervals: options.intervals,
            };
            let mut header = Vec::new();
            table.push_header(&mut header);
            stream_rows(reader, out, out_name, &header, b"", b"", |s, buf| {
                table.push_row(buf, s, &SampleModes::of(s));
            })
        }
        Format::Json => stream_rows(reader, out, out_name, b"[\n", b",\n", b"\n]\n", |s, buf| {
            let modes = SampleModes::of(s);
            let rec = ModesJson {
                sample: s,
                modes: &modes,
                metadata: &metadata,
            };
            // Serializing plain maps of numbers and strings into memory cannot fail.
            let _ = serde_json::to_writer(&mut *buf, &rec);
        }),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::input::ReadOptions;

    fn run(text: String) -> Result<usize> {
        let r = CountReader::from_reader(
            "t.csv",
            std::io::Cursor::new(text.into_bytes()),
            ReadOptions::default(),
        )?;
        write_modes(r, &mut Vec::new(), "out", ModesOptions::default())
    }

    fn table(rows: usize) -> String {
        let mut t = String::from("sample,Qm,Qp,P,K,Lv,Ls,Lm\n");
        for i in 0..rows {
            t.push_str(&format!("S{i},10,1,2,3,4,5,6\n"));
        }
        t
    }

    /// Rows enough to fill more than two blocks.
    const MANY: usize = 2 * crate::input::blocks::BLOCK_BYTES / 20 + 17;

    #[test]
    fn counts_every_row_across_blocks() {
        assert_eq!(run(table(MANY)).unwrap(), MANY);
        let part = crate::input::blocks::PART_ROWS;
        assert_eq!(run(table(part)).unwrap(), part);
        assert_eq!(run(table(0)).unwrap(), 0);
    }

    #[test]
    fn rows_come_out_in_input_order_with_multiline_cells() {
        // Quoted cells holding line breaks straddle part and block ends; the output must be
        // the same as one row at a time.
        let mut t = String::from("sample,Qm,Qp,P,K,Lv,Ls,Lm,notes\n");
        for i in 0..MANY {
            let note = if i % 5 == 0 {
                "\"a, \"\"b\"\"\nc\""
            } else {
                "x"
            };
            t.push_str(&format!("S{i},10,1,2,3,4,5,{},{note}\n", i % 9));
        }
        let parallel = {
            let r = CountReader::from_reader(
                "t.csv",
                std::io::Cursor::new(t.clone().into_bytes()),
                ReadOptions::default(),
            )
            .unwrap();
            let mut out = Vec::new();
            write_modes(r, &mut out, "out", ModesOptions::default()).unwrap();
            out
        };
        let mut r = CountReader::from_reader(
            "t.csv",
            std::io::Cursor::new(t.into_bytes()),
            ReadOptions::default(),
        )
        .unwrap();
        let table = ModesTable {
            metadata: r.metadata_columns().to_vec(),
            intervals: false,
        };
        let mut serial = Vec::new();
        table.push_header(&mut serial);
        let mut lines = Vec::new();
        for s in &mut r {
            let s = s.unwrap();
            lines.push(s.line);
            table.push_row(&mut serial, &s, &SampleModes::of(&s));
        }
        assert_eq!(parallel, serial);
        // Line numbers count the line breaks inside quoted cells.
        assert_eq!(lines[1], 4);
        assert_eq!(lines[6], 10);
    }

    #[test]
    fn a_bad_cell_in_a_later_block_is_located() {
        let mut t = table(MANY);
        t = t.replace(
            &format!("S{},10,", MANY - 3),
            &format!("S{},1.5,", MANY - 3),
        );
        let e = run(t).unwrap_err().to_string();
        assert!(
            e.starts_with(&format!("t.csv, line {}, column 2", MANY - 1)),
            "{e}"
        );
    }

    #[test]
    fn the_earliest_refusal_wins_when_a_bad_cell_precedes_a_duplicate_id() {
        // Regression: ids are checked on the reader thread, cells on the workers; the bad cell
        // on line 12 must be reported, not the duplicate on line 15.
        let mut t = table(20);
        t = t.replace("S10,10,", "S10,x,").replace("S13,", "S2,");
        let e = run(t).unwrap_err().to_string();
        assert!(e.starts_with("t.csv, line 12, column 2"), "{e}");
    }

    /// Run `f` with id segments of 100 ids, so that a table of [`MANY`] rows writes ids out.
    fn with_small_id_segments<T>(f: impl FnOnce() -> T) -> T {
        use crate::input::ids::{Limits, TEST_LIMITS};
        let small = Limits {
            entries: 100,
            text_bytes: 4096,
            fan_in: 3,
        };
        TEST_LIMITS.with(|l| l.set(Some(small)));
        let out = f();
        TEST_LIMITS.with(|l| l.set(None));
        out
    }

    #[test]
    fn a_repeat_of_an_id_written_out_long_before_is_refused_at_the_end() {
        let mut t = table(MANY);
        t.push_str("S5,1,1,1,1,1,1,1\n");
        let expected = format!(
            "t.csv, line {}, column 1 (\"sample\"): sample id \"S5\" was already used on line 7",
            MANY + 2
        );
        let e = with_small_id_segments(|| run(t.clone()))
            .unwrap_err()
            .to_string();
        assert!(e.starts_with(&expected), "{e}");
        // The one-by-one reader finds it as well, as its last item.
        let last = with_small_id_segments(|| {
            let bytes = std::io::Cursor::new(t.clone().into_bytes());
            let r = CountReader::from_reader("t.csv", bytes, ReadOptions::default())?;
            let last = r.last();
            match last {
                Some(Err(e)) => Err(e),
                _ => Ok(()),
            }
        });
        assert!(last.unwrap_err().to_string().starts_with(&expected));
        assert_eq!(with_small_id_segments(|| run(table(MANY))).unwrap(), MANY);
    }

    #[test]
    fn a_repeat_on_disk_wins_over_a_later_bad_cell() {
        // S3 (line 5) comes back on line 1002, long written out; the bad cell is later.
        let mut t = table(MANY);
        t = t.replace("\nS1000,", "\nS3,");
        t = t.replace(&format!("S{},10,", MANY - 3), &format!("S{},x,", MANY - 3));
        let e = with_small_id_segments(|| run(t)).unwrap_err().to_string();
        assert!(
            e.starts_with("t.csv, line 1002, column 1 (\"sample\"): sample id \"S3\" was already used on line 5"),
            "{e}"
        );
    }

    #[test]
    fn a_reader_already_started_goes_on_one_row_at_a_time() {
        // The fallback path: rows were read one by one before the batch took the reader, so
        // it carries on from there and writes what the parallel path writes for those rows.
        let open = |t: &str| {
            let bytes = std::io::Cursor::new(t.as_bytes().to_vec());
            CountReader::from_reader("t.csv", bytes, ReadOptions::default()).unwrap()
        };
        let t = table(MANY);
        let mut started = open(&t);
        let first = started.next().unwrap().unwrap();
        assert_eq!(first.id, "S0");
        let mut rest = Vec::new();
        let n = write_modes(started, &mut rest, "out", ModesOptions::default()).unwrap();
        assert_eq!(n, MANY - 1);
        let mut whole = Vec::new();
        write_modes(open(&t), &mut whole, "out", ModesOptions::default()).unwrap();
        let header_and_first = whole
            .iter()
            .enumerate()
            .filter(|(_, b)| **b == b'\n')
            .nth(1);
        let (cut, _) = header_and_first.unwrap();
        let header_end = whole.iter().position(|b| *b == b'\n').unwrap();
        assert_eq!(&rest[..=header_end], &whole[..=header_end]);
        assert_eq!(&rest[header_end + 1..], &whole[cut + 1..]);
        // A duplicate met on that path is still refused with both lines.
        let mut dup = open(&format!("{t}S7,1,1,1,1,1,1,1\n"));
        dup.next();
        let e = write_modes(dup, &mut Vec::new(), "out", ModesOptions::default());
        assert!(e
            .unwrap_err()
            .to_string()
            .contains("already used on line 9"));
    }

    #[test]
    fn a_duplicate_in_a_later_block_names_both_lines() {
        let mut t = table(MANY);
        t.push_str("S5,1,1,1,1,1,1,1\n");
        let e = run(t).unwrap_err().to_string();
        assert!(
            e.contains("sample id \"S5\" was already used on line 7"),
            "{e}"
        );
    }
}
