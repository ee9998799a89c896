//! From the syntax tree to the case model: each block's header is read by its
//! block module, then each statement is looked up in that module's keyword
//! table ([`crate::blocks::Keyword`]) and read by the entry's reader; whatever
//! does not fit becomes a diagnostic and the rest of the block is still read.

use crate::blocks::Keyword;
use crate::blocks::{case, contact_lens, eye, frame, model_eye, spectacle_lens, system};
use crate::codes;
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::*;
use crate::read::Reader;
use crate::schema;
use crate::units::{self as u};
use parax_optics::keratometry::{keratometric_radius, KERATOMETRIC_INDEX};
use parax_syntax::{
    Block as SyntaxBlock, BlockKind, LineKind, Parsed, Span, Symbol, Value, ValueKind,
};

/// Read every block of `p` into a [`Case`], appending diagnostics to `diags`.
pub fn lower(p: &Parsed, diags: &mut Vec<Diagnostic>) -> Case {
    let mut case = Case::default();
    // One entry per block at most: size the list once (a long history holds
    // tens of thousands of eye blocks; a growing vector keeps up to half spare).
    let count = p
        .blocks
        .iter()
        .filter(|b| b.kind != BlockKind::Case)
        .count();
    case.blocks.reserve_exact(count);
    for block in &p.blocks {
        lower_block(p, block, &mut case, diags);
    }
    case
}

fn statement_span(p: &Parsed, line: usize) -> Span {
    let l = &p.lines[line];
    let end = l.comment.map_or(l.span.end(), |c| c.start());
    let text = &p.source[l.span.start()..end];
    let start = l.span.start() + (text.len() - text.trim_start().len());
    Span::new(start, start + text.trim().len())
}

/// Read one block into `case`, appending diagnostics to `diags`.
pub(crate) fn lower_block(
    p: &Parsed,
    block: &SyntaxBlock,
    case: &mut Case,
    diags: &mut Vec<Diagnostic>,
) {
    let models = &case.blocks;
    let before = |k: BlockKind| models.iter().filter(|b| b.kind() == k).count();
    if let Some(b) = read_block(p, block, &mut case.info, &before, diags) {
        crate::push_growing_slowly(&mut case.blocks, b);
    }
}

/// Read one block: the `case` block into `info` (then `None`), any other into
/// its model, `None` when its header cannot be read (its statements are still
/// checked). `before(kind)` counts the blocks of `kind` before this one (an
/// unnamed system or model eye is named by its place).
pub(crate) fn read_block(
    p: &Parsed,
    block: &SyntaxBlock,
    info: &mut CaseInfo,
    before: &dyn Fn(BlockKind) -> usize,
    diags: &mut Vec<Diagnostic>,
) -> Option<Block> {
    let span = statement_span(p, block.header);
    let mut b = match block.kind {
        BlockKind::Case => {
            read_kind(p, block, diags, case::KEYWORDS, move |r, form| {
                case::read_header(r, form, &mut *info);
                Some(info)
            });
            return None;
        }
        BlockKind::Eye => read_kind(p, block, diags, eye::KEYWORDS, |r, form| {
            eye::read_header(r, form, span)
        })
        .map(Block::Eye),
        BlockKind::Frame => read_kind(p, block, diags, frame::KEYWORDS, |r, form| {
            frame::read_header(r, form, span)
        })
        .map(Block::Frame),
        BlockKind::SpectacleLens => {
            read_kind(p, block, diags, spectacle_lens::KEYWORDS, |r, form| {
                spectacle_lens::read_header(r, form, span)
            })
            .map(Block::SpectacleLens)
        }
        BlockKind::ContactLens => read_kind(p, block, diags, contact_lens::KEYWORDS, |r, form| {
            contact_lens::read_header(r, form, span)
        })
        .map(Block::ContactLens),
        BlockKind::System => read_kind(p, block, diags, system::KEYWORDS, |r, form| {
            system::read_header(r, form, span, || before(BlockKind::System))
        })
        .map(Block::System),
        BlockKind::ModelEye => read_kind(p, block, diags, model_eye::KEYWORDS, |r, form| {
            model_eye::read_header(r, form, span, || before(BlockKind::ModelEye))
        })
        .map(Block::ModelEye),
    }?;
    b.shrink();
    Some(b)
}

