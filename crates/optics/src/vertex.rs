//! Effective power and vertex-distance transfer.
//!
//! A thin lens of power `F` moved a distance `x` (metres) towards the eye has
//! the same focusing effect as a lens `F' = F / (1 − x·F)` in the new plane;
//! `x < 0` moves the lens away from the eye. Spectacle to corneal plane at
//! vertex distance `d`: `Fc = Fs / (1 − d·Fs)`. Sphero-cylinders are
//! transferred one principal meridian at a time.

use crate::refraction::SphCyl;

/// Above this absolute power (dioptres) vertex compensation usually matters:
/// at 12 mm the change reaches about 0.2 D (common practice).
pub const MEANINGFUL_CHANGE_THRESHOLD_D: f64 = 4.0;

/// Power needed in a plane `shift_m` metres closer to the eye (to the right)
/// than a lens of power `power` for the same focal point: `F / (1 − x·F)`.
///
/// Negative `shift_m` moves the plane away from the eye. When the new plane
/// lies on the focal point (`x·F = 1`) the result is infinite.
pub fn effective_power(power: f64, shift_m: f64) -> f64 {
    power / (1.0 - shift_m * power)
}

/// Transfers a sphero-cylinder `shift_m` metres towards the eye, meridian by
/// meridian. The axis is unchanged and the cylinder keeps its sign convention
/// (effective power is increasing in `F`, so the meridian order is kept).
pub fn transfer_sphcyl(rx: &SphCyl, shift_m: f64) -> SphCyl {
    let s = effective_power(rx.sphere, shift_m);
    let sc = effective_power(rx.sphere + rx.cylinder, shift_m);
    SphCyl {
        sphere: s,
        cylinder: sc - s,
        axis: rx.axis,
    }
}

/// Rounds `value` to the nearest multiple of `step` (ties away from zero),
/// e.g. `step = 0.25` for quarter-dioptre steps. A non-positive or
/// non-finite `step` returns `value` unchanged.
pub fn round_to_step(value: f64, step: f64) -> f64 {
    if !(step.is_finite() && step > 0.0) {
        return value;
    }
    (value / step).round() * step
}

/// Rounds sphere and cylinder of `rx` separately to multiples of `step`;
/// the axis is unchanged.
pub fn round_sphcyl(rx: &SphCyl, step: f64) -> SphCyl {
    SphCyl {
        sphere: round_to_step(rx.sphere, step),
        cylinder: round_to_step(rx.cylinder, step),
        axis: rx.axis,
    }
}

/// Rounds `rx` as a prescription is written for an order: sphere and cylinder
/// to multiples of `step` (see [`round_sphcyl`]) and the axis to the nearest
/// whole degree in 1..=180 (a computed axis such as 8.49° becomes 8°, 0.4°
/// becomes 180°). Orders are written in whole degrees (common practice, no
/// source).
pub fn round_order(rx: &SphCyl, step: f64) -> SphCyl {
    let mut out = round_sphcyl(rx, step);
    let axis = rx.axis.round().rem_euclid(180.0);
    out.axis = if axis == 0.0 { 180.0 } else { axis };
    out
}

/// Whether vertex compensation matters for a lens of this power:
/// `|power| > MEANINGFUL_CHANGE_THRESHOLD_D` (common practice).
pub fn compensation_matters(power: f64) -> bool {
    power.abs() > MEANINGFUL_CHANGE_THRESHOLD_D
}
