//! Folk (1980): quartz-feldspar-rock fragment (QFR) classes.
//!
//! # Poles
//! - Q = Qm + Qp: all quartz, polycrystalline quartz and metaquartzite included, chert not
//!   (Folk 1980; checked).
//! - F = P + K. Folk also counts granite and gneiss fragments as feldspar; under
//!   Gazzi-Dickinson counting (Ingersoll et al. 1984) their crystals are already counted as
//!   minerals, so P + K carries them.
//! - R = Lv + Ls + Lm + C: every other rock fragment, chert included (from memory; the subtype
//!   "chert arenite" fits). Chert can be moved with [`Folk::chert`].
//!
//! Matrix, cement, mica and dense minerals stay out; the poles are recalculated to 100.
//!
//! # Classes and the inclusive side of each boundary
//! The class limits are Folk's (1980), from memory with high confidence. The published rules do
//! not say which side of a limit is inclusive; sandprov's convention, tested on both sides of
//! every limit:
//!
//! | Q (% of QFR) | F/R | name | at the limit |
//! |---|---|---|---|
//! | ≥ 95 | any | quartzarenite | Q = 95 is quartzarenite |
//! | 75 to < 95 | F > R | subarkose | Q = 75 is sub- |
//! | 75 to < 95 | F ≤ R | sublitharenite | F = R is sublitharenite |
//! | < 75 | > 3 | arkose | F/R = 3 is lithic arkose |
//! | < 75 | > 1 to ≤ 3 | lithic arkose | |
//! | < 75 | ≥ 1/3 to ≤ 1 | feldspathic litharenite | F/R = 1 and 1/3 are feldspathic litharenite |
//! | < 75 | < 1/3 | litharenite | |
//!
//! The Q limits go with the quartz-richer class, as Folk's "≥ 95" states. Arkose "> 3" and
//! litharenite "< 1/3" are strict in the rule, so 3 and 1/3 fall to the inner classes. F = R is
//! not settled by the rule; sandprov counts it on the lithic side (sublitharenite,
//! feldspathic litharenite), a convention of its own.
//!
//! # Second level (from memory, unverified)
//! - Litharenites are named by their dominant rock-fragment family: volcanic (Lv) gives
//!   volcanic arenite, metamorphic (Lm) phyllarenite, sedimentary (Ls, with chert when chert
//!   is in R) sedarenite. A sedarenite whose chert exceeds its other sedimentary fragments is a
//!   chert arenite. "Dominant" is taken as the largest of the three families; a tie for the
//!   largest gives no subtype.
//! - Calclithite (carbonate rock fragments dominant) cannot be reached: the input has no
//!   carbonate category. A lab that maps carbonate fragments into `Ls` will see them named
//!   sedarenite.
//! - Arkoses are named by their dominant feldspar: plagioclase arkose (P > K) or K-feldspar
//!   arkose (K > P); P = K gives no subtype.

use super::basis::{ChertPlacement, Measure, Poles};
use super::words::{pct, ratio, share};
use super::{Naming, NamingScheme, Verdict};
use crate::counts::{Framework, Sample};

const SOURCE: &str = "Folk, R.L. (1980) Petrology of Sedimentary Rocks. Hemphill, Austin, Texas";

/// Q limits, percent of Q + F + R (Folk 1980; from memory, high confidence).
const Q_QUARTZARENITE: f64 = 95.0;
/// The lower Q limit of subarkose and sublitharenite (Folk 1980; from memory, high confidence).
const Q_SUB: f64 = 75.0;
/// F/R limits below Q 75% (Folk 1980; from memory, high confidence): 3, 1 and 1/3.
const FR_LIMITS: [f64; 3] = [3.0, 1.0, 1.0 / 3.0];

const MEMORY: &str = "split rule from memory, unverified";

