//! The canonical layout of a case file. The formatter changes only white space:
//! every keyword, value, unit spelling and comment is kept as written, and lines it
//! cannot read are kept verbatim. Layout: block headers at column 0, statements and
//! indented comments at two spaces, single spaces between values (none before `,`,
//! none between a number and `°`, `Δ` or `%`), two spaces before a trailing comment
//! (no column alignment, so one edit never re-aligns its neighbours), one blank line
//! between blocks, no trailing spaces or tabs, one final line break. The
//! line-break style of the first line break (LF, CRLF or a lone CR) is kept.
//! White space here is the space and the tab; line breaks are `\n`, `\r\n` and a
//! lone `\r`, as the reader reads them. Every other separator (VT, FF, NEL,
//! U+2028, U+2029, a no-break space) is an ordinary character and is kept where it
//! stands, also at the end of a line or of a comment.

use crate::tree::{Line, LineKind, Parsed, Statement, ValueKind};

/// Indentation of statements and indented comments.
pub const INDENT: &str = "  ";

/// The white space the formatter may add, remove or change: the space and the
/// tab (the grammar's `blank`). Line breaks are not in a line's text at all.
const BLANKS: [char; 2] = [' ', '\t'];

/// Format a whole file. Idempotent: formatting the result again returns it unchanged.
pub fn format(parsed: &Parsed) -> String {
    if parsed.errors.first().map(|e| e.code) == Some(crate::codes::TOO_LARGE) {
        // Not read (too large for 32-bit offsets): left exactly as it is.
        return parsed.source.clone();
    }
    let src = &parsed.source;
    let eol = match src.find(['\n', '\r']) {
        Some(i) if src[i..].starts_with("\r\n") => "\r\n",
        Some(i) if src[i..].starts_with('\r') => "\r",
        _ => "\n",
    };
    let mut out = String::with_capacity(parsed.source.len() + 16);
    // What the last emitted line was: None at file start.
    let mut last: Option<Emitted> = None;
    let mut pending_blank = false;
    for line in &parsed.lines {
        let text = format_line(parsed, line);
        if text.is_empty() {
            pending_blank = last.is_some();
            continue;
        }
        let is_header = matches!(line.kind, LineKind::Header { .. });
        let want_blank = match last {
            None => false,
            Some(_) if pending_blank => true,
            Some(Emitted::TopComment) => false,
            Some(_) => is_header,
        };
        if want_blank {
            out.push_str(eol);
        }
        out.push_str(&text);
        out.push_str(eol);
        pending_blank = false;
        last = Some(
            if line.indent == 0 && matches!(line.kind, LineKind::Trivia) {
                Emitted::TopComment
            } else {
                Emitted::Other
            },
        );
    }
    out
}

#[derive(Clone, Copy)]
enum Emitted {
    TopComment,
    Other,
}

/// The canonical text of one line (without line break); empty for a blank line.
pub fn format_line(parsed: &Parsed, line: &Line) -> String {
    let comment = line
        .comment
        .map(|c| parsed.text(c).trim_end_matches(BLANKS));
    let mut out = String::new();
    match &line.kind {
        // Only trailing spaces and tabs are trimmed: any other character may be
        // what made the line unreadable, and the formatter never changes meaning.
        LineKind::Error { .. } => {
            return parsed.text(line.span).trim_end_matches(BLANKS).to_owned()
        }
        LineKind::Trivia => {
            if let Some(c) = comment {
                if line.indent > 0 {
                    out.push_str(INDENT);
                }
                out.push_str(c);
            }
            return out;
        }
        LineKind::Header { statement, .. } => write_statement(parsed, statement, &mut out),
        LineKind::Statement { statement } => {
            out.push_str(INDENT);
            write_statement(parsed, statement, &mut out);
        }
    }
    if let Some(c) = comment {
        out.push_str("  ");
        out.push_str(c);
    }
    out
}

