//! Published sources and practice rules behind every derived value, with the
//! provenance tag of CAPABILITIES: S read in the source, C computed from the
//! formula, M from memory (to be confirmed), CP common practice.

use crate::derived::Source;

macro_rules! source {
    ($name:ident, $tag:literal, $citation:literal) => {
        #[doc = $citation]
        pub const $name: &Source = &Source {
            citation: $citation,
            tag: $tag,
        };
    };
}

source!(
    THIBOS_1997,
    "S",
    "Thibos, Wheeler & Horner, Power vectors, Optom Vis Sci 1997;74:367-375"
);
source!(POWER_MATRIX, "M", "dioptric power matrix: Long, Am J Optom Physiol Opt 1976; Keating, Am J Optom Physiol Opt 1981");
source!(VERGENCE, "M", "thin-lens vergence relations, e.g. Keating, Geometric, Physical, and Visual Optics, 2nd ed. 2002");
source!(
    ROUNDING,
    "CP",
    "rounding to the nearest 0.25 D step (common practice, no source)"
);
source!(
    ROUNDING_ORDER,
    "CP",
    "rounding to the nearest 0.25 D step, the axis to the nearest whole degree as orders are written (common practice, no source)"
);
source!(ENTRANCE_PUPIL, "C", "entrance pupil: the iris (at the front of the crystalline lens in Gullstrand's exact and Le Grand's full eye) imaged by the cornea, paraxial vergences through the published surface tables (Atchison & Smith, Optics of the Human Eye, 2000); about 3.04 mm behind the cornea, check values computed");
source!(RELATIVE_SPECTACLE_MAGNIFICATION, "C", "relative spectacle magnification in axial ametropia, RSM = F_e/(F_e + F_s − d·F_s·F_e): the eye's power over the equivalent power of lens and eye by Gullstrand's equation, d from the eye's first principal point; Knapp's law: a lens at the eye's anterior focal point gives RSM 1");
source!(
    KERATOMETRIC,
    "S",
    "keratometric index 1.3375, K = 337.5 / r(mm): Shammas et al., Am J Ophthalmol 2003;136:426"
);
source!(ASTIGMATISM_BANDS, "CP", "with-the-rule: minus-cylinder axis 180 ± 30; against-the-rule: 90 ± 30; oblique otherwise (common practice, no source)");
source!(GULLSTRAND_THICK, "S", "Gullstrand's equation F = F1 + F2 - (t/n)F1F2, indices of Gullstrand's exact eye: Atchison & Smith, Optics of the Human Eye, 2000");
source!(TANG_2006, "S", "keratometric overestimate of total corneal power: Tang et al., J Cataract Refract Surg 2006;32:1843");
source!(MATRICES, "M", "paraxial ray-transfer matrices on (y, n·u): Gerrard & Burch, Introduction to Matrix Methods in Optics, 1975");

/// Caution attached to keratometry when refractive surgery is recorded.
pub const CAUTION_REFRACTIVE_SURGERY: &str = "After corneal refractive surgery the keratometric index no longer \
holds: K misstates true corneal power (Hamed et al. 2002; Tang et al. 2006; Shammas et al. 2003). Do not use \
it for IOL or contact lens calculations without a validated adjustment; verify clinically.";

/// Caution attached to vertex-compensated powers.
pub const CAUTION_VERTEX: &str =
    "Vertex-compensated powers depend on the vertex distance as actually \
fitted; verify it clinically before ordering.";

