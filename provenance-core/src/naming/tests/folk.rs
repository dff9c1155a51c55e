//! Folk (1980). Class limits: Folk (1980), from memory with high confidence (the fact sheet's
//! [memory, high confidence] entry); poles Q = Qm + Qp, F = P + K, R = Lv + Ls + Lm + C.
//! Subtype rules are from memory, unverified (see the module documentation).

use super::counts;
use crate::naming::{ChertPlacement, Folk, NamingScheme};

fn folk(c: [u32; 8]) -> (Option<String>, Option<String>) {
    let n = Folk::default().classify(&counts(c));
    (
        n.name().map(String::from),
        n.subtype_name().map(String::from),
    )
}

fn name(c: [u32; 8]) -> String {
    folk(c).0.expect("a Folk name")
}

//                Qm  Qp  C   P   K   Lv  Ls  Lm

/// Worked examples derived from Folk's (1980) QFR classes; the derivation is beside each.
#[test]
fn worked_examples_folk_1980() {
    // Q = 280 + 12 = 292, F = 5, R = 3 + 0 = 3 (chert in R); Q = 97.3% ≥ 95.
    assert_eq!(name([280, 12, 3, 3, 2, 0, 0, 0]), "quartzarenite");
    // Q = 240 (80%), F = 45 (15%), R = 15 (5%): 75 ≤ Q < 95 and F > R.
    assert_eq!(name([230, 10, 0, 25, 20, 5, 5, 5]), "subarkose");
    // Q = 235 (78.3%), F = 12, R = 20 + 10 + 13 + 10 = 53: R > F.
    assert_eq!(name([220, 15, 20, 8, 4, 10, 13, 10]), "sublitharenite");
    // Q = 150 (50%), F = 130, R = 20: F/R = 6.5 > 3.
    assert_eq!(name([140, 10, 0, 60, 70, 8, 6, 6]), "arkose");
    // Q = 126 (42%), F = 90, R = 4 + 40 + 20 + 20 = 84: F/R = 1.07, between 1 and 3.
    assert_eq!(name([120, 6, 4, 60, 30, 40, 20, 20]), "lithic arkose");
    // Q = 120 (40%), F = 60, R = 10 + 60 + 30 + 20 = 120: F/R = 0.5, between 1/3 and 1.
    assert_eq!(
        name([100, 20, 10, 40, 20, 60, 30, 20]),
        "feldspathic litharenite"
    );
    // Q = 66 (22%), F = 24, R = 4 + 150 + 30 + 26 = 210: F/R = 0.11 < 1/3.
    assert_eq!(name([60, 6, 4, 20, 4, 150, 30, 26]), "litharenite");
    // Q = 160 (53.3%), F = 15, R = 125: F/R = 0.12 < 1/3.
    assert_eq!(name([140, 20, 0, 10, 5, 10, 15, 100]), "litharenite");
    // Q = 150 (50%), F = 9, R = 90 + 10 + 30 + 11 = 141: F/R = 0.06 < 1/3.
    assert_eq!(name([150, 0, 90, 6, 3, 10, 30, 11]), "litharenite");
}

/// Second level, from memory, unverified: litharenites by the largest rock-fragment family,
/// arkoses by the dominant feldspar. Examples derived from that rule.
#[test]
fn worked_subtypes_from_memory() {
    // V = 150, M = 26, S = 30 + 4 = 34: volcanic largest.
    assert_eq!(
        folk([60, 6, 4, 20, 4, 150, 30, 26]).1.as_deref(),
        Some("volcanic arenite")
    );
    // V = 10, M = 100, S = 15.
    assert_eq!(
        folk([140, 20, 0, 10, 5, 10, 15, 100]).1.as_deref(),
        Some("phyllarenite")
    );
    // Q = 140 (46.7%), F = 18, R = 142, F/R = 0.13; S = 100 + 15 = 115 largest, C 15 < Ls 100.
    assert_eq!(
        folk([130, 10, 15, 12, 6, 12, 100, 15]),
        (Some("litharenite".into()), Some("sedarenite".into()))
    );
    // S = 30 + 90 = 120 largest and C 90 > Ls 30.
    assert_eq!(
        folk([150, 0, 90, 6, 3, 10, 30, 11]).1.as_deref(),
        Some("chert arenite")
    );
    // Arkose with K 70 > P 60; and with P 100 > K 30 (Q 150/300 = 50%, F/R 6.5).
    assert_eq!(
        folk([140, 10, 0, 60, 70, 8, 6, 6]).1.as_deref(),
        Some("K-feldspar arkose")
    );
    assert_eq!(
        folk([140, 10, 0, 100, 30, 8, 6, 6]).1.as_deref(),
        Some("plagioclase arkose")
    );
    // Classes without a second level carry none.
    assert_eq!(folk([230, 10, 0, 25, 20, 5, 5, 5]).1, None);
}

