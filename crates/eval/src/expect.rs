//! `expect` lines: a recorded result compared with the computed one. The default
//! tolerance is half a step of the last digit written (`9.1 cm` → ±0.05 cm), so a
//! value copied at the precision shown always passes and a changed input fails.

use crate::codes;
use crate::derived::{Derived, DerivedValue as V};
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::{Expect, ExpectToken as T};
use parax_syntax::suggest::did_you_mean;

/// Names a block of this id can compute (for "did you mean" and to tell an unknown
/// name from one that this case's inputs do not reach): its block module's keys.
fn possible_names(block: &str) -> &'static [&'static str] {
    crate::blocks::kind_of_id(block).map_or(&[], crate::blocks::value_names)
}

/// Check the `expect` lines of block `block` against `derived`.
pub fn check(block: &str, expects: &[Expect], derived: &[Derived], diags: &mut Vec<Diagnostic>) {
    for e in expects {
        let key = format!("{block}.{}", e.name);
        let Some(d) = derived.iter().find(|d| d.is_key(&key)) else {
            let mine: Vec<&str> = derived
                .iter()
                .filter(|d| d.block.as_str() == block)
                .map(|d| &*d.name)
                .collect();
            let per_lens = e.name.contains('.')
                && crate::blocks::system::keys::PER_ELEMENT
                    .iter()
                    .any(|s| e.name.ends_with(&format!(".{s}")));
            if possible_names(block).contains(&e.name.as_str()) || per_lens {
                diags.push(
                    Diagnostic::new(
                        codes::EXPECT_UNAVAILABLE,
                        Severity::Error,
                        e.name_span,
                        format!(
                            "`{}` could not be computed from this block's inputs",
                            e.name
                        ),
                    )
                    .hint("record the inputs it needs (see docs/notation.md), or remove this line"),
                );
            } else {
                let mut diag = Diagnostic::new(
                    codes::EXPECT_UNKNOWN,
                    Severity::Error,
                    e.name_span,
                    format!("this block computes no value named `{}`", e.name),
                );
                let candidates = mine
                    .iter()
                    .copied()
                    .chain(possible_names(block).iter().copied());
                diag = match did_you_mean(&e.name, candidates) {
                    Some(s) => diag.hint(format!("did you mean `{s}`?")).fix(
                        format!("write `{s}`"),
                        e.name_span,
                        s,
                    ),
                    None if !mine.is_empty() => {
                        diag.hint(format!("this block computes: {}", mine.join(", ")))
                    }
                    None => diag,
                };
                diags.push(diag);
            }
            continue;
        };
        if let Err(why) = compare(d, e) {
            let value_span = e.value_span.unwrap_or(e.name_span);
            let mut diag = Diagnostic::new(
                codes::EXPECT_MISMATCH,
                Severity::Error,
                value_span,
                format!(
                    "recorded {} differs from the computed {}: {why}",
                    e.name,
                    d.text()
                ),
            )
            .hint("if an input changed, update the recorded result; otherwise check the inputs")
            .fix(
                format!("record the computed value `{}`", d.text()),
                value_span,
                d.text(),
            );
            if let Some(c) = d.caution {
                diag = diag.caution(c);
            }
            diags.push(diag);
        }
    }
}

fn numbers(e: &Expect) -> Vec<(f64, f64, bool)> {
    e.tokens
        .iter()
        .filter_map(|t| match t {
            T::Number {
                value,
                half_step,
                unit,
                ..
            } => Some((*value, *half_step, unit.is_some())),
            _ => None,
        })
        .collect()
}

fn words(e: &Expect) -> Vec<String> {
    e.tokens
        .iter()
        .filter_map(|t| match t {
            T::Word { word } => Some(word.to_lowercase()),
            _ => None,
        })
        .collect()
}

fn within(computed: f64, recorded: f64, tol: f64) -> Result<(), String> {
    let diff = computed - recorded;
    if diff.abs() <= tol + 1e-12 {
        Ok(())
    } else {
        Err(format!(
            "difference {:.4} exceeds the tolerance ±{:.4}",
            diff.abs(),
            tol
        ))
    }
}

