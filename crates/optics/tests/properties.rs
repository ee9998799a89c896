//! Property tests: algebraic identities that must hold for any input.

#[macro_use]
mod common;

use common::axis_diff;
use parax_optics::refraction::SphCyl;
use parax_optics::system::{system_matrix, Element};
use parax_optics::vertex::{effective_power, transfer_sphcyl};
use proptest::prelude::*;

fn sphcyl() -> impl Strategy<Value = SphCyl> {
    (-20.0f64..20.0, -8.0f64..8.0, 0.0f64..360.0).prop_map(|(s, c, a)| SphCyl::new(s, c, a))
}

fn element() -> impl Strategy<Value = Element> {
    prop_oneof![
        (-60.0f64..60.0).prop_map(|power| Element::ThinLens { power }),
        (0.0f64..0.2, 1.0f64..1.8).prop_map(|(length_m, index)| Element::Gap { length_m, index }),
        (prop_oneof![-0.05f64..-0.003, 0.003f64..0.05], 1.0f64..1.8).prop_map(
            |(radius_m, index_after)| Element::Surface {
                radius_m,
                index_after
            }
        ),
    ]
}

proptest! {
    #[test]
    fn transposition_is_an_involution(rx in sphcyl()) {
        let (a, b) = (rx.power_vector(), rx.transposed().power_vector());
        // [C] CAPABILITIES §1, transposed forms are the same lens: identical power vectors; tol 1e-9
        assert_close!(a.m, b.m, 1e-9);
        assert_close!(a.j0, b.j0, 1e-9);
        assert_close!(a.j45, b.j45, 1e-9);
        let back = rx.transposed().transposed();
        // [C] CAPABILITIES §1, transposing twice restores S, C and θ (mod 180); tol 1e-9
        assert_close!(back.sphere, rx.sphere, 1e-9);
        assert_close!(back.cylinder, rx.cylinder, 1e-9);
        prop_assert!(axis_diff(back.axis, rx.axis) < 1e-9);
    }

    #[test]
    fn power_vector_round_trip(rx in sphcyl()) {
        prop_assume!(rx.cylinder.abs() > 0.01);
        let back = rx.power_vector().to_sphcyl();
        let want = rx.minus_cyl();
        // [C] CAPABILITIES §1, inverse formulas recover the minus-cyl form; tol 1e-9
        assert_close!(back.sphere, want.sphere, 1e-9);
        assert_close!(back.cylinder, want.cylinder, 1e-9);
        prop_assert!(axis_diff(back.axis, want.axis) < 1e-6);
        prop_assert!(back.axis > 0.0 && back.axis <= 180.0);
    }

    #[test]
    fn meridian_power_matches_principal_meridians(rx in sphcyl()) {
        for m in rx.principal_meridians() {
            // [C] CAPABILITIES §1, F(φ) = S + C sin²(φ-θ) at the principal meridians; tol 1e-9
            assert_close!(rx.meridian_power(m.meridian), m.power, 1e-9);
        }
    }

    #[test]
    fn combine_is_commutative(a in sphcyl(), b in sphcyl()) {
        let (x, y) = (a.combine(&b).power_vector(), b.combine(&a).power_vector());
        // [C] CAPABILITIES §1, power-vector addition commutes; tol 1e-9
        assert_close!(x.m, y.m, 1e-9);
        assert_close!(x.j0, y.j0, 1e-9);
        assert_close!(x.j45, y.j45, 1e-9);
    }

    #[test]
    fn vertex_there_and_back(f in -30.0f64..30.0, x in -0.02f64..0.02) {
        // [C] CAPABILITIES §2, F/(1-xF) then shift -x is the identity; tol 1e-9
        assert_close!(effective_power(effective_power(f, x), -x), f, 1e-9);
    }

    #[test]
    fn sphcyl_vertex_there_and_back(rx in sphcyl(), x in -0.02f64..0.02) {
        let back = transfer_sphcyl(&transfer_sphcyl(&rx, x), -x);
        // [C] CAPABILITIES §2, per-meridian transfer is invertible, axis unchanged; tol 1e-9
        assert_close!(back.sphere, rx.sphere, 1e-9);
        assert_close!(back.cylinder, rx.cylinder, 1e-9);
        prop_assert_eq!(back.axis, rx.axis);
    }

    #[test]
    fn system_matrix_has_unit_determinant(els in prop::collection::vec(element(), 0..8)) {
        // [C] CAPABILITIES §4, det of a system matrix on (y, n·u) is 1; tol 1e-9
        assert_close!(system_matrix(&els).det(), 1.0, 1e-9);
    }
}

proptest! {
    /// The compensated order is the exact inverse of the as-worn mapping, and the
    /// as-worn mapping of a sphere tilted about one axis is Martin's formula.
    #[test]
    fn tilt_compensation_round_trip(
        rx in sphcyl(),
        p in -10.0f64..25.0,
        f in -5.0f64..35.0,
        n in 1.45f64..1.8,
        right in proptest::bool::ANY,
    ) {
        use parax_optics::prism::Eye;
        use parax_optics::tilt::{as_worn, compensated, martin, Tilt};
        let eye = if right { Eye::Right } else { Eye::Left };
        let t = Tilt::new(p, f, eye);
        let back = as_worn(&compensated(&rx, t, n), t, n).power_vector();
        let want = rx.power_vector();
        prop_assert!((back.m - want.m).abs() < 1e-9);
        prop_assert!((back.j0 - want.j0).abs() < 1e-9);
        prop_assert!((back.j45 - want.j45).abs() < 1e-9);
        let s = rx.sphere;
        let worn = as_worn(&SphCyl::new(s, 0.0, 180.0), Tilt::new(p, 0.0, eye), n);
        let (ms, mc) = martin(s, p, n);
        // Martin: power S' in the 180 meridian and S' + C in the 90 meridian.
        prop_assert!((worn.meridian_power(180.0) - ms).abs() < 1e-9);
        prop_assert!((worn.meridian_power(90.0) - (ms + mc)).abs() < 1e-9);
    }

    /// Prentice's rule is linear in the decentration and the base flips with it.
    #[test]
    fn prentice_is_odd_in_decentration(rx in sphcyl(), x in -0.01f64..0.01, y in -0.01f64..0.01) {
        use parax_optics::prism::{prentice, Eye};
        let a = prentice(&rx, Eye::Right, x, y);
        let b = prentice(&rx, Eye::Right, -x, -y);
        prop_assert!((a.base_in + b.base_in).abs() < 1e-9);
        prop_assert!((a.base_up + b.base_up).abs() < 1e-9);
    }
}
