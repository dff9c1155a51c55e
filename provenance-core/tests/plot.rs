//! Figure checks: the SVG is well-formed XML with layer ids and pole labels, compositions land
//! where barycentric arithmetic puts them, exports have the right magic bytes and page size,
//! and hostile strings cannot inject markup. Sample data here is invented for the tests.

use provenance_core::composition::Composition3;
use provenance_core::counts::{Framework, Sample};
use provenance_core::diagram::Diagram;
use provenance_core::geometry::Polygon;
use provenance_core::plot::export::{render, svg_to_pdf, svg_to_png, ImageFormat, PNG_DPI};
use provenance_core::plot::{
    DensityMode, Figure, FigureOptions, FigureSize, GroupBy, LabelledPolygon, MeanMarker,
    PolygonLayer, Region, RegionKind, RegionLayer,
};

/// Invented samples: three formations of a fictitious basin, from a simple deterministic
/// generator (no randomness library, so the figures never change).
fn invented_samples(n: usize) -> Vec<Sample> {
    let bases = [
        ("Lower Vell", [60.0, 8.0, 3.0, 90.0, 20.0, 110.0, 6.0, 5.0]),
        (
            "Middle Vell",
            [140.0, 20.0, 8.0, 60.0, 40.0, 40.0, 25.0, 20.0],
        ),
        (
            "Upper Vell",
            [230.0, 15.0, 10.0, 25.0, 30.0, 10.0, 20.0, 15.0],
        ),
    ];
    let mut state: u64 = 0x2545_f491_4f6c_dd1d;
    let mut next = move || {
        state ^= state << 13;
        state ^= state >> 7;
        state ^= state << 17;
        0.6 + 0.8 * ((state >> 11) as f64 / (1u64 << 53) as f64)
    };
    (0..n)
        .map(|i| {
            let (name, b) = bases[i % 3];
            let v: Vec<f64> = b.iter().map(|x| (x * next()).round()).collect();
            let f = Framework {
                qm: v[0],
                qp: v[1],
                c: v[2],
                p: v[3],
                k: v[4],
                lv: v[5],
                ls: v[6],
                lm: v[7],
            };
            let mut s = Sample::counted(format!("VX-{:02}", i + 1), f);
            s.line = i as u64 + 2;
            s.metadata = vec![name.to_string()];
            s
        })
        .collect()
}

fn by_formation() -> GroupBy {
    GroupBy {
        file: "invented.csv".into(),
        column: "formation".into(),
        index: 0,
        file_column: 10,
    }
}

fn figure(diagrams: &[Diagram], samples: &[Sample], options: FigureOptions) -> Figure {
    let mut b = Figure::builder(diagrams, Some(by_formation()));
    for s in samples {
        b.push(s).expect("invented samples are valid");
    }
    b.finish(options)
}

/// All text of an element, tspans included.
fn text_of(node: roxmltree::Node) -> String {
    node.descendants()
        .filter(|n| n.is_text())
        .filter_map(|n| n.text())
        .collect::<String>()
        .trim()
        .to_string()
}

fn layer<'a>(doc: &'a roxmltree::Document, id: &str) -> roxmltree::Node<'a, 'a> {
    doc.descendants()
        .find(|n| n.has_tag_name("g") && n.attribute("id") == Some(id))
        .unwrap_or_else(|| panic!("no layer {id}"))
}

