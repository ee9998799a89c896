//! Verifying a received spectacle lens against the order. Tolerances of
//! **ANSI Z80.1-2015** (American National Standard for Ophthalmics, Prescription
//! Spectacle Lenses, 2015 edition), as summarised in the standard's quick
//! reference guide. Other standards' tables are not offered until their numbers
//! are confirmed from the standard itself.

use crate::refraction::SphCyl;

/// The standard and edition every tolerance below comes from.
pub const STANDARD: &str = "ANSI Z80.1-2015";

/// ANSI Z80.1-2015: sphere (meridian of highest absolute power) ±0.13 D up to
/// 6.50 D, ±2% beyond. D.
pub fn sphere_tolerance(meridian_power: f64) -> f64 {
    let p = meridian_power.abs();
    if p <= 6.5 {
        0.13
    } else {
        0.02 * p
    }
}

/// ANSI Z80.1-2015: cylinder ±0.13 D up to 2.00, ±0.15 up to 4.50, ±4% beyond. D.
pub fn cylinder_tolerance(cylinder: f64) -> f64 {
    let c = cylinder.abs();
    if c <= 2.0 {
        0.13
    } else if c <= 4.5 {
        0.15
    } else {
        0.04 * c
    }
}

/// ANSI Z80.1-2015: axis tolerance by ordered cylinder: ±14° (0.12–0.25 D),
/// ±7° (≤0.50), ±5° (≤0.75), ±3° (≤1.50), ±2° (>1.50). Degrees; `None` below
/// 0.12 D (no axis to check).
pub fn axis_tolerance(cylinder: f64) -> Option<f64> {
    let c = cylinder.abs();
    Some(if c < 0.12 {
        return None;
    } else if c <= 0.25 {
        14.0
    } else if c <= 0.5 {
        7.0
    } else if c <= 0.75 {
        5.0
    } else if c <= 1.5 {
        3.0
    } else {
        2.0
    })
}

/// ANSI Z80.1-2015: add ±0.12 D up to 4.00, ±0.18 beyond.
pub fn add_tolerance(add: f64) -> f64 {
    if add.abs() <= 4.0 {
        0.12
    } else {
        0.18
    }
}

/// ANSI Z80.1-2015: unwanted prism at the reference point, single lens, Δ.
pub const PRISM_TOLERANCE: f64 = 0.33;
/// ANSI Z80.1-2015: mounted pair vertical imbalance, Δ (applies up to 3.375 D).
pub const VERTICAL_IMBALANCE_TOLERANCE: f64 = 0.33;
/// ANSI Z80.1-2015: mounted pair horizontal imbalance, Δ (applies up to 2.75 D).
pub const HORIZONTAL_IMBALANCE_TOLERANCE: f64 = 0.67;

/// One checked component.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Check {
    /// Ordered value (D or degrees).
    pub ordered: f64,
    /// Measured value.
    pub measured: f64,
    /// Allowed deviation either side.
    pub tolerance: f64,
}

impl Check {
    /// Measured minus ordered (axis differences folded into −90..90).
    pub fn deviation(&self) -> f64 {
        self.measured - self.ordered
    }

    /// Within tolerance (a hair of slack for decimal rounding).
    pub fn passes(&self) -> bool {
        self.deviation().abs() <= self.tolerance + 1e-9
    }
}

/// Sphere, cylinder and axis checks of a received lens.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Verification {
    /// Power in the ordered lens's meridian of highest absolute power.
    pub sphere: Check,
    /// Cylinder magnitude (both in minus-cylinder form).
    pub cylinder: Check,
    /// Axis, when the ordered cylinder is 0.12 D or more.
    pub axis: Option<Check>,
}

/// Compare `measured` with `ordered` by ANSI Z80.1-2015.
pub fn verify(ordered: &SphCyl, measured: &SphCyl) -> Verification {
    let o = ordered.minus_cyl();
    let m = measured.minus_cyl();
    let strongest = o
        .principal_meridians()
        .into_iter()
        .max_by(|a, b| a.power.abs().total_cmp(&b.power.abs()))
        .expect("two meridians");
    let sphere = Check {
        ordered: strongest.power,
        measured: m.meridian_power(strongest.meridian),
        tolerance: sphere_tolerance(strongest.power),
    };
    let cylinder = Check {
        ordered: o.cylinder,
        measured: m.cylinder,
        tolerance: cylinder_tolerance(o.cylinder),
    };
    let axis = axis_tolerance(o.cylinder).map(|tol| {
        let mut d = m.axis - o.axis;
        while d > 90.0 {
            d -= 180.0;
        }
        while d <= -90.0 {
            d += 180.0;
        }
        Check {
            ordered: o.axis,
            measured: o.axis + d,
            tolerance: tol,
        }
    });
    Verification {
        sphere,
        cylinder,
        axis,
    }
}

/// ANSI Z80.1-2015: the mounted-pair vertical imbalance tolerance applies to
/// lenses of up to this power in the vertical meridian, D.
pub const VERTICAL_IMBALANCE_UP_TO: f64 = 3.375;
/// ANSI Z80.1-2015: the mounted-pair horizontal imbalance tolerance applies to
/// lenses of up to this power in the horizontal meridian, D.
pub const HORIZONTAL_IMBALANCE_UP_TO: f64 = 2.75;
/// ANSI Z80.1-2015: above [`HORIZONTAL_IMBALANCE_UP_TO`] the distance between the
/// optical centres may differ from the ordered pupillary distance by this much,
/// metres: "≤ ±2.5 mm from specified distance interpupillary distance" in the
/// quick reference guide of the standard (read).
pub const CENTRE_DISTANCE_TOLERANCE: f64 = 0.0025;

/// The mounted-pair imbalance tolerance for one direction: `Some(tolerance Δ)`
/// when the stronger of the two lenses' powers in that meridian is within the
/// band the prism tolerance applies to, `None` above it.
pub fn mounted_imbalance_tolerance(vertical: bool, meridian_powers: [f64; 2]) -> Option<f64> {
    let p = meridian_powers[0].abs().max(meridian_powers[1].abs());
    let (up_to, tol) = if vertical {
        (VERTICAL_IMBALANCE_UP_TO, VERTICAL_IMBALANCE_TOLERANCE)
    } else {
        (HORIZONTAL_IMBALANCE_UP_TO, HORIZONTAL_IMBALANCE_TOLERANCE)
    };
    (p <= up_to + 1e-9).then_some(tol)
}
