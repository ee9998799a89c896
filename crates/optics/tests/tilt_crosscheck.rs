//! Cross-check of the tilted-lens power (`tilt::as_worn`, tagged [M]) against an
//! independent route: Coddington's oblique refraction equations applied surface by
//! surface to a thin lens traversed through its centre.
//!
//! Coddington's equations (as recounted by Kingslake, "Who discovered Coddington's
//! equations?", OPN 1994; written here from memory [M]): for a principal ray meeting
//! a surface of curvature `1/r` at incidence `I` (refracted `I'`), sagittal
//! `n'/s' − n/s = (n' cos I' − n cos I)/r` and tangential
//! `n' cos²I'/t' − n cos²I/t = (n' cos I' − n cos I)/r`. Their matrix form for an
//! astigmatic surface (Keating's generalised Coddington equations [M]) is
//! `Θ'·(n'V')·Θ' = Θ·(nV)·Θ + (n' cos I' − n cos I)·K` with `Θ = diag(1, cos I)` in
//! (sagittal, tangential) coordinates. Through the centre of a thin lens both
//! surfaces see the same `I` and `I'`, so the lens acts as
//! `F_t = (n cos I' − cos I)/(n − 1) · Θ⁻¹ F Θ⁻¹` [C], whose second-order expansion
//! `(1 + sin²I / 2n)` is Martin's factor: the two forms agree to O(sin⁴ I).

use parax_optics::refraction::SphCyl;
use parax_optics::tilt::{self, Tilt};

type M2 = [[f64; 2]; 2];

fn mul(a: M2, b: M2) -> M2 {
    let mut c = [[0.0; 2]; 2];
    for i in 0..2 {
        for j in 0..2 {
            c[i][j] = a[i][0] * b[0][j] + a[i][1] * b[1][j];
        }
    }
    c
}

fn scale(a: M2, k: f64) -> M2 {
    [[a[0][0] * k, a[0][1] * k], [a[1][0] * k, a[1][1] * k]]
}

fn sub(a: M2, b: M2) -> M2 {
    [
        [a[0][0] - b[0][0], a[0][1] - b[0][1]],
        [a[1][0] - b[1][0], a[1][1] - b[1][1]],
    ]
}

/// Largest |eigenvalue| of a symmetric 2×2 matrix: the largest meridional power.
fn norm(a: M2) -> f64 {
    let mean = (a[0][0] + a[1][1]) / 2.0;
    mean.abs() + ((a[0][0] - a[1][1]) / 2.0).hypot(a[0][1])
}

/// The thin lens by Coddington's equations, surface by surface: front surface of
/// curvature matrix `k1` (air → n), back `k2` (n → air), object at infinity, the
/// principal ray meeting the lens at incidence `i` with the tangential plane along
/// `tangential_is_y` (pantoscopic tilt: vertical; face form: horizontal).
fn coddington_thin_lens(k1: M2, k2: M2, n: f64, i_deg: f64, tangential_is_y: bool) -> M2 {
    let i = i_deg.to_radians();
    let ip = (i.sin() / n).asin();
    let theta = |c: f64| -> M2 {
        if tangential_is_y {
            [[1.0, 0.0], [0.0, c]]
        } else {
            [[c, 0.0], [0.0, 1.0]]
        }
    };
    let inv = |c: f64| theta(1.0 / c);
    // Front surface: Θ'(n V1)Θ' = 0 + (n cos I' − cos I) K1.
    let rhs1 = scale(k1, n * ip.cos() - i.cos());
    let n_v1 = mul(mul(inv(ip.cos()), rhs1), inv(ip.cos()));
    // Back surface: Θ(1·V2)Θ = Θ'(n V1)Θ' + (cos I − n cos I') K2.
    let inside = mul(mul(theta(ip.cos()), n_v1), theta(ip.cos()));
    let rhs2 = [
        [
            inside[0][0] + (i.cos() - n * ip.cos()) * k2[0][0],
            inside[0][1] + (i.cos() - n * ip.cos()) * k2[0][1],
        ],
        [
            inside[1][0] + (i.cos() - n * ip.cos()) * k2[1][0],
            inside[1][1] + (i.cos() - n * ip.cos()) * k2[1][1],
        ],
    ];
    mul(mul(inv(i.cos()), rhs2), inv(i.cos()))
}

/// A lens of power matrix `f` split into a spherical front of `front` D and the
/// back surface that completes it (thin lens: `F = (n − 1)(K1 − K2)`).
fn surfaces(f: M2, front: f64, n: f64) -> (M2, M2) {
    let k1 = [[front / (n - 1.0), 0.0], [0.0, front / (n - 1.0)]];
    let k2 = sub(k1, scale(f, 1.0 / (n - 1.0)));
    (k1, k2)
}

