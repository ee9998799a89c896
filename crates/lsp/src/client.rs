//! A minimal LSP client over any pair of byte streams: frames JSON-RPC messages
//! with `Content-Length`, sends requests and notifications, answers the server's
//! own requests with `null`, and keeps the notifications it receives. Used by the
//! tests (in-process and against the real binary) and by the benchmark; editors
//! are the real clients. Hand-written: a test client needs only framing and
//! id matching, not a client library.

use serde_json::{json, Value};
use std::collections::VecDeque;
use std::io;
use tokio::io::{AsyncBufReadExt, AsyncRead, AsyncReadExt, AsyncWrite, AsyncWriteExt, BufReader};

/// A client talking to a server through `R` (server output) and `W` (server input).
pub struct Client<R, W> {
    reader: BufReader<R>,
    writer: W,
    next_id: i64,
    /// Notifications received and not yet taken, oldest first.
    pub notifications: VecDeque<Value>,
}

impl<R: AsyncRead + Unpin, W: AsyncWrite + Unpin> Client<R, W> {
    /// A client over the given streams.
    pub fn new(reader: R, writer: W) -> Self {
        Client {
            reader: BufReader::new(reader),
            writer,
            next_id: 1,
            notifications: VecDeque::new(),
        }
    }

    async fn send(&mut self, msg: &Value) -> io::Result<()> {
        let body = serde_json::to_vec(msg)?;
        self.writer
            .write_all(format!("Content-Length: {}\r\n\r\n", body.len()).as_bytes())
            .await?;
        self.writer.write_all(&body).await?;
        self.writer.flush().await
    }

    /// Read one message.
    pub async fn read(&mut self) -> io::Result<Value> {
        let mut len = None;
        loop {
            let mut line = String::new();
            if self.reader.read_line(&mut line).await? == 0 {
                return Err(io::Error::new(
                    io::ErrorKind::UnexpectedEof,
                    "server closed its output",
                ));
            }
            let line = line.trim_end();
            if line.is_empty() {
                break;
            }
            if let Some(v) = line.strip_prefix("Content-Length:") {
                len = v.trim().parse::<usize>().ok();
            }
        }
        let len =
            len.ok_or_else(|| io::Error::new(io::ErrorKind::InvalidData, "no Content-Length"))?;
        let mut buf = vec![0; len];
        self.reader.read_exact(&mut buf).await?;
        Ok(serde_json::from_slice(&buf)?)
    }

    /// Send a notification.
    pub async fn notify(&mut self, method: &str, params: Value) -> io::Result<()> {
        self.send(&json!({"jsonrpc": "2.0", "method": method, "params": params}))
            .await
    }

    /// Send a request and wait for its response; returns `result` (or the error object).
    pub async fn request(&mut self, method: &str, params: Value) -> io::Result<Value> {
        let id = self.next_id;
        self.next_id += 1;
        self.send(&json!({"jsonrpc": "2.0", "id": id, "method": method, "params": params}))
            .await?;
        loop {
            let msg = self.read().await?;
            if msg.get("id") == Some(&json!(id)) && msg.get("method").is_none() {
                return Ok(msg
                    .get("result")
                    .cloned()
                    .or_else(|| msg.get("error").cloned())
                    .unwrap_or(Value::Null));
            }
            self.other(msg).await?;
        }
    }

    async fn other(&mut self, msg: Value) -> io::Result<()> {
        if msg.get("id").is_some() && msg.get("method").is_some() {
            // A request from the server (e.g. a refresh): answer it.
            let id = msg["id"].clone();
            self.send(&json!({"jsonrpc": "2.0", "id": id, "result": null}))
                .await
        } else {
            self.notifications.push_back(msg);
            Ok(())
        }
    }

    /// Wait for a notification `method` whose params satisfy `pred`, keeping others.
    pub async fn wait_for(
        &mut self,
        method: &str,
        pred: impl Fn(&Value) -> bool,
    ) -> io::Result<Value> {
        if let Some(i) = self
            .notifications
            .iter()
            .position(|n| n["method"] == method && pred(&n["params"]))
        {
            return Ok(self
                .notifications
                .remove(i)
                .map(|n| n["params"].clone())
                .unwrap_or_default());
        }
        loop {
            let msg = self.read().await?;
            if msg["method"] == method && msg.get("id").is_none() && pred(&msg["params"]) {
                return Ok(msg["params"].clone());
            }
            self.other(msg).await?;
        }
    }

    /// `initialize` (with the given client capabilities) then `initialized`.
    pub async fn initialize(&mut self, capabilities: Value) -> io::Result<Value> {
        let r = self
            .request(
                "initialize",
                json!({"processId": null, "rootUri": null, "capabilities": capabilities}),
            )
            .await?;
        self.notify("initialized", json!({})).await?;
        Ok(r)
    }

    /// `shutdown` then `exit`.
    pub async fn shutdown(&mut self) -> io::Result<()> {
        self.request("shutdown", Value::Null).await?;
        self.notify("exit", Value::Null).await
    }
}
