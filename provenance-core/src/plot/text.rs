//! Text in figures: the embedded font, measured widths, safe user strings and trade notation.
//!
//! Every figure uses one font, DejaVu Sans (Bitstream Vera licence with DejaVu changes in the
//! public domain: free to embed and redistribute), compiled into the library by the `dejavu`
//! crate. Widths are measured from its real advance widths, so legends and labels are laid out
//! from the same metrics that PNG and PDF rendering use.

use std::sync::OnceLock;

/// The font family name written into SVG `font-family` attributes.
pub const FONT_FAMILY: &str = "DejaVu Sans";

/// The embedded font file (TrueType).
///
/// # Example
/// ```
/// assert_eq!(&provenance_core::plot::text::font_data()[..4], &[0, 1, 0, 0]);
/// ```
pub fn font_data() -> &'static [u8] {
    dejavu::sans::regular()
}

/// Private-use character that opens a subscript in a label (see [`trade_notation`]).
pub(crate) const SUB_OPEN: char = '\u{E000}';
/// Private-use character that closes a subscript.
pub(crate) const SUB_CLOSE: char = '\u{E001}';

struct Metrics {
    units_per_em: f64,
    ascii: [f64; 128],
    fallback: f64,
}

fn metrics() -> &'static Metrics {
    static METRICS: OnceLock<Metrics> = OnceLock::new();
    METRICS.get_or_init(|| {
        // The embedded font is a fixed, valid file; if it ever failed to parse, widths fall
        // back to a generic estimate of 0.6 em per character instead of panicking.
        match ttf_parser::Face::parse(font_data(), 0) {
            Ok(face) => {
                let units = f64::from(face.units_per_em());
                let advance = |c: char| {
                    face.glyph_index(c)
                        .and_then(|g| face.glyph_hor_advance(g))
                        .map(f64::from)
                };
                let fallback = advance('n').unwrap_or(0.6 * units);
                let mut ascii = [fallback; 128];
                for (i, slot) in ascii.iter_mut().enumerate() {
                    if let Some(a) = char::from_u32(i as u32).and_then(advance) {
                        *slot = a;
                    }
                }
                Metrics {
                    units_per_em: units,
                    ascii,
                    fallback,
                }
            }
            Err(_) => Metrics {
                units_per_em: 1.0,
                ascii: [0.6; 128],
                fallback: 0.6,
            },
        }
    })
}

fn face() -> Option<&'static ttf_parser::Face<'static>> {
    static FACE: OnceLock<Option<ttf_parser::Face<'static>>> = OnceLock::new();
    FACE.get_or_init(|| ttf_parser::Face::parse(font_data(), 0).ok())
        .as_ref()
}

/// Width of `text` set at `size` (any unit; the width comes back in the same unit), from the
/// embedded font's advance widths. Subscripts (see [`trade_notation`]) count at 70% size.
///
/// # Example
/// ```
/// use provenance_core::plot::text::text_width;
/// let w = text_width("Qm", 10.0);
/// assert!(w > text_width("Q", 10.0) && w < 2.0 * 10.0);
/// assert_eq!(text_width("", 10.0), 0.0);
/// ```
pub fn text_width(text: &str, size: f64) -> f64 {
    let m = metrics();
    let mut scale = 1.0;
    let mut total = 0.0;
    for c in text.chars() {
        match c {
            SUB_OPEN => scale = SUBSCRIPT_SCALE,
            SUB_CLOSE => scale = 1.0,
            _ => {
                let a = if (c as u32) < 128 {
                    m.ascii[c as usize]
                } else {
                    face()
                        .and_then(|f| f.glyph_index(c).and_then(|g| f.glyph_hor_advance(g)))
                        .map(f64::from)
                        .unwrap_or(m.fallback)
                };
                total += a * scale;
            }
        }
    }
    total / m.units_per_em * size
}

/// Size of subscripts relative to the surrounding text.
pub const SUBSCRIPT_SCALE: f64 = 0.7;

/// Height above the baseline of capital letters, as a fraction of the font size (DejaVu Sans:
/// cap height 1493 of 2048 font units).
pub const CAP_HEIGHT: f64 = 0.729;

/// Make a user string (sample id, group name, label) safe to draw.
///
/// XML cannot carry most control characters at all, not even escaped, so they become spaces;
/// the private-use characters sandprov uses for subscripts and Unicode non-characters become
/// U+FFFD. Markup characters (`<`, `&`, quotes) are kept here and escaped when the SVG is
/// written, so a hostile id shows as text and injects nothing.
///
/// # Example
/// ```
/// use provenance_core::plot::text::sanitize;
/// assert_eq!(sanitize("a\u{1}b\tc"), "a b c");
/// assert_eq!(sanitize("<b>&"), "<b>&");
/// assert_eq!(sanitize("x\u{E000}"), "x\u{FFFD}");
/// ```
pub fn sanitize(s: &str) -> String {
    s.chars()
        .map(|c| match c {
            c if c.is_control() => ' ',
            '\u{E000}'..='\u{F8FF}' | '\u{FFFE}' | '\u{FFFF}' => '\u{FFFD}',
            c => c,
        })
        .collect()
}

/// Shorten `text` with an ellipsis so that it is at most `max_width` wide at `size`.
///
/// # Example
/// ```
/// use provenance_core::plot::text::{fit_width, text_width};
/// let long = "Upper Kessra Sandstone, lower member";
/// let short = fit_width(long, 60.0, 7.0);
/// assert!(short.ends_with('…') && text_width(&short, 7.0) <= 60.0);
/// assert_eq!(fit_width("ok", 60.0, 7.0), "ok");
/// ```
pub fn fit_width(text: &str, max_width: f64, size: f64) -> String {
    if text_width(text, size) <= max_width {
        return text.to_string();
    }
    // No glyph of the font is narrower than a quarter em except zero-width marks, so no more
    // characters than this can fit; cutting first keeps hostile megabyte-long names cheap.
    let cap = (max_width / (0.25 * size.max(f64::MIN_POSITIVE))).ceil() as usize + 1;
    let mut chars: Vec<char> = text.chars().take(cap).collect();
    while !chars.is_empty() {
        chars.pop();
        let candidate: String = chars.iter().collect::<String>().trim_end().to_string() + "…";
        if text_width(&candidate, size) <= max_width {
            return candidate;
        }
    }
    "…".to_string()
}

/// A pole symbol in trade notation with its subscript marked: the first letter is the
/// mineral or grain class, the rest a subscript (Qm → Q with subscript m, Lsm → L with
/// subscript sm), as the symbols are printed in Dickinson & Suczek (1979). SVG shows the
/// subscript; [`plain`] gives the symbol back.
///
/// # Example
/// ```
/// use provenance_core::plot::text::{plain, trade_notation};
/// assert_eq!(plain(&trade_notation("Lsm")), "Lsm");
/// assert_eq!(trade_notation("Q"), "Q");
/// assert_ne!(trade_notation("Qm"), "Qm");
/// ```
pub fn trade_notation(symbol: &str) -> String {
    let mut chars = symbol.chars();
    match chars.next() {
        Some(first) => {
            let rest: String = chars.collect();
            if rest.is_empty() {
                first.to_string()
            } else {
                format!("{first}{SUB_OPEN}{rest}{SUB_CLOSE}")
            }
        }
        None => String::new(),
    }
}

/// A label with its subscript marks removed.
pub fn plain(label: &str) -> String {
    label
        .chars()
        .filter(|c| *c != SUB_OPEN && *c != SUB_CLOSE)
        .collect()
}
