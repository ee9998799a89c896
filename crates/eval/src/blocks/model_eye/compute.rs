//! Derived values of a `model-eye` block: a published schematic eye with the
//! case's overrides, by ray-transfer matrices: powers, cardinal points, the
//! second focal point, the entrance pupil, the refraction its axial length
//! implies at the cornea and at a spectacle vertex distance, and the relative
//! spectacle magnification of that correction.

use super::keys;
use crate::blocks::Context;
use crate::codes;
use crate::compute::{n4, slug, Out};
use crate::derived::{DerivedValue as V, Method};
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::ModelEye;
use crate::sources as src;
use parax_optics::lens_form::relative_spectacle_magnification_axial;
use parax_optics::model_eye::{self, EyeSurface, Schematic};
use parax_optics::system::{system_matrix_in, system_powers};

/// `model-eye.<slug of the name>`.
pub fn block_id(m: &ModelEye) -> String {
    format!("model-eye.{}", slug(&m.name))
}

/// Vertex distance for the spectacle refraction when no frame records one, metres
/// (a common default, no source).
const DEFAULT_VERTEX: f64 = 0.012;

fn power_of(surfaces: &[EyeSurface], n_before: f64) -> f64 {
    let els = model_eye::elements(surfaces);
    system_powers(&system_matrix_in(&els, n_before)).equivalent
}