/// The Folk (1980) scheme.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::naming::{ChertPlacement, Folk, NamingScheme};
/// // Qm 270 and chert 30: with chert among the rock fragments, Q is 90%.
/// let s = Sample::counted("A", Framework { qm: 270.0, c: 30.0, ..Default::default() });
/// assert_eq!(Folk::default().classify(&s).name(), Some("sublitharenite"));
/// let counted_as_quartz = Folk { chert: ChertPlacement::Quartz };
/// assert_eq!(counted_as_quartz.classify(&s).name(), Some("quartzarenite"));
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Folk {
    /// Where chert goes; Folk's own rule, the default, puts it in R.
    pub chert: ChertPlacement,
}

impl Default for Folk {
    fn default() -> Self {
        Folk {
            chert: ChertPlacement::Lithic,
        }
    }
}

impl NamingScheme for Folk {
    fn id(&self) -> &'static str {
        "folk"
    }
    fn title(&self) -> &'static str {
        "Folk (1980)"
    }
    fn source(&self) -> &'static str {
        SOURCE
    }
    fn pole_symbols(&self) -> [&'static str; 3] {
        ["Q", "F", "R"]
    }
    fn measure_symbols(&self) -> &'static [&'static str] {
        &["F/R"]
    }
    fn has_subtype(&self) -> bool {
        true
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
        let Some(poles) = Poles::qfr(["Q", "F", "R"], self.chert, fw) else {
            return Naming::unnamed(no_grains(self.chert, fw));
        };
        let [q, f, r] = poles.amounts();
        let t = q + f + r;
        let [qp, fp, rp] = poles.percents();
        let fr = Measure::ratio("F/R", f, r, "feldspar over rock fragments");
        let q_text = format!("Q is {} of Q + F + R", pct(qp, &[Q_QUARTZARENITE, Q_SUB]));
        let (name, rule) = if 100.0 * q >= Q_QUARTZARENITE * t {
            ("quartzarenite", format!("{q_text}, at or above 95%"))
        } else if 100.0 * q >= Q_SUB * t {
            let band = format!("{q_text}, from 75% up to but not including 95%");
            let fr_text = if f > r {
                format!("F ({}) exceeds R ({})", pct(fp, &[]), pct(rp, &[]))
            } else if f == r {
                format!(
                    "F equals R ({} each), a tie sandprov counts on the lithic side",
                    pct(fp, &[])
                )
            } else {
                format!("R ({}) exceeds F ({})", pct(rp, &[]), pct(fp, &[]))
            };
            let name = if f > r { "subarkose" } else { "sublitharenite" };
            (name, format!("{band}, and {fr_text}"))
        } else {
            let below = format!("{q_text}, below 75%");
            let (name, fr_text) = below_75(f, r);
            (name, format!("{below}, and {fr_text}"))
        };
        let mut rule = format!("{rule}: {name}");
        match self.chert {
            ChertPlacement::Lithic => {}
            ChertPlacement::Quartz => {
                rule.push_str(" (chert counted with Q as asked; Folk puts it with R)")
            }
            ChertPlacement::Omit => {
                rule.push_str(" (chert left out as asked; Folk puts it with R)")
            }
        }
        let subtype = match name {
            "litharenite" => Some(litharenite_subtype(fw, self.chert)),
            "arkose" => Some(arkose_subtype(fw)),
            _ => None,
        };
        Naming {
            verdict: Verdict::named(name, rule),
            subtype,
            poles: Some(poles),
            measures: vec![fr],
        }
    }
}

fn no_grains(chert: ChertPlacement, fw: &Framework) -> String {
    if chert == ChertPlacement::Omit && fw.c > 0.0 {
        "no grains in Folk's Q, F and R poles: chert, the only framework grain counted, is left out as asked".into()
    } else {
        "no framework grains counted, so Folk's Q, F and R poles are empty".into()
    }
}

