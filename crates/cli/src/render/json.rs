//! Output for programs. Keys are stable and documented in docs/cli.md.

use parax_eval::{Derived, Diagnostic, GENERAL_CAUTION};
use parax_syntax::{Parsed, Span};
use serde_json::{json, Value};

fn range(parsed: &Parsed, span: Span) -> Value {
    let (l1, c1) = parsed.index.line_col(&parsed.source, span.start());
    let (l2, c2) = parsed.index.line_col(&parsed.source, span.end());
    json!({ "line": l1, "column": c1, "end_line": l2, "end_column": c2 })
}

/// One diagnostic as JSON; positions are 1-based, columns in characters.
pub fn diagnostic(parsed: &Parsed, d: &Diagnostic) -> Value {
    json!({
        "code": d.code,
        "severity": d.severity.name(),
        "message": d.message,
        "range": range(parsed, d.span),
        "hint": d.hint,
        "fix": d.fix.as_ref().map(|f| json!({
            "title": f.title,
            "edits": f.edits.iter().map(|e| json!({ "range": range(parsed, e.span), "text": e.text })).collect::<Vec<_>>(),
        })),
        "caution": d.caution,
    })
}

/// The diagnostics of one file.
pub fn file_diagnostics(name: &str, parsed: &Parsed, diags: &[Diagnostic]) -> Value {
    json!({
        "file": name,
        "diagnostics": diags.iter().map(|d| diagnostic(parsed, d)).collect::<Vec<_>>(),
    })
}

/// The whole `check --format json` report.
pub fn check_report(
    files: Vec<Value>,
    [e, w, i]: [usize; 3],
    count: usize,
    io_errors: &[String],
) -> Value {
    json!({
        "files": files,
        "summary": { "files": count, "errors": e, "warnings": w, "notes": i, "unreadable": io_errors },
        "caution": GENERAL_CAUTION,
    })
}

/// One derived value as JSON.
pub fn derived(parsed: &Parsed, d: &Derived) -> Value {
    json!({
        "key": d.key(),
        "name": d.name,
        "label": d.label,
        "value": d.value,
        "text": d.text(),
        "range": range(parsed, d.span),
        "derivation": {
            "formula": d.derivation.formula,
            "substituted": d.derivation.substituted,
            "source": d.derivation.source.citation,
            "tag": d.derivation.source.tag,
        },
        "caution": d.caution,
    })
}

/// The whole `eval --format json` report.
pub fn eval_report(
    name: &str,
    parsed: &Parsed,
    derived_values: &[Derived],
    diags: &[Diagnostic],
) -> Value {
    json!({
        "file": name,
        "derived": derived_values.iter().map(|d| derived(parsed, d)).collect::<Vec<_>>(),
        "diagnostics": diags.iter().map(|d| diagnostic(parsed, d)).collect::<Vec<_>>(),
        "caution": GENERAL_CAUTION,
    })
}
