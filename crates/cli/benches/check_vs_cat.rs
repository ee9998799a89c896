//! `parax check` over the generated 10,000-file corpus against `cat` of the same
//! files (the requirement: no slower than `cat` on one thread, and using
//! every core). Plain `main`, prints a table.
//!
//! Run: `cargo bench -p parax-cli --bench check_vs_cat`. The corpus is written to a
//! fresh folder under the system temp folder and removed afterwards (set
//! `PARAX_BENCH_KEEP=1` to keep it, and to get the 5 MB file beside it). Each
//! command is run once to warm the page cache, then 5 times, interleaved; the
//! table shows medians. "cores busy" is the child's CPU time (user + system,
//! from /proc/self/stat) over wall time.

#[path = "../../eval/benches/corpus/mod.rs"]
mod corpus;

use pest::Parser as _;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

const RUNS: usize = 5;

/// Builds the command to time, once per run.
type CommandMaker<'a> = Box<dyn Fn() -> Command + 'a>;

/// The `parax` binary of this build. Cargo builds the package's binaries for its
/// benchmarks (with the same `bench` profile) and names the path here.
fn parax_binary() -> PathBuf {
    let p = PathBuf::from(env!("CARGO_BIN_EXE_parax"));
    assert!(
        p.exists(),
        "the parax binary is missing at {}; build it with `cargo build --release -p parax-cli`",
        p.display()
    );
    p
}

/// CPU time of this process's waited-for children so far, in clock ticks
/// (fields 16 and 17 of /proc/self/stat); `None` off Linux.
fn children_cpu_ticks() -> Option<u64> {
    let stat = std::fs::read_to_string("/proc/self/stat").ok()?;
    // The command name (field 2) may hold spaces; fields resume after its ')'.
    let rest = &stat[stat.rfind(')')? + 2..];
    let f: Vec<&str> = rest.split_whitespace().collect();
    // rest starts at field 3, so field k is f[k - 3].
    Some(f.get(13)?.parse::<u64>().ok()? + f.get(14)?.parse::<u64>().ok()?)
}

/// Clock ticks per second; 100 on every Linux this runs on (USER_HZ).
const TICKS_PER_SECOND: f64 = 100.0;

struct Timing {
    wall: Vec<Duration>,
    cpu: Vec<f64>,
}

impl Timing {
    fn median(&self) -> Duration {
        let mut w = self.wall.clone();
        w.sort();
        w[w.len() / 2]
    }
    /// Total CPU seconds over total wall seconds.
    fn cores_busy(&self) -> f64 {
        let wall: f64 = self.wall.iter().map(Duration::as_secs_f64).sum();
        self.cpu.iter().sum::<f64>() / wall
    }
}

fn run(cmd: &mut Command) -> (Duration, f64) {
    let before = children_cpu_ticks().unwrap_or(0);
    let start = Instant::now();
    let out = cmd
        .stdout(Stdio::null())
        .stderr(Stdio::piped())
        .output()
        .expect("the command starts");
    let wall = start.elapsed();
    let cpu = (children_cpu_ticks().unwrap_or(0) - before) as f64 / TICKS_PER_SECOND;
    assert!(
        out.status.success(),
        "{cmd:?} failed: {}\n{}",
        out.status,
        String::from_utf8_lossy(&out.stderr)
            .chars()
            .take(2000)
            .collect::<String>()
    );
    // Output goes to /dev/null: `cat`'s bytes, `parax check -q`'s notes.
    (wall, cpu)
}

fn write_corpus(dir: &Path) -> (Vec<String>, u64) {
    let files = corpus::corpus(corpus::CORPUS_FILES);
    corpus::assert_sample_clean(&files, 50, None);
    let mut rel = Vec::with_capacity(files.len());
    let mut bytes = 0;
    for (i, text) in files.iter().enumerate() {
        let sub = format!("{:02}", i / 100);
        std::fs::create_dir_all(dir.join(&sub)).expect("create the corpus folder");
        let name = format!("{sub}/case-{i:05}.parax");
        std::fs::write(dir.join(&name), text).expect("write a corpus file");
        bytes += text.len() as u64;
        rel.push(name);
    }
    (rel, bytes)
}

