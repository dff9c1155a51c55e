//! Sandstone names under published classification schemes.
//!
//! Each scheme is one module implementing [`NamingScheme`]; a lab adds its own scheme by
//! implementing the trait in a new module and adding it to a [`SchemeSet`], without touching
//! the others.
//!
//! - [`folk`]: Folk (1980), quartz-feldspar-rock fragment (QFR) classes, with litharenite and
//!   arkose subtypes.
//! - [`garzanti`]: Garzanti (2019), the 15 QFL fields named by the components above 10%.
//! - [`pettijohn`]: Pettijohn, Potter & Siever (1987), arenites and wackes split at 15% matrix.
//!
//! Every scheme returns a [`Naming`]: the name (lower-case, as published) or no name with a
//! reason, the recalculated poles with the categories summed into each, any further quantity
//! compared, and the rule that fired, in words.
//!
//! Boundaries are compared on the amounts by cross-multiplication (for example Q ≥ 95% as
//! 100·Q ≥ 95·(Q + F + R)), so whole counts are classified exactly and multiplying every count
//! by the same factor never changes a name.
//!
//! # Example
//! ```
//! use provenance_core::counts::{Framework, Sample};
//! use provenance_core::naming::SchemeSet;
//! let s = Sample::counted("A", Framework { qm: 240.0, p: 30.0, k: 15.0, lv: 15.0, ..Default::default() });
//! let names: Vec<_> = SchemeSet::standard().classify(&s);
//! assert_eq!(names[0].name(), Some("subarkose"));
//! assert_eq!(names[1].name(), Some("feldspatho-quartzose")); // L is 5%, not above 10%
//! assert_eq!(names[2].name(), None); // no matrix column: Pettijohn et al. need one
//! ```

pub mod basis;
pub mod folk;
pub mod garzanti;
pub mod pettijohn;
mod words;
mod write;

#[cfg(test)]
mod tests;

pub use basis::{CategorySet, ChertPlacement, Measure, Pole, Poles, Unit};
pub use folk::Folk;
pub use garzanti::Garzanti;
pub use pettijohn::Pettijohn;
pub use write::{write_names, NamesOutput};

use crate::counts::Sample;
use crate::error::{Error, Result};

/// A published sandstone classification.
///
/// Implementations must be pure functions of the sample: the same counts give the same
/// [`Naming`], and classification must not depend on the scale of the counts.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::naming::{Folk, NamingScheme};
/// let folk = Folk::default();
/// assert_eq!(folk.id(), "folk");
/// assert_eq!(folk.pole_symbols(), ["Q", "F", "R"]);
/// let s = Sample::counted("A", Framework { qm: 290.0, p: 10.0, ..Default::default() });
/// assert_eq!(folk.classify(&s).name(), Some("quartzarenite"));
/// ```
pub trait NamingScheme: Send + Sync {
    /// Short lower-case id, used as column prefix and JSON key (`folk`).
    fn id(&self) -> &'static str;
    /// Author and year, as a petrologist cites the scheme (`Folk (1980)`).
    fn title(&self) -> &'static str;
    /// The full reference.
    fn source(&self) -> &'static str;
    /// The symbols of the three poles, in the order of [`Poles::parts`].
    fn pole_symbols(&self) -> [&'static str; 3];
    /// Symbols of the [`Measure`]s the scheme reports, in output order.
    fn measure_symbols(&self) -> &'static [&'static str] {
        &[]
    }
    /// True when the scheme gives a second-level name ([`Naming::subtype`]).
    fn has_subtype(&self) -> bool {
        false
    }
    /// Where the scheme puts chert, if it lets the user choose.
    fn chert(&self) -> Option<ChertPlacement> {
        None
    }
    /// Put chert elsewhere; false when the scheme has no such choice.
    fn place_chert(&mut self, placement: ChertPlacement) -> bool {
        let _ = placement;
        false
    }
    /// Name one sample.
    fn classify(&self, sample: &Sample) -> Naming;
}

