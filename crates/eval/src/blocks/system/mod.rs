//! The `system` block: thin lenses, surfaces and gaps on one axis, and an
//! object. Its model ([`System`]), its keywords, the names of its values
//! ([`keys`]) and its compute step (the trace, image, magnification and the
//! system's powers).

mod compute;

pub use compute::block_id;
pub(crate) use compute::compute;

use super::{expect, many, note, one, Keyword};
use crate::codes;
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::{At, Expect};
use crate::read::Reader;
use crate::units as u;
use parax_syntax::Span;
use serde::{Deserialize, Serialize};

/// Where the object of a system is.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum ObjectAt {
    /// At infinity.
    Infinity,
    /// At a distance before the first lens, metres (positive).
    Before {
        /// Metres before the lens named by `label`.
        distance: f64,
        /// The lens the distance is measured from (must be the first lens).
        label: String,
        /// Where the label is written.
        label_span: Span,
    },
}

/// One element of a system.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum SystemElement {
    /// `lens LABEL POWER`.
    Lens {
        /// The label, e.g. `L1`.
        label: String,
        /// Power, D.
        power: f64,
    },
    /// `surface LABEL RADIUS index N`: a refracting surface.
    Surface {
        /// The label.
        label: String,
        /// Radius of curvature, metres (positive: centre to the right).
        radius: f64,
        /// Index after the surface.
        index_after: f64,
    },
    /// `gap LENGTH [index N]`.
    Gap {
        /// Metres.
        length: f64,
        /// Refractive index of the gap.
        index: f64,
    },
}

/// The facts of a `system` block.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct System {
    /// Name.
    pub name: String,
    /// The header line.
    pub span: Span,
    /// The object; at infinity when not written.
    pub object: At<ObjectAt>,
    /// Lenses and gaps in order.
    pub elements: Vec<At<SystemElement>>,
    /// `expect` lines.
    pub expects: Vec<Expect>,
}

impl SystemElement {
    /// The element as the optics crate traces it.
    pub fn to_optics(&self) -> parax_optics::system::Element {
        use parax_optics::system::Element;
        match self {
            SystemElement::Lens { power, .. } => Element::ThinLens { power: *power },
            SystemElement::Surface {
                radius,
                index_after,
                ..
            } => Element::Surface {
                radius_m: *radius,
                index_after: *index_after,
            },
            SystemElement::Gap { length, index } => Element::Gap {
                length_m: *length,
                index: *index,
            },
        }
    }

    fn label(&self) -> Option<&str> {
        match self {
            SystemElement::Lens { label, .. } | SystemElement::Surface { label, .. } => Some(label),
            SystemElement::Gap { .. } => None,
        }
    }
}

impl System {
    /// Every element as the optics crate traces it, in order.
    pub fn optics_elements(&self) -> Vec<parax_optics::system::Element> {
        self.elements.iter().map(|e| e.value.to_optics()).collect()
    }
}

/// Names of the values of a `system` block (the last part of their keys). The
/// values of each lens or surface are named `LABEL.` and one of
/// [`keys::PER_ELEMENT`].
pub mod keys {
    super::super::keys! {
        /// Where the image is.
        IMAGE = "image",
        /// Lateral magnification.
        MAGNIFICATION = "magnification",
        /// Real or virtual image.
        IMAGE_KIND = "image-kind",
        /// Equivalent power.
        EQUIVALENT_POWER = "equivalent-power",
        /// Back vertex power.
        BACK_VERTEX_POWER = "back-vertex-power",
        /// Front vertex power.
        FRONT_VERTEX_POWER = "front-vertex-power",
    }

    /// Vergence reaching an element (after its label only: `L2.vergence-in`).
    pub const VERGENCE_IN: &str = "vergence-in";
    /// Vergence leaving an element (after its label only).
    pub const VERGENCE_OUT: &str = "vergence-out";

    /// The names that follow an element's label (`L1.image`).
    pub const PER_ELEMENT: &[&str] = &[IMAGE, MAGNIFICATION, VERGENCE_IN, VERGENCE_OUT];
}

