//! Validating a field set: vertices, simple polygons, overlaps, uncovered ground.
//!
//! A set is valid when every vertex sums to 100 (± [`VERTEX_SUM_TOLERANCE`]) with each part
//! from 0 to 100, every field is a simple polygon, and no two fields overlap by more than
//! [`OVERLAP_TOLERANCE`]. Uncovered ground is measured and located but is not an error: some
//! published diagrams leave ground unassigned.

use super::{FieldSet, TextPos};
use crate::diagram::Diagram;
use crate::error::{Column, Location};
use crate::geometry::overlay::{Overlay, Region, TRIANGLE_AREA};
use crate::geometry::{Anchor, Defect};
use std::fmt;

/// Allowed departure of a vertex's three parts from a sum of 100, percentage points (a project
/// requirement; it absorbs rounding of published or digitised values).
pub const VERTEX_SUM_TOLERANCE: f64 = 0.01;

/// Overlap areas at or below this (percentage points squared, of a triangle of 4330) are
/// rounding where two fields share an edge (numerical tolerance, our choice).
pub const OVERLAP_TOLERANCE: f64 = 1e-6;

/// One thing wrong with a set, where it is and what was expected.
///
/// # Example
/// ```
/// use provenance_core::error::Location;
/// use provenance_core::fields::Problem;
/// let p = Problem { at: Location::new("f.toml").line(4), message: "x".into(), expected: "y".into() };
/// assert_eq!(p.to_string(), "f.toml, line 4: x, expected y");
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Problem {
    /// Where.
    pub at: Location,
    /// What is wrong, naming the key and value.
    pub message: String,
    /// What would have been accepted.
    pub expected: String,
}

impl fmt::Display for Problem {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "{}: {}, expected {}",
            self.at, self.message, self.expected
        )
    }
}

/// Two fields that overlap.
///
/// # Example
/// ```
/// let o = provenance_core::fields::Overlap { first: 0, second: 2, area: 1.5 };
/// assert!(o.first < o.second);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Overlap {
    /// Index of the earlier field.
    pub first: usize,
    /// Index of the later field.
    pub second: usize,
    /// Overlap area, percentage points squared.
    pub area: f64,
}

/// The result of checking a set.
///
/// # Example
/// ```
/// use provenance_core::fields::{check::check, FieldSet};
/// let set = FieldSet::resolve("dickinson1985-qfl").unwrap();
/// let r = check(&set);
/// assert!(r.is_valid());
/// assert!(r.uncovered_percent() < 5.0);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct CheckReport {
    /// The set's id.
    pub id: String,
    /// Its diagram.
    pub diagram: Diagram,
    /// Problems that make the set invalid.
    pub problems: Vec<Problem>,
    /// Pairs of fields overlapping by more than [`OVERLAP_TOLERANCE`].
    pub overlaps: Vec<Overlap>,
    /// Sum of the overlap areas of all pairs, percentage points squared.
    pub overlap_area: f64,
    /// Connected uncovered regions, largest first.
    pub uncovered: Vec<Region>,
    /// Total uncovered area, percentage points squared.
    pub uncovered_area: f64,
    /// Area of each field, percentage points squared.
    pub field_areas: Vec<f64>,
    /// Label anchor of each field.
    pub anchors: Vec<Anchor>,
}

impl CheckReport {
    /// True when the set has no problems (uncovered ground is allowed).
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::{check::check, FieldSet};
    /// let r = check(&FieldSet::resolve("dickinson1985-qmflt").unwrap());
    /// assert!(r.is_valid() && r.problem_lines().is_empty());
    /// assert_eq!(r.overlap_percent(), 0.0);
    /// assert!(r.uncovered_percent() < 1e-9);
    /// ```
    pub fn is_valid(&self) -> bool {
        self.problems.is_empty()
    }

    /// Each problem as one line of text.
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::{check::check, FieldSet};
    /// let r = check(&FieldSet::resolve("dickinson1985-qmflt").unwrap());
    /// assert!(r.is_valid() && r.problem_lines().is_empty());
    /// assert_eq!(r.overlap_percent(), 0.0);
    /// assert!(r.uncovered_percent() < 1e-9);
    /// ```
    pub fn problem_lines(&self) -> Vec<String> {
        self.problems.iter().map(|p| p.to_string()).collect()
    }

    /// Overlap area as a percentage of the triangle.
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::{check::check, FieldSet};
    /// let r = check(&FieldSet::resolve("dickinson1985-qmflt").unwrap());
    /// assert!(r.is_valid() && r.problem_lines().is_empty());
    /// assert_eq!(r.overlap_percent(), 0.0);
    /// assert!(r.uncovered_percent() < 1e-9);
    /// ```
    pub fn overlap_percent(&self) -> f64 {
        100.0 * self.overlap_area / TRIANGLE_AREA
    }

