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
    let mut derived: Vec<Derived> = Vec::with_capacity(old_derived.len());
    // Reused values are moved out of the old list in one forward pass (eye blocks
    // keep their order unless blocks are moved around; an eye whose values lie
    // behind the pass is computed again instead).
    let mut pool = old_derived.into_iter();
    let mut pos = 0;
    let mut eyes = Vec::with_capacity(case.eyes.len());
    let mut eye_expects = Vec::new();
    for (i, e) in case.eyes.iter().enumerate() {
        let block = blocks[i];
        let text_of = |j: usize| parsed.text(blocks[j]).to_owned();
        let key = EyeKey {
            text: parsed.text(block).to_owned(),
            partner: visits.partner(e).map(text_of),
            previous: visits.previous(e).map(text_of),
        };
        let start = derived.len();
        let found = old
            .get(key.text.as_str())
            .filter(|&&j| old_eyes[j].key == key && old_eyes[j].derived.start >= pos);
        let memo = match found {
            Some(&j) => {
                let m = &old_eyes[j];
                let by = block.start as isize - m.base as isize;
                if m.derived.start > pos {
                    pool.nth(m.derived.start - pos - 1);
                }
                derived.extend(pool.by_ref().take(m.derived.len()).map(|mut d| {
                    d.span = d.span.moved(by);
                    d
                }));
                pos = m.derived.end;
                EyeMemo {
                    key,
                    base: block.start,
                    derived: start..derived.len(),
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
                let mut diags = Vec::new();
                compute::compute_eye(&case, &visits, e, &mut derived, &mut diags);
                let mut expects = Vec::new();
                expect::check(&ids[i], &e.expects, &derived[start..], &mut expects);
                let reusable = derived[start..].iter().all(|d| inside(d.span, block))
                    && diags.iter().chain(&expects).all(|d| {
                        inside(d.span, block)
                            && d.fix
                                .iter()
                                .flat_map(|f| &f.edits)
                                .all(|x| inside(x.span, block))
                    });
                EyeMemo {
                    key,
                    base: block.start,
                    derived: start..derived.len(),
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
