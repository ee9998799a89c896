//! Which keywords each block accepts, what values they take and what they mean,
//! read from the keyword tables of the block modules (`blocks::eye::KEYWORDS`
//! ...), where each keyword's reader stands beside its spec. Used for "did you
//! mean" hints, for completion in editors, and checked against
//! docs/notation.md by a test.

use parax_syntax::BlockKind;

/// One keyword of a block.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub struct KeywordSpec {
    /// The keyword.
    pub name: &'static str,
    /// The values it takes, as the notation document writes them.
    pub form: &'static str,
    /// What it records.
    pub doc: &'static str,
    /// May appear more than once in a block.
    pub repeatable: bool,
    /// Computed from in this version (false: accepted and checked, not yet used).
    pub evaluated: bool,
}

/// The keywords a block of `kind` accepts: the specs of its block module's
/// keyword table, the same table the reading uses.
pub fn keywords(kind: BlockKind) -> Vec<&'static KeywordSpec> {
    crate::blocks::keyword_specs(kind)
}

/// The spec of `keyword` in a block of `kind`.
pub fn keyword(kind: BlockKind, keyword: &str) -> Option<&'static KeywordSpec> {
    keywords(kind).into_iter().find(|k| k.name == keyword)
}

/// What a block header takes after its keyword.
pub fn header_form(kind: BlockKind) -> &'static str {
    match kind {
        BlockKind::Case => "[\"TITLE\"]",
        BlockKind::Eye => "right|left [YYYY-MM-DD]",
        BlockKind::Frame => "[\"NAME\"]",
        BlockKind::SpectacleLens | BlockKind::ContactLens => "right|left",
        BlockKind::System | BlockKind::ModelEye => "\"NAME\"",
    }
}
