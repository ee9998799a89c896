//! A stream of edits applied to a document as the language server applies them:
//! ranges as (line, column) in UTF-8 or UTF-16 columns, applied to the server's
//! rope by `parax_lsp::apply_change` (which rejects positions outside the
//! document) or turned into byte offsets by `LineIndex::offset` (which clamps
//! them). After every edit the analysis updated from the one before
//! (`parax_ide::Analysis::update`) must equal a fresh analysis of the same text.
//!
//! Input: the document's first text, then a NUL byte, then the edits, each drawn
//! from the remaining bytes (so a case file alone is a valid seed).
#![no_main]

use libfuzzer_sys::arbitrary::{Result, Unstructured};
use libfuzzer_sys::fuzz_target;
use parax_ide::Analysis;
use parax_syntax::{ColumnUnit, LineIndex, LinePos};
use ropey::Rope;

/// Pieces an edit inserts: line structure, every line break and separator,
/// tokens of the notation, and things the grammar rejects.
const PIECES: &[&str] = &[
    "",
    "\n",
    "\r\n",
    "\r",
    "\u{2028}",
    "\u{2029}",
    "\u{85}",
    "\u{b}",
    "\u{c}",
    "  ",
    "\t",
    "eye right\n",
    "case \"c\"\n",
    "system \"s\"\n  lens L1 +5 D\n",
    "  refraction -1.25 / -0.50 x 90 @ 12 mm\n",
    "  add +2.00",
    "  vertex 12 mm",
    "  keratometry 7.8 mm x 180, 7.6 mm x 90",
    "# note",
    "\"",
    "x",
    "°",
    "Δ",
    "é",
    "😀",
    "$",
    "1",
    ".",
    "-",
    "expect ",
];

/// One edit: a range (start and end line/column in `unit`) and its new text.
fn edit(u: &mut Unstructured<'_>, index: &LineIndex) -> Result<(LinePos, LinePos, String)> {
    let lines = index.line_count() as u32;
    let pos = |u: &mut Unstructured<'_>| -> Result<LinePos> {
        // Mostly inside the document, sometimes past its end.
        Ok(LinePos {
            line: u.int_in_range(0..=lines)?,
            col: u.int_in_range(0..=u8::MAX as u32)? % 48,
        })
    };
    let (a, b) = (pos(u)?, pos(u)?);
    let insert = if u.ratio(3, 4)? {
        PIECES[u.choose_index(PIECES.len())?].to_owned()
    } else {
        let s: &str = u.arbitrary()?;
        s.chars().take(6).collect()
    };
    Ok((a.min(b), a.max(b), insert))
}

/// The first part in which two analyses differ, if any.
fn difference(a: &Analysis, b: &Analysis) -> Option<&'static str> {
    let parts = [
        (
            "syntax tree",
            format!("{:?}", a.parsed),
            format!("{:?}", b.parsed),
        ),
        (
            "case model",
            format!("{:?}", a.evaluation.case),
            format!("{:?}", b.evaluation.case),
        ),
        (
            "derived values",
            format!("{:?}", a.evaluation.derived),
            format!("{:?}", b.evaluation.derived),
        ),
        (
            "diagnostics",
            format!("{:?}", a.evaluation.diagnostics),
            format!("{:?}", b.evaluation.diagnostics),
        ),
    ];
    parts
        .into_iter()
        .find(|(_, x, y)| x != y)
        .map(|(what, _, _)| what)
}

fn run(data: &[u8]) -> Result<()> {
    let split = data.iter().position(|&b| b == 0).unwrap_or(data.len());
    let first = String::from_utf8_lossy(&data[..split]).into_owned();
    let mut u = Unstructured::new(data.get(split + 1..).unwrap_or(&[]));
    let mut rope = Rope::from_str(&first);
    let mut analysis = Analysis::new(&first);
    for _ in 0..16 {
        if u.is_empty() {
            break;
        }
        let unit = if u.arbitrary()? {
            ColumnUnit::Utf16
        } else {
            ColumnUnit::Utf8
        };
        let (start, end, insert) = edit(&mut u, &analysis.parsed.index)?;
        let text = if u.arbitrary()? {
            // As the server does: the rope, strictly.
            let range = Some(((start.line, start.col), (end.line, end.col)));
            if parax_lsp::apply_change(&mut rope, range, &insert, unit).is_err() {
                continue;
            }
            rope.to_string()
        } else {
            // Clamped by the one position converter.
            let src = analysis.source();
            let index = &analysis.parsed.index;
            let (s, e) = (index.offset(src, start, unit), index.offset(src, end, unit));
            let mut text = src.to_owned();
            text.replace_range(s.min(e)..s.max(e), &insert);
            rope = Rope::from_str(&text);
            text
        };
        let before = analysis.source().to_owned();
        analysis = analysis.update(&text);
        let fresh = Analysis::new(&text);
        if let Some(what) = difference(&analysis, &fresh) {
            panic!("after the edit {before:?} -> {text:?} the updated analysis's {what} differs from a fresh one's");
        }
    }
    Ok(())
}

fuzz_target!(|data: &[u8]| {
    let _ = run(data);
});
