//! Garzanti (2019, Earth-Sci. Rev. 192:545-563): components above 10% of QFL, named from least
//! to most abundant (checked). Default poles: Q = Qm + Qp + C, F = P + K, L = Lv + Ls + Lm.

use super::counts;
use crate::naming::{ChertPlacement, Garzanti, NamingScheme};

fn name(c: [u32; 8]) -> String {
    Garzanti::default()
        .classify(&counts(c))
        .name()
        .expect("a Garzanti name")
        .to_string()
}

//                Qm  Qp  C   P   K   Lv  Ls  Lm

/// All 15 fields, each derived from Garzanti's (2019) rule; percentages beside each.
#[test]
fn worked_examples_all_fifteen_fields_garzanti_2019() {
    // Q = 150 + 20 + 10 = 180 (60%), F = 70 (23.3%), L = 50 (16.7%): Q > F > L > 10.
    assert_eq!(
        name([150, 20, 10, 40, 30, 20, 20, 10]),
        "litho-feldspatho-quartzose"
    );
    // Q 60%, L 23.3%, F 16.7%.
    assert_eq!(
        name([180, 0, 0, 50, 0, 70, 0, 0]),
        "feldspatho-litho-quartzose"
    );
    // F 60%, Q 23.3%, L 16.7%.
    assert_eq!(
        name([70, 0, 0, 100, 80, 30, 10, 10]),
        "litho-quartzo-feldspathic"
    );
    // F 60%, L 23.3%, Q 16.7%.
    assert_eq!(
        name([50, 0, 0, 180, 0, 70, 0, 0]),
        "quartzo-litho-feldspathic"
    );
    // L 60%, Q 23.3%, F 16.7%.
    assert_eq!(
        name([60, 5, 5, 50, 0, 120, 40, 20]),
        "feldspatho-quartzo-lithic"
    );
    // L 60%, F 23.3%, Q 16.7%.
    assert_eq!(
        name([50, 0, 0, 70, 0, 180, 0, 0]),
        "quartzo-feldspatho-lithic"
    );
    // Q 66.7%, F 26.7%, L 6.7% (not above 10).
    assert_eq!(name([200, 0, 0, 40, 40, 20, 0, 0]), "feldspatho-quartzose");
    // Q 66.7%, L 26.7%, F 6.7%.
    assert_eq!(name([180, 10, 10, 20, 0, 0, 50, 30]), "litho-quartzose");
    // F 66.7%, Q 26.7%, L 6.7%.
    assert_eq!(name([80, 0, 0, 200, 0, 20, 0, 0]), "quartzo-feldspathic");
    // F 66.7%, L 26.7%, Q 6.7%.
    assert_eq!(name([20, 0, 0, 150, 50, 80, 0, 0]), "litho-feldspathic");
    // L 66.7%, Q 26.7%, F 6.7%.
    assert_eq!(name([80, 0, 0, 20, 0, 100, 0, 100]), "quartzo-lithic");
    // L 66.7%, F 26.7%, Q 6.7%.
    assert_eq!(name([20, 0, 0, 80, 0, 200, 0, 0]), "feldspatho-lithic");
    // Q 90%, F 5%, L 5%.
    assert_eq!(name([250, 10, 10, 15, 0, 15, 0, 0]), "quartzose");
    // F 90%, Q 5%, L 5%.
    assert_eq!(name([15, 0, 0, 170, 100, 15, 0, 0]), "feldspathic");
    // L 90%, Q 5%, F 5%.
    assert_eq!(name([15, 0, 0, 15, 0, 270, 0, 0]), "lithic");
}

#[test]
fn fifteen_distinct_names() {
    let mut names = std::collections::BTreeSet::new();
    for q in (0..=300).step_by(10) {
        for f in (0..=300 - q).step_by(10) {
            let l = 300 - q - f;
            names.insert(name([q, 0, 0, f, 0, l, 0, 0]));
        }
    }
    assert_eq!(names.len(), 15, "{names:?}");
}

