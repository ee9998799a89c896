//! From text to [`Parsed`]: one pest pass per top-level block (a line at column 0
//! and the lines under it), each walked into [`Line`]s straight away, so pest's
//! token queue never holds more than one block; a block the grammar rejects is read
//! again line by line so that each bad line costs exactly one error and every other
//! line is still read. Then lines are grouped into blocks by indentation.

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
    if source.len() > crate::span::MAX_SOURCE_BYTES {
        return too_large(source);
    }
    let index = LineIndex::new(source);
    let mut errors = Vec::new();
    let count = index.line_count();
    let mut lines = Vec::with_capacity(count);
    let mut first = 0;
    while first < count {
        let mut end = first + 1;
        while end < count && !opens_block(source, index.line_start(end)) {
            end += 1;
        }
        parse_lines(source, &index, first..end, &mut lines, &mut errors);
        first = end;
    }
    finish(source.to_owned(), index, lines, errors)
}

/// A text whose offsets do not fit a [`Span`]: kept as it is, with no line read
/// and one error at its start.
fn too_large(source: &str) -> Parsed {
    Parsed {
        source: source.to_owned(),
        lines: Vec::new(),
        blocks: Vec::new(),
        errors: vec![SyntaxError {
            code: codes::TOO_LARGE,
            message: format!(
                "the file is {} bytes: parax reads files under 4 GiB",
                source.len()
            ),
            span: Span::new(0, 0),
            hint: Some("split the case file into smaller files".into()),
            replacement: None,
        }],
        index: LineIndex::new(""),
    }
}

/// True when the line starting at byte `at` starts a new chunk for [`parse`]: it
/// has a character at column 0 that is not white space or a comment. The grammar
/// is line-local, so any cut between lines reads the same; cutting where a block
/// (or a bad column-0 line) starts keeps each pest pass to one block.
fn opens_block(source: &str, at: usize) -> bool {
    source
        .as_bytes()
        .get(at)
        .is_some_and(|b| !matches!(b, b' ' | b'\t' | b'\r' | b'\n' | b'#'))
}

/// Parse lines `range` in one pest pass and push them onto `lines`; when the
/// grammar rejects any of them, read each line on its own instead.
fn parse_lines(
    source: &str,
    index: &LineIndex,
    range: std::ops::Range<usize>,
    lines: &mut Vec<Line>,
    errors: &mut Vec<SyntaxError>,
) {
    let start = index.line_start(range.start);
    // The last chunk runs to the end of the text; any other chunk stops before
    // its last line break.
    let end = if range.end == index.line_count() {
        source.len()
    } else {
        index.line_span(source, range.end - 1).end()
    };
    match Grammar::parse(Rule::file, &source[start..end]) {
        Ok(mut pairs) => {
            let file = pairs.next().expect("file rule yields one pair");
            let lines_of_file = file.into_inner().filter(|p| p.as_rule() != Rule::EOI);
            let expected = lines.len() + range.len();
            for (line_no, pair) in range.zip(lines_of_file) {
                let span = index.line_span(source, line_no);
                lines.push(walk_line(pair, span, start));
            }
            debug_assert_eq!(lines.len(), expected, "one pair per line");
        }
        Err(_) => {
            for line_no in range {
                let span = index.line_span(source, line_no);
                lines.push(parse_line(source, span, errors));
            }
        }
    }
}

/// Parse one line on its own (the line-by-line path). A line the grammar rejects
/// becomes an error line with its error pushed onto `errors`.
fn parse_line(source: &str, span: Span, errors: &mut Vec<SyntaxError>) -> Line {
    let text = &source[span.start()..span.end()];
    match Grammar::parse(Rule::line_only, text) {
        Ok(mut pairs) => {
            let pair = pairs.next().expect("line rule yields one pair");
            walk_line(pair, span, span.start())
        }
        Err(e) => {
            let at = match e.location {
                pest::error::InputLocation::Pos(p) => p,
                pest::error::InputLocation::Span((s, _)) => s,
            };
            errors.push(line_error(text, span.start(), at));
            Line {
                span,
                indent: indent_width(text),
                kind: LineKind::Error {
                    error: errors.len() - 1,
                },
                comment: None,
            }
        }
    }
}

