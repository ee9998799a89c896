//! Syntax errors: a stable code, a message, the span at fault and a hint.

use crate::Span;
use serde::Serialize;

/// A line the grammar could not read, or a line in the wrong place.
#[derive(Debug, Clone, PartialEq, Eq, Serialize)]
pub struct SyntaxError {
    /// Stable code (`P0001`…), documented in docs/diagnostics.md.
    pub code: &'static str,
    /// What is wrong, in one sentence.
    pub message: String,
    /// The bytes at fault.
    pub span: Span,
    /// How to put it right.
    pub hint: Option<String>,
    /// A replacement for `span` that fixes the line, when one is certain enough.
    pub replacement: Option<String>,
}

/// Codes of syntax errors, kept together so that docs and tests can list them.
pub mod codes {
    /// A character or token the grammar does not accept.
    pub const UNEXPECTED: &str = "P0001";
    /// A line at column 0 that does not open a known block.
    pub const UNKNOWN_BLOCK: &str = "P0002";
    /// An indented statement before the first block.
    pub const OUTSIDE_BLOCK: &str = "P0003";
    /// A string without its closing quote.
    pub const UNTERMINATED_STRING: &str = "P0004";
    /// A text of 4 GiB or more: spans hold 32-bit offsets, so it is not read.
    pub const TOO_LARGE: &str = "P0005";
}