    /// Uncovered area as a percentage of the triangle.
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::{check::check, FieldSet};
    /// let r = check(&FieldSet::resolve("dickinson1985-qmflt").unwrap());
    /// assert!(r.is_valid() && r.problem_lines().is_empty());
    /// assert_eq!(r.overlap_percent(), 0.0);
    /// assert!(r.uncovered_percent() < 1e-9);
    /// ```
    pub fn uncovered_percent(&self) -> f64 {
        100.0 * self.uncovered_area / TRIANGLE_AREA
    }

    /// A plain-text report, one finding per line.
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::{check::check, FieldSet};
    /// let set = FieldSet::resolve("dickinson-suczek1979-qmpk").unwrap();
    /// let text = check(&set).render(&set);
    /// assert!(text.contains("overlap: 0.000 pp²"));
    /// assert!(text.contains("gap 1:"));
    /// ```
    pub fn render(&self, set: &FieldSet) -> String {
        let poles = self.diagram.poles();
        let mut s = format!(
            "{}: {} ({}, {} fields)\n",
            self.id,
            set.title,
            self.diagram,
            set.fields.len()
        );
        for (i, f) in set.fields.iter().enumerate() {
            let (a, area) = (self.anchors[i], self.field_areas[i]);
            s.push_str(&format!(
                "  field {:>2} {:<44} {:<18} area {:>8.3} pp² ({:>6.2}%), label at {} {:.1}, {} {:.1}, {} {:.1} (clearance {:.1})\n",
                i + 1,
                format!("{:?}", f.name),
                f.group.name(),
                area,
                100.0 * area / TRIANGLE_AREA,
                poles[0],
                a.parts[0],
                poles[1],
                a.parts[1],
                poles[2],
                a.parts[2],
                a.clearance
            ));
        }
        s.push_str(&format!(
            "overlap: {:.3} pp² ({:.3}% of the triangle)\n",
            self.overlap_area,
            self.overlap_percent()
        ));
        for o in &self.overlaps {
            s.push_str(&format!(
                "  {:?} and {:?} overlap by {:.3} pp²\n",
                set.fields[o.first].name, set.fields[o.second].name, o.area
            ));
        }
        s.push_str(&format!(
            "uncovered: {:.3} pp² ({:.3}% of the triangle) in {} region(s)\n",
            self.uncovered_area,
            self.uncovered_percent(),
            self.uncovered.len()
        ));
        for (k, g) in self.uncovered.iter().enumerate() {
            s.push_str(&format!(
                "  gap {}: {:.3} pp² ({:.3}%) {}\n",
                k + 1,
                g.area,
                g.percent_of_triangle(),
                g.describe(poles)
            ));
        }
        if self.problems.is_empty() {
            s.push_str("valid\n");
        } else {
            s.push_str(&format!("invalid: {} problem(s)\n", self.problems.len()));
            for p in &self.problems {
                s.push_str(&format!("  {p}\n"));
            }
        }
        s
    }
}

fn at(file: &str, p: Option<&TextPos>, key: &str) -> Location {
    match p {
        Some(p) if p.line > 0 => Location::new(file).line(p.line).column(Column {
            index: p.column as usize,
            name: key.to_string(),
        }),
        _ => Location::new(file),
    }
}

fn show(v: [f64; 3]) -> String {
    format!("[{}, {}, {}]", v[0], v[1], v[2])
}

