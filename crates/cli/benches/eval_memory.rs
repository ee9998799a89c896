//! Peak resident memory of the real `parax` binary on the generated 5 MB file
//! (issue 2: parse + evaluate under 10× the input): `parax eval` in the human
//! form and as JSON, `parax eval --explain`, and `parax check`, each with its
//! output sent to /dev/null. Plain `main`, prints a table.
//!
//! Run: `cargo bench -p parax-cli --bench eval_memory`. The 5 MB file (the one of
//! the eval benchmarks, crates/eval/benches/corpus) and a tiny file are written
//! to a fresh folder under the system temp folder and removed afterwards (set
//! `PARAX_BENCH_KEEP=1` to keep them). Each
//! command runs `RUNS` times; the table shows the median of the child's peak
//! resident set (`ru_maxrss` from `wait4`, which reports it for that one child),
//! as a multiple of the input size, beside the same command on the tiny file
//! (the binary's own baseline: code, libraries, stack, thread pool).

#[path = "../../eval/benches/corpus/mod.rs"]
mod corpus;

use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

const RUNS: usize = 3;

/// The `parax` binary of this build (Cargo builds it for the benchmarks), or
/// the one named by `PARAX_BENCH_BINARY` (to measure an earlier build beside it).
fn parax_binary() -> PathBuf {
    let p = std::env::var_os("PARAX_BENCH_BINARY")
        .map_or_else(|| PathBuf::from(env!("CARGO_BIN_EXE_parax")), PathBuf::from);
    assert!(
        p.exists(),
        "the parax binary is missing at {}; build it with `cargo build --release -p parax-cli`",
        p.display()
    );
    p
}

/// Run `parax args… file` with stdout and stderr to /dev/null; returns its peak
/// resident set in bytes and its wall time. Panics unless it exits with 0.
///
/// `wait4` rather than `getrusage(RUSAGE_CHILDREN)`: the latter is the maximum
/// over every child waited for so far, so a smaller run after a larger one would
/// show the larger one's peak.
// The child is waited for by `wait4`, which clippy does not see.
#[allow(clippy::zombie_processes)]
fn peak_rss(parax: &Path, args: &[&str], file: &Path) -> (u64, Duration) {
    let start = Instant::now();
    let child = Command::new(parax)
        .args(args)
        .arg(file)
        .stdout(Stdio::null())
        .stderr(Stdio::null())
        .spawn()
        .expect("parax starts");
    let mut status = 0;
    // SAFETY: an all-zero `rusage` is a valid value of this plain C struct.
    let mut usage: libc::rusage = unsafe { std::mem::zeroed() };
    // SAFETY: waits for our own child, which `Child` has not waited for; both
    // out-pointers are valid for the call.
    let pid = unsafe { libc::wait4(child.id() as libc::pid_t, &mut status, 0, &mut usage) };
    let wall = start.elapsed();
    assert_eq!(pid, child.id() as libc::pid_t, "wait4 waits for the child");
    assert!(
        libc::WIFEXITED(status) && libc::WEXITSTATUS(status) == 0,
        "parax {args:?} {} failed: wait status {status}",
        file.display()
    );
    // Linux reports ru_maxrss in KiB.
    (usage.ru_maxrss as u64 * 1024, wall)
}

fn median<T: Ord + Copy>(mut v: Vec<T>) -> T {
    v.sort();
    v[v.len() / 2]
}

fn mib(b: u64) -> f64 {
    b as f64 / (1024.0 * 1024.0)
}

/// Environment variable naming the folder the writer child writes the files to.
const WRITE_TO: &str = "PARAX_BENCH_EVALMEM_WRITE_TO";

/// The writer child: the 5 MB file (checked clean in this process) and a tiny one.
fn write_files(dir: &Path) {
    let text = corpus::big_file(corpus::BIG_FILE_BYTES);
    corpus::assert_sample_clean(&[], 1, Some(&text));
    std::fs::write(dir.join("long-history.parax"), &text).expect("write the 5 MB file");
    // Invented, tiny: one eye with a refraction.
    std::fs::write(
        dir.join("tiny.parax"),
        "eye right\n  refraction -1.00 / -0.50 x 90\n",
    )
    .expect("write the tiny file");
}

fn main() {
    // `cargo test --benches` passes `--test`: nothing to measure there.
    if std::env::args().any(|a| a == "--list" || a == "--test") {
        return;
    }
    if let Some(dir) = std::env::var_os(WRITE_TO) {
        write_files(Path::new(&dir));
        return;
    }
    let parax = parax_binary();
    let dir = std::env::temp_dir().join(format!("parax-bench-evalmem-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("create the bench folder");
    // The files are made (and checked, which evaluates the 5 MB file) by a child
    // process: a process spawned from this one starts with this one's peak
    // resident set as its own (Linux carries it over `exec` when the child
    // shares or copies the parent's memory), so this process must stay small.
    let status = Command::new(std::env::current_exe().expect("this bench's path"))
        .env(WRITE_TO, &dir)
        .status()
        .expect("the writer child runs");
    assert!(status.success(), "writing the files failed: {status}");
    let big = dir.join("long-history.parax");
    let tiny = dir.join("tiny.parax");
    let n = std::fs::metadata(&big).expect("the 5 MB file").len();

    let commands: [(&str, &[&str]); 4] = [
        ("parax eval (table)", &["eval"]),
        ("parax eval --explain (table)", &["eval", "--explain"]),
        ("parax eval --format json", &["eval", "--format", "json"]),
        ("parax check", &["check"]),
    ];
    println!(
        "\n5 MB file: {n} bytes ({:.2} MiB); peak resident set, median of {RUNS} runs; output to /dev/null",
        mib(n)
    );
    println!("binary: {}", parax.display());
    println!(
        "{:<30} {:>10} {:>8} {:>11} {:>16} {:>8}",
        "command", "peak MiB", "× input", "tiny MiB", "(peak−tiny)/in", "seconds"
    );
    for (name, args) in commands {
        let (mut peaks, mut walls) = (Vec::new(), Vec::new());
        for _ in 0..RUNS {
            let (p, w) = peak_rss(&parax, args, &big);
            peaks.push(p);
            walls.push(w);
        }
        let (peak, wall) = (median(peaks), median(walls));
        let base = median((0..RUNS).map(|_| peak_rss(&parax, args, &tiny).0).collect());
        println!(
            "{name:<30} {:>10.1} {:>7.2}× {:>11.1} {:>15.2}× {:>8.2}",
            mib(peak),
            peak as f64 / n as f64,
            mib(base),
            peak.saturating_sub(base) as f64 / n as f64,
            wall.as_secs_f64()
        );
    }
    if std::env::var_os("PARAX_BENCH_KEEP").is_none() {
        let _ = std::fs::remove_dir_all(&dir);
    } else {
        println!("kept the files in {}", dir.display());
    }
}
