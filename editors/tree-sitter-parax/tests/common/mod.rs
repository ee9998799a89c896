//! Shared by the grammar tests: parse with tree-sitter, and reduce a file to what
//! both grammars say about each line (kind, keyword, values, unit, comment), from
//! the tree-sitter tree and from `parax_syntax::parse` (pest).

use std::collections::BTreeSet;
use tree_sitter::{Node, Parser, Tree};

/// Parse `source` with the parax tree-sitter grammar.
pub fn parse(source: &str) -> Tree {
    let mut parser = Parser::new();
    parser
        .set_language(&tree_sitter_parax::LANGUAGE.into())
        .expect("the generated parser's ABI is supported by the tree-sitter crate");
    parser
        .parse(source, None)
        .expect("tree-sitter returns a tree")
}

/// What one line holds, as both parsers can say it.
#[derive(Debug, PartialEq, Clone)]
pub enum LineView {
    Trivia {
        comment: Option<(usize, usize)>,
    },
    Header {
        kind: (usize, usize),
        values: Vec<ValueView>,
        comment: Option<(usize, usize)>,
    },
    Statement {
        indent: usize,
        keyword: (usize, usize),
        values: Vec<ValueView>,
        comment: Option<(usize, usize)>,
    },
}

/// One value: its kind (tree-sitter's node name), its range (for a number, the
/// digits only) and, for a number, its unit's range.
#[derive(Debug, PartialEq, Clone)]
pub struct ValueView {
    pub kind: &'static str,
    pub range: (usize, usize),
    pub unit: Option<(usize, usize)>,
}

/// Pest's view of each line; `None` for a line pest cannot read.
pub fn pest_lines(source: &str) -> Vec<Option<LineView>> {
    use parax_syntax::{LineKind, ValueKind};
    let parsed = parax_syntax::parse(source);
    let span = |s: parax_syntax::Span| (s.start(), s.end());
    parsed
        .lines
        .iter()
        .map(|line| {
            let values = |st: &parax_syntax::Statement| {
                st.values
                    .iter()
                    .map(|v| match &v.kind {
                        ValueKind::Number { number, unit, .. } => ValueView {
                            kind: "number",
                            range: span(*number),
                            unit: unit.map(span),
                        },
                        other => ValueView {
                            kind: match other {
                                ValueKind::Text { .. } => "string",
                                ValueKind::Date { .. } => "date",
                                ValueKind::AxisSign => "axis_sign",
                                ValueKind::Symbol { .. } => "symbol",
                                _ => "word",
                            },
                            range: span(v.span),
                            unit: None,
                        },
                    })
                    .collect()
            };
            let comment = line.comment.map(span);
            match &line.kind {
                LineKind::Trivia => Some(LineView::Trivia { comment }),
                LineKind::Header { statement, .. } => Some(LineView::Header {
                    kind: span(statement.keyword),
                    values: values(statement),
                    comment,
                }),
                LineKind::Statement { statement } => Some(LineView::Statement {
                    indent: line.indent as usize,
                    keyword: span(statement.keyword),
                    values: values(statement),
                    comment,
                }),
                LineKind::Error { .. } => None,
            }
        })
        .collect()
}

fn range(node: Node) -> (usize, usize) {
    (node.start_byte(), node.end_byte())
}

/// The tree-sitter view of each line of `source`; lines without a node are
/// trivia. A node's line comes from its byte offset by the notation's line
/// breaks (`parax_syntax::LineIndex`: `\n`, `\r\n`, lone `\r`), not from
/// tree-sitter's row, which counts `\n` only.
pub fn tree_lines(tree: &Tree, source: &str, line_count: usize) -> Vec<LineView> {
    let index = parax_syntax::LineIndex::new(source);
    let mut lines = vec![LineView::Trivia { comment: None }; line_count];
    let root = tree.root_node();
    let mut cursor = root.walk();
    for node in root.named_children(&mut cursor) {
        let row = index.line_of(node.start_byte());
        // ERROR nodes' rows are in `error_rows`, where the comparison stops.
        if row >= line_count || node.is_error() {
            continue;
        }
        let mut values = Vec::new();
        let mut comment = None;
        let mut head = (0, 0);
        let mut indent = 0;
        let mut c = node.walk();
        for child in node.named_children(&mut c) {
            match child.kind() {
                "block_kind" | "keyword" => head = range(child),
                "indent" => indent = child.end_byte() - child.start_byte(),
                "comment" => comment = Some(range(child)),
                "quantity" => {
                    let number = child.child_by_field_name("number").or(child.named_child(0));
                    let unit = (0..child.named_child_count())
                        .filter_map(|i| child.named_child(i))
                        .find(|n| n.kind() == "unit");
                    values.push(ValueView {
                        kind: "number",
                        range: range(number.unwrap()),
                        unit: unit.map(range),
                    });
                }
                kind @ ("string" | "date" | "axis_sign" | "symbol" | "word") => {
                    values.push(ValueView {
                        kind: match kind {
                            "string" => "string",
                            "date" => "date",
                            "axis_sign" => "axis_sign",
                            "symbol" => "symbol",
                            _ => "word",
                        },
                        range: range(child),
                        unit: None,
                    })
                }
                // Its rows are in `error_rows`, where the comparison stops.
                "ERROR" => {}
                other => panic!("unexpected node {other} in a line"),
            }
        }
        lines[row] = match node.kind() {
            "comment" => LineView::Trivia {
                comment: Some(range(node)),
            },
            "header" => LineView::Header {
                kind: head,
                values,
                comment,
            },
            "statement" => LineView::Statement {
                indent,
                keyword: head,
                values,
                comment,
            },
            _ => continue,
        };
    }
    lines
}

/// Lines of `source` (counted as in [`tree_lines`]) covered by ERROR or
/// MISSING nodes.
pub fn error_rows(tree: &Tree, source: &str) -> BTreeSet<usize> {
    let index = parax_syntax::LineIndex::new(source);
    let mut rows = BTreeSet::new();
    let mut stack = vec![tree.root_node()];
    while let Some(node) = stack.pop() {
        if node.is_error() || node.is_missing() {
            rows.extend(index.line_of(node.start_byte())..=index.line_of(node.end_byte()));
            continue;
        }
        if node.has_error() {
            let mut c = node.walk();
            stack.extend(node.children(&mut c));
        }
    }
    rows
}
