//! End-to-end: the real `parax` binary serving `parax lsp` over stdio. Opens the
//! invented clinic example, waits for diagnostics, asks for inlay hints, hover
//! and formatting, edits the file and sees the diagnostics follow, then shuts
//! down and checks the process exits cleanly.

use parax_lsp::client::Client;
use serde_json::json;
use std::process::Stdio;
use std::time::Duration;

async fn within<T>(f: impl std::future::Future<Output = std::io::Result<T>>) -> T {
    tokio::time::timeout(Duration::from_secs(30), f)
        .await
        .expect("the server answered in time")
        .expect("the exchange succeeded")
}

#[tokio::test]
async fn serves_the_clinic_example_over_stdio() {
    let mut child = tokio::process::Command::new(env!("CARGO_BIN_EXE_parax"))
        .arg("lsp")
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::null())
        .kill_on_drop(true)
        .spawn()
        .expect("parax starts");
    let mut c = Client::new(
        child.stdout.take().expect("stdout"),
        child.stdin.take().expect("stdin"),
    );
    let init = within(c.initialize(json!({}))).await;
    assert_eq!(init["capabilities"]["positionEncoding"], "utf-16");
    assert_eq!(init["serverInfo"]["name"], "parax");

    let path =
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../../examples/clinic-review.parax");
    let text = std::fs::read_to_string(path).expect("example");
    let uri = "file:///examples/clinic-review.parax";
    within(c.notify(
        "textDocument/didOpen",
        json!({"textDocument": {"uri": uri, "languageId": "parax", "version": 1, "text": text}}),
    ))
    .await;
    let d = within(c.wait_for("textDocument/publishDiagnostics", |p| p["version"] == 1)).await;
    // The same findings `parax check` reports: two vertex notes (P0303), no errors.
    let codes: Vec<_> = d["diagnostics"]
        .as_array()
        .expect("list")
        .iter()
        .map(|d| d["code"].clone())
        .collect();
    assert_eq!(codes, vec![json!("P0303"), json!("P0303")]);

    let hints = within(c.request(
        "textDocument/inlayHint",
        json!({"textDocument": {"uri": uri}, "range": {"start": {"line": 0, "character": 0}, "end": {"line": 99, "character": 0}}}),
    ))
    .await;
    // Corneal-plane power beside the right refraction (line 10 of the file):
    // -5.75/-1.50 x 175 at 12 mm, each meridian F/(1 - dF) [C]: -5.38 / -1.29.
    assert_eq!(hints[0]["position"]["line"], 9);
    assert!(hints[0]["label"]
        .as_str()
        .unwrap_or("")
        .starts_with("cornea -5.38 / -1.29 x 175"));

    let hover = within(c.request(
        "textDocument/hover",
        json!({"textDocument": {"uri": uri}, "position": {"line": 11, "character": 20}}),
    ))
    .await;
    let md = hover["contents"]["value"].as_str().unwrap_or("");
    assert!(md.contains("K = (n_k − 1) / r"), "{md}");
    assert!(md.contains("Shammas"), "{md}");
    assert!(md.contains("verify clinically"), "{md}");

    let fmt = within(c.request(
        "textDocument/formatting",
        json!({"textDocument": {"uri": uri}, "options": {"tabSize": 2, "insertSpaces": true}}),
    ))
    .await;
    assert_eq!(fmt, json!([]), "the example is in canonical layout");

    // Break a unit: `12 mm` → `12` on line 10; the missing-unit error appears.
    within(c.notify(
        "textDocument/didChange",
        json!({"textDocument": {"uri": uri, "version": 2},
               "contentChanges": [{"range": {"start": {"line": 9, "character": 37}, "end": {"line": 9, "character": 40}}, "text": ""}]}),
    ))
    .await;
    let d = within(c.wait_for("textDocument/publishDiagnostics", |p| p["version"] == 2)).await;
    assert!(
        d["diagnostics"]
            .as_array()
            .expect("list")
            .iter()
            .any(|d| d["code"] == "P0201"),
        "{d}"
    );

    within(c.shutdown()).await;
    let status = tokio::time::timeout(Duration::from_secs(10), child.wait())
        .await
        .expect("exits after `exit`")
        .expect("status");
    assert!(status.success());
}

/// Standard input that is a file, not a pipe (the runtime cannot poll it):
/// the server falls back to reading it through the blocking pool and still
/// answers the request in it.
#[test]
fn serves_requests_read_from_a_file() {
    fn frame(v: serde_json::Value) -> String {
        let body = v.to_string();
        format!("Content-Length: {}\r\n\r\n{body}", body.len())
    }
    let dir = std::env::temp_dir().join(format!("parax-lsp-stdin-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("temp dir");
    let input = dir.join("requests");
    // Only `initialize`: a client waits for its answer before sending more
    // (what is sent before the answer may be cancelled), and the end of the
    // file ends the session.
    let requests = [frame(
        json!({"jsonrpc": "2.0", "id": 1, "method": "initialize", "params": {"capabilities": {}}}),
    )];
    std::fs::write(&input, requests.concat()).expect("requests written");
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_parax"))
        .arg("lsp")
        .stdin(std::fs::File::open(&input).expect("requests"))
        .stderr(Stdio::null())
        .output()
        .expect("parax runs");
    let _ = std::fs::remove_dir_all(&dir);
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(out.status.success(), "exit status {:?}", out.status);
    assert!(text.contains(r#""serverInfo":{"name":"parax""#), "{text}");
}
