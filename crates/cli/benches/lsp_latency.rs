//! Latency of one edit in an editor: `didChange` → `publishDiagnostics` for
//! that version, then `inlayHint` for a screenful around the edit, through the
//! real `parax lsp` over stdio, for a 200-line and a 20,000-line case; beside a
//! do-nothing server (this same bench binary with `PARAX_BENCH_NULL=1`: it
//! frames and parses the same messages and answers with empty results) as the
//! transport floor; and once more for a client that resolves the hints'
//! tooltips on demand. Prints the median and 90th percentile of each.

use criterion::{criterion_group, Criterion};
use parax_lsp::client::Client;
use serde_json::{json, Value};
use std::io::{BufRead, BufReader, Read, Write};
use std::process::Stdio;
use std::time::{Duration, Instant};
use tokio::process::{Child, ChildStdin, ChildStdout};

/// An invented case of about `lines` lines: eye blocks of six lines each.
fn case(lines: usize) -> String {
    let mut s = String::from(
        "# Invented benchmark data: no real patient.\ncase \"bench\"\n  date 2026-01-02\n",
    );
    let mut i = 0;
    let mut n = 3;
    while n < lines {
        n += 6;
        let side = if i % 2 == 0 { "right" } else { "left" };
        // Spheres 1.00 and 1.25 D (no vertex notes), the same at every visit of
        // one eye (visits a day apart with a changed refraction would be flagged
        // as a fast change), so the file checks clean.
        let sphere = 1.0 + (i % 2) as f64 * 0.25;
        s.push_str(&format!(
            "\neye {side} {}-{:02}-{:02}\n  refraction -{sphere:.2} / -0.50 x {} @ 12 mm\n  add +1.50\n  keratometry 7.8{} mm x 180, 7.6{} mm x 90\n  expect spherical-equivalent {:.2} D\n",
            // A distinct date per block, so every block has its own key.
            1900 + i / 336,
            i / 28 % 12 + 1,
            i % 28 + 1,
            10 + 160 * (i % 2),
            i % 10,
            i % 10,
            // M = S + C/2 [S: Thibos et al. 1997], so every expect line holds.
            -sphere - 0.25,
        ));
        i += 1;
    }
    s
}

fn null_server() {
    let stdin = std::io::stdin();
    let mut r = BufReader::new(stdin.lock());
    let mut out = std::io::stdout().lock();
    loop {
        let mut len = 0usize;
        loop {
            let mut line = String::new();
            if r.read_line(&mut line).unwrap_or(0) == 0 {
                return;
            }
            let line = line.trim_end();
            if line.is_empty() {
                break;
            }
            if let Some(v) = line.strip_prefix("Content-Length:") {
                len = v.trim().parse().unwrap_or(0);
            }
        }
        let mut buf = vec![0; len];
        if r.read_exact(&mut buf).is_err() {
            return;
        }
        let msg: Value = serde_json::from_slice(&buf).unwrap_or(Value::Null);
        let reply = match (msg["method"].as_str().unwrap_or(""), msg.get("id")) {
            ("initialize", Some(id)) => {
                json!({"jsonrpc": "2.0", "id": id, "result": {"capabilities": {}}})
            }
            ("exit", _) => return,
            (_, Some(id)) => json!({"jsonrpc": "2.0", "id": id, "result": []}),
            ("textDocument/didChange" | "textDocument/didOpen", None) => json!({
                "jsonrpc": "2.0", "method": "textDocument/publishDiagnostics",
                "params": {"uri": msg["params"]["textDocument"]["uri"], "version": msg["params"]["textDocument"]["version"], "diagnostics": []}
            }),
            _ => continue,
        };
        let body = serde_json::to_vec(&reply).unwrap_or_default();
        let _ = write!(out, "Content-Length: {}\r\n\r\n", body.len());
        let _ = out.write_all(&body);
        let _ = out.flush();
    }
}

struct Session {
    rt: tokio::runtime::Runtime,
    _child: Child,
    client: Client<ChildStdout, ChildStdin>,
    version: i32,
    edit_line: u32,
    samples: Vec<Duration>,
}

const URI: &str = "file:///bench/case.parax";

