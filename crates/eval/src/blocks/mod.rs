//! One module per block kind. Each owns, for its kind:
//!
//! * its keyword table ([`Keyword`]): every keyword's spec (name, form, doc,
//!   repeatable) beside the function that reads it into the model, so the schema
//!   ([`crate::schema`], completion, hover, the docs test) and the reading are
//!   one list and a keyword cannot be accepted and then dropped;
//! * its model type (re-exported by [`crate::model`]);
//! * its derived-value names as constants (`eye::keys::SPHERICAL_EQUIVALENT`),
//!   the only place a value's name is written, with `keys::ALL` listing them;
//! * its compute step (`compute`), from the model and the `Context` of the
//!   other blocks it depends on.
//!
//! This module dispatches over [`Block`], the enum of those models, so that a
//! step taken for every block is written once.

pub mod case;
pub mod contact_lens;
pub mod eye;
pub mod frame;
pub mod model_eye;
pub mod spectacle_lens;
pub mod system;

use crate::compute::Out;
use crate::derived::Derived;
use crate::diagnostic::Diagnostic;
use crate::model::{
    Block, Case, CaseInfo, ContactLens, Expect, Eye, Frame, ModelEye, Side, SpectacleLens, System,
};
use crate::read::Reader;
use crate::schema::KeywordSpec;
use parax_syntax::{BlockKind, Span};

/// How a keyword's statement is read into the model `M` of its block: the
/// reader is at the first value after the keyword; `span` is the statement's
/// (the whole line without comment) and `form` the keyword's spec form, for
/// messages.
pub type ReadFn<M> = fn(r: &mut Reader<'_>, model: &mut M, span: Span, form: &'static str);

/// One keyword of a block: its spec and how it is read.
pub struct Keyword<M: 'static> {
    /// Name, form, doc, repeatable.
    pub spec: KeywordSpec,
    /// Stores the statement's values into the model.
    pub read: ReadFn<M>,
}

/// A keyword entry read by `read`, taken once per block.
pub(crate) const fn one<M>(
    name: &'static str,
    form: &'static str,
    doc: &'static str,
    read: ReadFn<M>,
) -> Keyword<M> {
    Keyword {
        spec: KeywordSpec {
            name,
            form,
            doc,
            repeatable: false,
            evaluated: true,
        },
        read,
    }
}

/// A keyword entry read by `read` that may appear more than once in a block.
pub(crate) const fn many<M>(
    name: &'static str,
    form: &'static str,
    doc: &'static str,
    read: ReadFn<M>,
) -> Keyword<M> {
    let mut k = one(name, form, doc, read);
    k.spec.repeatable = true;
    k
}

/// The model of a block that records `expect` lines.
pub(crate) trait Expects {
    /// The block's `expect` lines.
    fn expects_mut(&mut self) -> &mut Vec<Expect>;
}

/// Every block model with values keeps its `expect` lines in `expects`.
macro_rules! expects {
    ($($model:ty),*) => {
        $(impl Expects for $model {
            fn expects_mut(&mut self) -> &mut Vec<Expect> {
                &mut self.expects
            }
        })*
    };
}
expects!(Eye, Frame, SpectacleLens, ContactLens, System, ModelEye);

fn read_expect<M: Expects>(r: &mut Reader<'_>, m: &mut M, span: Span, form: &'static str) {
    let e = crate::lower::read_expect(r, form, span);
    m.expects_mut().extend(e);
    // An `expect` line reports what it cannot read itself; whatever follows an
    // unreadable tolerance is not reported again as extra values.
    while r.next_value().is_some() {}
}

fn read_note<M>(r: &mut Reader<'_>, _: &mut M, _: Span, form: &'static str) {
    r.text_value("the note", form);
}

/// The `expect` entry shared by every block that has values.
pub(crate) const fn expect<M: Expects>() -> Keyword<M> {
    many(
        "expect",
        "NAME VALUE [± TOLERANCE]",
        "a recorded result, checked against the computed value",
        read_expect::<M>,
    )
}

/// The `note` entry of a block that keeps no notes.
pub(crate) const fn note<M>() -> Keyword<M> {
    many("note", "\"TEXT\"", "a free note", read_note::<M>)
}

