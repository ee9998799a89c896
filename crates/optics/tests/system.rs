//! Lens systems: step-along vergence and matrices, two routes that must agree.

#[macro_use]
mod common;

use parax_optics::system::{
    cardinal_points, image_space_index, layout, matrix_image, system_matrix, system_matrix_in,
    system_powers, trace, transfer_vergence, Element, ImagePlace, Matrix2, Object,
};

fn two_lens() -> Vec<Element> {
    vec![
        Element::ThinLens { power: 5.0 },
        Element::Gap {
            length_m: 0.10,
            index: 1.0,
        },
        Element::ThinLens { power: 2.0 },
    ]
}

fn thick_lens() -> Vec<Element> {
    vec![
        Element::ThinLens { power: 8.0 },
        Element::Gap {
            length_m: 0.006,
            index: 1.5,
        },
        Element::ThinLens { power: -2.0 },
    ]
}

fn image_distance(p: ImagePlace) -> (f64, bool) {
    match p {
        ImagePlace::At {
            after_element_m,
            real,
        } => (after_element_m, real),
        ImagePlace::AtInfinity => panic!("image at infinity"),
    }
}

#[test]
fn two_lens_step_along() {
    let t = trace(
        Object::Distance {
            before_first_m: 0.5,
        },
        &two_lens(),
        1.0,
    );
    assert_eq!(t.steps.len(), 2);
    assert_eq!(t.steps[0].element_index, 0);
    assert_eq!(t.steps[1].element_index, 2);
    let (l1, real1) = image_distance(t.steps[0].image);
    // [C] CAPABILITIES §4, intermediate image +33.33 cm after lens 1; tol 1e-4 m
    assert_close!(l1, 0.3333, 1e-4);
    assert!(real1);
    // [C] CAPABILITIES §4, step-along L2 = 3/(1 - 0.1·3) = 4.2857 D; tol 1e-4
    assert_close!(t.steps[1].incident_vergence, 4.2857, 1e-4);
    let (l2, real2) = image_distance(t.final_image);
    // [C] CAPABILITIES §4, final image 15.9091 cm after lens 2; tol 1e-6 m
    assert_close!(l2, 0.159091, 1e-6);
    assert!(real2);
    // [C] CAPABILITIES §4, m1 = L/L' = -0.6667; tol 1e-4
    assert_close!(t.steps[0].magnification.unwrap(), -0.6667, 1e-4);
    // [C] CAPABILITIES §4, m2 = +0.6818; tol 1e-4
    assert_close!(t.steps[1].magnification.unwrap(), 0.6818, 1e-4);
    // [C] CAPABILITIES §4, total m = -0.4545 (real, inverted); tol 1e-4
    assert_close!(t.total_magnification.unwrap(), -0.4545, 1e-4);
    assert_eq!(t.erect, Some(false));
}

#[test]
fn two_lens_matrix_route() {
    let m = system_matrix(&two_lens());
    // [C] CAPABILITIES §4, det = 1; tol 1e-12
    assert_close!(m.det(), 1.0, 1e-12);
    let p = system_powers(&m);
    // [C] CAPABILITIES §4, equivalent power F = -C = 6.000; tol 1e-9
    assert_close!(p.equivalent, 6.0, 1e-9);
    // [C] CAPABILITIES §4, BVP = -C/A = 12.000; tol 1e-9
    assert_close!(p.back_vertex, 12.0, 1e-9);
    // [C] CAPABILITIES §4, FVP = -C/D = 7.500; tol 1e-9
    assert_close!(p.front_vertex, 7.5, 1e-9);
    let obj = Object::Distance {
        before_first_m: 0.5,
    };
    let (img, mag) = matrix_image(obj, &two_lens(), 1.0);
    let (l, real) = image_distance(img);
    // [C] CAPABILITIES §4, matrix route: final image 15.9091 cm; tol 1e-6 m
    assert_close!(l, 0.159091, 1e-6);
    assert!(real);
    // [C] CAPABILITIES §4, matrix route: m = 1/(C·u + D) = -0.4545; tol 1e-4
    assert_close!(mag.unwrap(), -0.4545, 1e-4);
    // Both routes agree to rounding.
    let t = trace(obj, &two_lens(), 1.0);
    let (lt, _) = image_distance(t.final_image);
    // [C] CAPABILITIES §4, two routes agree; tol 1e-12
    assert_close!(lt, l, 1e-12);
    assert_close!(t.total_magnification.unwrap(), mag.unwrap(), 1e-12);
}

