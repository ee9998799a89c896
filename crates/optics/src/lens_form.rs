//! Lens form: surface sags by the exact formula, centre and edge thickness of a
//! spectacle lens, and spectacle magnification (shape and power factors).
//!
//! Lengths in metres; a surface's radius is positive when its centre lies to the
//! right (behind the lens), so a convex front has `r > 0` and a concave back
//! `r > 0` too.

/// Signed sag of a spherical surface of radius `radius_m` over semi-aperture `y_m`:
/// `s = r − sign(r)·√(r² − y²)` (zero for a plane). `None` when `|y| > |r|`.
pub fn sag(radius_m: f64, y_m: f64) -> Option<f64> {
    if !radius_m.is_finite() {
        return Some(0.0);
    }
    let d = radius_m * radius_m - y_m * y_m;
    if d < 0.0 {
        return None;
    }
    Some(radius_m - radius_m.signum() * d.sqrt())
}

/// Radius of a surface of power `power` (D) between air and index `index`
/// (front: light enters the material), metres: `r = (n − 1)/F`.
pub fn front_radius(power: f64, index: f64) -> f64 {
    (index - 1.0) / power
}

/// Radius of a back surface of power `power` (material to air): `r = (1 − n)/F`.
pub fn back_radius(power: f64, index: f64) -> f64 {
    (1.0 - index) / power
}

/// Edge thickness from the centre thickness: `e = t + s_back − s_front` (signed sags).
pub fn edge_from_centre(centre_m: f64, front_r: f64, back_r: f64, y_m: f64) -> Option<f64> {
    Some(centre_m + sag(back_r, y_m)? - sag(front_r, y_m)?)
}

/// Back surface power for back vertex power `bvp` with front surface `f1`,
/// centre thickness `t` and index `n`: `F2 = Fv − F1/(1 − (t/n)F1)`.
pub fn back_surface_power(bvp: f64, f1: f64, t_m: f64, index: f64) -> f64 {
    bvp - f1 / (1.0 - t_m / index * f1)
}

/// Thickness of a lens in one meridian.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Thickness {
    /// Centre thickness, metres.
    pub centre: f64,
    /// Edge thickness at the given semi-aperture, metres.
    pub edge: f64,
    /// Back surface power used, D.
    pub back_power: f64,
}

/// Centre and edge thickness of a lens of back vertex power `bvp` in one
/// meridian, front surface `f1`, index `n`, semi-aperture `y`. A lens whose edge
/// would be thicker than its centre (minus) keeps `min_centre`; otherwise (plus)
/// the centre is found so that the edge is `min_edge`. The back surface is solved
/// exactly for the thickness found (a short fixed-point iteration: it converges in
/// a few steps because thickness changes the back surface by well under 1%).
pub fn thickness(
    bvp: f64,
    f1: f64,
    index: f64,
    y_m: f64,
    min_centre: f64,
    min_edge: f64,
) -> Option<Thickness> {
    let mut t = min_centre;
    for _ in 0..50 {
        let f2 = back_surface_power(bvp, f1, t, index);
        let (r1, r2) = (front_radius(f1, index), back_radius(f2, index));
        let e = edge_from_centre(t, r1, r2, y_m)?;
        let done = Thickness {
            centre: t,
            edge: e,
            back_power: f2,
        };
        if e >= min_edge - 1e-12 && t <= min_centre + 1e-12 {
            return Some(done);
        }
        let next = (t + min_edge - e).max(min_centre);
        if (next - t).abs() < 1e-10 {
            return Some(done);
        }
        t = next;
    }
    None
}

/// Typical minimum thickness for a material of index `index`, metres:
/// `(minus-lens centre, plus-lens edge)`: centre 2.0 mm for CR-39 (n < 1.55),
/// 1.5 mm for higher index; edge 1.0 mm (common practice, no source).
pub fn material_minimums(index: f64) -> (f64, f64) {
    if index < 1.55 {
        (0.002, 0.001)
    } else {
        (0.0015, 0.001)
    }
}

/// Spectacle magnification `SM = 1/(1 − (t/n)F1) · 1/(1 − h·Fv)` with `h` the
/// distance from the back vertex to the entrance pupil (Fannin & Grosvenor,
/// Clinical Optics). Returns `(shape, power, total)`.
pub fn spectacle_magnification(
    f1: f64,
    t_m: f64,
    index: f64,
    bvp: f64,
    h_m: f64,
) -> (f64, f64, f64) {
    let shape = 1.0 / (1.0 - t_m / index * f1);
    let power = 1.0 / (1.0 - h_m * bvp);
    (shape, power, shape * power)
}

