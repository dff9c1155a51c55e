//! Published tectonic-provenance fields as data, and looking a composition up in them.
//!
//! A [`FieldSet`] is a set of named [`Field`]s on one [`Diagram`], each a polygon with a
//! provenance [`Group`]. Sets are read from TOML files in our own format ([`format`](mod@format),
//! documented in `reference-fields/README.md`); the sets shipped in `reference-fields/` are
//! compiled in ([`embedded`]) so their ids resolve without files ([`FieldSet::resolve`]).
//! [`check`] validates a set (vertices, simple polygons, overlaps, uncovered ground) and
//! [`interpretation`] says, in our words, what each field means for provenance and basin.
//!
//! The shipped vertices were transcribed from memory of the published figures: they are
//! approximate and must be checked against the originals before use in publication.
//! Interpretations support, and never replace, petrographic judgement.
//!
//! # Example
//! ```
//! use provenance_core::fields::{FieldSet, Placement};
//! let set = FieldSet::resolve("dickinson1985-qfl")?;
//! match set.locate([95.0, 3.0, 2.0]) {
//!     Placement::Inside { field, .. } => assert_eq!(set.fields[field].name, "craton interior"),
//!     other => panic!("{other:?}"),
//! }
//! # Ok::<(), provenance_core::error::Error>(())
//! ```

pub mod check;
pub mod embedded;
pub mod format;
pub mod interpretation;

pub use check::{CheckReport, Overlap, Problem};
pub use interpretation::{Interpretation, CAUTION};

use crate::diagram::Diagram;
use crate::error::{Error, Result};
use crate::geometry::Polygon;
use std::fmt;

/// A point this close to a field's boundary (percentage points) counts as on it, for the
/// closed-boundary fallback of [`FieldSet::locate`] (numerical tolerance, our choice).
pub const BOUNDARY_TOLERANCE: f64 = 1e-9;

/// The provenance group of a field (Dickinson & Suczek 1979; Dickinson 1985).
///
/// # Example
/// ```
/// use provenance_core::fields::Group;
/// let g: Group = "recycled orogen".parse().unwrap();
/// assert_eq!(g, Group::RecycledOrogen);
/// assert_eq!(g.to_string(), "recycled orogen");
/// assert!("volcanic".parse::<Group>().is_err());
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Group {
    /// Continental block: stable craton and uplifted basement.
    ContinentalBlock,
    /// Magmatic arc.
    MagmaticArc,
    /// Recycled orogen: subduction complexes, collision orogens, foreland uplifts.
    RecycledOrogen,
    /// Mixed provenance (Dickinson 1985, QmFLt).
    Mixed,
}

impl Group {
    /// All four, in output order.
    pub const ALL: [Group; 4] = [
        Group::ContinentalBlock,
        Group::MagmaticArc,
        Group::RecycledOrogen,
        Group::Mixed,
    ];

    /// The name as written in files and outputs.
    ///
    /// # Example
    /// ```
    /// assert_eq!(provenance_core::fields::Group::MagmaticArc.name(), "magmatic arc");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            Group::ContinentalBlock => "continental block",
            Group::MagmaticArc => "magmatic arc",
            Group::RecycledOrogen => "recycled orogen",
            Group::Mixed => "mixed",
        }
    }
}

impl fmt::Display for Group {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

impl std::str::FromStr for Group {
    type Err = String;
    fn from_str(s: &str) -> std::result::Result<Self, Self::Err> {
        let key = s.trim();
        Group::ALL
            .into_iter()
            .find(|g| g.name() == key)
            .ok_or_else(|| {
                format!(
                    "unknown group {s:?}, expected one of continental block, magmatic arc, recycled orogen, mixed"
                )
            })
    }
}

/// Where a set's figure was published.
///
/// # Example
/// ```
/// use provenance_core::fields::Source;
/// let s = Source { author: "Dickinson".into(), year: 1985, figure: "Fig. 1".into(), reference: "Provenance of Arenites".into() };
/// assert_eq!(s.to_string(), "Dickinson (1985), Fig. 1; Provenance of Arenites");
/// ```
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Source {
    /// Author(s), as cited.
    pub author: String,
    /// Year of publication.
    pub year: i32,
    /// The figure the fields are drawn in.
    pub figure: String,
    /// The full reference.
    pub reference: String,
}

impl fmt::Display for Source {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "{} ({}), {}; {}",
            self.author, self.year, self.figure, self.reference
        )
    }
}

