//! Parse + evaluate throughput of parax text against serde_json reading the same
//! facts as JSON into the same model (`parax_eval::Case`), on the generated
//! 10,000-file corpus and on one 5 MB file (the performance requirement:
//! within 4× of serde_json, stretch 3×).
//!
//! Run: `cargo bench -p parax-eval --bench throughput`. Criterion reports each
//! benchmark (throughput in bytes of its own input: parax text or JSON); a closing
//! table, from the same samples, compares the two sides by time, which is the fair measure since both read
//! the same facts (the JSON is `serde_json::to_string` of the case evaluated from
//! the text).
//!
//! What each side does:
//! - `parax parse`: text → syntax tree (`parax_syntax::parse`).
//! - `parax parse+evaluate`: text → model + derived values + diagnostics
//!   (`evaluate_source` = parse, lower, compute, check `expect` lines).
//! - `parax evaluate (pre-parsed)`: lower + compute from an existing tree.
//! - `json deserialize`: JSON → model (`serde_json::from_str::<Case>`).
//! - `json deserialize+evaluate_case`: JSON → model + derived values.
//! - `model evaluate_case`: compute alone, from an existing model; subtracted from
//!   `parax parse+evaluate` it gives text → model (parse + lower).

mod corpus;

use criterion::{Criterion, SamplingMode, Throughput};
use parax_eval::{evaluate, evaluate_case, evaluate_source, Case, EvalOptions};
use std::cell::RefCell;
use std::collections::HashMap;
use std::hint::black_box;
use std::time::{Duration, Instant};

/// One input set: the texts, their JSON, and pre-built trees and models.
struct Set {
    name: &'static str,
    texts: Vec<String>,
    jsons: Vec<String>,
    text_bytes: u64,
    json_bytes: u64,
}

/// `text` evaluated, its case as JSON; checks that the JSON derives the same values.
fn json_of(text: &str) -> String {
    let (_, ev) = evaluate_source(text);
    let json = serde_json::to_string(&ev.case).expect("a case serializes");
    // The JSON side must read the same facts and derive the same values.
    // (Not `back == ev.case`: serde_json's default float parser may differ from
    // Rust's in the last bit, e.g. 0.0075842696629213465.)
    let back: Case = serde_json::from_str(&json).expect("the JSON reads back");
    let (derived, _) = evaluate_case(&back, EvalOptions::default());
    let shown =
        |d: &[parax_eval::Derived]| d.iter().map(|d| (d.key(), d.text())).collect::<Vec<_>>();
    assert_eq!(
        shown(&derived),
        shown(&ev.derived),
        "the JSON model derives other values"
    );
    json
}

/// The case of the large file as JSON, built piece by piece: each piece is lowered
/// alone and its spans moved by the piece's offset. Used because evaluating the
/// whole 5 MB file at once can take minutes (see the scaling probe).
fn json_of_parts(parts: &[String]) -> serde_json::Value {
    fn shift(v: &mut serde_json::Value, by: u64) {
        match v {
            serde_json::Value::Object(m) => {
                let is_span = m.len() == 2
                    && m.get("start").is_some_and(|x| x.is_u64())
                    && m.get("end").is_some_and(|x| x.is_u64());
                if is_span {
                    for k in ["start", "end"] {
                        let x = m[k].as_u64().expect("checked");
                        m[k] = (x + by).into();
                    }
                } else {
                    m.values_mut().for_each(|x| shift(x, by));
                }
            }
            serde_json::Value::Array(a) => a.iter_mut().for_each(|x| shift(x, by)),
            _ => {}
        }
    }
    let mut whole = serde_json::to_value(evaluate_source(&parts[0]).1.case).expect("serializes");
    let mut offset = parts[0].len() as u64;
    for p in &parts[1..] {
        let mut v = serde_json::to_value(evaluate_source(p).1.case).expect("serializes");
        shift(&mut v, offset);
        // The case model is the `case` block's facts and one file-ordered
        // list of blocks: a later part's blocks follow the earlier ones.
        let items = v["blocks"]
            .as_array_mut()
            .expect("a list")
            .drain(..)
            .collect::<Vec<_>>();
        whole["blocks"]
            .as_array_mut()
            .expect("a list")
            .extend(items);
        offset += p.len() as u64;
    }
    whole
}

