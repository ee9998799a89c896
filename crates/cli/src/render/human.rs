//! Output for people: each diagnostic with its position, the source line and a
//! caret under the span, then hint, fix and caution; derived values as a table.

use parax_eval::{Derived, Diagnostic, GENERAL_CAUTION};
use parax_syntax::Parsed;
use std::fmt::Write;

/// The closing caution line.
pub fn caution_line() -> String {
    format!("caution: {GENERAL_CAUTION}")
}

/// All diagnostics of one file.
pub fn diagnostics(name: &str, parsed: &Parsed, diags: &[Diagnostic]) -> String {
    let mut out = String::new();
    for d in diags {
        diagnostic(&mut out, name, parsed, d);
    }
    out
}

/// One diagnostic:
/// ```text
/// case.parax:5:37: error P0201: the vertex distance `12` has no unit
///    5 |   refraction -4.50 / -1.25 x 10 @ 12
///      |                                   ^^
///      = hint: …
/// ```
pub fn diagnostic(out: &mut String, name: &str, parsed: &Parsed, d: &Diagnostic) {
    let src = &parsed.source;
    let (line, col) = parsed.index.line_col(src, d.span.start());
    let _ = writeln!(
        out,
        "{name}:{line}:{col}: {} {}: {}",
        d.severity.name(),
        d.code,
        d.message
    );
    let line_span = parsed.index.line_span(src, line - 1);
    let text = &src[line_span.start()..line_span.end()];
    let gutter = line.to_string().len().max(3);
    let _ = writeln!(out, " {line:>gutter$} | {text}");
    let end = d.span.end().min(line_span.end()).max(d.span.start());
    let width = src[d.span.start().min(src.len())..end.min(src.len())]
        .chars()
        .count()
        .max(1);
    let lead: String = src[line_span.start()..d.span.start().min(line_span.end())]
        .chars()
        .map(|c| if c == '\t' { '\t' } else { ' ' })
        .collect();
    let _ = writeln!(out, " {:>gutter$} | {lead}{}", "", "^".repeat(width));
    if let Some(h) = &d.hint {
        let _ = writeln!(out, " {:>gutter$} = hint: {h}", "");
    }
    if let Some(f) = &d.fix {
        let _ = writeln!(out, " {:>gutter$} = fix: {}", "", f.title);
    }
    if let Some(c) = d.caution {
        let _ = writeln!(out, " {:>gutter$} = caution: {c}", "");
    }
}

/// The closing summary of `parax check`.
pub fn summary(files: usize, [e, w, i]: [usize; 3], expects: usize) -> String {
    let s = |n: usize, word: &str| format!("{n} {word}{}", if n == 1 { "" } else { "s" });
    format!(
        "checked {}: {}, {}, {}; {} recorded",
        s(files, "file"),
        s(e, "error"),
        s(w, "warning"),
        s(i, "note"),
        s(expects, "result")
    )
}

/// The derived values of one file as a table grouped by block.
pub fn derived_table(parsed: &Parsed, derived: &[Derived], explain: bool) -> String {
    let mut out = String::new();
    let mut current_block: Option<&str> = None;
    let name_w = derived
        .iter()
        .map(|d| d.name.chars().count())
        .max()
        .unwrap_or(0)
        .min(34);
    let text_w = derived
        .iter()
        .map(|d| d.text().chars().count())
        .max()
        .unwrap_or(0)
        .min(30);
    for d in derived {
        let block = &*d.block;
        if current_block != Some(block) {
            if current_block.is_some() {
                out.push('\n');
            }
            let (line, _) = parsed.index.line_col(&parsed.source, d.span.start());
            let header = parsed
                .blocks
                .iter()
                .find(|b| b.span.start <= d.span.start && d.span.start <= b.span.end)
                .map(|b| {
                    parsed
                        .text(parsed.lines[b.header].span)
                        .trim_end()
                        .to_owned()
                })
                .unwrap_or_else(|| block.to_owned());
            let _ = writeln!(out, "{header}    [{block}, from line {line}]");
            current_block = Some(block);
        }
        let (line, _) = parsed.index.line_col(&parsed.source, d.span.start());
        let _ = writeln!(
            out,
            "  {:<name_w$}  {:<text_w$}  {} (line {line})",
            d.name,
            d.text(),
            d.label
        );
        if explain {
            let _ = writeln!(
                out,
                "  {:<name_w$}    formula: {}",
                "", d.derivation.formula
            );
            let _ = writeln!(
                out,
                "  {:<name_w$}    numbers: {}",
                "", d.derivation.substituted
            );
            let s = d.derivation.source;
            let _ = writeln!(
                out,
                "  {:<name_w$}    source:  {} [{}]",
                "", s.citation, s.tag
            );
            if let Some(c) = d.caution {
                let _ = writeln!(out, "  {:<name_w$}    caution: {c}", "");
            }
        }
    }
    out
}
