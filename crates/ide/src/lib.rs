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

use parax_eval::{Derived, Evaluation};
use parax_syntax::{Block, BlockKind, Line, Parsed, Span};

pub use parax_eval::Edit;

/// One case file, parsed and evaluated: the input of every feature.
#[derive(Debug, Clone)]
pub struct Analysis {
    /// The syntax tree.
    pub parsed: Parsed,
    /// Derived values and diagnostics.
    pub evaluation: Evaluation,
    /// Indices into `evaluation.derived`, ordered by where each value's
    /// statement starts, so the values of one line are found by binary search.
    by_start: Vec<usize>,
}

impl Analysis {
    /// Parse and evaluate `source`.
    pub fn new(source: &str) -> Self {
        let parsed = parax_syntax::parse(source);
        let evaluation = parax_eval::evaluate_incremental(&parsed, None);
        Self::from_parts(parsed, evaluation)
    }

    /// The analysis of `source`, a later version of the same document: only the
    /// lines that differ are parsed again (`parax_syntax::reparse`) and only the
    /// eye blocks whose inputs changed are computed again
    /// (`parax_eval::evaluate_incremental`); the result equals [`Analysis::new`].
    pub fn update(self, source: &str) -> Self {
        let Analysis {
            parsed, evaluation, ..
        } = self;
        let (range, insert) = changed(&parsed.source, source);
        let parsed = parsed.edit(range, insert);
        let evaluation = parax_eval::evaluate_incremental(&parsed, Some(evaluation));
        Self::from_parts(parsed, evaluation)
    }

    fn from_parts(parsed: Parsed, evaluation: Evaluation) -> Self {
        // Sorted by (start, index): ties keep the order of `derived`, as a stable
        // sort would. The keys sit next to each other (no look-up per comparison).
        let mut keyed: Vec<(usize, usize)> = evaluation
            .derived
            .iter()
            .enumerate()
            .map(|(i, d)| (d.span.start(), i))
            .collect();
        sort_nearly_sorted(&mut keyed);
        let by_start = keyed.into_iter().map(|(_, i)| i).collect();
        Analysis {
            parsed,
            evaluation,
            by_start,
        }
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

    /// Derived values whose statement lies on `line`.
    pub fn derived_on_line(&self, line: &Line) -> impl Iterator<Item = &Derived> + '_ {
        let span = line.span;
        let derived = &self.evaluation.derived;
        let first = self
            .by_start
            .partition_point(|&i| derived[i].span.start < span.start);
        self.by_start[first..]
            .iter()
            .map(move |&i| &derived[i])
            .take_while(move |d| d.span.start <= span.end)
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

/// The one edit that turns `old` into `new`: the bytes of `old` between the
/// common prefix and the common suffix, and what replaces them in `new`. Edits
/// merged from several changes become one range covering them all.
fn changed<'a>(old: &str, new: &'a str) -> (std::ops::Range<usize>, &'a str) {
    let (a, b) = (old.as_bytes(), new.as_bytes());
    let mut prefix = a.iter().zip(b).take_while(|(x, y)| x == y).count();
    while !old.is_char_boundary(prefix) {
        prefix -= 1;
    }
    let room = a.len().min(b.len()) - prefix;
    let mut suffix = a
        .iter()
        .rev()
        .zip(b.iter().rev())
        .take(room)
        .take_while(|(x, y)| x == y)
        .count();
    while !old.is_char_boundary(a.len() - suffix) || !new.is_char_boundary(b.len() - suffix) {
        suffix -= 1;
    }
    (prefix..a.len() - suffix, &new[prefix..b.len() - suffix])
}

/// Sort values that are nearly in order already. Each block's values come
/// together and lie inside the block, so only a few values of each block are out
/// of place (a value of a later line pushed before one of an earlier line):
/// insertion sort costs one step per displacement, which is much less than a
/// general sort of tens of thousands of values. When the displacements add up
/// to more than a few per value (blocks out of file order), it stops and uses
/// the library's sort instead, so the worst case stays `n log n`.
fn sort_nearly_sorted(v: &mut [(usize, usize)]) {
    let mut budget = 8 * v.len();
    for k in 1..v.len() {
        let mut j = k;
        while j > 0 && v[j - 1] > v[j] {
            v.swap(j - 1, j);
            j -= 1;
            if budget == 0 {
                v.sort_unstable();
                return;
            }
            budget -= 1;
        }
    }
}
