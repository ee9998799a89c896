//! `evaluate_streaming` (parse, read and drop the lines block by block, values
//! handed to a callback block by block, as `parax check` and `parax stats` run
//! it) must give exactly the diagnostics and case of `evaluate_with`, and hand
//! over exactly its values in the same order; checked on every example and
//! fixture, on files whose blocks share an id, and after random edits; and so
//! must its two steps `read_source_streaming` and `StreamedSource::evaluate_each`
//! (as `parax eval` runs them), on those files and on generated case files.

use parax_eval::{
    evaluate_streaming, evaluate_with, read_source_streaming, BlockPlace, Derived, EvalOptions,
};
use parax_syntax::parse;
use proptest::prelude::*;
use std::path::Path;

fn files() -> Vec<String> {
    let mut out = vec![
        // Invented data: two blocks with the same id (undated right eye twice).
        "case \"dup\"\n  age 40\n\neye right\n  refraction -1.00 / -0.50 x 90\n  expect spherical-equivalent -1.25 D\n\neye left\n  refraction +1.00\n\neye right\n  refraction -2.00\n  expect spherical-equivalent -2.00 D\n".to_owned(),
    ];
    out.extend(parax_testdata::case_texts());
    out
}

/// Key, text, span and substituted formula of each value.
fn summary(values: &[Derived]) -> Vec<(String, String, (u32, u32), String)> {
    values
        .iter()
        .map(|d| {
            (
                d.key(),
                d.text(),
                (d.span.start, d.span.end),
                d.derivation.substituted.to_string(),
            )
        })
        .collect()
}

/// Compare `evaluate_streaming` with `evaluate_with` on `text`, both option sets;
/// returns how many times the callback was called.
fn same(text: &str) -> Result<usize, TestCaseError> {
    let parsed = parse(text);
    let mut calls = 0;
    for options in [EvalOptions::default(), EvalOptions::VALUES_ONLY] {
        let full = evaluate_with(&parsed, options);
        calls = 0;
        let mut streamed = Vec::new();
        let (read, stream) = evaluate_streaming(text, options, &mut |v| {
            calls += 1;
            streamed.extend_from_slice(v)
        });
        prop_assert!(
            stream.derived.is_empty(),
            "values are handed over, not kept"
        );
        prop_assert_eq!(
            summary(&streamed),
            summary(&full.derived),
            "streamed values of {:?}",
            text
        );
        prop_assert_eq!(
            &stream.diagnostics,
            &full.diagnostics,
            "streamed diagnostics of {:?}",
            text
        );
        prop_assert_eq!(&stream.case, &full.case);
        prop_assert_eq!(&read.errors, &parsed.errors);
        prop_assert_eq!(&read.source, &parsed.source);
        prop_assert!(read.lines.is_empty() && read.blocks.is_empty());
        // The full evaluation holds its values in a vector of exact capacity.
        prop_assert_eq!(full.derived.capacity(), full.derived.len());
        // The two steps of the streaming evaluation, the second run twice (as
        // `parax eval` does for its table): the same values and diagnostics.
        let source = read_source_streaming(text);
        for _ in 0..2 {
            let mut again = Vec::new();
            let diags = source.evaluate_each(options, &mut |v| again.extend_from_slice(v));
            prop_assert_eq!(summary(&again), summary(&full.derived));
            prop_assert_eq!(&diags, &full.diagnostics);
        }
        prop_assert_eq!(&source.case, &full.case);
        // A block's lists are stored without spare room.
        let lists = source
            .case
            .eyes()
            .map(|e| &e.expects)
            .chain(source.case.systems().map(|s| &s.expects))
            .chain(source.case.frames().map(|f| &f.expects));
        for list in lists {
            prop_assert_eq!(list.capacity(), list.len());
            for x in list {
                prop_assert_eq!(x.tokens.capacity(), x.tokens.len());
            }
        }
        for s in source.case.systems() {
            prop_assert_eq!(s.elements.capacity(), s.elements.len());
        }
        let places: Vec<BlockPlace> = parsed
            .blocks
            .iter()
            .map(|b| BlockPlace {
                span: b.span,
                header: parsed.lines[b.header].span,
            })
            .collect();
        prop_assert_eq!(&source.blocks, &places);
        for b in &parsed.blocks {
            for at in [b.span.start, b.span.end] {
                prop_assert_eq!(
                    source.block_at(at).map(|p| p.span),
                    parsed
                        .blocks
                        .iter()
                        .find(|c| c.span.start <= at && at <= c.span.end)
                        .map(|c| c.span)
                );
            }
        }
    }
    Ok(calls)
}

#[test]
fn every_example_and_fixture_gives_the_same_result() {
    for f in files() {
        same(&f).unwrap();
    }
}

#[test]
fn values_come_one_block_at_a_time_unless_ids_repeat() {
    let files = files();
    // The duplicate-id file: one call with every value.
    assert_eq!(same(&files[0]).unwrap(), 1);
    // The dispensing example: one call per block that has an id.
    let text = std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("../../examples/dispensing.parax"),
    )
    .expect("example");
    let ev = evaluate_with(&parse(&text), EvalOptions::default());
    let blocks = ev.case.blocks.len();
    assert!(blocks > 2);
    assert_eq!(same(&text).unwrap(), blocks);
}

#[path = "../benches/corpus/mod.rs"]
mod corpus;

/// Generated case files (the benches' corpus generator: invented patients and
/// numbers) and a large file of many blocks read the same streamed as whole.
#[test]
fn generated_files_give_the_same_result_streamed() {
    for i in 0..40 {
        same(&corpus::case_file(i)).unwrap();
    }
    same(&corpus::big_file(200 * 1024)).unwrap();
}

const PIECES: &[&str] = &[
    "",
    "\n",
    "  ",
    "1",
    "-",
    ".",
    " D",
    "x",
    "eye right\n  refraction -2.00 / -1.00 x 90\n  expect spherical-equivalent -2.50 D\n",
    "eye left 2026-01-02\n  refraction +1.00\n",
    "  expect spherical-equivalent -1.75 D\n",
    "frame\n  vertex 10 mm\n",
    "  expect nothing-such 1\n",
    "refraction -1.00\n",
    "%%% not a line\n",
    "# note\n",
    "  # indented note\n",
];

proptest! {
    #![proptest_config(ProptestConfig::with_cases(128))]
    #[test]
    fn each_equals_full_after_edits(
        file in any::<prop::sample::Index>(),
        edits in prop::collection::vec(
            (any::<prop::sample::Index>(), 0usize..30, prop::collection::vec(0..PIECES.len(), 0..3)),
            1..4,
        ),
    ) {
        let files = files();
        let mut text = files[file.index(files.len())].clone();
        for (at, len, pieces) in edits {
            let std::ops::Range { start, end } =
                parax_testdata::edit_range(&text, at.index(text.len() + 1), len);
            let insert: String = pieces.iter().map(|&i| PIECES[i]).collect();
            text.replace_range(start..end, &insert);
        }
        same(&text)?;
    }
}

/// A value's own size (a 5 MB file derives about 530,000 of them): a field
/// added or widened shows here. Formula and source are one shared `Method` (8
/// bytes), the block id a thin shared pointer (8), name and label `Phrase`s (16
/// each), the substituted formula a boxed `str` (16); it was 176 bytes.
#[test]
fn a_derived_value_stays_small() {
    let size = std::mem::size_of::<Derived>();
    assert!(size <= 120, "Derived is {size} bytes");
}
