//! Tilted spectacle lenses: Martin's formula for spheres, its exact generalisation
//! to a spherocylinder tilted by pantoscopic tilt and face form together (one
//! rotation by the combined angle about an oblique axis), the compensated power to
//! order, and the optical-centre drop for pantoscopic tilt.
//!
//! Geometry. Eye coordinates as in [`crate::prism`]: x horizontal, positive to the
//! right as seen facing the patient (toward the patient's left), y up, z along the
//! line of sight out of the face toward the observer. A frame's face form is built
//! into the front, then the front is tilted pantoscopically on the face, so the
//! lens is turned by `R = Rx(p)·Ry(β)`: the lower rim moves toward the cheek and the
//! temporal edge toward the face (`β = −f` for the right eye, whose temporal side
//! is −x, and `β = +f` for the left). `R` is one rotation by the obliquity `γ`
//! (`cos γ = cos p · cos f`) about an axis in the plane normal to the line of sight,
//! after a small twist `τ` of the lens about its own normal; [`Tilt::oblique`] gives
//! the three angles.
//!
//! Power. A thin lens met by the line of sight at incidence `γ` acts, in the plane
//! normal to the line of sight, as `F_t = k(γ)·A⁻ᵀ·F·A⁻¹`, where `A` is the lens
//! plane projected onto that plane (lengths along the tilt axis kept, across it
//! shortened by `cos γ`) and `k` the obliquity factor. With Martin's factor
//! `k = 1 + sin²γ/2n` a sphere gives exactly Martin's formula about the oblique
//! axis ([`as_worn`]); with the factor of the generalised Coddington equations,
//! `k = (√(n² − sin²γ) − cos γ)/(n − 1)`, the result is the exact thin-lens power
//! through the centre ([`as_worn_exact`]); the two differ by O(sin⁴γ).
//! tests/tilt_crosscheck.rs checks both against real rays traced through a tilted
//! toric lens.
//!
//! Power matrices as in [`SphCyl::power_matrix`] (`F_yy` acts in the vertical
//! meridian); axes in the standard notation, the same for both eyes.

use crate::prism::Eye;
use crate::refraction::{PowerVector, SphCyl};

type M2 = [[f64; 2]; 2];
type M3 = [[f64; 3]; 3];

/// Martin's formula for a thin spherical lens `sphere` (D) tilted by `tilt_deg`
/// about an axis in its plane, material index `index`: the new sphere
/// `S' = S(1 + sin²a / 2n)` and the induced cylinder `C = S'·tan²a` (same sign as
/// `S`, axis along the rotation axis).
pub fn martin(sphere: f64, tilt_deg: f64, index: f64) -> (f64, f64) {
    let a = tilt_deg.to_radians();
    let s = sphere * (1.0 + a.sin().powi(2) / (2.0 * index));
    (s, s * a.tan().powi(2))
}

/// Martin's obliquity factor `1 + sin²γ / 2n`.
pub fn martin_factor(obliquity_deg: f64, index: f64) -> f64 {
    1.0 + obliquity_deg.to_radians().sin().powi(2) / (2.0 * index)
}

/// The exact obliquity factor of a thin lens traversed through its centre at
/// incidence `γ`, from the generalised Coddington equations:
/// `(n·cos γ' − cos γ)/(n − 1) = (√(n² − sin²γ) − cos γ)/(n − 1)`. Its expansion
/// to second order in `sin γ` is Martin's factor.
pub fn coddington_factor(obliquity_deg: f64, index: f64) -> f64 {
    let g = obliquity_deg.to_radians();
    ((index * index - g.sin().powi(2)).sqrt() - g.cos()) / (index - 1.0)
}

/// A spherocylinder from its power matrix `[[a, b], [b, d]]`:
/// `M = (a + d)/2`, `J0 = (a − d)/2`, `J45 = b` (inverse of
/// [`SphCyl::power_matrix`]); minus-cylinder form.
pub fn sphcyl_from_matrix(m: [[f64; 2]; 2]) -> SphCyl {
    PowerVector::new(
        (m[0][0] + m[1][1]) / 2.0,
        (m[0][0] - m[1][1]) / 2.0,
        (m[0][1] + m[1][0]) / 2.0,
    )
    .to_sphcyl()
}

