//! Invariants of the petrofacies statistics (proptest).

use proptest::prelude::*;
use provenance_core::counts::{Framework, Sample};
use provenance_core::diagram::Diagram;
use provenance_core::geometry::Polygon;
use provenance_core::logratio::ilr;
use provenance_core::petrofacies::{DiagramSummary, Homogeneity, SigmaPolygon};

fn group() -> impl Strategy<Value = Vec<Sample>> {
    prop::collection::vec(prop::array::uniform3(0u32..500), 3..14).prop_map(|rows| {
        rows.into_iter()
            .enumerate()
            .map(|(i, [q, f, l])| {
                // At least one point in every sample.
                let fw = Framework {
                    qm: f64::from(q) + 1.0,
                    p: f64::from(f),
                    lv: f64::from(l),
                    ..Default::default()
                };
                Sample::counted(format!("s{i}"), fw)
            })
            .collect()
    })
}

fn summary(samples: &[Sample]) -> DiagramSummary {
    let refs: Vec<&Sample> = samples.iter().collect();
    DiagramSummary::of(&refs, Diagram::Qfl, 0.95).unwrap()
}

proptest! {
    #[test]
    fn the_mean_is_closed_and_its_ilr_is_the_ilr_mean(g in group()) {
        let s = summary(&g);
        prop_assert!((s.mean.parts().iter().sum::<f64>() - 100.0).abs() < 1e-9);
        let z = ilr(&s.mean.parts());
        prop_assert!((z[0] - s.ilr_mean[0]).abs() < 1e-9 && (z[1] - s.ilr_mean[1]).abs() < 1e-9);
    }

    #[test]
    fn regions_surround_the_mean_and_nest(g in group()) {
        let s = summary(&g);
        if let Ok(r) = &s.regions {
            let chol = s.ilr_covariance.as_ref().unwrap().cholesky().unwrap();
            for (curve, bound) in [(&r.confidence, r.confidence_bound), (&r.prediction, r.prediction_bound)] {
                for v in curve.iter().step_by(7) {
                    let z = ilr(v);
                    let d = [z[0] - s.ilr_mean[0], z[1] - s.ilr_mean[1]];
                    prop_assert!((chol.mahalanobis2(&d) / bound - 1.0).abs() < 1e-6);
                    prop_assert!(v.iter().all(|x| *x >= 0.0));
                }
            }
            let conf = Polygon::new(r.confidence[..r.confidence.len() - 1].to_vec());
            let pred = Polygon::new(r.prediction[..r.prediction.len() - 1].to_vec());
            prop_assert!(conf.contains(s.mean.parts()));
            prop_assert!(pred.area() > conf.area());
        }
    }

    #[test]
    fn the_sigma_polygon_stays_in_the_triangle(g in group()) {
        let pct: Vec<[f64; 3]> = g.iter().map(|s| {
            let a = Diagram::Qfl.pole_amounts(&s.framework);
            let t: f64 = a.iter().sum();
            a.map(|x| 100.0 * x / t)
        }).collect();
        let p = SigmaPolygon::of(&pct).unwrap();
        for v in &p.vertices {
            prop_assert!(v.iter().all(|x| *x >= -1e-9));
            prop_assert!((v.iter().sum::<f64>() - 100.0).abs() < 1e-9);
        }
        prop_assert_eq!(p.spills_outside, p.unclipped.iter().any(|v| v.iter().any(|x| *x < -1e-9)));
    }

    #[test]
    fn homogeneity_scales_with_the_counts(g in group(), k in 2u32..6) {
        let counts: Vec<[f64; 3]> = g.iter().map(|s| Diagram::Qfl.pole_amounts(&s.framework)).collect();
        let scaled: Vec<[f64; 3]> = counts.iter().map(|c| c.map(|x| x * f64::from(k))).collect();
        let (a, b) = (Homogeneity::of(&counts).unwrap(), Homogeneity::of(&scaled).unwrap());
        // Pearson's X² is proportional to the sample size for fixed proportions.
        prop_assert!((b.chi2 - f64::from(k) * a.chi2).abs() <= 1e-9 * b.chi2.max(1.0));
        prop_assert!((0.0..=1.0).contains(&a.p_value));
        prop_assert_eq!(a.df, b.df);
    }
}
