//! The `eye` block: one eye at one visit. Its model ([`Eye`]), its keywords,
//! the names of its values ([`keys`]) and its compute step, made of
//! `refraction` (cylinder forms, power vectors, vertex transfer, keratometry),
//! `axial` (relative spectacle magnification), `near` (accommodation), `iol`
//! (implant power) and `visits` (the other eye, the previous visit).

mod acuity;
mod axial;
mod iol;
mod near;
mod refraction;
mod visits;

pub(crate) use visits::Visits;

use super::{expect, one, Context, Keyword};
use crate::compute::Out;
use crate::diagnostic::Diagnostic;
use crate::lower::{at, quantity, read_keratometry, side};
use crate::model::{At, Expect, ExpectToken, Rx, Side};
use crate::read::Reader;
use crate::units as u;
use parax_syntax::{Span, Symbol};
use serde::{Deserialize, Serialize};

/// A refraction and the vertex distance at which it was measured.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Refraction {
    /// The correction.
    pub rx: Rx,
    /// Vertex distance of the measurement, metres; `None` when not recorded.
    pub vertex: Option<f64>,
    /// True when a vertex distance was written but could not be read (already
    /// reported), so that "not recorded" is not reported again.
    #[serde(default)]
    pub vertex_unreadable: bool,
}

/// One principal meridian of a keratometry reading.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct KMeridian {
    /// Radius of curvature, metres (converted from a reading in D with the
    /// keratometric index when written in D).
    pub radius: f64,
    /// Meridian, degrees.
    pub meridian: f64,
    /// True when recorded as a power (D) rather than a radius.
    pub as_power: bool,
}

/// The facts of an `eye` block.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Eye {
    /// Which eye.
    pub side: Side,
    /// Visit date, `YYYY-MM-DD`, when the header gives one.
    pub date: Option<String>,
    /// The header line.
    pub span: Span,
    /// Distance refraction.
    pub refraction: Option<At<Refraction>>,
    /// Reading addition, D.
    pub add: Option<At<f64>>,
    /// Keratometry: the two principal meridians.
    pub keratometry: Option<At<[KMeridian; 2]>>,
    /// Keratometric index in use (default 1.3375).
    pub keratometric_index: Option<At<f64>>,
    /// Posterior corneal radius, metres.
    pub posterior_radius: Option<At<f64>>,
    /// Central corneal thickness, metres.
    pub corneal_thickness: Option<At<f64>>,
    /// Axial length, metres.
    pub axial_length: Option<At<f64>>,
    /// Monocular pupillary distance, metres.
    pub pd: Option<At<f64>>,
    /// Age, years.
    pub age: Option<At<f64>>,
    /// The intraocular-lens facts (`iol-*` keywords), boxed: few eye blocks
    /// carry them, and inline they made every eye block 88 bytes larger.
    #[serde(default)]
    pub iol: Option<Box<IolFacts>>,
    /// Refractive-surgery history, as recorded.
    pub refractive_surgery: Option<At<String>>,
    /// Visual acuity as a Snellen fraction (test distance, letter size).
    #[serde(default)]
    pub acuity: Option<At<(f64, f64)>>,
    /// `expect` lines.
    pub expects: Vec<Expect>,
}

/// The intraocular-lens facts of an `eye` block.
#[derive(Debug, Clone, PartialEq, Default, Serialize, Deserialize)]
pub struct IolFacts {
    /// SRK/T A constant.
    #[serde(default)]
    pub constant: Option<At<f64>>,
    /// Target refraction after surgery, D.
    #[serde(default)]
    pub target: Option<At<f64>>,
    /// Effective lens position, metres.
    #[serde(default)]
    pub elp: Option<At<f64>>,
    /// A chosen IOL power, D.
    #[serde(default)]
    pub power: Option<At<f64>>,
}

impl Eye {
    /// The eye's intraocular-lens facts, made empty when the first `iol-*`
    /// keyword is read.
    fn iol_mut(&mut self) -> &mut IolFacts {
        self.iol.get_or_insert_with(Default::default)
    }
}

