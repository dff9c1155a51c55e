//! Likelihoods in the setting table: field membership under counting error per diagram, the
//! provenance-group summary across diagrams, and an optional classifier.
//!
//! JSON: each diagram's object gains the keys of [`crate::output::MembershipJson`]
//! (`membership`, `top`, `ambiguous`, `membership_error`, `region95`, and `membership_note`
//! when membership is unavailable); each sample gains `"provenance_summary"` and, with a
//! model, `"classifier"`. CSV: each diagram's block gains the columns of
//! [`crate::output::MembershipColumns`]; then per diagram `{d}_top_group`, `{d}_top_group_p`,
//! then `qfl_qmflt_disagree`, then with a model `classifier_model`, `classifier_top`,
//! `classifier_top_p` and `classifier_p_{class}`.

pub use crate::classifier::{ClassifierResult, NamedModel};
use crate::counts::Sample;
use crate::diagram::Diagram;
use crate::error::Result;
use crate::fields::FieldSet;
use crate::membership::{
    group_probabilities, ConfidenceRegion, Estimator, Membership, MembershipOptions, Posterior,
    ProvenanceSummary, AMBIGUOUS_BELOW, REGION_LEVEL,
};
use crate::modes::DiagramMode;
use crate::output::number::{push_fixed, round, RATIO_DECIMALS};
use crate::output::{push_csv_cell, MembershipColumns, MembershipJson};
use serde::ser::{SerializeMap, Serializer};
use serde::Serialize;

/// Why a diagram with points has no membership.
pub const POINTS_UNKNOWN: &str =
    "points unknown (percentages without n): no counting error, so no membership";

/// What the group summary means.
pub const SUMMARY_NOTE: &str = "Group probabilities add up the field memberships of each \
diagram. The diagrams are drawn from the same grains, so their agreement is not independent \
evidence.";

/// How likelihoods are computed for a [`super::Locator`]'s field sets.
#[derive(Debug, Clone)]
pub struct Likelihoods {
    estimators: Vec<Estimator>,
    options: MembershipOptions,
    ambiguous_below: f64,
    classifier: Option<NamedModel>,
}

/// One diagram's likelihoods.
#[derive(Debug, Clone, PartialEq)]
pub struct DiagramLikelihood {
    /// The membership; `None` without points or with points unknown.
    pub membership: Option<Membership>,
    /// The 95% logistic-normal confidence region of the composition.
    pub region: Option<ConfidenceRegion>,
    /// Why membership is unavailable although the diagram has points.
    pub note: Option<&'static str>,
}

/// Likelihoods of one sample.
#[derive(Debug, Clone, PartialEq)]
pub struct SampleLikelihood {
    /// One per field set of the locator, in its order.
    pub diagrams: Vec<DiagramLikelihood>,
    /// The provenance-group summary.
    pub summary: ProvenanceSummary,
    /// The classifier's verdict, when a model was given.
    pub classifier: Option<ClassifierResult>,
}

impl Likelihoods {
    /// Likelihoods for `sets` (in the locator's order) with membership `options` and an
    /// optional classifier.
    ///
    /// # Example
    /// ```
    /// use provenance_core::membership::MembershipOptions;
    /// use provenance_core::setting::{Likelihoods, Locator};
    /// let locator = Locator::embedded().unwrap();
    /// let l = Likelihoods::new(locator.sets(), MembershipOptions::default(), None).unwrap();
    /// assert_eq!(l.options().draws, 10_000);
    /// ```
    pub fn new(
        sets: &[FieldSet],
        options: MembershipOptions,
        classifier: Option<NamedModel>,
    ) -> Result<Likelihoods> {
        let estimators = sets
            .iter()
            .map(|s| Estimator::new(s, options))
            .collect::<Result<Vec<_>>>()?;
        Ok(Likelihoods {
            estimators,
            options,
            ambiguous_below: AMBIGUOUS_BELOW,
            classifier,
        })
    }

