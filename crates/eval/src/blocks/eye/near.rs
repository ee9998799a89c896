//! Near vision values of an `eye` block: Hofstetter's amplitudes for the age
//! recorded (eye or case), the near points of the uncorrected eye with the mean
//! amplitude, the range of clear vision through the add, and an add suggestion
//! that keeps half the mean amplitude in reserve (rule of thumb).

use super::keys;
use crate::blocks::Context;
use crate::compute::{n4, Out};
use crate::derived::{DerivedValue as V, Method};
use crate::model::Eye;
use crate::sources as src;
use parax_optics::near;
use parax_optics::refraction::{FarPoint, SphCyl};
use parax_optics::vertex::{round_to_step, transfer_sphcyl};

/// Working distance for the add suggestion, metres (common practice).
const WORKING_DISTANCE: f64 = 0.40;

pub(crate) fn compute(case: &Context<'_>, e: &Eye, out: &mut Out<'_>) {
    let Some(age) = e.age.as_ref().or(case.info.age.as_ref()) else {
        return;
    };
    let (lo, mean, hi) = near::hofstetter(age.value);
    let span = e.age.as_ref().map_or(e.span, |a| a.span);
    for (name, label, v, f) in [
        (
            keys::AMPLITUDE_MIN,
            "expected amplitude of accommodation, minimum",
            lo,
            "15 − 0.25·age",
        ),
        (
            keys::AMPLITUDE_MEAN,
            "expected amplitude of accommodation, mean",
            mean,
            "18.5 − 0.30·age",
        ),
        (
            keys::AMPLITUDE_MAX,
            "expected amplitude of accommodation, maximum",
            hi,
            "25 − 0.40·age",
        ),
    ] {
        out.push(
            name,
            label,
            V::Power { dioptres: v },
            span,
            &Method {
                formula: "Hofstetter: min 15 − 0.25·age, mean 18.5 − 0.30·age, max 25 − 0.40·age",
                source: src::HOFSTETTER,
            },
            || format!("{f} with age {} = {}", n4(age.value), n4(v)),
        );
    }
    if let Some(r) = &e.refraction {
        // As the far points: from the cornea when the vertex is known, else from
        // the correcting plane.
        let rx = SphCyl::new(r.value.rx.sphere, r.value.rx.cylinder, r.value.rx.axis);
        let (rx, from) = match r.value.vertex {
            Some(d) if d > 0.0 => (transfer_sphcyl(&rx, d), "the cornea"),
            _ => (rx, "the correcting plane"),
        };
        for (i, mer) in rx.principal_meridians().iter().enumerate() {
            let value = match near::near_point(mer.power, mean) {
                FarPoint::Infinity => V::Infinity,
                FarPoint::At { distance_m } => V::Distance {
                    metres: distance_m,
                    from: crate::derived::shared_place(from),
                },
            };
            out.push(
                [keys::NEAR_POINT_1, keys::NEAR_POINT_2][i],
                [
                    "near point without correction, mean amplitude, meridian 1",
                    "near point without correction, mean amplitude, meridian 2",
                ][i],
                value,
                r.span,
                &Method {
                    formula:
                        "near point at 1/(R − A): refraction R of the meridian, mean amplitude A",
                    source: src::HOFSTETTER,
                },
                || {
                    format!(
                        "1 / ({} − {}) = {} m (meridian {})",
                        n4(mer.power),
                        n4(mean),
                        n4(1.0 / (mer.power - mean)),
                        n4(mer.meridian)
                    )
                },
            );
        }
    }
    let suggested = round_to_step(near::add_keeping_half(WORKING_DISTANCE, mean), 0.25);
    out.push(
        keys::ADD_SUGGESTED,
        "add keeping half the mean amplitude in reserve, at 40 cm",
        V::Power {
            dioptres: suggested,
        },
        span,
        &Method {
            formula: "add = 1/w − A/2 (w = 0.40 m), to 0.25 D, not below 0",
            source: src::HALF_RESERVE,
        },
        || {
            format!(
                "1/0.40 − {}/2 = {} → {}",
                n4(mean),
                n4(1.0 / WORKING_DISTANCE - mean / 2.0),
                n4(suggested)
            )
        },
    )
    .caution = Some(crate::diagnostic::GENERAL_CAUTION);
    if let Some(add) = &e.add {
        let (far, nearp) = near::clear_range(add.value, mean);
        for (name, label, d) in [
            (
                keys::CLEAR_FAR,
                "far end of clear vision through the add",
                far,
            ),
            (
                keys::CLEAR_NEAR,
                "near end of clear vision through the add",
                nearp,
            ),
        ] {
            let value = match d {
                Some(m) => V::Distance {
                    metres: -m,
                    from: crate::derived::shared_place("the spectacle plane"),
                },
                None => V::Infinity,
            };
            out.push(
                name,
                label,
                value,
                add.span,
                &CLEAR_RANGE_THROUGH_ADD,
                || {
                    format!(
                        "add {}, A {}: 1/{} and 1/({} + {})",
                        n4(add.value),
                        n4(mean),
                        n4(add.value),
                        n4(add.value),
                        n4(mean)
                    )
                },
            );
        }
    }
}

/// The range of clear vision through a reading addition.
const CLEAR_RANGE_THROUGH_ADD: Method = Method {
    formula: "far end 1/add, near end 1/(add + A), distance correction worn, mean amplitude",
    source: src::HOFSTETTER,
};
