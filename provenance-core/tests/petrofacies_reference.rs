//! Petrofacies statistics against outside reference libraries: NumPy 2.4.6, SciPy 1.17.1 and
//! statsmodels 0.15.0 (Python 3.11.7), computed once by `tests/peers/petrofacies.py` and
//! committed as `tests/reference/petrofacies.json`. The count groups in that file are invented
//! test data.

use provenance_core::counts::{Framework, Sample};
use provenance_core::diagram::Diagram;
use provenance_core::petrofacies::{
    DiagramSummary, Homogeneity, Hotelling, Permutation, PermutationKind,
};
use provenance_core::stats::distributions::{chi2_sf, f2_quantile, f_quantile, f_sf};
use provenance_core::stats::gamma::{gamma_p, gamma_q};
use serde_json::Value;

const REFERENCE: &str = include_str!("../../tests/reference/petrofacies.json");

fn reference() -> Value {
    serde_json::from_str(REFERENCE).expect("the reference file is JSON")
}

fn f(v: &Value) -> f64 {
    v.as_f64().expect("a number")
}

fn close_rel(a: f64, b: f64, rel: f64) -> bool {
    (a - b).abs() <= rel * b.abs().max(1e-300)
}

fn group(r: &Value, name: &str) -> Vec<Sample> {
    r["groups"][name]
        .as_array()
        .unwrap()
        .iter()
        .enumerate()
        .map(|(i, row)| {
            let c: Vec<f64> = row.as_array().unwrap().iter().map(f).collect();
            // Q, F, L counts as Qm, P and Lv: QFL recalculates them unchanged.
            Sample::counted(
                format!("{name}{i}"),
                Framework {
                    qm: c[0],
                    p: c[1],
                    lv: c[2],
                    ..Default::default()
                },
            )
        })
        .collect()
}

fn summary(samples: &[Sample]) -> DiagramSummary {
    let refs: Vec<&Sample> = samples.iter().collect();
    DiagramSummary::of(&refs, Diagram::Qfl, 0.95).unwrap()
}

#[test]
fn reference_file_names_its_library_versions() {
    let r = reference();
    assert_eq!(r["versions"]["scipy"], "1.17.1");
    assert_eq!(r["versions"]["statsmodels"], "0.15.0");
    assert_eq!(r["versions"]["numpy"], "2.4.6");
}

#[test]
fn regularized_gamma_matches_scipy_gammainc() {
    for row in reference()["gamma"].as_array().unwrap() {
        let (a, x) = (f(&row["a"]), f(&row["x"]));
        let (p, q) = (f(&row["p"]), f(&row["q"]));
        assert!(
            close_rel(gamma_p(a, x), p, 1e-12),
            "P({a}, {x}) = {} vs {p}",
            gamma_p(a, x)
        );
        assert!(
            close_rel(gamma_q(a, x), q, 1e-11),
            "Q({a}, {x}) = {} vs {q}",
            gamma_q(a, x)
        );
    }
}

#[test]
fn chi2_tail_matches_scipy() {
    for row in reference()["chi2_sf"].as_array().unwrap() {
        let (x, df, sf) = (f(&row["x"]), f(&row["df"]), f(&row["sf"]));
        assert!(
            close_rel(chi2_sf(x, df), sf, 1e-11),
            "χ²({df}) at {x}: {} vs {sf}",
            chi2_sf(x, df)
        );
    }
}

#[test]
fn f_quantiles_and_tails_match_scipy() {
    for row in reference()["f_ppf"].as_array().unwrap() {
        let (q, d1, d2, ppf) = (f(&row["q"]), f(&row["d1"]), f(&row["d2"]), f(&row["ppf"]));
        assert!(
            close_rel(f_quantile(q, d1, d2), ppf, 1e-9),
            "F({d1},{d2}) q {q}"
        );
        if d1 == 2.0 {
            // The closed form of Weltje (2002) for two log-ratio coordinates.
            assert!(
                close_rel(f2_quantile(q, d2), ppf, 1e-12),
                "closed form F(2,{d2}) q {q}"
            );
        }
    }
    for row in reference()["f_sf"].as_array().unwrap() {
        let (x, d1, d2, sf) = (f(&row["x"]), f(&row["d1"]), f(&row["d2"]), f(&row["sf"]));
        assert!(
            close_rel(f_sf(x, d1, d2), sf, 1e-10),
            "F({d1},{d2}) tail at {x}"
        );
    }
}

