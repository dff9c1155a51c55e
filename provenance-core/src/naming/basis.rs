//! What a name rests on: the poles a scheme recalculated (with the categories in each), the
//! extra quantities it compared, and where chert was put.

use crate::composition::Composition3;
use crate::counts::{Category, Framework};
use serde::{Deserialize, Serialize};
use std::fmt;

/// A set of point-count categories, such as the categories summed into one pole.
///
/// # Example
/// ```
/// use provenance_core::counts::{Category, Framework};
/// use provenance_core::naming::CategorySet;
/// let q = CategorySet::of(&[Category::Qm, Category::Qp]);
/// assert!(q.contains(Category::Qp) && !q.contains(Category::C));
/// assert_eq!(q.to_string(), "Qm + Qp");
/// let f = Framework { qm: 200.0, qp: 10.0, c: 5.0, ..Default::default() };
/// assert_eq!(q.sum(&f), 210.0);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Default)]
pub struct CategorySet(u16);

impl CategorySet {
    /// The empty set.
    pub const EMPTY: CategorySet = CategorySet(0);

    /// The set of the given categories.
    pub fn of(categories: &[Category]) -> CategorySet {
        categories
            .iter()
            .fold(CategorySet::EMPTY, |s, c| s.with(*c))
    }

    /// This set plus one category.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::Category;
    /// use provenance_core::naming::CategorySet;
    /// assert!(CategorySet::EMPTY.with(Category::C).contains(Category::C));
    /// ```
    pub fn with(self, c: Category) -> CategorySet {
        CategorySet(self.0 | 1 << c.index())
    }

    /// True when `c` is in the set.
    pub fn contains(self, c: Category) -> bool {
        self.0 & (1 << c.index()) != 0
    }

    /// True when the set is empty.
    ///
    /// # Example
    /// ```
    /// assert!(provenance_core::naming::CategorySet::EMPTY.is_empty());
    /// ```
    pub fn is_empty(self) -> bool {
        self.0 == 0
    }

    /// The categories, in [`Category::ALL`] order.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::Category;
    /// use provenance_core::naming::CategorySet;
    /// let s = CategorySet::of(&[Category::Lm, Category::Lv]);
    /// assert_eq!(s.iter().collect::<Vec<_>>(), [Category::Lv, Category::Lm]);
    /// ```
    pub fn iter(self) -> impl Iterator<Item = Category> {
        Category::ALL.into_iter().filter(move |c| self.contains(*c))
    }

    /// The summed framework amounts of the set (non-framework categories add nothing).
    pub fn sum(self, f: &Framework) -> f64 {
        self.iter().map(|c| f.get(c)).sum()
    }
}

impl fmt::Display for CategorySet {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if self.is_empty() {
            return f.write_str("nothing");
        }
        for (i, c) in self.iter().enumerate() {
            if i > 0 {
                f.write_str(" + ")?;
            }
            f.write_str(c.symbol())?;
        }
        Ok(())
    }
}

/// One recalculated pole of a naming triangle.
///
/// # Example
/// ```
/// use provenance_core::counts::Framework;
/// use provenance_core::naming::{ChertPlacement, Poles};
/// let f = Framework { qm: 80.0, c: 20.0, p: 50.0, lv: 50.0, ..Default::default() };
/// let poles = Poles::qfr(["Q", "F", "R"], ChertPlacement::Lithic, &f).unwrap();
/// let r = poles.get("R").unwrap();
/// assert_eq!((r.amount, r.percent), (70.0, 35.0));
/// assert_eq!(r.categories.to_string(), "C + Lv + Ls + Lm");
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Pole {
    /// The pole's symbol, as the scheme writes it (`Q`, `F`, `R`, `L`).
    pub symbol: &'static str,
    /// The categories summed into the pole.
    pub categories: CategorySet,
    /// The summed amount, in the sample's basis (points, estimated points or percent).
    pub amount: f64,
    /// The pole as percent of the three poles.
    pub percent: f64,
}

/// The three poles of a naming triangle, recalculated to 100.
///
/// # Example
/// ```
/// use provenance_core::counts::{Category, Framework};
/// use provenance_core::naming::{CategorySet, Poles};
/// let f = Framework { qm: 60.0, p: 30.0, lm: 10.0, ..Default::default() };
/// let sets = [
///     CategorySet::of(&[Category::Qm]),
///     CategorySet::of(&[Category::P, Category::K]),
///     CategorySet::of(&[Category::Lm]),
/// ];
/// let p = Poles::new(["Q", "F", "R"], sets, &f).unwrap();
/// assert_eq!(p.percents(), [60.0, 30.0, 10.0]);
/// assert_eq!(p.total(), 100.0);
/// assert!(Poles::new(["Q", "F", "R"], sets, &Framework::default()).is_none());
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Poles {
    /// The poles, in the scheme's order.
    pub parts: [Pole; 3],
}

