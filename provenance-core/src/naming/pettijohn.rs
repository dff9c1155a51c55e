//! Pettijohn, Potter & Siever (1987): arenites and wackes.
//!
//! # Matrix
//! Matrix is taken as percent of framework plus matrix, 100·matrix / (framework + matrix),
//! with every framework grain (chert included) in the framework. Below 15% the rock is an
//! arenite, from 15% a wacke (Pettijohn et al. 1987, from memory; the 15% split is also
//! Dott's 1964, checked). Above 75% matrix the rock is a mudrock, not a sandstone, and gets no
//! name here (Dott 1964, checked; that Pettijohn et al. keep the same upper limit is from
//! memory). The scheme needs `matrix` counts: without a matrix column the name is null, with
//! a reason. Matrix and grains must be in one basis (both counts, or both percent of the whole
//! rock).
//!
//! # Poles
//! Q = Qm + Qp + C, F = P + K, R = Lv + Ls + Lm: chert goes with quartz by default (from
//! memory, unverified), and [`Pettijohn::chert`] can move it.
//!
//! # Classes and the inclusive side of each boundary
//! The quartz cut is 95% Q for both quartz arenite and quartz wacke (from memory; Dott's 1964
//! versions use 90% or 95%, and sandprov uses 95%). The 75% Q limit of subarkose and
//! sublitharenite and the F = R split follow the same rules (from memory).
//!
//! | matrix | Q | F vs R | name |
//! |---|---|---|---|
//! | < 15% | ≥ 95 | any | quartz arenite |
//! | < 15% | 75 to < 95 | F > R | subarkose |
//! | < 15% | 75 to < 95 | F ≤ R | sublitharenite |
//! | < 15% | < 75 | F > R | arkosic arenite |
//! | < 15% | < 75 | F ≤ R | lithic arenite |
//! | 15 to 75% | ≥ 95 | any | quartz wacke |
//! | 15 to 75% | < 95 | F > R | feldspathic greywacke |
//! | 15 to 75% | < 95 | F ≤ R | lithic greywacke |
//! | > 75% | | | no name (mudrock) |
//!
//! sandprov's convention at each limit: matrix = 15% is a wacke, matrix = 75% still a wacke;
//! Q = 95% and Q = 75% go with the quartz-richer class; F = R goes to the lithic side, as in
//! [`super::folk`].

use super::basis::{ChertPlacement, Measure, Poles};
use super::words::{pct, share};
use super::{Naming, NamingScheme, Verdict};
use crate::counts::Sample;

const SOURCE: &str =
    "Pettijohn, F.J., Potter, P.E. & Siever, R. (1987) Sand and Sandstone, 2nd ed. Springer, New York";

/// Matrix limit of arenites, percent of framework plus matrix (Pettijohn et al. 1987, from
/// memory; Dott 1964, checked).
const MATRIX_WACKE: f64 = 15.0;
/// Matrix limit of wackes (Dott 1964, checked; from memory for Pettijohn et al. 1987).
const MATRIX_MUDROCK: f64 = 75.0;
/// Quartz cut of quartz arenite and quartz wacke, percent of Q + F + R (from memory).
const Q_QUARTZ: f64 = 95.0;
/// Lower Q limit of subarkose and sublitharenite (from memory).
const Q_SUB: f64 = 75.0;

/// The Pettijohn, Potter & Siever (1987) scheme.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, NonFramework, Sample};
/// use provenance_core::naming::{NamingScheme, Pettijohn};
/// let mut s = Sample::counted("A", Framework { qm: 150.0, p: 100.0, lv: 50.0, ..Default::default() });
/// assert_eq!(Pettijohn::default().classify(&s).name(), None);
/// s.other = NonFramework { matrix: Some(100.0), ..Default::default() };
/// assert_eq!(Pettijohn::default().classify(&s).name(), Some("feldspathic greywacke"));
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Pettijohn {
    /// Where chert goes; the default is Q (from memory).
    pub chert: ChertPlacement,
}

impl Default for Pettijohn {
    fn default() -> Self {
        Pettijohn {
            chert: ChertPlacement::Quartz,
        }
    }
}

