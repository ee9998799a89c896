//! The `contact-lens` block: one contact lens fitted to the eye of its side.
//! Its model ([`ContactLens`]), its keywords, the names of its values
//! ([`keys`]) and its compute step (corneal-plane power, soft and rigid lens
//! powers with the tear lens, residual astigmatism).

mod compute;

pub use compute::block_id;
pub(crate) use compute::compute;

use super::{expect, note, one, Keyword};
use crate::lower::{at, side};
use crate::model::{At, Expect, Rx, Side};
use crate::read::Reader;
use crate::units as u;
use parax_syntax::Span;
use serde::{Deserialize, Serialize};

/// The facts of a `contact-lens` block.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ContactLens {
    /// Which eye.
    pub side: Side,
    /// The header line.
    pub span: Span,
    /// Back optic zone radius, metres.
    pub base_curve: Option<At<f64>>,
    /// `rigid` or `soft`.
    pub kind: Option<At<String>>,
    /// Back vertex power ordered.
    #[serde(default)]
    pub power: Option<At<Rx>>,
    /// Total diameter, metres.
    #[serde(default)]
    pub diameter: Option<At<f64>>,
    /// `expect` lines.
    pub expects: Vec<Expect>,
}

/// Names of the values of a `contact-lens` block (the last part of their keys).
pub mod keys {
    super::super::keys! {
        /// The eye's refraction at the corneal plane.
        CORNEAL_PLANE = "corneal-plane",
        /// Soft lens design (spherical or toric).
        SOFT_DESIGN = "soft-design",
        /// Soft lens power.
        SOFT_POWER = "soft-power",
        /// Power of the tear lens.
        TEAR_LENS = "tear-lens",
        /// Rigid lens power.
        RIGID_POWER = "rigid-power",
        /// Rigid lens power, rounded.
        RIGID_POWER_ROUNDED = "rigid-power-rounded",
        /// Ordered power less the computed power.
        POWER_DIFFERENCE = "power-difference",
        /// Residual astigmatism under a rigid lens.
        RESIDUAL_ASTIGMATISM = "residual-astigmatism",
    }
}

/// Read the header (`right|left`); `None` when the side is unreadable.
pub(crate) fn read_header(
    r: &mut Reader<'_>,
    form: &'static str,
    span: Span,
) -> Option<ContactLens> {
    let side = side(r, form);
    r.finish(form);
    Some(ContactLens {
        side: side?,
        span,
        base_curve: None,
        kind: None,
        power: None,
        diameter: None,
        expects: Vec::new(),
    })
}

/// The keywords of a `contact-lens` block and how each is read.
pub(crate) static KEYWORDS: &[Keyword<ContactLens>] = &[
    one(
        "base-curve",
        "RADIUS mm",
        "back optic zone radius",
        |r, c, span, form| c.base_curve = at(r.quantity(&u::CL_BASE_CURVE, form), span),
    ),
    one(
        "power",
        "SPHERE [/ CYLINDER x AXIS]",
        "back vertex power ordered, compared with the computed power",
        |r, c, span, form| c.power = at(r.rx(form), span),
    ),
    one("kind", "rigid | soft", "lens type", |r, c, span, form| {
        c.kind = at(
            r.word_of(&["rigid", "soft"], "a lens type", form)
                .map(str::to_owned),
            span,
        )
    }),
    one(
        "diameter",
        "LENGTH mm",
        "total diameter (plausibility for the lens type only)",
        |r, c, span, form| c.diameter = at(r.quantity(&u::DIAMETER, form), span),
    ),
    note(),
    expect(),
];
