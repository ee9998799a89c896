//! The parax evaluator: reads a parsed case file into the case model
//! ([`model::Case`]), computes every derived value with its derivation
//! ([`derived::Derived`]) and reports every finding as one kind of
//! [`diagnostic::Diagnostic`]. The command line and the language server render
//! these and compute nothing of their own.

pub mod blocks;
pub mod codes;
pub mod cohort;
mod compute;
pub mod derived;
pub mod diagnostic;
mod expect;
mod incremental;
mod lower;
pub mod model;
pub mod read;
pub mod schema;
pub mod sources;
pub mod units;

pub use compute::slug;
pub use derived::{Derived, DerivedValue, Difference, Phrase};
pub use diagnostic::{Diagnostic, Edit, Fix, Severity, GENERAL_CAUTION};
pub use incremental::{reevaluate, TextEdit};

pub use model::Case;

use parax_syntax::Parsed;

/// Everything known about one case file after evaluation.
#[derive(Debug, Clone)]
pub struct Evaluation {
    /// The facts read from the file.
    pub case: Case,
    /// Every derived value, block by block in file order.
    pub derived: Vec<Derived>,
    /// Every diagnostic (syntax, notation, units, clinical, expect), by position.
    pub diagnostics: Vec<Diagnostic>,
    /// Per-block results kept for [`reevaluate`] (empty from [`evaluate`]).
    memo: incremental::Memo,
}

impl Evaluation {
    /// True when any diagnostic is an error (the file fails `parax check`).
    pub fn has_errors(&self) -> bool {
        self.diagnostics
            .iter()
            .any(|d| d.severity == Severity::Error)
    }

    /// Indices in [`Evaluation::derived`] of the values whose span starts inside
    /// `span` (both ends included), ordered by (start, index). After
    /// [`reevaluate`] this looks only at the eye blocks that meet
    /// `span` and at the few values kept apart (the other blocks'), so its cost
    /// follows the size of `span`, not of the file; after [`evaluate`] it scans
    /// every value.
    pub fn values_starting_in(&self, span: parax_syntax::Span) -> Vec<usize> {
        incremental::values_starting_in(self, span)
    }

    /// The values at `indices` of [`Evaluation::derived`], each with its
    /// substituted formula written, whatever options the evaluation ran with.
    /// After an incremental evaluation with [`EvalOptions::VALUES_ONLY`] (the
    /// language server's) only the blocks holding those values are computed
    /// again, with derivations on; otherwise the stored values are cloned.
    /// Each result equals the value at the same index of [`evaluate`].
    pub fn explained(&self, indices: &[usize]) -> Vec<Derived> {
        incremental::explained(self, indices)
    }
}

/// What an evaluation should write besides the values and diagnostics.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct EvalOptions {
    /// Write each value's substituted formula ([`derived::Derivation::substituted`]).
    /// On by default; `parax check`, which shows only diagnostics, turns it off
    /// and saves most of the evaluator's text formatting and memory.
    pub derivations: bool,
}

impl Default for EvalOptions {
    fn default() -> Self {
        EvalOptions { derivations: true }
    }
}

impl EvalOptions {
    /// Values and diagnostics only, no substituted formulas.
    pub const VALUES_ONLY: EvalOptions = EvalOptions { derivations: false };
}

/// Evaluate a parsed file.
pub fn evaluate(parsed: &Parsed) -> Evaluation {
    evaluate_with(parsed, EvalOptions::default())
}

/// Evaluate a parsed file with `options`.
pub fn evaluate_with(parsed: &Parsed, options: EvalOptions) -> Evaluation {
    let mut diagnostics: Vec<Diagnostic> = parsed.errors.iter().map(from_syntax).collect();
    let case = lower::lower(parsed, &mut diagnostics);
    let (derived, more) = evaluate_case(&case, options);
    diagnostics.extend(more);
    diagnostics.sort_by_key(|d| (d.span.start, d.severity));
    Evaluation {
        case,
        derived,
        diagnostics,
        memo: incremental::Memo::full(options),
    }
}

/// Parse and evaluate source text.
pub fn evaluate_source(source: &str) -> (Parsed, Evaluation) {
    let parsed = parax_syntax::parse(source);
    let evaluation = evaluate(&parsed);
    (parsed, evaluation)
}

