//! Fitting multinomial logistic regression with linfa-logistic, with our own convergence check.

use super::training::TrainingSet;
use crate::error::{Error, Result};
use linfa::prelude::*;
use linfa::Dataset;
use linfa_logistic::MultiLogisticRegression;
use ndarray::{Array1, Array2};
use serde::{Deserialize, Serialize};

/// Default L2 penalty α = 1, which equals scikit-learn's default C = 1 (α = 1/C; common
/// practice).
pub const DEFAULT_L2: f64 = 1.0;

/// Default convergence tolerance: every component of the gradient of the mean penalised
/// log-loss must be at most 1e-6 in absolute value.
pub const DEFAULT_TOLERANCE: f64 = 1e-6;

/// How to fit.
///
/// The objective is the mean over samples of −ln p(true class), plus (α/2n)·‖W‖² with the
/// intercepts unpenalised: the objective of linfa-logistic divided by n, and that of
/// scikit-learn's `LogisticRegression` with C = 1/α.
///
/// # Example
/// ```
/// use provenance_core::classifier::FitOptions;
/// let o = FitOptions::default();
/// assert_eq!(o.l2, 1.0);
/// assert!(FitOptions { l2: -1.0, ..o }.check().is_err());
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FitOptions {
    /// L2 penalty α (0 for unpenalised maximum likelihood).
    pub l2: f64,
    /// L-BFGS iterations per round.
    pub max_iterations: u64,
    /// Restarts from the last solution while the gradient is still above the tolerance.
    pub rounds: u32,
    /// Convergence tolerance on the largest gradient component (see [`DEFAULT_TOLERANCE`]).
    pub tolerance: f64,
}

impl Default for FitOptions {
    fn default() -> Self {
        FitOptions {
            l2: DEFAULT_L2,
            max_iterations: 500,
            rounds: 4,
            tolerance: DEFAULT_TOLERANCE,
        }
    }
}

impl FitOptions {
    /// Refuse a negative or non-finite penalty, no iterations, or a non-positive tolerance.
    pub fn check(&self) -> Result<()> {
        let bad = |message: String| Err(Error::Usage { message });
        if !self.l2.is_finite() || self.l2 < 0.0 {
            return bad(format!("--l2 {}: expected a penalty of 0 or more", self.l2));
        }
        if self.max_iterations == 0 || self.rounds == 0 {
            return bad("no iterations allowed: expected at least one".into());
        }
        if !self.tolerance.is_finite() || self.tolerance <= 0.0 {
            return bad(format!(
                "tolerance {}: expected a value above 0",
                self.tolerance
            ));
        }
        Ok(())
    }
}

/// How well the fit converged, checked on our own gradient (linfa returns `Ok` also when it
/// runs out of iterations).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Convergence {
    /// Largest absolute component of the gradient of the mean penalised log-loss.
    pub gradient_max: f64,
    /// The tolerance it had to meet.
    pub tolerance: f64,
    /// The mean penalised log-loss at the solution.
    pub objective: f64,
    /// The mean log-loss on the training data (without the penalty).
    pub training_log_loss: f64,
    /// L-BFGS rounds used.
    pub rounds: u32,
}

/// A fitted multinomial logistic regression.
#[derive(Debug, Clone, PartialEq)]
pub struct LogisticFit {
    /// Class labels, sorted.
    pub classes: Vec<String>,
    /// Coefficients, one row per class, one column per feature.
    pub weights: Vec<Vec<f64>>,
    /// Intercepts, one per class.
    pub intercepts: Vec<f64>,
    /// The penalty used.
    pub l2: f64,
    /// The convergence check.
    pub convergence: Convergence,
}

/// Softmax probabilities of one feature vector (numerically stable: the row maximum is
/// subtracted first).
pub(crate) fn softmax(weights: &[Vec<f64>], intercepts: &[f64], z: &[f64]) -> Vec<f64> {
    let logits: Vec<f64> = weights
        .iter()
        .zip(intercepts)
        .map(|(w, b)| b + w.iter().zip(z).map(|(a, x)| a * x).sum::<f64>())
        .collect();
    let m = logits.iter().cloned().fold(f64::NEG_INFINITY, f64::max);
    let e: Vec<f64> = logits.iter().map(|l| (l - m).exp()).collect();
    let s: f64 = e.iter().sum();
    e.into_iter().map(|v| v / s).collect()
}

/// Mean penalised objective, mean log-loss and the gradient's largest component.
fn objective(
    set: &TrainingSet,
    class_of: &[usize],
    weights: &[Vec<f64>],
    intercepts: &[f64],
    l2: f64,
) -> (f64, f64, f64) {
    let (k, d) = (weights.len(), set.space().dimension());
    let n = set.len() as f64;
    let mut gw = vec![vec![0.0; d]; k];
    let mut gb = vec![0.0; k];
    let mut loss = 0.0;
    for (z, &y) in set.features().iter().zip(class_of) {
        let p = softmax(weights, intercepts, z);
        loss -= p[y].max(f64::MIN_POSITIVE).ln();
        for c in 0..k {
            let r = p[c] - if c == y { 1.0 } else { 0.0 };
            gb[c] += r;
            for (g, x) in gw[c].iter_mut().zip(z) {
                *g += r * x;
            }
        }
    }
    let mut penalty = 0.0;
    let mut gmax: f64 = 0.0;
    for c in 0..k {
        for j in 0..d {
            penalty += weights[c][j] * weights[c][j];
            gmax = gmax.max(((gw[c][j] + l2 * weights[c][j]) / n).abs());
        }
        gmax = gmax.max((gb[c] / n).abs());
    }
    ((loss + 0.5 * l2 * penalty) / n, loss / n, gmax)
}