impl Set {
    fn new(name: &'static str, texts: Vec<String>) -> Set {
        let jsons = texts.iter().map(|t| json_of(t)).collect();
        Set::with_json(name, texts, jsons)
    }

    /// The 5 MB file, its JSON built piece by piece (checked on a prefix).
    fn big() -> Set {
        let small = corpus::big_file_parts(200_000);
        let direct =
            serde_json::to_value(evaluate_source(&small.concat()).1.case).expect("serializes");
        assert_eq!(
            json_of_parts(&small),
            direct,
            "piecewise JSON differs from the whole file's"
        );
        let parts = corpus::big_file_parts(corpus::BIG_FILE_BYTES);
        let json = json_of_parts(&parts).to_string();
        assert!(
            serde_json::from_str::<Case>(&json).is_ok(),
            "the large JSON reads back"
        );
        Set::with_json("file-5MB", vec![parts.concat()], vec![json])
    }

    fn with_json(name: &'static str, texts: Vec<String>, jsons: Vec<String>) -> Set {
        Set {
            name,
            text_bytes: texts.iter().map(|t| t.len() as u64).sum(),
            json_bytes: jsons.iter().map(|t| t.len() as u64).sum(),
            texts,
            jsons,
        }
    }

    fn parse(&self) {
        for t in &self.texts {
            black_box(parax_syntax::parse(black_box(t)));
        }
    }
    fn parse_evaluate(&self) {
        for t in &self.texts {
            black_box(evaluate_source(black_box(t)));
        }
    }
    fn json_deserialize(&self) {
        for j in &self.jsons {
            black_box(serde_json::from_str::<Case>(black_box(j)).expect("valid JSON"));
        }
    }
    fn json_deserialize_evaluate(&self) {
        for j in &self.jsons {
            let case = serde_json::from_str::<Case>(black_box(j)).expect("valid JSON");
            black_box(evaluate_case(&case, EvalOptions::default()));
            black_box(case);
        }
    }
}

fn parsed(set: &Set) -> Vec<parax_syntax::Parsed> {
    set.texts.iter().map(|t| parax_syntax::parse(t)).collect()
}
fn models(set: &Set) -> Vec<Case> {
    set.jsons
        .iter()
        .map(|j| serde_json::from_str(j).expect("valid JSON"))
        .collect()
}

/// Per-iteration times of every sample criterion took, by benchmark, so that the
/// closing table reuses criterion's own measurements instead of timing again.
type Samples = RefCell<HashMap<&'static str, Vec<Duration>>>;

/// Time `iters` calls of `f`, each after an untimed `setup`, and record the mean.
fn timed<T>(
    samples: &Samples,
    key: &'static str,
    iters: u64,
    setup: impl Fn() -> T,
    f: impl Fn(&T),
) -> Duration {
    let mut total = Duration::ZERO;
    for _ in 0..iters {
        let input = setup();
        let start = Instant::now();
        f(&input);
        total += start.elapsed();
        drop(input);
    }
    samples
        .borrow_mut()
        .entry(key)
        .or_default()
        .push(total / iters as u32);
    total
}

const PARSE: &str = "parax parse";
const FULL: &str = "parax parse+evaluate";
const LOWER_COMPUTE: &str = "parax evaluate (pre-parsed)";
const COMPUTE: &str = "model evaluate_case (pre-built)";
const DE: &str = "json deserialize";
const DE_FULL: &str = "json deserialize+evaluate_case";

