//! `parse` never panics, keeps every character (the lines and their line breaks
//! give back the source), reads one line per line of the line index, and every
//! span slices the source.
#![no_main]

use libfuzzer_sys::fuzz_target;
use parax_fuzz::{assert_tree_slices, text};

fuzz_target!(|data: &[u8]| {
    let source = text(data);
    let parsed = parax_syntax::parse(&source);
    assert_tree_slices(&parsed);
    if parsed.errors.first().map(|e| e.code) == Some(parax_syntax::codes::TOO_LARGE) {
        return;
    }
    assert_eq!(parsed.lines.len(), parsed.index.line_count());
    // Lossless: between one line's end and the next line's start stands exactly
    // one line break.
    let mut at = 0;
    for (i, line) in parsed.lines.iter().enumerate() {
        let gap = &source[at..line.span.start()];
        if i == 0 {
            assert_eq!(gap, "");
        } else {
            assert!(
                matches!(gap, "\n" | "\r\n" | "\r"),
                "line {i} after {gap:?}"
            );
        }
        at = line.span.end();
    }
    assert_eq!(at, source.len());
});
