//! Cohorts of refractions drawn from evaluated case files: which derived values
//! a cohort reads (each eye block's power vector M, J0, J45), the groups an eye
//! belongs to (every eye, each case tag, or the visit year), and the power
//! vectors gathered per group and eye. The statistics themselves are
//! `parax_optics::cohort::summarize`.

use crate::blocks::eye::keys;
use crate::model::{Case, Side};
use crate::{Derived, DerivedValue};
use parax_optics::cohort::{summarize, CohortSummary};
use parax_optics::PowerVector;
use std::collections::BTreeMap;

/// What to group the eyes by.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum GroupBy {
    /// One group, `(all)`: every case.
    None,
    /// Each `tag` of the `case` block (a case with two tags counts in both;
    /// untagged cases form the group `(no tag)`).
    Tag,
    /// The year of the eye's visit date, else of the case's `date` (else the
    /// group `(no date)`).
    Year,
}

/// One eye's power vector and the groups it belongs to.
#[derive(Debug, Clone, PartialEq)]
pub struct Sample {
    /// The groups, by [`GroupBy`].
    pub groups: Vec<String>,
    /// The eye.
    pub side: Side,
    /// Its refraction as a power vector.
    pub vector: PowerVector,
}

/// True for the derived values a cohort reads: the three power-vector
/// components of an eye block (a reader evaluating block by block keeps these
/// and drops the rest).
pub fn is_cohort_value(d: &Derived) -> bool {
    d.block.starts_with("eye.")
        && matches!(
            &*d.name,
            keys::SPHERICAL_EQUIVALENT | keys::VECTOR_J0 | keys::VECTOR_J45
        )
}

/// The samples of one evaluated case: each eye whose three power-vector
/// components are among `values`, with its groups.
pub fn samples(case: &Case, values: &[Derived], group_by: GroupBy) -> Vec<Sample> {
    let power = |key: &str| {
        values
            .iter()
            .find(|d| d.is_key(key))
            .and_then(|d| match d.value {
                DerivedValue::Power { dioptres } => Some(dioptres),
                _ => None,
            })
    };
    let info = &case.info;
    let mut out = Vec::new();
    for eye in case.eyes() {
        // The block id names the visit too (`eye.right.2026-01-02`), so a
        // dated visit finds its own values, never another visit's.
        let id = crate::blocks::eye::block_id(eye);
        let (Some(m), Some(j0), Some(j45)) = (
            power(&format!("{id}.{}", keys::SPHERICAL_EQUIVALENT)),
            power(&format!("{id}.{}", keys::VECTOR_J0)),
            power(&format!("{id}.{}", keys::VECTOR_J45)),
        ) else {
            continue;
        };
        let groups = match group_by {
            GroupBy::None => vec!["(all)".to_owned()],
            GroupBy::Tag if info.tags.is_empty() => vec!["(no tag)".to_owned()],
            GroupBy::Tag => info.tags.clone(),
            GroupBy::Year => vec![eye
                .date
                .as_ref()
                .or(info.date.as_ref())
                .map_or("(no date)".to_owned(), |d| d.chars().take(4).collect())],
        };
        out.push(Sample {
            groups,
            side: eye.side,
            vector: PowerVector::new(m, j0, j45),
        });
    }
    out
}

/// Power vectors gathered per group and eye.
#[derive(Debug, Clone, Default)]
pub struct Cohort {
    groups: BTreeMap<(String, Side), Vec<PowerVector>>,
}

impl Cohort {
    /// Add samples: each counts in every group it belongs to.
    pub fn add(&mut self, samples: Vec<Sample>) {
        for s in samples {
            for g in s.groups {
                self.groups.entry((g, s.side)).or_default().push(s.vector);
            }
        }
    }

    /// The summary of each group and eye, ordered by group, then eye.
    pub fn summaries(self) -> Vec<((String, Side), CohortSummary)> {
        self.groups
            .into_iter()
            .filter_map(|(k, v)| summarize(&v).map(|s| (k, s)))
            .collect()
    }
}