impl NamingScheme for Pettijohn {
    fn id(&self) -> &'static str {
        "pettijohn"
    }
    fn title(&self) -> &'static str {
        "Pettijohn, Potter & Siever (1987)"
    }
    fn source(&self) -> &'static str {
        SOURCE
    }
    fn pole_symbols(&self) -> [&'static str; 3] {
        ["Q", "F", "R"]
    }
    fn measure_symbols(&self) -> &'static [&'static str] {
        &["matrix", "F/R"]
    }
    fn chert(&self) -> Option<ChertPlacement> {
        Some(self.chert)
    }
    fn place_chert(&mut self, placement: ChertPlacement) -> bool {
        self.chert = placement;
        true
    }

    fn classify(&self, sample: &Sample) -> Naming {
        let fw = &sample.framework;
        let framework = fw.total();
        let Some(poles) = Poles::qfr(["Q", "F", "R"], self.chert, fw) else {
            return Naming::unnamed(
                "no grains in the Q, F and R poles, so there is no sandstone to name",
            );
        };
        let [q, f, r] = poles.amounts();
        let t = q + f + r;
        let [qp, fp, rp] = poles.percents();
        let matrix_pct = sample.other.matrix.map(|m| share(m, framework + m));
        let measures = vec![
            Measure::percent("matrix", matrix_pct, "matrix, % of framework plus matrix"),
            Measure::ratio("F/R", f, r, "feldspar over rock fragments"),
        ];
        let named = |verdict| Naming {
            verdict,
            subtype: None,
            poles: Some(poles),
            measures: measures.clone(),
        };
        let Some(m) = sample.other.matrix else {
            return named(Verdict::unnamed(
                "the table has no matrix column: Pettijohn, Potter & Siever (1987) separate arenites from wackes at 15% matrix, so the scheme needs matrix counts",
            ));
        };
        let m_text = format!(
            "matrix is {} of framework plus matrix",
            pct(share(m, framework + m), &[MATRIX_WACKE, MATRIX_MUDROCK])
        );
        if 100.0 * m > MATRIX_MUDROCK * (framework + m) {
            return named(Verdict::unnamed(format!(
                "{m_text}, above 75%: a mudrock rather than a sandstone (limit of Dott 1964), so no sandstone name"
            )));
        }
        let wacke = 100.0 * m >= MATRIX_WACKE * (framework + m);
        let kind = if wacke {
            format!("{m_text}, from 15% to 75%: a wacke")
        } else {
            format!("{m_text}, below 15%: an arenite")
        };
        let q_text = format!("Q is {} of Q + F + R", pct(qp, &[Q_QUARTZ, Q_SUB]));
        let f_vs_r = if f > r {
            format!("F ({}) exceeds R ({})", pct(fp, &[]), pct(rp, &[]))
        } else if f == r {
            format!(
                "F equals R ({} each), a tie sandprov counts on the lithic side",
                pct(fp, &[])
            )
        } else {
            format!("R ({}) exceeds F ({})", pct(rp, &[]), pct(fp, &[]))
        };
        let feldspathic = f > r;
        let (name, q_rule) = if 100.0 * q >= Q_QUARTZ * t {
            let name = if wacke {
                "quartz wacke"
            } else {
                "quartz arenite"
            };
            (name, format!("{q_text}, at or above 95%"))
        } else if wacke {
            let name = if feldspathic {
                "feldspathic greywacke"
            } else {
                "lithic greywacke"
            };
            (name, format!("{q_text}, below 95%, and {f_vs_r}"))
        } else if 100.0 * q >= Q_SUB * t {
            let name = if feldspathic {
                "subarkose"
            } else {
                "sublitharenite"
            };
            (
                name,
                format!("{q_text}, from 75% up to but not including 95%, and {f_vs_r}"),
            )
        } else {
            let name = if feldspathic {
                "arkosic arenite"
            } else {
                "lithic arenite"
            };
            (name, format!("{q_text}, below 75%, and {f_vs_r}"))
        };
        named(Verdict::named(name, format!("{kind}; {q_rule}: {name}")))
    }
}
