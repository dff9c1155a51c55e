//! Physical figure sizes and font sizes, and the internal drawing unit.
//!
//! Figures are drawn on an internal canvas of [`UNITS_PER_PT`] units per typographic point and
//! given their physical size through the SVG `width`, `height` and `viewBox` attributes, so the
//! whole-unit rounding of the drawing backend costs at most 0.05 pt.

use crate::error::{Error, Result};
use std::fmt;

/// Internal drawing units per typographic point (1 pt = 1/72 inch).
pub const UNITS_PER_PT: f64 = 10.0;

/// Millimetres per typographic point: 25.4 mm per inch, 72 pt per inch.
pub const MM_PER_PT: f64 = 25.4 / 72.0;

/// Narrowest figure accepted, in millimetres.
pub const MIN_WIDTH_MM: f64 = 40.0;
/// Widest figure accepted, in millimetres (wider than any journal page).
pub const MAX_WIDTH_MM: f64 = 500.0;

/// Convert millimetres to internal units.
///
/// # Example
/// ```
/// use provenance_core::plot::size::{mm_to_units, UNITS_PER_PT};
/// assert!((mm_to_units(25.4) - 72.0 * UNITS_PER_PT).abs() < 1e-9);
/// ```
pub fn mm_to_units(mm: f64) -> f64 {
    mm / MM_PER_PT * UNITS_PER_PT
}

/// Convert points to internal units.
///
/// # Example
/// ```
/// assert_eq!(provenance_core::plot::size::pt(8.0), 80.0);
/// ```
pub fn pt(points: f64) -> f64 {
    points * UNITS_PER_PT
}

/// The width of a figure.
///
/// Journals print figures one column wide (about 85 mm) or across the page (about 175 mm);
/// both widths are common practice among geoscience journals, which ask for 80-90 mm and
/// 170-180 mm.
///
/// # Example
/// ```
/// use provenance_core::plot::FigureSize;
/// assert_eq!("single".parse::<FigureSize>().unwrap().width_mm(), 85.0);
/// assert_eq!("double".parse::<FigureSize>().unwrap().width_mm(), 175.0);
/// assert_eq!("120mm".parse::<FigureSize>().unwrap().width_mm(), 120.0);
/// assert!("12cm".parse::<FigureSize>().is_err());
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub enum FigureSize {
    /// One journal column, 85 mm.
    #[default]
    SingleColumn,
    /// The full text width, 175 mm.
    DoubleColumn,
    /// Any width in millimetres, from [`MIN_WIDTH_MM`] to [`MAX_WIDTH_MM`].
    Width(f64),
}

impl FigureSize {
    /// A figure of `mm` millimetres, refused outside [`MIN_WIDTH_MM`]..=[`MAX_WIDTH_MM`].
    ///
    /// # Example
    /// ```
    /// use provenance_core::plot::FigureSize;
    /// assert!(FigureSize::width(100.0).is_ok());
    /// assert!(FigureSize::width(5.0).is_err());
    /// ```
    pub fn width(mm: f64) -> Result<FigureSize> {
        if mm.is_finite() && (MIN_WIDTH_MM..=MAX_WIDTH_MM).contains(&mm) {
            Ok(FigureSize::Width(mm))
        } else {
            Err(Error::Usage {
                message: format!(
                    "figure width {mm} mm is out of range, expected {MIN_WIDTH_MM} to {MAX_WIDTH_MM} mm"
                ),
            })
        }
    }

    /// The width in millimetres.
    pub fn width_mm(&self) -> f64 {
        match self {
            FigureSize::SingleColumn => 85.0,
            FigureSize::DoubleColumn => 175.0,
            FigureSize::Width(mm) => *mm,
        }
    }
}

impl fmt::Display for FigureSize {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            FigureSize::SingleColumn => f.write_str("single"),
            FigureSize::DoubleColumn => f.write_str("double"),
            FigureSize::Width(mm) => write!(f, "{mm}mm"),
        }
    }
}

impl std::str::FromStr for FigureSize {
    type Err = String;

    fn from_str(s: &str) -> std::result::Result<Self, Self::Err> {
        let key = s.trim().to_ascii_lowercase();
        match key.as_str() {
            "single" => return Ok(FigureSize::SingleColumn),
            "double" => return Ok(FigureSize::DoubleColumn),
            _ => {}
        }
        let expected = "expected single, double or a width such as 120mm";
        let number = key
            .strip_suffix("mm")
            .ok_or_else(|| format!("unknown figure size {s:?}, {expected}"))?;
        let mm: f64 = number
            .trim()
            .parse()
            .map_err(|_| format!("unknown figure size {s:?}, {expected}"))?;
        FigureSize::width(mm).map_err(|e| e.to_string())
    }
}

/// Font sizes in points, at the printed size of the figure.
///
/// The defaults follow common practice: journals ask for lettering of 6 to 8 pt at final
/// size, and for no text below 5 pt.
///
/// # Example
/// ```
/// use provenance_core::plot::FontSizes;
/// let f = FontSizes::default();
/// assert!(f.ticks >= 5.0 && f.poles > f.legend);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FontSizes {
    /// Pole labels (Q, F, L …).
    pub poles: f64,
    /// Tick values along the edges.
    pub ticks: f64,
    /// Names of fields inside the triangle.
    pub fields: f64,
    /// Legend entries and the legend title.
    pub legend: f64,
    /// Sample labels.
    pub samples: f64,
    /// Source lines and panel notes.
    pub notes: f64,
}

impl Default for FontSizes {
    fn default() -> Self {
        FontSizes {
            poles: 9.0,
            ticks: 6.0,
            fields: 6.0,
            legend: 7.0,
            samples: 5.5,
            notes: 6.0,
        }
    }
}

/// The smallest font size the field-label fitting shrinks to, in points (common practice:
/// no lettering below 5 pt at final size).
pub const MIN_FONT_PT: f64 = 5.0;
