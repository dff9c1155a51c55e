//! Garzanti (2019): QFL names built from the components above 10%.
//!
//! A sand is named by the QFL components that exceed 10%, least abundant first and most
//! abundant last (Garzanti 2019, Earth-Sci. Rev. 192:545-563; checked). The components give
//! prefixes `quartzo-`, `feldspatho-`, `litho-` and endings `quartzose`, `feldspathic`,
//! `lithic`: Q > F > L > 10% is litho-feldspatho-quartzose.
//!
//! # The 15 fields
//! - three components above 10% (six orders): litho-feldspatho-quartzose (Q > F > L),
//!   feldspatho-litho-quartzose (Q > L > F), litho-quartzo-feldspathic (F > Q > L),
//!   quartzo-litho-feldspathic (F > L > Q), feldspatho-quartzo-lithic (L > Q > F),
//!   quartzo-feldspatho-lithic (L > F > Q);
//! - two (six orders): feldspatho-quartzose, litho-quartzose, quartzo-feldspathic,
//!   litho-feldspathic, quartzo-lithic, feldspatho-lithic;
//! - one: quartzose, feldspathic, lithic.
//!
//! Garzanti's further splits of lithic-poor sands by Q/F (18 fields in all) are not made: their
//! cut values are not known here.
//!
//! # Boundaries and ties (sandprov's conventions)
//! - "Exceed" is strict: a component at exactly 10% is left out of the name.
//! - When named components are equal, the one earlier in Q, F, L order counts as the more
//!   abundant and is named later: Q = F = 45%, L = 10% gives feldspatho-quartzose.
//!
//! # Chert and carbonate grains
//! Where Garzanti (2019) puts chert is not known here, so it is a choice ([`Garzanti::chert`]).
//! The default puts chert in Q, as Dickinson's (1985) QFL does, so these poles equal the QFL
//! mode of `sandprov modes`. The input has no carbonate category: carbonate grains go wherever
//! the lab's column mapping sends them (usually `Ls`, hence L).

use super::basis::{ChertPlacement, Poles};
use super::words::pct;
use super::{Naming, NamingScheme, Verdict};
use crate::counts::Sample;

const SOURCE: &str =
    "Garzanti, E. (2019) Petrographic classification of sand and sandstone. Earth-Science Reviews 192:545-563";

/// A component is named when it exceeds this percent of QFL (Garzanti 2019; checked).
const NAMED_ABOVE: f64 = 10.0;

const PREFIX: [&str; 3] = ["quartzo", "feldspatho", "litho"];
const ENDING: [&str; 3] = ["quartzose", "feldspathic", "lithic"];

/// The Garzanti (2019) scheme.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::naming::{Garzanti, NamingScheme};
/// let s = Sample::counted("A", Framework { qm: 186.0, p: 72.0, lv: 42.0, ..Default::default() });
/// let n = Garzanti::default().classify(&s);
/// assert_eq!(n.name(), Some("litho-feldspatho-quartzose"));
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Garzanti {
    /// Where chert goes; the default is Q (see the module documentation).
    pub chert: ChertPlacement,
}

impl Default for Garzanti {
    fn default() -> Self {
        Garzanti {
            chert: ChertPlacement::Quartz,
        }
    }
}

/// The Garzanti name of the components `named` (pole indices 0 = Q, 1 = F, 2 = L), given
/// least abundant first.
///
/// # Example
/// ```
/// use provenance_core::naming::garzanti::field_name;
/// assert_eq!(field_name(&[2, 1, 0]), "litho-feldspatho-quartzose");
/// assert_eq!(field_name(&[0, 2]), "quartzo-lithic");
/// assert_eq!(field_name(&[1]), "feldspathic");
/// ```
pub fn field_name(named: &[usize]) -> String {
    let mut parts: Vec<&str> = Vec::with_capacity(named.len());
    if let Some((last, rest)) = named.split_last() {
        parts.extend(rest.iter().map(|i| PREFIX[*i]));
        parts.push(ENDING[*last]);
    }
    parts.join("-")
}

impl NamingScheme for Garzanti {
    fn id(&self) -> &'static str {
        "garzanti"
    }
    fn title(&self) -> &'static str {
        "Garzanti (2019)"
    }
    fn source(&self) -> &'static str {
        SOURCE
    }
    fn pole_symbols(&self) -> [&'static str; 3] {
        ["Q", "F", "L"]
    }
    fn chert(&self) -> Option<ChertPlacement> {
        Some(self.chert)
    }
    fn place_chert(&mut self, placement: ChertPlacement) -> bool {
        self.chert = placement;
        true
    }

    fn classify(&self, sample: &Sample) -> Naming {
        let Some(poles) = Poles::qfr(["Q", "F", "L"], self.chert, &sample.framework) else {
            return Naming::unnamed(
                "no framework grains in Garzanti's Q, F and L poles, so there is nothing to name",
            );
        };
        let amounts = poles.amounts();
        let total = poles.total();
        let percents = poles.percents();
        let symbol = |i: usize| poles.parts[i].symbol;
        let mut named: Vec<usize> = (0..3)
            .filter(|i| 100.0 * amounts[*i] > NAMED_ABOVE * total)
            .collect();
        // Least abundant first; on a tie the pole later in Q, F, L order comes first.
        named.sort_by(|a, b| amounts[*a].total_cmp(&amounts[*b]).then(b.cmp(a)));
        let name = field_name(&named);

        let listed = (0..3)
            .map(|i| format!("{} {}", symbol(i), pct(percents[i], &[NAMED_ABOVE])))
            .collect::<Vec<_>>()
            .join(", ");
        let order = named
            .iter()
            .map(|i| symbol(*i))
            .collect::<Vec<_>>()
            .join(", ");
        let mut rule = if named.len() == 1 {
            format!("{listed} of Q + F + L; only {order} is above 10%")
        } else {
            format!("{listed} of Q + F + L; above 10%, from least to most abundant: {order}")
        };
        let left_out: Vec<usize> = (0..3).filter(|i| !named.contains(i)).collect();
        if let ([_, _], [out]) = (named.as_slice(), left_out.as_slice()) {
            rule.push_str(&format!(
                "; {} is not above 10% and stays out of the name",
                symbol(*out)
            ));
        }
        for w in named.windows(2) {
            if amounts[w[0]] == amounts[w[1]] {
                rule.push_str(&format!(
                    "; {} and {} tie, and by sandprov's tie rule {} (earlier in Q, F, L order) counts as the more abundant",
                    symbol(w[1]),
                    symbol(w[0]),
                    symbol(w[1])
                ));
            }
        }
        rule.push_str(&format!(": {name}"));
        Naming {
            verdict: Verdict::named(name, rule),
            subtype: None,
            poles: Some(poles),
            measures: Vec::new(),
        }
    }
}
