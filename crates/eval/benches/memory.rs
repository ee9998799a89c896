//! Peak heap while parsing and evaluating the 5 MB generated file, as a multiple of
//! the input size (the requirement: under 10×). Prints a table; no criterion.
//!
//! Run: `cargo bench -p parax-eval --bench memory`.

mod corpus;

use std::alloc::{GlobalAlloc, Layout, System};
use std::hint::black_box;
use std::sync::atomic::{AtomicUsize, Ordering::Relaxed};

/// Counts live heap bytes and their high-water mark around `System`.
///
/// Hand-rolled rather than a crate (dhat, stats_alloc, jemalloc's stats): it is
/// twenty lines, needs no dependency, and measures exactly what we want — bytes
/// requested from the allocator by this process, peak since the last reset — with
/// no sampling and no allocator change. It lives in its own bench binary so the
/// atomic bookkeeping does not slow the throughput benchmarks.
struct Counting;

static CURRENT: AtomicUsize = AtomicUsize::new(0);
static PEAK: AtomicUsize = AtomicUsize::new(0);

fn grew(by: usize) {
    let now = CURRENT.fetch_add(by, Relaxed) + by;
    PEAK.fetch_max(now, Relaxed);
}

// SAFETY: every call is forwarded unchanged to `System`; only counters are added.
unsafe impl GlobalAlloc for Counting {
    unsafe fn alloc(&self, layout: Layout) -> *mut u8 {
        let p = System.alloc(layout);
        if !p.is_null() {
            grew(layout.size());
        }
        p
    }
    unsafe fn alloc_zeroed(&self, layout: Layout) -> *mut u8 {
        let p = System.alloc_zeroed(layout);
        if !p.is_null() {
            grew(layout.size());
        }
        p
    }
    unsafe fn dealloc(&self, ptr: *mut u8, layout: Layout) {
        System.dealloc(ptr, layout);
        CURRENT.fetch_sub(layout.size(), Relaxed);
    }
    unsafe fn realloc(&self, ptr: *mut u8, layout: Layout, new_size: usize) -> *mut u8 {
        let p = System.realloc(ptr, layout, new_size);
        if !p.is_null() {
            if new_size >= layout.size() {
                grew(new_size - layout.size());
            } else {
                CURRENT.fetch_sub(layout.size() - new_size, Relaxed);
            }
        }
        p
    }
}

#[global_allocator]
static ALLOC: Counting = Counting;

/// Heap bytes above the level at the start: (peak during `f`, still held by its result).
fn measure<T>(f: impl FnOnce() -> T) -> (usize, usize, T) {
    let base = CURRENT.load(Relaxed);
    PEAK.store(base, Relaxed);
    let out = black_box(f());
    let peak = PEAK.load(Relaxed) - base;
    let held = CURRENT.load(Relaxed).saturating_sub(base);
    (peak, held, out)
}

fn mib(b: usize) -> f64 {
    b as f64 / (1024.0 * 1024.0)
}

