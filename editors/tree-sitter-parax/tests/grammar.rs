//! The tree-sitter grammar against the project's own parser and files.
//!
//! * Every example and fixture (`examples/`, `tests/fixtures/parse/`, the language
//!   server's and the CLI's test data) is parsed by tree-sitter and by
//!   `parax_syntax::parse` (pest, the authoritative grammar). Each line is
//!   reduced to what both trees say about it (header, statement or trivia; the
//!   keyword; every value's kind and byte range, the unit of a number; the
//!   comment) and the two must agree. A file that pest reads without error must
//!   give a tree without ERROR or MISSING nodes; a line pest rejects must lie
//!   under an ERROR node, and lines tree-sitter reads cleanly must agree with pest.
//! * The corpus (`test/corpus/*.txt`, the tree-sitter CLI's test format) is run
//!   here as well, so `cargo test` needs no generator: each input's tree must print as the
//!   S-expression recorded under it.
//! * The highlight queries compile, and give the captures expected on a snippet.
//!
//! Reference for every expectation: grammar/parax.pest and docs/notation.md [S].

mod common;

use common::{error_rows, parse, pest_lines, tree_lines};
use std::path::{Path, PathBuf};
use streaming_iterator::StreamingIterator;
use tree_sitter::{Query, QueryCursor};

fn root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..")
}

/// Every `.parax` file the project keeps as an example or test input.
fn case_files() -> Vec<PathBuf> {
    let dirs = [
        "examples",
        "tests/fixtures/parse/valid",
        "tests/fixtures/parse/invalid",
        "crates/lsp/tests/fixtures",
        "crates/cli/tests/data",
        "editors/vscode/test",
    ];
    let mut files = Vec::new();
    for dir in dirs {
        let mut stack = vec![root().join(dir)];
        while let Some(d) = stack.pop() {
            for entry in std::fs::read_dir(&d).unwrap_or_else(|e| panic!("{}: {e}", d.display())) {
                let path = entry.unwrap().path();
                if path.is_dir() {
                    stack.push(path);
                } else if path.extension().is_some_and(|e| e == "parax") {
                    files.push(path);
                }
            }
        }
    }
    files.sort();
    files
}

#[test]
fn reads_every_example_and_fixture_as_the_pest_grammar_does() {
    let files = case_files();
    assert!(files.len() >= 30, "only {} case files found", files.len());
    let (mut clean, mut with_errors) = (0, 0);
    // Lines compared; lines pest reads but tree-sitter puts under an ERROR.
    let (mut compared, mut spilled) = (0, 0);
    for path in &files {
        let source = std::fs::read_to_string(path).unwrap();
        let name = path
            .strip_prefix(root())
            .unwrap_or(path)
            .display()
            .to_string();
        let pest = pest_lines(&source);
        let tree = parse(&source);
        let ts = tree_lines(&tree, &source, pest.len());
        let errors = error_rows(&tree, &source);
        if pest.iter().all(Option::is_some) {
            clean += 1;
            assert!(
                !tree.root_node().has_error(),
                "{name}: pest reads it, tree-sitter has errors on lines {:?}:\n{}",
                errors.iter().map(|r| r + 1).collect::<Vec<_>>(),
                tree.root_node().to_sexp()
            );
        } else {
            with_errors += 1;
        }
        for (row, (p, t)) in pest.iter().zip(&ts).enumerate() {
            match p {
                None => assert!(
                    errors.contains(&row),
                    "{name}:{}: pest rejects the line, tree-sitter reads it as {t:?}",
                    row + 1
                ),
                Some(p) if !errors.contains(&row) => {
                    assert_eq!(p, t, "{name}:{}: the two grammars differ", row + 1);
                    compared += 1;
                }
                Some(_) => {
                    eprintln!("{name}:{}: under an ERROR node, read by pest", row + 1);
                    spilled += 1;
                }
            }
        }
    }
    eprintln!("{clean} clean files, {with_errors} with errors, {compared} lines compared, {spilled} spilled");
    assert!(
        clean >= 20 && with_errors >= 2,
        "{clean} clean, {with_errors} with errors"
    );
    assert!(compared >= 500, "only {compared} lines compared");
    // Error recovery may take a neighbouring line along, never many.
    assert!(
        spilled <= with_errors,
        "{spilled} readable lines under ERROR nodes"
    );
}

/// Normalise an S-expression's white space, as the tree-sitter CLI does.
fn squash(sexp: &str) -> String {
    let mut out = String::new();
    for word in sexp.split_whitespace() {
        if !out.is_empty() && !word.starts_with(')') {
            out.push(' ');
        }
        out.push_str(word);
    }
    out
}

