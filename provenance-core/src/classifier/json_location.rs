//! Where a key or element sits in a model file's JSON text, so that a refusal names its line
//! and column although the file was checked as a whole `serde_json::Value`.
//!
//! A small scanner over text that serde_json has already accepted: it tracks nesting and
//! string escapes, and follows a path of object keys and array indices.

use crate::error::{Column, Location};
use crate::text::position;

/// One step of a path into a JSON document.
#[derive(Debug, Clone, PartialEq, Eq)]
pub(crate) enum Step {
    /// The member of an object with this key.
    Key(String),
    /// The element of an array at this 0-based index.
    Index(usize),
}

/// The step to the member `key`.
pub(crate) fn key(key: &str) -> Step {
    Step::Key(key.to_string())
}

/// A path as a reader writes it: `features.parts[1]`.
pub(crate) fn path_text(path: &[Step]) -> String {
    let mut s = String::new();
    for step in path {
        match step {
            Step::Key(k) => {
                if !s.is_empty() {
                    s.push('.');
                }
                s.push_str(k);
            }
            Step::Index(i) => s.push_str(&format!("[{i}]")),
        }
    }
    s
}

/// The byte offset at which `text` writes the value at `path`: the opening quote of the key
/// of an object member (the last one, when a key repeats, as serde_json keeps the last), the
/// first byte of an array element, the first byte of the document for an empty path. `None`
/// when the path is not in the text.
pub(crate) fn offset_of(text: &str, path: &[Step]) -> Option<usize> {
    let mut s = Scanner {
        b: text.as_bytes(),
        i: 0,
    };
    s.peek()?;
    for (n, step) in path.iter().enumerate() {
        let last = n + 1 == path.len();
        match step {
            Step::Key(k) => {
                s.eat(b'{')?;
                let mut found = None;
                while s.peek()? != b'}' {
                    let start = s.i;
                    let name = s.string()?;
                    s.eat(b':')?;
                    if name == *k {
                        found = Some((start, s.i));
                    }
                    s.skip_value()?;
                    if s.peek()? == b',' {
                        s.i += 1;
                    }
                }
                let (start, value) = found?;
                if last {
                    return Some(start);
                }
                s.i = value;
            }
            Step::Index(index) => {
                s.eat(b'[')?;
                for _ in 0..*index {
                    if s.peek()? == b']' {
                        return None;
                    }
                    s.skip_value()?;
                    s.eat(b',')?;
                }
                if s.peek()? == b']' {
                    return None;
                }
                if last {
                    return Some(s.i);
                }
            }
        }
    }
    Some(s.i)
}

/// A JSON file's name and text, to place refusals in it.
pub(crate) struct JsonText<'a> {
    /// The file, as the user named it.
    pub file: &'a str,
    /// Its text.
    pub text: &'a str,
}

impl JsonText<'_> {
    /// Where the value at `path` is written: the line and column of its key (or element),
    /// with the path as the column's name. A path not in the text (a missing key) falls back
    /// to the nearest enclosing value that is, down to the document's first line.
    pub(crate) fn at(&self, path: &[Step]) -> Location {
        for len in (0..=path.len()).rev() {
            let Some(offset) = offset_of(self.text, &path[..len]) else {
                continue;
            };
            let p = position(self.text.as_bytes(), offset);
            let at = Location::new(self.file).line(p.line);
            if len == 0 {
                return at;
            }
            return at.column(Column {
                index: p.column as usize,
                name: path_text(&path[..len]),
            });
        }
        Location::new(self.file)
    }

    /// Where serde_json stopped on text that is not JSON, and its reason without the
    /// position it appends (the location names it).
    pub(crate) fn syntax_error(&self, e: &serde_json::Error) -> (Location, String) {
        let reason = e.to_string();
        let suffix = format!(" at line {} column {}", e.line(), e.column());
        let reason = reason.strip_suffix(&suffix).unwrap_or(&reason).to_string();
        // serde_json counts the column in bytes; an editor counts characters.
        let line_start = self
            .text
            .split_inclusive('\n')
            .take(e.line().saturating_sub(1))
            .map(str::len)
            .sum::<usize>();
        let line_end = self.text[line_start..]
            .find('\n')
            .map_or(self.text.len(), |i| line_start + i);
        let offset = (line_start + e.column().saturating_sub(1)).min(line_end);
        let p = position(self.text.as_bytes(), offset);
        let at = Location::new(self.file).line(p.line).column(Column {
            index: p.column as usize,
            name: String::new(),
        });
        (at, reason)
    }
}

