//! Streaming the names table: CSV, JSON or the plain-words explanation.

use super::SchemeSet;
use crate::batch::stream_rows;
use crate::error::Result;
use crate::input::CountReader;
use crate::output::names_table::{push_explanation, EXPLAIN_PREAMBLE};
use crate::output::{Format, NamesJson, NamesTable};
use std::io::Write;

/// What `write_names` writes.
///
/// # Example
/// ```
/// use provenance_core::naming::NamesOutput;
/// use provenance_core::output::Format;
/// assert_ne!(NamesOutput::Table(Format::Csv), NamesOutput::Explain);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum NamesOutput {
    /// The names table as CSV or JSON.
    Table(Format),
    /// Per sample, the recalculated poles and the rule behind each name, in words.
    Explain,
}

impl Default for NamesOutput {
    fn default() -> Self {
        NamesOutput::Table(Format::Csv)
    }
}

/// Name every sample in `reader` under every scheme of `schemes` and write the result to
/// `out`, streaming in input order. Metadata columns are carried through. Returns the number of
/// samples.
///
/// # Example
/// ```
/// use provenance_core::input::{CountReader, ReadOptions};
/// use provenance_core::naming::{write_names, NamesOutput, SchemeSet};
/// use provenance_core::output::Format;
/// let t = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,matrix,unit\nA,270,0,30,0,0,0,0,0,10,lower\n";
/// let r = CountReader::from_reader("t.csv", t.as_bytes(), ReadOptions::default()).unwrap();
/// let mut out = Vec::new();
/// let n = write_names(r, &mut out, "out", &SchemeSet::standard(), NamesOutput::Table(Format::Json)).unwrap();
/// assert_eq!(n, 1);
/// let v: serde_json::Value = serde_json::from_slice(&out).unwrap();
/// assert_eq!(v[0]["folk"], "sublitharenite");
/// assert_eq!(v[0]["garzanti"], "quartzose");
/// assert_eq!(v[0]["pettijohn"], "quartz arenite");
/// assert_eq!(v[0]["metadata"]["unit"], "lower");
/// ```
pub fn write_names<W: Write + ?Sized>(
    reader: CountReader,
    out: &mut W,
    out_name: &str,
    schemes: &SchemeSet,
    output: NamesOutput,
) -> Result<usize> {
    let metadata = reader.metadata_columns().to_vec();
    match output {
        NamesOutput::Table(Format::Csv) => {
            let table = NamesTable { metadata, schemes };
            let mut header = Vec::new();
            table.push_header(&mut header);
            stream_rows(reader, out, out_name, &header, b"", b"", |s, buf| {
                table.push_row(buf, s, &schemes.classify(s));
            })
        }
        NamesOutput::Table(Format::Json) => {
            stream_rows(reader, out, out_name, b"[\n", b",\n", b"\n]\n", |s, buf| {
                let namings = schemes.classify(s);
                let rec = NamesJson {
                    sample: s,
                    namings: &namings,
                    schemes,
                    metadata: &metadata,
                };
                // Serializing maps of strings and numbers into memory cannot fail.
                let _ = serde_json::to_writer(&mut *buf, &rec);
            })
        }
        NamesOutput::Explain => stream_rows(
            reader,
            out,
            out_name,
            EXPLAIN_PREAMBLE.as_bytes(),
            b"\n",
            b"",
            |s, buf| push_explanation(buf, s, schemes, &schemes.classify(s)),
        ),
    }
}