/// Group the lines into blocks, sort the errors and point error lines at them.
fn finish(
    source: String,
    index: LineIndex,
    mut lines: Vec<Line>,
    mut errors: Vec<SyntaxError>,
) -> Parsed {
    let blocks = group_blocks(&source, &mut lines, &mut errors);
    errors.sort_by_key(|e| e.span.start);
    // Error lines point into `errors` by index: renumber after sorting. Both are
    // in source order, so one forward walk finds, for each error line, the first
    // error that starts inside it (a linear merge; a search per line was
    // quadratic in files with many errors).
    let mut next = 0;
    for line in &mut lines {
        if let LineKind::Error { error } = &mut line.kind {
            while next < errors.len() && errors[next].span.start < line.span.start {
                next += 1;
            }
            if next < errors.len() && errors[next].span.start <= line.span.end {
                *error = next;
            }
        }
    }
    Parsed {
        source,
        lines,
        blocks,
        errors,
        index,
    }
}

/// Re-parse after one edit: `old` is the parse of the text before the edit, which
/// replaced the bytes `edit` of `old.source` with `new_text`. The result is exactly
/// [`parse`] of the edited text (a property test checks it), but only the lines the
/// edit touches are read again by the grammar. This is possible because the grammar
/// is line-local (a line's reading never depends on another line): the other lines
/// are reused with their spans shifted, and only the grouping into blocks (one cheap
/// pass over the lines, no grammar) is redone for the whole file. An edit range that
/// is reversed, out of bounds or not on character boundaries gets a full parse.
pub fn reparse(old: &Parsed, edit: std::ops::Range<usize>, new_text: &str) -> Parsed {
    old.clone().edit(edit, new_text)
}

