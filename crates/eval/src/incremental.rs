//! Evaluation again after an edit, at a cost proportional to the top-level
//! blocks the edit touched rather than to the file.
//!
//! The previous evaluation keeps, per top-level block, the block's text and
//! where it stood, and per block of the model ([`crate::model::Block`]) its
//! computed result; the new blocks are lined up with the old ones by the
//! longest run of identical blocks at the start of the file and at its end (an
//! edit leaves everything before it in place and moves everything after it by
//! the same number of bytes). Only the blocks in between are read again.
//!
//! * **Reading.** An `eye` block whose text is unchanged keeps its model and
//!   the diagnostics of reading it, moved to where the block stands now. Other
//!   blocks (the `case` block, frames, lenses, systems: few and short) are read
//!   again every time.
//! * **Computing.** The values of a block are a function of its own text and
//!   of the blocks it depends on ([`crate::blocks::Context`]): for an eye block,
//!   the text of every block that is not an eye block (`case`, frames, lenses)
//!   and its partner (the other eye of the same visit) and previous visit. An
//!   eye's values are reused when its block, its partner's block and its
//!   previous visit's block are all unchanged and are the same blocks as
//!   before, and the other blocks' text is unchanged. Every other block is
//!   computed again every time (its values depend on the eyes).
//!
//! Every mode runs the same per-block steps (`lower::read_block`, then
//! `compute::block_step`: compute the block, judge its `expect` lines); this
//! module only decides which results to keep. Texts are compared in full (no hashes), so a
//! reused result is the one a full evaluation would compute; a property test
//! checks that [`reevaluate`] equals [`crate::evaluate_with`]. A result
//! that points outside its own block is never reused. What is left
//! proportional to the file is plain bookkeeping: comparing block texts
//! (memory comparisons), moving the spans after the edit, and looking up what
//! the blocks depend on.

use crate::blocks::Context;
use crate::compute::{self, Visits};
use crate::derived::Derived;
use crate::diagnostic::Diagnostic;
use crate::model::{Block, Case};
use crate::{expect, from_syntax, lower, EvalOptions, Evaluation};
use parax_syntax::{BlockKind, Parsed, Span};
use std::collections::HashMap;
use std::ops::Range;

/// One top-level block as it was last read.
#[derive(Debug, Clone)]
struct BlockMemo {
    /// Its text.
    text: String,
    /// Where it started.
    start: usize,
    /// The index in `case.blocks` of the model read from it (`None` for the
    /// `case` block and for a block whose header could not be read).
    model: Option<usize>,
    /// For an eye block: the diagnostics of reading it, relative to `start`
    /// (so they stay right wherever the block moves).
    diags: Vec<Diagnostic>,
    /// False when reading it gave a span outside the block (read it again).
    reusable: bool,
}

/// One model block's computed result, kept for the next evaluation.
#[derive(Debug, Clone)]
struct ValuesMemo {
    /// The span of the top-level block it was read from.
    span: Span,
    /// For an eye: its partner and its previous visit (indices in `case.blocks`).
    partner: Option<usize>,
    previous: Option<usize>,
    /// Its values in [`Evaluation::derived`].
    derived: Range<usize>,
    /// Diagnostics of its computation and of its `expect` lines, relative to
    /// the start of `span` (so they stay right wherever the block moves).
    diags: Vec<Diagnostic>,
    expects: Vec<Diagnostic>,
    /// False when a span points outside the block (then moving it is not enough).
    reusable: bool,
}

/// The per-block results of an incremental evaluation.
#[derive(Debug, Clone, Default)]
pub(crate) struct Memo {
    /// False for an evaluation made by [`crate::evaluate`] (nothing kept).
    kept: bool,
    /// True when the values were computed without their substituted formulas
    /// ([`EvalOptions::VALUES_ONLY`]); [`explained`] writes them on demand.
    values_only: bool,
    /// Length of the text evaluated.
    len: usize,
    /// Texts of every block that is not an eye block, joined.
    context: String,
    /// Every top-level block, in file order.
    blocks: Vec<BlockMemo>,
    /// One per block of `case.blocks`.
    values: Vec<ValuesMemo>,
    /// How many blocks have each block id (ids must be unique to reuse results).
    ids: HashMap<String, usize>,
    /// Indices of the values that are not inside their block, ordered by
    /// (start, index).
    loose: Vec<usize>,
}

