//! Benchmark: batch evaluation of 10,000 generated case files with the real
//! `parax eval --format csv` command, against the I/O floor of simply reading
//! the same files (in parallel, page cache warm) in the same run. Prints files
//! per second for both and their ratio. A plain harness (`harness = false`):
//! one whole-corpus measurement per repetition, median of five, is the figure
//! asked for; a statistical per-iteration harness adds nothing at this scale.

#[allow(dead_code)]
#[path = "../tests/support/corpus.rs"]
mod corpus;

use rayon::prelude::*;
use std::path::PathBuf;
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

const FILES: usize = 10_000;
const REPEATS: usize = 5;

fn median(mut v: Vec<Duration>) -> Duration {
    v.sort();
    v[v.len() / 2]
}

fn main() {
    let dir = std::env::temp_dir().join(format!("parax-bench-batch-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    corpus::write(&dir, FILES);
    let mut paths: Vec<PathBuf> = std::fs::read_dir(&dir)
        .expect("corpus")
        .map(|e| e.expect("entry").path())
        .collect();
    paths.sort();
    let bytes: usize = paths
        .iter()
        .map(|p| std::fs::metadata(p).map(|m| m.len() as usize).unwrap_or(0))
        .sum();

    let read_all = || {
        let total: usize = paths
            .par_iter()
            .map(|p| std::fs::read_to_string(p).expect("read").len())
            .sum();
        assert_eq!(total, bytes);
    };
    let eval_all = || {
        let status = Command::new(env!("CARGO_BIN_EXE_parax"))
            .args(["eval", "--format", "csv"])
            .arg(&dir)
            .stdout(Stdio::null())
            .stderr(Stdio::null())
            .status()
            .expect("parax runs");
        assert!(status.success(), "every generated file evaluates");
    };
    // Warm the page cache and the binary once.
    read_all();
    eval_all();
    let mut reads = Vec::new();
    let mut evals = Vec::new();
    for _ in 0..REPEATS {
        let t = Instant::now();
        read_all();
        reads.push(t.elapsed());
        let t = Instant::now();
        eval_all();
        evals.push(t.elapsed());
    }
    let (read, eval) = (median(reads), median(evals));
    let per_sec = |d: Duration| FILES as f64 / d.as_secs_f64();
    println!(
        "batch_eval: {FILES} files ({:.1} MB), {} threads, median of {REPEATS}",
        bytes as f64 / 1e6,
        rayon::current_num_threads()
    );
    println!(
        "  read only (I/O floor): {:>8.1} ms  {:>10.0} files/s",
        read.as_secs_f64() * 1e3,
        per_sec(read)
    );
    println!(
        "  parax eval --format csv: {:>6.1} ms  {:>10.0} files/s",
        eval.as_secs_f64() * 1e3,
        per_sec(eval)
    );
    println!(
        "  ratio eval / read: {:.1}x",
        eval.as_secs_f64() / read.as_secs_f64()
    );
    let _ = std::fs::remove_dir_all(&dir);
}
