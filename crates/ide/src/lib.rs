//! Editor features as plain functions over one parsed and evaluated case file:
//! inlay hints, hover, completion, code actions, document symbols, folding
//! ranges, semantic tokens, lens-label navigation and formatting. Byte offsets in,
//! plain data out; nothing here knows the Language Server Protocol, so the
//! language server, the command line and tests share the same code.

pub mod actions;
pub mod complete;
pub mod format;
pub mod hints;
pub mod hover;
pub mod labels;
pub mod outline;
pub mod tokens;

use parax_eval::{Derived, EvalOptions, Evaluation};
use parax_syntax::{Block, BlockKind, Line, Parsed, Span};
use std::ops::Range;

pub use parax_eval::Edit;

/// One case file, parsed and evaluated: the input of every feature.
#[derive(Debug, Clone)]
pub struct Analysis {
    /// The syntax tree.
    pub parsed: Parsed,
    /// Derived values and diagnostics.
    pub evaluation: Evaluation,
}

impl Analysis {
    /// Parse and evaluate `source`. Values and diagnostics only: the
    /// substituted formulas, which only a hover shows, are written on demand
    /// by [`Analysis::explained`] (formatting every formula of the file on
    /// every edit was most of an edit's evaluation time).
    pub fn new(source: &str) -> Self {
        let parsed = parax_syntax::parse(source);
        let evaluation = parax_eval::reevaluate(&parsed, None, None, EvalOptions::VALUES_ONLY);
        Self::from_parts(parsed, evaluation)
    }

    /// The analysis of `source`, a later version of the same document given
    /// whole (a client that sends the whole text, or a file read again): the
    /// one edit between the two texts is found by comparing them (common
    /// prefix and suffix), then applied as by [`Analysis::edit`]; the result
    /// equals [`Analysis::new`]. When the edit is known, [`Analysis::edit`] and
    /// [`Analysis::edits`] skip the comparison.
    pub fn update(self, source: &str) -> Self {
        let (range, insert) = changed(&self.parsed.source, source);
        self.edit(range, insert)
    }

    /// The analysis after one edit: the bytes `range` of the current text were
    /// replaced by `insert`. Only the lines the edit touches are parsed again
    /// (`Parsed::edit`) and only the blocks it touched are read and computed
    /// again (`parax_eval::reevaluate`, told the edit); the result equals
    /// [`Analysis::new`] of the edited text. A range that is reversed, past the
    /// end of the text or inside a character is ignored (the text stays as it
    /// was).
    pub fn edit(self, range: Range<usize>, insert: &str) -> Self {
        self.edits([(range, insert)])
    }

    /// The analysis after several edits applied in order, each range in the
    /// text as the edits before it left it (how an editor sends a burst of
    /// changes): each is parsed as it comes, and the blocks are evaluated once,
    /// over one range covering every edit. Invalid ranges are ignored as in
    /// [`Analysis::edit`]. The result equals [`Analysis::new`] of the edited text.
    pub fn edits<'a>(self, edits: impl IntoIterator<Item = (Range<usize>, &'a str)>) -> Self {
        let Analysis {
            mut parsed,
            evaluation,
        } = self;
        let mut cover: Option<Cover> = None;
        for (range, insert) in edits {
            let text = &parsed.source;
            if range.start > range.end
                || range.end > text.len()
                || !text.is_char_boundary(range.start)
                || !text.is_char_boundary(range.end)
            {
                continue;
            }
            cover = Some(match cover {
                None => Cover {
                    start: range.start,
                    old_end: range.end,
                    new_end: range.start + insert.len(),
                },
                Some(c) => c.then(&range, insert.len()),
            });
            parsed = parsed.edit(range, insert);
        }
        let Some(c) = cover else {
            return Analysis { parsed, evaluation };
        };
        let edit = parax_eval::TextEdit {
            replaced: c.start..c.old_end,
            inserted: c.new_end - c.start,
        };
        let evaluation = parax_eval::reevaluate(
            &parsed,
            Some(evaluation),
            Some(edit),
            EvalOptions::VALUES_ONLY,
        );
        Self::from_parts(parsed, evaluation)
    }

    fn from_parts(parsed: Parsed, evaluation: Evaluation) -> Self {
        Analysis { parsed, evaluation }
    }

    /// The source text.
    pub fn source(&self) -> &str {
        &self.parsed.source
    }

    /// Index of the line holding byte `offset` (clamped to the text).
    pub fn line_at(&self, offset: usize) -> usize {
        self.parsed
            .index
            .line_of(offset.min(self.parsed.source.len()))
            .min(self.parsed.lines.len().saturating_sub(1))
    }

    /// The block a line belongs to; a blank or comment line after a block's last
    /// statement counts as inside it when indented or empty (where one types next).
    pub fn block_around(&self, line: usize) -> Option<&Block> {
        if let Some(b) = self.parsed.block_of_line(line) {
            return Some(b);
        }
        let l = self.parsed.lines.get(line)?;
        let text = self.parsed.text(l.span);
        if text.starts_with([' ', '\t']) || text.is_empty() {
            self.parsed.blocks.iter().rev().find(|b| b.header < line)
        } else {
            None
        }
    }

    /// Derived values whose statement lies on `line` (found through [`Evaluation::values_starting_in`], which looks only at the
    /// blocks around the line), ordered by where they start, then as evaluated.
    pub fn derived_on_line(&self, line: &Line) -> impl Iterator<Item = &Derived> + '_ {
        let derived = &self.evaluation.derived;
        self.evaluation
            .values_starting_in(line.span)
            .into_iter()
            .map(move |i| &derived[i])
    }

    /// The values at `indices` of the evaluation's derived values with their
    /// substituted formulas written (computed again for their blocks only, see
    /// [`Evaluation::explained`]).
    pub fn explained(&self, indices: &[usize]) -> Vec<Derived> {
        self.evaluation.explained(indices)
    }

    /// The kind of the block that holds `line`, if any.
    pub fn block_kind(&self, line: usize) -> Option<BlockKind> {
        self.block_around(line).map(|b| b.kind)
    }
}