impl Eye {
    /// An eye block with its header read and nothing else recorded yet.
    pub fn new(side: Side, date: Option<String>, span: Span) -> Eye {
        Eye {
            side,
            date,
            span,
            refraction: None,
            add: None,
            keratometry: None,
            keratometric_index: None,
            posterior_radius: None,
            corneal_thickness: None,
            axial_length: None,
            pd: None,
            age: None,
            iol: None,
            refractive_surgery: None,
            acuity: None,
            expects: Vec::new(),
        }
    }
}

fn move_at<T>(a: &mut Option<At<T>>, by: isize) {
    if let Some(a) = a {
        a.span = a.span.moved(by);
    }
}

fn move_expect(x: &mut Expect, by: isize) {
    x.name_span = x.name_span.moved(by);
    x.span = x.span.moved(by);
    x.value_span = x.value_span.map(|s| s.moved(by));
    for t in &mut x.tokens {
        if let ExpectToken::Number { span, .. } = t {
            *span = span.moved(by);
        }
    }
}

impl Eye {
    /// Move every span of the eye by `by` bytes (the incremental evaluation
    /// reuses an unchanged block after an edit before it). Written as one
    /// destructuring so that a field added to [`Eye`] fails to compile here
    /// until it is moved too.
    pub(crate) fn move_spans(&mut self, by: isize) {
        let Eye {
            side: _,
            date: _,
            span,
            refraction,
            add,
            keratometry,
            keratometric_index,
            posterior_radius,
            corneal_thickness,
            axial_length,
            pd,
            age,
            iol,
            refractive_surgery,
            acuity,
            expects,
        } = self;
        *span = span.moved(by);
        move_at(refraction, by);
        move_at(add, by);
        move_at(keratometry, by);
        for a in [
            keratometric_index,
            posterior_radius,
            corneal_thickness,
            axial_length,
            pd,
            age,
        ] {
            move_at(a, by);
        }
        if let Some(iol) = iol {
            let IolFacts {
                constant,
                target,
                elp,
                power,
            } = &mut **iol;
            for a in [constant, target, elp, power] {
                move_at(a, by);
            }
        }
        move_at(refractive_surgery, by);
        move_at(acuity, by);
        for x in expects {
            move_expect(x, by);
        }
    }
}

