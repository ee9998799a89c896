//! Code actions: every fix a diagnostic carries, and rewrites of the line under
//! the cursor: transpose a refraction to the other cylinder form, write an axis
//! of 0 as 180, convert a length between mm, cm and m, insert or refresh an
//! `expect` line with the computed value.

use crate::{meets, Analysis};
use parax_eval::blocks::eye::keys as eye;
use parax_eval::blocks::system::keys as system;
use parax_eval::units::{unit_of, written_in};
use parax_eval::Edit;
use parax_optics::units::{Dimension, Unit};
use parax_syntax::{Line, Span, Symbol as Sym, ValueKind};
use serde::Serialize;

/// What an action is, for the editor's menus.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum ActionKind {
    /// Fixes a diagnostic.
    QuickFix,
    /// Rewrites a value without changing its meaning.
    Rewrite,
    /// Records a computed value as an `expect` line.
    Record,
}

/// One action: a title and the edits that make it.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Action {
    /// Imperative title.
    pub title: String,
    /// Kind.
    pub kind: ActionKind,
    /// Non-overlapping edits.
    pub edits: Vec<Edit>,
    /// Index into `evaluation.diagnostics` of the diagnostic it fixes.
    pub diagnostic: Option<usize>,
}

/// Names offered for `expect` lines, in this order (the values an inlay hint shows).
const RECORDABLE: &[&str] = &[
    eye::CORNEAL_PLANE,
    eye::SPHERICAL_EQUIVALENT,
    eye::NEAR_REFRACTION,
    eye::MEAN_K,
    eye::CORNEAL_CYLINDER,
    eye::TOTAL_CORNEAL_POWER,
    system::IMAGE,
    system::MAGNIFICATION,
    system::EQUIVALENT_POWER,
];

/// Actions for the selection `range`.
pub fn code_actions(a: &Analysis, range: Span) -> Vec<Action> {
    let mut out = Vec::new();
    for (i, d) in a.evaluation.diagnostics.iter().enumerate() {
        if let Some(fix) = &d.fix {
            if meets(d.span, range) {
                out.push(Action {
                    title: fix.title.clone(),
                    kind: ActionKind::QuickFix,
                    edits: fix.edits.clone(),
                    diagnostic: Some(i),
                });
            }
        }
    }
    let first = a.line_at(range.start());
    let last = a.line_at(range.end());
    for li in first..=last {
        let line = &a.parsed.lines[li];
        transpose(a, line, &mut out);
        axis_and_units(a, line, range, &mut out);
        record(a, li, &mut out);
    }
    // A diagnostic fix and a rewrite may make the same edit (axis 0): keep one.
    let mut seen = Vec::new();
    out.retain(|x| {
        if seen.contains(&x.edits) {
            false
        } else {
            seen.push(x.edits.clone());
            true
        }
    });
    out
}

fn transpose(a: &Analysis, line: &Line, out: &mut Vec<Action>) {
    let Some(st) = line.statement() else { return };
    if a.parsed.keyword(st) != "refraction" {
        return;
    }
    let vals = &st.values;
    let Some(slash) = vals
        .iter()
        .position(|v| matches!(v.kind, ValueKind::Symbol { symbol: Sym::Slash }))
    else {
        return;
    };
    let Some(cyl) = vals.get(slash + 1) else {
        return;
    };
    let ValueKind::Number { value: c, .. } = cyl.kind else {
        return;
    };
    let Some(x) = vals
        .iter()
        .position(|v| matches!(v.kind, ValueKind::AxisSign))
    else {
        return;
    };
    let Some(axis) = vals
        .get(x + 1)
        .filter(|v| matches!(v.kind, ValueKind::Number { .. }))
    else {
        return;
    };
    let (want, form) = if c < 0.0 {
        (eye::PLUS_CYL, "plus")
    } else {
        (eye::MINUS_CYL, "minus")
    };
    let Some(d) = a.derived_on_line(line).find(|d| d.name == want) else {
        return;
    };
    out.push(Action {
        title: format!("transpose to {form}-cylinder form: {}", d.text()),
        kind: ActionKind::Rewrite,
        edits: vec![Edit {
            span: Span::new(vals[0].span.start(), axis.span.end()),
            text: d.text(),
        }],
        diagnostic: None,
    });
}

