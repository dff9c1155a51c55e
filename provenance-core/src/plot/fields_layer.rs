//! Field sets as figure layers, and the choice of field sets for a set of diagrams.

use super::overlay::{LabelledPolygon, PolygonLayer};
use crate::diagram::Diagram;
use crate::error::{Error, Result};
use crate::fields::{embedded, FieldSet};

impl PolygonLayer {
    /// The drawing layer of a field set: every field under its published name at its label
    /// anchor, and a credit line such as "fields: Dickinson (1985), from memory".
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::FieldSet;
    /// use provenance_core::plot::PolygonLayer;
    /// let layer = PolygonLayer::from_field_set(&FieldSet::load("dickinson1985-qfl").unwrap());
    /// assert_eq!(layer.polygons.len(), 7);
    /// assert!(layer.source.unwrap().starts_with("fields: Dickinson (1985)"));
    /// ```
    pub fn from_field_set(set: &FieldSet) -> PolygonLayer {
        PolygonLayer {
            source: Some(format!(
                "fields: {} ({}), vertices from memory",
                set.source.author, set.source.year
            )),
            polygons: set
                .fields
                .iter()
                .map(|f| {
                    let anchor = f.polygon.label_anchor();
                    let p = LabelledPolygon::new(f.name.clone(), f.polygon.clone());
                    if anchor.parts.iter().all(|v| v.is_finite()) {
                        p.with_anchor(anchor.parts)
                    } else {
                        p
                    }
                })
                .collect(),
        }
    }
}

/// Field sets for `diagrams` from `--fields` values: `none` for no fields; otherwise ids or
/// files, each used on its own diagram; a diagram without a named set takes its embedded
/// default, if there is one. Refuses a set for a diagram that is not drawn, and two sets for
/// one diagram.
///
/// # Example
/// ```
/// use provenance_core::diagram::Diagram;
/// use provenance_core::plot::choose_field_sets;
/// let sets = choose_field_sets(&[Diagram::Qfl, Diagram::Lmlvls], &[]).unwrap();
/// assert_eq!(sets[0].as_ref().unwrap().id, "dickinson1985-qfl");
/// assert!(sets[1].is_none()); // no LmLvLs set is shipped
/// assert!(choose_field_sets(&[Diagram::Qfl], &["none".into()]).unwrap()[0].is_none());
/// ```
pub fn choose_field_sets(diagrams: &[Diagram], specs: &[String]) -> Result<Vec<Option<FieldSet>>> {
    if specs.len() == 1 && specs[0].trim().eq_ignore_ascii_case("none") {
        return Ok(vec![None; diagrams.len()]);
    }
    let mut chosen: Vec<Option<FieldSet>> = vec![None; diagrams.len()];
    for spec in specs {
        let set = FieldSet::load(spec)?;
        let Some(i) = diagrams.iter().position(|d| *d == set.diagram) else {
            return Err(Error::Usage {
                message: format!(
                    "field set {} is for the {} diagram, which is not drawn; expected a set for one of {}",
                    set.id,
                    set.diagram,
                    diagrams.iter().map(|d| d.id()).collect::<Vec<_>>().join(", ")
                ),
            });
        };
        if chosen[i].is_some() {
            return Err(Error::Usage {
                message: format!(
                    "two field sets for the {} diagram, expected at most one",
                    set.diagram
                ),
            });
        }
        chosen[i] = Some(set);
    }
    for (i, d) in diagrams.iter().enumerate() {
        if chosen[i].is_none() {
            for id in embedded::ids() {
                if let Some(Ok(set)) = embedded::get(id) {
                    if set.diagram == *d && specs.is_empty() {
                        chosen[i] = Some(set);
                        break;
                    }
                }
            }
        }
    }
    Ok(chosen)
}
