//! Lens labels of `system` blocks: where each is defined (`lens LABEL POWER`)
//! and every place that names it (`object … before LABEL`, `expect LABEL.image`,
//! words in `expect` values).

use crate::Analysis;
use parax_syntax::{BlockKind, Span, ValueKind};
use serde::Serialize;

/// A label defined by a `lens` line.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LabelDef {
    /// The label.
    pub name: String,
    /// Where it is written on its `lens` line.
    pub span: Span,
    /// The system block it belongs to.
    pub block: Span,
}

/// Every label definition in the file.
pub fn definitions(a: &Analysis) -> Vec<LabelDef> {
    let mut out = Vec::new();
    for b in a
        .parsed
        .blocks
        .iter()
        .filter(|b| b.kind == BlockKind::System)
    {
        for li in b.body() {
            let Some(st) = a.parsed.lines[li].statement() else {
                continue;
            };
            if a.parsed.keyword(st) != "lens" {
                continue;
            }
            if let Some(v) = st
                .values
                .first()
                .filter(|v| matches!(v.kind, ValueKind::Word))
            {
                out.push(LabelDef {
                    name: a.parsed.text(v.span).into(),
                    span: v.span,
                    block: b.span,
                });
            }
        }
    }
    out
}

/// Every use of a label (not the definition): the span of the label text only.
fn uses(a: &Analysis, def: &LabelDef) -> Vec<Span> {
    let mut out = Vec::new();
    let Some(b) = a.parsed.blocks.iter().find(|b| b.span == def.block) else {
        return out;
    };
    for li in b.body() {
        let Some(st) = a.parsed.lines[li].statement() else {
            continue;
        };
        let kw = a.parsed.keyword(st);
        for (i, v) in st.values.iter().enumerate() {
            if !matches!(v.kind, ValueKind::Word) || (kw == "lens" && i == 0) {
                continue;
            }
            let text = a.parsed.text(v.span);
            if text == def.name {
                out.push(v.span);
            } else if kw == "expect" && i == 0 {
                if let Some(rest) = text.strip_prefix(def.name.as_str()) {
                    if rest.starts_with('.') {
                        out.push(Span::new(v.span.start(), v.span.start() + def.name.len()));
                    }
                }
            }
        }
    }
    out
}

fn def_at(a: &Analysis, offset: usize) -> Option<LabelDef> {
    let defs = definitions(a);
    if let Some(d) = defs.iter().find(|d| d.span.touches(offset)) {
        return Some(d.clone());
    }
    defs.into_iter()
        .find(|d| uses(a, d).iter().any(|u| u.touches(offset)))
}

/// The definition of the label at `offset`.
pub fn definition(a: &Analysis, offset: usize) -> Option<Span> {
    def_at(a, offset).map(|d| d.span)
}

/// Every place the label at `offset` is written, definition first when asked.
pub fn references(a: &Analysis, offset: usize, include_definition: bool) -> Vec<Span> {
    let Some(def) = def_at(a, offset) else {
        return Vec::new();
    };
    let mut out = Vec::new();
    if include_definition {
        out.push(def.span);
    }
    out.extend(uses(a, &def));
    out
}
