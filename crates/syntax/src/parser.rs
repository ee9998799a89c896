//! From text to [`Parsed`]: the whole file in one pest pass when it is clean (the
//! fast path), otherwise line by line so that each bad line costs exactly one error
//! and every other line is still read. Then lines are grouped into blocks by
//! indentation.

use crate::error::codes;
use crate::suggest::did_you_mean;
use crate::tree::*;
use crate::{LineIndex, Span, SyntaxError};
use pest::iterators::Pair;
use pest::Parser as _;

#[derive(pest_derive::Parser)]
#[grammar = "../../grammar/parax.pest"]
struct Grammar;

/// Parse a case file. Never fails and never panics; see [`Parsed::errors`].
pub fn parse(source: &str) -> Parsed {
    let index = LineIndex::new(source);
    let mut errors = Vec::new();
    let mut lines = Vec::with_capacity(index.line_count());
    match Grammar::parse(Rule::file, source) {
        Ok(mut pairs) => {
            let file = pairs.next().expect("file rule yields one pair");
            for (line_no, pair) in file.into_inner().enumerate() {
                if pair.as_rule() == Rule::EOI {
                    break;
                }
                let span = index.line_span(source, line_no);
                lines.push(walk_line(pair, span, 0));
            }
        }
        Err(_) => {
            for line_no in 0..index.line_count() {
                let span = index.line_span(source, line_no);
                let text = &source[span.start..span.end];
                match Grammar::parse(Rule::line_only, text) {
                    Ok(mut pairs) => {
                        let pair = pairs.next().expect("line rule yields one pair");
                        lines.push(walk_line(pair, span, span.start));
                    }
                    Err(e) => {
                        let at = match e.location {
                            pest::error::InputLocation::Pos(p) => p,
                            pest::error::InputLocation::Span((s, _)) => s,
                        };
                        errors.push(line_error(text, span.start, at));
                        lines.push(Line {
                            span,
                            indent: indent_width(text),
                            kind: LineKind::Error {
                                error: errors.len() - 1,
                            },
                            comment: None,
                        });
                    }
                }
            }
        }
    }
    let blocks = group_blocks(source, &mut lines, &mut errors);
    errors.sort_by_key(|e| e.span.start);
    // Error lines point into `errors` by index: renumber after sorting.
    for line in &mut lines {
        if let LineKind::Error { error } = &mut line.kind {
            if let Some(i) = errors
                .iter()
                .position(|e| line.span.start <= e.span.start && e.span.start <= line.span.end)
            {
                *error = i;
            }
        }
    }
    Parsed {
        source: source.to_owned(),
        lines,
        blocks,
        errors,
        index,
    }
}

fn indent_width(text: &str) -> usize {
    text.len() - text.trim_start_matches([' ', '\t']).len()
}

/// Turn one `header` / `statement` / `trivia` pair into a [`Line`]. `base` is the
/// byte offset of the parsed text in the file (0 on the fast path).
fn walk_line(pair: Pair<'_, Rule>, span: Span, base: usize) -> Line {
    let rule = pair.as_rule();
    let mut indent = 0;
    let mut keyword = None;
    let mut block = None;
    let mut values = Vec::new();
    let mut comment = None;
    for inner in pair.into_inner() {
        let s = shift(inner.as_span(), base);
        match inner.as_rule() {
            Rule::indent => indent = s.len(),
            Rule::keyword => keyword = Some(s),
            Rule::block_kind => {
                keyword = Some(s);
                block = BlockKind::from_keyword(inner.as_str());
            }
            Rule::comment => comment = Some(s),
            _ => values.push(walk_value(inner, base)),
        }
    }
    let kind = match (rule, keyword, block) {
        (Rule::header, Some(keyword), Some(block)) => LineKind::Header {
            block,
            statement: Statement { keyword, values },
        },
        (Rule::statement, Some(keyword), _) => LineKind::Statement {
            statement: Statement { keyword, values },
        },
        _ => LineKind::Trivia,
    };
    if matches!(kind, LineKind::Trivia) {
        let text_start = comment.map(|c| c.start).unwrap_or(span.end);
        indent = text_start - span.start;
    }
    Line {
        span,
        indent,
        kind,
        comment,
    }
}

fn shift(s: pest::Span<'_>, base: usize) -> Span {
    Span::new(s.start() + base, s.end() + base)
}

fn walk_value(pair: Pair<'_, Rule>, base: usize) -> Value {
    let span = shift(pair.as_span(), base);
    let kind = match pair.as_rule() {
        Rule::quantity => {
            let mut inner = pair.into_inner();
            let num = inner.next().expect("quantity has a number");
            let text = num.as_str();
            let unit = inner.next().map(|u| shift(u.as_span(), base));
            let (signed, digits) = match text.chars().next() {
                Some('−') => (true, format!("-{}", &text['−'.len_utf8()..])),
                Some('+') | Some('-') => (true, text.to_owned()),
                _ => (false, text.to_owned()),
            };
            let decimals = digits.split_once('.').map_or(0, |(_, d)| d.len() as u32);
            ValueKind::Number {
                number: shift(num.as_span(), base),
                value: digits.parse().unwrap_or(f64::NAN),
                signed,
                decimals,
                unit,
            }
        }
        Rule::string => {
            let text = pair
                .into_inner()
                .next()
                .map(|t| shift(t.as_span(), base))
                .unwrap_or(Span::new(span.start + 1, span.start + 1));
            ValueKind::Text { text }
        }
        Rule::date => {
            let t = pair.as_str();
            ValueKind::Date {
                year: t[0..4].parse().unwrap_or(0),
                month: t[5..7].parse().unwrap_or(0),
                day: t[8..10].parse().unwrap_or(0),
            }
        }
        Rule::axis_sign => ValueKind::AxisSign,
        Rule::symbol => ValueKind::Symbol {
            symbol: match pair.as_str() {
                "/" => Symbol::Slash,
                "," => Symbol::Comma,
                "@" => Symbol::At,
                _ => Symbol::PlusMinus,
            },
        },
        _ => ValueKind::Word,
    };
    Value { span, kind }
}

