//! Invariants across the core (proptest): closure, the ilr round trip in any dimension,
//! consistency under permutation of parts, membership probabilities summing to 1, field
//! placements under scaling of the counts, and metadata surviving a read and a write.
//!
//! Already covered elsewhere, so not repeated here: modes summing to 100 and the 3-part ilr
//! round trip (`properties.rs`), point-in-polygon against a winding-number reference
//! (`geometry_props.rs`), names under scaling (`src/naming/tests/scaling.rs`).

use proptest::prelude::*;
use provenance_core::batch::{write_modes, ModesOptions};
use provenance_core::composition::Composition3;
use provenance_core::counts::{Framework, Sample};
use provenance_core::diagram::Diagram;
use provenance_core::fields::{embedded, FieldSet};
use provenance_core::geometry::Polygon;
use provenance_core::input::{CountReader, ReadOptions};
use provenance_core::logratio::{close, clr, ilr, ilr_inverse};
use provenance_core::membership::{Estimator, Membership, MembershipOptions, Method, Posterior};
use provenance_core::modes::{Ratios, SampleModes};
use provenance_core::setting::Locator;
use std::sync::OnceLock;

/// Positive parts spanning twelve orders of magnitude, 2 to 9 of them.
fn positive_parts() -> impl Strategy<Value = Vec<f64>> {
    prop::collection::vec((1.0..10.0f64, -6i32..6), 2..10)
        .prop_map(|v| v.into_iter().map(|(m, e)| m * 10f64.powi(e)).collect())
}

