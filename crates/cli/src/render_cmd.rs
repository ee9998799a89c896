//! `parax render FILE --out DIR`: SVG diagrams of a case file, one per lens
//! system (object, every intermediate image and the final image, chief ray) and
//! one power cross per refraction. Positions, heights and ray heights come from
//! `parax_optics::system::{trace, ray_heights}` and the derived values of
//! `parax-eval`; drawing is `parax-diagram`. This module only places the given
//! numbers along the axis (adding up gap lengths) and picks labels.

use crate::files;
use parax_diagram::{
    lens_system_svg, power_cross_svg, Arrow, ArrowRole, LensDiagram, LensMark, MeridianMark,
    PowerCross,
};
use parax_eval::blocks::eye::keys;
use parax_eval::model::{ObjectAt, System, SystemElement};
use parax_eval::{evaluate_with, slug, DerivedValue, EvalOptions};
use parax_optics::system::{ray_heights, trace, Element, ImagePlace, Object};
use std::path::Path;

/// The diagram of one system, or `None` when it has no lens.
pub fn system_diagram(s: &System) -> Option<LensDiagram> {
    let elements: Vec<Element> = s.optics_elements();
    // Axial positions: each lens or surface after the sum of the gaps before it.
    // A surface is drawn as a lens mark of its power (n' − n)/r in the running index.
    let mut z = 0.0;
    let mut lenses = Vec::new();
    let mut n_end = 1.0;
    for e in &s.elements {
        match &e.value {
            SystemElement::Lens { label, power } => lenses.push(LensMark {
                label: label.clone(),
                x: z,
                power: *power,
            }),
            SystemElement::Surface {
                label,
                radius,
                index_after,
            } => {
                lenses.push(LensMark {
                    label: label.clone(),
                    x: z,
                    power: (index_after - n_end) / radius,
                });
                n_end = *index_after;
            }
            SystemElement::Gap { length, index } => {
                z += length;
                n_end = *index;
            }
        }
    }
    let z_end = z;
    if lenses.is_empty() {
        return None;
    }
    let object = match &s.object.value {
        ObjectAt::Infinity => Object::AtInfinity,
        ObjectAt::Before { distance, .. } => Object::Distance {
            before_first_m: *distance,
        },
    };
    let t = trace(object, &elements, 1.0);
    let mut arrows = Vec::new();
    let mut notes = Vec::new();
    if let Object::Distance { before_first_m } = object {
        arrows.push(Arrow {
            label: "object".into(),
            x: -before_first_m,
            height: 1.0,
            real: true,
            role: ArrowRole::Object,
        });
    } else {
        notes.push(
            "object at infinity: images marked at their positions (height not defined); no chief ray drawn"
                .to_owned(),
        );
    }
    let mut height = Some(1.0);
    let last = t.steps.len().saturating_sub(1);
    for (k, step) in t.steps.iter().enumerate() {
        height = height.zip(step.magnification).map(|(h, m)| h * m);
        let lens = &lenses[k];
        match step.image {
            ImagePlace::AtInfinity => notes.push(format!("image by {} at infinity", lens.label)),
            ImagePlace::At {
                after_element_m,
                real,
            } => arrows.push(Arrow {
                label: if k == last {
                    "final image".into()
                } else {
                    format!("image by {}", lens.label)
                },
                x: lens.x + after_element_m,
                height: height.unwrap_or(0.6),
                real,
                role: if k == last {
                    ArrowRole::Final
                } else {
                    ArrowRole::Intermediate
                },
            }),
        }
    }
    let mut chief_ray = Vec::new();
    let mut chief_ray_virtual = Vec::new();
    if let Object::Distance { before_first_m } = object {
        // The ray from the object's tip through the centre of the first lens.
        let (heights, y, nu) = ray_heights(&elements, 0.0, -1.0 / before_first_m, 1.0);
        chief_ray.push((-before_first_m, 1.0));
        chief_ray.extend(lenses.iter().zip(&heights).map(|(l, h)| (l.x, *h)));
        if z_end > lenses[lenses.len() - 1].x {
            chief_ray.push((z_end, y));
        }
        match t.final_image {
            ImagePlace::At {
                after_element_m,
                real,
            } => {
                let zi = lenses[lenses.len() - 1].x + after_element_m;
                let yi = y + nu / n_end * (zi - z_end);
                if real && zi >= z_end {
                    chief_ray.push((zi, yi));
                } else {
                    let reach = z_end + 0.3 * (z_end + before_first_m).max(0.05);
                    chief_ray.push((reach, y + nu / n_end * (reach - z_end)));
                    chief_ray_virtual = vec![(z_end, y), (zi, yi)];
                }
            }
            ImagePlace::AtInfinity => {
                let reach = z_end + 0.3 * (z_end + before_first_m).max(0.05);
                chief_ray.push((reach, y + nu / n_end * (reach - z_end)));
            }
        }
    }
    Some(LensDiagram {
        title: format!("system \"{}\"", s.name),
        lenses,
        arrows,
        chief_ray,
        chief_ray_virtual,
        notes,
    })
}

