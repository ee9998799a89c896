//! Inlay hints for a client that resolves tooltips on demand: the hints come
//! without their tooltip (the larger part of the answer) and `inlayHint/resolve`
//! adds the same tooltip a client without that capability gets at once.

use parax_ide::{hints, Analysis};
use parax_lsp::client::Client;
use serde_json::{json, Value};
use std::time::Duration;

async fn hints_of(text: &str, capabilities: Value) -> (Vec<Value>, Vec<Value>) {
    let (client_end, server_end) = tokio::io::duplex(1 << 20);
    let (r, w) = tokio::io::split(server_end);
    tokio::spawn(parax_lsp::serve(r, w));
    let (r, w) = tokio::io::split(client_end);
    let mut c = Client::new(r, w);
    let uri = "file:///clinic-review.parax";
    tokio::time::timeout(Duration::from_secs(30), async {
        let init = c.initialize(capabilities).await?;
        assert_eq!(init["capabilities"]["inlayHintProvider"]["resolveProvider"], true);
        c.notify("textDocument/didOpen", json!({"textDocument": {"uri": uri, "languageId": "parax", "version": 1, "text": text}})).await?;
        c.wait_for("textDocument/publishDiagnostics", |p| p["version"] == 1).await?;
        let hints = c
            .request("textDocument/inlayHint", json!({"textDocument": {"uri": uri},
                "range": {"start": {"line": 0, "character": 0}, "end": {"line": 10000, "character": 0}}}))
            .await?;
        let hints = hints.as_array().cloned().unwrap_or_default();
        let mut resolved = Vec::new();
        for h in &hints {
            resolved.push(c.request("inlayHint/resolve", h.clone()).await?);
        }
        std::io::Result::Ok((hints, resolved))
    })
    .await
    .expect("in time")
    .expect("exchange")
}

#[tokio::test]
async fn tooltips_are_resolved_on_demand_and_match_the_eager_ones() {
    let path =
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../../examples/clinic-review.parax");
    let text = std::fs::read_to_string(path).expect("example");
    let expected: Vec<String> = hints::inlay_hints(&Analysis::new(&text), None)
        .into_iter()
        .map(|h| h.tooltip)
        .collect();
    assert!(!expected.is_empty(), "the example has hints");

    let lazy =
        json!({"textDocument": {"inlayHint": {"resolveSupport": {"properties": ["tooltip"]}}}});
    let (hints, resolved) = hints_of(&text, lazy).await;
    assert_eq!(hints.len(), expected.len());
    for ((h, r), want) in hints.iter().zip(&resolved).zip(&expected) {
        assert!(h.get("tooltip").is_none(), "sent without tooltip: {h}");
        assert_eq!(r["tooltip"], json!(want), "resolved {h}");
        assert_eq!(r["label"], h["label"]);
        assert_eq!(r["position"], h["position"]);
    }

    // A client that cannot resolve gets the same tooltips at once.
    let (eager, _) = hints_of(&text, json!({})).await;
    let tips: Vec<Value> = eager.iter().map(|h| h["tooltip"].clone()).collect();
    assert_eq!(tips, expected.iter().map(|t| json!(t)).collect::<Vec<_>>());
}
