//! Unit spellings of the notation and the quantities keywords take: dimension,
//! the unit the trade writes when it writes none, and the plausible range.

use parax_optics::units::{Dimension, Unit};

/// The unit a spelling stands for. `DS` and `DC` are the trade's dioptre spellings
/// for sphere and cylinder; `°` and `deg`, `Δ` and `prism` are equal.
pub fn unit_of(symbol: &str) -> Option<Unit> {
    Some(match symbol {
        "D" | "DS" | "DC" => Unit::Dioptre,
        "m" => Unit::Metre,
        "cm" => Unit::Centimetre,
        "mm" => Unit::Millimetre,
        "deg" | "°" => Unit::Degree,
        "Δ" | "prism" => Unit::PrismDioptre,
        "y" => Unit::Year,
        _ => return None,
    })
}

/// A number written `decimals` places after the point in unit `from`, written
/// in unit `to` keeping the written precision: each factor of ten the unit
/// shrinks by moves one decimal (12.5 mm → 1.25 cm → 0.0125 m), and trailing
/// zeros (and a trailing point) are left out.
pub fn written_in(value: f64, decimals: u32, from: Unit, to: Unit) -> String {
    let converted = from.convert(value, to);
    let places = (decimals as i32 + from.decimal_shift(to)).max(0) as usize;
    let s = format!("{converted:.places$}");
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// Plain name of a dimension, for messages.
pub fn dimension_name(d: Dimension) -> &'static str {
    match d {
        Dimension::Power => "a power (D)",
        Dimension::Length => "a length (mm, cm, m)",
        Dimension::Angle => "an angle (deg)",
        Dimension::Prism => "a prism (Δ)",
        Dimension::Time => "an age (y)",
        Dimension::Ratio => "a plain number",
    }
}

/// A physical quantity a keyword takes.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct QuantitySpec {
    /// What it is, for messages: "vertex distance".
    pub what: &'static str,
    /// Its dimension.
    pub dimension: Dimension,
    /// The unit understood when none is written, for quantities the trade writes
    /// bare (powers in a refraction, axes, refractive indices); `None` means a bare
    /// number is a missing-unit diagnostic.
    pub bare: Option<Unit>,
    /// The unit a missing-unit fix inserts and messages use.
    pub usual: Unit,
    /// Plausible range in base units (D, m, deg, Δ, y) [CP: ranges met in practice].
    pub min: f64,
    /// Upper end of the plausible range.
    pub max: f64,
}

macro_rules! spec {
    ($name:ident, $what:literal, $dim:ident, $bare:expr, $usual:ident, $min:expr, $max:expr) => {
        #[doc = concat!("The ", $what, ".")]
        pub const $name: QuantitySpec = QuantitySpec {
            what: $what,
            dimension: Dimension::$dim,
            bare: $bare,
            usual: Unit::$usual,
            min: $min,
            max: $max,
        };
    };
}

