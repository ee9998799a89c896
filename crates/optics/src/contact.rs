//! Contact lenses: the spectacle refraction at the corneal plane, a soft-lens
//! suggestion (spherical equivalent or toric), and for a rigid lens the tear lens,
//! its final power and the residual astigmatism by power vectors.

use crate::keratometry::keratometric_power;
use crate::refraction::{PowerVector, SphCyl};
use crate::vertex::transfer_sphcyl;

/// Spectacle refraction measured at `vertex_m` carried to the corneal plane, per
/// principal meridian (axis unchanged).
pub fn corneal_plane(spectacle: &SphCyl, vertex_m: f64) -> SphCyl {
    transfer_sphcyl(spectacle, vertex_m)
}

/// Cylinder at the corneal plane from which a toric soft lens is usually chosen,
/// D (common practice, no source).
pub const TORIC_FROM: f64 = 0.75;

/// Soft lens: `true` when a toric lens is suggested (|cylinder| ≥ 0.75 D at the
/// corneal plane), else a sphere of the spherical equivalent.
pub fn soft_is_toric(corneal: &SphCyl) -> bool {
    corneal.cylinder.abs() >= TORIC_FROM - 1e-9
}

/// Tear lens power between a rigid lens of back optic zone radius `base_curve_m`
/// and a cornea of flat keratometry `flat_k` (D), both in keratometric terms
/// (index 1.3375): `K(base curve) − flat K`; positive when the lens is steeper.
pub fn tear_lens(base_curve_m: f64, flat_k: f64) -> f64 {
    keratometric_power(base_curve_m, crate::keratometry::KERATOMETRIC_INDEX) - flat_k
}

/// Rigid lens back vertex power: the corneal-plane power in the flat corneal
/// meridian minus the tear lens.
pub fn rigid_power(corneal: &SphCyl, flat_meridian_deg: f64, tear: f64) -> f64 {
    corneal.meridian_power(flat_meridian_deg) - tear
}

/// The corneal astigmatism as the minus cylinder that would correct it:
/// `−(K steep − K flat) × flat meridian`.
pub fn corneal_cylinder(flat_k: f64, flat_meridian_deg: f64, steep_k: f64) -> SphCyl {
    SphCyl::new(0.0, -(steep_k - flat_k).abs(), flat_meridian_deg)
}

/// Residual astigmatism under a spherical rigid lens: refractive cylinder minus
/// corneal cylinder, subtracted as power vectors (only the J0/J45 parts), in
/// minus-cylinder form with zero spherical equivalent removed: returned as
/// `(cylinder, axis)`.
pub fn residual_astigmatism(refractive: &SphCyl, corneal_cyl: &SphCyl) -> (f64, f64) {
    let a = refractive.power_vector();
    let b = corneal_cyl.power_vector();
    let r = PowerVector::new(0.0, a.j0 - b.j0, a.j45 - b.j45).to_sphcyl();
    (r.cylinder, r.axis)
}

/// Cylinder below which a spherical rigid lens usually suffices, D (common
/// practice, no source).
pub const SPHERICAL_RIGID_BELOW: f64 = 0.75;

/// Largest difference in any meridian between two spherocylinders, D: the
/// largest absolute eigenvalue of the difference of their power matrices.
pub fn largest_meridian_difference(a: &SphCyl, b: &SphCyl) -> f64 {
    let (p, q) = (a.power_matrix(), b.power_matrix());
    let (x, y, z) = (p[0][0] - q[0][0], p[1][1] - q[1][1], p[0][1] - q[0][1]);
    let mean = (x + y) / 2.0;
    let radius = ((x - y) / 2.0).hypot(z);
    mean.abs() + radius
}

/// An ordered contact lens power differing from the computed one by this much
/// or more in some meridian is flagged, D (one 0.25 D step; common practice).
pub const ORDER_DIFFERS_FROM: f64 = 0.25;

/// Usual total diameters, metres: soft lenses 13.0 to 15.0 mm, rigid corneal
/// lenses 8.0 to 10.5 mm (common practice, no source; scleral and other special
/// designs lie outside and are not judged here).
pub const SOFT_DIAMETER: (f64, f64) = (0.013, 0.015);
/// See [`SOFT_DIAMETER`].
pub const RIGID_DIAMETER: (f64, f64) = (0.008, 0.0105);