pub(crate) fn compute(
    case: &Context<'_>,
    m: &ModelEye,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    let Some(from) = &m.from else {
        diags.push(
            Diagnostic::new(
                codes::INPUTS_INCOMPLETE,
                Severity::Warning,
                m.span,
                "this model eye names no schematic eye to start from",
            )
            .hint("add `from gullstrand`, `from le-grand` or `from emsley`"),
        );
        return;
    };
    let model = match from.value.as_str() {
        "gullstrand" => Schematic::GullstrandExact,
        "le-grand" => Schematic::LeGrandFull,
        _ => Schematic::EmsleyReduced,
    };
    let mut s = model.surfaces();
    let mut changes = Vec::new();
    for o in &m.surfaces {
        let Some(surf) = s.get_mut(o.value.number.wrapping_sub(1)) else {
            diags.push(Diagnostic::new(
                codes::INPUTS_INCOMPLETE,
                Severity::Error,
                o.span,
                format!(
                    "the {} has {} surface(s); there is no surface {}",
                    model.name(),
                    s.len(),
                    o.value.number
                ),
            ));
            continue;
        };
        surf.radius_m = o.value.radius;
        if let Some(n) = o.value.index {
            surf.index_after = n;
        }
        if let Some(d) = o.value.distance {
            surf.distance_m = d;
        }
        changes.push(format!("surface {} overridden", o.value.number));
    }
    if let Some(al) = &m.axial_length {
        model_eye::with_axial_length(&mut s, al.value);
        changes.push(format!("axial length {} mm", n4(al.value * 1000.0)));
    }
    let base = if changes.is_empty() {
        model.name().to_owned()
    } else {
        format!("{} ({})", model.name(), changes.join(", "))
    };
    let r = model_eye::evaluate(&s);
    let span = m.span;
    out.push(
        keys::POWER,
        "equivalent power of the eye",
        V::Power { dioptres: r.power },
        span,
        &Method {
            formula:
                "F = −C of the system matrix (refraction [[1,0],[−F,1]], transfer [[1,d/n],[0,1]])",
            source: src::SCHEMATIC_EYES,
        },
        || format!("{base}: F = {}", n4(r.power)),
    );
    if s.len() >= 4 {
        let cornea = power_of(&s[..2], 1.0);
        let lens = power_of(&s[2..], s[1].index_after);
        out.push(
            keys::CORNEA_POWER,
            "power of the cornea (surfaces 1-2)",
            V::Power { dioptres: cornea },
            span,
            &Method {
                formula: "equivalent power of surfaces 1 and 2 and the gap between them",
                source: src::SCHEMATIC_EYES,
            },
            || format!("{base}: {}", n4(cornea)),
        );
        out.push(
            keys::LENS_POWER,
            "power of the crystalline lens (surfaces 3 on, in aqueous)",
            V::Power { dioptres: lens },
            span,
            &Method {
                formula: "equivalent power of surfaces 3 onward, object space index of the aqueous",
                source: src::SCHEMATIC_EYES,
            },
            || format!("{base}: {}", n4(lens)),
        );
    }
    let inner: f64 = s[..s.len() - 1].iter().map(|x| x.distance_m).sum();
    if let Some(c) = r.cardinal {
        for (name, label, v) in [
            (keys::FRONT_FOCAL, "first focal point", c.front_focal),
            (
                keys::FRONT_PRINCIPAL,
                "first principal point",
                c.front_principal,
            ),
            (
                keys::BACK_PRINCIPAL,
                "second principal point",
                inner + c.back_principal,
            ),
            (keys::FRONT_NODAL, "first nodal point", c.front_nodal),
            (keys::BACK_NODAL, "second nodal point", inner + c.back_nodal),
            (keys::BACK_FOCAL, "second focal point", inner + c.back_focal),
        ] {
            out.push(
                name,
                label,
                V::Distance {
                    metres: v,
                    from: crate::derived::shared_place("the cornea"),
                },
                span,
                &CARDINAL_POINTS,
                || format!("{base}: {} mm from the cornea", n4(v * 1000.0)),
            );
        }
    }
    // The iris lies at the front of the crystalline lens in the two full eyes;
    // the reduced eye has none.
    if model != Schematic::EmsleyReduced {
        let stop = model_eye::IRIS_AT_LENS_FRONT;
        if let Some((at, mag)) = model_eye::entrance_pupil(&s, stop) {
            out.push(
                keys::ENTRANCE_PUPIL,
                "entrance pupil (image of the iris by the cornea)",
                V::Distance {
                    metres: at,
                    from: crate::derived::shared_place("the cornea"),
                },
                span,
                &ENTRANCE_PUPIL_TRACE,
                || format!("{base}: {} mm behind the cornea", n4(at * 1000.0)),
            );
            out.push(
                keys::ENTRANCE_PUPIL_MAGNIFICATION,
                "entrance pupil magnification (pupil seen / iris aperture)",
                V::Number { value: mag },
                span,
                &Method {
                    formula: "product of L/L' over the surfaces in front of the iris",
                    source: src::ENTRANCE_PUPIL,
                },
                || format!("{base}: {}", n4(mag)),
            );
        }
    }
    let al = model_eye::axial_length(&s);
    out.push(
        keys::AXIAL_LENGTH,
        "axial length (cornea to retina)",
        V::Length { metres: al },
        m.axial_length.as_ref().map_or(span, |a| a.span),
        &Method {
            formula: "sum of the surface distances",
            source: src::SCHEMATIC_EYES,
        },
        || format!("{} mm", n4(al * 1000.0)),
    );
    out.push(
        keys::OCULAR_REFRACTION,
        "refraction at the cornea implied by the axial length",
        V::Power {
            dioptres: r.ocular_refraction,
        },
        span,
        &Method {
            formula: "K = A/B of the matrix from the cornea to the retina (far-point vergence)",
            source: src::MATRICES,
        },
        || format!("{base}: K = {}", n4(r.ocular_refraction)),
    )
    .caution = Some(src::CAUTION_MODEL);
    let (vertex, whence) = match case.first_frame().and_then(|f| f.vertex.as_ref()) {
        Some(v) => (v.value, "the frame's vertex distance"),
        None => (DEFAULT_VERTEX, "12 mm (no frame vertex recorded)"),
    };
    let fs = model_eye::spectacle_refraction(r.ocular_refraction, vertex);
    out.push(
        keys::SPECTACLE_REFRACTION,
        "spectacle refraction implied by the axial length",
        V::Power { dioptres: fs },
        span,
        &Method {
            formula: "F_s = K / (1 + d·K)",
            source: src::VERGENCE,
        },
        || {
            format!(
                "{} / (1 + {}·{}) = {} at {whence}",
                n4(r.ocular_refraction),
                n4(vertex),
                n4(r.ocular_refraction),
                n4(fs)
            )
        },
    )
    .caution = Some(src::CAUTION_MODEL);
    if let Some(c) = r.cardinal {
        // The correcting lens sits `vertex` before the cornea, the eye's first
        // principal point `front_principal` behind it.
        let d = vertex + c.front_principal;
        let rsm = relative_spectacle_magnification_axial(r.power, fs, d);
        out.push(
            keys::RELATIVE_SPECTACLE_MAGNIFICATION,
            "relative spectacle magnification of the spectacle correction (axial ametropia)",
            V::Number { value: rsm },
            span,
            &RSM_MODEL_EYE,
            || {
                format!(
                    "d = {} + {} = {} mm; {fe} / ({fe} + ({f}) − {d:.6}·({f})·{fe}) = {}",
                    n4(vertex * 1000.0),
                    n4(c.front_principal * 1000.0),
                    n4(d * 1000.0),
                    n4(rsm),
                    fe = n4(r.power),
                    f = n4(fs),
                )
            },
        )
        .caution = Some(src::CAUTION_MODEL);
    }
}

/// A schematic eye's cardinal points from its system matrix.
const CARDINAL_POINTS: Method = Method {
    formula: "cardinal points from the system matrix (n·D/C, n·(D − 1)/C, n'·(1 − A)/C, nodal = principal + (n' − n)/F)",
    source: src::MATRICES,
};

/// A schematic eye's entrance pupil: the iris imaged through the cornea.
const ENTRANCE_PUPIL_TRACE: Method = Method {
    formula: "iris at the front of the lens traced back through the cornea: L' = L + F at each surface, L ← L'/(1 − (d/n)·L') across each gap",
    source: src::ENTRANCE_PUPIL,
};

/// Relative spectacle magnification of a schematic eye.
const RSM_MODEL_EYE: Method = Method {
    formula:
        "RSM = F_e / (F_e + F_s − d·F_s·F_e), d = vertex distance + cornea to first principal point",
    source: src::RELATIVE_SPECTACLE_MAGNIFICATION,
};
