//! Writing results: number formatting, CSV and JSON tables, atomic files.

pub mod atomic;
pub mod changes_table;
pub mod groups_table;
pub mod membership;
pub mod modes_table;
pub mod names_table;
pub mod number;

pub use atomic::{check_not_input, AtomicFile, Sink};
pub use membership::{column_slug, MembershipColumns, MembershipJson};
pub use modes_table::{ModesJson, ModesTable};
pub use names_table::{NamesJson, NamesTable};

/// Output table format.
///
/// # Example
/// ```
/// use provenance_core::output::Format;
/// assert_eq!("json".parse::<Format>().unwrap(), Format::Json);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Format {
    /// Comma-separated, one row per sample, flat column names.
    #[default]
    Csv,
    /// A JSON array, one object per sample.
    Json,
}

impl std::str::FromStr for Format {
    type Err = String;
    fn from_str(s: &str) -> Result<Self, Self::Err> {
        match s.to_ascii_lowercase().as_str() {
            "csv" => Ok(Format::Csv),
            "json" => Ok(Format::Json),
            _ => Err(format!("unknown format {s:?}, expected csv or json")),
        }
    }
}

/// Append one CSV cell, quoting it when it holds a comma, quote or line break.
///
/// # Example
/// ```
/// let mut b = Vec::new();
/// provenance_core::output::push_csv_cell(&mut b, "a,\"b\"");
/// assert_eq!(b, b"\"a,\"\"b\"\"\"");
/// ```
pub fn push_csv_cell(buf: &mut Vec<u8>, s: &str) {
    if s.bytes().any(|b| matches!(b, b',' | b'"' | b'\n' | b'\r')) {
        buf.push(b'"');
        for b in s.bytes() {
            if b == b'"' {
                buf.push(b'"');
            }
            buf.push(b);
        }
        buf.push(b'"');
    } else {
        buf.extend_from_slice(s.as_bytes());
    }
}

/// A sample's metadata as a JSON object (column name → value), in column order; shared by the
/// modes, names and setting interfaces.
pub(crate) struct MetadataJson<'a>(pub &'a [String], pub &'a [String]);

impl serde::Serialize for MetadataJson<'_> {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        use serde::ser::SerializeMap;
        let mut m = s.serialize_map(Some(self.0.len()))?;
        for (k, v) in self.0.iter().zip(self.1) {
            m.serialize_entry(k, v)?;
        }
        m.end()
    }
}