/// Where in its file a value was written: 1-based line and column.
///
/// # Example
/// ```
/// let p = provenance_core::fields::TextPos { line: 3, column: 12 };
/// assert_eq!(p.line, 3);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct TextPos {
    /// Line, as an editor shows it.
    pub line: u64,
    /// Column (characters from the start of the line, 1-based).
    pub column: u64,
}

/// One provenance field: its published name, group and polygon.
///
/// # Example
/// ```
/// use provenance_core::fields::{Field, Group};
/// use provenance_core::geometry::Polygon;
/// let f = Field::new("craton interior", Group::ContinentalBlock,
///     Polygon::new(vec![[100.0, 0.0, 0.0], [80.0, 20.0, 0.0], [80.0, 0.0, 20.0]]));
/// assert!(f.polygon.contains([90.0, 5.0, 5.0]));
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Field {
    /// The name as published, lower-case.
    pub name: String,
    /// The provenance group.
    pub group: Group,
    /// The polygon, vertices in percent of the diagram's poles.
    pub polygon: Polygon,
    /// Where the field's `name` and each vertex were written (empty when built in code).
    pub positions: FieldPositions,
}

/// Positions in the source file of a field's parts, for messages.
///
/// # Example
/// ```
/// let p = provenance_core::fields::FieldPositions::default();
/// assert!(p.vertices.is_empty());
/// ```
#[derive(Debug, Clone, PartialEq, Default)]
pub struct FieldPositions {
    /// The `name` value.
    pub name: TextPos,
    /// Each vertex, in order.
    pub vertices: Vec<TextPos>,
}

impl Field {
    /// A field built in code (no file positions).
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::{Field, Group};
    /// use provenance_core::geometry::Polygon;
    /// let f = Field::new("mixed", Group::Mixed, Polygon::new(vec![]));
    /// assert!(f.positions.vertices.is_empty());
    /// ```
    pub fn new(name: impl Into<String>, group: Group, polygon: Polygon) -> Field {
        Field {
            name: name.into(),
            group,
            polygon,
            positions: FieldPositions::default(),
        }
    }

    /// What the field means for provenance and receiving basin, in our words.
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::{Field, Group};
    /// use provenance_core::geometry::Polygon;
    /// let f = Field::new("basement uplift", Group::ContinentalBlock, Polygon::new(vec![]));
    /// assert_eq!(f.interpretation().provenance, "basement uplift");
    /// ```
    pub fn interpretation(&self) -> Interpretation {
        Interpretation::of(self)
    }
}

/// Where a composition falls in a field set.
///
/// # Example
/// ```
/// use provenance_core::fields::{FieldSet, Placement};
/// let set = FieldSet::resolve("dickinson1985-qfl").unwrap();
/// let p = set.locate([100.0, 0.0, 0.0]);
/// assert!(matches!(p, Placement::Inside { .. }));
/// assert_eq!(p.field().map(|i| set.fields[i].name.as_str()), Some("craton interior"));
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Placement {
    /// Inside field `field` (an index into [`FieldSet::fields`]).
    Inside {
        /// The field's index.
        field: usize,
        /// Distance to the nearest edge of the field that does not run along a side of the
        /// triangle, percentage points; `None` when the field covers the whole triangle.
        boundary_distance: Option<f64>,
    },
    /// In ground no field covers.
    Outside {
        /// The nearest field and the distance to it, percentage points; `None` for a set
        /// without fields.
        nearest: Option<(usize, f64)>,
    },
}

impl Placement {
    /// The field index, when inside one.
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::Placement;
    /// assert_eq!(Placement::Inside { field: 2, boundary_distance: None }.field(), Some(2));
    /// assert_eq!(Placement::Outside { nearest: None }.field(), None);
    /// ```
    pub fn field(&self) -> Option<usize> {
        match self {
            Placement::Inside { field, .. } => Some(*field),
            Placement::Outside { .. } => None,
        }
    }
}