/// The class below Q 75%, by F/R, with the comparison in words.
fn below_75(f: f64, r: f64) -> (&'static str, String) {
    let fr = || ratio(f / r, &FR_LIMITS);
    if r == 0.0 {
        return (
            "arkose",
            "there are no rock fragments (F/R unbounded, above 3)".into(),
        );
    }
    if f > 3.0 * r {
        ("arkose", format!("F/R is {}, above 3", fr()))
    } else if f == 3.0 * r {
        (
            "lithic arkose",
            "F/R is exactly 3, which sandprov counts with lithic arkose (arkose needs F/R above 3)"
                .into(),
        )
    } else if f > r {
        (
            "lithic arkose",
            format!("F/R is {}, above 1 and at most 3", fr()),
        )
    } else if f == r {
        (
            "feldspathic litharenite",
            "F/R is exactly 1 (F equals R), a tie sandprov counts on the lithic side".into(),
        )
    } else if 3.0 * f > r {
        (
            "feldspathic litharenite",
            format!("F/R is {}, from 1/3 to 1", fr()),
        )
    } else if 3.0 * f == r {
        ("feldspathic litharenite", "F/R is exactly 1/3, which sandprov counts with feldspathic litharenite (litharenite needs F/R below 1/3)".into())
    } else {
        ("litharenite", format!("F/R is {}, below 1/3", fr()))
    }
}

/// Litharenite subtype by the dominant rock-fragment family (from memory, unverified).
fn litharenite_subtype(fw: &Framework, chert: ChertPlacement) -> Verdict {
    let chert_in_r = chert == ChertPlacement::Lithic;
    let c = if chert_in_r { fw.c } else { 0.0 };
    let families = [
        ("volcanic", "Lv", fw.lv, "volcanic arenite"),
        ("metamorphic", "Lm", fw.lm, "phyllarenite"),
        (
            "sedimentary",
            if chert_in_r { "Ls + C" } else { "Ls" },
            fw.ls + c,
            "sedarenite",
        ),
    ];
    let r: f64 = families.iter().map(|x| x.2).sum();
    let listed = format!(
        "R is {} volcanic ({}), {} metamorphic ({}) and {} sedimentary ({})",
        pct(share(families[0].2, r), &[]),
        families[0].1,
        pct(share(families[1].2, r), &[]),
        families[1].1,
        pct(share(families[2].2, r), &[]),
        families[2].1,
    );
    let top = families.iter().map(|x| x.2).fold(0.0, f64::max);
    let leaders: Vec<_> = families.iter().filter(|x| x.2 == top).collect();
    if leaders.len() > 1 {
        let tied = leaders
            .iter()
            .map(|x| x.0)
            .collect::<Vec<_>>()
            .join(" and ");
        return Verdict::unnamed(format!(
            "{listed}; the {tied} families tie for the largest share, so no single family names the litharenite ({MEMORY})"
        ));
    }
    let (word, _, _, mut name) = *leaders[0];
    let mut rule = format!("{listed}; the {word} family is the largest");
    if word == "sedimentary" {
        if chert_in_r && fw.c > fw.ls {
            name = "chert arenite";
            rule.push_str(" and chert exceeds the other sedimentary fragments");
        } else if chert_in_r {
            rule.push_str(" and chert does not exceed the other sedimentary fragments");
        } else {
            rule.push_str(" (chert is not in R here, so chert arenite cannot be reached)");
        }
        rule.push_str("; calclithite cannot be reached, as the input has no carbonate category");
    }
    Verdict::named(name, format!("{rule}: {name} ({MEMORY})"))
}

/// Arkose subtype by the dominant feldspar (from memory, unverified).
fn arkose_subtype(fw: &Framework) -> Verdict {
    let f = fw.feldspar();
    let listed = format!(
        "F is {} plagioclase (P) and {} K-feldspar (K)",
        pct(share(fw.p, f), &[]),
        pct(share(fw.k, f), &[])
    );
    let name = if fw.p > fw.k {
        "plagioclase arkose"
    } else if fw.k > fw.p {
        "K-feldspar arkose"
    } else {
        return Verdict::unnamed(format!(
            "{listed}; neither feldspar dominates, so no feldspar names the arkose (naming by the dominant feldspar is from memory, unverified)"
        ));
    };
    let which = if fw.p > fw.k {
        "plagioclase dominates"
    } else {
        "K-feldspar dominates"
    };
    Verdict::named(
        name,
        format!("{listed}; {which}: {name} (naming by the dominant feldspar is from memory, unverified)"),
    )
}
