//! The documentation agrees with the code: every keyword of every block is
//! documented in that block's section of docs/notation.md (with the block's header
//! form and, in its table row, whether it repeats and whether it is evaluated), and
//! every diagnostic code has its heading in docs/diagnostics.md, and no other.

use parax_eval::codes;
use parax_eval::schema::{self, KeywordSpec};
use parax_syntax::BlockKind;
use std::path::PathBuf;

fn read_doc(name: &str) -> String {
    let path = PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("..")
        .join("docs")
        .join(name);
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

#[test]
fn every_code_has_its_heading_in_diagnostics() {
    let doc = read_doc("diagnostics.md");
    let headings: Vec<&str> = doc
        .lines()
        .map(str::trim_end)
        .filter(|l| l.starts_with("## "))
        .collect();
    let mut problems = Vec::new();
    for info in codes::ALL {
        let want = format!("## {} {}", info.code, info.title);
        if !headings.contains(&want.as_str()) {
            problems.push(format!("missing heading `{want}`"));
        }
    }
    // And no heading for a code that does not exist (or whose title changed).
    for h in &headings {
        let Some(code) = h[3..].split_whitespace().next() else {
            continue;
        };
        let looks_like_code = code.len() == 5
            && code.starts_with('P')
            && code[1..].bytes().all(|b| b.is_ascii_digit());
        if looks_like_code
            && !codes::ALL
                .iter()
                .any(|i| format!("## {} {}", i.code, i.title) == *h)
        {
            problems.push(format!(
                "heading `{h}` matches no code in parax_eval::codes::ALL"
            ));
        }
    }
    assert!(
        problems.is_empty(),
        "docs/diagnostics.md is out of date:\n{}",
        problems.join("\n")
    );
}
