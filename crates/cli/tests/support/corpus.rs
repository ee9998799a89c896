//! A generated corpus of invented case files for the batch test and benchmark:
//! deterministic (a fixed linear congruential sequence), refractions on the
//! trade's 0.25 D steps, two eyes per case, tags and years to group by.

use std::path::Path;

/// Knuth's MMIX linear congruential generator: enough for varied, reproducible
/// test data without a dependency.
struct Lcg(u64);

impl Lcg {
    fn next(&mut self, n: u64) -> u64 {
        self.0 = self
            .0
            .wrapping_mul(6_364_136_223_846_793_005)
            .wrapping_add(1_442_695_040_888_963_407);
        (self.0 >> 33) % n
    }
}

/// The text of generated case `i`.
pub fn case_text(i: usize) -> String {
    let mut g = Lcg(i as u64 + 1);
    let eye = |side: &str, g: &mut Lcg| {
        let sphere = -8.0 + 0.25 * g.next(49) as f64;
        let cylinder = -0.25 * g.next(13) as f64;
        let axis = 1 + g.next(180);
        format!("eye {side}\n  refraction {sphere:+.2} / {cylinder:+.2} x {axis} @ 12 mm\n")
    };
    let year = 2020 + g.next(6);
    let tag = ["school-screening", "myopia-clinic", "general"][g.next(3) as usize];
    let right = eye("right", &mut g);
    let left = eye("left", &mut g);
    format!(
        "# Invented, generated test case {i}: not a real patient.\n\
         case \"generated {i}\"\n  date {year}-03-15\n  tag {tag}\n\n{right}\n{left}"
    )
}

/// Write `n` generated files into `dir` (`case-00000.parax`, …).
pub fn write(dir: &Path, n: usize) {
    std::fs::create_dir_all(dir).expect("corpus dir");
    for i in 0..n {
        std::fs::write(dir.join(format!("case-{i:05}.parax")), case_text(i)).expect("write case");
    }
}