/// Whole counts, zeros included, as a point count gives them.
fn framework() -> impl Strategy<Value = Framework> {
    prop::array::uniform8(prop_oneof![Just(0u32), 0u32..40, 0u32..2000]).prop_map(|a| Framework {
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

/// A random permutation of `0..n`, from `n` sort keys.
fn permutation(keys: &[u32], n: usize) -> Vec<usize> {
    let mut idx: Vec<usize> = (0..n).collect();
    idx.sort_by_key(|i| (keys[*i % keys.len()], *i));
    idx
}

fn permute<T: Copy>(x: &[T], pi: &[usize]) -> Vec<T> {
    pi.iter().map(|i| x[*i]).collect()
}

/// A diagram whose poles `i` and `j` trade places.
type Swap = (Diagram, usize, usize);

fn norm(v: &[f64]) -> f64 {
    v.iter().map(|x| x * x).sum::<f64>().sqrt()
}

fn diff(a: &[f64], b: &[f64]) -> Vec<f64> {
    a.iter().zip(b).map(|(x, y)| x - y).collect()
}

/// Every embedded field set, checked (parsed once).
fn embedded_sets() -> &'static [FieldSet] {
    static SETS: OnceLock<Vec<FieldSet>> = OnceLock::new();
    SETS.get_or_init(|| {
        embedded::ids()
            .into_iter()
            .map(|id| FieldSet::load(id).expect("embedded sets pass their check"))
            .collect()
    })
}

fn assert_sums_to_one(m: &Membership, tol: f64) -> Result<(), TestCaseError> {
    let sum: f64 = m.regions().iter().sum::<f64>() + m.outside();
    prop_assert!((sum - 1.0).abs() <= tol, "sum {sum} ({:?})", m.method());
    for p in m.regions().iter().chain([m.outside()].iter()) {
        prop_assert!((0.0..=1.0).contains(p), "probability {p}");
    }
    Ok(())
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]

    /// Closure (Aitchison 1986): proportions sum to 1, percent to 100, and the result does
    /// not depend on the scale of the input.
    #[test]
    fn closure_sums_to_one_and_100_and_ignores_scale(x in positive_parts(), k in 1e-3..1e3f64) {
        let c = close(&x).unwrap();
        prop_assert!((c.iter().sum::<f64>() - 1.0).abs() < 1e-12);
        let scaled: Vec<f64> = x.iter().map(|v| v * k).collect();
        for (a, b) in c.iter().zip(close(&scaled).unwrap()) {
            prop_assert!((a - b).abs() <= 1e-12 * a.max(1e-300) + 1e-300, "{a} vs {b}");
        }
        let three = [x[0], x[1 % x.len()], x[x.len() - 1]];
        let p = Composition3::close(three).unwrap();
        prop_assert!((p.parts().iter().sum::<f64>() - 100.0).abs() < 1e-10);
        prop_assert!(p.parts().iter().all(|v| (0.0..=100.0).contains(v)));
    }

    /// ilr then its inverse returns the closed composition, in every dimension (Egozcue et
    /// al. 2003: ilr is an isometry from the simplex onto R^(D-1)).
    #[test]
    fn ilr_then_inverse_returns_the_composition(x in positive_parts()) {
        let back = ilr_inverse(&ilr(&x));
        let c = close(&x).unwrap();
        prop_assert_eq!(back.len(), x.len());
        for (a, b) in c.iter().zip(&back) {
            prop_assert!((a - b).abs() <= 1e-9 * a, "{a} vs {b} for {x:?}");
        }
        // Scale invariance of the coordinates.
        let z = ilr(&x);
        for (a, b) in z.iter().zip(ilr(&c)) {
            prop_assert!((a - b).abs() < 1e-9);
        }
    }

    /// ilr is an isometry: Aitchison distance by ilr equals the distance by clr
    /// (Egozcue et al. 2003, Math. Geol. 35:279-300, eq. for the orthonormal basis).
    #[test]
    fn ilr_distances_equal_clr_distances(x in positive_parts(), y in positive_parts()) {
        let n = x.len().min(y.len());
        let (x, y) = (&x[..n], &y[..n]);
        let d_ilr = norm(&diff(&ilr(x), &ilr(y)));
        let d_clr = norm(&diff(&clr(x), &clr(y)));
        prop_assert!((d_ilr - d_clr).abs() <= 1e-9 * (1.0 + d_clr), "{d_ilr} vs {d_clr}");
    }

    /// Permuting the parts permutes the closure and the clr, keeps Aitchison distances, and
    /// the ilr inverse of the permuted coordinates is the permuted composition.
    #[test]
    fn permuting_parts_is_consistent_in_log_ratio_space(
        x in positive_parts(), y in positive_parts(), keys in prop::collection::vec(any::<u32>(), 9),
    ) {
        let n = x.len().min(y.len());
        let (x, y) = (&x[..n], &y[..n]);
        let pi = permutation(&keys, n);
        let (px, py) = (permute(x, &pi), permute(y, &pi));
        let (c, pc) = (close(x).unwrap(), close(&px).unwrap());
        for (a, b) in permute(&c, &pi).iter().zip(&pc) {
            prop_assert!((a - b).abs() <= 1e-12 * a);
        }
        for (a, b) in permute(&clr(x), &pi).iter().zip(clr(&px)) {
            prop_assert!((a - b).abs() < 1e-9);
        }
        let d = norm(&diff(&ilr(x), &ilr(y)));
        let pd = norm(&diff(&ilr(&px), &ilr(&py)));
        prop_assert!((d - pd).abs() <= 1e-9 * (1.0 + d), "{d} vs {pd}");
        for (a, b) in pc.iter().zip(ilr_inverse(&ilr(&px))) {
            prop_assert!((a - b).abs() <= 1e-9 * a);
        }
    }

    /// Swapping two categories that sit on different poles of one diagram swaps those poles
    /// (percent and sd) and the ratios built on them, and leaves diagrams that pool the two
    /// categories unchanged (pole definitions: Dickinson 1985, Dickinson & Suczek 1979).
    #[test]
    fn swapping_categories_swaps_poles(f in framework()) {
        let modes = |f: Framework| SampleModes::of(&Sample::counted("s", f));
        let base = modes(f);
        // (swapped framework, diagram whose poles i and j swap, diagrams that do not change)
        let pk = Framework { p: f.k, k: f.p, ..f };
        let lvls = Framework { lv: f.ls, ls: f.lv, ..f };
        let qpc = Framework { qp: f.c, c: f.qp, ..f };
        let cases: [(Framework, Option<Swap>, &[Diagram]); 3] = [
            (pk, Some((Diagram::Qmpk, 1, 2)), &[Diagram::Qfl, Diagram::Qmflt, Diagram::Qplvlsm, Diagram::Lmlvls]),
            (lvls, Some((Diagram::Lmlvls, 1, 2)), &[Diagram::Qfl, Diagram::Qmflt, Diagram::Qmpk]),
            (qpc, None, &[Diagram::Qfl, Diagram::Qmflt, Diagram::Qmpk, Diagram::Qplvlsm, Diagram::Lmlvls]),
        ];
        for (g, swap, same) in cases {
            let other = modes(g);
            if let Some((d, i, j)) = swap {
                match (base.get(d), other.get(d)) {
                    (Some(a), Some(b)) => {
                        let (pa, pb) = (a.percent.parts(), b.percent.parts());
                        let (sa, sb) = (a.sd().unwrap(), b.sd().unwrap());
                        let mut order = [0, 1, 2];
                        order.swap(i, j);
                        for (k, o) in order.into_iter().enumerate() {
                            prop_assert!((pa[k] - pb[o]).abs() < 1e-12, "{d}: {pa:?} vs {pb:?}");
                            prop_assert!((sa[k] - sb[o]).abs() < 1e-12);
                        }
                    }
                    (None, None) => {}
                    other => prop_assert!(false, "{d}: one side empty: {other:?}"),
                }
            }
            for d in same {
                prop_assert_eq!(base.get(*d).map(|m| m.percent), other.get(*d).map(|m| m.percent));
            }
        }
        let (r, rpk) = (Ratios::of(&f), Ratios::of(&pk));
        prop_assert_eq!(r.p_f, rpk.k_f);
        prop_assert_eq!(r.k_f, rpk.p_f);
        let l = f.lithics();
        prop_assert_eq!(Ratios::of(&lvls).lv_l, (l > 0.0).then(|| f.ls / l));
        let (rq, q) = (Ratios::of(&qpc), f.quartz());
        prop_assert_eq!(rq.qp_q, r.qp_q);
        prop_assert_eq!(rq.c_q, (q > 0.0).then(|| f.qp / q));
    }

    /// Relabelling the poles of a diagram maps the triangle onto itself, so containment of a
    /// point off the boundary is the same for the permuted polygon and point, for every field
    /// of every embedded set.
    #[test]
    fn point_in_polygon_is_consistent_under_permuted_poles(
        a in 0.0..100.0f64, t in 0.0..1.0f64, keys in prop::collection::vec(any::<u32>(), 3),
    ) {
        let p = [a, t * (100.0 - a), (1.0 - t) * (100.0 - a)];
        let pi = permutation(&keys, 3);
        let pp = [p[pi[0]], p[pi[1]], p[pi[2]]];
        for set in embedded_sets() {
            for field in &set.fields {
                let poly = &field.polygon;
                prop_assume!(poly.boundary_distance(p) > 1e-7);
                let permuted = Polygon::new(
                    poly.vertices().iter().map(|v| [v[pi[0]], v[pi[1]], v[pi[2]]]).collect(),
                );
                prop_assert_eq!(poly.contains(p), permuted.contains(pp), "{} {}", set.id, field.name);
            }
        }
    }

    /// Membership probabilities (every field, then "outside") lie in [0, 1] and sum to 1, by
    /// every method: the proven bound, integration and plain sampling.
    #[test]
    fn membership_probabilities_sum_to_one(
        counts in prop::array::uniform3(prop_oneof![Just(0.0f64), 0.0..8.0f64, 0.0..3000.0f64]),
        whole in any::<bool>(),
        set_index in 0usize..4,
    ) {
        let counts = if whole { counts.map(f64::round) } else { counts };
        let set = &embedded_sets()[set_index % embedded_sets().len()];
        let post = Posterior::jeffreys(counts).unwrap();
        let default = Estimator::new(set, MembershipOptions::default()).unwrap();
        let m = default.estimate(&post, 7, 0);
        assert_sums_to_one(&m, 1e-12)?;
        if let Some(m) = default.integrate(&post) {
            prop_assert_eq!(m.method(), Method::Integrated);
            assert_sums_to_one(&m, 1e-12)?;
        }
        if let Some(m) = default.bound(&post) {
            assert_sums_to_one(&m, 0.0)?;
        }
        let sampling = Estimator::new(
            set,
            MembershipOptions { draws: 500, shortcut: false, integrate: false, ..Default::default() },
        )
        .unwrap();
        let m = sampling.estimate(&post, 7, 0);
        prop_assert_eq!(m.method(), Method::Sampled { draws: 500 });
        assert_sums_to_one(&m, 1e-12)?;
    }

    /// Membership does not depend on how the poles are labelled: permuting the posterior's
    /// parts and every field's vertices alike gives the same probabilities, within the
    /// integration accuracy established by the tests (1e-6 each side, 1e-6 for the bound).
    #[test]
    fn membership_is_consistent_under_permuted_poles(
        counts in prop::array::uniform3(0u32..600), keys in prop::collection::vec(any::<u32>(), 3),
        set_index in 0usize..4,
    ) {
        let set = &embedded_sets()[set_index % embedded_sets().len()];
        let pi = permutation(&keys, 3);
        let counts = counts.map(f64::from);
        let permuted_counts = [counts[pi[0]], counts[pi[1]], counts[pi[2]]];
        let polygons: Vec<Polygon> = set
            .fields
            .iter()
            .map(|f| Polygon::new(f.polygon.vertices().iter().map(|v| [v[pi[0]], v[pi[1]], v[pi[2]]]).collect()))
            .collect();
        let named: Vec<(&str, &Polygon)> =
            set.fields.iter().map(|f| f.name.as_str()).zip(polygons.iter()).collect();
        let a = Estimator::new(set, MembershipOptions::default()).unwrap();
        let b = Estimator::new(&named[..], MembershipOptions::default()).unwrap();
        let ma = a.estimate(&Posterior::jeffreys(counts).unwrap(), 0, 0);
        let mb = b.estimate(&Posterior::jeffreys(permuted_counts).unwrap(), 0, 0);
        for (x, y) in ma.regions().iter().zip(mb.regions()).chain([(&ma.outside(), &mb.outside())]) {
            prop_assert!((x - y).abs() < 3e-6, "{} {counts:?} {pi:?}: {:?} vs {:?}", set.id, ma, mb);
        }
    }

    /// Scaling every count by a whole factor k changes neither the field a sample falls in
    /// nor its distance to the boundary, on every diagram of the embedded sets: percentages
    /// are ratios of the counts, and k·a/(k·n) rounds exactly as a/n for whole counts below
    /// 2^53. (Names under scaling: `src/naming/tests/scaling.rs`.)
    #[test]
    fn field_placements_do_not_change_when_counts_are_scaled(
        f in framework(), k in prop_oneof![2u32..20, 20u32..100_000, Just(1024u32)],
    ) {
        static LOCATOR: OnceLock<Locator> = OnceLock::new();
        let locator = LOCATOR.get_or_init(|| Locator::embedded().unwrap());
        let a = locator.locate(&Sample::counted("a", f));
        let b = locator.locate(&Sample::counted("b", f.scaled(f64::from(k))));
        for (i, (da, db)) in a.diagrams.iter().zip(&b.diagrams).enumerate() {
            prop_assert_eq!(
                locator.field_name(i, da), locator.field_name(i, db),
                "{}: {:?} vs {:?}", locator.sets()[i].id, da.placement, db.placement
            );
            prop_assert_eq!(da.placement, db.placement);
        }
    }
}

/// Metadata text with what breaks naive CSV handling: delimiters, quotes, line breaks,
/// non-ASCII letters, leading and trailing spaces, empty strings.
fn metadata_text() -> impl Strategy<Value = String> {
    prop::collection::vec(
        prop_oneof![
            Just(",".to_string()),
            Just("\"".to_string()),
            Just("\"\"".to_string()),
            Just(";".to_string()),
            Just("\t".to_string()),
            Just("\n".to_string()),
            Just("\r".to_string()),
            Just(" ".to_string()),
            Just("'".to_string()),
            Just("=1+2".to_string()),
            "[a-zA-Z0-9 ]{1,6}",
            "[äöüßéèñçøåÆœ]{1,3}",
            "[\u{3b1}-\u{3c9}\u{4e00}-\u{4e20}\u{1f300}-\u{1f320}]{1,3}",
        ],
        0..6,
    )
    // A CR directly before an LF is left out: the reader turns every CRLF into LF before
    // parsing, inside quoted cells too (`input/crlf.rs`), so such a cell would come back
    // with LF alone. A lone CR and a lone LF are kept and must survive.
    .prop_map(|v| {
        let mut s = v.concat();
        while s.contains("\r\n") {
            s = s.replace("\r\n", "\r");
        }
        s
    })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(128))]

    /// Metadata read from a table comes out of the modes CSV unchanged: the same columns, the
    /// same header names, every value byte for byte (parsed back with the csv crate).
    #[test]
    fn reading_then_writing_csv_round_trips_the_metadata(
        names in prop::collection::vec("[a-z][a-z _äé]{0,8}[a-z]", 1..4),
        rows in prop::collection::vec((prop::collection::vec(metadata_text(), 3), prop::array::uniform8(0u32..300)), 1..25),
    ) {
        let names: Vec<String> = names.iter().enumerate().map(|(i, n)| format!("note{i} {n}")).collect();
        let mut w = csv::WriterBuilder::new().from_writer(Vec::new());
        let mut header = vec!["sample".to_string()];
        header.extend(["Qm", "Qp", "C", "P", "K", "Lv", "Ls", "Lm"].map(String::from));
        header.extend(names.iter().cloned());
        w.write_record(&header).unwrap();
        let mut expected = Vec::new();
        for (i, (meta, counts)) in rows.iter().enumerate() {
            let mut rec = vec![format!("S-{i}")];
            rec.extend(counts.iter().map(|c| c.to_string()));
            let meta: Vec<String> = meta.iter().take(names.len()).cloned().collect();
            rec.extend(meta.iter().cloned());
            w.write_record(&rec).unwrap();
            expected.push(meta);
        }
        let table = w.into_inner().unwrap();

        let reader = CountReader::from_reader("t.csv", std::io::Cursor::new(table), ReadOptions::default()).unwrap();
        prop_assert_eq!(reader.metadata_columns(), &names[..]);
        let mut out = Vec::new();
        let n = write_modes(reader, &mut out, "out.csv", ModesOptions::default()).unwrap();
        prop_assert_eq!(n, rows.len());

        let mut back = csv::ReaderBuilder::new().from_reader(out.as_slice());
        let head: Vec<String> = back.headers().unwrap().iter().map(String::from).collect();
        let cols: Vec<usize> = names
            .iter()
            .map(|n| head.iter().position(|h| h == n).expect("every metadata column is written"))
            .collect();
        let mut got = Vec::new();
        for rec in back.records() {
            let rec = rec.unwrap();
            got.push(cols.iter().map(|c| rec[*c].to_string()).collect::<Vec<_>>());
        }
        prop_assert_eq!(got, expected);
    }
}
