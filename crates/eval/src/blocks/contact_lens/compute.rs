//! Derived values of a `contact-lens` block: the eye's refraction at the corneal
//! plane, a soft-lens suggestion (spherical equivalent or toric), and for a rigid
//! lens the tear lens, the lens power and the residual astigmatism.

use super::keys;
use crate::blocks::Context;
use crate::codes;
use crate::compute::{n4, sphcyl, Out};
use crate::derived::{DerivedValue as V, Method};
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::ContactLens;
use crate::sources as src;
use parax_optics::contact;
use parax_optics::keratometry::{keratometric_power, KERATOMETRIC_INDEX};
use parax_optics::refraction::SphCyl;
use parax_optics::vertex::{round_order, round_to_step};

/// `contact-lens.right` or `contact-lens.left`.
pub fn block_id(c: &ContactLens) -> String {
    format!("contact-lens.{}", c.side.name())
}

fn incomplete(c: &ContactLens, what: &str, diags: &mut Vec<Diagnostic>) {
    diags.push(
        Diagnostic::new(
            codes::INPUTS_INCOMPLETE,
            Severity::Warning,
            c.span,
            format!("this contact lens needs {what}"),
        )
        .hint(format!("record it in the `eye {}` block", c.side.name())),
    );
}

/// The total diameter against the usual range for the lens type: a plausibility
/// check only (scleral and special designs are not judged).
fn diameter(c: &ContactLens, rigid: bool, diags: &mut Vec<Diagnostic>) {
    let Some(d) = &c.diameter else { return };
    let (kind, (lo, hi)) = if rigid {
        ("rigid corneal", contact::RIGID_DIAMETER)
    } else {
        ("soft", contact::SOFT_DIAMETER)
    };
    if d.value < lo - 1e-9 || d.value > hi + 1e-9 {
        diags.push(
            Diagnostic::new(
                codes::CONTACT_DIAMETER,
                Severity::Info,
                d.span,
                format!(
                    "{:.1} mm is outside the usual {:.1} to {:.1} mm of a {kind} lens",
                    d.value * 1000.0,
                    lo * 1000.0,
                    hi * 1000.0
                ),
            )
            .hint("a plausibility check only; check the lens type and the figure [CP]")
            .caution(src::CAUTION_CONTACT),
        );
    }
}

/// The ordered `power` against the power computed: the largest difference in
/// any meridian, flagged from 0.25 D.
fn ordered_power(
    c: &ContactLens,
    computed: &SphCyl,
    what: &str,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    let Some(p) = &c.power else { return };
    let ordered = SphCyl::new(p.value.sphere, p.value.cylinder, p.value.axis);
    let diff = contact::largest_meridian_difference(&ordered, computed);
    out.push(
        keys::POWER_DIFFERENCE,
        "largest difference in any meridian between the power ordered and the power computed",
        V::Power { dioptres: diff },
        p.span,
        &Method {
            formula: "largest |eigenvalue| of F_ordered − F_computed (power matrices)",
            source: src::CONTACT_ORDER,
        },
        || {
            format!(
                "ordered {}, {what} {} → {}",
                sphcyl(&ordered).display(),
                sphcyl(computed).display(),
                n4(diff)
            )
        },
    )
    .caution = Some(src::CAUTION_CONTACT);
    if diff >= contact::ORDER_DIFFERS_FROM - 1e-9 {
        diags.push(
            Diagnostic::new(
                codes::CONTACT_POWER_DIFFERS,
                Severity::Warning,
                p.span,
                format!(
                    "the power ordered differs from {what} {} by up to {diff:.2} D",
                    sphcyl(computed).display()
                ),
            )
            .hint("check the refraction, its vertex distance and the base curve against the order")
            .caution(src::CAUTION_CONTACT),
        );
    }
}

