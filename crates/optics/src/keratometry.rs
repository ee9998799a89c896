//! Keratometry and corneal power.
//!
//! Keratometers convert an anterior corneal radius `r` into a power with a
//! fictitious keratometric index 1.3375 (`K = 0.3375 / r`, so 7.50 mm reads
//! 45.00 D). True corneal power uses both corneal surfaces, real indices and
//! the thick-lens (Gullstrand) equation `F = F1 + F2 − (t/n)·F1·F2`.
//!
//! The keratometric index is invalid after corneal refractive surgery: K then
//! overestimates true power after myopic ablation.
//!
//! Radii and thicknesses are in metres, powers in dioptres, meridians in degrees.

use serde::Serialize;

use crate::refraction::{normalize_axis, CYLINDER_EPS};

/// The keratometric index used by most keratometers.
pub const KERATOMETRIC_INDEX: f64 = 1.3375;

/// Keratometric power `(index − 1) / r` of an anterior radius `radius_m`.
pub fn keratometric_power(radius_m: f64, index: f64) -> f64 {
    (index - 1.0) / radius_m
}

/// Radius (metres) that reads `power` with keratometric index `index`:
/// the inverse of [`keratometric_power`].
pub fn keratometric_radius(power: f64, index: f64) -> f64 {
    (index - 1.0) / power
}

/// Power of a single refracting surface `(n2 − n1) / r` from index `n1`
/// (left) to `n2` (right); `r` positive when the centre lies to the right.
pub fn surface_power(n1: f64, n2: f64, radius_m: f64) -> f64 {
    (n2 - n1) / radius_m
}

/// Equivalent power of two surfaces `f1`, `f2` separated by `thickness_m` of
/// index `index` (Gullstrand equation `F1 + F2 − (t/n)·F1·F2`).
pub fn thick_lens_power(f1: f64, f2: f64, thickness_m: f64, index: f64) -> f64 {
    f1 + f2 - (thickness_m / index) * f1 * f2
}

/// Refractive indices of cornea and aqueous humour.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct CornealIndices {
    /// Index of the corneal stroma.
    pub cornea: f64,
    /// Index of the aqueous humour.
    pub aqueous: f64,
}

impl CornealIndices {
    /// Gullstrand's exact eye: cornea 1.376, aqueous 1.336.
    pub const GULLSTRAND: CornealIndices = CornealIndices {
        cornea: 1.376,
        aqueous: 1.336,
    };
    /// Le Grand's full theoretical eye: cornea 1.3771, aqueous 1.3374.
    pub const LE_GRAND: CornealIndices = CornealIndices {
        cornea: 1.3771,
        aqueous: 1.3374,
    };
}

/// Anterior, posterior and total (equivalent) corneal power, dioptres.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct TotalCornealPower {
    /// Anterior surface power, air to cornea.
    pub front: f64,
    /// Posterior surface power, cornea to aqueous (negative).
    pub back: f64,
    /// Equivalent power of the thick cornea.
    pub total: f64,
}

/// Total corneal power from anterior and posterior radii and central
/// thickness (metres), air in front.
pub fn total_corneal_power(
    front_radius_m: f64,
    back_radius_m: f64,
    thickness_m: f64,
    idx: CornealIndices,
) -> TotalCornealPower {
    let front = surface_power(1.0, idx.cornea, front_radius_m);
    let back = surface_power(idx.cornea, idx.aqueous, back_radius_m);
    TotalCornealPower {
        front,
        back,
        total: thick_lens_power(front, back, thickness_m, idx.cornea),
    }
}

/// One keratometer reading: a power in a meridian.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct KReading {
    /// Power, dioptres.
    pub power: f64,
    /// Meridian, degrees.
    pub meridian: f64,
}

/// Orientation class of an astigmatism.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize)]
pub enum AstigmatismKind {
    /// No astigmatism (cylinder below 1e-9 D).
    None,
    /// With-the-rule: minus-cylinder axis within 180 ± 30 (steep near vertical).
    WithTheRule,
    /// Against-the-rule: minus-cylinder axis within 90 ± 30 (steep near horizontal).
    AgainstTheRule,
    /// Oblique: any other axis.
    Oblique,
}

/// Classifies an astigmatism from its minus-cylinder axis (degrees):
/// with-the-rule for axes in `[150, 180] ∪ (0, 30]`, against-the-rule in
/// `[60, 120]`, oblique otherwise (±30° bands: common practice; some use
/// ±15° or ±20°). [`AstigmatismKind::None`] when `|cylinder| < 1e-9`.
pub fn classify_astigmatism(cylinder: f64, minus_cyl_axis: f64) -> AstigmatismKind {
    if cylinder.abs() < CYLINDER_EPS {
        return AstigmatismKind::None;
    }
    let a = normalize_axis(minus_cyl_axis);
    if a >= 150.0 || a <= 30.0 {
        AstigmatismKind::WithTheRule
    } else if (60.0..=120.0).contains(&a) {
        AstigmatismKind::AgainstTheRule
    } else {
        AstigmatismKind::Oblique
    }
}

/// Corneal astigmatism derived from two principal K readings.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct CornealAstigmatism {
    /// Cylinder in minus-cylinder form, `flat − steep` (≤ 0), dioptres.
    pub cylinder: f64,
    /// Minus-cylinder axis: the flat meridian, in `(0, 180]`
    /// (180 when there is no cylinder).
    pub axis: f64,
    /// Orientation class.
    pub kind: AstigmatismKind,
    /// Mean of the two readings, dioptres.
    pub mean_k: f64,
    /// The flatter (lower-power) reading, meridian normalised.
    pub flat: KReading,
    /// The steeper (higher-power) reading, meridian normalised.
    pub steep: KReading,
}

/// Corneal astigmatism from two K readings (assumed to be the principal
/// meridians). The cylinder is written as the correcting cylinder, minus
/// form: power `flat − steep` at the flat meridian as axis, as keratometric
/// cylinder is customarily written (the cornea's excess power lies in the
/// steep meridian). With equal readings the first is reported as flat.
pub fn corneal_astigmatism(a: KReading, b: KReading) -> CornealAstigmatism {
    let norm = |k: KReading| KReading {
        power: k.power,
        meridian: normalize_axis(k.meridian),
    };
    let (flat, steep) = if a.power <= b.power {
        (norm(a), norm(b))
    } else {
        (norm(b), norm(a))
    };
    let raw = flat.power - steep.power;
    let (cylinder, axis) = if raw.abs() < CYLINDER_EPS {
        (0.0, 180.0)
    } else {
        (raw, flat.meridian)
    };
    CornealAstigmatism {
        cylinder,
        axis,
        kind: classify_astigmatism(cylinder, axis),
        mean_k: 0.5 * (a.power + b.power),
        flat,
        steep,
    }
}
