//! Thick systems and schematic eyes cross-checked against SymPy's
//! `sympy.physics.optics` ray-transfer matrices (PyPI), a general-purpose optics
//! library outside the project that works on real rather than reduced angles.
//! `tests/reference/sympy_check.py` prints SymPy's values; this test compares
//! parax-optics with them. CI installs SymPy and sets `PARAX_REQUIRE_SYMPY`
//! (.ci/run): with it (or with `CI` set) a missing python3 or SymPy fails the
//! test. Locally, without either variable, the test is skipped with a note on
//! standard error that the harness does not hide.

use parax_optics::model_eye::{self, Schematic};
use parax_optics::system::{system_matrix, system_powers, Element};
use std::io::Write;
use std::path::Path;
use std::process::Command;

/// Whether a missing python3 or SymPy must fail the test rather than skip it.
fn required() -> bool {
    ["PARAX_REQUIRE_SYMPY", "CI"]
        .iter()
        .any(|v| std::env::var_os(v).is_some_and(|x| !x.is_empty() && x != "0" && x != "false"))
}

/// Skip (locally) or fail (in CI) because `why`.
fn missing(why: &str) -> Option<serde_json::Value> {
    if required() {
        panic!("{why}, and PARAX_REQUIRE_SYMPY or CI is set: the cross-check must run (pip install sympy)");
    }
    // Written to the stream itself, not through `eprintln!`, which the test
    // harness captures and hides for a passing test: the skip stays visible.
    let _ = writeln!(
        std::io::stderr(),
        "SKIPPED: {why} (pip install sympy); CI runs this check with PARAX_REQUIRE_SYMPY=1"
    );
    None
}

fn reference() -> Option<serde_json::Value> {
    let script = Path::new(env!("CARGO_MANIFEST_DIR")).join("reference/sympy_check.py");
    let out = match Command::new("python3").arg(&script).output() {
        Ok(o) => o,
        Err(e) => return missing(&format!("python3 is not available ({e})")),
    };
    if !out.status.success() {
        let err = String::from_utf8_lossy(&out.stderr);
        if err.contains("No module named 'sympy'") {
            return missing("SymPy is not installed");
        }
        panic!("sympy_check.py failed:\n{err}");
    }
    Some(serde_json::from_slice(&out.stdout).expect("sympy_check.py prints JSON"))
}

fn num(v: &serde_json::Value, path: &[&str]) -> f64 {
    let mut x = v;
    for p in path {
        x = &x[*p];
    }
    x.as_f64()
        .unwrap_or_else(|| panic!("no number at {path:?}"))
}

fn close(a: f64, b: f64, tol: f64, what: &str) {
    assert!(
        (a - b).abs() <= tol,
        "{what}: parax {a} vs SymPy {b} (tol {tol})"
    );
}

#[test]
fn schematic_eyes_agree_with_sympy() {
    let Some(r) = reference() else { return };
    for (key, model) in [
        ("gullstrand", Schematic::GullstrandExact),
        ("le_grand", Schematic::LeGrandFull),
    ] {
        let e = model_eye::evaluate(&model.surfaces());
        // [C] SymPy ray-transfer matrices, same surface table; tol 1e-9 D / 1e-9 mm
        close(e.power, num(&r, &[key, "power"]), 1e-9, key);
        close(
            e.back_focal_from_cornea.expect("focal system") * 1000.0,
            num(&r, &[key, "back_focal_from_cornea_mm"]),
            1e-9,
            key,
        );
        close(
            e.ocular_refraction,
            num(&r, &[key, "ocular_refraction"]),
            1e-9,
            key,
        );
    }
    // [C] SymPy: Emsley reduced eye lengthened to 24 mm; tol 1e-9 D
    let mut s = Schematic::EmsleyReduced.surfaces();
    model_eye::with_axial_length(&mut s, 0.024);
    let e = model_eye::evaluate(&s);
    close(
        e.power,
        num(&r, &["reduced_24mm", "power"]),
        1e-9,
        "reduced power",
    );
    close(
        e.ocular_refraction,
        num(&r, &["reduced_24mm", "ocular_refraction"]),
        1e-9,
        "reduced refraction",
    );
}

#[test]
fn two_thin_lenses_agree_with_sympy() {
    let Some(r) = reference() else { return };
    let m = system_matrix(&[
        Element::ThinLens { power: 5.0 },
        Element::Gap {
            length_m: 0.1,
            index: 1.0,
        },
        Element::ThinLens { power: 2.0 },
    ]);
    let p = system_powers(&m);
    // [C] SymPy ThinLens/FreeSpace: F 6.000, BVP 12.000 (CAPABILITIES §4); tol 1e-12
    close(
        p.equivalent,
        num(&r, &["two_lens", "power"]),
        1e-12,
        "power",
    );
    close(
        p.back_vertex,
        num(&r, &["two_lens", "back_vertex_power"]),
        1e-12,
        "BVP",
    );
}
