//! Generic overlays: labelled polygons (provenance fields) and outlined regions (confidence
//! and prediction regions), so that field sets and region calculations plug into figures
//! without the renderer knowing where they came from.

use crate::composition::Composition3;
use crate::geometry::{Cartesian, Polygon};

/// A named polygon with a place for its name, such as one provenance field.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::plot::LabelledPolygon;
/// let p = LabelledPolygon::new(
///     "quartz-rich corner",
///     Polygon::new(vec![[100.0, 0.0, 0.0], [70.0, 30.0, 0.0], [70.0, 0.0, 30.0]]),
/// );
/// let a = p.label_anchor();
/// assert!((a[0] - 80.0).abs() < 1e-9 && (a[1] - 10.0).abs() < 1e-9);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct LabelledPolygon {
    /// The name drawn inside the polygon (for fields: the published name, lower case).
    pub name: String,
    /// The outline, in percent of the diagram's poles.
    pub polygon: Polygon,
    /// Where the name goes, in percent of the poles; the area centroid when `None`.
    pub anchor: Option<[f64; 3]>,
}

impl LabelledPolygon {
    /// A polygon whose name sits at its area centroid.
    pub fn new(name: impl Into<String>, polygon: Polygon) -> LabelledPolygon {
        LabelledPolygon {
            name: name.into(),
            polygon,
            anchor: None,
        }
    }

    /// The same polygon with its name at `anchor` (percent of the poles).
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::Polygon;
    /// use provenance_core::plot::LabelledPolygon;
    /// let p = LabelledPolygon::new("a", Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]))
    ///     .with_anchor([60.0, 20.0, 20.0]);
    /// assert_eq!(p.label_anchor(), [60.0, 20.0, 20.0]);
    /// ```
    pub fn with_anchor(mut self, anchor: [f64; 3]) -> LabelledPolygon {
        self.anchor = Some(anchor);
        self
    }

    /// The point where the name is centred.
    pub fn label_anchor(&self) -> [f64; 3] {
        self.anchor
            .unwrap_or_else(|| area_centroid(&self.polygon).to_parts())
    }
}

/// The area centroid of a polygon in the side-100 plane (the vertex mean for a degenerate
/// polygon of zero area).
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::plot::overlay::area_centroid;
/// let whole = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]);
/// let c = area_centroid(&whole).to_parts();
/// assert!(c.iter().all(|v| (v - 100.0 / 3.0).abs() < 1e-9));
/// ```
pub fn area_centroid(p: &Polygon) -> Cartesian {
    let pts = p.plane();
    let n = pts.len();
    let (mut a, mut cx, mut cy) = (0.0, 0.0, 0.0);
    for i in 0..n {
        let (u, v) = (pts[i], pts[(i + 1) % n]);
        let cross = u.x * v.y - v.x * u.y;
        a += cross;
        cx += (u.x + v.x) * cross;
        cy += (u.y + v.y) * cross;
    }
    if a.abs() < 1e-12 || n == 0 {
        let k = n.max(1) as f64;
        return Cartesian {
            x: pts.iter().map(|p| p.x).sum::<f64>() / k,
            y: pts.iter().map(|p| p.y).sum::<f64>() / k,
        };
    }
    Cartesian {
        x: cx / (3.0 * a),
        y: cy / (3.0 * a),
    }
}

/// A set of labelled polygons drawn on one diagram, with the line that credits their source.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::plot::{LabelledPolygon, PolygonLayer};
/// let layer = PolygonLayer {
///     source: Some("fields: an invented test set".into()),
///     polygons: vec![LabelledPolygon::new(
///         "upper",
///         Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]),
///     )],
/// };
/// assert_eq!(layer.polygons.len(), 1);
/// ```
#[derive(Debug, Clone, PartialEq, Default)]
pub struct PolygonLayer {
    /// The credit line, for example "fields: Dickinson (1985)".
    pub source: Option<String>,
    /// The polygons, drawn and labelled in order.
    pub polygons: Vec<LabelledPolygon>,
}

/// What a region outlines; decides its line style.
///
/// # Example
/// ```
/// use provenance_core::plot::RegionKind;
/// assert_ne!(RegionKind::Confidence, RegionKind::Prediction);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum RegionKind {
    /// A confidence region (of one sample's composition, or of a group mean): solid line.
    Confidence,
    /// A prediction region for a new sample of a group: dashed line.
    Prediction,
}

/// A closed outline drawn in its group's colour.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::plot::{Region, RegionKind};
/// let r = Region {
///     group: 0,
///     outline: Polygon::new(vec![[60.0, 20.0, 20.0], [50.0, 30.0, 20.0], [50.0, 20.0, 30.0]]),
///     kind: RegionKind::Confidence,
/// };
/// assert_eq!(r.outline.vertices().len(), 3);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Region {
    /// The group whose colour the outline takes (index into the figure's groups).
    pub group: usize,
    /// The outline, in percent of the poles (a curve given as many vertices).
    pub outline: Polygon,
    /// What the region is.
    pub kind: RegionKind,
}

/// Regions drawn on one diagram, with the line that credits the method.
///
/// # Example
/// ```
/// use provenance_core::plot::RegionLayer;
/// let layer = RegionLayer { source: Some("regions: 95%, Weltje (2002)".into()), regions: vec![] };
/// assert!(layer.regions.is_empty());
/// ```
#[derive(Debug, Clone, PartialEq, Default)]
pub struct RegionLayer {
    /// The credit line.
    pub source: Option<String>,
    /// The regions.
    pub regions: Vec<Region>,
}

/// A group mean drawn as a large marker of the group's symbol.
///
/// # Example
/// ```
/// use provenance_core::composition::Composition3;
/// use provenance_core::plot::MeanMarker;
/// let m = MeanMarker { group: 1, composition: Composition3::close([6.0, 2.0, 2.0]).unwrap() };
/// assert_eq!(m.composition.part(0), 60.0);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct MeanMarker {
    /// The group (index into the figure's groups).
    pub group: usize,
    /// The mean composition.
    pub composition: Composition3,
}