    /// The membership options.
    pub fn options(&self) -> &MembershipOptions {
        &self.options
    }

    /// The classifier, if any.
    pub fn classifier(&self) -> Option<&NamedModel> {
        self.classifier.as_ref()
    }

    /// The likelihoods of one sample, given its modes on each set's diagram. The sample's
    /// random stream (used only where membership is sampled) comes from the seed, the sample's
    /// line in the input (its position) and the diagram.
    pub fn assess(
        &self,
        sets: &[FieldSet],
        sample: &Sample,
        modes: &[Option<DiagramMode>],
    ) -> SampleLikelihood {
        let mut diagrams = Vec::with_capacity(sets.len());
        let mut groups = Vec::new();
        for ((set, est), mode) in sets.iter().zip(&self.estimators).zip(modes) {
            let post = mode.as_ref().and_then(Posterior::of_mode);
            let d = match (mode, post) {
                (None, _) => DiagramLikelihood {
                    membership: None,
                    region: None,
                    note: None,
                },
                (Some(_), None) => DiagramLikelihood {
                    membership: None,
                    region: None,
                    note: Some(POINTS_UNKNOWN),
                },
                (Some(_), Some(p)) => {
                    let m = est.estimate(&p, sample.line, set.diagram.index() as u64);
                    groups.push((set.diagram, group_probabilities(&m, set)));
                    DiagramLikelihood {
                        membership: Some(m),
                        region: ConfidenceRegion::logistic_normal(&p, REGION_LEVEL).ok(),
                        note: None,
                    }
                }
            };
            diagrams.push(d);
        }
        let classifier = self.classifier.as_ref().map(|c| c.apply(sample));
        SampleLikelihood {
            diagrams,
            summary: ProvenanceSummary::of(&groups),
            classifier,
        }
    }

    /// Append a diagram's membership entries to its JSON object.
    pub(crate) fn write_diagram_entries<M: SerializeMap>(
        &self,
        map: &mut M,
        set: &FieldSet,
        d: &DiagramLikelihood,
    ) -> std::result::Result<(), M::Error> {
        MembershipJson {
            regions: set,
            membership: d.membership.as_ref(),
            region: d.region.as_ref(),
            ambiguous_below: self.ambiguous_below,
            note: d.note,
        }
        .write_entries(map)
    }

    /// Append the sample-level entries (`provenance_summary`, `classifier`).
    pub(crate) fn write_sample_entries<M: SerializeMap>(
        &self,
        map: &mut M,
        l: &SampleLikelihood,
    ) -> std::result::Result<(), M::Error> {
        map.serialize_entry("provenance_summary", &SummaryJson(&l.summary))?;
        if let (Some(c), Some(r)) = (&self.classifier, &l.classifier) {
            map.serialize_entry("classifier", &ClassifierJson(c, r))?;
        }
        Ok(())
    }

    /// The membership columns of one diagram's block.
    pub(crate) fn diagram_columns(&self, set: &FieldSet) -> Vec<String> {
        MembershipColumns::new(set.diagram.id(), set).header()
    }

    /// Append one diagram's membership cells.
    pub(crate) fn push_diagram(&self, buf: &mut Vec<u8>, set: &FieldSet, d: &DiagramLikelihood) {
        MembershipColumns::new(set.diagram.id(), set).push_cells(
            buf,
            d.membership.as_ref(),
            self.ambiguous_below,
        );
    }

    /// The sample-level columns.
    pub(crate) fn sample_columns(&self, sets: &[FieldSet]) -> Vec<String> {
        let mut h = Vec::new();
        for s in sets {
            h.push(format!("{}_top_group", s.diagram.id()));
            h.push(format!("{}_top_group_p", s.diagram.id()));
        }
        h.push("qfl_qmflt_disagree".into());
        if let Some(c) = &self.classifier {
            h.extend(c.csv_columns());
        }
        h
    }