#[test]
fn calclithite_is_said_to_be_out_of_reach() {
    let n = Folk::default().classify(&counts([130, 10, 15, 12, 6, 12, 100, 15]));
    let rule = n.subtype.unwrap().explanation().to_string();
    assert!(rule.contains("calclithite cannot be reached"), "{rule}");
    assert!(rule.contains("from memory"), "{rule}");
}

// Boundary tests: both sides of every limit. The inclusive side is sandprov's documented
// convention (module documentation of `folk`).

#[test]
fn q_95_is_quartzarenite_and_just_below_is_not() {
    // Q = 190 of 200 = 95% exactly.
    assert_eq!(name([190, 0, 0, 5, 0, 5, 0, 0]), "quartzarenite");
    // Q = 18999 of 20000 = 94.995%.
    assert_eq!(name([18999, 0, 0, 500, 0, 501, 0, 0]), "sublitharenite");
    assert_eq!(name([18999, 0, 0, 501, 0, 500, 0, 0]), "subarkose");
}

#[test]
fn q_75_is_sub_and_just_below_is_not() {
    // Q = 150 of 200 = 75% exactly, F 30 > R 20.
    assert_eq!(name([150, 0, 0, 30, 0, 20, 0, 0]), "subarkose");
    // Q = 14999 of 20000 = 74.995%, F/R = 1.5.
    assert_eq!(name([14999, 0, 0, 3001, 0, 2000, 0, 0]), "lithic arkose");
}

#[test]
fn f_equal_r_above_q_75_is_sublitharenite() {
    // Q 80%, F = R = 20.
    assert_eq!(name([160, 0, 0, 20, 0, 20, 0, 0]), "sublitharenite");
    assert_eq!(name([160, 0, 0, 21, 0, 19, 0, 0]), "subarkose");
    assert_eq!(name([160, 0, 0, 19, 0, 21, 0, 0]), "sublitharenite");
}

#[test]
fn f_r_3_is_lithic_arkose_and_above_is_arkose() {
    // Q 50%, F/R = 75/25 = 3 exactly.
    assert_eq!(name([100, 0, 0, 75, 0, 25, 0, 0]), "lithic arkose");
    // F/R = 301/100 = 3.01, Q = 400/801 = 49.9%.
    assert_eq!(name([400, 0, 0, 301, 0, 100, 0, 0]), "arkose");
    // F/R = 299/100, Q = 400/799.
    assert_eq!(name([400, 0, 0, 299, 0, 100, 0, 0]), "lithic arkose");
}

#[test]
fn f_r_1_below_q_75_is_feldspathic_litharenite() {
    assert_eq!(
        name([100, 0, 0, 50, 0, 50, 0, 0]),
        "feldspathic litharenite"
    );
    assert_eq!(name([100, 0, 0, 51, 0, 49, 0, 0]), "lithic arkose");
    assert_eq!(
        name([100, 0, 0, 49, 0, 51, 0, 0]),
        "feldspathic litharenite"
    );
}

#[test]
fn f_r_one_third_is_feldspathic_litharenite_and_below_is_litharenite() {
    // F/R = 25/75 = 1/3 exactly.
    assert_eq!(
        name([100, 0, 0, 25, 0, 75, 0, 0]),
        "feldspathic litharenite"
    );
    // F/R = 100/301 = 0.3322.
    assert_eq!(name([400, 0, 0, 100, 0, 301, 0, 0]), "litharenite");
    // F/R = 100/299 = 0.3344.
    assert_eq!(
        name([400, 0, 0, 100, 0, 299, 0, 0]),
        "feldspathic litharenite"
    );
}

#[test]
fn rules_name_the_exact_limit_and_the_convention() {
    let rule = |c| {
        Folk::default()
            .classify(&counts(c))
            .verdict
            .explanation()
            .to_string()
    };
    assert!(rule([100, 0, 0, 75, 0, 25, 0, 0]).contains("exactly 3"));
    assert!(rule([100, 0, 0, 50, 0, 50, 0, 0]).contains("lithic side"));
    assert!(rule([190, 0, 0, 5, 0, 5, 0, 0]).contains("Q is 95.0% of Q + F + R, at or above 95%"));
    // 94.995% must not be printed as 95.0% beside "below".
    let r = rule([18999, 0, 0, 500, 0, 501, 0, 0]);
    assert!(r.contains("94.995%"), "{r}");
}

