//! `parax`: check, evaluate and format optical case files. A thin shell: every
//! value and finding comes from `parax-eval`; this crate only finds files, renders
//! and sets the exit status (0 clean, 1 errors or failed `expect`, 2 usage or I/O).

mod batch;
mod check;
mod diff_cmd;
mod eval_cmd;
mod files;
mod fmt_cmd;
mod lsp_cmd;
mod render;
mod render_cmd;
mod stats;

use clap::{Parser, Subcommand, ValueEnum};

/// The allocator of the `parax` binary. Parsing and evaluating allocate many
/// small, short-lived objects (a line's values, a block's results, a message's
/// JSON); glibc's allocator spent 10–40% of `parax check` and of the language
/// server's edit handling in `malloc`/`free`. mimalloc (a well-kept allocator
/// with thread-local free lists) does the same work for less.
#[global_allocator]
static GLOBAL: mimalloc::MiMalloc = mimalloc::MiMalloc;
use std::path::PathBuf;
use std::process::ExitCode;

const CAUTION_HELP: &str =
    "Caution: parax computes values as aids. Verify every value clinically; \
prescribing belongs to a licensed practitioner under local rules.";

/// Plain-text optical case files: check them, compute every derived value, format them.
#[derive(Parser, Debug)]
#[command(name = "parax", version, after_help = CAUTION_HELP)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

/// Output formats.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum Format {
    /// For people.
    Human,
    /// For programs (keys documented in docs/notation.md and docs/cli.md).
    Json,
    /// SARIF 2.1.0, for code-review systems (`parax check` only).
    Sarif,
}

/// Output formats of `parax eval`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum EvalFormat {
    /// For people (one file).
    Human,
    /// For programs (one file).
    Json,
    /// One row per eye and system, comma-separated (any number of files).
    Csv,
    /// One row per eye and system, one JSON object per line (any number of files).
    Jsonl,
}

#[derive(Subcommand, Debug)]
enum Command {
    /// Check case files: syntax, units, plausibility, clinical notes and `expect` lines.
    #[command(after_help = CAUTION_HELP)]
    Check {
        /// Files or folders (folders are searched for *.parax); default: the current folder.
        paths: Vec<PathBuf>,
        /// Output format.
        #[arg(long, value_enum, default_value_t = Format::Human)]
        format: Format,
        /// Leave out the closing caution line and the summary.
        #[arg(long, short)]
        quiet: bool,
    },
    /// Compute every derived value: of one file, grouped by block; or of many files
    /// and folders at once as CSV or JSON lines (one row per eye and system).
    #[command(after_help = CAUTION_HELP)]
    Eval {
        /// Case files or folders (`-` reads standard input); several, or a folder,
        /// need `--format csv` or `--format jsonl`.
        #[arg(required = true)]
        paths: Vec<PathBuf>,
        /// Output format.
        #[arg(long, value_enum, default_value_t = EvalFormat::Human)]
        format: EvalFormat,
        /// Show each value's formula, substituted numbers and source.
        #[arg(long)]
        explain: bool,
        /// Leave out the closing caution line.
        #[arg(long, short)]
        quiet: bool,
    },
    /// Rewrite case files in the canonical layout (white space only; comments kept).
    Fmt {
        /// Files or folders; `-` formats standard input to standard output.
        paths: Vec<PathBuf>,
        /// Change nothing; list the files that are not in canonical layout and fail if any.
        #[arg(long)]
        check: bool,
    },
    /// Compare two versions of a case file: changed inputs and the derived values that moved.
    #[command(after_help = CAUTION_HELP)]
    Diff {
        /// The old version: a file, or `REV:PATH` read with `git show`.
        old: String,
        /// The new version: a file, or `REV:PATH`.
        new: String,
        /// Output format.
        #[arg(long, value_enum, default_value_t = diff_cmd::DiffFormat::Human)]
        format: diff_cmd::DiffFormat,
    },
    /// Cohort statistics of refractions: count, mean and SD of M, J0, J45 per eye,
    /// the mean as sphere/cylinder/axis; optionally per tag or year.
    #[command(after_help = CAUTION_HELP)]
    Stats {
        /// Case files or folders.
        #[arg(required = true)]
        paths: Vec<PathBuf>,
        /// Group the eyes by a case field.
        #[arg(long, value_enum, default_value_t = stats::GroupBy::None)]
        group_by: stats::GroupBy,
        /// Output format.
        #[arg(long, value_enum, default_value_t = stats::StatsFormat::Human)]
        format: stats::StatsFormat,
    },
    /// Draw SVG diagrams: each lens system (object, images, chief ray) and a power
    /// cross for each refraction.
    Render {
        /// The case file.
        file: PathBuf,
        /// The folder to write the SVG files into (created if needed).
        #[arg(long)]
        out: PathBuf,
    },
    /// Print a case file followed by its derived values, one per line (a git textconv driver).
    View {
        /// The case file (`-` reads standard input).
        file: PathBuf,
    },
    /// Serve the Language Server Protocol on standard input and output (for editors).
    Lsp,
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    let code = match cli.command {
        Command::Check {
            paths,
            format,
            quiet,
        } => check::run(&paths, format, quiet),
        Command::Eval {
            paths,
            format,
            explain,
            quiet,
        } => eval_cmd::dispatch(&paths, format, explain, quiet),
        Command::Fmt { paths, check } => fmt_cmd::run(&paths, check),
        Command::Diff { old, new, format } => diff_cmd::run(&old, &new, format),
        Command::View { file } => diff_cmd::view(&file),
        Command::Render { file, out } => render_cmd::run(&file, &out),
        Command::Stats {
            paths,
            group_by,
            format,
        } => stats::run(&paths, group_by, format),
        Command::Lsp => lsp_cmd::run(),
    };
    ExitCode::from(code)
}