#[test]
fn every_diagram_gives_well_formed_svg_with_layers_and_pole_labels() {
    let samples = invented_samples(24);
    for d in Diagram::ALL {
        let svg = figure(&[d], &samples, FigureOptions::default())
            .to_svg()
            .unwrap();
        let doc = roxmltree::Document::parse(&svg).expect("SVG is XML");
        let root = doc.root_element();
        assert_eq!(root.tag_name().name(), "svg");
        assert_eq!(root.attribute("width"), Some("85.00mm"));
        for id in [
            "grid", "fields", "frame", "regions", "samples", "labels", "legend",
        ] {
            layer(&doc, id);
        }
        let labels: Vec<String> = layer(&doc, "labels")
            .children()
            .filter(|n| n.has_tag_name("text"))
            .map(text_of)
            .collect();
        for pole in d.poles() {
            assert!(
                labels.contains(&pole.to_string()),
                "{d}: {pole} missing in {labels:?}"
            );
        }
        // Subscripts are real tspans where the symbol has more than one letter.
        let subs = layer(&doc, "labels")
            .descendants()
            .filter(|n| n.has_tag_name("tspan"))
            .count();
        let expected = d.poles().iter().filter(|p| p.len() > 1).count();
        assert_eq!(subs, expected, "{d}");
        // 24 samples → 24 markers, and the legend names the three formations.
        let legend: Vec<String> = layer(&doc, "legend")
            .children()
            .filter(|n| n.has_tag_name("text"))
            .map(text_of)
            .collect();
        assert!(legend.contains(&"Middle Vell".to_string()), "{legend:?}");
    }
}

/// Parse an SVG `points` attribute.
fn points(s: &str) -> Vec<(f64, f64)> {
    s.split_whitespace()
        .filter_map(|p| {
            let (x, y) = p.split_once(',')?;
            Some((x.parse().ok()?, y.parse().ok()?))
        })
        .collect()
}

#[test]
fn a_known_composition_lands_at_its_barycentric_page_point() {
    // Q = 50, F = 25, L = 25 (Qm 100, P 50, Lv 50). On the page the point is
    // 0.5·A + 0.25·B + 0.25·C of the drawn triangle's vertices: the barycentric definition,
    // computed here from the frame as drawn, independently of the mapping code.
    let s = Sample::counted(
        "known",
        Framework {
            qm: 100.0,
            p: 50.0,
            lv: 50.0,
            ..Default::default()
        },
    );
    let mut b = Figure::builder(&[Diagram::Qfl], None);
    b.push(&s).unwrap();
    let fig = b.finish(FigureOptions::default());
    let svg = fig.to_svg().unwrap();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let frame = layer(&doc, "frame")
        .children()
        .find(|n| n.has_tag_name("polyline"))
        .and_then(|n| n.attribute("points"))
        .map(points)
        .expect("triangle outline");
    let (a, bb, c) = (frame[0], frame[1], frame[2]);
    // Apex on top, B bottom left, C bottom right, equilateral within rounding.
    assert!(a.1 < bb.1 && (bb.1 - c.1).abs() < 1.0 && bb.0 < c.0);
    let side = c.0 - bb.0;
    assert!(((a.0 - bb.0) - side / 2.0).abs() <= 1.0);
    assert!(((bb.1 - a.1) - side * 3f64.sqrt() / 2.0).abs() <= 1.0);
    let expected = (
        0.5 * a.0 + 0.25 * bb.0 + 0.25 * c.0,
        0.5 * a.1 + 0.25 * bb.1 + 0.25 * c.1,
    );
    let marker = layer(&doc, "samples")
        .children()
        .find(|n| n.has_tag_name("circle"))
        .expect("one circle marker");
    let cx: f64 = marker.attribute("cx").unwrap().parse().unwrap();
    let cy: f64 = marker.attribute("cy").unwrap().parse().unwrap();
    // Whole-unit rounding of vertices and marker: within 1.5 units = 0.15 pt.
    assert!(
        (cx - expected.0).abs() <= 1.5 && (cy - expected.1).abs() <= 1.5,
        "({cx}, {cy}) vs {expected:?}"
    );

    // And by hand from the layout: single column, 85 mm = 240.945 pt = 2409.45 units wide.
    let l = fig.layout();
    assert!((l.width - 2_409.448_818).abs() < 1e-3);
    let m = l.panels[0].mapping;
    let p = m.composition_to_page(&Composition3::close([2.0, 1.0, 1.0]).unwrap());
    let b0 = m.vertex(1);
    // x = x_B + side·(25 + 50/2)/100, y = y_B − side·50·(√3/2)/100.
    assert!((p.x - (b0.x + m.side() * 0.5)).abs() < 1e-9);
    assert!((p.y - (b0.y - m.side() * 0.5 * 0.866_025_403_784_438_6)).abs() < 1e-9);
}

