//! The field-set file format: TOML of our own design (documented in
//! `reference-fields/README.md`).
//!
//! ```toml
//! format = 1                      # optional; the only version so far
//! id = "my-lab-qfl"               # lower-case letters, digits, '.', '_' and '-'
//! title = "QFL fields digitised by our lab"
//! diagram = "qfl"                 # qfl, qmflt, qmpk, qplvlsm or lmlvls
//! note = "Digitised at 600 dpi from the printed figure; vertices ±0.5%."
//!
//! [source]
//! author = "Dickinson"
//! year = 1985
//! figure = "Fig. 1"
//! reference = "Interpreting provenance relations from detrital modes of sandstones"
//!
//! [[fields]]
//! name = "craton interior"        # as published, lower-case
//! group = "continental block"     # continental block, magmatic arc, recycled orogen, mixed
//! vertices = [[100, 0, 0], [82, 18, 0], [97, 0, 3]]   # percent of the diagram's poles
//! ```
//!
//! Parsing checks structure and types; [`super::check`] checks the values (sums, ranges,
//! simple polygons, overlaps). Every refusal names the file, line, column, key, the value
//! and what was expected.

use super::{Field, FieldPositions, FieldSet, Group, Source, TextPos};
use crate::diagram::Diagram;
use crate::error::{Column, Error, Location, Result};
use crate::geometry::Polygon;
use serde::Deserialize;
use toml::Spanned;

/// The format version this build reads.
pub const FORMAT_VERSION: i64 = 1;

/// What a field-set file is, for refusals of the whole file.
const EXPECTED_FILE: &str = "a field set as described in reference-fields/README.md";

/// Most vertices a set may have in all, so that checking stays quick (our limit; a digitised
/// field rarely needs more than a few hundred).
pub const MAX_VERTICES: usize = 10_000;

#[derive(Deserialize)]
#[serde(deny_unknown_fields)]
struct RawSet {
    format: Option<Spanned<i64>>,
    id: Spanned<String>,
    title: Spanned<String>,
    diagram: Spanned<String>,
    note: Spanned<String>,
    source: RawSource,
    fields: Spanned<Vec<RawField>>,
}

#[derive(Deserialize)]
#[serde(deny_unknown_fields)]
struct RawSource {
    author: Spanned<String>,
    year: Spanned<i64>,
    figure: Spanned<String>,
    reference: Spanned<String>,
}

#[derive(Deserialize)]
#[serde(deny_unknown_fields)]
struct RawField {
    name: Spanned<String>,
    group: Spanned<String>,
    vertices: Spanned<Vec<Spanned<Vec<Spanned<f64>>>>>,
}

/// 1-based line and column of a byte offset.
fn pos(text: &str, offset: usize) -> TextPos {
    crate::text::position(text.as_bytes(), offset)
}

/// The key written at the start of the line holding `offset`, when the line is `key = …`.
fn key_at(text: &str, offset: usize) -> Option<String> {
    let offset = offset.min(text.len());
    let start = text.get(..offset)?.rfind('\n').map_or(0, |i| i + 1);
    let line = text[start..].lines().next()?;
    let (k, _) = line.split_once('=')?;
    let k = k.trim().trim_matches('"');
    (!k.is_empty() && !k.starts_with('[') && !k.contains(char::is_whitespace))
        .then(|| k.to_string())
}

struct Ctx<'a> {
    file: &'a str,
    text: &'a str,
}

impl Ctx<'_> {
    fn at(&self, span: &std::ops::Range<usize>, key: &str) -> Location {
        let p = pos(self.text, span.start);
        if key.is_empty() {
            return Location::new(self.file).line(p.line);
        }
        Location::new(self.file).line(p.line).column(Column {
            index: p.column as usize,
            name: key.to_string(),
        })
    }

    fn bad(
        &self,
        span: &std::ops::Range<usize>,
        key: &str,
        message: String,
        expected: &str,
    ) -> Error {
        Error::Malformed {
            at: self.at(span, key),
            message,
            expected: expected.to_string(),
        }
    }

    fn text_value(&self, v: Spanned<String>, key: &str) -> Result<String> {
        let span = v.span();
        let s = v.into_inner();
        if s.trim().is_empty() {
            return Err(self.bad(
                &span,
                key,
                format!("key {key} is {s:?}"),
                "a non-empty string",
            ));
        }
        Ok(s.trim().to_string())
    }
}

