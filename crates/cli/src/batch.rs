//! Batch evaluation: `parax eval DIR… --format csv|jsonl`. Every case file is
//! evaluated in parallel (rayon) and written as one row per evaluated block (each
//! `eye` and each `system`; `model-eye` blocks are not evaluated yet), in file
//! order, with the stable columns of [`Row`]. A file that cannot be read or has
//! errors gives one row with `status` `error` and a message, is reported on
//! standard error, and never stops the batch. A progress bar is drawn on standard
//! error only when it is a terminal.

use crate::files;
use indicatif::{ProgressBar, ProgressStyle};
use parax_eval::blocks::{eye, system};
use parax_eval::{evaluate_with, Derived, DerivedValue, EvalOptions, Severity};
use rayon::prelude::*;
use serde::Serialize;
use std::io::{IsTerminal, Write};
use std::path::{Path, PathBuf};

/// Batch output formats.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum BatchFormat {
    /// Comma-separated values with a header row (RFC 4180 quoting).
    Csv,
    /// One JSON object per line.
    Jsonl,
}

/// One output row. Column names and order are stable (documented in the README);
/// new columns are only ever added at the end. Powers in dioptres, lengths in
/// metres, angles in degrees; empty (CSV) or `null` (JSONL) when not computed.
#[derive(Debug, Clone, Default, Serialize, PartialEq)]
pub struct Row {
    /// The file, as found.
    pub file: String,
    /// The block's key prefix, e.g. `eye.right`, `system.two-lens-bench-relay`.
    pub block: String,
    /// `eye`, `system`, or `file` for a row that reports a file error.
    pub kind: String,
    /// `ok`, or `error` when the file could not be read or has errors.
    pub status: String,
    /// The `case` title.
    pub case: Option<String>,
    /// The eye's visit date, else the case's date.
    pub date: Option<String>,
    /// The case's tags, separated by `;`.
    pub tags: Option<String>,
    /// Refraction sphere as recorded, D.
    pub sphere: Option<f64>,
    /// Refraction cylinder as recorded, D (0 for a sphere).
    pub cylinder: Option<f64>,
    /// Refraction axis as recorded, degrees (180 for a sphere).
    pub axis: Option<f64>,
    /// Spherical equivalent M, D.
    pub m: Option<f64>,
    /// Power-vector component J0, D.
    pub j0: Option<f64>,
    /// Power-vector component J45, D.
    pub j45: Option<f64>,
    /// Mean keratometric power, D.
    pub mean_k: Option<f64>,
    /// Corneal cylinder, D (minus form).
    pub corneal_cylinder: Option<f64>,
    /// Axis of the corneal cylinder, degrees.
    pub corneal_cylinder_axis: Option<f64>,
    /// System: equivalent power, D.
    pub equivalent_power: Option<f64>,
    /// System: back vertex power, D.
    pub back_vertex_power: Option<f64>,
    /// System: front vertex power, D.
    pub front_vertex_power: Option<f64>,
    /// System: final image position, metres from `image_from` (positive: after it).
    pub image_m: Option<f64>,
    /// System: what the image position is measured from.
    pub image_from: Option<String>,
    /// System: total lateral magnification.
    pub magnification: Option<f64>,
    /// System: kind of final image.
    pub image_kind: Option<String>,
    /// Errors in the file: the first one, with line and column, and the count.
    pub message: Option<String>,
}

/// The block prefix of a derived value's key.
fn block_of(d: &Derived) -> &str {
    &d.block
}

fn fill(row: &mut Row, d: &Derived) {
    use DerivedValue as V;
    match (&*d.name, &d.value) {
        (eye::keys::SPHERICAL_EQUIVALENT, V::Power { dioptres }) => row.m = Some(*dioptres),
        (eye::keys::VECTOR_J0, V::Power { dioptres }) => row.j0 = Some(*dioptres),
        (eye::keys::VECTOR_J45, V::Power { dioptres }) => row.j45 = Some(*dioptres),
        (eye::keys::MEAN_K, V::Power { dioptres }) => row.mean_k = Some(*dioptres),
        (eye::keys::CORNEAL_CYLINDER, V::Cylinder { dioptres, axis }) => {
            row.corneal_cylinder = Some(*dioptres);
            row.corneal_cylinder_axis = Some(*axis);
        }
        (system::keys::EQUIVALENT_POWER, V::Power { dioptres }) => {
            row.equivalent_power = Some(*dioptres)
        }
        (system::keys::BACK_VERTEX_POWER, V::Power { dioptres }) => {
            row.back_vertex_power = Some(*dioptres)
        }
        (system::keys::FRONT_VERTEX_POWER, V::Power { dioptres }) => {
            row.front_vertex_power = Some(*dioptres)
        }
        (system::keys::IMAGE, V::Distance { metres, from }) => {
            row.image_m = Some(*metres);
            row.image_from = Some(from.to_string());
        }
        (system::keys::IMAGE, V::Infinity) => row.image_from = Some("infinity".into()),
        (system::keys::MAGNIFICATION, V::Number { value }) => row.magnification = Some(*value),
        (system::keys::IMAGE_KIND, V::Text { text }) => row.image_kind = Some(text.to_string()),
        _ => {}
    }
}

