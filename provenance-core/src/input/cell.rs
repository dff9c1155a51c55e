//! Validation of one count cell.

/// Largest count accepted in one cell. Slides take 300-500 points (common practice); this
/// bound only catches values no count could reach, such as misplaced identifiers.
pub const MAX_COUNT: f64 = 10_000_000.0;

/// Why a cell was refused: the text for "expected …".
pub(crate) type Expected = &'static str;

const WHOLE: Expected =
    "a whole number of points from 0 to 10000000 (counts mode; use --percent for percentages)";
const PERCENT: Expected = "a percentage from 0 to 100";
const POINTS: Expected = "a whole number of points counted, greater than 0";

fn trim(bytes: &[u8]) -> &[u8] {
    let start = bytes
        .iter()
        .position(|b| !b.is_ascii_whitespace())
        .unwrap_or(bytes.len());
    let end = bytes
        .iter()
        .rposition(|b| !b.is_ascii_whitespace())
        .map_or(start, |e| e + 1);
    &bytes[start..end]
}

fn parse_float(t: &[u8], decimal_comma: bool) -> Option<f64> {
    let s = std::str::from_utf8(t).ok()?;
    if decimal_comma && s.contains(',') {
        s.replacen(',', ".", 1).parse().ok()
    } else {
        s.parse().ok()
    }
}

/// A count cell: blank counts as 0 points (common practice on count sheets).
pub(crate) fn count(bytes: &[u8], decimal_comma: bool) -> Result<f64, Expected> {
    let t = trim(bytes);
    if t.is_empty() {
        return Ok(0.0);
    }
    if t.len() <= 7 && t.iter().all(u8::is_ascii_digit) {
        return Ok(t.iter().fold(0u32, |a, d| a * 10 + u32::from(d - b'0')) as f64);
    }
    let v = parse_float(t, decimal_comma).ok_or(WHOLE)?;
    if !v.is_finite() || v < 0.0 || v.fract() != 0.0 || v > MAX_COUNT {
        return Err(WHOLE);
    }
    Ok(v)
}

/// A percentage cell: blank counts as 0.
pub(crate) fn percent(bytes: &[u8], decimal_comma: bool) -> Result<f64, Expected> {
    let t = trim(bytes);
    if t.is_empty() {
        return Ok(0.0);
    }
    let v = parse_float(t, decimal_comma).ok_or(PERCENT)?;
    if !v.is_finite() || !(0.0..=100.0).contains(&v) {
        return Err(PERCENT);
    }
    Ok(v)
}

/// The points-counted cell of percent mode: blank means unknown.
pub(crate) fn points(bytes: &[u8], decimal_comma: bool) -> Result<Option<f64>, Expected> {
    let t = trim(bytes);
    if t.is_empty() {
        return Ok(None);
    }
    let v = parse_float(t, decimal_comma).ok_or(POINTS)?;
    if !v.is_finite() || v <= 0.0 || v.fract() != 0.0 || v > MAX_COUNT {
        return Err(POINTS);
    }
    Ok(Some(v))
}

pub(crate) fn trimmed(bytes: &[u8]) -> &[u8] {
    trim(bytes)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn counts_accept_whole_values_and_blank() {
        assert_eq!(count(b" 12 ", false), Ok(12.0));
        assert_eq!(count(b"12.0", false), Ok(12.0));
        assert_eq!(count(b"", false), Ok(0.0));
        assert_eq!(count(b"9999999", false), Ok(9_999_999.0));
        assert_eq!(count(b"10000000", false), Ok(10_000_000.0));
    }

    #[test]
    fn counts_refuse_bad_values() {
        for bad in [
            "-1", "1.5", "NaN", "inf", "abc", "1e12", "10000001", "99999999",
        ] {
            assert_eq!(count(bad.as_bytes(), false), Err(WHOLE), "{bad}");
        }
    }

    #[test]
    fn decimal_comma_only_when_enabled() {
        assert_eq!(percent(b"12,5", true), Ok(12.5));
        assert_eq!(percent(b"12,5", false), Err(PERCENT));
        assert_eq!(percent(b"100.5", false), Err(PERCENT));
    }

    #[test]
    fn points_blank_is_unknown() {
        assert_eq!(points(b"", false), Ok(None));
        assert_eq!(points(b"400", false), Ok(Some(400.0)));
        assert_eq!(points(b"0", false), Err(POINTS));
    }
}
