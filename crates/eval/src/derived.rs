//! The one model of derived values: what was computed, from what, by which
//! published method. Every front end renders these and nothing else.
//!
//! A file may carry hundreds of thousands of values, so a value holds no text it
//! can rebuild: the key is its block id (shared by every value of the block) and
//! its name, built on demand by [`Derived::key`]; the display text is rendered from
//! the value by [`Derived::text`]; names and labels are [`Phrase`]s, borrowed
//! from the program text in nearly every case, and the words inside a value are
//! static or shared. A test bounds `size_of::<Derived>()`.

use parax_syntax::Span;
use serde::ser::SerializeStruct;
use serde::{Serialize, Serializer};
use std::borrow::Cow;
use std::fmt;
use std::sync::Arc;

/// A published source or a practice rule, with its provenance tag.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub struct Source {
    /// Citation: authors, title or journal, year.
    pub citation: &'static str,
    /// Provenance: `S` read in the source, `C` computed from the formula, `M` from
    /// memory (to be confirmed), `CP` common practice with no source.
    pub tag: &'static str,
}

/// A published method: a formula and where it is published. Each is a constant
/// of the program, so a value points to its method (8 bytes) instead of holding
/// the formula and the source (24).
#[derive(Debug, PartialEq, Eq)]
pub struct Method {
    /// The formula in symbols.
    pub formula: &'static str,
    /// Where the method is published (one of the constants of [`crate::sources`]).
    pub source: &'static Source,
}

/// How a value was derived.
#[derive(Debug, Clone, PartialEq)]
pub struct Derivation {
    /// The formula and its published source, shared by every value it derives.
    pub method: &'static Method,
    /// The formula with this case's numbers substituted, and the result. Empty
    /// when the evaluation was asked for values only
    /// ([`EvalOptions::derivations`](crate::EvalOptions) false, as `parax check`
    /// does); every evaluation through [`crate::evaluate`] writes it. A boxed
    /// `str`, not a `String`: written once, never grown (8 bytes less per value).
    pub substituted: Box<str>,
}

impl Derivation {
    /// The formula in symbols.
    pub fn formula(&self) -> &'static str {
        self.method.formula
    }

    /// Where the method is published.
    pub fn source(&self) -> &'static Source {
        self.method.source
    }
}

/// The JSON shape is the one it had when formula and source were stored
/// fields: `formula`, `substituted`, `source`, in that order.
impl Serialize for Derivation {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        let mut s = serializer.serialize_struct("Derivation", 3)?;
        s.serialize_field("formula", self.method.formula)?;
        s.serialize_field("substituted", &self.substituted)?;
        s.serialize_field("source", self.method.source)?;
        s.end()
    }
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
        /// Shared: the values measured from one lens share its label, and the
        /// fixed places are each one shared string ([`shared_place`]).
        #[serde(serialize_with = "serialize_str")]
        from: Arc<str>,
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
        base: &'static str,
    },
    /// A pure number (magnification, ratio).
    Number {
        /// The number.
        value: f64,
    },
    /// A word or phrase (a classification).
    Text {
        /// The text.
        text: Cow<'static, str>,
    },
}

/// A name or label of a derived value: a literal of the program (nearly all of
/// them) or a text made for one case (a lens label inside a system's value
/// names), shared. Reads as a `str` (`Deref`, `Display`, comparisons).
///
/// Our own type rather than `Cow<'static, str>`: both variants are one pointer
/// wide after the first (the shared text is a thin `Arc<String>`), so the enum
/// fits in 16 bytes instead of 24, 16 bytes less per value for name and label
/// together (a test bounds the size of [`Derived`]).
#[derive(Clone)]
pub enum Phrase {
    /// A literal of the program.
    Static(&'static str),
    /// A text made at run time.
    Shared(Arc<String>),
}

impl Phrase {
    /// The text.
    pub fn as_str(&self) -> &str {
        match self {
            Phrase::Static(s) => s,
            Phrase::Shared(s) => s.as_str(),
        }
    }
}

impl std::ops::Deref for Phrase {
    type Target = str;
    fn deref(&self) -> &str {
        self.as_str()
    }
}

impl AsRef<str> for Phrase {
    fn as_ref(&self) -> &str {
        self.as_str()
    }
}

impl std::borrow::Borrow<str> for Phrase {
    fn borrow(&self) -> &str {
        self.as_str()
    }
}

impl From<&'static str> for Phrase {
    fn from(s: &'static str) -> Self {
        Phrase::Static(s)
    }
}