#[test]
fn martin_agrees_with_coddington_for_a_sphere_to_fourth_order() {
    for &(s, n) in &[(15.0, 1.5), (-10.0, 1.6), (6.0, 1.74), (-4.0, 1.498)] {
        let lens = SphCyl::new(s, 0.0, 180.0);
        let (k1, k2) = surfaces(lens.power_matrix(), 6.0, n);
        for &a in &[2.0_f64, 5.0, 10.0, 15.0, 20.0] {
            let exact = coddington_thin_lens(k1, k2, n, a, true);
            let (sph, cyl) = tilt::martin(s, a, n);
            // Martin: sagittal (horizontal) S', tangential (vertical) S' + C.
            let martin: M2 = [[sph, 0.0], [0.0, sph + cyl]];
            let d = norm(sub(exact, martin));
            let s4 = a.to_radians().sin().powi(4);
            // [C] the factors differ by s⁴(1 − 1/n³)/(8(n − 1)) + O(s⁶) (series of
            // √(n² − s²) − √(1 − s²)); bound 0.3·|S|·sin⁴a covers n ≥ 1.49 to 20°.
            assert!(
                d <= 0.3 * s.abs() * s4 + 1e-12,
                "S {s}, n {n}, {a}°: difference {d}"
            );
            // and the difference is not zero: two distinct forms, equal to O(s²)
            assert!(d > 0.0);
            // [C] at the usual tilts (≤ 10°) the forms agree within 0.005 D for |S| ≤ 15 D
            if a <= 10.0 {
                assert!(d < 0.005, "S {s}, {a}°: {d}");
            }
        }
    }
}

#[test]
fn matrix_form_agrees_with_coddington_for_spherocylinders_about_one_axis() {
    // Every axis, both single-axis tilts, plus and minus, several indices: the
    // implementation's matrix equals the Coddington route times the ratio of
    // Martin's factor to the exact obliquity factor (structure identical, to
    // 1e-12 D), and the two differ by O(sin⁴ a) only.
    for &(s, c, n) in &[(-5.5, -0.75, 1.6), (4.0, -2.0, 1.5), (-8.0, -3.0, 1.67)] {
        for axis in (5..=180).step_by(5) {
            let lens = SphCyl::new(s, c, axis as f64);
            let f = lens.power_matrix();
            let (k1, k2) = surfaces(f, 4.0, n);
            for &(a, pantoscopic) in &[(8.0_f64, true), (12.0, false), (15.0, true)] {
                let t = if pantoscopic {
                    Tilt {
                        pantoscopic_deg: a,
                        face_form_deg: 0.0,
                    }
                } else {
                    Tilt {
                        pantoscopic_deg: 0.0,
                        face_form_deg: a,
                    }
                };
                let ours = tilt::as_worn(&lens, t, n).power_matrix();
                let exact = coddington_thin_lens(k1, k2, n, a, pantoscopic);
                let sn = a.to_radians().sin();
                let k_exact = ((n * n - sn * sn).sqrt() - (1.0 - sn * sn).sqrt()) / (n - 1.0);
                let k_martin = 1.0 + sn * sn / (2.0 * n);
                let same_structure = norm(sub(ours, scale(exact, k_martin / k_exact)));
                assert!(same_structure < 1e-9, "{lens:?} {a}°: {same_structure}");
                let d = norm(sub(ours, exact));
                assert!(d <= 0.3 * norm(f) * sn.powi(4) + 1e-9, "{lens:?} {a}°: {d}");
            }
        }
    }
}

#[test]
fn compound_tilt_omits_an_oblique_term_of_order_sin_p_sin_f() {
    // With both pantoscopic tilt and face form the principal ray meets the lens
    // in an oblique plane, so even a sphere gains an oblique (J45) cylinder. The
    // implementation's symmetric stretch diag(1/cos f, 1/cos p) has no
    // off-diagonal term. The projection route below (lens plane projected along
    // the line of sight after face form, then pantoscopic tilt; exact obliquity
    // factor) measures what is left out [C]: for −5.50 / −0.75 x 180, 10° / 5°,
    // n 1.6 about 0.10 D (largest meridional difference), nearly all of it the
    // off-diagonal term; tol: between 0.08 and 0.12 D.
    let lens = SphCyl::new(-5.5, -0.75, 180.0);
    let n = 1.6;
    let (p, f) = (10.0_f64.to_radians(), 5.0_f64.to_radians());
    // Lens axes after R = Rx(p)·Ry(f), projected onto the plane normal to the ray.
    let ex = [f.cos(), 0.0];
    let ey = [p.sin() * f.sin(), p.cos()];
    let a: M2 = [[ex[0], ey[0]], [ex[1], ey[1]]];
    let det = a[0][0] * a[1][1] - a[0][1] * a[1][0];
    let ai: M2 = [
        [a[1][1] / det, -a[0][1] / det],
        [-a[1][0] / det, a[0][0] / det],
    ];
    let ait: M2 = [[ai[0][0], ai[1][0]], [ai[0][1], ai[1][1]]];
    let g = (p.cos() * f.cos()).acos();
    let sg = g.sin();
    let k = ((n * n - sg * sg).sqrt() - (1.0 - sg * sg).sqrt()) / (n - 1.0);
    let projected = scale(mul(mul(ait, lens.power_matrix()), ai), k);
    let ours = tilt::as_worn(
        &lens,
        Tilt {
            pantoscopic_deg: 10.0,
            face_form_deg: 5.0,
        },
        n,
    )
    .power_matrix();
    let d = norm(sub(projected, ours));
    assert!((0.08..=0.12).contains(&d), "difference {d}");
    // The diagonal (meridians 180 and 90) agrees within 0.005 D: the omission is
    // the oblique part.
    assert!((projected[0][0] - ours[0][0]).abs() < 0.005);
    assert!((projected[1][1] - ours[1][1]).abs() < 0.005);
    assert!(projected[0][1].abs() > 0.08);
    assert!(ours[0][1].abs() < 1e-12);
}
