//! From the case model to derived values and the diagnostics they raise: the
//! loop over the blocks, and what every block's compute step shares ([`Out`],
//! number formatting). Works on the model alone (no text), so a case read from
//! JSON evaluates identically. Each block kind's computations live in its
//! module under `blocks`.

pub(crate) use crate::blocks::eye::Visits;

use crate::blocks::{self, Context};
use crate::derived::{Derivation, Derived, DerivedValue, Method, Phrase};
use crate::diagnostic::Diagnostic;
use crate::model::{Block, Case};
use parax_optics::refraction::SphCyl;
use parax_syntax::Span;
use std::sync::Arc;

/// What [`compute_each`] calls after each block: the block, the buffer and the
/// index where the block's values start in it.
pub(crate) type BlockDone<'a> = dyn FnMut(&Block, &mut Vec<Derived>, usize) + 'a;

/// The one per-block step of every evaluation mode (full, streaming,
/// incremental, a hover's derivations): compute block `i` of the case, pushing
/// its values onto `out` and the diagnostics of computing it onto `diags`; then,
/// when `expects` is given, judge the block's `expect` lines against its own
/// values into it (right when no other block shares its id). `visits` must
/// index at least this eye, its partner and its previous visit when the block
/// is an eye block. Returns the block's id.
pub(crate) fn block_step(
    cx: &Context<'_>,
    visits: &Visits<'_>,
    i: usize,
    derivations: bool,
    out: &mut Vec<Derived>,
    diags: &mut Vec<Diagnostic>,
    expects: Option<&mut Vec<Diagnostic>>,
) -> Arc<String> {
    let start = out.len();
    let id = blocks::compute(cx, visits, i, derivations, out, diags);
    if let Some(expects) = expects {
        crate::expect::check(&id, cx.case.blocks[i].expects(), &out[start..], expects);
    }
    id
}

/// [`block_step`] for every block in file order: the values of each block are
/// pushed onto `buf`, then `done` is called with the block and the index where
/// its values start (it may drain them). `expect` findings go to `expects`
/// when given (see [`block_step`]).
pub(crate) fn compute_each(
    case: &Case,
    derivations: bool,
    buf: &mut Vec<Derived>,
    diags: &mut Vec<Diagnostic>,
    mut expects: Option<&mut Vec<Diagnostic>>,
    done: &mut BlockDone<'_>,
) {
    let cx = Context::new(case);
    let visits = Visits::new(case);
    for (i, b) in case.blocks.iter().enumerate() {
        let start = buf.len();
        block_step(
            &cx,
            &visits,
            i,
            derivations,
            buf,
            diags,
            expects.as_deref_mut(),
        );
        done(b, buf, start);
    }
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
    pub(crate) fn new(
        block: Arc<String>,
        derivations: bool,
        derived: &'a mut Vec<Derived>,
    ) -> Self {
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