#[test]
fn hostile_ids_and_group_names_cannot_inject_markup() {
    let hostile_id = "\"><script>alert(1)</script><g id=\"x\u{1}\u{E000}";
    let hostile_group = "</g><svg onload=\"alert(2)\">&amp;";
    let mut s = invented_samples(1).remove(0);
    s.id = hostile_id.to_string();
    s.metadata = vec![hostile_group.to_string()];
    let mut b = Figure::builder(&[Diagram::Qfl, Diagram::Qmflt], Some(by_formation()));
    b.push(&s).unwrap();
    let svg = b
        .finish(FigureOptions {
            labels: true,
            ..Default::default()
        })
        .to_svg()
        .unwrap();
    let doc = roxmltree::Document::parse(&svg).expect("still XML");
    let allowed = [
        "svg", "g", "text", "tspan", "polygon", "polyline", "circle", "line", "rect",
    ];
    for n in doc.descendants().filter(|n| n.is_element()) {
        assert!(
            allowed.contains(&n.tag_name().name()),
            "unexpected <{}>",
            n.tag_name().name()
        );
        assert!(n.attribute("onload").is_none());
        if let Some(id) = n.attribute("id") {
            assert!(
                ["grid", "fields", "frame", "regions", "samples", "labels", "legend"].contains(&id),
                "injected id {id}"
            );
        }
    }
    assert_eq!(
        doc.descendants().filter(|n| n.has_tag_name("svg")).count(),
        1
    );
    // The strings show as text, made safe but otherwise intact.
    let texts: Vec<String> = doc
        .descendants()
        .filter(|n| n.has_tag_name("text"))
        .map(text_of)
        .collect();
    assert!(
        texts.contains(&"\"><script>alert(1)</script><g id=\"x \u{FFFD}".to_string()),
        "{texts:?}"
    );
    assert!(texts.contains(&hostile_group.to_string()), "{texts:?}");
}

fn png_size(png: &[u8]) -> (u32, u32) {
    let be = |i: usize| u32::from_be_bytes([png[i], png[i + 1], png[i + 2], png[i + 3]]);
    assert_eq!(&png[12..16], b"IHDR");
    (be(16), be(20))
}

#[test]
fn png_and_pdf_have_magic_bytes_and_the_printed_size() {
    let fig = figure(
        &[Diagram::Qfl],
        &invented_samples(12),
        FigureOptions::default(),
    );
    let svg = fig.to_svg().unwrap();
    let layout = fig.layout();
    let height_pt = layout.height / 10.0;

    let png = svg_to_png(&svg, PNG_DPI).unwrap();
    assert_eq!(&png[..8], b"\x89PNG\r\n\x1a\n");
    let (w, h) = png_size(&png);
    // 85 mm at 300 dpi = 85 / 25.4 · 300 = 1003.9 → 1004 pixels.
    assert_eq!(w, 1004);
    assert_eq!(h, (height_pt / 72.0 * 300.0).round() as u32);
    // The resolution is recorded: 300 dpi = 11811 pixels per metre.
    let phys = png
        .windows(4)
        .position(|w| w == b"pHYs")
        .expect("pHYs chunk");
    let ppm = u32::from_be_bytes([png[phys + 4], png[phys + 5], png[phys + 6], png[phys + 7]]);
    assert_eq!(ppm, 11811);

    let pdf = svg_to_pdf(&svg).unwrap();
    assert!(pdf.starts_with(b"%PDF-"));
    let text = String::from_utf8_lossy(&pdf);
    let media = text.split("/MediaBox [").nth(1).expect("MediaBox");
    let nums: Vec<f64> = media
        .split(']')
        .next()
        .unwrap()
        .split_whitespace()
        .map(|v| v.parse().unwrap())
        .collect();
    // 85 mm = 240.945 pt.
    assert!((nums[2] - nums[0] - 240.945).abs() < 0.05, "{nums:?}");
    assert!(
        (nums[3] - nums[1] - height_pt).abs() < 0.05,
        "{nums:?} vs {height_pt}"
    );
    // The font travels with the file.
    assert!(text.contains("DejaVu"));

    // render() picks the same paths by format.
    assert_eq!(render(&fig, ImageFormat::Png).unwrap(), png);
}

