//! `parax render FILE --out DIR`: SVG diagrams of a case file, one per lens
//! system (object, every intermediate image and the final image, chief ray) and
//! one power cross per refraction. Positions, powers, image heights and the
//! chief ray come from `parax_optics::system::layout`, the power crosses from
//! the derived values of `parax-eval`; layout and drawing are `parax-diagram`.
//! This module only gathers those numbers and labels and writes the files.

use crate::files;
use parax_diagram::{
    lens_diagram, lens_system_svg, power_cross_svg, ImageMark, LensDiagram, LensMark, MeridianMark,
    PowerCross, RayMark, SystemSketch,
};
use parax_eval::blocks::eye::keys;
use parax_eval::model::{ObjectAt, System, SystemElement};
use parax_eval::{evaluate_with, slug, DerivedValue, EvalOptions};
use parax_optics::system::{layout, Object};
use std::path::Path;

/// The diagram of one system, or `None` when it has no lens: the numbers from
/// `parax_optics::system::layout`, the labels from the case model, laid out by
/// `parax_diagram::lens_diagram`.
pub fn system_diagram(s: &System) -> Option<LensDiagram> {
    let object = match &s.object.value {
        ObjectAt::Infinity => Object::AtInfinity,
        ObjectAt::Before { distance, .. } => Object::Distance {
            before_first_m: *distance,
        },
    };
    let l = layout(object, &s.optics_elements());
    let labels = s.elements.iter().filter_map(|e| match &e.value {
        SystemElement::Lens { label, .. } | SystemElement::Surface { label, .. } => Some(label),
        SystemElement::Gap { .. } => None,
    });
    lens_diagram(SystemSketch {
        title: format!("system \"{}\"", s.name),
        lenses: labels
            .zip(l.positions.iter().zip(&l.powers))
            .map(|(label, (x, power))| LensMark {
                label: label.clone(),
                x: *x,
                power: *power,
            })
            .collect(),
        end: l.end_m,
        object_before: match object {
            Object::Distance { before_first_m } => Some(before_first_m),
            Object::AtInfinity => None,
        },
        images: l
            .images
            .iter()
            .map(|i| ImageMark {
                x: i.at_m,
                real: i.real,
                height: i.height,
            })
            .collect(),
        chief_ray: l.chief_ray.map(|r| RayMark {
            heights: r.heights,
            exit_height: r.exit_height,
            exit_slope: r.exit_slope,
        }),
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
