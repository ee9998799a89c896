//! Test inputs shared by the crates' tests: the case files the project keeps
//! (examples and parser fixtures) and the arithmetic of a random edit. A
//! dev-dependency only, and it depends on no parax crate, so every layer's
//! tests (syntax included) can use it.

use std::ops::Range;
use std::path::{Path, PathBuf};

/// The folders of case files every property test runs over, relative to the
/// repository root.
pub const CASE_DIRS: [&str; 3] = [
    "examples",
    "tests/fixtures/parse/valid",
    "tests/fixtures/parse/invalid",
];

/// The repository root.
pub fn root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..")
}

/// Every `.parax` file directly in `dir` (relative to the root), sorted by
/// name, as (path relative to the root, text).
pub fn case_files_in(dir: &str) -> Vec<(String, String)> {
    let mut paths: Vec<PathBuf> = std::fs::read_dir(root().join(dir))
        .unwrap_or_else(|e| panic!("{dir}: {e}"))
        .map(|e| e.expect("a folder entry").path())
        .filter(|p| p.extension().is_some_and(|x| x == "parax"))
        .collect();
    paths.sort();
    paths
        .into_iter()
        .map(|p| {
            let name = p.file_name().expect("a file name").to_string_lossy();
            let text = std::fs::read_to_string(&p).unwrap_or_else(|e| panic!("{name}: {e}"));
            (format!("{dir}/{name}"), text)
        })
        .collect()
}

/// The texts of every file in [`CASE_DIRS`], folder by folder.
pub fn case_texts() -> Vec<String> {
    let texts: Vec<String> = CASE_DIRS
        .iter()
        .flat_map(|dir| case_files_in(dir))
        .map(|(_, text)| text)
        .collect();
    assert!(texts.len() >= 20, "case files found: {}", texts.len());
    texts
}

/// The bytes a random edit replaces: from `at` (any offset up to the text's
/// length) over `len` bytes, both ends moved back to character boundaries.
pub fn edit_range(text: &str, at: usize, len: usize) -> Range<usize> {
    let start = text.floor_char_boundary(at);
    start..text.floor_char_boundary(start + len)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_the_case_files() {
        assert!(case_texts().iter().all(|t| !t.is_empty()));
        assert!(case_files_in("examples")
            .iter()
            .all(|(rel, _)| rel.starts_with("examples/") && rel.ends_with(".parax")));
    }

    #[test]
    fn edits_stay_on_character_boundaries() {
        // `°` is two bytes: an edit starting or ending inside it moves back.
        let text = "7.8 mm × 180°";
        let n = text.len();
        assert_eq!(edit_range(text, n - 1, 5), n - 2..n);
        assert_eq!(edit_range(text, 0, 3), 0..3);
        // `×` (two bytes) starts at byte 7: an end inside it moves back to 7.
        assert_eq!(edit_range(text, 4, 4), 4..7);
    }
}