impl Session {
    fn start(null: bool, capabilities: Value, text: &str) -> Session {
        let rt = tokio::runtime::Builder::new_current_thread()
            .enable_all()
            .build()
            .expect("runtime");
        let (child, client) = rt.block_on(async {
            let mut cmd = if null {
                let mut c = tokio::process::Command::new(std::env::current_exe().expect("bench exe"));
                c.env("PARAX_BENCH_NULL", "1");
                c
            } else {
                let mut c = tokio::process::Command::new(env!("CARGO_BIN_EXE_parax"));
                c.arg("lsp");
                c
            };
            let mut child = cmd
                .stdin(Stdio::piped())
                .stdout(Stdio::piped())
                .stderr(Stdio::null())
                .kill_on_drop(true)
                .spawn()
                .expect("server starts");
            let mut client = Client::new(child.stdout.take().expect("stdout"), child.stdin.take().expect("stdin"));
            client.initialize(capabilities).await.expect("initialize");
            client
                .notify(
                    "textDocument/didOpen",
                    json!({"textDocument": {"uri": URI, "languageId": "parax", "version": 1, "text": text}}),
                )
                .await
                .expect("open");
            let first = client
                .wait_for("textDocument/publishDiagnostics", |p| p["version"] == 1)
                .await
                .expect("first diagnostics");
            assert_eq!(first["diagnostics"], json!([]), "the benchmark case checks clean");
            (child, client)
        });
        // The refraction line of the block in the middle of the file.
        let mid = text.lines().count() / 2;
        let edit_line = text
            .lines()
            .enumerate()
            .skip(mid)
            .find(|(_, l)| l.starts_with("  refraction -"))
            .map(|(i, _)| i as u32)
            .unwrap_or(4);
        Session {
            rt,
            _child: child,
            client,
            version: 1,
            edit_line,
            samples: Vec::new(),
        }
    }

    /// One edit: change the sphere's first decimal (col 16) and wait for
    /// diagnostics of that version and the hints of a screenful around it.
    fn edit(&mut self) -> Duration {
        self.version += 1;
        let v = self.version;
        let digit = (v % 10).to_string();
        let line = self.edit_line;
        let start = Instant::now();
        let client = &mut self.client;
        self.rt.block_on(async {
            client
                .notify(
                    "textDocument/didChange",
                    json!({"textDocument": {"uri": URI, "version": v}, "contentChanges": [{
                        "range": {"start": {"line": line, "character": 16}, "end": {"line": line, "character": 17}},
                        "text": digit}]}),
                )
                .await
                .expect("change");
            client
                .wait_for("textDocument/publishDiagnostics", |p| p["version"] == v)
                .await
                .expect("diagnostics");
            let from = line.saturating_sub(25);
            client
                .request(
                    "textDocument/inlayHint",
                    json!({"textDocument": {"uri": URI}, "range": {"start": {"line": from, "character": 0}, "end": {"line": from + 50, "character": 0}}}),
                )
                .await
                .expect("hints");
        });
        let d = start.elapsed();
        self.samples.push(d);
        d
    }
}

fn percentile(sorted: &[Duration], p: f64) -> Duration {
    sorted[((sorted.len() - 1) as f64 * p).round() as usize]
}

fn bench(c: &mut Criterion) {
    let mut report = Vec::new();
    for lines in [200usize, 20_000] {
        let text = case(lines);
        // A client that resolves hint tooltips on demand (as VS Code does) gets
        // smaller hint answers.
        let lazy =
            json!({"textDocument": {"inlayHint": {"resolveSupport": {"properties": ["tooltip"]}}}});
        for (name, null, caps) in [
            ("do-nothing server", true, json!({})),
            ("parax lsp", false, json!({})),
            ("parax lsp, tooltips on demand", false, lazy),
        ] {
            let mut s = Session::start(null, caps, &text);
            let id = format!("change→diagnostics+hints/{lines} lines/{name}");
            c.bench_function(&id, |b| {
                b.iter_custom(|iters| (0..iters).map(|_| s.edit()).sum());
            });
            let mut all = s.samples.clone();
            if all.is_empty() {
                // Left out by a filter on the command line.
                continue;
            }
            all.sort();
            report.push(format!(
                "{id}: median {:?}, p90 {:?} ({} samples)",
                percentile(&all, 0.5),
                percentile(&all, 0.9),
                all.len()
            ));
        }
    }
    for r in report {
        println!("{r}");
    }
}

criterion_group! {
    name = benches;
    config = Criterion::default().sample_size(20).measurement_time(Duration::from_secs(3)).warm_up_time(Duration::from_secs(1));
    targets = bench
}

fn main() {
    if std::env::var_os("PARAX_BENCH_NULL").is_some() {
        null_server();
        return;
    }
    benches();
    Criterion::default().configure_from_args().final_summary();
}
