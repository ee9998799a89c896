//! One conversion between byte offsets and positions: 1-based line:column for
//! people, and 0-based line plus a column in UTF-8 bytes, UTF-16 code units or
//! characters for editors. Every position shown anywhere comes from here.

/// How a column is counted.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ColumnUnit {
    /// Bytes of UTF-8 (LSP `utf-8`).
    Utf8,
    /// UTF-16 code units (LSP `utf-16`, the protocol default).
    Utf16,
    /// Unicode scalar values (what people count; used for `line:column`).
    Char,
}

/// A 0-based line and a 0-based column counted in some [`ColumnUnit`].
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
pub struct LinePos {
    /// 0-based line number.
    pub line: u32,
    /// 0-based column in the chosen unit.
    pub col: u32,
}

/// Line starts of one text, for offset ↔ position conversion. A line ends at a
/// line break: `\n`, `\r\n` or a lone `\r` (what the Language Server Protocol
/// says clients use; the grammar and the formatter read the same three). A line
/// break is never a column. Every other separator (VT, FF, NEL, U+2028, U+2029)
/// is an ordinary character of its line.
#[derive(Debug, Clone)]
pub struct LineIndex {
    starts: Vec<usize>,
    len: usize,
}

impl LineIndex {
    /// Index the line starts of `text`.
    pub fn new(text: &str) -> Self {
        let mut starts = Vec::with_capacity(text.len() / 32 + 1);
        starts.push(0);
        starts.extend(line_starts(text.as_bytes(), 1..text.len() + 1));
        LineIndex {
            starts,
            len: text.len(),
        }
    }

    /// Update the index for an edit of the indexed text: the bytes `edit` of the
    /// old text were replaced by `inserted` bytes, giving `edited`. Only the
    /// inserted bytes and the one byte on each side are looked at (an edit can
    /// join a `\r` and a `\n` into one line break, or split one); the line starts
    /// before the edit are kept and those after it are moved, so the result equals
    /// [`LineIndex::new`] of `edited` without reading all of it (the incremental
    /// re-parse uses this). `edit` must lie inside the old text.
    pub fn edit(&mut self, edited: &str, edit: std::ops::Range<usize>, inserted: usize) {
        let delta = inserted as isize - edit.len() as isize;
        let new_end = edit.start + inserted;
        // Whether `s` starts a line depends on the bytes at `s - 1` and `s`: the
        // starts before the edit's start and after its end keep their reading
        // (those after move by `delta`); the ones in between are read again.
        let keep = self.starts.partition_point(|&s| s < edit.start.max(1));
        let tail = self.starts.partition_point(|&s| s <= edit.end).max(keep);
        let from = edit.start.max(1);
        let added: Vec<usize> = line_starts(edited.as_bytes(), from..new_end + 1).collect();
        let moved = keep + added.len();
        self.starts.splice(keep..tail, added);
        if delta != 0 {
            for s in &mut self.starts[moved..] {
                *s = s.wrapping_add_signed(delta);
            }
        }
        self.len = edited.len();
    }

    /// Number of lines (a final line without a line break counts; an empty text
    /// has one line).
    pub fn line_count(&self) -> usize {
        self.starts.len()
    }

    /// Byte offset where 0-based `line` starts, clamped to the text.
    pub fn line_start(&self, line: usize) -> usize {
        self.starts.get(line).copied().unwrap_or(self.len)
    }

    /// Byte range of 0-based `line` without its line break (`\n`, `\r\n` or `\r`).
    pub fn line_span(&self, text: &str, line: usize) -> crate::Span {
        let start = self.line_start(line);
        let mut end = self
            .starts
            .get(line + 1)
            .map(|s| s - 1)
            .unwrap_or(self.len)
            .max(start);
        let bytes = text.as_bytes();
        if end > start && bytes.get(end) == Some(&b'\n') && bytes.get(end - 1) == Some(&b'\r') {
            end -= 1;
        }
        crate::Span::new(start, end)
    }

    /// 0-based line containing byte `offset` (clamped).
    pub fn line_of(&self, offset: usize) -> usize {
        let offset = offset.min(self.len);
        match self.starts.binary_search(&offset) {
            Ok(i) => i,
            Err(i) => i - 1,
        }
    }

    /// Position of byte `offset` with the column in `unit`. Offsets past the end or
    /// inside a character are clamped to the nearest earlier character boundary.
    pub fn position(&self, text: &str, offset: usize, unit: ColumnUnit) -> LinePos {
        let offset = text.floor_char_boundary(offset);
        let line = self.line_of(offset);
        let start = self.line_start(line);
        let before = &text[start..offset];
        let before = before.strip_suffix('\r').unwrap_or(before);
        let col = match unit {
            ColumnUnit::Utf8 => before.len(),
            ColumnUnit::Utf16 => before.encode_utf16().count(),
            ColumnUnit::Char => before.chars().count(),
        };
        LinePos {
            line: line as u32,
            col: col as u32,
        }
    }

