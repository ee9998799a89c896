//! Differences between two versions of a derived value (used by `parax diff`),
//! checked against values worked by hand from published formulas.

use parax_eval::{DerivedValue as V, Difference as D};

fn close(a: f64, b: f64, tol: f64) {
    assert!((a - b).abs() <= tol, "{a} vs {b} (tol {tol})");
}

#[test]
fn sphcyl_difference_is_the_power_vector_difference() {
    // [C] Thibos, Wheeler & Horner, Optom Vis Sci 1997: M = S + C/2,
    // J0 = −(C/2)cos2θ, J45 = −(C/2)sin2θ. Old −2.00/−1.00×180: (−2.5, +0.5, 0);
    // new −2.00/−1.00×90: (−2.5, −0.5, 0); new − old = (0, −1, 0), i.e.
    // J = 1, C = −2, S = M + J = +1, θ = ½·atan2(0, −1) = 90°. Tolerance 1e-9.
    let old = V::SphCyl {
        sphere: -2.0,
        cylinder: -1.0,
        axis: 180.0,
    };
    let new = V::SphCyl {
        sphere: -2.0,
        cylinder: -1.0,
        axis: 90.0,
    };
    match V::difference(&old, &new) {
        Some(D::SphCyl {
            sphere,
            cylinder,
            axis,
        }) => {
            close(sphere, 1.0, 1e-9);
            close(cylinder, -2.0, 1e-9);
            close(axis, 90.0, 1e-9);
        }
        d => panic!("{d:?}"),
    }
    assert_eq!(
        V::difference(&old, &new).unwrap().display(),
        "+1.00 / -2.00 x 90"
    );
}

#[test]
fn scalar_differences_and_kind_changes() {
    // [CP] plain subtraction new − old.
    let d = V::difference(&V::Power { dioptres: -6.5 }, &V::Power { dioptres: -6.75 });
    assert_eq!(d, Some(D::Dioptres { dioptres: -0.25 }));
    assert_eq!(d.unwrap().display(), "-0.25 D");
    let a = V::Distance {
        metres: 0.1,
        from: "L2".into(),
    };
    let b = V::Distance {
        metres: 0.12,
        from: "L2".into(),
    };
    match V::difference(&a, &b) {
        Some(D::Metres { metres }) => close(metres, 0.02, 1e-12),
        d => panic!("{d:?}"),
    }
    let c = V::Distance {
        metres: 0.12,
        from: "L3".into(),
    };
    assert_eq!(V::difference(&a, &c), None, "different reference point");
    assert_eq!(V::difference(&V::Infinity, &a), None);
}
