//! Document outline (one symbol per block, lens labels under systems) and
//! folding ranges (blocks).

use crate::{labels, Analysis};
use parax_syntax::{BlockKind, Span};
use serde::Serialize;

/// One entry of the outline.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Symbol {
    /// Shown text: the header without its keyword, or the keyword alone.
    pub name: String,
    /// The block keyword (`eye`, `system`, …) or `lens`.
    pub detail: String,
    /// The block kind, `None` for a lens label.
    pub block: Option<BlockKind>,
    /// The whole block (or lens line).
    pub span: Span,
    /// The header (or label) to select.
    pub selection: Span,
    /// Lens labels of a system.
    pub children: Vec<Symbol>,
}

/// The outline of the file.
pub fn symbols(a: &Analysis) -> Vec<Symbol> {
    let defs = labels::definitions(a);
    a.parsed
        .blocks
        .iter()
        .map(|b| {
            let header = &a.parsed.lines[b.header];
            let st = header.statement().expect("a block header is a statement");
            let rest: Vec<&str> = st.values.iter().map(|v| a.parsed.text(v.span)).collect();
            let name = if rest.is_empty() {
                b.kind.keyword().to_string()
            } else {
                format!("{} {}", b.kind.keyword(), rest.join(" "))
            };
            let children = defs
                .iter()
                .filter(|d| d.block == b.span)
                .map(|d| {
                    let line = a.line_at(d.span.start());
                    Symbol {
                        name: d.name.clone(),
                        detail: "lens".into(),
                        block: None,
                        span: a.parsed.lines[line].span,
                        selection: d.span,
                        children: Vec::new(),
                    }
                })
                .collect();
            Symbol {
                name,
                detail: b.kind.keyword().into(),
                block: Some(b.kind),
                span: b.span,
                selection: header.span,
                children,
            }
        })
        .collect()
}

/// A foldable range of whole lines (0-based, inclusive).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub struct Fold {
    /// First line (the header).
    pub start_line: usize,
    /// Last line.
    pub end_line: usize,
    /// True for a run of comment lines, false for a block.
    pub comment: bool,
}

/// Folding ranges: every block of more than one line, and runs of two or more
/// column-0 comment lines.
pub fn folds(a: &Analysis) -> Vec<Fold> {
    let mut out: Vec<Fold> = a
        .parsed
        .blocks
        .iter()
        .filter(|b| b.end > b.header + 1)
        .map(|b| Fold {
            start_line: b.header,
            end_line: b.end - 1,
            comment: false,
        })
        .collect();
    let mut run: Option<usize> = None;
    for (i, l) in a
        .parsed
        .lines
        .iter()
        .enumerate()
        .chain(std::iter::once((a.parsed.lines.len(), &a.parsed.lines[0])))
    {
        let is_comment = i < a.parsed.lines.len()
            && l.indent == 0
            && l.comment.is_some()
            && matches!(l.kind, parax_syntax::LineKind::Trivia);
        match (is_comment, run) {
            (true, None) => run = Some(i),
            (false, Some(s)) => {
                if i - s >= 2 {
                    out.push(Fold {
                        start_line: s,
                        end_line: i - 1,
                        comment: true,
                    });
                }
                run = None;
            }
            _ => {}
        }
    }
    out.sort_by_key(|f| f.start_line);
    out
}
