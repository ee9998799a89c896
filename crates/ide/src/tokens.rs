//! Semantic tokens: every meaningful piece of a line with a class of our own,
//! in source order, for highlighting.

use crate::{labels, Analysis};
use parax_syntax::{LineKind, Span, ValueKind};
use serde::Serialize;

/// Token classes. The language server maps them onto standard LSP token types.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum TokenClass {
    /// A block keyword at column 0.
    BlockKeyword,
    /// A statement keyword.
    Keyword,
    /// A number.
    Number,
    /// A unit after a number.
    Unit,
    /// A quoted string.
    Text,
    /// A date.
    Date,
    /// `x`, `×`, `/`, `@`, `,`, `±`.
    Operator,
    /// A lens label (definition or use).
    Label,
    /// Any other word.
    Word,
    /// A comment.
    Comment,
}

impl TokenClass {
    /// Every class, in a stable order (the legend order of the language server).
    pub const ALL: [TokenClass; 10] = [
        TokenClass::BlockKeyword,
        TokenClass::Keyword,
        TokenClass::Number,
        TokenClass::Unit,
        TokenClass::Text,
        TokenClass::Date,
        TokenClass::Operator,
        TokenClass::Label,
        TokenClass::Word,
        TokenClass::Comment,
    ];
}

/// One token: a span on one line and its class.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub struct Token {
    /// The bytes (never across a line break).
    pub span: Span,
    /// The class.
    pub class: TokenClass,
}

/// Every token of the file, in order.
pub fn tokens(a: &Analysis) -> Vec<Token> {
    let label_spans: Vec<Span> = {
        let defs = labels::definitions(a);
        let mut v: Vec<Span> = defs.iter().map(|d| d.span).collect();
        for d in &defs {
            v.extend(labels::references(a, d.span.start(), false));
        }
        v
    };
    let mut out = Vec::new();
    let mut push = |span: Span, class| {
        if !span.is_empty() {
            out.push(Token { span, class });
        }
    };
    for line in &a.parsed.lines {
        if let Some(st) = line.statement() {
            let class = if matches!(line.kind, LineKind::Header { .. }) {
                TokenClass::BlockKeyword
            } else {
                TokenClass::Keyword
            };
            push(st.keyword, class);
            for v in &st.values {
                match &v.kind {
                    ValueKind::Number { number, unit, .. } => {
                        push(*number, TokenClass::Number);
                        if let Some(u) = unit {
                            push(*u, TokenClass::Unit);
                        }
                    }
                    ValueKind::Text { .. } => push(v.span, TokenClass::Text),
                    ValueKind::Date { .. } => push(v.span, TokenClass::Date),
                    ValueKind::AxisSign | ValueKind::Symbol { .. } => {
                        push(v.span, TokenClass::Operator)
                    }
                    ValueKind::Word => {
                        if let Some(l) = label_spans.iter().find(|l| l.start == v.span.start) {
                            push(*l, TokenClass::Label);
                            push(Span::new(l.end(), v.span.end()), TokenClass::Word);
                        } else {
                            push(v.span, TokenClass::Word);
                        }
                    }
                }
            }
        }
        if let Some(c) = line.comment {
            let text = a.parsed.text(c);
            push(
                Span::new(c.start(), c.start() + text.trim_end_matches('\r').len()),
                TokenClass::Comment,
            );
        }
    }
    out
}
