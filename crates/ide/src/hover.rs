//! Hover: how the values of a line were derived (formula, the numbers
//! substituted, result, published source with its provenance tag, caution), what
//! a keyword records, and the findings on the line.

use crate::Analysis;
use parax_eval::{schema, GENERAL_CAUTION};
use parax_syntax::{LineKind, Span};
use serde::Serialize;

/// Hover text in Markdown and the span it describes.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Hover {
    /// What the hover is about (a keyword, or the whole statement).
    pub span: Span,
    /// Markdown.
    pub markdown: String,
}

/// The hover at byte `offset`, if there is anything to say.
pub fn hover(a: &Analysis, offset: usize) -> Option<Hover> {
    let offset = offset.min(a.source().len());
    let line_i = a.line_at(offset);
    let line = a.parsed.lines.get(line_i)?;
    let statement = line.statement()?;
    let kind = a.block_kind(line_i);
    let keyword = a.parsed.keyword(statement);
    let mut md = String::new();
    let mut span = line.span;

    if statement.keyword.touches(offset) {
        span = statement.keyword;
        match (&line.kind, kind) {
            (LineKind::Header { block, .. }, _) => {
                md.push_str(&format!(
                    "**{}** {}\n\nOpens a `{}` block. Keywords: {}.\n",
                    block.keyword(),
                    schema::header_form(*block),
                    block.keyword(),
                    schema::keywords(*block)
                        .iter()
                        .map(|k| format!("`{}`", k.name))
                        .collect::<Vec<_>>()
                        .join(", ")
                ));
            }
            (_, Some(k)) => {
                if let Some(spec) = schema::keyword(k, keyword) {
                    md.push_str(&format!(
                        "**{}** {}\n\n{}.\n",
                        spec.name, spec.form, spec.doc
                    ));
                    if !spec.evaluated {
                        md.push_str("\nRead and checked; not yet used in computations.\n");
                    }
                }
            }
            _ => {}
        }
    }

    // An `expect` line: the value it records and the one computed.
    if keyword == "expect" {
        if let Some(name_v) = statement.values.first() {
            let name = a.parsed.text(name_v.span);
            // The first value (in evaluation order) of that name inside the block.
            let derived = &a.evaluation.derived;
            let found = a.block_around(line_i).and_then(|b| {
                a.evaluation
                    .values_starting_in(b.span)
                    .into_iter()
                    .filter(|&i| derived[i].name == name && derived[i].span.end <= b.span.end)
                    .min()
            });
            if let Some(i) = found {
                for d in a.explained(&[i]) {
                    md.push_str(&derivation_md(&d));
                }
            }
        }
    }

    let on_line = a.evaluation.values_starting_in(line.span);
    if !statement.keyword.touches(offset) || md.is_empty() {
        for d in &a.explained(&on_line) {
            md.push_str(&derivation_md(d));
        }
    }

    for diag in a
        .evaluation
        .diagnostics
        .iter()
        .filter(|d| d.span.touches(offset) && d.span.start >= line.span.start)
    {
        md.push_str(&format!(
            "\n**{} {}**: {}\n",
            diag.severity.name(),
            diag.code,
            diag.message
        ));
        if let Some(h) = &diag.hint {
            md.push_str(&format!("\n{h}\n"));
        }
        if let Some(c) = diag.caution {
            md.push_str(&format!("\n*Caution:* {c}\n"));
        }
    }

    if md.is_empty() {
        return None;
    }
    if !on_line.is_empty() || keyword == "expect" {
        md.push_str(&format!("\n---\n*{GENERAL_CAUTION}*\n"));
    }
    Some(Hover { span, markdown: md })
}

fn derivation_md(d: &parax_eval::Derived) -> String {
    let mut s = format!(
        "\n### {}: {}\n`{}`\n\n- formula: `{}`\n- substituted: `{}`\n- source: {} [{}]\n",
        d.label,
        d.text(),
        d.name,
        d.derivation.formula(),
        d.derivation.substituted,
        d.derivation.source().citation,
        d.derivation.source().tag
    );
    if let Some(c) = d.caution {
        s.push_str(&format!("- *caution:* {c}\n"));
    }
    s
}
