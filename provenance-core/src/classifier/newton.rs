//! Newton steps on the multinomial logistic objective, used to finish a fit when
//! linfa-logistic stops short of our tolerance.
//!
//! Why: linfa-logistic 0.8 computes log Σ exp(h) for every row after subtracting the largest
//! logit of the whole matrix, not of the row, and clips the row sum at 1e-15. When some rows'
//! logits all lie more than about 34 below the largest logit anywhere (well-separated
//! classes), their loss and gradient are wrong and L-BFGS stops at a point that is not the
//! optimum. Our own objective here subtracts each row's maximum.

/// The mean penalised objective, the mean log-loss, the gradient and (when asked) the Hessian,
/// for parameters θ laid out class by class as (w₁ … w_d, b) and rows `x` with class `y`.
pub(crate) struct Evaluation {
    pub objective: f64,
    pub log_loss: f64,
    pub gradient: Vec<f64>,
    pub hessian: Vec<f64>,
}

impl Evaluation {
    /// The largest absolute component of the gradient: the convergence measure.
    pub(crate) fn gradient_max(&self) -> f64 {
        self.gradient.iter().fold(0.0f64, |a, v| a.max(v.abs()))
    }
}

/// A fitting problem: rows `x` (d features) with classes `y` (of k), penalty `l2`.
pub(crate) struct Problem<'a> {
    pub x: &'a [Vec<f64>],
    pub y: &'a [usize],
    pub k: usize,
    pub d: usize,
    pub l2: f64,
}

/// Evaluate a problem at `theta`.
pub(crate) fn evaluate(pr: &Problem<'_>, theta: &[f64], with_hessian: bool) -> Evaluation {
    let (x, y, k, d, l2) = (pr.x, pr.y, pr.k, pr.d, pr.l2);
    let q = d + 1;
    let np = k * q;
    let n = x.len() as f64;
    let mut g = vec![0.0; np];
    // The Hessian's (c, e) block is Σᵢ wᵢ,ce·xᵢxᵢᵀ with w = p_c(δ_ce − p_e): symmetric in the
    // classes and within each block, so only the blocks c ≤ e and their upper triangles are
    // summed over rows (k(k+1)/2 · q(q+1)/2 products a row instead of k²q²).
    let tri = q * (q + 1) / 2;
    let pairs = if with_hessian { k * (k + 1) / 2 } else { 0 };
    let mut blocks = vec![0.0; pairs * tri];
    let mut outer = vec![0.0; tri];
    let mut loss = 0.0;
    let mut logits = vec![0.0; k];
    let mut xt = vec![0.0; q];
    for (row, &yi) in x.iter().zip(y) {
        xt[..d].copy_from_slice(row);
        xt[d] = 1.0;
        for c in 0..k {
            logits[c] = (0..q).map(|j| theta[c * q + j] * xt[j]).sum();
        }
        let m = logits.iter().cloned().fold(f64::NEG_INFINITY, f64::max);
        let mut s = 0.0;
        for l in logits.iter_mut() {
            *l = (*l - m).exp();
            s += *l;
        }
        for l in logits.iter_mut() {
            *l /= s;
        }
        let p = &logits;
        loss -= p[yi].max(f64::MIN_POSITIVE).ln();
        for c in 0..k {
            let r = p[c] - if c == yi { 1.0 } else { 0.0 };
            for j in 0..q {
                g[c * q + j] += r * xt[j];
            }
        }
        if with_hessian {
            let mut t = 0;
            for j in 0..q {
                for l in j..q {
                    outer[t] = xt[j] * xt[l];
                    t += 1;
                }
            }
            let mut b = 0;
            for c in 0..k {
                for e in c..k {
                    let w = if c == e {
                        p[c] * (1.0 - p[c])
                    } else {
                        -p[c] * p[e]
                    };
                    for (acc, o) in blocks[b * tri..(b + 1) * tri].iter_mut().zip(&outer) {
                        *acc += w * o;
                    }
                    b += 1;
                }
            }
        }
    }
    let mut h = if with_hessian {
        expand(&blocks, k, q)
    } else {
        Vec::new()
    };
    let mut penalty = 0.0;
    for c in 0..k {
        for j in 0..d {
            let w = theta[c * q + j];
            penalty += w * w;
            g[c * q + j] += l2 * w;
            if with_hessian {
                h[(c * q + j) * np + c * q + j] += l2;
            }
        }
    }
    for v in g.iter_mut() {
        *v /= n;
    }
    for v in h.iter_mut() {
        *v /= n;
    }
    Evaluation {
        objective: (loss + 0.5 * l2 * penalty) / n,
        log_loss: loss / n,
        gradient: g,
        hessian: h,
    }
}

