//! Published schematic eyes by their published names, as editable surface
//! tables: powers and cardinal points by ray-transfer matrices, and the
//! refraction an axial length implies (at the cornea and at a spectacle vertex).
//!
//! Tables (radius mm / index after / distance to the next surface mm) from
//! Atchison & Smith, Optics of the Human Eye (2000), appendix tables; Le Grand &
//! El Hage, Physiological Optics (1980); Emsley, Visual Optics [M].

use crate::system::{cardinal_points, system_matrix, system_powers, CardinalPoints, Element};

/// A published schematic eye.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Schematic {
    /// Gullstrand's exact eye (No. 1), relaxed.
    GullstrandExact,
    /// Le Grand's full theoretical eye, relaxed.
    LeGrandFull,
    /// Emsley's reduced eye.
    EmsleyReduced,
}

impl Schematic {
    /// Every model, in the order the notation lists them.
    pub const ALL: [Schematic; 3] = [
        Schematic::GullstrandExact,
        Schematic::LeGrandFull,
        Schematic::EmsleyReduced,
    ];

    /// The published name.
    pub fn name(self) -> &'static str {
        match self {
            Schematic::GullstrandExact => "Gullstrand exact eye (No. 1), relaxed",
            Schematic::LeGrandFull => "Le Grand full theoretical eye, relaxed",
            Schematic::EmsleyReduced => "Emsley reduced eye",
        }
    }

    /// The model's surfaces.
    pub fn surfaces(self) -> Vec<EyeSurface> {
        let t: &[(f64, f64, f64)] = match self {
            Schematic::GullstrandExact => &[
                (7.7, 1.376, 0.5),
                (6.8, 1.336, 3.1),
                (10.0, 1.386, 0.546),
                (7.911, 1.406, 2.419),
                (-5.76, 1.386, 0.635),
                (-6.0, 1.336, 17.185),
            ],
            Schematic::LeGrandFull => &[
                (7.8, 1.3771, 0.55),
                (6.5, 1.3374, 3.05),
                (10.2, 1.42, 4.0),
                (-6.0, 1.336, 16.5966),
            ],
            Schematic::EmsleyReduced => &[(50.0 / 9.0, 4.0 / 3.0, 200.0 / 9.0)],
        };
        t.iter()
            .map(|&(r, n, d)| EyeSurface {
                radius_m: r / 1000.0,
                index_after: n,
                distance_m: d / 1000.0,
            })
            .collect()
    }
}

/// One refracting surface of a model eye.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct EyeSurface {
    /// Radius of curvature, metres (positive: centre behind).
    pub radius_m: f64,
    /// Index after the surface.
    pub index_after: f64,
    /// Distance to the next surface (the last: to the retina), metres.
    pub distance_m: f64,
}

/// Axial length (cornea to retina) of a surface table, metres.
pub fn axial_length(surfaces: &[EyeSurface]) -> f64 {
    surfaces.iter().map(|s| s.distance_m).sum()
}

/// Set the axial length by changing the last distance (the vitreous chamber).
pub fn with_axial_length(surfaces: &mut [EyeSurface], axial_m: f64) {
    let before: f64 = surfaces[..surfaces.len() - 1]
        .iter()
        .map(|s| s.distance_m)
        .sum();
    if let Some(last) = surfaces.last_mut() {
        last.distance_m = axial_m - before;
    }
}

/// The surfaces as system elements, without the final distance to the retina.
pub fn elements(surfaces: &[EyeSurface]) -> Vec<Element> {
    let mut out = Vec::new();
    for (i, s) in surfaces.iter().enumerate() {
        out.push(Element::Surface {
            radius_m: s.radius_m,
            index_after: s.index_after,
        });
        if i + 1 < surfaces.len() {
            out.push(Element::Gap {
                length_m: s.distance_m,
                index: s.index_after,
            });
        }
    }
    out
}

