//! The `case` block: the title, date, age, notes and tags of the case. It has
//! no values of its own; its age reaches the eye blocks' near computations, and
//! its facts are kept for reports (batch rows, grouping in `stats`).

use super::{many, one, Keyword};
use crate::lower::at;
use crate::model::At;
use crate::read::Reader;
use crate::units as u;
use serde::{Deserialize, Serialize};

/// The facts of a `case` block.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize, Default)]
pub struct CaseInfo {
    /// Title.
    pub title: Option<String>,
    /// Date of the case.
    pub date: Option<String>,
    /// Age, years.
    pub age: Option<At<f64>>,
    /// Notes.
    pub notes: Vec<String>,
    /// Tags.
    pub tags: Vec<String>,
}

/// Read the header (`["TITLE"]`) into `info` (a later `case` block adds to the
/// facts of an earlier one).
pub(crate) fn read_header(r: &mut Reader<'_>, form: &'static str, info: &mut CaseInfo) {
    if !r.at_end() {
        info.title = r.text_value("the case title", form);
    }
    r.finish(form);
}

/// The keywords of a `case` block and how each is read.
pub(crate) static KEYWORDS: &[Keyword<CaseInfo>] = &[
    one(
        "date",
        "YYYY-MM-DD",
        "date of the case or visit",
        |r, info, _, form| info.date = r.date(form),
    ),
    one(
        "age",
        "N y",
        "age of the patient in years",
        |r, info, span, form| info.age = at(r.quantity(&u::AGE, form), span),
    ),
    many("note", "\"TEXT\"", "a free note", |r, info, _, form| {
        if let Some(t) = r.text_value("the note", form) {
            info.notes.push(t);
        }
    }),
    many(
        "tag",
        "WORD",
        "a label for grouping cases",
        |r, info, _, form| {
            if let Some((t, _)) = r.word("a tag", form) {
                info.tags.push(t.to_owned());
            }
        },
    ),
];
