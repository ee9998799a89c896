//! `reevaluate`, without and with the edit told (reusing the previous evaluation
//! for the blocks whose inputs did not change) must give exactly what
//! `evaluate` gives: the same case model, derived values (key, text, span) and
//! diagnostics, after random edits of the example and fixture files and of a
//! long history of visits; and `values_starting_in` must find what a scan of
//! every value finds. An evaluation with `EvalOptions::VALUES_ONLY` (no
//! substituted formulas, as the language server runs) gives the same values
//! and diagnostics, and `Evaluation::explained` writes for any value exactly the
//! derivation `evaluate` writes.

use parax_eval::{evaluate, evaluate_with, reevaluate, EvalOptions, Evaluation, TextEdit};
use parax_syntax::Span;
use parax_syntax::{parse, reparse};
use proptest::prelude::*;

/// Invented visits (no real patient): dated eye blocks of both eyes, some on
/// the same day (anisometropia), a frame (vertex) and a case block (age).
fn visits() -> String {
    let mut s = String::from(
        "# Invented data: no real patient.\ncase \"visits\"\n  age 52\n\nframe \"f\"\n  vertex 13 mm\n",
    );
    for i in 0..12 {
        let side = if i % 3 == 0 { "left" } else { "right" };
        s.push_str(&format!(
            "\neye {side} 2026-{:02}-0{}\n  refraction -{}.{}5 / -0.50 x {} @ 12 mm\n  add +1.50\n  keratometry 7.8{} mm x 180, 7.6{} mm x 90\n  expect spherical-equivalent -1.50 D\n",
            1 + i / 2,
            1 + i % 2,
            1 + i % 4,
            i % 10,
            10 + 7 * i,
            i % 10,
            i % 10,
        ));
    }
    s
}

fn files() -> Vec<String> {
    let mut out = vec![visits()];
    for dir in ["examples", "tests/fixtures/parse/valid"] {
        out.extend(
            parax_testdata::case_files_in(dir)
                .into_iter()
                .map(|(_, text)| text),
        );
    }
    out
}

/// What an edit inserts: digits and signs (values change), line structure,
/// dates (visits reorder), whole blocks, and mistakes.
const PIECES: &[&str] = &[
    "",
    "\n",
    "  ",
    "1",
    "7",
    "-",
    ".",
    "0",
    " D",
    " mm",
    "x",
    "#",
    "eye right 2026-03-01\n  refraction -2.00 / -1.00 x 90\n",
    "eye left\n  refraction +1.00\n",
    "  expect spherical-equivalent -1.75 D\n",
    "2025-12-31",
    "frame\n  vertex 10 mm\n",
    "  age 70\n",
    "$",
    "eye",
];

fn summary(e: &Evaluation) -> Vec<(String, String, (usize, usize))> {
    e.derived
        .iter()
        .map(|d| (d.key(), d.text(), (d.span.start(), d.span.end())))
        .collect()
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]
    #[test]
    fn incremental_equals_full(
        file in any::<prop::sample::Index>(),
        edits in prop::collection::vec(
            (any::<prop::sample::Index>(), 0usize..30, prop::collection::vec(0..PIECES.len(), 0..3)),
            1..5,
        ),
    ) {
        let files = files();
        let mut text = files[file.index(files.len())].clone();
        let mut parsed = parse(&text);
        let mut eval = reevaluate(&parsed, None, None, EvalOptions::default());
        // The same edits told to the evaluator (blocks found by position).
        let mut told = eval.clone();
        // Values only, derivations written on demand.
        let mut quiet = reevaluate(&parsed, None, None, EvalOptions::VALUES_ONLY);
        for (at, len, pieces) in edits {
            let std::ops::Range { start, end } =
                parax_testdata::edit_range(&text, at.index(text.len() + 1), len);
            let insert: String = pieces.iter().map(|&i| PIECES[i]).collect();
            parsed = reparse(&parsed, start..end, &insert);
            text.replace_range(start..end, &insert);
            eval = reevaluate(&parsed, Some(eval), None, EvalOptions::default());
            let edit = TextEdit { replaced: start..end, inserted: insert.len() };
            told = reevaluate(&parsed, Some(told), Some(edit.clone()), EvalOptions::default());
            quiet = reevaluate(&parsed, Some(quiet), Some(edit), EvalOptions::VALUES_ONLY);
            let full = evaluate(&parse(&text));
            prop_assert!(quiet.derived.iter().all(|d| d.derivation.substituted.is_empty()));
            // Asked for in two halves (a block may be computed once per call).
            let all: Vec<usize> = (0..full.derived.len()).collect();
            let (a, b) = all.split_at(all.len() / 2);
            let mut explained = quiet.explained(b);
            explained.splice(0..0, quiet.explained(a));
            prop_assert_eq!(&explained, &full.derived, "derivations of {:?}", text);
            for e in [&eval, &told, &quiet] {
                prop_assert_eq!(summary(e), summary(&full), "values of {:?}", text);
                prop_assert_eq!(&e.diagnostics, &full.diagnostics, "diagnostics of {:?}", text);
                prop_assert_eq!(&e.case, &full.case);
            }
            // The values found by span are those a scan of every value finds.
            let lines = parse(&text).lines;
            for line in lines.iter().step_by(3) {
                let mut scan: Vec<usize> = (0..full.derived.len())
                    .filter(|&i| (line.span.start..=line.span.end).contains(&full.derived[i].span.start))
                    .collect();
                scan.sort_by_key(|&i| (full.derived[i].span.start, i));
                prop_assert_eq!(told.values_starting_in(line.span), scan.clone());
                prop_assert_eq!(full.values_starting_in(line.span), scan);
            }
            let whole = Span::new(0, text.len());
            prop_assert_eq!(told.values_starting_in(whole).len(), full.derived.len());
        }
    }
}

#[test]
fn an_edit_in_one_visit_reuses_the_others_and_moves_their_spans() {
    let text = visits();
    let parsed = parse(&text);
    let first = reevaluate(&parsed, None, None, EvalOptions::default());
    // Insert a blank line before the first eye block: every eye block moves.
    let at = text.find("\neye").expect("an eye block");
    let parsed = reparse(&parsed, at..at, "\n");
    let again = reevaluate(&parsed, Some(first.clone()), None, EvalOptions::default());
    let full = evaluate(&parsed);
    assert_eq!(summary(&again), summary(&full));
    assert_eq!(again.diagnostics, full.diagnostics);
    assert_ne!(summary(&again), summary(&first), "spans moved by one byte");
}

#[test]
fn a_full_evaluation_without_derivations_explains_on_demand() {
    let parsed = parse(&visits());
    let full = evaluate(&parsed);
    let quiet = evaluate_with(&parsed, EvalOptions::VALUES_ONLY);
    assert_eq!(summary(&quiet), summary(&full));
    assert!(full
        .derived
        .iter()
        .all(|d| !d.derivation.substituted.is_empty()));
    let picked = [full.derived.len() - 1, 0, 5];
    let expected: Vec<_> = picked.iter().map(|&i| full.derived[i].clone()).collect();
    assert_eq!(quiet.explained(&picked), expected);
    assert_eq!(full.explained(&picked), expected);
}
