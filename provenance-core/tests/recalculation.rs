//! Each diagram's recalculation, worked by hand from the published pole definitions.

use provenance_core::prelude::*;

/// A hand-worked slide of 400 framework points:
/// Qm 180, Qp 20, C 12, P 60, K 28, Lv 50, Ls 30, Lm 20.
fn slide() -> Sample {
    let mut s = Sample::counted(
        "W-1",
        Framework {
            qm: 180.0,
            qp: 20.0,
            c: 12.0,
            p: 60.0,
            k: 28.0,
            lv: 50.0,
            ls: 30.0,
            lm: 20.0,
        },
    );
    s.other.matrix = Some(100.0);
    s
}

fn assert_mode(d: Diagram, n: f64, expected: [f64; 3]) {
    let m = SampleModes::of(&slide());
    let mode = m.get(d).unwrap();
    assert_eq!(mode.points, Some(n), "{d}");
    for (got, want) in mode.percent.parts().iter().zip(expected) {
        assert!((got - want).abs() < 1e-9, "{d}: {got} vs {want}");
    }
}

#[test]
fn qfl_dickinson_1985() {
    // Q = Qm + Qp + C = 212, F = P + K = 88, L = Lv + Ls + Lm = 100; n = 400.
    assert_mode(Diagram::Qfl, 400.0, [53.0, 22.0, 25.0]);
}

#[test]
fn qmflt_dickinson_1985() {
    // Qm = 180, F = 88, Lt = Qp + C + Lv + Ls + Lm = 132; n = 400.
    assert_mode(Diagram::Qmflt, 400.0, [45.0, 22.0, 33.0]);
}

#[test]
fn qmpk_dickinson_suczek_1979() {
    // Qm 180, P 60, K 28; n = 268.
    assert_mode(
        Diagram::Qmpk,
        268.0,
        [18000.0 / 268.0, 6000.0 / 268.0, 2800.0 / 268.0],
    );
}

#[test]
fn qplvlsm_dickinson_suczek_1979() {
    // Qp = Qp + C = 32, Lv = 50, Lsm = Ls + Lm = 50; n = 132.
    assert_mode(
        Diagram::Qplvlsm,
        132.0,
        [3200.0 / 132.0, 5000.0 / 132.0, 5000.0 / 132.0],
    );
}

#[test]
fn lmlvls_ingersoll_suczek_1979() {
    // Lm 20, Lv 50, Ls 30; n = 100.
    assert_mode(Diagram::Lmlvls, 100.0, [20.0, 50.0, 30.0]);
}

#[test]
fn ratios_and_matrix_hand_worked() {
    let m = SampleModes::of(&slide());
    assert_eq!(m.framework_total, 400.0);
    // matrix / (framework + matrix) = 100 / 500.
    assert_eq!(m.matrix_percent, Some(20.0));
    let r = m.ratios;
    assert!((r.p_f.unwrap() - 60.0 / 88.0).abs() < 1e-12);
    assert!((r.k_f.unwrap() - 28.0 / 88.0).abs() < 1e-12);
    assert!((r.lv_l.unwrap() - 0.5).abs() < 1e-12);
    assert!((r.qp_q.unwrap() - 32.0 / 212.0).abs() < 1e-12);
    assert!((r.c_q.unwrap() - 12.0 / 212.0).abs() < 1e-12);
}

#[test]
fn a_diagram_without_points_is_null_not_nan() {
    // Only quartz and feldspar: no lithics at all.
    let s = Sample::counted(
        "W-2",
        Framework {
            qm: 250.0,
            p: 50.0,
            ..Default::default()
        },
    );
    let m = SampleModes::of(&s);
    assert!(m.get(Diagram::Qplvlsm).is_none());
    assert!(m.get(Diagram::Lmlvls).is_none());
    assert_eq!(m.ratios.lv_l, None);
    assert_eq!(
        m.get(Diagram::Qfl).unwrap().percent.parts(),
        [250.0 / 3.0, 50.0 / 3.0, 0.0]
    );
}
