//! Helpers shared by the evaluator's test files: evaluate a snippet, fetch a
//! derived value by key, compare numbers within a stated tolerance.

use parax_eval::{evaluate_source, DerivedValue, Evaluation};

/// Parse and evaluate a case snippet.
pub fn eval(src: &str) -> Evaluation {
    evaluate_source(src).1
}

/// The derived value with `key`; panics listing the keys present when absent.
pub fn get<'a>(ev: &'a Evaluation, key: &str) -> &'a DerivedValue {
    &ev.derived
        .iter()
        .find(|d| d.is_key(key))
        .unwrap_or_else(|| {
            panic!(
                "no {key}; have {:?}",
                ev.derived.iter().map(|d| d.key()).collect::<Vec<_>>()
            )
        })
        .value
}

/// Assert `got` is within `tol` of `want`.
#[track_caller]
pub fn close(got: f64, want: f64, tol: f64) {
    assert!((got - want).abs() <= tol, "got {got}, want {want} ± {tol}");
}
