//! Fitting multinomial logistic regression with linfa-logistic, with our own convergence check.

use super::newton::{evaluate, polish, Problem};
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

/// Above this many parameters (classes × (features + 1)) the automatic choice fits by
/// L-BFGS instead of Newton's method: a Newton step costs about k²q²/4 products a sample and a
/// (kq)³/3 factorisation, an L-BFGS step about kq (Nocedal & Wright 2006, Numerical
/// Optimization, ch. 6-7), so Newton loses as the problem grows. The threshold is ours and was
/// measured only below it: at 28 parameters (the classifier benchmark) Newton took 23 ms and
/// L-BFGS 101 ms.
pub const NEWTON_MAX_PARAMETERS: usize = 64;

/// The optimiser of a fit. Both minimise the same objective to the same tolerance.
///
/// # Example
/// ```
/// use provenance_core::classifier::{FitOptions, Solver};
/// assert_eq!(FitOptions::default().solver, Solver::Auto);
/// assert_eq!(Solver::Auto.resolve(4 * 7), Solver::Newton);
/// assert_eq!(Solver::Auto.resolve(20 * 7), Solver::Lbfgs);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Solver {
    /// Newton for up to [`NEWTON_MAX_PARAMETERS`] parameters, L-BFGS above.
    #[default]
    Auto,
    /// Damped Newton steps on the exact objective from zero (Nocedal & Wright 2006, §3.1).
    Newton,
    /// linfa-logistic's L-BFGS, finished by Newton steps when it stops short.
    Lbfgs,
}

impl Solver {
    /// The solver used for a problem of `parameters` parameters.
    pub fn resolve(self, parameters: usize) -> Solver {
        match self {
            Solver::Auto if parameters <= NEWTON_MAX_PARAMETERS => Solver::Newton,
            Solver::Auto => Solver::Lbfgs,
            other => other,
        }
    }
}

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
    /// L-BFGS iterations of linfa-logistic (with the L-BFGS solver).
    pub max_iterations: u64,
    /// Newton steps allowed: the whole fit with the Newton solver; with L-BFGS, the steps
    /// that finish the fit when it stops short.
    pub newton_steps: u32,
    /// The optimiser.
    pub solver: Solver,
    /// Convergence tolerance on the largest gradient component (see [`DEFAULT_TOLERANCE`]).
    pub tolerance: f64,
}