impl From<String> for Phrase {
    fn from(s: String) -> Self {
        Phrase::Shared(Arc::new(s))
    }
}

/// Written as the text, with width and alignment honoured (`{:<20}`).
impl std::fmt::Display for Phrase {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        std::fmt::Display::fmt(self.as_str(), f)
    }
}

/// Written as the text, as a `str` is (`"name"`).
impl std::fmt::Debug for Phrase {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        std::fmt::Debug::fmt(self.as_str(), f)
    }
}

impl PartialEq for Phrase {
    fn eq(&self, other: &Phrase) -> bool {
        self.as_str() == other.as_str()
    }
}

impl Eq for Phrase {}

impl PartialEq<str> for Phrase {
    fn eq(&self, other: &str) -> bool {
        self.as_str() == other
    }
}

impl PartialEq<&str> for Phrase {
    fn eq(&self, other: &&str) -> bool {
        self.as_str() == *other
    }
}

impl PartialEq<String> for Phrase {
    fn eq(&self, other: &String) -> bool {
        self.as_str() == other.as_str()
    }
}

impl PartialEq<Phrase> for str {
    fn eq(&self, other: &Phrase) -> bool {
        self == other.as_str()
    }
}

impl PartialEq<Phrase> for &str {
    fn eq(&self, other: &Phrase) -> bool {
        *self == other.as_str()
    }
}

impl std::hash::Hash for Phrase {
    fn hash<H: std::hash::Hasher>(&self, state: &mut H) {
        self.as_str().hash(state)
    }
}

impl PartialOrd for Phrase {
    fn partial_cmp(&self, other: &Phrase) -> Option<std::cmp::Ordering> {
        Some(self.cmp(other))
    }
}

impl Ord for Phrase {
    fn cmp(&self, other: &Phrase) -> std::cmp::Ordering {
        self.as_str().cmp(other.as_str())
    }
}

impl Serialize for Phrase {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        serializer.serialize_str(self.as_str())
    }
}

/// One derived value.
#[derive(Debug, Clone, PartialEq)]
pub struct Derived {
    /// The block id, the first part of the key: `eye.right`, `system.bench`.
    /// Shared by every value of the block. An `Arc<String>` rather than an
    /// `Arc<str>`: a thin pointer, 8 bytes per value instead of 16, for one more
    /// indirection when the id is read (rarely: keys, block headers).
    pub block: Arc<String>,
    /// The name part of the key, as an `expect` line writes it.
    pub name: Phrase,
    /// Human label.
    pub label: Phrase,
    /// The value.
    pub value: DerivedValue,
    /// The statement (line) the value belongs to.
    pub span: Span,
    /// Formula, numbers, source.
    pub derivation: Derivation,
    /// A clinical caution that applies to this value.
    pub caution: Option<&'static str>,
}

impl Derived {
    /// Stable key, `<block>.<name>`, e.g. `eye.right.spherical-equivalent`
    /// (documented in docs/notation.md; `expect <name>` refers to the name part).
    pub fn key(&self) -> String {
        format!("{}.{}", self.block, self.name)
    }

    /// True when [`Derived::key`] equals `key` (without building the key).
    pub fn is_key(&self, key: &str) -> bool {
        key.strip_prefix(self.block.as_str())
            .and_then(|rest| rest.strip_prefix('.'))
            .is_some_and(|name| name == self.name)
    }

    /// Compact display text, e.g. `-3.82 / -1.12 x 10`, rendered from the value.
    pub fn text(&self) -> String {
        self.value.display()
    }
}

/// The JSON shape of a derived value is the one it had when key and text were
/// stored fields: `key`, `name`, `label`, `value`, `text`, `span`, `derivation`,
/// `caution`, in that order.
impl Serialize for Derived {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        let mut s = serializer.serialize_struct("Derived", 8)?;
        s.serialize_field("key", &self.key())?;
        s.serialize_field("name", &self.name)?;
        s.serialize_field("label", &self.label)?;
        s.serialize_field("value", &self.value)?;
        s.serialize_field("text", &self.text())?;
        s.serialize_field("span", &self.span)?;
        s.serialize_field("derivation", &self.derivation)?;
        s.serialize_field("caution", &self.caution)?;
        s.end()
    }
}

