//! The parser fixture harness: every file in `fixtures/parse/valid` and
//! `fixtures/parse/invalid` (sorted by name) is parsed and evaluated, and a compact
//! text rendering is snapshotted: one line per source line (its kind, keyword,
//! values and comment), the blocks with their line ranges, then every diagnostic as
//! `line:col code severity message` with its hint and fix. Valid files must have no
//! error, invalid ones at least one, including the code named on their first line.

mod support;

use parax_eval::{evaluate_source, Severity};
use parax_syntax::{LineKind, Parsed, Symbol, Value, ValueKind};
use std::fmt::Write as _;
use std::panic::{catch_unwind, AssertUnwindSafe};
use std::path::Path;
use support::{fixtures_dir, parax_files, read, stem};

/// 1-based `line:col` of a byte offset.
fn pos(parsed: &Parsed, offset: usize) -> String {
    let (line, col) = parsed.index.line_col(&parsed.source, offset);
    format!("{line}:{col}")
}

fn render_value(parsed: &Parsed, value: &Value) -> String {
    let text = parsed.text(value.span);
    match &value.kind {
        ValueKind::Number { .. } => format!("number {text:?}"),
        ValueKind::Text { text } => format!("text {:?}", parsed.text(*text)),
        ValueKind::Date { .. } => format!("date {text:?}"),
        ValueKind::AxisSign if text == "x" => "axis-sign".to_owned(),
        ValueKind::AxisSign => format!("axis-sign {text:?}"),
        ValueKind::Symbol { symbol } => match symbol {
            Symbol::Slash => "slash".to_owned(),
            Symbol::Comma => "comma".to_owned(),
            Symbol::At => "at".to_owned(),
            Symbol::PlusMinus => format!("plus-minus {text:?}"),
        },
        ValueKind::Word => format!("word {text:?}"),
    }
}

/// The compact rendering that is snapshotted.
fn render(source: &str) -> (String, parax_eval::Evaluation, Parsed) {
    let (parsed, ev) = evaluate_source(source);
    let mut out = String::new();
    let breaks = if source.contains("\r\n") {
        "CRLF"
    } else {
        "LF"
    };
    let _ = writeln!(out, "{} lines, {breaks} line breaks", parsed.lines.len());
    let _ = writeln!(out, "-- lines");
    for (i, line) in parsed.lines.iter().enumerate() {
        let n = i + 1;
        let indent =
            if line.indent == 0 || (line.indent == 2 && !matches!(line.kind, LineKind::Trivia)) {
                String::new()
            } else {
                format!(
                    " indent={:?}",
                    &parsed.source[line.span.start()..line.span.start() + line.indent as usize]
                )
            };
        let comment = line
            .comment
            .map(|c| format!(" {}", parsed.text(c)))
            .unwrap_or_default();
        let body = match &line.kind {
            LineKind::Trivia if line.comment.is_none() => "blank".to_owned(),
            LineKind::Trivia => "comment".to_owned(),
            LineKind::Header { block, statement } => {
                let values: Vec<String> = statement
                    .values
                    .iter()
                    .map(|v| render_value(&parsed, v))
                    .collect();
                format!("header {} [{}]", block.keyword(), values.join(", "))
            }
            LineKind::Statement { statement } => {
                let values: Vec<String> = statement
                    .values
                    .iter()
                    .map(|v| render_value(&parsed, v))
                    .collect();
                format!(
                    "statement {} [{}]",
                    parsed.keyword(statement),
                    values.join(", ")
                )
            }
            LineKind::Error { error } => {
                let e = &parsed.errors[*error];
                format!("error {} {:?}", e.code, parsed.text(line.span))
            }
        };
        let _ = writeln!(out, "{n:>3} {body}{indent}{comment}");
    }
    let _ = writeln!(out, "-- blocks");
    for b in &parsed.blocks {
        let _ = writeln!(
            out,
            "{} lines {}-{} ({}..{})",
            b.kind.keyword(),
            b.header + 1,
            b.end,
            pos(&parsed, b.span.start()),
            pos(&parsed, b.span.end())
        );
    }
    let _ = writeln!(out, "-- diagnostics");
    for d in &ev.diagnostics {
        let _ = writeln!(
            out,
            "{} {} {} {}",
            pos(&parsed, d.span.start()),
            d.code,
            d.severity.name(),
            d.message
        );
        if let Some(h) = &d.hint {
            let _ = writeln!(out, "    hint: {h}");
        }
        if let Some(f) = &d.fix {
            let edits: Vec<String> = f
                .edits
                .iter()
                .map(|e| {
                    format!(
                        "{}..{} -> {:?}",
                        pos(&parsed, e.span.start()),
                        pos(&parsed, e.span.end()),
                        e.text
                    )
                })
                .collect();
            let _ = writeln!(out, "    fix: {} [{}]", f.title, edits.join("; "));
        }
    }
    (out, ev, parsed)
}