/// True when two spans overlap or touch.
pub(crate) fn meets(a: Span, b: Span) -> bool {
    a.start <= b.end && b.start <= a.end
}

/// One edit covering a sequence of edits: the bytes `start..old_end` of the
/// text before the first edit became the bytes `start..new_end` of the text
/// after the last one (the bytes outside are untouched).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
struct Cover {
    start: usize,
    old_end: usize,
    new_end: usize,
}

impl Cover {
    /// The cover after one more edit: `range` of the current text replaced by
    /// `inserted` bytes.
    fn then(self, range: &Range<usize>, inserted: usize) -> Cover {
        // Bytes before `start` are unchanged, so `range.start` means the same
        // in the old text; bytes after `new_end` are the old text's shifted.
        let end = range.end.max(self.new_end);
        Cover {
            start: self.start.min(range.start),
            old_end: self.old_end + (end - self.new_end),
            new_end: end - range.len() + inserted,
        }
    }
}

/// The one edit that turns `old` into `new`: the bytes of `old` between the
/// common prefix and the common suffix, and what replaces them in `new`. Edits
/// merged from several changes become one range covering them all.
fn changed<'a>(old: &str, new: &'a str) -> (Range<usize>, &'a str) {
    let (a, b) = (old.as_bytes(), new.as_bytes());
    let mut prefix = common_prefix(a, b);
    while !old.is_char_boundary(prefix) {
        prefix -= 1;
    }
    let room = a.len().min(b.len()) - prefix;
    let mut suffix = common_suffix(&a[a.len() - room..], &b[b.len() - room..]);
    while !old.is_char_boundary(a.len() - suffix) || !new.is_char_boundary(b.len() - suffix) {
        suffix -= 1;
    }
    (prefix..a.len() - suffix, &new[prefix..b.len() - suffix])
}

/// Chunk size for [`common_prefix`] and [`common_suffix`]: whole chunks are
/// compared as slices (one memory comparison each, much faster than a byte
/// loop over a large file), then the differing chunk byte by byte.
const CHUNK: usize = 256;

/// Length of the longest common prefix of `a` and `b`.
fn common_prefix(a: &[u8], b: &[u8]) -> usize {
    let n = a.len().min(b.len());
    let mut i = 0;
    while i + CHUNK <= n && a[i..i + CHUNK] == b[i..i + CHUNK] {
        i += CHUNK;
    }
    i + a[i..n]
        .iter()
        .zip(&b[i..n])
        .take_while(|(x, y)| x == y)
        .count()
}

/// Length of the longest common suffix of `a` and `b`.
fn common_suffix(a: &[u8], b: &[u8]) -> usize {
    let n = a.len().min(b.len());
    let (a, b) = (&a[a.len() - n..], &b[b.len() - n..]);
    let mut i = 0;
    while i + CHUNK <= n && a[n - i - CHUNK..n - i] == b[n - i - CHUNK..n - i] {
        i += CHUNK;
    }
    i + a[..n - i]
        .iter()
        .rev()
        .zip(b[..n - i].iter().rev())
        .take_while(|(x, y)| x == y)
        .count()
}
