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
