//! Every group's statistics and the pairwise comparisons between groups.

use super::compare::{
    holm, pair_seed, Hotelling, Permutation, DEFAULT_PERMUTATIONS, DEFAULT_SEED, SMALL_GROUP,
};
use super::grouping::{MetaColumn, Table};
use super::regions::DEFAULT_LEVEL;
use super::summary::GroupSummary;
use crate::counts::Sample;
use crate::diagram::Diagram;
use crate::error::{Error, Result};
use serde::Serialize;

/// Settings of a petrofacies analysis, checked by [`GroupOptions::check`].
///
/// # Example
/// ```
/// use provenance_core::petrofacies::GroupOptions;
/// assert!(GroupOptions::default().check().is_ok());
/// assert!(GroupOptions { level: 1.0, ..Default::default() }.check().is_err());
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct GroupOptions {
    /// Level of the confidence and prediction regions (0 < level < 1).
    pub level: f64,
    /// Random splits of a Monte Carlo permutation test (at least 99).
    pub permutations: usize,
    /// Seed of the permutation tests.
    pub seed: u64,
    /// Groups smaller than this (either of the pair) get a permutation test, whose p-value is
    /// then the one reported.
    pub small_group: usize,
}

impl Default for GroupOptions {
    fn default() -> Self {
        GroupOptions {
            level: DEFAULT_LEVEL,
            permutations: DEFAULT_PERMUTATIONS,
            seed: DEFAULT_SEED,
            small_group: SMALL_GROUP,
        }
    }
}

impl GroupOptions {
    /// Refuse settings that cannot work, with one message per rule.
    pub fn check(&self) -> Result<()> {
        if !(self.level > 0.0 && self.level < 1.0) {
            return Err(Error::Usage {
                message: format!(
                    "region level {}: expected a probability between 0 and 1, e.g. 0.95",
                    self.level
                ),
            });
        }
        if self.permutations < 99 {
            return Err(Error::Usage {
                message: format!(
                    "{} permutations: expected at least 99 (p-values are multiples of 1/(R + 1))",
                    self.permutations
                ),
            });
        }
        Ok(())
    }
}

/// Which test gave the reported p-value.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::TestMethod;
/// assert_eq!(serde_json::to_value(TestMethod::Hotelling).unwrap(), "hotelling");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum TestMethod {
    /// Hotelling's two-sample T² with the F reference distribution.
    Hotelling,
    /// The permutation distribution of T².
    Permutation,
}

/// One pair of groups compared in one diagram.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::{Comparison, TestMethod};
/// let c = Comparison::of(provenance_core::diagram::Diagram::Qfl, ("A", &[vec![0.0, 0.0]]), ("B", &[vec![1.0, 1.0]]), &Default::default(), 0, 1);
/// assert!(c.p_value.is_none()); // one sample each: no test possible
/// assert!(c.note.is_some());
/// ```
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Comparison {
    /// The diagram.
    pub diagram: Diagram,
    /// The two groups' names.
    pub groups: [String; 2],
    /// Samples of each group with points in the diagram.
    pub n: [usize; 2],
    /// Hotelling's test, when the pooled covariance allows it.
    pub hotelling: Option<Hotelling>,
    /// The permutation test, for small groups.
    pub permutation: Option<Permutation>,
    /// The test whose p-value is reported.
    pub method: Option<TestMethod>,
    /// The reported p-value.
    pub p_value: Option<f64>,
    /// Holm-adjusted p-value over all pairs in this diagram.
    pub p_holm: Option<f64>,
    /// Why no test was possible.
    pub note: Option<&'static str>,
}

impl Comparison {
    /// Compare two groups' ilr coordinates; `pair` = (i, j) positions of the groups, used with
    /// `diagram` to seed the permutation stream.
    pub fn of(
        diagram: Diagram,
        a: (&str, &[Vec<f64>]),
        b: (&str, &[Vec<f64>]),
        options: &GroupOptions,
        i: usize,
        j: usize,
    ) -> Comparison {
        let hotelling = Hotelling::test(a.1, b.1);
        let small = a.1.len().min(b.1.len()) < options.small_group;
        let permutation = if small && hotelling.is_some() {
            let seed = pair_seed(options.seed, diagram.index(), i, j);
            Permutation::test(a.1, b.1, options.permutations, seed)
        } else {
            None
        };
        let (method, p_value) = match (&permutation, &hotelling) {
            (Some(p), _) => (Some(TestMethod::Permutation), Some(p.p_value)),
            (None, Some(h)) => (Some(TestMethod::Hotelling), Some(h.p_value)),
            _ => (None, None),
        };
        Comparison {
            diagram,
            groups: [a.0.to_string(), b.0.to_string()],
            n: [a.1.len(), b.1.len()],
            hotelling,
            permutation,
            method,
            p_value,
            p_holm: None,
            note: hotelling.is_none().then_some(
                "no test: together the groups need at least 4 samples and a non-singular pooled covariance",
            ),
        }
    }
}

