//! Membership summed by provenance group, and the QFL / QmFLt agreement check.

use super::estimate::Membership;
use super::regions::Regions;
use crate::diagram::Diagram;

/// The name under which mass outside every region is reported.
pub const OUTSIDE: &str = "outside";

/// Membership summed by provenance group, groups in order of first appearance in the set and
/// "outside" last. A region without a group counts under its own name.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// use provenance_core::membership::{group_probabilities, Estimator, MembershipOptions, Posterior, Region};
/// let upper = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
/// let left = Polygon::new(vec![[50.0, 50.0, 0.0], [0.0, 100.0, 0.0], [0.0, 50.0, 50.0], [50.0, 25.0, 25.0]]);
/// let set = [
///     Region { name: "upper", group: Some("g1"), polygon: &upper },
///     Region { name: "left", group: Some("g1"), polygon: &left },
/// ];
/// let est = Estimator::new(&set[..], MembershipOptions::default()).unwrap();
/// let m = est.estimate(&Posterior::jeffreys([200.0, 150.0, 50.0]).unwrap(), 0, 0);
/// let g = group_probabilities(&m, &set[..]);
/// assert_eq!(g[0].0, "g1");
/// assert_eq!(g[1].0, "outside");
/// assert!((g[0].1 + g[1].1 - 1.0).abs() < 1e-12);
/// ```
pub fn group_probabilities<R: Regions + ?Sized>(m: &Membership, regions: &R) -> Vec<(String, f64)> {
    let mut out: Vec<(String, f64)> = Vec::new();
    for (i, p) in m.regions().iter().enumerate() {
        let g = regions.group(i).unwrap_or(regions.name(i));
        match out.iter_mut().find(|(name, _)| name == g) {
            Some(slot) => slot.1 += p,
            None => out.push((g.to_string(), *p)),
        }
    }
    out.push((OUTSIDE.to_string(), m.outside()));
    out
}

/// The most probable group of a list from [`group_probabilities`]; ties go to the first.
///
/// # Example
/// ```
/// let g = vec![("a".to_string(), 0.2), ("b".to_string(), 0.7), ("outside".to_string(), 0.1)];
/// assert_eq!(provenance_core::membership::top_group(&g), Some(("b", 0.7)));
/// ```
pub fn top_group(groups: &[(String, f64)]) -> Option<(&str, f64)> {
    let mut best: Option<(&str, f64)> = None;
    for (g, p) in groups {
        if best.is_none_or(|(_, b)| *p > b) {
            best = Some((g.as_str(), *p));
        }
    }
    best
}

/// The cross-diagram summary at the provenance-group level.
///
/// # Example
/// ```
/// use provenance_core::diagram::Diagram;
/// use provenance_core::membership::ProvenanceSummary;
/// let qfl = vec![("recycled orogen".to_string(), 0.9), ("outside".to_string(), 0.1)];
/// let qmflt = vec![("magmatic arc".to_string(), 0.6), ("recycled orogen".to_string(), 0.4), ("outside".to_string(), 0.0)];
/// let s = ProvenanceSummary::of(&[(Diagram::Qfl, qfl), (Diagram::Qmflt, qmflt)]);
/// assert_eq!(s.top.len(), 2);
/// assert_eq!(s.top[0].1, "recycled orogen");
/// assert_eq!(s.qfl_qmflt_disagree, Some(true));
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct ProvenanceSummary {
    /// Per diagram: its group probabilities (see [`group_probabilities`]).
    pub groups: Vec<(Diagram, Vec<(String, f64)>)>,
    /// Per diagram: the top group and its probability.
    pub top: Vec<(Diagram, String, f64)>,
    /// Whether the top groups of QFL and QmFLt differ; `None` unless both have a membership.
    pub qfl_qmflt_disagree: Option<bool>,
}

impl ProvenanceSummary {
    /// Summarise the group probabilities of several diagrams of one sample.
    pub fn of(per_diagram: &[(Diagram, Vec<(String, f64)>)]) -> ProvenanceSummary {
        let top: Vec<(Diagram, String, f64)> = per_diagram
            .iter()
            .filter_map(|(d, g)| top_group(g).map(|(name, p)| (*d, name.to_string(), p)))
            .collect();
        let find = |d: Diagram| top.iter().find(|t| t.0 == d).map(|t| t.1.as_str());
        let qfl_qmflt_disagree = match (find(Diagram::Qfl), find(Diagram::Qmflt)) {
            (Some(a), Some(b)) => Some(a != b),
            _ => None,
        };
        ProvenanceSummary {
            groups: per_diagram.to_vec(),
            top,
            qfl_qmflt_disagree,
        }
    }
}
