//! Which keywords each block accepts, what values they take and what they mean.
//! Used for "did you mean" hints, for completion in editors, and checked against
//! docs/notation.md by a test.

use parax_syntax::BlockKind;

/// One keyword of a block.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub struct KeywordSpec {
    /// The keyword.
    pub name: &'static str,
    /// The values it takes, as the notation document writes them.
    pub form: &'static str,
    /// What it records.
    pub doc: &'static str,
    /// May appear more than once in a block.
    pub repeatable: bool,
    /// Computed from in this version (false: accepted and checked, not yet used).
    pub evaluated: bool,
}

const fn kw(name: &'static str, form: &'static str, doc: &'static str) -> KeywordSpec {
    KeywordSpec {
        name,
        form,
        doc,
        repeatable: false,
        evaluated: true,
    }
}

const fn many(k: KeywordSpec) -> KeywordSpec {
    KeywordSpec {
        repeatable: true,
        ..k
    }
}

const EXPECT: KeywordSpec = many(kw(
    "expect",
    "NAME VALUE [± TOLERANCE]",
    "a recorded result, checked against the computed value",
));

const CASE: &[KeywordSpec] = &[
    kw("date", "YYYY-MM-DD", "date of the case or visit"),
    kw("age", "N y", "age of the patient in years"),
    many(kw("note", "\"TEXT\"", "a free note")),
    many(kw("tag", "WORD", "a label for grouping cases")),
];

const EYE: &[KeywordSpec] = &[
    kw(
        "refraction",
        "SPHERE [/ CYLINDER x AXIS] [@ VERTEX mm]",
        "distance refraction and the vertex distance it was measured at",
    ),
    kw("add", "POWER", "reading addition"),
    kw(
        "keratometry",
        "RADIUS mm x MERIDIAN, RADIUS mm x MERIDIAN (or K D x MERIDIAN, …)",
        "anterior corneal curvature in both principal meridians",
    ),
    kw(
        "keratometric-index",
        "N",
        "index used to turn radius into K (default 1.3375)",
    ),
    kw(
        "posterior-radius",
        "RADIUS mm",
        "posterior corneal radius, for total corneal power",
    ),
    kw(
        "corneal-thickness",
        "LENGTH mm",
        "central corneal thickness, for total corneal power",
    ),
    kw("axial-length", "LENGTH mm", "axial length of the eye"),
    kw("pd", "LENGTH mm", "monocular pupillary distance"),
    kw("age", "N y", "age, when it differs per eye or visit"),
    kw(
        "iol-constant",
        "N",
        "SRK/T A constant of the intraocular lens considered",
    ),
    kw(
        "iol-target",
        "POWER",
        "target refraction after surgery (default 0)",
    ),
    kw(
        "iol-elp",
        "LENGTH mm",
        "effective lens position, for the thin-lens vergence formula",
    ),
    kw(
        "iol-power",
        "POWER",
        "power of a chosen intraocular lens, for its predicted refraction",
    ),
    kw(
        "refractive-surgery",
        "\"TEXT\"",
        "history of corneal refractive surgery (keratometry cautions follow)",
    ),
    many(kw("note", "\"TEXT\"", "a free note")),
    EXPECT,
];

const FRAME: &[KeywordSpec] = &[
    kw(
        "vertex",
        "LENGTH mm",
        "vertex distance as fitted in this frame",
    ),
    kw("pantoscopic-tilt", "ANGLE deg", "pantoscopic tilt"),
    kw("face-form", "ANGLE deg", "face form (wrap) angle"),
    kw(
        "fitting-height",
        "LENGTH mm",
        "height of the pupil centre above the lowest point of the rim",
    ),
    kw(
        "reading-drop",
        "LENGTH mm",
        "how far below the distance centres the eyes read",
    ),
    kw(
        "near-inset",
        "LENGTH mm",
        "inward shift of each reading point",
    ),
    kw(
        "centre-distance",
        "LENGTH mm",
        "distance between the optical centres",
    ),
    kw(
        "boxed-lens-size",
        "WIDTH mm x HEIGHT mm",
        "horizontal and vertical boxed lens size of the frame shape",
    ),
    kw(
        "distance-between-lenses",
        "LENGTH mm",
        "distance between the boxed lens shapes (bridge)",
    ),
    kw(
        "effective-diameter",
        "LENGTH mm",
        "twice the longest radius of the lens shape from its boxed centre",
    ),
    many(kw("note", "\"TEXT\"", "a free note")),
    EXPECT,
];

