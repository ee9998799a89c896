//! `fmt_power` and `Fixed2` write two decimals from an integer (hundredths)
//! instead of the standard library's exact float formatting, except at and near
//! ties: they must give exactly what `format!("{:+.2}")` and `format!("{:.2}")`
//! give (the references), for every value.

use parax_eval::derived::fmt_power;
use proptest::prelude::*;

/// The plain formula `fmt_power` must equal.
fn reference(d: f64) -> String {
    let d = if d.abs() < 0.005 { 0.0 } else { d };
    format!("{d:+.2}")
}

#[test]
fn quarter_steps_and_edges() {
    for q in -400..=400 {
        let d = q as f64 / 4.0;
        assert_eq!(fmt_power(d), reference(d), "{d}");
    }
    for d in [
        -0.0, 0.004, -0.004, 0.125, -0.375, 1.005, 2.675, 1e20, -1e20, 0.1, -5.75,
    ] {
        assert_eq!(fmt_power(d), reference(d), "{d}");
    }
    assert_eq!(fmt_power(-5.75), "-5.75");
    assert_eq!(fmt_power(0.0), "+0.00");
    assert_eq!(fmt_power(12.5), "+12.50");
}

proptest! {
    #[test]
    fn equals_the_standard_formatting(d in -1.0e6f64..1.0e6, q in -100_000i64..100_000) {
        prop_assert_eq!(fmt_power(d), reference(d));
        let step = q as f64 / 4.0;
        prop_assert_eq!(fmt_power(step), reference(step));
    }
}

/// `Fixed2` must write exactly what `{:.2}` writes (the reference), sign of
/// negative values that round to zero included.
#[test]
fn fixed_two_decimals_edges() {
    use parax_eval::derived::Fixed2;
    for d in [
        0.0,
        -0.0,
        0.001,
        -0.001,
        0.005,
        -0.005,
        0.015,
        1.005,
        2.675,
        0.125,
        -0.375,
        1e7,
        1e20,
        -1e20,
        0.1,
        12.344999999,
        12.345,
        12.345000001,
        f64::MIN_POSITIVE,
    ] {
        assert_eq!(Fixed2(d).to_string(), format!("{d:.2}"), "{d}");
    }
    // Every value with three decimals over ±20: ties and near-ties of the
    // hundredths are exactly where a shortcut could round the other way.
    for k in -20_000..=20_000 {
        let d = k as f64 / 1000.0;
        assert_eq!(Fixed2(d).to_string(), format!("{d:.2}"), "{d}");
        assert_eq!(fmt_power(d), reference(d), "{d}");
    }
}

proptest! {
    #[test]
    fn fixed_two_decimals_equal_the_standard_formatting(d in -1.0e8f64..1.0e8, e in -12i32..12) {
        use parax_eval::derived::Fixed2;
        let scaled = d * 10f64.powi(e);
        prop_assert_eq!(Fixed2(scaled).to_string(), format!("{scaled:.2}"));
        prop_assert_eq!(fmt_power(scaled), reference(scaled));
    }
}
