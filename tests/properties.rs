//! Properties of the parser, evaluator and formatter on arbitrary input: nothing
//! panics, every span is a valid slice, `fmt` is idempotent, and on every fixture and
//! example `fmt` is lossless (same comments, statements, derived values and
//! diagnostic codes). Inputs mix arbitrary Unicode with the notation's own tokens so
//! that most of them get past the first character.

mod support;

use parax_eval::evaluate_source;
use parax_syntax::{format::format, parse, LineKind, Parsed, ValueKind};
use proptest::prelude::*;
use proptest::test_runner::FileFailurePersistence;
use support::{all_case_files, read};

const KEYWORDS: &[&str] = &[
    "case",
    "eye",
    "frame",
    "spectacle-lens",
    "contact-lens",
    "system",
    "model-eye",
    "eyes",
    "refraction",
    "add",
    "keratometry",
    "keratometric-index",
    "posterior-radius",
    "corneal-thickness",
    "axial-length",
    "pd",
    "age",
    "date",
    "note",
    "tag",
    "vertex",
    "pantoscopic-tilt",
    "face-form",
    "prism",
    "power",
    "measured",
    "index",
    "base-curve",
    "kind",
    "diameter",
    "object",
    "lens",
    "gap",
    "surface",
    "from",
    "expect",
    "refractoin",
    "right",
    "left",
    "before",
    "after",
    "at",
    "infinity",
    "rigid",
    "soft",
    "le-grand",
    "BU",
    "A",
    "L1",
    "spherical-equivalent",
    "image",
    "magnification",
    "mean-k",
    "equivalent-power",
];
const UNITS: &[&str] = &[
    "mm", "cm", "m", "deg", "DS", "DC", "D", "prism", "y", "°", "Δ", "%",
];
const MARKS: &[&str] = &[
    "/", "x", "X", "×", "@", ",", "±", "+/-", "#", "\"", "\\", "-", "+", "−", ".", "$", "'",
];
const SPACE: &[&str] = &[
    " ", "  ", "\t", "\n", "\n", "\n  ", "\n  ", "\n\t", "\r\n", "\r", "\u{a0}", "\n\n",
];

/// One token of the notation, or something close to it, or anything at all.
fn token() -> impl Strategy<Value = String> {
    prop_oneof![
        4 => prop::sample::select(KEYWORDS).prop_map(str::to_owned),
        3 => prop::sample::select(SPACE).prop_map(str::to_owned),
        3 => "[+−-]?[0-9]{1,3}(\\.[0-9]{0,3})?",
        2 => prop::sample::select(UNITS).prop_map(|u| format!(" {u}")),
        2 => prop::sample::select(MARKS).prop_map(str::to_owned),
        1 => "[0-9]{4}-[0-9]{2}-[0-9]{2}",
        1 => "\"[^\"\n]{0,8}\"",
        1 => "# [^\n]{0,10}",
        2 => any::<String>().prop_map(|s| s.chars().take(4).collect()),
    ]
}

/// A line shaped like the notation: optional indent, keyword, values, comment.
fn line() -> impl Strategy<Value = String> {
    (
        prop::sample::select(&["", "", "  ", "    ", "\t", " "][..]),
        prop::sample::select(KEYWORDS),
        prop::collection::vec(token(), 0..8),
        prop::option::of("#[^\n]{0,12}"),
    )
        .prop_map(|(indent, kw, values, comment)| {
            let mut s = format!("{indent}{kw}");
            for v in values {
                if !v.starts_with([' ', '\t', '\n', '\r']) {
                    s.push(' ');
                }
                s.push_str(&v);
            }
            if let Some(c) = comment {
                s.push_str("  ");
                s.push_str(&c);
            }
            s
        })
}

/// A whole input: either a soup of tokens or notation-shaped lines.
fn input() -> impl Strategy<Value = String> {
    prop_oneof![
        prop::collection::vec(token(), 0..40).prop_map(|t| t.concat()),
        (prop::collection::vec(line(), 0..12), any::<bool>())
            .prop_map(|(lines, crlf)| { lines.join(if crlf { "\r\n" } else { "\n" }) }),
        any::<String>(),
    ]
}

