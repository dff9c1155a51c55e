//! PNG and PDF from a figure's SVG, rendered with the embedded font (resvg/usvg for PNG,
//! svg2pdf for PDF; both parse the SVG with the same usvg), so output is identical on every
//! machine whatever fonts it has installed.

use super::figure::Figure;
use super::text::{font_data, FONT_FAMILY};
use crate::error::{Error, Result};
use resvg::tiny_skia;
use resvg::usvg;
use std::path::Path;
use std::sync::{Arc, OnceLock};

/// PNG resolution, dots per inch (common practice: journals ask for at least 300 dpi for
/// colour and greyscale figures).
pub const PNG_DPI: f64 = 300.0;

/// CSS pixels per inch: usvg converts millimetres at this resolution (CSS Values and Units).
const CSS_DPI: f64 = 96.0;

/// An output file type.
///
/// # Example
/// ```
/// use provenance_core::plot::export::ImageFormat;
/// use std::path::Path;
/// assert_eq!(ImageFormat::from_path(Path::new("fig.PDF")), Some(ImageFormat::Pdf));
/// assert_eq!(ImageFormat::from_path(Path::new("fig.jpg")), None);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ImageFormat {
    /// Scalable vector graphics, editable in a vector editor.
    Svg,
    /// A raster image at [`PNG_DPI`].
    Png,
    /// A one-page PDF the size of the figure.
    Pdf,
}

impl ImageFormat {
    /// The format named by a file's extension (`.svg`, `.png`, `.pdf`, any case).
    pub fn from_path(path: &Path) -> Option<ImageFormat> {
        let ext = path.extension()?.to_str()?.to_ascii_lowercase();
        match ext.as_str() {
            "svg" => Some(ImageFormat::Svg),
            "png" => Some(ImageFormat::Png),
            "pdf" => Some(ImageFormat::Pdf),
            _ => None,
        }
    }
}

fn fonts() -> Arc<usvg::fontdb::Database> {
    static DB: OnceLock<Arc<usvg::fontdb::Database>> = OnceLock::new();
    DB.get_or_init(|| {
        let mut db = usvg::fontdb::Database::new();
        db.load_font_data(font_data().to_vec());
        db.set_sans_serif_family(FONT_FAMILY);
        db.set_serif_family(FONT_FAMILY);
        Arc::new(db)
    })
    .clone()
}

/// Parse SVG with the embedded font as the only font.
fn parse(svg: &str) -> Result<usvg::Tree> {
    let options = usvg::Options {
        font_family: FONT_FAMILY.to_string(),
        fontdb: fonts(),
        dpi: CSS_DPI as f32,
        ..usvg::Options::default()
    };
    usvg::Tree::from_str(svg, &options).map_err(|e| Error::Render {
        message: format!("the SVG does not parse: {e}"),
    })
}

