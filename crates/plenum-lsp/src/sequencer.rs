//! Document mutations, applied strictly in the order the client sent them.
//!
//! tower-lsp-server reads messages one by one and calls the service for
//! each in arrival order, but then runs the handlers' futures concurrently
//! (`buffer_unordered`): two `didChange` handlers may run in either order.
//! So the mutations are not done in the handlers. [`Sequenced`] wraps the
//! service and applies each `didOpen`, `didChange`, `didClose`, `didSave`
//! and `didChangeWatchedFiles` to the shared state synchronously inside
//! `call` — in arrival order, under the state's one mutex — before the
//! handler is even created. The handlers only publish diagnostics. A change
//! whose version is not newer than the document's is dropped (and counted).

use std::panic::{AssertUnwindSafe, catch_unwind};
use std::task::{Context, Poll};

use plenum_model::fs::CONFIG_FILE;
use serde_json::Value;
use tower::Service;
use tower_lsp_server::jsonrpc::{Request, Response};
use tower_lsp_server::ls_types::{
    DidChangeTextDocumentParams, DidChangeWatchedFilesParams, DidCloseTextDocumentParams,
    DidOpenTextDocumentParams, DidSaveTextDocumentParams, FileChangeType,
};

use crate::convert;
use crate::state::{Shared, State, lock};

pub(crate) struct Sequenced<S> {
    pub inner: S,
    pub state: Shared,
}

impl<S> Service<Request> for Sequenced<S>
where
    S: Service<Request, Response = Option<Response>>,
{
    type Response = S::Response;
    type Error = S::Error;
    type Future = S::Future;

    fn poll_ready(&mut self, cx: &mut Context<'_>) -> Poll<Result<(), Self::Error>> {
        self.inner.poll_ready(cx)
    }

    fn call(&mut self, req: Request) -> Self::Future {
        if let Some(params) = req.params() {
            let method = req.method();
            let state = &self.state;
            // A bug in a mutation must not take the server down.
            let _ = catch_unwind(AssertUnwindSafe(|| {
                let mut st = lock(state);
                mutate(&mut st, method, params);
            }));
        }
        self.inner.call(req)
    }
}

fn parse<T: serde::de::DeserializeOwned>(v: &Value) -> Option<T> {
    serde_json::from_value(v.clone()).ok()
}

/// Apply one notification's mutation to the state.
pub(crate) fn mutate(st: &mut State, method: &str, params: &Value) {
    match method {
        "textDocument/didOpen" => {
            let Some(p) = parse::<DidOpenTextDocumentParams>(params) else {
                return;
            };
            let Some(path) = st.path_of(&p.text_document.uri) else {
                return;
            };
            st.uris.insert(path.clone(), p.text_document.uri.clone());
            st.host.set_document(&path, p.text_document.text.clone());
            st.docs.insert(
                path.clone(),
                crate::state::Doc {
                    version: p.text_document.version,
                    text: p.text_document.text,
                },
            );
            st.adopt_project_of(&path);
            st.generation += 1;
        }
        "textDocument/didChange" => {
            let Some(p) = parse::<DidChangeTextDocumentParams>(params) else {
                return;
            };
            let Some(path) = st.path_of(&p.text_document.uri) else {
                return;
            };
            let enc = st.encoding;
            let Some(doc) = st.docs.get_mut(&path) else {
                return;
            };
            if p.text_document.version <= doc.version {
                st.stale_changes += 1;
                return;
            }
            for c in &p.content_changes {
                convert::apply_change(&mut doc.text, c.range, &c.text, enc);
            }
            doc.version = p.text_document.version;
            let text = doc.text.clone();
            st.host.set_document(&path, text);
            st.generation += 1;
        }
        "textDocument/didClose" => {
            let Some(p) = parse::<DidCloseTextDocumentParams>(params) else {
                return;
            };
            let Some(path) = st.path_of(&p.text_document.uri) else {
                return;
            };
            st.docs.remove(&path);
            st.host.close_document(&path);
            st.generation += 1;
        }
        "textDocument/didSave" => {
            let Some(p) = parse::<DidSaveTextDocumentParams>(params) else {
                return;
            };
            let Some(path) = st.path_of(&p.text_document.uri) else {
                return;
            };
            if path.file_name().is_some_and(|n| n == CONFIG_FILE) {
                st.host.file_changed_on_disk(&path);
                st.generation += 1;
            }
        }
        "workspace/didChangeWatchedFiles" => {
            let Some(p) = parse::<DidChangeWatchedFilesParams>(params) else {
                return;
            };
            let mut disk_set_changed = false;
            for c in &p.changes {
                let Some(path) = st.path_of(&c.uri) else {
                    continue;
                };
                if c.typ == FileChangeType::CREATED || c.typ == FileChangeType::DELETED {
                    disk_set_changed = true;
                }
                st.host.file_changed_on_disk(&path);
            }
            if disk_set_changed {
                let folders: Vec<_> = st.scanned.iter().cloned().collect();
                let mut files = Vec::new();
                for f in &folders {
                    files.extend(crate::workspace::design_files(f));
                }
                st.host.set_disk_files(files);
            }
            st.generation += 1;
        }
        _ => {}
    }
}
