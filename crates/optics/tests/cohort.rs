//! Cohort statistics on power vectors, checked against values worked by hand
//! from the definitions in Thibos, Wheeler & Horner, Optom Vis Sci 1997
//! (M = S + C/2, J0 = −(C/2)cos 2θ, J45 = −(C/2)sin 2θ; the mean of each
//! component; back-conversion J = √(J0² + J45²), C = −2J, S = M + J,
//! θ = ½·atan2(J45, J0)). Sample standard deviation with divisor n − 1.

#[macro_use]
mod common;

use parax_optics::cohort::summarize;
use parax_optics::refraction::SphCyl;

fn vectors(rx: &[(f64, f64, f64)]) -> Vec<parax_optics::PowerVector> {
    rx.iter()
        .map(|&(s, c, a)| SphCyl::new(s, c, a).power_vector())
        .collect()
}

#[test]
fn three_refractions_worked_by_hand() {
    // -2.00/-1.00×90 → (−2.50, −0.50, 0); -1.00/-2.00×45 → (−2.00, 0, +1.00);
    // +1.00/-0.50×180 → (+0.75, +0.25, 0).
    let s = summarize(&vectors(&[
        (-2.0, -1.0, 90.0),
        (-1.0, -2.0, 45.0),
        (1.0, -0.5, 180.0),
    ]))
    .expect("three refractions");
    assert_eq!(s.count, 3);
    // [C] Thibos 1997 definitions, by hand: mean M = (−2.5 − 2 + 0.75)/3 = −1.25; tol 1e-12
    assert_close!(s.mean.m, -1.25, 1e-12);
    // [C] mean J0 = (−0.5 + 0 + 0.25)/3 = −1/12; tol 1e-12
    assert_close!(s.mean.j0, -1.0 / 12.0, 1e-12);
    // [C] mean J45 = (0 + 1 + 0)/3 = 1/3; tol 1e-12
    assert_close!(s.mean.j45, 1.0 / 3.0, 1e-12);
    let sd = s.sd.expect("n > 1");
    // [C] SD M: deviations −1.25, −0.75, +2.00; Σd² = 6.125; /2 → √3.0625 = 1.75; tol 1e-12
    assert_close!(sd.m, 1.75, 1e-12);
    // [C] SD J0: Σd² = 0.291667; /2 → √0.145833 = 0.381881; tol 1e-6
    assert_close!(sd.j0, 0.381881, 1e-6);
    // [C] SD J45: Σd² = 2/3; /2 → √(1/3) = 0.577350; tol 1e-6
    assert_close!(sd.j45, 0.577350, 1e-6);
    // [C] back-conversion: J = √(1/144 + 1/9) = 0.343592; S = −1.25 + J = −0.906408;
    // C = −0.687184; θ = ½·atan2(1/3, −1/12) = 52.018°; tol 1e-5 D, 1e-3°
    assert_close!(s.mean_sphcyl.sphere, -0.906408, 1e-5);
    assert_close!(s.mean_sphcyl.cylinder, -0.687184, 1e-5);
    assert_close!(s.mean_sphcyl.axis, 52.018, 1e-3);
}

#[test]
fn crossed_axes_average_to_a_sphere_not_an_oblique_cylinder() {
    // [C] Thibos 1997: −1.00/−1.00×180 → (−1.5, +0.5, 0) and −1.00/−1.00×90 →
    // (−1.5, −0.5, 0); the mean (−1.5, 0, 0) is −1.50 DS, whereas averaging
    // sphere, cylinder and axis would give −1.00/−1.00×135. SD J0 = √(0.5/1); tol 1e-12
    let s = summarize(&vectors(&[(-1.0, -1.0, 180.0), (-1.0, -1.0, 90.0)])).unwrap();
    assert_close!(s.mean_sphcyl.sphere, -1.5, 1e-12);
    assert_close!(s.mean_sphcyl.cylinder, 0.0, 1e-12);
    assert_close!(s.sd.unwrap().j0, 0.5f64.sqrt(), 1e-12);
    assert_close!(s.sd.unwrap().m, 0.0, 1e-12);
}

#[test]
fn single_and_empty_cohorts() {
    // [CP] one refraction: its own mean, no SD; an empty cohort has no summary.
    let s = summarize(&vectors(&[(-3.0, -0.75, 20.0)])).unwrap();
    assert_eq!(s.count, 1);
    assert!(s.sd.is_none());
    assert_close!(s.mean_sphcyl.sphere, -3.0, 1e-12);
    assert_close!(s.mean_sphcyl.cylinder, -0.75, 1e-12);
    assert_close!(s.mean_sphcyl.axis, 20.0, 1e-9);
    assert!(summarize(&[]).is_none());
}