#[test]
fn two_lens_vertex_powers_by_vergence() {
    // Object at infinity: the back focal point is 1/BVP after lens 2.
    let t = trace(Object::AtInfinity, &two_lens(), 1.0);
    // [C] CAPABILITIES §4, BVP 12.000 by step-along; tol 1e-9
    assert_close!(t.steps[1].emergent_vergence, 12.0, 1e-9);
    assert_eq!(t.total_magnification, None);
    assert_eq!(t.erect, None);
    assert_eq!(t.steps[0].magnification, None);
    let cp = cardinal_points(&system_matrix(&two_lens()), 1.0, 1.0).unwrap();
    // [C] CAPABILITIES §4, back focal point 1/12 m after lens 2; tol 1e-12
    assert_close!(cp.back_focal, 1.0 / 12.0, 1e-12);
    // [C] CAPABILITIES §4, front focal point 1/7.5 m before lens 1; tol 1e-12
    assert_close!(cp.front_focal, -1.0 / 7.5, 1e-12);
    // [C] derived: front focal length -1/F between F and P; tol 1e-12
    assert_close!(cp.front_focal - cp.front_principal, -1.0 / 6.0, 1e-12);
    // [C] derived: back focal length +1/F between P' and F'; tol 1e-12
    assert_close!(cp.back_focal - cp.back_principal, 1.0 / 6.0, 1e-12);
    // [C] derived: in air the nodal points coincide with the principal points; tol 1e-12
    assert_close!(cp.front_nodal, cp.front_principal, 1e-12);
    assert_close!(cp.back_nodal, cp.back_principal, 1e-12);
}

#[test]
fn thick_lens_powers() {
    let m = system_matrix(&thick_lens());
    let p = system_powers(&m);
    // [C] CAPABILITIES §4, thick lens +8/-2, 6 mm, n 1.5: F 6.0640; tol 1e-4
    assert_close!(p.equivalent, 6.0640, 1e-4);
    // [C] CAPABILITIES §4, BVP 6.2645; tol 1e-4
    assert_close!(p.back_vertex, 6.2645, 1e-4);
    // [C] CAPABILITIES §4, FVP 6.0159; tol 1e-4
    assert_close!(p.front_vertex, 6.0159, 1e-4);
    // [C] CAPABILITIES §4, det = 1; tol 1e-12
    assert_close!(m.det(), 1.0, 1e-12);
    // Second route: vergence of an infinite object after the back surface.
    let t = trace(Object::AtInfinity, &thick_lens(), 1.0);
    // [C] CAPABILITIES §4, BVP by step-along: 8/(1 - 0.004·8) - 2 = 6.2645; tol 1e-4
    assert_close!(t.steps[1].emergent_vergence, 6.2645, 1e-4);
    // Third route: the same lens as two surfaces of radius 62.5 mm and -250 mm.
    let surfaces = [
        Element::Surface {
            radius_m: 0.0625,
            index_after: 1.5,
        },
        Element::Gap {
            length_m: 0.006,
            index: 1.5,
        },
        Element::Surface {
            radius_m: 0.25,
            index_after: 1.0,
        },
    ];
    let ps = system_powers(&system_matrix(&surfaces));
    // [C] CAPABILITIES §4, surfaces (1.5-1)/0.0625 = +8 and (1-1.5)/0.25 = -2 give F 6.0640; tol 1e-4
    assert_close!(ps.equivalent, 6.0640, 1e-4);
    assert_close!(ps.back_vertex, p.back_vertex, 1e-12);
}

#[test]
fn matrix_primitives() {
    let r = Matrix2::refraction(5.0);
    assert_eq!((r.a, r.b, r.c, r.d), (1.0, 0.0, -5.0, 1.0));
    let t = Matrix2::transfer(0.006, 1.5);
    // [C] CAPABILITIES §4, transfer [[1, d/n], [0, 1]]; tol 1e-15
    assert_close!(t.b, 0.004, 1e-15);
    let m = r.then(&t);
    // next · self: [[1,0.004],[0,1]]·[[1,0],[-5,1]] = [[0.98, 0.004], [-5, 1]]
    assert_close!(m.a, 0.98, 1e-15);
    assert_close!(m.b, 0.004, 1e-15);
    assert_close!(m.c, -5.0, 1e-15);
    assert_close!(m.d, 1.0, 1e-15);
    assert_eq!(Matrix2::IDENTITY.then(&r), r);
    // [C] CAPABILITIES §4, L2 = L1'/(1 - (d/n)L1'); tol 1e-12
    assert_close!(transfer_vergence(3.0, 0.1, 1.0), 3.0 / 0.7, 1e-12);
}

