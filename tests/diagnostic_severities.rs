//! Every diagnostic raised over the project's case files has a severity its code's
//! table entry (`parax_eval::codes`) allows: the examples, the parser fixtures,
//! the CLI's test data, the language server's fixtures, the cases of docs/cases and the example lines of
//! docs/diagnostics.md. Inside the test suites every other input is covered too:
//! `Diagnostic::new` checks the same in debug builds, so a test that raises a
//! code with a severity its entry does not name panics.

use parax_eval::{codes, evaluate_source, Diagnostic};
use parax_testdata::{case_files_in, CASE_DIRS};

/// Every file that must be checked, as (name, text).
fn inputs() -> Vec<(String, String)> {
    let mut files: Vec<(String, String)> = CASE_DIRS
        .iter()
        .chain(&[
            "crates/cli/tests/data",
            "crates/lsp/tests/fixtures",
            "docs/cases",
        ])
        .flat_map(|dir| case_files_in(dir))
        .collect();
    // The example lines of the reference page: each fenced block of an entry.
    for info in codes::ALL {
        for (i, block) in info.example.split("```").skip(1).step_by(2).enumerate() {
            let text = block.split_once('\n').map_or("", |(_, t)| t);
            files.push((format!("{} example {}", info.code, i + 1), text.to_owned()));
        }
    }
    files
}

fn severities(d: &Diagnostic) -> String {
    let info = d.code.info();
    std::iter::once(info.severity.name())
        .chain(info.also.iter().map(|(s, _)| s.name()))
        .collect::<Vec<_>>()
        .join(" or ")
}

#[test]
fn every_raised_severity_is_one_its_code_allows() {
    let files = inputs();
    assert!(files.len() >= 40, "inputs found: {}", files.len());
    let mut raised = 0;
    let mut problems = Vec::new();
    for (name, text) in &files {
        let (_, ev) = evaluate_source(text);
        for d in &ev.diagnostics {
            raised += 1;
            if !d.code.allows(d.severity) {
                problems.push(format!(
                    "{name}: {} raised as {}, its table entry says {}",
                    d.code,
                    d.severity.name(),
                    severities(d)
                ));
            }
        }
    }
    // The inputs raise diagnostics at all (the check is not vacuous).
    assert!(raised >= 50, "only {raised} diagnostics raised");
    assert!(problems.is_empty(), "{}", problems.join("\n"));
}

#[test]
fn every_other_severity_in_the_table_is_raised_by_some_input() {
    // A severity named in `also` that no input raises would be untested text:
    // each such pair must occur over the inputs above.
    let files = inputs();
    let mut seen = std::collections::HashSet::new();
    for (_, text) in &files {
        for d in evaluate_source(text).1.diagnostics {
            seen.insert((d.code, d.severity));
        }
    }
    let missing: Vec<String> = codes::ALL
        .iter()
        .flat_map(|i| i.also.iter().map(move |(s, w)| (i.code, *s, *w)))
        .filter(|(c, s, _)| !seen.contains(&(*c, *s)))
        .map(|(c, s, w)| format!("{c} as {} ({w})", s.name()))
        .collect();
    assert!(
        missing.is_empty(),
        "no example or fixture raises: {}",
        missing.join("; ")
    );
}
