//! Derived values of `spectacle-lens` blocks and of the `frame` they are fitted in:
//! power as worn (tilt), the compensated power to order, prism by Prentice's rule
//! at the distance and reading points, thickness by exact sags, spectacle
//! magnification, verification of a received lens against ANSI Z80.1-2015, and
//! for the frame the optical-centre drop, prism imbalance and aniseikonia.

use super::keys;
use crate::blocks::frame::oc_height;
use crate::blocks::Context;
use crate::codes;
use crate::compute::{n4, sphcyl, Out};
use crate::derived::{DerivedValue as V, Method};
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::{At, Frame, Side, SpectacleLens};
use crate::sources as src;
use parax_optics::lens_form::{self, material_minimums};
use parax_optics::prism::{self, prentice, Prism};
use parax_optics::refraction::SphCyl;
use parax_optics::tilt::{self, Tilt};
use parax_optics::verify::{self, Check};
use parax_optics::vertex::{round_order, transfer_sphcyl};

/// The formula of the power as worn in a tilted frame.
const AS_WORN_FORMULA: &str = "F_t = (1 + sin²γ/2n)·A⁻ᵀ·F·A⁻¹, A the lens plane projected along the line of sight, cos γ = cos p·cos f; sphere: S(1 + sin²γ/2n), C = S'·tan²γ about the tilt axis";

/// Index used when a lens records none, for tilt only (thickness needs a recorded
/// index): 1.5, a common crown/CR-39 value [CP].
const DEFAULT_INDEX: f64 = 1.5;

pub(crate) fn power(l: &SpectacleLens) -> Option<SphCyl> {
    l.power
        .as_ref()
        .map(|p| SphCyl::new(p.value.sphere, p.value.cylinder, p.value.axis))
}

/// The frame's tilt before the lens's eye (face form turns the two lenses in
/// opposite senses).
fn tilt_of(f: &Frame, side: Side) -> Tilt {
    Tilt::new(
        f.pantoscopic_tilt.as_ref().map_or(0.0, |t| t.value),
        f.face_form.as_ref().map_or(0.0, |t| t.value),
        side_eye(side),
    )
}

/// "γ° about the axis at θ" with the twist when both tilts are present.
fn oblique_note(t: &Tilt) -> String {
    let o = t.oblique();
    let twist = if o.twist_deg.abs() >= 5e-5 {
        format!(", after a twist of {}° of the lens", n4(o.twist_deg))
    } else {
        String::new()
    };
    format!(
        "one rotation of {}° about the axis at {}{twist}",
        n4(o.angle_deg.abs()),
        n4(o.axis_deg)
    )
}

pub(crate) fn side_eye(s: Side) -> prism::Eye {
    match s {
        Side::Right => prism::Eye::Right,
        Side::Left => prism::Eye::Left,
    }
}

fn with_prescribed(mut p: Prism, l: &SpectacleLens) -> Prism {
    if let Some(rx) = &l.prism {
        let a = rx.value.amount;
        match rx.value.base.as_str() {
            "BU" => p.base_up += a,
            "BD" => p.base_up -= a,
            "BI" => p.base_in += a,
            _ => p.base_in -= a,
        }
    }
    p
}

/// Horizontal offset of the pupil from the optical centre, nasal positive:
/// half the centre distance minus the monocular PD.
pub(crate) fn nasal_offset(case: &Context<'_>, f: &Frame, l: &SpectacleLens) -> Option<f64> {
    let cd = f.centre_distance.as_ref()?.value;
    let pd = case.current_eye(l.side)?.pd.as_ref()?.value;
    Some(cd / 2.0 - pd)
}

pub(crate) struct Prisms {
    pub(crate) distance: Option<(Prism, String)>,
    pub(crate) reading: Option<(Prism, String)>,
    /// The horizontal offset of the reading point is known (centre distance and PD).
    pub(crate) reading_horizontal: bool,
}

