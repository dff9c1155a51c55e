//! The five ternary diagrams of detrital modes and how each recalculates a framework.

use crate::counts::Framework;
use serde::{Deserialize, Serialize};
use std::fmt;

/// A ternary diagram of recalculated detrital modes.
///
/// Pole definitions:
/// - `Qfl`: Q = Qm + Qp + C, F = P + K, L = Lv + Ls + Lm (Dickinson 1985).
/// - `Qmflt`: Qm, F, Lt = Qp + C + Lv + Ls + Lm (Dickinson 1985).
/// - `Qmpk`: Qm, P, K (Dickinson & Suczek 1979).
/// - `Qplvlsm`: Qp = Qp + C (all polycrystalline quartzose grains), Lv, Lsm = Ls + Lm
///   (Dickinson & Suczek 1979).
/// - `Lmlvls`: Lm, Lv, Ls (Ingersoll & Suczek 1979, J. Sed. Petrol. 49:1217-1228).
///
/// # Example
/// ```
/// use provenance_core::diagram::Diagram;
/// use provenance_core::counts::Framework;
/// let f = Framework { qm: 60.0, qp: 5.0, c: 5.0, p: 10.0, k: 10.0, lv: 4.0, ls: 3.0, lm: 3.0 };
/// assert_eq!(Diagram::Qfl.pole_amounts(&f), [70.0, 20.0, 10.0]);
/// assert_eq!(Diagram::Qmflt.pole_amounts(&f), [60.0, 20.0, 20.0]);
/// assert_eq!(Diagram::Qfl.poles(), ["Q", "F", "L"]);
/// assert_eq!("qmflt".parse::<Diagram>().unwrap(), Diagram::Qmflt);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum Diagram {
    /// Q-F-L.
    Qfl,
    /// Qm-F-Lt.
    Qmflt,
    /// Qm-P-K.
    Qmpk,
    /// Qp-Lv-Lsm.
    Qplvlsm,
    /// Lm-Lv-Ls.
    Lmlvls,
}

impl Diagram {
    /// All five, in the order outputs list them.
    pub const ALL: [Diagram; 5] = [
        Diagram::Qfl,
        Diagram::Qmflt,
        Diagram::Qmpk,
        Diagram::Qplvlsm,
        Diagram::Lmlvls,
    ];

    /// The lower-case id used on the command line and as JSON key.
    pub fn id(self) -> &'static str {
        match self {
            Diagram::Qfl => "qfl",
            Diagram::Qmflt => "qmflt",
            Diagram::Qmpk => "qmpk",
            Diagram::Qplvlsm => "qplvlsm",
            Diagram::Lmlvls => "lmlvls",
        }
    }

    /// The diagram's name in trade notation, for captions and headings.
    ///
    /// # Example
    /// ```
    /// assert_eq!(provenance_core::diagram::Diagram::Qmflt.label(), "QmFLt");
    /// ```
    pub fn label(self) -> &'static str {
        match self {
            Diagram::Qfl => "QFL",
            Diagram::Qmflt => "QmFLt",
            Diagram::Qmpk => "QmPK",
            Diagram::Qplvlsm => "QpLvLsm",
            Diagram::Lmlvls => "LmLvLs",
        }
    }

    /// Pole symbols in trade notation, in the order of every three-part value.
    pub fn poles(self) -> [&'static str; 3] {
        match self {
            Diagram::Qfl => ["Q", "F", "L"],
            Diagram::Qmflt => ["Qm", "F", "Lt"],
            Diagram::Qmpk => ["Qm", "P", "K"],
            Diagram::Qplvlsm => ["Qp", "Lv", "Lsm"],
            Diagram::Lmlvls => ["Lm", "Lv", "Ls"],
        }
    }

    /// The publication that defines the diagram's poles.
    ///
    /// # Example
    /// ```
    /// assert!(provenance_core::diagram::Diagram::Lmlvls.source().contains("Ingersoll"));
    /// ```
    pub fn source(self) -> &'static str {
        match self {
            Diagram::Qfl | Diagram::Qmflt => {
                "Dickinson (1985), in Zuffa (ed.) Provenance of Arenites, 333-361"
            }
            Diagram::Qmpk | Diagram::Qplvlsm => {
                "Dickinson & Suczek (1979), AAPG Bulletin 63:2164-2182"
            }
            Diagram::Lmlvls => "Ingersoll & Suczek (1979), J. Sed. Petrol. 49:1217-1228",
        }
    }

    /// The three pole amounts of a framework, in pole order.
    pub fn pole_amounts(self, f: &Framework) -> [f64; 3] {
        match self {
            Diagram::Qfl => [f.quartz(), f.feldspar(), f.lithics()],
            Diagram::Qmflt => [f.qm, f.feldspar(), f.total_lithics()],
            Diagram::Qmpk => [f.qm, f.p, f.k],
            Diagram::Qplvlsm => [f.polycrystalline(), f.lv, f.ls + f.lm],
            Diagram::Lmlvls => [f.lm, f.lv, f.ls],
        }
    }

    /// Position in [`Diagram::ALL`].
    pub fn index(self) -> usize {
        self as usize
    }
}

impl fmt::Display for Diagram {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.id())
    }
}

impl std::str::FromStr for Diagram {
    type Err = String;

    fn from_str(s: &str) -> Result<Self, Self::Err> {
        let key = s.trim().to_ascii_lowercase();
        Diagram::ALL
            .into_iter()
            .find(|d| d.id() == key)
            .ok_or_else(|| {
                format!("unknown diagram {s:?}, expected one of qfl, qmflt, qmpk, qplvlsm, lmlvls")
            })
    }
}
