//! Conversions between `parax-ide` data (byte offsets) and LSP types, in the
//! position encoding negotiated with the client. Reads clamp positions.

use parax_eval::{Diagnostic, Severity};
use parax_ide::Analysis;
use parax_syntax::{ColumnUnit, LinePos, Span};
use tower_lsp_server::ls_types as lsp;

/// Byte offset of an LSP position (clamped to the text).
pub fn offset(a: &Analysis, pos: lsp::Position, unit: ColumnUnit) -> usize {
    a.parsed.index.offset(
        a.source(),
        LinePos {
            line: pos.line,
            col: pos.character,
        },
        unit,
    )
}

/// LSP position of a byte offset.
pub fn position(a: &Analysis, offset: usize, unit: ColumnUnit) -> lsp::Position {
    let p = a.parsed.index.position(a.source(), offset, unit);
    lsp::Position::new(p.line, p.col)
}

/// LSP range of a byte span.
pub fn range(a: &Analysis, span: Span, unit: ColumnUnit) -> lsp::Range {
    lsp::Range::new(
        position(a, span.start(), unit),
        position(a, span.end(), unit),
    )
}

/// Byte span of an LSP range (clamped, and put in order).
pub fn span(a: &Analysis, r: lsp::Range, unit: ColumnUnit) -> Span {
    let s = offset(a, r.start, unit);
    let e = offset(a, r.end, unit);
    Span::new(s.min(e), s.max(e))
}

/// An LSP diagnostic with the same code, message and span as `parax check`.
pub fn diagnostic(a: &Analysis, d: &Diagnostic, unit: ColumnUnit) -> lsp::Diagnostic {
    let severity = match d.severity {
        Severity::Error => lsp::DiagnosticSeverity::ERROR,
        Severity::Warning => lsp::DiagnosticSeverity::WARNING,
        Severity::Info => lsp::DiagnosticSeverity::INFORMATION,
    };
    let mut message = d.message.clone();
    if let Some(h) = &d.hint {
        message.push_str("\nhint: ");
        message.push_str(h);
    }
    if let Some(c) = d.caution {
        message.push_str("\ncaution: ");
        message.push_str(c);
    }
    lsp::Diagnostic {
        range: range(a, d.span, unit),
        severity: Some(severity),
        code: Some(lsp::NumberOrString::String(d.code.into())),
        source: Some("parax".into()),
        message,
        ..Default::default()
    }
}

/// LSP text edits from `parax-ide` edits.
pub fn edits(a: &Analysis, edits: &[parax_ide::Edit], unit: ColumnUnit) -> Vec<lsp::TextEdit> {
    edits
        .iter()
        .map(|e| lsp::TextEdit::new(range(a, e.span, unit), e.text.clone()))
        .collect()
}
