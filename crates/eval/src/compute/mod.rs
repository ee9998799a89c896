//! From the case model to derived values and the diagnostics they raise. Works on
//! the model alone (no text), so a case read from JSON evaluates identically.

mod contact;
mod eye;
mod iol;
mod model_eye;
mod near;
mod spectacle;
mod system;
mod visits;

use crate::derived::{Derivation, Derived, DerivedValue, Source};
use crate::diagnostic::Diagnostic;
use crate::model::{Case, Eye, Frame, Side};
use parax_optics::refraction::SphCyl;
use parax_syntax::Span;

/// Every derived value and diagnostic of a case.
pub fn compute(case: &Case, derived: &mut Vec<Derived>, diags: &mut Vec<Diagnostic>) {
    let ctx = Ctx::new(case);
    let case = &ctx;
    for e in &case.eyes {
        let mut out = Out::new(eye::block_id(e), derived);
        eye::compute(case, e, &mut out, diags);
        near::compute(case, e, &mut out);
        iol::compute(e, &mut out, diags);
        visits::compute(case, e, &mut out, diags);
    }
    for s in &case.systems {
        system::compute(s, &mut Out::new(system::block_id(s), derived), diags);
    }
    for l in &case.spectacle_lenses {
        spectacle::compute(
            case,
            l,
            &mut Out::new(spectacle::block_id(l), derived),
            diags,
        );
    }
    for f in &case.frames {
        spectacle::compute_frame(
            case,
            f,
            &mut Out::new(spectacle::frame_id(f), derived),
            diags,
        );
    }
    for c in &case.contact_lenses {
        contact::compute(case, c, &mut Out::new(contact::block_id(c), derived), diags);
    }
    for m in &case.model_eyes {
        model_eye::compute(
            case,
            m,
            &mut Out::new(model_eye::block_id(m), derived),
            diags,
        );
    }
}

/// A case with the look-ups that values of one block make into other blocks,
/// indexed once so that evaluation stays linear in the number of blocks. Derefs to
/// the case.
pub(crate) struct Ctx<'a> {
    case: &'a Case,
    /// The eye each side's lenses are fitted to (see [`current_eye`]).
    current: [Option<&'a Eye>; 2],
    /// Each side's eyes with a refraction by visit date (days since 1970), sorted.
    pub(crate) visits: [Vec<(i64, &'a Eye)>; 2],
    /// Eyes with a refraction by side and date, for the other eye of a visit.
    pub(crate) by_visit: std::collections::HashMap<(Side, Option<&'a str>), &'a Eye>,
}

fn side_index(side: Side) -> usize {
    match side {
        Side::Right => 0,
        Side::Left => 1,
    }
}

impl<'a> Ctx<'a> {
    fn new(case: &'a Case) -> Self {
        let mut current: [Option<&Eye>; 2] = [None, None];
        let mut visits: [Vec<(i64, &Eye)>; 2] = [Vec::new(), Vec::new()];
        let mut by_visit = std::collections::HashMap::new();
        for e in &case.eyes {
            let i = side_index(e.side);
            // The undated block if there is one, else the latest dated visit.
            current[i] = match current[i] {
                Some(c) if c.date.is_none() => Some(c),
                _ if e.date.is_none() => Some(e),
                Some(c) if c.date > e.date => Some(c),
                _ => Some(e),
            };
            if e.refraction.is_some() {
                if let Some(d) = e.date.as_deref().and_then(visits::days) {
                    visits[i].push((d, e));
                }
                by_visit.entry((e.side, e.date.as_deref())).or_insert(e);
            }
        }
        for v in &mut visits {
            v.sort_by_key(|(d, _)| *d);
        }
        Ctx {
            case,
            current,
            visits,
            by_visit,
        }
    }

    /// The eye with a refraction recorded last before `days` on `side`.
    pub(crate) fn previous_visit(&self, side: Side, days: i64) -> Option<(i64, &'a Eye)> {
        let v = &self.visits[side_index(side)];
        let i = v.partition_point(|(d, _)| *d < days);
        i.checked_sub(1).map(|i| v[i])
    }
}

impl std::ops::Deref for Ctx<'_> {
    type Target = Case;
    fn deref(&self) -> &Case {
        self.case
    }
}

/// The eye block a lens of `side` is fitted to: the undated block if there is one,
/// else the latest dated visit.
pub(crate) fn current_eye<'a>(case: &Ctx<'a>, side: Side) -> Option<&'a Eye> {
    case.current[side_index(side)]
}

/// The frame the lenses are fitted in: the first `frame` block.
pub(crate) fn first_frame<'a>(case: &Ctx<'a>) -> Option<&'a Frame> {
    case.case.frames.first()
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
pub(crate) struct Out<'a> {
    block: String,
    derived: &'a mut Vec<Derived>,
}

impl<'a> Out<'a> {
    fn new(block: String, derived: &'a mut Vec<Derived>) -> Self {
        Out { block, derived }
    }

    /// Add one value.
    #[allow(clippy::too_many_arguments)]
    pub(crate) fn push(
        &mut self,
        name: &str,
        label: &str,
        value: DerivedValue,
        span: Span,
        formula: &'static str,
        substituted: String,
        source: Source,
    ) -> &mut Derived {
        let text = value.display();
        self.derived.push(Derived {
            key: format!("{}.{name}", self.block),
            name: name.to_owned(),
            label: label.to_owned(),
            value,
            text,
            span,
            derivation: Derivation {
                formula,
                substituted,
                source,
            },
            caution: None,
        });
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