/// Evaluate a case model (read from a file or from JSON) with `options`:
/// derived values, and the diagnostics of computation and `expect` lines.
pub fn evaluate_case(case: &Case, options: EvalOptions) -> (Vec<Derived>, Vec<Diagnostic>) {
    let mut derived = Vec::new();
    let mut diags = Vec::new();
    // `expect` findings after the computation's, in file order.
    let mut expects = Vec::new();
    let unique = ids_unique(case);
    let judged = unique.then_some(&mut expects);
    compute::compute_each(
        case,
        options.derivations,
        &mut derived,
        &mut diags,
        judged,
        &mut |_, _, _| {},
    );
    // Exact capacity: the values are held as long as the evaluation is.
    derived.shrink_to_fit();
    if !unique {
        // Blocks sharing an id look their `expect` lines up across each other's
        // values: index the range of each id once, so this costs one look-up
        // per block instead of a scan of every value (quadratic on large files).
        let ranges = block_ranges(&derived);
        let of =
            |id: &str| -> &[Derived] { ranges.get(id).map_or(&[][..], |&(a, b)| &derived[a..b]) };
        for b in &case.blocks {
            let id = b.id();
            expect::check(&id, b.expects(), of(&id), &mut expects);
        }
    }
    diags.append(&mut expects);
    (derived, diags)
}

/// True when no two blocks of `case` share an id (then each block's `expect`
/// lines are judged against its own values alone).
fn ids_unique(case: &Case) -> bool {
    let mut seen = std::collections::HashSet::with_capacity(case.blocks.len());
    case.blocks.iter().all(|b| seen.insert(b.id()))
}

/// Read, evaluate and check source text as a stream, handing the derived
/// values to `each` block by block instead of collecting them: each top-level
/// block is parsed, read into the case model and its lines dropped before the
/// next block is read ([`parax_syntax::parse_each`]), so the syntax tree of the
/// whole file and the case model are never alive together; then each block's
/// values are computed, its `expect` lines judged against them, and they are
/// passed to `each` and dropped, so one block's values are held at a time
/// whatever the file's size. `each` keeps what it needs (a few keys, a count),
/// or nothing (`parax check`).
///
/// The returned [`Evaluation`] has the case and every diagnostic, exactly as
/// [`evaluate_with`] gives them, and an empty [`Evaluation::derived`]; the
/// values reach `each` in the order of [`Evaluation::derived`] (a test compares
/// them on every example and fixture and after random edits). When two blocks
/// share an id (their `expect` lines then look up values across both), the
/// values are collected first and `each` is called once with all of them. The
/// returned [`Parsed`] has the source, the line index and the syntax errors,
/// but no lines and no blocks: it serves to place and render diagnostics.
pub fn evaluate_streaming(
    source: &str,
    options: EvalOptions,
    each: &mut dyn FnMut(&[Derived]),
) -> (Parsed, Evaluation) {
    // `check` renders no block headers: their places are not kept.
    let read = read_streaming(source, false);
    let computed = evaluate_case_each(&read.case, options, each);
    let mut diagnostics = read.diagnostics;
    diagnostics.extend(computed);
    diagnostics.sort_by_key(|d| (d.span.start, d.severity));
    let evaluation = Evaluation {
        case: read.case,
        derived: Vec::new(),
        diagnostics,
        memo: Default::default(),
    };
    (read.parsed, evaluation)
}

/// Where one top-level block of a file read by [`read_source_streaming`] lies
/// (its lines are gone by then).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct BlockPlace {
    /// From the header's start to the end of the block's last line
    /// ([`parax_syntax::Block::span`]).
    pub span: parax_syntax::Span,
    /// The header line ([`parax_syntax::Line::span`] of the block's first line).
    pub header: parax_syntax::Span,
}

/// A source read block by block into the case model, before any value is
/// computed ([`read_source_streaming`]). Its values are then computed as often
/// as wanted by [`StreamedSource::evaluate_each`], one block at a time, with the
/// source and line index at hand to render them as they come (`parax eval`).
#[derive(Debug)]
pub struct StreamedSource {
    /// The source, the line index and the syntax errors; no lines, no blocks.
    pub parsed: Parsed,
    /// The facts read from the file.
    pub case: Case,
    /// Where each top-level block lies, in file order.
    pub blocks: Vec<BlockPlace>,
    /// Syntax and notation diagnostics found while reading, unsorted.
    diagnostics: Vec<Diagnostic>,
}

