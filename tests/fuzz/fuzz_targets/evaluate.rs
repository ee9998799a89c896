//! `evaluate` never panics, and every diagnostic, fix and derived value it
//! reports points into the source (a place an editor can show).
#![no_main]

use libfuzzer_sys::fuzz_target;
use parax_fuzz::{assert_slices, text};

fuzz_target!(|data: &[u8]| {
    let source = text(data);
    let parsed = parax_syntax::parse(&source);
    let ev = parax_eval::evaluate(&parsed);
    for d in &ev.diagnostics {
        assert_slices(&source, d.span, d.code.as_str());
        let _ = parsed.index.line_col(&source, d.span.start());
        for e in d.fix.iter().flat_map(|f| &f.edits) {
            assert_slices(&source, e.span, "fix");
        }
    }
    for d in &ev.derived {
        assert_slices(&source, d.span, "derived value");
        let _ = (d.key(), d.text());
    }
});
