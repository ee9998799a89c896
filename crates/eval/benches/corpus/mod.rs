//! Deterministic generator of invented `.parax` case files for the benchmarks.
//!
//! Shared by `crates/eval/benches/throughput.rs`, `crates/eval/benches/memory.rs`
//! and `crates/cli/benches/check_vs_cat.rs` (the latter two include it with
//! `#[path]`), so every benchmark measures the same corpus.
//!
//! Every file is invented: no real person, clinic or measurement. The `expect`
//! lines are computed here from the generated inputs with the textbook formulas
//! (spherical equivalent, keratometric power, step-along vergence, ray-transfer
//! matrices), independently of `parax-eval`, and written at the precision shown,
//! so a generated file checks clean; [`assert_checks_clean`] verifies that.
#![allow(dead_code)] // each bench uses a different part of this module

/// A seeded xorshift64* generator.
///
/// Hand-rolled rather than the `rand` crate: the corpus must be byte-for-byte the
/// same on every machine and every run (so figures are comparable over time), and
/// `rand` does not promise value stability across versions. Eight lines here
/// are also one dependency fewer; statistical quality is irrelevant for this use.
pub struct Rng(u64);

impl Rng {
    /// A generator for `seed` (any value; 0 is remapped).
    pub fn new(seed: u64) -> Self {
        // splitmix64 scramble so that neighbouring seeds give unrelated streams.
        let mut z = seed.wrapping_add(0x9E37_79B9_7F4A_7C15);
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^= z >> 31;
        Rng(if z == 0 { 0x2545_F491_4F6C_DD1D } else { z })
    }

    /// Next 64 random bits.
    pub fn next_u64(&mut self) -> u64 {
        let mut x = self.0;
        x ^= x >> 12;
        x ^= x << 25;
        x ^= x >> 27;
        self.0 = x;
        x.wrapping_mul(0x2545_F491_4F6C_DD1D)
    }

    /// Uniform in `0..n`.
    pub fn below(&mut self, n: u64) -> u64 {
        self.next_u64() % n
    }

    /// Uniform in `lo..=hi`.
    pub fn int(&mut self, lo: i64, hi: i64) -> i64 {
        lo + self.below((hi - lo + 1) as u64) as i64
    }

    /// A multiple of `step` in `lo..=hi` (both multiples of `step`).
    pub fn steps(&mut self, lo: f64, hi: f64, step: f64) -> f64 {
        let n = ((hi - lo) / step).round() as i64;
        lo + self.int(0, n) as f64 * step
    }

    /// True with probability `p`.
    pub fn chance(&mut self, p: f64) -> bool {
        ((self.next_u64() >> 11) as f64 / (1u64 << 53) as f64) < p
    }

    /// One of `items`.
    pub fn pick<'a>(&mut self, items: &[&'a str]) -> &'a str {
        items[self.below(items.len() as u64) as usize]
    }
}

/// The seed every benchmark uses.
pub const SEED: u64 = 0x5EED_0A11;
/// Files in the corpus.
pub const CORPUS_FILES: usize = 10_000;
/// Size of the single large file.
pub const BIG_FILE_BYTES: usize = 5 * 1024 * 1024;

const NOTES: &[&str] = &[
    "new frame requested; contact lens trial next visit",
    "reports glare when driving at night",
    "prefers the previous frame; check the fitting",
    "computer work most of the day",
    "first examination at this practice",
    "symptoms settled since the last visit",
];
const TAGS: &[&str] = &[
    "annual-review",
    "myopia",
    "presbyopia",
    "contact-lens",
    "referral",
    "recheck",
];
const FRAMES: &[&str] = &[
    "thin metal, round eye",
    "acetate, square",
    "rimless",
    "half-rim titanium",
    "sports wrap",
];
const LABELS: &[[&str; 3]] = &[
    ["A", "B", "C"],
    ["L1", "L2", "L3"],
    ["objective", "field", "eyepiece"],
];
const COMMENTS: &[&str] = &[
    "measured in the trial frame",
    "subjective, binocular balance",
    "retinoscopy confirmed",
    "cycloplegic not needed",
];

