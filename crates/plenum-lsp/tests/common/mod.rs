//! A minimal LSP client for protocol tests: spawns the server binary and
//! speaks JSON-RPC over its stdin and stdout (Content-Length framing).
#![allow(dead_code)]

use std::io::{BufRead, BufReader, Write};
use std::path::Path;
use std::process::{Child, ChildStdin, Command, Stdio};
use std::sync::mpsc::{Receiver, RecvTimeoutError, channel};
use std::time::{Duration, Instant};

use serde_json::{Value, json};

pub const TIMEOUT: Duration = Duration::from_secs(20);

pub struct Client {
    child: Child,
    stdin: Option<ChildStdin>,
    rx: Receiver<Value>,
    next_id: i64,
    /// Notifications received and not yet consumed.
    pub notifications: Vec<Value>,
}

fn read_message(r: &mut impl BufRead) -> Option<Value> {
    let mut len = None;
    loop {
        let mut line = String::new();
        if r.read_line(&mut line).ok()? == 0 {
            return None;
        }
        let line = line.trim_end();
        if line.is_empty() {
            break;
        }
        if let Some(v) = line.strip_prefix("Content-Length: ") {
            len = v.parse::<usize>().ok();
        }
    }
    let mut buf = vec![0u8; len?];
    r.read_exact(&mut buf).ok()?;
    serde_json::from_slice(&buf).ok()
}

impl Client {
    /// Start the server and initialize it with these client capabilities
    /// and workspace folders.
    pub fn start(capabilities: Value, root: Option<&Path>) -> (Client, Value) {
        let mut child = Command::new(env!("CARGO_BIN_EXE_plenum-lsp-test"))
            .stdin(Stdio::piped())
            .stdout(Stdio::piped())
            .stderr(Stdio::null())
            .spawn()
            .unwrap();
        let stdout = child.stdout.take().unwrap();
        let stdin = child.stdin.take();
        let (tx, rx) = channel();
        std::thread::spawn(move || {
            let mut r = BufReader::new(stdout);
            while let Some(m) = read_message(&mut r) {
                if tx.send(m).is_err() {
                    break;
                }
            }
        });
        let mut c = Client {
            child,
            stdin,
            rx,
            next_id: 0,
            notifications: Vec::new(),
        };
        let folders = root.map(|r| json!([{ "uri": uri(r), "name": "w" }]));
        let init = c.request(
            "initialize",
            json!({
                "processId": null,
                "rootUri": null,
                "capabilities": capabilities,
                "workspaceFolders": folders,
            }),
        );
        c.notify("initialized", json!({}));
        (c, init)
    }

    fn send(&mut self, msg: &Value) {
        let body = serde_json::to_string(msg).unwrap();
        let stdin = self.stdin.as_mut().unwrap();
        write!(stdin, "Content-Length: {}\r\n\r\n{body}", body.len()).unwrap();
        stdin.flush().unwrap();
    }

    pub fn notify(&mut self, method: &str, params: Value) {
        self.send(&json!({ "jsonrpc": "2.0", "method": method, "params": params }));
    }

    /// Send a request without waiting; returns its id.
    pub fn send_request(&mut self, method: &str, params: Value) -> i64 {
        self.next_id += 1;
        let id = self.next_id;
        self.send(&json!({ "jsonrpc": "2.0", "id": id, "method": method, "params": params }));
        id
    }

    /// Receive one message (answering server requests as they come).
    fn recv(&mut self, deadline: Instant) -> Option<Value> {
        loop {
            let left = deadline.checked_duration_since(Instant::now())?;
            let m = match self.rx.recv_timeout(left) {
                Ok(m) => m,
                Err(RecvTimeoutError::Timeout | RecvTimeoutError::Disconnected) => return None,
            };
            if m.get("method").is_some() && m.get("id").is_some() {
                // A request from the server (registerCapability …): accept it.
                let id = m["id"].clone();
                self.send(&json!({ "jsonrpc": "2.0", "id": id, "result": null }));
                continue;
            }
            return Some(m);
        }
    }

