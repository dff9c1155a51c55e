//! The field sets shipped in `reference-fields/`, compiled into the library so their ids
//! resolve without files.
//!
//! Each is the text of its file, parsed on request. Every shipped vertex was transcribed
//! from memory of the published figure (see each file's note and `reference-fields/README.md`).

use super::format;
use super::FieldSet;
use crate::error::Result;

/// (id, file name, text) of every embedded set, in listing order.
pub const SETS: [(&str, &str, &str); 4] = [
    (
        "dickinson1985-qfl",
        "dickinson1985-qfl.toml",
        include_str!("../../../reference-fields/dickinson1985-qfl.toml"),
    ),
    (
        "dickinson1985-qmflt",
        "dickinson1985-qmflt.toml",
        include_str!("../../../reference-fields/dickinson1985-qmflt.toml"),
    ),
    (
        "dickinson-suczek1979-qmpk",
        "dickinson-suczek1979-qmpk.toml",
        include_str!("../../../reference-fields/dickinson-suczek1979-qmpk.toml"),
    ),
    (
        "dickinson-suczek1979-qplvlsm",
        "dickinson-suczek1979-qplvlsm.toml",
        include_str!("../../../reference-fields/dickinson-suczek1979-qplvlsm.toml"),
    ),
];

/// The ids of the embedded sets, in listing order.
///
/// # Example
/// ```
/// let ids = provenance_core::fields::embedded::ids();
/// assert_eq!(ids[0], "dickinson1985-qfl");
/// ```
pub fn ids() -> Vec<&'static str> {
    SETS.iter().map(|s| s.0).collect()
}

/// The embedded set with this id, parsed; `None` for an unknown id.
///
/// # Example
/// ```
/// let set = provenance_core::fields::embedded::get("dickinson1985-qfl").unwrap().unwrap();
/// assert_eq!(set.file, "embedded:dickinson1985-qfl");
/// assert!(provenance_core::fields::embedded::get("qfl").is_none());
/// ```
pub fn get(id: &str) -> Option<Result<FieldSet>> {
    SETS.iter()
        .find(|s| s.0 == id)
        .map(|(id, _, text)| format::parse(&format!("embedded:{id}"), text))
}

/// Every embedded set, parsed, in listing order.
///
/// # Example
/// ```
/// let all = provenance_core::fields::embedded::all().unwrap();
/// assert_eq!(all.len(), 4);
/// ```
pub fn all() -> Result<Vec<FieldSet>> {
    SETS.iter()
        .map(|(id, _, text)| format::parse(&format!("embedded:{id}"), text))
        .collect()
}
