//! `reparse` (re-reading only the lines an edit touches) must give exactly what
//! `parse` gives for the edited text: same lines, blocks and errors, over random
//! edits of the fixture files, chained so that each edit starts from a re-parse.

use parax_syntax::{parse, reparse, Parsed};
use proptest::prelude::*;

fn fixtures() -> Vec<String> {
    parax_testdata::case_texts()
}

/// Pieces of text an edit inserts: line structure (breaks, indentation, headers
/// at column 0), tokens, and things the grammar rejects.
const PIECES: &[&str] = &[
    "",
    "\n",
    "\r\n",
    // A lone CR is a line break too; it can join a `\n` after it into one.
    "\r",
    "\u{2029}",
    "  ",
    "\t",
    "eye right\n",
    "eye left 2026-01-02",
    "system \"s\"\n  lens L1 +5 D\n",
    "  refraction -1.25 / -0.50 x 90 @ 12 mm\n",
    "  add +2.00",
    "refraction -2",
    "# note",
    "\"",
    "x",
    "°",
    "Δ",
    "5",
    "-",
    ".",
    "$",
    "eyes right",
    "case \"Zoë\"",
    "  expect spherical-equivalent -1.50 D ± 0.01",
];

fn assert_same(got: &Parsed, want: &Parsed) {
    assert_eq!(got.source, want.source);
    assert_eq!(got.lines, want.lines, "lines of {:?}", want.source);
    assert_eq!(got.blocks, want.blocks, "blocks of {:?}", want.source);
    assert_eq!(got.errors, want.errors, "errors of {:?}", want.source);
    assert_eq!(got.index.line_count(), want.index.line_count());
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(512))]
    #[test]
    fn reparse_equals_parse(
        file in any::<prop::sample::Index>(),
        edits in prop::collection::vec(
            (any::<prop::sample::Index>(), 0usize..40, prop::collection::vec(0..PIECES.len(), 0..3)),
            1..4,
        ),
    ) {
        let files = fixtures();
        let mut text = files[file.index(files.len())].clone();
        let mut parsed = parse(&text);
        for (at, len, pieces) in edits {
            let std::ops::Range { start, end } =
                parax_testdata::edit_range(&text, at.index(text.len() + 1), len);
            let insert: String = pieces.iter().map(|&i| PIECES[i]).collect();
            parsed = reparse(&parsed, start..end, &insert);
            text.replace_range(start..end, &insert);
            assert_same(&parsed, &parse(&text));
        }
    }
}

#[test]
fn an_edit_that_moves_a_header_regroups_blocks() {
    let src = "eye right\n  add +1.00\neye left\n  add +2.00\n";
    let p = parse(src);
    // Indent the second header: it becomes a statement of the first block.
    let r = reparse(&p, 22..22, "  ");
    assert_same(
        &r,
        &parse("eye right\n  add +1.00\n  eye left\n  add +2.00\n"),
    );
    assert_eq!(r.blocks.len(), 1);
    // A statement before any block, then a header typed above it.
    let p = parse("  add +1.00\n");
    assert_eq!(p.errors.len(), 1);
    let r = reparse(&p, 0..0, "eye right\n");
    assert!(r.errors.is_empty(), "{:?}", r.errors);
    assert_same(&r, &parse("eye right\n  add +1.00\n"));
}

/// Found by the `lsp_edits` fuzz target: an indented comment before any block
/// edited into a statement kept the fast path (same line count, no errors
/// before), so the statement outside every block got no P0003 error.
#[test]
fn a_comment_before_any_block_edited_into_a_statement_is_an_error() {
    let p = parse("  # expect-code: P0°");
    assert!(p.errors.is_empty());
    let r = reparse(&p, 2..2, "add +2.00");
    assert_same(&r, &parse("  add +2.00# expect-code: P0°"));
    assert_eq!(r.errors.len(), 1);
}

#[test]
fn a_bad_range_gets_a_full_parse() {
    let p = parse("case \"Zoë\"\n");
    // Inside the `ë`, reversed, past the end: the text stays, parsed in full.
    for (start, end) in [(8, 9), (3, 1), (5, 99)] {
        let got = reparse(&p, start..end, "x");
        assert_same(&got, &p);
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]
    /// `parse` reads one top-level block per pest pass and falls back to single
    /// lines only inside a rejected block; re-parsing everything from an empty
    /// text reads every line on its own. Both must agree on any mix of good and
    /// bad blocks (the grammar is line-local, so where the passes are cut must not
    /// matter).
    #[test]
    fn blockwise_parse_equals_line_by_line(
        pieces in prop::collection::vec(0..PIECES.len(), 0..24),
        file in any::<prop::sample::Index>(),
        cut in any::<prop::sample::Index>(),
    ) {
        let files = fixtures();
        let base = &files[file.index(files.len())];
        let at = base.floor_char_boundary(cut.index(base.len() + 1));
        let insert: String = pieces.iter().map(|&i| PIECES[i]).collect();
        let mut text = base.clone();
        text.insert_str(at, &insert);
        assert_same(&reparse(&parse(""), 0..0, &text), &parse(&text));
    }
}

#[test]
fn a_bad_block_costs_only_its_bad_line() {
    let src = "eye right\n  add +1.00\neye left\n  add +2.00 $\n  pd 31 mm\n\
               system \"s\"\n  lens L1 +5 D\n";
    let p = parse(src);
    assert_eq!(p.errors.len(), 1, "{:?}", p.errors);
    assert_eq!(p.index.line_col(src, p.errors[0].span.start()).0, 4);
    assert_eq!(p.blocks.len(), 3);
    assert_same(&p, &reparse(&parse(""), 0..0, src));
}
