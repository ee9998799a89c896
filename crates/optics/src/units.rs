//! Physical dimensions, units and conversions to the base unit of each
//! dimension.
//!
//! Base units: metres (length), dioptres (power), degrees (angle), prism
//! dioptres (prism), years (time); ratios are dimensionless. Every function of
//! this crate takes and returns base units.

use serde::Serialize;

/// A physical dimension of a quantity.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, serde::Deserialize)]
pub enum Dimension {
    /// Optical power or vergence; base unit dioptre.
    Power,
    /// Length or distance; base unit metre.
    Length,
    /// Plane angle; base unit degree.
    Angle,
    /// Prismatic deviation; base unit prism dioptre.
    Prism,
    /// Time (ages); base unit year.
    Time,
    /// Dimensionless ratio (magnification, index).
    Ratio,
}

/// A unit of measure known to parax.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, serde::Deserialize)]
pub enum Unit {
    /// Dioptre (D), 1/m.
    Dioptre,
    /// Metre (m).
    Metre,
    /// Centimetre (cm).
    Centimetre,
    /// Millimetre (mm).
    Millimetre,
    /// Degree of arc (deg).
    Degree,
    /// Prism dioptre (Δ): 1 cm deviation at 1 m.
    PrismDioptre,
    /// Year (y).
    Year,
}

const ALL_UNITS: [Unit; 7] = [
    Unit::Dioptre,
    Unit::Metre,
    Unit::Centimetre,
    Unit::Millimetre,
    Unit::Degree,
    Unit::PrismDioptre,
    Unit::Year,
];

impl Unit {
    /// The dimension this unit measures.
    pub fn dimension(self) -> Dimension {
        match self {
            Unit::Dioptre => Dimension::Power,
            Unit::Metre | Unit::Centimetre | Unit::Millimetre => Dimension::Length,
            Unit::Degree => Dimension::Angle,
            Unit::PrismDioptre => Dimension::Prism,
            Unit::Year => Dimension::Time,
        }
    }

    /// The written symbol: `"D"`, `"m"`, `"cm"`, `"mm"`, `"deg"`, `"Δ"`, `"y"`.
    pub fn symbol(self) -> &'static str {
        match self {
            Unit::Dioptre => "D",
            Unit::Metre => "m",
            Unit::Centimetre => "cm",
            Unit::Millimetre => "mm",
            Unit::Degree => "deg",
            Unit::PrismDioptre => "Δ",
            Unit::Year => "y",
        }
    }

    /// Converts a value in this unit to the base unit of its dimension.
    ///
    /// Sub-multiples divide (`12 mm` becomes `12.0 / 1000.0`, which is the
    /// same `f64` as the literal `0.012`).
    pub fn to_base(self, v: f64) -> f64 {
        match self {
            Unit::Centimetre => v / 100.0,
            Unit::Millimetre => v / 1000.0,
            Unit::Dioptre | Unit::Metre | Unit::Degree | Unit::PrismDioptre | Unit::Year => v,
        }
    }

    /// Converts a value in the base unit of this unit's dimension to this unit.
    pub fn from_base(self, v: f64) -> f64 {
        match self {
            Unit::Centimetre => v * 100.0,
            Unit::Millimetre => v * 1000.0,
            Unit::Dioptre | Unit::Metre | Unit::Degree | Unit::PrismDioptre | Unit::Year => v,
        }
    }

    /// Converts a value in this unit to the unit `to` of the same dimension
    /// (through the base unit).
    pub fn convert(self, v: f64, to: Unit) -> f64 {
        to.from_base(self.to_base(v))
    }

    /// How many decimal places a value gains when converted from this unit to
    /// `to`: the power of ten between them (mm → m: 3; m → cm: −2; 0 between
    /// units of no fixed ratio of ten).
    pub fn decimal_shift(self, to: Unit) -> i32 {
        let ratio = self.to_base(1.0) / to.to_base(1.0);
        -(ratio.log10().round() as i32)
    }

    /// Every unit, in declaration order.
    pub fn all() -> &'static [Unit] {
        &ALL_UNITS
    }

    /// The units measuring dimension `d` (empty for [`Dimension::Ratio`]).
    pub fn units_of(d: Dimension) -> Vec<Unit> {
        ALL_UNITS
            .iter()
            .copied()
            .filter(|u| u.dimension() == d)
            .collect()
    }

    /// The base unit of dimension `d`, if it has one
    /// (`None` for [`Dimension::Ratio`]).
    pub fn base_of(d: Dimension) -> Option<Unit> {
        match d {
            Dimension::Power => Some(Unit::Dioptre),
            Dimension::Length => Some(Unit::Metre),
            Dimension::Angle => Some(Unit::Degree),
            Dimension::Prism => Some(Unit::PrismDioptre),
            Dimension::Time => Some(Unit::Year),
            Dimension::Ratio => None,
        }
    }
}

/// A closed interval `[min, max]` in base units, e.g. a plausibility range.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Range {
    /// Lower bound (inclusive).
    pub min: f64,
    /// Upper bound (inclusive).
    pub max: f64,
}

impl Range {
    /// Creates the range `[min, max]`.
    pub const fn new(min: f64, max: f64) -> Self {
        Range { min, max }
    }

    /// Whether `v` lies in `[min, max]` (false for NaN).
    pub fn contains(&self, v: f64) -> bool {
        v >= self.min && v <= self.max
    }
}
