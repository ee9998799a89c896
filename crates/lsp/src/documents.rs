//! Open documents as ropes, and incremental edits applied to them. An edit with
//! a reversed range or a position outside the document is rejected whole (the
//! document is left as it was) and reported, never a panic.

use parax_syntax::ColumnUnit;
use ropey::Rope;
use std::fmt;
use std::ops::Range;

/// Why an edit was rejected.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum EditError {
    /// The line lies past the end of the document.
    LineOutOfRange {
        /// The line asked for.
        line: u32,
        /// Lines in the document.
        lines: usize,
    },
    /// The column lies past the end of its line or inside a character.
    ColumnOutOfRange {
        /// The line.
        line: u32,
        /// The column asked for.
        col: u32,
    },
    /// The range ends before it starts.
    Reversed,
}

impl fmt::Display for EditError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            EditError::LineOutOfRange { line, lines } => {
                write!(
                    f,
                    "line {line} is past the end of the document ({lines} lines)"
                )
            }
            EditError::ColumnOutOfRange { line, col } => {
                write!(f, "column {col} is outside line {line}")
            }
            EditError::Reversed => write!(f, "the range ends before it starts"),
        }
    }
}

/// The char index of a 0-based line and column, strictly: errors instead of clamping.
pub(crate) fn char_index(
    rope: &Rope,
    line: u32,
    col: u32,
    unit: ColumnUnit,
) -> Result<usize, EditError> {
    let lines = rope.len_lines();
    if line as usize >= lines {
        return Err(EditError::LineOutOfRange { line, lines });
    }
    let start = rope.line_to_char(line as usize);
    let slice = rope.line(line as usize);
    let mut remaining = col as usize;
    let mut chars = 0usize;
    for ch in slice.chars() {
        if remaining == 0 {
            break;
        }
        if ch == '\n' || ch == '\r' {
            break;
        }
        let w = match unit {
            ColumnUnit::Utf8 => ch.len_utf8(),
            ColumnUnit::Utf16 => ch.len_utf16(),
            ColumnUnit::Char => 1,
        };
        if w > remaining {
            return Err(EditError::ColumnOutOfRange { line, col });
        }
        remaining -= w;
        chars += 1;
    }
    if remaining != 0 {
        return Err(EditError::ColumnOutOfRange { line, col });
    }
    Ok(start + chars)
}

/// Apply one change (`range` as start line/col and end line/col, or the whole
/// text when `None`) to `rope`, and return the bytes of the text before the
/// change that it replaced (`None` for a whole-text change): the range the
/// analysis is edited with, converted once here. On error the rope is unchanged.
pub fn apply_change(
    rope: &mut Rope,
    range: Option<((u32, u32), (u32, u32))>,
    text: &str,
    unit: ColumnUnit,
) -> Result<Option<Range<usize>>, EditError> {
    let Some(((sl, sc), (el, ec))) = range else {
        *rope = Rope::from_str(text);
        return Ok(None);
    };
    let start = char_index(rope, sl, sc, unit)?;
    let end = char_index(rope, el, ec, unit)?;
    if end < start {
        return Err(EditError::Reversed);
    }
    let bytes = rope.char_to_byte(start)..rope.char_to_byte(end);
    rope.remove(start..end);
    rope.insert(start, text);
    Ok(Some(bytes))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn applies_edits_in_both_encodings_and_rejects_bad_ones() {
        let mut r = Rope::from_str("eye right\r\n  keratometry 7.8 mm × 175\r\n");
        // After `×` (one UTF-16 unit, two UTF-8 bytes): insert a space-free marker.
        // Bytes: `eye right\r\n` is 11, then 21 columns of which `×` is 2 bytes.
        let at = apply_change(&mut r, Some(((1, 22), (1, 22))), "!", ColumnUnit::Utf16);
        assert_eq!(at, Ok(Some(34..34)));
        assert_eq!(r.line(1).to_string(), "  keratometry 7.8 mm ×! 175\r\n");
        let at = apply_change(&mut r, Some(((1, 24), (1, 25))), "?", ColumnUnit::Utf8);
        assert_eq!(at, Ok(Some(35..36)));
        assert_eq!(r.line(1).to_string(), "  keratometry 7.8 mm ×!?175\r\n");
        let at = apply_change(&mut r, Some(((1, 25), (1, 25))), " ", ColumnUnit::Utf8);
        assert_eq!(at, Ok(Some(36..36)));
        assert_eq!(r.line(1).to_string(), "  keratometry 7.8 mm ×!? 175\r\n");
        let before = r.to_string();
        // Inside the two bytes of `×`.
        assert_eq!(
            apply_change(&mut r, Some(((1, 22), (1, 22))), "x", ColumnUnit::Utf8),
            Err(EditError::ColumnOutOfRange { line: 1, col: 22 })
        );
        assert!(matches!(
            apply_change(&mut r, Some(((9, 0), (9, 0))), "x", ColumnUnit::Utf16),
            Err(EditError::LineOutOfRange { .. })
        ));
        assert_eq!(
            apply_change(&mut r, Some(((1, 5), (0, 2))), "x", ColumnUnit::Utf16),
            Err(EditError::Reversed)
        );
        // Past the end of a line (the `\r\n` is not a column).
        assert!(apply_change(&mut r, Some(((0, 10), (0, 10))), "x", ColumnUnit::Utf16).is_err());
        assert_eq!(r.to_string(), before);
    }
}