/// The full k·q × k·q Hessian from the summed upper triangles of its blocks c ≤ e.
fn expand(blocks: &[f64], k: usize, q: usize) -> Vec<f64> {
    let (np, tri) = (k * q, q * (q + 1) / 2);
    let mut h = vec![0.0; np * np];
    let mut b = 0;
    for c in 0..k {
        for e in c..k {
            let block = &blocks[b * tri..(b + 1) * tri];
            let mut t = 0;
            for j in 0..q {
                for l in j..q {
                    let v = block[t];
                    t += 1;
                    for (r, s) in [(c * q + j, e * q + l), (c * q + l, e * q + j)] {
                        h[r * np + s] = v;
                        h[s * np + r] = v;
                    }
                }
            }
            b += 1;
        }
    }
    h
}

/// Solve (H + εI)·s = g by Cholesky, with ε raised until the factorisation succeeds (the
/// objective's Hessian is only positive semi-definite: adding one vector to every class's
/// parameters leaves the probabilities unchanged).
fn solve(h: &[f64], g: &[f64]) -> Option<Vec<f64>> {
    let n = g.len();
    let scale = (0..n).map(|i| h[i * n + i]).fold(0.0, f64::max).max(1e-300);
    let mut jitter = 1e-12 * scale;
    for _ in 0..12 {
        let mut l = vec![0.0; n * n];
        let mut ok = true;
        'rows: for i in 0..n {
            for j in 0..=i {
                let mut s = h[i * n + j] + if i == j { jitter } else { 0.0 };
                for k in 0..j {
                    s -= l[i * n + k] * l[j * n + k];
                }
                if i == j {
                    if s <= 0.0 || !s.is_finite() {
                        ok = false;
                        break 'rows;
                    }
                    l[i * n + i] = s.sqrt();
                } else {
                    l[i * n + j] = s / l[j * n + j];
                }
            }
        }
        if ok {
            let mut z = vec![0.0; n];
            for i in 0..n {
                let s: f64 = (0..i).map(|k| l[i * n + k] * z[k]).sum();
                z[i] = (g[i] - s) / l[i * n + i];
            }
            let mut out = vec![0.0; n];
            for i in (0..n).rev() {
                let s: f64 = (i + 1..n).map(|k| l[k * n + i] * out[k]).sum();
                out[i] = (z[i] - s) / l[i * n + i];
            }
            return Some(out);
        }
        jitter *= 100.0;
    }
    None
}

/// Damped Newton steps from `theta` until the gradient's largest component is at most `tol`
/// or `max_steps` are taken; returns the number of steps taken. Each step backtracks until the
/// objective does not rise (Armijo rule with c = 1e-4; Nocedal & Wright 2006, Numerical
/// Optimization, §3.1).
pub(crate) fn polish(pr: &Problem<'_>, theta: &mut [f64], tol: f64, max_steps: u32) -> u32 {
    for step in 0..max_steps {
        let e = evaluate(pr, theta, true);
        let gmax = e.gradient_max();
        if gmax <= tol {
            return step;
        }
        let Some(dir) = solve(&e.hessian, &e.gradient) else {
            return step;
        };
        let slope: f64 = -dir.iter().zip(&e.gradient).map(|(a, b)| a * b).sum::<f64>();
        let mut t = 1.0;
        let mut moved = false;
        for _ in 0..40 {
            let trial: Vec<f64> = theta.iter().zip(&dir).map(|(a, s)| a - t * s).collect();
            let f = evaluate(pr, &trial, false).objective;
            if f <= e.objective + 1e-4 * t * slope {
                theta.copy_from_slice(&trial);
                moved = true;
                break;
            }
            t *= 0.5;
        }
        if !moved {
            return step;
        }
    }
    max_steps
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn gradient_and_hessian_match_finite_differences() {
        let x = vec![
            vec![0.3, -1.2],
            vec![1.5, 0.2],
            vec![-0.7, 0.9],
            vec![0.1, 0.1],
        ];
        let y = vec![0, 1, 2, 1];
        let pr = Problem {
            x: &x,
            y: &y,
            k: 3,
            d: 2,
            l2: 0.7,
        };
        let theta: Vec<f64> = (0..9).map(|i| 0.1 * i as f64 - 0.35).collect();
        let e = evaluate(&pr, &theta, true);
        let h = 1e-6;
        for i in 0..9 {
            let mut tp = theta.clone();
            tp[i] += h;
            let mut tm = theta.clone();
            tm[i] -= h;
            let ep = evaluate(&pr, &tp, false);
            let em = evaluate(&pr, &tm, false);
            let fd = (ep.objective - em.objective) / (2.0 * h);
            assert!((fd - e.gradient[i]).abs() < 1e-8, "gradient {i}");
            for j in 0..9 {
                let fd2 = (ep.gradient[j] - em.gradient[j]) / (2.0 * h);
                assert!((fd2 - e.hessian[i * 9 + j]).abs() < 1e-6, "hessian {i},{j}");
            }
        }
    }
}