pub(crate) fn prisms(case: &Context<'_>, l: &SpectacleLens) -> Prisms {
    let (Some(rx), Some(f)) = (power(l), case.first_frame()) else {
        return Prisms {
            distance: None,
            reading: None,
            reading_horizontal: false,
        };
    };
    let eye = side_eye(l.side);
    let nasal = nasal_offset(case, f, l);
    let distance = nasal.map(|c| {
        let p = with_prescribed(prentice(&rx, eye, c, 0.0), l);
        (
            p,
            format!(
                "pupil {} mm nasal of the optical centre (centre distance / 2 − PD); P = −F·c → {}",
                n4(c * 1000.0),
                p.describe()
            ),
        )
    });
    let reading = f.reading_drop.as_ref().map(|drop| {
        let inset = f.near_inset.as_ref().map_or(0.0, |i| i.value);
        let c = nasal.map_or(0.0, |n| n + inset);
        let p = with_prescribed(prentice(&rx, eye, c, -drop.value), l);
        (
            p,
            format!(
                "reading point {} mm below and {} mm nasal of the optical centre; P = −F·c → {}",
                n4(drop.value * 1000.0),
                n4(c * 1000.0),
                p.describe()
            ),
        )
    });
    Prisms {
        distance,
        reading,
        reading_horizontal: nasal.is_some(),
    }
}

fn vertical(p: &Prism) -> V {
    V::Prism {
        dioptres: p.base_up.abs(),
        base: if p.base_up >= 0.0 { "BU" } else { "BD" },
    }
}

pub(crate) fn horizontal(p: f64) -> V {
    V::Prism {
        dioptres: p.abs(),
        base: if p >= 0.0 { "BI" } else { "BO" },
    }
}

struct Form {
    centre: f64,
    edge: f64,
    f1: f64,
    index: f64,
    strongest: f64,
    /// Semi-aperture used, metres.
    y: f64,
}

/// The refractive index of a lens: the recorded `index`, else its `material`'s
/// index from the table.
fn lens_index(l: &SpectacleLens) -> Option<f64> {
    l.index.as_ref().map(|i| i.value).or_else(|| {
        l.material
            .as_ref()
            .and_then(|m| lens_form::material(&m.value))
            .map(|m| m.index)
    })
}

/// Usual minimum (minus centre, plus edge) thickness: the material's row of the
/// table when it names one, else by index.
fn minimums(l: &SpectacleLens, index: f64) -> (f64, f64) {
    match l
        .material
        .as_ref()
        .and_then(|m| lens_form::material(&m.value))
    {
        Some(m) => (m.min_centre, m.min_edge),
        None => material_minimums(index),
    }
}

/// Thickness at semi-aperture `y` (metres).
fn form_at(l: &SpectacleLens, y: f64) -> Option<Form> {
    let rx = power(l)?;
    let index = lens_index(l)?;
    let f1 = l.base_curve.as_ref()?.value;
    let strongest = rx
        .principal_meridians()
        .into_iter()
        .map(|m| m.power)
        .max_by(|a, b| a.abs().total_cmp(&b.abs()))?;
    let (min_c, min_e) = minimums(l, index);
    let min_c = l.centre_thickness.as_ref().map_or(min_c, |t| t.value);
    let min_e = l.edge_thickness.as_ref().map_or(min_e, |t| t.value);
    let t = lens_form::thickness(strongest, f1, index, y, min_c, min_e)?;
    Some(Form {
        centre: t.centre,
        edge: t.edge,
        f1,
        index,
        strongest,
        y,
    })
}

fn form(l: &SpectacleLens) -> Option<Form> {
    form_at(l, l.blank_diameter.as_ref()?.value / 2.0)
}

/// The edged lens in the frame: decentration from the boxed centre, the effective
/// diameter used and how it was found.
struct Edged {
    horizontal: f64,
    vertical: f64,
    total: f64,
    effective_diameter: f64,
    ed_note: String,
    span: parax_syntax::Span,
}

