//! Changes that arrive while an evaluation runs are merged, checked exactly: the
//! server's worker is held at a gate (`parax_lsp::Gate`, a test hook) so the test
//! decides when each evaluation starts and when its result is kept, whatever the
//! machine's speed. A burst of edits queued before an evaluation starts costs one
//! evaluation; edits that arrive while one runs make its result stale (not
//! published) and are applied on top of it by the next; only the newest version
//! is published, and what is published equals a fresh analysis of the final text.

use parax_lsp::client::Client;
use parax_lsp::{Counts, Gate};
use serde_json::{json, Value};
use std::time::Duration;

/// An invented case of 300 eye blocks (about 1,500 lines): no real patient.
/// Block `b` has its header on line `2 + 4 b`, its refraction on `3 + 4 b`.
fn case() -> String {
    let mut text = String::from("# Invented test data.\n");
    for i in 0..300 {
        text.push_str(&format!(
            "\neye right {}-{:02}-{:02}\n  refraction -1.00 / -0.50 x 90 @ 12 mm\n  expect spherical-equivalent -1.25 D\n",
            1900 + i / 336,
            i / 28 % 12 + 1,
            i % 28 + 1
        ));
    }
    text
}

/// One edit as the client sends it (line, start and end column, text) and as
/// the test applies it to its own copy of the text (all ASCII: columns are bytes).
struct Edit(u32, u32, u32, String);

impl Edit {
    fn json(&self) -> Value {
        json!({"range": {"start": {"line": self.0, "character": self.1},
                         "end": {"line": self.0, "character": self.2}}, "text": self.3})
    }

    fn apply(&self, text: &mut String) {
        let line_start: usize = text
            .split_inclusive('\n')
            .take(self.0 as usize)
            .map(str::len)
            .sum();
        text.replace_range(
            line_start + self.1 as usize..line_start + self.2 as usize,
            &self.3,
        );
    }
}

/// The digit edit number `v` writes: `-1.00` → `-1.0N` in block `v * 7 % 300`
/// (spread over the file, so a merged burst covers many blocks).
fn digit_edit(v: i32) -> Edit {
    let block = (v as u32 * 7) % 300;
    Edit(3 + 4 * block, 17, 18, ((v % 9) + 1).to_string())
}

async fn change(
    c: &mut Client<impl tokio::io::AsyncRead + Unpin, impl tokio::io::AsyncWrite + Unpin>,
    uri: &str,
    version: i32,
    edits: &[Edit],
    text: &mut String,
) -> std::io::Result<()> {
    for e in edits {
        e.apply(text);
    }
    let changes: Vec<Value> = edits.iter().map(Edit::json).collect();
    c.notify(
        "textDocument/didChange",
        json!({"textDocument": {"uri": uri, "version": version}, "contentChanges": changes}),
    )
    .await
}

/// (code, message, line) of each diagnostic, as the server publishes them.
fn published(params: &Value) -> Vec<(String, String, u64)> {
    params["diagnostics"]
        .as_array()
        .expect("a list")
        .iter()
        .map(|d| {
            let message = d["message"].as_str().unwrap_or_default();
            (
                d["code"].as_str().unwrap_or_default().to_owned(),
                message.split('\n').next().unwrap_or_default().to_owned(),
                d["range"]["start"]["line"].as_u64().unwrap_or(u64::MAX),
            )
        })
        .collect()
}

/// The same of a fresh analysis of `text`.
fn fresh(text: &str) -> Vec<(String, String, u64)> {
    let a = parax_ide::Analysis::new(text);
    a.evaluation
        .diagnostics
        .iter()
        .map(|d| {
            (
                d.code.to_string(),
                d.message.clone(),
                a.parsed.index.line_of(d.span.start()) as u64,
            )
        })
        .collect()
}

