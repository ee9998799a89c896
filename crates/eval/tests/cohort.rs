//! `parax_eval::cohort`: which values a cohort reads, the groups of each eye
//! and the power vectors gathered per group and eye.

use parax_eval::cohort::{is_cohort_value, samples, Cohort, GroupBy};
use parax_eval::model::Side;
use parax_eval::{evaluate_source, Derived};

// Invented data: no real patient.
const CASE: &str = "case \"Invented\"\n  date 2025-03-04\n  tag myopia\n  tag study-a\n\neye right\n  refraction -1.00 / -0.50 x 90\n\neye left\n  refraction +2.00\n";

fn kept(text: &str) -> (parax_eval::Evaluation, Vec<Derived>) {
    let (_, ev) = evaluate_source(text);
    let kept = ev
        .derived
        .iter()
        .filter(|d| is_cohort_value(d))
        .cloned()
        .collect();
    (ev, kept)
}

#[test]
fn an_eye_counts_in_each_of_its_groups_with_its_power_vector() {
    let (ev, values) = kept(CASE);
    // Only the three power-vector components of each eye block are read.
    assert_eq!(
        values.len(),
        6,
        "{:?}",
        values.iter().map(|d| d.key()).collect::<Vec<_>>()
    );
    let s = samples(&ev.case, &values, GroupBy::Tag);
    assert_eq!(s.len(), 2);
    assert_eq!(s[0].groups, ["myopia", "study-a"]);
    assert_eq!(s[0].side, Side::Right);
    // [S] Thibos, Wheeler & Horner 1997: M = S + C/2 = -1.25 D,
    // J0 = -(C/2) cos 2α = 0.25 cos 180° = -0.25 D, J45 = -(C/2) sin 2α = 0 D; tol 1e-9
    let v = s[0].vector;
    assert!(
        (v.m + 1.25).abs() < 1e-9 && (v.j0 + 0.25).abs() < 1e-9 && v.j45.abs() < 1e-9,
        "{v:?}"
    );
    // The year: (without a visit date) the case's date.
    let years: Vec<_> = samples(&ev.case, &values, GroupBy::Year)
        .into_iter()
        .map(|s| s.groups)
        .collect();
    assert_eq!(years, [["2025"], ["2025"]]);
    // Without the values an eye is left out.
    assert!(samples(&ev.case, &[], GroupBy::None).is_empty());
}

#[test]
fn a_cohort_summarises_per_group_and_eye() {
    let (ev, values) = kept(CASE);
    let untagged = CASE.replace("  tag myopia\n  tag study-a\n", "");
    let (ev2, values2) = kept(&untagged);
    let mut c = Cohort::default();
    c.add(samples(&ev.case, &values, GroupBy::Tag));
    c.add(samples(&ev2.case, &values2, GroupBy::Tag));
    let rows: Vec<_> = c
        .summaries()
        .into_iter()
        .map(|((g, side), s)| (g, side, s.count))
        .collect();
    assert_eq!(
        rows,
        [
            ("(no tag)".to_owned(), Side::Right, 1),
            ("(no tag)".to_owned(), Side::Left, 1),
            ("myopia".to_owned(), Side::Right, 1),
            ("myopia".to_owned(), Side::Left, 1),
            ("study-a".to_owned(), Side::Right, 1),
            ("study-a".to_owned(), Side::Left, 1),
        ]
    );
}

#[test]
fn a_length_written_in_another_unit_keeps_its_precision() {
    use parax_eval::units::written_in;
    use parax_optics::units::Unit;
    // [S] SI prefixes (BIPM SI Brochure, 9th ed.): 12.5 mm = 1.25 cm = 0.0125 m.
    assert_eq!(
        written_in(12.5, 1, Unit::Millimetre, Unit::Centimetre),
        "1.25"
    );
    assert_eq!(written_in(12.5, 1, Unit::Millimetre, Unit::Metre), "0.0125");
    // 1.20 m written in mm: no decimals left, and none invented.
    assert_eq!(written_in(1.2, 2, Unit::Metre, Unit::Millimetre), "1200");
    assert_eq!(
        written_in(10.0, 0, Unit::Centimetre, Unit::Millimetre),
        "100"
    );
}

#[test]
fn every_dated_visit_counts_with_its_own_values_and_year() {
    // Invented data: two dated visits of one right eye (a myopic shift).
    let text = "case \"Invented\"\n\neye right 2024-05-06\n  refraction -1.00\n\neye right 2026-01-02\n  refraction -2.00 / -1.00 x 180\n";
    let (ev, values) = kept(text);
    let s = samples(&ev.case, &values, GroupBy::Year);
    assert_eq!(s.len(), 2, "each dated visit is a sample");
    assert_eq!(s[0].groups, ["2024"]);
    assert_eq!(s[1].groups, ["2026"]);
    // [S] Thibos, Wheeler & Horner 1997: M = S + C/2: -1.00 D for the first
    // visit, -2.00 + (-1.00)/2 = -2.50 D for the second; J0 = -(C/2) cos 2α
    // = 0.50 cos 360° = +0.50 D; tol 1e-9.
    assert!((s[0].vector.m + 1.0).abs() < 1e-9, "{:?}", s[0].vector);
    assert!((s[1].vector.m + 2.5).abs() < 1e-9, "{:?}", s[1].vector);
    assert!((s[1].vector.j0 - 0.5).abs() < 1e-9, "{:?}", s[1].vector);
}
