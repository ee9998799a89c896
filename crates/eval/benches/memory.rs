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

fn main() {
    if std::env::args().any(|a| a == "--list") {
        return;
    }
    let big = corpus::big_file(corpus::BIG_FILE_BYTES);
    corpus::assert_sample_clean(&[], 1, Some(&big));
    let n = big.len();
    let json = serde_json::to_string(&parax_eval::evaluate_source(&big).1.case)
        .expect("a case serializes");

    println!("peak heap, 5 MB file: {n} bytes of parax text ({:.2} MiB); JSON of the same facts {} bytes", mib(n), json.len());
    println!("(heap above the input string, which the caller holds; 'held' = still allocated by the result)");
    println!(
        "{:<44} {:>10} {:>8} {:>10} {:>8}",
        "step", "peak MiB", "× input", "held MiB", "× input"
    );
    let row = |name: &str, peak: usize, held: usize, input: usize| {
        println!(
            "{name:<44} {:>10.2} {:>7.2}× {:>10.2} {:>7.2}×",
            mib(peak),
            peak as f64 / input as f64,
            mib(held),
            held as f64 / input as f64
        );
    };

    let (peak, held, parsed) = measure(|| parax_syntax::parse(&big));
    row("parax parse", peak, held, n);
    drop(parsed);
    let (peak, held, both) = measure(|| parax_eval::evaluate_source(&big));
    row(
        "parax parse + evaluate (text → model + derived)",
        peak,
        held,
        n,
    );
    let (_, ev) = both;
    let derived = ev.derived.len();
    drop(ev);
    let (peak, held, case) =
        measure(|| serde_json::from_str::<parax_eval::Case>(&json).expect("valid JSON"));
    row("serde_json deserialize (vs parax text size)", peak, held, n);
    let (peak, held, out) = measure(|| parax_eval::evaluate_case(&case));
    row("evaluate_case on that model (compute only)", peak, held, n);
    assert_eq!(
        out.0.len(),
        derived,
        "the JSON model derives the same values"
    );
    drop(out);
    drop(case);
    let (peak, held, out) = measure(|| {
        let case = serde_json::from_str::<parax_eval::Case>(&json).expect("valid JSON");
        parax_eval::evaluate_case(&case);
        case
    });
    row("serde_json deserialize + evaluate_case", peak, held, n);
    drop(out);

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
    println!(
        "10,000-file corpus, one file at a time: worst peak {worst_peak} bytes = {worst:.2}× that file's size"
    );
}