impl Memo {
    /// The memo of a full evaluation with `options`: nothing kept.
    pub(crate) fn full(options: EvalOptions) -> Memo {
        Memo {
            values_only: !options.derivations,
            ..Memo::default()
        }
    }
}

/// `d` with every span moved by `by` bytes.
fn moved(d: &Diagnostic, by: isize) -> Diagnostic {
    let mut d = d.clone();
    d.span = d.span.moved(by);
    if let Some(f) = &mut d.fix {
        for e in &mut f.edits {
            e.span = e.span.moved(by);
        }
    }
    d
}

/// Diagnostics placed in the file, as a block starting at `start` keeps them.
fn relative(ds: &[Diagnostic], start: usize) -> Vec<Diagnostic> {
    ds.iter().map(|d| moved(d, -(start as isize))).collect()
}

/// Diagnostics a block starting at `start` keeps, placed in the file.
fn placed(ds: &[Diagnostic], start: usize) -> impl Iterator<Item = Diagnostic> + '_ {
    ds.iter().map(move |d| moved(d, start as isize))
}

fn inside(s: Span, block: Span) -> bool {
    block.start <= s.start && s.end <= block.end
}

fn diag_inside(d: &Diagnostic, block: Span) -> bool {
    inside(d.span, block)
        && d.fix
            .iter()
            .flat_map(|f| &f.edits)
            .all(|x| inside(x.span, block))
}

/// An edit of a text: the bytes `replaced` of the previous text were replaced
/// by `inserted` bytes.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct TextEdit {
    /// The byte range of the previous text that was replaced.
    pub replaced: Range<usize>,
    /// How many bytes took its place.
    pub inserted: usize,
}

/// Evaluate `parsed` with `options`, reusing what `previous` (the evaluation of
/// an earlier version of the same document, made by this function) read and
/// computed for the blocks that did not change; with no `previous`, everything
/// is read and computed, and the result keeps what the next call reuses. When
/// `edit` tells what changed, blocks wholly before or after it are recognised
/// by where they stand and their length, without comparing their text;
/// otherwise block texts are compared. A `previous` evaluation made with other
/// options is not reused. With [`EvalOptions::VALUES_ONLY`] (what the language
/// server runs on every edit) no substituted formula is written;
/// [`Evaluation::explained`] writes those of the values asked for. Gives
/// exactly what [`crate::evaluate_with`] gives with the same options.
pub fn reevaluate(
    parsed: &Parsed,
    previous: Option<Evaluation>,
    edit: Option<TextEdit>,
    options: EvalOptions,
) -> Evaluation {
    evaluate_with(
        parsed,
        previous,
        edit.map(|e| (e.replaced, e.inserted)),
        options,
    )
}

/// An eye's side, date and whether it has a refraction.
type VisitShape<'a> = (crate::model::Side, Option<&'a str>, bool);

/// What [`Visits`] tells about one eye: same side, date and presence of a
/// refraction (for a block that is not an eye, its kind).
fn visit_shape(b: &Block) -> (BlockKind, Option<VisitShape<'_>>) {
    match b {
        Block::Eye(e) => (
            BlockKind::Eye,
            Some((e.side, e.date.as_deref(), e.refraction.is_some())),
        ),
        other => (other.kind(), None),
    }
}

/// Visits indexed only with eye `i`, its partner and its previous visit.
fn local_visits(
    case: &Case,
    i: usize,
    partner: Option<usize>,
    previous: Option<usize>,
) -> Visits<'_> {
    let mut these: Vec<usize> = [Some(i), partner, previous].into_iter().flatten().collect();
    these.sort_unstable();
    these.dedup();
    Visits::of(case, these)
}

/// Which old model block a new one is, when it is unchanged: the models before
/// the changed blocks keep their index, those after them move by `shift`.
struct Lineup {
    before: usize,
    /// End of the changed models, new numbering.
    after: usize,
    /// End of the changed models, old numbering.
    old_after: usize,
}

impl Lineup {
    fn old(&self, i: usize) -> Option<usize> {
        if i < self.before {
            Some(i)
        } else if i >= self.after {
            Some(i - self.after + self.old_after)
        } else {
            None
        }
    }

    fn changed(&self, i: usize) -> bool {
        (self.before..self.after).contains(&i)
    }
}

