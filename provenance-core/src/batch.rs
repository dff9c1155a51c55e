//! Streaming table jobs: read rows in chunks, compute in parallel, write in input order.
//!
//! Memory holds one chunk of rows at a time, whatever the size of the input.

use crate::counts::Sample;
use crate::error::{Error, Result};
use crate::input::CountReader;
use crate::modes::SampleModes;
use crate::output::{Format, ModesJson, ModesTable};
use rayon::prelude::*;
use std::io::Write;
use std::sync::mpsc;

/// Rows per parallel chunk.
pub const CHUNK_ROWS: usize = 8192;

/// Rows per parallel task within a chunk.
const PART_ROWS: usize = 512;

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

/// Run `each` over the reader's samples chunk by chunk, in parallel, writing each sample's
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
    mut reader: CountReader,
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
    let parser = reader.parser().clone();
    let mut total = 0usize;
    let mut wrote = false;
    let mut buffers: Vec<Vec<u8>> = Vec::new();
    std::thread::scope(|scope| -> Result<()> {
        // A reader thread splits rows and checks id uniqueness (the only serial work) one
        // chunk ahead of the workers; record vectors travel back to be reused.
        let (chunks, chunks_in) = mpsc::sync_channel::<Chunk>(2);
        let (spare, spare_in) = mpsc::channel::<Vec<csv::ByteRecord>>();
        scope.spawn(move || loop {
            let mut records = spare_in.try_recv().unwrap_or_default();
            let (filled, refusal) = fill_chunk(&mut reader, &mut records);
            let last = filled < CHUNK_ROWS || refusal.is_some();
            if chunks
                .send(Chunk {
                    records,
                    filled,
                    refusal,
                })
                .is_err()
                || last
            {
                break;
            }
        });
        for chunk in chunks_in {
            // Parallel part: validate, compute and format; the first refusal in row order
            // wins. Output buffers are kept from chunk to chunk, so their memory is touched once.
            let parts = chunk.filled.div_ceil(PART_ROWS);
            if buffers.len() < parts {
                buffers.resize_with(parts, Vec::new);
            }
            let results: Vec<Result<()>> = chunk.records[..chunk.filled]
                .par_chunks(PART_ROWS)
                .zip(buffers[..parts].par_iter_mut())
                .map(|(part, buf)| {
                    buf.clear();
                    for (i, rec) in part.iter().enumerate() {
                        let sample = parser.parse_record(rec)?;
                        if i > 0 {
                            buf.extend_from_slice(sep);
                        }
                        each(&sample, buf);
                    }
                    Ok(())
                })
                .collect();
            for (r, buf) in results.into_iter().zip(&buffers) {
                r?;
                if wrote {
                    out.write_all(sep).map_err(werr)?;
                }
                out.write_all(buf).map_err(werr)?;
                wrote = true;
            }
            total += chunk.filled;
            if let Some(e) = chunk.refusal {
                return Err(e);
            }
            // The reader may have ended; a closed return channel is no error.
            let _ = spare.send(chunk.records);
        }
        Ok(())
    })?;
    out.write_all(end).map_err(werr)?;
    Ok(total)
}

/// Rows split by the reader thread, not yet validated.
struct Chunk {
    records: Vec<csv::ByteRecord>,
    filled: usize,
    refusal: Option<Error>,
}

/// Read up to [`CHUNK_ROWS`] raw rows, checking id uniqueness; a refusal ends the chunk at the
/// offending row.
fn fill_chunk(
    reader: &mut CountReader,
    records: &mut Vec<csv::ByteRecord>,
) -> (usize, Option<Error>) {
    let mut filled = 0;
    while filled < CHUNK_ROWS {
        if records.len() == filled {
            records.push(csv::ByteRecord::new());
        }
        match reader.read_raw(&mut records[filled]) {
            Ok(false) => break,
            Ok(true) => {}
            Err(e) => return (filled, Some(e)),
        }
        if let Err(e) = reader.check_unique(&records[filled]) {
            return (filled, Some(e));
        }
        filled += 1;
    }
    (filled, None)
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

    #[test]
    fn counts_every_row_across_chunks() {
        assert_eq!(
            run(table(CHUNK_ROWS * 2 + 17)).unwrap(),
            CHUNK_ROWS * 2 + 17
        );
        assert_eq!(run(table(CHUNK_ROWS)).unwrap(), CHUNK_ROWS);
        assert_eq!(run(table(0)).unwrap(), 0);
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

    #[test]
    fn a_duplicate_in_a_later_chunk_names_both_lines() {
        let mut t = table(CHUNK_ROWS + 100);
        t.push_str("S5,1,1,1,1,1,1,1\n");
        let e = run(t).unwrap_err().to_string();
        assert!(
            e.contains("sample id \"S5\" was already used on line 7"),
            "{e}"
        );
    }
}
