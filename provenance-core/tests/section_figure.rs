//! The section figure: marks land where the page mapping puts them, layers and panels are
//! present, and the membership panel appears only with membership.

use provenance_core::counts::{Framework, Sample};
use provenance_core::petrofacies::section_svg::{page_point, render, FigureOptions};
use provenance_core::petrofacies::{ChangeOptions, ChangePoints, Ordering, Section, SectionSample};

fn section() -> Section {
    // Q 50%, F 25%, L 25% at 0 m; Q 20%, F 40%, L 40% at 100 m (400 points each).
    let s = |id: &str, q, f, l, h| {
        let fw = Framework {
            qm: q,
            p: f,
            lv: l / 2.0,
            ls: l / 4.0,
            lm: l / 4.0,
            ..Default::default()
        };
        SectionSample::new(Sample::counted(id, fw), h, Some("Lower".into()))
    };
    Section {
        axis: "height_m".into(),
        ordering: Ordering::Height,
        by: Some("formation".into()),
        samples: vec![
            s("A", 200.0, 100.0, 100.0, 0.0),
            s("B", 80.0, 160.0, 160.0, 100.0),
        ],
    }
}

/// Circle centres of one fill colour in the samples layer.
fn circles(svg: &str, fill: &str) -> Vec<(i64, i64)> {
    let doc = roxmltree::Document::parse(svg).unwrap();
    let layer = doc
        .descendants()
        .find(|n| n.attribute("id") == Some("samples"))
        .unwrap();
    layer
        .descendants()
        .filter(|n| n.has_tag_name("circle") && n.attribute("fill") == Some(fill))
        .map(|n| {
            let v = |a| n.attribute(a).unwrap().parse::<f64>().unwrap().round() as i64;
            (v("cx"), v("cy"))
        })
        .collect()
}

#[test]
fn q_markers_land_at_their_page_coordinates() {
    let sec = section();
    let o = FigureOptions::default();
    let svg = render(&sec, None, &o).unwrap();
    // Q is drawn with filled blue circles (#0072B2): one per sample.
    let found = circles(&svg, "#0072B2");
    for (pct, h) in [(50.0, 0.0), (20.0, 100.0)] {
        let (x, y) = page_point(&sec, None, &o, 0, pct, h).unwrap();
        let want = (x.round() as i64, y.round() as i64);
        assert!(found.contains(&want), "{want:?} not in {found:?}");
    }
    // 50% is halfway across the first panel.
    let (x0, _) = page_point(&sec, None, &o, 0, 0.0, 0.0).unwrap();
    let (x1, _) = page_point(&sec, None, &o, 0, 100.0, 0.0).unwrap();
    let (xm, _) = page_point(&sec, None, &o, 0, 50.0, 0.0).unwrap();
    assert!((xm - 0.5 * (x0 + x1)).abs() < 1e-9);
    // Lv is 50% of L in both samples: purple circles in the second panel, at its midpoint.
    let (lx, _) = page_point(&sec, None, &o, 1, 50.0, 0.0).unwrap();
    assert!(circles(&svg, "#CC79A7")
        .iter()
        .all(|c| c.0 == lx.round() as i64));
}

#[test]
fn the_page_has_its_physical_size_and_layers() {
    let svg = render(
        &section(),
        None,
        &FigureOptions {
            width_mm: 85.0,
            height_mm: 120.0,
            ..Default::default()
        },
    )
    .unwrap();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let root = doc.root_element();
    assert_eq!(root.attribute("width"), Some("85.00mm"));
    assert_eq!(root.attribute("height"), Some("120.00mm"));
    // 85 mm = 240.9 pt = 2409 units at 10 units per point.
    assert_eq!(root.attribute("viewBox"), Some("0 0 2409 3402"));
    let layers: Vec<&str> = root.children().filter_map(|n| n.attribute("id")).collect();
    assert_eq!(
        layers,
        [
            "background",
            "bands",
            "grid",
            "axes",
            "changes",
            "samples",
            "labels",
            "legend"
        ]
    );
}

#[test]
fn membership_adds_a_stacked_bar_panel() {
    let mut sec = section();
    let plain = render(&sec, None, &FigureOptions::default()).unwrap();
    assert!(!plain.contains("setting membership"));
    sec.samples[0].membership = Some(vec![("dissected arc".into(), 0.7), ("outside".into(), 0.3)]);
    sec.samples[1].membership = Some(vec![("recycled orogen".into(), 1.0)]);
    let svg = render(&sec, None, &FigureOptions::default()).unwrap();
    assert!(svg.contains("setting membership") && svg.contains("dissected arc"));
    assert!(page_point(&sec, None, &FigureOptions::default(), 2, 0.0, 0.0).is_some());
}

#[test]
fn change_points_are_drawn_and_labelled() {
    let sec = section();
    let cp = ChangePoints::of_section(&sec, &ChangeOptions::default()).unwrap();
    assert!(cp.note.is_some(), "two samples: too few for a search");
    let svg = render(&sec, Some(&cp), &FigureOptions::default()).unwrap();
    assert!(svg.contains("No change-point search"));
    assert!(!svg.contains("NaN"));
    // Eight samples of one composition with small scatter: a search, and no change.
    let mut samples = Vec::new();
    for i in 0..8 {
        let d = (i % 3) as f64;
        let fw = Framework {
            qm: 200.0 + 5.0 * d,
            p: 100.0 - 3.0 * d,
            lv: 100.0 + d,
            ..Default::default()
        };
        samples.push(SectionSample::new(
            Sample::counted(format!("S{i}"), fw),
            i as f64,
            None,
        ));
    }
    let flat = Section {
        axis: "h".into(),
        ordering: Ordering::Height,
        by: None,
        samples,
    };
    let cp = ChangePoints::of_section(&flat, &ChangeOptions::default()).unwrap();
    assert!(cp.note.is_none() && cp.changes.is_empty());
    let svg = render(&flat, Some(&cp), &FigureOptions::default()).unwrap();
    assert!(svg.contains("No change point was found"));
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let labels = doc
        .descendants()
        .find(|n| n.attribute("id") == Some("labels"))
        .unwrap();
    assert!(!labels
        .descendants()
        .any(|n| n.text().is_some_and(|t| t.trim().starts_with("change"))));
}

#[test]
fn oversized_sections_are_refused_not_drawn() {
    use provenance_core::error::ErrorKind;
    use provenance_core::petrofacies::section_svg::MAX_FIGURE_SAMPLES;
    let fw = Framework {
        qm: 10.0,
        p: 5.0,
        lv: 5.0,
        ..Default::default()
    };
    let samples = (0..=MAX_FIGURE_SAMPLES)
        .map(|i| SectionSample::new(Sample::counted(format!("S{i}"), fw), i as f64, None))
        .collect();
    let sec = Section {
        axis: "h".into(),
        ordering: Ordering::Height,
        by: None,
        samples,
    };
    let e = render(&sec, None, &FigureOptions::default()).unwrap_err();
    assert_eq!(e.kind(), ErrorKind::Usage);
    assert!(e.to_string().contains("5001 samples"));
}
