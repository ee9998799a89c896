//! Derived values of an `eye` block: both cylinder forms, spherical equivalent,
//! power vectors, principal meridians, far points, vertex transfer, near
//! refraction, keratometry and total corneal power.

use super::keys;
use crate::blocks::Context;
use crate::codes;
use crate::compute::{n4, Out};
use crate::derived::{fmt_power, DerivedValue as V, Method};
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::Eye;
use crate::sources as src;
use parax_optics::keratometry::{
    corneal_astigmatism, keratometric_power, total_corneal_power, AstigmatismKind, CornealIndices,
    KReading, KERATOMETRIC_INDEX,
};
use parax_optics::refraction::{FarPoint, SphCyl};
use parax_optics::vertex::{round_order, transfer_sphcyl, MEANINGFUL_CHANGE_THRESHOLD_D};

fn sphcyl(rx: &SphCyl) -> V {
    V::SphCyl {
        sphere: rx.sphere,
        cylinder: rx.cylinder,
        axis: rx.axis,
    }
}

fn show(rx: &SphCyl) -> String {
    sphcyl(rx).display()
}

pub(crate) fn compute(case: &Context<'_>, e: &Eye, out: &mut Out<'_>, diags: &mut Vec<Diagnostic>) {
    if let Some(r) = &e.refraction {
        refraction(case, e, r, out, diags);
    }
    if let Some(k) = &e.keratometry {
        keratometry(e, k, out, diags);
    }
}

