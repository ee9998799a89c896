//! Evaluation again after an edit, at a cost proportional to the top-level
//! blocks the edit touched rather than to the file.
//!
//! The previous evaluation keeps, per top-level block, the block's text and
//! where it stood; the new blocks are lined up with the old ones by the longest
//! run of identical blocks at the start of the file and at its end (an edit
//! leaves everything before it in place and moves everything after it by the
//! same number of bytes). Only the blocks in between are read again.
//!
//! * **Reading (lowering).** An `eye` block whose text is unchanged keeps its
//!   lowered [`Eye`] and the diagnostics of reading it, moved to where the block
//!   stands now. Other blocks (the `case` block, frames, lenses, systems: few and
//!   short) are read again every time.
//! * **Computing.** The values of an eye block are a function of its own text,
//!   of the text of every block that is not an eye block (`case`, frames), and
//!   of its partner (the other eye of the same visit) and of its previous
//!   visit. An eye's values are reused when its block, its partner's block and
//!   its previous visit's block are all unchanged and are the same blocks as
//!   before, and the other blocks' text is unchanged; cross-block values (the
//!   eyes compared, lenses fitted to eyes, the frame) are thus recomputed
//!   whenever one of their inputs changed. The other blocks' values are
//!   computed again every time.
//!
//! Texts are compared in full (no hashes), so a reused result is the one a full
//! evaluation would compute; a property test checks that
//! [`evaluate_incremental`] equals [`crate::evaluate`]. A result that points
//! outside its own block is never reused. What is left proportional to the
//! file is plain bookkeeping: comparing block texts (memory comparisons), moving
//! the spans after the edit, and indexing visits by side and date.

use crate::compute::{self, Visits};
use crate::derived::Derived;
use crate::diagnostic::Diagnostic;
use crate::model::{At, Case, Expect, ExpectToken, Eye};
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
    /// For an eye block: the index in `case.eyes` of the eye read from it
    /// (`None` when its header could not be read).
    eye: Option<usize>,
    /// For an eye block: the diagnostics of reading it.
    diags: Vec<Diagnostic>,
    /// False when reading it gave a span outside the block (read it again).
    reusable: bool,
}

