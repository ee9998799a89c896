//! Refraction algebra: power vectors, transposition, crossed cylinders,
//! meridional power, principal meridians and far points.

#[macro_use]
mod common;

use common::axis_diff;
use parax_optics::refraction::{
    max_rotation_for_residual, normalize_axis, rotation_residual_cylinder, FarPoint, PowerVector,
    SphCyl,
};

#[test]
fn power_vector_plus1_minus2_x45() {
    let pv = SphCyl::new(1.0, -2.0, 45.0).power_vector();
    // [C] CAPABILITIES §1 (Thibos 1997 formulas), M = S + C/2 = 0; tol 1e-9
    assert_close!(pv.m, 0.0, 1e-9);
    // [C] CAPABILITIES §1, J0 = -(C/2)cos 2θ = 0; tol 1e-9
    assert_close!(pv.j0, 0.0, 1e-9);
    // [C] CAPABILITIES §1, J45 = -(C/2)sin 2θ = +1.000; tol 1e-9
    assert_close!(pv.j45, 1.0, 1e-9);
    // [C] CAPABILITIES §1, B = √(M²+J0²+J45²) = 1.000; tol 1e-9
    assert_close!(pv.blur_strength(), 1.0, 1e-9);
}

#[test]
fn power_vector_minus2_minus1_x180() {
    let pv = SphCyl::new(-2.0, -1.0, 180.0).power_vector();
    // [C] CAPABILITIES §1, M = -2.500; tol 1e-9
    assert_close!(pv.m, -2.5, 1e-9);
    // [C] CAPABILITIES §1, J0 = +0.500; tol 1e-9
    assert_close!(pv.j0, 0.5, 1e-9);
    // [C] CAPABILITIES §1, J45 = 0; tol 1e-9
    assert_close!(pv.j45, 0.0, 1e-9);
    // [C] CAPABILITIES §1, B = 2.5495; tol 1e-4
    assert_close!(pv.blur_strength(), 2.5495, 1e-4);
}

#[test]
fn power_vector_minus325_minus150_x170() {
    let pv = SphCyl::new(-3.25, -1.5, 170.0).power_vector();
    // [C] CAPABILITIES §1, M = -4.000; tol 1e-9
    assert_close!(pv.m, -4.0, 1e-9);
    // [C] CAPABILITIES §1, J0 = +0.7048; tol 1e-4
    assert_close!(pv.j0, 0.7048, 1e-4);
    // [C] CAPABILITIES §1, J45 = -0.2565; tol 1e-4
    assert_close!(pv.j45, -0.2565, 1e-4);
    // [C] CAPABILITIES §1, B = 4.0697; tol 1e-4
    assert_close!(pv.blur_strength(), 4.0697, 1e-4);
}

#[test]
fn transposed_pair_has_identical_vectors() {
    let a = SphCyl::new(2.0, -1.5, 30.0);
    let b = SphCyl::new(0.5, 1.5, 120.0);
    for pv in [a.power_vector(), b.power_vector()] {
        // [C] CAPABILITIES §1, both give (1.25, 0.375, 0.6495); tol 1e-4
        assert_close!(pv.m, 1.25, 1e-4);
        assert_close!(pv.j0, 0.375, 1e-4);
        assert_close!(pv.j45, 0.6495, 1e-4);
    }
    let t = a.transposed();
    // [C] CAPABILITIES §1, transposition (S+C, -C, θ±90) of +2.00 -1.50 x 30 = +0.50 +1.50 x 120; tol 1e-12
    assert_close!(t.sphere, 0.5, 1e-12);
    assert_close!(t.cylinder, 1.5, 1e-12);
    assert_close!(t.axis, 120.0, 1e-12);
    assert_eq!(b.minus_cyl(), SphCyl::new(2.0, -1.5, 30.0));
    assert_eq!(a.plus_cyl(), b);
    assert_eq!(a.minus_cyl(), a);
}

#[test]
fn transposition_wraps_axis_to_180() {
    let t = SphCyl::new(-1.0, 0.5, 90.0).transposed();
    // [CP] CAPABILITIES conventions, axis 0 written as 180; exact
    assert_eq!(t.axis, 180.0);
    assert_close!(t.sphere, -0.5, 1e-12);
    assert_close!(t.cylinder, -0.5, 1e-12);
    assert_eq!(normalize_axis(0.0), 180.0);
    assert_eq!(normalize_axis(-15.0), 165.0);
    assert_eq!(normalize_axis(360.0), 180.0);
    assert_eq!(normalize_axis(190.0), 10.0);
    assert_eq!(SphCyl::new(0.0, -1.0, 0.0).axis, 180.0);
}

#[test]
fn spherical_equivalent() {
    // [C] CAPABILITIES §1, M = S + C/2 = -3.25 - 0.75 = -4.00; tol 1e-12
    assert_close!(
        SphCyl::new(-3.25, -1.5, 170.0).spherical_equivalent(),
        -4.0,
        1e-12
    );
}

#[test]
fn obliquely_crossed_cylinders() {
    let r = SphCyl::new(0.0, 1.0, 30.0).combine(&SphCyl::new(0.0, 2.0, 90.0));
    // [C] CAPABILITIES §1, +1.00 DC x 30 with +2.00 DC x 90 -> sphere +2.366; tol 1e-3
    assert_close!(r.sphere, 2.366, 1e-3);
    // [C] CAPABILITIES §1, cylinder -1.732; tol 1e-3
    assert_close!(r.cylinder, -1.732, 1e-3);
    // [C] CAPABILITIES §1, axis 165; tol 1e-6 deg
    assert_close!(r.axis, 165.0, 1e-6);
}

