//! Helpers shared by the fixture harness and the property tests (test data only).
#![allow(dead_code)]

use std::path::{Path, PathBuf};

/// The folder of parser fixtures.
pub fn fixtures_dir() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("fixtures/parse")
}

/// The examples folder of the repository.
pub fn examples_dir() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../examples")
}

/// Every `*.parax` file directly in `dir`, sorted by name. Panics if there is none,
/// so a moved folder cannot make a test pass vacuously.
pub fn parax_files(dir: &Path) -> Vec<PathBuf> {
    let mut files: Vec<PathBuf> = std::fs::read_dir(dir)
        .unwrap_or_else(|e| panic!("{}: {e}", dir.display()))
        .map(|e| e.expect("directory entry").path())
        .filter(|p| p.extension().is_some_and(|e| e == "parax"))
        .collect();
    files.sort();
    assert!(!files.is_empty(), "no .parax files in {}", dir.display());
    files
}

/// Valid fixtures, invalid fixtures and examples: every case file the tests know.
pub fn all_case_files() -> Vec<PathBuf> {
    let mut all = parax_files(&fixtures_dir().join("valid"));
    all.extend(parax_files(&fixtures_dir().join("invalid")));
    all.extend(parax_files(&examples_dir()));
    all
}

/// A file's text (fixtures are UTF-8).
pub fn read(path: &Path) -> String {
    std::fs::read_to_string(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()))
}

/// The file stem as a string.
pub fn stem(path: &Path) -> String {
    path.file_stem()
        .expect("a file name")
        .to_string_lossy()
        .into_owned()
}