fn edged(case: &Context<'_>, l: &SpectacleLens) -> Option<Edged> {
    let f = case.first_frame()?;
    let boxed = f.boxed_lens_size.as_ref()?;
    let (a, b) = boxed.value;
    let dbl = f.distance_between_lenses.as_ref()?.value;
    // Where the optical centres are: the frame's centre distance, else at the pupils.
    let half_cd = match &f.centre_distance {
        Some(cd) => cd.value / 2.0,
        None => case.current_eye(l.side)?.pd.as_ref()?.value,
    };
    let horizontal = (a + dbl) / 2.0 - half_cd;
    let vertical = oc_height(f).map_or(0.0, |(h, _)| h - b / 2.0);
    let total = lens_form::decentration(a, dbl, 2.0 * half_cd, vertical);
    let (effective_diameter, ed_note) = match &f.effective_diameter {
        Some(ed) => (ed.value, format!("ED {} mm", n4(ed.value * 1000.0))),
        None => (
            a.hypot(b),
            format!(
                "ED not recorded: the box diagonal √({}² + {}²) = {} mm, an upper bound",
                n4(a * 1000.0),
                n4(b * 1000.0),
                n4(a.hypot(b) * 1000.0)
            ),
        ),
    };
    Some(Edged {
        horizontal,
        vertical,
        total,
        effective_diameter,
        ed_note,
        span: boxed.span,
    })
}

pub(crate) fn magnification(case: &Context<'_>, l: &SpectacleLens) -> Option<(f64, String)> {
    let f = form(l)?;
    let vertex = case.first_frame()?.vertex.as_ref()?.value;
    let bvp = power(l)?.spherical_equivalent();
    let h = lens_form::entrance_pupil_distance(vertex);
    let (shape, pw, sm) = lens_form::spectacle_magnification(f.f1, f.centre, f.index, bvp, h);
    Some((
        sm,
        format!(
            "shape 1/(1 − ({}/{})·{}) = {}; power 1/(1 − {}·{}) = {} (spherical equivalent); SM = {}",
            n4(f.centre),
            f.index,
            n4(f.f1),
            n4(shape),
            n4(h),
            n4(bvp),
            n4(pw),
            n4(sm)
        ),
    ))
}