impl StreamedSource {
    /// Compute every value and hand them to `each` block by block, as
    /// [`evaluate_streaming`] does; returns every diagnostic of the file (reading,
    /// computation, `expect` lines) in the order of [`Evaluation::diagnostics`].
    /// The values and diagnostics are those of [`evaluate_streaming`].
    pub fn evaluate_each(
        &self,
        options: EvalOptions,
        each: &mut dyn FnMut(&[Derived]),
    ) -> Vec<Diagnostic> {
        let computed = evaluate_case_each(&self.case, options, each);
        let mut diagnostics = Vec::with_capacity(self.diagnostics.len() + computed.len());
        diagnostics.extend(self.diagnostics.iter().cloned());
        diagnostics.extend(computed);
        diagnostics.sort_by_key(|d| (d.span.start, d.severity));
        diagnostics
    }

    /// The block whose span holds byte offset `at` (both ends included).
    pub fn block_at(&self, at: u32) -> Option<&BlockPlace> {
        // Blocks are in file order and do not overlap: the first one that ends
        // at or after `at` is the only candidate.
        let i = self.blocks.partition_point(|b| b.span.end < at);
        self.blocks.get(i).filter(|b| b.span.start <= at)
    }
}

/// Read source text into the case model block by block, dropping each block's
/// lines once it is read (as [`evaluate_streaming`] does), and compute
/// nothing yet: see [`StreamedSource`].
pub fn read_source_streaming(source: &str) -> StreamedSource {
    read_streaming(source, true)
}

/// [`read_source_streaming`], keeping [`StreamedSource::blocks`] only when `places`.
fn read_streaming(source: &str, places: bool) -> StreamedSource {
    let mut case = model::Case::default();
    let mut lowered = Vec::new();
    let mut blocks = Vec::new();
    let parsed = parax_syntax::parse_each(source, &mut |p, block| {
        if places {
            blocks.push(BlockPlace {
                span: block.span,
                header: p.lines[block.header].span,
            });
        }
        lower::lower_block(p, block, &mut case, &mut lowered)
    });
    let mut diagnostics: Vec<Diagnostic> = parsed.errors.iter().map(from_syntax).collect();
    diagnostics.append(&mut lowered);
    drop(lowered);
    blocks.shrink_to_fit();
    StreamedSource {
        parsed,
        case,
        blocks,
        diagnostics,
    }
}

/// [`evaluate_case`] handing the values to `each` block by block instead of
/// returning them (see [`evaluate_streaming`]); returns the diagnostics, in the
/// order [`evaluate_case`] gives them.
fn evaluate_case_each(
    case: &Case,
    options: EvalOptions,
    each: &mut dyn FnMut(&[Derived]),
) -> Vec<Diagnostic> {
    if !ids_unique(case) {
        let (derived, diags) = evaluate_case(case, options);
        each(&derived);
        return diags;
    }
    let mut diags = Vec::new();
    // `expect` findings after the computation's, as `evaluate_case` orders them.
    let mut expects = Vec::new();
    let mut buf = Vec::new();
    compute::compute_each(
        case,
        options.derivations,
        &mut buf,
        &mut diags,
        Some(&mut expects),
        &mut |_, buf, start| {
            each(&buf[start..]);
            buf.truncate(start);
        },
    );
    diags.append(&mut expects);
    diags
}

/// The range of each block id's values in `derived` (each block's values are
/// pushed together; two blocks sharing an id get the range covering both, and
/// [`expect::check`] looks values up by key within it).
fn block_ranges(derived: &[Derived]) -> std::collections::HashMap<&str, (usize, usize)> {
    let mut ranges: std::collections::HashMap<&str, (usize, usize)> =
        std::collections::HashMap::new();
    for (i, d) in derived.iter().enumerate() {
        let r = ranges.entry(d.block.as_str()).or_insert((i, i + 1));
        r.1 = i + 1;
    }
    ranges
}

/// Push `item`, growing a full `list` by a quarter instead of doubling it. For
/// the lists that grow with the size of a file (its values, its eye blocks): a
/// doubled vector may be half empty (530,000 values in room for 1,048,576 on
/// the 5 MB benchmark file). Still geometric, so pushing stays amortized
/// constant time; large vectors are moved by `realloc`, which remaps pages.
pub(crate) fn push_growing_slowly<T>(list: &mut Vec<T>, item: T) {
    if list.len() == list.capacity() {
        list.reserve_exact((list.capacity() / 4).max(4));
    }
    list.push(item);
}

fn from_syntax(e: &parax_syntax::SyntaxError) -> Diagnostic {
    let mut d = Diagnostic::new(
        codes::Code::of_syntax(e.code),
        Severity::Error,
        e.span,
        e.message.clone(),
    );
    d.hint = e.hint.clone();
    if let Some(r) = &e.replacement {
        d = d.fix(format!("write `{r}`"), e.span, r.clone());
    }
    d
}