/// Names of the values of an `eye` block (the last part of their keys).
pub mod keys {
    super::super::keys! {
        /// The refraction in minus-cylinder form.
        MINUS_CYL = "minus-cyl",
        /// The refraction in plus-cylinder form.
        PLUS_CYL = "plus-cyl",
        /// Spherical equivalent, M = S + C/2.
        SPHERICAL_EQUIVALENT = "spherical-equivalent",
        /// Power vector J0.
        VECTOR_J0 = "vector-j0",
        /// Power vector J45.
        VECTOR_J45 = "vector-j45",
        /// Blur strength.
        BLUR_STRENGTH = "blur-strength",
        /// First principal meridian.
        MERIDIAN_1 = "meridian-1",
        /// Second principal meridian.
        MERIDIAN_2 = "meridian-2",
        /// Far point of the first meridian.
        FAR_POINT_1 = "far-point-1",
        /// Far point of the second meridian.
        FAR_POINT_2 = "far-point-2",
        /// The refraction at the corneal plane.
        CORNEAL_PLANE = "corneal-plane",
        /// The refraction at the corneal plane, to 0.25 D.
        CORNEAL_PLANE_ROUNDED = "corneal-plane-rounded",
        /// The refraction at the frame's vertex distance.
        AT_FRAME_VERTEX = "at-frame-vertex",
        /// The refraction at the frame's vertex distance, to 0.25 D.
        AT_FRAME_VERTEX_ROUNDED = "at-frame-vertex-rounded",
        /// Distance refraction plus the addition.
        NEAR_REFRACTION = "near-refraction",
        /// Flat keratometry.
        K_FLAT = "k-flat",
        /// Steep keratometry.
        K_STEEP = "k-steep",
        /// Mean keratometry.
        MEAN_K = "mean-k",
        /// Corneal cylinder.
        CORNEAL_CYLINDER = "corneal-cylinder",
        /// Corneal astigmatism type.
        CORNEAL_ASTIGMATISM = "corneal-astigmatism",
        /// Total corneal power (thick cornea).
        TOTAL_CORNEAL_POWER = "total-corneal-power",
        /// Keratometric K less total corneal power.
        KERATOMETRIC_EXCESS = "keratometric-excess",
        /// Expected amplitude of accommodation, minimum.
        AMPLITUDE_MIN = "amplitude-min",
        /// Expected amplitude of accommodation, mean.
        AMPLITUDE_MEAN = "amplitude-mean",
        /// Expected amplitude of accommodation, maximum.
        AMPLITUDE_MAX = "amplitude-max",
        /// Suggested reading addition.
        ADD_SUGGESTED = "add-suggested",
        /// Far end of clear vision through the addition.
        CLEAR_FAR = "clear-far",
        /// Near end of clear vision through the addition.
        CLEAR_NEAR = "clear-near",
        /// Near point of the first meridian.
        NEAR_POINT_1 = "near-point-1",
        /// Near point of the second meridian.
        NEAR_POINT_2 = "near-point-2",
        /// Anisometropia in spherical equivalent.
        ANISOMETROPIA = "anisometropia",
        /// Anisometropia in meridian 180.
        ANISOMETROPIA_180 = "anisometropia-180",
        /// Anisometropia in meridian 90.
        ANISOMETROPIA_90 = "anisometropia-90",
        /// Change of M since the previous visit.
        CHANGE_M = "change-m",
        /// Change of J0 since the previous visit.
        CHANGE_J0 = "change-j0",
        /// Change of J45 since the previous visit.
        CHANGE_J45 = "change-j45",
        /// Years since the previous visit.
        CHANGE_YEARS = "change-years",
        /// Change of M per year.
        CHANGE_M_PER_YEAR = "change-m-per-year",
        /// Change of blur strength per year.
        CHANGE_BLUR_PER_YEAR = "change-blur-per-year",
        /// Anterior chamber depth estimate (SRK/T).
        IOL_ACD_ESTIMATE = "iol-acd-estimate",
        /// IOL power by SRK/T.
        IOL_POWER_SRKT = "iol-power-srkt",
        /// IOL power by the thin-lens vergence formula.
        IOL_POWER_VERGENCE = "iol-power-vergence",
        /// Refraction predicted for the chosen IOL.
        IOL_PREDICTED_REFRACTION = "iol-predicted-refraction",
        /// Relative spectacle magnification (axial length).
        RELATIVE_SPECTACLE_MAGNIFICATION = "relative-spectacle-magnification",
        /// Visual acuity in logMAR.
        ACUITY_LOGMAR = "acuity-logmar",
    }
}

/// `eye.right`, or `eye.right.2026-10-02` for a dated visit.
pub fn block_id(e: &Eye) -> String {
    match &e.date {
        Some(d) => format!("eye.{}.{d}", e.side.name()),
        None => format!("eye.{}", e.side.name()),
    }
}

/// Read the header (`right|left [YYYY-MM-DD]`); `None` when the side is unreadable.
pub(crate) fn read_header(r: &mut Reader<'_>, form: &'static str, span: Span) -> Option<Eye> {
    let side = side(r, form);
    let date = if r.at_end() { None } else { r.date(form) };
    r.finish(form);
    Some(Eye::new(side?, date, span))
}