pub(crate) fn compute(
    case: &Context<'_>,
    l: &SpectacleLens,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    let frame = case.first_frame();
    let index = lens_index(l).unwrap_or(DEFAULT_INDEX);
    let index_note = if l.index.is_some() {
        format!("n = {index}")
    } else if lens_index(l).is_some() {
        format!("n = {index} (from the material)")
    } else {
        format!("n = {index} (not recorded; assumed)")
    };
    material(l, diags);
    let pspan = l.power.as_ref().map_or(l.span, |p| p.span);
    if let (Some(rx), Some(f)) = (power(l), frame) {
        let t = tilt_of(f, l.side);
        if t.pantoscopic_deg != 0.0 || t.face_form_deg != 0.0 {
            let worn = tilt::as_worn(&rx, t, index);
            out.push(
                keys::AS_WORN,
                "power as worn (tilt)",
                sphcyl(&worn),
                pspan,
                if rx.cylinder.abs() < 1e-9 && (t.pantoscopic_deg == 0.0 || t.face_form_deg == 0.0)
                {
                    &Method {
                        formula: AS_WORN_FORMULA,
                        source: src::MARTIN,
                    }
                } else {
                    &Method {
                        formula: AS_WORN_FORMULA,
                        source: src::TILT_MATRIX,
                    }
                },
                || {
                    format!(
                        "{} tilted {}° pantoscopic, {}° face form ({}), {index_note} → {}",
                        sphcyl(&rx).display(),
                        n4(t.pantoscopic_deg),
                        n4(t.face_form_deg),
                        oblique_note(&t),
                        sphcyl(&worn).display()
                    )
                },
            )
            .caution = Some(src::CAUTION_ORDER);
            let change = [0.0, 45.0, 90.0, 135.0]
                .iter()
                .map(|m| (worn.meridian_power(*m) - rx.meridian_power(*m)).abs())
                .fold(0.0, f64::max);
            if change >= 0.12 {
                diags.push(
                    Diagnostic::new(
                        codes::TILT_CHANGES_POWER,
                        Severity::Info,
                        pspan,
                        format!(
                            "as worn in this frame the lens acts as {} (up to {change:.2} D different)",
                            sphcyl(&worn).display()
                        ),
                    )
                    .hint("see `compensated` for the power that gives the prescription as worn")
                    .caution(src::CAUTION_ORDER),
                );
            }
        }
    }
    if let (Some(eye), Some(f)) = (case.current_eye(l.side), frame) {
        if let Some(r) = &eye.refraction {
            let mut target = SphCyl::new(r.value.rx.sphere, r.value.rx.cylinder, r.value.rx.axis);
            let mut steps = vec![format!("prescription {}", sphcyl(&target).display())];
            if let (Some(d), Some(fv)) = (r.value.vertex, f.vertex.as_ref()) {
                if (d - fv.value).abs() > 1e-9 {
                    target = transfer_sphcyl(&target, d - fv.value);
                    steps.push(format!(
                        "moved from {} mm to {} mm: {}",
                        n4(d * 1000.0),
                        n4(fv.value * 1000.0),
                        sphcyl(&target).display()
                    ));
                }
            }
            let t = tilt_of(f, l.side);
            let order = tilt::compensated(&target, t, index);
            steps.push(format!(
                "tilt {}° / {}° ({}), {index_note}: inverse of the as-worn mapping → {}",
                n4(t.pantoscopic_deg),
                n4(t.face_form_deg),
                oblique_note(&t),
                sphcyl(&order).display()
            ));
            out.push(
                keys::COMPENSATED,
                "power to order (vertex and tilt compensated)",
                sphcyl(&order),
                l.span,
                &COMPENSATED_ORDER,
                || steps.join("; "),
            )
            .caution = Some(src::CAUTION_ORDER);
            let rounded = round_order(&order, 0.25);
            out.push(
                keys::COMPENSATED_ROUNDED,
                "power to order, to 0.25 D and whole degrees",
                sphcyl(&rounded),
                l.span,
                &ORDER_ROUNDED,
                || {
                    format!(
                        "{} → {}",
                        sphcyl(&order).display(),
                        sphcyl(&rounded).display()
                    )
                },
            )
            .caution = Some(src::CAUTION_ORDER);
        }
    }
    let p = prisms(case, l);
    if let Some((d, why)) = &p.distance {
        out.push(
            keys::DISTANCE_PRISM_HORIZONTAL,
            "horizontal prism at the distance pupil",
            horizontal(d.base_in),
            l.span,
            &Method {
                formula: "P = −F·c (Prentice, power matrix; c in cm), plus any prescribed prism",
                source: src::PRENTICE,
            },
            || why.clone(),
        );
    }
    if let Some((r, why)) = &p.reading {
        out.push(
            keys::READING_PRISM_VERTICAL,
            "vertical prism at the reading point",
            vertical(r),
            l.span,
            &Method {
                formula: "P = −F·c (Prentice, power matrix; c in cm), plus any prescribed prism",
                source: src::PRENTICE,
            },
            || why.clone(),
        );
        if p.reading_horizontal {
            out.push(
                keys::READING_PRISM_HORIZONTAL,
                "horizontal prism at the reading point",
                horizontal(r.base_in),
                l.span,
                &Method {
                    formula:
                        "P = −F·c (Prentice, power matrix; c in cm), plus any prescribed prism",
                    source: src::PRENTICE,
                },
                || why.clone(),
            );
        }
    }
    thickness(l, out, diags);
    edged_thickness(case, l, out, diags);
    if let Some((sm, why)) = magnification(case, l) {
        out.push(
            keys::MAGNIFICATION,
            "spectacle magnification",
            V::Number { value: sm },
            l.span,
            &Method {
                formula: "SM = 1/(1 − (t/n)·F1) × 1/(1 − h·Fv), h = vertex distance + 3 mm",
                source: src::SPECTACLE_MAGNIFICATION,
            },
            || why,
        );
    }
    verification(l, out, diags);
}