/// One eye block's computed result, kept for the next evaluation.
#[derive(Debug, Clone)]
struct EyeMemo {
    /// The block's span.
    span: Span,
    /// Its partner and its previous visit (indices in `case.eyes`).
    partner: Option<usize>,
    previous: Option<usize>,
    /// Its values in [`Evaluation::derived`].
    derived: Range<usize>,
    /// Diagnostics of its computation and of its `expect` lines.
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
    /// One per eye in `case.eyes`.
    eyes: Vec<EyeMemo>,
    /// How many eyes have each block id (ids must be unique to reuse results).
    ids: HashMap<String, usize>,
    /// Indices of the values that are not inside their eye block (the other
    /// blocks' values and those of eyes whose values point elsewhere), ordered
    /// by (start, index).
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

fn shift_diag(d: &mut Diagnostic, by: isize) {
    d.span = d.span.moved(by);
    if let Some(f) = &mut d.fix {
        for e in &mut f.edits {
            e.span = e.span.moved(by);
        }
    }
}

fn shifted(ds: &[Diagnostic], by: isize) -> impl Iterator<Item = Diagnostic> + '_ {
    ds.iter().map(move |d| {
        let mut d = d.clone();
        shift_diag(&mut d, by);
        d
    })
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

fn move_at<T>(a: &mut Option<At<T>>, by: isize) {
    if let Some(a) = a {
        a.span = a.span.moved(by);
    }
}

fn move_expect(x: &mut Expect, by: isize) {
    x.name_span = x.name_span.moved(by);
    x.value_span = x.value_span.map(|s| s.moved(by));
    x.span = x.span.moved(by);
    for t in &mut x.tokens {
        if let ExpectToken::Number { span, .. } = t {
            *span = span.moved(by);
        }
    }
}

/// Move every span of a lowered eye by `by` bytes. Written as one destructuring
/// so that a field added to [`Eye`] fails to compile here until it is moved too.
fn move_eye(e: &mut Eye, by: isize) {
    let Eye {
        side: _,
        date: _,
        span,
        refraction,
        add,
        keratometry,
        keratometric_index,
        posterior_radius,
        corneal_thickness,
        axial_length,
        pd,
        age,
        iol_constant,
        iol_target,
        iol_elp,
        iol_power,
        refractive_surgery,
        expects,
    } = e;
    *span = span.moved(by);
    move_at(refraction, by);
    move_at(add, by);
    move_at(keratometry, by);
    for a in [
        keratometric_index,
        posterior_radius,
        corneal_thickness,
        axial_length,
        pd,
        age,
        iol_constant,
        iol_target,
        iol_elp,
        iol_power,
    ] {
        move_at(a, by);
    }
    move_at(refractive_surgery, by);
    for x in expects {
        move_expect(x, by);
    }
}

/// Evaluate `parsed`, reusing what `previous` (the evaluation of an earlier
/// version of the same document, made by this function) read and computed for
/// the blocks that did not change. Gives exactly what [`crate::evaluate`] gives.
pub fn evaluate_incremental(parsed: &Parsed, previous: Option<Evaluation>) -> Evaluation {
    evaluate_with(parsed, previous, None, EvalOptions::default())
}

/// [`evaluate_incremental`] with `options`. A `previous` evaluation made with
/// other options is not reused. With [`EvalOptions::VALUES_ONLY`] (what the
/// language server runs on every edit) no substituted formula is written;
/// [`Evaluation::explained`] writes those of the values asked for. Gives
/// exactly what [`crate::evaluate_with`] gives with the same options.
pub fn evaluate_incremental_with(
    parsed: &Parsed,
    previous: Option<Evaluation>,
    options: EvalOptions,
) -> Evaluation {
    evaluate_with(parsed, previous, None, options)
}

/// [`evaluate_incremental`] when the edit is known: the bytes `edit` of the
/// previous text were replaced by `inserted` bytes. Blocks wholly before or
/// after the edit are then recognised by where they stand and their length,
/// without comparing their text. Gives exactly what [`crate::evaluate`] gives.
pub fn evaluate_edit(
    parsed: &Parsed,
    previous: Option<Evaluation>,
    edit: Range<usize>,
    inserted: usize,
) -> Evaluation {
    evaluate_with(
        parsed,
        previous,
        Some((edit, inserted)),
        EvalOptions::default(),
    )
}

/// [`evaluate_edit`] with `options` (see [`evaluate_incremental_with`]).
pub fn evaluate_edit_with(
    parsed: &Parsed,
    previous: Option<Evaluation>,
    edit: Range<usize>,
    inserted: usize,
    options: EvalOptions,
) -> Evaluation {
    evaluate_with(parsed, previous, Some((edit, inserted)), options)
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
    let (old_eyes, old_derived, memo) = match previous {
        Some(p) if p.memo.kept && p.memo.values_only != explain => (p.case.eyes, p.derived, p.memo),
        _ => Default::default(),
    };
    let Memo {
        len: old_len,
        context: old_context,
        blocks: mut old_blocks,
        eyes: mut old_eye_memos,
        mut ids,
        ..
    } = memo;
    let compute_ok = old_context == context;
    let new = &parsed.blocks;
    // Line the blocks up: `p` equal blocks at the start, `s` at the end.
    let delta = parsed.source.len() as isize - old_len as isize;
    // An edit whose numbers do not fit the two texts is ignored.
    let edit = edit.filter(|(e, ins)| {
        e.start <= e.end && e.end <= old_len && old_len - e.len() + ins == parsed.source.len()
    });
    let same = |o: &BlockMemo, n: &parax_syntax::Block, by: isize| {
        if !o.reusable || o.start as isize + by != n.span.start as isize {
            return false;
        }
        // Wholly before the edit, or wholly after it, with the same length:
        // the same bytes.
        let untouched = edit.as_ref().is_some_and(|(e, _)| {
            o.text.len() == n.span.len() && (o.start + o.text.len() <= e.start || o.start >= e.end)
        });
        untouched || o.text == parsed.text(n.span)
    };
    let mut p = 0;
    while p < old_blocks.len() && p < new.len() && same(&old_blocks[p], &new[p], 0) {
        p += 1;
    }
    let mut s = 0;
    while s < old_blocks.len() - p
        && s < new.len() - p
        && same(
            &old_blocks[old_blocks.len() - 1 - s],
            &new[new.len() - 1 - s],
            delta,
        )
    {
        s += 1;
    }
    let (old_mid, new_mid) = (p..old_blocks.len() - s, p..new.len() - s);
    // The eyes of the blocks before and after the changed ones.
    let eyes_before = old_blocks[..p]
        .iter()
        .rev()
        .find_map(|b| b.eye)
        .map_or(0, |e| e + 1);
    let eyes_after = old_blocks[old_mid.end..]
        .iter()
        .find_map(|b| b.eye)
        .unwrap_or(old_eyes.len());

    // Read the changed blocks (and every block that is not an eye block).
    let mut diagnostics: Vec<Diagnostic> = parsed.errors.iter().map(from_syntax).collect();
    let mut fresh = Case::default();
    let mut mid_memos = Vec::with_capacity(new_mid.len());
    for (k, b) in new.iter().enumerate() {
        let reused = if k < p {
            Some((k, 0))
        } else if k >= new_mid.end {
            Some((k - new_mid.end + old_mid.end, delta))
        } else {
            None
        };
        match reused {
            Some((o, by)) if b.kind == BlockKind::Eye => {
                diagnostics.extend(shifted(&old_blocks[o].diags, by));
            }
            _ => {
                let first_diag = diagnostics.len();
                let eyes = fresh.eyes.len();
                lower::lower_block(parsed, b, &mut fresh, &mut diagnostics);
                if reused.is_none() {
                    let eye = (fresh.eyes.len() > eyes).then_some(eyes_before + eyes);
                    let diags: Vec<Diagnostic> = if b.kind == BlockKind::Eye {
                        diagnostics[first_diag..].to_vec()
                    } else {
                        Vec::new()
                    };
                    let reusable = diags.iter().all(|d| diag_inside(d, b.span));
                    mid_memos.push(BlockMemo {
                        text: parsed.text(b.span).to_owned(),
                        start: b.span.start(),
                        eye,
                        diags,
                        reusable,
                    });
                }
            }
        }
    }
    let new_eye_count = fresh.eyes.len();
    let mut case_eyes = old_eyes;
    let removed: Vec<Eye> = case_eyes
        .splice(eyes_before..eyes_after, fresh.eyes.drain(..))
        .collect();
    let after = eyes_before + new_eye_count;
    let eye_shift = new_eye_count as isize - (eyes_after - eyes_before) as isize;
    if delta != 0 {
        for e in &mut case_eyes[after..] {
            move_eye(e, delta);
        }
    }
    let case = Case {
        eyes: case_eyes,
        ..fresh
    };

    // The blocks, updated the same way.
    old_blocks.splice(old_mid.clone(), mid_memos);
    for b in &mut old_blocks[new_mid.end..] {
        b.start = b.start.wrapping_add_signed(delta);
        b.eye = b.eye.map(|e| e.wrapping_add_signed(eye_shift));
        for d in &mut b.diags {
            shift_diag(d, delta);
        }
    }
    let blocks = old_blocks;

    // Block ids must be unique: two eye blocks with the same id share their
    // `expect` look-ups, so then everything is evaluated in full.
    for e in &removed {
        let id = compute::eye_block_id(e);
        if let Some(n) = ids.get_mut(&id) {
            *n -= 1;
            if *n == 0 {
                ids.remove(&id);
            }
        }
    }
    let mut duplicate = false;
    for e in &case.eyes[eyes_before..after] {
        let n = ids.entry(compute::eye_block_id(e)).or_insert(0);
        *n += 1;
        duplicate |= *n > 1;
    }
    if duplicate {
        return crate::evaluate_with(parsed, options);
    }

    // Which block each eye came from.
    let block_of_eye: Vec<usize> = {
        let mut v = vec![0; case.eyes.len()];
        for (k, b) in blocks.iter().enumerate() {
            if let Some(e) = b.eye {
                v[e] = k;
            }
        }
        v
    };
    // The old index of an unchanged eye.
    let old_eye = |i: usize| -> Option<usize> {
        if i < eyes_before {
            Some(i)
        } else if i >= after {
            Some(i - after + eyes_after)
        } else {
            None
        }
    };
    // When the eyes read again have the same sides, dates and presence of a
    // refraction as the ones they replace, every eye keeps its partner and
    // previous visit (indices included): they are taken from the memo, and an
    // eye computed again is indexed only with those two, instead of indexing
    // every visit of the file.
    let same_visits = compute_ok
        && old_eye_memos.len() == case.eyes.len()
        && removed.len() == after - eyes_before
        && removed
            .iter()
            .zip(&case.eyes[eyes_before..after])
            .all(|(a, b)| {
                a.side == b.side
                    && a.date == b.date
                    && a.refraction.is_some() == b.refraction.is_some()
            });
    let all_visits = (!same_visits).then(|| Visits::new(&case));
    let mut derived = if compute_ok { old_derived } else { Vec::new() };
    if !compute_ok {
        old_eye_memos.clear();
    }
    let done = same_visits
        && in_place(
            &case,
            &parsed.blocks,
            &block_of_eye,
            eyes_before..after,
            delta,
            &mut derived,
            &mut old_eye_memos,
            explain,
        );
    let (mut derived, eyes) = if done {
        let end = old_eye_memos.last().map_or(0, |m| m.derived.end);
        derived.truncate(end);
        (derived, old_eye_memos)
    } else {
        // The old list is edited in place: `derived[..w]` is final, and from `w` on
        // it still holds the old values from old index `r`. A reused eye's values stay
        // where they are (only their spans move); the values computed afresh wait in
        // `fresh_values` and replace the unused old values before the next reused eye,
        // which moves nothing when their count is unchanged (the usual edit).
        let (mut w, mut r) = (0, 0);
        let mut fresh_values: Vec<Derived> = Vec::new();
        // Eyes computed afresh whose memo ranges still count from the start of `fresh_values`.
        let mut waiting: Vec<usize> = Vec::new();
        let flush = |derived: &mut Vec<Derived>,
                     eyes: &mut Vec<EyeMemo>,
                     waiting: &mut Vec<usize>,
                     fresh: &mut Vec<Derived>,
                     w: &mut usize,
                     until: usize| {
            let n = fresh.len();
            derived.splice(*w..until, fresh.drain(..));
            for k in waiting.drain(..) {
                let m = &mut eyes[k];
                m.derived = m.derived.start + *w..m.derived.end + *w;
            }
            *w += n;
        };
        let mut eyes: Vec<EyeMemo> = Vec::with_capacity(case.eyes.len());
        for (i, e) in case.eyes.iter().enumerate() {
            let span = parsed.blocks[block_of_eye[i]].span;
            let (partner, previous) = match &all_visits {
                Some(v) => (v.partner(e), v.previous(e)),
                None => (old_eye_memos[i].partner, old_eye_memos[i].previous),
            };
            // The old result of this eye, if it and the eyes it depends on are
            // unchanged and are the same eyes as before.
            let found = old_eye(i).and_then(|j| {
                let m = old_eye_memos.get(j)?;
                let same_dep = |new: Option<usize>, old: Option<usize>| match (new, old) {
                    (None, None) => true,
                    (Some(n), Some(o)) => old_eye(n) == Some(o),
                    _ => false,
                };
                (m.reusable
                    && m.derived.start >= r
                    && same_dep(partner, m.partner)
                    && same_dep(previous, m.previous))
                .then_some(j)
            });
            let memo = match found {
                Some(j) => {
                    let m = &old_eye_memos[j];
                    let by = span.start as isize - m.span.start as isize;
                    // Old values r..m.derived.start (of eyes not reused) give way.
                    let until = w + (m.derived.start - r);
                    flush(
                        &mut derived,
                        &mut eyes,
                        &mut waiting,
                        &mut fresh_values,
                        &mut w,
                        until,
                    );
                    let start = w;
                    if by != 0 {
                        for d in &mut derived[start..start + m.derived.len()] {
                            d.span = d.span.moved(by);
                        }
                    }
                    w += m.derived.len();
                    r = m.derived.end;
                    EyeMemo {
                        span,
                        partner,
                        previous,
                        derived: start..w,
                        diags: shifted(&m.diags, by).collect(),
                        expects: shifted(&m.expects, by).collect(),
                        reusable: true,
                    }
                }
                None => {
                    let start = fresh_values.len();
                    let mut diags = Vec::new();
                    let local;
                    let visits = match &all_visits {
                        Some(v) => v,
                        None => {
                            let mut these: Vec<usize> =
                                [Some(i), partner, previous].into_iter().flatten().collect();
                            these.sort_unstable();
                            these.dedup();
                            local = Visits::of(&case, these);
                            &local
                        }
                    };
                    compute::compute_eye(&case, visits, e, explain, &mut fresh_values, &mut diags);
                    let mut expects = Vec::new();
                    let id = compute::eye_block_id(e);
                    expect::check(&id, &e.expects, &fresh_values[start..], &mut expects);
                    let reusable = fresh_values[start..].iter().all(|d| inside(d.span, span))
                        && diags.iter().chain(&expects).all(|d| diag_inside(d, span));
                    waiting.push(eyes.len());
                    EyeMemo {
                        span,
                        partner,
                        previous,
                        derived: start..fresh_values.len(),
                        diags,
                        expects,
                        reusable,
                    }
                }
            };
            eyes.push(memo);
        }
        // The remaining old values (eyes not reused, and the other blocks') go.
        let end = derived.len();
        flush(
            &mut derived,
            &mut eyes,
            &mut waiting,
            &mut fresh_values,
            &mut w,
            end,
        );
        (derived, eyes)
    };
    // Diagnostics in the order of a full evaluation: each eye's, the other
    // blocks', then the eyes' `expect` lines.
    for m in &eyes {
        diagnostics.extend(m.diags.iter().cloned());
    }
    let others = derived.len();
    compute::compute_others(&case, explain, &mut derived, &mut diagnostics);
    for m in &eyes {
        diagnostics.extend(m.expects.iter().cloned());
    }
    crate::check_others(&case, &derived[others..], &mut diagnostics);
    diagnostics.sort_by_key(|d| (d.span.start, d.severity));
    // Values outside their eye block, for `values_starting_in`.
    let mut loose: Vec<usize> = eyes
        .iter()
        .filter(|m| !m.reusable)
        .flat_map(|m| m.derived.clone())
        .chain(others..derived.len())
        .collect();
    loose.sort_by_key(|&i| (derived[i].span.start, i));
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
            eyes,
            ids,
            loose,
        },
    }
}

