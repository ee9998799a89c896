//! Evaluation again after an edit, reusing the previous evaluation's work for
//! every eye block whose inputs did not change. Eye blocks are where large files
//! spend their time (a long history of visits), so they are what is cached:
//! the values of an eye block are a function of its own text, of the text of
//! every block that is not an eye block (the `case` block, frames: few and
//! short), and of the text of its partner (the other eye of the same visit) and
//! of its previous visit. Those texts are the cache key, compared in full (no
//! hashes), so a reused result is the one a full evaluation would compute; a
//! property test checks that [`evaluate_incremental`] equals [`crate::evaluate`].
//! Lowering and the other blocks are recomputed every time (they are cheap).
//! Results are stored with spans relative to the block's start and moved to
//! where the block stands now; a result that points outside its own block is
//! never reused.

use crate::compute::{self, Visits};
use crate::derived::Derived;
use crate::diagnostic::Diagnostic;
use crate::{expect, from_syntax, lower, Evaluation};
use parax_syntax::{BlockKind, Parsed, Span};
use std::collections::{HashMap, HashSet};
use std::ops::Range;

/// What one eye block's result depends on: its text, its partner's and its
/// previous visit's.
#[derive(Debug, Clone, PartialEq, Eq)]
struct EyeKey {
    text: String,
    partner: Option<String>,
    previous: Option<String>,
}

/// One eye block's result, kept for the next evaluation.
#[derive(Debug, Clone)]
struct EyeMemo {
    key: EyeKey,
    /// Where the block started.
    base: usize,
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
    /// Texts of every block that is not an eye block, joined.
    context: String,
    eyes: Vec<EyeMemo>,
}

fn shift_diag(mut d: Diagnostic, by: isize) -> Diagnostic {
    d.span = d.span.moved(by);
    if let Some(f) = &mut d.fix {
        for e in &mut f.edits {
            e.span = e.span.moved(by);
        }
    }
    d
}

fn inside(s: Span, block: Span) -> bool {
    block.start <= s.start && s.end <= block.end
}

/// Evaluate `parsed`, reusing what `previous` (the evaluation of an earlier
/// version of the same document, made by this function) computed for eye blocks
/// that did not change. Gives exactly what [`crate::evaluate`] gives.
pub fn evaluate_incremental(parsed: &Parsed, previous: Option<Evaluation>) -> Evaluation {
    let mut diagnostics: Vec<Diagnostic> = parsed.errors.iter().map(from_syntax).collect();
    let case = lower::lower(parsed, &mut diagnostics);
    // Two eye blocks with the same id share their `expect` look-ups: evaluate in full.
    let ids: Vec<String> = case.eyes.iter().map(compute::eye_block_id).collect();
    let mut seen = HashSet::with_capacity(ids.len());
    if !ids.iter().all(|id| seen.insert(id.as_str())) {
        return crate::evaluate(parsed);
    }
    let mut context = String::new();
    for b in parsed.blocks.iter().filter(|b| b.kind != BlockKind::Eye) {
        context.push_str(parsed.text(b.span));
        context.push('\0');
    }
    let (old_derived, old_eyes) = match previous {
        Some(p) if p.memo.context == context => (p.derived, p.memo.eyes),
        _ => (Vec::new(), Vec::new()),
    };
    // By the block's own text (unique: the header holds side and date, and ids
    // are unique); partner and previous visit are compared on a hit.
    let mut old: HashMap<&str, usize> = HashMap::with_capacity(old_eyes.len());
    for (i, m) in old_eyes.iter().enumerate() {
        if m.reusable {
            old.insert(m.key.text.as_str(), i);
        }
    }
    // The block of each eye (eyes are pushed in block order, blocks are sorted).
    let blocks: Vec<Span> = case
        .eyes
        .iter()
        .map(|e| {
            let k = parsed
                .blocks
                .partition_point(|b| b.span.start <= e.span.start);
            parsed.blocks[k - 1].span
        })
        .collect();
    let visits = Visits::new(&case);
    // The old list is edited in place: `derived[..w]` is final, and from `w` on
    // it still holds the old values from old index `r`. A reused eye's values stay
    // where they are (only their spans move); the values computed afresh wait in
    // `fresh` and replace the unused old values before the next reused eye, which
    // moves nothing when their count is unchanged (the usual edit). An eye whose
    // old values lie behind `r` (blocks moved around) is computed again.
    let mut derived = old_derived;
    let (mut w, mut r) = (0, 0);
    let mut fresh: Vec<Derived> = Vec::new();
    // Eyes computed afresh whose memo ranges still count from the start of `fresh`.
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
    let mut eye_expects = Vec::new();
    for (i, e) in case.eyes.iter().enumerate() {
        let block = blocks[i];
        let text_of = |j: usize| parsed.text(blocks[j]).to_owned();
        let key = EyeKey {
            text: parsed.text(block).to_owned(),
            partner: visits.partner(e).map(text_of),
            previous: visits.previous(e).map(text_of),
        };
        let found = old
            .get(key.text.as_str())
            .filter(|&&j| old_eyes[j].key == key && old_eyes[j].derived.start >= r);
        let memo = match found {
            Some(&j) => {
                let m = &old_eyes[j];
                let by = block.start as isize - m.base as isize;
                // Old values r..m.derived.start (of eyes not reused) give way.
                let until = w + (m.derived.start - r);
                flush(
                    &mut derived,
                    &mut eyes,
                    &mut waiting,
                    &mut fresh,
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
                    key,
                    base: block.start(),
                    derived: start..w,
                    diags: m.diags.iter().map(|d| shift_diag(d.clone(), by)).collect(),
                    expects: m
                        .expects
                        .iter()
                        .map(|d| shift_diag(d.clone(), by))
                        .collect(),
                    reusable: true,
                }
            }
            None => {
                let start = fresh.len();
                let mut diags = Vec::new();
                compute::compute_eye(&case, &visits, e, &mut fresh, &mut diags);
                let mut expects = Vec::new();
                expect::check(&ids[i], &e.expects, &fresh[start..], &mut expects);
                let reusable = fresh[start..].iter().all(|d| inside(d.span, block))
                    && diags.iter().chain(&expects).all(|d| {
                        inside(d.span, block)
                            && d.fix
                                .iter()
                                .flat_map(|f| &f.edits)
                                .all(|x| inside(x.span, block))
                    });
                waiting.push(eyes.len());
                EyeMemo {
                    key,
                    base: block.start(),
                    derived: start..fresh.len(),
                    diags,
                    expects,
                    reusable,
                }
            }
        };
        diagnostics.extend(memo.diags.iter().cloned());
        eye_expects.extend(memo.expects.iter().cloned());
        eyes.push(memo);
    }
    // The remaining old values (eyes not reused, and the other blocks') go.
    let end = derived.len();
    flush(
        &mut derived,
        &mut eyes,
        &mut waiting,
        &mut fresh,
        &mut w,
        end,
    );
    let others = derived.len();
    compute::compute_others(&case, &mut derived, &mut diagnostics);
    diagnostics.extend(eye_expects);
    crate::check_others(&case, &derived[others..], &mut diagnostics);
    diagnostics.sort_by_key(|d| (d.span.start, d.severity));
    Evaluation {
        case,
        derived,
        diagnostics,
        memo: Memo { context, eyes },
    }
}
