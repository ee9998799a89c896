//! From the case model to derived values and the diagnostics they raise. Works on
//! the model alone (no text), so a case read from JSON evaluates identically.

mod eye;
mod system;

use crate::derived::{Derivation, Derived, DerivedValue, Source};
use crate::diagnostic::Diagnostic;
use crate::model::Case;
use parax_syntax::Span;

/// Every derived value and diagnostic of a case.
pub fn compute(case: &Case, derived: &mut Vec<Derived>, diags: &mut Vec<Diagnostic>) {
    for e in &case.eyes {
        eye::compute(case, e, &mut Out::new(eye::block_id(e), derived), diags);
    }
    for s in &case.systems {
        system::compute(s, &mut Out::new(system::block_id(s), derived), diags);
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

pub use eye::block_id as eye_block_id;
pub use system::block_id as system_block_id;