#[test]
fn afocal_system_has_no_cardinal_points() {
    // Galilean telescope: +4 and -8 separated by 1/8 m.
    let els = [
        Element::ThinLens { power: 4.0 },
        Element::Gap {
            length_m: 0.125,
            index: 1.0,
        },
        Element::ThinLens { power: -8.0 },
    ];
    let m = system_matrix(&els);
    // [C] CAPABILITIES §4, F = F1 + F2 - d·F1·F2 = 4 - 8 + 4 = 0; tol 1e-12
    assert_close!(m.c, 0.0, 1e-12);
    assert_eq!(cardinal_points(&m, 1.0, 1.0), None);
    let t = trace(Object::AtInfinity, &els, 1.0);
    assert_eq!(t.final_image, ImagePlace::AtInfinity);
}

#[test]
fn intermediate_image_at_infinity_falls_back_to_matrix() {
    // Object at the first focal point of lens 1: collimated between lenses.
    let els = two_lens();
    let obj = Object::Distance {
        before_first_m: 0.2,
    };
    let t = trace(obj, &els, 1.0);
    assert_eq!(t.steps[0].image, ImagePlace::AtInfinity);
    assert_eq!(t.steps[0].magnification, None);
    let (l, real) = image_distance(t.final_image);
    // [C] CAPABILITIES §4, collimated light at lens 2 images at 1/F2 = 0.5 m; tol 1e-12
    assert_close!(l, 0.5, 1e-12);
    assert!(real);
    // [C] CAPABILITIES §4, m = 1/(C·u + D) = 1/(-6·0.2 + 0.8) = -2.5; tol 1e-12
    assert_close!(t.total_magnification.unwrap(), -2.5, 1e-12);
}

#[test]
fn virtual_image_and_erect() {
    // Object inside the focal length of a +5 lens: virtual, erect, magnified.
    let t = trace(
        Object::Distance {
            before_first_m: 0.1,
        },
        &[Element::ThinLens { power: 5.0 }],
        1.0,
    );
    let (l, real) = image_distance(t.final_image);
    // [C] CAPABILITIES §4, L' = -10 + 5 = -5 D -> image 0.2 m before the lens, virtual; tol 1e-12
    assert_close!(l, -0.2, 1e-12);
    assert!(!real);
    // [C] CAPABILITIES §4, m = L/L' = -10/-5 = +2; tol 1e-12
    assert_close!(t.total_magnification.unwrap(), 2.0, 1e-12);
    assert_eq!(t.erect, Some(true));
}

#[test]
fn emsley_reduced_eye() {
    let eye = [Element::Surface {
        radius_m: 0.05 / 9.0,
        index_after: 4.0 / 3.0,
    }];
    let m = system_matrix(&eye);
    // [M] Emsley reduced eye (CAPABILITIES §5): power 60.000 D; tol 1e-9
    assert_close!(system_powers(&m).equivalent, 60.0, 1e-9);
    let cp = cardinal_points(&m, 1.0, image_space_index(&eye, 1.0)).unwrap();
    // [M] Emsley reduced eye (CAPABILITIES §5): axial length n'/F = 22.222 mm; tol 1e-6 m
    assert_close!(cp.back_focal, 0.022222, 1e-6);
    // [C] single surface: nodal point at the centre of curvature 50/9 mm; tol 1e-12
    assert_close!(cp.back_nodal, 0.05 / 9.0, 1e-12);
    assert_close!(cp.front_principal, 0.0, 1e-12);
    // Vergence route: parallel light focuses at the retina.
    let t = trace(Object::AtInfinity, &eye, 1.0);
    let (l, _) = image_distance(t.final_image);
    // [M] Emsley reduced eye: same 22.222 mm by step-along; tol 1e-6 m
    assert_close!(l, 0.022222, 1e-6);
}

/// Gullstrand exact eye No. 1, relaxed: radius mm, index after, gap mm.
const GULLSTRAND: [(f64, f64, f64); 6] = [
    (7.7, 1.376, 0.5),
    (6.8, 1.336, 3.1),
    (10.0, 1.386, 0.546),
    (7.911, 1.406, 2.419),
    (-5.76, 1.386, 0.635),
    (-6.0, 1.336, 17.185),
];

/// Surfaces and gaps in metres, stopping at the last surface.
fn eye_elements(table: &[(f64, f64, f64)]) -> Vec<Element> {
    let mut out = Vec::new();
    for (i, &(r, n, d)) in table.iter().enumerate() {
        out.push(Element::Surface {
            radius_m: r / 1000.0,
            index_after: n,
        });
        if i + 1 < table.len() {
            out.push(Element::Gap {
                length_m: d / 1000.0,
                index: n,
            });
        }
    }
    out
}

