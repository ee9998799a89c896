//! Data-driven tests of every editor feature through the real service, in
//! process: each `fixtures/NAME.parax` is opened and the requests in
//! `fixtures/NAME.requests` are sent one by one (positions are 0-based line and
//! column in the fixture's encoding); the answers form one insta snapshot.

use parax_lsp::client::Client;
use parax_syntax::{ColumnUnit, LineIndex, LinePos};
use serde_json::{json, Value};
use std::path::Path;
use std::time::Duration;

const URI: &str = "file:///fixture/case.parax";
const TOKEN_TYPES: [&str; 10] = [
    "block-keyword",
    "keyword",
    "number",
    "unit",
    "text",
    "date",
    "operator",
    "label",
    "word",
    "comment",
];

async fn within<T>(what: &str, f: impl std::future::Future<Output = std::io::Result<T>>) -> T {
    tokio::time::timeout(Duration::from_secs(20), f)
        .await
        .unwrap_or_else(|_| panic!("no answer to `{what}` within 20 s"))
        .unwrap_or_else(|e| panic!("`{what}` failed: {e}"))
}

fn pos(a: &str, b: &str) -> Value {
    json!({"line": a.parse::<u32>().expect("line"), "character": b.parse::<u32>().expect("column")})
}

async fn run_fixture(path: &Path) -> Value {
    let source = std::fs::read_to_string(path).expect("fixture");
    let requests = std::fs::read_to_string(path.with_extension("requests")).expect("requests file");
    let (client_end, server_end) = tokio::io::duplex(1 << 20);
    let (server_read, server_write) = tokio::io::split(server_end);
    tokio::spawn(parax_lsp::serve(server_read, server_write));
    let (read, write) = tokio::io::split(client_end);
    let mut c = Client::new(read, write);

    let mut encoding = "utf-16";
    for line in requests.lines() {
        if let Some(e) = line.strip_prefix("encoding ") {
            encoding = if e.trim() == "utf-8" {
                "utf-8"
            } else {
                "utf-16"
            };
        }
    }
    let caps = if encoding == "utf-8" {
        json!({"general": {"positionEncodings": ["utf-8", "utf-16"]}})
    } else {
        json!({"general": {"positionEncodings": ["utf-16"]}})
    };
    let init = within("initialize", c.initialize(caps)).await;
    assert_eq!(init["capabilities"]["positionEncoding"], encoding);
    let unit = if encoding == "utf-8" {
        ColumnUnit::Utf8
    } else {
        ColumnUnit::Utf16
    };
    let mut version = 1;
    within(
        "didOpen",
        c.notify(
            "textDocument/didOpen",
            json!({"textDocument": {"uri": URI, "languageId": "parax", "version": version, "text": source}}),
        ),
    )
    .await;
    let doc = json!({"uri": URI});
    let mut out = Vec::new();
    for line in requests.lines() {
        let line = line.trim();
        if line.is_empty() || line.starts_with('#') || line.starts_with("encoding ") {
            continue;
        }
        let w: Vec<&str> = line.split_whitespace().collect();
        let result = match w[0] {
            "diagnostics" => {
                let v = version;
                let p = within(
                    line,
                    c.wait_for("textDocument/publishDiagnostics", |p| p["version"] == v),
                )
                .await;
                p["diagnostics"].clone()
            }
            "log" => within(line, c.wait_for("window/logMessage", |_| true)).await,
            "change" => {
                let text: String = serde_json::from_str(w[5..].join(" ").as_str())
                    .expect("change text is a JSON string");
                version += 1;
                let params = json!({
                    "textDocument": {"uri": URI, "version": version},
                    "contentChanges": [{"range": {"start": pos(w[1], w[2]), "end": pos(w[3], w[4])}, "text": text}]
                });
                within(line, c.notify("textDocument/didChange", params)).await;
                continue;
            }
            "hints" => {
                let params = json!({"textDocument": doc, "range": {"start": pos("0", "0"), "end": pos("100000", "0")}});
                within(line, c.request("textDocument/inlayHint", params)).await
            }
            "hover" => {
                let params = json!({"textDocument": doc, "position": pos(w[1], w[2])});
                within(line, c.request("textDocument/hover", params)).await
            }
            "completion" => {
                let params = json!({"textDocument": doc, "position": pos(w[1], w[2])});
                let r = within(line, c.request("textDocument/completion", params)).await;
                // Labels and replaced ranges are what matter; details are in the first item.
                json!(r.as_array().map(|items| keyword_table(
                    items
                        .iter()
                        .map(|i| json!([i["label"], i["kind"], i["textEdit"]["range"]]))
                        .collect::<Vec<_>>()
                )))
            }
            "actions" => {
                let params = json!({"textDocument": doc, "range": {"start": pos(w[1], w[2]), "end": pos(w[3], w[4])}, "context": {"diagnostics": []}});
                let r = within(line, c.request("textDocument/codeAction", params)).await;
                json!(r.as_array().map(|acts| acts
                    .iter()
                    .map(|a| json!({
                        "title": a["title"], "kind": a["kind"],
                        "fixes": a["diagnostics"][0]["code"],
                        "edits": a["edit"]["changes"][URI],
                    }))
                    .collect::<Vec<_>>()))
            }
            "symbols" => {
                within(
                    line,
                    c.request("textDocument/documentSymbol", json!({"textDocument": doc})),
                )
                .await
            }
            "folds" => {
                within(
                    line,
                    c.request("textDocument/foldingRange", json!({"textDocument": doc})),
                )
                .await
            }
            "formatting" => {
                let params =
                    json!({"textDocument": doc, "options": {"tabSize": 2, "insertSpaces": true}});
                within(line, c.request("textDocument/formatting", params)).await
            }
            "format-range" => {
                let params = json!({"textDocument": doc, "range": {"start": pos(w[1], w[2]), "end": pos(w[3], w[4])}, "options": {"tabSize": 2, "insertSpaces": true}});
                within(line, c.request("textDocument/rangeFormatting", params)).await
            }
            "definition" => {
                let params = json!({"textDocument": doc, "position": pos(w[1], w[2])});
                within(line, c.request("textDocument/definition", params)).await
            }
            "references" => {
                let params = json!({"textDocument": doc, "position": pos(w[1], w[2]), "context": {"includeDeclaration": true}});
                within(line, c.request("textDocument/references", params)).await
            }
            "tokens" => {
                let r = within(
                    line,
                    c.request(
                        "textDocument/semanticTokens/full",
                        json!({"textDocument": doc}),
                    ),
                )
                .await;
                decode_tokens(&source, unit, &r["data"])
            }
            other => panic!("unknown request `{other}` in {}", path.display()),
        };
        out.push(json!({"request": line, "result": result}));
    }
    within("shutdown", c.shutdown()).await;
    Value::Array(out)
}