/// Evaluate one file into its rows. Never panics on bad input; errors become a
/// `status = error` row.
pub fn rows_of(path: &Path) -> Vec<Row> {
    let file = files::display(path);
    let error_row = |message: String| Row {
        file: file.clone(),
        kind: "file".into(),
        status: "error".into(),
        message: Some(message),
        ..Row::default()
    };
    let source = match files::read(path) {
        Ok(s) => s,
        Err(e) => return vec![error_row(e)],
    };
    let parsed = parax_syntax::parse(&source);
    let ev = evaluate_with(&parsed, EvalOptions::VALUES_ONLY);
    let errors: Vec<_> = ev
        .diagnostics
        .iter()
        .filter(|d| d.severity == Severity::Error)
        .collect();
    if let Some(first) = errors.first() {
        let (line, col) = parsed.index.line_col(&parsed.source, first.span.start());
        return vec![error_row(format!(
            "{file}:{line}:{col}: {} {} ({} error{} in the file)",
            first.code,
            first.message,
            errors.len(),
            if errors.len() == 1 { "" } else { "s" }
        ))];
    }
    let info = &ev.case.info;
    let mut rows: Vec<Row> = Vec::new();
    for d in &ev.derived {
        let block = block_of(d);
        if rows.last().map(|r| r.block.as_str()) != Some(block) {
            let kind = block.split('.').next().unwrap_or_default();
            let eye = ev
                .case
                .eyes()
                .find(|e| block.strip_prefix("eye.") == Some(e.side.name()));
            let eye_date = eye.and_then(|e| e.date.clone());
            // The refraction as recorded (minus-cylinder form as written).
            let rx = eye.and_then(|e| e.refraction.as_ref()).map(|r| r.value.rx);
            rows.push(Row {
                sphere: rx.map(|r| r.sphere),
                cylinder: rx.map(|r| r.cylinder),
                axis: rx.map(|r| r.axis),
                file: file.clone(),
                block: block.to_owned(),
                kind: kind.to_owned(),
                status: "ok".into(),
                case: info.title.clone(),
                date: eye_date.or_else(|| info.date.clone()),
                tags: (!info.tags.is_empty()).then(|| info.tags.join(";")),
                ..Row::default()
            });
        }
        if let Some(r) = rows.last_mut() {
            fill(r, d);
        }
    }
    rows
}

/// Evaluate every file in parallel; rows in file order. The progress bar (if
/// any) advances as files finish.
pub fn evaluate_all(list: &[PathBuf], progress: bool) -> Vec<Vec<Row>> {
    evaluate_all_with(list, progress, rows_of)
}

/// Apply `f` to every file in parallel (rayon), results in file order, with a
/// progress bar on standard error when `progress` is true.
pub fn evaluate_all_with<T: Send>(
    list: &[PathBuf],
    progress: bool,
    f: impl Fn(&Path) -> T + Sync,
) -> Vec<T> {
    let bar = if progress {
        let b = ProgressBar::new(list.len() as u64);
        b.set_style(
            ProgressStyle::with_template("{bar:40} {pos}/{len} files  {per_sec}  eta {eta}")
                .expect("a valid template"),
        );
        b
    } else {
        ProgressBar::hidden()
    };
    let out = list
        .par_iter()
        .map(|p| {
            let r = f(p);
            bar.inc(1);
            r
        })
        .collect();
    bar.finish_and_clear();
    out
}

/// Run the batch; exit status 0 when every file evaluated cleanly, 1 when any
/// file could not be read or had errors, 2 when a path given does not exist.
pub fn run(paths: &[PathBuf], format: BatchFormat) -> u8 {
    let (list, walk_errors) = files::collect(paths);
    for e in &walk_errors {
        eprintln!("parax: {e}");
    }
    let progress = std::io::stderr().is_terminal();
    let results = evaluate_all(&list, progress);
    let stdout = std::io::stdout();
    let mut out = std::io::BufWriter::new(stdout.lock());
    let mut failed = 0usize;
    let mut csv = csv::WriterBuilder::new()
        .has_headers(false)
        .from_writer(Vec::with_capacity(1 << 16));
    if format == BatchFormat::Csv {
        // The header even when there are no rows, so the columns are always there.
        let _ = csv.write_record(COLUMNS);
    }
    for r in results.iter().flatten() {
        if r.status == "error" {
            failed += 1;
            eprintln!("parax: {}", r.message.as_deref().unwrap_or("error"));
        }
        match format {
            BatchFormat::Csv => {
                let _ = csv.write_record(csv_fields(r));
            }
            BatchFormat::Jsonl => {
                let _ = writeln!(out, "{}", serde_json::to_string(r).expect("plain values"));
            }
        }
    }
    if format == BatchFormat::Csv {
        let _ = csv.flush();
        let _ = out.write_all(csv.get_ref());
    }
    let _ = out.flush();
    eprintln!(
        "evaluated {} file{}: {} ok, {failed} failed",
        list.len(),
        if list.len() == 1 { "" } else { "s" },
        list.len() - failed
    );
    if !walk_errors.is_empty() {
        2
    } else if failed > 0 {
        1
    } else {
        0
    }
}

/// The column names, in order (the field names of [`Row`]).
pub const COLUMNS: [&str; 24] = [
    "file",
    "block",
    "kind",
    "status",
    "case",
    "date",
    "tags",
    "sphere",
    "cylinder",
    "axis",
    "m",
    "j0",
    "j45",
    "mean_k",
    "corneal_cylinder",
    "corneal_cylinder_axis",
    "equivalent_power",
    "back_vertex_power",
    "front_vertex_power",
    "image_m",
    "image_from",
    "magnification",
    "image_kind",
    "message",
];

/// A row's fields in [`COLUMNS`] order, as CSV text: numbers in Rust's shortest
/// round-trip form, absent values empty.
pub fn csv_fields(r: &Row) -> Vec<String> {
    let v = serde_json::to_value(r).expect("plain values");
    COLUMNS
        .iter()
        .map(|c| match &v[*c] {
            serde_json::Value::Null => String::new(),
            serde_json::Value::String(t) => t.clone(),
            other => other.to_string(),
        })
        .collect()
}
