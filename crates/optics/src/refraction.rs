//! Refraction algebra: sphere/cylinder/axis notation, transposition,
//! spherical equivalent, meridional power, far points and power vectors.
//!
//! Power vectors follow Thibos, Wheeler & Horner (Optom Vis Sci
//! 1997;74:367–375): `M = S + C/2`, `J0 = −(C/2)·cos 2θ`,
//! `J45 = −(C/2)·sin 2θ`. Thin lenses in contact (obliquely crossed
//! cylinders) combine by adding their power vectors.
//!
//! Axes and meridians are in degrees, ISO 8429 orientation, kept in `(0, 180]`.

use serde::Serialize;

/// Cylinders with magnitude below this (dioptres) are treated as zero: the
/// axis is then undefined and written 180° (common practice).
pub const CYLINDER_EPS: f64 = 1e-9;

/// Axis differences within this many degrees of 0 or 180 snap to 180.
const AXIS_SNAP_EPS: f64 = 1e-9;

/// Normalises an axis or meridian (degrees) into `(0, 180]`; 0 becomes 180.
///
/// Values within 1e-9° of a multiple of 180 become exactly 180. Non-finite
/// input is returned unchanged.
pub fn normalize_axis(deg: f64) -> f64 {
    if !deg.is_finite() {
        return deg;
    }
    let r = deg.rem_euclid(180.0);
    if r < AXIS_SNAP_EPS || 180.0 - r < AXIS_SNAP_EPS {
        180.0
    } else {
        r
    }
}

/// The smallest angle (degrees, in `[0, 90]`) between two axes, modulo 180.
pub fn axis_difference(a: f64, b: f64) -> f64 {
    let d = (a - b).rem_euclid(180.0);
    d.min(180.0 - d)
}

/// A sphero-cylindrical power: sphere `S` (D), cylinder `C` (D), axis `θ` (deg).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct SphCyl {
    /// Sphere power, dioptres.
    pub sphere: f64,
    /// Cylinder power, dioptres (either sign).
    pub cylinder: f64,
    /// Cylinder axis, degrees in `(0, 180]`.
    pub axis: f64,
}

/// A principal meridian and the power acting in it.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Meridian {
    /// Meridian, degrees in `(0, 180]`.
    pub meridian: f64,
    /// Power in that meridian, dioptres.
    pub power: f64,
}

/// Far point of one principal meridian of an eye whose ocular refraction at a
/// correcting plane is known.
///
/// The distance is measured from the correcting plane (spectacle or corneal
/// plane): `1/F` metres. Negative means in front of the plane (a real far
/// point: myopia); positive means behind it (a virtual far point: hyperopia).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub enum FarPoint {
    /// Emmetropic meridian: the far point is at infinity.
    Infinity,
    /// Far point at a finite signed distance from the correcting plane.
    At {
        /// Signed distance from the correcting plane, metres.
        distance_m: f64,
    },
}

/// A power vector `(M, J0, J45)` in dioptres (Thibos et al. 1997).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct PowerVector {
    /// Spherical equivalent `S + C/2`.
    pub m: f64,
    /// Jackson cross-cylinder component at axes 0/90: `−(C/2)·cos 2θ`.
    pub j0: f64,
    /// Jackson cross-cylinder component at axes 45/135: `−(C/2)·sin 2θ`.
    pub j45: f64,
}

impl SphCyl {
    /// Creates a sphero-cylinder; the axis is normalised into `(0, 180]`.
    pub fn new(sphere: f64, cylinder: f64, axis: f64) -> Self {
        SphCyl {
            sphere,
            cylinder,
            axis: normalize_axis(axis),
        }
    }

    /// Transposed form `(S + C, −C, θ ± 90)`, axis normalised to `(0, 180]`.
    pub fn transposed(&self) -> SphCyl {
        SphCyl::new(
            self.sphere + self.cylinder,
            -self.cylinder,
            self.axis + 90.0,
        )
    }

    /// The same power written with a cylinder `≤ 0` (transposes if `C > 0`).
    pub fn minus_cyl(&self) -> SphCyl {
        if self.cylinder > 0.0 {
            self.transposed()
        } else {
            SphCyl::new(self.sphere, self.cylinder, self.axis)
        }
    }

    /// The same power written with a cylinder `≥ 0` (transposes if `C < 0`).
    pub fn plus_cyl(&self) -> SphCyl {
        if self.cylinder < 0.0 {
            self.transposed()
        } else {
            SphCyl::new(self.sphere, self.cylinder, self.axis)
        }
    }

    /// Spherical equivalent `S + C/2`, dioptres.
    pub fn spherical_equivalent(&self) -> f64 {
        self.sphere + self.cylinder / 2.0
    }

    /// The power vector `(M, J0, J45)` (Thibos et al. 1997).
    pub fn power_vector(&self) -> PowerVector {
        let two_theta = (2.0 * self.axis).to_radians();
        let half_c = self.cylinder / 2.0;
        PowerVector {
            m: self.sphere + half_c,
            j0: -half_c * two_theta.cos(),
            j45: -half_c * two_theta.sin(),
        }
    }