#[test]
fn gullstrand_exact_eye() {
    let els = eye_elements(&GULLSTRAND);
    let m = system_matrix(&els);
    // [C] det = 1 for any system; tol 1e-12
    assert_close!(m.det(), 1.0, 1e-12);
    // [S] Atchison & Smith, Optics of the Human Eye (2000): eye 58.64 D; tol 0.005
    assert_close!(system_powers(&m).equivalent, 58.64, 0.005);
    let n_img = image_space_index(&els, 1.0);
    assert_eq!(n_img, 1.336);
    let cp = cardinal_points(&m, 1.0, n_img).unwrap();
    let len = 0.0072; // cornea to back of lens, 7.2 mm
                      // [S] Atchison & Smith (2000): F' at 24.385 mm from the cornea; tol 0.001 mm
    assert_close!((cp.back_focal + len) * 1000.0, 24.385, 0.001);
    // [S] Atchison & Smith (2000): P 1.348 mm; tol 0.001 mm
    assert_close!(cp.front_principal * 1000.0, 1.348, 0.001);
    // [S] Atchison & Smith (2000): P' 1.602 mm; tol 0.002 mm (computed 1.6008)
    assert_close!((cp.back_principal + len) * 1000.0, 1.602, 0.002);
    // [S] Atchison & Smith (2000): N 7.078 mm; tol 0.001 mm
    assert_close!(cp.front_nodal * 1000.0, 7.078, 0.001);
    // [S] Atchison & Smith (2000): N' 7.332 mm; tol 0.002 mm (computed 7.3311)
    assert_close!((cp.back_nodal + len) * 1000.0, 7.332, 0.002);
    // Lens alone, aqueous to vitreous.
    let lens = system_matrix_in(&els[4..], 1.336);
    // [S] Atchison & Smith (2000): lens 19.11 D; tol 0.005
    assert_close!(system_powers(&lens).equivalent, 19.11, 0.005);
    // Cornea alone.
    let cornea = system_matrix(&els[..3]);
    // [S] Atchison & Smith (2000): cornea 43.05 D; tol 0.005
    assert_close!(system_powers(&cornea).equivalent, 43.05, 0.005);
    // Vergence route agrees with the matrix route for the focal point.
    let t = trace(Object::AtInfinity, &els, 1.0);
    let (l, real) = image_distance(t.final_image);
    // [C] two routes agree; tol 1e-12 m
    assert_close!(l, cp.back_focal, 1e-12);
    assert!(real);
}

#[test]
fn le_grand_eye() {
    let table = [
        (7.8, 1.3771, 0.55),
        (6.5, 1.3374, 3.05),
        (10.2, 1.42, 4.0),
        (-6.0, 1.336, 16.5966),
    ];
    let els = eye_elements(&table);
    let m = system_matrix(&els);
    // [S] Atchison & Smith (2000) / Le Grand & El Hage (1980): eye 59.940 D; tol 1e-3
    assert_close!(system_powers(&m).equivalent, 59.940, 1e-3);
    let cp = cardinal_points(&m, 1.0, 1.336).unwrap();
    // [S] same sources: F' at 24.197 mm from the cornea; tol 1e-3 mm
    assert_close!((cp.back_focal + 0.0076) * 1000.0, 24.197, 1e-3);
    let lens = system_matrix_in(&els[4..], 1.3374);
    // [S] same sources: lens 21.779 D; tol 1e-3
    assert_close!(system_powers(&lens).equivalent, 21.779, 1e-3);
    let cornea = system_matrix(&els[..3]);
    // [S] same sources: cornea 42.356 D; tol 1e-3
    assert_close!(system_powers(&cornea).equivalent, 42.356, 1e-3);
}

#[test]
fn trailing_gap_sets_image_medium() {
    // A thin +60 D lens followed by water-like medium: image at n'/F.
    let els = [
        Element::ThinLens { power: 60.0 },
        Element::Gap {
            length_m: 0.03,
            index: 4.0 / 3.0,
        },
    ];
    let t = trace(Object::AtInfinity, &els, 1.0);
    let (l, _) = image_distance(t.final_image);
    // [C] CAPABILITIES §4, l' = n'/L' = (4/3)/60 = 22.222 mm; tol 1e-12 m
    assert_close!(l, (4.0 / 3.0) / 60.0, 1e-12);
    let (img, _) = matrix_image(Object::AtInfinity, &els, 1.0);
    let (lm, _) = image_distance(img);
    assert_close!(lm, l, 1e-12);
}

