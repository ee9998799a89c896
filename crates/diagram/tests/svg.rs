//! The diagrams are valid SVG: parsed and rasterised to PNG with resvg
//! (crates.io), with ink where the drawing should be; dashed for virtual images.

use parax_diagram::*;

fn render_png(svg: &str) -> (resvg::tiny_skia::Pixmap, Vec<u8>) {
    let tree = resvg::usvg::Tree::from_str(svg, &resvg::usvg::Options::default())
        .expect("resvg parses the SVG");
    let size = tree.size().to_int_size();
    let mut pixmap =
        resvg::tiny_skia::Pixmap::new(size.width(), size.height()).expect("a non-empty picture");
    resvg::render(
        &tree,
        resvg::tiny_skia::Transform::default(),
        &mut pixmap.as_mut(),
    );
    let png = pixmap.encode_png().expect("PNG");
    (pixmap, png)
}

fn non_white(p: &resvg::tiny_skia::Pixmap) -> usize {
    p.pixels()
        .iter()
        .filter(|c| (c.red(), c.green(), c.blue()) != (255, 255, 255))
        .count()
}

fn sample() -> LensDiagram {
    LensDiagram {
        title: "test <relay> & co".into(),
        lenses: vec![
            LensMark {
                label: "A".into(),
                x: 0.0,
                power: 6.0,
            },
            LensMark {
                label: "B".into(),
                x: 0.2,
                power: -10.0,
            },
        ],
        arrows: vec![
            Arrow {
                label: "object".into(),
                x: -0.4,
                height: 1.0,
                real: true,
                role: ArrowRole::Object,
            },
            Arrow {
                label: "image by A".into(),
                x: 0.2857,
                height: -0.71,
                real: true,
                role: ArrowRole::Intermediate,
            },
            Arrow {
                label: "final image".into(),
                x: 0.1,
                height: 0.5,
                real: false,
                role: ArrowRole::Final,
            },
        ],
        chief_ray: vec![(-0.4, 1.0), (0.0, 0.0), (0.2, -0.5), (0.3, -0.6)],
        chief_ray_virtual: vec![(0.2, -0.5), (0.1, 0.5)],
        notes: vec!["a note".into()],
    }
}

#[test]
fn lens_system_renders_to_png() {
    let svg = lens_system_svg(&sample());
    assert!(
        svg.contains("test &lt;relay&gt; &amp; co"),
        "text is escaped"
    );
    assert_eq!(svg.matches(r#"class="lens""#).count(), 2);
    assert_eq!(svg.matches(r#"class="arrow real""#).count(), 2);
    assert_eq!(svg.matches(r#"class="arrow virtual""#).count(), 1);
    assert!(svg.contains("stroke-dasharray"), "virtual image dashed");
    let (pixmap, png) = render_png(&svg);
    assert_eq!((pixmap.width(), pixmap.height()), (900, 360));
    assert!(non_white(&pixmap) > 2_000, "lines are drawn");
    assert_eq!(&png[1..4], b"PNG");
}

#[test]
fn power_cross_renders_to_png() {
    let svg = power_cross_svg(&PowerCross {
        title: "eye right: -5.75 / -1.50 x 175".into(),
        meridians: [
            MeridianMark {
                degrees: 175.0,
                label: "-5.75 D @ 175".into(),
            },
            MeridianMark {
                degrees: 85.0,
                label: "-7.25 D @ 85".into(),
            },
        ],
    });
    assert_eq!(svg.matches(r#"class="meridian""#).count(), 2);
    let (pixmap, _) = render_png(&svg);
    // The 85° meridian is nearly vertical: ink in the centre column above the centre.
    let ink_at = |x: u32, y: u32| {
        let c = pixmap.pixel(x, y).unwrap();
        (c.red(), c.green(), c.blue()) != (255, 255, 255)
    };
    assert!(
        (195..225).any(|x| ink_at(x, 110)),
        "85° meridian drawn upward"
    );
    assert!(non_white(&pixmap) > 1_000);
}
