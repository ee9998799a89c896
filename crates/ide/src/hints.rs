//! Inlay hints: the derived values of a line, compact, shown at its end.

use crate::{meets, Analysis};
use parax_eval::blocks::eye::keys as eye;
use parax_eval::blocks::system::keys as system;
use parax_syntax::Span;
use serde::Serialize;
use std::fmt::Write as _;

/// One hint: text shown after the end of a statement line.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct InlayHint {
    /// Byte offset where the hint stands (the end of the line's text).
    pub offset: usize,
    /// The compact text, e.g. `corneal plane -5.38 / -1.29 x 175 · SE -6.50 D`.
    pub label: String,
    /// Longer text: each value with its label and source (empty from
    /// [`inlay_hints_without_tooltips`]).
    pub tooltip: String,
}

/// The values a hint shows for a line, in order of preference; the first two
/// present are shown. Names not listed never appear in a hint (hover has them all).
/// (The same names are used by other blocks' values: a contact lens's
/// `corneal-plane`, a spectacle lens's `magnification`.)
const PREFERRED: &[(&str, &str)] = &[
    (eye::CORNEAL_PLANE, "cornea"),
    (eye::SPHERICAL_EQUIVALENT, "SE"),
    (eye::NEAR_REFRACTION, "near"),
    (eye::MEAN_K, "K"),
    (eye::CORNEAL_CYLINDER, "cyl"),
    (eye::TOTAL_CORNEAL_POWER, "total K"),
    (system::IMAGE, "image"),
    (system::MAGNIFICATION, "mag"),
    (system::EQUIVALENT_POWER, "F"),
];

/// Hints for every statement line that meets `range` (the whole file when `None`).
pub fn inlay_hints(a: &Analysis, range: Option<Span>) -> Vec<InlayHint> {
    hints(a, range, true)
}

/// [`inlay_hints`] with every tooltip left empty, for a client that asks for
/// a hint's tooltip only when it shows it: the tooltip formats every value of
/// the line (the label only two), so it was most of the cost of an answer.
pub fn inlay_hints_without_tooltips(a: &Analysis, range: Option<Span>) -> Vec<InlayHint> {
    hints(a, range, false)
}

fn hints(a: &Analysis, range: Option<Span>, tooltips: bool) -> Vec<InlayHint> {
    let mut out = Vec::new();
    // Only the lines of the range are visited (found by the line index), so a
    // screenful costs the same in a short file and a long one.
    let lines = match range {
        Some(r) => {
            let first = a.line_at(r.start());
            &a.parsed.lines[first.min(a.parsed.lines.len())..]
        }
        None => &a.parsed.lines[..],
    };
    for line in lines {
        if let Some(r) = range {
            if line.span.start > r.end {
                break;
            }
            if !meets(r, line.span) {
                continue;
            }
        }
        if line.statement().is_none() {
            continue;
        }
        let here: Vec<_> = a.derived_on_line(line).collect();
        if here.is_empty() {
            continue;
        }
        // The label is written in place: `short value · short value`.
        let mut label = String::new();
        let mut parts = 0;
        for (name, short) in PREFERRED {
            // Per-lens values are keyed `LABEL.image`; the whole system's image is `image`.
            // The whole system's value wins over a per-lens one on the same line.
            let exact = here.iter().find(|d| d.name == *name);
            let per_lens = || {
                here.iter().find(|d| {
                    d.name
                        .strip_suffix(name)
                        .is_some_and(|label| label.ends_with('.'))
                })
            };
            if let Some(d) = exact.or_else(per_lens) {
                if parts > 0 {
                    label.push_str(" · ");
                }
                let _ = write!(label, "{short} {}", d.value);
                parts += 1;
            }
            if parts == 2 {
                break;
            }
        }
        if parts == 0 {
            continue;
        }
        // One string written in place (no string per value, then a join).
        let mut tooltip = String::new();
        for (k, d) in here.iter().enumerate().filter(|_| tooltips) {
            if k > 0 {
                tooltip.push('\n');
            }
            let _ = write!(tooltip, "{}: {}  [{}]", d.label, d.value, d.name);
        }
        // End of the text before any trailing comment, so the hint reads after the values.
        let end = match line.comment {
            Some(c) => {
                a.parsed.source[line.span.start()..c.start()]
                    .trim_end()
                    .len()
                    + line.span.start()
            }
            None => line.span.end(),
        };
        out.push(InlayHint {
            offset: end,
            label,
            tooltip,
        });
    }
    out
}
