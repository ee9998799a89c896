//! From the case model to derived values and the diagnostics they raise. Works on
//! the model alone (no text), so a case read from JSON evaluates identically.

mod contact;
mod eye;
mod eye_axial;
mod iol;
mod model_eye;
mod near;
mod spectacle;
mod system;
mod visits;

pub use visits::Visits;

use crate::derived::{Derivation, Derived, DerivedValue, Method, Phrase};
use crate::diagnostic::Diagnostic;
use crate::model::{Case, Expect, Eye, Frame, Side};
use parax_optics::refraction::SphCyl;
use parax_syntax::Span;
use std::sync::Arc;

/// Every derived value and diagnostic of a case; the substituted formulas only
/// when `derivations` is true.
pub fn compute(
    case: &Case,
    derivations: bool,
    derived: &mut Vec<Derived>,
    diags: &mut Vec<Diagnostic>,
) {
    compute_each(case, derivations, derived, diags, &mut |_, _, _, _| {});
}

/// The values of one eye block. Besides the block itself they depend on the
/// `case` block and the frames (`case`), and on the eye's partner and previous
/// visit (`visits`); nothing else. Substituted formulas only when `derivations`.
pub fn compute_eye(
    case: &Case,
    visits: &Visits<'_>,
    e: &Eye,
    derivations: bool,
    derived: &mut Vec<Derived>,
    diags: &mut Vec<Diagnostic>,
) {
    let mut out = Out::new(Arc::new(eye::block_id(e)), derivations, derived);
    eye_block(case, visits, e, &mut out, diags);
}

/// Every computation of one eye block, in order. The one list of them: full,
/// block-by-block and incremental evaluation all come here.
fn eye_block(
    case: &Case,
    visits: &Visits<'_>,
    e: &Eye,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    eye::compute(case, e, out, diags);
    eye_axial::compute(case, e, out);
    near::compute(case, e, out);
    iol::compute(e, out, diags);
    visits::compute(case, visits, e, out, diags);
}

/// The values of every block other than the eye blocks, in the order of
/// [`compute`]; substituted formulas only when `derivations`.
pub fn compute_others(
    case: &Case,
    derivations: bool,
    derived: &mut Vec<Derived>,
    diags: &mut Vec<Diagnostic>,
) {
    others_each(case, derivations, derived, diags, &mut |_, _, _, _| {});
}

/// What [`compute_each`] calls after each block: the block id, the block's
/// `expect` lines, the buffer and the index where the block's values start in it.
pub(crate) type BlockDone<'a> = dyn FnMut(&str, &[Expect], &mut Vec<Derived>, usize) + 'a;

/// [`compute`] one block at a time: the values of each block are pushed onto
/// `buf`, then `done` is called with the block's id, its `expect` lines and the
/// index where its values start (it may drain them). Blocks come in the order of
/// [`compute`]: eyes, systems, spectacle lenses, frames, contact lenses, model eyes.
pub(crate) fn compute_each(
    case: &Case,
    derivations: bool,
    buf: &mut Vec<Derived>,
    diags: &mut Vec<Diagnostic>,
    done: &mut BlockDone<'_>,
) {
    let visits = Visits::new(case);
    for e in &case.eyes {
        let id = Arc::new(eye::block_id(e));
        let start = buf.len();
        let mut out = Out::new(Arc::clone(&id), derivations, buf);
        eye_block(case, &visits, e, &mut out, diags);
        done(&id, &e.expects, buf, start);
    }
    others_each(case, derivations, buf, diags, done);
}

/// The blocks other than eye blocks, one at a time, as [`compute_each`] does.
fn others_each(
    case: &Case,
    derivations: bool,
    buf: &mut Vec<Derived>,
    diags: &mut Vec<Diagnostic>,
    done: &mut BlockDone<'_>,
) {
    for s in &case.systems {
        let id = Arc::new(system::block_id(s));
        let start = buf.len();
        system::compute(s, &mut Out::new(Arc::clone(&id), derivations, buf), diags);
        done(&id, &s.expects, buf, start);
    }
    for l in &case.spectacle_lenses {
        let id = Arc::new(spectacle::block_id(l));
        let start = buf.len();
        spectacle::compute(
            case,
            l,
            &mut Out::new(Arc::clone(&id), derivations, buf),
            diags,
        );
        done(&id, &l.expects, buf, start);
    }
    for f in &case.frames {
        let id = Arc::new(spectacle::frame_id(f));
        let start = buf.len();
        spectacle::compute_frame(
            case,
            f,
            &mut Out::new(Arc::clone(&id), derivations, buf),
            diags,
        );
        done(&id, &f.expects, buf, start);
    }
    for c in &case.contact_lenses {
        let id = Arc::new(contact::block_id(c));
        let start = buf.len();
        contact::compute(
            case,
            c,
            &mut Out::new(Arc::clone(&id), derivations, buf),
            diags,
        );
        done(&id, &c.expects, buf, start);
    }
    for m in &case.model_eyes {
        let id = Arc::new(model_eye::block_id(m));
        let start = buf.len();
        model_eye::compute(
            case,
            m,
            &mut Out::new(Arc::clone(&id), derivations, buf),
            diags,
        );
        done(&id, &m.expects, buf, start);
    }
}