#[test]
fn no_refracting_elements() {
    let t = trace(
        Object::Distance {
            before_first_m: 0.3,
        },
        &[Element::Gap {
            length_m: 0.1,
            index: 1.0,
        }],
        1.0,
    );
    assert!(t.steps.is_empty());
    assert_eq!(t.total_magnification, Some(1.0));
    let (l, _) = image_distance(t.final_image);
    // [C] the object itself, 0.4 m before the end of the gap; tol 1e-12
    assert_close!(l, -0.4, 1e-12);
}

#[test]
fn chief_ray_meets_every_image_tip() {
    use parax_optics::system::{ray_heights, trace, Element, ImagePlace, Object};
    // The two-lens relay of examples/bench-relay.parax: object 1 unit high, 40 cm
    // before A (+6 D); 20 cm to B (+10 D).
    let els = [
        Element::ThinLens { power: 6.0 },
        Element::Gap {
            length_m: 0.2,
            index: 1.0,
        },
        Element::ThinLens { power: 10.0 },
    ];
    let t = trace(
        Object::Distance {
            before_first_m: 0.4,
        },
        &els,
        1.0,
    );
    // A ray from the object tip through the centre of A: y = 0 at A, n·u = −1/0.4.
    let (heights, y, nu) = ray_heights(&els, 0.0, -1.0 / 0.4, 1.0);
    // [C] transfer y' = y + d·u: at B, y = 0.2 × (−2.5) = −0.5; tol 1e-12
    assert_close!(heights[1], -0.5, 1e-12);
    // [C] paraxial imaging (every ray from an object point passes through its
    // image point): at the final image (4.615 cm after B) the ray's height is the
    // image height m·h = −0.3846 (CAPABILITIES §4 / README bench relay); tol 1e-9
    let ImagePlace::At {
        after_element_m, ..
    } = t.final_image
    else {
        panic!("finite image")
    };
    let m = t.total_magnification.unwrap();
    assert_close!(y + nu * after_element_m, m, 1e-9);
    assert_close!(m, -0.384615, 1e-6);
}

#[test]
fn layout_places_elements_images_and_the_chief_ray() {
    // Invented bench: A +5 D, 0.2 m of air, then a surface r = +0.1 m into n = 1.5
    // (power (1.5 − 1)/0.1 = +5 D [C] (n' − n)/r), object 0.4 m before A.
    let els = [
        Element::ThinLens { power: 5.0 },
        Element::Gap {
            length_m: 0.2,
            index: 1.0,
        },
        Element::Surface {
            radius_m: 0.1,
            index_after: 1.5,
        },
    ];
    let l = layout(
        Object::Distance {
            before_first_m: 0.4,
        },
        &els,
    );
    assert_eq!(l.positions, vec![0.0, 0.2]);
    assert_close!(l.powers[1], 5.0, 1e-12);
    assert_close!(l.end_m, 0.2, 1e-12);
    // [C] step-along vergence: at A, L = −2.5, L' = +2.5: real image 0.4 m
    // after A, m = L/L' = −1; at the surface L = 2.5/(1 − 0.2·2.5) = 5,
    // L' = 10, image n'/L' = 0.15 m after it (z = 0.35), m = 5/10, height −0.5;
    // tol 1e-12
    assert_close!(l.images[0].at_m.unwrap(), 0.4, 1e-12);
    assert_close!(l.images[0].height.unwrap(), -1.0, 1e-12);
    assert!(l.images[1].real);
    assert_close!(l.images[1].at_m.unwrap(), 0.35, 1e-12);
    assert_close!(l.images[1].height.unwrap(), -0.5, 1e-12);
    // [C] the chief ray: y = 0 at A, n·u = −2.5; at the surface y = 0.2·(−2.5)
    // = −0.5, then n'u' = −2.5 + 0.5·5 = 0 (parallel to the axis), so it meets
    // the final image at height −0.5 (every ray from the object's tip passes
    // through the image's tip); tol 1e-12
    let ray = l.chief_ray.expect("finite object");
    assert_close!(ray.heights[0], 0.0, 1e-12);
    assert_close!(ray.heights[1], -0.5, 1e-12);
    assert_close!(ray.exit_height, -0.5, 1e-12);
    assert_close!(ray.exit_slope, 0.0, 1e-12);
    // An object at infinity: images placed, heights undefined, no chief ray.
    let l = layout(Object::AtInfinity, &els);
    assert_eq!(l.images[0].height, None);
    assert!(l.chief_ray.is_none());
}