/// The codes an invalid fixture names on its first line: `# expect-code: P0001 P0002`.
fn expected_codes(source: &str) -> Vec<String> {
    source
        .lines()
        .next()
        .and_then(|l| l.strip_prefix("# expect-code:"))
        .map(|rest| rest.split_whitespace().map(str::to_owned).collect())
        .unwrap_or_default()
}

fn check_file(kind: &str, path: &Path) {
    let source = read(path);
    let (rendered, ev, _) = render(&source);
    let name = format!("{kind}__{}", stem(path));
    insta::with_settings!({
        input_file => path,
        omit_expression => true,
        description => format!("fixtures/parse/{kind}/{}.parax", stem(path)),
    }, {
        insta::assert_snapshot!(name, rendered);
    });
    let errors: Vec<_> = ev
        .diagnostics
        .iter()
        .filter(|d| d.severity == Severity::Error)
        .map(|d| d.code)
        .collect();
    if kind == "valid" {
        assert!(errors.is_empty(), "{}: errors {errors:?}", path.display());
    } else {
        assert!(!errors.is_empty(), "{}: no error reported", path.display());
        let want = expected_codes(&source);
        assert!(
            !want.is_empty(),
            "{}: first line must be `# expect-code: P…`",
            path.display()
        );
        for code in want {
            assert!(
                ev.diagnostics.iter().any(|d| d.code == code),
                "{}: expected {code}, got {:?}",
                path.display(),
                ev.diagnostics.iter().map(|d| d.code).collect::<Vec<_>>()
            );
        }
    }
}

/// Run `check_file` on every file of a folder; report every failing file at once.
fn run_folder(kind: &str, min_files: usize) {
    let files = parax_files(&fixtures_dir().join(kind));
    assert!(
        files.len() >= min_files,
        "{kind}: only {} fixtures",
        files.len()
    );
    let failed: Vec<String> = files
        .iter()
        .filter(|p| catch_unwind(AssertUnwindSafe(|| check_file(kind, p))).is_err())
        .map(|p| stem(p))
        .collect();
    assert!(failed.is_empty(), "{kind} fixtures failed: {failed:?}");
}

#[test]
fn valid_fixtures() {
    run_folder("valid", 8);
}

#[test]
fn invalid_fixtures() {
    run_folder("invalid", 8);
}

/// The first diagnostic with `code` in an invalid fixture, as (line, col).
fn first_position(stem: &str, code: &str) -> (usize, usize) {
    let path = fixtures_dir().join("invalid").join(format!("{stem}.parax"));
    let (parsed, ev) = evaluate_source(&read(&path));
    let d = ev
        .diagnostics
        .iter()
        .find(|d| d.code == code)
        .unwrap_or_else(|| panic!("{stem}: no {code}"));
    parsed.index.line_col(&parsed.source, d.span.start())
}

#[test]
fn error_positions_in_line_and_column() {
    // `eyes right` on line 3: the unknown block word starts the line.
    assert_eq!(first_position("unknown-block", "P0002"), (3, 1));
    // `  refraction -1.00 $ 3`: the `$` is the 20th character.
    assert_eq!(first_position("stray-character", "P0001"), (3, 20));
    // The unterminated string starts at its opening quote.
    assert_eq!(first_position("unterminated-string", "P0004"), (3, 8));
    // Columns count characters: five multi-byte characters precede the `¤`.
    assert_eq!(first_position("non-ascii-column", "P0001"), (4, 20));
    // The vertex `12` without unit, after `@ `.
    assert_eq!(first_position("missing-unit", "P0201"), (3, 35));
}

#[test]
fn fixtures_cover_the_notation() {
    let valid = parax_files(&fixtures_dir().join("valid"));
    let sources: Vec<String> = valid.iter().map(|p| read(p)).collect();
    let mut kinds = std::collections::BTreeSet::new();
    for s in &sources {
        kinds.extend(parax_syntax::parse(s).blocks.iter().map(|b| b.kind));
    }
    assert_eq!(
        kinds.len(),
        parax_syntax::BlockKind::ALL.len(),
        "block kinds covered: {kinds:?}"
    );
    let all = sources.concat();
    assert!(all.contains("\neye right 2025-03-01"), "a dated eye block");
    for needle in ["°", "Δ", "×", "\u{2212}", "ë", "\t", "\r\n"] {
        assert!(all.contains(needle), "no valid fixture contains {needle:?}");
    }
    // The CRLF fixture must still have CRLF (and only CRLF) line breaks.
    let crlf = read(&fixtures_dir().join("valid/crlf-line-endings.parax"));
    assert_eq!(crlf.matches('\n').count(), crlf.matches("\r\n").count());
    assert!(crlf.contains("\r\n"));
    // Every valid fixture has comments, and most have trailing ones.
    let trailing = sources
        .iter()
        .filter(|s| {
            parax_syntax::parse(s)
                .lines
                .iter()
                .any(|l| l.comment.is_some() && !matches!(l.kind, LineKind::Trivia))
        })
        .count();
    assert!(
        trailing * 2 > sources.len(),
        "only {trailing} fixtures have trailing comments"
    );
}
