//! Petrofacies statistics against hand computations from the published formulas
//! (Aitchison 1986 closed geometric mean; Weltje 2002 regions; Hotelling 1931 T²;
//! Martín-Fernández et al. 2003 zero replacement). Every expected value below is derived in
//! the comments, not taken from the code under test.

use provenance_core::counts::{Framework, Sample};
use provenance_core::diagram::Diagram;
use provenance_core::logratio::ilr;
use provenance_core::petrofacies::{DiagramSummary, Hotelling, SymMatrix};

fn qfl(q: f64, f: f64, l: f64) -> Sample {
    Sample::counted(
        "s",
        Framework {
            qm: q,
            p: f,
            lv: l,
            ..Default::default()
        },
    )
}

fn summary(samples: &[Sample]) -> DiagramSummary {
    let refs: Vec<&Sample> = samples.iter().collect();
    DiagramSummary::of(&refs, Diagram::Qfl, 0.95).unwrap()
}

/// The symmetric group (1,1,1), (4,1,1), (1,4,1), (1,1,4) × 100 points.
fn symmetric() -> Vec<Sample> {
    vec![
        qfl(100.0, 100.0, 100.0),
        qfl(400.0, 100.0, 100.0),
        qfl(100.0, 400.0, 100.0),
        qfl(100.0, 100.0, 400.0),
    ]
}

#[test]
fn geometric_mean_and_ilr_covariance_of_a_symmetric_group() {
    // Each pole's product over the four samples is 4 (in units of 100 points), so the closed
    // geometric mean is (1/3, 1/3, 1/3). With a = ln 2 the ilr coordinates are
    // (0, 0), (√2a, b), (−√2a, b), (0, −2b) with b = √(2/3)·a: mean (0, 0);
    // var z₁ = (2a² + 2a²)/3 = 4a²/3; var z₂ = (b² + b² + 4b²)/3 = 6b²/3 = 4a²/3; cov = 0.
    let s = summary(&symmetric());
    let a = 2f64.ln();
    assert_eq!(s.n, 4);
    for v in s.mean.parts() {
        assert!((v - 100.0 / 3.0).abs() < 1e-12);
    }
    assert!(s.ilr_mean[0].abs() < 1e-12 && s.ilr_mean[1].abs() < 1e-12);
    let c = s.ilr_covariance.as_ref().unwrap();
    assert!((c.get(0, 0) - 4.0 * a * a / 3.0).abs() < 1e-12);
    assert!((c.get(1, 1) - 4.0 * a * a / 3.0).abs() < 1e-12);
    assert!(c.get(0, 1).abs() < 1e-12);
    // Pooled counts 700 : 700 : 700.
    for v in s.pooled.unwrap().parts() {
        assert!((v - 100.0 / 3.0).abs() < 1e-12);
    }
}

#[test]
fn confidence_and_prediction_regions_of_a_symmetric_group() {
    // n = 4, p = 2: F₂,₂(0.95) = (2/2)·(0.05^(−1) − 1) = 19; bound c² = 2·3/(4·2)·19 = 14.25;
    // prediction bound 5·14.25 = 71.25. With S = (4a²/3)·I the confidence ellipse is a circle
    // of radius² 14.25·4a²/3 = 19a², prediction radius² 95a². Its θ = 0 point is z = (r, 0):
    // Q/F = e^(√2·r) and L = √(QF), closed to 100.
    let s = summary(&symmetric());
    let reg = s.regions.as_ref().unwrap();
    assert!((reg.confidence_bound - 14.25).abs() < 1e-12);
    assert!((reg.prediction_bound - 71.25).abs() < 1e-12);
    let a = 2f64.ln();
    for (curve, r) in [
        (&reg.confidence, 19f64.sqrt() * a),
        (&reg.prediction, 95f64.sqrt() * a),
    ] {
        let ratio = (2f64.sqrt() * r).exp();
        let raw = [ratio, 1.0, ratio.sqrt()];
        let sum: f64 = raw.iter().sum();
        for i in 0..3 {
            assert!(
                (curve[0][i] - 100.0 * raw[i] / sum).abs() < 1e-9,
                "θ = 0 vertex"
            );
        }
        // Every vertex lies on the circle |z|² = r², strictly inside the triangle, and the
        // curve is closed.
        assert_eq!(curve.first(), curve.last());
        for v in curve {
            assert!(v.iter().all(|x| *x > 0.0));
            assert!((v.iter().sum::<f64>() - 100.0).abs() < 1e-9);
            let z = ilr(v);
            assert!((z[0] * z[0] + z[1] * z[1] - r * r).abs() < 1e-9);
        }
    }
}

