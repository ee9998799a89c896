//! The case model reads back from its JSON (what the throughput benchmark
//! compares parax text with): every example and fixture, serialized and read
//! back, derives the same values (keys and displayed text) and the same
//! diagnostics' codes and places.

use parax_eval::{evaluate_case, evaluate_source, Case, EvalOptions};

#[test]
fn the_model_reads_back_from_json() {
    for text in parax_testdata::case_texts() {
        let (_, ev) = evaluate_source(&text);
        let json = serde_json::to_string(&ev.case).expect("a case serializes");
        // Not `back == ev.case`: serde_json's float parser may differ from
        // Rust's in the last bit.
        let back: Case = serde_json::from_str(&json).expect("the JSON reads back");
        assert_eq!(back.blocks.len(), ev.case.blocks.len());
        let (derived, diags) = evaluate_case(&back, EvalOptions::default());
        let shown = |d: &[parax_eval::Derived]| {
            d.iter()
                .map(|d| (d.key(), d.text(), d.span))
                .collect::<Vec<_>>()
        };
        assert_eq!(shown(&derived), shown(&ev.derived), "values of {text:?}");
        let (_, direct) = evaluate_case(&ev.case, EvalOptions::default());
        let places =
            |d: &[parax_eval::Diagnostic]| d.iter().map(|d| (d.code, d.span)).collect::<Vec<_>>();
        assert_eq!(places(&diags), places(&direct), "diagnostics of {text:?}");
    }
}