/// Read the top-level blocks `mid` (those an edit changed) into models, placed
/// after the models `before`: the models, the blocks' memos (model indices
/// counted from the start of the file) and each block's reading diagnostics.
/// `case` blocks are left for [`read_unchanged`], which reads them in file order.
fn read_changed(
    parsed: &Parsed,
    mid: &[parax_syntax::Block],
    before: &[Block],
) -> (Vec<Block>, Vec<BlockMemo>, Vec<Vec<Diagnostic>>) {
    let mut fresh: Vec<Block> = Vec::new();
    let mut mid_diags: Vec<Vec<Diagnostic>> = Vec::with_capacity(mid.len());
    let mut memos = Vec::with_capacity(mid.len());
    let mut scratch = crate::model::CaseInfo::default();
    for b in mid {
        let mut diags = Vec::new();
        let mut model = None;
        if b.kind != BlockKind::Case {
            let kinds_before = |k: BlockKind| {
                before
                    .iter()
                    .chain(&fresh)
                    .filter(|m| m.kind() == k)
                    .count()
            };
            if let Some(m) = lower::read_block(parsed, b, &mut scratch, &kinds_before, &mut diags) {
                model = Some(before.len() + fresh.len());
                fresh.push(m);
            }
        }
        let reusable = diags.iter().all(|d| diag_inside(d, b.span));
        let kept = if b.kind == BlockKind::Eye {
            relative(&diags, b.span.start())
        } else {
            Vec::new()
        };
        memos.push(BlockMemo {
            text: parsed.text(b.span).to_owned(),
            start: b.span.start(),
            model,
            diags: kept,
            reusable,
        });
        mid_diags.push(diags);
    }
    (fresh, memos, mid_diags)
}

/// Every block's reading diagnostics in file order, after the syntax errors:
/// those of the changed blocks `mid` (read by [`read_changed`]), an unchanged
/// eye block's kept ones (its model moved by `delta` when it stands after the
/// edit); the `case` blocks and the other unchanged blocks are read again (into
/// their model's place in `case`).
fn read_unchanged(
    parsed: &Parsed,
    blocks: &[BlockMemo],
    case: &mut Case,
    mid: Range<usize>,
    mid_diags: &[Vec<Diagnostic>],
    delta: isize,
) -> Vec<Diagnostic> {
    let mut diagnostics: Vec<Diagnostic> = parsed.errors.iter().map(from_syntax).collect();
    for (k, b) in parsed.blocks.iter().enumerate() {
        if mid.contains(&k) && b.kind != BlockKind::Case {
            diagnostics.extend(mid_diags[k - mid.start].iter().cloned());
            continue;
        }
        let memo = &blocks[k];
        match b.kind {
            BlockKind::Eye => {
                diagnostics.extend(placed(&memo.diags, b.span.start()));
                if k >= mid.end && delta != 0 {
                    if let Some(Block::Eye(e)) = memo.model.map(|m| &mut case.blocks[m]) {
                        e.move_spans(delta);
                    }
                }
            }
            _ => {
                let slot = memo.model;
                let models = &case.blocks;
                let kinds_before = |kind: BlockKind| {
                    let end = slot.unwrap_or(0);
                    models[..end].iter().filter(|m| m.kind() == kind).count()
                };
                let model =
                    lower::read_block(parsed, b, &mut case.info, &kinds_before, &mut diagnostics);
                if let (Some(m), Some(slot)) = (model, slot) {
                    case.blocks[slot] = m;
                }
            }
        }
    }
    diagnostics
}

/// Update the count of each eye block id: `removed` blocks go, `added` ones
/// come. False when an id is then counted twice.
fn count_eye_ids(ids: &mut HashMap<String, usize>, removed: &[Block], added: &[Block]) -> bool {
    for b in removed.iter().filter(|b| matches!(b, Block::Eye(_))) {
        let id = b.id();
        if let Some(n) = ids.get_mut(&id) {
            *n -= 1;
            if *n == 0 {
                ids.remove(&id);
            }
        }
    }
    let mut unique = true;
    for b in added.iter().filter(|b| matches!(b, Block::Eye(_))) {
        let n = ids.entry(b.id()).or_insert(0);
        *n += 1;
        unique &= *n == 1;
    }
    unique
}

