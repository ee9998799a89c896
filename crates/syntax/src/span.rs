//! Byte spans into the source text.
//!
//! Offsets are stored as `u32` (a span is 8 bytes; a large file holds millions of
//! them), so a file must be under 4 GiB: [`crate::parse`] refuses a larger one with
//! a diagnostic (code `P0005`, [`crate::codes::TOO_LARGE`]) instead of reading it.

use serde::{Deserialize, Serialize};

/// The largest source, in bytes, whose offsets fit a [`Span`].
pub const MAX_SOURCE_BYTES: usize = u32::MAX as usize;

/// A half-open byte range `start..end` into the source text of one file.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Hash, Default, Serialize, Deserialize, PartialOrd, Ord,
)]
pub struct Span {
    /// First byte of the range.
    pub start: u32,
    /// One past the last byte of the range.
    pub end: u32,
}

/// An offset as stored in a span. Offsets come from texts of at most
/// [`MAX_SOURCE_BYTES`] (checked where text enters: [`crate::parse`]); a larger
/// one is a bug, and saturates rather than wrapping silently.
fn offset(at: usize) -> u32 {
    debug_assert!(at <= MAX_SOURCE_BYTES, "offset {at} past 4 GiB");
    u32::try_from(at).unwrap_or(u32::MAX)
}

impl Span {
    /// A span from `start` to `end` (bytes).
    pub fn new(start: usize, end: usize) -> Self {
        debug_assert!(start <= end);
        Span {
            start: offset(start),
            end: offset(end),
        }
    }

    /// First byte, as an index into the text.
    pub fn start(self) -> usize {
        self.start as usize
    }

    /// One past the last byte, as an index into the text.
    pub fn end(self) -> usize {
        self.end as usize
    }

    /// The byte range, for slicing the text.
    pub fn range(self) -> std::ops::Range<usize> {
        self.start()..self.end()
    }

    /// The smallest span covering both.
    pub fn cover(self, other: Span) -> Span {
        Span {
            start: self.start.min(other.start),
            end: self.end.max(other.end),
        }
    }

    /// Length in bytes.
    pub fn len(self) -> usize {
        (self.end - self.start) as usize
    }

    /// True when the span covers no byte.
    pub fn is_empty(self) -> bool {
        self.start == self.end
    }

    /// True when `offset` lies in `start..=end` (the end is included so a cursor
    /// just after a token still belongs to it).
    pub fn touches(self, offset: usize) -> bool {
        self.start() <= offset && offset <= self.end()
    }

    /// The same span moved right by `by` bytes.
    pub fn shifted(self, by: usize) -> Span {
        Span::new(self.start() + by, self.end() + by)
    }
}

impl Span {
    /// The same span moved by `by` bytes, left when negative.
    pub fn moved(self, by: isize) -> Span {
        Span::new(
            self.start().wrapping_add_signed(by),
            self.end().wrapping_add_signed(by),
        )
    }
}

impl From<std::ops::Range<usize>> for Span {
    fn from(r: std::ops::Range<usize>) -> Self {
        Span::new(r.start, r.end)
    }
}