/// Run `parax render`; exit status 0, 1 when the file has errors (what could be
/// computed is still drawn), 2 when the file cannot be read or written.
pub fn run(path: &Path, out: &Path) -> u8 {
    let source = match files::read(path) {
        Ok(s) => s,
        Err(e) => {
            eprintln!("parax: {e}");
            return 2;
        }
    };
    let ev = evaluate_with(&parax_syntax::parse(&source), EvalOptions::VALUES_ONLY);
    let stem = path
        .file_stem()
        .map_or("stdin".into(), |s| s.to_string_lossy().into_owned());
    let mut written = Vec::new();
    let mut pictures: Vec<(String, String)> = Vec::new();
    for s in ev.case.systems() {
        if let Some(d) = system_diagram(s) {
            pictures.push((
                format!("{stem}.system.{}.svg", slug(&s.name)),
                lens_system_svg(&d),
            ));
        }
    }
    for e in ev.case.eyes() {
        let side = e.side.name();
        let find = |name: &str| {
            ev.derived
                .iter()
                .find(|d| d.is_key(&format!("eye.{side}.{name}")))
        };
        let meridian = |name: &str| match find(name).map(|d| &d.value) {
            Some(DerivedValue::Meridian { dioptres, meridian }) => Some(MeridianMark {
                degrees: *meridian,
                label: format!(
                    "{} D @ {}",
                    parax_eval::derived::fmt_power(*dioptres),
                    parax_eval::derived::fmt_axis(*meridian)
                ),
            }),
            _ => None,
        };
        if let (Some(a), Some(b)) = (meridian(keys::MERIDIAN_1), meridian(keys::MERIDIAN_2)) {
            let rx = find(keys::MINUS_CYL)
                .or_else(|| find(keys::SPHERICAL_EQUIVALENT))
                .map_or(String::new(), |d| d.text());
            pictures.push((
                format!("{stem}.eye.{side}.svg"),
                power_cross_svg(&PowerCross {
                    title: format!("eye {side}: {rx}"),
                    meridians: [a, b],
                }),
            ));
        }
    }
    if let Err(e) = std::fs::create_dir_all(out) {
        eprintln!("parax: {}: {e}", out.display());
        return 2;
    }
    for (name, svg) in pictures {
        let p = out.join(&name);
        if let Err(e) = std::fs::write(&p, svg) {
            eprintln!("parax: {}: {e}", p.display());
            return 2;
        }
        written.push(p);
    }
    for p in &written {
        println!("wrote {}", p.display());
    }
    if written.is_empty() {
        println!("nothing to draw: record a lens system or a refraction");
    }
    u8::from(ev.has_errors())
}
