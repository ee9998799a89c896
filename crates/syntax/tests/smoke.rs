//! Smoke tests of the parser on hand-written lines.
use parax_syntax::*;

#[test]
fn reads_a_refraction_line_and_keeps_comments() {
    let src = "# demo\neye right\n  refraction -4.50 / -1.25 x 10 @ 12 mm   # sphere\n  keratometry 7.84 mm x175, 7.66mm × 85\n\ncase \"Zoë\"\n  date 2026-10-02\n";
    let p = parse(src);
    assert!(p.errors.is_empty(), "{:?}", p.errors);
    assert_eq!(p.blocks.len(), 2);
    assert_eq!(p.blocks[0].kind, BlockKind::Eye);
    assert_eq!(p.blocks[0].body(), 2..4);
    let st = p.lines[2].statement().unwrap();
    assert_eq!(p.keyword(st), "refraction");
    let texts: Vec<&str> = st.values.iter().map(|v| p.text(v.span)).collect();
    assert_eq!(texts, ["-4.50", "/", "-1.25", "x", "10", "@", "12 mm"]);
    let st = p.lines[3].statement().unwrap();
    let texts: Vec<&str> = st.values.iter().map(|v| p.text(v.span)).collect();
    assert_eq!(texts, ["7.84 mm", "x", "175", ",", "7.66mm", "×", "85"]);
    assert_eq!(p.comments().collect::<Vec<_>>(), ["# demo", "# sphere"]);
}

#[test]
fn one_bad_line_costs_one_error() {
    let src = "eyes right\n  refraction -2.00\neye left\n  refraction -1.00 $ 3\n  add +2.00\n  note \"open\n";
    let p = parse(src);
    let got: Vec<(&str, (usize, usize), String)> = p
        .errors
        .iter()
        .map(|e| {
            (
                e.code,
                p.index.line_col(&p.source, e.span.start()),
                e.message.clone(),
            )
        })
        .collect();
    assert_eq!(got.len(), 3, "{got:?}");
    assert_eq!(got[0].0, codes::UNKNOWN_BLOCK);
    assert_eq!(got[0].1, (1, 1));
    assert_eq!(p.errors[0].replacement.as_deref(), Some("eye"));
    assert_eq!(got[1].0, codes::UNEXPECTED);
    assert_eq!(got[1].1, (4, 20));
    assert_eq!(got[2].0, codes::UNTERMINATED_STRING);
    assert_eq!(p.blocks.len(), 1);
    assert!(p.lines[4].statement().is_some());
}
