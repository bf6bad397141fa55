//! A small LSP client over a child process's stdin and stdout
//! (Content-Length framing), for the server benchmark and stress test.
//!
//! Messages from the server are read on a thread of their own; requests
//! the server sends (`client/registerCapability` …) are answered with a
//! null result. Every wait has a deadline: a server that stops answering
//! is an error, never a hang.

use std::collections::HashMap;
use std::io::{BufRead, BufReader, Write};
use std::path::Path;
use std::process::{Child, ChildStdin, Command, ExitStatus, Stdio};
use std::sync::mpsc::{Receiver, RecvTimeoutError, channel};
use std::time::{Duration, Instant};

use serde_json::{Value, json};

/// What went wrong talking to the server.
pub type Error = String;

/// The last diagnostics published for a URI, and when they arrived.
#[derive(Clone, Debug)]
pub struct Published {
    pub version: Option<i64>,
    pub diagnostics: Vec<Value>,
    pub at: Instant,
}

/// A running server and the client side of the connection.
pub struct Client {
    child: Child,
    stdin: Option<ChildStdin>,
    rx: Receiver<Value>,
    next_id: i64,
    /// Responses received and not yet asked for, by id.
    responses: HashMap<i64, Value>,
    /// The latest `publishDiagnostics` per URI.
    pub published: HashMap<String, Published>,
    /// How many `publishDiagnostics` arrived in all.
    pub publish_count: usize,
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

/// The `file://` URI of an absolute path (ASCII paths only: the harness
/// chooses its paths).
pub fn file_uri(path: &Path) -> String {
    format!("file://{}", path.display())
}

impl Client {
    /// Start `program` with `args` and initialize it with these client
    /// capabilities and an optional workspace folder.
    pub fn start(
        program: &Path,
        args: &[&str],
        capabilities: Value,
        folder: Option<&Path>,
        timeout: Duration,
    ) -> Result<(Client, Value), Error> {
        let mut child = Command::new(program)
            .args(args)
            .stdin(Stdio::piped())
            .stdout(Stdio::piped())
            .stderr(Stdio::null())
            .spawn()
            .map_err(|e| format!("cannot start {}: {e}", program.display()))?;
        let stdout = child.stdout.take().ok_or("no stdout")?;
        let stdin = child.stdin.take();
        let (tx, rx) = channel();
        std::thread::spawn(move || {
            let mut r = BufReader::with_capacity(1 << 20, stdout);
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
            responses: HashMap::new(),
            published: HashMap::new(),
            publish_count: 0,
        };
        let folders = folder.map(|f| json!([{ "uri": file_uri(f), "name": "w" }]));
        let init = c.request(
            "initialize",
            json!({
                "processId": null,
                "rootUri": null,
                "capabilities": capabilities,
                "workspaceFolders": folders,
            }),
            timeout,
        )?;
        c.notify("initialized", json!({}))?;
        Ok((c, init))
    }

    fn send(&mut self, msg: &Value) -> Result<(), Error> {
        let body = serde_json::to_string(msg).map_err(|e| e.to_string())?;
        let stdin = self.stdin.as_mut().ok_or("stdin closed")?;
        write!(stdin, "Content-Length: {}\r\n\r\n{body}", body.len())
            .and_then(|()| stdin.flush())
            .map_err(|e| format!("the server's stdin: {e}"))
    }

    pub fn notify(&mut self, method: &str, params: Value) -> Result<(), Error> {
        self.send(&json!({ "jsonrpc": "2.0", "method": method, "params": params }))
    }

    /// Send a request without waiting; returns its id.
    pub fn send_request(&mut self, method: &str, params: Value) -> Result<i64, Error> {
        self.next_id += 1;
        let id = self.next_id;
        self.send(&json!({ "jsonrpc": "2.0", "id": id, "method": method, "params": params }))?;
        Ok(id)
    }

    /// Handle one message, waiting until `deadline`; false when none came.
    fn pump(&mut self, deadline: Instant) -> Result<bool, Error> {
        let Some(left) = deadline.checked_duration_since(Instant::now()) else {
            return Ok(false);
        };
        let m = match self.rx.recv_timeout(left) {
            Ok(m) => m,
            Err(RecvTimeoutError::Timeout) => return Ok(false),
            Err(RecvTimeoutError::Disconnected) => {
                return Err("the server closed its output".to_string());
            }
        };
        self.handle(m)?;
        Ok(true)
    }

    fn handle(&mut self, m: Value) -> Result<(), Error> {
        match (m.get("method").and_then(Value::as_str), m.get("id")) {
            (Some(_), Some(id)) => {
                // A request from the server: accept it.
                let id = id.clone();
                self.send(&json!({ "jsonrpc": "2.0", "id": id, "result": null }))?;
            }
            (Some("textDocument/publishDiagnostics"), None) => {
                let p = &m["params"];
                let uri = p["uri"].as_str().unwrap_or_default().to_string();
                self.publish_count += 1;
                self.published.insert(
                    uri,
                    Published {
                        version: p["version"].as_i64(),
                        diagnostics: p["diagnostics"].as_array().cloned().unwrap_or_default(),
                        at: Instant::now(),
                    },
                );
            }
            (Some(_), None) => {}
            (None, Some(id)) => {
                if let Some(id) = id.as_i64() {
                    self.responses.insert(id, m);
                }
            }
            (None, None) => {}
        }
        Ok(())
    }

    /// Handle every message that has already arrived.
    pub fn drain(&mut self) -> Result<(), Error> {
        while let Ok(m) = self.rx.try_recv() {
            self.handle(m)?;
        }
        Ok(())
    }

    /// The whole response (`result` or `error`) to request `id`.
    pub fn response(&mut self, id: i64, timeout: Duration) -> Result<Value, Error> {
        let deadline = Instant::now() + timeout;
        loop {
            if let Some(r) = self.responses.remove(&id) {
                return Ok(r);
            }
            if !self.pump(deadline)? {
                return Err(format!("no response to request {id} within {timeout:?}"));
            }
        }
    }

    /// Send a request and return its `result`; an error response is an error.
    pub fn request(
        &mut self,
        method: &str,
        params: Value,
        timeout: Duration,
    ) -> Result<Value, Error> {
        let id = self.send_request(method, params)?;
        let r = self.response(id, timeout)?;
        if let Some(e) = r.get("error") {
            return Err(format!("{method}: {e}"));
        }
        Ok(r["result"].clone())
    }

    /// Wait until the diagnostics published for `uri` satisfy `ok`.
    pub fn wait_published(
        &mut self,
        uri: &str,
        timeout: Duration,
        ok: impl Fn(&Published) -> bool,
    ) -> Result<Published, Error> {
        let deadline = Instant::now() + timeout;
        loop {
            if let Some(p) = self.published.get(uri)
                && ok(p)
            {
                return Ok(p.clone());
            }
            if !self.pump(deadline)? {
                return Err(format!(
                    "no matching diagnostics for {uri} within {timeout:?}"
                ));
            }
        }
    }

    pub fn open(&mut self, uri: &str, version: i64, text: &str) -> Result<(), Error> {
        self.notify(
            "textDocument/didOpen",
            json!({ "textDocument": { "uri": uri, "languageId": "plenum", "version": version, "text": text } }),
        )
    }

    pub fn change(&mut self, uri: &str, version: i64, changes: Value) -> Result<(), Error> {
        self.notify(
            "textDocument/didChange",
            json!({ "textDocument": { "uri": uri, "version": version }, "contentChanges": changes }),
        )
    }

    /// Whether the process is still running.
    pub fn alive(&mut self) -> bool {
        matches!(self.child.try_wait(), Ok(None))
    }

    /// `shutdown`, `exit`, and the exit status.
    pub fn shutdown(mut self, timeout: Duration) -> Result<ExitStatus, Error> {
        self.request("shutdown", Value::Null, timeout)?;
        self.notify("exit", Value::Null)?;
        drop(self.stdin.take());
        let deadline = Instant::now() + timeout;
        loop {
            if let Some(status) = self.child.try_wait().map_err(|e| e.to_string())? {
                return Ok(status);
            }
            if Instant::now() > deadline {
                return Err("the server did not exit".to_string());
            }
            std::thread::sleep(Duration::from_millis(10));
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

/// An LSP position (`line`, `character` in `utf-8` or `utf-16` units) of a
/// byte offset in `text`. A CR before LF belongs to the line break.
pub fn position(text: &str, offset: usize, utf8: bool) -> Value {
    let before = &text[..offset];
    let line = before.matches('\n').count();
    let start = before.rfind('\n').map_or(0, |i| i + 1);
    let seg = &text[start..offset];
    let col = if utf8 {
        seg.len()
    } else {
        seg.encode_utf16().count()
    };
    json!({ "line": line, "character": col })
}