impl Parsed {
    /// Apply one edit (replace the bytes `edit` of the source with `new_text`) and
    /// re-parse only the lines it touches; see [`reparse`], which is this on a copy.
    pub fn edit(self, edit: std::ops::Range<usize>, new_text: &str) -> Parsed {
        let old_src = &self.source;
        if old_src.len().saturating_sub(edit.len()) + new_text.len() > crate::span::MAX_SOURCE_BYTES
            && edit.start <= edit.end
            && edit.end <= old_src.len()
        {
            let mut text = old_src.clone();
            text.replace_range(edit, new_text);
            return parse(&text);
        }
        if edit.start > edit.end
            || edit.end > old_src.len()
            || !old_src.is_char_boundary(edit.start)
            || !old_src.is_char_boundary(edit.end)
        {
            return parse(old_src);
        }
        let mut source = String::with_capacity(old_src.len() - edit.len() + new_text.len());
        source.push_str(&old_src[..edit.start]);
        source.push_str(new_text);
        source.push_str(&old_src[edit.end..]);
        let Parsed {
            lines: mut old_lines,
            errors: old_errors,
            index: old_index,
            blocks: old_blocks,
            ..
        } = self;
        // Old lines `first..=last` are replaced by new lines `first..=new_last`.
        let first = old_index.line_of(edit.start);
        let last = old_index.line_of(edit.end);
        let mut index = old_index;
        index.edit(&source, edit.clone(), new_text.len());
        let new_last = index.line_of(edit.start + new_text.len());
        let delta = new_text.len() as isize - edit.len() as isize;
        let mut errors = Vec::new();
        // The usual edit in a clean file: as many lines as before, each of the
        // same kind for the grouping. Then the blocks are the same blocks (only
        // their spans move) and no line is an error, so the grouping pass over
        // every line is skipped; `Parsed::edit` stays proportional to the lines
        // after the edit (their spans move), not to the whole file's grouping.
        if old_errors.is_empty() && new_last == last {
            let fresh: Vec<Line> = (first..=new_last)
                .map(|i| parse_line(&source, index.line_span(&source, i), &mut errors))
                .collect();
            let same = errors.is_empty()
                && fresh
                    .iter()
                    .zip(&old_lines[first..=last])
                    .all(|(a, b)| grouping(a) == grouping(b));
            if same {
                for line in &mut old_lines[last + 1..] {
                    line.shift(delta);
                }
                old_lines.splice(first..=last, fresh);
                let mut blocks = old_blocks;
                // Blocks that end before the edit keep their span.
                let from = blocks.partition_point(|b| b.end <= first);
                for b in &mut blocks[from..] {
                    b.span = Span::new(
                        old_lines[b.header].span.start(),
                        old_lines[b.end - 1].span.end(),
                    );
                }
                return Parsed {
                    source,
                    lines: old_lines,
                    blocks,
                    errors,
                    index,
                };
            }
            errors.clear();
        }
        // Restore an unchanged line to what the grammar made of it: its own error
        // back, or (for a statement that stood outside any block, which the
        // grouping rewrote) read again.
        let keep = |line: &mut Line, at: usize, errors: &mut Vec<SyntaxError>| {
            if let LineKind::Error { error } = line.kind {
                let e = &old_errors[error];
                if e.code == codes::OUTSIDE_BLOCK {
                    *line = parse_line(&source, index.line_span(&source, at), errors);
                } else {
                    let mut e = e.clone();
                    e.span = e.span.moved(if at > new_last { delta } else { 0 });
                    errors.push(e);
                    line.kind = LineKind::Error {
                        error: errors.len() - 1,
                    };
                }
            }
        };
        for (i, line) in old_lines[..first].iter_mut().enumerate() {
            keep(line, i, &mut errors);
        }
        let fresh: Vec<Line> = (first..=new_last)
            .map(|i| parse_line(&source, index.line_span(&source, i), &mut errors))
            .collect();
        let tail = new_last + 1;
        for (i, line) in old_lines[last + 1..].iter_mut().enumerate() {
            line.shift(delta);
            keep(line, tail + i, &mut errors);
        }
        old_lines.splice(first..=last, fresh);
        finish(source, index, old_lines, errors)
    }
}

/// What [`group_blocks`] makes of a line that is not an error: a header of
/// some kind, a statement, an indented comment (both extend the open block, but
/// a statement with no block open becomes an error, a comment does not), or a
/// line that it skips.
fn grouping(line: &Line) -> Option<(u8, Option<BlockKind>)> {
    let top = line.indent == 0;
    match &line.kind {
        LineKind::Header { block, .. } => Some((0, Some(*block))),
        LineKind::Statement { .. } => Some((1, None)),
        LineKind::Trivia if top || line.comment.is_none() => Some((2, None)),
        LineKind::Trivia => Some((3, None)),
        LineKind::Error { .. } => None,
    }
}

fn indent_width(text: &str) -> u32 {
    // A line is part of a text under 4 GiB (checked by `parse`).
    (text.len() - text.trim_start_matches([' ', '\t']).len()) as u32
}