/// Peak and held heap of each step on one file, as rows of the table.
fn table(text: &str, label: &str) {
    let n = text.len();
    let json = serde_json::to_string(&parax_eval::evaluate_source(text).1.case)
        .expect("a case serializes");
    println!(
        "\n{label}: {n} bytes of parax text ({:.2} MiB); JSON of the same facts {} bytes",
        mib(n),
        json.len()
    );
    println!("(heap above the input string, which the caller holds; 'held' = still allocated by the result)");
    println!(
        "{:<50} {:>9} {:>8} {:>9} {:>8}",
        "step", "peak MiB", "× text", "held MiB", "× text"
    );
    let row = |name: &str, peak: usize, held: usize| {
        println!(
            "{name:<50} {:>9.2} {:>7.2}× {:>9.2} {:>7.2}×",
            mib(peak),
            peak as f64 / n as f64,
            mib(held),
            held as f64 / n as f64
        );
    };
    let (peak, held, parsed) = measure(|| parax_syntax::parse(text));
    row("parax parse", peak, held);
    drop(parsed);
    let (peak, held, both) = measure(|| parax_eval::evaluate_source(text));
    row(
        "parax parse + evaluate (text → model + derived)",
        peak,
        held,
    );
    let derived = both.1.derived.len();
    drop(both);
    let (peak, held, both) = measure(|| {
        let parsed = parax_syntax::parse(text);
        let ev = parax_eval::evaluate_with(&parsed, parax_eval::EvalOptions::VALUES_ONLY);
        (parsed, ev)
    });
    row("  the same, values only", peak, held);
    drop(both);
    let mut count = 0;
    let (peak, held, both) = measure(|| {
        parax_eval::evaluate_streaming(text, parax_eval::EvalOptions::VALUES_ONLY, &mut |v| {
            count += v.len()
        })
    });
    row("  read block by block too (`parax check`)", peak, held);
    assert_eq!(count, derived, "every value is handed over");
    drop(both);
    let (peak, held, case) =
        measure(|| serde_json::from_str::<parax_eval::Case>(&json).expect("valid JSON"));
    row("serde_json deserialize (JSON → model)", peak, held);
    let (peak, held, out) =
        measure(|| parax_eval::evaluate_case(&case, parax_eval::EvalOptions::default()));
    row("evaluate_case on that model (compute alone)", peak, held);
    assert_eq!(
        out.0.len(),
        derived,
        "the JSON model derives the same values"
    );
    drop(out);
    drop(case);
    let (peak, held, out) = measure(|| {
        let case = serde_json::from_str::<parax_eval::Case>(&json).expect("valid JSON");
        drop(parax_eval::evaluate_case(
            &case,
            parax_eval::EvalOptions::default(),
        ));
        case
    });
    row("serde_json deserialize + evaluate_case", peak, held);
    drop(out);
}

fn main() {
    if std::env::args().any(|a| a == "--list" || a == "--test") {
        return;
    }
    let big = corpus::big_file(corpus::BIG_FILE_BYTES);
    let (peak, held, parsed) = measure(|| parax_syntax::parse(&big));
    drop(parsed);
    println!(
        "5 MB file ({} bytes): parax parse alone peaks at {:.2} MiB = {:.2}× the input (holds {:.2}×)",
        big.len(),
        mib(peak),
        peak as f64 / big.len() as f64,
        held as f64 / big.len() as f64
    );

    // Evaluation of one large file may grow faster than linearly; measure at the
    // full 5 MB only when that is affordable (or PARAX_BENCH_FULL=1 asks for it).
    let scaling = corpus::scaling_probe(2.0);
    scaling.print();
    if corpus::full_requested() || scaling.predicted <= 60.0 {
        corpus::assert_sample_clean(&[], 1, Some(&big));
        table(&big, "5 MB file");
    } else {
        let &(bytes, _) = scaling
            .points
            .iter()
            .rev()
            .find(|p| p.1 <= 10.0)
            .unwrap_or(&scaling.points[0]);
        println!(
            "\nNOT measured at 5 MB: one evaluation is predicted to take {:.0} s (set PARAX_BENCH_FULL=1 to run it).\n\
             Peak multiples below are for the largest affordable size; they hardly depend on size (see the smaller one).",
            scaling.predicted
        );
        for b in [bytes / 4, bytes] {
            let text = corpus::big_file(b);
            corpus::assert_sample_clean(&[], 1, Some(&text));
            table(
                &text,
                &format!("prefix of the 5 MB file, {:.2} MB", text.len() as f64 / 1e6),
            );
        }
    }

    // The 10,000-file corpus, one file at a time as `parax check` does per thread.
    let files = corpus::corpus(corpus::CORPUS_FILES);
    let mut worst = 0.0f64;
    let mut worst_peak = 0;
    for f in &files {
        let (peak, _, r) = measure(|| parax_eval::evaluate_source(f));
        drop(r);
        let ratio = peak as f64 / f.len() as f64;
        if ratio > worst {
            worst = ratio;
            worst_peak = peak;
        }
    }
    println!("\n10,000-file corpus, one file at a time: worst peak {worst_peak} bytes = {worst:.2}× that file's size");
}