/// The material line: an index from the table when no `index` is recorded; a
/// note when the name is not in the table or disagrees with the recorded index.
fn material(l: &SpectacleLens, diags: &mut Vec<Diagnostic>) {
    let Some(m) = &l.material else { return };
    match lens_form::material(&m.value) {
        None => diags.push(
            Diagnostic::new(
                codes::MATERIAL,
                Severity::Info,
                m.span,
                format!(
                    "material \"{}\" is not in the table; record its `index`",
                    m.value
                ),
            )
            .hint(format!(
                "the table knows {}",
                lens_form::MATERIALS
                    .iter()
                    .map(|t| format!("\"{}\"", t.name))
                    .collect::<Vec<_>>()
                    .join(", ")
            )),
        ),
        Some(t) => {
            if let Some(i) = &l.index {
                if (i.value - t.index).abs() > 0.01 {
                    diags.push(
                        Diagnostic::new(
                            codes::MATERIAL,
                            Severity::Warning,
                            i.span,
                            format!(
                                "index {} does not match {} (n {}); the recorded index is used",
                                i.value, t.name, t.index
                            ),
                        )
                        .hint("check the material and index on the order")
                        .caution(src::CAUTION_ORDER),
                    );
                }
            }
        }
    }
}

/// Thickness of the lens edged to the frame shape: the semi-aperture is the
/// distance to the farthest point (ED/2 + decentration); the minimum blank size
/// is ED + 2 × decentration.
fn edged_thickness(
    case: &Context<'_>,
    l: &SpectacleLens,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    let Some(e) = edged(case, l) else { return };
    let why = || {
        format!(
        "horizontal (A + DBL)/2 − centre distance/2 = {} mm, vertical OC height − B/2 = {} mm → {} mm",
        n4(e.horizontal * 1000.0),
        n4(e.vertical * 1000.0),
        n4(e.total * 1000.0)
        )
    };
    out.push(
        keys::DECENTRATION,
        "decentration of the optical centre from the boxed centre",
        V::Length { metres: e.total },
        e.span,
        &Method {
            formula: "dec = √(((A + DBL − CD)/2)² + (OC height − B/2)²)",
            source: src::BLANK_SIZE,
        },
        why,
    );
    let mbs = lens_form::minimum_blank(e.effective_diameter, e.total);
    out.push(
        keys::MINIMUM_BLANK,
        "minimum blank size",
        V::Length { metres: mbs },
        e.span,
        &Method {
            formula: "MBS = ED + 2 × decentration",
            source: src::BLANK_SIZE,
        },
        || {
            format!(
                "{}; {} + 2 × {} = {} mm (laboratories often add about 2 mm for edging)",
                e.ed_note,
                n4(e.effective_diameter * 1000.0),
                n4(e.total * 1000.0),
                n4(mbs * 1000.0)
            )
        },
    );
    if let Some(b) = &l.blank_diameter {
        if b.value < mbs - 1e-9 {
            diags.push(
                Diagnostic::new(
                    codes::BLANK_TOO_SMALL,
                    Severity::Warning,
                    b.span,
                    format!(
                        "a {:.1} mm blank is smaller than the {:.1} mm this frame shape and decentration need",
                        b.value * 1000.0,
                        mbs * 1000.0
                    ),
                )
                .hint("order a larger blank, or check the boxed lens size, effective diameter and centre distance")
                .caution(src::CAUTION_ORDER),
            );
        }
    }
    let y = lens_form::farthest_point(e.effective_diameter, e.total);
    let Some(f) = form_at(l, y) else { return };
    let why = || {
        format!(
        "strongest meridian {} D, F1 {} D, n {}, farthest point ED/2 + dec = {} mm: F2 = Fv − F1/(1 − (t/n)F1); edge = centre + s_back − s_front → centre {} mm, edge {} mm",
        n4(f.strongest),
        n4(f.f1),
        f.index,
        n4(f.y * 1000.0),
        n4(f.centre * 1000.0),
        n4(f.edge * 1000.0)
        )
    };
    out.push(
        keys::EDGED_THICKNESS_CENTRE,
        "centre thickness of the lens edged to the frame",
        V::Length { metres: f.centre },
        e.span,
        &EDGED_THICKNESS_CENTRE,
        why,
    );
    out.push(
        keys::EDGED_THICKNESS_EDGE,
        "edge thickness at the farthest point of the edged lens (strongest meridian)",
        V::Length { metres: f.edge },
        e.span,
        &Method {
            formula: "edge = centre + s_back − s_front at y = ED/2 + decentration",
            source: src::SAG,
        },
        why,
    );
}

