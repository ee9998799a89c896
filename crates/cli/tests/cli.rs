//! End-to-end tests of the `parax` binary: outputs are snapshotted, exit codes and
//! the closing caution line are asserted. Every command runs in the workspace root
//! so that file names in outputs are the stable `examples/….parax`.

use std::io::Write as _;
use std::path::PathBuf;
use std::process::{Command, Output, Stdio};

const ROOT: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/../..");
const EXAMPLES: [&str; 6] = [
    "examples/bench-relay.parax",
    "examples/clinic-review.parax",
    "examples/contact-lens.parax",
    "examples/dispensing.parax",
    "examples/eye-model.parax",
    "examples/schematic-eyes.parax",
];
/// The caution the help texts end with (crates/cli/src/main.rs).
const CAUTION_HELP: &str =
    "Caution: parax computes values as aids. Verify every value clinically; \
prescribing belongs to a licensed practitioner under local rules.";

fn parax(args: &[&str]) -> Output {
    parax_stdin(args, None)
}

fn parax_stdin(args: &[&str], stdin: Option<&str>) -> Output {
    let mut child = Command::new(env!("CARGO_BIN_EXE_parax"))
        .args(args)
        .current_dir(ROOT)
        .stdin(if stdin.is_some() {
            Stdio::piped()
        } else {
            Stdio::null()
        })
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("the parax binary runs");
    if let Some(input) = stdin {
        child
            .stdin
            .take()
            .expect("piped stdin")
            .write_all(input.as_bytes())
            .expect("write stdin");
    }
    child.wait_with_output().expect("parax finishes")
}

fn code(o: &Output) -> i32 {
    o.status.code().expect("exited normally")
}

fn stdout(o: &Output) -> String {
    String::from_utf8(o.stdout.clone()).expect("UTF-8 stdout")
}

fn stderr(o: &Output) -> String {
    String::from_utf8(o.stderr.clone()).expect("UTF-8 stderr")
}

/// Exit code, stdout and stderr in one text for a snapshot.
fn transcript(o: &Output) -> String {
    format!(
        "exit: {}\n--- stdout\n{}--- stderr\n{}",
        code(o),
        stdout(o),
        stderr(o)
    )
}

fn stem(path: &str) -> &str {
    path.trim_start_matches("examples/")
        .trim_end_matches(".parax")
}

/// The last non-empty line of a text.
fn last_line(s: &str) -> &str {
    s.lines().rev().find(|l| !l.trim().is_empty()).unwrap_or("")
}