/// Semantic tokens as `[line, column, length, class, text]`, the text cut from
/// the source with the same column unit, so the snapshot shows what each covers.
fn decode_tokens(source: &str, unit: ColumnUnit, data: &Value) -> Value {
    let idx = LineIndex::new(source);
    let data: Vec<u32> = data
        .as_array()
        .expect("token data")
        .iter()
        .map(|v| v.as_u64().unwrap_or(0) as u32)
        .collect();
    let (mut line, mut col) = (0, 0);
    let mut out = Vec::new();
    for t in data.chunks(5) {
        if t[0] > 0 {
            col = 0;
        }
        line += t[0];
        col += t[1];
        let s = idx.offset(source, LinePos { line, col }, unit);
        let e = idx.offset(
            source,
            LinePos {
                line,
                col: col + t[2],
            },
            unit,
        );
        out.push(json!([
            line,
            col,
            t[2],
            TOKEN_TYPES[t[3] as usize],
            &source[s..e]
        ]));
    }
    Value::Array(out)
}

/// Completion items that are exactly a block's keyword table (the schema's,
/// in its order, all replacing the same range) are checked against
/// `parax_eval::schema::keywords` and written as one entry, so that a keyword
/// added to a block changes no snapshot.
fn keyword_table(items: Vec<Value>) -> Vec<Value> {
    let keywords: Vec<&Value> = items.iter().filter(|i| i[1] == json!(14)).collect();
    let labels: Vec<&str> = keywords.iter().filter_map(|i| i[0].as_str()).collect();
    let Some(kind) = parax_syntax::BlockKind::ALL.into_iter().find(|k| {
        let names: Vec<&str> = parax_eval::schema::keywords(*k)
            .into_iter()
            .map(|s| s.name)
            .collect();
        names == labels
    }) else {
        return items;
    };
    assert!(
        keywords.iter().all(|i| i[2] == keywords[0][2]),
        "every keyword replaces the same range"
    );
    let table = json!([
        format!(
            "(the keywords of `{}` blocks, as the schema lists them)",
            kind.keyword()
        ),
        14,
        keywords[0][2]
    ]);
    let mut out: Vec<Value> = items
        .iter()
        .filter(|i| i[1] != json!(14))
        .cloned()
        .collect();
    out.insert(0, table);
    out
}

#[tokio::test(flavor = "multi_thread", worker_threads = 2)]
async fn fixtures() {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures");
    let mut names: Vec<_> = std::fs::read_dir(&dir)
        .expect("fixtures folder")
        .filter_map(|e| e.ok().map(|e| e.path()))
        .filter(|p| p.extension().is_some_and(|x| x == "parax"))
        .collect();
    names.sort();
    assert!(names.len() >= 6, "fixtures are missing");
    for path in names {
        let name = path
            .file_stem()
            .and_then(|s| s.to_str())
            .unwrap_or("fixture")
            .to_string();
        let result = run_fixture(&path).await;
        insta::assert_json_snapshot!(name, result);
    }
}
