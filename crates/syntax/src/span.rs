//! Byte spans into the source text.

use serde::{Deserialize, Serialize};

/// A half-open byte range `start..end` into the source text of one file.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Hash, Default, Serialize, Deserialize, PartialOrd, Ord,
)]
pub struct Span {
    /// First byte of the range.
    pub start: usize,
    /// One past the last byte of the range.
    pub end: usize,
}

impl Span {
    /// A span from `start` to `end` (bytes).
    pub fn new(start: usize, end: usize) -> Self {
        debug_assert!(start <= end);
        Span { start, end }
    }

    /// The smallest span covering both.
    pub fn cover(self, other: Span) -> Span {
        Span::new(self.start.min(other.start), self.end.max(other.end))
    }

    /// Length in bytes.
    pub fn len(self) -> usize {
        self.end - self.start
    }

    /// True when the span covers no byte.
    pub fn is_empty(self) -> bool {
        self.start == self.end
    }

    /// True when `offset` lies in `start..=end` (the end is included so a cursor
    /// just after a token still belongs to it).
    pub fn touches(self, offset: usize) -> bool {
        self.start <= offset && offset <= self.end
    }

    /// The same span moved right by `by` bytes.
    pub fn shifted(self, by: usize) -> Span {
        Span::new(self.start + by, self.end + by)
    }
}

impl Span {
    /// The same span moved by `by` bytes, left when negative.
    pub fn moved(self, by: isize) -> Span {
        Span::new(
            self.start.wrapping_add_signed(by),
            self.end.wrapping_add_signed(by),
        )
    }
}

impl From<std::ops::Range<usize>> for Span {
    fn from(r: std::ops::Range<usize>) -> Self {
        Span::new(r.start, r.end)
    }
}
