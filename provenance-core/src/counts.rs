//! Point counts of one thin section, by Gazzi-Dickinson category.
//!
//! Symbols follow Dickinson & Suczek (1979, AAPG Bull. 63:2164-2182) and Dickinson (1985):
//! Qm monocrystalline quartz, Qp polycrystalline quartz (here without chert), C chert,
//! P plagioclase, K K-feldspar, Lv / Ls / Lm volcanic, sedimentary and metamorphic aphanitic
//! lithic fragments. Under Gazzi-Dickinson counting (Ingersoll et al. 1984, J. Sed. Petrol.
//! 54:103-116) a sand-size crystal inside a rock fragment counts as that mineral.

use serde::{Deserialize, Serialize};

/// A category a count column can feed.
///
/// # Example
/// ```
/// use provenance_core::counts::Category;
/// assert_eq!(Category::from_name("lv"), Some(Category::Lv));
/// assert_eq!(Category::Lv.symbol(), "Lv");
/// assert!(Category::Lv.is_framework());
/// assert!(!Category::Matrix.is_framework());
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
pub enum Category {
    /// Monocrystalline quartz.
    Qm,
    /// Polycrystalline quartz other than chert.
    Qp,
    /// Chert.
    C,
    /// Plagioclase.
    P,
    /// K-feldspar.
    K,
    /// Volcanic (and metavolcanic) aphanitic lithic fragments.
    Lv,
    /// Sedimentary aphanitic lithic fragments.
    Ls,
    /// Metamorphic aphanitic lithic fragments.
    Lm,
    /// Matrix (material finer than sand between framework grains).
    Matrix,
    /// Cement.
    Cement,
    /// Pore space.
    Pores,
    /// Micas.
    Mica,
    /// Dense (heavy) minerals.
    Dense,
    /// Anything else counted.
    Other,
}

impl Category {
    /// Every category, framework first, in the order of [`Framework`]'s fields.
    pub const ALL: [Category; 14] = [
        Category::Qm,
        Category::Qp,
        Category::C,
        Category::P,
        Category::K,
        Category::Lv,
        Category::Ls,
        Category::Lm,
        Category::Matrix,
        Category::Cement,
        Category::Pores,
        Category::Mica,
        Category::Dense,
        Category::Other,
    ];

    /// The symbol or word used in headers and outputs.
    ///
    /// # Example
    /// ```
    /// assert_eq!(provenance_core::counts::Category::Dense.symbol(), "dense");
    /// ```
    pub fn symbol(self) -> &'static str {
        match self {
            Category::Qm => "Qm",
            Category::Qp => "Qp",
            Category::C => "C",
            Category::P => "P",
            Category::K => "K",
            Category::Lv => "Lv",
            Category::Ls => "Ls",
            Category::Lm => "Lm",
            Category::Matrix => "matrix",
            Category::Cement => "cement",
            Category::Pores => "pores",
            Category::Mica => "mica",
            Category::Dense => "dense",
            Category::Other => "other",
        }
    }

    /// The category whose symbol matches `name`, ignoring case, spaces, underscores and hyphens.
    /// Chert is also found by its name, `chert`, the header labs give it beside the symbol `C`
    /// (common practice).
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::Category;
    /// assert_eq!(Category::from_name(" Q_m "), Some(Category::Qm));
    /// assert_eq!(Category::from_name("Chert"), Some(Category::C));
    /// assert_eq!(Category::from_name("quartz"), None);
    /// ```
    pub fn from_name(name: &str) -> Option<Category> {
        let key = normalize_header(name);
        if key == "chert" {
            return Some(Category::C);
        }
        Category::ALL
            .into_iter()
            .find(|c| normalize_header(c.symbol()) == key)
    }

    /// True for the eight framework categories.
    pub fn is_framework(self) -> bool {
        (self as usize) < 8
    }

    /// Position in [`Category::ALL`].
    pub fn index(self) -> usize {
        self as usize
    }
}

/// Header matching key: lower case, with spaces, underscores and hyphens removed.
///
/// # Example
/// ```
/// assert_eq!(provenance_core::counts::normalize_header(" Lv_felsitic "), "lvfelsitic");
/// ```
pub fn normalize_header(name: &str) -> String {
    name.chars()
        .filter(|c| !c.is_whitespace() && *c != '_' && *c != '-')
        .flat_map(char::to_lowercase)
        .collect()
}

/// Framework grain amounts of one sample.
///
/// In counts mode these are points; in percent mode with a known number of points they are
/// points estimated from the percentages; otherwise they are the percentages themselves
/// (see [`Counting`]).
///
/// # Example
/// ```
/// use provenance_core::counts::Framework;
/// let f = Framework { qm: 200.0, qp: 10.0, c: 5.0, p: 40.0, k: 25.0, lv: 10.0, ls: 6.0, lm: 4.0 };
/// assert_eq!(f.total(), 300.0);
/// assert_eq!(f.quartz(), 215.0);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
pub struct Framework {
    /// Monocrystalline quartz.
    pub qm: f64,
    /// Polycrystalline quartz other than chert.
    pub qp: f64,
    /// Chert.
    pub c: f64,
    /// Plagioclase.
    pub p: f64,
    /// K-feldspar.
    pub k: f64,
    /// Volcanic lithic fragments.
    pub lv: f64,
    /// Sedimentary lithic fragments.
    pub ls: f64,
    /// Metamorphic lithic fragments.
    pub lm: f64,
}

impl Framework {
    /// Sum of all framework grains.
    pub fn total(&self) -> f64 {
        self.qm + self.qp + self.c + self.p + self.k + self.lv + self.ls + self.lm
    }