/// A set of provenance fields on one diagram.
///
/// # Example
/// ```
/// use provenance_core::diagram::Diagram;
/// use provenance_core::fields::FieldSet;
/// let set = FieldSet::resolve("dickinson1985-qmflt")?;
/// assert_eq!(set.diagram, Diagram::Qmflt);
/// assert_eq!(set.fields.len(), 10);
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct FieldSet {
    /// Short id, as used with `--fields`.
    pub id: String,
    /// A one-line title.
    pub title: String,
    /// The diagram the fields are drawn on.
    pub diagram: Diagram,
    /// The publication.
    pub source: Source,
    /// How the vertices were obtained, and how far to trust them.
    pub note: String,
    /// The fields, in file order.
    pub fields: Vec<Field>,
    /// Where the set came from, for messages: a path, or `embedded:ID`.
    pub file: String,
}

impl FieldSet {
    /// An embedded set by id, or a set file by path.
    ///
    /// A value containing a path separator or ending in `.toml` is a file. Otherwise an
    /// embedded id is tried first, then a file of that name. The set is parsed but not
    /// checked; see [`FieldSet::load`].
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::FieldSet;
    /// assert!(FieldSet::resolve("dickinson1985-qfl").is_ok());
    /// let e = FieldSet::resolve("no-such-set").unwrap_err();
    /// assert!(e.to_string().contains("dickinson1985-qfl"));
    /// ```
    pub fn resolve(spec: &str) -> Result<FieldSet> {
        let looks_like_file = spec.contains('/')
            || spec.contains(std::path::MAIN_SEPARATOR)
            || spec.ends_with(".toml");
        if !looks_like_file {
            if let Some(set) = embedded::get(spec) {
                return set;
            }
        }
        let path = std::path::Path::new(spec);
        if looks_like_file || path.exists() {
            return format::from_path(path);
        }
        Err(Error::UnknownFieldSet {
            spec: spec.to_string(),
            known: embedded::ids().join(", "),
        })
    }

    /// [`FieldSet::resolve`], then [`check::check`]: a set that fails the check (bad
    /// vertices, non-simple polygons, overlapping fields) is refused with every problem
    /// named. Uncovered ground is allowed.
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::FieldSet;
    /// assert_eq!(FieldSet::load("dickinson1985-qfl").unwrap().fields.len(), 7);
    /// ```
    pub fn load(spec: &str) -> Result<FieldSet> {
        let set = FieldSet::resolve(spec)?;
        let report = check::check(&set);
        if !report.is_valid() {
            return Err(Error::InvalidFieldSet {
                file: set.file.clone(),
                problems: report.problem_lines(),
            });
        }
        Ok(set)
    }

    /// The polygons, in field order.
    ///
    /// # Example
    /// ```
    /// let set = provenance_core::fields::FieldSet::resolve("dickinson1985-qfl").unwrap();
    /// assert_eq!(set.polygons().len(), 7);
    /// ```
    pub fn polygons(&self) -> Vec<Polygon> {
        self.fields.iter().map(|f| f.polygon.clone()).collect()
    }

    /// The index of the field containing `parts` (percent), without distances.
    ///
    /// Boundary rule: [`Polygon::contains`] decides first. It is half-open, so a point on an
    /// edge shared by two fields (written with the same vertices in both) belongs to exactly
    /// one of them. A point no field contains by that rule, but which lies on a field's
    /// boundary (within [`BOUNDARY_TOLERANCE`]) goes to the first such field in file order:
    /// this gives the triangle's corners and sides, and the edges of fields facing
    /// unassigned ground, to the field along them.
    ///
    /// # Example
    /// ```
    /// let set = provenance_core::fields::FieldSet::resolve("dickinson1985-qfl").unwrap();
    /// let i = set.field_index([0.0, 100.0, 0.0]).unwrap();
    /// assert_eq!(set.fields[i].name, "basement uplift");
    /// ```
    pub fn field_index(&self, parts: [f64; 3]) -> Option<usize> {
        self.fields
            .iter()
            .position(|f| f.polygon.contains(parts))
            .or_else(|| {
                self.fields
                    .iter()
                    .position(|f| f.polygon.boundary_distance(parts) <= BOUNDARY_TOLERANCE)
            })
    }