/// Add every block's diagnostics of computing and of its `expect` lines to the
/// reading diagnostics, in the order of a full evaluation (reading, computing,
/// then `expect` lines, each block in file order, sorted by place); returns the
/// indices of the values outside their block, for `values_starting_in`.
fn finish(
    derived: &[Derived],
    values: &[ValuesMemo],
    diagnostics: &mut Vec<Diagnostic>,
) -> Vec<usize> {
    for m in values {
        diagnostics.extend(placed(&m.diags, m.span.start()));
    }
    for m in values {
        diagnostics.extend(placed(&m.expects, m.span.start()));
    }
    diagnostics.sort_by_key(|d| (d.span.start, d.severity));
    let mut loose: Vec<usize> = values
        .iter()
        .filter(|m| !m.reusable)
        .flat_map(|m| m.derived.clone())
        .collect();
    loose.sort_by_key(|&i| (derived[i].span.start, i));
    loose
}

/// How many top-level blocks at the start (`.0`) and at the end (`.1`) of the
/// file are the old ones: at the same place (those at the end moved by
/// `delta`), with the same text. With `edit` known, a block wholly before or
/// after it with the same length is the same without comparing its text.
fn line_up(
    old: &[BlockMemo],
    parsed: &Parsed,
    edit: Option<&(Range<usize>, usize)>,
    delta: isize,
) -> (usize, usize) {
    let new = &parsed.blocks;
    let same = |o: &BlockMemo, n: &parax_syntax::Block, by: isize| {
        if !o.reusable || o.start as isize + by != n.span.start as isize {
            return false;
        }
        let untouched = edit.is_some_and(|(e, _)| {
            o.text.len() == n.span.len() && (o.start + o.text.len() <= e.start || o.start >= e.end)
        });
        untouched || o.text == parsed.text(n.span)
    };
    let mut p = 0;
    while p < old.len() && p < new.len() && same(&old[p], &new[p], 0) {
        p += 1;
    }
    let mut s = 0;
    while s < old.len() - p
        && s < new.len() - p
        && same(&old[old.len() - 1 - s], &new[new.len() - 1 - s], delta)
    {
        s += 1;
    }
    (p, s)
}