/// A model being read, owned (a block) or borrowed (the `case` block's facts).
trait Slot<M> {
    fn model(&mut self) -> &mut M;
}

impl<M> Slot<M> for M {
    fn model(&mut self) -> &mut M {
        self
    }
}

impl<M> Slot<M> for &mut M {
    fn model(&mut self) -> &mut M {
        self
    }
}

/// Read a block of the kind whose keyword table is `table`: its header by
/// `header` (`None`: unreadable, the statements are checked and dropped), then
/// every statement by its table entry.
fn read_kind<M: 'static, S: Slot<M>>(
    p: &Parsed,
    block: &SyntaxBlock,
    diags: &mut Vec<Diagnostic>,
    table: &'static [Keyword<M>],
    header: impl FnOnce(&mut Reader<'_>, &'static str) -> Option<S>,
) -> Option<S> {
    let statement = p.lines[block.header]
        .statement()
        .expect("a block starts with a header");
    let form = schema::header_form(block.kind);
    let first_header_diag = diags.len();
    let mut model = {
        let mut r = Reader::new(p, statement, diags);
        header(&mut r, form)
    };
    // Shape errors on the header line are header errors.
    for d in &mut diags[first_header_diag..] {
        if d.code == codes::BAD_VALUES {
            d.code = codes::BAD_HEADER;
        }
    }
    let mut seen: Vec<&str> = Vec::new();
    for line in block.body() {
        let LineKind::Statement { statement } = &p.lines[line].kind else {
            continue;
        };
        let span = statement_span(p, line);
        let kw = p.keyword(statement);
        let Some(entry) = table.iter().find(|k| k.spec.name == kw) else {
            diags.push(unknown_keyword(block.kind, kw, statement.keyword));
            continue;
        };
        if !entry.spec.repeatable {
            if seen.contains(&kw) {
                diags.push(
                    Diagnostic::new(
                        codes::DUPLICATE,
                        Severity::Warning,
                        statement.keyword,
                        format!("`{kw}` appears more than once in this block; this one is ignored"),
                    )
                    .hint("keep one, or record a later visit as a block of its own"),
                );
                continue;
            }
            seen.push(kw);
        }
        let form = entry.spec.form;
        let mut r = Reader::new(p, statement, diags);
        match &mut model {
            Some(m) => (entry.read)(&mut r, m.model(), span, form),
            // A block whose header could not be read: its notes and `expect`
            // lines are still checked, the rest is skipped.
            None => match kw {
                "expect" => {
                    read_expect(&mut r, form, span);
                    while r.next_value().is_some() {}
                }
                "note" => {
                    r.text_value("the note", form);
                }
                _ => {
                    r.rest();
                }
            },
        }
        r.finish(form);
    }
    model
}

pub(crate) fn side(r: &mut Reader<'_>, form: &str) -> Option<Side> {
    match r.word_of(&["right", "left"], "a side", form)? {
        "right" => Some(Side::Right),
        _ => Some(Side::Left),
    }
}

fn unknown_keyword(kind: BlockKind, kw: &str, span: Span) -> Diagnostic {
    let names = schema::keywords(kind).into_iter().map(|k| k.name);
    let mut d = Diagnostic::new(
        codes::UNKNOWN_KEYWORD,
        Severity::Error,
        span,
        format!("`{kw}` is not a keyword of `{}` blocks", kind.keyword()),
    );
    if let Some(s) = parax_syntax::suggest::did_you_mean(kw, names) {
        d = d
            .hint(format!("did you mean `{s}`?"))
            .fix(format!("write `{s}`"), span, s);
    } else if let Some(other) = BlockKind::ALL
        .into_iter()
        .find(|k| *k != kind && schema::keyword(*k, kw).is_some())
    {
        d = d.hint(format!("`{kw}` belongs in a `{}` block", other.keyword()));
    } else {
        let all: Vec<&str> = schema::keywords(kind).into_iter().map(|k| k.name).collect();
        d = d.hint(format!(
            "`{}` blocks take: {}",
            kind.keyword(),
            all.join(", ")
        ));
    }
    d
}

pub(crate) fn at<T>(value: Option<T>, span: Span) -> Option<At<T>> {
    value.map(|value| At { value, span })
}

/// Read one quantity with `spec` as the fact of the statement at `span` (the
/// reader every single-number keyword uses).
pub(crate) fn quantity(
    r: &mut Reader<'_>,
    spec: &u::QuantitySpec,
    form: &str,
    span: Span,
) -> Option<At<f64>> {
    at(r.quantity(spec, form), span)
}