/// The statistics of every group and the comparisons of every pair, diagram by diagram.
///
/// # Example
/// ```
/// use provenance_core::input::CountReader;
/// use provenance_core::petrofacies::{GroupOptions, Petrofacies, Table};
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm,fm\n\
///          a,100,5,40,10,50,5,5,X\nb,120,4,35,12,40,6,4,X\nc,90,6,50,9,55,4,6,X\n\
///          d,200,9,10,4,10,20,9,Y\ne,210,8,12,3,9,25,8,Y\nf,190,10,9,5,12,22,10,Y\n";
/// let table = Table::read(CountReader::from_reader("t.csv", t.as_bytes(), Default::default())?)?;
/// let p = Petrofacies::of(&table, &table.column("fm")?, GroupOptions::default())?;
/// assert_eq!(p.groups.len(), 2);
/// let qfl = p.comparisons.iter().find(|c| c.diagram.id() == "qfl").unwrap();
/// assert_eq!(qfl.groups, ["X", "Y"]);
/// assert!(qfl.permutation.is_some()); // 3 + 3 samples: small groups
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Petrofacies {
    /// The grouping column.
    pub by: String,
    /// The settings used.
    pub options: GroupOptions,
    /// One summary per group, in order of first appearance.
    pub groups: Vec<GroupSummary>,
    /// Pairwise comparisons, diagram by diagram, pairs in group order.
    pub comparisons: Vec<Comparison>,
}

impl Petrofacies {
    /// Group the samples of `table` by `by` and analyse them.
    pub fn of(table: &Table, by: &MetaColumn, options: GroupOptions) -> Result<Petrofacies> {
        let groups = table.groups(by)?;
        let named: Vec<(String, Vec<&Sample>)> = groups
            .iter()
            .map(|g| (g.name.clone(), g.samples(table)))
            .collect();
        Petrofacies::from_groups(by.name(), &named, options)
    }

    /// Analyse groups given directly as (name, samples).
    pub fn from_groups(
        by: &str,
        groups: &[(String, Vec<&Sample>)],
        options: GroupOptions,
    ) -> Result<Petrofacies> {
        options.check()?;
        use rayon::prelude::*;
        let summaries: Vec<GroupSummary> = groups
            .par_iter()
            .map(|(name, samples)| GroupSummary::of(name, samples, options.level))
            .collect();
        let mut comparisons = Vec::new();
        for d in Diagram::ALL {
            let mut pairs = Vec::new();
            for i in 0..summaries.len() {
                for j in i + 1..summaries.len() {
                    if let (Some(a), Some(b)) = (summaries[i].get(d), summaries[j].get(d)) {
                        pairs.push((i, j, a, b));
                    }
                }
            }
            let mut block: Vec<Comparison> = pairs
                .par_iter()
                .map(|(i, j, a, b)| {
                    let rows = |s: &super::summary::DiagramSummary| -> Vec<Vec<f64>> {
                        s.coordinates.iter().map(|c| c.to_vec()).collect()
                    };
                    let (ra, rb) = (rows(a), rows(b));
                    Comparison::of(
                        d,
                        (&summaries[*i].name, &ra),
                        (&summaries[*j].name, &rb),
                        &options,
                        *i,
                        *j,
                    )
                })
                .collect();
            let adjusted = holm(&block.iter().map(|c| c.p_value).collect::<Vec<_>>());
            for (c, h) in block.iter_mut().zip(adjusted) {
                c.p_holm = h;
            }
            comparisons.extend(block);
        }
        Ok(Petrofacies {
            by: by.to_string(),
            options,
            groups: summaries,
            comparisons,
        })
    }
}