/// Every span the parser and evaluator hand out must slice the source.
fn assert_spans_slice(parsed: &Parsed, ev: &parax_eval::Evaluation) {
    let src = &parsed.source;
    let ok = |s: parax_syntax::Span| {
        s.start <= s.end
            && s.end() <= src.len()
            && src.is_char_boundary(s.start())
            && src.is_char_boundary(s.end())
    };
    for line in &parsed.lines {
        assert!(ok(line.span), "line span {:?}", line.span);
        if let Some(st) = line.statement() {
            assert!(ok(st.keyword));
            for v in &st.values {
                assert!(ok(v.span), "value span {:?}", v.span);
            }
        }
    }
    for d in &ev.diagnostics {
        assert!(ok(d.span), "{} span {:?}", d.code, d.span);
        let _ = parsed.index.line_col(src, d.span.start());
        for e in d.fix.iter().flat_map(|f| &f.edits) {
            assert!(ok(e.span), "{} fix span {:?}", d.code, e.span);
        }
    }
    for d in &ev.derived {
        assert!(ok(d.span), "{} span {:?}", d.key(), d.span);
    }
}

/// What formatting must keep: comments in order, statements (keyword and value
/// texts; a quantity as number and unit, whatever the spacing between them), lines
/// it cannot read, derived values and diagnostic codes.
#[derive(Debug, PartialEq)]
struct Content {
    comments: Vec<String>,
    statements: Vec<String>,
    derived: Vec<(String, String)>,
    codes: Vec<&'static str>,
}

fn content(source: &str) -> Content {
    let (parsed, ev) = evaluate_source(source);
    let comments = parsed.comments().map(|c| c.trim_end().to_owned()).collect();
    let statements = parsed
        .lines
        .iter()
        .filter_map(|line| match &line.kind {
            LineKind::Trivia => None,
            LineKind::Error { .. } => Some(format!("error: {}", parsed.text(line.span).trim())),
            LineKind::Header { statement, .. } | LineKind::Statement { statement } => {
                let values: Vec<String> = statement
                    .values
                    .iter()
                    .map(|v| match &v.kind {
                        ValueKind::Number { number, unit, .. } => format!(
                            "{}{}",
                            parsed.text(*number),
                            unit.map(|u| format!(" {}", parsed.text(u)))
                                .unwrap_or_default()
                        ),
                        _ => parsed.text(v.span).to_owned(),
                    })
                    .collect();
                let kind = if matches!(line.kind, LineKind::Header { .. }) {
                    "header"
                } else {
                    "statement"
                };
                Some(format!(
                    "{kind} {} [{}]",
                    parsed.keyword(statement),
                    values.join(" | ")
                ))
            }
        })
        .collect();
    let derived = ev.derived.iter().map(|d| (d.key(), d.text())).collect();
    let codes = ev.diagnostics.iter().map(|d| d.code.as_str()).collect();
    Content {
        comments,
        statements,
        derived,
        codes,
    }
}

fn fmt(source: &str) -> String {
    format(&parse(source))
}

proptest! {
    #![proptest_config(ProptestConfig {
        cases: 256,
        // Failing inputs are kept in tests/properties.regressions and replayed first.
        failure_persistence: Some(Box::new(FileFailurePersistence::WithSource("regressions"))),
        ..ProptestConfig::default()
    })]

    #[test]
    fn parse_evaluate_and_format_never_panic(src in input()) {
        let (parsed, ev) = evaluate_source(&src);
        assert_spans_slice(&parsed, &ev);
        let _ = format(&parsed);
        prop_assert_eq!(parsed.lines.len(), parsed.index.line_count());
    }

    #[test]
    fn fmt_is_idempotent(src in input()) {
        let once = fmt(&src);
        let twice = fmt(&once);
        prop_assert_eq!(twice, once);
    }

    #[test]
    fn fmt_is_lossless(src in input()) {
        let formatted = fmt(&src);
        prop_assert_eq!(content(&formatted), content(&src), "formatted: {:?}", formatted);
    }
}

#[test]
fn fmt_is_idempotent_on_fixtures_and_examples() {
    for path in all_case_files() {
        let once = fmt(&read(&path));
        assert_eq!(fmt(&once), once, "{}", path.display());
    }
}