const SPECTACLE_LENS: &[KeywordSpec] = &[
    kw("power", "SPHERE [/ CYLINDER x AXIS]", "the power ordered"),
    kw("add", "POWER", "the addition ordered"),
    kw(
        "prism",
        "AMOUNT Δ BASE",
        "prescribed prism and base direction (BU, BD, BI, BO)",
    ),
    kw("index", "N", "refractive index of the material"),
    kw(
        "material",
        "\"TEXT\"",
        "material name (index and minimum thickness from a table)",
    ),
    kw("base-curve", "POWER", "front surface power"),
    kw("centre-thickness", "LENGTH mm", "centre thickness"),
    kw("edge-thickness", "LENGTH mm", "edge thickness"),
    kw("blank-diameter", "LENGTH mm", "uncut diameter"),
    kw(
        "measured",
        "SPHERE [/ CYLINDER x AXIS]",
        "focimeter reading of the received lens",
    ),
    kw(
        "measured-add",
        "POWER",
        "addition measured on the received lens",
    ),
    kw(
        "measured-prism",
        "AMOUNT Δ BASE",
        "prism measured at the received lens's reference point",
    ),
    many(kw("note", "\"TEXT\"", "a free note")),
    EXPECT,
];

const CONTACT_LENS: &[KeywordSpec] = &[
    kw("base-curve", "RADIUS mm", "back optic zone radius"),
    kw(
        "power",
        "SPHERE [/ CYLINDER x AXIS]",
        "back vertex power ordered, compared with the computed power",
    ),
    kw("kind", "rigid | soft", "lens type"),
    kw(
        "diameter",
        "LENGTH mm",
        "total diameter (plausibility for the lens type only)",
    ),
    many(kw("note", "\"TEXT\"", "a free note")),
    EXPECT,
];

const SYSTEM: &[KeywordSpec] = &[
    kw(
        "object",
        "DISTANCE before LABEL | at infinity",
        "where the object is (default: at infinity)",
    ),
    many(kw("lens", "LABEL POWER", "a thin lens")),
    many(kw(
        "gap",
        "LENGTH [index N]",
        "distance to the next element, in air unless an index is given",
    )),
    many(kw(
        "surface",
        "LABEL RADIUS mm index N",
        "a refracting surface",
    )),
    many(kw("note", "\"TEXT\"", "a free note")),
    EXPECT,
];

const MODEL_EYE: &[KeywordSpec] = &[
    kw(
        "from",
        "gullstrand | le-grand | emsley",
        "the published schematic eye to start from",
    ),
    kw("axial-length", "LENGTH mm", "axial length override"),
    many(kw(
        "surface",
        "N radius RADIUS mm [index N] [distance LENGTH mm]",
        "override one surface",
    )),
    many(kw("note", "\"TEXT\"", "a free note")),
    EXPECT,
];

/// The keywords a block of `kind` accepts.
pub fn keywords(kind: BlockKind) -> &'static [KeywordSpec] {
    match kind {
        BlockKind::Case => CASE,
        BlockKind::Eye => EYE,
        BlockKind::Frame => FRAME,
        BlockKind::SpectacleLens => SPECTACLE_LENS,
        BlockKind::ContactLens => CONTACT_LENS,
        BlockKind::System => SYSTEM,
        BlockKind::ModelEye => MODEL_EYE,
    }
}

/// The spec of `keyword` in a block of `kind`.
pub fn keyword(kind: BlockKind, keyword: &str) -> Option<&'static KeywordSpec> {
    keywords(kind).iter().find(|k| k.name == keyword)
}

/// What a block header takes after its keyword.
pub fn header_form(kind: BlockKind) -> &'static str {
    match kind {
        BlockKind::Case => "[\"TITLE\"]",
        BlockKind::Eye => "right|left [YYYY-MM-DD]",
        BlockKind::Frame => "[\"NAME\"]",
        BlockKind::SpectacleLens | BlockKind::ContactLens => "right|left",
        BlockKind::System | BlockKind::ModelEye => "\"NAME\"",
    }
}
