//! The case model: the facts a case file records, in base units (dioptres, metres,
//! degrees), each with the span of the statement it came from: the `case`
//! block's facts and every other block in file order ([`Block`]; each block
//! kind's type lives in its module under `blocks`, re-exported here). Serializable both
//! ways so that the same facts can be read from JSON (the benchmark's yardstick).

use parax_syntax::Span;
use serde::{Deserialize, Serialize};

pub use crate::blocks::case::CaseInfo;
pub use crate::blocks::contact_lens::ContactLens;
pub use crate::blocks::eye::{Eye, IolFacts, KMeridian, Refraction};
pub use crate::blocks::frame::Frame;
pub use crate::blocks::model_eye::{ModelEye, SurfaceOverride};
pub use crate::blocks::spectacle_lens::{PrismRx, SpectacleLens};
pub use crate::blocks::system::{ObjectAt, System, SystemElement};

/// A fact and the statement it came from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct At<T> {
    /// The fact.
    pub value: T,
    /// The statement's span (the whole line, without comment).
    pub span: Span,
}

/// Which eye.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize, PartialOrd, Ord)]
#[serde(rename_all = "lowercase")]
pub enum Side {
    /// Right eye (OD).
    Right,
    /// Left eye (OS).
    Left,
}

impl Side {
    /// `right` or `left`.
    pub fn name(self) -> &'static str {
        match self {
            Side::Right => "right",
            Side::Left => "left",
        }
    }
}

/// A sphere / cylinder × axis, as recorded.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Rx {
    /// Sphere, D.
    pub sphere: f64,
    /// Cylinder, D (0 for a sphere).
    pub cylinder: f64,
    /// Axis, degrees (180 for a sphere).
    pub axis: f64,
}

/// One value of an `expect` line, in base units where it is a quantity.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum ExpectToken {
    /// A number, converted to base units when a unit was written.
    Number {
        /// Value in base units.
        value: f64,
        /// The unit written, if any (as the optics crate names it).
        unit: Option<parax_optics::units::Unit>,
        /// Half a step of the last written digit, in base units: the default
        /// tolerance.
        half_step: f64,
        /// Where it stands.
        span: Span,
    },
    /// A word (`after`, `L2`, `real`, `with-the-rule`).
    Word {
        /// The word.
        word: String,
    },
    /// `/`, `x`, `@` or `,`.
    Mark {
        /// The mark as written.
        mark: String,
    },
}

/// `expect NAME VALUE… [± TOLERANCE]`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Expect {
    /// The derived value's name (the last part of its key).
    pub name: String,
    /// Span of the name.
    pub name_span: Span,
    /// The recorded value.
    pub tokens: Vec<ExpectToken>,
    /// Explicit tolerance, base units.
    pub tolerance: Option<f64>,
    /// The recorded value (after the name, before any `±`).
    pub value_span: Option<Span>,
    /// The whole statement.
    pub span: Span,
}

/// A block that has values, read from one top-level block of the file.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Block {
    /// An `eye` block.
    Eye(Eye),
    /// A `frame` block.
    Frame(Frame),
    /// A `spectacle-lens` block.
    SpectacleLens(SpectacleLens),
    /// A `contact-lens` block.
    ContactLens(ContactLens),
    /// A `system` block.
    System(System),
    /// A `model-eye` block.
    ModelEye(ModelEye),
}

/// Everything a case file records.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize, Default)]
pub struct Case {
    /// The `case` block (several `case` blocks add to one another).
    pub info: CaseInfo,
    /// Every other block whose header could be read, in file order.
    pub blocks: Vec<Block>,
}

macro_rules! of_kind {
    ($(#[$doc:meta])* $name:ident, $variant:ident, $ty:ty) => {
        $(#[$doc])*
        pub fn $name(&self) -> impl DoubleEndedIterator<Item = &$ty> + Clone + '_ {
            self.blocks.iter().filter_map(|b| match b {
                Block::$variant(x) => Some(x),
                _ => None,
            })
        }
    };
}

impl Case {
    of_kind!(
        /// The `eye` blocks, in file order.
        eyes, Eye, Eye
    );
    of_kind!(
        /// The `frame` blocks, in file order.
        frames, Frame, Frame
    );
    of_kind!(
        /// The `spectacle-lens` blocks, in file order.
        spectacle_lenses, SpectacleLens, SpectacleLens
    );
    of_kind!(
        /// The `contact-lens` blocks, in file order.
        contact_lenses, ContactLens, ContactLens
    );
    of_kind!(
        /// The `system` blocks, in file order.
        systems, System, System
    );
    of_kind!(
        /// The `model-eye` blocks, in file order.
        model_eyes, ModelEye, ModelEye
    );
}