    /// Total quartzose grains, Q = Qm + Qp + C (Dickinson 1985).
    pub fn quartz(&self) -> f64 {
        self.qm + self.qp + self.c
    }

    /// Polycrystalline quartzose grains including chert (Dickinson & Suczek 1979's Qp).
    pub fn polycrystalline(&self) -> f64 {
        self.qp + self.c
    }

    /// Feldspar, F = P + K.
    pub fn feldspar(&self) -> f64 {
        self.p + self.k
    }

    /// Unstable lithic fragments, L = Lv + Ls + Lm.
    pub fn lithics(&self) -> f64 {
        self.lv + self.ls + self.lm
    }

    /// Total lithic fragments, Lt = L + Qp + C.
    pub fn total_lithics(&self) -> f64 {
        self.lithics() + self.polycrystalline()
    }

    /// The amount of one framework category; 0 for non-framework categories.
    ///
    /// # Example
    /// ```
    /// use provenance_core::counts::{Category, Framework};
    /// let f = Framework { lv: 3.0, ..Default::default() };
    /// assert_eq!(f.get(Category::Lv), 3.0);
    /// ```
    pub fn get(&self, c: Category) -> f64 {
        match c {
            Category::Qm => self.qm,
            Category::Qp => self.qp,
            Category::C => self.c,
            Category::P => self.p,
            Category::K => self.k,
            Category::Lv => self.lv,
            Category::Ls => self.ls,
            Category::Lm => self.lm,
            _ => 0.0,
        }
    }

    /// Every amount multiplied by `factor`.
    pub fn scaled(&self, factor: f64) -> Framework {
        Framework {
            qm: self.qm * factor,
            qp: self.qp * factor,
            c: self.c * factor,
            p: self.p * factor,
            k: self.k * factor,
            lv: self.lv * factor,
            ls: self.ls * factor,
            lm: self.lm * factor,
        }
    }

    pub(crate) fn add(&mut self, c: Category, v: f64) {
        match c {
            Category::Qm => self.qm += v,
            Category::Qp => self.qp += v,
            Category::C => self.c += v,
            Category::P => self.p += v,
            Category::K => self.k += v,
            Category::Lv => self.lv += v,
            Category::Ls => self.ls += v,
            Category::Lm => self.lm += v,
            _ => {}
        }
    }
}

/// Non-framework amounts; `None` when the column was not in the table.
///
/// # Example
/// ```
/// use provenance_core::counts::NonFramework;
/// let n = NonFramework { matrix: Some(30.0), ..Default::default() };
/// assert_eq!(n.matrix, Some(30.0));
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
pub struct NonFramework {
    /// Matrix.
    pub matrix: Option<f64>,
    /// Cement.
    pub cement: Option<f64>,
    /// Pores.
    pub pores: Option<f64>,
    /// Micas.
    pub mica: Option<f64>,
    /// Dense minerals.
    pub dense: Option<f64>,
    /// Other.
    pub other: Option<f64>,
}

impl NonFramework {
    pub(crate) fn add(&mut self, c: Category, v: f64) {
        let slot = match c {
            Category::Matrix => &mut self.matrix,
            Category::Cement => &mut self.cement,
            Category::Pores => &mut self.pores,
            Category::Mica => &mut self.mica,
            Category::Dense => &mut self.dense,
            Category::Other => &mut self.other,
            _ => return,
        };
        *slot = Some(slot.unwrap_or(0.0) + v);
    }

    /// Every present amount multiplied by `factor`.
    pub fn scaled(&self, factor: f64) -> NonFramework {
        let s = |o: Option<f64>| o.map(|v| v * factor);
        NonFramework {
            matrix: s(self.matrix),
            cement: s(self.cement),
            pores: s(self.pores),
            mica: s(self.mica),
            dense: s(self.dense),
            other: s(self.other),
        }
    }
}

/// How the amounts of a sample relate to points counted.
///
/// # Example
/// ```
/// use provenance_core::counts::Counting;
/// assert!(Counting::Counted.has_points());
/// assert!(!Counting::Unknown.has_points());
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Counting {
    /// Amounts are whole points counted.
    Counted,
    /// Amounts are points estimated from published percentages and the stated number of points.
    FromPercent {
        /// The stated number of points the percentages refer to.
        points: f64,
    },
    /// Amounts are percentages and the number of points is not known: no counting statistics.
    Unknown,
}

impl Counting {
    /// True when amounts are (possibly estimated) points, so counting statistics apply.
    pub fn has_points(&self) -> bool {
        !matches!(self, Counting::Unknown)
    }
}

/// One thin section: id, amounts and the metadata carried through untouched.
///
/// # Example
/// ```
/// use provenance_core::counts::{Counting, Framework, NonFramework, Sample};
/// let s = Sample::counted("KR-01", Framework { qm: 300.0, ..Default::default() });
/// assert_eq!(s.counting, Counting::Counted);
/// assert_eq!(s.framework.total(), 300.0);
/// ```
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Sample {
    /// The sample id.
    pub id: String,
    /// The 1-based line of the row in its file (0 when built in code).
    pub line: u64,
    /// Framework amounts.
    pub framework: Framework,
    /// Non-framework amounts.
    pub other: NonFramework,
    /// How amounts relate to points.
    pub counting: Counting,
    /// Metadata values, in the order of the reader's metadata columns.
    pub metadata: Vec<String>,
}

impl Sample {
    /// A counted sample with no non-framework counts and no metadata.
    pub fn counted(id: impl Into<String>, framework: Framework) -> Sample {
        Sample {
            id: id.into(),
            line: 0,
            framework,
            other: NonFramework::default(),
            counting: Counting::Counted,
            metadata: Vec::new(),
        }
    }
}
