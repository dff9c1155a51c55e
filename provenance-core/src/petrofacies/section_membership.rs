//! Provenance-group membership of each section sample, for the section figure's stacked bar.

use super::section::Section;
use crate::diagram::Diagram;
use crate::setting::Locator;

impl Section {
    /// Fill every sample's membership with the probabilities of the provenance groups
    /// (continental block, magmatic arc, recycled orogen, mixed, outside) on `diagram`, from a
    /// locator that computes likelihoods (see [`Locator::with_membership`]). Samples without
    /// points in that diagram, or with an unknown number of points, keep none. Returns how many
    /// samples got one.
    ///
    /// # Example
    /// ```
    /// use provenance_core::diagram::Diagram;
    /// use provenance_core::membership::MembershipOptions;
    /// use provenance_core::petrofacies::{Ordering, Section};
    /// use provenance_core::setting::Locator;
    /// let table = provenance_core::demo::dataset().unwrap();
    /// let h = table.column("height_m").unwrap();
    /// let mut s = Section::of(&table, &h, Ordering::Height, None).unwrap();
    /// let l = Locator::embedded().unwrap().with_membership(MembershipOptions::default(), None).unwrap();
    /// assert_eq!(s.fill_membership(&l, Diagram::Qfl), 40);
    /// let m = s.samples[0].membership.as_ref().unwrap();
    /// assert!((m.iter().map(|(_, p)| p).sum::<f64>() - 1.0).abs() < 1e-6);
    /// ```
    pub fn fill_membership(&mut self, locator: &Locator, diagram: Diagram) -> usize {
        let mut filled = 0;
        for s in &mut self.samples {
            let setting = locator.locate(&s.sample);
            let groups = setting.likelihood.as_ref().and_then(|l| {
                l.summary
                    .groups
                    .iter()
                    .find(|(d, _)| *d == diagram)
                    .map(|(_, g)| g.clone())
            });
            if let Some(g) = groups.filter(|g| !g.is_empty()) {
                s.membership = Some(g);
                filled += 1;
            }
        }
        filled
    }
}