#[test]
fn fmt_is_lossless_on_fixtures_and_examples() {
    let mut changed = 0;
    for path in all_case_files() {
        let source = read(&path);
        let formatted = fmt(&source);
        changed += usize::from(formatted != source);
        let before = content(&source);
        assert!(
            !before.statements.is_empty() && !before.comments.is_empty(),
            "{}: the comparison would be vacuous",
            path.display()
        );
        assert_eq!(
            content(&formatted),
            before,
            "{}:\n{formatted}",
            path.display()
        );
    }
    // Most fixtures are not in canonical layout on purpose, so the check has teeth.
    assert!(changed >= 4, "only {changed} files changed under fmt");
}

#[test]
fn fmt_keeps_the_line_break_style() {
    for path in all_case_files() {
        let source = read(&path);
        let formatted = fmt(&source);
        assert_eq!(
            formatted.contains("\r\n"),
            source.contains("\r\n"),
            "{}",
            path.display()
        );
    }
}

// Regressions found by the properties above, kept as plain examples.

/// A `,` right after the keyword: the formatter glues it to the keyword
/// (`note, x`), which the grammar cannot read (values start after white space).
#[test]
fn fmt_keeps_a_leading_comma_readable() {
    for src in [
        "case\n  note , x\n",
        "eye , right\n",
        "system \"s\"\n  lens ,A +1.00 D\n",
    ] {
        let formatted = fmt(src);
        assert!(
            parse(&formatted).errors.is_empty(),
            "{src:?} formats to unreadable {formatted:?}"
        );
        assert_eq!(
            content(&formatted),
            content(src),
            "{src:?} -> {formatted:?}"
        );
    }
}

/// An unreadable line is kept "verbatim", but with its trailing white space
/// trimmed; when that white space is what made it unreadable (a stray `\r`, a
/// no-break space), formatting turns an error into a block header, and a second
/// pass then adds the blank line before it.
#[test]
fn fmt_keeps_unreadable_lines_unreadable() {
    for src in [
        "case\ncase\r\r\n",
        "case\u{a0}\ncase\n",
        "eye left\n  add +1.00\u{a0}\n",
    ] {
        let once = fmt(src);
        assert_eq!(fmt(&once), once, "not idempotent on {src:?}");
        assert_eq!(content(&once), content(src), "{src:?} -> {once:?}");
    }
}

/// Inputs with every separator the notation does not treat as white space, and
/// the three line breaks, spliced into notation-shaped text.
fn input_with_separators() -> impl Strategy<Value = String> {
    const SEPARATORS: &[&str] = &[
        "\r", "\r\n", "\n", "\u{b}", "\u{c}", "\u{85}", "\u{2028}", "\u{2029}", "\u{a0}", " ", "\t",
    ];
    (
        input(),
        prop::collection::vec(
            (
                any::<prop::sample::Index>(),
                prop::sample::select(SEPARATORS),
            ),
            0..6,
        ),
    )
        .prop_map(|(mut text, inserts)| {
            for (at, sep) in inserts {
                let mut i = at.index(text.len() + 1);
                while !text.is_char_boundary(i) {
                    i -= 1;
                }
                text.insert_str(i, sep);
            }
            text
        })
}

proptest! {
    #![proptest_config(ProptestConfig {
        cases: 256,
        failure_persistence: Some(Box::new(FileFailurePersistence::WithSource("regressions"))),
        ..ProptestConfig::default()
    })]

    /// The invariants the `format` fuzz target asserts (`parax_tests::check_format`):
    /// the reader's lines are the line-break rule's, and formatting is idempotent,
    /// keeps every character but spaces and tabs on its line, and keeps the
    /// evaluation.
    #[test]
    fn fmt_keeps_characters_lines_and_meaning(src in input_with_separators()) {
        if let Err(e) = parax_tests::check_format(&src) {
            return Err(TestCaseError::fail(e));
        }
    }
}

#[test]
fn fmt_keeps_characters_lines_and_meaning_on_fixtures_and_examples() {
    for path in all_case_files() {
        let source = read(&path);
        parax_tests::check_format(&source).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
        // With each separator appended to every line: kept where it stands.
        for sep in ["\u{b}", "\u{c}", "\u{85}", "\u{2028}", "\u{2029}"] {
            let mutated = source.replace('\n', &format!("{sep}\n"));
            parax_tests::check_format(&mutated)
                .unwrap_or_else(|e| panic!("{}: {e}", path.display()));
        }
        // Every line break a lone CR.
        let cr = source.replace("\r\n", "\n").replace('\n', "\r");
        parax_tests::check_format(&cr).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
    }
}