    /// The whole response (`result` or `error`) to request `id`.
    pub fn response(&mut self, id: i64) -> Value {
        let deadline = Instant::now() + TIMEOUT;
        while let Some(m) = self.recv(deadline) {
            if m.get("id") == Some(&json!(id)) {
                return m;
            }
            self.notifications.push(m);
        }
        panic!("no response to request {id}");
    }

    /// Send a request and return its `result` (panics on an error response).
    pub fn request(&mut self, method: &str, params: Value) -> Value {
        let id = self.send_request(method, params);
        let r = self.response(id);
        assert!(r.get("error").is_none(), "{method}: {r}");
        r["result"].clone()
    }

    /// Wait for a `publishDiagnostics` of `uri` that satisfies `ok`; returns its diagnostics.
    pub fn diagnostics_where(&mut self, uri: &str, ok: impl Fn(&[Value]) -> bool) -> Vec<Value> {
        let deadline = Instant::now() + TIMEOUT;
        let mut last = None;
        loop {
            let found = self.notifications.iter().position(|n| {
                n["method"] == "textDocument/publishDiagnostics" && n["params"]["uri"] == uri
            });
            if let Some(i) = found {
                let n = self.notifications.remove(i);
                let diags = n["params"]["diagnostics"]
                    .as_array()
                    .cloned()
                    .unwrap_or_default();
                if ok(&diags) {
                    return diags;
                }
                last = Some(diags);
                continue;
            }
            match self.recv(deadline) {
                Some(m) => self.notifications.push(m),
                None => panic!("no matching diagnostics for {uri}; last: {last:?}"),
            }
        }
    }

    /// The next diagnostics published for `uri`.
    pub fn diagnostics(&mut self, uri: &str) -> Vec<Value> {
        self.diagnostics_where(uri, |_| true)
    }

    pub fn open(&mut self, uri: &str, text: &str) {
        self.notify(
            "textDocument/didOpen",
            json!({ "textDocument": { "uri": uri, "languageId": "plenum", "version": 1, "text": text } }),
        );
    }

    pub fn change(&mut self, uri: &str, version: i32, changes: Value) {
        self.notify(
            "textDocument/didChange",
            json!({ "textDocument": { "uri": uri, "version": version }, "contentChanges": changes }),
        );
    }

    pub fn hover(&mut self, uri: &str, line: u32, character: u32) -> Value {
        self.request(
            "textDocument/hover",
            json!({ "textDocument": { "uri": uri }, "position": { "line": line, "character": character } }),
        )
    }

    /// `shutdown`, `exit`, and the exit status.
    pub fn shutdown(mut self) -> std::process::ExitStatus {
        let _ = self.request("shutdown", Value::Null);
        self.notify("exit", Value::Null);
        drop(self.stdin.take());
        let deadline = Instant::now() + TIMEOUT;
        loop {
            if let Some(status) = self.child.try_wait().unwrap() {
                return status;
            }
            assert!(Instant::now() < deadline, "the server did not exit");
            std::thread::sleep(Duration::from_millis(20));
        }
    }
}

impl Drop for Client {
    fn drop(&mut self) {
        if let Ok(None) = self.child.try_wait() {
            let _ = self.child.kill();
            let _ = self.child.wait();
        }
    }
}

pub fn uri(path: &Path) -> String {
    plenum_lsp::uri_string_from_path(path)
}

/// The UTF-16 and UTF-8 client capabilities.
pub fn utf16() -> Value {
    json!({})
}

pub fn utf8() -> Value {
    json!({ "general": { "positionEncodings": ["utf-8", "utf-16"] } })
}

/// Line and column (in `enc` units: "utf-8" or "utf-16") of byte `offset` in `text`.
pub fn pos(text: &str, offset: usize, enc: &str) -> (u32, u32) {
    let before = &text[..offset];
    let line = before.matches('\n').count() as u32;
    let start = before.rfind('\n').map_or(0, |i| i + 1);
    let seg = &text[start..offset];
    let col = if enc == "utf-8" {
        seg.len()
    } else {
        seg.encode_utf16().count()
    };
    (line, col as u32)
}