#[tokio::test(flavor = "multi_thread", worker_threads = 2)]
async fn edits_merged_while_an_evaluation_runs_are_evaluated_exactly_as_scheduled() {
    let mut text = case();
    let gate = Gate::closed();
    let (client_end, server_end) = tokio::io::duplex(1 << 22);
    let (r, w) = tokio::io::split(server_end);
    tokio::spawn(parax_lsp::serve_gated(r, w, gate.clone()));
    let (r, w) = tokio::io::split(client_end);
    let mut c = Client::new(r, w);
    let uri = "file:///burst.parax";
    let counts = |received, taken, changes_taken, evaluated, published| Counts {
        received,
        taken,
        changes_taken,
        evaluated,
        published,
    };
    tokio::time::timeout(Duration::from_secs(120), async {
        c.initialize(json!({})).await?;
        c.notify("textDocument/didOpen", json!({"textDocument": {"uri": uri, "languageId": "parax", "version": 1, "text": text}})).await?;
        // Nothing is evaluated while the gate is closed.
        gate.until(|c| c.received == 1).await;
        assert_eq!(gate.counts(), counts(1, 0, 0, 0, 0));

        // Version 1: one evaluation, published.
        gate.allow_taking(1);
        gate.allow_keeping(1);
        let first = c.wait_for("textDocument/publishDiagnostics", |p| p["version"] == 1).await?;
        assert_eq!(published(&first), fresh(&text));
        assert_eq!(gate.counts(), counts(1, 1, 1, 1, 1));

        // Versions 2 to 21 arrive before the worker may start: one evaluation
        // takes them all up.
        for v in 2..=21 {
            change(&mut c, uri, v, &[digit_edit(v)], &mut text).await?;
        }
        gate.until(|c| c.received == 21).await;
        gate.allow_taking(1);
        gate.until(|c| c.taken == 2).await;

        // Versions 22 to 42 arrive while it runs (the last one with two changes
        // in one message, one of them breaking the first block's expect line:
        // `-1.00` → `-2.00`); its result, of version 21, is stale: kept as the
        // next start, not published.
        for v in 22..=41 {
            change(&mut c, uri, v, &[digit_edit(v)], &mut text).await?;
        }
        change(&mut c, uri, 42, &[digit_edit(42), Edit(3, 14, 18, "2.00".into())], &mut text).await?;
        gate.until(|c| c.received == 42).await;
        gate.allow_keeping(1);
        gate.until(|c| c.evaluated == 2).await;
        assert_eq!(gate.counts(), counts(42, 2, 21, 2, 1));

        // One more evaluation, from the stale one plus the 22 changes after it.
        gate.allow_taking(1);
        gate.allow_keeping(1);
        let last = c.wait_for("textDocument/publishDiagnostics", |p| p["version"] == 42).await?;
        assert_eq!(gate.counts(), counts(42, 3, 43, 3, 2));
        // -2.00 / -0.50: M = S + C/2 = -2.25 D [S: Thibos et al. 1997], not the
        // recorded -1.25 D, so the recorded result fails (P0401).
        let got = published(&last);
        assert!(got.iter().any(|d| d.0 == "P0401" && d.2 == 4), "{got:?}");
        assert_eq!(got, fresh(&text));
        // No other version was published (version 21 in particular).
        let others: Vec<&Value> = c
            .notifications
            .iter()
            .filter(|n| n["method"] == "textDocument/publishDiagnostics")
            .collect();
        assert!(others.is_empty(), "{others:?}");
        std::io::Result::Ok(())
    })
    .await
    .expect("in time")
    .expect("exchange");
}

/// Whole-text changes queued among ranged ones, and an analysis a request made
/// meanwhile (a hover while the worker is held): the worker starts from the
/// newest analysis with only the changes after it, and publishes what a fresh
/// analysis gives.
#[tokio::test(flavor = "multi_thread", worker_threads = 2)]
async fn whole_text_changes_and_request_analyses_are_merged_exactly() {
    let mut text = case();
    let gate = Gate::closed();
    let (client_end, server_end) = tokio::io::duplex(1 << 22);
    let (r, w) = tokio::io::split(server_end);
    tokio::spawn(parax_lsp::serve_gated(r, w, gate.clone()));
    let (r, w) = tokio::io::split(client_end);
    let mut c = Client::new(r, w);
    let uri = "file:///whole.parax";
    tokio::time::timeout(Duration::from_secs(120), async {
        c.initialize(json!({})).await?;
        c.notify("textDocument/didOpen", json!({"textDocument": {"uri": uri, "languageId": "parax", "version": 1, "text": text}})).await?;
        gate.allow_taking(1);
        gate.allow_keeping(1);
        c.wait_for("textDocument/publishDiagnostics", |p| p["version"] == 1).await?;

        // A ranged edit, a whole new text (the first block's refraction changed
        // and a block appended), a ranged edit of that text.
        change(&mut c, uri, 2, &[digit_edit(2)], &mut text).await?;
        text = text.replacen("-1.00 / -0.50", "-3.00 / -0.50", 1)
            + "\neye left\n  refraction +1.00\n  expect spherical-equivalent +2.00 D\n";
        c.notify("textDocument/didChange", json!({"textDocument": {"uri": uri, "version": 3},
            "contentChanges": [{"text": text}]})).await?;
        change(&mut c, uri, 4, &[digit_edit(4)], &mut text).await?;
        gate.until(|c| c.received == 4).await;
        // A hover analyses the newest text itself while the worker is held.
        let hover = c
            .request("textDocument/hover", json!({"textDocument": {"uri": uri}, "position": {"line": 3, "character": 16}}))
            .await?;
        assert!(hover.get("code").is_none(), "{hover}");
        // The worker finds that analysis and nothing queued after it (of the
        // changes taken in all, only the opening text).
        gate.allow_taking(1);
        gate.allow_keeping(1);
        let p = c.wait_for("textDocument/publishDiagnostics", |p| p["version"] == 4).await?;
        assert_eq!(published(&p), fresh(&text));
        assert_eq!(gate.counts(), Counts { received: 4, taken: 2, changes_taken: 1, evaluated: 2, published: 2 });

        // From that analysis: a whole text (the appended block's expect fixed),
        // then a message of two ranged edits; one evaluation taking the three.
        text = text.replace("expect spherical-equivalent +2.00 D", "expect spherical-equivalent +1.00 D");
        c.notify("textDocument/didChange", json!({"textDocument": {"uri": uri, "version": 5},
            "contentChanges": [{"text": text}]})).await?;
        change(&mut c, uri, 6, &[digit_edit(6), Edit(3, 14, 18, "2.00".into())], &mut text).await?;
        gate.until(|c| c.received == 6).await;
        gate.allow_taking(1);
        gate.allow_keeping(1);
        let p = c.wait_for("textDocument/publishDiagnostics", |p| p["version"] == 6).await?;
        assert_eq!(published(&p), fresh(&text));
        assert_eq!(gate.counts(), Counts { received: 6, taken: 3, changes_taken: 4, evaluated: 3, published: 3 });
        let others = c.notifications.iter().filter(|n| n["method"] == "textDocument/publishDiagnostics").count();
        assert_eq!(others, 0);
        std::io::Result::Ok(())
    })
    .await
    .expect("in time")
    .expect("exchange");
}