fn evaluate_with(
    parsed: &Parsed,
    previous: Option<Evaluation>,
    edit: Option<(Range<usize>, usize)>,
    options: EvalOptions,
) -> Evaluation {
    let explain = options.derivations;
    let mut context = String::new();
    for b in parsed.blocks.iter().filter(|b| b.kind != BlockKind::Eye) {
        context.push_str(parsed.text(b.span));
        context.push('\0');
    }
    let (old_models, old_derived, memo) = match previous {
        Some(p) if p.memo.kept && p.memo.values_only != explain => {
            (p.case.blocks, p.derived, p.memo)
        }
        _ => Default::default(),
    };
    let Memo {
        len: old_len,
        context: old_context,
        blocks: mut old_blocks,
        values: mut old_values,
        mut ids,
        ..
    } = memo;
    let compute_ok = old_context == context && old_values.len() == old_models.len();
    let new = &parsed.blocks;
    // Line the blocks up: `p` equal blocks at the start, `s` at the end.
    let delta = parsed.source.len() as isize - old_len as isize;
    // An edit whose numbers do not fit the two texts is ignored.
    let edit = edit.filter(|(e, ins)| {
        e.start <= e.end && e.end <= old_len && old_len - e.len() + ins == parsed.source.len()
    });
    let (p, s) = line_up(&old_blocks, parsed, edit.as_ref(), delta);
    let (old_mid, new_mid) = (p..old_blocks.len() - s, p..new.len() - s);
    // The models of the blocks before and after the changed ones.
    let models_before = old_blocks[..p]
        .iter()
        .rev()
        .find_map(|b| b.model)
        .map_or(0, |m| m + 1);
    let old_models_after = old_blocks[old_mid.end..]
        .iter()
        .find_map(|b| b.model)
        .unwrap_or(old_models.len());

    // Read the changed blocks (the `case` blocks come later, in file order).
    let (fresh, mid_memos, mid_diags) =
        read_changed(parsed, &new[new_mid.clone()], &old_models[..models_before]);
    let lineup = Lineup {
        before: models_before,
        after: models_before + fresh.len(),
        old_after: old_models_after,
    };
    let shift = lineup.after as isize - old_models_after as isize;
    let mut case = Case {
        blocks: old_models,
        ..Case::default()
    };
    let removed: Vec<Block> = case
        .blocks
        .splice(models_before..old_models_after, fresh)
        .collect();
    // The blocks, updated the same way.
    old_blocks.splice(old_mid.clone(), mid_memos);
    for b in &mut old_blocks[new_mid.end..] {
        b.start = b.start.wrapping_add_signed(delta);
        b.model = b.model.map(|m| m.wrapping_add_signed(shift));
    }
    let blocks = old_blocks;

    let mut diagnostics = read_unchanged(
        parsed,
        &blocks,
        &mut case,
        new_mid.clone(),
        &mid_diags,
        delta,
    );

    // Block ids of eyes must be unique: two eye blocks with the same id share
    // their `expect` look-ups, so then everything is evaluated in full.
    let added = &case.blocks[lineup.before..lineup.after];
    let duplicate = !count_eye_ids(&mut ids, &removed, added);
    if duplicate {
        return crate::evaluate_with(parsed, options);
    }

    // Which top-level block each model came from.
    let mut span_of = vec![Span::default(); case.blocks.len()];
    for (k, b) in blocks.iter().enumerate() {
        if let Some(m) = b.model {
            span_of[m] = new[k].span;
        }
    }
    // When the models read again have the same kinds and, for eyes, the same
    // sides, dates and presence of a refraction as the ones they replace,
    // every eye keeps its partner and previous visit (indices included): they
    // are taken from the memo, and an eye computed again is indexed only with
    // those two, instead of indexing every visit of the file.
    let same_visits = compute_ok
        && removed.len() == lineup.after - lineup.before
        && removed
            .iter()
            .zip(&case.blocks[lineup.before..lineup.after])
            .all(|(a, b)| visit_shape(a) == visit_shape(b));
    drop(removed);
    if !compute_ok {
        old_values.clear();
    }
    let cx = Context::new(&case);
    let in_place = if same_visits {
        in_place(
            &cx,
            &lineup,
            &span_of,
            delta,
            old_derived,
            old_values,
            explain,
        )
    } else {
        Err((old_derived, old_values))
    };
    let (mut derived, mut values) = match in_place {
        Ok(done) => done,
        Err((old_derived, old_values)) => rebuild(
            &cx,
            &lineup,
            &span_of,
            same_visits,
            compute_ok,
            old_derived,
            old_values,
            explain,
        ),
    };
    derived.shrink_to_fit();
    share_expects(&case, &derived, &mut values);
    let loose = finish(&derived, &values, &mut diagnostics);
    Evaluation {
        case,
        derived,
        diagnostics,
        memo: Memo {
            kept: true,
            values_only: !explain,
            len: parsed.source.len(),
            context,
            blocks,
            values,
            ids,
            loose,
        },
    }
}

/// Compute block `i` onto the end of `out`: the diagnostics of computing it and
/// of its `expect` lines, relative to the start of `span` (the block's), and
/// whether every span stays inside `span`.
fn compute_into(
    cx: &Context<'_>,
    visits: &Visits<'_>,
    i: usize,
    explain: bool,
    span: Span,
    out: &mut Vec<Derived>,
) -> (Vec<Diagnostic>, Vec<Diagnostic>, bool) {
    let start = out.len();
    let mut diags = Vec::new();
    let mut expects = Vec::new();
    compute::block_step(cx, visits, i, explain, out, &mut diags, Some(&mut expects));
    let reusable = out[start..].iter().all(|d| inside(d.span, span))
        && diags.iter().chain(&expects).all(|d| diag_inside(d, span));
    let at = span.start();
    (relative(&diags, at), relative(&expects, at), reusable)
}

/// Old values and their memos, handed back when [`in_place`] cannot be used.
type Old = (Vec<Derived>, Vec<ValuesMemo>);