#[test]
fn arkose_without_rock_fragments() {
    let n = Folk::default().classify(&counts([100, 0, 0, 60, 40, 0, 0, 0]));
    assert_eq!(n.name(), Some("arkose"));
    assert_eq!(n.measure("F/R").unwrap().value, None);
    assert!(n.verdict.explanation().contains("no rock fragments"));
}

#[test]
fn litharenite_family_tie_gives_no_subtype_and_one_more_breaks_it() {
    // Q 80 of 200 (40%), F 10, R 110 (Lv 50, Lm 50, Ls 10): F/R 0.09.
    let n = Folk::default().classify(&counts([80, 0, 0, 5, 5, 50, 10, 50]));
    assert_eq!(n.name(), Some("litharenite"));
    let sub = n.subtype.unwrap();
    assert_eq!(sub.name(), None);
    assert!(sub
        .explanation()
        .contains("volcanic and metamorphic families tie"));
    assert_eq!(
        folk([80, 0, 0, 5, 5, 51, 10, 50]).1.as_deref(),
        Some("volcanic arenite")
    );
    assert_eq!(
        folk([80, 0, 0, 5, 5, 50, 10, 51]).1.as_deref(),
        Some("phyllarenite")
    );
}

#[test]
fn chert_equal_to_other_sedimentary_fragments_is_sedarenite() {
    // R = C 60 + Ls 60 + Lv 10 + Lm 10; S = 120 largest; C = Ls.
    assert_eq!(
        folk([100, 0, 60, 5, 5, 10, 60, 10]).1.as_deref(),
        Some("sedarenite")
    );
    assert_eq!(
        folk([100, 0, 61, 5, 5, 10, 60, 10]).1.as_deref(),
        Some("chert arenite")
    );
}

#[test]
fn equal_feldspars_give_no_arkose_subtype() {
    let n = Folk::default().classify(&counts([100, 0, 0, 50, 50, 10, 0, 0]));
    assert_eq!(n.name(), Some("arkose"));
    assert_eq!(n.subtype_name(), None);
    assert!(n.subtype.is_some());
    assert_eq!(
        folk([100, 0, 0, 51, 50, 10, 0, 0]).1.as_deref(),
        Some("plagioclase arkose")
    );
    assert_eq!(
        folk([100, 0, 0, 50, 51, 10, 0, 0]).1.as_deref(),
        Some("K-feldspar arkose")
    );
}

/// The chert-placement check: Qm 270 and chert 30. Folk puts chert in R, so Q is 90%
/// and R 10%: a sublitharenite. Counted as quartz, Q is 100%: a quartzarenite.
#[test]
fn chert_placement_changes_the_folk_name() {
    let s = counts([270, 0, 30, 0, 0, 0, 0, 0]);
    assert_eq!(Folk::default().classify(&s).name(), Some("sublitharenite"));
    let as_quartz = Folk {
        chert: ChertPlacement::Quartz,
    };
    let n = as_quartz.classify(&s);
    assert_eq!(n.name(), Some("quartzarenite"));
    assert!(n.verdict.explanation().contains("chert counted with Q"));
    // The option gives the same name as recounting the chert as polycrystalline quartz.
    let recounted = counts([270, 30, 0, 0, 0, 0, 0, 0]);
    assert_eq!(
        Folk::default().classify(&recounted).name(),
        Some("quartzarenite")
    );
    // Left out, chert no longer counts anywhere.
    let omitted = Folk {
        chert: ChertPlacement::Omit,
    };
    assert_eq!(omitted.classify(&s).poles.unwrap().total(), 270.0);
}

#[test]
fn poles_report_their_categories() {
    let n = Folk::default().classify(&counts([100, 20, 10, 40, 20, 60, 30, 20]));
    let p = n.poles.unwrap();
    assert_eq!(p.get("Q").unwrap().categories.to_string(), "Qm + Qp");
    assert_eq!(p.get("F").unwrap().categories.to_string(), "P + K");
    assert_eq!(
        p.get("R").unwrap().categories.to_string(),
        "C + Lv + Ls + Lm"
    );
    assert_eq!(p.percents(), [40.0, 20.0, 40.0]);
}

#[test]
fn no_grains_no_name() {
    let n = Folk::default().classify(&counts([0; 8]));
    assert_eq!(n.name(), None);
    assert!(n.poles.is_none());
    let only_chert = counts([0, 0, 5, 0, 0, 0, 0, 0]);
    let omitted = Folk {
        chert: ChertPlacement::Omit,
    };
    assert!(omitted
        .classify(&only_chert)
        .verdict
        .explanation()
        .contains("left out"));
}
