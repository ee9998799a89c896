//! `parax eval`: every derived value of one file.

use crate::batch::{self, BatchFormat};
use crate::render::{human, json};
use crate::{files, EvalFormat, Format};
use parax_eval::evaluate_source;
use std::path::{Path, PathBuf};

/// Run `parax eval`; returns the exit status.
pub fn run(path: &Path, format: Format, explain: bool, quiet: bool) -> u8 {
    let source = match files::read(path) {
        Ok(s) => s,
        Err(e) => {
            eprintln!("parax: {e}");
            return 2;
        }
    };
    let name = files::display(path);
    let (parsed, ev) = evaluate_source(&source);
    match format {
        Format::Json => {
            let v = json::eval_report(&name, &parsed, &ev.derived, &ev.diagnostics);
            println!(
                "{}",
                serde_json::to_string_pretty(&v).expect("JSON of plain values")
            );
        }
        Format::Human | Format::Sarif => {
            print!("{}", human::derived_table(&parsed, &ev.derived, explain));
            if ev.derived.is_empty() {
                println!("(no derived values: record a refraction, keratometry or a lens system)");
            }
            let problems: Vec<_> = ev
                .diagnostics
                .iter()
                .filter(|d| d.severity != parax_eval::Severity::Info)
                .cloned()
                .collect();
            if !problems.is_empty() {
                eprint!("{}", human::diagnostics(&name, &parsed, &problems));
            }
            if !quiet {
                println!("\n{}", human::caution_line());
            }
        }
    }
    if ev.has_errors() {
        1
    } else {
        0
    }
}

/// `parax eval PATH…`: one file in the human or JSON form, or a batch as CSV or
/// JSON lines (see [`crate::batch`]).
pub fn dispatch(paths: &[PathBuf], format: EvalFormat, explain: bool, quiet: bool) -> u8 {
    let single = match format {
        EvalFormat::Human => Format::Human,
        EvalFormat::Json => Format::Json,
        EvalFormat::Csv => return batch::run(paths, BatchFormat::Csv),
        EvalFormat::Jsonl => return batch::run(paths, BatchFormat::Jsonl),
    };
    match paths {
        [one] if !one.is_dir() => run(one, single, explain, quiet),
        _ => {
            eprintln!("parax: several files or a folder: use `--format csv` or `--format jsonl`");
            2
        }
    }
}