impl Default for FitOptions {
    fn default() -> Self {
        FitOptions {
            l2: DEFAULT_L2,
            max_iterations: 500,
            newton_steps: 50,
            tolerance: DEFAULT_TOLERANCE,
            solver: Solver::Auto,
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
        if self.max_iterations == 0 {
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
    /// Newton steps taken: the whole fit with the Newton solver; after L-BFGS, the steps that
    /// finished it (0 when L-BFGS alone met the tolerance).
    pub newton_steps: u32,
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
    let theta = pack(weights, intercepts);
    let d = set.space().dimension();
    let pr = Problem {
        x: set.features(),
        y: class_of,
        k: weights.len(),
        d,
        l2,
    };
    let e = evaluate(&pr, &theta, false);
    let gmax = e.gradient_max();
    (e.objective, e.log_loss, gmax)
}

/// Parameters class by class: (w₁ … w_d, b).
fn pack(weights: &[Vec<f64>], intercepts: &[f64]) -> Vec<f64> {
    let mut t = Vec::new();
    for (w, b) in weights.iter().zip(intercepts) {
        t.extend_from_slice(w);
        t.push(*b);
    }
    t
}

fn unpack(theta: &[f64], k: usize, d: usize) -> (Vec<Vec<f64>>, Vec<f64>) {
    let q = d + 1;
    let weights = (0..k).map(|c| theta[c * q..c * q + d].to_vec()).collect();
    let intercepts = (0..k).map(|c| theta[c * q + d]).collect();
    (weights, intercepts)
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

/// linfa-logistic's L-BFGS fit, as parameters laid out class by class (w₁ … w_d, b).
fn lbfgs(set: &TrainingSet, class_of: &[usize], options: &FitOptions) -> Result<Vec<f64>> {
    let (n, d, k) = (set.len(), set.space().dimension(), set.classes().len());
    let refuse = |message: String, expected: &str| Error::Training {
        file: set.name().to_string(),
        message,
        expected: expected.into(),
    };
    let flat: Vec<f64> = set.features().iter().flatten().copied().collect();
    let x = Array2::from_shape_vec((n, d), flat).map_err(|e| {
        refuse(
            format!("feature table has the wrong shape ({e})"),
            "one row per sample",
        )
    })?;
    let data = Dataset::new(x, Array1::from(class_of.to_vec()));
    let params = MultiLogisticRegression::default()
        .alpha(options.l2)
        .max_iterations(options.max_iterations)
        // linfa stops on the L2 norm of the summed gradient; n·tol makes that at least as
        // strict as our check on the mean gradient's largest component.
        .gradient_tolerance(options.tolerance * n as f64);
    let fitted = params
        .fit(&data)
        .map_err(|e| refuse(format!("the solver failed ({e})"), "finite features"))?;
    let (w, b) = (fitted.params(), fitted.intercept());
    let weights: Vec<Vec<f64>> = (0..k)
        .map(|c| (0..d).map(|j| w[[j, c]]).collect())
        .collect();
    Ok(pack(&weights, &b.to_vec()))
}

/// Fit a multinomial logistic regression to a training set.
///
/// linfa-logistic's L-BFGS runs up to `max_iterations`. If our gradient check on its solution
/// fails (linfa can stop short on well-separated classes; see the `newton` module source),
/// up to `newton_steps` damped Newton steps on the exact objective finish the fit. A fit that
/// still misses the tolerance is refused. An unpenalised fit (`l2` = 0) whose objective does not rise when its
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
    let class_of: Vec<usize> = set
        .labels()
        .iter()
        .map(|l| classes.binary_search(l).unwrap_or(0))
        .collect();
    let k = classes.len();
    let pr = Problem {
        x: set.features(),
        y: &class_of,
        k,
        d,
        l2: options.l2,
    };
    let solver = options.solver.resolve(k * (d + 1));
    let (theta, steps) = match solver {
        Solver::Lbfgs => {
            let mut theta = lbfgs(set, &class_of, options)?;
            let g0 = evaluate(&pr, &theta, false).gradient_max();
            let mut steps = 0;
            if g0 > options.tolerance {
                steps = polish(&pr, &mut theta, options.tolerance, options.newton_steps);
            }
            (theta, steps)
        }
        _ => {
            let mut theta = vec![0.0; k * (d + 1)];
            let steps = polish(&pr, &mut theta, options.tolerance, options.newton_steps);
            (theta, steps)
        }
    };
    let (weights, intercepts) = unpack(&theta, k, d);
    let (obj, ll, gmax) = objective(set, &class_of, &weights, &intercepts, options.l2);
    if gmax > options.tolerance {
        return Err(refuse(
            match solver {
                Solver::Lbfgs => format!(
                    "the fit did not converge in {} L-BFGS iterations and {steps} Newton steps (largest gradient component {gmax:.3e})",
                    options.max_iterations
                ),
                _ => format!(
                    "the fit did not converge in {steps} Newton steps (largest gradient component {gmax:.3e})"
                ),
            },
            &format!(
                "a gradient of at most {:.1e}; with --l2 0 the classes may be separable: give a positive --l2",
                options.tolerance
            ),
        ));
    }
    if options.l2 == 0.0 && diverges(set, &class_of, &weights, &intercepts, obj) {
        return Err(refuse(
            "the unpenalised optimum lies at infinity: the classes are separable in these features, so the log-loss keeps falling as the coefficients grow".into(),
            "a positive --l2 (or more overlapping training data)",
        ));
    }
    Ok(LogisticFit {
        classes,
        weights,
        intercepts,
        l2: options.l2,
        convergence: Convergence {
            gradient_max: gmax,
            tolerance: options.tolerance,
            objective: obj,
            training_log_loss: ll,
            newton_steps: steps,
        },
    })
}
