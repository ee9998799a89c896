//! The parax tree-sitter grammar for Rust: the language and its highlight query.
//!
//! The grammar (`grammar.js`) mirrors `grammar/parax.pest`: lines of block
//! headers, indented statements and comments, with values (numbers with units,
//! text, dates, words, the axis sign, separators). It exists for editors that
//! highlight through tree-sitter; parax itself parses with pest. The tests of
//! this crate check that both read every example and fixture the same way.
//!
//! ```
//! let mut parser = tree_sitter::Parser::new();
//! parser.set_language(&tree_sitter_parax::LANGUAGE.into()).unwrap();
//! let tree = parser.parse("eye right\n  add +1.50\n", None).unwrap();
//! assert!(!tree.root_node().has_error());
//! ```

use tree_sitter_language::LanguageFn;

extern "C" {
    fn tree_sitter_parax() -> *const ();
}

/// The tree-sitter language of parax case files.
pub const LANGUAGE: LanguageFn = unsafe { LanguageFn::from_raw(tree_sitter_parax) };

/// The node types of the grammar (`src/node-types.json`).
pub const NODE_TYPES: &str = include_str!("../../src/node-types.json");

/// The highlight query with the tree-sitter CLI's and Neovim's capture names.
pub const HIGHLIGHTS_QUERY: &str = include_str!("../../queries/highlights.scm");

/// The highlight query with Helix's capture names.
pub const HELIX_HIGHLIGHTS_QUERY: &str =
    include_str!("../../../helix/queries/parax/highlights.scm");