pub(crate) fn compute(
    case: &Context<'_>,
    c: &ContactLens,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    let rigid = match &c.kind {
        Some(k) => k.value == "rigid",
        None => c.base_curve.is_some(),
    };
    diameter(c, rigid, diags);
    let Some(eye) = case.current_eye(c.side) else {
        return incomplete(
            c,
            "an `eye` block of the same side with a refraction",
            diags,
        );
    };
    let Some(r) = &eye.refraction else {
        return incomplete(c, "the eye's `refraction`", diags);
    };
    let Some(vertex) = r.value.vertex else {
        return incomplete(
            c,
            "the vertex distance of the refraction (`@ VERTEX mm`)",
            diags,
        );
    };
    let rx = SphCyl::new(r.value.rx.sphere, r.value.rx.cylinder, r.value.rx.axis);
    let corneal = contact::corneal_plane(&rx, vertex).minus_cyl();
    out.push(
        keys::CORNEAL_PLANE,
        "refraction at the corneal plane",
        sphcyl(&corneal),
        c.span,
        &Method {
            formula: "F_c = F / (1 − d·F) per principal meridian",
            source: src::VERGENCE,
        },
        || {
            format!(
                "{} @ {} mm → {}",
                sphcyl(&rx).display(),
                n4(vertex * 1000.0),
                sphcyl(&corneal).display()
            )
        },
    )
    .caution = Some(src::CAUTION_CONTACT);
    if !rigid {
        let toric = contact::soft_is_toric(&corneal);
        out.push(
            keys::SOFT_DESIGN,
            "soft lens design suggested",
            V::Text {
                text: if toric { "toric" } else { "spherical" }.into(),
            },
            c.span,
            &Method {
                formula: "toric when |cylinder at the cornea| ≥ 0.75 D",
                source: src::CONTACT_RULES,
            },
            || {
                format!(
                    "|{}| {} 0.75",
                    n4(corneal.cylinder),
                    if toric { "≥" } else { "<" }
                )
            },
        )
        .caution = Some(src::CAUTION_CONTACT);
        let lens = if toric {
            round_order(&corneal, 0.25)
        } else {
            SphCyl::new(
                round_to_step(corneal.spherical_equivalent(), 0.25),
                0.0,
                180.0,
            )
        };
        out.push(
            keys::SOFT_POWER,
            "soft lens power suggested, to 0.25 D",
            sphcyl(&lens),
            c.span,
            if toric {
                &TORIC_ORDER_ROUNDED
            } else {
                &SPHERICAL_ORDER_ROUNDED
            },
            || {
                format!(
                    "{} → {}",
                    sphcyl(&corneal).display(),
                    sphcyl(&lens).display()
                )
            },
        )
        .caution = Some(src::CAUTION_CONTACT);
        let computed = if toric {
            corneal
        } else {
            SphCyl::new(corneal.spherical_equivalent(), 0.0, 180.0)
        };
        ordered_power(
            c,
            &computed,
            "the soft lens suggested (unrounded)",
            out,
            diags,
        );
        return;
    }
    let Some(k) = &eye.keratometry else {
        return incomplete(c, "the eye's `keratometry` (for the tear lens)", diags);
    };
    let Some(bc) = &c.base_curve else {
        return incomplete(c, "a `base-curve` (back optic zone radius)", diags);
    };
    let index = eye
        .keratometric_index
        .as_ref()
        .map_or(KERATOMETRIC_INDEX, |i| i.value);
    let ks = k
        .value
        .map(|m| (keratometric_power(m.radius, index), m.meridian));
    let (flat, steep) = if ks[0].0 <= ks[1].0 {
        (ks[0], ks[1])
    } else {
        (ks[1], ks[0])
    };
    let tear = contact::tear_lens(bc.value, flat.0);
    out.push(
        keys::TEAR_LENS,
        "tear lens power",
        V::Power { dioptres: tear },
        bc.span,
        &Method {
            formula: "K(base curve) − flat K, K = 337.5 / r(mm)",
            source: src::CONTACT_RULES,
        },
        || {
            format!(
                "337.5 / {} − {} = {}",
                n4(bc.value * 1000.0),
                n4(flat.0),
                n4(tear)
            )
        },
    )
    .caution = Some(src::CAUTION_CONTACT);
    let p = contact::rigid_power(&corneal, flat.1, tear);
    out.push(
        keys::RIGID_POWER,
        "rigid lens power",
        V::Power { dioptres: p },
        bc.span,
        &Method {
            formula: "corneal-plane power in the flat meridian − tear lens",
            source: src::CONTACT_RULES,
        },
        || {
            format!(
                "{} (meridian {}) − {} = {}",
                n4(corneal.meridian_power(flat.1)),
                n4(flat.1),
                n4(tear),
                n4(p)
            )
        },
    )
    .caution = Some(src::CAUTION_CONTACT);
    ordered_power(
        c,
        &SphCyl::new(p, 0.0, 180.0),
        "the rigid lens power (unrounded)",
        out,
        diags,
    );
    let pr = round_to_step(p, 0.25);
    out.push(
        keys::RIGID_POWER_ROUNDED,
        "rigid lens power, to 0.25 D",
        V::Power { dioptres: pr },
        bc.span,
        &Method {
            formula: "to the nearest 0.25 D",
            source: src::ROUNDING,
        },
        || format!("{} → {}", n4(p), n4(pr)),
    )
    .caution = Some(src::CAUTION_CONTACT);
    let cc = contact::corneal_cylinder(flat.0, flat.1, steep.0);
    let (rc, ra) = contact::residual_astigmatism(&corneal, &cc);
    out.push(
        keys::RESIDUAL_ASTIGMATISM,
        "residual astigmatism under a spherical rigid lens",
        V::Cylinder {
            dioptres: rc,
            axis: ra,
        },
        k.span,
        &Method {
            formula: "refractive cylinder − corneal cylinder, as power vectors (J0, J45)",
            source: src::THIBOS_1997,
        },
        || {
            format!(
                "({} x {}) − ({} x {}) = {} x {}",
                n4(corneal.cylinder),
                n4(corneal.axis),
                n4(cc.cylinder),
                n4(cc.axis),
                n4(rc),
                n4(ra)
            )
        },
    )
    .caution = Some(src::CAUTION_CONTACT);
    if rc.abs() >= contact::SPHERICAL_RIGID_BELOW - 1e-9 {
        diags.push(
            Diagnostic::new(
                codes::RESIDUAL_ASTIGMATISM,
                Severity::Info,
                c.span,
                format!(
                    "residual astigmatism {:.2} x {:.0} under a spherical rigid lens",
                    rc, ra
                ),
            )
            .hint("a front-toric or bitoric rigid design may be needed [CP]")
            .caution(src::CAUTION_CONTACT),
        );
    }
}

/// How a toric contact lens order is rounded.
const TORIC_ORDER_ROUNDED: Method = Method {
    formula: "corneal-plane sphere and cylinder, each to 0.25 D, the axis to the nearest degree",
    source: src::CONTACT_RULES,
};

/// How a spherical contact lens order is rounded.
const SPHERICAL_ORDER_ROUNDED: Method = Method {
    formula: "spherical equivalent at the corneal plane, to 0.25 D",
    source: src::CONTACT_RULES,
};