/// A name with the rule that gave it, or no name with the reason.
///
/// # Example
/// ```
/// use provenance_core::naming::Verdict;
/// let v = Verdict::named("quartzarenite", "Q is 97.0%, at or above 95%");
/// assert_eq!(v.name(), Some("quartzarenite"));
/// let u = Verdict::unnamed("no matrix column");
/// assert_eq!((u.name(), u.explanation()), (None, "no matrix column"));
/// ```
#[derive(Debug, Clone, PartialEq)]
pub enum Verdict {
    /// A name.
    Named {
        /// The name, lower-case as published.
        name: String,
        /// The rule that fired, in words.
        rule: String,
    },
    /// No name.
    Unnamed {
        /// Why not, in words.
        reason: String,
    },
}

impl Verdict {
    /// A name and its rule.
    pub fn named(name: impl Into<String>, rule: impl Into<String>) -> Verdict {
        Verdict::Named {
            name: name.into(),
            rule: rule.into(),
        }
    }

    /// No name, with the reason.
    pub fn unnamed(reason: impl Into<String>) -> Verdict {
        Verdict::Unnamed {
            reason: reason.into(),
        }
    }

    /// The name, if any.
    pub fn name(&self) -> Option<&str> {
        match self {
            Verdict::Named { name, .. } => Some(name),
            Verdict::Unnamed { .. } => None,
        }
    }

    /// The rule that fired, or the reason there is no name.
    pub fn explanation(&self) -> &str {
        match self {
            Verdict::Named { rule, .. } => rule,
            Verdict::Unnamed { reason } => reason,
        }
    }
}

/// One scheme's result for one sample.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::naming::{Folk, NamingScheme};
/// let s = Sample::counted("A", Framework { qm: 100.0, lv: 160.0, ls: 20.0, lm: 10.0, p: 10.0, ..Default::default() });
/// let n = Folk::default().classify(&s);
/// assert_eq!(n.name(), Some("litharenite"));
/// assert_eq!(n.subtype_name(), Some("volcanic arenite"));
/// assert_eq!(n.poles.unwrap().get("R").unwrap().amount, 190.0);
/// assert!(n.verdict.explanation().contains("below 1/3"));
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Naming {
    /// The name or the reason there is none.
    pub verdict: Verdict,
    /// The second-level name where the scheme has one for this class; `None` where the class
    /// has no subdivision.
    pub subtype: Option<Verdict>,
    /// The recalculated poles; `None` when they hold no grains.
    pub poles: Option<Poles>,
    /// Further quantities compared, in the order of [`NamingScheme::measure_symbols`].
    pub measures: Vec<Measure>,
}

impl Naming {
    /// No name, for a reason that leaves no poles to report.
    ///
    /// # Example
    /// ```
    /// let n = provenance_core::naming::Naming::unnamed("no framework grains counted");
    /// assert!(n.name().is_none() && n.poles.is_none());
    /// ```
    pub fn unnamed(reason: impl Into<String>) -> Naming {
        Naming {
            verdict: Verdict::unnamed(reason),
            subtype: None,
            poles: None,
            measures: Vec::new(),
        }
    }

    /// The name, if any.
    pub fn name(&self) -> Option<&str> {
        self.verdict.name()
    }

    /// The second-level name, if any.
    pub fn subtype_name(&self) -> Option<&str> {
        self.subtype.as_ref().and_then(Verdict::name)
    }

    /// The measure with this symbol.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Framework, Sample};
    /// use provenance_core::naming::{Folk, NamingScheme};
    /// let s = Sample::counted("A", Framework { qm: 100.0, p: 60.0, lv: 40.0, ..Default::default() });
    /// assert_eq!(Folk::default().classify(&s).measure("F/R").unwrap().value, Some(1.5));
    /// ```
    pub fn measure(&self, symbol: &str) -> Option<&Measure> {
        self.measures.iter().find(|m| m.symbol == symbol)
    }
}

/// Keys a scheme id may not take, because the names table uses them.
const RESERVED_IDS: [&str; 4] = ["sample", "basis", "metadata", "line"];

/// The schemes a names table applies, in output order.
///
/// # Example
/// ```
/// use provenance_core::naming::{ChertPlacement, SchemeSet};
/// let mut set = SchemeSet::standard();
/// assert_eq!(set.ids(), ["folk", "garzanti", "pettijohn"]);
/// set.apply_chert_option("garzanti=lithic").unwrap();
/// assert_eq!(set.get("garzanti").unwrap().chert(), Some(ChertPlacement::Lithic));
/// assert!(set.apply_chert_option("dott=quartz").is_err());
/// ```
#[derive(Default)]
pub struct SchemeSet {
    schemes: Vec<Box<dyn NamingScheme>>,
}

