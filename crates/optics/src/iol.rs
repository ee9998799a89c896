//! Intraocular lens power: the thin-lens vergence formula with an effective lens
//! position, and SRK/T (Retzlaff, Sanders & Kraff, J Cataract Refract Surg
//! 1990;16:333-340; erratum p. 528). Lengths in millimetres here, as biometry is
//! written. These are aids: biometry, constants and the choice of lens belong to
//! the surgeon, and neither formula is valid after corneal refractive surgery
//! without adjustment.

/// Aqueous and vitreous index of both formulas.
pub const N_AQUEOUS: f64 = 1.336;

/// Thin-lens vergence formula: `P = n/(AL − ELP) − n/(n/(K + Z) − ELP)` with
/// `Z = R/(1 − V·R)`; AL and ELP in mm, K in D, target refraction `r` at vertex
/// `v_mm`.
pub fn vergence_power(al_mm: f64, k: f64, elp_mm: f64, target: f64, v_mm: f64) -> f64 {
    let n = N_AQUEOUS;
    let z = target / (1.0 - v_mm / 1000.0 * target);
    n / ((al_mm - elp_mm) / 1000.0) - n / (n / (k + z) - elp_mm / 1000.0)
}

/// Intermediate values of SRK/T.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SrkT {
    /// Corneal radius `337.5/K`, mm.
    pub r: f64,
    /// Optical axial length `L + RETHICK`, mm.
    pub lopt: f64,
    /// Estimated postoperative anterior chamber depth, mm.
    pub acd: f64,
    /// The corneal height `H = r − √(r² − W²/4)` is defined: the computed corneal
    /// width `W` is at most twice the radius. When it is not (long eyes with steep
    /// corneas) the published equations give no value; this crate then takes
    /// `H = r` (the root set to zero) and the caller must say so.
    pub corneal_height_defined: bool,
}

/// SRK/T's intermediate values from axial length `l` (mm), K (D) and A constant:
/// `LCOR = L` up to 24.2 mm, else `−3.446 + 1.716L − 0.0237L²`;
/// `W = −5.41 + 0.58412·LCOR + 0.098K`; `H = r − √(r² − W²/4)`;
/// `ACD = H + (0.62467A − 68.747) − 3.336`; `LOPT = L + 0.65696 − 0.02029L`.
pub fn srkt_geometry(l: f64, k: f64, a: f64) -> SrkT {
    let lcor = if l <= 24.2 {
        l
    } else {
        -3.446 + 1.716 * l - 0.0237 * l * l
    };
    let cw = -5.41 + 0.58412 * lcor + 0.098 * k;
    let r = 337.5 / k;
    let x = r * r - cw * cw / 4.0;
    let h = r - x.max(0.0).sqrt();
    let offset = (0.62467 * a - 68.747) - 3.336;
    let rethick = 0.65696 - 0.02029 * l;
    SrkT {
        r,
        lopt: l + rethick,
        acd: h + offset,
        corneal_height_defined: x >= 0.0,
    }
}

const NC_MINUS_1: f64 = 0.333;
/// SRK/T's vertex distance, mm.
pub const SRKT_VERTEX_MM: f64 = 12.0;

/// SRK/T lens power for target refraction `target` (D at 12 mm). The target terms
/// carry minus signs: a myopic target raises the power.
pub fn srkt_power(l: f64, k: f64, a: f64, target: f64) -> f64 {
    let g = srkt_geometry(l, k, a);
    let (na, v) = (N_AQUEOUS, SRKT_VERTEX_MM);
    let num = na * g.r - NC_MINUS_1 * g.lopt;
    let den = na * g.r - NC_MINUS_1 * g.acd;
    1000.0 * na * (num - 0.001 * target * (v * num + g.lopt * g.r))
        / ((g.lopt - g.acd) * (den - 0.001 * target * (v * den + g.acd * g.r)))
}

/// SRK/T predicted refraction (D at 12 mm) for a lens of power `p`.
pub fn srkt_refraction(l: f64, k: f64, a: f64, p: f64) -> f64 {
    let g = srkt_geometry(l, k, a);
    let (na, v) = (N_AQUEOUS, SRKT_VERTEX_MM);
    let num = na * g.r - NC_MINUS_1 * g.lopt;
    let den = na * g.r - NC_MINUS_1 * g.acd;
    (1000.0 * na * num - p * (g.lopt - g.acd) * den)
        / (na * (v * num + g.lopt * g.r) - 0.001 * p * (g.lopt - g.acd) * (v * den + g.acd * g.r))
}
