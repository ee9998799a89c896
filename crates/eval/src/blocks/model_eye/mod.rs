//! The `model-eye` block: a published schematic eye with the case's overrides.
//! Its model ([`ModelEye`]), its keywords, the names of its values ([`keys`])
//! and its compute step (powers, cardinal points, entrance pupil, refraction).

mod compute;

pub use compute::block_id;
pub(crate) use compute::compute;

use super::{expect, many, note, one, Keyword};
use crate::lower::at;
use crate::model::{At, Expect};
use crate::read::Reader;
use crate::units as u;
use parax_syntax::Span;
use serde::{Deserialize, Serialize};

/// One surface override of a model eye.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SurfaceOverride {
    /// Surface number, from 1 at the front.
    pub number: usize,
    /// Radius, metres.
    pub radius: f64,
    /// Index after the surface, if overridden.
    pub index: Option<f64>,
    /// Distance to the next surface, metres, if overridden.
    pub distance: Option<f64>,
}

/// The facts of a `model-eye` block.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ModelEye {
    /// Name.
    pub name: String,
    /// The header line.
    pub span: Span,
    /// `gullstrand`, `le-grand` or `emsley`.
    pub from: Option<At<String>>,
    /// Axial length override, metres.
    pub axial_length: Option<At<f64>>,
    /// Surface overrides.
    pub surfaces: Vec<At<SurfaceOverride>>,
    /// `expect` lines.
    pub expects: Vec<Expect>,
}

/// Names of the values of a `model-eye` block (the last part of their keys).
pub mod keys {
    super::super::keys! {
        /// Equivalent power of the eye.
        POWER = "power",
        /// Power of the cornea.
        CORNEA_POWER = "cornea-power",
        /// Power of the crystalline lens.
        LENS_POWER = "lens-power",
        /// Front focal point.
        FRONT_FOCAL = "front-focal",
        /// Front principal point.
        FRONT_PRINCIPAL = "front-principal",
        /// Back principal point.
        BACK_PRINCIPAL = "back-principal",
        /// Front nodal point.
        FRONT_NODAL = "front-nodal",
        /// Back nodal point.
        BACK_NODAL = "back-nodal",
        /// Back focal point.
        BACK_FOCAL = "back-focal",
        /// Axial length of the model.
        AXIAL_LENGTH = "axial-length",
        /// Ocular refraction.
        OCULAR_REFRACTION = "ocular-refraction",
        /// Spectacle refraction.
        SPECTACLE_REFRACTION = "spectacle-refraction",
        /// Entrance pupil position.
        ENTRANCE_PUPIL = "entrance-pupil",
        /// Entrance pupil magnification.
        ENTRANCE_PUPIL_MAGNIFICATION = "entrance-pupil-magnification",
        /// Relative spectacle magnification.
        RELATIVE_SPECTACLE_MAGNIFICATION = "relative-spectacle-magnification",
    }
}

/// Read the header (`"NAME"`); an unnamed model is named by its place among
/// the model eyes read before it (`model-2`).
pub(crate) fn read_header(
    r: &mut Reader<'_>,
    form: &'static str,
    span: Span,
    models_before: impl FnOnce() -> usize,
) -> Option<ModelEye> {
    let name = if r.at_end() {
        r.missing::<()>("the model name", form);
        format!("model-{}", models_before() + 1)
    } else {
        r.text_value("the model name", form).unwrap_or_default()
    };
    r.finish(form);
    Some(ModelEye {
        name,
        span,
        from: None,
        axial_length: None,
        surfaces: Vec::new(),
        expects: Vec::new(),
    })
}

fn read_surface_override(r: &mut Reader<'_>, form: &str) -> Option<SurfaceOverride> {
    let n = r.quantity(&u::LEVEL, form)?;
    if n < 1.0 || n.fract() != 0.0 {
        return r.missing("a surface number 1, 2, 3, …", form);
    }
    if !r.word_if("radius") {
        return r.missing("`radius RADIUS mm`", form);
    }
    let radius = r.radius(&u::SURFACE_RADIUS, form)?;
    let mut o = SurfaceOverride {
        number: n as usize,
        radius,
        index: None,
        distance: None,
    };
    if r.word_if("index") {
        o.index = Some(r.quantity(&u::INDEX, form)?);
    }
    if r.word_if("distance") {
        o.distance = Some(r.quantity(&u::MODEL_DISTANCE, form)?);
    }
    Some(o)
}

/// The keywords of a `model-eye` block and how each is read.
pub(crate) static KEYWORDS: &[Keyword<ModelEye>] = &[
    one(
        "from",
        "gullstrand | le-grand | emsley",
        "the published schematic eye to start from",
        |r, m, span, form| {
            m.from = at(
                r.word_of(
                    &["gullstrand", "le-grand", "emsley"],
                    "a schematic eye",
                    form,
                )
                .map(str::to_owned),
                span,
            )
        },
    ),
    one(
        "axial-length",
        "LENGTH mm",
        "axial length override",
        |r, m, span, form| m.axial_length = at(r.quantity(&u::AXIAL_LENGTH, form), span),
    ),
    many(
        "surface",
        "N radius RADIUS mm [index N] [distance LENGTH mm]",
        "override one surface",
        |r, m, span, form| {
            if let Some(o) = read_surface_override(r, form) {
                m.surfaces.push(At { value: o, span });
            }
        },
    ),
    note(),
    expect(),
];
