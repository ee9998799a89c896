//! Housekeeping as tests: the architecture section names only paths that exist, and
//! every Rust module starts with a `//!` doc comment.

use std::path::{Path, PathBuf};

fn root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("..")
}

#[test]
fn developers_guide_names_existing_paths() {
    let text = std::fs::read_to_string(root().join("DEVELOPERS.md")).unwrap();
    let mut checked = 0;
    for chunk in text.split('`').skip(1).step_by(2) {
        let looks_like_path = (chunk.starts_with("crates/")
            || chunk.starts_with("grammar/")
            || chunk.starts_with("tests/")
            || chunk.starts_with("docs/")
            || chunk.starts_with("examples/"))
            && !chunk.contains(' ')
            && !chunk.contains("...");
        if looks_like_path {
            let p = chunk.trim_end_matches('/');
            assert!(
                root().join(p).exists(),
                "DEVELOPERS.md names `{chunk}`, which does not exist"
            );
            checked += 1;
        }
    }
    assert!(
        checked >= 8,
        "only {checked} paths found: did the guide change shape?"
    );
}

#[test]
fn every_module_has_a_doc_comment() {
    let mut missing = Vec::new();
    let mut stack = vec![root().join("crates")];
    while let Some(dir) = stack.pop() {
        for entry in std::fs::read_dir(&dir).unwrap() {
            let path = entry.unwrap().path();
            if path.is_dir() {
                if !path.ends_with("target") {
                    stack.push(path);
                }
            } else if path.extension().is_some_and(|e| e == "rs")
                && path.components().any(|c| c.as_os_str() == "src")
            {
                let text = std::fs::read_to_string(&path).unwrap();
                if !text.trim_start().starts_with("//!") {
                    missing.push(path);
                }
            }
        }
    }
    assert!(missing.is_empty(), "modules without a //! doc: {missing:?}");
}

/// The dependencies of each workspace package as `cargo metadata` reads them
/// from the manifests: (package, dependency, kind) with kind `normal`, `dev`
/// or `build`.
fn declared_dependencies() -> Vec<(String, String, String)> {
    let cargo = option_env!("CARGO").unwrap_or("cargo");
    let out = std::process::Command::new(cargo)
        .args([
            "metadata",
            "--no-deps",
            "--offline",
            "--format-version",
            "1",
        ])
        .current_dir(root())
        .output()
        .expect("cargo metadata runs");
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let meta: serde_json::Value = serde_json::from_slice(&out.stdout).expect("JSON");
    let mut deps = Vec::new();
    for p in meta["packages"].as_array().expect("packages") {
        for d in p["dependencies"].as_array().expect("dependencies") {
            deps.push((
                p["name"].as_str().unwrap_or_default().to_owned(),
                d["name"].as_str().unwrap_or_default().to_owned(),
                d["kind"].as_str().unwrap_or("normal").to_owned(),
            ));
        }
    }
    deps
}

/// Every dependency that breaks the layering DEVELOPERS.md states.
fn layering_violations(deps: &[(String, String, String)]) -> Vec<String> {
    let is_lsp = |d: &str| {
        matches!(
            d,
            "tower-lsp-server" | "tower-lsp" | "lsp-types" | "ls-types"
        )
    };
    let mut out = Vec::new();
    for (p, d, kind) in deps {
        let parax = d.starts_with("parax-");
        let normal = kind == "normal";
        // The shared test inputs, allowed to every crate's tests.
        let test_inputs = d == "parax-testdata" && !normal;
        let wrong = match p.as_str() {
            // Knows no optics and no other parax crate (its tests may share the test inputs).
            "parax-syntax" => parax && !test_inputs,
            // Pure maths: no parax crate at all.
            "parax-optics" => parax,
            // Drawing only: depends on nothing of parax.
            "parax-diagram" => parax,
            // The evaluator reads the tree and calls the maths, nothing else.
            "parax-eval" => {
                parax
                    && !(normal && matches!(d.as_str(), "parax-syntax" | "parax-optics"))
                    && !test_inputs
            }
            // Test inputs for every crate: depends on no parax crate.
            "parax-testdata" => parax,
            // Editor features as plain data: no LSP.
            "parax-ide" => d == "parax-lsp" || d == "parax-cli",
            "parax-lsp" => d == "parax-cli",
            "tree-sitter-parax" => parax && normal,
            _ => false,
        };
        // Only the language server knows the protocol's types.
        let lsp_outside = is_lsp(d) && p != "parax-lsp";
        if wrong || lsp_outside {
            out.push(format!("{p} depends on {d} ({kind})"));
        }
    }
    out
}

#[test]
fn crates_depend_only_as_the_architecture_says() {
    let deps = declared_dependencies();
    assert!(
        deps.iter()
            .any(|(p, d, _)| p == "parax-eval" && d == "parax-syntax"),
        "cargo metadata lists no dependency: did its output change shape?"
    );
    assert_eq!(layering_violations(&deps), Vec::<String>::new());
    // The check finds a dependency that breaks a rule.
    for (p, d) in [
        ("parax-syntax", "parax-optics"),
        ("parax-optics", "parax-syntax"),
        ("parax-diagram", "parax-optics"),
        ("parax-eval", "parax-ide"),
        ("parax-ide", "tower-lsp-server"),
        ("parax-ide", "parax-lsp"),
        ("parax-cli", "ls-types"),
    ] {
        let mut broken = deps.clone();
        broken.push((p.into(), d.into(), "normal".into()));
        assert_eq!(
            layering_violations(&broken),
            [format!("{p} depends on {d} (normal)")],
            "{p} → {d} not caught"
        );
    }
}