#[test]
fn combine_matches_power_matrix_sum() {
    // Second route: the dioptric power matrix (CAPABILITIES §1) is additive.
    let a = SphCyl::new(-1.25, -0.75, 20.0);
    let b = SphCyl::new(0.5, -1.0, 75.0);
    let r = a.combine(&b);
    let (ma, mb, mr) = (a.power_matrix(), b.power_matrix(), r.power_matrix());
    for i in 0..2 {
        for j in 0..2 {
            // [C] CAPABILITIES §1, power matrices of lenses in contact add; tol 1e-9
            assert_close!(mr[i][j], ma[i][j] + mb[i][j], 1e-9, "[{i}][{j}]");
        }
    }
}

#[test]
fn meridian_power_in_90_of_oblique_cyl() {
    let rx = SphCyl::new(-2.0, -1.5, 30.0);
    // [C] CAPABILITIES §1, F(90) = S + C sin²(90-30) = -3.125; tol 1e-9
    assert_close!(rx.meridian_power(90.0), -3.125, 1e-9);
    // [C] CAPABILITIES §1, F(θ) = S along the axis; tol 1e-12
    assert_close!(rx.meridian_power(30.0), -2.0, 1e-12);
    // [C] CAPABILITIES §1, F(θ+90) = S + C; tol 1e-12
    assert_close!(rx.meridian_power(120.0), -3.5, 1e-12);
}

#[test]
fn principal_meridians_and_far_points() {
    let rx = SphCyl::new(-2.0, -1.0, 180.0);
    let [along, across] = rx.principal_meridians();
    assert_eq!(along.meridian, 180.0);
    assert_eq!(across.meridian, 90.0);
    // [C] CAPABILITIES §1, powers S = -2 @180 and S+C = -3 @90; tol 1e-12
    assert_close!(along.power, -2.0, 1e-12);
    assert_close!(across.power, -3.0, 1e-12);
    match rx.far_points() {
        [FarPoint::At { distance_m: a }, FarPoint::At { distance_m: b }] => {
            // [C] CAPABILITIES §11, far point 1/R = -0.5 m (real, in front); tol 1e-12
            assert_close!(a, -0.5, 1e-12);
            // [C] CAPABILITIES §11, far point 1/R = -0.3333 m; tol 1e-4
            assert_close!(b, -0.3333, 1e-4);
        }
        other => panic!("unexpected far points {other:?}"),
    }
    let hyperope = SphCyl::new(2.0, -2.0, 90.0).far_points();
    assert!(matches!(hyperope[0], FarPoint::At { distance_m } if (distance_m - 0.5).abs() < 1e-12));
    assert_eq!(hyperope[1], FarPoint::Infinity);
}

#[test]
fn power_vector_inverse_known_values() {
    let rx = PowerVector::new(-4.0, 0.7048, -0.2565).to_sphcyl();
    // [C] CAPABILITIES §1, inverse of (−4, 0.7048, −0.2565) -> −3.25 −1.50 × 170; tol 2e-4
    assert_close!(rx.sphere, -3.25, 2e-4);
    assert_close!(rx.cylinder, -1.5, 2e-4);
    assert_close!(rx.axis, 170.0, 1e-2);
    let sph = PowerVector::new(1.5, 0.0, 0.0).to_sphcyl();
    // [CP] CAPABILITIES §1, J = 0 -> cylinder 0, axis written 180; exact
    assert_eq!(
        sph,
        SphCyl {
            sphere: 1.5,
            cylinder: 0.0,
            axis: 180.0
        }
    );
}

#[test]
fn power_vector_arithmetic() {
    let a = PowerVector::new(1.0, 0.5, -0.25);
    let b = PowerVector::new(-2.0, 0.25, 0.75);
    assert_eq!(a.add(&b), PowerVector::new(-1.0, 0.75, 0.5));
    assert_eq!(a.sub(&b), PowerVector::new(3.0, 0.25, -1.0));
    assert_eq!(a.scale(2.0), PowerVector::new(2.0, 1.0, -0.5));
}

#[test]
fn ansi_axis_tolerance_from_residual_cylinder() {
    // [S] OLA white paper on ANSI Z80.1-2005 (via CAPABILITIES §1): α = asin(0.12/2C) = 13.9° at 0.25 D; tol 0.05°
    assert_close!(max_rotation_for_residual(0.25, 0.12).unwrap(), 13.9, 0.05);
    // [S] same source: 6.9° at 0.50 D; tol 0.05°
    assert_close!(max_rotation_for_residual(0.5, 0.12).unwrap(), 6.9, 0.05);
    assert_eq!(max_rotation_for_residual(0.05, 0.12), None);
    // Second route: rotate -1.00 x 10 by 12° and neutralise with +1.00 x 10.
    let residual = SphCyl::new(0.0, -1.0, 22.0).combine(&SphCyl::new(0.0, 1.0, 10.0));
    // [C] CAPABILITIES §1, residual cylinder 2C sin α = 2·sin 12° = 0.41582; tol 1e-5
    assert_close!(
        residual.cylinder.abs(),
        rotation_residual_cylinder(1.0, 12.0),
        1e-9
    );
    assert_close!(rotation_residual_cylinder(-1.0, 12.0), 0.41582, 1e-5);
    // [C] Thibos 1997 power vectors (CAPABILITIES §1): residual cross-cylinder axis at the mean
    // axis 16° + 45° = 61° (minus form), sphere +C sin α; tol 1e-6
    assert!(
        axis_diff(residual.axis, 61.0) < 1e-6,
        "axis {}",
        residual.axis
    );
    assert_close!(residual.sphere, 12f64.to_radians().sin(), 1e-9);
}