/// The keywords of an `eye` block and how each is read.
pub(crate) static KEYWORDS: &[Keyword<Eye>] = &[
    one(
        "refraction",
        "SPHERE [/ CYLINDER x AXIS] [@ VERTEX mm]",
        "distance refraction and the vertex distance it was measured at",
        |r, e, span, form| {
            let rx = r.rx(form);
            let written = r.symbol_if(Symbol::At);
            let vertex = if written {
                r.quantity(&u::VERTEX, form)
            } else {
                None
            };
            let vertex_unreadable = written && vertex.is_none();
            if let Some(rx) = rx {
                let value = Refraction {
                    rx,
                    vertex,
                    vertex_unreadable,
                };
                e.refraction = Some(At { value, span });
            }
        },
    ),
    one("add", "POWER", "reading addition", |r, e, span, form| {
        e.add = quantity(r, &u::ADD, form, span)
    }),
    one(
        "keratometry",
        "RADIUS mm x MERIDIAN, RADIUS mm x MERIDIAN (or K D x MERIDIAN, …)",
        "anterior corneal curvature in both principal meridians",
        |r, e, span, form| e.keratometry = at(read_keratometry(r, form), span),
    ),
    one(
        "keratometric-index",
        "N",
        "index used to turn radius into K (default 1.3375)",
        |r, e, span, form| e.keratometric_index = quantity(r, &u::INDEX, form, span),
    ),
    one(
        "posterior-radius",
        "RADIUS mm",
        "posterior corneal radius, for total corneal power",
        |r, e, span, form| e.posterior_radius = quantity(r, &u::POSTERIOR_RADIUS, form, span),
    ),
    one(
        "corneal-thickness",
        "LENGTH mm",
        "central corneal thickness, for total corneal power",
        |r, e, span, form| e.corneal_thickness = quantity(r, &u::CORNEAL_THICKNESS, form, span),
    ),
    one(
        "axial-length",
        "LENGTH mm",
        "axial length of the eye",
        |r, e, span, form| e.axial_length = quantity(r, &u::AXIAL_LENGTH, form, span),
    ),
    one(
        "pd",
        "LENGTH mm",
        "monocular pupillary distance",
        |r, e, span, form| e.pd = quantity(r, &u::PD, form, span),
    ),
    one(
        "age",
        "N y",
        "age, when it differs per eye or visit",
        |r, e, span, form| e.age = quantity(r, &u::AGE, form, span),
    ),
    one(
        "iol-constant",
        "N",
        "SRK/T A constant of the intraocular lens considered",
        |r, e, span, form| e.iol_mut().constant = quantity(r, &u::IOL_CONSTANT, form, span),
    ),
    one(
        "iol-target",
        "POWER",
        "target refraction after surgery (default 0)",
        |r, e, span, form| e.iol_mut().target = quantity(r, &u::IOL_TARGET, form, span),
    ),
    one(
        "iol-elp",
        "LENGTH mm",
        "effective lens position, for the thin-lens vergence formula",
        |r, e, span, form| e.iol_mut().elp = quantity(r, &u::IOL_ELP, form, span),
    ),
    one(
        "iol-power",
        "POWER",
        "power of a chosen intraocular lens, for its predicted refraction",
        |r, e, span, form| e.iol_mut().power = quantity(r, &u::IOL_POWER, form, span),
    ),
    one(
        "refractive-surgery",
        "\"TEXT\"",
        "history of corneal refractive surgery (keratometry cautions follow)",
        |r, e, span, _| {
            e.refractive_surgery = Some(At {
                value: r.rest(),
                span,
            })
        },
    ),
    one(
        "acuity",
        "DISTANCE/SIZE",
        "visual acuity as a Snellen fraction (6/12, 20/40)",
        |r, e, span, form| {
            let d = r.quantity(&acuity::TEST_DISTANCE, form);
            let size = if r.symbol_if(Symbol::Slash) {
                r.quantity(&acuity::LETTER_SIZE, form)
            } else {
                r.missing("`/` and the letter size (`6/12`)", form)
            };
            if let (Some(d), Some(size)) = (d, size) {
                e.acuity = Some(At {
                    value: (d, size),
                    span,
                });
            }
        },
    ),
    super::note(),
    expect(),
];

/// Every computation of one eye block, in order. Besides the block itself they
/// depend on the `case` block and the frames (`cx`), and on the eye's partner
/// and previous visit (`visits`); nothing else.
pub(crate) fn compute(
    cx: &Context<'_>,
    visits: &Visits<'_>,
    e: &Eye,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    refraction::compute(cx, e, out, diags);
    axial::compute(cx, e, out);
    near::compute(cx, e, out);
    iol::compute(e, out, diags);
    visits::compute(cx, visits, e, out, diags);
    acuity::compute(e, out);
}