    /// Append the sample-level cells, each preceded by a comma.
    pub(crate) fn push_sample(&self, buf: &mut Vec<u8>, sets: &[FieldSet], l: &SampleLikelihood) {
        for s in sets {
            let top = l.summary.top.iter().find(|t| t.0 == s.diagram);
            buf.push(b',');
            if let Some(t) = top {
                push_csv_cell(buf, &t.1);
            }
            buf.push(b',');
            if let Some(t) = top {
                push_fixed(buf, t.2, RATIO_DECIMALS);
            }
        }
        buf.push(b',');
        if let Some(d) = l.summary.qfl_qmflt_disagree {
            buf.extend_from_slice(if d { b"true" } else { b"false" });
        }
        if let (Some(c), Some(r)) = (&self.classifier, &l.classifier) {
            c.push_csv_cells(buf, r);
        }
    }
}

struct SummaryJson<'a>(&'a ProvenanceSummary);

impl Serialize for SummaryJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
        struct Groups<'a>(&'a [(String, f64)]);
        impl Serialize for Groups<'_> {
            fn serialize<S: Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
                let mut m = s.serialize_map(Some(self.0.len()))?;
                for (g, p) in self.0 {
                    m.serialize_entry(g, &round(*p, RATIO_DECIMALS))?;
                }
                m.end()
            }
        }
        struct ByDiagram<'a>(&'a [(Diagram, Vec<(String, f64)>)]);
        impl Serialize for ByDiagram<'_> {
            fn serialize<S: Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
                let mut m = s.serialize_map(Some(self.0.len()))?;
                for (d, g) in self.0 {
                    m.serialize_entry(d.id(), &Groups(g))?;
                }
                m.end()
            }
        }
        struct Top<'a>(&'a [(Diagram, String, f64)]);
        impl Serialize for Top<'_> {
            fn serialize<S: Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
                let mut m = s.serialize_map(Some(self.0.len()))?;
                for (d, g, p) in self.0 {
                    m.serialize_entry(d.id(), &TopGroup(g, *p))?;
                }
                m.end()
            }
        }
        struct TopGroup<'a>(&'a str, f64);
        impl Serialize for TopGroup<'_> {
            fn serialize<S: Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
                let mut m = s.serialize_map(Some(2))?;
                m.serialize_entry("group", self.0)?;
                m.serialize_entry("probability", &round(self.1, RATIO_DECIMALS))?;
                m.end()
            }
        }
        let mut m = s.serialize_map(Some(4))?;
        m.serialize_entry("groups", &ByDiagram(&self.0.groups))?;
        m.serialize_entry("top", &Top(&self.0.top))?;
        m.serialize_entry("qfl_qmflt_disagree", &self.0.qfl_qmflt_disagree)?;
        m.serialize_entry("note", SUMMARY_NOTE)?;
        m.end()
    }
}

struct ClassifierJson<'a>(&'a NamedModel, &'a ClassifierResult);

impl Serialize for ClassifierJson<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
        let (c, r) = (self.0, self.1);
        struct Probs<'a>(&'a [String], &'a [f64]);
        impl Serialize for Probs<'_> {
            fn serialize<S: Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
                let mut m = s.serialize_map(Some(self.0.len()))?;
                for (k, p) in self.0.iter().zip(self.1) {
                    m.serialize_entry(k, &round(*p, RATIO_DECIMALS))?;
                }
                m.end()
            }
        }
        let mut m = s.serialize_map(None)?;
        m.serialize_entry("model", &c.name)?;
        m.serialize_entry("composition", c.model.features.composition.id())?;
        m.serialize_entry(
            "probabilities",
            &r.probabilities
                .as_deref()
                .map(|p| Probs(&c.model.classes, p)),
        )?;
        if let Some(note) = r.note {
            m.serialize_entry("reason", note)?;
        }
        m.serialize_entry("note", &c.model.note)?;
        m.end()
    }
}
