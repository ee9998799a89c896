//! Diagnostics of the evaluator: codes, positions (line:column), hints and fixes.

use parax_eval::{evaluate_source, Diagnostic, Severity};

fn diags(src: &str) -> Vec<(String, usize, usize, Diagnostic)> {
    let (p, ev) = evaluate_source(src);
    ev.diagnostics
        .into_iter()
        .map(|d| {
            let (l, c) = p.index.line_col(&p.source, d.span.start());
            (d.code.to_string(), l, c, d)
        })
        .collect()
}

fn only(src: &str, code: &str) -> (usize, usize, Diagnostic) {
    let all = diags(src);
    let hits: Vec<_> = all.iter().filter(|d| d.0 == code).collect();
    assert_eq!(hits.len(), 1, "{all:#?}");
    let (_, l, c, d) = hits[0].clone();
    (l, c, d)
}

#[test]
fn missing_unit_has_a_fix() {
    let (l, c, d) = only("eye right\n  refraction -5.00 @ 12\n", "P0201");
    assert_eq!((l, c), (2, 22));
    assert_eq!(d.severity, Severity::Error);
    let fix = d.fix.unwrap();
    assert_eq!(fix.edits[0].text, " mm");
    assert_eq!(fix.edits[0].span.start, fix.edits[0].span.end);
}

#[test]
fn wrong_dimension_unit() {
    let (l, c, d) = only("frame\n  vertex 12 D\n", "P0202");
    assert_eq!((l, c), (2, 13));
    assert!(d.message.contains("vertex distance"), "{}", d.message);
    assert_eq!(d.fix.unwrap().edits[0].text, "mm");
}

#[test]
fn implausible_values_name_the_range_and_suggest() {
    // A vertex distance of 13 m: the unit slipped.
    let (_, _, d) = only("frame\n  vertex 13 m\n", "P0203");
    assert!(d.message.contains("0 mm to 25 mm"), "{}", d.message);
    assert_eq!(d.hint.as_deref(), Some("did you mean 13 mm?"));
    // A corneal radius of 78 mm: the decimal point slipped.
    let (_, _, d) = only(
        "eye left\n  keratometry 78 mm x 180, 7.7 mm x 90\n",
        "P0203",
    );
    assert!(d.message.contains("5.5 mm to 10 mm"), "{}", d.message);
    assert_eq!(d.hint.as_deref(), Some("did you mean 7.8 mm?"));
}

#[test]
fn axis_out_of_range_and_zero() {
    let (l, c, d) = only("eye right\n  refraction -1.00 / -0.50 x 200\n", "P0204");
    assert_eq!((l, c), (2, 30));
    assert_eq!(d.severity, Severity::Error);
    assert_eq!(d.fix.unwrap().edits[0].text, "20");
    let (_, _, d) = only("eye right\n  refraction -1.00 / -0.50 x 0\n", "P0204");
    assert_eq!(d.severity, Severity::Info);
    assert_eq!(d.fix.unwrap().edits[0].text, "180");
}

#[test]
fn unknown_keyword_did_you_mean() {
    let (l, c, d) = only("eye right\n  refracton -1.00\n", "P0101");
    assert_eq!((l, c), (2, 3));
    assert_eq!(d.hint.as_deref(), Some("did you mean `refraction`?"));
    let (_, _, d) = only("eye right\n  vertex 12 mm\n", "P0101");
    assert_eq!(
        d.hint.as_deref(),
        Some("`vertex` belongs in a `frame` block")
    );
}

#[test]
fn a_bad_line_does_not_stop_the_others() {
    let src = "eye right\n  refraction -1.00 $ -0.50\n  keratometry 7.80 mm x 180, 7.60 mm x 90\n";
    let (_, ev) = evaluate_source(src);
    assert_eq!(
        ev.diagnostics
            .iter()
            .filter(|d| d.severity == Severity::Error)
            .count(),
        1
    );
    assert!(ev.derived.iter().any(|d| d.is_key("eye.right.mean-k")));
}