/// The usual edit, done in place: the models read again have the same kinds
/// (and eyes the same sides, dates and presence of a refraction) as before, so
/// every eye keeps its partner and previous visit and `memos` holds every
/// model's old result under its index. Only the blocks read again, the blocks
/// that are not eyes, the eyes that depend on changed ones and those whose
/// results point outside their block are computed again, each eye indexed only
/// with its partner and previous visit; their values are written over the old
/// ones, and the results of the blocks after the edit are moved by `delta`
/// bytes. Gives back the old values unchanged when a recomputed block has a
/// different number of values than before (then [`rebuild`] runs).
fn in_place(
    cx: &Context<'_>,
    lineup: &Lineup,
    span_of: &[Span],
    delta: isize,
    mut derived: Vec<Derived>,
    mut memos: Vec<ValuesMemo>,
    explain: bool,
) -> Result<Old, Old> {
    let case = cx.case;
    if memos.len() != case.blocks.len() {
        return Err((derived, memos));
    }
    let touched = |x: Option<usize>| x.is_some_and(|x| lineup.changed(x));
    let redo: Vec<usize> = (0..memos.len())
        .filter(|&i| {
            let m = &memos[i];
            lineup.changed(i)
                || !matches!(case.blocks[i], Block::Eye(_))
                || !m.reusable
                || touched(m.partner)
                || touched(m.previous)
        })
        .collect();
    let mut results = Vec::with_capacity(redo.len());
    for &i in &redo {
        let m = &memos[i];
        let visits = local_visits(case, i, m.partner, m.previous);
        let mut values = Vec::with_capacity(m.derived.len());
        let result = compute_into(cx, &visits, i, explain, span_of[i], &mut values);
        if values.len() != m.derived.len() {
            return Err((derived, memos));
        }
        results.push((values, result));
    }
    // Every block after the edit moves (the recomputed ones are replaced below).
    if delta != 0 {
        for m in memos[lineup.after..].iter_mut() {
            m.span = m.span.moved(delta);
            for d in &mut derived[m.derived.clone()] {
                d.span = d.span.moved(delta);
            }
        }
    }
    for (&i, (values, (diags, expects, reusable))) in redo.iter().zip(results) {
        let m = &mut memos[i];
        for (slot, v) in derived[m.derived.clone()].iter_mut().zip(values) {
            *slot = v;
        }
        m.diags = diags;
        m.expects = expects;
        m.reusable = reusable;
        m.span = span_of[i];
    }
    Ok((derived, memos))
}

/// Every block's values in file order: an unchanged eye's old values are moved
/// over (their spans moved to where the block stands now) when the eyes it
/// depends on are the same as before; every other block is computed.
// The one call site's state, all of it needed.
#[allow(clippy::too_many_arguments)]
fn rebuild(
    cx: &Context<'_>,
    lineup: &Lineup,
    span_of: &[Span],
    same_visits: bool,
    compute_ok: bool,
    old_derived: Vec<Derived>,
    old_memos: Vec<ValuesMemo>,
    explain: bool,
) -> Old {
    let case = cx.case;
    let all_visits = (!same_visits).then(|| Visits::new(case));
    let mut derived = Vec::with_capacity(old_derived.len());
    let mut old = old_derived.into_iter();
    let mut pos = 0;
    let mut memos = Vec::with_capacity(case.blocks.len());
    for (i, b) in case.blocks.iter().enumerate() {
        let span = span_of[i];
        let (partner, previous) = match (b, &all_visits) {
            (Block::Eye(e), Some(v)) => (v.partner(e), v.previous(e)),
            (Block::Eye(_), None) => (old_memos[i].partner, old_memos[i].previous),
            _ => (None, None),
        };
        // The old result of this eye, if it and the eyes it depends on are
        // unchanged and are the same eyes as before.
        let found = lineup.old(i).filter(|_| compute_ok).and_then(|j| {
            let m = old_memos.get(j)?;
            let same_dep = |new: Option<usize>, old: Option<usize>| match (new, old) {
                (None, None) => true,
                (Some(n), Some(o)) => lineup.old(n) == Some(o),
                _ => false,
            };
            (matches!(b, Block::Eye(_))
                && m.reusable
                && m.derived.start >= pos
                && same_dep(partner, m.partner)
                && same_dep(previous, m.previous))
            .then_some(m)
        });
        let start = derived.len();
        let memo = match found {
            Some(m) => {
                let by = span.start as isize - m.span.start as isize;
                // Old values pos..m.derived.start (of blocks not reused) go.
                if m.derived.start > pos {
                    old.nth(m.derived.start - pos - 1);
                }
                derived.extend(old.by_ref().take(m.derived.len()).map(|mut d| {
                    d.span = d.span.moved(by);
                    d
                }));
                pos = m.derived.end;
                ValuesMemo {
                    span,
                    partner,
                    previous,
                    derived: start..derived.len(),
                    diags: m.diags.clone(),
                    expects: m.expects.clone(),
                    reusable: true,
                }
            }
            None => {
                let local;
                let visits = match &all_visits {
                    Some(v) => v,
                    None => {
                        local = local_visits(case, i, partner, previous);
                        &local
                    }
                };
                let (diags, expects, reusable) =
                    compute_into(cx, visits, i, explain, span, &mut derived);
                ValuesMemo {
                    span,
                    partner,
                    previous,
                    derived: start..derived.len(),
                    diags,
                    expects,
                    reusable,
                }
            }
        };
        memos.push(memo);
    }
    (derived, memos)
}