    /// Power acting in meridian `φ` (degrees): `S + C·sin²(φ − θ)`.
    pub fn meridian_power(&self, meridian_deg: f64) -> f64 {
        let s = (meridian_deg - self.axis).to_radians().sin();
        self.sphere + self.cylinder * s * s
    }

    /// The two principal meridians: first along the axis (power `S` in
    /// meridian `θ`), then perpendicular to it (power `S + C` in meridian
    /// `θ + 90`). Meridians are normalised to `(0, 180]`.
    pub fn principal_meridians(&self) -> [Meridian; 2] {
        [
            Meridian {
                meridian: normalize_axis(self.axis),
                power: self.sphere,
            },
            Meridian {
                meridian: normalize_axis(self.axis + 90.0),
                power: self.sphere + self.cylinder,
            },
        ]
    }

    /// Far points of the two principal meridians (same order as
    /// [`SphCyl::principal_meridians`]), treating `self` as the ocular
    /// refraction at its correcting plane. See [`FarPoint`] for the sign.
    pub fn far_points(&self) -> [FarPoint; 2] {
        self.principal_meridians().map(|m| far_point(m.power))
    }

    /// Combines two thin sphero-cylinders in contact (obliquely crossed
    /// cylinders) by adding power vectors; the result is in minus-cylinder
    /// form (axis 180 when the resulting cylinder vanishes).
    pub fn combine(&self, other: &SphCyl) -> SphCyl {
        self.power_vector().add(&other.power_vector()).to_sphcyl()
    }

    /// The dioptric power matrix `[[S + C sin²θ, −C sinθ cosθ], [−C sinθ cosθ, S + C cos²θ]]`.
    pub fn power_matrix(&self) -> [[f64; 2]; 2] {
        let t = self.axis.to_radians();
        let (s, c) = t.sin_cos();
        let off = -self.cylinder * s * c;
        [
            [self.sphere + self.cylinder * s * s, off],
            [off, self.sphere + self.cylinder * c * c],
        ]
    }
}

/// Far point for a single meridional refraction `power` (D) at the
/// correcting plane: [`FarPoint::Infinity`] when `|power| < 1e-12`, else `1/power` metres.
pub fn far_point(power: f64) -> FarPoint {
    if power.abs() < 1e-12 {
        FarPoint::Infinity
    } else {
        FarPoint::At {
            distance_m: 1.0 / power,
        }
    }
}

impl PowerVector {
    /// Creates a power vector from its components (dioptres).
    pub fn new(m: f64, j0: f64, j45: f64) -> Self {
        PowerVector { m, j0, j45 }
    }

    /// Blur strength `B = √(M² + J0² + J45²)`, dioptres.
    pub fn blur_strength(&self) -> f64 {
        (self.m * self.m + self.j0 * self.j0 + self.j45 * self.j45).sqrt()
    }

    /// Converts back to minus-cylinder notation: `J = √(J0² + J45²)`,
    /// `C = −2J`, `S = M + J`, `θ = ½·atan2(J45, J0)` in `(0, 180]`.
    /// When `J` is below [`CYLINDER_EPS`] the cylinder is 0 and the axis is
    /// written 180 (common practice).
    pub fn to_sphcyl(&self) -> SphCyl {
        let j = self.j0.hypot(self.j45);
        if j < CYLINDER_EPS {
            SphCyl {
                sphere: self.m,
                cylinder: 0.0,
                axis: 180.0,
            }
        } else {
            SphCyl::new(
                self.m + j,
                -2.0 * j,
                0.5 * self.j45.atan2(self.j0).to_degrees(),
            )
        }
    }

    /// Component-wise sum (lenses in contact).
    pub fn add(&self, o: &Self) -> Self {
        PowerVector {
            m: self.m + o.m,
            j0: self.j0 + o.j0,
            j45: self.j45 + o.j45,
        }
    }

    /// Component-wise difference `self − o` (e.g. residual astigmatism).
    pub fn sub(&self, o: &Self) -> Self {
        PowerVector {
            m: self.m - o.m,
            j0: self.j0 - o.j0,
            j45: self.j45 - o.j45,
        }
    }

    /// Multiplies every component by `k` (e.g. averaging).
    pub fn scale(&self, k: f64) -> Self {
        PowerVector {
            m: self.m * k,
            j0: self.j0 * k,
            j45: self.j45 * k,
        }
    }
}

/// Magnitude of the residual cylinder (D) left when a cylinder of power
/// `cylinder` is rotated by `rotation_deg` from its intended axis:
/// `2·|C|·sin α`.
pub fn rotation_residual_cylinder(cylinder: f64, rotation_deg: f64) -> f64 {
    2.0 * cylinder.abs() * rotation_deg.to_radians().sin().abs()
}

/// The largest axis rotation (degrees) of a cylinder `cylinder` that keeps the
/// residual cylinder within `residual` D: `asin(residual / 2|C|)`.
/// `None` when any rotation stays within the limit (`residual ≥ 2|C|`).
pub fn max_rotation_for_residual(cylinder: f64, residual: f64) -> Option<f64> {
    let ratio = residual.abs() / (2.0 * cylinder.abs());
    if ratio >= 1.0 || ratio.is_nan() {
        None
    } else {
        Some(ratio.asin().to_degrees())
    }
}