fn id_ok(id: &str) -> bool {
    let mut chars = id.chars();
    chars
        .next()
        .is_some_and(|c| c.is_ascii_lowercase() || c.is_ascii_digit())
        && chars.all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || "._-".contains(c))
}

/// Read and parse a field-set file.
///
/// # Example
/// ```
/// let dir = tempfile::tempdir().unwrap();
/// let path = dir.path().join("bad.toml");
/// std::fs::write(&path, "id = \"x\"\n").unwrap();
/// let e = provenance_core::fields::format::from_path(&path).unwrap_err();
/// assert!(e.to_string().contains("missing"), "{e}");
/// ```
pub fn from_path(path: &std::path::Path) -> Result<FieldSet> {
    let (name, text) = crate::text::read_text(path, EXPECTED_FILE)?;
    parse(&name, &text)
}

/// Parse field-set text; `file` names it in messages.
///
/// # Example
/// ```
/// use provenance_core::fields::format::parse;
/// let text = r#"
/// id = "demo"
/// title = "Two fields"
/// diagram = "qfl"
/// note = "Invented for this example."
/// [source]
/// author = "Nobody"
/// year = 2024
/// figure = "none"
/// reference = "this example"
/// [[fields]]
/// name = "upper"
/// group = "continental block"
/// vertices = [[100, 0, 0], [50, 50, 0], [50, 0, 50]]
/// [[fields]]
/// name = "lower"
/// group = "magmatic arc"
/// vertices = [[50, 50, 0], [0, 100, 0], [0, 0, 100], [50, 0, 50]]
/// "#;
/// let set = parse("demo.toml", text).unwrap();
/// assert_eq!(set.fields[1].name, "lower");
/// assert_eq!(set.fields[1].positions.vertices[0].line, 18);
///
/// let e = parse("demo.toml", &text.replace("magmatic arc", "arc")).unwrap_err();
/// assert!(e.to_string().starts_with("demo.toml, line 17, column 9 (\"group\")"), "{e}");
/// ```
pub fn parse(file: &str, text: &str) -> Result<FieldSet> {
    let cx = Ctx { file, text };
    let raw: RawSet = toml::from_str(text).map_err(|e| {
        let span = e.span().unwrap_or(0..0);
        let key = key_at(text, span.start).unwrap_or_default();
        let shown = text
            .get(span.clone())
            .map(|s| s.trim())
            .filter(|s| !s.is_empty() && s.len() <= 80 && !s.contains('\n'));
        let message = match shown {
            Some(v) if !key.is_empty() => {
                format!("key {key} = {v}: {}", e.message().trim())
            }
            _ => e.message().trim().to_string(),
        };
        Error::Malformed {
            at: cx.at(&span, &key),
            message,
            expected: EXPECTED_FILE.into(),
        }
    })?;
    if let Some(f) = &raw.format {
        if *f.get_ref() != FORMAT_VERSION {
            return Err(cx.bad(
                &f.span(),
                "format",
                format!("format = {}", f.get_ref()),
                "format = 1",
            ));
        }
    }
    let id_span = raw.id.span();
    let id = cx.text_value(raw.id, "id")?;
    if !id_ok(&id) {
        return Err(cx.bad(
            &id_span,
            "id",
            format!("id = {id:?}"),
            "lower-case letters, digits, '.', '_' and '-', starting with a letter or digit",
        ));
    }
    let title = cx.text_value(raw.title, "title")?;
    let d_span = raw.diagram.span();
    let diagram: Diagram = raw.diagram.get_ref().parse().map_err(|_| {
        cx.bad(
            &d_span,
            "diagram",
            format!("diagram = {:?}", raw.diagram.get_ref()),
            "one of qfl, qmflt, qmpk, qplvlsm, lmlvls",
        )
    })?;
    let note = cx.text_value(raw.note, "note")?;
    let year_span = raw.source.year.span();
    let year = i32::try_from(*raw.source.year.get_ref())
        .ok()
        .filter(|y| (1000..=9999).contains(y))
        .ok_or_else(|| {
            cx.bad(
                &year_span,
                "year",
                format!("year = {}", raw.source.year.get_ref()),
                "a four-digit year",
            )
        })?;
    let source = Source {
        author: cx.text_value(raw.source.author, "author")?,
        year,
        figure: cx.text_value(raw.source.figure, "figure")?,
        reference: cx.text_value(raw.source.reference, "reference")?,
    };
    let fields_span = raw.fields.span();
    let raw_fields = raw.fields.into_inner();
    if raw_fields.is_empty() {
        return Err(cx.bad(
            &fields_span,
            "fields",
            "no fields".into(),
            "at least one [[fields]] table",
        ));
    }
    let total: usize = raw_fields.iter().map(|f| f.vertices.get_ref().len()).sum();
    if total > MAX_VERTICES {
        return Err(cx.bad(
            &fields_span,
            "fields",
            format!("the fields have {total} vertices in all"),
            &format!("at most {MAX_VERTICES}"),
        ));
    }
    let mut fields: Vec<Field> = Vec::with_capacity(raw_fields.len());
    for rf in raw_fields {
        fields.push(field(&cx, rf, diagram, &fields)?);
    }
    Ok(FieldSet {
        id,
        title,
        diagram,
        source,
        note,
        fields,
        file: file.to_string(),
    })
}

