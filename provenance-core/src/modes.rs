//! Recalculated detrital modes: each diagram's pole percentages with counting error, and the
//! ratios practitioners report.

use crate::composition::Composition3;
use crate::counts::{Counting, Sample};
use crate::diagram::Diagram;
use crate::stats::{clopper_pearson, sd_percent, wilson, Interval, Z95};

/// One sample's mode in one diagram.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, Sample};
/// use provenance_core::diagram::Diagram;
/// use provenance_core::modes::DiagramMode;
/// let s = Sample::counted("a", Framework { qm: 150.0, p: 100.0, lv: 50.0, ..Default::default() });
/// let m = DiagramMode::of(&s, Diagram::Qfl).unwrap();
/// assert_eq!(m.points, Some(300.0));
/// assert_eq!(m.percent.parts(), [50.0, 100.0 / 3.0, 50.0 / 3.0]);
/// assert!((m.sd().unwrap()[0] - (50.0f64 * 50.0 / 300.0).sqrt()).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DiagramMode {
    /// The diagram.
    pub diagram: Diagram,
    /// Pole amounts in the sample's basis (points, estimated points or percentages).
    pub amounts: [f64; 3],
    /// Points in this diagram; `None` when the number of points is unknown.
    pub points: Option<f64>,
    /// Closed pole percentages.
    pub percent: Composition3,
}

impl DiagramMode {
    /// The mode of `sample` in `diagram`; `None` when the diagram has no points.
    pub fn of(sample: &Sample, diagram: Diagram) -> Option<DiagramMode> {
        let amounts = diagram.pole_amounts(&sample.framework);
        let percent = Composition3::close(amounts)?;
        let points = match sample.counting {
            Counting::Unknown => None,
            _ => Some(amounts.iter().sum()),
        };
        Some(DiagramMode {
            diagram,
            amounts,
            points,
            percent,
        })
    }

    /// One standard deviation per pole, percentage points (Van der Plas & Tobi 1965).
    pub fn sd(&self) -> Option<[f64; 3]> {
        let n = self.points?;
        Some(self.percent.parts().map(|p| sd_percent(p, n)))
    }

    /// 95% Wilson score interval per pole.
    pub fn wilson95(&self) -> Option<[Interval; 3]> {
        let n = self.points?;
        Some(self.amounts.map(|k| wilson(k, n, Z95)))
    }

    /// 95% Clopper-Pearson interval per pole.
    pub fn clopper_pearson95(&self) -> Option<[Interval; 3]> {
        let n = self.points?;
        Some(self.amounts.map(|k| clopper_pearson(k, n, 0.05)))
    }
}

/// Grain ratios (0 to 1); `None` where the denominator is zero.
///
/// - P/F and Lv/L: Dickinson (1970, J. Sed. Petrol. 40:695-707).
/// - C/Q: Dickinson (1970), with Q = Qm + Qp + C.
/// - K/F, Qp/Q: common practice; Qp/Q takes Qp as all polycrystalline quartzose grains
///   (Qp + C), as in Dickinson & Suczek (1979).
///
/// # Example
/// ```
/// use provenance_core::counts::Framework;
/// use provenance_core::modes::Ratios;
/// let r = Ratios::of(&Framework { qm: 90.0, c: 10.0, p: 30.0, k: 10.0, ..Default::default() });
/// assert_eq!(r.p_f, Some(0.75));
/// assert_eq!(r.c_q, Some(0.1));
/// assert_eq!(r.lv_l, None);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Ratios {
    /// Plagioclase over total feldspar.
    pub p_f: Option<f64>,
    /// K-feldspar over total feldspar.
    pub k_f: Option<f64>,
    /// Volcanic over unstable lithic fragments.
    pub lv_l: Option<f64>,
    /// Polycrystalline quartzose grains (Qp + C) over total quartzose grains.
    pub qp_q: Option<f64>,
    /// Chert over total quartzose grains.
    pub c_q: Option<f64>,
}

fn ratio(a: f64, b: f64) -> Option<f64> {
    (b > 0.0).then(|| a / b)
}

impl Ratios {
    /// The ratios of a framework.
    pub fn of(f: &crate::counts::Framework) -> Ratios {
        Ratios {
            p_f: ratio(f.p, f.feldspar()),
            k_f: ratio(f.k, f.feldspar()),
            lv_l: ratio(f.lv, f.lithics()),
            qp_q: ratio(f.polycrystalline(), f.quartz()),
            c_q: ratio(f.c, f.quartz()),
        }
    }

    /// (name, value) pairs in output order; names as column suffixes.
    pub fn named(&self) -> [(&'static str, Option<f64>); 5] {
        [
            ("P/F", self.p_f),
            ("K/F", self.k_f),
            ("Lv/L", self.lv_l),
            ("Qp/Q", self.qp_q),
            ("C/Q", self.c_q),
        ]
    }
}

/// Every recalculation of one sample.
///
/// # Example
/// ```
/// use provenance_core::counts::{Framework, NonFramework, Sample};
/// use provenance_core::diagram::Diagram;
/// use provenance_core::modes::SampleModes;
/// let mut s = Sample::counted("a", Framework { qm: 270.0, lm: 30.0, ..Default::default() });
/// s.other = NonFramework { matrix: Some(100.0), ..Default::default() };
/// let m = SampleModes::of(&s);
/// assert_eq!(m.framework_total, 300.0);
/// assert_eq!(m.matrix_percent, Some(25.0));
/// assert!(m.get(Diagram::Qmpk).is_some());
/// assert!(m.get(Diagram::Qplvlsm).is_none() == false);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct SampleModes {
    /// One entry per diagram in [`Diagram::ALL`] order; `None` where the diagram has no points.
    pub diagrams: [Option<DiagramMode>; 5],
    /// Grain ratios.
    pub ratios: Ratios,
    /// Sum of framework amounts.
    pub framework_total: f64,
    /// Matrix as percent of framework plus matrix, where matrix was counted.
    pub matrix_percent: Option<f64>,
}

impl SampleModes {
    /// Recalculate one sample.
    pub fn of(sample: &Sample) -> SampleModes {
        let f = &sample.framework;
        let total = f.total();
        SampleModes {
            diagrams: Diagram::ALL.map(|d| DiagramMode::of(sample, d)),
            ratios: Ratios::of(f),
            framework_total: total,
            matrix_percent: sample
                .other
                .matrix
                .and_then(|m| ratio(100.0 * m, total + m)),
        }
    }

    /// The mode in one diagram.
    pub fn get(&self, d: Diagram) -> Option<&DiagramMode> {
        self.diagrams[d.index()].as_ref()
    }

    /// True when the framework has no grains at all: every diagram is null.
    pub fn empty_framework(&self) -> bool {
        self.framework_total <= 0.0
    }
}
