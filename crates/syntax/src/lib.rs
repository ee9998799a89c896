//! The parax notation as text: the pest grammar (`grammar/parax.pest`), a parser
//! that never fails and keeps every line (comments and blank lines included), a
//! tree with byte spans, the one [`LineIndex`] that turns offsets into positions,
//! and the formatter. This crate knows nothing of optics: which keywords a block
//! accepts and what values mean is decided by `parax-eval`.

// The pest-generated parser names `alloc` (pest is used without its `std` feature;
// see the workspace Cargo.toml).
extern crate alloc;

mod error;
pub mod format;
mod line_index;
mod parser;
mod span;
pub mod suggest;
mod tree;

pub use error::{codes, SyntaxError};
pub use line_index::{ColumnUnit, LineIndex, LinePos};
pub use parser::{parse, parse_each, reparse};
pub use span::{Span, MAX_SOURCE_BYTES};
pub use tree::*;
