//! Derived values of a `frame` block: the optical-centre drop and height, and for
//! the first frame the pair fitted in it: prism imbalance between the eyes at the
//! reading point, the mounted pair checked against ANSI Z80.1-2015 and aniseikonia.

use super::keys;
use crate::blocks::spectacle_lens::compute::{
    components, horizontal, magnification, nasal_offset, prisms, side_eye,
};
use crate::blocks::Context;
use crate::codes;
use crate::compute::{n4, sphcyl, Out};
use crate::derived::{DerivedValue as V, Method};
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::{Frame, Side, SpectacleLens};
use crate::sources as src;
use parax_optics::prism::{self, prentice, Prism};
use parax_optics::refraction::SphCyl;
use parax_optics::tilt;
use parax_optics::verify;

/// Recommended height of the optical centre above the lowest point of the rim:
/// the fitting height lowered by the optical-centre drop for the tilt. Metres,
/// with the drop used.
pub(crate) fn oc_height(f: &Frame) -> Option<(f64, f64)> {
    let h = f.fitting_height.as_ref()?.value;
    let drop = f
        .pantoscopic_tilt
        .as_ref()
        .map_or(0.0, |t| tilt::optical_centre_drop(t.value));
    Some((h - drop, drop))
}

/// Values of the frame: optical-centre drop, prism imbalance between the eyes and
/// aniseikonia, from the first lens of each side.
pub(crate) fn compute_frame(
    case: &Context<'_>,
    f: &Frame,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    if let Some(t) = &f.pantoscopic_tilt {
        let drop = tilt::optical_centre_drop(t.value);
        out.push(
            keys::OC_DROP,
            "optical-centre drop for the pantoscopic tilt",
            V::Length { metres: drop },
            t.span,
            &Method {
                formula: "drop ≈ 0.5 mm per degree of pantoscopic tilt",
                source: src::OC_DROP,
            },
            || format!("0.5 mm × {} = {} mm", n4(t.value), n4(drop * 1000.0)),
        );
    }
    if let Some((h, drop)) = oc_height(f) {
        out.push(
            keys::OC_HEIGHT,
            "recommended optical-centre height above the lowest point of the rim",
            V::Length { metres: h },
            f.fitting_height.as_ref().map_or(f.span, |h| h.span),
            &OC_HEIGHT,
            || {
                format!(
                    "{} mm − {} mm = {} mm",
                    n4((h + drop) * 1000.0),
                    n4(drop * 1000.0),
                    n4(h * 1000.0)
                )
            },
        );
    }
    // Only the first frame carries the pair's values (lenses are fitted in it).
    if !case.first_frame().is_some_and(|ff| std::ptr::eq(ff, f)) {
        return;
    }
    let lens = |s: Side| case.lens(s);
    let (Some(r), Some(l)) = (lens(Side::Right), lens(Side::Left)) else {
        return;
    };
    mounted_pair(case, f, r, l, out, diags);
    let (pr, pl) = (prisms(case, r), prisms(case, l));
    if let (Some((a, _)), Some((b, _))) = (&pr.reading, &pl.reading) {
        let imb = prism::vertical_imbalance(a, b);
        let span = f.reading_drop.as_ref().map_or(f.span, |d| d.span);
        out.push(
            keys::READING_VERTICAL_IMBALANCE,
            "vertical prism imbalance at the reading point",
            V::Prism {
                dioptres: imb,
                base: "",
            },
            span,
            &Method {
                formula: "|P_v(right) − P_v(left)| with base up positive",
                source: src::PRISM_TOLERANCE,
            },
            || {
                format!(
                    "right {:+.4}Δ, left {:+.4}Δ (base up +) → {}Δ",
                    a.base_up,
                    b.base_up,
                    n4(imb)
                )
            },
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
            keys::DISTANCE_HORIZONTAL_PRISM,
            "net horizontal prism at the distance pupils",
            horizontal(net),
            span,
            &Method {
                formula: "P_h(right) + P_h(left), base in positive",
                source: src::PRISM_TOLERANCE,
            },
            || format!("{:+.4}Δ + {:+.4}Δ = {}Δ", a.base_in, b.base_in, n4(net)),
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
            keys::ANISEIKONIA,
            "aniseikonia estimate, % (right relative to left)",
            V::Number { value: pct },
            f.span,
            &Method {
                formula: "(SM_right / SM_left − 1) × 100",
                source: src::ANISEIKONIA,
            },
            || {
                format!(
                    "right: {wa}; left: {wb}; ({} / {} − 1) × 100 = {}",
                    n4(a),
                    n4(b),
                    n4(pct)
                )
            },
        );
    }
}