/// Check a set; see the [module](self) documentation for what makes it valid.
///
/// # Example
/// ```
/// use provenance_core::fields::{check::check, FieldSet};
/// let r = check(&FieldSet::resolve("dickinson-suczek1979-qmpk").unwrap());
/// assert_eq!(r.uncovered.len(), 1);
/// assert!((r.uncovered_percent() - 17.5).abs() < 1e-9);
/// ```
pub fn check(set: &FieldSet) -> CheckReport {
    let mut problems = Vec::new();
    let poles = set.diagram.poles();
    for f in &set.fields {
        for (k, v) in f.polygon.vertices().iter().enumerate() {
            let p = f.positions.vertices.get(k);
            let sum: f64 = v.iter().sum();
            let expected = format!(
                "[{}, {}, {}] each from 0 to 100, summing to 100 ± {VERTEX_SUM_TOLERANCE}",
                poles[0], poles[1], poles[2]
            );
            if (sum - 100.0).abs() > VERTEX_SUM_TOLERANCE {
                problems.push(Problem {
                    at: at(&set.file, p, "vertices"),
                    message: format!(
                        "vertex {} of field {:?} is {} and sums to {sum}",
                        k + 1,
                        f.name,
                        show(*v)
                    ),
                    expected: expected.clone(),
                });
            }
            if v.iter().any(|x| !(0.0..=100.0).contains(x)) {
                problems.push(Problem {
                    at: at(&set.file, p, "vertices"),
                    message: format!(
                        "vertex {} of field {:?} is {}, outside the triangle",
                        k + 1,
                        f.name,
                        show(*v)
                    ),
                    expected,
                });
            }
        }
        if let Err(d) = f.polygon.check_simple() {
            let vertex = match d {
                Defect::RepeatedVertex { second, .. } => second,
                Defect::DoublesBack { vertex } => vertex,
                Defect::Crossing { first_edge, .. } => first_edge,
                _ => 1,
            };
            problems.push(Problem {
                at: at(&set.file, f.positions.vertices.get(vertex - 1), "vertices"),
                message: format!("field {:?} is not a simple polygon: {d}", f.name),
                expected: "vertices in order around a polygon whose edges do not cross or touch"
                    .into(),
            });
        }
    }
    let polys = set.polygons();
    let overlay = Overlay::of(&polys);
    let n = polys.len();
    let mut overlaps = Vec::new();
    let mut overlap_area = 0.0;
    for i in 0..n {
        for j in i + 1..n {
            let area = overlay.overlap(i, j);
            overlap_area += area;
            if area > OVERLAP_TOLERANCE {
                overlaps.push(Overlap {
                    first: i,
                    second: j,
                    area,
                });
                let (a, b) = (&set.fields[i], &set.fields[j]);
                problems.push(Problem {
                    at: at(&set.file, Some(&b.positions.name), "name"),
                    message: format!(
                        "field {:?} overlaps field {:?} (line {}) by {area:.3} pp² ({:.3}% of the triangle)",
                        b.name,
                        a.name,
                        a.positions.name.line,
                        100.0 * area / TRIANGLE_AREA
                    ),
                    expected: "fields that meet only along shared edges".into(),
                });
            }
        }
    }
    CheckReport {
        id: set.id.clone(),
        diagram: set.diagram,
        problems,
        overlaps,
        overlap_area,
        uncovered: overlay.uncovered().to_vec(),
        uncovered_area: overlay.uncovered_area(),
        field_areas: (0..n).map(|i| overlay.area(i)).collect(),
        anchors: polys.iter().map(|p| p.label_anchor()).collect(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::fields::format::parse;

    const HEAD: &str = "id = \"t\"\ntitle = \"t\"\ndiagram = \"qfl\"\nnote = \"n\"\n[source]\nauthor = \"a\"\nyear = 2000\nfigure = \"f\"\nreference = \"r\"\n";

    fn set(fields: &[(&str, &str)]) -> FieldSet {
        let mut t = HEAD.to_string();
        for (name, v) in fields {
            t.push_str(&format!(
                "[[fields]]\nname = \"{name}\"\ngroup = \"mixed\"\nvertices = {v}\n"
            ));
        }
        parse("t.toml", &t).unwrap()
    }

    #[test]
    fn bad_sum_and_outside_vertex_name_their_lines() {
        let s = set(&[("a", "[[100, 0, 0], [50, 49, 0], [-5, 0, 105]]")]);
        let r = check(&s);
        let lines = r.problem_lines();
        assert_eq!(lines.len(), 2, "{lines:?}");
        assert!(
            lines[0].starts_with("t.toml, line 13, column 26 (\"vertices\")"),
            "{lines:?}"
        );
        assert!(lines[0].contains("sums to 99"), "{lines:?}");
        assert!(
            lines[1].contains("[-5, 0, 105], outside the triangle"),
            "{lines:?}"
        );
    }

    #[test]
    fn overlap_is_measured_and_refused() {
        // Q ≥ 40 and F ≥ 40 overlap in a triangle of side 20: 4% of the whole.
        let s = set(&[
            ("q", "[[100, 0, 0], [40, 60, 0], [40, 0, 60]]"),
            ("f", "[[0, 100, 0], [0, 40, 60], [60, 40, 0]]"),
        ]);
        let r = check(&s);
        assert!(!r.is_valid());
        assert_eq!(r.overlaps.len(), 1);
        assert!((r.overlap_percent() - 4.0).abs() < 1e-9);
        assert!(
            r.problem_lines()[0].contains("line 15"),
            "{:?}",
            r.problem_lines()
        );
        // Uncovered: 1 - 0.6² - 0.6² + 0.2² of the triangle.
        assert!(
            (r.uncovered_percent() - 32.0).abs() < 1e-9,
            "{}",
            r.uncovered_percent()
        );
    }

    #[test]
    fn self_crossing_field_is_refused() {
        let s = set(&[(
            "bow",
            "[[0, 100, 0], [50, 0, 50], [50, 50, 0], [0, 50, 50]]",
        )]);
        let r = check(&s);
        assert!(
            r.problem_lines()[0].contains("not a simple polygon"),
            "{:?}",
            r.problem_lines()
        );
    }
}
