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

/// Rows per parallel chunk.
pub const CHUNK_ROWS: usize = 8192;

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
    let mut total = 0usize;
    let mut wrote = false;
    let mut records: Vec<csv::ByteRecord> = Vec::new();
    loop {
        // Serial part: split rows and check ids for uniqueness, the one check that needs
        // earlier rows. A refusal here ends the chunk at the offending row.
        let mut filled = 0;
        let mut refusal = None;
        while filled < CHUNK_ROWS {
            if records.len() == filled {
                records.push(csv::ByteRecord::new());
            }
            match reader.read_raw(&mut records[filled]) {
                Ok(false) => break,
                Ok(true) => {}
                Err(e) => {
                    refusal = Some(e);
                    break;
                }
            }
            if let Err(e) = reader.check_unique(&records[filled]) {
                refusal = Some(e);
                break;
            }
            filled += 1;
        }
        // Parallel part: validate, compute and format; the first refusal in row order wins.
        let parser = reader.parser();
        let parts: Vec<Result<Vec<u8>>> = records[..filled]
            .par_chunks(512)
            .map(|part| {
                let mut buf = Vec::with_capacity(part.len() * 320);
                for (i, rec) in part.iter().enumerate() {
                    let sample = parser.parse_record(rec)?;
                    if i > 0 {
                        buf.extend_from_slice(sep);
                    }
                    each(&sample, &mut buf);
                }
                Ok(buf)
            })
            .collect();
        for p in parts {
            let p = p?;
            if wrote {
                out.write_all(sep).map_err(werr)?;
            }
            out.write_all(&p).map_err(werr)?;
            wrote = true;
        }
        total += filled;
        if let Some(e) = refusal {
            return Err(e);
        }
        if filled < CHUNK_ROWS {
            break;
        }
    }
    out.write_all(end).map_err(werr)?;
    Ok(total)
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