fn compare(d: &Derived, e: &Expect) -> Result<(), String> {
    let nums = numbers(e);
    let tol = |i: usize| {
        e.tolerance
            .unwrap_or_else(|| nums.get(i).map_or(0.0, |n| n.1))
    };
    let want = |n: usize| -> Result<(), String> {
        if nums.len() == n {
            Ok(())
        } else {
            Err(format!(
                "expected {n} number(s) in the recorded value, found {}",
                nums.len()
            ))
        }
    };
    match &d.value {
        V::Power { dioptres } => {
            want(1)?;
            within(*dioptres, nums[0].0, tol(0))
        }
        V::Number { value } => {
            want(1)?;
            within(*value, nums[0].0, tol(0))
        }
        V::SphCyl {
            sphere,
            cylinder,
            axis,
        } => {
            let (s, c, a) = match nums.len() {
                1 => (nums[0].0, 0.0, *axis),
                3 => (nums[0].0, nums[1].0, nums[2].0),
                n => {
                    return Err(format!(
                        "a sphero-cylinder is SPHERE [/ CYLINDER x AXIS], found {n} numbers"
                    ))
                }
            };
            // Either cylinder form may be recorded.
            let (cs, cc, ca) = if c * cylinder < 0.0 {
                (
                    sphere + cylinder,
                    -cylinder,
                    parax_optics::refraction::normalize_axis(axis + 90.0),
                )
            } else {
                (*sphere, *cylinder, *axis)
            };
            within(cs, s, tol(0)).map_err(|w| format!("sphere: {w}"))?;
            if nums.len() == 3 {
                within(cc, c, tol(1)).map_err(|w| format!("cylinder: {w}"))?;
                if cc.abs() > 0.005 {
                    let da = parax_optics::refraction::axis_difference(ca, a);
                    let atol = e
                        .tolerance
                        .map_or(0.5_f64.max(nums[2].1), |_| 0.5_f64.max(nums[2].1));
                    if da > atol + 1e-9 {
                        return Err(format!("axis differs by {da:.1}°"));
                    }
                }
            } else if cc.abs() > tol(0) {
                return Err("the computed value has a cylinder".into());
            }
            Ok(())
        }
        V::Meridian { dioptres, meridian } => {
            want(2)?;
            within(*dioptres, nums[0].0, tol(0))?;
            let da = parax_optics::refraction::axis_difference(*meridian, nums[1].0);
            if da > 0.5_f64.max(nums[1].1) + 1e-9 {
                return Err(format!("meridian differs by {da:.1}°"));
            }
            Ok(())
        }
        V::Cylinder { dioptres, axis } => {
            want(2)?;
            within(*dioptres, nums[0].0, tol(0))?;
            let da = parax_optics::refraction::axis_difference(*axis, nums[1].0);
            if dioptres.abs() > 0.005 && da > 0.5_f64.max(nums[1].1) + 1e-9 {
                return Err(format!("axis differs by {da:.1}°"));
            }
            Ok(())
        }
        V::Distance { metres, from } => {
            want(1)?;
            if !nums[0].2 {
                return Err("a distance needs its unit (mm, cm or m)".into());
            }
            let w = words(e);
            let sign = if w.iter().any(|w| w == "before") {
                -1.0
            } else {
                1.0
            };
            let label = w
                .iter()
                .filter(|w| *w != "after" && *w != "before")
                .cloned()
                .collect::<Vec<_>>()
                .join(" ");
            if !label.is_empty() && !label.eq_ignore_ascii_case(from) {
                return Err(format!(
                    "the computed position is measured from {from}, not {label}"
                ));
            }
            within(*metres, sign * nums[0].0, tol(0))
        }
        V::Length { metres } => {
            want(1)?;
            if !nums[0].2 {
                return Err("a length needs its unit (mm, cm or m)".into());
            }
            within(*metres, nums[0].0, tol(0))
        }
        V::Prism { dioptres, base } => {
            want(1)?;
            within(*dioptres, nums[0].0, tol(0))?;
            match words(e).first() {
                Some(w) if dioptres.abs() > tol(0) && !w.eq_ignore_ascii_case(base) => Err(
                    format!("the computed base is {base}, not {}", w.to_uppercase()),
                ),
                _ => Ok(()),
            }
        }
        V::Infinity => {
            if words(e).iter().any(|w| w == "infinity") {
                Ok(())
            } else {
                Err("the computed value is at infinity".into())
            }
        }
        V::Text { text } => {
            let norm = |s: &str| {
                s.to_lowercase()
                    .replace(',', " ")
                    .split_whitespace()
                    .collect::<Vec<_>>()
                    .join(" ")
            };
            if norm(text) == words(e).join(" ") {
                Ok(())
            } else {
                Err("the words differ".into())
            }
        }
    }
}