/// Writes `value` with two decimals exactly as `format!("{value:.2}")` does
/// (with `plus`, as `{:+.2}`), without the standard library's exact float
/// formatting where that is safe. Hints and hovers format many values per edit
/// and the exact path (Grisu with a Dragon fallback, on every value) was a
/// tenth of the language server's time. Hand-rolled because no library offers
/// fixed decimals equal to `{:.2}`; property tests (tests/fmt_power.rs) compare
/// it with `format!` on random and on tie values.
fn write_fixed2(out: &mut impl fmt::Write, value: f64, plus: bool) -> fmt::Result {
    let scaled = value * 100.0;
    let rounded = scaled.round();
    // Far from a tie (x.5 hundredths), the rounding of the (inexact) product
    // is the rounding of the exact value: the product's error is below 1e-7
    // of a hundredth for |value| < 1e7. Ties, near-ties and huge values take
    // the exact path.
    let near_tie = ((scaled - scaled.trunc()).abs() - 0.5).abs() < 1e-6;
    if !value.is_finite() || near_tie || scaled.abs() >= 1e9 {
        return if plus {
            write!(out, "{value:+.2}")
        } else {
            write!(out, "{value:.2}")
        };
    }
    // Digits written backwards into a stack buffer and handed over in one
    // piece (`write!` with three arguments cost more than the rounding).
    let hundredths = rounded.abs() as u64; // < 1e9: at most 10 digits
    let mut buf = [0u8; 16];
    let mut i = buf.len();
    let mut push = |b: u8| {
        i -= 1;
        buf[i] = b;
    };
    push(b'0' + (hundredths % 10) as u8);
    push(b'0' + (hundredths / 10 % 10) as u8);
    push(b'.');
    let mut int = hundredths / 100;
    loop {
        push(b'0' + (int % 10) as u8);
        int /= 10;
        if int == 0 {
            break;
        }
    }
    // `{:.2}` keeps the sign of a negative value that rounds to zero (`-0.00`).
    if value.is_sign_negative() {
        push(b'-');
    } else if plus {
        push(b'+');
    }
    out.write_str(std::str::from_utf8(&buf[i..]).map_err(|_| fmt::Error)?)
}

/// A power as the trade writes it, for `write!`: sign always, two decimals
/// (|d| < 0.005 shown as `+0.00`).
#[derive(Debug, Clone, Copy)]
pub struct Dioptres(pub f64);

impl fmt::Display for Dioptres {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let d = if self.0.abs() < 0.005 { 0.0 } else { self.0 };
        write_fixed2(f, d, true)
    }
}

/// Two decimals, as `{:.2}` writes them, for `write!`.
#[derive(Debug, Clone, Copy)]
pub struct Fixed2(pub f64);

impl fmt::Display for Fixed2 {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write_fixed2(f, self.0, false)
    }
}

/// An axis or meridian as a whole number of degrees in 1..=180, for `write!`.
#[derive(Debug, Clone, Copy)]
pub struct Axis(pub f64);

impl fmt::Display for Axis {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        // 0 is written 180, and an axis that rounds past 180 wraps to the start
        // (common practice, no source: axes are written 1–180).
        let a = (self.0.round() as i64 - 1).rem_euclid(180) + 1;
        write!(f, "{a}")
    }
}

/// A sphere / cylinder × axis, for `write!`: `-3.82 / -1.12 x 10`, or
/// `-3.82 DS` without cylinder.
#[derive(Debug, Clone, Copy)]
pub struct SphCyl {
    /// Sphere, D.
    pub sphere: f64,
    /// Cylinder, D.
    pub cylinder: f64,
    /// Axis, degrees.
    pub axis: f64,
}

impl fmt::Display for SphCyl {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if self.cylinder.abs() < 0.005 {
            return write!(f, "{} DS", Dioptres(self.sphere));
        }
        write!(
            f,
            "{} / {} x {}",
            Dioptres(self.sphere),
            Dioptres(self.cylinder),
            Axis(self.axis)
        )
    }
}

/// Serialize a shared string as a plain string (serde's `rc` feature is not
/// enabled; this is all it would add here).
fn serialize_str<S: Serializer>(text: &Arc<str>, serializer: S) -> Result<S::Ok, S::Error> {
    serializer.serialize_str(text)
}