fn axis_and_units(a: &Analysis, line: &Line, range: Span, out: &mut Vec<Action>) {
    let Some(st) = line.statement() else { return };
    for (i, v) in st.values.iter().enumerate() {
        let ValueKind::Number {
            number,
            value,
            decimals,
            unit,
            ..
        } = &v.kind
        else {
            continue;
        };
        let after_x = i > 0 && matches!(st.values[i - 1].kind, ValueKind::AxisSign);
        if after_x && *value == 0.0 && unit.is_none() {
            out.push(Action {
                title: "write the axis 0 as 180".into(),
                kind: ActionKind::Rewrite,
                edits: vec![Edit {
                    span: *number,
                    text: "180".into(),
                }],
                diagnostic: None,
            });
        }
        let Some(u_span) = unit else { continue };
        if !meets(v.span, range) {
            continue;
        }
        let Some(from) = unit_of(a.parsed.text(*u_span)) else {
            continue;
        };
        if from.dimension() != Dimension::Length {
            continue;
        }
        for to in [Unit::Millimetre, Unit::Centimetre, Unit::Metre] {
            if to == from {
                continue;
            }
            let text = written_in(*value, u32::from(*decimals), from, to);
            out.push(Action {
                title: format!("convert to {}: {text} {}", to.symbol(), to.symbol()),
                kind: ActionKind::Rewrite,
                edits: vec![
                    Edit {
                        span: *number,
                        text,
                    },
                    Edit {
                        span: *u_span,
                        text: to.symbol().into(),
                    },
                ],
                diagnostic: None,
            });
        }
    }
}

fn record(a: &Analysis, li: usize, out: &mut Vec<Action>) {
    let line = &a.parsed.lines[li];
    let Some(st) = line.statement() else { return };
    let Some(block) = a.block_around(li) else {
        return;
    };
    let in_block =
        |d: &parax_eval::Derived| block.span.start <= d.span.start && d.span.end <= block.span.end;
    // Existing expect lines of the block: name → (value span or name end, line).
    let expects: Vec<(String, Span)> = block
        .body()
        .filter_map(|i| {
            let s = a.parsed.lines[i].statement()?;
            if a.parsed.keyword(s) != "expect" {
                return None;
            }
            let name = s.values.first()?;
            let rest = s.values.iter().skip(1).take_while(|v| {
                !matches!(
                    v.kind,
                    ValueKind::Symbol {
                        symbol: Sym::PlusMinus
                    }
                )
            });
            let span = rest
                .fold(None::<Span>, |acc, v| {
                    Some(acc.map_or(v.span, |s| s.cover(v.span)))
                })
                .unwrap_or(Span::new(name.span.end(), name.span.end()));
            Some((a.parsed.text(name.span).to_string(), span))
        })
        .collect();
    let refresh = |name: &str, d: &parax_eval::Derived, out: &mut Vec<Action>| {
        if let Some((_, span)) = expects.iter().find(|(n, _)| n == name) {
            if a.parsed.text(*span) != d.text() {
                let text = if span.is_empty() {
                    format!(" {}", d.text())
                } else {
                    d.text()
                };
                out.push(Action {
                    title: format!("refresh `expect {name}` to {}", d.text()),
                    kind: ActionKind::Record,
                    edits: vec![Edit { span: *span, text }],
                    diagnostic: None,
                });
            }
            true
        } else {
            false
        }
    };
    if a.parsed.keyword(st) == "expect" {
        if let Some(name) = st.values.first().map(|v| a.parsed.text(v.span)) {
            if let Some(d) = a
                .evaluation
                .derived
                .iter()
                .find(|d| d.name == name && in_block(d))
            {
                refresh(name, d, out);
            }
        }
        return;
    }
    let eol = if a.source().contains("\r\n") {
        "\r\n"
    } else {
        "\n"
    };
    let last_line = &a.parsed.lines[block.end - 1];
    for name in RECORDABLE {
        for d in a
            .derived_on_line(line)
            .filter(|d| d.name == *name || d.name.ends_with(&format!(".{name}")))
        {
            if refresh(&d.name, d, out) {
                continue;
            }
            // Insert after the block's last line.
            let at = last_line.span.end();
            out.push(Action {
                title: format!("record `expect {} {}`", d.name, d.text()),
                kind: ActionKind::Record,
                edits: vec![Edit {
                    span: Span::new(at, at),
                    text: format!("{eol}  expect {} {}", d.name, d.text()),
                }],
                diagnostic: None,
            });
        }
    }
}