/// `YYYY-MM-DD` for day `n` counted from 2000-01-01 (months of 28 days keep it simple).
fn date(n: u64) -> String {
    let y = 2000 + n / (12 * 28);
    let m = 1 + (n / 28) % 12;
    let d = 1 + n % 28;
    format!("{y:04}-{m:02}-{d:02}")
}

/// Signed power with two decimals and its sign, `+1.50` / `-0.75`.
fn p2(x: f64) -> String {
    let x = if x.abs() < 0.005 { 0.0 } else { x };
    format!("{x:+.2}")
}

/// An axis written 1..=180.
fn norm_axis(a: i64) -> i64 {
    let a = a.rem_euclid(180);
    if a == 0 {
        180
    } else {
        a
    }
}

/// One `eye` block. `dated` gives the header a visit date (the large file repeats eyes).
/// A refraction: sphere, cylinder (minus form, 0 for none), axis.
type Rx = (f64, f64, i64);

/// A refraction as most are: mild, and about one in six strong enough (over 4 D
/// in a meridian) that parax adds a note on the corneal-plane power.
fn draw_rx(rng: &mut Rng) -> Rx {
    let s = if rng.chance(0.15) {
        rng.steps(-10.0, 6.0, 0.25)
    } else {
        rng.steps(-3.5, 3.0, 0.25)
    };
    let c = if rng.chance(0.2) {
        0.0
    } else {
        rng.steps(-2.0, -0.25, 0.25)
    };
    (s, c, rng.int(1, 180))
}

/// The fellow eye of `rx`: the two eyes of one person are alike (within 0.75 D,
/// mirrored axes), with a real anisometropia now and then.
fn fellow_rx(rng: &mut Rng, (fs, fc, fa): Rx) -> Rx {
    let ds = if rng.chance(0.03) {
        rng.steps(-3.0, 3.0, 0.25)
    } else {
        rng.steps(-0.75, 0.75, 0.25)
    };
    let c = if fc == 0.0 {
        0.0
    } else {
        (fc + rng.steps(-0.25, 0.25, 0.25)).min(-0.25)
    };
    (fs + ds, c, norm_axis(180 - fa + rng.int(-5, 5)))
}

/// One `eye` block with refraction `rx`; `visit` gives the header a date (the
/// large file repeats eyes).
fn eye_block(
    rng: &mut Rng,
    out: &mut String,
    side: &str,
    visit: Option<&str>,
    vertex_mm: i64,
    (s, c, a): Rx,
) {
    use std::fmt::Write;
    match visit {
        Some(d) => writeln!(out, "eye {side} {d}").unwrap(),
        None => writeln!(out, "eye {side}").unwrap(),
    }
    let comment = if rng.chance(0.4) {
        format!("  # {}", rng.pick(COMMENTS))
    } else {
        String::new()
    };
    if c == 0.0 {
        writeln!(out, "  refraction {} @ {vertex_mm} mm{comment}", p2(s)).unwrap();
    } else {
        writeln!(
            out,
            "  refraction {} / {} x {a} @ {vertex_mm} mm{comment}",
            p2(s),
            p2(c)
        )
        .unwrap();
    }
    if rng.chance(0.5) {
        writeln!(out, "  add {}", p2(rng.steps(0.75, 3.0, 0.25))).unwrap();
    }
    // Keratometry: two principal meridians 90° apart, as radii (mm) or as K (D).
    let m1 = rng.int(1, 180);
    let m2 = norm_axis(m1 + 90);
    let (k1, k2);
    if rng.chance(0.75) {
        let r1 = rng.int(720, 840) as f64 / 100.0;
        let r2 = r1 - rng.int(0, 30) as f64 / 100.0;
        writeln!(out, "  keratometry {r1:.2} mm x {m1}, {r2:.2} mm x {m2}").unwrap();
        k1 = 0.3375 / (r1 / 1000.0);
        k2 = 0.3375 / (r2 / 1000.0);
    } else {
        k1 = rng.steps(40.0, 47.0, 0.25);
        k2 = k1 + rng.steps(0.0, 2.5, 0.25);
        writeln!(out, "  keratometry {k1:.2} D x {m1}, {k2:.2} D x {m2}").unwrap();
    }
    if rng.chance(0.3) {
        writeln!(out, "  note \"{}\"", rng.pick(NOTES)).unwrap();
    }
    writeln!(out, "  expect spherical-equivalent {} D", p2(s + c / 2.0)).unwrap();
    writeln!(out, "  expect mean-k {:.2} D", (k1 + k2) / 2.0).unwrap();
    if c != 0.0 && rng.chance(0.5) {
        // The plus-cylinder form: (S + C) / −C x (θ ± 90).
        writeln!(
            out,
            "  expect plus-cyl {} / {} x {}",
            p2(s + c),
            p2(-c),
            norm_axis(a + 90)
        )
        .unwrap();
    }
    out.push('\n');
}