// Boundary tests: a component at exactly 10% is left out ("exceed" is strict), just above is
// named, for each pole.

#[test]
fn l_at_10_is_left_out_and_just_above_is_named() {
    // L = 30 of 300 = 10% exactly.
    assert_eq!(name([200, 0, 0, 70, 0, 30, 0, 0]), "feldspatho-quartzose");
    // L = 301 of 3000 = 10.03%.
    assert_eq!(
        name([1999, 0, 0, 700, 0, 301, 0, 0]),
        "litho-feldspatho-quartzose"
    );
}

#[test]
fn q_at_10_is_left_out_and_just_above_is_named() {
    assert_eq!(name([30, 0, 0, 200, 0, 70, 0, 0]), "litho-feldspathic");
    assert_eq!(
        name([301, 0, 0, 1999, 0, 700, 0, 0]),
        "quartzo-litho-feldspathic"
    );
}

#[test]
fn f_at_10_is_left_out_and_just_above_is_named() {
    assert_eq!(name([200, 0, 0, 30, 0, 70, 0, 0]), "litho-quartzose");
    assert_eq!(
        name([1999, 0, 0, 301, 0, 700, 0, 0]),
        "feldspatho-litho-quartzose"
    );
}

// Ties (sandprov's rule): the pole earlier in Q, F, L order counts as the more abundant.

#[test]
fn q_f_tie_and_either_side() {
    // Q = F = 135 (45%), L = 30 (10%, left out).
    assert_eq!(name([135, 0, 0, 135, 0, 30, 0, 0]), "feldspatho-quartzose");
    assert_eq!(name([135, 0, 0, 136, 0, 29, 0, 0]), "quartzo-feldspathic");
    assert_eq!(name([136, 0, 0, 135, 0, 29, 0, 0]), "feldspatho-quartzose");
}

#[test]
fn f_l_tie_and_either_side() {
    // Q 120 (40%), F = L = 90 (30%).
    assert_eq!(
        name([120, 0, 0, 90, 0, 90, 0, 0]),
        "litho-feldspatho-quartzose"
    );
    assert_eq!(
        name([120, 0, 0, 89, 0, 91, 0, 0]),
        "feldspatho-litho-quartzose"
    );
    // A three-way tie follows the same order.
    assert_eq!(
        name([100, 0, 0, 100, 0, 100, 0, 0]),
        "litho-feldspatho-quartzose"
    );
}

#[test]
fn tie_rule_is_stated() {
    let n = Garzanti::default().classify(&counts([120, 0, 0, 90, 0, 90, 0, 0]));
    let rule = n.verdict.explanation();
    assert!(rule.contains("F and L tie"), "{rule}");
    assert!(rule.contains("sandprov's tie rule"), "{rule}");
}

#[test]
fn chert_placement_is_configurable_with_q_as_default() {
    // Qm 240, chert 45, P 15. Default, chert in Q: Q 95%, F 5%, L 0: quartzose.
    let s = counts([240, 0, 45, 15, 0, 0, 0, 0]);
    let g = Garzanti::default();
    assert_eq!(g.chert, ChertPlacement::Quartz);
    assert_eq!(g.classify(&s).name(), Some("quartzose"));
    // Chert in L: Q 80%, F 5%, L 15%: litho-quartzose.
    let lithic = Garzanti {
        chert: ChertPlacement::Lithic,
    };
    let n = lithic.classify(&s);
    assert_eq!(n.name(), Some("litho-quartzose"));
    assert_eq!(
        n.poles.unwrap().get("L").unwrap().categories.to_string(),
        "C + Lv + Ls + Lm"
    );
}

#[test]
fn default_poles_equal_the_qfl_mode() {
    use crate::diagram::Diagram;
    use crate::modes::DiagramMode;
    let s = counts([150, 20, 10, 40, 30, 20, 20, 10]);
    let qfl = DiagramMode::of(&s, Diagram::Qfl).unwrap();
    let n = Garzanti::default().classify(&s);
    assert_eq!(n.poles.unwrap().percents(), qfl.percent.parts());
}
