//! The `frame` block: the frame the spectacle lenses are fitted in. Its model
//! ([`Frame`]), its keywords, the names of its values ([`keys`]) and its
//! compute step (optical-centre drop and height; for the first frame, the pair
//! of lenses fitted in it).

mod compute;

pub(crate) use compute::oc_height;

use super::{expect, note, one, Context, Keyword};
use crate::compute::Out;
use crate::diagnostic::Diagnostic;
use crate::lower::quantity;
use crate::model::{At, Expect};
use crate::read::Reader;
use crate::units as u;
use parax_syntax::Span;
use serde::{Deserialize, Serialize};

/// The facts of a `frame` block.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize, Default)]
pub struct Frame {
    /// Name, if given.
    pub name: Option<String>,
    /// The header line.
    pub span: Span,
    /// Vertex distance as fitted, metres.
    pub vertex: Option<At<f64>>,
    /// Pantoscopic tilt, degrees.
    pub pantoscopic_tilt: Option<At<f64>>,
    /// Face form (wrap), degrees.
    pub face_form: Option<At<f64>>,
    /// Fitting height, metres.
    pub fitting_height: Option<At<f64>>,
    /// Reading drop, metres.
    pub reading_drop: Option<At<f64>>,
    /// Near inset per eye, metres.
    pub near_inset: Option<At<f64>>,
    /// Distance between the optical centres, metres.
    pub centre_distance: Option<At<f64>>,
    /// Boxed lens size (horizontal, vertical), metres.
    #[serde(default)]
    pub boxed_lens_size: Option<At<(f64, f64)>>,
    /// Distance between lenses (bridge, boxed system), metres.
    #[serde(default)]
    pub distance_between_lenses: Option<At<f64>>,
    /// Effective diameter of the lens shape, metres.
    #[serde(default)]
    pub effective_diameter: Option<At<f64>>,
    /// `expect` lines.
    pub expects: Vec<Expect>,
}

/// Names of the values of a `frame` block (the last part of their keys).
pub mod keys {
    super::super::keys! {
        /// Optical-centre drop for the pantoscopic tilt.
        OC_DROP = "oc-drop",
        /// Recommended optical-centre height.
        OC_HEIGHT = "oc-height",
        /// Vertical prism imbalance at the reading point.
        READING_VERTICAL_IMBALANCE = "reading-vertical-imbalance",
        /// Horizontal prism at distance, both eyes.
        DISTANCE_HORIZONTAL_PRISM = "distance-horizontal-prism",
        /// Vertical imbalance of the received pair as mounted.
        MOUNTED_VERTICAL_IMBALANCE = "mounted-vertical-imbalance",
        /// Horizontal imbalance of the received pair as mounted.
        MOUNTED_HORIZONTAL_IMBALANCE = "mounted-horizontal-imbalance",
        /// The mounted pair's vertical imbalance against its tolerance.
        CHECK_MOUNTED_VERTICAL = "check-mounted-vertical",
        /// The mounted pair's horizontal imbalance against its tolerance.
        CHECK_MOUNTED_HORIZONTAL = "check-mounted-horizontal",
        /// Aniseikonia between the two lenses.
        ANISEIKONIA = "aniseikonia",
    }
}

/// `frame` or `frame.<slug of the name>`.
pub fn block_id(f: &Frame) -> String {
    match &f.name {
        Some(n) => format!("frame.{}", crate::compute::slug(n)),
        None => "frame".into(),
    }
}

/// Read the header (`["NAME"]`).
pub(crate) fn read_header(r: &mut Reader<'_>, form: &'static str, span: Span) -> Option<Frame> {
    let name = if r.at_end() {
        None
    } else {
        r.text_value("the frame name", form)
    };
    r.finish(form);
    Some(Frame {
        name,
        span,
        ..Frame::default()
    })
}

/// The keywords of a `frame` block and how each is read.
pub(crate) static KEYWORDS: &[Keyword<Frame>] = &[
    one(
        "vertex",
        "LENGTH mm",
        "vertex distance as fitted in this frame",
        |r, f, span, form| f.vertex = quantity(r, &u::VERTEX, form, span),
    ),
    one(
        "pantoscopic-tilt",
        "ANGLE deg",
        "pantoscopic tilt",
        |r, f, span, form| f.pantoscopic_tilt = quantity(r, &u::TILT, form, span),
    ),
    one(
        "face-form",
        "ANGLE deg",
        "face form (wrap) angle",
        |r, f, span, form| f.face_form = quantity(r, &u::FACE_FORM, form, span),
    ),
    one(
        "fitting-height",
        "LENGTH mm",
        "height of the pupil centre above the lowest point of the rim",
        |r, f, span, form| f.fitting_height = quantity(r, &u::FITTING_HEIGHT, form, span),
    ),
    one(
        "reading-drop",
        "LENGTH mm",
        "how far below the distance centres the eyes read",
        |r, f, span, form| f.reading_drop = quantity(r, &u::READING_DROP, form, span),
    ),
    one(
        "near-inset",
        "LENGTH mm",
        "inward shift of each reading point",
        |r, f, span, form| f.near_inset = quantity(r, &u::NEAR_INSET, form, span),
    ),
    one(
        "centre-distance",
        "LENGTH mm",
        "distance between the optical centres",
        |r, f, span, form| f.centre_distance = quantity(r, &u::CENTRE_DISTANCE, form, span),
    ),
    one(
        "boxed-lens-size",
        "WIDTH mm x HEIGHT mm",
        "horizontal and vertical boxed lens size of the frame shape",
        |r, f, span, form| {
            let width = r.quantity(&u::BOXED_SIZE, form);
            let height = if r.axis_sign_if() {
                r.quantity(&u::BOXED_SIZE, form)
            } else {
                r.missing("`x HEIGHT mm` (the vertical boxed lens size)", form)
            };
            if let (Some(w), Some(h)) = (width, height) {
                f.boxed_lens_size = Some(At {
                    value: (w, h),
                    span,
                });
            }
        },
    ),
    one(
        "distance-between-lenses",
        "LENGTH mm",
        "distance between the boxed lens shapes (bridge)",
        |r, f, span, form| {
            f.distance_between_lenses = quantity(r, &u::DISTANCE_BETWEEN_LENSES, form, span)
        },
    ),
    one(
        "effective-diameter",
        "LENGTH mm",
        "twice the longest radius of the lens shape from its boxed centre",
        |r, f, span, form| f.effective_diameter = quantity(r, &u::EFFECTIVE_DIAMETER, form, span),
    ),
    note(),
    expect(),
];

/// The values of a frame block.
pub(crate) fn compute(cx: &Context<'_>, f: &Frame, out: &mut Out<'_>, diags: &mut Vec<Diagnostic>) {
    compute::compute_frame(cx, f, out, diags);
}