fn refraction(
    case: &Context<'_>,
    e: &Eye,
    r: &crate::model::At<crate::model::Refraction>,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    let span = r.span;
    let rx = SphCyl::new(r.value.rx.sphere, r.value.rx.cylinder, r.value.rx.axis);
    let (s, c, a) = (rx.sphere, rx.cylinder, rx.axis);
    let has_cyl = c.abs() > 1e-9;
    if has_cyl {
        let minus = rx.minus_cyl();
        let plus = rx.plus_cyl();
        for (name, label, form) in [
            (keys::MINUS_CYL, "minus-cylinder form", minus),
            (keys::PLUS_CYL, "plus-cylinder form", plus),
        ] {
            out.push(
                name,
                label,
                sphcyl(&form),
                span,
                &Method {
                    formula: "(S, C, θ) → (S + C, −C, θ ± 90)",
                    source: src::THIBOS_1997,
                },
                || format!("{} → {}", show(&rx), show(&form)),
            );
        }
    }
    let m = rx.spherical_equivalent();
    out.push(
        keys::SPHERICAL_EQUIVALENT,
        "spherical equivalent",
        V::Power { dioptres: m },
        span,
        &Method {
            formula: "M = S + C/2",
            source: src::THIBOS_1997,
        },
        || format!("M = {} + ({})/2 = {}", n4(s), n4(c), n4(m)),
    );
    let pv = rx.power_vector();
    let t2 = || format!("2θ = {}°", n4(2.0 * a));
    out.push(
        keys::VECTOR_J0,
        "power vector J0",
        V::Power { dioptres: pv.j0 },
        span,
        &Method {
            formula: "J0 = −(C/2)·cos 2θ",
            source: src::THIBOS_1997,
        },
        || format!("J0 = −({}/2)·cos({}) = {}", n4(c), t2(), n4(pv.j0)),
    );
    out.push(
        keys::VECTOR_J45,
        "power vector J45",
        V::Power { dioptres: pv.j45 },
        span,
        &Method {
            formula: "J45 = −(C/2)·sin 2θ",
            source: src::THIBOS_1997,
        },
        || format!("J45 = −({}/2)·sin({}) = {}", n4(c), t2(), n4(pv.j45)),
    );
    let b = pv.blur_strength();
    out.push(
        keys::BLUR_STRENGTH,
        "blur strength",
        V::Power { dioptres: b },
        span,
        &Method {
            formula: "B = √(M² + J0² + J45²)",
            source: src::THIBOS_1997,
        },
        || {
            format!(
                "B = √({}² + {}² + {}²) = {}",
                n4(m),
                n4(pv.j0),
                n4(pv.j45),
                n4(b)
            )
        },
    );
    let meridians = rx.principal_meridians();
    for (i, mer) in meridians.iter().enumerate() {
        out.push(
            [keys::MERIDIAN_1, keys::MERIDIAN_2][i],
            ["principal meridian 1", "principal meridian 2"][i],
            V::Meridian {
                dioptres: mer.power,
                meridian: mer.meridian,
            },
            span,
            &Method {
                formula: "F(φ) = S + C·sin²(φ − θ)",
                source: src::POWER_MATRIX,
            },
            || {
                format!(
                    "F({}) = {} + {}·sin²({} − {}) = {}",
                    n4(mer.meridian),
                    n4(s),
                    n4(c),
                    n4(mer.meridian),
                    n4(a),
                    n4(mer.power)
                )
            },
        );
    }
    let vertex = r.value.vertex;
    // Far points from the cornea when the vertex is known (1/Fc), else from the
    // correcting plane (1/F).
    let (far_rx, from) = match vertex {
        Some(d) if d > 0.0 => (transfer_sphcyl(&rx, d), "the cornea"),
        _ => (rx, "the correcting plane"),
    };
    for (i, (fp, mer)) in far_rx
        .far_points()
        .iter()
        .zip(far_rx.principal_meridians())
        .enumerate()
    {
        let value = match fp {
            FarPoint::Infinity => V::Infinity,
            FarPoint::At { distance_m } => V::Distance {
                metres: *distance_m,
                from: crate::derived::shared_place(from),
            },
        };
        out.push(
            [keys::FAR_POINT_1, keys::FAR_POINT_2][i],
            ["far point, meridian 1", "far point, meridian 2"][i],
            value,
            span,
            &Method {
                formula: "far point at 1/F from the correcting plane",
                source: src::VERGENCE,
            },
            || {
                format!(
                    "1 / {} D = {} m (meridian {})",
                    n4(mer.power),
                    n4(1.0 / mer.power),
                    n4(mer.meridian)
                )
            },
        );
    }
    let strongest = meridians.iter().map(|m| m.power.abs()).fold(0.0, f64::max);
    match vertex {
        Some(d) if d > 0.0 => {
            vertex_transfer(
                &rx,
                d,
                0.0,
                [keys::CORNEAL_PLANE, keys::CORNEAL_PLANE_ROUNDED],
                ["at the corneal plane", "at the corneal plane, to 0.25 D"],
                span,
                out,
                diags,
                strongest,
            );
        }
        Some(_) => {}
        None if strongest > MEANINGFUL_CHANGE_THRESHOLD_D && !r.value.vertex_unreadable => diags
            .push(
            Diagnostic::new(
                codes::VERTEX_UNKNOWN,
                Severity::Warning,
                span,
                format!(
                    "a meridian of {} D: the vertex distance matters, but it is not recorded",
                    fmt_power(meridians.iter().map(|m| m.power).fold(0.0, |a: f64, b| {
                        if b.abs() > a.abs() {
                            b
                        } else {
                            a
                        }
                    }))
                ),
            )
            .hint("add `@ VERTEX mm` with the vertex distance at which the refraction was measured")
            .caution(src::CAUTION_VERTEX),
        ),
        None => {}
    }
    if let (Some(d), Some(fv)) = (vertex, case.frame_vertex()) {
        if (fv - d).abs() > 1e-9 {
            vertex_transfer(
                &rx,
                d,
                fv,
                [keys::AT_FRAME_VERTEX, keys::AT_FRAME_VERTEX_ROUNDED],
                [
                    "at the frame's vertex distance",
                    "at the frame's vertex distance, to 0.25 D",
                ],
                span,
                out,
                diags,
                strongest,
            );
        }
    }
    if let Some(add) = &e.add {
        let near = SphCyl::new(s + add.value, c, a);
        out.push(
            keys::NEAR_REFRACTION,
            "near refraction",
            sphcyl(&near),
            add.span,
            &Method {
                formula: "near = distance sphere + add",
                source: src::VERGENCE,
            },
            || format!("{} + {} = {}", n4(s), n4(add.value), show(&near)),
        );
    }
}