#[test]
fn png_text_is_drawn_with_the_embedded_font() {
    // A label alone on the page: without a font resvg would drop it and leave the page white.
    let svg = r#"<svg xmlns="http://www.w3.org/2000/svg" width="20mm" height="10mm" viewBox="0 0 200 100" font-family="DejaVu Sans"><text x="10" y="70" font-size="60">Qm</text></svg>"#;
    let png = svg_to_png(svg, 150.0).unwrap();
    // Decode with the png crate and count dark pixels.
    let decoder = png::Decoder::new(std::io::Cursor::new(&png));
    let mut reader = decoder.read_info().unwrap();
    let mut buf = vec![0; reader.output_buffer_size()];
    reader.next_frame(&mut buf).unwrap();
    let dark = buf.chunks(3).filter(|p| p[0] < 128).count();
    assert!(dark > 50, "text was not drawn ({dark} dark pixels)");
}

#[test]
fn large_data_sets_switch_to_density_shading() {
    let samples = invented_samples(2400);
    let svg = figure(&[Diagram::Qfl], &samples, FigureOptions::default())
        .to_svg()
        .unwrap();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let s = layer(&doc, "samples");
    assert_eq!(s.children().filter(|n| n.has_tag_name("circle")).count(), 0);
    assert!(s.children().filter(|n| n.has_tag_name("polygon")).count() > 10);
    let legend = text_of(layer(&doc, "legend"));
    assert!(legend.contains("samples per cell:"), "{legend}");
    // Forced markers draw one marker per sample (circles: the first group's shape).
    let svg = figure(
        &[Diagram::Qfl],
        &samples,
        FigureOptions {
            density: DensityMode::Never,
            ..Default::default()
        },
    )
    .to_svg()
    .unwrap();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let circles = layer(&doc, "samples")
        .children()
        .filter(|n| n.has_tag_name("circle") && n.attribute("fill") != Some("none"))
        .count();
    assert_eq!(circles, 800);
}

#[test]
fn panels_sit_side_by_side_on_a_wide_page_and_stack_on_a_narrow_one() {
    let samples = invented_samples(6);
    let wide = figure(
        &[Diagram::Qfl, Diagram::Qmflt, Diagram::Qmpk],
        &samples,
        FigureOptions {
            size: FigureSize::DoubleColumn,
            ..Default::default()
        },
    )
    .layout();
    assert!(wide.panels.iter().all(|p| p.top == wide.panels[0].top));
    let narrow = figure(
        &[Diagram::Qfl, Diagram::Qmflt],
        &samples,
        FigureOptions::default(),
    )
    .layout();
    assert!(narrow.panels[1].top > narrow.panels[0].top + narrow.panels[0].height * 0.9);
    // One shared legend either way.
    let svg = figure(
        &[Diagram::Qfl, Diagram::Qmflt],
        &samples,
        FigureOptions::default(),
    )
    .to_svg()
    .unwrap();
    assert_eq!(svg.matches(">\nUpper Vell\n<").count(), 1);
}