#[test]
fn expect_mismatch_names_both_values() {
    let src =
        "eye right\n  refraction -2.00 / -1.00 x 180\n  expect spherical-equivalent -2.25 D\n";
    let (l, c, d) = only(src, "P0401");
    assert_eq!((l, c), (3, 31));
    assert!(
        d.message.contains("-2.25") || d.message.contains("spherical-equivalent"),
        "{}",
        d.message
    );
    assert!(d.message.contains("-2.50 D"), "{}", d.message);
    assert_eq!(d.fix.unwrap().edits[0].text, "-2.50 D");
    // The same line with the right value passes; the default tolerance is half a step
    // of the last digit written.
    let ok = "eye right\n  refraction -2.00 / -1.00 x 180\n  expect spherical-equivalent -2.5 D\n  expect plus-cyl -3.00 / +1.00 x 90\n  expect minus-cyl -2.00 / -1.00 x 180\n";
    assert!(diags(ok).is_empty(), "{:#?}", diags(ok));
}

#[test]
fn expect_unknown_name() {
    let src = "eye right\n  refraction -2.00\n  expect sphericl-equivalent -2.00 D\n";
    let (_, _, d) = only(src, "P0402");
    assert_eq!(
        d.hint.as_deref(),
        Some("did you mean `spherical-equivalent`?")
    );
    let src = "eye right\n  refraction -2.00\n  expect corneal-plane -2.00\n";
    only(src, "P0403");
}

#[test]
fn refractive_surgery_cautions_keratometry() {
    let src = "eye left\n  refractive-surgery \"myopic ablation 2019\"\n  keratometry 8.20 mm x 180, 8.10 mm x 90\n";
    let (l, _, d) = only(src, "P0301");
    assert_eq!(l, 3);
    assert_eq!(d.severity, Severity::Warning);
    assert!(d.caution.unwrap().contains("verify clinically"));
    let (_, ev) = evaluate_source(src);
    let k = ev
        .derived
        .iter()
        .find(|d| d.is_key("eye.left.mean-k"))
        .unwrap();
    assert!(k.caution.is_some());
}

#[test]
fn strong_refraction_without_vertex_is_flagged() {
    let (_, _, d) = only("eye right\n  refraction -7.00\n", "P0302");
    assert_eq!(d.severity, Severity::Warning);
    assert!(diags("eye right\n  refraction -2.00\n").is_empty());
}

#[test]
fn syntax_codes_agree_with_the_code_table() {
    use parax_syntax::codes as s;
    for (syn, table) in [
        (s::UNEXPECTED, parax_eval::codes::UNEXPECTED),
        (s::UNKNOWN_BLOCK, parax_eval::codes::UNKNOWN_BLOCK),
        (s::OUTSIDE_BLOCK, parax_eval::codes::OUTSIDE_BLOCK),
        (
            s::UNTERMINATED_STRING,
            parax_eval::codes::UNTERMINATED_STRING,
        ),
        (s::TOO_LARGE, parax_eval::codes::TOO_LARGE),
    ] {
        assert_eq!(syn, table.as_str());
    }
}

#[test]
fn a_surface_radius_of_zero_is_refused_and_yields_no_infinite_power() {
    // A radius of 0 has no centre of curvature; read as a number it made the
    // surface power (n' − n)/r infinite and every value after it NaN.
    let src = "model-eye \"m\"\n  from le-grand\n  surface 1 radius 0 mm\n";
    let (l, c, d) = only(src, "P0102");
    assert_eq!((l, c), (3, 20));
    assert!(d.message.contains("of 0"), "{}", d.message);
    let (_, ev) = evaluate_source(src);
    assert!(ev
        .derived
        .iter()
        .all(|v| !format!("{:?}", v.value).contains("NaN")
            && !format!("{:?}", v.value).contains("inf")));
    let src = "system \"s\"\n  surface S1 0 mm index 1.5\n";
    let (l, c, _) = only(src, "P0102");
    assert_eq!((l, c), (2, 14));
}