/// The id of every block that has values, in the order of [`compute`].
pub(crate) fn block_ids(case: &Case) -> Vec<String> {
    let mut ids = Vec::with_capacity(
        case.eyes.len()
            + case.systems.len()
            + case.spectacle_lenses.len()
            + case.frames.len()
            + case.contact_lenses.len()
            + case.model_eyes.len(),
    );
    ids.extend(case.eyes.iter().map(eye::block_id));
    ids.extend(case.systems.iter().map(system::block_id));
    ids.extend(case.spectacle_lenses.iter().map(spectacle::block_id));
    ids.extend(case.frames.iter().map(spectacle::frame_id));
    ids.extend(case.contact_lenses.iter().map(contact::block_id));
    ids.extend(case.model_eyes.iter().map(model_eye::block_id));
    ids
}

/// The eye block a lens of `side` is fitted to: the undated block if there is one,
/// else the latest dated visit.
pub(crate) fn current_eye(case: &Case, side: Side) -> Option<&Eye> {
    let mine = case.eyes.iter().filter(|e| e.side == side);
    mine.clone()
        .find(|e| e.date.is_none())
        .or_else(|| mine.max_by(|a, b| a.date.cmp(&b.date)))
}

/// The frame the lenses are fitted in: the first `frame` block.
pub(crate) fn first_frame(case: &Case) -> Option<&Frame> {
    case.frames.first()
}

/// A spherocylinder as a derived value.
pub(crate) fn sphcyl(rx: &SphCyl) -> DerivedValue {
    DerivedValue::SphCyl {
        sphere: rx.sphere,
        cylinder: rx.cylinder,
        axis: rx.axis,
    }
}

/// Collects the derived values of one block under its block id.
///
/// The substituted formula of a value is passed to [`Out::push`] as a closure and
/// run at once when `derivations` is set, never otherwise. Chosen over storing the
/// closure in the value (`Arc<dyn Fn() -> String>`): a stored closure costs an
/// allocation per value anyway and must copy what it captures, while the one
/// front end that needs no derivations (`parax check`) knows it up front; every
/// other caller ([`crate::evaluate`], JSON, hover, `eval --explain`) gets them
/// written exactly as before.
pub(crate) struct Out<'a> {
    block: Arc<String>,
    derivations: bool,
    derived: &'a mut Vec<Derived>,
}

impl<'a> Out<'a> {
    fn new(block: Arc<String>, derivations: bool, derived: &'a mut Vec<Derived>) -> Self {
        Out {
            block,
            derivations,
            derived,
        }
    }

    /// True when substituted formulas are written: a derivation that costs
    /// work before [`Out::push`] (a chain shared by several values) checks this.
    pub(crate) fn explains(&self) -> bool {
        self.derivations
    }

    /// Add one value; `substituted` writes the formula with this case's numbers
    /// (called only when derivations are wanted).
    #[allow(clippy::too_many_arguments)]
    pub(crate) fn push(
        &mut self,
        name: impl Into<Phrase>,
        label: impl Into<Phrase>,
        value: DerivedValue,
        span: Span,
        method: &'static Method,
        substituted: impl FnOnce() -> String,
    ) -> &mut Derived {
        let substituted = if self.derivations {
            substituted().into_boxed_str()
        } else {
            Box::default()
        };
        crate::push_growing_slowly(
            self.derived,
            Derived {
                block: Arc::clone(&self.block),
                name: name.into(),
                label: label.into(),
                value,
                span,
                derivation: Derivation {
                    method,
                    substituted,
                },
                caution: None,
            },
        );
        self.derived.last_mut().expect("just pushed")
    }
}

/// A name as a key part: lower case, runs of other characters as one `-`.
pub fn slug(name: &str) -> String {
    let mut out = String::with_capacity(name.len());
    for c in name.chars() {
        if c.is_alphanumeric() {
            out.extend(c.to_lowercase());
        } else if !out.ends_with('-') && !out.is_empty() {
            out.push('-');
        }
    }
    out.trim_end_matches('-').to_owned()
}

/// Four significant decimals, for substituted formulas.
pub(crate) fn n4(x: f64) -> String {
    let x = if x.abs() < 5e-5 { 0.0 } else { x };
    format!("{x:.4}")
}

pub use contact::block_id as contact_block_id;
pub use eye::block_id as eye_block_id;
pub use model_eye::block_id as model_eye_block_id;
pub use spectacle::{block_id as spectacle_block_id, frame_id};
pub use system::block_id as system_block_id;
