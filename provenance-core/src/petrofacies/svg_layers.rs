//! Plotters' SVG backend, a layer at a time: each layer is drawn on its own backend of the
//! same size and wrapped in `<g id="…">`, so the figure edits cleanly in a vector editor. The
//! document gets a physical size (millimetres) over a large internal canvas, because plotters
//! rounds coordinates to whole pixels (CRATE-NOTES: draw at 10 units per point).

use crate::error::{Error, Result};
use plotters::coord::Shift;
use plotters::prelude::{DrawingArea, IntoDrawingArea, SVGBackend};

/// Internal canvas units per typographic point.
pub const UNITS_PER_PT: f64 = 10.0;

/// Points per millimetre (72 pt per inch, 25.4 mm per inch).
pub const PT_PER_MM: f64 = 72.0 / 25.4;

/// The drawing area of one layer.
pub type Area<'a> = DrawingArea<SVGBackend<'a>, Shift>;

/// Text safe for an SVG document: characters XML 1.0 forbids (control characters other than
/// tab, and U+FFFE/U+FFFF) become U+FFFD, line breaks and tabs become spaces. Markup characters
/// are left to plotters, which escapes `< > & " '` in every text and attribute.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::section_svg::sanitize;
/// assert_eq!(sanitize("a\u{1}b\nc"), "a\u{FFFD}b c");
/// ```
pub fn sanitize(text: &str) -> String {
    text.chars()
        .map(|c| match c {
            '\n' | '\r' | '\t' => ' ',
            c if (c as u32) < 0x20 || c == '\u{FFFE}' || c == '\u{FFFF}' => '\u{FFFD}',
            c => c,
        })
        .collect()
}

/// Draws one layer.
pub(crate) type LayerFn<'f> = &'f dyn Fn(&Area) -> Result<()>;

/// Assemble an SVG document from layers, each drawn by its closure on a fresh area of
/// `size` units; `width_mm` × `height_mm` is the physical size.
pub(crate) fn layered_svg(
    size: (u32, u32),
    width_mm: f64,
    height_mm: f64,
    layers: &[(&str, LayerFn)],
) -> Result<String> {
    let mut out = format!(
        "<svg width=\"{width_mm:.2}mm\" height=\"{height_mm:.2}mm\" viewBox=\"0 0 {} {}\" xmlns=\"http://www.w3.org/2000/svg\">\n",
        size.0, size.1
    );
    for (id, draw) in layers {
        let mut buf = String::new();
        {
            let root = SVGBackend::with_string(&mut buf, size).into_drawing_area();
            draw(&root)?;
            root.present().map_err(render_error)?;
        }
        // The backend writes its own <svg …> line first and </svg> last; keep what is between.
        let body = buf
            .split_once('\n')
            .map(|(_, rest)| rest)
            .unwrap_or("")
            .trim_end()
            .strip_suffix("</svg>")
            .unwrap_or("");
        out.push_str(&format!("<g id=\"{id}\">\n"));
        out.push_str(body);
        out.push_str("</g>\n");
    }
    out.push_str("</svg>\n");
    Ok(out)
}

/// A drawing failure (in memory, so only a bug can cause one).
pub(crate) fn render_error<E: std::fmt::Debug>(e: E) -> Error {
    Error::Render {
        message: format!("{e:?}"),
    }
}
