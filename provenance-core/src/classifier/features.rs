//! Classifier features: ilr coordinates of a diagram's composition or of the framework.

use crate::counts::{Counting, Framework, Sample};
use crate::diagram::Diagram;
use crate::logratio::{delta_for_points, ilr, replace_zeros};
use serde::{Deserialize, Serialize};

/// Parts of the seven-part framework composition: Qm, Qp + C, P, K, Lv, Ls, Lm.
pub const FRAMEWORK_PARTS: [&str; 7] = ["Qm", "Qp+C", "P", "K", "Lv", "Ls", "Lm"];

/// Which composition a classifier reads.
///
/// # Example
/// ```
/// use provenance_core::classifier::FeatureSpace;
/// use provenance_core::diagram::Diagram;
/// assert_eq!("framework".parse::<FeatureSpace>().unwrap(), FeatureSpace::Framework);
/// assert_eq!("qfl".parse::<FeatureSpace>().unwrap(), FeatureSpace::Diagram(Diagram::Qfl));
/// assert_eq!(FeatureSpace::Framework.dimension(), 6);
/// assert_eq!(FeatureSpace::Diagram(Diagram::Qmflt).parts(), ["Qm", "F", "Lt"]);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(try_from = "String", into = "String")]
pub enum FeatureSpace {
    /// The three poles of one diagram.
    Diagram(Diagram),
    /// The seven-part framework (Qm, Qp + C, P, K, Lv, Ls, Lm), all the evidence at once.
    Framework,
}

impl FeatureSpace {
    /// The id used on the command line and in model files.
    pub fn id(&self) -> &'static str {
        match self {
            FeatureSpace::Diagram(d) => d.id(),
            FeatureSpace::Framework => "framework",
        }
    }

    /// Names of the composition's parts.
    pub fn parts(&self) -> Vec<&'static str> {
        match self {
            FeatureSpace::Diagram(d) => d.poles().to_vec(),
            FeatureSpace::Framework => FRAMEWORK_PARTS.to_vec(),
        }
    }

    /// Number of ilr coordinates (parts − 1).
    pub fn dimension(&self) -> usize {
        match self {
            FeatureSpace::Diagram(_) => 2,
            FeatureSpace::Framework => 6,
        }
    }

    /// Names of the features: `ilr1`, `ilr2`, ….
    pub fn feature_names(&self) -> Vec<String> {
        (1..=self.dimension()).map(|i| format!("ilr{i}")).collect()
    }

    /// The composition's amounts from a framework, in [`FeatureSpace::parts`] order.
    ///
    /// # Example
    /// ```
    /// use provenance_core::classifier::FeatureSpace;
    /// use provenance_core::counts::Framework;
    /// let f = Framework { qm: 50.0, qp: 3.0, c: 2.0, p: 20.0, k: 5.0, lv: 10.0, ls: 6.0, lm: 4.0 };
    /// assert_eq!(FeatureSpace::Framework.amounts(&f), [50.0, 5.0, 20.0, 5.0, 10.0, 6.0, 4.0]);
    /// ```
    pub fn amounts(&self, f: &Framework) -> Vec<f64> {
        match self {
            FeatureSpace::Diagram(d) => d.pole_amounts(f).to_vec(),
            FeatureSpace::Framework => {
                vec![f.qm, f.polycrystalline(), f.p, f.k, f.lv, f.ls, f.lm]
            }
        }
    }

    /// The features of a sample: zeros replaced multiplicatively with δ = 0.65/n, n the points
    /// in the composition (Martín-Fernández et al. 2003; see [`crate::logratio`]), then ilr.
    /// A composition without zeros keeps its values.
    ///
    /// # Example
    /// ```
    /// use provenance_core::classifier::{FeatureSpace, FeatureProblem};
    /// use provenance_core::counts::{Counting, Framework, Sample};
    /// use provenance_core::diagram::Diagram;
    /// let s = Sample::counted("a", Framework { qm: 200.0, p: 100.0, ..Default::default() });
    /// let z = FeatureSpace::Diagram(Diagram::Qfl).features(&s).unwrap();
    /// // L = 0 becomes δ = 0.65/300; Q/F stays 2.
    /// assert!((z[0] - 2f64.ln() / 2f64.sqrt()).abs() < 1e-12);
    /// let mut pct = s.clone();
    /// pct.counting = Counting::Unknown;
    /// assert_eq!(FeatureSpace::Diagram(Diagram::Qfl).features(&pct), Err(FeatureProblem::ZeroWithoutPoints));
    /// ```
    pub fn features(&self, sample: &Sample) -> Result<Vec<f64>, FeatureProblem> {
        self.features_of(&self.amounts(&sample.framework), sample.counting)
    }

    /// The features of amounts in [`FeatureSpace::parts`] order (see [`FeatureSpace::features`]).
    pub fn features_of(
        &self,
        amounts: &[f64],
        counting: Counting,
    ) -> Result<Vec<f64>, FeatureProblem> {
        let n: f64 = amounts.iter().sum();
        if n.is_nan() || n <= 0.0 {
            return Err(FeatureProblem::NoPoints);
        }
        let has_zero = amounts.contains(&0.0);
        let x = if has_zero {
            if !counting.has_points() {
                return Err(FeatureProblem::ZeroWithoutPoints);
            }
            replace_zeros(amounts, delta_for_points(n)).ok_or(FeatureProblem::NoPoints)?
        } else {
            amounts.to_vec()
        };
        Ok(ilr(&x))
    }
}

/// Why a sample has no features.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum FeatureProblem {
    /// The composition has no grains.
    NoPoints,
    /// A part is zero and the number of points is unknown, so δ = 0.65/n cannot be set.
    ZeroWithoutPoints,
}

impl FeatureProblem {
    /// The problem in words, for messages.
    ///
    /// # Example
    /// ```
    /// assert!(provenance_core::classifier::FeatureProblem::NoPoints.describe().contains("no grains"));
    /// ```
    pub fn describe(&self) -> &'static str {
        match self {
            FeatureProblem::NoPoints => "the composition has no grains",
            FeatureProblem::ZeroWithoutPoints => {
                "a part is zero and the number of points is unknown, so the zero cannot be replaced (δ = 0.65/n)"
            }
        }
    }
}

impl std::str::FromStr for FeatureSpace {
    type Err = String;
    fn from_str(s: &str) -> Result<Self, Self::Err> {
        if s.trim().eq_ignore_ascii_case("framework") {
            return Ok(FeatureSpace::Framework);
        }
        s.parse::<Diagram>().map(FeatureSpace::Diagram).map_err(|_| {
            format!("unknown composition {s:?}, expected one of qfl, qmflt, qmpk, qplvlsm, lmlvls, framework")
        })
    }
}

impl TryFrom<String> for FeatureSpace {
    type Error = String;
    fn try_from(s: String) -> Result<Self, Self::Error> {
        s.parse()
    }
}

impl From<FeatureSpace> for String {
    fn from(f: FeatureSpace) -> String {
        f.id().to_string()
    }
}

impl std::fmt::Display for FeatureSpace {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.id())
    }
}