fn main() {
    let args: Vec<String> = std::env::args().collect();
    // `cargo test --benches` passes `--test`: nothing to measure there.
    if args.iter().any(|a| a == "--list" || a == "--test") {
        return;
    }
    let parax = parax_binary();
    let dir = std::env::temp_dir().join(format!("parax-bench-corpus-{}", std::process::id()));
    let (rel, bytes) = write_corpus(&dir);
    let cores = std::thread::available_parallelism().map_or(1, |n| n.get());

    // `cat` of every file, one process, output discarded; file names passed as
    // arguments (10,000 short relative names, far under ARG_MAX).
    let cat = || {
        let mut c = Command::new("cat");
        c.args(&rel).current_dir(&dir);
        c
    };
    let check = |threads: Option<usize>| {
        let mut c = Command::new(&parax);
        c.args(["check", "-q", "."]).current_dir(&dir);
        match threads {
            Some(n) => c.env("RAYON_NUM_THREADS", n.to_string()),
            None => c.env_remove("RAYON_NUM_THREADS"),
        };
        c
    };
    let cases: [(&str, CommandMaker<'_>); 3] = [
        ("cat (one process)", Box::new(cat)),
        (
            "parax check -q, RAYON_NUM_THREADS=1",
            Box::new(move || check(Some(1))),
        ),
        ("parax check -q, all cores", Box::new(move || check(None))),
    ];
    // No errors (exit 0); the notes on strong prescriptions are printed, as in use.
    let out = check(None).output().expect("parax runs");
    assert!(
        out.status.success(),
        "parax check on the corpus is not clean:\n{}",
        String::from_utf8_lossy(&out.stdout)
            .chars()
            .take(4000)
            .collect::<String>()
    );
    let notes = String::from_utf8_lossy(&out.stdout)
        .matches(": info P")
        .count();

    let mut timings: Vec<Timing> = cases
        .iter()
        .map(|_| Timing {
            wall: vec![],
            cpu: vec![],
        })
        .collect();
    for (_, make) in &cases {
        run(&mut make()); // warm-up: page cache, binary
    }
    for _ in 0..RUNS {
        for (t, (_, make)) in timings.iter_mut().zip(&cases) {
            let (wall, cpu) = run(&mut make());
            t.wall.push(wall);
            t.cpu.push(cpu);
        }
    }

    let n = rel.len() as f64;
    let mb = bytes as f64 / 1e6;
    let cat_median = timings[0].median();
    println!(
        "\n{} files, {:.2} MB, in {}; {cores} core(s); medians of {RUNS}",
        rel.len(),
        mb,
        dir.display()
    );
    println!(
        "binary: {}; parax check prints {notes} note(s) and no error",
        parax.display()
    );
    println!(
        "{:<38} {:>9} {:>11} {:>8} {:>12} {:>11}",
        "command", "ms", "files/s", "MB/s", "time ÷ cat", "cores busy"
    );
    for ((name, _), t) in cases.iter().zip(&timings) {
        let m = t.median();
        println!(
            "{name:<38} {:>9.1} {:>11.0} {:>8.1} {:>11.2}× {:>11.2}",
            m.as_secs_f64() * 1e3,
            n / m.as_secs_f64(),
            mb / m.as_secs_f64(),
            m.as_secs_f64() / cat_median.as_secs_f64(),
            t.cores_busy()
        );
    }
    let one = timings[1].median().as_secs_f64();
    let all = timings[2].median().as_secs_f64();
    println!(
        "speed-up, all cores over one thread: {:.2}× on {cores} core(s)",
        one / all
    );

    floor(&dir, &rel, cat_median);

    if std::env::var_os("PARAX_BENCH_KEEP").is_none() {
        let _ = std::fs::remove_dir_all(&dir);
    } else {
        // Also the 5 MB file of the eval benchmarks, beside (not in) the corpus.
        let big = dir.with_extension("long-history.parax");
        std::fs::write(&big, corpus::big_file(corpus::BIG_FILE_BYTES))
            .expect("write the 5 MB file");
        println!(
            "kept the corpus in {} and the 5 MB file as {}",
            dir.display(),
            big.display()
        );
    }
}

// pest_derive without `std` writes `alloc::` paths.
extern crate alloc;

/// The project's pest grammar, generated once more here so that the benchmark
/// can time the grammar alone: no tree walk, no evaluation, no output.
#[derive(pest_derive::Parser)]
#[grammar = "../../grammar/parax.pest"]
struct Grammar;

/// Lower bounds of `parax check` on one thread, in this process, over the same
/// files: reading them (open, size, read, close: `cat`'s work without the
/// output), and reading them plus running the pest grammar over each file's text
/// (one `file` rule per file, which is at most what the parser's per-block runs
/// do). `parax check` cannot be faster than the second row; when that row is
/// slower than `cat`, no tree walk or evaluation, however fast, meets "no slower
/// than `cat` on one thread" with this grammar and this parser generator.
fn floor(dir: &Path, rel: &[String], cat: Duration) {
    let read_all = || -> Vec<String> {
        rel.iter()
            .map(|r| std::fs::read_to_string(dir.join(r)).expect("read a corpus file"))
            .collect()
    };
    let median = |f: &dyn Fn() -> usize| {
        let mut t: Vec<Duration> = (0..RUNS)
            .map(|_| {
                let start = Instant::now();
                std::hint::black_box(f());
                start.elapsed()
            })
            .collect();
        t.sort();
        t[t.len() / 2]
    };
    let read = median(&|| read_all().len());
    let grammar = median(&|| {
        read_all()
            .iter()
            .map(|text| {
                Grammar::parse(Rule::file, text)
                    .expect("the corpus is valid")
                    .count()
            })
            .sum()
    });
    println!("\nfloors, one thread, in this process (medians of {RUNS}):");
    for (name, t) in [
        ("read every file (no output)", read),
        ("read + pest grammar alone (no tree walk)", grammar),
    ] {
        println!(
            "{name:<44} {:>9.1} ms {:>8.2}× cat",
            t.as_secs_f64() * 1e3,
            t.as_secs_f64() / cat.as_secs_f64()
        );
    }
}
