//! The one diagnostic model. Made here, rendered by every front end (terminal,
//! JSON, editor) without change of code, message or span.

use crate::codes::Code;
use parax_syntax::Span;
use serde::Serialize;

/// How serious a diagnostic is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Severity {
    /// The file is wrong or a recorded result disagrees: `parax check` fails.
    Error,
    /// Probably wrong, or clinically notable: shown, does not fail the check.
    Warning,
    /// Worth knowing.
    Info,
}

impl Severity {
    /// Lower-case name, as printed.
    pub fn name(self) -> &'static str {
        match self {
            Severity::Error => "error",
            Severity::Warning => "warning",
            Severity::Info => "info",
        }
    }
}

/// One text replacement.
#[derive(Debug, Clone, PartialEq, Eq, Serialize)]
pub struct Edit {
    /// The bytes to replace (empty to insert).
    pub span: Span,
    /// The new text.
    pub text: String,
}

/// A suggested fix: a title and the edits that make it.
#[derive(Debug, Clone, PartialEq, Eq, Serialize)]
pub struct Fix {
    /// What the fix does, as an imperative: "add the unit `mm`".
    pub title: String,
    /// The edits, non-overlapping.
    pub edits: Vec<Edit>,
}

/// A finding about a case file.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Diagnostic {
    /// Stable code, e.g. `P0201` (serialized as that string); its title,
    /// description and severities are in [`crate::codes`].
    pub code: Code,
    /// Severity.
    pub severity: Severity,
    /// One sentence saying what is wrong.
    pub message: String,
    /// The bytes at fault.
    pub span: Span,
    /// How to put it right, or what to consider.
    pub hint: Option<String>,
    /// A fix an editor can apply.
    pub fix: Option<Fix>,
    /// The clinical caution that applies, for warnings about patients.
    pub caution: Option<&'static str>,
}

impl Diagnostic {
    /// A diagnostic with no hint, fix or caution. In debug builds (every test),
    /// a severity the code's table entry does not allow panics.
    pub fn new(code: Code, severity: Severity, span: Span, message: impl Into<String>) -> Self {
        debug_assert!(
            code.allows(severity),
            "{code} raised as {}: its entry in crates/eval/src/codes.rs allows {} only",
            severity.name(),
            allowed_names(code)
        );
        Diagnostic {
            code,
            severity,
            message: message.into(),
            span,
            hint: None,
            fix: None,
            caution: None,
        }
    }

    /// Add a hint.
    pub fn hint(mut self, hint: impl Into<String>) -> Self {
        self.hint = Some(hint.into());
        self
    }

    /// Add a fix made of one edit.
    pub fn fix(mut self, title: impl Into<String>, span: Span, text: impl Into<String>) -> Self {
        self.fix = Some(Fix {
            title: title.into(),
            edits: vec![Edit {
                span,
                text: text.into(),
            }],
        });
        self
    }

    /// Attach a clinical caution.
    pub fn caution(mut self, caution: &'static str) -> Self {
        self.caution = Some(caution);
        self
    }
}

/// The severities a code allows, for the message of a failed check.
fn allowed_names(code: Code) -> String {
    let info = code.info();
    std::iter::once(info.severity)
        .chain(info.also.iter().map(|(s, _)| *s))
        .map(Severity::name)
        .collect::<Vec<_>>()
        .join(", ")
}

/// The general caution shown with every output that carries clinical values.
pub const GENERAL_CAUTION: &str =
    "Computed values are aids, not prescriptions: verify clinically; \
prescribing belongs to a licensed practitioner under local rules.";