/// What a model eye computes.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct EyeResult {
    /// Equivalent power of the whole eye, D.
    pub power: f64,
    /// Cardinal points from the corneal vertex, metres.
    pub cardinal: Option<CardinalPoints>,
    /// Second focal point from the corneal vertex, metres.
    pub back_focal_from_cornea: Option<f64>,
    /// Ocular refraction at the cornea implied by the axial length, D.
    pub ocular_refraction: f64,
}

/// Evaluate a surface table. Ocular refraction: with `[[A, B], [C, D]]` the
/// matrix from the front of the cornea to the retina (object space index 1),
/// the far-point vergence at the cornea is `K = A/B` (the ocular refraction): a
/// myopic (too long) eye gives a negative value.
pub fn evaluate(surfaces: &[EyeSurface]) -> EyeResult {
    let els = elements(surfaces);
    let m = system_matrix(&els);
    let n_img = surfaces.last().map_or(1.0, |s| s.index_after);
    let cardinal = cardinal_points(&m, 1.0, n_img);
    let inner: f64 = surfaces[..surfaces.len().saturating_sub(1)]
        .iter()
        .map(|s| s.distance_m)
        .sum();
    let to_retina = surfaces.last().map_or(0.0, |s| s.distance_m);
    let full = m.then(&crate::system::Matrix2::transfer(to_retina, n_img));
    // A ray from the far point reaches the cornea at height y with reduced angle
    // n·u = −K·y (K the far-point vergence); on the retina A·y − B·K·y = 0.
    let k = full.a / full.b;
    EyeResult {
        power: system_powers(&m).equivalent,
        cardinal,
        back_focal_from_cornea: cardinal.map(|c| inner + c.back_focal),
        ocular_refraction: k,
    }
}

/// The iris of Gullstrand's exact eye and of Le Grand's full theoretical eye lies
/// at the front of the crystalline lens: surface index 2 of their tables.
pub const IRIS_AT_LENS_FRONT: usize = 2;

/// Entrance pupil of a surface table whose aperture stop (the iris) lies at the
/// vertex of surface `stop`: the image of the stop formed by the surfaces before
/// it, seen from the front. Traced backwards by paraxial vergences (a surface has
/// the same power `(n' − n)/r` for light in either direction): from the stop, the
/// reduced vergence `L = n/l` meets each surface, `L' = L + F`, and crosses each
/// gap, `L ← L'/(1 − (d/n)·L')`. Returns the distance of the entrance pupil
/// behind the corneal vertex (metres) and its magnification (product of `L/L'`),
/// or `None` when `stop` is 0 or beyond the table or the image is at infinity.
pub fn entrance_pupil(surfaces: &[EyeSurface], stop: usize) -> Option<(f64, f64)> {
    if stop == 0 || stop >= surfaces.len() {
        return None;
    }
    let index_before = |j: usize| {
        if j == 0 {
            1.0
        } else {
            surfaces[j - 1].index_after
        }
    };
    // Backwards the positive direction is toward the front: the stop lies
    // `distance_m` behind surface stop − 1, i.e. at l = −d.
    let last = &surfaces[stop - 1];
    let mut l_vergence = last.index_after / -last.distance_m;
    let mut magnification = 1.0;
    for j in (0..stop).rev() {
        let s = &surfaces[j];
        let power = (s.index_after - index_before(j)) / s.radius_m;
        let after = l_vergence + power;
        magnification *= l_vergence / after;
        if j == 0 {
            if after.abs() < 1e-12 {
                return None;
            }
            // Image distance 1/L' in air, positive toward the front.
            return Some((-1.0 / after, magnification));
        }
        let d = surfaces[j - 1].distance_m;
        let n = index_before(j);
        l_vergence = after / (1.0 - d / n * after);
    }
    None
}

/// Spectacle refraction at vertex distance `d` for ocular refraction `k`:
/// `Fs = K/(1 + d·K)`.
pub fn spectacle_refraction(k: f64, vertex_m: f64) -> f64 {
    k / (1.0 + vertex_m * k)
}