fn thickness(l: &SpectacleLens, out: &mut Out<'_>, diags: &mut Vec<Diagnostic>) {
    let Some(f) = form(l) else { return };
    let y = f.y;
    let why = || {
        format!(
        "strongest meridian {} D, F1 {} D, n {}, y {} mm: F2 = Fv − F1/(1 − (t/n)F1); edge = centre + s_back − s_front with s = r − √(r² − y²) → centre {} mm, edge {} mm",
        n4(f.strongest),
        n4(f.f1),
        f.index,
        n4(y * 1000.0),
        n4(f.centre * 1000.0),
        n4(f.edge * 1000.0)
        )
    };
    let span = l.blank_diameter.as_ref().map_or(l.span, |d| d.span);
    out.push(
        keys::THICKNESS_CENTRE,
        "centre thickness",
        V::Length { metres: f.centre },
        span,
        &Method {
            formula: "minus: centre = minimum; plus: centre = edge + s_front − s_back",
            source: src::SAG,
        },
        why,
    );
    out.push(
        keys::THICKNESS_EDGE,
        "edge thickness (strongest meridian, uncut blank)",
        V::Length { metres: f.edge },
        span,
        &Method {
            formula: "edge = centre + s_back − s_front",
            source: src::SAG,
        },
        why,
    );
    let (min_c, min_e) = minimums(l, f.index);
    let minus = f.edge > f.centre;
    if let Some(t) = &l.centre_thickness {
        if minus && t.value < min_c - 1e-9 {
            diags.push(
                Diagnostic::new(
                    codes::THIN_LENS,
                    Severity::Warning,
                    t.span,
                    format!(
                        "centre thickness {:.1} mm is below the usual {:.1} mm for this material (n {})",
                        t.value * 1000.0,
                        min_c * 1000.0,
                        f.index
                    ),
                )
                .hint("minimum thicknesses are common practice; check with the laboratory")
                .caution(src::CAUTION_ORDER),
            );
        }
    }
    if let Some(t) = &l.edge_thickness {
        if !minus && t.value < min_e - 1e-9 {
            diags.push(
                Diagnostic::new(
                    codes::THIN_LENS,
                    Severity::Warning,
                    t.span,
                    format!(
                        "edge thickness {:.1} mm is below the usual {:.1} mm",
                        t.value * 1000.0,
                        min_e * 1000.0
                    ),
                )
                .hint("drilled rimless mounts usually need 1.5 to 2 mm")
                .caution(src::CAUTION_ORDER),
            );
        }
    }
}

/// (horizontal, vertical) components of a recorded prism: base in and base up positive.
pub(crate) fn components(p: &crate::model::PrismRx) -> (f64, f64) {
    match p.base.as_str() {
        "BU" => (0.0, p.amount),
        "BD" => (0.0, -p.amount),
        "BI" => (p.amount, 0.0),
        _ => (-p.amount, 0.0),
    }
}

type Part<'a> = (&'a str, &'a str, Check, &'a str, parax_syntax::Span);

