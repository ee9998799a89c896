//! Keratometric power, true corneal power and corneal astigmatism.

#[macro_use]
mod common;

use parax_optics::keratometry::{
    classify_astigmatism, corneal_astigmatism, keratometric_power, keratometric_radius,
    surface_power, thick_lens_power, total_corneal_power, AstigmatismKind, CornealIndices,
    KReading, KERATOMETRIC_INDEX,
};

#[test]
fn keratometric_index_reads_45_at_7_50() {
    // [S] Shammas et al., Am J Ophthalmol 2003;136:426: 7.50 mm -> 45.000 D with n 1.3375; tol 1e-9
    assert_close!(keratometric_power(0.0075, KERATOMETRIC_INDEX), 45.0, 1e-9);
    // [C] CAPABILITIES §3, K = 337.5/7.80 = 43.269 D; tol 1e-3
    assert_close!(keratometric_power(0.0078, KERATOMETRIC_INDEX), 43.269, 1e-3);
    // [C] inverse of K = 0.3375/r; tol 1e-12 m
    assert_close!(keratometric_radius(45.0, KERATOMETRIC_INDEX), 0.0075, 1e-12);
}

#[test]
fn k_pair_with_the_rule() {
    let a = KReading {
        power: keratometric_power(0.0078, KERATOMETRIC_INDEX),
        meridian: 180.0,
    };
    let b = KReading {
        power: keratometric_power(0.0076, KERATOMETRIC_INDEX),
        meridian: 90.0,
    };
    // [C] CAPABILITIES §3, 7.80 @180 -> 43.27; tol 5e-3
    assert_close!(a.power, 43.27, 5e-3);
    // [C] CAPABILITIES §3, 7.60 @90 -> 44.41; tol 5e-3
    assert_close!(b.power, 44.41, 5e-3);
    let ast = corneal_astigmatism(b, a);
    // [C] CAPABILITIES §3, corneal cyl 1.14 D (minus form -1.14); tol 5e-3
    assert_close!(ast.cylinder, -1.14, 5e-3);
    assert_eq!(ast.axis, 180.0);
    assert_eq!(ast.kind, AstigmatismKind::WithTheRule);
    assert_eq!(ast.flat.meridian, 180.0);
    assert_eq!(ast.steep.meridian, 90.0);
    // [C] mean K = (43.269 + 44.408)/2 = 43.839; tol 1e-3
    assert_close!(ast.mean_k, 43.839, 1e-3);
}

#[test]
fn astigmatism_classes() {
    let k = |power, meridian| KReading { power, meridian };
    // [CP] CAPABILITIES §3, steep near horizontal -> minus-cyl axis 90 -> against the rule
    let atr = corneal_astigmatism(k(44.0, 0.0), k(43.0, 90.0));
    assert_eq!(atr.kind, AstigmatismKind::AgainstTheRule);
    assert_eq!(atr.axis, 90.0);
    assert_eq!(atr.steep.meridian, 180.0);
    // [CP] CAPABILITIES §3, axis 45 -> oblique
    assert_eq!(
        corneal_astigmatism(k(43.0, 45.0), k(44.0, 135.0)).kind,
        AstigmatismKind::Oblique
    );
    // [CP] no cylinder -> None, axis written 180
    let none = corneal_astigmatism(k(43.5, 10.0), k(43.5, 100.0));
    assert_eq!(none.kind, AstigmatismKind::None);
    assert_eq!(none.cylinder, 0.0);
    assert_eq!(none.axis, 180.0);
    // [CP] CAPABILITIES §3, ±30° bands (inclusive)
    assert_eq!(
        classify_astigmatism(-1.0, 30.0),
        AstigmatismKind::WithTheRule
    );
    assert_eq!(
        classify_astigmatism(-1.0, 150.0),
        AstigmatismKind::WithTheRule
    );
    assert_eq!(classify_astigmatism(-1.0, 31.0), AstigmatismKind::Oblique);
    assert_eq!(
        classify_astigmatism(-1.0, 60.0),
        AstigmatismKind::AgainstTheRule
    );
    assert_eq!(
        classify_astigmatism(-1.0, 120.0),
        AstigmatismKind::AgainstTheRule
    );
    assert_eq!(classify_astigmatism(-1.0, 121.0), AstigmatismKind::Oblique);
}

#[test]
fn gullstrand_cornea_surfaces_and_total() {
    let t = total_corneal_power(0.0077, 0.0068, 0.0005, CornealIndices::GULLSTRAND);
    // [S] Gullstrand exact eye, Atchison & Smith, Optics of the Human Eye (2000): front +48.831 D; tol 1e-3
    assert_close!(t.front, 48.831, 1e-3);
    // [S] same source: back -5.882 D; tol 1e-3
    assert_close!(t.back, -5.882, 1e-3);
    // [S] same source: total corneal power 43.053 D; tol 1e-3
    assert_close!(t.total, 43.053, 1e-3);
    // [C] CAPABILITIES §3, surface power (n2-n1)/r; tol 1e-3
    assert_close!(surface_power(1.0, 1.376, 0.0077), 48.831, 1e-3);
}

#[test]
fn le_grand_cornea_total() {
    let t = total_corneal_power(0.0078, 0.0065, 0.00055, CornealIndices::LE_GRAND);
    // [S] Le Grand full theoretical eye, Atchison & Smith (2000) table: cornea 42.356 D; tol 1e-3
    assert_close!(t.total, 42.356, 1e-3);
}

#[test]
fn tang_true_power_vs_keratometric() {
    let t = total_corneal_power(0.0078, 0.0065, 0.00055, CornealIndices::GULLSTRAND);
    let k = keratometric_power(0.0078, KERATOMETRIC_INDEX);
    // [C] CAPABILITIES §3, cornea 7.8/6.5 mm, t 0.55 mm, 1.376/1.336 -> 42.170 D; tol 1e-3
    assert_close!(t.total, 42.170, 1e-3);
    // [C] CAPABILITIES §3, K overestimates by 43.269 - 42.170 = 1.099 D; tol 1e-3
    assert_close!(k - t.total, 1.099, 1e-3);
    // [S] Tang et al., JCRS 2006;32:1843: published mean overestimate 1.13 D; tol 0.05
    assert_close!(k - t.total, 1.13, 0.05);
}

#[test]
fn gullstrand_equation() {
    // [C] CAPABILITIES §4, F = F1 + F2 - (t/n)F1F2: +8, -2, 6 mm, 1.5 -> 6.0640; tol 1e-4
    assert_close!(thick_lens_power(8.0, -2.0, 0.006, 1.5), 6.0640, 1e-4);
    // [C] thin limit t = 0 -> F1 + F2; tol 1e-12
    assert_close!(thick_lens_power(8.0, -2.0, 0.0, 1.5), 6.0, 1e-12);
}
