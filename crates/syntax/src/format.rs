//! The canonical layout of a case file. The formatter changes only white space:
//! every keyword, value, unit spelling and comment is kept as written, and lines it
//! cannot read are kept verbatim. Layout: block headers at column 0, statements and
//! indented comments at two spaces, single spaces between values (none before `,`,
//! none between a number and `°`, `Δ` or `%`), two spaces before a trailing comment
//! (no column alignment, so one edit never re-aligns its neighbours), one blank line
//! between blocks, no trailing white space, one final line break. The line-break
//! style (LF or CRLF) of the first line is kept.

use crate::tree::{Line, LineKind, Parsed, Statement, ValueKind};

/// Indentation of statements and indented comments.
pub const INDENT: &str = "  ";

/// Format a whole file. Idempotent: formatting the result again returns it unchanged.
pub fn format(parsed: &Parsed) -> String {
    if parsed.errors.first().map(|e| e.code) == Some(crate::codes::TOO_LARGE) {
        // Not read (too large for 32-bit offsets): left exactly as it is.
        return parsed.source.clone();
    }
    let eol = if parsed
        .source
        .split('\n')
        .next()
        .is_some_and(|l| l.ends_with('\r'))
        && parsed.source.contains('\n')
    {
        "\r\n"
    } else {
        "\n"
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
    let comment = line.comment.map(|c| parsed.text(c).trim_end());
    let mut out = String::new();
    match &line.kind {
        // Only trailing spaces, tabs and carriage returns are trimmed: any other character may be what made the
        // line unreadable, and the formatter never changes meaning.
        LineKind::Error { .. } => {
            return parsed
                .text(line.span)
                .trim_end_matches([' ', '\t', '\r'])
                .to_owned()
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

    #[test]
    fn keeps_crlf() {
        let got = format(&parse("eye right\r\n  add +2.00\r\n"));
        assert_eq!(got, "eye right\r\n  add +2.00\r\n");
    }
}