/// Derived-value names of a block: a `pub const` per name and `ALL`, every
/// name in the order written.
macro_rules! keys {
    ($($(#[$doc:meta])* $name:ident = $text:literal,)*) => {
        $($(#[$doc])* pub const $name: &str = $text;)*
        /// Every name a block of this kind computes.
        pub const ALL: &[&str] = &[$($name),*];
    };
}
pub(crate) use keys;

/// The specs of the keywords of `table`.
pub(crate) fn specs<M>(table: &'static [Keyword<M>]) -> impl Iterator<Item = &'static KeywordSpec> {
    table.iter().map(|k| &k.spec)
}

/// The keyword specs of blocks of `kind`, in the order of its table.
pub fn keyword_specs(kind: BlockKind) -> Vec<&'static KeywordSpec> {
    match kind {
        BlockKind::Case => specs(case::KEYWORDS).collect(),
        BlockKind::Eye => specs(eye::KEYWORDS).collect(),
        BlockKind::Frame => specs(frame::KEYWORDS).collect(),
        BlockKind::SpectacleLens => specs(spectacle_lens::KEYWORDS).collect(),
        BlockKind::ContactLens => specs(contact_lens::KEYWORDS).collect(),
        BlockKind::System => specs(system::KEYWORDS).collect(),
        BlockKind::ModelEye => specs(model_eye::KEYWORDS).collect(),
    }
}

/// The names of the derived values blocks of `kind` compute (empty for the
/// `case` block, which has none).
pub fn value_names(kind: BlockKind) -> &'static [&'static str] {
    match kind {
        BlockKind::Case => &[],
        BlockKind::Eye => eye::keys::ALL,
        BlockKind::Frame => frame::keys::ALL,
        BlockKind::SpectacleLens => spectacle_lens::keys::ALL,
        BlockKind::ContactLens => contact_lens::keys::ALL,
        BlockKind::System => system::keys::ALL,
        BlockKind::ModelEye => model_eye::keys::ALL,
    }
}

/// The kind of block a block id (the first part of a value's key) names.
pub fn kind_of_id(id: &str) -> Option<BlockKind> {
    let head = id.split('.').next()?;
    BlockKind::ALL.into_iter().find(|k| k.keyword() == head)
}

impl Block {
    /// The block's kind.
    pub fn kind(&self) -> BlockKind {
        match self {
            Block::Eye(_) => BlockKind::Eye,
            Block::Frame(_) => BlockKind::Frame,
            Block::SpectacleLens(_) => BlockKind::SpectacleLens,
            Block::ContactLens(_) => BlockKind::ContactLens,
            Block::System(_) => BlockKind::System,
            Block::ModelEye(_) => BlockKind::ModelEye,
        }
    }

    /// The id its values' keys start with (`eye.right`, `system.bench`).
    pub fn id(&self) -> String {
        match self {
            Block::Eye(e) => eye::block_id(e),
            Block::Frame(f) => frame::block_id(f),
            Block::SpectacleLens(l) => spectacle_lens::block_id(l),
            Block::ContactLens(c) => contact_lens::block_id(c),
            Block::System(s) => system::block_id(s),
            Block::ModelEye(m) => model_eye::block_id(m),
        }
    }

    /// Its header line.
    pub fn span(&self) -> Span {
        match self {
            Block::Eye(e) => e.span,
            Block::Frame(f) => f.span,
            Block::SpectacleLens(l) => l.span,
            Block::ContactLens(c) => c.span,
            Block::System(s) => s.span,
            Block::ModelEye(m) => m.span,
        }
    }

    /// Its `expect` lines.
    pub fn expects(&self) -> &[Expect] {
        match self {
            Block::Eye(e) => &e.expects,
            Block::Frame(f) => &f.expects,
            Block::SpectacleLens(l) => &l.expects,
            Block::ContactLens(c) => &c.expects,
            Block::System(s) => &s.expects,
            Block::ModelEye(m) => &m.expects,
        }
    }

    /// Give back the spare room of the block's lists once it is read (a vector
    /// that grew by pushes holds up to twice its length; on a 5 MB file the
    /// `expect` lists alone left 3.6 MB empty).
    pub(crate) fn shrink(&mut self) {
        match self {
            Block::Eye(e) => e.expects.shrink_to_fit(),
            Block::Frame(f) => f.expects.shrink_to_fit(),
            Block::SpectacleLens(l) => l.expects.shrink_to_fit(),
            Block::ContactLens(c) => c.expects.shrink_to_fit(),
            Block::System(s) => {
                s.elements.shrink_to_fit();
                s.expects.shrink_to_fit();
            }
            Block::ModelEye(m) => {
                m.surfaces.shrink_to_fit();
                m.expects.shrink_to_fit();
            }
        }
    }
}

/// What a block's values depend on besides the block itself, looked up once
/// per evaluation: the `case` block, the frames, the eye a lens is fitted to
/// and the first lens of each side. Eye blocks also depend on their partner and
/// previous visit, through [`eye::Visits`].
pub(crate) struct Context<'a> {
    /// The case.
    pub case: &'a Case,
    /// The `case` block's facts.
    pub info: &'a CaseInfo,
    first_frame: Option<&'a Frame>,
    frame_vertex: Option<f64>,
    current: [Option<&'a Eye>; 2],
    lens: [Option<&'a SpectacleLens>; 2],
}

fn side_index(s: Side) -> usize {
    match s {
        Side::Right => 0,
        Side::Left => 1,
    }
}

impl<'a> Context<'a> {
    /// Look up what the blocks of `case` depend on, in one pass over its blocks.
    pub fn new(case: &'a Case) -> Self {
        let mut cx = Context {
            case,
            info: &case.info,
            first_frame: None,
            frame_vertex: None,
            current: [None; 2],
            lens: [None; 2],
        };
        // Per side: the undated eye block if there is one, else the latest
        // dated visit (the last of equal dates).
        let mut undated: [Option<&Eye>; 2] = [None; 2];
        let mut latest: [Option<&Eye>; 2] = [None; 2];
        for b in &case.blocks {
            match b {
                Block::Frame(f) => {
                    cx.first_frame = cx.first_frame.or(Some(f));
                    if cx.frame_vertex.is_none() {
                        cx.frame_vertex = f.vertex.as_ref().map(|v| v.value);
                    }
                }
                Block::Eye(e) => {
                    let s = side_index(e.side);
                    if e.date.is_none() {
                        undated[s] = undated[s].or(Some(e));
                    } else if latest[s].is_none_or(|l| e.date >= l.date) {
                        latest[s] = Some(e);
                    }
                }
                Block::SpectacleLens(l) => {
                    let s = side_index(l.side);
                    cx.lens[s] = cx.lens[s].or(Some(l));
                }
                _ => {}
            }
        }
        for s in 0..2 {
            cx.current[s] = undated[s].or(latest[s]);
        }
        cx
    }

    /// The frame the lenses are fitted in: the first `frame` block.
    pub fn first_frame(&self) -> Option<&'a Frame> {
        self.first_frame
    }

    /// The vertex distance of the first frame that records one, metres.
    pub fn frame_vertex(&self) -> Option<f64> {
        self.frame_vertex
    }

    /// The eye block a lens of `side` is fitted to: the undated block if there
    /// is one, else the latest dated visit.
    pub fn current_eye(&self, side: Side) -> Option<&'a Eye> {
        self.current[side_index(side)]
    }

    /// The first `spectacle-lens` block of `side`.
    pub fn lens(&self, side: Side) -> Option<&'a SpectacleLens> {
        self.lens[side_index(side)]
    }

    /// The eye at index `i` of [`Case::blocks`] (an index from [`eye::Visits`]).
    pub fn eye(&self, i: usize) -> &'a Eye {
        match &self.case.blocks[i] {
            Block::Eye(e) => e,
            _ => unreachable!("visits index eye blocks only"),
        }
    }
}

/// Compute the values of block `i` of the case (pushed onto `derived`) and the
/// diagnostics of its computation; the one compute step of every evaluation
/// mode. `visits` must index at least this eye, its partner and its previous
/// visit when the block is an eye block. Returns the block's id.
pub(crate) fn compute(
    cx: &Context<'_>,
    visits: &eye::Visits<'_>,
    i: usize,
    derivations: bool,
    derived: &mut Vec<Derived>,
    diags: &mut Vec<Diagnostic>,
) -> std::sync::Arc<String> {
    let block = &cx.case.blocks[i];
    let id = std::sync::Arc::new(block.id());
    let mut out = Out::new(std::sync::Arc::clone(&id), derivations, derived);
    match block {
        Block::Eye(e) => eye::compute(cx, visits, e, &mut out, diags),
        Block::Frame(f) => frame::compute(cx, f, &mut out, diags),
        Block::SpectacleLens(l) => spectacle_lens::compute(cx, l, &mut out, diags),
        Block::ContactLens(c) => contact_lens::compute(cx, c, &mut out, diags),
        Block::System(s) => system::compute(s, &mut out, diags),
        Block::ModelEye(m) => model_eye::compute(cx, m, &mut out, diags),
    }
    id
}
