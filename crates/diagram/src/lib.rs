//! SVG diagrams for parax, as plain data in and SVG text out. This crate does
//! no optics: every position, height, power and ray slope it draws is given to
//! it (the command line takes them from `parax_optics::system::layout` and from
//! the derived values of `parax-eval`). It lays them out ([`lens_diagram`]:
//! labels, notes, which arrows and ray segments to draw, how far to draw a ray
//! along its given slope), scales them to the picture and writes SVG 1.1
//! elements by hand: a handful of `line`, `path` and `text` elements do not
//! justify an SVG-writing dependency.

#![forbid(unsafe_code)]
#![warn(missing_docs)]

use std::fmt::Write as _;

/// What an arrow in a lens diagram stands for.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ArrowRole {
    /// The object.
    Object,
    /// The image formed by one lens and the object of the next.
    Intermediate,
    /// The final image.
    Final,
}

/// An object or image drawn as an arrow standing on the axis.
#[derive(Debug, Clone, PartialEq)]
pub struct Arrow {
    /// Label, e.g. `object`, `image by A`.
    pub label: String,
    /// Axial position, metres (light travels to +x).
    pub x: f64,
    /// Height relative to the object's (object = 1; negative: inverted).
    pub height: f64,
    /// Real (solid) or virtual (dashed).
    pub real: bool,
    /// What it stands for.
    pub role: ArrowRole,
}

/// A thin lens.
#[derive(Debug, Clone, PartialEq)]
pub struct LensMark {
    /// Label as written in the case file.
    pub label: String,
    /// Axial position, metres.
    pub x: f64,
    /// Power, dioptres (sign decides the symbol).
    pub power: f64,
}

/// Everything a lens-system diagram shows.
#[derive(Debug, Clone, PartialEq)]
pub struct LensDiagram {
    /// Title (the system's name).
    pub title: String,
    /// The lenses, left to right.
    pub lenses: Vec<LensMark>,
    /// Object and images; images at infinity are left out by the caller.
    pub arrows: Vec<Arrow>,
    /// The chief ray as (x metres, height) points, solid where light travels.
    pub chief_ray: Vec<(f64, f64)>,
    /// Backward extension of the chief ray to a virtual final image (dashed).
    pub chief_ray_virtual: Vec<(f64, f64)>,
    /// Notes printed under the drawing (e.g. "object at infinity").
    pub notes: Vec<String>,
}

/// The image one element forms, as given to [`lens_diagram`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ImageMark {
    /// Axial position, metres; `None` at infinity.
    pub x: Option<f64>,
    /// Real or virtual.
    pub real: bool,
    /// Height relative to the object's; `None` when undefined.
    pub height: Option<f64>,
}

/// The chief ray, as given to [`lens_diagram`].
#[derive(Debug, Clone, PartialEq)]
pub struct RayMark {
    /// Height at each lens, in order.
    pub heights: Vec<f64>,
    /// Height at the end of the system.
    pub exit_height: f64,
    /// Slope after the end of the system (height per metre).
    pub exit_slope: f64,
}

/// A lens system as numbers: what [`lens_diagram`] lays out.
#[derive(Debug, Clone, PartialEq)]
pub struct SystemSketch {
    /// Title (the system's name).
    pub title: String,
    /// The lenses (or surfaces, as lenses of their power), left to right.
    pub lenses: Vec<LensMark>,
    /// Axial position of the end of the system (after its last gap).
    pub end: f64,
    /// Distance of the object before the first lens; `None` at infinity.
    pub object_before: Option<f64>,
    /// The image each lens forms, in order.
    pub images: Vec<ImageMark>,
    /// The chief ray, for an object at a finite distance.
    pub chief_ray: Option<RayMark>,
}

