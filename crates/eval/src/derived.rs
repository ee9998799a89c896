//! The one model of derived values: what was computed, from what, by which
//! published method. Every front end renders these and nothing else.

use parax_syntax::Span;
use serde::Serialize;

/// A published source or a practice rule, with its provenance tag.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub struct Source {
    /// Citation: authors, title or journal, year.
    pub citation: &'static str,
    /// Provenance: `S` read in the source, `C` computed from the formula, `M` from
    /// memory (to be confirmed), `CP` common practice with no source.
    pub tag: &'static str,
}

/// How a value was derived.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Derivation {
    /// The formula in symbols.
    pub formula: &'static str,
    /// The formula with this case's numbers substituted, and the result.
    pub substituted: String,
    /// Where the method is published.
    pub source: Source,
}

/// The value itself. Numbers are in base units: dioptres, metres, degrees.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "type", rename_all = "kebab-case")]
pub enum DerivedValue {
    /// A power in dioptres.
    Power {
        /// Dioptres.
        dioptres: f64,
    },
    /// A sphere / cylinder × axis.
    SphCyl {
        /// Sphere, D.
        sphere: f64,
        /// Cylinder, D.
        cylinder: f64,
        /// Axis, degrees (1..=180).
        axis: f64,
    },
    /// A power along a meridian.
    Meridian {
        /// Dioptres.
        dioptres: f64,
        /// Meridian, degrees.
        meridian: f64,
    },
    /// A cylinder and its axis (minus-cylinder form).
    Cylinder {
        /// Dioptres.
        dioptres: f64,
        /// Axis, degrees.
        axis: f64,
    },
    /// A signed distance in metres from a named reference point.
    Distance {
        /// Metres, positive to the right (behind the reference).
        metres: f64,
        /// What it is measured from: "L2", "the cornea", "the spectacle plane".
        from: String,
    },
    /// A point at infinity.
    Infinity,
    /// A length (thickness, drop), metres; shown in mm.
    Length {
        /// Metres.
        metres: f64,
    },
    /// A prism and its base direction (`BU`, `BD`, `BI`, `BO`, or empty for an
    /// imbalance between the eyes), prism dioptres.
    Prism {
        /// Prism dioptres (≥ 0).
        dioptres: f64,
        /// Base direction.
        base: String,
    },
    /// A pure number (magnification, ratio).
    Number {
        /// The number.
        value: f64,
    },
    /// A word or phrase (a classification).
    Text {
        /// The text.
        text: String,
    },
}

/// One derived value.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Derived {
    /// Stable key, `<block>.<name>`, e.g. `eye.right.spherical-equivalent`
    /// (documented in docs/notation.md; `expect <name>` refers to the name part).
    pub key: String,
    /// The name part of the key, as an `expect` line writes it.
    pub name: String,
    /// Human label.
    pub label: String,
    /// The value.
    pub value: DerivedValue,
    /// Compact display text, e.g. `-3.82 / -1.12 x 10`.
    pub text: String,
    /// The statement (line) the value belongs to.
    pub span: Span,
    /// Formula, numbers, source.
    pub derivation: Derivation,
    /// A clinical caution that applies to this value.
    pub caution: Option<&'static str>,
}

/// Format a power like the trade writes it: sign always, two decimals.
pub fn fmt_power(d: f64) -> String {
    let d = if d.abs() < 0.005 { 0.0 } else { d };
    format!("{d:+.2}")
}

/// Format a sphere/cylinder × axis: `-3.82 / -1.12 x 10`.
pub fn fmt_sphcyl(s: f64, c: f64, axis: f64) -> String {
    if c.abs() < 0.005 {
        return format!("{} DS", fmt_power(s));
    }
    format!("{} / {} x {}", fmt_power(s), fmt_power(c), fmt_axis(axis))
}

/// Format an axis as a whole number of degrees in 1..=180.
pub fn fmt_axis(axis: f64) -> String {
    let a = axis.round() as i64;
    let a = if a <= 0 { a + 180 } else { a };
    format!("{a}")
}

impl DerivedValue {
    /// Display text for this value.
    pub fn display(&self) -> String {
        match self {
            DerivedValue::Power { dioptres } => format!("{} D", fmt_power(*dioptres)),
            DerivedValue::SphCyl {
                sphere,
                cylinder,
                axis,
            } => fmt_sphcyl(*sphere, *cylinder, *axis),
            DerivedValue::Meridian { dioptres, meridian } => {
                format!("{} D @ {}", fmt_power(*dioptres), fmt_axis(*meridian))
            }
            DerivedValue::Cylinder { dioptres, axis } => {
                format!("{} x {}", fmt_power(*dioptres), fmt_axis(*axis))
            }
            DerivedValue::Distance { metres, from } => {
                let cm = metres * 100.0;
                let side = if *metres >= 0.0 { "after" } else { "before" };
                format!("{:.2} cm {side} {from}", cm.abs())
            }
            DerivedValue::Infinity => "infinity".into(),
            DerivedValue::Length { metres } => format!("{:.2} mm", metres * 1000.0),
            DerivedValue::Prism { dioptres, base } => {
                format!("{dioptres:.2}Δ {base}").trim_end().to_owned()
            }
            DerivedValue::Number { value } => format!("{value:.4}"),
            DerivedValue::Text { text } => text.clone(),
        }
    }
}