/// A cursor over JSON text.
struct Scanner<'a> {
    b: &'a [u8],
    i: usize,
}

impl Scanner<'_> {
    /// The next byte that is not white space, the cursor on it.
    fn peek(&mut self) -> Option<u8> {
        while matches!(self.b.get(self.i), Some(b' ' | b'\t' | b'\n' | b'\r')) {
            self.i += 1;
        }
        self.b.get(self.i).copied()
    }

    /// Step over `c`, the next byte that is not white space.
    fn eat(&mut self, c: u8) -> Option<()> {
        (self.peek()? == c).then(|| self.i += 1)
    }

    /// The four hex digits of a `\u` escape.
    fn hex4(&mut self) -> Option<u32> {
        let digits = std::str::from_utf8(self.b.get(self.i..self.i + 4)?).ok()?;
        self.i += 4;
        u32::from_str_radix(digits, 16).ok()
    }

    /// The string at the cursor, unescaped; the cursor ends past its closing quote.
    fn string(&mut self) -> Option<String> {
        self.eat(b'"')?;
        let mut out = Vec::new();
        loop {
            let c = *self.b.get(self.i)?;
            self.i += 1;
            match c {
                b'"' => return String::from_utf8(out).ok(),
                b'\\' => {
                    let e = *self.b.get(self.i)?;
                    self.i += 1;
                    let ch = match e {
                        b'n' => '\n',
                        b't' => '\t',
                        b'r' => '\r',
                        b'b' => '\u{8}',
                        b'f' => '\u{c}',
                        b'u' => {
                            let high = self.hex4()?;
                            let pair = (0xD800..0xDC00).contains(&high)
                                && self.b.get(self.i..self.i + 2) == Some(b"\\u");
                            let code = if pair {
                                let before = self.i;
                                self.i += 2;
                                let low = self.hex4()?;
                                if (0xDC00..0xE000).contains(&low) {
                                    Some(0x10000 + ((high - 0xD800) << 10) + (low - 0xDC00))
                                } else {
                                    // A lone high surrogate: the next escape stands alone.
                                    self.i = before;
                                    None
                                }
                            } else {
                                Some(high)
                            };
                            code.and_then(char::from_u32)
                                .unwrap_or(char::REPLACEMENT_CHARACTER)
                        }
                        other => char::from(other), // '"', '\\' and '/'
                    };
                    let mut buf = [0; 4];
                    out.extend_from_slice(ch.encode_utf8(&mut buf).as_bytes());
                }
                _ => out.push(c),
            }
        }
    }

    /// Step over the value at the cursor.
    fn skip_value(&mut self) -> Option<()> {
        match self.peek()? {
            b'"' => {
                self.string()?;
            }
            b'{' | b'[' => {
                let mut depth = 0usize;
                loop {
                    match *self.b.get(self.i)? {
                        b'"' => {
                            self.string()?;
                            continue;
                        }
                        b'{' | b'[' => depth += 1,
                        b'}' | b']' => {
                            depth -= 1;
                            if depth == 0 {
                                self.i += 1;
                                return Some(());
                            }
                        }
                        _ => {}
                    }
                    self.i += 1;
                }
            }
            _ => {
                while !matches!(
                    self.b.get(self.i),
                    None | Some(b',' | b'}' | b']' | b' ' | b'\t' | b'\n' | b'\r')
                ) {
                    self.i += 1;
                }
            }
        }
        Some(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const TEXT: &str = r#"{
  "format": "x",
  "features": {
    "parts": ["Q", "F", "L"],
    "note": "a \"quoted\" } ] brace, key \"parts\""
  },
  "weights": [
    [1.5, -2e3],
    [{"k": [0]}, 4]
  ],
  "caf\u00e9": true,
  "format": "y"
}
"#;

    fn line_col(path: &[Step]) -> Option<(u64, u64)> {
        offset_of(TEXT, path).map(|o| {
            let p = position(TEXT.as_bytes(), o);
            (p.line, p.column)
        })
    }

    #[test]
    fn keys_and_elements_are_found_at_their_line_and_column() {
        assert_eq!(line_col(&[]), Some((1, 1)));
        assert_eq!(line_col(&[key("features")]), Some((3, 3)));
        assert_eq!(line_col(&[key("features"), key("parts")]), Some((4, 5)));
        let third_part = [key("features"), key("parts"), Step::Index(2)];
        assert_eq!(line_col(&third_part), Some((4, 25)));
        assert_eq!(line_col(&[key("weights"), Step::Index(1)]), Some((9, 5)));
        let four = [key("weights"), Step::Index(1), Step::Index(1)];
        assert_eq!(line_col(&four), Some((9, 18)));
    }

    #[test]
    fn strings_with_escapes_and_brackets_are_skipped_whole() {
        // The note holds quotes, brackets and the text "parts": none of it is structure.
        assert_eq!(line_col(&[key("weights")]), Some((7, 3)));
        // An escaped key is compared unescaped.
        assert_eq!(line_col(&[key("café")]), Some((11, 3)));
        let pair = r#"{"a": 1, "\ud83d\ude00": 2}"#;
        assert_eq!(offset_of(pair, &[key("\u{1F600}")]), Some(9));
    }

    #[test]
    fn broken_surrogate_escapes_match_nothing_and_do_not_stop_the_scan() {
        let text = r#"{"\ud800\u0041": 1, "b": 2}"#;
        assert_eq!(offset_of(text, &[key("A")]), None);
        assert_eq!(offset_of(text, &[key("\u{FFFD}A")]), Some(1));
        assert_eq!(offset_of(text, &[key("b")]), Some(20));
    }

    proptest::proptest! {
        /// Text that is not JSON (the fallback paths of a refusal) is answered, never a panic.
        #[test]
        fn any_text_and_path_is_answered_without_a_panic(
            text in "[\\[\\]{}\":,\\\\ a-z0-9]{0,200}",
            k in "[a-z]{0,2}",
            i in 0usize..3,
        ) {
            let path = [key(&k), Step::Index(i), key(&k)];
            if let Some(offset) = offset_of(&text, &path) {
                proptest::prop_assert!(offset <= text.len());
            }
            let _ = JsonText { file: "f", text: &text }.at(&path);
        }
    }

    #[test]
    fn a_repeated_key_is_found_where_serde_json_takes_it() {
        assert_eq!(line_col(&[key("format")]), Some((12, 3)));
    }

    #[test]
    fn paths_not_in_the_text_are_none() {
        assert_eq!(line_col(&[key("intercepts")]), None);
        assert_eq!(line_col(&[key("weights"), Step::Index(2)]), None);
        assert_eq!(line_col(&[key("format"), key("x")]), None);
        assert_eq!(line_col(&[key("features"), Step::Index(0)]), None);
        assert_eq!(offset_of("   ", &[]), None);
    }

    #[test]
    fn locations_fall_back_to_the_enclosing_value() {
        let json = JsonText {
            file: "m.json",
            text: TEXT,
        };
        let at = json.at(&[key("features"), key("transform")]);
        assert_eq!(at.to_string(), "m.json, line 3, column 3 (\"features\")");
        assert_eq!(json.at(&[key("intercepts")]).to_string(), "m.json, line 1");
        let element = json.at(&[key("weights"), Step::Index(0), Step::Index(1)]);
        assert_eq!(
            element.to_string(),
            "m.json, line 8, column 11 (\"weights[0][1]\")"
        );
    }

    #[test]
    fn syntax_errors_name_line_and_character_column_once() {
        let text = "{\n  \"é\": 1,,\n}";
        let e = serde_json::from_str::<serde_json::Value>(text).unwrap_err();
        let (at, reason) = JsonText {
            file: "m.json",
            text,
        }
        .syntax_error(&e);
        // serde_json says byte column 11; the second comma is the tenth character.
        assert_eq!((e.line(), e.column()), (2, 11));
        assert_eq!(at.to_string(), "m.json, line 2, column 10");
        assert!(!reason.contains("line"), "{reason}");
    }
}
