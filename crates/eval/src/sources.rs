//! Published sources and practice rules behind every derived value, with the
//! provenance tag of CAPABILITIES: S read in the source, C computed from the
//! formula, M from memory (to be confirmed), CP common practice.

use crate::derived::Source;

macro_rules! source {
    ($name:ident, $tag:literal, $citation:literal) => {
        #[doc = $citation]
        pub const $name: Source = Source {
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
