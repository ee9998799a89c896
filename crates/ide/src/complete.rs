//! Completion: block kinds at column 0, the keywords a block accepts, units that
//! fit the quantity being written, lens labels of the system, derived-value names
//! after `expect`, and the published model-eye names.

use crate::{labels, Analysis};
use parax_eval::schema;
use parax_syntax::{BlockKind, Span};
use serde::Serialize;

/// What a completion item is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum ItemKind {
    /// A block keyword at column 0.
    Block,
    /// A statement keyword.
    Keyword,
    /// A unit.
    Unit,
    /// A lens label.
    Label,
    /// A derived-value name.
    Value,
    /// A fixed word (model-eye name, side).
    Word,
}

/// One completion item.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Item {
    /// The text inserted.
    pub label: String,
    /// What it is.
    pub kind: ItemKind,
    /// One line shown beside it.
    pub detail: String,
    /// The span the item replaces (the word being typed).
    pub replace: Span,
}

/// Published schematic eyes the notation names.
pub const MODEL_EYES: &[(&str, &str)] = &[
    ("gullstrand", "Gullstrand's exact schematic eye"),
    ("le-grand", "Le Grand's full theoretical eye"),
    ("emsley", "Emsley's reduced eye"),
];

/// Completion items at byte `offset`.
pub fn complete(a: &Analysis, offset: usize) -> Vec<Item> {
    let src = a.source();
    let offset = src.floor_char_boundary(offset);
    let line_i = a.line_at(offset);
    let start = a.parsed.index.line_start(line_i);
    let before = &src[start..offset];
    let word_len = before
        .chars()
        .rev()
        .take_while(|c| c.is_alphanumeric() || matches!(c, '-' | '.' | '_'))
        .map(char::len_utf8)
        .sum::<usize>();
    let replace = Span::new(offset - word_len, offset);
    let head = &before[..before.len() - word_len];
    let words: Vec<&str> = head.split_whitespace().collect();
    let mut out = Vec::new();

    if head.is_empty() {
        // Column 0: a block opens here.
        for k in BlockKind::ALL {
            out.push(Item {
                label: k.keyword().into(),
                kind: ItemKind::Block,
                detail: schema::header_form(k).into(),
                replace,
            });
        }
        return out;
    }
    let Some(block) = a.block_around(line_i) else {
        return out;
    };
    if words.is_empty() {
        for k in schema::keywords(block.kind) {
            out.push(Item {
                label: k.name.into(),
                kind: ItemKind::Keyword,
                detail: format!("{}: {}", k.form, k.doc),
                replace,
            });
        }
        return out;
    }
    let keyword = words[0];
    let last = *words.last().unwrap_or(&"");
    // After a number: the units of the quantity.
    if words.len() > 1 && last.trim_start_matches(['+', '-']).parse::<f64>().is_ok() {
        if let Some(spec) = schema::keyword(block.kind, keyword) {
            for (unit, what) in units_for(keyword, spec.form) {
                out.push(Item {
                    label: (*unit).into(),
                    kind: ItemKind::Unit,
                    detail: (*what).into(),
                    replace,
                });
            }
        }
        return out;
    }
    match (block.kind, keyword) {
        (BlockKind::ModelEye, "from") if words.len() == 1 => {
            for (name, what) in MODEL_EYES {
                out.push(Item {
                    label: (*name).into(),
                    kind: ItemKind::Word,
                    detail: (*what).into(),
                    replace,
                });
            }
        }
        (BlockKind::System, _) if last == "before" || last == "after" => {
            label_items(a, block.span, replace, &mut out);
        }
        (_, "expect") if words.len() == 1 => {
            let mut seen = std::collections::BTreeSet::new();
            for d in a
                .evaluation
                .derived
                .iter()
                .filter(|d| block.span.start <= d.span.start && d.span.end <= block.span.end)
            {
                if seen.insert(d.name.clone()) {
                    out.push(Item {
                        label: d.name.to_string(),
                        kind: ItemKind::Value,
                        detail: format!("{}: {}", d.label, d.text()),
                        replace,
                    });
                }
            }
        }
        (BlockKind::Eye | BlockKind::SpectacleLens | BlockKind::ContactLens, _)
            if matches!(
                a.parsed.lines[line_i].kind,
                parax_syntax::LineKind::Header { .. }
            ) || block.header == line_i =>
        {
            for side in ["right", "left"] {
                out.push(Item {
                    label: side.into(),
                    kind: ItemKind::Word,
                    detail: "which eye".into(),
                    replace,
                });
            }
        }
        _ => {}
    }
    out
}

fn label_items(a: &Analysis, block: Span, replace: Span, out: &mut Vec<Item>) {
    for def in labels::definitions(a)
        .into_iter()
        .filter(|d| block.start <= d.span.start && d.span.end <= block.end)
    {
        out.push(Item {
            label: def.name.clone(),
            kind: ItemKind::Label,
            detail: "lens label".into(),
            replace,
        });
    }
}

/// Units that fit a keyword's quantity, read from the schema's value form.
fn units_for(keyword: &str, form: &str) -> &'static [(&'static str, &'static str)] {
    const LENGTH: &[(&str, &str)] = &[
        ("mm", "millimetres"),
        ("cm", "centimetres"),
        ("m", "metres"),
    ];
    const POWER: &[(&str, &str)] = &[
        ("D", "dioptres"),
        ("DS", "dioptres sphere"),
        ("DC", "dioptres cylinder"),
    ];
    const ANGLE: &[(&str, &str)] = &[("deg", "degrees"), ("°", "degrees")];
    const PRISM: &[(&str, &str)] = &[("Δ", "prism dioptres"), ("prism", "prism dioptres")];
    const AGE: &[(&str, &str)] = &[("y", "years")];
    if form.contains("Δ") {
        PRISM
    } else if form.contains("mm") || matches!(keyword, "gap" | "object") {
        // keratometry also takes K in D; radius first.
        if keyword == "keratometry" {
            const K: &[(&str, &str)] = &[("mm", "radius in millimetres"), ("D", "K in dioptres")];
            K
        } else {
            LENGTH
        }
    } else if form.contains("deg") {
        ANGLE
    } else if form.contains(" y") {
        AGE
    } else if form.contains("POWER") || form.contains("SPHERE") {
        POWER
    } else {
        &[]
    }
}
