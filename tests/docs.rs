//! The documentation agrees with the code: every keyword of every block is
//! documented in that block's section of docs/notation.md (with the block's header
//! form and, in its table row, whether it repeats and whether it is evaluated), and
//! docs/diagnostics.md is what the code table (`parax_eval::codes::ALL`) generates
//! below its hand-written introduction.

use parax_eval::codes;
use parax_eval::schema::{self, KeywordSpec};
use parax_syntax::BlockKind;
use std::path::PathBuf;

/// The repository's root.
fn repo() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("..")
}

fn read_doc(name: &str) -> String {
    let path = repo().join("docs").join(name);
    std::fs::read_to_string(&path).unwrap_or_else(|e| panic!("cannot read {}: {e}", path.display()))
}

/// The lines of the level-2 section whose heading line is exactly `heading`, up to
/// (not including) the next level-2 heading.
fn section<'a>(text: &'a str, heading: &str) -> Option<Vec<&'a str>> {
    let mut lines = text.lines().skip_while(|l| l.trim_end() != heading);
    lines.next()?;
    Some(lines.take_while(|l| !l.starts_with("## ")).collect())
}

/// The heading of a block's section in docs/notation.md.
fn block_heading(kind: BlockKind) -> String {
    format!("## The `{}` block", kind.keyword())
}

/// The cells of a Markdown table row, trimmed; `\|` inside a cell is kept as `|`.
fn cells(row: &str) -> Vec<String> {
    let row = row.trim().trim_start_matches('|').trim_end_matches('|');
    row.replace("\\|", "\u{0}")
        .split('|')
        .map(|c| c.replace('\u{0}', "|").trim().to_owned())
        .collect()
}

fn yes_no(b: bool) -> &'static str {
    if b {
        "yes"
    } else {
        "no"
    }
}

#[test]
fn every_keyword_is_documented_in_its_block_section() {
    let doc = read_doc("notation.md");
    let mut problems = Vec::new();
    for kind in BlockKind::ALL {
        let heading = block_heading(kind);
        let Some(lines) = section(&doc, &heading) else {
            problems.push(format!("no section `{heading}`"));
            continue;
        };
        let body = lines.join("\n");
        let header = format!("`{} {}`", kind.keyword(), schema::header_form(kind));
        if !body.contains(&header) {
            problems.push(format!("{heading}: header form {header} is not documented"));
        }
        for spec in schema::keywords(kind) {
            check_keyword(&heading, &lines, &body, spec, &mut problems);
        }
    }
    assert!(
        problems.is_empty(),
        "docs/notation.md is out of date:\n{}",
        problems.join("\n")
    );
}

fn check_keyword(
    heading: &str,
    lines: &[&str],
    body: &str,
    spec: &KeywordSpec,
    problems: &mut Vec<String>,
) {
    let name = format!("`{}`", spec.name);
    if !body.contains(&name) {
        problems.push(format!("{heading}: keyword {name} is not documented"));
        return;
    }
    // The keyword's row in the block's table: | `name` | form | meaning | repeatable | … | evaluated |
    let Some(row) = lines
        .iter()
        .map(|l| cells(l))
        .find(|c| c.first().map(String::as_str) == Some(name.as_str()))
    else {
        problems.push(format!("{heading}: keyword {name} has no row in the table"));
        return;
    };
    if row.len() != 8 {
        problems.push(format!(
            "{heading}: the row of {name} has {} cells, not 8",
            row.len()
        ));
        return;
    }
    if row[3] != yes_no(spec.repeatable) {
        problems.push(format!(
            "{heading}: {name} is documented as repeatable `{}`, the schema says `{}`",
            row[3],
            yes_no(spec.repeatable)
        ));
    }
    if row[7] != yes_no(spec.evaluated) {
        problems.push(format!(
            "{heading}: {name} is documented as evaluated `{}`, the schema says `{}`",
            row[7],
            yes_no(spec.evaluated)
        ));
    }
}

/// The line after which docs/diagnostics.md is generated from the code table.
const GENERATED: &str = "<!-- Generated below this line from the table in crates/eval/src/codes.rs: edit the table, then run `PARAX_BLESS=1 cargo test -p parax-tests --test docs`. -->";

/// `Severity: warning; error for a surface that does not exist.`
fn severity_line(info: &codes::CodeInfo) -> String {
    let mut line = format!("Severity: {}", info.severity.name());
    for (severity, when) in info.also {
        line.push_str(&format!("; {} {when}", severity.name()));
    }
    line.push('.');
    line
}

/// The page: the hand-written introduction, then per code its heading, the
/// explanation, the severities and the example, all from the table.
fn diagnostics_page(introduction: &str) -> String {
    let mut page = format!("{introduction}{GENERATED}\n");
    for info in codes::ALL {
        page.push_str(&format!("\n## {} {}\n\n", info.code, info.title));
        if !info.about.is_empty() {
            page.push_str(info.about);
            page.push_str("\n\n");
        }
        page.push_str(&severity_line(info));
        page.push('\n');
        if !info.example.is_empty() {
            page.push('\n');
            page.push_str(info.example);
            page.push('\n');
        }
    }
    page
}

/// Whether the `PARAX_BLESS` variable asks to rewrite generated files.
fn bless() -> bool {
    std::env::var_os("PARAX_BLESS").is_some_and(|v| !v.is_empty() && v != "0")
}

#[test]
fn diagnostics_page_is_generated_from_the_code_table() {
    let path = repo().join("docs/diagnostics.md");
    let doc = read_doc("diagnostics.md");
    let introduction = doc.split(GENERATED).next().unwrap_or_default();
    assert!(
        doc.contains(GENERATED),
        "docs/diagnostics.md lacks the line `{GENERATED}` that ends its hand-written introduction"
    );
    let want = diagnostics_page(introduction);
    if want == doc {
        return;
    }
    if bless() {
        std::fs::write(&path, &want).expect("write docs/diagnostics.md");
        return;
    }
    let line = want
        .lines()
        .zip(doc.lines())
        .position(|(a, b)| a != b)
        .unwrap_or(want.lines().count().min(doc.lines().count()));
    panic!(
        "docs/diagnostics.md differs from the code table in crates/eval/src/codes.rs from line {}: \
         regenerate it with `PARAX_BLESS=1 cargo test -p parax-tests --test docs`",
        line + 1
    );
}

#[test]
fn every_code_has_a_severity_it_is_raised_with_and_a_distinct_string() {
    let mut seen = std::collections::HashSet::new();
    for (i, info) in codes::ALL.iter().enumerate() {
        assert_eq!(info.code.index(), i, "{} out of table order", info.code);
        assert!(seen.insert(info.code.as_str()), "{} twice", info.code);
        assert_eq!(codes::Code::parse(info.code.as_str()), Some(info.code));
        assert!(info.code.allows(info.severity));
        for (s, when) in info.also {
            assert_ne!(
                *s, info.severity,
                "{}: `also` repeats the default",
                info.code
            );
            assert!(
                !when.is_empty(),
                "{}: say when it is {}",
                info.code,
                s.name()
            );
        }
    }
}
