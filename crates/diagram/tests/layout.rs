//! `lens_diagram` places the numbers it is given: arrows for the object and
//! each image, notes for what is at infinity, and the chief ray drawn along
//! its given slope, dashed back to a virtual final image.

use parax_diagram::*;

fn lens(label: &str, x: f64, power: f64) -> LensMark {
    LensMark {
        label: label.into(),
        x,
        power,
    }
}

#[test]
fn a_virtual_final_image_gets_a_dashed_ray_back_to_it() {
    // Invented numbers (not an optical computation): one lens at 0, the system
    // ending 0.1 m after it, a virtual image 0.2 m before the lens at height 2,
    // the ray leaving the end at height 0.5 with slope 2.5 per metre.
    let d = lens_diagram(SystemSketch {
        title: "t".into(),
        lenses: vec![lens("A", 0.0, -5.0)],
        end: 0.1,
        object_before: Some(0.5),
        images: vec![ImageMark {
            x: Some(-0.2),
            real: false,
            height: Some(2.0),
        }],
        chief_ray: Some(RayMark {
            heights: vec![0.0],
            exit_height: 0.5,
            exit_slope: 2.5,
        }),
    })
    .expect("a lens");
    assert_eq!(d.arrows.len(), 2);
    assert_eq!(d.arrows[0].x, -0.5);
    assert_eq!(
        (d.arrows[1].label.as_str(), d.arrows[1].x),
        ("final image", -0.2)
    );
    assert!(!d.arrows[1].real && d.arrows[1].role == ArrowRole::Final);
    // Through the object's tip, the lens, the end; on to 0.1 + 0.3·0.6 = 0.28 m.
    assert_eq!(d.chief_ray[..3], [(-0.5, 1.0), (0.0, 0.0), (0.1, 0.5)]);
    let (x, y) = d.chief_ray[3];
    assert!((x - 0.28).abs() < 1e-12 && (y - (0.5 + 2.5 * 0.18)).abs() < 1e-12);
    // Back from the end to the virtual image along the same line.
    assert_eq!(d.chief_ray_virtual[0], (0.1, 0.5));
    let (x, y) = d.chief_ray_virtual[1];
    assert!((x + 0.2).abs() < 1e-12 && (y - (0.5 - 2.5 * 0.3)).abs() < 1e-12);
}

#[test]
fn what_is_at_infinity_becomes_a_note() {
    let d = lens_diagram(SystemSketch {
        title: "t".into(),
        lenses: vec![lens("A", 0.0, 5.0), lens("B", 0.2, 5.0)],
        end: 0.2,
        object_before: None,
        images: vec![
            ImageMark {
                x: Some(0.2),
                real: true,
                height: None,
            },
            ImageMark {
                x: None,
                real: false,
                height: None,
            },
        ],
        chief_ray: None,
    })
    .expect("lenses");
    assert_eq!(d.arrows.len(), 1);
    assert_eq!(d.arrows[0].label, "image by A");
    // An image of undefined height is drawn at 0.6 of the object's.
    assert_eq!(d.arrows[0].height, 0.6);
    assert!(d.notes[0].starts_with("object at infinity"));
    assert_eq!(d.notes[1], "image by B at infinity");
    assert!(d.chief_ray.is_empty());
    // No lens, no diagram.
    let none = lens_diagram(SystemSketch {
        title: "t".into(),
        lenses: vec![],
        end: 0.0,
        object_before: Some(1.0),
        images: vec![],
        chief_ray: None,
    });
    assert!(none.is_none());
}