/// The tilt of a lens before one eye, degrees.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Tilt {
    /// Pantoscopic tilt (rotation about the horizontal axis, lower rim toward the
    /// cheek), degrees.
    pub pantoscopic_deg: f64,
    /// Face form (wrap: rotation about the vertical axis, temporal edge toward the
    /// face), degrees.
    pub face_form_deg: f64,
    /// The eye the lens is before: face form turns the two lenses in opposite
    /// senses.
    pub eye: Eye,
}

/// A tilt as one rotation: the lens twisted by `twist_deg` about its own normal,
/// then turned by `angle_deg` about the axis at `axis_deg` (standard notation,
/// 0–180) in the plane normal to the line of sight.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Oblique {
    /// The combined tilt, degrees, signed: a right-handed rotation about the axis
    /// direction `axis_deg`; its size is the obliquity `γ` (`cos γ = cos p · cos f`).
    pub angle_deg: f64,
    /// Direction of the rotation axis, degrees, standard notation.
    pub axis_deg: f64,
    /// Twist of the lens about its own normal before the tilt, degrees
    /// (counter-clockwise positive); zero when only one tilt is present.
    pub twist_deg: f64,
}

fn mul3(a: &M3, b: &M3) -> M3 {
    let mut c = [[0.0; 3]; 3];
    for (i, row) in c.iter_mut().enumerate() {
        for (j, v) in row.iter_mut().enumerate() {
            *v = (0..3).map(|k| a[i][k] * b[k][j]).sum();
        }
    }
    c
}

fn mul2(a: &M2, b: &M2) -> M2 {
    let mut c = [[0.0; 2]; 2];
    for (i, row) in c.iter_mut().enumerate() {
        for (j, v) in row.iter_mut().enumerate() {
            *v = a[i][0] * b[0][j] + a[i][1] * b[1][j];
        }
    }
    c
}

fn transpose2(a: &M2) -> M2 {
    [[a[0][0], a[1][0]], [a[0][1], a[1][1]]]
}

fn inverse2(a: &M2) -> M2 {
    let det = a[0][0] * a[1][1] - a[0][1] * a[1][0];
    [
        [a[1][1] / det, -a[0][1] / det],
        [-a[1][0] / det, a[0][0] / det],
    ]
}

/// `Mᵀ·F·M` for 2×2 matrices.
fn congruence(f: &M2, m: &M2) -> M2 {
    mul2(&mul2(&transpose2(m), f), m)
}

impl Tilt {
    /// A tilt before `eye`.
    pub fn new(pantoscopic_deg: f64, face_form_deg: f64, eye: Eye) -> Tilt {
        Tilt {
            pantoscopic_deg,
            face_form_deg,
            eye,
        }
    }

    /// The rotation `R = Rx(p)·Ry(β)` taking the lens's own axes (columns) into
    /// eye coordinates; `β = −f` for the right eye, `+f` for the left.
    pub fn rotation(&self) -> [[f64; 3]; 3] {
        let (sp, cp) = self.pantoscopic_deg.to_radians().sin_cos();
        let beta = match self.eye {
            Eye::Right => -self.face_form_deg,
            Eye::Left => self.face_form_deg,
        };
        let (sb, cb) = beta.to_radians().sin_cos();
        let rx = [[1.0, 0.0, 0.0], [0.0, cp, -sp], [0.0, sp, cp]];
        let ry = [[cb, 0.0, sb], [0.0, 1.0, 0.0], [-sb, 0.0, cb]];
        mul3(&rx, &ry)
    }

    /// Total obliquity `γ`, with `cos γ = cos p · cos f`.
    pub fn obliquity_deg(&self) -> f64 {
        self.rotation()[2][2].clamp(-1.0, 1.0).acos().to_degrees()
    }

