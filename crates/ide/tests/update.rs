//! `Analysis::update` (re-reading only what changed) equals `Analysis::new` of
//! the new text, for single edits, merged edits and edits next to non-ASCII text;
//! so do `Analysis::edit` and `Analysis::edits` (the edit given, as the language
//! server passes it), on the project's case files after random edits.

use parax_ide::Analysis;
use proptest::prelude::*;

fn same(a: &Analysis, b: &Analysis) {
    assert_eq!(a.source(), b.source());
    assert_eq!(a.parsed.lines, b.parsed.lines);
    assert_eq!(a.parsed.blocks, b.parsed.blocks);
    assert_eq!(a.parsed.errors, b.parsed.errors);
    assert_eq!(a.evaluation.diagnostics, b.evaluation.diagnostics);
    let keys = |x: &Analysis| {
        x.evaluation
            .derived
            .iter()
            .map(|d| (d.key(), d.text(), d.span))
            .collect::<Vec<_>>()
    };
    assert_eq!(keys(a), keys(b));
}

#[test]
fn update_equals_a_fresh_analysis() {
    // Invented data: no real patient.
    let v0 = "case \"Zoë\"\n  age 50\n\neye right 2026-01-02\n  refraction -1.00 / -0.50 x 10\n\neye right 2026-06-02\n  refraction -1.50 / -0.50 x 10\n  expect spherical-equivalent -1.75 D\n";
    let steps = [
        // one digit
        v0.replace("-1.50 /", "-1.75 /"),
        // two places at once (merged changes), around the `ë`
        v0.replace("Zoë", "Zoé")
            .replace("x 10\n\neye", "x 15\n\neye"),
        // a block removed
        v0.replace(
            "eye right 2026-01-02\n  refraction -1.00 / -0.50 x 10\n\n",
            "",
        ),
        // everything replaced
        "eye left\n  refraction +1.00\n".to_owned(),
        String::new(),
        v0.to_owned(),
    ];
    let mut a = Analysis::new(v0);
    for text in steps {
        a = a.update(&text);
        same(&a, &Analysis::new(&text));
    }
}

/// Replace `range` of `text` with `insert`, as a plain string operation.
fn spliced(text: &str, range: std::ops::Range<usize>, insert: &str) -> String {
    let mut t = text.to_owned();
    t.replace_range(range, insert);
    t
}

#[test]
fn an_edit_equals_a_fresh_analysis() {
    // Invented data: no real patient.
    let v0 = "case \"Zoë\"\n  age 50\n\neye right 2026-01-02\n  refraction -1.00 / -0.50 x 10\n";
    let at = v0.find("-1.00").expect("in the text");
    let a = Analysis::new(v0).edit(at..at + 5, "-2.25");
    same(&a, &Analysis::new(&spliced(v0, at..at + 5, "-2.25")));
    // A reversed range, a range past the end and one inside `ë` leave the text as it was.
    let z = v0.find('ë').expect("in the text");
    #[allow(clippy::reversed_empty_ranges)]
    let reversed = 5..2;
    for bad in [reversed, 0..v0.len() + 1, z + 1..z + 1] {
        let a = Analysis::new(v0).edit(bad.clone(), "x");
        same(&a, &Analysis::new(v0));
    }
    // Three edits in order, each in the text the one before left: the cover of
    // an edit before, inside and after the first.
    let b = v0.find("x 10").expect("in the text");
    let a = Analysis::new(v0).edits([(b + 2..b + 4, "15"), (0..4, "case"), (at..at + 1, "+")]);
    let want = spliced(&spliced(v0, b + 2..b + 4, "15"), at..at + 1, "+");
    same(&a, &Analysis::new(&want));
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(48))]

    /// A burst of random edits on a case file, given to `Analysis::edits` (one
    /// evaluation over their cover) and to `Analysis::edit` one at a time, equals
    /// a fresh analysis of the edited text.
    #[test]
    fn random_edits_equal_a_fresh_analysis(
        file in 0usize..1000,
        edits in prop::collection::vec((0usize..4000, 0usize..40, "[ a-z0-9.@x/\n-]{0,12}"), 1..5),
    ) {
        let texts = parax_testdata::case_texts();
        let text = &texts[file % texts.len()];
        let mut now = text.clone();
        let mut ranges = Vec::new();
        for (at, len, insert) in &edits {
            let range = parax_testdata::edit_range(&now, at % (now.len() + 1), *len);
            now = spliced(&now, range.clone(), insert);
            ranges.push((range, insert.as_str()));
        }
        let fresh = Analysis::new(&now);
        same(&Analysis::new(text).edits(ranges.iter().cloned()), &fresh);
        let mut one_by_one = Analysis::new(text);
        for (range, insert) in &ranges {
            one_by_one = one_by_one.edit(range.clone(), insert);
        }
        same(&one_by_one, &fresh);
    }
}

/// The values of each line, found through the ordered index, are the values
/// whose statement starts on that line, in evaluation order: checked on files
/// whose values are nearly in order (eye blocks) and far out of order (systems
/// before eyes: their values come after the eyes' in the evaluation).
#[test]
fn values_per_line_follow_the_evaluation_order() {
    let root = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../../examples");
    let mut texts: Vec<String> = [
        "clinic-review.parax",
        "bench-relay.parax",
        "schematic-eyes.parax",
    ]
    .iter()
    .map(|f| std::fs::read_to_string(root.join(f)).expect("example"))
    .collect();
    // Systems first, then many eye blocks: far out of order.
    texts.push(format!(
        "{}\n{}",
        texts[1].clone() + &texts[2],
        texts[0].repeat(3)
    ));
    for text in texts {
        let a = Analysis::new(&text);
        for line in &a.parsed.lines {
            let got: Vec<*const _> = a.derived_on_line(line).map(|d| d as *const _).collect();
            let want: Vec<*const _> = a
                .evaluation
                .derived
                .iter()
                .filter(|d| line.span.start <= d.span.start && d.span.start <= line.span.end)
                .map(|d| d as *const _)
                .collect();
            let mut want_sorted = want.clone();
            // Same set; order by start, ties in evaluation order.
            want_sorted.sort_by_key(|&p| {
                let i = a
                    .evaluation
                    .derived
                    .iter()
                    .position(|d| std::ptr::eq(d, p))
                    .unwrap();
                (a.evaluation.derived[i].span.start, i)
            });
            assert_eq!(got, want_sorted, "line {:?}", a.parsed.text(line.span));
        }
    }
}
