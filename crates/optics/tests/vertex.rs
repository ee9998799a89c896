//! Effective power and vertex-distance transfer.

#[macro_use]
mod common;

use parax_optics::refraction::SphCyl;
use parax_optics::vertex::{
    compensation_matters, effective_power, round_order, round_sphcyl, round_to_step,
    transfer_sphcyl, MEANINGFUL_CHANGE_THRESHOLD_D,
};

const D12: f64 = 0.012;
const D14: f64 = 0.014;

#[test]
fn spheres_at_12_mm() {
    // [C] CAPABILITIES §2, Fc = Fs/(1-dFs), -4.00 @12 mm -> -3.8168; tol 1e-4
    assert_close!(effective_power(-4.0, D12), -3.8168, 1e-4);
    // [C] CAPABILITIES §2, +4.00 @12 mm -> +4.2017; tol 1e-4
    assert_close!(effective_power(4.0, D12), 4.2017, 1e-4);
    // [C] CAPABILITIES §2, -8.00 @12 mm -> -7.2993; tol 1e-4
    assert_close!(effective_power(-8.0, D12), -7.2993, 1e-4);
    // [C] CAPABILITIES §2, +9.00 @12 mm -> +10.0897; tol 1e-4
    assert_close!(effective_power(9.0, D12), 10.0897, 1e-4);
    // [C] CAPABILITIES §2, -11.00 @12 mm -> -9.7173; tol 1e-4
    assert_close!(effective_power(-11.0, D12), -9.7173, 1e-4);
}

#[test]
fn spheres_at_14_mm() {
    // [C] CAPABILITIES §2, -8.00 @14 mm -> -7.1942; tol 1e-4
    assert_close!(effective_power(-8.0, D14), -7.1942, 1e-4);
    // [C] CAPABILITIES §2, +9.00 @14 mm -> +10.2975; tol 1e-4
    assert_close!(effective_power(9.0, D14), 10.2975, 1e-4);
}

#[test]
fn lens_moved_away_from_eye() {
    // [C] CAPABILITIES §2, +12.00 moved 4 mm away (x = -0.004) -> +11.4504; tol 1e-4
    assert_close!(effective_power(12.0, -0.004), 11.4504, 1e-4);
}

#[test]
fn spherocylinder_at_12_mm() {
    let rx = SphCyl::new(-6.0, -2.0, 180.0);
    let c = transfer_sphcyl(&rx, D12);
    // [C] CAPABILITIES §2, meridian 180: -6.00 -> -5.5970; tol 1e-4
    assert_close!(c.sphere, -5.5970, 1e-4);
    // [C] CAPABILITIES §2, meridian 90: -8.00 -> -7.2993, cyl = -7.2993 - (-5.5970) = -1.7023; tol 1e-4
    assert_close!(c.sphere + c.cylinder, -7.2993, 1e-4);
    assert_close!(c.cylinder, -1.7023, 1e-4);
    assert_eq!(c.axis, 180.0);
    let shown = round_sphcyl(&c, 0.01);
    // [C] CAPABILITIES §2, shown as -5.60 -1.70 x 180; tol 1e-9
    assert_close!(shown.sphere, -5.60, 1e-9);
    assert_close!(shown.cylinder, -1.70, 1e-9);
    let quarter = round_sphcyl(&c, 0.25);
    // [CP] CAPABILITIES §2, rounded to 0.25 D: -5.50 -1.75; tol 1e-12
    assert_close!(quarter.sphere, -5.5, 1e-12);
    assert_close!(quarter.cylinder, -1.75, 1e-12);
}

#[test]
fn plus_cyl_input_keeps_plus_cyl() {
    let rx = SphCyl::new(-8.0, 2.0, 90.0);
    let c = transfer_sphcyl(&rx, D12);
    // [C] CAPABILITIES §2, same lens in plus-cyl form: -7.2993 +1.7023 x 90; tol 1e-4
    assert_close!(c.sphere, -7.2993, 1e-4);
    assert_close!(c.cylinder, 1.7023, 1e-4);
    assert_eq!(c.axis, 90.0);
}

#[test]
fn rounding_ties_away_from_zero() {
    // [CP] CAPABILITIES §2 rounding to 0.25 D, ties away from zero; exact
    assert_eq!(round_to_step(-3.8168, 0.25), -3.75);
    assert_eq!(round_to_step(4.2017, 0.25), 4.25);
    assert_eq!(round_to_step(0.125, 0.25), 0.25);
    assert_eq!(round_to_step(-0.125, 0.25), -0.25);
    assert_eq!(round_to_step(10.0897, 0.125), 10.125);
    assert_eq!(round_to_step(1.234, 0.0), 1.234);
}

#[test]
fn compensation_threshold() {
    // [CP] CAPABILITIES §2, compensation matters above about ±4.00 D; exact
    assert_eq!(MEANINGFUL_CHANGE_THRESHOLD_D, 4.0);
    assert!(!compensation_matters(-4.0));
    assert!(compensation_matters(-4.25));
    // [C] CAPABILITIES §2, the change at 4.00 D and 12 mm is about 0.2 D; tol 0.02
    assert_close!(effective_power(4.0, D12) - 4.0, 0.2, 0.02);
}

#[test]
fn orders_round_the_axis_to_whole_degrees() {
    // [CP] orders are written in whole degrees: a computed axis 8.49° → 8°,
    // 8.5° → 9° (ties away from zero), 179.6° → 180°, 0.4° → 180° (axes run
    // 1..=180); sphere and cylinder to 0.25 D as round_sphcyl; exact
    let r = round_order(&SphCyl::new(-5.44, -0.64, 8.49), 0.25);
    assert_eq!((r.sphere, r.cylinder, r.axis), (-5.5, -0.75, 8.0));
    assert_eq!(round_order(&SphCyl::new(-1.0, -1.0, 8.5), 0.25).axis, 9.0);
    assert_eq!(
        round_order(&SphCyl::new(-1.0, -1.0, 179.6), 0.25).axis,
        180.0
    );
    assert_eq!(round_order(&SphCyl::new(-1.0, -1.0, 0.4), 0.25).axis, 180.0);
    assert_eq!(round_order(&SphCyl::new(-1.0, -1.0, 90.0), 0.25).axis, 90.0);
    // the unrounded form keeps the axis as computed
    assert_eq!(
        round_sphcyl(&SphCyl::new(-1.0, -1.0, 8.49), 0.25).axis,
        8.49
    );
}
