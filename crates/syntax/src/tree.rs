//! The syntax tree: every line of the file in order (nothing is dropped, so the
//! formatter can reproduce comments and blank lines), and the blocks they form.

use crate::{LineIndex, Span, SyntaxError};
use serde::Serialize;

/// The kinds of top-level block the notation knows.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, PartialOrd, Ord)]
#[serde(rename_all = "kebab-case")]
pub enum BlockKind {
    /// `case "title"`: who, when, notes.
    Case,
    /// `eye right|left [date]`: refraction, keratometry, biometry.
    Eye,
    /// `frame ["name"]`: fitting geometry.
    Frame,
    /// `spectacle-lens right|left`: a lens as ordered and as received.
    SpectacleLens,
    /// `contact-lens right|left`.
    ContactLens,
    /// `system "name"`: lenses and gaps on a bench or in a model.
    System,
    /// `model-eye "name"`: a schematic eye with overrides.
    ModelEye,
}

impl BlockKind {
    /// Every block kind, in the order the notation documents them.
    pub const ALL: [BlockKind; 7] = [
        BlockKind::Case,
        BlockKind::Eye,
        BlockKind::Frame,
        BlockKind::SpectacleLens,
        BlockKind::ContactLens,
        BlockKind::System,
        BlockKind::ModelEye,
    ];

    /// The keyword that opens the block.
    pub fn keyword(self) -> &'static str {
        match self {
            BlockKind::Case => "case",
            BlockKind::Eye => "eye",
            BlockKind::Frame => "frame",
            BlockKind::SpectacleLens => "spectacle-lens",
            BlockKind::ContactLens => "contact-lens",
            BlockKind::System => "system",
            BlockKind::ModelEye => "model-eye",
        }
    }

    /// The block kind opened by `keyword`, if any.
    pub fn from_keyword(keyword: &str) -> Option<BlockKind> {
        BlockKind::ALL.into_iter().find(|k| k.keyword() == keyword)
    }
}

/// A separator or sign between values.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Symbol {
    /// `/` between sphere and cylinder.
    Slash,
    /// `,` between list items.
    Comma,
    /// `@` before a vertex distance or meridian.
    At,
    /// `±` or `+/-` before a tolerance.
    PlusMinus,
}

/// What one value is.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum ValueKind {
    /// A number, with the unit written after it if any.
    Number {
        /// The digits (with sign) as written.
        number: Span,
        /// The number read as `f64`.
        value: f64,
        /// True when written with a leading `+` or `-`.
        signed: bool,
        /// Digits written after the decimal point (the written precision; 255 at most).
        decimals: u8,
        /// The unit as written, if any.
        unit: Option<Span>,
    },
    /// A quoted string; `text` is the inside, without quotes, escapes still in place.
    Text {
        /// The text between the quotes.
        text: Span,
    },
    /// A calendar date `YYYY-MM-DD`.
    Date {
        /// Year.
        year: u16,
        /// Month 1..=12 (not range-checked here).
        month: u8,
        /// Day 1..=31 (not range-checked here).
        day: u8,
    },
    /// The axis sign `x` or `×`.
    AxisSign,
    /// A separator.
    Symbol {
        /// Which one.
        symbol: Symbol,
    },
    /// A bare word: `right`, `rigid`, `L1`, `le-grand`.
    Word,
}

/// One value of a statement, with its span.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Value {
    /// Where it stands.
    pub span: Span,
    /// What it is.
    #[serde(flatten)]
    pub kind: ValueKind,
}

/// A keyword followed by values: a header or a body statement.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Statement {
    /// The keyword's span.
    pub keyword: Span,
    /// The values after the keyword, in order.
    pub values: Vec<Value>,
}

/// What a line holds besides its comment.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "line", rename_all = "kebab-case")]
pub enum LineKind {
    /// Nothing (blank, or only a comment).
    Trivia,
    /// A block header at column 0.
    Header {
        /// The block kind.
        block: BlockKind,
        /// Keyword and values.
        statement: Statement,
    },
    /// An indented statement.
    Statement {
        /// Keyword and values.
        statement: Statement,
    },
    /// A line that could not be read; its text is kept verbatim.
    Error {
        /// Index into [`Parsed::errors`].
        error: usize,
    },
}

/// One line of the source.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Line {
    /// The line without its line break.
    pub span: Span,
    /// Width in bytes of the leading spaces and tabs.
    pub indent: u32,
    /// What the line holds.
    #[serde(flatten)]
    pub kind: LineKind,
    /// The comment at the end of the line, `#` included.
    pub comment: Option<Span>,
}

impl Line {
    /// Move every span of the line by `by` bytes (after an edit before it).
    pub(crate) fn shift(&mut self, by: isize) {
        if by == 0 {
            return;
        }
        self.span = self.span.moved(by);
        self.comment = self.comment.map(|c| c.moved(by));
        if let LineKind::Header { statement, .. } | LineKind::Statement { statement } =
            &mut self.kind
        {
            statement.keyword = statement.keyword.moved(by);
            for v in &mut statement.values {
                v.span = v.span.moved(by);
                match &mut v.kind {
                    ValueKind::Number { number, unit, .. } => {
                        *number = number.moved(by);
                        *unit = unit.map(|u| u.moved(by));
                    }
                    ValueKind::Text { text } => *text = text.moved(by),
                    _ => {}
                }
            }
        }
    }

    /// The statement on this line, if it is a header or a statement.
    pub fn statement(&self) -> Option<&Statement> {
        match &self.kind {
            LineKind::Header { statement, .. } | LineKind::Statement { statement } => {
                Some(statement)
            }
            _ => None,
        }
    }
}

/// A top-level block: its header line and the lines under it.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Block {
    /// Which kind of block.
    pub kind: BlockKind,
    /// Index of the header line in [`Parsed::lines`].
    pub header: usize,
    /// One past the last line that belongs to the block (trailing blank lines and
    /// column-0 comments after the last statement are not part of it).
    pub end: usize,
    /// From the header's start to the end of the block's last line.
    pub span: Span,
}

impl Block {
    /// Indices of the body lines (after the header).
    pub fn body(&self) -> std::ops::Range<usize> {
        self.header + 1..self.end
    }
}

/// The result of parsing one file. Parsing never fails: unreadable lines become
/// [`LineKind::Error`] lines with an entry in `errors`.
#[derive(Debug, Clone)]
pub struct Parsed {
    /// The source text.
    pub source: String,
    /// Every line, in order.
    pub lines: Vec<Line>,
    /// The blocks, in order.
    pub blocks: Vec<Block>,
    /// Syntax errors, in source order.
    pub errors: Vec<SyntaxError>,
    /// Line starts, for positions.
    pub index: LineIndex,
}

impl Parsed {
    /// The source text under `span`.
    pub fn text(&self, span: Span) -> &str {
        &self.source[span.start()..span.end()]
    }

    /// The keyword text of a statement.
    pub fn keyword(&self, statement: &Statement) -> &str {
        self.text(statement.keyword)
    }

    /// The block whose lines include line `line`, if any.
    pub fn block_of_line(&self, line: usize) -> Option<&Block> {
        self.blocks
            .iter()
            .find(|b| b.header <= line && line < b.end)
    }

    /// Every comment in the file, in order.
    pub fn comments(&self) -> impl Iterator<Item = &str> + '_ {
        self.lines
            .iter()
            .filter_map(|l| l.comment.map(|c| self.text(c)))
    }
}