/// The name of a value of one element: `L1.image`.
pub(crate) fn element_key(label: &str, key: &str) -> String {
    format!("{label}.{key}")
}

/// Read the header (`"NAME"`); an unnamed system is named by its place among
/// the systems read before it (`system-2`).
pub(crate) fn read_header(
    r: &mut Reader<'_>,
    form: &'static str,
    span: Span,
    systems_before: impl FnOnce() -> usize,
) -> Option<System> {
    let name = if r.at_end() {
        r.missing::<()>("the system name", form);
        format!("system-{}", systems_before() + 1)
    } else {
        r.text_value("the system name", form).unwrap_or_default()
    };
    r.finish(form);
    Some(System {
        name,
        span,
        object: At {
            value: ObjectAt::Infinity,
            span,
        },
        elements: Vec::new(),
        expects: Vec::new(),
    })
}

/// Report a lens or surface label that an earlier element of the system already uses.
fn check_label_unused(r: &mut Reader<'_>, s: &System, label: &str, span: Span) {
    if s.elements.iter().any(|e| e.value.label() == Some(label)) {
        r.diags.push(Diagnostic::new(
            codes::SYSTEM_LAYOUT,
            Severity::Error,
            span,
            format!("the label `{label}` is already used in this system"),
        ));
    }
}

/// The keywords of a `system` block and how each is read.
pub(crate) static KEYWORDS: &[Keyword<System>] = &[
    one(
        "object",
        "DISTANCE before LABEL | at infinity",
        "where the object is (default: at infinity)",
        |r, s, span, form| {
            if r.word_if("at") {
                if r.word_if("infinity") {
                    s.object = At {
                        value: ObjectAt::Infinity,
                        span,
                    };
                } else {
                    r.missing::<()>("`infinity`", form);
                }
            } else if let Some(d) = r.quantity(&u::OBJECT_DISTANCE, form) {
                if r.word_if("before") {
                    if let Some((label, label_span)) = r.word("a lens label", form) {
                        let value = ObjectAt::Before {
                            distance: d,
                            label: label.to_owned(),
                            label_span,
                        };
                        s.object = At { value, span };
                    }
                } else {
                    r.missing::<()>("`before LABEL`", form);
                }
            }
        },
    ),
    many("lens", "LABEL POWER", "a thin lens", |r, s, span, form| {
        let label = r.word("a lens label", form);
        let power = r.quantity(&u::LENS_POWER, form);
        if let (Some((label, lspan)), Some(power)) = (label, power) {
            check_label_unused(r, s, label, lspan);
            s.elements.push(At {
                value: SystemElement::Lens {
                    label: label.to_owned(),
                    power,
                },
                span,
            });
        }
    }),
    many(
        "gap",
        "LENGTH [index N]",
        "distance to the next element, in air unless an index is given",
        |r, s, span, form| {
            let length = r.quantity(&u::GAP, form);
            let index = if r.word_if("index") {
                r.quantity(&u::INDEX, form)
            } else {
                Some(1.0)
            };
            if let (Some(length), Some(index)) = (length, index) {
                s.elements.push(At {
                    value: SystemElement::Gap { length, index },
                    span,
                });
            }
        },
    ),
    many(
        "surface",
        "LABEL RADIUS mm index N",
        "a refracting surface",
        |r, s, span, form| {
            let label = r.word("a surface label", form);
            let radius = r.radius(&u::SURFACE_RADIUS, form);
            let index = if r.word_if("index") {
                r.quantity(&u::INDEX, form)
            } else {
                r.missing("`index N` (the index after the surface)", form)
            };
            if let (Some((label, lspan)), Some(radius), Some(index_after)) = (label, radius, index)
            {
                check_label_unused(r, s, label, lspan);
                s.elements.push(At {
                    value: SystemElement::Surface {
                        label: label.to_owned(),
                        radius,
                        index_after,
                    },
                    span,
                });
            }
        },
    ),
    note(),
    expect(),
];