/// Explain why one line failed to parse. `at` is pest's failure offset in the line.
fn line_error(text: &str, base: usize, at: usize) -> SyntaxError {
    let indent = indent_width(text);
    let body = &text[indent..];
    let first_word: &str = body
        .split(|c: char| !(c.is_alphanumeric() || c == '-' || c == '_'))
        .next()
        .unwrap_or("");
    if indent == 0 && !first_word.is_empty() && BlockKind::from_keyword(first_word).is_none() {
        let span = Span::new(base, base + first_word.len());
        let kinds = BlockKind::ALL.map(BlockKind::keyword);
        let suggestion = did_you_mean(first_word, kinds);
        let hint = match suggestion {
            Some(s) => format!(
                "did you mean `{s}`? (if this line is a statement, indent it under its block)"
            ),
            None => format!(
                "a block starts at column 0 with one of: {}; the statements under it are indented",
                kinds.join(", ")
            ),
        };
        return SyntaxError {
            code: codes::UNKNOWN_BLOCK,
            message: format!("`{first_word}` does not open a block"),
            span,
            hint: Some(hint),
            replacement: suggestion.map(str::to_owned),
        };
    }
    if let Some(open) = unterminated_quote(text) {
        return SyntaxError {
            code: codes::UNTERMINATED_STRING,
            message: "this text has no closing quote".into(),
            span: Span::new(base + open, base + text.len()),
            hint: Some("end the text with `\"` before the end of the line".into()),
            replacement: None,
        };
    }
    let at = at.min(text.len());
    let ch = text[at..].chars().next();
    let (span, message) = match ch {
        Some(c) => {
            let end = text[at..]
                .find(char::is_whitespace)
                .map_or(text.len(), |w| at + w)
                .max(at + c.len_utf8());
            (
                Span::new(base + at, base + end),
                format!("unexpected `{}`", text[at..end].escape_debug()),
            )
        }
        None => (
            Span::new(base + at, base + at),
            "this line ends too early".into(),
        ),
    };
    SyntaxError {
        code: codes::UNEXPECTED,
        message,
        span,
        hint: Some(
            "a line is a keyword and then values: numbers with units (`12 mm`), \"text\", \
             dates (2026-10-02), words, `/`, `x` before an axis, `@` or `,`; a comment starts with `#`"
                .into(),
        ),
        replacement: None,
    }
}

/// Offset of an opening `"` that is never closed on this line, outside comments.
fn unterminated_quote(text: &str) -> Option<usize> {
    let mut open = None;
    let mut chars = text.char_indices();
    while let Some((i, c)) = chars.next() {
        match (c, open) {
            ('#', None) => return None,
            ('"', None) => open = Some(i),
            ('"', Some(_)) => open = None,
            ('\\', Some(_)) => {
                chars.next();
            }
            _ => {}
        }
    }
    open
}

/// Group lines into blocks and flag statements that stand outside any block.
fn group_blocks(source: &str, lines: &mut [Line], errors: &mut Vec<SyntaxError>) -> Vec<Block> {
    let mut blocks = Vec::new();
    // (kind, header line, last line that belongs to the block)
    let mut open: Option<(BlockKind, usize, usize)> = None;
    // After an unreadable column-0 line, indented lines are its body: no extra errors.
    let mut orphaned = false;
    let close =
        |open: Option<(BlockKind, usize, usize)>, lines: &[Line], blocks: &mut Vec<Block>| {
            if let Some((kind, header, last)) = open {
                blocks.push(Block {
                    kind,
                    header,
                    end: last + 1,
                    span: Span::new(lines[header].span.start, lines[last].span.end),
                });
            }
        };
    for i in 0..lines.len() {
        let top = lines[i].indent == 0;
        match &lines[i].kind {
            LineKind::Header { block, .. } => {
                close(open.take(), lines, &mut blocks);
                open = Some((*block, i, i));
                orphaned = false;
            }
            LineKind::Statement { .. } if open.is_none() && !orphaned => {
                let span = lines[i].span;
                let text = &source[span.start..span.end];
                let kw_start = span.start + indent_width(text);
                errors.push(SyntaxError {
                    code: codes::OUTSIDE_BLOCK,
                    message: "this statement stands before any block".into(),
                    span: Span::new(kw_start, span.end),
                    hint: Some(
                        "put it under a block header such as `eye right` or `case \"…\"`, \
                         or remove its indentation if it opens a block"
                            .into(),
                    ),
                    replacement: None,
                });
                lines[i].kind = LineKind::Error {
                    error: errors.len() - 1,
                };
                lines[i].comment = None;
            }
            LineKind::Error { .. } if top => {
                close(open.take(), lines, &mut blocks);
                orphaned = true;
            }
            LineKind::Trivia if top || lines[i].comment.is_none() => {}
            _ => {
                if let Some(o) = open.as_mut() {
                    o.2 = i;
                }
            }
        }
    }
    close(open.take(), lines, &mut blocks);
    blocks
}
