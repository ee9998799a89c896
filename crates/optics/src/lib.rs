//! Pure paraxial and clinical optics for parax.
//!
//! This crate is mathematics only: it knows nothing of text, spans or I/O.
//! The evaluator turns parsed case files into calls on these functions.
//!
//! # Units at the API
//!
//! - Lengths and distances are in **metres** (`_m` suffix where ambiguous).
//! - Powers and vergences are in **dioptres** (D = 1/m).
//! - Angles (cylinder axes, meridians) are in **degrees**.
//! - [`units`] converts other units (cm, mm, ...) to these bases.
//!
//! # Sign conventions
//!
//! - Light travels from left to right.
//! - Distances measured from a surface or lens are negative to the left and
//!   positive to the right; a radius of curvature is positive when its centre
//!   lies to the right of the surface.
//! - Vergence is reduced: `L = n / l`, with `l` in metres and `n` the index of
//!   the medium in which `l` is measured.
//! - Cylinder axes and meridians follow ISO 8429: 0° is the right-hand
//!   horizontal seen from in front of the patient, angles grow
//!   counter-clockwise, and both eyes use the same scale. Axes are kept in
//!   `(0, 180]`: an axis of 0° is written 180° (common practice).
//!
//! # Modules
//!
//! - [`cohort`]: mean and standard deviation of a cohort's power vectors.
//! - [`units`]: dimensions, units and conversions.
//! - [`refraction`]: sphere/cylinder/axis algebra and power vectors.
//! - [`vertex`]: effective power and vertex-distance transfer.
//! - [`keratometry`]: keratometric and true corneal power, corneal astigmatism.
//! - [`system`]: thin lenses, refracting surfaces and gaps; step-along vergence
//!   and ray-transfer matrices; cardinal points.
//! - [`tilt`]: tilted spectacle lenses (Martin's formula and its matrix form).
//! - [`prism`]: Prentice's rule, base directions, imbalance.
//! - [`lens_form`]: sags, thickness, spectacle magnification.
//! - [`verify`]: received-lens tolerances of ANSI Z80.1-2015.
//! - [`contact`]: corneal-plane power, soft and rigid contact lenses.
//! - [`near`]: amplitude of accommodation and near ranges.
//! - [`model_eye`]: published schematic eyes and refraction from axial length.
//! - [`iol`]: intraocular lens power (vergence formula, SRK/T).
//!
//! # Example
//!
//! ```
//! use parax_optics::vertex::effective_power;
//! // A -8.00 D spectacle lens at 12 mm corresponds to about -7.30 D at the cornea.
//! let fc = effective_power(-8.0, 0.012);
//! assert!((fc - (-7.2993)).abs() < 1e-4);
//! ```

#![forbid(unsafe_code)]
#![warn(missing_docs)]

pub mod cohort;
pub mod contact;
pub mod iol;
pub mod keratometry;
pub mod lens_form;
pub mod model_eye;
pub mod near;
pub mod prism;
pub mod refraction;
pub mod system;
pub mod tilt;
pub mod units;
pub mod verify;
pub mod vertex;

pub use refraction::{normalize_axis, FarPoint, Meridian, PowerVector, SphCyl};
pub use units::{Dimension, Range, Unit};
