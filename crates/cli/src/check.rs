//! `parax check`: evaluate every file in parallel and report diagnostics.

use crate::render::{human, json, sarif};
use crate::{files, Format};
use parax_eval::{evaluate_streaming, EvalOptions, Severity};
use rayon::prelude::*;
use std::io::Write;
use std::path::{Path, PathBuf};

/// One file's outcome.
pub struct Checked {
    /// The rendered report for this file (may be empty).
    pub report: String,
    /// Counts of errors, warnings, infos.
    pub counts: [usize; 3],
    /// `expect` lines in the file.
    pub expects: usize,
}

fn check_one(
    path: &Path,
    format: Format,
    root: &Path,
) -> Result<(Checked, Option<serde_json::Value>), String> {
    let source = files::read(path)?;
    let name = files::display(path);
    // Only diagnostics are shown: each block's lines are dropped once it is read
    // into the case model, and its values once its `expect` lines are judged, so
    // memory holds the case model and one block's tree and values at a time.
    let (parsed, ev) = evaluate_streaming(&source, EvalOptions::VALUES_ONLY, &mut |_| {});
    let mut counts = [0; 3];
    for d in &ev.diagnostics {
        counts[match d.severity {
            Severity::Error => 0,
            Severity::Warning => 1,
            Severity::Info => 2,
        }] += 1;
    }
    let expects = ev
        .case
        .blocks
        .iter()
        .map(|b| b.expects().len())
        .sum::<usize>();
    Ok(match format {
        Format::Human => (
            Checked {
                report: human::diagnostics(&name, &parsed, &ev.diagnostics),
                counts,
                expects,
            },
            None,
        ),
        Format::Json => (
            Checked {
                report: String::new(),
                counts,
                expects,
            },
            Some(json::file_diagnostics(&name, &parsed, &ev.diagnostics)),
        ),
        Format::Sarif => {
            let location = sarif::artifact_location(root, path);
            (
                Checked {
                    report: String::new(),
                    counts,
                    expects,
                },
                Some(serde_json::Value::Array(sarif::results(
                    &location,
                    &parsed,
                    &ev.diagnostics,
                ))),
            )
        }
    })
}

/// Run `parax check`; returns the exit status.
pub fn run(paths: &[PathBuf], format: Format, quiet: bool) -> u8 {
    let (list, mut io_errors) = files::collect(paths);
    let root = match format {
        Format::Sarif => sarif::root(),
        _ => PathBuf::new(),
    };
    let results: Vec<_> = list
        .par_iter()
        .map(|p| check_one(p, format, &root))
        .collect();
    let stdout = std::io::stdout();
    let mut out = std::io::BufWriter::new(stdout.lock());
    let mut totals = [0usize; 3];
    let mut expects = 0;
    let mut json_files = Vec::new();
    for r in results {
        match r {
            Ok((c, j)) => {
                let _ = out.write_all(c.report.as_bytes());
                for (total, n) in totals.iter_mut().zip(c.counts) {
                    *total += n;
                }
                expects += c.expects;
                json_files.extend(j);
            }
            Err(e) => io_errors.push(e),
        }
    }
    for e in &io_errors {
        eprintln!("parax: {e}");
    }
    match format {
        Format::Json => {
            let v = json::check_report(json_files, totals, list.len(), &io_errors);
            let _ = writeln!(
                out,
                "{}",
                serde_json::to_string_pretty(&v).expect("JSON of plain values")
            );
        }
        Format::Sarif => {
            let results = json_files
                .into_iter()
                .flat_map(|v| match v {
                    serde_json::Value::Array(a) => a,
                    other => vec![other],
                })
                .collect();
            let v = sarif::log(results, &io_errors);
            let _ = writeln!(
                out,
                "{}",
                serde_json::to_string_pretty(&v).expect("JSON of plain values")
            );
        }
        Format::Human if !quiet => {
            let _ = writeln!(out, "{}", human::summary(list.len(), totals, expects));
            let _ = writeln!(out, "{}", human::caution_line());
        }
        Format::Human => {}
    }
    let _ = out.flush();
    if !io_errors.is_empty() {
        2
    } else if totals[0] > 0 {
        1
    } else {
        0
    }
}
