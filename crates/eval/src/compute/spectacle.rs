//! Derived values of `spectacle-lens` blocks and of the `frame` they are fitted in:
//! power as worn (tilt), the compensated power to order, prism by Prentice's rule
//! at the distance and reading points, thickness by exact sags, spectacle
//! magnification, verification of a received lens against ANSI Z80.1-2015, and
//! for the frame the optical-centre drop, prism imbalance and aniseikonia.

use super::{current_eye, first_frame, n4, sphcyl, Out};
use crate::codes;
use crate::derived::DerivedValue as V;
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::{At, Case, Frame, Side, SpectacleLens};
use crate::sources as src;
use parax_optics::lens_form::{self, material_minimums};
use parax_optics::prism::{self, prentice, Prism};
use parax_optics::refraction::SphCyl;
use parax_optics::tilt::{self, Tilt};
use parax_optics::verify::{self, Check};
use parax_optics::vertex::{round_sphcyl, transfer_sphcyl};

/// `spectacle-lens.right` or `spectacle-lens.left`.
pub fn block_id(l: &SpectacleLens) -> String {
    format!("spectacle-lens.{}", l.side.name())
}

/// `frame` or `frame.<slug of the name>`.
pub fn frame_id(f: &Frame) -> String {
    match &f.name {
        Some(n) => format!("frame.{}", super::slug(n)),
        None => "frame".into(),
    }
}

/// Index used when a lens records none, for tilt only (thickness needs a recorded
/// index): 1.5, a common crown/CR-39 value [CP].
const DEFAULT_INDEX: f64 = 1.5;

fn power(l: &SpectacleLens) -> Option<SphCyl> {
    l.power
        .as_ref()
        .map(|p| SphCyl::new(p.value.sphere, p.value.cylinder, p.value.axis))
}

fn tilt_of(f: &Frame) -> Tilt {
    Tilt {
        pantoscopic_deg: f.pantoscopic_tilt.as_ref().map_or(0.0, |t| t.value),
        face_form_deg: f.face_form.as_ref().map_or(0.0, |t| t.value),
    }
}