/// Relative spectacle magnification in axial ametropia: the retinal image with a
/// thin correcting lens of power `lens` (D) at `d_m` metres before the eye's first
/// principal point, relative to the image of the standard emmetropic eye of the
/// same power `eye_power` (D): `RSM = F_e / (F_e + F_s − d·F_s·F_e)`. Knapp's law:
/// with the lens at the eye's anterior focal point (`d = 1/F_e`) the system's
/// equivalent power is `F_e` again and `RSM = 1` for every lens.
pub fn relative_spectacle_magnification_axial(eye_power: f64, lens: f64, d_m: f64) -> f64 {
    eye_power / (eye_power + lens - d_m * lens * eye_power)
}

/// Distance from the spectacle vertex to the entrance pupil: vertex distance
/// plus about 3 mm (Fannin & Grosvenor), metres.
pub fn entrance_pupil_distance(vertex_m: f64) -> f64 {
    vertex_m + 0.003
}

/// A spectacle lens material of the common-practice table [`MATERIALS`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Material {
    /// The name the table shows.
    pub name: &'static str,
    /// Spellings accepted, lower case, letters, digits and `.` only.
    pub spellings: &'static [&'static str],
    /// Refractive index (helium d line), as catalogues quote it.
    pub index: f64,
    /// Usual minimum centre thickness of a minus lens, metres.
    pub min_centre: f64,
    /// Usual minimum edge thickness of a plus lens, metres.
    pub min_edge: f64,
}

/// Common spectacle lens materials: indices as lens catalogues quote them and the
/// minimum thicknesses laboratories usually work to (common practice, no single
/// source; CR-39 2.0 mm and polycarbonate 1.0 mm minus centres are the figures
/// usually quoted for impact resistance, crown glass 2.2 mm for a tempered lens).
pub const MATERIALS: &[Material] = &[
    Material {
        name: "CR-39",
        spellings: &["cr39", "cr-39", "adc"],
        index: 1.498,
        min_centre: 0.002,
        min_edge: 0.001,
    },
    Material {
        name: "crown glass",
        spellings: &["crownglass", "crown", "glass"],
        index: 1.523,
        min_centre: 0.0022,
        min_edge: 0.001,
    },
    Material {
        name: "polycarbonate",
        spellings: &["polycarbonate", "pc"],
        index: 1.586,
        min_centre: 0.001,
        min_edge: 0.001,
    },
    Material {
        name: "1.60 plastic",
        spellings: &["1.60", "1.6", "1.60plastic", "1.6plastic"],
        index: 1.6,
        min_centre: 0.0015,
        min_edge: 0.001,
    },
    Material {
        name: "1.67 plastic",
        spellings: &["1.67", "1.67plastic"],
        index: 1.67,
        min_centre: 0.0015,
        min_edge: 0.001,
    },
    Material {
        name: "1.74 plastic",
        spellings: &["1.74", "1.74plastic"],
        index: 1.74,
        min_centre: 0.0015,
        min_edge: 0.001,
    },
];

/// The material of [`MATERIALS`] that `name` spells (case, spaces and `-` ignored).
pub fn material(name: &str) -> Option<&'static Material> {
    let key: String = name
        .chars()
        .filter(|c| c.is_alphanumeric() || *c == '.')
        .flat_map(char::to_lowercase)
        .collect();
    MATERIALS
        .iter()
        .find(|m| m.spellings.iter().any(|s| s.replace('-', "") == key))
}

/// Decentration of a lens's optical centre from the boxed centre of its frame
/// shape, metres: horizontally `(A + DBL − centre distance)/2` (inward positive)
/// and vertically `OC height − B/2`; the total is their vector sum.
pub fn decentration(
    boxed_width_m: f64,
    distance_between_lenses_m: f64,
    centre_distance_m: f64,
    vertical_m: f64,
) -> f64 {
    ((boxed_width_m + distance_between_lenses_m - centre_distance_m) / 2.0).hypot(vertical_m)
}

/// Minimum blank size for an edged lens: effective diameter plus twice the
/// decentration (`MBS = ED + 2·dec`; common practice, no source; laboratories
/// often add about 2 mm for edging). Metres.
pub fn minimum_blank(effective_diameter_m: f64, decentration_m: f64) -> f64 {
    effective_diameter_m + 2.0 * decentration_m
}

/// Distance from the optical centre to the farthest point of the edged lens,
/// at most half the effective diameter plus the decentration (the bound is
/// reached when the farthest point of the shape lies in the direction of the
/// decentration). Metres.
pub fn farthest_point(effective_diameter_m: f64, decentration_m: f64) -> f64 {
    effective_diameter_m / 2.0 + decentration_m
}