/// Blocks other than eyes that share an id (two unnamed frames) look their
/// `expect` lines up across each other's values, as a full evaluation does:
/// check those again against all the values of the id.
fn share_expects(case: &Case, derived: &[Derived], memos: &mut [ValuesMemo]) {
    let mut groups: HashMap<String, Vec<usize>> = HashMap::new();
    for (i, b) in case.blocks.iter().enumerate() {
        if !matches!(b, Block::Eye(_)) {
            groups.entry(b.id()).or_default().push(i);
        }
    }
    for (id, list) in groups.into_iter().filter(|(_, l)| l.len() > 1) {
        let all: Vec<Derived> = list
            .iter()
            .flat_map(|&i| derived[memos[i].derived.clone()].iter().cloned())
            .collect();
        for i in list {
            let mut expects = Vec::new();
            expect::check(&id, case.blocks[i].expects(), &all, &mut expects);
            memos[i].expects = relative(&expects, memos[i].span.start());
        }
    }
}

/// See [`Evaluation::values_starting_in`].
pub(crate) fn values_starting_in(e: &Evaluation, span: Span) -> Vec<usize> {
    let starts_in = |i: &usize| {
        let s = e.derived[*i].span.start;
        span.start <= s && s <= span.end
    };
    let mut out: Vec<usize> = if e.memo.kept {
        let m = &e.memo;
        // Blocks are in file order and do not overlap.
        let first = m.values.partition_point(|x| x.span.end < span.start);
        let from = m
            .loose
            .partition_point(|&i| e.derived[i].span.start < span.start);
        m.values[first..]
            .iter()
            .take_while(|x| x.span.start <= span.end)
            .filter(|x| x.reusable)
            .flat_map(|x| x.derived.clone())
            .filter(starts_in)
            .chain(m.loose[from..].iter().copied().take_while(|i| starts_in(i)))
            .collect()
    } else {
        (0..e.derived.len()).filter(starts_in).collect()
    };
    out.sort_by_key(|&i| (e.derived[i].span.start, i));
    out
}

/// See [`Evaluation::explained`]. After an incremental evaluation, each block
/// holding one of the values is computed again, an eye from its model, its
/// partner and its previous visit (the inputs the memo records); each block at
/// most once per call.
pub(crate) fn explained(e: &Evaluation, indices: &[usize]) -> Vec<Derived> {
    if !e.memo.values_only {
        return indices.iter().map(|&i| e.derived[i].clone()).collect();
    }
    if !e.memo.kept {
        // A full evaluation without derivations keeps no per-block inputs:
        // everything is computed again (not a path the language server takes).
        let (all, _) = crate::evaluate_case(&e.case, EvalOptions::default());
        return indices.iter().map(|&i| all[i].clone()).collect();
    }
    let m = &e.memo;
    let cx = Context::new(&e.case);
    let mut done: HashMap<usize, Vec<Derived>> = HashMap::new();
    let mut out = Vec::with_capacity(indices.len());
    for &i in indices {
        let k = m.values.partition_point(|x| x.derived.end <= i);
        let vm = &m.values[k];
        let values = done.entry(k).or_insert_with(|| {
            let visits = local_visits(&e.case, k, vm.partner, vm.previous);
            let mut values = Vec::new();
            let mut diags = Vec::new();
            compute::block_step(&cx, &visits, k, true, &mut values, &mut diags, None);
            values
        });
        out.push(values[i - vm.derived.start].clone());
    }
    out
}
