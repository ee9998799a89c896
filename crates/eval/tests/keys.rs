//! Every derived value is named by its block module's key table
//! (`parax_eval::blocks::<kind>::keys`), every key of those tables is documented
//! in docs/notation.md under its block, and no crate writes a multi-word value
//! name as a string literal outside the block modules; and a block of the
//! model is no larger than an eye block.

use parax_eval::blocks::{self, system};
use parax_syntax::BlockKind;
use std::path::Path;

fn root() -> &'static Path {
    Path::new(concat!(env!("CARGO_MANIFEST_DIR"), "/../.."))
}

/// The kinds that have values.
fn kinds() -> impl Iterator<Item = BlockKind> {
    BlockKind::ALL.into_iter().filter(|k| *k != BlockKind::Case)
}

#[test]
fn every_value_is_named_by_its_block_table() {
    let mut unknown = Vec::new();
    let mut seen = 0;
    for text in parax_testdata::case_texts() {
        let (_, ev) = parax_eval::evaluate_source(&text);
        for d in &ev.derived {
            seen += 1;
            let kind = blocks::kind_of_id(&d.block).expect("a block id names its kind");
            let name = &*d.name;
            let known = blocks::value_names(kind).contains(&name)
                || (kind == BlockKind::System
                    && name.split_once('.').is_some_and(|(label, key)| {
                        !label.is_empty() && system::keys::PER_ELEMENT.contains(&key)
                    }));
            if !known {
                unknown.push(format!("{}.{name}", d.block));
            }
        }
    }
    assert!(seen > 300, "the examples and fixtures give values ({seen})");
    unknown.sort();
    unknown.dedup();
    assert!(
        unknown.is_empty(),
        "values not in their block's keys: {unknown:?}"
    );
}

#[test]
fn every_key_is_documented_under_its_block() {
    let doc = std::fs::read_to_string(root().join("docs/notation.md")).expect("docs/notation.md");
    let table: Vec<(String, String)> = doc
        .lines()
        .skip_while(|l| !l.starts_with("## Derived values and their keys"))
        .filter(|l| l.starts_with("| `"))
        .filter_map(|l| {
            let cells: Vec<&str> = l.trim_matches('|').split(" | ").collect();
            Some((cells.first()?.to_string(), cells.get(1)?.trim().to_string()))
        })
        .collect();
    let mut missing = Vec::new();
    for kind in kinds() {
        let keys = blocks::value_names(kind).iter().copied().chain(
            if kind == BlockKind::System {
                system::keys::PER_ELEMENT
            } else {
                &[]
            }
            .iter()
            .copied(),
        );
        for key in keys {
            let written = [format!("`{key}`"), format!("`LABEL.{key}`")];
            let documented = table.iter().any(|(names, block)| {
                block == kind.keyword()
                    && names
                        .split(", ")
                        .any(|n| written.iter().any(|w| w == n.trim()))
            });
            if !documented {
                missing.push(format!("{}.{key}", kind.keyword()));
            }
        }
    }
    assert!(
        missing.is_empty(),
        "keys missing from the table of docs/notation.md: {missing:?}"
    );
}

/// Every `.rs` file under `dir`.
fn sources(dir: &Path, out: &mut Vec<std::path::PathBuf>) {
    for entry in std::fs::read_dir(dir).expect("a source directory") {
        let path = entry.expect("an entry").path();
        if path.is_dir() {
            sources(&path, out);
        } else if path.extension().is_some_and(|e| e == "rs") {
            out.push(path);
        }
    }
}

#[test]
fn no_value_name_is_written_outside_its_block_module() {
    // Names of more than one word (`spherical-equivalent`): single words
    // (`image`, `power`) are ordinary words in labels and messages.
    let names: Vec<&str> = kinds()
        .flat_map(|k| blocks::value_names(k).iter().copied())
        .chain(system::keys::PER_ELEMENT.iter().copied())
        .filter(|n| n.contains('-'))
        .collect();
    let blocks_dir = root().join("crates/eval/src/blocks");
    let mut files = Vec::new();
    for krate in ["eval", "ide", "cli", "lsp"] {
        sources(&root().join("crates").join(krate).join("src"), &mut files);
    }
    let mut found = Vec::new();
    for file in files.iter().filter(|f| !f.starts_with(&blocks_dir)) {
        let text = std::fs::read_to_string(file).expect("a source file");
        for name in &names {
            if text.contains(&format!("\"{name}\"")) {
                found.push(format!("{}: \"{name}\"", file.display()));
            }
        }
    }
    assert!(
        found.is_empty(),
        "use the block's keys constants instead: {found:?}"
    );
}

/// A block of the model takes no more room than an eye block, the kind a long
/// history holds by the thousand: no other kind may grow past it unboxed.
#[test]
fn a_block_is_as_large_as_an_eye() {
    use parax_eval::model::Block;
    assert_eq!(
        std::mem::size_of::<Block>(),
        std::mem::size_of::<parax_eval::model::Eye>()
    );
}

#[test]
fn an_eye_block_is_no_larger_than_before_the_block_modules() {
    // 472 bytes before the redesign (acuity, added since, takes 32 more); the
    // rarely written `iol-*` facts are boxed, so every other eye block is smaller.
    assert!(
        std::mem::size_of::<parax_eval::model::Eye>() <= 472,
        "{}",
        std::mem::size_of::<parax_eval::model::Eye>()
    );
}