/// The corpus files' cases: (file:name, input, expected tree).
fn corpus() -> Vec<(String, String, String)> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("test/corpus");
    let mut cases = Vec::new();
    let mut paths: Vec<_> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|e| e == "txt"))
        .collect();
    paths.sort();
    for path in paths {
        let text = std::fs::read_to_string(&path).unwrap();
        let file = path.file_name().unwrap().to_string_lossy().to_string();
        // Format: a line of `=`, the name, a line of `=`, the input, a line of `-`,
        // the expected S-expression; then the next case. (Hand-read rather than a
        // dependency: the format is these three separators and nothing else.)
        let lines: Vec<&str> = text.lines().collect();
        let is_rule = |l: &str, c: char| l.len() >= 3 && l.chars().all(|x| x == c);
        let mut i = 0;
        while i < lines.len() {
            if !is_rule(lines[i], '=') {
                i += 1;
                continue;
            }
            let name = lines[i + 1].trim().to_owned();
            assert!(
                is_rule(lines[i + 2], '='),
                "{file}: {name}: header not closed"
            );
            let mut j = i + 3;
            let mut input = Vec::new();
            while !is_rule(lines[j], '-') {
                input.push(lines[j]);
                j += 1;
            }
            let mut k = j + 1;
            let mut expected = Vec::new();
            while k < lines.len() && !is_rule(lines[k], '=') {
                expected.push(lines[k]);
                k += 1;
            }
            // The CLI drops the line break before the `---` line.
            cases.push((
                format!("{file}: {name}"),
                input.join("\n"),
                squash(&expected.join("\n")),
            ));
            i = k;
        }
    }
    cases
}

#[test]
fn corpus_cases_give_their_recorded_trees() {
    let cases = corpus();
    assert!(cases.len() >= 12, "only {} corpus cases", cases.len());
    for (name, input, expected) in cases {
        let tree = parse(&input);
        assert_eq!(squash(&tree.root_node().to_sexp()), expected, "{name}");
    }
}

/// (captured text, capture name) for each capture of `query` on `source`, in order.
fn captures(query_source: &str, source: &str) -> Vec<(String, String)> {
    let language = tree_sitter_parax::LANGUAGE.into();
    let query = Query::new(&language, query_source).expect("the query compiles");
    let tree = parse(source);
    let mut cursor = QueryCursor::new();
    let mut out = Vec::new();
    let mut caps = cursor.captures(&query, tree.root_node(), source.as_bytes());
    while let Some((m, index)) = caps.next() {
        let cap = m.captures[*index];
        out.push((
            cap.node.utf8_text(source.as_bytes()).unwrap().to_owned(),
            query.capture_names()[cap.index as usize].to_owned(),
        ));
    }
    out
}

const SNIPPET: &str = "# invented example\neye right 2026-11-18\n  refraction -5.75/-1.50x175 @ 12mm  # trial frame\n  expect mean-k 44.21 D ± 0.01 D\nframe \"thin metal\"\n";

#[test]
fn highlight_captures_on_a_snippet() {
    let got = captures(tree_sitter_parax::HIGHLIGHTS_QUERY, SNIPPET);
    let want: Vec<(String, String)> = [
        ("# invented example", "comment"),
        ("eye", "keyword"),
        ("right", "constant"),
        ("2026-11-18", "string.special"),
        ("refraction", "property"),
        ("-5.75", "number"),
        ("/", "punctuation.delimiter"),
        ("-1.50", "number"),
        ("x", "operator"),
        ("175", "number"),
        ("@", "punctuation.delimiter"),
        ("12", "number"),
        ("mm", "type.builtin"),
        ("# trial frame", "comment"),
        ("expect", "property"),
        ("mean-k", "constant"),
        ("44.21", "number"),
        ("D", "type.builtin"),
        ("±", "punctuation.delimiter"),
        ("0.01", "number"),
        ("D", "type.builtin"),
        ("frame", "keyword"),
        ("\"thin metal\"", "string"),
    ]
    .iter()
    .map(|(a, b)| (a.to_string(), b.to_string()))
    .collect();
    assert_eq!(got, want);
}

#[test]
fn helix_query_captures_the_same_nodes() {
    let standard = captures(tree_sitter_parax::HIGHLIGHTS_QUERY, SNIPPET);
    let helix = captures(tree_sitter_parax::HELIX_HIGHLIGHTS_QUERY, SNIPPET);
    let texts = |v: &[(String, String)]| v.iter().map(|(t, _)| t.clone()).collect::<Vec<_>>();
    assert_eq!(texts(&standard), texts(&helix));
    assert!(helix.contains(&("-5.75".to_owned(), "constant.numeric".to_owned())));
    assert!(helix.contains(&("refraction".to_owned(), "variable.other.member".to_owned())));
}

#[test]
fn node_types_name_every_highlighted_node() {
    for kind in [
        "header",
        "statement",
        "comment",
        "block_kind",
        "keyword",
        "quantity",
        "number",
        "unit",
        "string",
        "date",
        "axis_sign",
        "symbol",
        "word",
        "indent",
    ] {
        assert!(
            tree_sitter_parax::NODE_TYPES.contains(&format!("\"type\": \"{kind}\"")),
            "node-types.json lacks {kind}"
        );
    }
}
