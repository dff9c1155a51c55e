//! Which column does what: resolved once from the header.

use super::mapping::Mapping;
use crate::counts::{normalize_header, Category};
use crate::error::{Column, Error, Location, Result};

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Role {
    Id,
    Feeds(Category),
    Points,
    Meta,
}

#[derive(Debug, Clone)]
pub(crate) struct Layout {
    pub roles: Vec<Role>,
    pub id: usize,
    /// Indices of metadata columns, in order.
    pub meta: Vec<usize>,
    /// Which non-framework categories are present.
    pub present: [bool; 14],
}

/// Normalised headers taken as the sample id column without a mapping, in order of preference.
const ID_HEADERS: [&str; 5] = ["sample", "sampleid", "sampleno", "sampleno.", "samplename"];

/// The roles of the columns of `headers`, the header of `file` on 1-based line
/// `header_line` (which every refusal of the header names).
pub(crate) fn resolve_at(
    file: &str,
    header_line: u64,
    headers: &[String],
    mapping: Option<&Mapping>,
    percent: bool,
) -> Result<Layout> {
    let keys: Vec<String> = headers.iter().map(|h| normalize_header(h)).collect();
    let header = || Location::new(file).line(header_line);
    let at_col = |i: usize| {
        header().column(Column {
            index: i + 1,
            name: headers[i].clone(),
        })
    };
    let mut roles = vec![Role::Meta; headers.len()];

    let named = mapping.and_then(|m| m.id_column.clone());
    // Without a mapping, the id column is `sample` or one of the spellings labs use for it
    // (header matching already ignores case, spaces, underscores and hyphens; common practice).
    let id = match &named {
        Some(name) => keys.iter().position(|k| *k == normalize_header(name)),
        None => ID_HEADERS
            .iter()
            .find_map(|alias| keys.iter().position(|k| k == alias)),
    };
    let id_name = named.unwrap_or_else(|| "sample".into());
    let id = id.ok_or_else(|| Error::Malformed {
        at: header(),
        message: format!("no sample id column {id_name:?} among {headers:?}"),
        expected: "a column named \"sample\" (or \"sample id\", \"sample no\", \"sample name\"; or id = \"…\" in the --scheme mapping)".into(),
    })?;
    roles[id] = Role::Id;

    if let Some(m) = mapping {
        for mc in &m.columns {
            let key = normalize_header(&mc.column);
            let i = keys
                .iter()
                .position(|k| *k == key)
                .ok_or_else(|| Error::Malformed {
                    at: Location::new(&m.file).line(mc.line),
                    message: format!(
                        "column {:?} mapped to {} is not in {file}",
                        mc.column,
                        mc.category.symbol()
                    ),
                    expected: format!("a column of {file}'s header {headers:?}"),
                })?;
            if roles[i] != Role::Meta {
                return Err(Error::Malformed {
                    at: Location::new(&m.file).line(mc.line),
                    message: format!("column {:?} is the sample id column", mc.column),
                    expected: "a count column".into(),
                });
            }
            roles[i] = Role::Feeds(mc.category);
        }
    }

    if percent {
        let name = mapping
            .and_then(|m| m.points_column.clone())
            .unwrap_or_else(|| "n".into());
        if let Some(i) = keys.iter().position(|k| *k == normalize_header(&name)) {
            if roles[i] == Role::Meta {
                roles[i] = Role::Points;
            }
        }
    }

    let mut direct: [Option<usize>; 14] = [None; 14];
    for i in 0..headers.len() {
        if roles[i] != Role::Meta {
            continue;
        }
        let Some(c) = Category::from_name(&headers[i]) else {
            continue;
        };
        if mapping.is_some_and(|m| m.maps(c)) {
            continue;
        }
        if let Some(first) = direct[c.index()] {
            return Err(Error::DuplicateColumn {
                at: at_col(i),
                name: c.symbol().into(),
                first: first + 1,
            });
        }
        direct[c.index()] = Some(i);
        roles[i] = Role::Feeds(c);
    }

    let mut present = [false; 14];
    for r in &roles {
        if let Role::Feeds(c) = r {
            present[c.index()] = true;
        }
    }
    if !present.iter().any(|p| *p) {
        return Err(Error::NoCountColumns {
            at: header(),
            headers: headers.to_vec(),
        });
    }
    let missing: Vec<&str> = Category::ALL[..8]
        .iter()
        .filter(|c| **c != Category::C && !present[c.index()])
        .map(|c| c.symbol())
        .collect();
    if !missing.is_empty() {
        return Err(Error::MissingColumns {
            at: header(),
            missing: missing.join(", "),
        });
    }
    let meta = (0..headers.len())
        .filter(|i| roles[*i] == Role::Meta)
        .collect();
    Ok(Layout {
        roles,
        id,
        meta,
        present,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn cells(line: &str) -> Vec<String> {
        line.split(',').map(str::to_string).collect()
    }

    #[test]
    fn labs_spellings_of_the_id_column_are_taken_and_sample_is_preferred() {
        let fw = "Qm,Qp,P,K,Lv,Ls,Lm";
        for (head, id) in [
            (format!("Sample ID,{fw}"), 0),
            (format!("x,sample_no.,{fw}"), 1),
            (format!("Sample-Name,{fw}"), 0),
            (format!("Sample ID,Sample,{fw}"), 1),
        ] {
            let l = resolve_at("t.csv", 1, &cells(&head), None, false).unwrap();
            assert_eq!(l.id, id, "{head}");
        }
        // Not every column with "sample" in it is an id.
        let e = resolve_at(
            "t.csv",
            1,
            &cells(&format!("sample type,{fw}")),
            None,
            false,
        );
        assert!(e.is_err());
    }

    #[test]
    fn refusals_of_the_header_name_its_line() {
        // A header below two blank lines sits on line 3.
        let none = resolve_at("t.csv", 3, &cells("sample,colour"), None, false).unwrap_err();
        assert!(
            none.to_string()
                .starts_with("t.csv, line 3: no recognisable count columns"),
            "{none}"
        );
        let some = resolve_at("t.csv", 3, &cells("sample,Qm,Qp,P,K"), None, false).unwrap_err();
        assert!(
            some.to_string()
                .starts_with("t.csv, line 3: missing column(s) Lv, Ls, Lm"),
            "{some}"
        );
        let twice = resolve_at("t.csv", 3, &cells("sample,Qm,Qm"), None, false).unwrap_err();
        assert!(
            twice
                .to_string()
                .starts_with("t.csv, line 3, column 3 (\"Qm\")"),
            "{twice}"
        );
        let no_id = resolve_at("t.csv", 3, &cells("id,Qm"), None, false).unwrap_err();
        assert!(
            no_id.to_string().starts_with("t.csv, line 3: no sample id"),
            "{no_id}"
        );
    }

    #[test]
    fn a_header_on_the_first_line_is_line_one() {
        let e = resolve_at("t.csv", 1, &cells("sample,colour"), None, false).unwrap_err();
        assert!(e.to_string().starts_with("t.csv, line 1: "), "{e}");
    }
}
