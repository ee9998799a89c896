//! `fmt_power` writes quarter-dioptre steps from an integer instead of the
//! standard library's exact float formatting: it must give exactly what
//! `format!("{:+.2}")` gives (the reference), for every power.

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