pub(crate) fn read_prism(r: &mut Reader<'_>, form: &str) -> Option<PrismRx> {
    let amount = r.quantity(&u::PRISM, form);
    let base = r.word_of(&["BU", "BD", "BI", "BO"], "a base direction", form);
    Some(PrismRx {
        amount: amount?,
        base: base?.to_owned(),
    })
}

pub(crate) fn read_keratometry(r: &mut Reader<'_>, form: &str) -> Option<[KMeridian; 2]> {
    let index = KERATOMETRIC_INDEX;
    let mut out = Vec::with_capacity(2);
    for i in 0..2 {
        if i == 1 && !r.symbol_if(Symbol::Comma) {
            return match r.peek() {
                Some(v) => {
                    let t = r.text(v.span);
                    r.fail(
                        v.span,
                        format!("expected `,` and the second meridian, found `{t}`"),
                        form,
                    )
                }
                None => r.missing("the second meridian (`, RADIUS mm x MERIDIAN`)", form),
            };
        }
        let is_power = matches!(
            r.peek(),
            Some(Value { kind: ValueKind::Number { unit: Some(us), .. }, .. }) if matches!(r.text(*us), "D")
        );
        let (radius, as_power) = if is_power {
            (
                keratometric_radius(r.quantity(&u::K_POWER, form)?, index),
                true,
            )
        } else {
            (r.quantity(&u::CORNEAL_RADIUS, form)?, false)
        };
        if !(r.axis_sign_if() || r.symbol_if(Symbol::At)) {
            return r.missing("`x` and the meridian", form);
        }
        let meridian = r.axis(&u::MERIDIAN, form)?;
        out.push(KMeridian {
            radius,
            meridian,
            as_power,
        });
    }
    Some([out[0], out[1]])
}

pub(crate) fn read_expect(r: &mut Reader<'_>, form: &str, span: Span) -> Option<Expect> {
    let (name, name_span) = r.word("the name of a computed value", form)?;
    let mut tokens = Vec::new();
    let mut tolerance = None;
    let mut value_span: Option<Span> = None;
    while let Some(v) = r.next_value() {
        if !matches!(
            v.kind,
            ValueKind::Symbol {
                symbol: Symbol::PlusMinus
            }
        ) && tolerance.is_none()
        {
            value_span = Some(value_span.map_or(v.span, |s| s.cover(v.span)));
        }
        match &v.kind {
            ValueKind::Number {
                number,
                value,
                unit,
                decimals,
                ..
            } => {
                let unit = unit.and_then(|us| u::unit_of(r.text(us)));
                let half = 0.5 * 10f64.powi(-(*decimals as i32));
                let (value, half_step) = match unit {
                    Some(un) => (un.to_base(*value), un.to_base(half)),
                    None => (*value, half),
                };
                tokens.push(ExpectToken::Number {
                    value,
                    unit,
                    half_step,
                    span: *number,
                });
            }
            ValueKind::Symbol {
                symbol: Symbol::PlusMinus,
            } => {
                let tv = r.next_value();
                match tv.map(|t| &t.kind) {
                    Some(ValueKind::Number { value, unit, .. }) => {
                        let unit = unit.and_then(|us| u::unit_of(r.text(us)));
                        tolerance = Some(unit.map_or(*value, |un| un.to_base(*value)));
                    }
                    _ => {
                        return r.missing("the tolerance after `±`", form);
                    }
                }
            }
            ValueKind::Word | ValueKind::Text { .. } => {
                let t = r.text(v.span);
                tokens.push(ExpectToken::Word {
                    word: t.trim_matches('"').to_owned(),
                })
            }
            ValueKind::AxisSign | ValueKind::Symbol { .. } | ValueKind::Date { .. } => {
                tokens.push(ExpectToken::Mark {
                    mark: r.text(v.span).to_owned(),
                })
            }
        }
    }
    // Exact length: most `expect` lines hold one to three values, and a pushed
    // vector starts with room for four (5.6 MB of empty room on a 5 MB file).
    tokens.shrink_to_fit();
    Some(Expect {
        name: name.to_owned(),
        name_span,
        tokens,
        tolerance,
        value_span,
        span,
    })
}