    /// Where `parts` (percent) falls: the field containing it (by the rule of
    /// [`FieldSet::field_index`]) and its distance to that field's boundary with other ground,
    /// or the nearest field when it lies in unassigned ground.
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::{FieldSet, Placement};
    /// let set = FieldSet::resolve("dickinson-suczek1979-qmpk").unwrap();
    /// // In the unassigned wedge of this set: outside, with the nearest field.
    /// match set.locate([10.0, 50.0, 40.0]) {
    ///     Placement::Outside { nearest: Some((i, d)) } => assert!(d > 0.0 && i < 2),
    ///     other => panic!("{other:?}"),
    /// }
    /// ```
    pub fn locate(&self, parts: [f64; 3]) -> Placement {
        match self.field_index(parts) {
            Some(field) => Placement::Inside {
                field,
                boundary_distance: self.fields[field].polygon.interior_boundary_distance(parts),
            },
            None => Placement::Outside {
                nearest: self
                    .fields
                    .iter()
                    .enumerate()
                    .map(|(i, f)| (i, f.polygon.boundary_distance(parts)))
                    .min_by(|a, b| a.1.total_cmp(&b.1)),
            },
        }
    }

    /// The stable JSON form (see the `Serialize` impl) on one line, ending in a newline.
    ///
    /// # Example
    /// ```
    /// let set = provenance_core::fields::FieldSet::resolve("dickinson1985-qfl").unwrap();
    /// let v: serde_json::Value = serde_json::from_str(&set.to_json()).unwrap();
    /// assert_eq!(v["poles"], serde_json::json!(["Q", "F", "L"]));
    /// assert_eq!(v["fields"][0]["vertices"][0], serde_json::json!([100, 0, 0]));
    /// ```
    pub fn to_json(&self) -> String {
        // A map of strings and finite numbers always serializes.
        let mut s = serde_json::to_string(self).unwrap_or_default();
        s.push('\n');
        s
    }

    /// The field with this name (case-insensitive).
    ///
    /// # Example
    /// ```
    /// let set = provenance_core::fields::FieldSet::resolve("dickinson1985-qmflt").unwrap();
    /// assert!(set.field("Mixed").is_some());
    /// ```
    pub fn field(&self, name: &str) -> Option<&Field> {
        self.fields
            .iter()
            .find(|f| f.name.eq_ignore_ascii_case(name.trim()))
    }
}

impl serde::Serialize for FieldSet {
    /// The stable JSON form: `{"id", "diagram", "poles", "source", "note", "fields": [{"name",
    /// "group", "vertices"}]}`; whole numbers are written without decimals.
    fn serialize<S: serde::Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
        use serde::ser::{SerializeMap, SerializeSeq};
        struct Num(f64);
        impl serde::Serialize for Num {
            fn serialize<S: serde::Serializer>(
                &self,
                s: S,
            ) -> std::result::Result<S::Ok, S::Error> {
                if self.0.fract() == 0.0 && self.0.abs() < 1e15 {
                    s.serialize_i64(self.0 as i64)
                } else {
                    s.serialize_f64(self.0)
                }
            }
        }
        struct Vertices<'a>(&'a [[f64; 3]]);
        impl serde::Serialize for Vertices<'_> {
            fn serialize<S: serde::Serializer>(
                &self,
                s: S,
            ) -> std::result::Result<S::Ok, S::Error> {
                let mut seq = s.serialize_seq(Some(self.0.len()))?;
                for v in self.0 {
                    seq.serialize_element(&v.map(Num))?;
                }
                seq.end()
            }
        }
        struct FieldJson<'a>(&'a Field);
        impl serde::Serialize for FieldJson<'_> {
            fn serialize<S: serde::Serializer>(
                &self,
                s: S,
            ) -> std::result::Result<S::Ok, S::Error> {
                let mut m = s.serialize_map(Some(3))?;
                m.serialize_entry("name", &self.0.name)?;
                m.serialize_entry("group", self.0.group.name())?;
                m.serialize_entry("vertices", &Vertices(self.0.polygon.vertices()))?;
                m.end()
            }
        }
        let mut m = s.serialize_map(Some(6))?;
        m.serialize_entry("id", &self.id)?;
        m.serialize_entry("diagram", self.diagram.id())?;
        m.serialize_entry("poles", &self.diagram.poles())?;
        m.serialize_entry("source", &self.source.to_string())?;
        m.serialize_entry("note", &self.note)?;
        let fields: Vec<FieldJson> = self.fields.iter().map(FieldJson).collect();
        m.serialize_entry("fields", &fields)?;
        m.end()
    }
}
