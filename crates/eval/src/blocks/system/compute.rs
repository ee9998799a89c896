//! Derived values of a `system` block: per-lens vergences, images and
//! magnifications by step-along vergence (thin lenses and refracting surfaces); the final image; equivalent,
//! back-vertex and front-vertex power by ray-transfer matrices.

use super::{element_key, keys};
use crate::codes;
use crate::compute::{n4, slug, Out};
use crate::derived::{DerivedValue as V, Method};
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::{ObjectAt, System, SystemElement};
use crate::sources as src;
use parax_optics::system::{system_matrix, system_powers, trace, Element, ImagePlace, Object};

/// `system.<slug of the name>`.
pub fn block_id(s: &System) -> String {
    format!("system.{}", slug(&s.name))
}

fn place(p: ImagePlace, label: &str) -> V {
    match p {
        ImagePlace::AtInfinity => V::Infinity,
        ImagePlace::At {
            after_element_m, ..
        } => V::Distance {
            metres: after_element_m,
            from: label.into(),
        },
    }
}

pub(crate) fn compute(s: &System, out: &mut Out<'_>, diags: &mut Vec<Diagnostic>) {
    let lenses: Vec<(usize, &str)> = s
        .elements
        .iter()
        .enumerate()
        .filter_map(|(i, e)| match &e.value {
            SystemElement::Lens { label, .. } | SystemElement::Surface { label, .. } => {
                Some((i, label.as_str()))
            }
            SystemElement::Gap { .. } => None,
        })
        .collect();
    let Some(&(first_i, first_label)) = lenses.first() else {
        diags.push(
            Diagnostic::new(
                codes::SYSTEM_LAYOUT,
                Severity::Warning,
                s.span,
                "this system has no lens",
            )
            .hint("add `lens LABEL POWER D` lines"),
        );
        return;
    };
    if first_i > 0 {
        diags.push(
            Diagnostic::new(
                codes::SYSTEM_LAYOUT,
                Severity::Error,
                s.elements[0].span,
                "a gap before the first lens has no meaning",
            )
            .hint("the object distance is measured to the first lens; remove this gap"),
        );
        return;
    }
    let object = match &s.object.value {
        ObjectAt::Infinity => Object::AtInfinity,
        ObjectAt::Before {
            distance,
            label,
            label_span,
        } => {
            if label != first_label {
                let known = lenses.iter().any(|(_, l)| l == label);
                let msg = if known {
                    format!(
                        "the object distance must be measured to the first lens, `{first_label}`"
                    )
                } else {
                    format!("there is no lens `{label}` in this system")
                };
                diags.push(
                    Diagnostic::new(codes::SYSTEM_LAYOUT, Severity::Error, *label_span, msg).fix(
                        format!("measure from `{first_label}`"),
                        *label_span,
                        first_label,
                    ),
                );
                return;
            }
            Object::Distance {
                before_first_m: *distance,
            }
        }
    };
    let elements: Vec<Element> = s.optics_elements();
    let t = trace(object, &elements, 1.0);
    // The step-along chain is shared by several derivations and grows per
    // element: build it only when derivations are written.
    let explain = out.explains();
    let mut chain = match object {
        _ if !explain => String::new(),
        Object::AtInfinity => "L = 0 (object at infinity)".to_owned(),
        Object::Distance { before_first_m } => format!(
            "L = 1/(−{}) = {}",
            n4(before_first_m),
            n4(-1.0 / before_first_m)
        ),
    };
    for step in &t.steps {
        let el = &s.elements[step.element_index];
        let (label, power) = match &el.value {
            SystemElement::Lens { label, power } => (label, *power),
            SystemElement::Surface {
                label,
                radius,
                index_after,
            } => {
                // F = (n' − n)/r with n the index of the medium before the surface.
                let before = s.elements[..step.element_index]
                    .iter()
                    .rev()
                    .find_map(|e| match &e.value {
                        SystemElement::Gap { index, .. } => Some(*index),
                        SystemElement::Surface { index_after, .. } => Some(*index_after),
                        SystemElement::Lens { .. } => None,
                    })
                    .unwrap_or(1.0);
                (label, (index_after - before) / radius)
            }
            SystemElement::Gap { .. } => continue,
        };
        let power = &power;
        let span = el.span;
        let line = || {
            format!(
                "{label}: L = {}, L' = L + F = {} + {} = {}",
                n4(step.incident_vergence),
                n4(step.incident_vergence),
                n4(*power),
                n4(step.emergent_vergence)
            )
        };
        if explain {
            chain.push_str("; ");
            chain.push_str(&line());
        }
        out.push(
            element_key(label, keys::VERGENCE_IN),
            format!("vergence arriving at {label}"),
            V::Power {
                dioptres: step.incident_vergence,
            },
            span,
            &Method {
                formula: "L2 = L1' / (1 − (d/n)·L1')",
                source: src::VERGENCE,
            },
            || chain.clone(),
        );
        out.push(
            element_key(label, keys::VERGENCE_OUT),
            format!("vergence leaving {label}"),
            V::Power {
                dioptres: step.emergent_vergence,
            },
            span,
            &Method {
                formula: "L' = L + F",
                source: src::VERGENCE,
            },
            line,
        );
        let image_sub = || match step.image {
            ImagePlace::AtInfinity => "L' = 0: image at infinity".to_owned(),
            ImagePlace::At {
                after_element_m, ..
            } => {
                // n of the medium after the element, recovered from l' = n/L'.
                format!(
                    "l' = n/L' = {}/{} = {} m",
                    n4(after_element_m * step.emergent_vergence),
                    n4(step.emergent_vergence),
                    n4(after_element_m)
                )
            }
        };
        out.push(
            element_key(label, keys::IMAGE),
            format!("image formed by {label}"),
            place(step.image, label),
            span,
            &Method {
                formula: "l' = n / L'",
                source: src::VERGENCE,
            },
            image_sub,
        );
        if let Some(m) = step.magnification {
            out.push(
                element_key(label, keys::MAGNIFICATION),
                format!("lateral magnification at {label}"),
                V::Number { value: m },
                span,
                &Method {
                    formula: "m = L / L'",
                    source: src::VERGENCE,
                },
                || {
                    format!(
                        "m = {} / {} = {}",
                        n4(step.incident_vergence),
                        n4(step.emergent_vergence),
                        n4(m)
                    )
                },
            );
        }
    }
    let &(last_i, last_label) = lenses.last().expect("at least one lens");
    let last_span = s.elements[last_i].span;
    out.push(
        keys::IMAGE,
        "final image",
        place(t.final_image, last_label),
        last_span,
        &Method {
            formula: "step-along vergence through every element",
            source: src::VERGENCE,
        },
        || chain.clone(),
    );
    if let Some(m) = t.total_magnification {
        let factors = || -> Vec<String> {
            t.steps
                .iter()
                .filter_map(|s| s.magnification.map(n4))
                .collect()
        };
        out.push(
            keys::MAGNIFICATION,
            "total lateral magnification",
            V::Number { value: m },
            last_span,
            &Method {
                formula: "m = m1 · m2 · …",
                source: src::VERGENCE,
            },
            || format!("{} = {}", factors().join(" · "), n4(m)),
        );
    }
    let kind = match (t.final_image, t.erect) {
        (ImagePlace::AtInfinity, _) => "at infinity".to_owned(),
        (ImagePlace::At { real, .. }, erect) => {
            let r = if real { "real" } else { "virtual" };
            match erect {
                Some(true) => format!("{r}, erect"),
                Some(false) => format!("{r}, inverted"),
                None => r.to_owned(),
            }
        }
    };
    out.push(
        keys::IMAGE_KIND,
        "kind of final image",
        V::Text {
            text: kind.clone().into(),
        },
        last_span,
        &Method {
            formula: "real when the final vergence L' > 0; erect when m > 0",
            source: src::VERGENCE,
        },
        || kind.clone(),
    );
    // Powers by matrices, up to the last lens (a trailing gap is image space).
    let m = system_matrix(&elements[..=last_i]);
    let p = system_powers(&m);
    let msub = || {
        format!(
            "A = {}, B = {}, C = {}, D = {}",
            n4(m.a),
            n4(m.b),
            n4(m.c),
            n4(m.d)
        )
    };
    for (name, label, method, value) in [
        (
            keys::EQUIVALENT_POWER,
            "equivalent power",
            &Method {
                formula: "F = −C",
                source: src::MATRICES,
            },
            p.equivalent,
        ),
        (
            keys::BACK_VERTEX_POWER,
            "back vertex power",
            &Method {
                formula: "F'v = −C / A",
                source: src::MATRICES,
            },
            p.back_vertex,
        ),
        (
            keys::FRONT_VERTEX_POWER,
            "front vertex power",
            &Method {
                formula: "Fv = −C / D",
                source: src::MATRICES,
            },
            p.front_vertex,
        ),
    ] {
        if value.is_finite() {
            out.push(
                name,
                label,
                V::Power { dioptres: value },
                last_span,
                method,
                || format!("{}; {} = {}", msub(), method.formula, n4(value)),
            );
        }
    }
}
