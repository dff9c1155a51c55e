//! Post-processing of the SVG that plotters writes: the one place where sandprov edits SVG
//! text.
//!
//! plotters' SVG backend can neither set ids nor write `<tspan>`, so each layer is drawn into
//! its own document, and this module
//! - takes the body of each layer document and wraps it in `<g id="LAYER">`;
//! - writes one root `<svg>` whose `width` and `height` give the printed size in millimetres
//!   and whose `viewBox` spans the internal canvas (0.1 pt units);
//! - turns the private-use subscript marks of pole labels into `<tspan>` subscripts;
//! - tidies `font-size` values (plotters divides by 1.24, leaving long decimals).
//!
//! User strings never reach this module unescaped: plotters escapes `<`, `>`, `&` and quotes in
//! text and attributes, and [`super::text::sanitize`] removes what XML cannot hold at all.

use super::size::{MM_PER_PT, UNITS_PER_PT};
use super::text::{FONT_FAMILY, SUBSCRIPT_SCALE, SUB_CLOSE, SUB_OPEN};
use std::fmt::Write;

/// The layer ids, bottom to top.
///
/// # Example
/// ```
/// use provenance_core::plot::svg::LAYERS;
/// assert_eq!(LAYERS.first(), Some(&"grid"));
/// assert!(LAYERS.contains(&"fields") && LAYERS.contains(&"legend"));
/// ```
pub const LAYERS: [&str; 7] = [
    "grid", "fields", "frame", "regions", "samples", "labels", "legend",
];

/// The body of a document written by plotters: everything between the root's start tag and
/// its end tag.
fn body(doc: &str) -> &str {
    let start = doc
        .find("<svg")
        .and_then(|i| doc[i..].find('>').map(|j| i + j + 1))
        .unwrap_or(0);
    let end = doc.rfind("</svg>").unwrap_or(doc.len()).max(start);
    &doc[start..end]
}

/// Round a font-size attribute value to 2 decimals.
fn tidy_font_sizes(s: &str, out: &mut String) {
    const KEY: &str = "font-size=\"";
    let mut rest = s;
    while let Some(i) = rest.find(KEY) {
        out.push_str(&rest[..i + KEY.len()]);
        rest = &rest[i + KEY.len()..];
        let end = rest.find('"').unwrap_or(rest.len());
        match rest[..end].parse::<f64>() {
            Ok(v) => {
                let _ = write!(out, "{}", (v * 100.0).round() / 100.0);
            }
            Err(_) => out.push_str(&rest[..end]),
        }
        rest = &rest[end..];
    }
    out.push_str(rest);
}

/// Replace subscript marks by tspans.
fn subscripts(s: &str) -> String {
    let open = format!(
        "<tspan baseline-shift=\"sub\" font-size=\"{}%\">",
        (SUBSCRIPT_SCALE * 100.0).round()
    );
    let mut out = String::with_capacity(s.len());
    for c in s.chars() {
        match c {
            SUB_OPEN => out.push_str(&open),
            SUB_CLOSE => out.push_str("</tspan>"),
            c => out.push(c),
        }
    }
    out
}

/// Assemble the figure from its layer documents (in [`LAYERS`] order) on a canvas of
/// `width` × `height` internal units.
pub(crate) fn compose(width: f64, height: f64, layers: &[(&str, String)]) -> String {
    let mm = |units: f64| units / UNITS_PER_PT * MM_PER_PT;
    let total: usize = layers.iter().map(|(_, s)| s.len()).sum();
    let mut out = String::with_capacity(total + 1024);
    let _ = write!(
        out,
        "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n\
         <svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" \
         width=\"{:.2}mm\" height=\"{:.2}mm\" viewBox=\"0 0 {:.1} {:.1}\" \
         font-family=\"{FONT_FAMILY}\">\n",
        mm(width),
        mm(height),
        width,
        height
    );
    for (id, doc) in layers {
        let _ = writeln!(out, "<g id=\"{id}\">");
        let b = body(doc);
        if b.contains(SUB_OPEN) {
            tidy_font_sizes(&subscripts(b), &mut out);
        } else {
            tidy_font_sizes(b, &mut out);
        }
        out.push_str("</g>\n");
    }
    out.push_str("</svg>\n");
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn layers_get_ids_and_the_root_gets_a_physical_size() {
        let doc = "<svg width=\"10\" height=\"10\" viewBox=\"0 0 10 10\" xmlns=\"http://www.w3.org/2000/svg\">\n<text font-size=\"48.387096774193544\">Q\u{E000}m\u{E001}</text>\n</svg>\n";
        let svg = compose(2409.4488, 1000.0, &[("labels", doc.to_string())]);
        assert!(svg.contains("width=\"85.00mm\""), "{svg}");
        assert!(svg.contains("<g id=\"labels\">"));
        assert!(svg.contains("font-size=\"48.39\""));
        assert!(svg.contains("Q<tspan baseline-shift=\"sub\" font-size=\"70%\">m</tspan>"));
        assert_eq!(svg.matches("<svg").count(), 1);
    }
}
