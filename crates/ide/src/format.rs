//! Formatting through the one formatter (`parax_syntax::format`): the whole
//! document as one edit, or only the lines a range touches.

use crate::{meets, Analysis};
use parax_eval::Edit;
use parax_syntax::{format::format_line, LineKind, Span};

/// The edit that puts the whole file in canonical layout, if it is not already.
/// One replacement of the whole text: simple for every client, and the file is
/// small next to the cost of a round trip.
pub fn format_document(a: &Analysis) -> Vec<Edit> {
    let formatted = parax_syntax::format::format(&a.parsed);
    if formatted == a.source() {
        return Vec::new();
    }
    vec![Edit {
        span: Span::new(0, a.source().len()),
        text: formatted,
    }]
}

/// Edits that put each statement, header or comment line meeting `range` in
/// canonical layout. Blank lines between blocks are left alone (that is the
/// whole-document formatter's job), so a range edit never moves other lines.
pub fn format_range(a: &Analysis, range: Span) -> Vec<Edit> {
    let mut out = Vec::new();
    for line in &a.parsed.lines {
        if !meets(range, line.span) || matches!(line.kind, LineKind::Error { .. }) {
            continue;
        }
        if matches!(line.kind, LineKind::Trivia) && line.comment.is_none() {
            continue;
        }
        let want = format_line(&a.parsed, line);
        if a.parsed.text(line.span) != want {
            out.push(Edit {
                span: line.span,
                text: want,
            });
        }
    }
    out
}