fn side_eye(s: Side) -> prism::Eye {
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
fn nasal_offset(case: &Case, f: &Frame, l: &SpectacleLens) -> Option<f64> {
    let cd = f.centre_distance.as_ref()?.value;
    let pd = current_eye(case, l.side)?.pd.as_ref()?.value;
    Some(cd / 2.0 - pd)
}

struct Prisms {
    distance: Option<(Prism, String)>,
    reading: Option<(Prism, String)>,
    /// The horizontal offset of the reading point is known (centre distance and PD).
    reading_horizontal: bool,
}

fn prisms(case: &Case, l: &SpectacleLens) -> Prisms {
    let (Some(rx), Some(f)) = (power(l), first_frame(case)) else {
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
        base: if p.base_up >= 0.0 { "BU" } else { "BD" }.into(),
    }
}

fn horizontal(p: f64) -> V {
    V::Prism {
        dioptres: p.abs(),
        base: if p >= 0.0 { "BI" } else { "BO" }.into(),
    }
}

struct Form {
    centre: f64,
    edge: f64,
    f1: f64,
    index: f64,
    strongest: f64,
}

fn form(l: &SpectacleLens) -> Option<Form> {
    let rx = power(l)?;
    let index = l.index.as_ref()?.value;
    let f1 = l.base_curve.as_ref()?.value;
    let y = l.blank_diameter.as_ref()?.value / 2.0;
    let strongest = rx
        .principal_meridians()
        .into_iter()
        .map(|m| m.power)
        .max_by(|a, b| a.abs().total_cmp(&b.abs()))?;
    let (min_c, min_e) = material_minimums(index);
    let min_c = l.centre_thickness.as_ref().map_or(min_c, |t| t.value);
    let min_e = l.edge_thickness.as_ref().map_or(min_e, |t| t.value);
    let t = lens_form::thickness(strongest, f1, index, y, min_c, min_e)?;
    Some(Form {
        centre: t.centre,
        edge: t.edge,
        f1,
        index,
        strongest,
    })
}

fn magnification(case: &Case, l: &SpectacleLens) -> Option<(f64, String)> {
    let f = form(l)?;
    let vertex = first_frame(case)?.vertex.as_ref()?.value;
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

pub(super) fn compute(
    case: &Case,
    l: &SpectacleLens,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    let frame = first_frame(case);
    let index = l.index.as_ref().map_or(DEFAULT_INDEX, |i| i.value);
    let index_note = if l.index.is_some() {
        format!("n = {index}")
    } else {
        format!("n = {index} (not recorded; assumed)")
    };
    let pspan = l.power.as_ref().map_or(l.span, |p| p.span);
    if let (Some(rx), Some(f)) = (power(l), frame) {
        let t = tilt_of(f);
        if t.pantoscopic_deg != 0.0 || t.face_form_deg != 0.0 {
            let worn = tilt::as_worn(&rx, t, index);
            out.push(
                "as-worn",
                "power as worn (tilt)",
                sphcyl(&worn),
                pspan,
                "F_t = (1 + sin²γ/2n)·Q·F·Q, Q = diag(1/cos face form, 1/cos pantoscopic); sphere: S(1 + sin²a/2n), C = S'·tan²a",
                format!(
                    "{} tilted {}° pantoscopic, {}° face form, {index_note} → {}",
                    sphcyl(&rx).display(),
                    n4(t.pantoscopic_deg),
                    n4(t.face_form_deg),
                    sphcyl(&worn).display()
                ),
                if rx.cylinder.abs() < 1e-9 && (t.pantoscopic_deg == 0.0 || t.face_form_deg == 0.0) {
                    src::MARTIN
                } else {
                    src::TILT_MATRIX
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
    if let (Some(eye), Some(f)) = (current_eye(case, l.side), frame) {
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
            let t = tilt_of(f);
            let order = tilt::compensated(&target, t, index);
            steps.push(format!(
                "tilt {}° / {}°, {index_note}: inverse of the as-worn mapping → {}",
                n4(t.pantoscopic_deg),
                n4(t.face_form_deg),
                sphcyl(&order).display()
            ));
            out.push(
                "compensated",
                "power to order (vertex and tilt compensated)",
                sphcyl(&order),
                l.span,
                "F = (Q⁻¹·F_rx·Q⁻¹)/(1 + sin²γ/2n), F_rx moved to the frame's vertex by F' = F/(1 − d·F)",
                steps.join("; "),
                src::TILT_MATRIX,
            )
            .caution = Some(src::CAUTION_ORDER);
            let rounded = round_sphcyl(&order, 0.25);
            out.push(
                "compensated-rounded",
                "power to order, to 0.25 D",
                sphcyl(&rounded),
                l.span,
                "sphere and cylinder each rounded to the nearest 0.25 D",
                format!(
                    "{} → {}",
                    sphcyl(&order).display(),
                    sphcyl(&rounded).display()
                ),
                src::ROUNDING,
            )
            .caution = Some(src::CAUTION_ORDER);
        }
    }
    let p = prisms(case, l);
    if let Some((d, why)) = &p.distance {
        out.push(
            "distance-prism-horizontal",
            "horizontal prism at the distance pupil",
            horizontal(d.base_in),
            l.span,
            "P = −F·c (Prentice, power matrix; c in cm), plus any prescribed prism",
            why.clone(),
            src::PRENTICE,
        );
    }
    if let Some((r, why)) = &p.reading {
        out.push(
            "reading-prism-vertical",
            "vertical prism at the reading point",
            vertical(r),
            l.span,
            "P = −F·c (Prentice, power matrix; c in cm), plus any prescribed prism",
            why.clone(),
            src::PRENTICE,
        );
        if p.reading_horizontal {
            out.push(
                "reading-prism-horizontal",
                "horizontal prism at the reading point",
                horizontal(r.base_in),
                l.span,
                "P = −F·c (Prentice, power matrix; c in cm), plus any prescribed prism",
                why.clone(),
                src::PRENTICE,
            );
        }
    }
    thickness(l, out, diags);
    if let Some((sm, why)) = magnification(case, l) {
        out.push(
            "magnification",
            "spectacle magnification",
            V::Number { value: sm },
            l.span,
            "SM = 1/(1 − (t/n)·F1) × 1/(1 − h·Fv), h = vertex distance + 3 mm",
            why,
            src::SPECTACLE_MAGNIFICATION,
        );
    }
    verification(l, out, diags);
}

fn thickness(l: &SpectacleLens, out: &mut Out<'_>, diags: &mut Vec<Diagnostic>) {
    let Some(f) = form(l) else { return };
    let y = l.blank_diameter.as_ref().map_or(0.0, |d| d.value / 2.0);
    let why = format!(
        "strongest meridian {} D, F1 {} D, n {}, y {} mm: F2 = Fv − F1/(1 − (t/n)F1); edge = centre + s_back − s_front with s = r − √(r² − y²) → centre {} mm, edge {} mm",
        n4(f.strongest),
        n4(f.f1),
        f.index,
        n4(y * 1000.0),
        n4(f.centre * 1000.0),
        n4(f.edge * 1000.0)
    );
    let span = l.blank_diameter.as_ref().map_or(l.span, |d| d.span);
    out.push(
        "thickness-centre",
        "centre thickness",
        V::Length { metres: f.centre },
        span,
        "minus: centre = minimum; plus: centre = edge + s_front − s_back",
        why.clone(),
        src::SAG,
    );
    out.push(
        "thickness-edge",
        "edge thickness (strongest meridian, uncut blank)",
        V::Length { metres: f.edge },
        span,
        "edge = centre + s_back − s_front",
        why,
        src::SAG,
    );
    let (min_c, min_e) = material_minimums(f.index);
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
fn components(p: &crate::model::PrismRx) -> (f64, f64) {
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
            "check-sphere",
            "sphere (strongest meridian)",
            v.sphere,
            "D",
            m.span,
        ));
        parts.push(("check-cylinder", "cylinder", v.cylinder, "D", m.span));
        if let Some(a) = v.axis {
            parts.push(("check-axis", "axis", a, "°", m.span));
        }
        compared.push(format!(
            "power ordered {}, measured {}",
            sphcyl(&ordered).display(),
            sphcyl(&measured).display()
        ));
    }
    if let (Some(o), Some(m)) = (&l.add, &l.measured_add) {
        parts.push((
            "check-add",
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
            "check-prism",
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
            &format!("{what} within {}", verify::STANDARD),
            V::Text {
                text: if pass { "pass" } else { "fail" }.into(),
            },
            m.span,
            "|measured − ordered| ≤ tolerance of ANSI Z80.1-2015",
            format!(
                "ordered {} ± {} → allowed {band}; measured {}",
                n4(c.ordered),
                n4(c.tolerance),
                n4(c.measured)
            ),
            src::ANSI_Z80_1_2015,
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
        "verification",
        &format!("received lens against the order ({})", verify::STANDARD),
        V::Text {
            text: if all { "pass" } else { "fail" }.into(),
        },
        l.measured.as_ref().map_or(l.span, |m| m.span),
        "every component compared is within its tolerance",
        compared.join("; "),
        src::ANSI_Z80_1_2015,
    );
}

/// Values of the frame: optical-centre drop, prism imbalance between the eyes and
/// aniseikonia, from the first lens of each side.
pub(super) fn compute_frame(
    case: &Case,
    f: &Frame,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    if let Some(t) = &f.pantoscopic_tilt {
        let drop = tilt::optical_centre_drop(t.value);
        out.push(
            "oc-drop",
            "optical-centre drop for the pantoscopic tilt",
            V::Length { metres: drop },
            t.span,
            "drop ≈ 0.5 mm per degree of pantoscopic tilt",
            format!("0.5 mm × {} = {} mm", n4(t.value), n4(drop * 1000.0)),
            src::OC_DROP,
        );
    }
    // Only the first frame carries the pair's values (lenses are fitted in it).
    if !first_frame(case).is_some_and(|ff| std::ptr::eq(ff, f)) {
        return;
    }
    let lens = |s: Side| case.spectacle_lenses.iter().find(|l| l.side == s);
    let (Some(r), Some(l)) = (lens(Side::Right), lens(Side::Left)) else {
        return;
    };
    let (pr, pl) = (prisms(case, r), prisms(case, l));
    if let (Some((a, _)), Some((b, _))) = (&pr.reading, &pl.reading) {
        let imb = prism::vertical_imbalance(a, b);
        let span = f.reading_drop.as_ref().map_or(f.span, |d| d.span);
        out.push(
            "reading-vertical-imbalance",
            "vertical prism imbalance at the reading point",
            V::Prism {
                dioptres: imb,
                base: String::new(),
            },
            span,
            "|P_v(right) − P_v(left)| with base up positive",
            format!(
                "right {:+.4}Δ, left {:+.4}Δ (base up +) → {}Δ",
                a.base_up,
                b.base_up,
                n4(imb)
            ),
            src::PRISM_TOLERANCE,
        );
        if imb > prism::VERTICAL_TOLERANCE + 1e-9 {
            let slab = if imb > prism::SLAB_OFF_CONSIDER {
                "; slab-off (bicentric grinding) on the more minus lens is worth considering"
            } else {
                ""
            };
            diags.push(
                Diagnostic::new(
                    codes::VERTICAL_IMBALANCE,
                    Severity::Warning,
                    span,
                    format!(
                        "vertical imbalance of {imb:.2}Δ at the reading point exceeds about {:.0}Δ{slab}",
                        prism::VERTICAL_TOLERANCE
                    ),
                )
                .hint("options: a higher reading position, separate reading glasses, contact lenses, slab-off [CP]")
                .caution(src::CAUTION_ORDER),
            );
        }
    }
    if let (Some((a, _)), Some((b, _))) = (&pr.distance, &pl.distance) {
        let net = prism::horizontal_net(a, b);
        let span = f.centre_distance.as_ref().map_or(f.span, |d| d.span);
        out.push(
            "distance-horizontal-prism",
            "net horizontal prism at the distance pupils",
            horizontal(net),
            span,
            "P_h(right) + P_h(left), base in positive",
            format!("{:+.4}Δ + {:+.4}Δ = {}Δ", a.base_in, b.base_in, n4(net)),
            src::PRISM_TOLERANCE,
        );
        if net.abs() > prism::HORIZONTAL_TOLERANCE + 1e-9 {
            diags.push(
                Diagnostic::new(
                    codes::HORIZONTAL_PRISM,
                    Severity::Warning,
                    span,
                    format!(
                        "net horizontal prism {:.2}Δ {} exceeds about {:.0}Δ",
                        net.abs(),
                        if net >= 0.0 { "base in" } else { "base out" },
                        prism::HORIZONTAL_TOLERANCE
                    ),
                )
                .hint("check the centre distance against the pupillary distances")
                .caution(src::CAUTION_ORDER),
            );
        }
    }
    if let (Some((a, wa)), Some((b, wb))) = (magnification(case, r), magnification(case, l)) {
        let pct = (a / b - 1.0) * 100.0;
        out.push(
            "aniseikonia",
            "aniseikonia estimate, % (right relative to left)",
            V::Number { value: pct },
            f.span,
            "(SM_right / SM_left − 1) × 100",
            format!(
                "right: {wa}; left: {wb}; ({} / {} − 1) × 100 = {}",
                n4(a),
                n4(b),
                n4(pct)
            ),
            src::ANISEIKONIA,
        );
    }
}