    /// The tilt as one rotation by `γ` about an oblique axis, after a twist.
    pub fn oblique(&self) -> Oblique {
        let r = self.rotation();
        // Lens normal N = R·ẑ; the tilt axis is ẑ × N (normalised), the sagittal
        // direction of the principal ray.
        let (nx, ny) = (r[0][2], r[1][2]);
        let s = nx.hypot(ny);
        let gamma = self.obliquity_deg();
        let (mut ax, mut ay) = if s < 1e-15 {
            (1.0, 0.0)
        } else {
            (-ny / s, nx / s)
        };
        // Report the axis in 0–180: turning it half round reverses the rotation.
        let mut angle_deg = gamma;
        if ay < 0.0 || (ay == 0.0 && ax < 0.0) {
            (ax, ay, angle_deg) = (-ax, -ay, -gamma);
        }
        let axis_deg = ay.atan2(ax).to_degrees().rem_euclid(180.0);
        // Twist: the projection A = B·diag(1, cos γ)·Bᵀ·Rz(τ), so
        // Rz(τ) = B·diag(1, 1/cos γ)·Bᵀ·A.
        let a = self.projection();
        let b: M2 = [[ax, -ay], [ay, ax]];
        let stretch: M2 = [[1.0, 0.0], [0.0, 1.0 / gamma.to_radians().cos()]];
        let rz = mul2(&mul2(&mul2(&b, &stretch), &transpose2(&b)), &a);
        Oblique {
            angle_deg,
            axis_deg,
            twist_deg: rz[1][0].atan2(rz[0][0]).to_degrees(),
        }
    }

    /// The lens plane projected along the line of sight onto the plane normal to
    /// it: columns are the lens's own x and y axes seen by the eye (the upper-left
    /// block of [`Tilt::rotation`]).
    pub fn projection(&self) -> [[f64; 2]; 2] {
        let r = self.rotation();
        [[r[0][0], r[0][1]], [r[1][0], r[1][1]]]
    }
}

/// `F_t = k·A⁻ᵀ·F·A⁻¹` for the projection `A` of the tilt.
fn tilted(f: &M2, tilt: Tilt, k: f64) -> M2 {
    let ai = inverse2(&tilt.projection());
    let m = congruence(f, &ai);
    [[k * m[0][0], k * m[0][1]], [k * m[1][0], k * m[1][1]]]
}

/// `F = Aᵀ·F_t·A / k`, the inverse of [`tilted`].
fn untilted(ft: &M2, tilt: Tilt, k: f64) -> M2 {
    let m = congruence(ft, &tilt.projection());
    [[m[0][0] / k, m[0][1] / k], [m[1][0] / k, m[1][1] / k]]
}

/// Power of a thin spherocylinder `lens` of index `index` as worn with `tilt`,
/// by Martin's formula applied about the oblique axis of the combined tilt:
/// `F_t = (1 + sin²γ / 2n)·A⁻ᵀ·F·A⁻¹`.
///
/// For a sphere this is exactly Martin's formula about the oblique axis (sphere
/// `S(1 + sin²γ/2n)`, cylinder `S'·tan²γ` along the axis of [`Tilt::oblique`]);
/// with one tilt only, about the horizontal (pantoscopic) or vertical (face form)
/// axis. For a cylinder the lens's meridians are carried by the same rotation.
/// It differs from the exact thin-lens power ([`as_worn_exact`]) only through the
/// obliquity factor, by O(sin⁴γ): under 0.005 D for 15 D at 10°.
pub fn as_worn(lens: &SphCyl, tilt: Tilt, index: f64) -> SphCyl {
    let k = martin_factor(tilt.obliquity_deg(), index);
    sphcyl_from_matrix(tilted(&lens.power_matrix(), tilt, k))
}

/// Exact thin-lens power as worn through the centre: the generalised Coddington
/// equations applied to both surfaces, `F_t = k·A⁻ᵀ·F·A⁻¹` with
/// [`coddington_factor`].
pub fn as_worn_exact(lens: &SphCyl, tilt: Tilt, index: f64) -> SphCyl {
    let k = coddington_factor(tilt.obliquity_deg(), index);
    sphcyl_from_matrix(tilted(&lens.power_matrix(), tilt, k))
}

/// The lens to order so that its as-worn power ([`as_worn`]) with `tilt` equals
/// `wanted`: the exact inverse `F = Aᵀ·F_t·A / (1 + sin²γ / 2n)` (the mapping is
/// linear in the power matrix).
pub fn compensated(wanted: &SphCyl, tilt: Tilt, index: f64) -> SphCyl {
    let k = martin_factor(tilt.obliquity_deg(), index);
    sphcyl_from_matrix(untilted(&wanted.power_matrix(), tilt, k))
}

/// Optical-centre drop for pantoscopic tilt: about 0.5 mm per degree (common
/// practice, no source). Metres.
pub fn optical_centre_drop(pantoscopic_deg: f64) -> f64 {
    0.0005 * pantoscopic_deg
}
