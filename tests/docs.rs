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
    if !info.severity_when.is_empty() {
        line.push_str(&format!(" {}", info.severity_when));
    }
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
fn code_table_is_in_order_with_distinct_codes_and_stated_severities() {
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

/// README.md and every page in docs/, as (path relative to the root, text).
fn pages() -> Vec<(String, String)> {
    let mut names = vec!["README.md".to_owned()];
    let mut docs: Vec<String> = std::fs::read_dir(repo().join("docs"))
        .expect("docs/")
        .map(|e| {
            e.expect("a folder entry")
                .file_name()
                .to_string_lossy()
                .into_owned()
        })
        .filter(|n| n.ends_with(".md"))
        .map(|n| format!("docs/{n}"))
        .collect();
    docs.sort();
    names.extend(docs);
    names
        .into_iter()
        .map(|n| {
            let text = std::fs::read_to_string(repo().join(&n))
                .unwrap_or_else(|e| panic!("cannot read {n}: {e}"));
            (n, text)
        })
        .collect()
}

/// A fenced block whose first line is `$ parax …`: the command, its documented
/// output and the line of the command in its page.
struct Transcript {
    line: usize,
    command: String,
    output: Vec<String>,
}

/// The transcripts of a page: every fenced block (any info string) whose first
/// line starts with `$ parax `.
fn transcripts(text: &str) -> Vec<Transcript> {
    let mut found = Vec::new();
    let mut lines = text.lines().enumerate();
    while let Some((_, l)) = lines.next() {
        if !l.starts_with("```") {
            continue;
        }
        let body: Vec<(usize, &str)> = lines
            .by_ref()
            .take_while(|(_, l)| !l.starts_with("```"))
            .collect();
        if let Some(((n, first), rest)) = body.split_first() {
            if let Some(command) = first.strip_prefix("$ ").filter(|c| c.starts_with("parax ")) {
                found.push(Transcript {
                    line: n + 1,
                    command: command.to_owned(),
                    output: rest.iter().map(|(_, l)| l.to_string()).collect(),
                });
            }
        }
    }
    found
}

/// Whether the documented lines match the real ones: lines compare without
/// trailing white space, and a line that is only `…` stands for any number of
/// real lines (an elision, so a page may show part of a long output).
fn matches(doc: &[String], real: &[&str]) -> bool {
    match doc.split_first() {
        None => real.is_empty(),
        Some((first, rest)) if first.trim() == "…" => {
            (0..=real.len()).any(|skip| matches(rest, &real[skip..]))
        }
        Some((first, rest)) => real
            .split_first()
            .is_some_and(|(r, more)| r.trim_end() == first.trim_end() && matches(rest, more)),
    }
}

/// The `parax` binary: `PARAX_BIN`, else the one cargo built beside this test
/// (`cargo test --workspace` builds it before running the tests).
fn parax_binary() -> PathBuf {
    if let Some(p) = std::env::var_os("PARAX_BIN") {
        return PathBuf::from(p);
    }
    let exe = std::env::current_exe().expect("the test's path");
    let bin = exe
        .parent()
        .and_then(|deps| deps.parent())
        .expect("target/debug/deps")
        .join(format!("parax{}", std::env::consts::EXE_SUFFIX));
    let built = std::fs::metadata(&bin).and_then(|m| m.modified());
    let newest_source =
        walk_newest(&repo().join("crates")).max(walk_newest(&repo().join("grammar")));
    match built {
        Ok(t) if newest_source.is_none_or(|s| s <= t) => bin,
        _ => panic!(
            "{} is missing or older than the sources: build it first (`cargo build -p parax-cli`, \
             or run `cargo test --workspace`), or point PARAX_BIN at a parax binary",
            bin.display()
        ),
    }
}

/// The latest modification time of a source file (`.rs`, `.pest`, `.toml`) under `dir`.
fn walk_newest(dir: &std::path::Path) -> Option<std::time::SystemTime> {
    let mut newest = None;
    let Ok(entries) = std::fs::read_dir(dir) else {
        return None;
    };
    for e in entries.flatten() {
        let p = e.path();
        if p.is_dir() {
            if p.file_name()
                .is_some_and(|n| n != "target" && n != "node_modules")
            {
                newest = newest.max(walk_newest(&p));
            }
        } else if p
            .extension()
            .is_some_and(|x| x == "rs" || x == "pest" || x == "toml")
        {
            newest = newest.max(e.metadata().and_then(|m| m.modified()).ok());
        }
    }
    newest
}

#[test]
fn documented_parax_output_is_the_real_output() {
    let bin = parax_binary();
    let bin_dir = bin.parent().expect("the binary's folder").to_owned();
    let path = std::env::join_paths(std::iter::once(bin_dir).chain(std::env::split_paths(
        &std::env::var_os("PATH").unwrap_or_default(),
    )))
    .expect("PATH");
    let mut problems = Vec::new();
    let mut checked = 0;
    for (page, text) in pages() {
        for t in transcripts(&text) {
            checked += 1;
            // As typed at a shell in the repository's root, standard error
            // interleaved with standard output as a terminal shows them.
            let out = std::process::Command::new("sh")
                .arg("-c")
                .arg(format!("{} 2>&1", t.command))
                .current_dir(repo())
                .env("PATH", &path)
                .env_remove("RAYON_NUM_THREADS")
                .output()
                .expect("run sh");
            let real = String::from_utf8_lossy(&out.stdout);
            let real: Vec<&str> = real.lines().collect();
            let mut doc = t.output.clone();
            while doc.last().is_some_and(|l| l.trim().is_empty()) {
                doc.pop();
            }
            let mut real_trimmed = real.clone();
            while real_trimmed.last().is_some_and(|l| l.trim().is_empty()) {
                real_trimmed.pop();
            }
            if !matches(&doc, &real_trimmed) {
                problems.push(format!(
                    "{page}:{}: `$ {}` prints:\n{}\n",
                    t.line,
                    t.command,
                    real_trimmed.join("\n")
                ));
            }
        }
    }
    assert!(checked >= 8, "only {checked} `$ parax` transcripts found");
    assert!(
        problems.is_empty(),
        "documented output differs from the real output (a `…` line stands for any lines):\n{}",
        problems.join("\n")
    );
}

/// GitHub's anchor of a heading: lower case, punctuation other than `-` and `_`
/// dropped, spaces as `-`.
fn anchor(heading: &str) -> String {
    heading
        .trim()
        .to_lowercase()
        .chars()
        .filter(|c| c.is_alphanumeric() || *c == '-' || *c == '_' || *c == ' ')
        .map(|c| if c == ' ' { '-' } else { c })
        .collect()
}

/// The anchors of a Markdown page's headings (outside fenced blocks).
fn anchors(text: &str) -> Vec<String> {
    let mut in_fence = false;
    let mut found = Vec::new();
    for l in text.lines() {
        if l.starts_with("```") {
            in_fence = !in_fence;
        } else if !in_fence && l.starts_with('#') {
            found.push(anchor(l.trim_start_matches('#')));
        }
    }
    found
}

#[test]
fn relative_links_resolve() {
    let link = |s: &str| -> Vec<String> {
        // `](target)` outside code spans is enough for these pages.
        s.match_indices("](")
            .filter_map(|(i, _)| s[i + 2..].split_once(')').map(|(t, _)| t.to_owned()))
            .collect()
    };
    let mut problems = Vec::new();
    let mut checked = 0;
    for (page, text) in pages() {
        let dir = repo().join(&page).parent().expect("a folder").to_owned();
        let mut in_fence = false;
        for l in text.lines() {
            if l.starts_with("```") {
                in_fence = !in_fence;
            }
            if in_fence {
                continue;
            }
            for target in link(l) {
                if target.contains("://") || target.starts_with("mailto:") {
                    continue;
                }
                checked += 1;
                let (file, frag) = target.split_once('#').unwrap_or((&target, ""));
                let file_path = if file.is_empty() {
                    repo().join(&page)
                } else {
                    dir.join(file)
                };
                if !file_path.exists() {
                    problems.push(format!(
                        "{page}: link `{target}`: no file {}",
                        file_path.display()
                    ));
                    continue;
                }
                if !frag.is_empty() && file_path.extension().is_some_and(|x| x == "md") {
                    let target_text = std::fs::read_to_string(&file_path).unwrap_or_default();
                    if !anchors(&target_text).iter().any(|a| a == frag) {
                        problems.push(format!(
                            "{page}: link `{target}`: no heading with anchor `#{frag}`"
                        ));
                    }
                }
            }
        }
    }
    assert!(checked >= 10, "only {checked} relative links found");
    assert!(problems.is_empty(), "{}", problems.join("\n"));
}

#[test]
fn documented_sarif_result_is_a_real_result() {
    // docs/commands.md shows one SARIF result, laid out by hand, below a line
    // naming the command; as JSON it must equal one result of the real log.
    let doc = read_doc("commands.md");
    let lead = "One result from `parax check --format sarif ";
    let at = doc.find(lead).expect("the SARIF example's lead line");
    let rest = &doc[at + lead.len()..];
    let (file, rest) = rest.split_once('`').expect("the command's end");
    let block = rest
        .split_once("```json\n")
        .and_then(|(_, b)| b.split_once("```"))
        .map(|(b, _)| b)
        .expect("a ```json block after the lead line");
    let shown: serde_json::Value = serde_json::from_str(block).expect("the example is JSON");
    let out = std::process::Command::new(parax_binary())
        .args(["check", "--format", "sarif", file])
        .current_dir(repo())
        .output()
        .expect("run parax");
    let log: serde_json::Value = serde_json::from_slice(&out.stdout).expect("a SARIF log");
    let results = log["runs"][0]["results"].as_array().expect("results");
    assert!(
        results.contains(&shown),
        "docs/commands.md's SARIF result is not among the real ones:\n{}",
        serde_json::to_string_pretty(results).unwrap_or_default()
    );
}