/// The expected results of a thin-lens system, computed here by step-along vergence
/// and ray-transfer matrices. `None` when the layout is degenerate (an image at
/// infinity or on a lens), so the caller draws again.
struct SystemResult {
    image_m: f64,
    magnification: Option<f64>,
    equivalent: f64,
    back_vertex: f64,
}

fn solve_system(
    object_m: Option<f64>,
    lenses: &[f64],
    gaps: &[(f64, f64)],
) -> Option<SystemResult> {
    let mut vergence = object_m.map_or(0.0, |l| -1.0 / l);
    let mut n = 1.0;
    let mut mag = 1.0;
    // Matrix (a b; c d) on (y, nu), starting at the first lens.
    let (mut a, mut b, mut c, mut d) = (1.0f64, 0.0f64, 0.0f64, 1.0f64);
    for (i, &f) in lenses.iter().enumerate() {
        let out = vergence + f;
        if out.abs() < 0.2 {
            return None;
        }
        mag *= vergence / out;
        vergence = out;
        // refraction: c -= f·a, d -= f·b
        c -= f * a;
        d -= f * b;
        if let Some(&(len, index)) = gaps.get(i) {
            let denom = 1.0 - (len / index) * vergence;
            if denom.abs() < 0.05 {
                return None;
            }
            vergence /= denom;
            n = index;
            // transfer: a += (len/n)·c, b += (len/n)·d
            a += len / index * c;
            b += len / index * d;
        }
    }
    let image_m = n / vergence;
    if image_m.abs() > 5.0 || a.abs() < 0.05 || c.abs() < 0.1 {
        return None;
    }
    Some(SystemResult {
        image_m,
        magnification: object_m.map(|_| mag),
        equivalent: -c,
        back_vertex: -c / a,
    })
}

/// One `system` block named `name`.
fn system_block(rng: &mut Rng, out: &mut String, name: &str) {
    use std::fmt::Write;
    let labels = LABELS[rng.below(LABELS.len() as u64) as usize];
    loop {
        let count = rng.int(2, 3) as usize;
        let object_cm = if rng.chance(0.25) {
            None
        } else {
            Some(rng.int(25, 100) as f64)
        };
        let lenses: Vec<f64> = (0..count)
            .map(|_| {
                if rng.chance(0.2) {
                    rng.steps(-8.0, -1.0, 0.25)
                } else {
                    rng.steps(2.0, 12.0, 0.25)
                }
            })
            .collect();
        let gaps: Vec<(f64, f64)> = (0..count - 1)
            .map(|_| {
                (
                    rng.int(2, 30) as f64,
                    if rng.chance(0.15) { 1.336 } else { 1.0 },
                )
            })
            .collect();
        let gaps_m: Vec<(f64, f64)> = gaps.iter().map(|&(cm, n)| (cm / 100.0, n)).collect();
        let Some(r) = solve_system(object_cm.map(|cm| cm / 100.0), &lenses, &gaps_m) else {
            continue;
        };
        writeln!(out, "system \"{name}\"").unwrap();
        if rng.chance(0.3) {
            writeln!(out, "  # invented bench layout; thin lenses, paraxial").unwrap();
        }
        match object_cm {
            Some(cm) => writeln!(out, "  object {cm} cm before {}", labels[0]).unwrap(),
            None => writeln!(out, "  object at infinity").unwrap(),
        }
        for (i, f) in lenses.iter().enumerate() {
            writeln!(out, "  lens {} {} D", labels[i], p2(*f)).unwrap();
            if let Some(&(cm, index)) = gaps.get(i) {
                if index == 1.0 {
                    writeln!(out, "  gap {cm} cm").unwrap();
                } else {
                    writeln!(out, "  gap {cm} cm index {index}").unwrap();
                }
            }
        }
        let last = labels[count - 1];
        let cm = r.image_m * 100.0;
        let dir = if cm < 0.0 { "before" } else { "after" };
        writeln!(out, "  expect image {:.2} cm {dir} {last}", cm.abs()).unwrap();
        if let Some(m) = r.magnification {
            writeln!(out, "  expect magnification {m:.4}").unwrap();
            let kind = if r.image_m > 0.0 { "real" } else { "virtual" };
            let erect = if m > 0.0 { "erect" } else { "inverted" };
            writeln!(out, "  expect image-kind {kind} {erect}").unwrap();
        }
        writeln!(out, "  expect equivalent-power {} D", p2(r.equivalent)).unwrap();
        writeln!(out, "  expect back-vertex-power {} D", p2(r.back_vertex)).unwrap();
        out.push('\n');
        return;
    }
}

