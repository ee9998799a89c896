//! Output for people: each diagnostic with its position, the source line and a
//! caret under the span, then hint, fix and caution; derived values as a table.

use parax_eval::{Derived, Diagnostic, StreamedSource, GENERAL_CAUTION};
use parax_syntax::Parsed;
use std::fmt::Write;
use std::sync::Arc;

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

/// The column widths of the table of derived values: the longest name (at most
/// 34 characters) and the longest value text (at most 30) of the whole file, so
/// they are gathered over every value before the first row is written.
#[derive(Debug, Clone, Copy, Default)]
pub struct Widths {
    name: usize,
    text: usize,
}

impl Widths {
    /// Widen to fit `values`.
    pub fn fit(&mut self, values: &[Derived]) {
        for d in values {
            self.name = self.name.max(d.name.chars().count());
            self.text = self.text.max(d.text().chars().count());
        }
    }
}

/// Writes the derived values of one file as a table grouped by block, as they
/// are handed over block by block ([`parax_eval::StreamedSource::evaluate_each`]):
/// a header line whenever the block changes, then one row per value (and its
/// formula, numbers, source and caution with `explain`).
pub struct Table<'a> {
    read: &'a StreamedSource,
    name_w: usize,
    text_w: usize,
    explain: bool,
    current_block: Option<Arc<String>>,
}

impl<'a> Table<'a> {
    /// A table over `read`'s values, with the widths gathered over all of them.
    pub fn new(read: &'a StreamedSource, widths: Widths, explain: bool) -> Self {
        Table {
            read,
            name_w: widths.name.min(34),
            text_w: widths.text.min(30),
            explain,
            current_block: None,
        }
    }

    /// True once a value has been written.
    pub fn any(&self) -> bool {
        self.current_block.is_some()
    }

    /// Write the rows of `values` (the next ones in order) to `out`.
    pub fn write(
        &mut self,
        out: &mut impl std::io::Write,
        values: &[Derived],
    ) -> std::io::Result<()> {
        let parsed = &self.read.parsed;
        let (name_w, text_w) = (self.name_w, self.text_w);
        for d in values {
            if self.current_block.as_deref() != Some(&d.block) {
                if self.current_block.is_some() {
                    writeln!(out)?;
                }
                let (line, _) = parsed.index.line_col(&parsed.source, d.span.start());
                let block = d.block.as_str();
                let header = self
                    .read
                    .block_at(d.span.start)
                    .map_or(block, |b| parsed.text(b.header).trim_end());
                writeln!(out, "{header}    [{block}, from line {line}]")?;
                self.current_block = Some(Arc::clone(&d.block));
            }
            let (line, _) = parsed.index.line_col(&parsed.source, d.span.start());
            writeln!(
                out,
                "  {:<name_w$}  {:<text_w$}  {} (line {line})",
                d.name,
                d.text(),
                d.label
            )?;
            if self.explain {
                writeln!(
                    out,
                    "  {:<name_w$}    formula: {}",
                    "",
                    d.derivation.formula()
                )?;
                writeln!(
                    out,
                    "  {:<name_w$}    numbers: {}",
                    "", d.derivation.substituted
                )?;
                let s = d.derivation.source();
                writeln!(
                    out,
                    "  {:<name_w$}    source:  {} [{}]",
                    "", s.citation, s.tag
                )?;
                if let Some(c) = d.caution {
                    writeln!(out, "  {:<name_w$}    caution: {c}", "")?;
                }
            }
        }
        Ok(())
    }
}
