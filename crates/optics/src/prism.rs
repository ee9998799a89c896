//! Prism by Prentice's rule in vector form (`P = F·c` with the power matrix),
//! base directions per eye, and the imbalance between the eyes.
//!
//! Coordinates: x horizontal (positive to the right as seen facing the patient,
//! i.e. toward the patient's left), y vertical (positive up), decentrations in
//! metres of the viewing point from the optical centre.

use crate::refraction::SphCyl;

/// Which eye, for naming horizontal base directions.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Eye {
    /// Right eye: nasal is +x.
    Right,
    /// Left eye: nasal is −x.
    Left,
}

impl Eye {
    /// +1 when +x is nasal for this eye, −1 otherwise.
    pub fn nasal_sign(self) -> f64 {
        match self {
            Eye::Right => 1.0,
            Eye::Left => -1.0,
        }
    }
}

/// Prism at a viewing point, prism dioptres (Δ), split into base-in (+) / base-out
/// (−) and base-up (+) / base-down (−).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Prism {
    /// Horizontal component: positive base in, negative base out.
    pub base_in: f64,
    /// Vertical component: positive base up, negative base down.
    pub base_up: f64,
}

impl Prism {
    /// Resultant prism, Δ.
    pub fn magnitude(&self) -> f64 {
        self.base_in.hypot(self.base_up)
    }

    /// `1.60 BI`, `3.00 BD`, … for one component (empty base word when ~0).
    pub fn describe(&self) -> String {
        let h = if self.base_in >= 0.0 { "BI" } else { "BO" };
        let v = if self.base_up >= 0.0 { "BU" } else { "BD" };
        format!(
            "{:.2}Δ {h}, {:.2}Δ {v}",
            self.base_in.abs(),
            self.base_up.abs()
        )
    }
}

/// Prentice's rule for a thin spherocylinder: prism at the point `nasal_m`
/// nasal and `up_m` above the optical centre of the `eye`'s lens. The base
/// vector is `−F·c` (c in cm): toward the centre for plus power, away for minus.
pub fn prentice(lens: &SphCyl, eye: Eye, nasal_m: f64, up_m: f64) -> Prism {
    let f = lens.power_matrix();
    let cx = nasal_m * 100.0 * eye.nasal_sign();
    let cy = up_m * 100.0;
    let bx = -(f[0][0] * cx + f[0][1] * cy);
    let by = -(f[1][0] * cx + f[1][1] * cy);
    Prism {
        base_in: bx * eye.nasal_sign(),
        base_up: by,
    }
}

/// Vertical imbalance between the eyes, Δ: the difference of the vertical
/// components (a base-down in one eye adds to a base-up in the other).
pub fn vertical_imbalance(right: &Prism, left: &Prism) -> f64 {
    (right.base_up - left.base_up).abs()
}

/// Net horizontal prism of the pair, Δ: positive base in, negative base out.
pub fn horizontal_net(right: &Prism, left: &Prism) -> f64 {
    right.base_in + left.base_in
}

/// Vertical imbalance tolerated before symptoms are likely, Δ (clinical rule of
/// thumb: Optician CPD article; common practice).
pub const VERTICAL_TOLERANCE: f64 = 1.0;
/// Horizontal prism tolerated before symptoms are likely, Δ (same source).
pub const HORIZONTAL_TOLERANCE: f64 = 3.0;
/// Vertical imbalance at the reading point above which slab-off is worth
/// considering, Δ (common practice, quoted as 1 to 1.5).
pub const SLAB_OFF_CONSIDER: f64 = 1.5;
