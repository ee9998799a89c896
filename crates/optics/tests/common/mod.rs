//! Shared helpers for the parax-optics integration tests.

/// Asserts `|actual − expected| ≤ tol`, printing all three on failure.
#[macro_export]
macro_rules! assert_close {
    ($actual:expr, $expected:expr, $tol:expr $(,)?) => {
        assert_close!($actual, $expected, $tol, "")
    };
    ($actual:expr, $expected:expr, $tol:expr, $($msg:tt)+) => {{
        let (a, e, t): (f64, f64, f64) = ($actual, $expected, $tol);
        assert!(
            (a - e).abs() <= t,
            "assert_close failed: actual {a} vs expected {e} (|diff| {} > tol {t}) {}",
            (a - e).abs(),
            format_args!($($msg)+)
        );
    }};
}

/// Smallest angle between two axes, modulo 180 degrees.
#[allow(dead_code)]
pub fn axis_diff(a: f64, b: f64) -> f64 {
    let d = (a - b).rem_euclid(180.0);
    d.min(180.0 - d)
}