impl Poles {
    /// Sum each set over the framework and close to 100; `None` when the poles hold no grains.
    pub fn new(symbols: [&'static str; 3], sets: [CategorySet; 3], f: &Framework) -> Option<Poles> {
        let amounts = sets.map(|s| s.sum(f));
        let closed = Composition3::close(amounts)?;
        let mut i = 0;
        let parts = symbols.map(|symbol| {
            let p = Pole {
                symbol,
                categories: sets[i],
                amount: amounts[i],
                percent: closed.part(i),
            };
            i += 1;
            p
        });
        Some(Poles { parts })
    }

    /// Quartz, feldspar and rock-fragment poles with chert placed as asked: Q = Qm + Qp
    /// (+ C), F = P + K, R = Lv + Ls + Lm (+ C). `symbols` names the three poles.
    pub fn qfr(symbols: [&'static str; 3], chert: ChertPlacement, f: &Framework) -> Option<Poles> {
        Poles::new(symbols, qfr_sets(chert), f)
    }

    /// The pole with this symbol.
    pub fn get(&self, symbol: &str) -> Option<&Pole> {
        self.parts.iter().find(|p| p.symbol == symbol)
    }

    /// The three amounts, in pole order.
    pub fn amounts(&self) -> [f64; 3] {
        self.parts.map(|p| p.amount)
    }

    /// The three percentages, in pole order.
    pub fn percents(&self) -> [f64; 3] {
        self.parts.map(|p| p.percent)
    }

    /// The summed amount of the three poles.
    pub fn total(&self) -> f64 {
        self.amounts().iter().sum()
    }
}

/// The category sets of a quartz-feldspar-rock fragment triangle with chert placed as asked.
///
/// # Example
/// ```
/// use provenance_core::counts::Category;
/// use provenance_core::naming::{basis::qfr_sets, ChertPlacement};
/// let [q, _, r] = qfr_sets(ChertPlacement::Quartz);
/// assert!(q.contains(Category::C) && !r.contains(Category::C));
/// let [q, _, r] = qfr_sets(ChertPlacement::Omit);
/// assert!(!q.contains(Category::C) && !r.contains(Category::C));
/// ```
pub fn qfr_sets(chert: ChertPlacement) -> [CategorySet; 3] {
    let q = CategorySet::of(&[Category::Qm, Category::Qp]);
    let f = CategorySet::of(&[Category::P, Category::K]);
    let r = CategorySet::of(&[Category::Lv, Category::Ls, Category::Lm]);
    match chert {
        ChertPlacement::Quartz => [q.with(Category::C), f, r],
        ChertPlacement::Lithic => [q, f, r.with(Category::C)],
        ChertPlacement::Omit => [q, f, r],
    }
}

/// Which pole chert (`C`) joins in a naming triangle.
///
/// Schemes differ: Folk (1980) counts chert with the rock fragments; Dickinson's (1985) QFL
/// counts it with quartz. Each scheme documents its default.
///
/// # Example
/// ```
/// use provenance_core::naming::ChertPlacement;
/// assert_eq!("lithic".parse::<ChertPlacement>(), Ok(ChertPlacement::Lithic));
/// assert_eq!(ChertPlacement::Quartz.to_string(), "quartz");
/// assert!("rock".parse::<ChertPlacement>().is_err());
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum ChertPlacement {
    /// With quartz (Q).
    Quartz,
    /// With the rock or lithic fragments (R or L).
    Lithic,
    /// Left out of the triangle.
    Omit,
}

impl fmt::Display for ChertPlacement {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            ChertPlacement::Quartz => "quartz",
            ChertPlacement::Lithic => "lithic",
            ChertPlacement::Omit => "omit",
        })
    }
}

impl std::str::FromStr for ChertPlacement {
    type Err = String;
    fn from_str(s: &str) -> Result<Self, Self::Err> {
        match s.trim().to_ascii_lowercase().as_str() {
            "quartz" => Ok(ChertPlacement::Quartz),
            "lithic" => Ok(ChertPlacement::Lithic),
            "omit" => Ok(ChertPlacement::Omit),
            _ => Err(format!(
                "unknown chert placement {s:?}, expected quartz, lithic or omit"
            )),
        }
    }
}

/// How a [`Measure`] is expressed.
///
/// # Example
/// ```
/// use provenance_core::naming::Unit;
/// assert_ne!(Unit::Percent, Unit::Ratio);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Unit {
    /// Percent.
    Percent,
    /// A plain ratio.
    Ratio,
}

/// A quantity, other than the poles, that a scheme compared to reach its name.
///
/// # Example
/// ```
/// use provenance_core::naming::{Measure, Unit};
/// let m = Measure::ratio("F/R", 20.0, 10.0, "feldspar over rock fragments");
/// assert_eq!(m.value, Some(2.0));
/// assert_eq!(Measure::ratio("F/R", 5.0, 0.0, "").value, None);
/// assert_eq!(m.unit, Unit::Ratio);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Measure {
    /// Its symbol (`F/R`, `matrix`).
    pub symbol: &'static str,
    /// Its value; `None` when undefined (a zero denominator, a category not counted).
    pub value: Option<f64>,
    /// Percent or ratio.
    pub unit: Unit,
    /// What it is, in words.
    pub meaning: &'static str,
}

impl Measure {
    /// `num / den`; undefined when `den` is not above zero.
    pub fn ratio(symbol: &'static str, num: f64, den: f64, meaning: &'static str) -> Measure {
        Measure {
            symbol,
            value: (den > 0.0).then(|| num / den),
            unit: Unit::Ratio,
            meaning,
        }
    }

    /// A percentage, possibly undefined.
    ///
    /// # Example
    /// ```
    /// let m = provenance_core::naming::Measure::percent("matrix", Some(12.5), "matrix");
    /// assert_eq!(m.value, Some(12.5));
    /// ```
    pub fn percent(symbol: &'static str, value: Option<f64>, meaning: &'static str) -> Measure {
        Measure {
            symbol,
            value,
            unit: Unit::Percent,
            meaning,
        }
    }
}