/// The usual edit, done in place: the eyes read again have the same sides,
/// dates and presence of a refraction as before (so every eye keeps its
/// partner and previous visit) and `memos` holds every eye's old result. Only
/// the eyes read again, the eyes that depend on them and those whose results
/// point outside their block are computed again, each indexed only with its
/// partner and previous visit; their values are written over the old ones, and
/// the results of the eyes after the edit are moved by `delta` bytes. Returns
/// false, having changed nothing, when a recomputed eye has a different number
/// of values than before (then the general path runs). `explain` writes the
/// substituted formulas ([`EvalOptions::derivations`]).
// Eight inputs, all of the one call site's state: a struct would only rename them.
#[allow(clippy::too_many_arguments)]
fn in_place(
    case: &Case,
    blocks: &[parax_syntax::Block],
    block_of_eye: &[usize],
    changed: Range<usize>,
    delta: isize,
    derived: &mut [Derived],
    memos: &mut [EyeMemo],
    explain: bool,
) -> bool {
    if memos.len() != case.eyes.len() {
        return false;
    }
    let touched = |x: Option<usize>| x.is_some_and(|x| changed.contains(&x));
    let redo: Vec<usize> = (0..memos.len())
        .filter(|&i| {
            let m = &memos[i];
            changed.contains(&i) || !m.reusable || touched(m.partner) || touched(m.previous)
        })
        .collect();
    let mut results = Vec::with_capacity(redo.len());
    for &i in &redo {
        let e = &case.eyes[i];
        let m = &memos[i];
        let span = blocks[block_of_eye[i]].span;
        let mut these: Vec<usize> = [Some(i), m.partner, m.previous]
            .into_iter()
            .flatten()
            .collect();
        these.sort_unstable();
        these.dedup();
        let visits = Visits::of(case, these);
        let mut values = Vec::with_capacity(m.derived.len());
        let mut diags = Vec::new();
        compute::compute_eye(case, &visits, e, explain, &mut values, &mut diags);
        if values.len() != m.derived.len() {
            return false;
        }
        let mut expects = Vec::new();
        expect::check(&compute::eye_block_id(e), &e.expects, &values, &mut expects);
        let reusable = values.iter().all(|d| inside(d.span, span))
            && diags.iter().chain(&expects).all(|d| diag_inside(d, span));
        results.push((values, diags, expects, reusable, span));
    }
    // Every eye after the edit moves (the recomputed ones are replaced below).
    if delta != 0 {
        for m in memos[changed.end..].iter_mut() {
            m.span = m.span.moved(delta);
            for d in &mut derived[m.derived.clone()] {
                d.span = d.span.moved(delta);
            }
            for d in m.diags.iter_mut().chain(&mut m.expects) {
                shift_diag(d, delta);
            }
        }
    }
    for (&i, (values, diags, expects, reusable, span)) in redo.iter().zip(results) {
        let m = &mut memos[i];
        for (slot, v) in derived[m.derived.clone()].iter_mut().zip(values) {
            *slot = v;
        }
        m.diags = diags;
        m.expects = expects;
        m.reusable = reusable;
        m.span = span;
    }
    true
}

