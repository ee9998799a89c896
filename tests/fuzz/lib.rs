//! Checks shared by the fuzz targets: every span the reader and the evaluator
//! hand out slices the text it came from.

use parax_syntax::{Parsed, Span};

/// Panics unless `span` is a valid slice of `text` (in order, in bounds, on
/// character boundaries).
pub fn assert_slices(text: &str, span: Span, what: &str) {
    assert!(
        span.start <= span.end
            && span.end() <= text.len()
            && text.is_char_boundary(span.start())
            && text.is_char_boundary(span.end()),
        "{what} span {span:?} does not slice a text of {} bytes",
        text.len()
    );
}

/// Panics unless every line, keyword and value span of `parsed` slices its source.
pub fn assert_tree_slices(parsed: &Parsed) {
    let src = &parsed.source;
    for line in &parsed.lines {
        assert_slices(src, line.span, "line");
        if let Some(c) = line.comment {
            assert_slices(src, c, "comment");
        }
        if let Some(st) = line.statement() {
            assert_slices(src, st.keyword, "keyword");
            for v in &st.values {
                assert_slices(src, v.span, "value");
            }
        }
    }
    for e in &parsed.errors {
        assert_slices(src, e.span, "syntax error");
    }
    for b in &parsed.blocks {
        assert_slices(src, b.span, "block");
    }
}

/// The fuzzer's bytes as text: valid UTF-8 as it is, anything else with its
/// bad sequences replaced (so every input reaches the reader).
pub fn text(data: &[u8]) -> std::borrow::Cow<'_, str> {
    String::from_utf8_lossy(data)
}