fn frame_block(rng: &mut Rng, out: &mut String, name: &str, vertex_mm: i64) {
    use std::fmt::Write;
    writeln!(out, "frame \"{name}\"").unwrap();
    writeln!(out, "  vertex {vertex_mm} mm").unwrap();
    if rng.chance(0.3) {
        writeln!(out, "  note \"{}\"", rng.pick(NOTES)).unwrap();
    }
    out.push('\n');
}

/// Case file number `i`: a `case` block, both eyes, a frame and a lens system.
pub fn case_file(i: usize) -> String {
    use std::fmt::Write;
    let mut rng = Rng::new(SEED ^ (i as u64).wrapping_mul(0x9E37_79B9));
    let mut out = String::with_capacity(1500);
    writeln!(
        out,
        "# Invented benchmark case {i}: no real person or clinic; the numbers are generated."
    )
    .unwrap();
    writeln!(out, "case \"Bench clinic {i:05}: review\"").unwrap();
    writeln!(out, "  date {}", date(rng.below(9000))).unwrap();
    writeln!(out, "  age {} y", rng.int(8, 85)).unwrap();
    if rng.chance(0.6) {
        writeln!(out, "  note \"{}\"", rng.pick(NOTES)).unwrap();
    }
    writeln!(out, "  tag {}", rng.pick(TAGS)).unwrap();
    out.push('\n');
    // Same vertex for the refraction and the frame (no frame-vertex notes).
    let vertex = rng.int(10, 14);
    let right = draw_rx(&mut rng);
    let left = fellow_rx(&mut rng, right);
    eye_block(&mut rng, &mut out, "right", None, vertex, right);
    eye_block(&mut rng, &mut out, "left", None, vertex, left);
    let frame = rng.pick(FRAMES);
    frame_block(&mut rng, &mut out, frame, vertex);
    system_block(&mut rng, &mut out, &format!("bench relay {i}"));
    out
}

/// The corpus: `n` case files.
pub fn corpus(n: usize) -> Vec<String> {
    (0..n).map(case_file).collect()
}

/// One file of at least `bytes` bytes: a `case` block, then dated eye visits,
/// frames and systems, each with a unique name or date.
pub fn big_file(bytes: usize) -> String {
    big_file_parts(bytes).concat()
}

/// [`big_file`] in the pieces it is made of: the `case` block, then one piece per
/// visit (two dated eyes, a frame, a system). Each piece is a valid file by itself.
pub fn big_file_parts(bytes: usize) -> Vec<String> {
    use std::fmt::Write;
    let mut rng = Rng::new(SEED ^ 0xB16);
    let mut head = String::new();
    writeln!(
        head,
        "# Invented benchmark file: one long case history, generated; no real person."
    )
    .unwrap();
    writeln!(head, "case \"Bench clinic: long history\"").unwrap();
    writeln!(head, "  age 52 y").unwrap();
    writeln!(head, "  tag long-history\n").unwrap();
    let mut total = head.len();
    let mut parts = vec![head];
    let vertex = 12;
    // Visits a fortnight apart (the dates run on for two centuries: the file is
    // a stress test, not a life), of a patient whose refraction is stable: parax
    // notes any change between two close visits as fast progression.
    let right = draw_rx(&mut rng);
    let left = fellow_rx(&mut rng, right);
    let mut i = 0u64;
    while total < bytes {
        let mut out = String::with_capacity(1500);
        let visit = date(i * 14);
        eye_block(&mut rng, &mut out, "right", Some(&visit), vertex, right);
        eye_block(&mut rng, &mut out, "left", Some(&visit), vertex, left);
        frame_block(&mut rng, &mut out, &format!("frame {i}"), vertex);
        system_block(&mut rng, &mut out, &format!("bench relay {i}"));
        total += out.len();
        parts.push(out);
        i += 1;
    }
    parts
}