/// Render SVG to PNG at `dpi` on a white background; the PNG records its resolution, so
/// layout programs place it at the figure's printed size.
///
/// # Example
/// ```
/// use provenance_core::plot::export::svg_to_png;
/// let svg = r#"<svg xmlns="http://www.w3.org/2000/svg" width="25.4mm" height="12.7mm" viewBox="0 0 10 5"/>"#;
/// let png = svg_to_png(svg, 300.0)?;
/// assert_eq!(&png[1..4], b"PNG");
/// // 1 inch × 0.5 inch at 300 dpi.
/// assert_eq!(u32::from_be_bytes([png[16], png[17], png[18], png[19]]), 300);
/// assert_eq!(u32::from_be_bytes([png[20], png[21], png[22], png[23]]), 150);
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub fn svg_to_png(svg: &str, dpi: f64) -> Result<Vec<u8>> {
    let tree = parse(svg)?;
    let size = tree.size();
    let scale = dpi / CSS_DPI;
    let w = (f64::from(size.width()) * scale).round().max(1.0) as u32;
    let h = (f64::from(size.height()) * scale).round().max(1.0) as u32;
    let mut pixmap = tiny_skia::Pixmap::new(w, h).ok_or_else(|| Error::Render {
        message: format!("cannot allocate a {w} × {h} image"),
    })?;
    pixmap.fill(tiny_skia::Color::WHITE);
    let (sx, sy) = (w as f32 / size.width(), h as f32 / size.height());
    resvg::render(
        &tree,
        tiny_skia::Transform::from_scale(sx, sy),
        &mut pixmap.as_mut(),
    );
    // The background is opaque, so premultiplied and straight colour agree: keep RGB.
    let rgb: Vec<u8> = pixmap
        .data()
        .chunks_exact(4)
        .flat_map(|p| [p[0], p[1], p[2]])
        .collect();
    let mut out = Vec::new();
    {
        let mut enc = png::Encoder::new(&mut out, w, h);
        enc.set_color(png::ColorType::Rgb);
        enc.set_depth(png::BitDepth::Eight);
        let per_metre = (dpi / 0.0254).round() as u32;
        enc.set_pixel_dims(Some(png::PixelDimensions {
            xppu: per_metre,
            yppu: per_metre,
            unit: png::Unit::Meter,
        }));
        let err = |e: png::EncodingError| Error::Render {
            message: format!("cannot encode PNG: {e}"),
        };
        let mut writer = enc.write_header().map_err(err)?;
        writer.write_image_data(&rgb).map_err(err)?;
        writer.finish().map_err(err)?;
    }
    Ok(out)
}

/// Convert SVG to a one-page PDF of the same printed size, with text kept as text in the
/// embedded (subset) font.
///
/// # Example
/// ```
/// use provenance_core::plot::export::svg_to_pdf;
/// let svg = r#"<svg xmlns="http://www.w3.org/2000/svg" width="85mm" height="40mm" viewBox="0 0 850 400"><text x="10" y="200" font-size="40">Q</text></svg>"#;
/// let pdf = svg_to_pdf(svg)?;
/// assert!(pdf.starts_with(b"%PDF-"));
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub fn svg_to_pdf(svg: &str) -> Result<Vec<u8>> {
    let tree = parse(svg)?;
    // usvg sizes the tree in CSS pixels; at 96 per inch the page gets the printed size.
    let page = svg2pdf::PageOptions {
        dpi: CSS_DPI as f32,
    };
    svg2pdf::to_pdf(&tree, svg2pdf::ConversionOptions::default(), page).map_err(|e| Error::Render {
        message: format!("cannot convert to PDF: {e}"),
    })
}

/// A figure in the given format, as the bytes of the file.
///
/// # Example
/// ```
/// use provenance_core::diagram::Diagram;
/// use provenance_core::plot::export::{render, ImageFormat};
/// use provenance_core::plot::{Figure, FigureOptions};
/// let fig = Figure::builder(&[Diagram::Qmpk], None).finish(FigureOptions::default());
/// assert!(render(&fig, ImageFormat::Svg)?.starts_with(b"<?xml"));
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub fn render(figure: &Figure, format: ImageFormat) -> Result<Vec<u8>> {
    encode(figure.to_svg()?, format)
}

/// Any figure's SVG as the bytes of `format` (PNG and PDF with the embedded font).
///
/// # Example
/// ```
/// use provenance_core::plot::export::{encode, ImageFormat};
/// let svg = "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"10mm\" height=\"10mm\" viewBox=\"0 0 10 10\"/>";
/// assert!(encode(svg.to_string(), ImageFormat::Png)?.starts_with(b"\x89PNG"));
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
pub fn encode(svg: String, format: ImageFormat) -> Result<Vec<u8>> {
    match format {
        ImageFormat::Svg => Ok(svg.into_bytes()),
        ImageFormat::Png => svg_to_png(&svg, PNG_DPI),
        ImageFormat::Pdf => svg_to_pdf(&svg),
    }
}