/// A fresh folder under the system temp dir, unique to this process and test.
fn temp_dir(test: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("parax-cli-{}-{test}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).expect("create temp dir");
    dir
}

#[test]
fn check_examples_human() {
    let o = parax(&["check", "examples"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    insta::assert_snapshot!("check_examples_human", transcript(&o));
}

#[test]
fn check_examples_json() {
    let o = parax(&["check", "--format", "json", "examples"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let v: serde_json::Value = serde_json::from_slice(&o.stdout).expect("check prints JSON");
    assert_eq!(v["files"].as_array().map(Vec::len), Some(6));
    insta::assert_snapshot!("check_examples_json", transcript(&o));
}

#[test]
fn eval_examples_human() {
    for file in EXAMPLES {
        let o = parax(&["eval", file]);
        assert_eq!(code(&o), 0, "{file}: {}", stderr(&o));
        insta::assert_snapshot!(format!("eval_human__{}", stem(file)), transcript(&o));
    }
}

#[test]
fn eval_explain() {
    let o = parax(&["eval", "--explain", "examples/clinic-review.parax"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let out = stdout(&o);
    assert!(out.contains("formula: "), "--explain shows formulas");
    insta::assert_snapshot!("eval_explain__clinic-review", transcript(&o));
}

#[test]
fn eval_examples_json() {
    for file in EXAMPLES {
        let o = parax(&["eval", "--format", "json", file]);
        assert_eq!(code(&o), 0, "{file}: {}", stderr(&o));
        let v: serde_json::Value = serde_json::from_slice(&o.stdout).expect("eval prints JSON");
        assert!(
            !v["derived"].as_array().expect("a derived list").is_empty(),
            "{file}"
        );
        insta::assert_snapshot!(format!("eval_json__{}", stem(file)), transcript(&o));
    }
}

#[test]
fn fmt_check_examples_is_clean() {
    let o = parax(&["fmt", "--check", "examples"]);
    assert_eq!(code(&o), 0, "{}{}", stdout(&o), stderr(&o));
    assert_eq!(stdout(&o), "");
    assert_eq!(stderr(&o), "");
}

const MESSY: &str = "\n\n# top comment   \ncase   \"Messy input\"   # title\n    date    2026-01-02\n\n\n\neye right\n\t refraction -4.50/-1.25x10 @12mm\n     keratometry 7.8mm x 180 ,7.6 mm x90   \n  add +2.00#no space\n    # inner comment\neye left\n  oops $ kept verbatim   \nspectacle-lens right\n  prism 2 Δ  BU\n";

#[test]
fn fmt_stdin_to_stdout() {
    let o = parax_stdin(&["fmt", "-"], Some(MESSY));
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let out = stdout(&o);
    insta::assert_snapshot!("fmt_stdin_messy", out);
    // Formatting the output again changes nothing.
    let again = parax_stdin(&["fmt", "-"], Some(&out));
    assert_eq!(stdout(&again), out);
}

#[test]
fn exit_codes() {
    let dir = temp_dir("exit-codes");
    let bad = dir.join("bad.parax");
    std::fs::write(&bad, "eye right\n  refraction -1.00 / -0.50 x 200\n").expect("write");
    let messy = dir.join("messy.parax");
    std::fs::write(&messy, MESSY.replace("  oops $ kept verbatim   \n", "")).expect("write");
    let bad = bad.to_str().expect("UTF-8 temp path");
    let messy = messy.to_str().expect("UTF-8 temp path");

    // 0: clean.
    assert_eq!(code(&parax(&["check", "examples"])), 0);
    assert_eq!(code(&parax(&["eval", EXAMPLES[0]])), 0);
    // 1: a file with an error.
    let o = parax(&["check", bad]);
    assert_eq!(code(&o), 1, "{}", stdout(&o));
    assert!(stdout(&o).contains("P0204"), "{}", stdout(&o));
    assert_eq!(code(&parax(&["check", "examples", bad])), 1);
    assert_eq!(code(&parax(&["eval", bad])), 1);
    assert_eq!(code(&parax(&["fmt", "--check", messy])), 1);
    // 2: a path that does not exist (even next to good files).
    let missing = "no/such/folder/case.parax";
    let o = parax(&["check", missing]);
    assert_eq!(code(&o), 2);
    assert!(stderr(&o).contains(missing), "{}", stderr(&o));
    assert_eq!(code(&parax(&["check", "examples", missing])), 2);
    // 2: a file of 4 GiB or more (sparse: nothing is written) is refused by its
    // size, with P0005, and `fmt` leaves it alone.
    let huge = dir.join("huge.parax");
    std::fs::File::create(&huge)
        .and_then(|f| f.set_len(u64::from(u32::MAX) + 1))
        .expect("sparse file");
    let huge = huge.to_str().expect("UTF-8 temp path");
    let o = parax(&["check", huge]);
    assert_eq!(code(&o), 2);
    assert!(stderr(&o).contains("P0005"), "{}", stderr(&o));
    assert_eq!(code(&parax(&["fmt", huge])), 2);
    assert_eq!(
        std::fs::metadata(huge).expect("still there").len(),
        u64::from(u32::MAX) + 1
    );
    std::fs::remove_file(huge).expect("remove the sparse file");
    assert_eq!(code(&parax(&["eval", missing])), 2);
    assert_eq!(code(&parax(&["fmt", "--check", missing])), 2);
    // 2: usage errors.
    assert_eq!(code(&parax(&["check", "--format", "xml", "examples"])), 2);
    assert_eq!(code(&parax(&[])), 2);

    // `fmt` in place fixes the layout; afterwards the check passes.
    assert_eq!(code(&parax(&["fmt", messy])), 0);
    assert_eq!(code(&parax(&["fmt", "--check", messy])), 0);
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn help_carries_the_caution() {
    for args in [&["--help"][..], &["check", "--help"], &["eval", "--help"]] {
        let o = parax(args);
        assert_eq!(code(&o), 0, "{args:?}");
        let out = stdout(&o);
        assert!(
            out.contains(CAUTION_HELP),
            "{args:?} help lacks the caution:\n{out}"
        );
    }
}

#[test]
fn human_output_ends_with_the_caution_unless_quiet() {
    let caution = format!("caution: {}", parax_eval::GENERAL_CAUTION);
    let mut runs: Vec<Vec<&str>> = vec![vec!["check", "examples"]];
    for file in EXAMPLES {
        runs.push(vec!["check", file]);
        runs.push(vec!["eval", file]);
        runs.push(vec!["eval", "--explain", file]);
    }
    for args in runs {
        let o = parax(&args);
        let out = stdout(&o);
        assert_eq!(last_line(&out), caution, "{args:?}:\n{out}");
        let mut quiet = args.clone();
        quiet.push("-q");
        let q = stdout(&parax(&quiet));
        assert!(
            !q.lines().any(|l| l.starts_with("caution:")),
            "{quiet:?} still prints the caution:\n{q}"
        );
        assert!(
            !q.contains("checked "),
            "{quiet:?} still prints the summary"
        );
    }
    // Also for a file with errors: the caution still closes the report.
    let o = parax(&["check", "tests/fixtures/parse/invalid"]);
    assert_eq!(code(&o), 1);
    assert_eq!(last_line(&stdout(&o)), caution);
}

/// `parax eval` computes and writes the values block by block; its JSON lists
/// exactly the values of the library's full evaluation (`evaluate_source`), in
/// the same order, with the same diagnostics and exit status: on every fixture
/// (valid and with mistakes), on the examples and on a file whose blocks share
/// an id (invented data, read from stdin).
#[test]
fn eval_json_lists_the_full_evaluation_in_order() {
    let mut inputs: Vec<(String, String)> = Vec::new();
    for dir in ["tests/fixtures/parse/valid", "tests/fixtures/parse/invalid"] {
        inputs.extend(parax_testdata::case_files_in(dir));
    }
    for rel in EXAMPLES
        .iter()
        .chain(&["crates/cli/tests/data/mistakes.parax"])
    {
        let text = std::fs::read_to_string(PathBuf::from(ROOT).join(rel)).expect("file");
        inputs.push((rel.to_string(), text));
    }
    let dup =
        "eye right\n  refraction -1.00 / -0.50 x 90\n  expect spherical-equivalent -1.25 D\n\n\
               eye left\n  refraction +1.00\n\n\
               eye right\n  refraction -2.00\n  expect spherical-equivalent -2.00 D\n";
    inputs.push(("-".to_owned(), dup.to_owned()));
    for (arg, text) in &inputs {
        let o = if arg == "-" {
            parax_stdin(&["eval", "--format", "json", "-"], Some(text))
        } else {
            parax(&["eval", "--format", "json", arg])
        };
        let (_, ev) = parax_eval::evaluate_source(text);
        assert_eq!(code(&o), i32::from(ev.has_errors()), "{arg}: exit status");
        let v: serde_json::Value = serde_json::from_slice(&o.stdout).expect("eval prints JSON");
        let got: Vec<(String, String, String)> = v["derived"]
            .as_array()
            .expect("a derived list")
            .iter()
            .map(|d| {
                let s = |k: &str| d[k].as_str().unwrap_or_default().to_owned();
                let sub = d["derivation"]["substituted"].as_str().unwrap_or_default();
                (s("key"), s("text"), sub.to_owned())
            })
            .collect();
        let want: Vec<(String, String, String)> = ev
            .derived
            .iter()
            .map(|d| (d.key(), d.text(), d.derivation.substituted.to_string()))
            .collect();
        assert_eq!(got, want, "{arg}: values");
        let codes: Vec<&str> = v["diagnostics"]
            .as_array()
            .expect("a diagnostics list")
            .iter()
            .map(|d| d["code"].as_str().expect("a code"))
            .collect();
        let want: Vec<&str> = ev.diagnostics.iter().map(|d| d.code.as_str()).collect();
        assert_eq!(codes, want, "{arg}: diagnostics");
    }
}
