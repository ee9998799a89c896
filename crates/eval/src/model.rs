//! The case model: the facts a case file records, in base units (dioptres, metres,
//! degrees), each with the span of the statement it came from. Serializable both
//! ways so that the same facts can be read from JSON (the benchmark's yardstick).

use parax_syntax::Span;
use serde::{Deserialize, Serialize};

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
    /// SRK/T A constant.
    #[serde(default)]
    pub iol_constant: Option<At<f64>>,
    /// Target refraction after surgery, D.
    #[serde(default)]
    pub iol_target: Option<At<f64>>,
    /// Effective lens position, metres.
    #[serde(default)]
    pub iol_elp: Option<At<f64>>,
    /// A chosen IOL power, D.
    #[serde(default)]
    pub iol_power: Option<At<f64>>,
    /// Refractive-surgery history, as recorded.
    pub refractive_surgery: Option<At<String>>,
    /// `expect` lines.
    pub expects: Vec<Expect>,
}

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

/// The facts of a `case` block.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize, Default)]
pub struct CaseInfo {
    /// Title.
    pub title: Option<String>,
    /// Date of the case.
    pub date: Option<String>,
    /// Age, years.
    pub age: Option<At<f64>>,
    /// Notes.
    pub notes: Vec<String>,
    /// Tags.
    pub tags: Vec<String>,
}

/// Everything a case file records.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize, Default)]
pub struct Case {
    /// The `case` block.
    pub info: CaseInfo,
    /// `eye` blocks.
    pub eyes: Vec<Eye>,
    /// `frame` blocks.
    pub frames: Vec<Frame>,
    /// `system` blocks.
    pub systems: Vec<System>,
    /// `spectacle-lens` blocks.
    #[serde(default)]
    pub spectacle_lenses: Vec<SpectacleLens>,
    /// `contact-lens` blocks.
    #[serde(default)]
    pub contact_lenses: Vec<ContactLens>,
    /// `model-eye` blocks.
    #[serde(default)]
    pub model_eyes: Vec<ModelEye>,
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
}

impl System {
    /// Every element as the optics crate traces it, in order.
    pub fn optics_elements(&self) -> Vec<parax_optics::system::Element> {
        self.elements.iter().map(|e| e.value.to_optics()).collect()
    }
}
