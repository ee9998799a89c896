//! `parax eval`: every derived value of one file.

use crate::batch::{self, BatchFormat};
use crate::render::{human, json};
use crate::{files, EvalFormat, Format};
use parax_eval::{read_source_streaming, EvalOptions, Severity, StreamedSource};
use std::io::{BufWriter, Write};
use std::path::{Path, PathBuf};

/// Run `parax eval`; returns the exit status.
///
/// The file is read block by block into the case model
/// ([`parax_eval::read_source_streaming`]), then its values are computed block by
/// block and each block's values are written and dropped before the next block is
/// computed, so memory holds the case model and one block's values, not every
/// value of the file (issue 2: under 10× the input on a 5 MB file). The table's
/// column widths depend on every value, so the human form computes the values
/// twice: once for the widths (values only), once to write them.
pub fn run(path: &Path, format: Format, explain: bool, quiet: bool) -> u8 {
    let source = match files::read(path) {
        Ok(s) => s,
        Err(e) => {
            eprintln!("parax: {e}");
            return 2;
        }
    };
    let name = files::display(path);
    let read = read_source_streaming(&source);
    drop(source);
    let stdout = std::io::stdout();
    let mut out = BufWriter::new(stdout.lock());
    let written = match format {
        Format::Json => json::write_eval_report(&mut out, &name, &read)
            .map_err(std::io::Error::from)
            .and_then(|diags| writeln!(out).map(|()| diags)),
        Format::Human | Format::Sarif => write_human(&mut out, &name, &read, explain, quiet),
    };
    let diagnostics = match written.and_then(|d| out.flush().map(|()| d)) {
        Ok(d) => d,
        Err(e) => {
            eprintln!("parax: cannot write the output: {e}");
            return 2;
        }
    };
    if diagnostics.iter().any(|d| d.severity == Severity::Error) {
        1
    } else {
        0
    }
}

/// The human form: the table on `out`, problems on stderr, then the caution.
fn write_human(
    out: &mut impl Write,
    name: &str,
    read: &StreamedSource,
    explain: bool,
    quiet: bool,
) -> std::io::Result<Vec<parax_eval::Diagnostic>> {
    let mut widths = human::Widths::default();
    read.evaluate_each(EvalOptions::VALUES_ONLY, &mut |v| widths.fit(v));
    let options = if explain {
        EvalOptions::default()
    } else {
        EvalOptions::VALUES_ONLY
    };
    let mut table = human::Table::new(read, widths, explain);
    let mut failed = None;
    let diagnostics = read.evaluate_each(options, &mut |values| {
        if failed.is_none() {
            failed = table.write(out, values).err();
        }
    });
    if let Some(e) = failed {
        return Err(e);
    }
    if !table.any() {
        writeln!(
            out,
            "(no derived values: record a refraction, keratometry or a lens system)"
        )?;
    }
    let problems: Vec<_> = diagnostics
        .iter()
        .filter(|d| d.severity != Severity::Info)
        .cloned()
        .collect();
    if !problems.is_empty() {
        // The table first, then the problems, as a terminal shows both.
        out.flush()?;
        eprint!("{}", human::diagnostics(name, &read.parsed, &problems));
    }
    if !quiet {
        writeln!(out, "\n{}", human::caution_line())?;
    }
    Ok(diagnostics)
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