fn field(cx: &Ctx, rf: RawField, diagram: Diagram, earlier: &[Field]) -> Result<Field> {
    let name_span = rf.name.span();
    let name_pos = pos(cx.text, name_span.start);
    let name = cx.text_value(rf.name, "name")?;
    if let Some(prev) = earlier.iter().find(|f| f.name.eq_ignore_ascii_case(&name)) {
        return Err(cx.bad(
            &name_span,
            "name",
            format!(
                "name = {name:?} repeats the field on line {}",
                prev.positions.name.line
            ),
            "a different name for each field",
        ));
    }
    let g_span = rf.group.span();
    let group: Group = rf.group.get_ref().parse().map_err(|_| {
        cx.bad(
            &g_span,
            "group",
            format!("group = {:?} in field {name:?}", rf.group.get_ref()),
            "one of continental block, magmatic arc, recycled orogen, mixed",
        )
    })?;
    let poles = diagram.poles();
    let expected = format!(
        "[{}, {}, {}] in percent, three numbers",
        poles[0], poles[1], poles[2]
    );
    let mut vertices = Vec::new();
    let mut positions = Vec::new();
    for v in rf.vertices.into_inner() {
        let span = v.span();
        let parts: Vec<f64> = v
            .into_inner()
            .into_iter()
            .map(Spanned::into_inner)
            .collect();
        let shown = cx.text.get(span.clone()).unwrap_or("").to_string();
        if parts.len() != 3 {
            return Err(cx.bad(
                &span,
                "vertices",
                format!(
                    "vertex {} of field {name:?} is {shown} ({} numbers)",
                    vertices.len() + 1,
                    parts.len()
                ),
                &expected,
            ));
        }
        if parts.iter().any(|p| !p.is_finite()) {
            return Err(cx.bad(
                &span,
                "vertices",
                format!("vertex {} of field {name:?} is {shown}", vertices.len() + 1),
                &format!("{expected}, finite"),
            ));
        }
        positions.push(pos(cx.text, span.start));
        vertices.push([parts[0], parts[1], parts[2]]);
    }
    Ok(Field {
        name,
        group,
        polygon: Polygon::new(vertices),
        positions: FieldPositions {
            name: name_pos,
            vertices: positions,
        },
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    const HEAD: &str = "id = \"t\"\ntitle = \"t\"\ndiagram = \"qfl\"\nnote = \"n\"\n[source]\nauthor = \"a\"\nyear = 2000\nfigure = \"f\"\nreference = \"r\"\n";

    fn with_field(body: &str) -> String {
        format!("{HEAD}[[fields]]\n{body}")
    }

    #[test]
    fn wrong_vertex_length_names_line_key_value_and_expectation() {
        let t = with_field(
            "name = \"a\"\ngroup = \"mixed\"\nvertices = [[100, 0, 0], [50, 50], [0, 0, 100]]\n",
        );
        let e = parse("f.toml", &t).unwrap_err().to_string();
        assert!(
            e.starts_with("f.toml, line 13, column 26 (\"vertices\")"),
            "{e}"
        );
        assert!(
            e.contains("[50, 50]") && e.contains("expected [Q, F, L]"),
            "{e}"
        );
    }

    #[test]
    fn string_vertex_part_is_refused_with_its_line() {
        let t = with_field(
            "name = \"a\"\ngroup = \"mixed\"\nvertices = [[100, 0, 0], [50, \"x\", 50], [0, 0, 100]]\n",
        );
        let e = parse("f.toml", &t).unwrap_err().to_string();
        assert!(e.starts_with("f.toml, line 13"), "{e}");
        assert!(e.contains("vertices"), "{e}");
    }

    #[test]
    fn unknown_key_is_refused() {
        let t = with_field("name = \"a\"\ngroup = \"mixed\"\ncolour = \"red\"\nvertices = []\n");
        let e = parse("f.toml", &t).unwrap_err().to_string();
        assert!(e.contains("line 13") && e.contains("colour"), "{e}");
    }

    #[test]
    fn duplicate_field_name_names_first_line() {
        let f =
            "name = \"a\"\ngroup = \"mixed\"\nvertices = [[100, 0, 0], [0, 100, 0], [0, 0, 100]]\n";
        let t = format!("{}[[fields]]\n{f}", with_field(f));
        let e = parse("f.toml", &t).unwrap_err().to_string();
        assert!(e.starts_with("f.toml, line 15, column 8 (\"name\")"), "{e}");
        assert!(e.contains("repeats the field on line 11"), "{e}");
    }

    #[test]
    fn unknown_diagram_and_bad_id_are_refused() {
        let ok =
            "name = \"a\"\ngroup = \"mixed\"\nvertices = [[100, 0, 0], [0, 100, 0], [0, 0, 100]]\n";
        assert!(parse("f.toml", &with_field(ok)).is_ok());
        let e = parse("f.toml", &with_field(ok).replace("\"qfl\"", "\"qxl\""))
            .unwrap_err()
            .to_string();
        assert!(
            e.starts_with("f.toml, line 3, column 11 (\"diagram\")"),
            "{e}"
        );
        let e = parse(
            "f.toml",
            &with_field(ok).replace("id = \"t\"", "id = \"My Set\""),
        )
        .unwrap_err()
        .to_string();
        assert!(e.contains("line 1") && e.contains("My Set"), "{e}");
    }

    #[test]
    fn missing_key_names_the_table() {
        let e = parse("f.toml", &with_field("name = \"a\"\nvertices = []\n"))
            .unwrap_err()
            .to_string();
        assert!(
            e.starts_with("f.toml, line 10: missing field `group`"),
            "{e}"
        );
    }

    #[test]
    fn invalid_toml_names_its_line() {
        let e = parse("f.toml", "id = \"t\"\ntitle = \n")
            .unwrap_err()
            .to_string();
        assert!(e.starts_with("f.toml, line 2"), "{e}");
    }
}
