//! Unit conversion tests.

#[macro_use]
mod common;

use parax_optics::units::{Dimension, Range, Unit};

#[test]
fn millimetres_divide_to_metres_exactly() {
    // [CP] definition 1 mm = 1/1000 m; division keeps 12 mm == 0.012 as parsed; exact
    assert_eq!(Unit::Millimetre.to_base(12.0), 0.012);
    assert_eq!(Unit::Centimetre.to_base(50.0), 0.5);
    assert_close!(Unit::Millimetre.from_base(0.0078), 7.8, 1e-12);
    assert_close!(Unit::Centimetre.from_base(0.159091), 15.9091, 1e-12);
}

#[test]
fn identity_units_and_round_trip() {
    for &u in Unit::all() {
        for v in [-12.5, 0.0, 0.25, 7.8, 180.0] {
            // [CP] from_base inverts to_base; tol 1e-12
            assert_close!(u.from_base(u.to_base(v)), v, 1e-12, "{u:?}");
        }
    }
    assert_eq!(Unit::Dioptre.to_base(-3.25), -3.25);
    assert_eq!(Unit::Degree.to_base(170.0), 170.0);
}

#[test]
fn symbols_and_dimensions() {
    let syms: Vec<&str> = Unit::all().iter().map(|u| u.symbol()).collect();
    assert_eq!(syms, ["D", "m", "cm", "mm", "deg", "Δ", "y"]);
    assert_eq!(
        Unit::units_of(Dimension::Length),
        vec![Unit::Metre, Unit::Centimetre, Unit::Millimetre]
    );
    assert_eq!(Unit::units_of(Dimension::Power), vec![Unit::Dioptre]);
    assert!(Unit::units_of(Dimension::Ratio).is_empty());
    assert_eq!(Unit::PrismDioptre.dimension(), Dimension::Prism);
    assert_eq!(Unit::Year.dimension(), Dimension::Time);
    assert_eq!(Unit::base_of(Dimension::Length), Some(Unit::Metre));
    assert_eq!(Unit::base_of(Dimension::Ratio), None);
}

#[test]
fn range_contains_bounds() {
    let r = Range::new(-30.0, 30.0);
    assert!(r.contains(-30.0) && r.contains(30.0) && r.contains(0.0));
    assert!(!r.contains(30.01) && !r.contains(f64::NAN));
}

#[test]
fn conversion_between_lengths_and_its_decimal_shift() {
    // [S] SI prefixes (BIPM SI Brochure, 9th ed., table 7): 1 cm = 10 mm, 1 m = 1000 mm.
    assert_eq!(Unit::Millimetre.convert(12.5, Unit::Centimetre), 1.25);
    assert_eq!(Unit::Centimetre.convert(1.25, Unit::Metre), 0.0125);
    assert_eq!(Unit::Metre.convert(0.5, Unit::Millimetre), 500.0);
    assert_eq!(Unit::Millimetre.decimal_shift(Unit::Metre), 3);
    assert_eq!(Unit::Metre.decimal_shift(Unit::Centimetre), -2);
    assert_eq!(Unit::Centimetre.decimal_shift(Unit::Millimetre), -1);
    assert_eq!(Unit::Dioptre.decimal_shift(Unit::Dioptre), 0);
}