/// Panic unless `source` evaluates without error diagnostics. Returns the number
/// of warnings and notes (corneal-plane notes for the strong prescriptions).
pub fn assert_checks_clean(name: &str, source: &str) -> usize {
    let (_, ev) = parax_eval::evaluate_source(source);
    let errors: Vec<_> = ev
        .diagnostics
        .iter()
        .filter(|d| d.severity == parax_eval::Severity::Error)
        .collect();
    assert!(
        errors.is_empty(),
        "generated file {name} does not check clean: {} error(s), first: {:?}\n{source}",
        errors.len(),
        errors[0]
    );
    ev.diagnostics.len()
}

/// Check every `step`-th file of `files` and the whole of `big` (when given).
pub fn assert_sample_clean(files: &[String], step: usize, big: Option<&str>) {
    let mut other = 0;
    for (i, f) in files.iter().enumerate().step_by(step.max(1)) {
        other += assert_checks_clean(&format!("#{i}"), f);
    }
    if let Some(b) = big {
        other += assert_checks_clean("(5 MB file)", b);
    }
    if other > 0 {
        eprintln!("note: the checked sample has {other} warning(s)/note(s) and no errors");
    }
}

/// How the time of one `evaluate_source` grows with the size of one file.
pub struct Scaling {
    /// (bytes, seconds) per measured size, doubling.
    pub points: Vec<(usize, f64)>,
    /// Growth exponent between the last two sizes (1 = linear, 2 = quadratic).
    pub exponent: f64,
    /// Predicted seconds for one evaluation of `BIG_FILE_BYTES`.
    pub predicted: f64,
}

/// Time `evaluate_source` on generated files of 1/64, 1/32, … of `BIG_FILE_BYTES`,
/// doubling until the full size or until one run takes over `stop_s` seconds.
pub fn scaling_probe(stop_s: f64) -> Scaling {
    let mut points = Vec::new();
    let mut size = BIG_FILE_BYTES / 64;
    loop {
        let text = big_file(size);
        let start = std::time::Instant::now();
        std::hint::black_box(parax_eval::evaluate_source(&text));
        let t = start.elapsed().as_secs_f64();
        points.push((text.len(), t));
        if size >= BIG_FILE_BYTES || t > stop_s {
            break;
        }
        size = (size * 2).min(BIG_FILE_BYTES);
    }
    let (b1, t1) = points[points.len().saturating_sub(2)];
    let (b2, t2) = points[points.len() - 1];
    let exponent = if b2 > b1 {
        (t2 / t1).ln() / (b2 as f64 / b1 as f64).ln()
    } else {
        1.0
    };
    let predicted = t2 * (BIG_FILE_BYTES as f64 / b2 as f64).powf(exponent.max(1.0));
    Scaling {
        points,
        exponent,
        predicted,
    }
}

impl Scaling {
    /// Print the probe as a small table.
    pub fn print(&self) {
        println!("one parse+evaluate of a generated file, by size (is it linear?):");
        for (b, t) in &self.points {
            println!(
                "  {:>9} bytes  {:>9.3} s  {:>8.2} MB/s",
                b,
                t,
                *b as f64 / 1e6 / t
            );
        }
        println!(
            "  growth exponent {:.2} (1 = linear); predicted for {:.1} MB: {:.1} s",
            self.exponent,
            BIG_FILE_BYTES as f64 / 1e6,
            self.predicted
        );
    }
}

/// True when the slow steps should run at full size whatever the prediction.
pub fn full_requested() -> bool {
    std::env::var_os("PARAX_BENCH_FULL").is_some()
}
