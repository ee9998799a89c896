//! Property test: on generated case files, the tree-sitter grammar reads every
//! line as `parax_syntax::parse` (pest, the authoritative grammar) does.
//!
//! Lines are built from the value shapes of grammar/parax.pest (numbers with and
//! without sign, `−`, units glued or spaced, dates, text with escapes, the axis
//! sign, separators, words including ones that start with `x` or a unit's
//! spelling), joined by spaces, tabs or nothing. Where pest reads every line, the
//! tree-sitter tree must have no ERROR node and the same kind, keyword, value
//! kinds and byte ranges, units and comment on every line; where pest rejects a
//! line, tree-sitter must have an ERROR node.

mod common;

use common::{error_rows, parse, pest_lines, tree_lines};
use proptest::prelude::*;

fn value() -> impl Strategy<Value = String> {
    let number = (
        prop::sample::select(vec!["", "+", "-", "−"]),
        prop::sample::select(vec!["0", "12", "7.72", "12.", ".5", "180", "2026"]),
        prop::sample::select(vec![
            "", "mm", " mm", "cm", "m", " D", "DS", "DC", "deg", "°", "Δ", " prism", " y", "%",
            " mmHg", "mmx",
        ]),
    )
        .prop_map(|(s, n, u)| format!("{s}{n}{u}"));
    prop_oneof![
        3 => number,
        1 => prop::sample::select(vec!["2026-11-18", "1999-01-02"]).prop_map(str::to_owned),
        1 => prop::sample::select(vec![
            "\"metal full-rim\"", "\"a \\\"quoted\\\" # word\"", "\"\"", "\"Zoë Brontë\"",
        ])
        .prop_map(str::to_owned),
        1 => prop::sample::select(vec!["x", "×"]).prop_map(str::to_owned),
        1 => prop::sample::select(vec!["/", ",", "@", "±", "+/-"]).prop_map(str::to_owned),
        2 => prop::sample::select(vec![
            "right", "left", "plano", "le-grand", "L1", "BU", "xray", "x-ray", "mm", "D",
            "Δ", "spherical-equivalent", "_tmp", "it's", "mean-k.value",
        ])
        .prop_map(str::to_owned),
    ]
}

fn values() -> impl Strategy<Value = String> {
    prop::collection::vec(
        (prop::sample::select(vec![" ", "  ", "\t", ""]), value()),
        0..6,
    )
    .prop_map(|vs| {
        let mut out = String::new();
        let mut after_date = false;
        for (i, (sep, v)) in vs.into_iter().enumerate() {
            // The first value needs white space after the keyword. Known
            // differences, both on malformed values, come from pest's look-ahead
            // (`!word_char`), which tree-sitter tokens lack: a date glued to a digit
            // or letter (`2026-11-180`: pest reads three numbers, tree-sitter a date
            // and a number) and `°` or `%` glued to one (`0%2`: pest rejects the
            // line, tree-sitter reads a unit and a number), and `×` glued to a
            // letter (`×x`: pest rejects the line, tree-sitter reads an axis sign
            // and a word). The generator keeps such values apart.
            let glue_forbidden = i == 0 || after_date;
            out.push_str(if glue_forbidden && sep.is_empty() {
                " "
            } else {
                sep
            });
            out.push_str(&v);
            after_date = (v.len() == 10 && v.as_bytes()[4] == b'-' && v.as_bytes()[7] == b'-')
                || v.ends_with('°')
                || v.ends_with('%')
                || v == "×";
        }
        out
    })
}

fn tail() -> impl Strategy<Value = String> {
    prop::sample::select(vec![
        "",
        " ",
        "  # a comment",
        "\t# tab, then comment",
        "#glued",
    ])
    .prop_map(str::to_owned)
}

fn line() -> impl Strategy<Value = String> {
    let kinds: Vec<&str> = parax_syntax::BlockKind::ALL.map(|k| k.keyword()).to_vec();
    let keywords = vec![
        "refraction",
        "add",
        "keratometry",
        "expect",
        "lens",
        "gap",
        "note",
        "x1",
    ];
    prop_oneof![
        2 => (prop::sample::select(kinds), values(), tail()).prop_map(|(k, v, t)| format!("{k}{v}{t}")),
        5 => (prop::sample::select(vec!["  ", "\t", "    "]), prop::sample::select(keywords), values(), tail())
            .prop_map(|(i, k, v, t)| format!("{i}{k}{v}{t}")),
        1 => prop::sample::select(vec!["", "# comment", "   # indented comment", "  "]).prop_map(str::to_owned),
    ]
}

fn file() -> impl Strategy<Value = String> {
    (
        prop::collection::vec(line(), 1..12),
        prop::sample::select(vec!["\n", "\r\n", "\r"]),
        any::<bool>(),
    )
        .prop_map(|(lines, nl, final_break)| {
            // Files start with a header so that statements have a block.
            let mut text = format!("eye right{nl}");
            text.push_str(&lines.join(nl));
            if final_break {
                text.push_str(nl);
            }
            text
        })
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 512, ..ProptestConfig::default() })]

    #[test]
    fn tree_sitter_reads_generated_files_as_pest_does(source in file()) {
        let pest = pest_lines(&source);
        let tree = parse(&source);
        let ts = tree_lines(&tree, &source, pest.len());
        let errors = error_rows(&tree, &source);
        if pest.iter().all(Option::is_some) {
            prop_assert!(!tree.root_node().has_error(),
                "pest reads it, tree-sitter has errors:\n{source}\n{}", tree.root_node().to_sexp());
            for (row, (p, t)) in pest.iter().zip(&ts).enumerate() {
                prop_assert_eq!(p.as_ref().unwrap(), t, "line {}:\n{}", row + 1, source);
            }
        } else {
            for (row, p) in pest.iter().enumerate() {
                if p.is_none() {
                    prop_assert!(errors.contains(&row),
                        "pest rejects line {}, tree-sitter reads it:\n{source}", row + 1);
                }
            }
        }
    }
}