/// One shared copy of a fixed place name for [`DerivedValue::Distance::from`],
/// so the many values measured from it allocate nothing: a handful of places,
/// each allocated once per thread and kept for the thread's life.
pub fn shared_place(place: &'static str) -> Arc<str> {
    thread_local! {
        static PLACES: std::cell::RefCell<Vec<(&'static str, Arc<str>)>> =
            const { std::cell::RefCell::new(Vec::new()) };
    }
    PLACES.with(|places| {
        let mut places = places.borrow_mut();
        if let Some((_, shared)) = places.iter().find(|(p, _)| *p == place) {
            return Arc::clone(shared);
        }
        let shared: Arc<str> = place.into();
        places.push((place, Arc::clone(&shared)));
        shared
    })
}

/// Format a power like the trade writes it: sign always, two decimals.
pub fn fmt_power(d: f64) -> String {
    Dioptres(d).to_string()
}

/// Format a sphere/cylinder × axis: `-3.82 / -1.12 x 10`.
pub fn fmt_sphcyl(s: f64, c: f64, axis: f64) -> String {
    SphCyl {
        sphere: s,
        cylinder: c,
        axis,
    }
    .to_string()
}

/// Format an axis as a whole number of degrees in 1..=180.
pub fn fmt_axis(axis: f64) -> String {
    Axis(axis).to_string()
}

impl DerivedValue {
    /// Display text for this value (the [`fmt::Display`] form).
    pub fn display(&self) -> String {
        self.to_string()
    }
}

/// The compact text of a value, written straight into the destination (hints
/// and tooltips write many per edit).
impl fmt::Display for DerivedValue {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            DerivedValue::Power { dioptres } => write!(f, "{} D", Dioptres(*dioptres)),
            DerivedValue::SphCyl {
                sphere,
                cylinder,
                axis,
            } => SphCyl {
                sphere: *sphere,
                cylinder: *cylinder,
                axis: *axis,
            }
            .fmt(f),
            DerivedValue::Meridian { dioptres, meridian } => {
                write!(f, "{} D @ {}", Dioptres(*dioptres), Axis(*meridian))
            }
            DerivedValue::Cylinder { dioptres, axis } => {
                write!(f, "{} x {}", Dioptres(*dioptres), Axis(*axis))
            }
            DerivedValue::Distance { metres, from } => {
                let side = if *metres >= 0.0 { "after" } else { "before" };
                // Under a centimetre (pupils, cardinal points inside the eye) in
                // millimetres, so two decimals still carry the value.
                if metres.abs() < 0.01 {
                    write!(f, "{} mm {side} {from}", Fixed2(metres.abs() * 1000.0))
                } else {
                    write!(f, "{} cm {side} {from}", Fixed2(metres.abs() * 100.0))
                }
            }
            DerivedValue::Infinity => f.write_str("infinity"),
            DerivedValue::Length { metres } => write!(f, "{} mm", Fixed2(metres * 1000.0)),
            DerivedValue::Prism { dioptres, base } => {
                let text = format!("{}Δ {base}", Fixed2(*dioptres));
                f.write_str(text.trim_end())
            }
            DerivedValue::Number { value } => write!(f, "{value:.4}"),
            DerivedValue::Text { text } => f.write_str(text),
        }
    }
}

/// How far a derived value moved between two versions of a case file.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "type", rename_all = "kebab-case")]
pub enum Difference {
    /// A change of a power, in dioptres (new − old).
    Dioptres {
        /// Dioptres.
        dioptres: f64,
    },
    /// A change of a distance measured from the same point, metres (new − old).
    Metres {
        /// Metres.
        metres: f64,
    },
    /// A change of a pure number (new − old).
    Number {
        /// The change.
        value: f64,
    },
    /// The change of a sphero-cylinder: the power-vector difference new − old
    /// (Thibos, Wheeler & Horner 1997), written back as a sphero-cylinder: the
    /// lens that, added to the old correction, gives the new one.
    SphCyl {
        /// Sphere of the difference, D.
        sphere: f64,
        /// Cylinder of the difference (minus form), D.
        cylinder: f64,
        /// Axis of the difference, degrees.
        axis: f64,
    },
}

impl Difference {
    /// Display text: `+0.25 D`, `-1.20 cm`, `+0.0120`, `-0.25 / -0.50 x 90`.
    pub fn display(&self) -> String {
        match self {
            Difference::Dioptres { dioptres } => format!("{} D", fmt_power(*dioptres)),
            Difference::Metres { metres } => format!("{:+.2} cm", metres * 100.0),
            Difference::Number { value } => format!("{value:+.4}"),
            Difference::SphCyl {
                sphere,
                cylinder,
                axis,
            } => fmt_sphcyl(*sphere, *cylinder, *axis),
        }
    }
}

