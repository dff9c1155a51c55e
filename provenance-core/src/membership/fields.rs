//! Field sets as region sets for membership.

use super::regions::Regions;
use crate::fields::FieldSet;
use crate::geometry::Polygon;

/// A field set's fields are membership regions, in file order, grouped by provenance group.
///
/// # Example
/// ```
/// use provenance_core::fields::FieldSet;
/// use provenance_core::membership::Regions;
/// let set = FieldSet::load("dickinson1985-qfl").unwrap();
/// assert_eq!(set.len(), 7);
/// assert_eq!(set.name(0), "craton interior");
/// assert_eq!(set.group(0), Some("continental block"));
/// ```
impl Regions for FieldSet {
    fn len(&self) -> usize {
        self.fields.len()
    }
    fn name(&self, i: usize) -> &str {
        &self.fields[i].name
    }
    fn polygon(&self, i: usize) -> &Polygon {
        &self.fields[i].polygon
    }
    fn group(&self, i: usize) -> Option<&str> {
        Some(self.fields[i].group.name())
    }
}