    /// 1-based `(line, column)` for people, the column counted in characters.
    pub fn line_col(&self, text: &str, offset: usize) -> (usize, usize) {
        let p = self.position(text, offset, ColumnUnit::Char);
        (p.line as usize + 1, p.col as usize + 1)
    }

    /// Byte offset of a position. Out-of-range lines clamp to the end of the text and
    /// out-of-range columns to the end of the line (never a panic): editors send such
    /// positions while typing.
    pub fn offset(&self, text: &str, pos: LinePos, unit: ColumnUnit) -> usize {
        let line = pos.line as usize;
        if line >= self.starts.len() {
            return self.len;
        }
        let span = self.line_span(text, line);
        let line_text = &text[span.start()..span.end()];
        let mut remaining = pos.col as usize;
        for (i, ch) in line_text.char_indices() {
            let width = match unit {
                ColumnUnit::Utf8 => ch.len_utf8(),
                ColumnUnit::Utf16 => ch.len_utf16(),
                ColumnUnit::Char => 1,
            };
            if remaining < width {
                return span.start() + i;
            }
            remaining -= width;
        }
        span.end()
    }
}

/// The line starts `s` in `range` (each `1..=bytes.len()`): `s` follows a `\n`,
/// or a `\r` that is not the first half of a `\r\n`. Hand-written rather than a
/// dependency: one pass over the bytes.
fn line_starts(bytes: &[u8], range: std::ops::Range<usize>) -> impl Iterator<Item = usize> + '_ {
    let range = range.start.max(1)..range.end.min(bytes.len() + 1);
    range.filter(move |&s| match bytes[s - 1] {
        b'\n' => true,
        b'\r' => bytes.get(s) != Some(&b'\n'),
        _ => false,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn an_edited_index_equals_a_new_one() {
        let text = "eye right\n  add +1.00\r\n\n  note \"Zoë\"\r\r x\n";
        for start in 0..=text.len() {
            for end in start..=text.len() {
                if !text.is_char_boundary(start) || !text.is_char_boundary(end) {
                    continue;
                }
                for insert in ["", "x", "\n", "\r", "a\nb\n", "\r\n\n", "\n\r"] {
                    let mut edited = text.to_owned();
                    edited.replace_range(start..end, insert);
                    let mut idx = LineIndex::new(text);
                    idx.edit(&edited, start..end, insert.len());
                    let fresh = LineIndex::new(&edited);
                    assert_eq!((idx.starts, idx.len), (fresh.starts, fresh.len));
                }
            }
        }
    }

    #[test]
    fn columns_in_every_unit_on_non_ascii_text() {
        let text = "eye right\n  keratometry 7.8 mm × 175\r\n  note \"Zoë 😀\" # ok\n";
        let idx = LineIndex::new(text);
        let hash = text.find('#').unwrap();
        assert_eq!(idx.line_col(text, hash), (3, 16));
        assert_eq!(idx.position(text, hash, ColumnUnit::Utf8).col, 19);
        assert_eq!(idx.position(text, hash, ColumnUnit::Utf16).col, 16);
        for unit in [ColumnUnit::Utf8, ColumnUnit::Utf16, ColumnUnit::Char] {
            let pos = idx.position(text, hash, unit);
            assert_eq!(idx.offset(text, pos, unit), hash);
        }
        // `\r` of a CRLF is not a column: end of line 2 is after "175".
        let end2 = idx.line_span(text, 1).end();
        assert_eq!(&text[end2..end2 + 2], "\r\n");
    }

    /// `\n`, `\r\n` and a lone `\r` end a line; other separators do not.
    #[test]
    fn three_line_breaks_and_no_others() {
        let text = "a\rb\r\nc\nd\u{2028}e\u{2029}f\u{85}g\u{b}h\u{c}i\r";
        let idx = LineIndex::new(text);
        let lines: Vec<&str> = (0..idx.line_count())
            .map(|l| {
                let s = idx.line_span(text, l);
                &text[s.start()..s.end()]
            })
            .collect();
        assert_eq!(
            lines,
            ["a", "b", "c", "d\u{2028}e\u{2029}f\u{85}g\u{b}h\u{c}i", ""]
        );
        let d = text.find('d').unwrap();
        assert_eq!(
            idx.position(text, d + 4, ColumnUnit::Utf16),
            LinePos { line: 3, col: 2 }
        );
    }

    #[test]
    fn clamps_out_of_range_positions() {
        let text = "case\n  date 2026-01-02";
        let idx = LineIndex::new(text);
        let far = LinePos { line: 9, col: 0 };
        assert_eq!(idx.offset(text, far, ColumnUnit::Utf16), text.len());
        let long = LinePos { line: 0, col: 99 };
        assert_eq!(idx.offset(text, long, ColumnUnit::Utf16), 4);
        assert_eq!(idx.position(text, 999, ColumnUnit::Char).line, 1);
    }
}