#[test]
fn zeros_are_replaced_before_the_geometric_mean() {
    // Two samples: (300, 100, 0) and (100, 300, 0), 400 points each. δ = 0.65/400 = 0.001625;
    // the zero L becomes δ and Q, F are scaled by (1 − δ): (0.75, 0.25)·(1 − δ), δ.
    // Geometric mean: Q = F = √(0.75·0.25)·(1 − δ), L = δ, then closed.
    let s = summary(&[qfl(300.0, 100.0, 0.0), qfl(100.0, 300.0, 0.0)]);
    let d = 0.65 / 400.0;
    let qf = (0.75f64 * 0.25).sqrt() * (1.0 - d);
    let sum = 2.0 * qf + d;
    assert!((s.mean.part(0) - 100.0 * qf / sum).abs() < 1e-12);
    assert!((s.mean.part(2) - 100.0 * d / sum).abs() < 1e-12);
    // Two samples: a covariance, but no regions (F needs n − p ≥ 1).
    assert!(s.ilr_covariance.is_some());
    assert!(s.regions.is_err());
}

#[test]
fn hotelling_two_sample_by_hand() {
    // a = (0,0), (1,0), (0,1); b = (3,3), (4,3), (3,4). Means (1/3, 1/3) and (10/3, 10/3),
    // d = (−3, −3). Each group's scatter is [[2/3, −1/3], [−1/3, 2/3]], so the pooled covariance
    // is 2·that/(6 − 2) = [[1/3, −1/6], [−1/6, 1/3]], determinant 1/12, inverse [[4, 2], [2, 4]].
    // dᵀS⁻¹d = 9·(4 + 2 + 2 + 4) = 108; T² = (3·3/6)·108 = 162;
    // F = (6 − 2 − 1)/(2·(6 − 2))·162 = 60.75 on (2, 3) df; p = (1 + 2·60.75/3)^(−3/2) = 41.5^(−1.5).
    let a = vec![vec![0.0, 0.0], vec![1.0, 0.0], vec![0.0, 1.0]];
    let b = vec![vec![3.0, 3.0], vec![4.0, 3.0], vec![3.0, 4.0]];
    let h = Hotelling::test(&a, &b).unwrap();
    assert!((h.t2 - 162.0).abs() < 1e-9);
    assert!((h.f - 60.75).abs() < 1e-9);
    assert_eq!((h.df1, h.df2), (2.0, 3.0));
    assert!((h.p_value - 41.5f64.powf(-1.5)).abs() < 1e-12);
}

#[test]
fn singular_and_tiny_groups_give_reasons_not_panics() {
    // Identical compositions: zero covariance, no regions.
    let same = summary(&[
        qfl(100.0, 50.0, 50.0),
        qfl(200.0, 100.0, 100.0),
        qfl(300.0, 150.0, 150.0),
    ]);
    assert!(same.regions.is_err());
    let c = same.ilr_covariance.unwrap();
    assert_eq!(c, SymMatrix::zeros(2));
    // One sample: no covariance, no sigma polygon, no homogeneity test.
    let one = summary(&[qfl(100.0, 50.0, 50.0)]);
    assert!(
        one.ilr_covariance.is_none() && one.sigma_polygon.is_none() && one.homogeneity.is_none()
    );
}
