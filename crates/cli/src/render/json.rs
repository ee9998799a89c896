//! Output for programs. Keys are stable and documented in docs/cli.md.

use parax_eval::{Derived, Diagnostic, EvalOptions, StreamedSource, GENERAL_CAUTION};
use parax_syntax::{Parsed, Span};
use serde::ser::{SerializeMap, SerializeSeq};
use serde::{Serialize, Serializer};
use serde_json::{json, Value};
use std::cell::RefCell;

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
            "formula": d.derivation.formula(),
            "substituted": d.derivation.substituted,
            "source": d.derivation.source().citation,
            "tag": d.derivation.source().tag,
        },
        "caution": d.caution,
    })
}

/// Write the whole `eval --format json` report of `read` to `out` (pretty, as
/// `serde_json::to_string_pretty` writes it), computing the values while they
/// are written: each block's values are serialized and dropped before the next
/// block is computed, so the report is never held whole, neither as values nor
/// as a `serde_json::Value`. Keys come in sorted order, as a `Value` object
/// writes them. Returns every diagnostic of the file.
pub fn write_eval_report(
    out: impl std::io::Write,
    name: &str,
    read: &StreamedSource,
) -> serde_json::Result<Vec<Diagnostic>> {
    let diagnostics = RefCell::new(Vec::new());
    let report = EvalReport {
        name,
        read,
        diagnostics: &diagnostics,
    };
    report.serialize(&mut serde_json::Serializer::pretty(out))?;
    Ok(diagnostics.into_inner())
}

/// The report's top level; serializing it runs the evaluation (see
/// [`write_eval_report`]).
struct EvalReport<'a> {
    name: &'a str,
    read: &'a StreamedSource,
    /// Filled while `derived` is written, read for `diagnostics` after it.
    diagnostics: &'a RefCell<Vec<Diagnostic>>,
}

impl Serialize for EvalReport<'_> {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        let parsed = &self.read.parsed;
        let mut map = serializer.serialize_map(Some(4))?;
        map.serialize_entry("caution", GENERAL_CAUTION)?;
        map.serialize_entry("derived", &Values(self))?;
        let diags: Vec<Value> = self
            .diagnostics
            .borrow()
            .iter()
            .map(|d| diagnostic(parsed, d))
            .collect();
        map.serialize_entry("diagnostics", &diags)?;
        map.serialize_entry("file", self.name)?;
        map.end()
    }
}

/// The `derived` array, serialized block by block as the values are computed.
struct Values<'r, 'a>(&'r EvalReport<'a>);

impl Serialize for Values<'_, '_> {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        let parsed = &self.0.read.parsed;
        let mut seq = serializer.serialize_seq(None)?;
        let mut failed = None;
        let diags = self
            .0
            .read
            .evaluate_each(EvalOptions::default(), &mut |values| {
                for d in values {
                    if failed.is_some() {
                        return;
                    }
                    if let Err(e) = seq.serialize_element(&derived(parsed, d)) {
                        failed = Some(e);
                    }
                }
            });
        *self.0.diagnostics.borrow_mut() = diags;
        match failed {
            Some(e) => Err(e),
            None => seq.end(),
        }
    }
}
