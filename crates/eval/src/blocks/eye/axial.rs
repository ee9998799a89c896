//! Values of an `eye` block that join its refraction and its axial length: the
//! relative spectacle magnification of the spectacle correction, with the eye
//! taken as Emsley's reduced eye (one surface, index 4/3, principal point at the
//! cornea) of the measured axial length whose power gives the refraction.

use super::keys;
use crate::blocks::Context;
use crate::compute::{n4, Out};
use crate::derived::{DerivedValue as V, Method};
use crate::model::Eye;
use crate::sources as src;
use parax_optics::lens_form::relative_spectacle_magnification_axial;
use parax_optics::model_eye::{spectacle_refraction, Schematic};

pub(crate) fn compute(case: &Context<'_>, e: &Eye, out: &mut Out<'_>) {
    let (Some(r), Some(al)) = (&e.refraction, &e.axial_length) else {
        return;
    };
    // The refraction is only placed before the eye when its vertex is recorded.
    let Some(measured_at) = r.value.vertex else {
        return;
    };
    let rx = &r.value.rx;
    let m = rx.sphere + rx.cylinder / 2.0;
    // Ocular refraction (at the cornea) of the spherical equivalent.
    let k = m / (1.0 - measured_at * m);
    // The lens as worn: at the first frame's vertex when one is recorded.
    let (d, whence) = match case.first_frame().and_then(|f| f.vertex.as_ref()) {
        Some(v) => (v.value, "the frame's vertex"),
        None => (measured_at, "the refraction's vertex"),
    };
    let fs = spectacle_refraction(k, d);
    let n = Schematic::EmsleyReduced.surfaces()[0].index_after;
    // Reduced eye: the vergence leaving the surface, K + F_e, focuses on the
    // retina at the axial length: K + F_e = n'/AL.
    let fe = n / al.value - k;
    let rsm = relative_spectacle_magnification_axial(fe, fs, d);
    out.push(
        keys::RELATIVE_SPECTACLE_MAGNIFICATION,
        RSM_AXIAL_LABEL,
        V::Number { value: rsm },
        al.span,
        &RSM_REDUCED_EYE,
        || {
            format!(
                "M = {m4}, K = {k4}; F_e = {}/{} − ({k4}) = {fe4}; \
                 F_s = {fs4} at {} mm ({whence}); \
                 RSM = {fe4} / ({fe4} + ({fs4}) − {d:.6}·({fs4})·{fe4}) = {}",
                n4(n),
                n4(al.value),
                n4(d * 1000.0),
                n4(rsm),
                m4 = n4(m),
                k4 = n4(k),
                fe4 = n4(fe),
                fs4 = n4(fs),
            )
        },
    )
    .caution = Some(src::CAUTION_MODEL);
}

/// Relative spectacle magnification of an eye block, through Emsley's reduced eye.
const RSM_REDUCED_EYE: Method = Method {
    formula: "K = M/(1 − d₀·M); F_e = n'/AL − K (n' = 4/3); F_s = K/(1 + d·K); RSM = F_e / (F_e + F_s − d·F_s·F_e)",
    source: src::RELATIVE_SPECTACLE_MAGNIFICATION,
};

/// The label of the eye block's relative spectacle magnification.
const RSM_AXIAL_LABEL: &str =
    "relative spectacle magnification of the spectacle correction (reduced eye of this axial length)";