#[test]
fn field_polygons_regions_and_means_plug_into_their_layers() {
    // An invented two-field layer split at 50% of the first pole, for this test only.
    let upper = Polygon::new(vec![
        [100.0, 0.0, 0.0],
        [50.0, 50.0, 0.0],
        [50.0, 0.0, 50.0],
    ]);
    let lower = Polygon::new(vec![
        [50.0, 50.0, 0.0],
        [0.0, 100.0, 0.0],
        [0.0, 0.0, 100.0],
        [50.0, 0.0, 50.0],
    ]);
    let mut b = Figure::builder(&[Diagram::Qfl], Some(by_formation()));
    for s in invented_samples(9) {
        b.push(&s).unwrap();
    }
    let g = b.group_index("Upper Vell").unwrap();
    let panel = &mut b.panels_mut()[0];
    panel.fields = Some(PolygonLayer {
        source: Some("fields: invented test set".into()),
        polygons: vec![
            LabelledPolygon::new("upper test field", upper.clone()),
            LabelledPolygon::new("lower test field", lower.clone()).with_anchor([20.0, 40.0, 40.0]),
        ],
    });
    let ring: Vec<[f64; 3]> = (0..36)
        .map(|i| {
            let t = i as f64 * std::f64::consts::PI / 18.0;
            let (a, c) = (70.0 + 4.0 * t.sin(), 15.0 + 4.0 * t.cos());
            [a, 100.0 - a - c, c]
        })
        .collect();
    panel.regions = Some(RegionLayer {
        source: Some("regions: invented test outlines".into()),
        regions: vec![
            Region {
                group: g,
                outline: Polygon::new(ring.clone()),
                kind: RegionKind::Confidence,
            },
            Region {
                group: g,
                outline: Polygon::new(ring),
                kind: RegionKind::Prediction,
            },
        ],
    });
    panel.means.push(MeanMarker {
        group: g,
        composition: Composition3::close([70.0, 15.0, 15.0]).unwrap(),
    });
    let fig = b.finish(FigureOptions::default());
    let svg = fig.to_svg().unwrap();
    let doc = roxmltree::Document::parse(&svg).unwrap();

    let fields = layer(&doc, "fields");
    assert_eq!(
        fields
            .children()
            .filter(|n| n.has_tag_name("polyline"))
            .count(),
        2
    );
    let m = fig.layout().panels[0].mapping;
    for (name, poly) in [("upper test field", &upper), ("lower test field", &lower)] {
        let t = fields
            .children()
            .find(|n| n.has_tag_name("text") && text_of(*n) == name)
            .unwrap_or_else(|| panic!("{name} not drawn"));
        let x: f64 = t.attribute("x").unwrap().parse().unwrap();
        let y: f64 = t.attribute("y").unwrap().parse().unwrap();
        let parts = m.to_parts(provenance_core::plot::PagePoint { x, y });
        assert!(
            poly.contains(parts),
            "{name} drawn outside its field at {parts:?}"
        );
    }
    let regions = layer(&doc, "regions");
    // One solid outline plus a dashed one made of many short pieces.
    assert!(
        regions
            .children()
            .filter(|n| n.has_tag_name("polyline"))
            .count()
            > 5
    );
    assert!(text_of(layer(&doc, "legend")).contains("fields: invented test set"));
    assert!(text_of(layer(&doc, "legend")).contains("regions: invented test outlines"));
}

#[test]
fn too_many_groups_are_refused_with_file_line_and_column() {
    let mut b = Figure::builder(&[Diagram::Qfl], Some(by_formation()));
    let mut samples = invented_samples(70);
    for (i, s) in samples.iter_mut().enumerate() {
        s.metadata = vec![format!("bed {i}")];
    }
    let mut err = None;
    for s in &samples {
        if let Err(e) = b.push(s) {
            err = Some(e);
            break;
        }
    }
    let msg = err.expect("65th group refused").to_string();
    assert!(msg.contains("invented.csv, line 66, column 10"), "{msg}");
    assert!(msg.contains("at most 64"), "{msg}");
}

#[test]
fn snapshot_one_figure_per_diagram() {
    let samples = invented_samples(15);
    for d in Diagram::ALL {
        let svg = figure(
            &[d],
            &samples,
            FigureOptions {
                labels: true,
                ..Default::default()
            },
        )
        .to_svg()
        .unwrap();
        insta::assert_snapshot!(format!("figure_{}", d.id()), svg);
    }
}

#[test]
fn a_huge_group_name_is_shortened_to_the_page_width() {
    let mut s = invented_samples(1).remove(0);
    s.metadata = vec!["W".repeat(100_000)];
    let mut b = Figure::builder(&[Diagram::Qfl], Some(by_formation()));
    b.push(&s).unwrap();
    let fig = b.finish(FigureOptions::default());
    let layout = fig.layout();
    let entry = &layout.legend[1];
    assert!(entry.text.ends_with('…') && entry.text.chars().count() < 200);
    let right = entry.x
        + provenance_core::plot::text::text_width(&entry.text, fig.options.fonts.legend * 10.0);
    assert!(right <= layout.width, "legend entry runs off the page");
}
