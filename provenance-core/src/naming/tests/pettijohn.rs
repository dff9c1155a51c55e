//! Pettijohn, Potter & Siever (1987): the class rules are from memory (fact sheet [memory]):
//! arenite below 15% matrix, wacke from 15%; quartz cut 95% Q; 75% Q for the sub- classes;
//! F versus R for the rest. The 15% split and the 75% matrix limit of wackes are Dott's (1964),
//! checked. Poles: Q = Qm + Qp + C, F = P + K, R = Lv + Ls + Lm.

use super::{counts, with_matrix};
use crate::naming::{ChertPlacement, NamingScheme, Pettijohn};

fn name(c: [u32; 8], matrix: u32) -> Option<String> {
    Pettijohn::default()
        .classify(&with_matrix(counts(c), matrix))
        .name()
        .map(String::from)
}

fn named(c: [u32; 8], matrix: u32) -> String {
    name(c, matrix).expect("a Pettijohn name")
}

//                Qm  Qp  C   P   K   Lv  Ls  Lm

/// Worked examples derived from the Pettijohn et al. (1987) rules; derivation beside each.
#[test]
fn worked_examples_pettijohn_potter_siever_1987() {
    // Matrix 20 / 320 = 6.3% (arenite); Q = 280 + 10 + 5 = 295 of 300 = 98.3%.
    assert_eq!(named([280, 10, 5, 3, 0, 2, 0, 0], 20), "quartz arenite");
    // Matrix 30 / 330 = 9.1%; Q 240 (80%), F 45 > R 15.
    assert_eq!(named([230, 10, 0, 30, 15, 10, 5, 0], 30), "subarkose");
    // Matrix 0; Q = 220 + 10 + 10 = 240 (80%), F 10 < R 50.
    assert_eq!(named([220, 10, 10, 10, 0, 30, 10, 10], 0), "sublitharenite");
    // Matrix 40 / 340 = 11.8%; Q 150 (50%), F 120 > R 30.
    assert_eq!(named([150, 0, 0, 60, 60, 20, 10, 0], 40), "arkosic arenite");
    // Matrix 10 / 310 = 3.2%; Q 150 (50%), F 30 < R 120.
    assert_eq!(named([140, 10, 0, 30, 0, 80, 20, 20], 10), "lithic arenite");
    // Matrix 100 / 400 = 25% (wacke); Q 295 of 300 = 98.3%.
    assert_eq!(named([290, 5, 0, 3, 0, 2, 0, 0], 100), "quartz wacke");
    // Matrix 120 / 420 = 28.6%; Q 150 (50%), F 100 > R 50.
    assert_eq!(
        named([150, 0, 0, 70, 30, 30, 20, 0], 120),
        "feldspathic greywacke"
    );
    // Matrix 150 / 450 = 33.3%; Q 140 (46.7%), F 20 < R 140.
    assert_eq!(
        named([120, 10, 10, 20, 0, 100, 20, 20], 150),
        "lithic greywacke"
    );
    // Matrix 60 / 360 = 16.7%; Q 255 (85%): wackes have no sub- classes, F 30 > R 15.
    assert_eq!(
        named([255, 0, 0, 30, 0, 15, 0, 0], 60),
        "feldspathic greywacke"
    );
}

#[test]
fn no_matrix_column_gives_null_with_a_reason() {
    let n = Pettijohn::default().classify(&counts([280, 10, 5, 3, 0, 2, 0, 0]));
    assert_eq!(n.name(), None);
    assert!(n.verdict.explanation().contains("no matrix column"));
    // The poles are still reported.
    assert!(n.poles.is_some());
    assert_eq!(n.measure("matrix").unwrap().value, None);
}

// Boundary tests, both sides of every limit (sandprov's inclusive sides, module docs).

#[test]
fn matrix_15_is_wacke_and_just_below_is_arenite() {
    // 300 / 2000 = 15% exactly; 299 / 1999 = 14.96%.
    assert_eq!(named([1700, 0, 0, 0, 0, 0, 0, 0], 300), "quartz wacke");
    assert_eq!(named([1700, 0, 0, 0, 0, 0, 0, 0], 299), "quartz arenite");
}