/// See [`Evaluation::values_starting_in`].
pub(crate) fn values_starting_in(e: &Evaluation, span: Span) -> Vec<usize> {
    let starts_in = |i: &usize| {
        let s = e.derived[*i].span.start;
        span.start <= s && s <= span.end
    };
    let mut out: Vec<usize> = if e.memo.kept {
        let m = &e.memo;
        // Eye blocks are in file order and do not overlap.
        let first = m.eyes.partition_point(|x| x.span.end < span.start);
        let from = m
            .loose
            .partition_point(|&i| e.derived[i].span.start < span.start);
        m.eyes[first..]
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

/// See [`Evaluation::explained`]. After an incremental evaluation, an eye's
/// values are computed again from its lowered eye, its partner and its previous
/// visit (the inputs the memo records, as [`in_place`] does), and the other
/// blocks' values from the case; each block at most once per call.
pub(crate) fn explained(e: &Evaluation, indices: &[usize]) -> Vec<Derived> {
    if !e.memo.values_only {
        return indices.iter().map(|&i| e.derived[i].clone()).collect();
    }
    if !e.memo.kept {
        // A full evaluation without derivations keeps no per-block inputs:
        // everything is computed again (not a path the language server takes).
        let (all, _) = crate::evaluate_case_with(&e.case, EvalOptions::default());
        return indices.iter().map(|&i| all[i].clone()).collect();
    }
    let m = &e.memo;
    let others = m.eyes.last().map_or(0, |x| x.derived.end);
    // Computed blocks: `Some(eye)` or `None` for the other blocks.
    let mut done: HashMap<Option<usize>, Vec<Derived>> = HashMap::new();
    let mut out = Vec::with_capacity(indices.len());
    for &i in indices {
        let unit = (i < others).then(|| m.eyes.partition_point(|x| x.derived.end <= i));
        let values = done.entry(unit).or_insert_with(|| {
            let mut values = Vec::new();
            let mut diags = Vec::new();
            match unit {
                Some(k) => {
                    let em = &m.eyes[k];
                    let mut these: Vec<usize> = [Some(k), em.partner, em.previous]
                        .into_iter()
                        .flatten()
                        .collect();
                    these.sort_unstable();
                    these.dedup();
                    let visits = Visits::of(&e.case, these);
                    let eye = &e.case.eyes[k];
                    compute::compute_eye(&e.case, &visits, eye, true, &mut values, &mut diags);
                }
                None => compute::compute_others(&e.case, true, &mut values, &mut diags),
            }
            values
        });
        let base = unit.map_or(others, |k| m.eyes[k].derived.start);
        out.push(values[i - base].clone());
    }
    out
}