// Ranges are [CP]: what practice meets, wide enough that a real case never trips
// them and narrow enough to catch a unit slip (13 m for 13 mm, 78 mm for 7.8 mm).
spec!(
    SPHERE,
    "sphere",
    Power,
    Some(Unit::Dioptre),
    Dioptre,
    -30.0,
    30.0
);
spec!(
    CYLINDER,
    "cylinder",
    Power,
    Some(Unit::Dioptre),
    Dioptre,
    -10.0,
    10.0
);
spec!(AXIS, "axis", Angle, Some(Unit::Degree), Degree, 0.0, 180.0);
spec!(
    MERIDIAN,
    "meridian",
    Angle,
    Some(Unit::Degree),
    Degree,
    0.0,
    180.0
);
spec!(
    ADD,
    "reading addition",
    Power,
    Some(Unit::Dioptre),
    Dioptre,
    0.25,
    4.0
);
spec!(
    VERTEX,
    "vertex distance",
    Length,
    None,
    Millimetre,
    0.0,
    0.025
);
spec!(
    CORNEAL_RADIUS,
    "corneal radius",
    Length,
    None,
    Millimetre,
    0.0055,
    0.0100
);
spec!(
    POSTERIOR_RADIUS,
    "posterior corneal radius",
    Length,
    None,
    Millimetre,
    0.0045,
    0.0085
);
spec!(
    K_POWER,
    "keratometric power",
    Power,
    None,
    Dioptre,
    33.0,
    61.0
);
spec!(
    CORNEAL_THICKNESS,
    "corneal thickness",
    Length,
    None,
    Millimetre,
    0.0003,
    0.0008
);
spec!(
    AXIAL_LENGTH,
    "axial length",
    Length,
    None,
    Millimetre,
    0.018,
    0.035
);
spec!(
    PD,
    "monocular pupillary distance",
    Length,
    None,
    Millimetre,
    0.020,
    0.045
);
spec!(AGE, "age", Time, None, Year, 0.0, 120.0);
spec!(INDEX, "refractive index", Ratio, None, Degree, 1.0, 2.0);
spec!(TILT, "pantoscopic tilt", Angle, None, Degree, -10.0, 25.0);
spec!(
    FACE_FORM,
    "face form angle",
    Angle,
    None,
    Degree,
    -5.0,
    35.0
);
spec!(
    FITTING_HEIGHT,
    "fitting height",
    Length,
    None,
    Millimetre,
    0.008,
    0.040
);
spec!(
    READING_DROP,
    "reading drop",
    Length,
    None,
    Millimetre,
    0.0,
    0.020
);
spec!(
    NEAR_INSET,
    "near inset",
    Length,
    None,
    Millimetre,
    0.0,
    0.006
);
spec!(
    CENTRE_DISTANCE,
    "distance between optical centres",
    Length,
    None,
    Millimetre,
    0.040,
    0.090
);
spec!(
    LENS_POWER,
    "lens power",
    Power,
    None,
    Dioptre,
    -100.0,
    100.0
);
spec!(GAP, "gap", Length, None, Centimetre, 0.0, 20.0);
spec!(
    OBJECT_DISTANCE,
    "object distance",
    Length,
    None,
    Centimetre,
    0.0,
    1000.0
);
spec!(
    TOLERANCE_POWER,
    "tolerance",
    Power,
    Some(Unit::Dioptre),
    Dioptre,
    0.0,
    5.0
);
spec!(
    LENS_THICKNESS,
    "thickness",
    Length,
    None,
    Millimetre,
    0.0003,
    0.030
);
spec!(DIAMETER, "diameter", Length, None, Millimetre, 0.005, 0.090);
spec!(
    BOXED_SIZE,
    "boxed lens size",
    Length,
    None,
    Millimetre,
    0.015,
    0.080
);
spec!(
    DISTANCE_BETWEEN_LENSES,
    "distance between lenses",
    Length,
    None,
    Millimetre,
    0.010,
    0.030
);
spec!(
    EFFECTIVE_DIAMETER,
    "effective diameter",
    Length,
    None,
    Millimetre,
    0.020,
    0.090
);
spec!(
    CL_BASE_CURVE,
    "base curve radius",
    Length,
    None,
    Millimetre,
    0.0060,
    0.0100
);
spec!(
    BASE_CURVE_POWER,
    "base curve",
    Power,
    Some(Unit::Dioptre),
    Dioptre,
    0.0,
    20.0
);
spec!(PRISM, "prism", Prism, None, PrismDioptre, 0.0, 20.0);
spec!(
    SURFACE_RADIUS,
    "surface radius",
    Length,
    None,
    Millimetre,
    -1.0,
    1.0
);
spec!(
    MODEL_DISTANCE,
    "distance",
    Length,
    None,
    Millimetre,
    0.0,
    0.05
);
spec!(LEVEL, "a plain number", Ratio, None, Degree, -1.0e9, 1.0e9);
spec!(
    IOL_CONSTANT,
    "SRK/T A constant",
    Ratio,
    None,
    Degree,
    110.0,
    125.0
);
spec!(
    IOL_TARGET,
    "target refraction",
    Power,
    Some(Unit::Dioptre),
    Dioptre,
    -10.0,
    10.0
);
spec!(
    IOL_POWER,
    "intraocular lens power",
    Power,
    Some(Unit::Dioptre),
    Dioptre,
    -10.0,
    40.0
);
spec!(
    IOL_ELP,
    "effective lens position",
    Length,
    None,
    Millimetre,
    0.002,
    0.008
);
