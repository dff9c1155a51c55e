//! Text files as messages see them: the 1-based line and column of a byte offset, and files
//! read as UTF-8 with a refusal that names the first byte that is not text.

use crate::error::{Column, Error, Location, Result};
use crate::fields::TextPos;
use std::path::Path;

/// The 1-based line and column (in characters, as an editor counts) of byte `offset` of
/// `bytes`; an offset past the end counts as the end.
pub(crate) fn position(bytes: &[u8], offset: usize) -> TextPos {
    let before = &bytes[..offset.min(bytes.len())];
    let line_start = before
        .iter()
        .rposition(|b| *b == b'\n')
        .map_or(0, |i| i + 1);
    let line = before.iter().filter(|b| **b == b'\n').count() as u64 + 1;
    // Characters, not bytes: every byte but a UTF-8 continuation byte starts one.
    let chars = before[line_start..]
        .iter()
        .filter(|b| (**b & 0xC0) != 0x80)
        .count();
    TextPos {
        line,
        column: chars as u64 + 1,
    }
}

/// The offset of the first byte that keeps `bytes` from being text: a NUL, or the start of
/// a sequence that is not UTF-8.
pub(crate) fn first_non_text(bytes: &[u8]) -> Option<usize> {
    let nul = memchr::memchr(0, bytes);
    let invalid = std::str::from_utf8(bytes).err().map(|e| e.valid_up_to());
    nul.into_iter().chain(invalid).min()
}

/// The refusal of `bytes` (the start of `file`, or all of it) as not text, at the first
/// offending byte; `expected` says what kind of file was wanted.
pub(crate) fn not_text(file: &str, bytes: &[u8], expected: &str) -> Error {
    let p = position(bytes, first_non_text(bytes).unwrap_or(bytes.len()));
    Error::NotText {
        at: Location::new(file).line(p.line).column(Column {
            index: p.column as usize,
            name: String::new(),
        }),
        expected: expected.to_string(),
    }
}

/// Read a whole text file: its name for messages and its text. `expected` says what kind of
/// file was wanted, for the refusal of one that is not text.
pub(crate) fn read_text(path: &Path, expected: &str) -> Result<(String, String)> {
    let name = path.display().to_string();
    let bytes = std::fs::read(path).map_err(|source| Error::Read {
        path: name.clone(),
        source,
    })?;
    if first_non_text(&bytes).is_some() {
        return Err(not_text(&name, &bytes, expected));
    }
    let text = String::from_utf8(bytes).map_err(|e| not_text(&name, e.as_bytes(), expected))?;
    Ok((name, text))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn position_counts_lines_and_characters_from_one() {
        let text = "ab\ncdé f\n";
        assert_eq!(position(text.as_bytes(), 0), TextPos { line: 1, column: 1 });
        assert_eq!(position(text.as_bytes(), 3), TextPos { line: 2, column: 1 });
        // "é" is two bytes and one character: the space after it is the fourth character.
        let space = text.find(' ').unwrap();
        assert_eq!(
            position(text.as_bytes(), space),
            TextPos { line: 2, column: 4 }
        );
        assert_eq!(
            position(text.as_bytes(), 1000),
            TextPos { line: 3, column: 1 }
        );
    }

    #[test]
    fn the_first_nul_or_broken_sequence_is_found() {
        assert_eq!(first_non_text(b"plain\ntext"), None);
        assert_eq!(first_non_text(b"ab\xffc"), Some(2));
        assert_eq!(first_non_text(b"a\0b\xff"), Some(1));
        assert_eq!(first_non_text(b"a\xc3"), Some(1)); // a cut-off two-byte sequence
    }

    #[test]
    fn not_text_names_line_and_column_of_the_bad_byte() {
        let e = not_text("m.json", b"{\n  \"k\": \"\xff\"}", "a model file");
        assert_eq!(
            e.to_string(),
            "m.json, line 2, column 9: the bytes are not UTF-8 text, expected a model file"
        );
    }

    #[test]
    fn read_text_refuses_a_nul_byte_and_names_a_missing_file() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("set.toml");
        std::fs::write(&path, b"id = \"a\"\ntitle = \"\0\"\n").unwrap();
        let e = read_text(&path, "a field-set file").unwrap_err();
        let shown = format!("{}, line 2, column 10:", path.display());
        assert!(e.to_string().starts_with(&shown), "{e}");
        std::fs::write(&path, "id = \"a\"\n").unwrap();
        let (name, text) = read_text(&path, "a field-set file").unwrap();
        assert_eq!(
            (name, text.as_str()),
            (path.display().to_string(), "id = \"a\"\n")
        );
        let e = read_text(&dir.path().join("none.toml"), "x").unwrap_err();
        assert!(e.to_string().starts_with("cannot read "), "{e}");
    }
}
