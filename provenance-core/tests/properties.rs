//! Invariants of recalculation and counting error (proptest).

use proptest::prelude::*;
use provenance_core::logratio::{ilr, ilr_inverse};
use provenance_core::prelude::*;

fn framework() -> impl Strategy<Value = Framework> {
    prop::array::uniform8(0u32..500).prop_map(|a| Framework {
        qm: a[0] as f64,
        qp: a[1] as f64,
        c: a[2] as f64,
        p: a[3] as f64,
        k: a[4] as f64,
        lv: a[5] as f64,
        ls: a[6] as f64,
        lm: a[7] as f64,
    })
}

proptest! {
    #[test]
    fn percentages_sum_to_100(f in framework()) {
        let m = SampleModes::of(&Sample::counted("p", f));
        for mode in m.diagrams.iter().flatten() {
            let sum: f64 = mode.percent.parts().iter().sum();
            prop_assert!((sum - 100.0).abs() < 1e-9);
            prop_assert!(mode.percent.parts().iter().all(|p| (0.0..=100.0).contains(p)));
        }
    }

    #[test]
    fn scaling_counts_keeps_percentages_and_divides_sd_by_sqrt_k(f in framework(), k in 2u32..20) {
        let a = SampleModes::of(&Sample::counted("a", f));
        let b = SampleModes::of(&Sample::counted("b", f.scaled(k as f64)));
        for (ma, mb) in a.diagrams.iter().zip(&b.diagrams) {
            prop_assert_eq!(ma.is_some(), mb.is_some());
            if let (Some(ma), Some(mb)) = (ma, mb) {
                let (sa, sb) = (ma.sd().unwrap(), mb.sd().unwrap());
                for i in 0..3 {
                    prop_assert!((ma.percent.part(i) - mb.percent.part(i)).abs() < 1e-9);
                    prop_assert!((sb[i] - sa[i] / (k as f64).sqrt()).abs() < 1e-9);
                }
            }
        }
    }

    #[test]
    fn wilson_and_clopper_pearson_contain_the_observed_proportion(k in 0u32..500, extra in 0u32..500) {
        let n = (k + extra).max(1) as f64;
        let k = (k as f64).min(n);
        let p = 100.0 * k / n;
        let w = provenance_core::stats::wilson(k, n, provenance_core::stats::Z95);
        let c = provenance_core::stats::clopper_pearson(k, n, 0.05);
        prop_assert!(w.lower - 1e-9 <= p && p <= w.upper + 1e-9);
        prop_assert!(c.lower - 1e-9 <= p && p <= c.upper + 1e-9);
    }

    #[test]
    fn ilr_round_trips(a in 0.001f64..1.0, b in 0.001f64..1.0, c in 0.001f64..1.0) {
        let s = a + b + c;
        let back = ilr_inverse(&ilr(&[a, b, c]));
        prop_assert!((back[0] - a / s).abs() < 1e-12);
        prop_assert!((back[1] - b / s).abs() < 1e-12);
        prop_assert!((back[2] - c / s).abs() < 1e-12);
    }
}
