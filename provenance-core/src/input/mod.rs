//! Reading point-count tables: dialect detection, column mapping, cell validation, streaming.
//!
//! A table has one row per thin section, a `sample` id column, one column per framework
//! category (`Qm`, `Qp`, `C`, `P`, `K`, `Lv`, `Ls`, `Lm`; `C` optional), optional
//! non-framework columns (`matrix`, `cement`, `pores`, `mica`, `dense`, `other`), and any
//! number of metadata columns carried through untouched. Header matching ignores case,
//! spaces, underscores and hyphens. A [`Mapping`] maps a lab's own columns onto categories.

pub(crate) mod blocks;
mod cell;
mod id_runs;
pub(crate) mod ids;
mod layout;
pub mod mapping;
pub(crate) mod reader;

pub use mapping::Mapping;
pub use reader::{CountReader, Dialect, ReadOptions, MAX_COUNT};