/// Turn one `header` / `statement` / `trivia` pair into a [`Line`]. `base` is the
/// byte offset of the parsed text in the file.
fn walk_line(pair: Pair<'_, Rule>, span: Span, base: usize) -> Line {
    let rule = pair.as_rule();
    let mut indent = 0;
    let mut keyword = None;
    let mut block = None;
    let pairs = pair.into_inner();
    // Values are most of the tree: allocate exactly as many as the line holds
    // (a growing vector keeps up to 3 spare slots of a 40-byte value).
    let is_value = |r: Rule| {
        !matches!(
            r,
            Rule::indent | Rule::keyword | Rule::block_kind | Rule::comment
        )
    };
    let mut values = Vec::with_capacity(pairs.clone().filter(|p| is_value(p.as_rule())).count());
    let mut comment = None;
    for inner in pairs {
        let s = shift(inner.as_span(), base);
        match inner.as_rule() {
            Rule::indent => indent = s.len() as u32,
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
        let text_start = comment.map(|c| c.start()).unwrap_or(span.end());
        indent = (text_start - span.start()) as u32;
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
            // `−` (U+2212) reads as `-`; only then is a copy needed.
            let (signed, negative, digits) = match text.chars().next() {
                Some('−') => (true, true, &text['−'.len_utf8()..]),
                Some('+') | Some('-') => (true, false, text),
                _ => (false, false, text),
            };
            let decimals = digits
                .split_once('.')
                .map_or(0, |(_, d)| d.len().min(255) as u8);
            let value: f64 = digits.parse().unwrap_or(f64::NAN);
            ValueKind::Number {
                number: shift(num.as_span(), base),
                value: if negative { -value } else { value },
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
                .unwrap_or(Span::new(span.start() + 1, span.start() + 1));
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
    let indent = indent_width(text) as usize;
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
    let mut grouper = Grouper::default();
    let block = |(kind, header, last): (BlockKind, usize, usize), lines: &[Line]| Block {
        kind,
        header,
        end: last + 1,
        span: Span::new(lines[header].span.start(), lines[last].span.end()),
    };
    for i in 0..lines.len() {
        if let Some(closed) = grouper.step(source, i, &mut lines[i], errors) {
            blocks.push(block(closed, lines));
        }
    }
    if let Some(closed) = grouper.open.take() {
        blocks.push(block(closed, lines));
    }
    blocks
}

/// The grouping of lines into blocks, one line at a time, shared by [`parse`] and
/// [`parse_each`] so that both group exactly alike.
#[derive(Default)]
struct Grouper {
    /// (kind, header line, last line that belongs to the block)
    open: Option<(BlockKind, usize, usize)>,
    /// After an unreadable column-0 line, indented lines are its body: no extra errors.
    orphaned: bool,
}

impl Grouper {
    /// Take line `i` (every earlier line was taken before); returns the block it
    /// closes, if any, as (kind, header line, last line).
    fn step(
        &mut self,
        source: &str,
        i: usize,
        line: &mut Line,
        errors: &mut Vec<SyntaxError>,
    ) -> Option<(BlockKind, usize, usize)> {
        let top = line.indent == 0;
        match &line.kind {
            LineKind::Header { block, .. } => {
                let closed = self.open.take();
                self.open = Some((*block, i, i));
                self.orphaned = false;
                return closed;
            }
            LineKind::Statement { .. } if self.open.is_none() && !self.orphaned => {
                let span = line.span;
                let text = &source[span.start()..span.end()];
                let kw_start = span.start() + indent_width(text) as usize;
                errors.push(SyntaxError {
                    code: codes::OUTSIDE_BLOCK,
                    message: "this statement stands before any block".into(),
                    span: Span::new(kw_start, span.end()),
                    hint: Some(
                        "put it under a block header such as `eye right` or `case \"…\"`, \
                         or remove its indentation if it opens a block"
                            .into(),
                    ),
                    replacement: None,
                });
                line.kind = LineKind::Error {
                    error: errors.len() - 1,
                };
                line.comment = None;
            }
            LineKind::Error { .. } if top => {
                self.orphaned = true;
                return self.open.take();
            }
            LineKind::Trivia if top || line.comment.is_none() => {}
            _ => {
                if let Some(o) = self.open.as_mut() {
                    o.2 = i;
                }
            }
        }
        None
    }
}

/// Parse `source` one top-level block at a time and hand each block to `each`
/// as soon as it is read, with a [`Parsed`] that holds the whole source but only
/// that block's lines (the [`Block`] passed along indexes them: its `header` is
/// 0). The lines are dropped once `each` returns, so the syntax tree of the
/// whole file never exists: a reader that keeps only what it draws from each
/// block (`parax check` keeps the case model) holds one block's tree at a time.
///
/// The blocks, their lines and the errors are exactly those of [`parse`] (a test
/// in the evaluator compares the two on every example and fixture and after
/// random edits), except that, while `each` runs, the error lines' indices point
/// into the errors read so far, in reading order. Returns the source, the line
/// index and every syntax error in source order, with no lines and no blocks.
pub fn parse_each(source: &str, each: &mut dyn FnMut(&Parsed, &Block)) -> Parsed {
    if source.len() > crate::span::MAX_SOURCE_BYTES {
        return too_large(source);
    }
    let index = LineIndex::new(source);
    let count = index.line_count();
    let mut window = Parsed {
        source: source.to_owned(),
        lines: Vec::new(),
        blocks: Vec::new(),
        errors: Vec::new(),
        index,
    };
    // Lines read and not yet handed over: global line `first + k` is `pending[k]`.
    let mut pending: Vec<Line> = Vec::new();
    let mut first = 0;
    let mut grouper = Grouper::default();
    let mut hand_over = |(kind, header, last): (BlockKind, usize, usize),
                         pending: &mut [Line],
                         first: usize,
                         window: &mut Parsed| {
        // Move the block's lines out (the grouper never looks back at them).
        window.lines.clear();
        window
            .lines
            .extend(pending[header - first..=last - first].iter_mut().map(|l| {
                std::mem::replace(
                    l,
                    Line {
                        span: l.span,
                        indent: 0,
                        kind: LineKind::Trivia,
                        comment: None,
                    },
                )
            }));
        let block = Block {
            kind,
            header: 0,
            end: last - header + 1,
            span: Span::new(
                window.lines[0].span.start(),
                window.lines[last - header].span.end(),
            ),
        };
        each(window, &block);
        window.lines.clear();
    };
    let mut start = 0;
    while start < count {
        let mut end = start + 1;
        while end < count && !opens_block(&window.source, window.index.line_start(end)) {
            end += 1;
        }
        let from = pending.len();
        parse_lines(
            &window.source,
            &window.index,
            start..end,
            &mut pending,
            &mut window.errors,
        );
        for k in from..pending.len() {
            let closed = grouper.step(
                &window.source,
                first + k,
                &mut pending[k],
                &mut window.errors,
            );
            if let Some(closed) = closed {
                hand_over(closed, &mut pending, first, &mut window);
            }
        }
        // Keep only the lines of the block still open.
        let keep = grouper.open.map_or(end, |(_, header, _)| header);
        pending.drain(..keep - first);
        first = keep;
        start = end;
    }
    if let Some(closed) = grouper.open.take() {
        hand_over(closed, &mut pending, first, &mut window);
    }
    drop(pending);
    window.lines = Vec::new();
    window.errors.sort_by_key(|e| e.span.start);
    window
}

#[cfg(test)]
mod tests {
    use super::*;

    /// What `parse` gives for a text over 4 GiB (the text itself is too large
    /// for a test): the source kept, no line read, one P0005 error, and the
    /// formatter leaves it as it is.
    #[test]
    fn a_text_too_large_is_refused_and_kept() {
        let src = "eye right\n  refraction -1.00\n";
        let p = too_large(src);
        assert_eq!(p.source, src);
        assert!(p.lines.is_empty() && p.blocks.is_empty());
        assert_eq!(p.errors.len(), 1);
        assert_eq!(p.errors[0].code, codes::TOO_LARGE);
        assert!(p.errors[0].message.contains("under 4 GiB"));
        assert_eq!(crate::format::format(&p), src);
        // A text under the limit is read.
        assert!(parse(src).errors.is_empty());
    }

    /// The tree's per-value and per-line sizes (a 5 MB file holds about a
    /// million values): a field added or widened shows here.
    #[test]
    fn tree_nodes_stay_small() {
        use std::mem::size_of;
        assert_eq!(size_of::<Span>(), 8);
        assert!(size_of::<Value>() <= 40, "Value {}", size_of::<Value>());
        assert!(size_of::<Line>() <= 64, "Line {}", size_of::<Line>());
    }
}
