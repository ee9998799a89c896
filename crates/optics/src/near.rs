//! Accommodation and near vision: Hofstetter's amplitudes by age, far and near
//! points, the range of clear vision through an add, and an add suggestion that
//! keeps half the amplitude in reserve (a rule of thumb).

use crate::refraction::{far_point, FarPoint};

/// Hofstetter's (1950) amplitudes of accommodation for `age` years, D:
/// `(minimum 15 − 0.25·age, mean 18.5 − 0.30·age, maximum 25 − 0.40·age)`, each
/// floored at 0.
pub fn hofstetter(age: f64) -> (f64, f64, f64) {
    (
        (15.0 - 0.25 * age).max(0.0),
        (18.5 - 0.30 * age).max(0.0),
        (25.0 - 0.40 * age).max(0.0),
    )
}

/// Range of clear vision through a near add `add` with amplitude `amplitude`,
/// distance refraction corrected: `(far, near)` distances in metres in front of
/// the spectacle plane, far = 1/add (`None` for infinity), near = 1/(add + A).
pub fn clear_range(add: f64, amplitude: f64) -> (Option<f64>, Option<f64>) {
    let far = (add > 1e-9).then(|| 1.0 / add);
    let total = add + amplitude;
    let near = (total > 1e-9).then(|| 1.0 / total);
    (far, near)
}

/// Near point of an eye of ocular refraction `refraction` (D, at the correcting
/// plane, one meridian) that accommodates by `amplitude` (D): the nearest point
/// it can focus has vergence `R − A`, so it lies at `1/(R − A)` metres from the
/// correcting plane, with the sign convention of [`far_point`] (negative: in
/// front). An emmetrope of amplitude 6.5 D sees down to 15.4 cm; a hyperope whose
/// refraction exceeds the amplitude has a virtual near point (positive distance)
/// and cannot focus any real object without correction.
pub fn near_point(refraction: f64, amplitude: f64) -> FarPoint {
    far_point(refraction - amplitude)
}

/// Add that keeps half the amplitude in reserve at working distance
/// `working_m`: `1/w − A/2`, never below zero (rule of thumb, common practice).
pub fn add_keeping_half(working_m: f64, amplitude: f64) -> f64 {
    (1.0 / working_m - amplitude / 2.0).max(0.0)
}
