//! Shared helpers for the cross-crate tests, and the formatter's invariants,
//! checked both by the property tests (`tests/properties.rs`) and by the `format`
//! fuzz target (`tests/fuzz`), so the plain test suite and the fuzzer hold the
//! formatter to the same rules.

use parax_syntax::{format::format, parse, Parsed};

/// The lines of `text` by the notation's rule, written here independently of
/// the reader as the oracle it is checked against: a line ends at `\n`, `\r\n`
/// or a lone `\r` (docs/notation.md, "Lines"); every other separator is an
/// ordinary character.
pub fn lines_by_rule(text: &str) -> Vec<&str> {
    let bytes = text.as_bytes();
    let mut lines = Vec::new();
    let mut start = 0;
    let mut i = 0;
    while i < bytes.len() {
        match bytes[i] {
            b'\n' => {
                lines.push(&text[start..i]);
                start = i + 1;
            }
            b'\r' => {
                lines.push(&text[start..i]);
                if bytes.get(i + 1) == Some(&b'\n') {
                    i += 1;
                }
                start = i + 1;
            }
            _ => {}
        }
        i += 1;
    }
    lines.push(&text[start..]);
    lines
}

/// What the formatter may not change: each line that holds anything but spaces
/// and tabs, with its spaces and tabs left out, in order. So the same
/// non-white-space characters in the same order, each on a line of its own
/// kind: a separator (VT, FF, NEL, U+2028, U+2029, no-break space) is kept where
/// it stands and a line break (lone CR included) stays a line break.
pub fn kept_text(text: &str) -> Vec<String> {
    lines_by_rule(text)
        .into_iter()
        .map(|l| {
            l.chars()
                .filter(|c| !matches!(c, ' ' | '\t'))
                .collect::<String>()
        })
        .filter(|l| !l.is_empty())
        .collect()
}

/// Diagnostics as (code, message) and derived values as (key, value text).
pub type Meaning = (Vec<(String, String)>, Vec<(String, String)>);

/// The evaluation of a text, spans aside: diagnostics as (code, message) and
/// derived values as (key, value text), in order; a message's spaces and tabs
/// are left out.
pub fn meaning(parsed: &Parsed) -> Meaning {
    let ev = parax_eval::evaluate(parsed);
    let diagnostics = ev
        .diagnostics
        .iter()
        // A message may quote the source, whose spaces the formatter changes
        // (`2m` is written `2 m`).
        .map(|d| (d.code.to_string(), without_blanks(&d.message)))
        .collect();
    let derived = ev.derived.iter().map(|d| (d.key(), d.text())).collect();
    (diagnostics, derived)
}

/// `text` without its spaces and tabs.
pub fn without_blanks(text: &str) -> String {
    text.chars().filter(|c| !matches!(c, ' ' | '\t')).collect()
}

/// Check the formatter on `source`; `Err` says which invariant broke.
/// The reader reads the lines [`lines_by_rule`] finds; formatting is idempotent,
/// keeps [`kept_text`] and keeps the evaluation ([`meaning`]).
pub fn check_format(source: &str) -> Result<(), String> {
    let parsed = parse(source);
    if parsed.errors.first().map(|e| e.code) == Some(parax_syntax::codes::TOO_LARGE) {
        return Ok(());
    }
    let by_rule = lines_by_rule(source);
    let read: Vec<&str> = parsed.lines.iter().map(|l| parsed.text(l.span)).collect();
    if read != by_rule || parsed.index.line_count() != by_rule.len() {
        return Err(format!(
            "the reader's lines differ from the line-break rule: {read:?} vs {by_rule:?}"
        ));
    }
    let once = format(&parsed);
    let again = parse(&once);
    let twice = format(&again);
    if twice != once {
        return Err(format!("not idempotent: {once:?} -> {twice:?}"));
    }
    if kept_text(&once) != kept_text(source) {
        return Err(format!("characters changed: {source:?} -> {once:?}"));
    }
    let (before, after) = (meaning(&parsed), meaning(&again));
    if before != after {
        return Err(format!(
            "evaluation changed: {source:?} -> {once:?}\n{before:?}\n{after:?}"
        ));
    }
    Ok(())
}