source!(MARTIN, "S", "Martin's formula for tilted spherical lenses, S' = S(1 + sin²a/2n), C = S'·tan²a: Brooks & Borish, System for Ophthalmic Dispensing");
source!(TILT_MATRIX, "C", "tilted thin spherocylinders: Martin's formula (Brooks & Borish) applied about the oblique axis of the one rotation equal to face form then pantoscopic tilt, F_t = (1 + sin²γ/2n)·A⁻ᵀ·F·A⁻¹; verified against real rays traced through the tilted lens (equal up to Martin's O(sin⁴γ) remainder, about 0.0015 D for 5.50 D at 10°/5°); the published spherocylinder forms (Harris, Optom Vis Sci 2002; Keating, Optom Vis Sci 1995) are cited from memory and not yet compared");
source!(OC_DROP, "CP", "lower the optical centre about 0.5 mm per degree of pantoscopic tilt (common practice, no source)");
source!(PRENTICE, "S", "Prentice's rule P = c·F, vector form with the dioptric power matrix: Keating, Geometric, Physical, and Visual Optics, 2nd ed. 2002");
source!(PRISM_TOLERANCE, "CP", "about 1Δ vertical and 3Δ horizontal before symptoms; slab-off worth considering above about 1.5Δ vertical at the reading point (Optician CPD article; common practice)");
source!(SAG, "S", "exact sag s = r − √(r² − y²), edge = centre + s_back − s_front: J. Loomis, University of Dayton, \"Sags and Edge Thickness\"");
source!(BLANK_SIZE, "CP", "decentration from the boxed centre (boxed system, ISO 13666 terms) and minimum blank size = effective diameter + 2 × decentration (common practice, no source)");
source!(MATERIAL_TABLE, "CP", "indices and minimum thicknesses of common lens materials as catalogues and laboratories quote them (common practice, no single source)");
source!(MOUNTED_PAIR, "S", "ANSI Z80.1-2015, mounted pair: vertical imbalance 0.33Δ up to 3.375 D, horizontal 0.67Δ up to 2.75 D; above 2.75 D the centre distance within ±2.5 mm of the specified PD (quick reference guide of the standard)");
source!(CONTACT_ORDER, "CP", "ordered power compared meridian by meridian with the computed power (power matrices); a difference of one 0.25 D step flagged (common practice)");
source!(OC_HEIGHT, "CP", "optical centre set below the pupil by the optical-centre drop for the tilt, 0.5 mm per degree (common practice, no source)");
source!(MATERIAL_MINIMUMS, "CP", "minimum thickness: minus centre 2.0 mm (CR-39) or 1.5 mm (high index), plus edge 1.0 mm (common practice, no source)");
source!(SPECTACLE_MAGNIFICATION, "S", "spectacle magnification = shape factor × power factor, entrance pupil about 3 mm behind the cornea: Fannin & Grosvenor, Clinical Optics");
source!(ANISEIKONIA, "CP", "aniseikonia estimated as the ratio of the two spectacle magnifications; about 1% per dioptre (common practice)");
source!(
    ANSI_Z80_1_2015,
    "S",
    "ANSI Z80.1-2015, Prescription Spectacle Lenses, tolerance tables (quick reference guide)"
);
source!(CONTACT_RULES, "CP", "soft toric from about 0.75 D of cylinder; rigid tear lens ≈ K(base curve) − flat K with K = 337.5/r; spherical rigid lens fine below about 0.75 D residual (common practice)");
source!(HOFSTETTER, "S", "Hofstetter, amplitude of accommodation by age: minimum 15 − 0.25·age, mean 18.5 − 0.30·age, maximum 25 − 0.40·age (1950)");
source!(HALF_RESERVE, "CP", "keep half the amplitude of accommodation in reserve: add = 1/working distance − A/2 (rule of thumb, common practice)");
source!(SCHEMATIC_EYES, "S", "schematic eyes: Atchison & Smith, Optics of the Human Eye (2000), appendix tables; Le Grand & El Hage, Physiological Optics (1980); Emsley reduced eye [M]");

/// Caution attached to tilt compensation and ordering values.
pub const CAUTION_ORDER: &str = "Values to order are aids computed from the recorded fitting; \
verify the fitting and the prescription clinically. Prescribing belongs to a licensed practitioner under local rules.";

/// Caution attached to contact lens suggestions.
pub const CAUTION_CONTACT: &str = "Contact lens powers here are starting points only: fit, \
over-refraction and follow-up belong to a licensed practitioner under local rules.";

/// Caution attached to model-eye refraction.
pub const CAUTION_MODEL: &str = "A schematic eye is a model, not the patient: refraction \
predicted from axial length is an estimate for study, not a prescription.";

source!(SRKT, "S", "SRK/T: Retzlaff, Sanders & Kraff, J Cataract Refract Surg 1990;16:333-340 (erratum p. 528); equations read as restated in full in an A-scan biometer operator's manual (every constant and the target-refraction signs as implemented), the 1990 paper itself not read");
source!(IOL_VERGENCE, "M", "thin-lens vergence IOL formula P = n/(AL − ELP) − n/(n/(K + Z) − ELP), Z = R/(1 − V·R), n 1.336");

/// Caution attached to every intraocular lens value.
pub const CAUTION_IOL: &str = "IOL power is for licensed surgical practice only: biometry, lens \
constants and the choice of lens belong to the surgeon, with measured biometry and optimised constants. \
Not valid after corneal refractive surgery without a validated adjustment.";
