//! `parax stats PATH…`: cohort statistics of the refractions in many case files,
//! per eye and optionally per group (a case tag, or the visit year). The
//! statistics are `parax_optics::cohort::summarize` on the power vectors that
//! `parax-eval` derives (M, J0, J45), gathered per group and eye by
//! `parax_eval::cohort`; this module only reads the files and prints the result.

use crate::batch::evaluate_all_with;
use crate::files;
use crate::render::human;
use parax_eval::cohort::{self, is_cohort_value, samples, Cohort, Sample};
use parax_eval::model::Side;
use parax_eval::{evaluate_streaming, EvalOptions, Severity, GENERAL_CAUTION};
use parax_optics::cohort::CohortSummary;
use serde_json::json;
use std::fmt::Write as _;
use std::io::IsTerminal;
use std::path::{Path, PathBuf};

/// What to group the eyes by.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum GroupBy {
    /// One group: every case.
    None,
    /// Each `tag` of the `case` block (a case with two tags counts in both;
    /// untagged cases form the group `(no tag)`).
    Tag,
    /// The year of the eye's visit date, else of the case's `date`.
    Year,
}

/// Output formats of `parax stats`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum StatsFormat {
    /// A table for people.
    Human,
    /// For programs.
    Json,
}

impl From<GroupBy> for cohort::GroupBy {
    fn from(g: GroupBy) -> Self {
        match g {
            GroupBy::None => cohort::GroupBy::None,
            GroupBy::Tag => cohort::GroupBy::Tag,
            GroupBy::Year => cohort::GroupBy::Year,
        }
    }
}

/// The samples of one file, or the reason it was left out.
fn samples_of(path: &Path, group_by: GroupBy) -> Result<Vec<Sample>, String> {
    let source = files::read(path)?;
    let name = files::display(path);
    // Only the values a cohort reads are kept as they are handed over.
    let mut kept = Vec::new();
    let (parsed, ev) = evaluate_streaming(&source, EvalOptions::VALUES_ONLY, &mut |values| {
        kept.extend(values.iter().filter(|d| is_cohort_value(d)).cloned())
    });
    if let Some(d) = ev
        .diagnostics
        .iter()
        .find(|d| d.severity == Severity::Error)
    {
        let (line, col) = parsed.index.line_col(&parsed.source, d.span.start());
        return Err(format!("{name}:{line}:{col}: {} {}", d.code, d.message));
    }
    Ok(samples(&ev.case, &kept, group_by.into()))
}

/// Run `parax stats`; exit status 0, 1 when a file was left out (unreadable or
/// with errors), 2 when a path does not exist or there is nothing to summarise.
pub fn run(paths: &[PathBuf], group_by: GroupBy, format: StatsFormat) -> u8 {
    let (list, walk_errors) = files::collect(paths);
    for e in &walk_errors {
        eprintln!("parax: {e}");
    }
    let results = evaluate_all_with(&list, std::io::stderr().is_terminal(), |p| {
        samples_of(p, group_by)
    });
    let mut cohort = Cohort::default();
    let mut left_out = 0;
    for r in results {
        match r {
            Ok(samples) => cohort.add(samples),
            Err(e) => {
                left_out += 1;
                eprintln!("parax: left out {e}");
            }
        }
    }
    let summaries = cohort.summaries();
    match format {
        StatsFormat::Human => print!("{}", table(&summaries, list.len(), left_out)),
        StatsFormat::Json => {
            let v = json!({
                "files": list.len(),
                "left_out": left_out,
                "method": METHOD,
                "groups": summaries.iter().map(|((g, side), s)| json!({
                    "group": g,
                    "eye": side.name(),
                    "count": s.count,
                    "mean": { "m": s.mean.m, "j0": s.mean.j0, "j45": s.mean.j45 },
                    "sd": s.sd.map(|d| json!({ "m": d.m, "j0": d.j0, "j45": d.j45 })),
                    "mean_sphcyl": {
                        "sphere": s.mean_sphcyl.sphere,
                        "cylinder": s.mean_sphcyl.cylinder,
                        "axis": s.mean_sphcyl.axis,
                        "text": parax_eval::derived::fmt_sphcyl(s.mean_sphcyl.sphere, s.mean_sphcyl.cylinder, s.mean_sphcyl.axis),
                    },
                })).collect::<Vec<_>>(),
                "caution": GENERAL_CAUTION,
            });
            println!(
                "{}",
                serde_json::to_string_pretty(&v).expect("JSON of plain values")
            );
        }
    }
    if !walk_errors.is_empty() || summaries.is_empty() {
        if summaries.is_empty() {
            eprintln!("parax: no refractions to summarise");
        }
        2
    } else {
        u8::from(left_out > 0)
    }
}

const METHOD: &str = "refractions averaged as power vectors (M, J0, J45) and the mean \
converted back to sphere/cylinder/axis (Thibos, Wheeler & Horner, Optom Vis Sci 1997); \
SD is the sample standard deviation (n - 1); refractions as recorded, at their own vertex distance";

fn table(rows: &[((String, Side), CohortSummary)], files: usize, left_out: usize) -> String {
    let mut out = String::new();
    let gw = rows
        .iter()
        .map(|((g, _), _)| g.chars().count())
        .max()
        .unwrap_or(5)
        .max(5);
    let _ = writeln!(
        out,
        "{:<gw$}  {:<5}  {:>5}  {:>14}  {:>14}  {:>14}  mean as sph/cyl x axis",
        "group", "eye", "n", "M mean (SD)", "J0 mean (SD)", "J45 mean (SD)"
    );
    let cell = |mean: f64, sd: Option<f64>| match sd {
        Some(sd) => format!("{mean:+.2} ({sd:.2})"),
        None => format!("{mean:+.2} (-)"),
    };
    for ((g, side), s) in rows {
        let _ = writeln!(
            out,
            "{g:<gw$}  {:<5}  {:>5}  {:>14}  {:>14}  {:>14}  {}",
            side.name(),
            s.count,
            cell(s.mean.m, s.sd.map(|d| d.m)),
            cell(s.mean.j0, s.sd.map(|d| d.j0)),
            cell(s.mean.j45, s.sd.map(|d| d.j45)),
            parax_eval::derived::fmt_sphcyl(
                s.mean_sphcyl.sphere,
                s.mean_sphcyl.cylinder,
                s.mean_sphcyl.axis
            ),
        );
    }
    let _ = writeln!(
        out,
        "\n{files} file{}, {left_out} left out. Values in D. Method: {METHOD}.",
        if files == 1 { "" } else { "s" }
    );
    let _ = writeln!(out, "{}", human::caution_line());
    out
}