/// Canonical text of a statement's keyword and values.
pub fn write_statement(parsed: &Parsed, statement: &Statement, out: &mut String) {
    out.push_str(parsed.text(statement.keyword));
    for (i, value) in statement.values.iter().enumerate() {
        let is_comma = matches!(
            value.kind,
            ValueKind::Symbol {
                symbol: crate::Symbol::Comma
            }
        );
        // A comma hugs the value before it, but never the keyword (values must
        // start after white space).
        if !is_comma || i == 0 {
            out.push(' ');
        }
        match &value.kind {
            ValueKind::Number {
                number,
                unit: Some(unit),
                ..
            } => {
                out.push_str(parsed.text(*number));
                let u = parsed.text(*unit);
                if !matches!(u, "°" | "Δ" | "%") {
                    out.push(' ');
                }
                out.push_str(u);
            }
            _ => out.push_str(parsed.text(value.span)),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::format;
    use crate::parse;

    #[test]
    fn canonical_layout() {
        let src = "\n\n# top\ncase   \"x\"   # c\n    date    2026-01-02\n\n\n\neye right\n\t refraction -4.50/-1.25x10 @12mm\n     keratometry 7.8mm x 180 ,7.6 mm x90\n  prism 2 Δ  BU\n    # inner\neye left\n  oops $\n";
        let want = "# top\ncase \"x\"  # c\n  date 2026-01-02\n\neye right\n  refraction -4.50 / -1.25 x 10 @ 12 mm\n  keratometry 7.8 mm x 180, 7.6 mm x 90\n  prism 2Δ BU\n  # inner\n\neye left\n  oops $\n";
        let got = format(&parse(src));
        assert_eq!(got, want);
        assert_eq!(format(&parse(&got)), got);
    }

    /// Found by a mutation run: a separator at the end of a comment was trimmed
    /// as white space. Only spaces and tabs are white space to the formatter.
    #[test]
    fn keeps_other_separators_at_line_ends() {
        for sep in ["\u{b}", "\u{c}", "\u{85}", "\u{2028}", "\u{2029}", "\u{a0}"] {
            for (src, want) in [
                (
                    format!("eye right  # c{sep}\n"),
                    format!("eye right  # c{sep}\n"),
                ),
                (
                    format!("# top{sep}\neye right\n"),
                    format!("# top{sep}\neye right\n"),
                ),
                (
                    format!("eye right\n  # c{sep} \n"),
                    format!("eye right\n  # c{sep}\n"),
                ),
                // Not white space inside a line either: the line is unreadable, kept.
                (
                    format!("eye right\n  add +1.00{sep}\n"),
                    format!("eye right\n  add +1.00{sep}\n"),
                ),
            ] {
                assert_eq!(format(&parse(&src)), want, "{src:?}");
            }
        }
    }

    /// Found by a mutation run: a lone CR was read as white space inside a line,
    /// so `eye\rright` (two lines to an editor) became `eye right`, and the `#`
    /// of `eye\r#` was put after the header. A lone CR is a line break.
    #[test]
    fn a_lone_cr_is_a_line_break() {
        let p = parse("eye\rright");
        assert_eq!(p.lines.len(), 2);
        assert_eq!(p.text(p.lines[1].span), "right");
        for (src, want) in [
            ("eye\rright", "eye\rright\r"),
            ("eye\r#", "eye\r#\r"),
            ("eye right\r  add\r+1.00\r", "eye right\r  add\r+1.00\r"),
            (
                "eye right\r\r\r  add +1.00   \r",
                "eye right\r\r  add +1.00\r",
            ),
            // The first line break sets the style, every line break counts.
            (
                "eye right\n  add +1.00\r  vertex 12 mm\r\n",
                "eye right\n  add +1.00\n  vertex 12 mm\n",
            ),
            ("case\r\n  note \"a\rb\"\n", "case\r\n  note \"a\r\nb\"\r\n"),
        ] {
            assert_eq!(format(&parse(src)), want, "{src:?}");
        }
    }

    #[test]
    fn keeps_crlf() {
        let got = format(&parse("eye right\r\n  add +2.00\r\n"));
        assert_eq!(got, "eye right\r\n  add +2.00\r\n");
    }
}
