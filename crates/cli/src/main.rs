//! `parax`: check, evaluate and format optical case files. A thin shell: every
//! value and finding comes from `parax-eval`; this crate only finds files, renders
//! and sets the exit status (0 clean, 1 errors or failed `expect`, 2 usage or I/O).

mod check;
mod eval_cmd;
mod files;
mod fmt_cmd;
mod lsp_cmd;
mod render;

use clap::{Parser, Subcommand, ValueEnum};
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
    /// Compute and show every derived value of one case file, grouped by block.
    #[command(after_help = CAUTION_HELP)]
    Eval {
        /// The case file (`-` reads standard input).
        file: PathBuf,
        /// Output format.
        #[arg(long, value_enum, default_value_t = Format::Human)]
        format: Format,
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
            file,
            format,
            explain,
            quiet,
        } => eval_cmd::run(&file, format, explain, quiet),
        Command::Fmt { paths, check } => fmt_cmd::run(&paths, check),
        Command::Lsp => lsp_cmd::run(),
    };
    ExitCode::from(code)
}