/// Prism at a pupil that the received lens adds beyond the order: Prentice's rule
/// with the measured power at the decentration (centre distance / 2 − PD), plus
/// the measured prism at the reference point minus the prism ordered.
fn unwanted_prism(case: &Context<'_>, f: &Frame, l: &SpectacleLens) -> Option<(Prism, SphCyl)> {
    let m = l.measured.as_ref()?;
    let measured = SphCyl::new(m.value.sphere, m.value.cylinder, m.value.axis);
    let c = nasal_offset(case, f, l)?;
    let mut p = prentice(&measured, side_eye(l.side), c, 0.0);
    if let Some(mp) = &l.measured_prism {
        let (h, v) = components(&mp.value);
        p.base_in += h;
        p.base_up += v;
    }
    if let Some(op) = &l.prism {
        let (h, v) = components(&op.value);
        p.base_in -= h;
        p.base_up -= v;
    }
    Some((p, measured))
}

/// The received pair as mounted, against ANSI Z80.1-2015: vertical imbalance
/// (0.33Δ, up to 3.375 D in the vertical meridian) and horizontal imbalance
/// (0.67Δ, up to 2.75 D in the horizontal meridian; above it the centre distance
/// within ±2.5 mm of the PDs [S: quick reference guide]).
fn mounted_pair(
    case: &Context<'_>,
    f: &Frame,
    r: &SpectacleLens,
    l: &SpectacleLens,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    let (Some((pr, mr)), Some((pl, ml))) = (unwanted_prism(case, f, r), unwanted_prism(case, f, l))
    else {
        return;
    };
    let span = f.centre_distance.as_ref().map_or(f.span, |d| d.span);
    let vertical = prism::vertical_imbalance(&pr, &pl);
    let horizontal = prism::horizontal_net(&pr, &pl);
    let why = |what: &str, a: f64, b: f64, total: f64| {
        format!(
            "measured right {}, left {} at the pupils (centre distance / 2 − PD): {what} right {a:+.4}Δ, left {b:+.4}Δ → {}Δ",
            sphcyl(&mr).display(),
            sphcyl(&ml).display(),
            n4(total)
        )
    };
    out.push(
        keys::MOUNTED_VERTICAL_IMBALANCE,
        "vertical prism imbalance of the received pair at the pupils",
        V::Prism {
            dioptres: vertical,
            base: "",
        },
        span,
        &Method {
            formula: "|P_v(right) − P_v(left)|, P = −F_measured·c plus measured − ordered prism",
            source: src::MOUNTED_PAIR,
        },
        || why("base up +", pr.base_up, pl.base_up, vertical),
    );
    out.push(
        keys::MOUNTED_HORIZONTAL_IMBALANCE,
        "net horizontal prism of the received pair at the pupils",
        self::horizontal(horizontal),
        span,
        &MOUNTED_HORIZONTAL_IMBALANCE,
        || why("base in +", pr.base_in, pl.base_in, horizontal),
    );
    let checks = [
        (
            keys::CHECK_MOUNTED_VERTICAL,
            "vertical imbalance",
            true,
            vertical,
            [mr.meridian_power(90.0), ml.meridian_power(90.0)],
            verify::VERTICAL_IMBALANCE_UP_TO,
        ),
        (
            keys::CHECK_MOUNTED_HORIZONTAL,
            "horizontal imbalance",
            false,
            horizontal.abs(),
            [mr.meridian_power(180.0), ml.meridian_power(180.0)],
            verify::HORIZONTAL_IMBALANCE_UP_TO,
        ),
    ];
    for (name, what, is_vertical, got, powers, up_to) in checks {
        let strongest = powers[0].abs().max(powers[1].abs());
        let (pass, band, detail) = match verify::mounted_imbalance_tolerance(is_vertical, powers) {
            Some(tol) => (
                Some(got <= tol + 1e-9),
                format!("0 to {tol:.2}Δ"),
                format!(
                    "{what} {}Δ; strongest power in the meridian {} D ≤ {up_to} D, so the band is 0 to {tol:.2}Δ",
                    n4(got),
                    n4(strongest)
                ),
            ),
            None if !is_vertical => {
                // Above 2.75 D the standard checks the optical-centre positions
                // instead: centre distance within ±2.5 mm of the ordered PD [S: quick reference guide of the standard].
                let Some(cd) = f.centre_distance.as_ref().map(|c| c.value) else {
                    continue;
                };
                let pds = [r, l]
                    .iter()
                    .map(|x| case.current_eye(x.side).and_then(|e| e.pd.as_ref().map(|p| p.value)))
                    .sum::<Option<f64>>();
                let Some(pd) = pds else { continue };
                let tol = verify::CENTRE_DISTANCE_TOLERANCE;
                (
                    Some((cd - pd).abs() <= tol + 1e-9),
                    format!("{:.1} to {:.1} mm", (pd - tol) * 1000.0, (pd + tol) * 1000.0),
                    format!(
                        "strongest power in the horizontal meridian {} D > {up_to} D: centre distance {} mm against PD {} mm ± 2.5 mm",
                        n4(strongest),
                        n4(cd * 1000.0),
                        n4(pd * 1000.0)
                    ),
                )
            }
            None => (
                None,
                String::new(),
                format!(
                    "strongest power in the vertical meridian {} D > {up_to} D: the standard then limits the difference in optical-centre heights, which is not recorded here",
                    n4(strongest)
                ),
            ),
        };
        out.push(
            name,
            format!("mounted pair {what} within {}", verify::STANDARD),
            V::Text {
                text: match pass {
                    Some(true) => "pass",
                    Some(false) => "fail",
                    None => "not applicable",
                }
                .into(),
            },
            span,
            &MOUNTED_PAIR_TOLERANCE,
            || detail,
        );
        if pass == Some(false) {
            diags.push(
                Diagnostic::new(
                    codes::MOUNTED_IMBALANCE,
                    Severity::Warning,
                    span,
                    format!(
                        "the received pair's {what} is outside {band} ({})",
                        verify::STANDARD
                    ),
                )
                .hint("re-measure the optical centres and the PDs; return the pair to the laboratory if confirmed")
                .caution(src::CAUTION_ORDER),
            );
        }
    }
}

/// Optical-centre height: the fitting height less the drop for pantoscopic tilt.
const OC_HEIGHT: Method = Method {
    formula:
        "OC height = fitting height − optical-centre drop (0.5 mm per degree of pantoscopic tilt)",
    source: src::OC_HEIGHT,
};

/// Horizontal prism imbalance of a mounted pair.
const MOUNTED_HORIZONTAL_IMBALANCE: Method = Method {
    formula: "P_h(right) + P_h(left), base in +, P = −F_measured·c plus measured − ordered prism",
    source: src::MOUNTED_PAIR,
};

/// The tolerance a mounted pair is checked against.
const MOUNTED_PAIR_TOLERANCE: Method = Method {
    formula:
        "ANSI Z80.1-2015 mounted pair: vertical ≤ 0.33Δ (≤ 3.375 D), horizontal ≤ 0.67Δ (≤ 2.75 D)",
    source: src::MOUNTED_PAIR,
};
