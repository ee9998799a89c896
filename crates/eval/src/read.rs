//! Reading the values of one statement into typed facts, with a diagnostic for each
//! thing that does not fit: wrong shape, missing or wrong unit, implausible value.

use crate::codes;
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::Rx;
use crate::units::{dimension_name, unit_of, QuantitySpec};
use parax_optics::units::{Dimension, Unit};
use parax_syntax::{Parsed, Span, Statement, Symbol, Value, ValueKind};

/// A cursor over a statement's values that reports what does not fit.
pub struct Reader<'a> {
    p: &'a Parsed,
    values: &'a [Value],
    pos: usize,
    keyword: Span,
    /// Where the diagnostics go.
    pub diags: &'a mut Vec<Diagnostic>,
    /// Set once a shape error was reported, so one line yields one such error.
    pub failed: bool,
}

impl<'a> Reader<'a> {
    /// A reader over the values of `statement`.
    pub fn new(p: &'a Parsed, statement: &'a Statement, diags: &'a mut Vec<Diagnostic>) -> Self {
        Reader {
            p,
            values: &statement.values,
            pos: 0,
            keyword: statement.keyword,
            diags,
            failed: false,
        }
    }

    /// The next value, without consuming it.
    pub fn peek(&self) -> Option<&'a Value> {
        self.values.get(self.pos)
    }

    /// Consume and return the next value.
    pub fn next_value(&mut self) -> Option<&'a Value> {
        let v = self.values.get(self.pos);
        self.pos += v.is_some() as usize;
        v
    }

    /// True when every value has been read.
    pub fn at_end(&self) -> bool {
        self.pos >= self.values.len()
    }

    /// The source text of a span.
    pub fn text(&self, span: Span) -> &'a str {
        let p: &'a Parsed = self.p;
        p.text(span)
    }

    /// Report a shape error once per statement and return `None`.
    pub fn fail<T>(&mut self, span: Span, message: String, hint: &str) -> Option<T> {
        if !self.failed {
            self.failed = true;
            let kw = self.text(self.keyword);
            self.diags.push(
                Diagnostic::new(codes::BAD_VALUES, Severity::Error, span, message)
                    .hint(format!("`{kw}` takes: {hint}")),
            );
        }
        None
    }

    /// Report that `what` is missing at the end of the statement.
    pub fn missing<T>(&mut self, what: &str, form: &str) -> Option<T> {
        let end = self
            .values
            .last()
            .map_or(self.keyword.end(), |v| v.span.end());
        self.fail(Span::new(end, end), format!("{what} is missing here"), form)
    }

    /// Report any values left over and return whether there were none.
    pub fn finish(&mut self, form: &str) -> bool {
        if let (Some(first), Some(last)) = (self.values.get(self.pos), self.values.last()) {
            let span = first.span.cover(last.span);
            let text = self.text(span).to_owned();
            self.fail::<()>(span, format!("unexpected `{text}` at the end"), form);
            return false;
        }
        true
    }

    /// Consume the next value if it is `symbol`.
    pub fn symbol_if(&mut self, symbol: Symbol) -> bool {
        let hit = matches!(self.peek(), Some(Value { kind: ValueKind::Symbol { symbol: s }, .. }) if *s == symbol);
        self.pos += hit as usize;
        hit
    }

    /// Consume the next value if it is the axis sign `x`.
    pub fn axis_sign_if(&mut self) -> bool {
        let hit = matches!(
            self.peek(),
            Some(Value {
                kind: ValueKind::AxisSign,
                ..
            })
        );
        self.pos += hit as usize;
        hit
    }

    /// Consume the next value if it is the word `word`.
    pub fn word_if(&mut self, word: &str) -> bool {
        let hit = matches!(self.peek(), Some(v @ Value { kind: ValueKind::Word, .. }) if self.text(v.span) == word);
        self.pos += hit as usize;
        hit
    }

    /// A bare word.
    pub fn word(&mut self, what: &str, form: &str) -> Option<(&'a str, Span)> {
        match self.next_value() {
            Some(
                v @ Value {
                    kind: ValueKind::Word,
                    ..
                },
            ) => Some((self.text(v.span), v.span)),
            Some(v) => {
                let t = self.text(v.span);
                self.fail(v.span, format!("expected {what}, found `{t}`"), form)
            }
            None => self.missing(what, form),
        }
    }

    /// A word from a fixed list, with a "did you mean" hint otherwise.
    pub fn word_of(
        &mut self,
        options: &[&'static str],
        what: &str,
        form: &str,
    ) -> Option<&'static str> {
        let (w, span) = self.word(what, form)?;
        if let Some(o) = options.iter().find(|o| **o == w) {
            return Some(o);
        }
        let mut d = Diagnostic::new(
            codes::BAD_VALUES,
            Severity::Error,
            span,
            format!(
                "`{w}` is not {what}; one of {} is expected",
                options.join(", ")
            ),
        );
        if let Some(s) = parax_syntax::suggest::did_you_mean(w, options.iter().copied()) {
            d = d
                .hint(format!("did you mean `{s}`?"))
                .fix(format!("write `{s}`"), span, s);
        }
        self.failed = true;
        self.diags.push(d);
        None
    }

    /// A quoted text, unescaped.
    pub fn text_value(&mut self, what: &str, form: &str) -> Option<String> {
        match self.next_value() {
            Some(Value {
                kind: ValueKind::Text { text },
                ..
            }) => Some(unescape(self.text(*text))),
            Some(v) => {
                let t = self.text(v.span);
                self.fail(
                    v.span,
                    format!("expected {what} in quotes, found `{t}`"),
                    form,
                )
            }
            None => self.missing(what, form),
        }
    }

    /// The rest of the statement as written (for free-form history lines).
    pub fn rest(&mut self) -> String {
        let out = match (self.values.get(self.pos), self.values.last()) {
            (Some(a), Some(b)) => {
                let t = self.text(a.span.cover(b.span));
                t.strip_prefix('"')
                    .and_then(|t| t.strip_suffix('"'))
                    .unwrap_or(t)
                    .to_owned()
            }
            _ => String::new(),
        };
        self.pos = self.values.len();
        out
    }

    /// A date `YYYY-MM-DD`, checked to be a calendar date.
    pub fn date(&mut self, form: &str) -> Option<String> {
        match self.next_value() {
            Some(
                v @ Value {
                    kind: ValueKind::Date { year, month, day },
                    ..
                },
            ) => {
                let leap = (year % 4 == 0 && year % 100 != 0) || year % 400 == 0;
                let days = [
                    31,
                    if leap { 29 } else { 28 },
                    31,
                    30,
                    31,
                    30,
                    31,
                    31,
                    30,
                    31,
                    30,
                    31,
                ];
                if !(1..=12).contains(month) || *day == 0 || *day > days[*month as usize - 1] {
                    let t = self.text(v.span);
                    return self.fail(v.span, format!("`{t}` is not a calendar date"), form);
                }
                Some(self.text(v.span).to_owned())
            }
            Some(v) => {
                let t = self.text(v.span);
                self.fail(
                    v.span,
                    format!("expected a date YYYY-MM-DD, found `{t}`"),
                    form,
                )
            }
            None => self.missing("a date", form),
        }
    }

    /// A physical quantity in base units, checked for unit and plausibility.
    /// Read a radius of curvature with `spec`, refusing 0: a radius of 0 has no
    /// centre of curvature and would make the surface power infinite (a value
    /// that then reaches every derived value as infinity or NaN).
    pub fn radius(&mut self, spec: &QuantitySpec, form: &str) -> Option<f64> {
        let span = self.peek().map(|v| v.span);
        let radius = self.quantity(spec, form)?;
        if radius == 0.0 {
            let span = span.expect("a quantity was read");
            return self.fail(
                span,
                format!("a {} of 0 has no centre of curvature", spec.what),
                form,
            );
        }
        Some(radius)
    }

    pub fn quantity(&mut self, spec: &QuantitySpec, form: &str) -> Option<f64> {
        let v = match self.next_value() {
            Some(v) => v,
            None => return self.missing(&format!("the {}", spec.what), form),
        };
        let ValueKind::Number {
            number,
            value,
            unit,
            ..
        } = &v.kind
        else {
            let t = self.text(v.span);
            return self.fail(
                v.span,
                format!("expected the {}, found `{t}`", spec.what),
                form,
            );
        };
        let number_text = self.text(*number);
        let unit_used = match unit {
            Some(u_span) => {
                let u_text = self.text(*u_span);
                let unit = unit_of(u_text);
                if spec.dimension == Dimension::Ratio {
                    self.failed = true;
                    self.diags.push(
                        Diagnostic::new(
                            codes::WRONG_UNIT,
                            Severity::Error,
                            *u_span,
                            format!("a {} has no unit", spec.what),
                        )
                        .fix(
                            "remove the unit",
                            Span::new(number.end(), u_span.end()),
                            "",
                        ),
                    );
                    return None;
                }
                match unit {
                    Some(u) if u.dimension() == spec.dimension => u,
                    _ => {
                        let measures = unit.map_or("nothing the notation knows", |u| {
                            dimension_name(u.dimension())
                        });
                        let usual = spec.usual.symbol();
                        self.failed = true;
                        self.diags.push(
                            Diagnostic::new(
                                codes::WRONG_UNIT,
                                Severity::Error,
                                *u_span,
                                format!(
                                    "`{u_text}` measures {measures}, but the {} is {}",
                                    spec.what,
                                    dimension_name(spec.dimension)
                                ),
                            )
                            .hint(format!("write the {} in {usual}", spec.what))
                            .fix(
                                format!("use `{usual}`"),
                                *u_span,
                                usual,
                            ),
                        );
                        return None;
                    }
                }
            }
            None if spec.dimension == Dimension::Ratio => Unit::Degree, // unused: ratios are bare
            None => match spec.bare {
                Some(u) => u,
                None => {
                    let usual = spec.usual.symbol();
                    let sep = if matches!(usual, "°" | "Δ") {
                        ""
                    } else {
                        " "
                    };
                    self.failed = true;
                    self.diags.push(
                        Diagnostic::new(
                            codes::MISSING_UNIT,
                            Severity::Error,
                            *number,
                            format!("the {} `{number_text}` has no unit", spec.what),
                        )
                        .hint(format!(
                            "every physical quantity carries its unit; the {} is usually written in {usual}",
                            spec.what
                        ))
                        .fix(format!("add the unit `{usual}`"), Span::new(number.end(), number.end()), format!("{sep}{usual}")),
                    );
                    return None;
                }
            },
        };
        let base = if spec.dimension == Dimension::Ratio {
            *value
        } else {
            unit_used.to_base(*value)
        };
        if !(spec.min..=spec.max).contains(&base) {
            self.implausible(spec, v.span, *value, unit_used, unit.is_some());
        }
        Some(base)
    }

    fn implausible(
        &mut self,
        spec: &QuantitySpec,
        span: Span,
        value: f64,
        unit: Unit,
        unit_written: bool,
    ) {
        let show = |x: f64| {
            if spec.dimension == Dimension::Ratio {
                format!("{x}")
            } else {
                let u = spec.usual;
                let sep = if matches!(u.symbol(), "°" | "Δ") {
                    ""
                } else {
                    " "
                };
                format!("{}{sep}{}", trim_float(u.from_base(x)), u.symbol())
            }
        };
        let written = self.text(span).to_owned();
        let mut d = Diagnostic::new(
            codes::IMPLAUSIBLE,
            Severity::Warning,
            span,
            format!(
                "a {} of {written} is outside the plausible range {} to {}",
                spec.what,
                show(spec.min),
                show(spec.max)
            ),
        );
        // A unit slip is the usual cause: offer the length unit that makes it plausible.
        if spec.dimension == Dimension::Length && unit_written {
            for u in [Unit::Millimetre, Unit::Centimetre, Unit::Metre] {
                if u != unit && (spec.min..=spec.max).contains(&u.to_base(value)) {
                    let ValueKindNumber { unit_span, .. } = self.number_parts(span);
                    if let Some(us) = unit_span {
                        d = d
                            .hint(format!(
                                "did you mean {} {}?",
                                trim_float(value),
                                u.symbol()
                            ))
                            .fix(format!("use `{}`", u.symbol()), us, u.symbol());
                    }
                    break;
                }
            }
        }
        // 78 mm for 7.8 mm: a slipped decimal point.
        if d.hint.is_none() && spec.dimension == Dimension::Length {
            for k in [10.0, 0.1] {
                if (spec.min..=spec.max).contains(&unit.to_base(value / k)) {
                    d = d.hint(format!(
                        "did you mean {} {}?",
                        trim_float(value / k),
                        unit.symbol()
                    ));
                    break;
                }
            }
        }
        self.diags.push(d);
    }

    fn number_parts(&self, span: Span) -> ValueKindNumber {
        let v = self.values.iter().find(|v| v.span == span);
        match v.map(|v| &v.kind) {
            Some(ValueKind::Number { unit, .. }) => ValueKindNumber { unit_span: *unit },
            _ => ValueKindNumber { unit_span: None },
        }
    }

    /// An axis or meridian: bare or in degrees, 0..=180; 0 is read as 180 with a note.
    pub fn axis(&mut self, spec: &QuantitySpec, form: &str) -> Option<f64> {
        let span = self.peek().map(|v| v.span);
        let a = self.quantity_quiet_range(spec, form)?;
        let span = span.unwrap_or_default();
        if !(0.0..=180.0).contains(&a) {
            self.failed = true;
            let hint = if a > 180.0 && a <= 360.0 {
                format!(
                    "axes run from 1 to 180; {} is the same meridian",
                    trim_float(a - 180.0)
                )
            } else {
                "axes run from 1 to 180 degrees (ISO 8429)".to_owned()
            };
            let mut d = Diagnostic::new(
                codes::BAD_AXIS,
                Severity::Error,
                span,
                format!("an {} of {} is out of range", spec.what, trim_float(a)),
            )
            .hint(hint);
            if a > 180.0 && a <= 360.0 {
                d = d.fix(
                    format!("write {}", trim_float(a - 180.0)),
                    self.number_span(span),
                    trim_float(a - 180.0),
                );
            }
            self.diags.push(d);
            return None;
        }
        if a == 0.0 {
            self.diags.push(
                Diagnostic::new(
                    codes::BAD_AXIS,
                    Severity::Info,
                    span,
                    format!("an {} of 0 is written 180", spec.what),
                )
                .hint("0 and 180 are the same meridian; the trade writes 180 [CP]")
                .fix("write 180", self.number_span(span), "180"),
            );
            return Some(180.0);
        }
        Some(a)
    }

    fn number_span(&self, span: Span) -> Span {
        match self.values.iter().find(|v| v.span == span).map(|v| &v.kind) {
            Some(ValueKind::Number { number, .. }) => *number,
            _ => span,
        }
    }

    fn quantity_quiet_range(&mut self, spec: &QuantitySpec, form: &str) -> Option<f64> {
        let wide = QuantitySpec {
            min: f64::NEG_INFINITY,
            max: f64::INFINITY,
            ..*spec
        };
        self.quantity(&wide, form)
    }

    /// `SPHERE [/] [CYLINDER x AXIS]`; `plano` or `pl` for a zero sphere.
    pub fn rx(&mut self, form: &str) -> Option<Rx> {
        use crate::units::{AXIS, CYLINDER, SPHERE};
        let sphere = if self.word_if("plano") || self.word_if("pl") {
            0.0
        } else {
            self.quantity(&SPHERE, form)?
        };
        let slash = self.symbol_if(Symbol::Slash);
        let has_cyl = matches!(
            self.peek(),
            Some(Value {
                kind: ValueKind::Number { .. },
                ..
            })
        );
        if !has_cyl {
            if slash {
                return self.missing("the cylinder", form);
            }
            return Some(Rx {
                sphere,
                cylinder: 0.0,
                axis: 180.0,
            });
        }
        let cylinder = self.quantity(&CYLINDER, form)?;
        if !self.axis_sign_if() {
            return match self.peek() {
                Some(v) => {
                    let t = self.text(v.span);
                    self.fail(
                        v.span,
                        format!("expected `x` and the axis, found `{t}`"),
                        form,
                    )
                }
                None => self.missing("the axis (`x AXIS`)", form),
            };
        }
        let axis = self.axis(&AXIS, form)?;
        Some(Rx {
            sphere,
            cylinder,
            axis,
        })
    }
}

struct ValueKindNumber {
    unit_span: Option<Span>,
}

/// Undo `\"` and `\\` escapes of a quoted text.
pub fn unescape(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    let mut chars = s.chars();
    while let Some(c) = chars.next() {
        if c == '\\' {
            if let Some(n) = chars.next() {
                out.push(n);
            }
        } else {
            out.push(c);
        }
    }
    out
}

/// A float without trailing zeros: 13, 7.8, 0.0125.
pub fn trim_float(x: f64) -> String {
    let s = format!("{:.6}", x);
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" {
        "0".into()
    } else {
        s.to_owned()
    }
}