/// Lay a system out for [`lens_system_svg`]: the object and every image as
/// arrows (an image of undefined height drawn at 0.6 of the object's, images at
/// infinity as notes), and the chief ray through the lenses and on along its
/// slope to a real final image, or to a little past the system (a fifth past
/// the object-to-end length, at least 5 cm times 0.3) with a dashed extension
/// back to a virtual one. `None` without a lens.
pub fn lens_diagram(s: SystemSketch) -> Option<LensDiagram> {
    let last_lens = s.lenses.last()?.x;
    let mut arrows = Vec::new();
    let mut notes = Vec::new();
    if let Some(before) = s.object_before {
        arrows.push(Arrow {
            label: "object".into(),
            x: -before,
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
    let last = s.images.len().saturating_sub(1);
    for (k, (image, lens)) in s.images.iter().zip(&s.lenses).enumerate() {
        match image.x {
            None => notes.push(format!("image by {} at infinity", lens.label)),
            Some(x) => arrows.push(Arrow {
                label: if k == last {
                    "final image".into()
                } else {
                    format!("image by {}", lens.label)
                },
                x,
                height: image.height.unwrap_or(0.6),
                real: image.real,
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
    if let (Some(before), Some(ray)) = (s.object_before, &s.chief_ray) {
        let (z_end, y, slope) = (s.end, ray.exit_height, ray.exit_slope);
        chief_ray.push((-before, 1.0));
        chief_ray.extend(s.lenses.iter().zip(&ray.heights).map(|(l, h)| (l.x, *h)));
        if z_end > last_lens {
            chief_ray.push((z_end, y));
        }
        let reach = z_end + 0.3 * (z_end + before).max(0.05);
        match s.images.last() {
            Some(ImageMark {
                x: Some(zi), real, ..
            }) => {
                let yi = y + slope * (zi - z_end);
                if *real && *zi >= z_end {
                    chief_ray.push((*zi, yi));
                } else {
                    chief_ray.push((reach, y + slope * (reach - z_end)));
                    chief_ray_virtual = vec![(z_end, y), (*zi, yi)];
                }
            }
            _ => chief_ray.push((reach, y + slope * (reach - z_end))),
        }
    }
    Some(LensDiagram {
        title: s.title,
        lenses: s.lenses,
        arrows,
        chief_ray,
        chief_ray_virtual,
        notes,
    })
}

/// One principal meridian of a refraction.
#[derive(Debug, Clone, PartialEq)]
pub struct MeridianMark {
    /// Meridian, degrees (ISO 8429: 0° to the right, counter-clockwise, seen
    /// from in front of the patient).
    pub degrees: f64,
    /// Label, e.g. `-5.75 D @ 175`.
    pub label: String,
}

/// A power cross: the two principal meridians of a refraction.
#[derive(Debug, Clone, PartialEq)]
pub struct PowerCross {
    /// Title, e.g. `eye right: -5.75 / -1.50 x 175`.
    pub title: String,
    /// The two principal meridians.
    pub meridians: [MeridianMark; 2],
}

const W: f64 = 900.0;
const H: f64 = 360.0;
const AXIS_Y: f64 = 190.0;
const MARGIN: f64 = 60.0;
/// Height in pixels of the tallest arrow.
const ARROW_PX: f64 = 110.0;

fn esc(s: &str) -> String {
    s.replace('&', "&amp;")
        .replace('<', "&lt;")
        .replace('>', "&gt;")
        .replace('"', "&quot;")
}

fn head(out: &mut String, w: f64, h: f64, title: &str) {
    let _ = writeln!(
        out,
        r##"<svg xmlns="http://www.w3.org/2000/svg" width="{w}" height="{h}" viewBox="0 0 {w} {h}" font-family="sans-serif" font-size="12">"##
    );
    let _ = writeln!(out, "<title>{}</title>", esc(title));
    let _ = writeln!(
        out,
        r##"<rect x="0" y="0" width="{w}" height="{h}" fill="#ffffff"/>"##
    );
}

/// The SVG of a lens system: axis, lenses at their positions (to scale along the
/// axis), object and images as arrows (real solid, virtual dashed), the chief
/// ray, a scale bar and the notes.
pub fn lens_system_svg(d: &LensDiagram) -> String {
    let xs: Vec<f64> = d
        .lenses
        .iter()
        .map(|l| l.x)
        .chain(d.arrows.iter().map(|a| a.x))
        .chain(d.chief_ray.iter().chain(&d.chief_ray_virtual).map(|p| p.0))
        .collect();
    let (lo, hi) = xs
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), &x| {
            (a.min(x), b.max(x))
        });
    let (lo, hi) = if lo.is_finite() && hi > lo {
        (lo, hi)
    } else {
        (lo.min(0.0) - 0.05, lo.max(0.0) + 0.05)
    };
    let scale = (W - 2.0 * MARGIN) / (hi - lo);
    let px = |x: f64| MARGIN + (x - lo) * scale;
    let hmax = d
        .arrows
        .iter()
        .map(|a| a.height.abs())
        .chain(
            d.chief_ray
                .iter()
                .chain(&d.chief_ray_virtual)
                .map(|p| p.1.abs()),
        )
        .fold(1.0f64, f64::max);
    let py = |h: f64| AXIS_Y - h / hmax * ARROW_PX;
    let mut out = String::new();
    head(&mut out, W, H, &d.title);
    let _ = writeln!(
        out,
        r##"<text x="{MARGIN}" y="24" font-size="15">{}</text>"##,
        esc(&d.title)
    );
    // The optical axis.
    let _ = writeln!(
        out,
        r##"<line class="axis" x1="10" y1="{AXIS_Y}" x2="{}" y2="{AXIS_Y}" stroke="#666666" stroke-width="1"/>"##,
        W - 10.0
    );
    for l in &d.lenses {
        let x = px(l.x);
        let (t, b) = (AXIS_Y - ARROW_PX - 15.0, AXIS_Y + ARROW_PX + 15.0);
        // Positive lens: heads pointing outwards; negative: inwards.
        let k = if l.power >= 0.0 { -8.0 } else { 8.0 };
        let _ = writeln!(
            out,
            r##"<path class="lens" d="M {x:.1} {t:.1} L {x:.1} {b:.1} M {:.1} {:.1} L {x:.1} {t:.1} L {:.1} {:.1} M {:.1} {:.1} L {x:.1} {b:.1} L {:.1} {:.1}" fill="none" stroke="#1f4e9c" stroke-width="2"/>"##,
            x - 6.0,
            t - k,
            x + 6.0,
            t - k,
            x - 6.0,
            b + k,
            x + 6.0,
            b + k
        );
        let _ = writeln!(
            out,
            r##"<text x="{x:.1}" y="{:.1}" text-anchor="middle">{} {:+.2} D</text>"##,
            b + 18.0,
            esc(&l.label),
            l.power
        );
    }
    for a in &d.arrows {
        let x = px(a.x);
        let y = py(a.height);
        let colour = match a.role {
            ArrowRole::Object => "#222222",
            ArrowRole::Intermediate => "#8a5a00",
            ArrowRole::Final => "#b00020",
        };
        let dash = if a.real {
            ""
        } else {
            r##" stroke-dasharray="6 4""##
        };
        let dir = if a.height >= 0.0 { 1.0 } else { -1.0 };
        let _ = writeln!(
            out,
            r##"<path class="arrow {}" d="M {x:.1} {AXIS_Y:.1} L {x:.1} {y:.1} M {:.1} {:.1} L {x:.1} {y:.1} L {:.1} {:.1}" fill="none" stroke="{colour}" stroke-width="2"{dash}/>"##,
            if a.real { "real" } else { "virtual" },
            x - 5.0,
            y + 9.0 * dir,
            x + 5.0,
            y + 9.0 * dir
        );
        let ly = if a.height >= 0.0 { y - 6.0 } else { y + 16.0 };
        let _ = writeln!(
            out,
            r##"<text x="{x:.1}" y="{ly:.1}" text-anchor="middle" fill="{colour}">{}{}</text>"##,
            esc(&a.label),
            if a.real { "" } else { " (virtual)" }
        );
    }
    let poly = |pts: &[(f64, f64)]| {
        pts.iter()
            .map(|&(x, h)| format!("{:.1},{:.1}", px(x), py(h)))
            .collect::<Vec<_>>()
            .join(" ")
    };
    if d.chief_ray.len() > 1 {
        let _ = writeln!(
            out,
            r##"<polyline class="chief-ray" points="{}" fill="none" stroke="#2e7d32" stroke-width="1.5"/>"##,
            poly(&d.chief_ray)
        );
    }
    if d.chief_ray_virtual.len() > 1 {
        let _ = writeln!(
            out,
            r##"<polyline class="chief-ray virtual" points="{}" fill="none" stroke="#2e7d32" stroke-width="1" stroke-dasharray="4 4"/>"##,
            poly(&d.chief_ray_virtual)
        );
    }
    // A scale bar of a round length near a fifth of the drawing.
    let span = (hi - lo) / 5.0;
    let step = [
        0.001, 0.002, 0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1.0, 2.0, 5.0,
    ]
    .into_iter()
    .rev()
    .find(|s| *s <= span)
    .unwrap_or(0.001);
    let y = H - 40.0;
    let _ = writeln!(
        out,
        r##"<path class="scale" d="M {MARGIN} {y} L {:.1} {y} M {MARGIN} {:.1} L {MARGIN} {:.1} M {:.1} {:.1} L {:.1} {:.1}" stroke="#000000" stroke-width="1"/>"##,
        MARGIN + step * scale,
        y - 4.0,
        y + 4.0,
        MARGIN + step * scale,
        y - 4.0,
        MARGIN + step * scale,
        y + 4.0
    );
    let label = if step >= 0.01 {
        format!("{} cm", step * 100.0)
    } else {
        format!("{} mm", step * 1000.0)
    };
    let _ = writeln!(
        out,
        r##"<text x="{:.1}" y="{:.1}">{label} (axial scale; heights not to scale)</text>"##,
        MARGIN + step * scale + 8.0,
        y + 4.0
    );
    for (i, n) in d.notes.iter().enumerate() {
        let _ = writeln!(
            out,
            r##"<text x="{MARGIN}" y="{:.1}" fill="#444444">{}</text>"##,
            H - 18.0 + 14.0 * i as f64 - 14.0 * (d.notes.len().saturating_sub(1)) as f64,
            esc(n)
        );
    }
    out.push_str("</svg>\n");
    out
}

/// The SVG of a power cross: two lines along the principal meridians (ISO 8429
/// angles, seen from in front), each labelled with its power.
pub fn power_cross_svg(c: &PowerCross) -> String {
    let (w, h) = (420.0, 420.0);
    let (cx, cy, r) = (210.0, 220.0, 140.0);
    let mut out = String::new();
    head(&mut out, w, h, &c.title);
    let _ = writeln!(
        out,
        r##"<text x="20" y="28" font-size="15">{}</text>"##,
        esc(&c.title)
    );
    let _ = writeln!(
        out,
        r##"<circle cx="{cx}" cy="{cy}" r="{r}" fill="none" stroke="#bbbbbb" stroke-width="1"/>"##
    );
    for (deg, name) in [(0.0, "0"), (90.0, "90"), (180.0, "180")] {
        let (s, co) = (
            f64::sin(f64::to_radians(deg)),
            f64::cos(f64::to_radians(deg)),
        );
        let _ = writeln!(
            out,
            r##"<text x="{:.1}" y="{:.1}" text-anchor="middle" fill="#888888">{name}°</text>"##,
            cx + (r + 18.0) * co,
            cy - (r + 18.0) * s + 4.0
        );
    }
    for (i, m) in c.meridians.iter().enumerate() {
        let t = m.degrees.to_radians();
        let (dx, dy) = (r * t.cos(), -r * t.sin());
        let colour = ["#1f4e9c", "#b00020"][i];
        let _ = writeln!(
            out,
            r##"<line class="meridian" x1="{:.1}" y1="{:.1}" x2="{:.1}" y2="{:.1}" stroke="{colour}" stroke-width="3"/>"##,
            cx - dx,
            cy - dy,
            cx + dx,
            cy + dy
        );
        // The label sits just beyond one end, inside the picture.
        let (lx, ly) = (cx + 0.62 * dx, cy + 0.62 * dy - 8.0);
        let _ = writeln!(
            out,
            r##"<text x="{lx:.1}" y="{ly:.1}" text-anchor="middle" fill="{colour}" font-weight="bold">{}</text>"##,
            esc(&m.label)
        );
    }
    let _ = writeln!(
        out,
        r##"<text x="20" y="{}" fill="#444444">meridians seen from in front of the patient (ISO 8429)</text>"##,
        h - 14.0
    );
    out.push_str("</svg>\n");
    out
}