#[test]
fn homogeneity_matches_scipy_chi2_contingency() {
    let r = reference();
    for row in r["contingency"].as_array().unwrap() {
        let name = row["group"].as_str().unwrap();
        let counts: Vec<[f64; 3]> = group(&r, name)
            .iter()
            .map(|s| Diagram::Qfl.pole_amounts(&s.framework))
            .collect();
        let h = Homogeneity::of(&counts).unwrap();
        assert!(close_rel(h.chi2, f(&row["chi2"]), 1e-12), "{name}");
        assert!(close_rel(h.p_value, f(&row["p"]), 1e-10), "{name}");
        assert_eq!(h.df as f64, f(&row["dof"]), "{name}");
    }
}

#[test]
fn means_covariances_and_regions_match_numpy_and_scipy() {
    let r = reference();
    for name in ["A", "B", "C"] {
        let s = summary(&group(&r, name));
        let want = &r["summaries"][name];
        for i in 0..3 {
            assert!(
                (s.mean.part(i) - f(&want["gmean_percent"][i])).abs() < 1e-9,
                "{name} mean"
            );
            assert!((s.pooled.unwrap().part(i) - f(&want["pooled_percent"][i])).abs() < 1e-9);
        }
        for i in 0..2 {
            assert!(
                (s.ilr_mean[i] - f(&want["ilr_mean"][i])).abs() < 1e-12,
                "{name} ilr mean"
            );
            for j in 0..2 {
                let c = s.ilr_covariance.as_ref().unwrap().get(i, j);
                assert!((c - f(&want["ilr_cov"][i][j])).abs() < 1e-12, "{name} cov");
            }
        }
        let reg = s.regions.as_ref().unwrap();
        assert!(close_rel(
            reg.confidence_bound,
            f(&want["confidence_bound"]),
            1e-10
        ));
        assert!(close_rel(
            reg.prediction_bound,
            f(&want["prediction_bound"]),
            1e-10
        ));
        for i in 0..3 {
            assert!(
                (reg.confidence[0][i] - f(&want["confidence_vertex0"][i])).abs() < 1e-8,
                "{name}"
            );
            assert!(
                (reg.prediction[0][i] - f(&want["prediction_vertex0"][i])).abs() < 1e-8,
                "{name}"
            );
        }
    }
}

#[test]
fn hotelling_two_sample_matches_statsmodels() {
    let r = reference();
    for row in r["hotelling"].as_array().unwrap() {
        let (a, b) = (row["a"].as_str().unwrap(), row["b"].as_str().unwrap());
        let rows = |n| -> Vec<Vec<f64>> {
            summary(&group(&r, n))
                .coordinates
                .iter()
                .map(|c| c.to_vec())
                .collect()
        };
        let h = Hotelling::test(&rows(a), &rows(b)).unwrap();
        assert!(close_rel(h.t2, f(&row["t2"]), 1e-10), "{a}{b} T²");
        assert!(close_rel(h.f, f(&row["f"]), 1e-10), "{a}{b} F");
        assert_eq!((h.df1, h.df2), (f(&row["df1"]), f(&row["df2"])));
        assert!(
            close_rel(h.p_value, f(&row["p"]), 1e-8),
            "{a}{b} p {} vs {}",
            h.p_value,
            row["p"]
        );
    }
}

#[test]
fn exact_permutation_test_matches_scipy_permutation_test() {
    let r = reference();
    for row in r["permutation"].as_array().unwrap() {
        let (a, b) = (row["a"].as_str().unwrap(), row["b"].as_str().unwrap());
        let rows = |n| -> Vec<Vec<f64>> {
            summary(&group(&r, n))
                .coordinates
                .iter()
                .map(|c| c.to_vec())
                .collect()
        };
        let p = Permutation::test(&rows(a), &rows(b), 9_999, 1).unwrap();
        assert_eq!(p.kind, PermutationKind::Exact);
        assert_eq!(p.splits as f64, f(&row["splits"]), "{a}{b}");
        assert!(
            (p.p_value - f(&row["p_exact"])).abs() < 1e-12,
            "{a}{b}: {} vs {}",
            p.p_value,
            row["p_exact"]
        );
    }
}
