//! Column mappings: a small TOML file of our own that maps a lab's columns onto categories.
//!
//! ```toml
//! # which column holds the sample id (default "sample")
//! id = "Slide"
//! # percent mode only: which column holds the points counted (default "n")
//! points = "Points"
//!
//! [categories]
//! # each category takes one column or a list of columns, summed
//! Qm = ["Qm non-undulose", "Qm undulose"]
//! Lv = ["Lv felsitic", "Lv microlitic", "Lv lathwork"]
//! C = "Chert"
//! ```
//!
//! Column names match the table's header ignoring case, spaces, underscores and hyphens.
//! Categories not named here are still found by their usual header names; a table column
//! whose own name is a category the mapping sums from other columns is kept as metadata.

use crate::counts::{normalize_header, Category};
use crate::error::{Error, Location, Result};

/// One mapped column.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct MappedColumn {
    /// The category it feeds.
    pub category: Category,
    /// The column name as written in the mapping.
    pub column: String,
    /// The mapping file's 1-based line naming it.
    pub line: u64,
}

/// A parsed column mapping.
///
/// # Example
/// ```
/// use provenance_core::counts::Category;
/// use provenance_core::input::Mapping;
/// let m = Mapping::parse("lab.toml", "id = \"Slide\"\n[categories]\nQm = [\"Qm a\", \"Qm b\"]\n").unwrap();
/// assert_eq!(m.id_column.as_deref(), Some("Slide"));
/// assert_eq!(m.columns.len(), 2);
/// assert_eq!(m.columns[1].category, Category::Qm);
/// assert_eq!(m.columns[1].line, 3);
/// ```
#[derive(Debug, Clone, PartialEq, Eq, Default)]
pub struct Mapping {
    /// The mapping file's name, for messages.
    pub file: String,
    /// The id column, when not `sample`.
    pub id_column: Option<String>,
    /// The points column of percent mode, when not `n`.
    pub points_column: Option<String>,
    /// Mapped columns.
    pub columns: Vec<MappedColumn>,
}

const EXPECTED_TOP: &str = "the keys id, points and a [categories] table";
const EXPECTED_VALUE: &str = "a column name or a list of column names";

fn line_of(text: &str, key: &str) -> u64 {
    let pos = text.lines().position(|l| {
        let t = l.trim_start();
        let t = t.strip_prefix('"').unwrap_or(t);
        t.starts_with(key)
            && t[key.len()..]
                .trim_start_matches('"')
                .trim_start()
                .starts_with('=')
    });
    pos.map_or(1, |p| p as u64 + 1)
}

impl Mapping {
    /// Read and parse a mapping file.
    pub fn from_path(path: &std::path::Path) -> Result<Mapping> {
        let (name, text) = crate::text::read_text(
            path,
            "a column mapping (TOML: id, points and a [categories] table)",
        )?;
        Mapping::parse(&name, &text)
    }

    /// Parse mapping text; `file` names it in messages.
    pub fn parse(file: &str, text: &str) -> Result<Mapping> {
        let bad = |line: u64, message: String, expected: &str| Error::Malformed {
            at: Location::new(file).line(line),
            message,
            expected: expected.to_string(),
        };
        let table: toml::Table = text.parse().map_err(|e: toml::de::Error| {
            let line = e
                .span()
                .map_or(1, |s| crate::text::position(text.as_bytes(), s.start).line);
            bad(
                line,
                format!("not valid TOML ({})", e.message()),
                EXPECTED_TOP,
            )
        })?;
        let mut m = Mapping {
            file: file.to_string(),
            ..Default::default()
        };
        for (key, value) in &table {
            let line = line_of(text, key);
            match key.as_str() {
                "id" | "points" => {
                    let s = value
                        .as_str()
                        .filter(|s| !s.trim().is_empty())
                        .ok_or_else(|| bad(line, format!("{key} is {value}"), "a column name"))?;
                    if key == "id" {
                        m.id_column = Some(s.to_string());
                    } else {
                        m.points_column = Some(s.to_string());
                    }
                }
                "categories" => {
                    let cats = value.as_table().ok_or_else(|| {
                        bad(line, "categories is not a table".into(), "[categories]")
                    })?;
                    for (cat, cols) in cats {
                        let line = line_of(text, cat);
                        let category = Category::from_name(cat).ok_or_else(|| {
                            bad(
                                line,
                                format!("unknown category {cat:?}"),
                                "one of Qm, Qp, C, P, K, Lv, Ls, Lm, matrix, cement, pores, mica, dense, other",
                            )
                        })?;
                        let names: Vec<&str> = match cols {
                            toml::Value::String(s) => vec![s.as_str()],
                            toml::Value::Array(a) => a
                                .iter()
                                .map(|v| v.as_str())
                                .collect::<Option<Vec<_>>>()
                                .ok_or_else(|| {
                                    bad(line, format!("{cat} = {cols}"), EXPECTED_VALUE)
                                })?,
                            _ => return Err(bad(line, format!("{cat} = {cols}"), EXPECTED_VALUE)),
                        };
                        if names.is_empty() || names.iter().any(|n| n.trim().is_empty()) {
                            return Err(bad(line, format!("{cat} = {cols}"), EXPECTED_VALUE));
                        }
                        for n in names {
                            if let Some(prev) = m
                                .columns
                                .iter()
                                .find(|c| normalize_header(&c.column) == normalize_header(n))
                            {
                                return Err(bad(
                                    line,
                                    format!(
                                        "column {n:?} is already mapped to {} on line {}",
                                        prev.category.symbol(),
                                        prev.line
                                    ),
                                    "each column mapped once",
                                ));
                            }
                            m.columns.push(MappedColumn {
                                category,
                                column: n.to_string(),
                                line,
                            });
                        }
                    }
                }
                other => {
                    return Err(bad(line, format!("unknown key {other:?}"), EXPECTED_TOP));
                }
            }
        }
        Ok(m)
    }

    /// True when the mapping sums columns into `category`.
    pub fn maps(&self, category: Category) -> bool {
        self.columns.iter().any(|c| c.category == category)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn unknown_category_names_its_line() {
        let e = Mapping::parse("m.toml", "[categories]\nQm = \"a\"\nQuartz = \"b\"\n").unwrap_err();
        assert!(e.to_string().starts_with("m.toml, line 3:"), "{e}");
        assert!(e.to_string().contains("Quartz"));
    }

    #[test]
    fn bad_toml_names_its_line() {
        let e = Mapping::parse("m.toml", "id = \"x\"\n[categories\n").unwrap_err();
        assert!(e.to_string().contains("line 2"), "{e}");
    }

    #[test]
    fn column_mapped_twice_is_refused() {
        let e = Mapping::parse("m.toml", "[categories]\nQm = \"a\"\nQp = \"A\"\n").unwrap_err();
        assert!(
            e.to_string().contains("already mapped to Qm on line 2"),
            "{e}"
        );
    }

    #[test]
    fn non_string_value_is_refused() {
        let e = Mapping::parse("m.toml", "[categories]\nQm = 3\n").unwrap_err();
        assert!(e.to_string().contains("line 2"), "{e}");
    }
}
