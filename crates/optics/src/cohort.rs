//! Statistics of a cohort of refractions, done on power vectors: the mean and
//! standard deviation of M, J0 and J45 component by component, and the mean
//! written back as sphere / cylinder × axis (Thibos, Wheeler & Horner, "Power
//! vectors: an application of Fourier analysis to the description and
//! statistical analysis of refractive error", Optom Vis Sci 1997). Averaging
//! sphere, cylinder and axis directly is wrong (axes 1° and 179° are neighbours);
//! the power-vector components are Cartesian and may be averaged.

use crate::refraction::{PowerVector, SphCyl};

/// The summary of a cohort.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct CohortSummary {
    /// Number of refractions.
    pub count: usize,
    /// Mean of each component.
    pub mean: PowerVector,
    /// Sample standard deviation (divisor n − 1) of each component; `None` for a
    /// single refraction.
    pub sd: Option<PowerVector>,
    /// The mean power vector as a sphero-cylinder (minus-cylinder form).
    pub mean_sphcyl: SphCyl,
}

/// Summarise a cohort; `None` when it is empty.
pub fn summarize(vectors: &[PowerVector]) -> Option<CohortSummary> {
    let n = vectors.len();
    if n == 0 {
        return None;
    }
    let sum = vectors
        .iter()
        .fold(PowerVector::new(0.0, 0.0, 0.0), |a, v| a.add(v));
    let mean = sum.scale(1.0 / n as f64);
    let sd = (n > 1).then(|| {
        let sq = vectors.iter().fold([0.0; 3], |mut a, v| {
            let d = v.sub(&mean);
            a[0] += d.m * d.m;
            a[1] += d.j0 * d.j0;
            a[2] += d.j45 * d.j45;
            a
        });
        let k = 1.0 / (n - 1) as f64;
        PowerVector::new((sq[0] * k).sqrt(), (sq[1] * k).sqrt(), (sq[2] * k).sqrt())
    });
    Some(CohortSummary {
        count: n,
        mean,
        sd,
        mean_sphcyl: mean.to_sphcyl(),
    })
}