/// Run the group for `set`; `evaluate_steps: false` leaves out every step that evaluates.
fn bench_set(
    c: &mut Criterion,
    set: &Set,
    evaluate_steps: bool,
) -> HashMap<&'static str, Vec<Duration>> {
    let samples = Samples::default();
    let s = &samples;
    let mut g = c.benchmark_group(set.name);
    g.sample_size(10)
        .warm_up_time(Duration::from_secs(1))
        .measurement_time(Duration::from_secs(5))
        .sampling_mode(SamplingMode::Flat);
    g.throughput(Throughput::Bytes(set.text_bytes));
    g.bench_function(PARSE, |b| {
        b.iter_custom(|n| timed(s, PARSE, n, || (), |_| set.parse()))
    });
    if evaluate_steps {
        g.bench_function(FULL, |b| {
            b.iter_custom(|n| timed(s, FULL, n, || (), |_| set.parse_evaluate()))
        });
        g.bench_function(LOWER_COMPUTE, |b| {
            b.iter_custom(|n| {
                timed(
                    s,
                    LOWER_COMPUTE,
                    n,
                    || parsed(set),
                    |trees| trees.iter().for_each(|p| drop(black_box(evaluate(p)))),
                )
            })
        });
        g.bench_function(COMPUTE, |b| {
            b.iter_custom(|n| {
                timed(
                    s,
                    COMPUTE,
                    n,
                    || models(set),
                    |cases| {
                        cases
                            .iter()
                            .for_each(|c| drop(black_box(evaluate_case(c, EvalOptions::default()))))
                    },
                )
            })
        });
    }
    g.throughput(Throughput::Bytes(set.json_bytes));
    g.bench_function(DE, |b| {
        b.iter_custom(|n| timed(s, DE, n, || (), |_| set.json_deserialize()))
    });
    if evaluate_steps {
        g.bench_function(DE_FULL, |b| {
            b.iter_custom(|n| timed(s, DE_FULL, n, || (), |_| set.json_deserialize_evaluate()))
        });
    }
    g.finish();
    samples.into_inner()
}

/// The side-by-side table, from the medians of the measured samples (the last
/// `SAMPLES`: the ones before are criterion's warm-up).
fn summary(set: &Set, samples: &HashMap<&'static str, Vec<Duration>>) {
    let median = |key: &str| -> Option<Duration> {
        let all = samples.get(key)?;
        let mut t = all[all.len().saturating_sub(SAMPLES)..].to_vec();
        t.sort();
        Some(t[t.len() / 2])
    };
    let (Some(parse), Some(de)) = (median(PARSE), median(DE)) else {
        return; // a filter left these out
    };
    let evaluated = (
        median(FULL),
        median(LOWER_COMPUTE),
        median(COMPUTE),
        median(DE_FULL),
    );
    let mbs = |bytes: u64, d: Duration| bytes as f64 / 1e6 / d.as_secs_f64();
    let ratio = |a: Duration, b: Duration| a.as_secs_f64() / b.as_secs_f64();
    println!(
        "\n== {}: {} file(s), parax text {:.2} MB, JSON of the same facts {:.2} MB (medians of criterion's samples) ==",
        set.name,
        set.texts.len(),
        set.text_bytes as f64 / 1e6,
        set.json_bytes as f64 / 1e6
    );
    println!(
        "{:<46} {:>10} {:>12} {:>12}",
        "step", "ms", "text MB/s", "own MB/s"
    );
    let row = |name: &str, d: Duration, own: u64| {
        println!(
            "{name:<46} {:>10.1} {:>12.1} {:>12.1}",
            d.as_secs_f64() * 1e3,
            mbs(set.text_bytes, d),
            mbs(own, d)
        );
    };
    row("parax parse", parse, set.text_bytes);
    row("json deserialize", de, set.json_bytes);
    let (Some(full), Some(lower_compute), Some(compute), Some(de_full)) = evaluated else {
        println!("ratio (parax time / serde_json time; target ≤ 4×, stretch ≤ 3×):");
        println!(
            "  parse alone vs JSON deserialize: {:.2}×  (evaluating steps not measured here)",
            ratio(parse, de)
        );
        return;
    };
    let text_model = full.saturating_sub(compute);
    row(
        "parax evaluate (pre-parsed: lower+compute)",
        lower_compute,
        set.text_bytes,
    );
    row("parax parse+evaluate", full, set.text_bytes);
    // Compute on the JSON-read model stands in for compute on the text's model;
    // unless it is clearly the smaller part (not so on the 5 MB file, where compute
    // is super-linear and its speed depends on memory layout) the difference
    // means nothing.
    let split = compute.as_secs_f64() < 0.9 * full.as_secs_f64();
    if split {
        row(
            "  of which text → model (minus compute)",
            text_model,
            set.text_bytes,
        );
    }
    row(
        "model evaluate_case (compute alone)",
        compute,
        set.text_bytes,
    );
    row("json deserialize+evaluate_case", de_full, set.json_bytes);
    println!("ratios (parax time / serde_json time; target ≤ 4×, stretch ≤ 3×):");
    println!(
        "  text → model + derived  vs JSON → model + derived: {:.2}×",
        ratio(full, de_full)
    );
    println!(
        "  text → model (parse+lower) vs JSON → model:        {}",
        if split {
            format!("{:.2}×", ratio(text_model, de))
        } else {
            "n/a".into()
        }
    );
    println!(
        "  parse alone               vs JSON deserialize:     {:.2}×",
        ratio(parse, de)
    );
    println!(
        "  parse+evaluate            vs JSON deserialize:     {:.2}×",
        ratio(full, de)
    );
}