#[test]
fn matrix_75_is_wacke_and_above_has_no_sandstone_name() {
    // 300 / 400 = 75% exactly; 301 / 401 = 75.06%.
    assert_eq!(named([100, 0, 0, 0, 0, 0, 0, 0], 300), "quartz wacke");
    assert_eq!(name([100, 0, 0, 0, 0, 0, 0, 0], 301), None);
    let n = Pettijohn::default().classify(&with_matrix(counts([100, 0, 0, 0, 0, 0, 0, 0]), 301));
    assert!(n.verdict.explanation().contains("mudrock"));
}

#[test]
fn q_95_both_sides_in_arenites_and_wackes() {
    assert_eq!(named([190, 0, 0, 5, 0, 5, 0, 0], 0), "quartz arenite");
    assert_eq!(named([18999, 0, 0, 500, 0, 501, 0, 0], 0), "sublitharenite");
    assert_eq!(named([190, 0, 0, 5, 0, 5, 0, 0], 100), "quartz wacke");
    assert_eq!(
        named([18999, 0, 0, 500, 0, 501, 0, 0], 10000),
        "lithic greywacke"
    );
    assert_eq!(
        named([18999, 0, 0, 501, 0, 500, 0, 0], 10000),
        "feldspathic greywacke"
    );
}

#[test]
fn q_75_both_sides_in_arenites() {
    assert_eq!(named([150, 0, 0, 30, 0, 20, 0, 0], 0), "subarkose");
    assert_eq!(
        named([14999, 0, 0, 3001, 0, 2000, 0, 0], 0),
        "arkosic arenite"
    );
    assert_eq!(named([150, 0, 0, 20, 0, 30, 0, 0], 0), "sublitharenite");
    assert_eq!(
        named([14999, 0, 0, 2000, 0, 3001, 0, 0], 0),
        "lithic arenite"
    );
}

#[test]
fn f_equal_r_goes_to_the_lithic_side() {
    assert_eq!(named([160, 0, 0, 20, 0, 20, 0, 0], 0), "sublitharenite");
    assert_eq!(named([160, 0, 0, 21, 0, 19, 0, 0], 0), "subarkose");
    assert_eq!(named([100, 0, 0, 50, 0, 50, 0, 0], 0), "lithic arenite");
    assert_eq!(named([100, 0, 0, 51, 0, 49, 0, 0], 0), "arkosic arenite");
    assert_eq!(named([100, 0, 0, 50, 0, 50, 0, 0], 100), "lithic greywacke");
    assert_eq!(
        named([100, 0, 0, 51, 0, 49, 0, 0], 100),
        "feldspathic greywacke"
    );
}

#[test]
fn chert_goes_with_quartz_by_default_and_can_move() {
    // Qm 270, chert 30, no matrix counted as 0: Q 100% with chert in Q.
    let s = with_matrix(counts([270, 0, 30, 0, 0, 0, 0, 0]), 0);
    assert_eq!(
        Pettijohn::default().classify(&s).name(),
        Some("quartz arenite")
    );
    let lithic = Pettijohn {
        chert: ChertPlacement::Lithic,
    };
    assert_eq!(lithic.classify(&s).name(), Some("sublitharenite"));
}

#[test]
fn matrix_counts_chert_in_the_framework_whatever_its_pole() {
    // Framework 270 + 30 = 300, matrix 53: 15.01%, a wacke even with chert left out.
    let s = with_matrix(counts([270, 0, 30, 0, 0, 0, 0, 0]), 53);
    let omit = Pettijohn {
        chert: ChertPlacement::Omit,
    };
    assert_eq!(omit.classify(&s).name(), Some("quartz wacke"));
}

#[test]
fn rule_names_matrix_and_quartz() {
    let n =
        Pettijohn::default().classify(&with_matrix(counts([150, 0, 0, 70, 30, 30, 20, 0]), 120));
    let rule = n.verdict.explanation();
    assert!(
        rule.contains("matrix is 28.6% of framework plus matrix, from 15% to 75%: a wacke"),
        "{rule}"
    );
    assert!(
        rule.contains("Q is 50.0% of Q + F + R, below 95%"),
        "{rule}"
    );
    let m = n.measure("matrix").unwrap().value.unwrap();
    assert!((m - 100.0 * 120.0 / 420.0).abs() < 1e-12);
}