impl DerivedValue {
    /// The difference `new − old` when both are numbers of the same kind (and,
    /// for distances, from the same point); `None` for text, infinity or a
    /// change of kind, where only old and new can be shown.
    pub fn difference(old: &DerivedValue, new: &DerivedValue) -> Option<Difference> {
        use DerivedValue as V;
        match (old, new) {
            (V::Power { dioptres: a }, V::Power { dioptres: b }) => {
                Some(Difference::Dioptres { dioptres: b - a })
            }
            (V::Meridian { dioptres: a, .. }, V::Meridian { dioptres: b, .. }) => {
                Some(Difference::Dioptres { dioptres: b - a })
            }
            (
                V::Cylinder {
                    dioptres: c1,
                    axis: a1,
                },
                V::Cylinder {
                    dioptres: c2,
                    axis: a2,
                },
            ) => Some(sphcyl_difference((0.0, *c1, *a1), (0.0, *c2, *a2))),
            (
                V::SphCyl {
                    sphere: s1,
                    cylinder: c1,
                    axis: a1,
                },
                V::SphCyl {
                    sphere: s2,
                    cylinder: c2,
                    axis: a2,
                },
            ) => Some(sphcyl_difference((*s1, *c1, *a1), (*s2, *c2, *a2))),
            (
                V::Distance {
                    metres: a,
                    from: f1,
                },
                V::Distance {
                    metres: b,
                    from: f2,
                },
            ) if f1 == f2 => Some(Difference::Metres { metres: b - a }),
            (V::Number { value: a }, V::Number { value: b }) => {
                Some(Difference::Number { value: b - a })
            }
            _ => None,
        }
    }
}

fn sphcyl_difference(old: (f64, f64, f64), new: (f64, f64, f64)) -> Difference {
    use parax_optics::refraction::SphCyl;
    let o = SphCyl::new(old.0, old.1, old.2).power_vector();
    let n = SphCyl::new(new.0, new.1, new.2).power_vector();
    let d = n.sub(&o).to_sphcyl();
    Difference::SphCyl {
        sphere: d.sphere,
        cylinder: d.cylinder,
        axis: d.axis,
    }
}

#[cfg(test)]
mod tests {
    use super::fmt_axis;

    /// Axes are written as whole degrees 1–180 (common practice, no source).
    #[test]
    fn axes_are_written_one_to_one_eighty() {
        for (axis, text) in [
            (0.0, "180"),
            (0.4, "180"),
            (0.6, "1"),
            (90.0, "90"),
            (179.6, "180"),
            (180.0, "180"),
            (180.6, "1"),
            (-10.0, "170"),
        ] {
            assert_eq!(fmt_axis(axis), text, "axis {axis}");
        }
    }

    /// The parts of a derived value stay small (the bound on the whole is in
    /// tests/each.rs): a field added or widened shows here.
    #[test]
    fn parts_of_a_derived_value_stay_small() {
        use std::mem::size_of;
        assert!(
            size_of::<super::DerivedValue>() <= 32,
            "DerivedValue {}",
            size_of::<super::DerivedValue>()
        );
        assert!(
            size_of::<super::Derivation>() <= 24,
            "Derivation {}",
            size_of::<super::Derivation>()
        );
    }

    /// A fixed place is one shared string, whoever asks for it.
    #[test]
    fn fixed_places_are_shared() {
        let a = super::shared_place("the cornea");
        let b = super::shared_place("the cornea");
        assert!(std::sync::Arc::ptr_eq(&a, &b));
        assert_eq!(&*a, "the cornea");
        assert_ne!(&*super::shared_place("the spectacle plane"), "the cornea");
    }

    /// Distances under a centimetre are shown in millimetres (exact unit change).
    #[test]
    fn short_distances_are_shown_in_millimetres() {
        use super::DerivedValue;
        let d = |metres: f64| DerivedValue::Distance {
            metres,
            from: "the cornea".into(),
        };
        assert_eq!(d(0.0030434).display(), "3.04 mm after the cornea");
        assert_eq!(d(-0.0015).display(), "1.50 mm before the cornea");
        assert_eq!(d(0.0153846).display(), "1.54 cm after the cornea");
    }
}