const SAMPLES: usize = 10;

fn main() {
    let args: Vec<String> = std::env::args().collect();
    if args.iter().any(|a| a == "--list") {
        return;
    }
    let corpus = Set::new("corpus-10k", corpus::corpus(corpus::CORPUS_FILES));
    corpus::assert_sample_clean(&corpus.texts, 50, None);
    let mut c = Criterion::default().configure_from_args();
    let corpus_samples = bench_set(&mut c, &corpus, true);

    // One evaluation of the 5 MB file may grow faster than linearly with size;
    // criterion needs at least 10 runs, so the evaluating steps go through
    // criterion at 5 MB only when one run is quick, are timed once when it takes
    // up to ONE_RUN_MAX_S, and are left out beyond (PARAX_BENCH_FULL=1: always
    // criterion).
    let test_mode = args.iter().any(|a| a == "--test");
    let scaling = (!test_mode).then(|| corpus::scaling_probe(2.0));
    let predicted = scaling.as_ref().map_or(0.0, |s| s.predicted);
    let criterion_ok = corpus::full_requested() || predicted <= 3.0;
    let one_run = !criterion_ok && predicted <= ONE_RUN_MAX_S;
    let big = Set::big();
    if criterion_ok {
        corpus::assert_sample_clean(&[], 1, Some(&big.texts[0]));
    } else if !one_run {
        // Every piece alone; the whole file is too slow to evaluate here.
        let parts = corpus::big_file_parts(corpus::BIG_FILE_BYTES);
        corpus::assert_sample_clean(&parts, 1, None);
    }
    let mut big_samples = bench_set(&mut c, &big, criterion_ok);
    if one_run {
        time_once(&big, &mut big_samples);
    }
    c.final_summary();
    // `cargo test --benches` runs each benchmark once (`--test`); no table there.
    if !test_mode {
        summary(&corpus, &corpus_samples);
        summary(&big, &big_samples);
        if one_run {
            println!("  (5 MB: the steps that evaluate were timed ONCE each, not by criterion; see below)");
        }
        if let Some(s) = scaling {
            println!();
            s.print();
            if !criterion_ok && !one_run {
                println!(
                    "  => the evaluating steps were NOT run on the 5 MB file (predicted {:.0} s per run); \
                     PARAX_BENCH_FULL=1 runs them",
                    s.predicted
                );
            }
        }
    }
}

/// Longest predicted single evaluation of the 5 MB file that is still timed once.
const ONE_RUN_MAX_S: f64 = 60.0;

/// Time each evaluating step of `set` once (for a file too slow for criterion),
/// checking on the way that it evaluates without errors.
fn time_once(set: &Set, samples: &mut HashMap<&'static str, Vec<Duration>>) {
    let mut once = |key: &'static str, f: &mut dyn FnMut()| {
        let start = Instant::now();
        f();
        samples.entry(key).or_default().push(start.elapsed());
    };
    let mut kept = Vec::new();
    once(FULL, &mut || {
        kept = set.texts.iter().map(|t| evaluate_source(t).1).collect()
    });
    for ev in &kept {
        let first = ev
            .diagnostics
            .iter()
            .find(|d| d.severity == parax_eval::Severity::Error);
        assert!(
            first.is_none(),
            "the 5 MB file does not check clean: {first:?}"
        );
    }
    drop(kept);
    let trees = parsed(set);
    once(LOWER_COMPUTE, &mut || {
        trees.iter().for_each(|p| drop(black_box(evaluate(p))))
    });
    drop(trees);
    let cases = models(set);
    once(COMPUTE, &mut || {
        cases
            .iter()
            .for_each(|c| drop(black_box(evaluate_case(c, EvalOptions::default()))))
    });
    drop(cases);
    once(DE_FULL, &mut || set.json_deserialize_evaluate());
}
