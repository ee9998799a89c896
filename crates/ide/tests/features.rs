//! Direct tests of the IDE functions (the language server's fixture tests cover
//! the same features through LSP): offsets and edits as plain data.

use parax_ide::{actions, complete, format, hints, hover, labels, outline, tokens, Analysis};

const RELAY: &str = "# Invented demo data for tests.\nsystem \"relay\"\n  object 40 cm before A\n  lens A +6.00 D\n  gap 20 cm\n  lens B +10.00 D\n";

fn apply(src: &str, edits: &[parax_ide::Edit]) -> String {
    let mut out = src.to_string();
    let mut e = edits.to_vec();
    e.sort_by_key(|e| std::cmp::Reverse(e.span.start));
    for e in e {
        out.replace_range(e.span.start()..e.span.end(), &e.text);
    }
    out
}

#[test]
fn converts_a_length_keeping_its_precision() {
    // SI prefixes (definition): 12 mm = 1.2 cm = 0.012 m.
    let src = "eye right\n  refraction -5.00 @ 12 mm\n";
    let a = Analysis::new(src);
    let at = src.find("12").unwrap();
    let acts = actions::code_actions(&a, parax_syntax::Span::new(at, at + 2));
    let got: Vec<String> = acts
        .iter()
        .filter(|x| x.title.starts_with("convert"))
        .map(|x| apply(src, &x.edits))
        .collect();
    assert_eq!(
        got,
        vec![
            "eye right\n  refraction -5.00 @ 1.2 cm\n".to_string(),
            "eye right\n  refraction -5.00 @ 0.012 m\n".to_string()
        ]
    );
}

#[test]
fn transposes_and_records_and_the_result_checks_clean() {
    // Transposition (S+C, -C, axis±90) [S: Thibos et al. 1997 notation]: -2.00/-0.50x180 → -2.50/+0.50x90.
    let src = "eye left\n  refraction -2.00 / -0.50 x 180 @ 12 mm\n";
    let a = Analysis::new(src);
    let acts = actions::code_actions(&a, parax_syntax::Span::new(12, 12));
    let t = acts
        .iter()
        .find(|x| x.title.starts_with("transpose"))
        .expect("transpose offered");
    assert_eq!(
        apply(src, &t.edits),
        "eye left\n  refraction -2.50 / +0.50 x 90 @ 12 mm\n"
    );
    let rec = acts
        .iter()
        .find(|x| x.title.starts_with("record `expect spherical-equivalent"))
        .expect("record offered");
    let recorded = apply(src, &rec.edits);
    assert!(
        recorded.ends_with("  expect spherical-equivalent -2.25 D\n"),
        "{recorded}"
    );
    // The recorded line passes its own check.
    assert!(!Analysis::new(&recorded).evaluation.has_errors());
}

#[test]
fn labels_definitions_and_references() {
    let a = Analysis::new(RELAY);
    let use_a = RELAY.find("before A").unwrap() + 7;
    let def = labels::definition(&a, use_a).expect("defined");
    assert_eq!(&RELAY[def.start()..def.end()], "A");
    assert_eq!(def.start(), RELAY.find("lens A").unwrap() + 5);
    assert_eq!(labels::references(&a, def.start(), true).len(), 2);
    assert_eq!(
        labels::references(&a, def.start(), false),
        vec![parax_syntax::Span::new(use_a, use_a + 1)]
    );
    assert!(labels::definition(&a, 0).is_none());
}

#[test]
fn completion_contexts() {
    let src =
        "system \"s\"\n  lens A +1 D\n  gap 12 \n  object 1 m before \nmodel-eye \"m\"\n  from \n";
    let a = Analysis::new(src);
    let labels_of = |off| {
        complete::complete(&a, off)
            .into_iter()
            .map(|i| i.label)
            .collect::<Vec<_>>()
    };
    assert_eq!(
        labels_of(src.find("gap 12 ").unwrap() + 7),
        vec!["mm", "cm", "m"]
    );
    assert_eq!(labels_of(src.find("before ").unwrap() + 7), vec!["A"]);
    assert_eq!(
        labels_of(src.find("from ").unwrap() + 5),
        vec!["gullstrand", "le-grand", "emsley"]
    );
    assert!(labels_of(src.find("model-eye").unwrap()).contains(&"model-eye".to_string()));
    assert!(labels_of(src.find("  lens").unwrap() + 2).contains(&"lens".to_string()));
}

#[test]
fn hints_hover_outline_tokens_and_formatting() {
    let a = Analysis::new(RELAY);
    let h = hints::inlay_hints(&a, None);
    // Thin-lens vergence [C]: L = -2.5 D, L' = 3.5 D at A; 20 cm on: L = 1/(1/3.5 - 0.2) = 11.67 D;
    // L' = 21.67 D at B, image 1/21.67 m = 4.62 cm after B.
    assert_eq!(
        h.last().map(|h| h.label.as_str()),
        Some("image 4.62 cm after B · mag -0.3846")
    );
    // Without tooltips: the same hints where they were, tooltips left empty.
    let bare = hints::inlay_hints_without_tooltips(&a, None);
    assert_eq!(bare.len(), h.len());
    for (b, full) in bare.iter().zip(&h) {
        assert_eq!((b.offset, &b.label), (full.offset, &full.label));
        assert!(b.tooltip.is_empty() && !full.tooltip.is_empty());
    }
    let hv = hover::hover(&a, RELAY.find("lens B").unwrap() + 8).expect("hover");
    assert!(hv.markdown.contains("L' = L + F") && hv.markdown.contains("verify clinically"));
    let sym = outline::symbols(&a);
    assert_eq!(sym.len(), 1);
    assert_eq!(
        sym[0]
            .children
            .iter()
            .map(|c| c.name.as_str())
            .collect::<Vec<_>>(),
        vec!["A", "B"]
    );
    let classes: Vec<_> = tokens::tokens(&a).iter().map(|t| t.class).collect();
    assert_eq!(classes[0], tokens::TokenClass::Comment);
    assert!(classes.contains(&tokens::TokenClass::Label));
    assert!(format::format_document(&a).is_empty());
    let messy = Analysis::new("eye right\n     add   +1.50\n");
    assert_eq!(
        apply(messy.source(), &format::format_document(&messy)),
        "eye right\n  add +1.50\n"
    );
    assert_eq!(outline::folds(&messy).len(), 1);
}
