//! Property: names do not change when every count (matrix included) is multiplied by the
//! same factor. Factors are whole numbers and powers of two, the scalings that keep counts
//! exact in floating point.

use crate::counts::{Counting, Framework, NonFramework, Sample};
use crate::naming::{ChertPlacement, SchemeSet};
use proptest::prelude::*;

fn sample(c: [u32; 8], matrix: Option<u32>) -> Sample {
    let [qm, qp, c, p, k, lv, ls, lm] = c.map(f64::from);
    Sample {
        id: "p".into(),
        line: 0,
        framework: Framework {
            qm,
            qp,
            c,
            p,
            k,
            lv,
            ls,
            lm,
        },
        other: NonFramework {
            matrix: matrix.map(f64::from),
            ..Default::default()
        },
        counting: Counting::Counted,
        metadata: Vec::new(),
    }
}

fn factor() -> impl Strategy<Value = f64> {
    prop_oneof![
        (1u32..=1000).prop_map(f64::from),
        (-10i32..=10).prop_map(|e| 2f64.powi(e)),
    ]
}

fn schemes(chert: ChertPlacement) -> SchemeSet {
    let mut set = SchemeSet::standard();
    for id in ["folk", "garzanti", "pettijohn"] {
        set.place_chert(id, chert).unwrap();
    }
    set
}

fn chert() -> impl Strategy<Value = ChertPlacement> {
    prop_oneof![
        Just(ChertPlacement::Quartz),
        Just(ChertPlacement::Lithic),
        Just(ChertPlacement::Omit),
    ]
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(2000))]

    #[test]
    fn names_do_not_change_when_counts_are_scaled(
        c in proptest::array::uniform8(0u32..400),
        matrix in proptest::option::of(0u32..1500),
        k in factor(),
        chert in chert(),
    ) {
        let s = sample(c, matrix);
        let mut scaled = s.clone();
        scaled.framework = s.framework.scaled(k);
        scaled.other = s.other.scaled(k);
        let set = schemes(chert);
        for (scheme, (a, b)) in set.iter().zip(set.classify(&s).iter().zip(set.classify(&scaled).iter())) {
            prop_assert_eq!(a.name(), b.name(), "{} at k = {}", scheme.id(), k);
            prop_assert_eq!(a.subtype_name(), b.subtype_name(), "{} subtype at k = {}", scheme.id(), k);
            prop_assert_eq!(a.poles.is_some(), b.poles.is_some());
            if let (Some(pa), Some(pb)) = (a.poles, b.poles) {
                for (x, y) in pa.percents().iter().zip(pb.percents()) {
                    prop_assert!((x - y).abs() < 1e-9);
                }
            }
        }
    }

    /// Near the limits the counts sit one point either side of a threshold; scaling must not
    /// move them across it.
    #[test]
    fn names_at_limits_survive_scaling(
        base in prop_oneof![Just([190u32, 5, 5]), Just([150, 30, 20]), Just([100, 75, 25]),
                            Just([100, 50, 50]), Just([100, 25, 75]), Just([200, 70, 30]),
                            Just([135, 135, 30])],
        nudge in -1i32..=1,
        k in factor(),
    ) {
        let [q, f, r] = base;
        let f = (f as i32 + nudge) as u32;
        let s = sample([q, 0, 0, f, 0, r, 0, 0], Some(q + f + r));
        let mut scaled = s.clone();
        scaled.framework = s.framework.scaled(k);
        scaled.other = s.other.scaled(k);
        let set = SchemeSet::standard();
        for (a, b) in set.classify(&s).iter().zip(set.classify(&scaled).iter()) {
            prop_assert_eq!(a.name(), b.name());
        }
    }
}