impl SchemeSet {
    /// No schemes yet.
    pub fn new() -> SchemeSet {
        SchemeSet::default()
    }

    /// Folk (1980), Garzanti (2019) and Pettijohn, Potter & Siever (1987), with their
    /// documented defaults.
    pub fn standard() -> SchemeSet {
        SchemeSet {
            schemes: vec![
                Box::new(Folk::default()),
                Box::new(Garzanti::default()),
                Box::new(Pettijohn::default()),
            ],
        }
    }

    /// Add a scheme; refuses an id already used, a reserved key or one that is not
    /// lower-case letters, digits and underscores.
    ///
    /// # Example
    /// ```
    /// use provenance_core::naming::{Folk, SchemeSet};
    /// let mut set = SchemeSet::new();
    /// set.push(Box::new(Folk::default())).unwrap();
    /// assert!(set.push(Box::new(Folk::default())).is_err());
    /// ```
    pub fn push(&mut self, scheme: Box<dyn NamingScheme>) -> Result<()> {
        let id = scheme.id();
        let well_formed = !id.is_empty()
            && id
                .bytes()
                .all(|b| b.is_ascii_lowercase() || b.is_ascii_digit() || b == b'_');
        if !well_formed || RESERVED_IDS.contains(&id) || self.get(id).is_some() {
            return Err(Error::Usage {
                message: format!(
                    "naming scheme id {id:?} is reserved, malformed or already used; expected a new id of lower-case letters, digits and underscores"
                ),
            });
        }
        self.schemes.push(scheme);
        Ok(())
    }

    /// The schemes, in order.
    pub fn iter(&self) -> impl Iterator<Item = &dyn NamingScheme> {
        self.schemes.iter().map(|s| s.as_ref())
    }

    /// The ids, in order.
    pub fn ids(&self) -> Vec<&'static str> {
        self.iter().map(|s| s.id()).collect()
    }

    /// The scheme with this id.
    pub fn get(&self, id: &str) -> Option<&dyn NamingScheme> {
        self.iter().find(|s| s.id() == id)
    }

    /// Put chert elsewhere in one scheme.
    ///
    /// # Example
    /// ```
    /// use provenance_core::naming::{ChertPlacement, SchemeSet};
    /// let mut set = SchemeSet::standard();
    /// set.place_chert("folk", ChertPlacement::Quartz).unwrap();
    /// assert_eq!(set.get("folk").unwrap().chert(), Some(ChertPlacement::Quartz));
    /// ```
    pub fn place_chert(&mut self, id: &str, placement: ChertPlacement) -> Result<()> {
        let known = self.ids().join(", ");
        let scheme = self
            .schemes
            .iter_mut()
            .find(|s| s.id() == id)
            .ok_or_else(|| Error::Usage {
                message: format!("--chert {id}={placement}: unknown naming scheme {id:?}, expected one of {known}"),
            })?;
        if scheme.place_chert(placement) {
            Ok(())
        } else {
            Err(Error::Usage {
                message: format!(
                    "--chert {id}={placement}: the {id} scheme has no chert placement to choose"
                ),
            })
        }
    }

    /// Apply a `SCHEME=WHERE` option (`garzanti=lithic`), WHERE being quartz, lithic or omit.
    pub fn apply_chert_option(&mut self, spec: &str) -> Result<()> {
        let usage = |why: String| Error::Usage {
            message: format!("--chert {spec}: {why}"),
        };
        let (id, place) = spec
            .split_once('=')
            .ok_or_else(|| usage("expected SCHEME=WHERE, such as garzanti=lithic".into()))?;
        let placement: ChertPlacement = place.parse().map_err(usage)?;
        self.place_chert(id.trim(), placement)
    }

    /// Every scheme's naming of one sample, in order.
    pub fn classify(&self, sample: &Sample) -> Vec<Naming> {
        self.iter().map(|s| s.classify(sample)).collect()
    }
}
