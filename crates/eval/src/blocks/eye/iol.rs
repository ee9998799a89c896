//! Intraocular lens values of an `eye` block: SRK/T power for the target
//! refraction and its estimated anterior chamber depth, the thin-lens vergence
//! formula with a recorded effective lens position, and the predicted refraction
//! of a chosen lens. Every value carries the strong IOL caution.

use super::keys;
use crate::codes;
use crate::compute::{n4, Out};
use crate::derived::{DerivedValue as V, Method};
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::Eye;
use crate::sources as src;
use parax_optics::iol;
use parax_optics::keratometry::{keratometric_power, KERATOMETRIC_INDEX};

pub(crate) fn compute(e: &Eye, out: &mut Out<'_>, diags: &mut Vec<Diagnostic>) {
    let (Some(al), Some(k)) = (&e.axial_length, &e.keratometry) else {
        return;
    };
    let Some(facts) = e.iol.as_deref() else {
        return;
    };
    if facts.constant.is_none() && facts.elp.is_none() {
        return;
    }
    let index = e
        .keratometric_index
        .as_ref()
        .map_or(KERATOMETRIC_INDEX, |i| i.value);
    let mean_k = k
        .value
        .iter()
        .map(|m| keratometric_power(m.radius, index))
        .sum::<f64>()
        / 2.0;
    let l = al.value * 1000.0;
    let target = facts.target.as_ref().map_or(0.0, |t| t.value);
    let mut any = false;
    let mut undefined_height = false;
    if let Some(a) = &facts.constant {
        any = true;
        let g = iol::srkt_geometry(l, mean_k, a.value);
        undefined_height = !g.corneal_height_defined;
        let height_note = if undefined_height {
            "; the corneal width exceeds the corneal diameter, so SRK/T's corneal height is undefined and H = r is used (outside the published formula)"
        } else {
            ""
        };
        out.push(
            keys::IOL_ACD_ESTIMATE,
            "SRK/T estimated postoperative anterior chamber depth",
            V::Length {
                metres: g.acd / 1000.0,
            },
            a.span,
            &Method {
                formula: "ACD = H + (0.62467·A − 68.747) − 3.336, H from corneal height (SRK/T)",
                source: src::SRKT,
            },
            || {
                format!(
                    "L {} mm, K {}, A {} → ACD {} mm{height_note}",
                    n4(l),
                    n4(mean_k),
                    a.value,
                    n4(g.acd)
                )
            },
        )
        .caution = Some(src::CAUTION_IOL);
        let p = iol::srkt_power(l, mean_k, a.value, target);
        out.push(
            keys::IOL_POWER_SRKT,
            "IOL power for the target refraction (SRK/T)",
            V::Power { dioptres: p },
            a.span,
            &SRKT_POWER,
            || {
                format!(
                    "L {} mm, mean K {}, A {}, target {} → {}{height_note}",
                    n4(l),
                    n4(mean_k),
                    a.value,
                    n4(target),
                    n4(p)
                )
            },
        )
        .caution = Some(src::CAUTION_IOL);
        if let Some(chosen) = &facts.power {
            let r = iol::srkt_refraction(l, mean_k, a.value, chosen.value);
            out.push(
                keys::IOL_PREDICTED_REFRACTION,
                "predicted refraction with the chosen IOL (SRK/T, at 12 mm)",
                V::Power { dioptres: r },
                chosen.span,
                &Method {
                    formula: "SRK/T solved for the refraction",
                    source: src::SRKT,
                },
                || format!("IOL {} D → {}", n4(chosen.value), n4(r)),
            )
            .caution = Some(src::CAUTION_IOL);
        }
    }
    if let Some(elp) = &facts.elp {
        any = true;
        let p = iol::vergence_power(l, mean_k, elp.value * 1000.0, target, 12.0);
        out.push(
            keys::IOL_POWER_VERGENCE,
            "IOL power for the target refraction (thin-lens vergence formula)",
            V::Power { dioptres: p },
            elp.span,
            &Method {
                formula: "P = n/(AL − ELP) − n/(n/(K + Z) − ELP), Z = R/(1 − 0.012·R), n = 1.336",
                source: src::IOL_VERGENCE,
            },
            || {
                format!(
                    "AL {} mm, K {}, ELP {} mm, R {} → {}",
                    n4(l),
                    n4(mean_k),
                    n4(elp.value * 1000.0),
                    n4(target),
                    n4(p)
                )
            },
        )
        .caution = Some(src::CAUTION_IOL);
    }
    if any {
        let after_surgery = e.refractive_surgery.is_some();
        diags.push(
            Diagnostic::new(
                codes::IOL_CAUTION,
                if after_surgery || undefined_height {
                    Severity::Warning
                } else {
                    Severity::Info
                },
                al.span,
                if after_surgery {
                    "IOL power computed after corneal refractive surgery: these formulas are not valid without a validated adjustment"
                } else if undefined_height {
                    "SRK/T's corneal height is undefined for this axial length and K (computed corneal width above twice the radius): the SRK/T values lie outside the published formula"
                } else {
                    "IOL power computed: an aid for the surgeon, not a lens choice"
                },
            )
            .hint("biometry, lens constants and the choice of lens belong to the surgeon")
            .caution(src::CAUTION_IOL),
        );
    }
}

/// The SRK/T intraocular lens power for the target refraction.
const SRKT_POWER: Method = Method {
    formula: "SRK/T (Retzlaff, Sanders & Kraff 1990), V = 12 mm, target terms with minus signs",
    source: src::SRKT,
};