/// True when doubling every coefficient does not raise the unpenalised objective: at a finite
/// optimum of the strictly convex log-loss it would, so the "optimum" found lies on a ray to
/// infinity (separation; Albert & Anderson 1984, Biometrika 71:1-10).
fn diverges(
    set: &TrainingSet,
    class_of: &[usize],
    weights: &[Vec<f64>],
    intercepts: &[f64],
    objective_here: f64,
) -> bool {
    let w2: Vec<Vec<f64>> = weights
        .iter()
        .map(|w| w.iter().map(|v| 2.0 * v).collect())
        .collect();
    let b2: Vec<f64> = intercepts.iter().map(|v| 2.0 * v).collect();
    let (doubled, _, _) = objective(set, class_of, &w2, &b2, 0.0);
    doubled <= objective_here + 1e-12 * objective_here.max(1.0)
}

/// Fit a multinomial logistic regression to a training set.
///
/// linfa-logistic's L-BFGS runs up to `max_iterations`; if our gradient check fails, it
/// restarts from the solution reached, up to `rounds` times. A fit that still misses the
/// tolerance is refused. An unpenalised fit (`l2` = 0) whose objective does not rise when its
/// coefficients are doubled is refused too: the classes are separable and the maximum
/// likelihood estimate does not exist.
///
/// # Example
/// ```
/// use provenance_core::classifier::{fit, FeatureSpace, FitOptions, TrainingSet};
/// use provenance_core::counts::Counting;
/// use provenance_core::diagram::Diagram;
/// let mut t = TrainingSet::new(FeatureSpace::Diagram(Diagram::Qfl));
/// for (q, f, l, label) in [(80.0, 10.0, 10.0, "q"), (70.0, 20.0, 10.0, "q"), (30.0, 40.0, 30.0, "f"), (20.0, 50.0, 30.0, "f"), (60.0, 30.0, 10.0, "f"), (40.0, 20.0, 40.0, "q")] {
///     t.push_amounts(label, &[q, f, l], Counting::Counted).unwrap();
/// }
/// let m = fit(&t, &FitOptions::default()).unwrap();
/// assert_eq!(m.classes, ["f", "q"]);
/// assert!(m.convergence.gradient_max <= 1e-6);
/// ```
pub fn fit(set: &TrainingSet, options: &FitOptions) -> Result<LogisticFit> {
    options.check()?;
    let classes = set.classes();
    let refuse = |message: String, expected: &str| Error::Training {
        file: set.name().to_string(),
        message,
        expected: expected.into(),
    };
    if classes.len() < 2 {
        return Err(refuse(
            format!("{} class(es) {:?}", classes.len(), classes),
            "at least two classes in the label column",
        ));
    }
    let d = set.space().dimension();
    let n = set.len();
    let class_of: Vec<usize> = set
        .labels()
        .iter()
        .map(|l| classes.binary_search(l).unwrap_or(0))
        .collect();
    let flat: Vec<f64> = set.features().iter().flatten().copied().collect();
    let x = Array2::from_shape_vec((n, d), flat).map_err(|e| {
        refuse(
            format!("feature table has the wrong shape ({e})"),
            "one row per sample",
        )
    })?;
    let data = Dataset::new(x, Array1::from(class_of.clone()));
    let mut init = Array2::<f64>::zeros((d + 1, classes.len()));
    let mut last = None;
    for round in 1..=options.rounds {
        let params = MultiLogisticRegression::default()
            .alpha(options.l2)
            .max_iterations(options.max_iterations)
            // linfa stops on the L2 norm of the summed gradient; n·tol makes that at least as
            // strict as our check on the mean gradient's largest component.
            .gradient_tolerance(options.tolerance * n as f64)
            .initial_params(init.clone());
        let fitted = params
            .fit(&data)
            .map_err(|e| refuse(format!("the solver failed ({e})"), "finite features"))?;
        let (w, b) = (fitted.params(), fitted.intercept());
        let weights: Vec<Vec<f64>> = (0..classes.len())
            .map(|c| (0..d).map(|j| w[[j, c]]).collect())
            .collect();
        let intercepts: Vec<f64> = b.to_vec();
        let (obj, ll, gmax) = objective(set, &class_of, &weights, &intercepts, options.l2);
        let convergence = Convergence {
            gradient_max: gmax,
            tolerance: options.tolerance,
            objective: obj,
            training_log_loss: ll,
            rounds: round,
        };
        if gmax <= options.tolerance {
            if options.l2 == 0.0 && diverges(set, &class_of, &weights, &intercepts, obj) {
                return Err(refuse(
                    "the unpenalised optimum lies at infinity: the classes are separable in these features, so the log-loss keeps falling as the coefficients grow".into(),
                    "a positive --l2 (or more overlapping training data)",
                ));
            }
            return Ok(LogisticFit {
                classes,
                weights,
                intercepts,
                l2: options.l2,
                convergence,
            });
        }
        for j in 0..d {
            for c in 0..classes.len() {
                init[[j, c]] = weights[c][j];
            }
        }
        for c in 0..classes.len() {
            init[[d, c]] = intercepts[c];
        }
        last = Some(convergence);
    }
    let c = last.map_or(f64::NAN, |c| c.gradient_max);
    Err(refuse(
        format!(
            "the fit did not converge in {} rounds of {} L-BFGS iterations (largest gradient component {c:.3e})",
            options.rounds, options.max_iterations
        ),
        &format!(
            "a gradient of at most {:.1e}; with --l2 0 the classes may be separable: give a positive --l2",
            options.tolerance
        ),
    ))
}