fn verification(l: &SpectacleLens, out: &mut Out<'_>, diags: &mut Vec<Diagnostic>) {
    let mut parts: Vec<Part<'_>> = Vec::new();
    let mut compared = Vec::new();
    if let (Some(ordered), Some(m)) = (power(l), l.measured.as_ref()) {
        let measured = SphCyl::new(m.value.sphere, m.value.cylinder, m.value.axis);
        let v = verify::verify(&ordered, &measured);
        parts.push((
            keys::CHECK_SPHERE,
            "sphere (strongest meridian)",
            v.sphere,
            "D",
            m.span,
        ));
        parts.push((keys::CHECK_CYLINDER, "cylinder", v.cylinder, "D", m.span));
        if let Some(a) = v.axis {
            parts.push((keys::CHECK_AXIS, "axis", a, "°", m.span));
        }
        compared.push(format!(
            "power ordered {}, measured {}",
            sphcyl(&ordered).display(),
            sphcyl(&measured).display()
        ));
    }
    if let (Some(o), Some(m)) = (&l.add, &l.measured_add) {
        parts.push((
            keys::CHECK_ADD,
            "add",
            Check {
                ordered: o.value,
                measured: m.value,
                tolerance: verify::add_tolerance(o.value),
            },
            "D",
            m.span,
        ));
        compared.push(format!(
            "add ordered {}, measured {}",
            n4(o.value),
            n4(m.value)
        ));
    }
    if let Some(m) = &l.measured_prism {
        // Unwanted (or wrong) prism: the size of the difference between the prism
        // measured at the reference point and the prism ordered (none if not ordered).
        let (mh, mv) = components(&m.value);
        let (oh, ov) = l
            .prism
            .as_ref()
            .map_or((0.0, 0.0), |p| components(&p.value));
        let diff = (mh - oh).hypot(mv - ov);
        parts.push((
            keys::CHECK_PRISM,
            "prism at the reference point (size of the difference from the order)",
            Check {
                ordered: 0.0,
                measured: diff,
                tolerance: verify::PRISM_TOLERANCE,
            },
            "Δ",
            m.span,
        ));
        compared.push(format!("prism difference {}Δ", n4(diff)));
    }
    if parts.is_empty() {
        return;
    }
    let mut all = true;
    for (name, what, c, unit, span) in parts {
        let m = At { value: (), span };
        let pass = c.passes();
        all &= pass;
        let band = format!(
            "{:.2} to {:.2} {unit}",
            c.ordered - c.tolerance,
            c.ordered + c.tolerance
        );
        out.push(
            name,
            format!("{what} within {}", verify::STANDARD),
            V::Text {
                text: if pass { "pass" } else { "fail" }.into(),
            },
            m.span,
            &Method {
                formula: "|measured − ordered| ≤ tolerance of ANSI Z80.1-2015",
                source: src::ANSI_Z80_1_2015,
            },
            || {
                format!(
                    "ordered {} ± {} → allowed {band}; measured {}",
                    n4(c.ordered),
                    n4(c.tolerance),
                    n4(c.measured)
                )
            },
        );
        if !pass {
            diags.push(
                Diagnostic::new(
                    codes::OUT_OF_TOLERANCE,
                    Severity::Warning,
                    m.span,
                    format!(
                        "{what} out of tolerance: measured {:.2}, allowed {band} ({})",
                        c.measured,
                        verify::STANDARD
                    ),
                )
                .hint("re-measure on the focimeter, then return the lens to the laboratory if confirmed")
                .caution(src::CAUTION_ORDER),
            );
        }
    }
    out.push(
        keys::VERIFICATION,
        format!("received lens against the order ({})", verify::STANDARD),
        V::Text {
            text: if all { "pass" } else { "fail" }.into(),
        },
        l.measured.as_ref().map_or(l.span, |m| m.span),
        &Method {
            formula: "every component compared is within its tolerance",
            source: src::ANSI_Z80_1_2015,
        },
        || compared.join("; "),
    );
}
/// The power to order so that the lens gives the prescription as worn.
const COMPENSATED_ORDER: Method = Method {
    formula: "F = Aᵀ·F_rx·A/(1 + sin²γ/2n), F_rx moved to the frame's vertex by F' = F/(1 − d·F)",
    source: src::TILT_MATRIX,
};

/// How the compensated order is rounded.
const ORDER_ROUNDED: Method = Method {
    formula:
        "sphere and cylinder each rounded to the nearest 0.25 D, the axis to the nearest degree",
    source: src::ROUNDING_ORDER,
};

/// Centre thickness of an edged lens: the minimum for minus lenses, from the sags and the edge for plus lenses.
const EDGED_THICKNESS_CENTRE: Method = Method {
    formula:
        "minus: centre = minimum; plus: centre = edge + s_front − s_back, at the farthest point",
    source: src::SAG,
};
