//! The `spectacle-lens` block: one lens as ordered and as received. Its model
//! ([`SpectacleLens`]), its keywords, the names of its values ([`keys`]) and its
//! compute step (power as worn, compensated order, prism, thickness,
//! magnification, verification of the received lens).

pub(crate) mod compute;

pub(crate) use compute::compute;

use super::{expect, note, one, Keyword};
use crate::lower::{at, quantity, read_prism, side};
use crate::model::{At, Expect, Rx, Side};
use crate::read::Reader;
use crate::units as u;
use parax_syntax::Span;
use serde::{Deserialize, Serialize};

/// A prescribed prism: amount and base direction.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct PrismRx {
    /// Prism dioptres.
    pub amount: f64,
    /// `BU`, `BD`, `BI` or `BO`.
    pub base: String,
}

/// The facts of a `spectacle-lens` block.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SpectacleLens {
    /// Which eye.
    pub side: Side,
    /// The header line.
    pub span: Span,
    /// Power ordered.
    pub power: Option<At<Rx>>,
    /// Addition ordered, D.
    pub add: Option<At<f64>>,
    /// Prescribed prism.
    pub prism: Option<At<PrismRx>>,
    /// Refractive index of the material.
    pub index: Option<At<f64>>,
    /// Material name, as recorded.
    #[serde(default)]
    pub material: Option<At<String>>,
    /// Front surface power, D.
    pub base_curve: Option<At<f64>>,
    /// Centre thickness, metres.
    pub centre_thickness: Option<At<f64>>,
    /// Edge thickness, metres.
    pub edge_thickness: Option<At<f64>>,
    /// Uncut diameter, metres.
    pub blank_diameter: Option<At<f64>>,
    /// Focimeter reading of the received lens.
    pub measured: Option<At<Rx>>,
    /// Addition measured on the received lens, D.
    #[serde(default)]
    pub measured_add: Option<At<f64>>,
    /// Prism measured at the reference point of the received lens.
    #[serde(default)]
    pub measured_prism: Option<At<PrismRx>>,
    /// `expect` lines.
    pub expects: Vec<Expect>,
}

impl SpectacleLens {
    /// A lens with its header read and nothing else recorded yet.
    pub fn new(side: Side, span: Span) -> SpectacleLens {
        SpectacleLens {
            side,
            span,
            power: None,
            add: None,
            prism: None,
            index: None,
            material: None,
            base_curve: None,
            centre_thickness: None,
            edge_thickness: None,
            blank_diameter: None,
            measured: None,
            measured_add: None,
            measured_prism: None,
            expects: Vec::new(),
        }
    }
}

/// Names of the values of a `spectacle-lens` block (the last part of their keys).
pub mod keys {
    super::super::keys! {
        /// Power as worn in the tilted frame.
        AS_WORN = "as-worn",
        /// The power to order for the prescription as worn.
        COMPENSATED = "compensated",
        /// The compensated order, rounded.
        COMPENSATED_ROUNDED = "compensated-rounded",
        /// Decentration of the optical centre.
        DECENTRATION = "decentration",
        /// Horizontal prism at the distance point.
        DISTANCE_PRISM_HORIZONTAL = "distance-prism-horizontal",
        /// Vertical prism at the reading point.
        READING_PRISM_VERTICAL = "reading-prism-vertical",
        /// Horizontal prism at the reading point.
        READING_PRISM_HORIZONTAL = "reading-prism-horizontal",
        /// Centre thickness of the uncut lens.
        THICKNESS_CENTRE = "thickness-centre",
        /// Edge thickness of the uncut lens.
        THICKNESS_EDGE = "thickness-edge",
        /// Minimum blank diameter.
        MINIMUM_BLANK = "minimum-blank",
        /// Centre thickness of the edged lens.
        EDGED_THICKNESS_CENTRE = "edged-thickness-centre",
        /// Edge thickness of the edged lens.
        EDGED_THICKNESS_EDGE = "edged-thickness-edge",
        /// Spectacle magnification.
        MAGNIFICATION = "magnification",
        /// Received sphere against the order.
        CHECK_SPHERE = "check-sphere",
        /// Received cylinder against the order.
        CHECK_CYLINDER = "check-cylinder",
        /// Received axis against the order.
        CHECK_AXIS = "check-axis",
        /// Received addition against the order.
        CHECK_ADD = "check-add",
        /// Received prism against the order.
        CHECK_PRISM = "check-prism",
        /// The received lens passes or fails.
        VERIFICATION = "verification",
    }
}

/// `spectacle-lens.right` or `spectacle-lens.left`.
pub fn block_id(l: &SpectacleLens) -> String {
    format!("spectacle-lens.{}", l.side.name())
}

/// Read the header (`right|left`); `None` when the side is unreadable.
pub(crate) fn read_header(
    r: &mut Reader<'_>,
    form: &'static str,
    span: Span,
) -> Option<SpectacleLens> {
    let side = side(r, form);
    r.finish(form);
    Some(SpectacleLens::new(side?, span))
}

/// The keywords of a `spectacle-lens` block and how each is read.
pub(crate) static KEYWORDS: &[Keyword<SpectacleLens>] = &[
    one(
        "power",
        "SPHERE [/ CYLINDER x AXIS]",
        "the power ordered",
        |r, l, span, form| l.power = at(r.rx(form), span),
    ),
    one(
        "add",
        "POWER",
        "the addition ordered",
        |r, l, span, form| l.add = quantity(r, &u::ADD, form, span),
    ),
    one(
        "prism",
        "AMOUNT Δ BASE",
        "prescribed prism and base direction (BU, BD, BI, BO)",
        |r, l, span, form| l.prism = at(read_prism(r, form), span),
    ),
    one(
        "index",
        "N",
        "refractive index of the material",
        |r, l, span, form| l.index = quantity(r, &u::INDEX, form, span),
    ),
    one(
        "material",
        "\"TEXT\"",
        "material name (index and minimum thickness from a table)",
        |r, l, span, form| l.material = at(r.text_value("the material name", form), span),
    ),
    one(
        "base-curve",
        "POWER",
        "front surface power",
        |r, l, span, form| l.base_curve = quantity(r, &u::BASE_CURVE_POWER, form, span),
    ),
    one(
        "centre-thickness",
        "LENGTH mm",
        "centre thickness",
        |r, l, span, form| l.centre_thickness = quantity(r, &u::LENS_THICKNESS, form, span),
    ),
    one(
        "edge-thickness",
        "LENGTH mm",
        "edge thickness",
        |r, l, span, form| l.edge_thickness = quantity(r, &u::LENS_THICKNESS, form, span),
    ),
    one(
        "blank-diameter",
        "LENGTH mm",
        "uncut diameter",
        |r, l, span, form| l.blank_diameter = quantity(r, &u::DIAMETER, form, span),
    ),
    one(
        "measured",
        "SPHERE [/ CYLINDER x AXIS]",
        "focimeter reading of the received lens",
        |r, l, span, form| l.measured = at(r.rx(form), span),
    ),
    one(
        "measured-add",
        "POWER",
        "addition measured on the received lens",
        |r, l, span, form| l.measured_add = quantity(r, &u::ADD, form, span),
    ),
    one(
        "measured-prism",
        "AMOUNT Δ BASE",
        "prism measured at the received lens's reference point",
        |r, l, span, form| l.measured_prism = at(read_prism(r, form), span),
    ),
    note(),
    expect(),
];
