//! The server evaluates edits without substituted formulas and writes them only
//! when a hover asks: a hover after an edit must show the derivation of the new
//! numbers, exactly as a full evaluation (with derivations) writes it.

use parax_lsp::client::Client;
use serde_json::{json, Value};
use std::time::Duration;

/// Invented data (no real patient): one eye and its partner.
const TEXT: &str = "# Invented data: no real patient.\ncase \"hover\"\n\neye right\n  refraction -2.00 / -0.50 x 180 @ 12 mm\n\neye left\n  refraction -1.00 / -0.50 x 90\n";

/// The substituted formulas a full evaluation writes for the values of `line`.
fn substituted_on(text: &str, line: usize) -> Vec<String> {
    let (parsed, ev) = parax_eval::evaluate_source(text);
    let span = parsed.lines[line].span;
    let found: Vec<String> = ev
        .derived
        .iter()
        .filter(|d| span.start <= d.span.start && d.span.start <= span.end)
        .map(|d| d.derivation.substituted.to_string())
        .collect();
    assert!(!found.is_empty() && found.iter().all(|s| !s.is_empty()));
    found
}

#[tokio::test]
async fn a_hover_after_an_edit_shows_the_new_derivation() {
    let (client_end, server_end) = tokio::io::duplex(1 << 20);
    let (r, w) = tokio::io::split(server_end);
    tokio::spawn(parax_lsp::serve(r, w));
    let (r, w) = tokio::io::split(client_end);
    let mut c = Client::new(r, w);
    let uri = "file:///hover-after-edit.parax";
    let at = json!({"textDocument": {"uri": uri}, "position": {"line": 4, "character": 16}});
    let edited = TEXT.replace("-2.00 / -0.50", "-3.75 / -0.50");
    let (before, after) = tokio::time::timeout(Duration::from_secs(30), async {
        c.initialize(json!({})).await?;
        c.notify("textDocument/didOpen", json!({"textDocument": {"uri": uri, "languageId": "parax", "version": 1, "text": TEXT}})).await?;
        c.wait_for("textDocument/publishDiagnostics", |p| p["version"] == 1).await?;
        let before: Value = c.request("textDocument/hover", at.clone()).await?;
        // `-2.00` → `-3.75` on line 4 (columns 13..18).
        c.notify("textDocument/didChange", json!({"textDocument": {"uri": uri, "version": 2},
            "contentChanges": [{"range": {"start": {"line": 4, "character": 13}, "end": {"line": 4, "character": 18}}, "text": "-3.75"}]})).await?;
        c.wait_for("textDocument/publishDiagnostics", |p| p["version"] == 2).await?;
        let after: Value = c.request("textDocument/hover", at.clone()).await?;
        std::io::Result::Ok((before, after))
    })
    .await
    .expect("in time")
    .expect("exchange");
    let md = |h: &Value| {
        h["contents"]["value"]
            .as_str()
            .expect("markdown")
            .to_string()
    };
    let (before, after) = (md(&before), md(&after));
    for s in substituted_on(TEXT, 4) {
        assert!(
            before.contains(&format!("- substituted: `{s}`")),
            "{s} in {before}"
        );
    }
    for s in substituted_on(&edited, 4) {
        assert!(
            after.contains(&format!("- substituted: `{s}`")),
            "{s} in {after}"
        );
    }
    assert_ne!(before, after);
    assert!(
        after.contains("-3.75") && !after.contains("-2.00 /"),
        "{after}"
    );
}