/// Power moved from vertex `from` to vertex `to` (metres from the cornea), exact and
/// rounded, with a note when the change is clinically meaningful.
#[allow(clippy::too_many_arguments)]
fn vertex_transfer(
    rx: &SphCyl,
    from: f64,
    to: f64,
    [name, name_rounded]: [&'static str; 2],
    [label, label_rounded]: [&'static str; 2],
    span: parax_syntax::Span,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
    strongest: f64,
) {
    let shift = from - to;
    let moved = transfer_sphcyl(rx, shift);
    let m = rx.principal_meridians();
    let mm = moved.principal_meridians();
    let substituted = || {
        m.iter()
            .zip(mm.iter())
            .map(|(a, b)| {
                format!(
                    "{} / (1 − {}·{}) = {} @ {}",
                    n4(a.power),
                    n4(shift),
                    n4(a.power),
                    n4(b.power),
                    n4(a.meridian)
                )
            })
            .collect::<Vec<_>>()
            .join("; ")
    };
    out.push(
        name,
        label,
        sphcyl(&moved),
        span,
        &Method {
            formula: "F' = F / (1 − d·F) per principal meridian, d = distance moved toward the eye",
            source: src::VERGENCE,
        },
        substituted,
    )
    .caution = Some(src::CAUTION_VERTEX);
    let rounded = round_order(&moved, 0.25);
    out.push(
        name_rounded,
        label_rounded,
        sphcyl(&rounded),
        span,
        &ROUNDED_TO_QUARTERS,
        || format!("{} → {}", show(&moved), show(&rounded)),
    )
    .caution = Some(src::CAUTION_VERTEX);
    let change = m
        .iter()
        .zip(mm.iter())
        .map(|(a, b)| (b.power - a.power).abs())
        .fold(0.0, f64::max);
    if strongest > MEANINGFUL_CHANGE_THRESHOLD_D && change >= 0.125 {
        diags.push(
            Diagnostic::new(
                codes::VERTEX_MATTERS,
                Severity::Info,
                span,
                format!(
                    "{label}: {} (a change of up to {:.2} D)",
                    show(&rounded),
                    change
                ),
            )
            .hint("above about 4 D the vertex distance changes the effective power [CP]")
            .caution(src::CAUTION_VERTEX),
        );
    }
}

fn keratometry(
    e: &Eye,
    k: &crate::model::At<[crate::model::KMeridian; 2]>,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    let span = k.span;
    let index = e
        .keratometric_index
        .as_ref()
        .map_or(KERATOMETRIC_INDEX, |i| i.value);
    let caution = e
        .refractive_surgery
        .as_ref()
        .map(|_| src::CAUTION_REFRACTIVE_SURGERY);
    if let Some(rs) = &e.refractive_surgery {
        diags.push(
            Diagnostic::new(
                codes::REFRACTIVE_SURGERY,
                Severity::Warning,
                span,
                "keratometric power is not valid after corneal refractive surgery",
            )
            .hint(format!(
                "history recorded: {}; use a method validated after surgery",
                if rs.value.is_empty() {
                    "refractive surgery"
                } else {
                    &rs.value
                }
            ))
            .caution(src::CAUTION_REFRACTIVE_SURGERY),
        );
    }
    let readings = k.value.map(|m| KReading {
        power: keratometric_power(m.radius, index),
        meridian: m.meridian,
    });
    let ast = corneal_astigmatism(readings[0], readings[1]);
    for (name, label, r) in [
        (keys::K_FLAT, "flat K", ast.flat),
        (keys::K_STEEP, "steep K", ast.steep),
    ] {
        let radius = k
            .value
            .iter()
            .find(|m| m.meridian == r.meridian)
            .map_or(f64::NAN, |m| m.radius);
        out.push(
            name,
            label,
            V::Meridian {
                dioptres: r.power,
                meridian: r.meridian,
            },
            span,
            &Method {
                formula: "K = (n_k − 1) / r",
                source: src::KERATOMETRIC,
            },
            || format!("K = ({} − 1) / {} m = {} D", index, n4(radius), n4(r.power)),
        )
        .caution = caution;
    }
    out.push(
        keys::MEAN_K,
        "mean K",
        V::Power {
            dioptres: ast.mean_k,
        },
        span,
        &Method {
            formula: "mean K = (K1 + K2) / 2",
            source: src::KERATOMETRIC,
        },
        || {
            format!(
                "({} + {}) / 2 = {}",
                n4(ast.flat.power),
                n4(ast.steep.power),
                n4(ast.mean_k)
            )
        },
    )
    .caution = caution;
    out.push(
        keys::CORNEAL_CYLINDER,
        "corneal astigmatism",
        V::Cylinder {
            dioptres: ast.cylinder,
            axis: ast.axis,
        },
        span,
        &Method {
            formula: "C = K_flat − K_steep, axis along the flat meridian (minus-cylinder form)",
            source: src::KERATOMETRIC,
        },
        || {
            format!(
                "{} − {} = {} x {}",
                n4(ast.flat.power),
                n4(ast.steep.power),
                n4(ast.cylinder),
                n4(ast.axis)
            )
        },
    )
    .caution = caution;
    let kind = match ast.kind {
        AstigmatismKind::None => "none",
        AstigmatismKind::WithTheRule => "with-the-rule",
        AstigmatismKind::AgainstTheRule => "against-the-rule",
        AstigmatismKind::Oblique => "oblique",
    };
    out.push(
        keys::CORNEAL_ASTIGMATISM,
        "type of corneal astigmatism",
        V::Text { text: kind.into() },
        span,
        &Method {
            formula: "by the minus-cylinder axis: 180 ± 30 with-the-rule, 90 ± 30 against-the-rule",
            source: src::ASTIGMATISM_BANDS,
        },
        || format!("axis {} → {kind}", n4(ast.axis)),
    );
    if let (Some(back), Some(t)) = (&e.posterior_radius, &e.corneal_thickness) {
        let front_r = (k.value[0].radius + k.value[1].radius) / 2.0;
        let idx = CornealIndices::GULLSTRAND;
        let tp = total_corneal_power(front_r, back.value, t.value, idx);
        let subst = || {
            format!(
                "F1 = ({} − 1)/{} = {}; F2 = ({} − {})/{} = {}; F = F1 + F2 − ({}/{})·F1·F2 = {}",
                idx.cornea,
                n4(front_r),
                n4(tp.front),
                idx.aqueous,
                idx.cornea,
                n4(back.value),
                n4(tp.back),
                t.value,
                idx.cornea,
                n4(tp.total)
            )
        };
        out.push(
            keys::TOTAL_CORNEAL_POWER,
            "total corneal power (thick cornea)",
            V::Power { dioptres: tp.total },
            back.span,
            &Method {
                formula: "F = F1 + F2 − (t/n)·F1·F2",
                source: src::GULLSTRAND_THICK,
            },
            subst,
        )
        .caution = caution;
        let over = ast.mean_k - tp.total;
        out.push(
            keys::KERATOMETRIC_EXCESS,
            "mean K minus total corneal power",
            V::Power { dioptres: over },
            back.span,
            &Method {
                formula: "mean K − F_total",
                source: src::TANG_2006,
            },
            || format!("{} − {} = {}", n4(ast.mean_k), n4(tp.total), n4(over)),
        );
    }
}

/// How a vertex-transferred refraction is rounded for ordering.
const ROUNDED_TO_QUARTERS: Method = Method {
    formula:
        "sphere and cylinder each rounded to the nearest 0.25 D, the axis to the nearest degree",
    source: src::ROUNDING_ORDER,
};
